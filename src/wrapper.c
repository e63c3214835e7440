/* termtide — the submission wrapper of electronic filings: detection of a
 * document's kind, splitting a wrapper into its inner documents, and the
 * type filter (see include/termtide/document.h).
 *
 * The wrapper is a plain-text container: an optional header section
 * (<SEC-DOCUMENT>, <SEC-HEADER> or <IMS-HEADER>, then "KEY:<tabs>value"
 * lines), then one block per inner document:
 *
 *     <DOCUMENT>
 *     <TYPE>10-Q
 *     <SEQUENCE>1
 *     <FILENAME>q3.htm
 *     <DESCRIPTION>QUARTERLY REPORT
 *     <TEXT>
 *     ... the body: HTML, plain text, or a uuencoded binary ...
 *     </TEXT>
 *     </DOCUMENT>
 *
 * The splitter reads it line by line in one pass (memchr for line ends), so
 * it is linear in the input and never copies a body: a part records the
 * body's offset and length in the decoded text. Tags are matched without
 * regard to case, after leading blanks, with a CR before the LF ignored.
 * Inside a body only a closing </TEXT> is looked for, at the start or at the
 * end of a line (bodies often end "</html></TEXT>"); a tag such as
 * <document> inside an XML body therefore cannot end the part early. Header
 * values are taken from the first occurrence of each key before the first
 * <DOCUMENT> (a filing with several filers lists the primary filer first).
 *
 * Kind detection looks at a bounded prefix only, so it costs the same on a
 * 1 KiB memo and a 500 MB filing: 64 KiB for the wrapper's <DOCUMENT> line
 * (headers of filings with many filers run to tens of KiB), 4 KiB for HTML
 * markers. */
#include "termtide/document.h"
#include "tt_internal.h"

#define DETECT_WRAPPER_WINDOW ((size_t)64 * 1024)
#define DETECT_HTML_WINDOW ((size_t)4 * 1024)

const char *tt_doc_kind_name(tt_doc_kind kind)
{
    switch (kind) {
    case TT_KIND_TEXT: return "text";
    case TT_KIND_HTML: return "html";
    case TT_KIND_WRAPPER: return "wrapper";
    }
    return "unknown";
}

void tt_wrapper_init(tt_wrapper *w)
{
    w->parts = NULL;
    w->n = 0;
    w->cap = 0;
    w->entity[0] = '\0';
    w->period[0] = '\0';
    w->form[0] = '\0';
}

void tt_wrapper_release(tt_wrapper *w)
{
    tt_free(w->parts);
    tt_wrapper_init(w);
}

/* ---- small helpers --------------------------------------------------------- */

static int is_blank(int c) { return c == ' ' || c == '\t'; }

/* Case-insensitive ASCII comparison of n bytes; lit is upper case. */
static int eq_ci(const char *s, const char *lit, size_t n)
{
    for (size_t i = 0; i < n; i++) {
        int c = (unsigned char)s[i];
        if ((unsigned)c - 'a' < 26u)
            c -= 32;
        if (c != (unsigned char)lit[i])
            return 0;
    }
    return 1;
}

/* Whether [s, e) starts with lit (upper case), without regard to case. */
static int starts_ci(const char *s, const char *e, const char *lit)
{
    size_t n = strlen(lit);
    return (size_t)(e - s) >= n && eq_ci(s, lit, n);
}

static const char *skip_blanks(const char *s, const char *e)
{
    while (s < e && is_blank((unsigned char)*s))
        s++;
    return s;
}

static const char *trim_end(const char *s, const char *e)
{
    while (e > s && tti_is_ascii_space((unsigned char)e[-1]))
        e--;
    return e;
}

/* Copies [s, e) trimmed into a fixed field, truncating at a UTF-8 character
 * boundary so the field stays valid UTF-8. */
static void copy_field(char *dst, size_t size, const char *s, const char *e)
{
    while (s < e && tti_is_ascii_space((unsigned char)*s))
        s++;
    e = trim_end(s, e);
    size_t n = (size_t)(e - s);
    if (n >= size) {
        n = size - 1;
        while (n > 0 && ((unsigned char)s[n] & 0xC0) == 0x80)
            n--;
    }
    memcpy(dst, s, n);
    dst[n] = '\0';
}

/* One line of the input: [b, e) without the line break, next = where the
 * following line starts. */
typedef struct line {
    const char *b, *e;
    size_t start, next;
} line;

static int next_line(const char *text, size_t len, size_t pos, line *ln)
{
    if (pos >= len)
        return 0;
    const char *nl = memchr(text + pos, '\n', len - pos);
    size_t end = nl ? (size_t)(nl - text) : len;
    ln->start = pos;
    ln->next = nl ? end + 1 : len;
    ln->b = text + pos;
    ln->e = text + end;
    if (ln->e > ln->b && ln->e[-1] == '\r')
        ln->e--;
    return 1;
}

/* ---- kind detection --------------------------------------------------------- */

static int is_tag_end(const char *p, const char *e)
{
    return p >= e || *p == '>' || *p == '/' || tti_is_ascii_space((unsigned char)*p);
}

static int looks_like_wrapper(const char *text, size_t len)
{
    const char *e = text + len;
    const char *s = text;
    while (s < e && tti_is_ascii_space((unsigned char)*s))
        s++;
    static const char *const openers[] = {
        "<SEC-DOCUMENT>", "<SEC-HEADER>", "<IMS-DOCUMENT>", "<IMS-HEADER>",
        "ACCESSION NUMBER:", "CONFORMED SUBMISSION TYPE:",
    };
    for (size_t i = 0; i < sizeof openers / sizeof openers[0]; i++)
        if (starts_ci(s, e, openers[i]))
            return 1;

    size_t win = len < DETECT_WRAPPER_WINDOW ? len : DETECT_WRAPPER_WINDOW;
    size_t pos = 0;
    line ln;
    while (next_line(text, win, pos, &ln)) {
        pos = ln.next;
        const char *t = skip_blanks(ln.b, ln.e);
        if (!starts_ci(t, ln.e, "<DOCUMENT>"))
            continue;
        /* The <DOCUMENT> line must be followed by its <TYPE> line. */
        line nx;
        size_t p2 = ln.next;
        while (next_line(text, len, p2, &nx)) {
            p2 = nx.next;
            const char *u = skip_blanks(nx.b, nx.e);
            if (u == nx.e)
                continue;
            if (starts_ci(u, nx.e, "<TYPE>"))
                return 1;
            break;
        }
    }
    return 0;
}

static int looks_like_html(const char *text, size_t len)
{
    const char *s = text, *end = text + len;
    while (s < end && tti_is_ascii_space((unsigned char)*s))
        s++;
    const char *e = (size_t)(end - s) > DETECT_HTML_WINDOW ? s + DETECT_HTML_WINDOW : end;
    int table = 0, row = 0;
    for (const char *p = s; p < e; p++) {
        p = memchr(p, '<', (size_t)(e - p));
        if (!p)
            break;
        const char *q = p + 1;
        if (starts_ci(q, e, "!DOCTYPE")) {
            q += 8;
            while (q < e && tti_is_ascii_space((unsigned char)*q))
                q++;
            if (starts_ci(q, e, "HTML"))
                return 1;
            continue;
        }
        static const char *const names[] = { "HTML", "HEAD", "BODY", "DIV", "P" };
        for (size_t i = 0; i < sizeof names / sizeof names[0]; i++) {
            size_t n = strlen(names[i]);
            if (starts_ci(q, e, names[i]) && is_tag_end(q + n, e))
                return 1;
        }
        if (starts_ci(q, e, "TABLE") && is_tag_end(q + 5, e))
            table = 1;
        else if ((starts_ci(q, e, "TR") || starts_ci(q, e, "TD")) && is_tag_end(q + 2, e))
            row = 1;
    }
    /* <TABLE> alone is not enough: plain-text filings mark their tables with
     * <TABLE>, <CAPTION>, <S> and <C> lines but never with <TR> or <TD>. */
    return table && row;
}

tt_doc_kind tt_detect_kind(const char *text, size_t len)
{
    if (looks_like_wrapper(text, len))
        return TT_KIND_WRAPPER;
    if (looks_like_html(text, len))
        return TT_KIND_HTML;
    return TT_KIND_TEXT;
}

/* ---- splitting --------------------------------------------------------------- */

/* A body is uuencoded when its first non-blank line is "begin MODE NAME"
 * with an octal MODE (the uuencode format, POSIX uuencode(1)); the base64
 * variant "begin-base64 MODE NAME" is treated alike. A <PDF> line before it
 * (how wrappers enclose an encoded PDF) is stepped over. */
static int is_uuencoded(const char *body, size_t n)
{
    size_t pos = 0;
    line ln;
    while (next_line(body, n, pos, &ln)) {
        pos = ln.next;
        const char *t = skip_blanks(ln.b, ln.e);
        if (t == ln.e)
            continue;
        const char *q = trim_end(t, ln.e);
        if (q - t == 5 && eq_ci(t, "<PDF>", 5))
            continue;
        if (starts_ci(t, ln.e, "BEGIN-BASE64 "))
            q = t + 13;
        else if (starts_ci(t, ln.e, "BEGIN "))
            q = t + 6;
        else
            return 0;
        q = skip_blanks(q, ln.e);
        const char *d = q;
        while (q < ln.e && *q >= '0' && *q <= '7')
            q++;
        return q - d >= 3 && q - d <= 4 && q < ln.e && is_blank((unsigned char)*q);
    }
    return 0;
}

static size_t parse_seq(const char *s, const char *e)
{
    s = skip_blanks(s, e);
    size_t v = 0;
    int any = 0;
    while (s < e && tti_is_ascii_digit((unsigned char)*s)) {
        if (v > (SIZE_MAX - 9) / 10)
            return 0;
        v = v * 10 + (size_t)(*s - '0');
        s++;
        any = 1;
    }
    return any ? v : 0;
}

/* Matches "<TAG>" at t and returns the text after it, or NULL. */
static const char *after_tag(const char *t, const char *e, const char *tag)
{
    return starts_ci(t, e, tag) ? t + strlen(tag) : NULL;
}

/* Checks a line inside a body for the closing </TEXT>: at its start, or at
 * its end. Returns the body end offset or SIZE_MAX. */
static size_t text_close(const char *text, const line *ln)
{
    const char *t = skip_blanks(ln->b, ln->e);
    if (starts_ci(t, ln->e, "</TEXT>"))
        return ln->start;
    const char *e = trim_end(ln->b, ln->e);
    if (e - ln->b >= 7 && eq_ci(e - 7, "</TEXT>", 7))
        return (size_t)(e - 7 - text);
    return SIZE_MAX;
}

tt_status tt_wrapper_split(const char *text, size_t len, tt_wrapper *out, const char *name,
                           tt_error *err)
{
    int in_doc = 0, in_text = 0, seen_doc = 0;
    int have_entity = 0, have_period = 0, have_form = 0;
    size_t cur = 0, pos = 0;
    long lineno = 0;
    line ln;

    out->n = 0;
    out->entity[0] = out->period[0] = out->form[0] = '\0';

    while (next_line(text, len, pos, &ln)) {
        pos = ln.next;
        lineno++;
        if (in_text) {
            size_t close = text_close(text, &ln);
            if (close != SIZE_MAX) {
                out->parts[cur].text_len = close - out->parts[cur].text_off;
                in_text = 0;
            }
            continue;
        }
        const char *t = skip_blanks(ln.b, ln.e);
        const char *v;
        if (starts_ci(t, ln.e, "<DOCUMENT>")) {
            if (out->n == TT_LIMIT_WRAPPER_PARTS)
                return tt_error_set_line(err, TT_ELIMIT, name, lineno,
                                         "more than %d documents in the wrapper "
                                         "(TT_LIMIT_WRAPPER_PARTS)",
                                         TT_LIMIT_WRAPPER_PARTS);
            if (out->n == out->cap) {
                size_t cap = out->cap ? out->cap * 2 : 8;
                tt_wrapper_part *p = tt_reallocarray(out->parts, cap, sizeof *p);
                if (!p)
                    return tt_error_set(err, TT_ENOMEM, name, -1, "out of memory");
                out->parts = p;
                out->cap = cap;
            }
            cur = out->n++;
            tt_wrapper_part *part = &out->parts[cur];
            memset(part, 0, sizeof *part);
            part->text_off = ln.next;
            in_doc = seen_doc = 1;
            continue;
        }
        if (!in_doc) {
            if (seen_doc)
                continue;
            if (!have_entity && (v = after_tag(t, ln.e, "COMPANY CONFORMED NAME:"))) {
                copy_field(out->entity, sizeof out->entity, v, ln.e);
                have_entity = 1;
            } else if (!have_period && (v = after_tag(t, ln.e, "CONFORMED PERIOD OF REPORT:"))) {
                copy_field(out->period, sizeof out->period, v, ln.e);
                have_period = 1;
            } else if (!have_form && (v = after_tag(t, ln.e, "CONFORMED SUBMISSION TYPE:"))) {
                copy_field(out->form, sizeof out->form, v, ln.e);
                have_form = 1;
            }
            continue;
        }
        tt_wrapper_part *part = &out->parts[cur];
        if (starts_ci(t, ln.e, "</DOCUMENT>")) {
            in_doc = 0;
        } else if ((v = after_tag(t, ln.e, "<TYPE>"))) {
            copy_field(part->type, sizeof part->type, v, ln.e);
        } else if ((v = after_tag(t, ln.e, "<SEQUENCE>"))) {
            part->seq = parse_seq(v, ln.e);
        } else if ((v = after_tag(t, ln.e, "<FILENAME>"))) {
            copy_field(part->filename, sizeof part->filename, v, ln.e);
        } else if ((v = after_tag(t, ln.e, "<DESCRIPTION>"))) {
            copy_field(part->description, sizeof part->description, v, ln.e);
        } else if ((v = after_tag(t, ln.e, "<TEXT>"))) {
            in_text = 1;
            if (skip_blanks(v, ln.e) == ln.e) {
                part->text_off = ln.next;
            } else {
                /* The body starts on the <TEXT> line itself, and may even
                 * end there. */
                part->text_off = (size_t)(v - text);
                const char *e = trim_end(v, ln.e);
                if (e - v >= 7 && eq_ci(e - 7, "</TEXT>", 7)) {
                    part->text_len = (size_t)(e - 7 - v);
                    in_text = 0;
                }
            }
        }
    }
    if (in_text)
        out->parts[cur].text_len = len - out->parts[cur].text_off;
    if (!seen_doc)
        return tt_error_set(err, TT_EPARSE, name, -1,
                            "no <DOCUMENT> found in the submission wrapper");
    for (size_t i = 0; i < out->n; i++) {
        tt_wrapper_part *part = &out->parts[i];
        if (part->seq == 0)
            part->seq = i + 1;
        if (part->text_off > len)
            part->text_off = len;
        part->uuencoded = is_uuencoded(text + part->text_off, part->text_len);
    }
    return TT_OK;
}

/* ---- the type filter ---------------------------------------------------------- */

static int ci_equal(const char *a, size_t an, const char *b)
{
    size_t bn = strlen(b);
    if (an != bn)
        return 0;
    for (size_t i = 0; i < an; i++)
        if (tti_ascii_lower((unsigned char)a[i]) != tti_ascii_lower((unsigned char)b[i]))
            return 0;
    return 1;
}

static int ci_prefix(const char *s, const char *prefix, size_t pn)
{
    if (strlen(s) < pn)
        return 0;
    for (size_t i = 0; i < pn; i++)
        if (tti_ascii_lower((unsigned char)s[i]) != tti_ascii_lower((unsigned char)prefix[i]))
            return 0;
    return 1;
}

static int ci_suffix(const char *s, const char *suffix)
{
    size_t n = strlen(s), m = strlen(suffix);
    return n >= m && ci_equal(s + n - m, m, suffix);
}

static int default_keep(const tt_wrapper_part *part)
{
    static const char *const types[] = { "GRAPHIC", "ZIP", "EXCEL", "XML", "JSON", "PDF" };
    static const char *const exts[] = { ".xml", ".xsd", ".jpg", ".gif", ".png", ".pdf",
                                        ".zip", ".xlsx", ".json", ".js", ".css" };
    if (ci_prefix(part->type, "EX-", 3))
        return 0;
    for (size_t i = 0; i < sizeof types / sizeof types[0]; i++)
        if (ci_equal(part->type, strlen(part->type), types[i]))
            return 0;
    for (size_t i = 0; i < sizeof exts / sizeof exts[0]; i++)
        if (ci_suffix(part->filename, exts[i]))
            return 0;
    return 1;
}

int tt_wrapper_keep(const tt_wrapper_part *part, const char *types)
{
    if (part->uuencoded)
        return 0;
    if (!types || !*types)
        return default_keep(part);
    const char *p = types;
    while (*p) {
        const char *comma = strchr(p, ',');
        const char *e = comma ? comma : p + strlen(p);
        const char *s = p;
        while (s < e && tti_is_ascii_space((unsigned char)*s))
            s++;
        const char *ie = trim_end(s, e);
        size_t n = (size_t)(ie - s);
        if (n > 0) {
            if (ci_equal(s, n, "all"))
                return 1;
            if (s[n - 1] == '*') {
                if (ci_prefix(part->type, s, n - 1))
                    return 1;
            } else if (ci_equal(s, n, part->type)) {
                return 1;
            }
        }
        if (!comma)
            break;
        p = comma + 1;
    }
    return 0;
}
