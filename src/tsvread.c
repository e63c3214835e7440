/* termtide — reading TSV tables back.
 *
 * The whole file is read (bounded by TT_LIMIT_FILE_BYTES), then cut in
 * place: each line ends at '\n' (a '\r' before it is dropped), each cell at
 * '\t', and the escapes tt_table_str writes are undone in place (the result
 * is never longer). Numbers are parsed here without strtod, so a locale with
 * a decimal comma cannot change what a picture shows. */
#include <errno.h>
#include <math.h>
#include <stdio.h>
#include <string.h>

#include "termtide/alloc.h"
#include "termtide/limits.h"
#include "termtide/tsvread.h"
#include "tt_internal.h"

void tt_tsv_init(tt_tsv *t)
{
    memset(t, 0, sizeof *t);
}

void tt_tsv_release(tt_tsv *t)
{
    tt_free(t->cells);
    tt_free(t->data);
    tt_tsv_init(t);
}

static void unescape(char *s)
{
    char *w = s;
    for (char *r = s; *r; r++) {
        if (*r == '\\' && r[1]) {
            r++;
            *w++ = *r == 't' ? '\t' : *r == 'n' ? '\n' : *r == 'r' ? '\r' : *r;
        } else {
            *w++ = *r;
        }
    }
    *w = '\0';
}

/* Cuts data (len bytes, NUL at data[len], owned from here on) into t. */
static tt_status parse_owned(char *data, size_t len, const char *path, tt_tsv *t, tt_error *err)
{
    if (memchr(data, '\0', len)) {
        tt_free(data);
        return tt_error_set(err, TT_EPARSE, path, -1, "binary data, not a TSV table");
    }
    t->data = data;
    /* the header */
    size_t lines = 0;
    for (size_t i = 0; i < len; i++)
        lines += data[i] == '\n';
    lines++;
    if (lines > TT_LIMIT_CHART_ROWS + 2) {
        tt_tsv_release(t);
        return tt_error_set(err, TT_ELIMIT, path, -1, "more than %d rows",
                            TT_LIMIT_CHART_ROWS);
    }
    char *p = data;
    char *eol = strchr(p, '\n');
    size_t ncols = 1;
    for (char *q = p; *q && q != eol; q++)
        ncols += *q == '\t';
    if (!*p || *p == '\n') {
        tt_tsv_release(t);
        return tt_error_set(err, TT_EPARSE, path, -1, "empty: expected a header line");
    }
    if (ncols == 1 && memchr(p, ',', (size_t)((eol ? eol : p + strlen(p)) - p))) {
        tt_tsv_release(t);
        return tt_error_set_line(err, TT_EPARSE, path, 1,
                            "a comma-separated header: pictures read TSV tables (write the "
                            "table with -f tsv, the default)");
    }
    if (ncols > TT_LIMIT_TABLE_COLUMNS) {
        tt_tsv_release(t);
        return tt_error_set_line(err, TT_ELIMIT, path, 1, "more than %d columns",
                            TT_LIMIT_TABLE_COLUMNS);
    }
    t->ncols = ncols;
    t->cells = tt_reallocarray(NULL, lines * ncols, sizeof *t->cells);
    if (!t->cells) {
        tt_tsv_release(t);
        return tt_error_set(err, TT_ENOMEM, path, -1, "out of memory");
    }
    size_t row = 0;
    long lineno = 0;
    while (p && *p) {
        lineno++;
        eol = strchr(p, '\n');
        if (eol) {
            *eol = '\0';
            if (eol > p && eol[-1] == '\r')
                eol[-1] = '\0';
        }
        if (*p) {
            size_t col = 0;
            char *cell = p;
            for (;;) {
                char *tab = strchr(cell, '\t');
                if (tab)
                    *tab = '\0';
                if (col >= ncols) {
                    col++;
                    break;
                }
                unescape(cell);
                t->cells[row * ncols + col++] = cell;
                if (!tab)
                    break;
                cell = tab + 1;
            }
            if (col != ncols) {
                tt_tsv_release(t);
                return tt_error_set_line(err, TT_EPARSE, path, lineno,
                                         "%zu cells where the header has %zu (is this a TSV "
                                         "table written by termtide?)",
                                         col, ncols);
            }
            row++;
        }
        p = eol ? eol + 1 : NULL;
    }
    if (row < 2) {
        tt_tsv_release(t);
        return tt_error_set(err, TT_EPARSE, path, -1, "no data rows under the header");
    }
    t->nrows = row - 1;
    return TT_OK;
}

tt_status tt_tsv_read(const char *path, tt_tsv *t, tt_error *err)
{
    tt_tsv_release(t);
    int is_stdin = !strcmp(path, "-");
    FILE *fp = is_stdin ? stdin : fopen(path, "rb");
    if (!fp)
        return tt_error_set(err, errno == ENOENT ? TT_ENOENT : TT_EIO, path, -1, "%s",
                            strerror(errno));
    size_t cap = 1 << 16, len = 0;
    char *data = tt_malloc(cap);
    tt_status st = data ? TT_OK : TT_ENOMEM;
    while (!st) {
        if (cap - len < 4096) {
            if (cap >= TT_LIMIT_FILE_BYTES) {
                st = tt_error_set(err, TT_ELIMIT, path, -1, "larger than %zu bytes",
                                  (size_t)TT_LIMIT_FILE_BYTES);
                break;
            }
            char *n = tt_realloc(data, cap * 2);
            if (!n) {
                st = TT_ENOMEM;
                break;
            }
            data = n;
            cap *= 2;
        }
        size_t k = fread(data + len, 1, cap - len - 1, fp);
        len += k;
        if (k == 0) {
            if (ferror(fp))
                st = tt_error_set(err, TT_EIO, path, -1, "read error");
            break;
        }
    }
    if (!is_stdin)
        fclose(fp);
    if (st) {
        tt_free(data);
        return st == TT_ENOMEM ? tt_error_set(err, st, path, -1, "out of memory") : st;
    }
    data[len] = '\0';
    return parse_owned(data, len, path, t, err);
}

tt_status tt_tsv_parse(const char *text, size_t len, const char *name, tt_tsv *t, tt_error *err)
{
    tt_tsv_release(t);
    if (len > TT_LIMIT_FILE_BYTES)
        return tt_error_set(err, TT_ELIMIT, name, -1, "larger than %zu bytes",
                            (size_t)TT_LIMIT_FILE_BYTES);
    char *data = tt_malloc(len + 1);
    if (!data)
        return tt_error_set(err, TT_ENOMEM, name, -1, "out of memory");
    memcpy(data, text, len);
    data[len] = '\0';
    return parse_owned(data, len, name, t, err);
}

long tt_tsv_column(const tt_tsv *t, const char *name)
{
    for (size_t i = 0; i < t->ncols; i++)
        if (!strcmp(t->cells[i], name))
            return (long)i;
    return -1;
}

const char *tt_tsv_cell(const tt_tsv *t, size_t row, size_t col)
{
    return t->cells[(row + 1) * t->ncols + col];
}

int tt_tsv_number(const tt_tsv *t, size_t row, size_t col, double *out)
{
    const char *s = tt_tsv_cell(t, row, col);
    if (!*s || !strcmp(s, "n/a") || !strcmp(s, "nan") || !strcmp(s, "new") ||
        !strcmp(s, "gone")) {
        *out = NAN;
        return 1;
    }
    const char *p = s;
    int neg = 0;
    if (*p == '-' || *p == '+')
        neg = *p++ == '-';
    if (!strcmp(p, "inf")) {
        *out = neg ? -INFINITY : INFINITY;
        return 1;
    }
    double v = 0;
    int digits = 0;
    while (tti_is_ascii_digit(*p)) {
        v = v * 10 + (*p++ - '0');
        digits++;
    }
    if (*p == '.') {
        p++;
        int frac = 0;
        while (tti_is_ascii_digit(*p)) {
            v = v * 10 + (*p++ - '0');
            frac++;
            digits++;
        }
        v /= pow(10.0, frac); /* one division: 0.3 reads as 0.3 */
    }
    if (!digits)
        return 0;
    if (*p == 'e' || *p == 'E') {
        p++;
        int eneg = 0, e = 0, ed = 0;
        if (*p == '-' || *p == '+')
            eneg = *p++ == '-';
        while (tti_is_ascii_digit(*p) && e < 10000) {
            e = e * 10 + (*p++ - '0');
            ed++;
        }
        if (!ed)
            return 0;
        v *= pow(10.0, eneg ? -e : e);
    }
    if (*p)
        return 0;
    *out = neg ? -v : v;
    return 1;
}
