/* termtide — table output (TSV, CSV, JSON Lines) and atomic files.
 *
 * Numbers are formatted by hand from integers so that no locale can turn a
 * decimal point into a comma. CSV follows RFC 4180 and neutralises cells a
 * spreadsheet would evaluate as formulas (leading = + - @ tab CR get an
 * apostrophe, the usual defence against CSV injection, common practice). */
#include <errno.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <sys/stat.h>
#include <unistd.h>

#include "termtide/output.h"
#include "tt_internal.h"

tt_status tt_format_parse(const char *name, tt_format *out)
{
    if (!strcmp(name, "tsv"))
        *out = TT_FORMAT_TSV;
    else if (!strcmp(name, "csv"))
        *out = TT_FORMAT_CSV;
    else if (!strcmp(name, "jsonl"))
        *out = TT_FORMAT_JSONL;
    else
        return TT_EINVAL;
    return TT_OK;
}

/* Decimal digits two at a time from a table of "00".."99". */
static const char digit_pairs[201] = "00010203040506070809101112131415161718192021222324252627282930"
                                     "31323334353637383940414243444546474849505152535455565758596061"
                                     "62636465666768697071727374757677787980818283848586878889909192"
                                     "93949596979899";

static size_t put_u64(uint64_t v, char *out)
{
    size_t n = 1;
    for (uint64_t t = v; t >= 10; t /= 10)
        n++;
    char *p = out + n;
    *p = '\0';
    while (v >= 100) {
        unsigned d = (unsigned)(v % 100) * 2;
        v /= 100;
        *--p = digit_pairs[d + 1];
        *--p = digit_pairs[d];
    }
    if (v >= 10) {
        *--p = digit_pairs[v * 2 + 1];
        *--p = digit_pairs[v * 2];
    } else {
        *--p = (char)('0' + v);
    }
    return n;
}

/* Powers of ten, each exact as a double (up to 10^12, the most decimals). */
static const double pow10_d[13] = { 1e0, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6,
                                    1e7, 1e8, 1e9, 1e10, 1e11, 1e12 };

size_t tt_format_fixed(double x, int decimals, char *out)
{
    if (isnan(x)) {
        memcpy(out, "nan", 4);
        return 3;
    }
    if (isinf(x)) {
        if (x < 0) {
            memcpy(out, "-inf", 5);
            return 4;
        }
        memcpy(out, "inf", 4);
        return 3;
    }
    if (decimals < 0)
        decimals = 0;
    if (decimals > 12)
        decimals = 12;
    size_t n = 0;
    int neg = x < 0;
    /* rounded half away from zero: the integer part of |x| * 10^decimals
     * + 0.5 (a conversion truncates, which is floor for what is not
     * negative) */
    double scale = pow10_d[decimals];
    double scaled = fabs(x) * scale + 0.5;
    if (scaled >= 1.8e19) { /* too large for the integer path: plain %e-free fallback */
        int k = snprintf(out, 40, "%.0f", x);
        return k < 0 ? 0 : (size_t)k;
    }
    uint64_t v = (uint64_t)scaled;
    uint64_t ip = v, fp = 0;
    uint64_t sc = (uint64_t)scale;
    if (decimals) {
        ip = v / sc;
        fp = v % sc;
    }
    if (neg && v != 0)
        out[n++] = '-';
    n += put_u64(ip, out + n);
    if (decimals) {
        /* exactly `decimals` digits, leading zeros included */
        out[n++] = '.';
        char *p = out + n + decimals;
        int k = decimals;
        for (; k >= 2; k -= 2) {
            unsigned d = (unsigned)(fp % 100) * 2;
            fp /= 100;
            *--p = digit_pairs[d + 1];
            *--p = digit_pairs[d];
        }
        if (k)
            *--p = (char)('0' + fp % 10);
        n += (size_t)decimals;
    }
    out[n] = '\0';
    return n;
}

size_t tt_format_sci(double x, int digits, char *out)
{
    if (digits < 1)
        digits = 1;
    if (digits > 15)
        digits = 15;
    if (!isfinite(x))
        return tt_format_fixed(x, 0, out);
    if (x == 0) {
        memcpy(out, "0", 2);
        return 1;
    }
    double a = fabs(x);
    int exp10 = (int)floor(log10(a));
    if (exp10 >= -4 && exp10 < 6) {
        int decimals = digits - 1 - exp10;
        return tt_format_fixed(x, decimals < 0 ? 0 : decimals, out);
    }
    double mant = a / pow(10.0, exp10);
    /* rounding may carry the mantissa to 10.0 */
    double scale = pow(10.0, digits - 1);
    if (floor(mant * scale + 0.5) >= 10.0 * scale) {
        mant /= 10.0;
        exp10++;
    }
    size_t n = 0;
    if (x < 0)
        out[n++] = '-';
    n += tt_format_fixed(mant, digits - 1, out + n);
    out[n++] = 'e';
    out[n++] = exp10 < 0 ? '-' : '+';
    int e = exp10 < 0 ? -exp10 : exp10;
    if (e >= 100)
        out[n++] = (char)('0' + e / 100);
    out[n++] = (char)('0' + (e / 10) % 10);
    out[n++] = (char)('0' + e % 10);
    out[n] = '\0';
    return n;
}

tt_status tt_table_begin(tt_table_writer *w, tt_format format, tt_buf *out,
                         const char *const *columns, size_t ncolumns, int header)
{
    w->format = format;
    w->out = out;
    w->columns = columns;
    w->ncolumns = ncolumns;
    w->col = 0;
    if (!header || format == TT_FORMAT_JSONL)
        return TT_OK;
    for (size_t i = 0; i < ncolumns; i++) {
        tt_status st = tt_table_cstr(w, columns[i]);
        if (st)
            return st;
    }
    return tt_table_end_row(w);
}

static tt_status cell_start(tt_table_writer *w)
{
    tt_status st = TT_OK;
    if (w->format == TT_FORMAT_JSONL) {
        st = tt_buf_puts(w->out, w->col ? ",\"" : "{\"");
        if (!st && w->col < w->ncolumns)
            st = tt_buf_puts(w->out, w->columns[w->col]);
        if (!st)
            st = tt_buf_puts(w->out, "\":");
    } else if (w->col) {
        st = tt_buf_putc(w->out, w->format == TT_FORMAT_CSV ? ',' : '\t');
    }
    w->col++;
    return st;
}

static tt_status put_json_string(tt_buf *b, const char *s, size_t len)
{
    static const char hex[] = "0123456789abcdef";
    tt_status st = tt_buf_putc(b, '"');
    size_t run = 0;
    for (size_t i = 0; i < len && !st; i++) {
        unsigned char c = (unsigned char)s[i];
        if (c >= 0x20 && c != '"' && c != '\\')
            continue;
        st = tt_buf_append(b, s + run, i - run);
        run = i + 1;
        if (st)
            break;
        switch (c) {
        case '"': st = tt_buf_puts(b, "\\\""); break;
        case '\\': st = tt_buf_puts(b, "\\\\"); break;
        case '\n': st = tt_buf_puts(b, "\\n"); break;
        case '\r': st = tt_buf_puts(b, "\\r"); break;
        case '\t': st = tt_buf_puts(b, "\\t"); break;
        default: {
            char u[7] = { '\\', 'u', '0', '0', hex[c >> 4], hex[c & 15], 0 };
            st = tt_buf_puts(b, u);
        }
        }
    }
    if (!st)
        st = tt_buf_append(b, s + run, len - run);
    if (!st)
        st = tt_buf_putc(b, '"');
    return st;
}

static tt_status put_csv_string(tt_buf *b, const char *s, size_t len)
{
    int formula = len > 0 && (s[0] == '=' || s[0] == '+' || s[0] == '-' || s[0] == '@' ||
                              s[0] == '\t' || s[0] == '\r');
    int quote = 0;
    for (size_t i = 0; i < len; i++)
        if (s[i] == ',' || s[i] == '"' || s[i] == '\r' || s[i] == '\n') {
            quote = 1;
            break;
        }
    tt_status st = quote ? tt_buf_putc(b, '"') : TT_OK;
    if (!st && formula)
        st = tt_buf_putc(b, '\'');
    size_t run = 0;
    for (size_t i = 0; i < len && !st; i++) {
        if (s[i] != '"')
            continue;
        st = tt_buf_append(b, s + run, i + 1 - run); /* the quote itself, then again */
        if (!st)
            st = tt_buf_putc(b, '"');
        run = i + 1;
    }
    if (!st)
        st = tt_buf_append(b, s + run, len - run);
    if (!st && quote)
        st = tt_buf_putc(b, '"');
    return st;
}

static tt_status put_tsv_string(tt_buf *b, const char *s, size_t len)
{
    tt_status st = TT_OK;
    size_t run = 0;
    for (size_t i = 0; i < len && !st; i++) {
        const char *esc = NULL;
        switch (s[i]) {
        case '\t': esc = "\\t"; break;
        case '\n': esc = "\\n"; break;
        case '\r': esc = "\\r"; break;
        case '\\': esc = "\\\\"; break;
        default: continue;
        }
        st = tt_buf_append(b, s + run, i - run);
        if (!st)
            st = tt_buf_puts(b, esc);
        run = i + 1;
    }
    if (!st)
        st = tt_buf_append(b, s + run, len - run);
    return st;
}

tt_status tt_table_escape(tt_format f, const char *s, size_t len, tt_buf *out)
{
    switch (f) {
    case TT_FORMAT_JSONL: return put_json_string(out, s, len);
    case TT_FORMAT_CSV: return put_csv_string(out, s, len);
    case TT_FORMAT_TSV: return put_tsv_string(out, s, len);
    }
    return TT_EINVAL;
}

/* Room for extra more bytes and the NUL in out: the common case (room
 * already there: cap > len + extra, which also keeps len + extra within the
 * limit, since tt_buf_grow never makes cap more than limit + 1) without
 * the call, which a table of millions of cells makes once a cell. */
static inline tt_status reserve(tt_buf *out, size_t extra)
{
    return extra < out->cap - out->len ? TT_OK : tt_buf_grow(out, extra);
}

/* Bytes of the next cell as they are (escaped already): with TSV and CSV
 * the separator and the bytes in one step. */
static tt_status put_raw_cell(tt_table_writer *w, const char *s, size_t len)
{
    if (w->format == TT_FORMAT_JSONL) {
        tt_status st = cell_start(w);
        return st ? st : tt_buf_append(w->out, s, len);
    }
    const size_t sep = w->col ? 1 : 0;
    tt_status st = reserve(w->out, len + sep);
    if (st)
        return st;
    char *p = w->out->data + w->out->len;
    if (w->col++)
        *p++ = w->format == TT_FORMAT_CSV ? ',' : '\t';
    memcpy(p, s, len);
    p[len] = '\0';
    w->out->len = (size_t)(p + len - w->out->data);
    return TT_OK;
}

tt_status tt_table_escaped(tt_table_writer *w, const char *s, size_t len)
{
    return put_raw_cell(w, s, len);
}

tt_status tt_table_str(tt_table_writer *w, const char *s, size_t len)
{
    if (w->format == TT_FORMAT_TSV) {
        /* nothing to escape (the usual term): as it is */
        size_t i = 0;
        while (i < len && s[i] != '\t' && s[i] != '\n' && s[i] != '\r' && s[i] != '\\')
            i++;
        if (i == len)
            return put_raw_cell(w, s, len);
    }
    tt_status st = cell_start(w);
    if (st)
        return st;
    switch (w->format) {
    case TT_FORMAT_JSONL: return put_json_string(w->out, s, len);
    case TT_FORMAT_CSV: return put_csv_string(w->out, s, len);
    case TT_FORMAT_TSV: return put_tsv_string(w->out, s, len);
    }
    return TT_EINVAL;
}

tt_status tt_table_cstr(tt_table_writer *w, const char *s)
{
    return tt_table_str(w, s, strlen(s));
}

/* A cell of n bytes needing no quoting or escaping (a number) at num[1..],
 * num[0] free for the separator: TSV and CSV take it in one append. */
static tt_status put_plain_cell(tt_table_writer *w, char *num, size_t n)
{
    if (w->format == TT_FORMAT_JSONL) {
        tt_status st = cell_start(w);
        return st ? st : tt_buf_append(w->out, num + 1, n);
    }
    const char *from = num + 1;
    if (w->col++) {
        num[0] = w->format == TT_FORMAT_CSV ? ',' : '\t';
        from = num;
        n++;
    }
    tt_status st = reserve(w->out, n);
    if (st)
        return st;
    char *to = w->out->data + w->out->len;
    for (size_t i = 0; i < n; i++) /* a few bytes: no call */
        to[i] = from[i];
    to[n] = '\0';
    w->out->len += n;
    return TT_OK;
}

tt_status tt_table_u64(tt_table_writer *w, uint64_t v)
{
    char num[25];
    return put_plain_cell(w, num, put_u64(v, num + 1));
}

/* An undefined statistic (NaN) is the word "n/a" in TSV and CSV and null
 * in JSON Lines, never a number-like "nan". */
tt_status tt_table_fixed(tt_table_writer *w, double v, int decimals)
{
    char num[41];
    if (isfinite(v))
        return put_plain_cell(w, num, tt_format_fixed(v, decimals, num + 1));
    size_t n = tt_format_fixed(v, decimals, num + 1);
    tt_status st = cell_start(w);
    if (st)
        return st;
    if (w->format == TT_FORMAT_JSONL)
        return tt_buf_puts(w->out, "null");
    if (isnan(v))
        return tt_buf_puts(w->out, "n/a");
    return tt_buf_append(w->out, num + 1, n);
}

tt_status tt_table_sci(tt_table_writer *w, double v, int digits)
{
    char num[48];
    size_t n = tt_format_sci(v, digits, num);
    tt_status st = cell_start(w);
    if (st)
        return st;
    if (w->format == TT_FORMAT_JSONL && !isfinite(v))
        return tt_buf_puts(w->out, "null");
    if (isnan(v))
        return tt_buf_puts(w->out, "n/a");
    return tt_buf_append(w->out, num, n);
}

tt_status tt_table_end_row(tt_table_writer *w)
{
    tt_status st = TT_OK;
    if (w->format == TT_FORMAT_JSONL)
        st = tt_buf_puts(w->out, w->col ? "}\n" : "{}\n");
    else if (w->format == TT_FORMAT_CSV)
        st = tt_buf_puts(w->out, "\r\n");
    else if (!(st = reserve(w->out, 1))) {
        w->out->data[w->out->len++] = '\n';
        w->out->data[w->out->len] = '\0';
    }
    w->col = 0;
    return st;
}

tt_status tt_outfile_open(tt_outfile *f, const char *path, tt_error *err)
{
    f->fp = NULL;
    f->path = NULL;
    f->tmp_path = NULL;
    f->failed = 0;
    if (!path || !strcmp(path, "-")) {
        f->fp = stdout;
        return TT_OK;
    }
    size_t n = strlen(path);
    f->path = tt_strdup(path);
    f->tmp_path = tt_malloc(n + 16);
    if (!f->path || !f->tmp_path) {
        tt_free(f->path);
        tt_free(f->tmp_path);
        f->path = f->tmp_path = NULL;
        return tt_error_set(err, TT_ENOMEM, path, -1, "out of memory");
    }
    memcpy(f->tmp_path, path, n);
    memcpy(f->tmp_path + n, ".tmp.XXXXXX", 12);
    int fd = mkstemp(f->tmp_path);
    if (fd < 0) {
        int e = errno;
        tt_free(f->path);
        tt_free(f->tmp_path);
        f->path = f->tmp_path = NULL;
        return tt_error_set(err, TT_EIO, path, -1, "cannot create output file: %s", strerror(e));
    }
    /* mkstemp makes the file 0600; the result gets the mode a new file would
     * (0666 less the umask), or the mode of the file it replaces. The umask
     * is read by setting it back at once (output is opened by the calling
     * thread, before any worker starts). */
    struct stat sb;
    mode_t mode;
    if (stat(path, &sb) == 0) {
        mode = sb.st_mode & 07777;
    } else {
        mode_t mask = umask(022);
        umask(mask);
        mode = 0666 & ~mask;
    }
    (void)fchmod(fd, mode);
    f->fp = fdopen(fd, "wb");
    if (!f->fp) {
        int e = errno;
        close(fd);
        unlink(f->tmp_path);
        tt_free(f->path);
        tt_free(f->tmp_path);
        f->path = f->tmp_path = NULL;
        return tt_error_set(err, TT_EIO, path, -1, "cannot open output file: %s", strerror(e));
    }
    return TT_OK;
}

tt_status tt_outfile_write(tt_outfile *f, const void *data, size_t len, tt_error *err)
{
    if (f->failed)
        return TT_EIO;
    if (len && fwrite(data, 1, len, f->fp) != len) {
        f->failed = 1;
        return tt_error_set(err, TT_EIO, f->path ? f->path : "<stdout>", -1,
                            "write failed: %s", strerror(errno));
    }
    return TT_OK;
}

tt_status tt_outfile_commit(tt_outfile *f, tt_error *err)
{
    const char *name = f->path ? f->path : "<stdout>";
    if (!f->fp)
        return TT_OK;
    if (!f->path) {
        if (fflush(f->fp) != 0 || f->failed)
            return tt_error_set(err, TT_EIO, name, -1, "write failed: %s", strerror(errno));
        f->fp = NULL;
        return TT_OK;
    }
    int bad = f->failed || fflush(f->fp) != 0 || fsync(fileno(f->fp)) != 0;
    int e = errno;
    if (fclose(f->fp) != 0 && !bad) {
        bad = 1;
        e = errno;
    }
    f->fp = NULL;
    if (bad || rename(f->tmp_path, f->path) != 0) {
        if (!bad)
            e = errno;
        unlink(f->tmp_path);
        tt_free(f->tmp_path);
        tt_free(f->path);
        f->tmp_path = f->path = NULL;
        return tt_error_set(err, TT_EIO, name, -1, "could not write output: %s", strerror(e));
    }
    tt_free(f->tmp_path);
    tt_free(f->path);
    f->tmp_path = f->path = NULL;
    return TT_OK;
}

void tt_outfile_abort(tt_outfile *f)
{
    if (f->fp && f->path) {
        fclose(f->fp);
        unlink(f->tmp_path);
    }
    f->fp = NULL;
    tt_free(f->tmp_path);
    tt_free(f->path);
    f->tmp_path = f->path = NULL;
}
