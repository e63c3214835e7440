/* termtide — the report page.
 *
 * A report is a body and a table of contents, grown part by part, then
 * wrapped into one XHTML5 page by tt_report_write. The page is
 * self-contained by construction: its only style is an inline <style>, its
 * pictures are inline SVG, and a content security policy of "default-src
 * 'none'" tells the browser to refuse any fetch or script should one ever
 * slip in. It is also well-formed XML (every element closed, attributes
 * quoted, the CSS free of < and &), so a test can parse it back.
 *
 * Safety rests on one rule: text reaches the page only through
 * tt_svg_escape, the library's one markup escaper; only the pictures, which
 * termtide's own SVG writers made with the same escaper, are inserted as
 * markup. Their <title>/<desc> ids are numbered per picture so that
 * aria-labelledby never points at another picture's title.
 *
 * Cost: linear in the page's size; a table is scanned once for alignment
 * and once to write. */
#include <string.h>

#include "termtide/limits.h"
#include "termtide/report.h"
#include "termtide/svg.h"

const char tt_report_caution[] =
    "termtide measures language. It gives no investment, legal or compliance advice; "
    "defer to your firm's policies and to licensed professionals.";

void tt_report_init(tt_report *r)
{
    tt_buf_init(&r->body, TT_LIMIT_REPORT_BYTES);
    tt_buf_init(&r->contents, TT_LIMIT_REPORT_BYTES);
    r->figures = 0;
    r->anchors = 0;
    r->chapters = 0;
}

void tt_report_release(tt_report *r)
{
    tt_buf_release(&r->body);
    tt_buf_release(&r->contents);
}

tt_status tt_report_heading(tt_report *r, int level, const char *text)
{
    if (level < 1 || level > 3)
        return TT_EINVAL;
    unsigned id = ++r->anchors;
    if (level == 1)
        r->chapters++;
    tt_status st = tt_buf_printf(&r->body, "<h%d id=\"part-%u\">", level + 1, id);
    if (!st) st = tt_svg_escape(&r->body, text, strlen(text));
    if (!st) st = tt_buf_printf(&r->body, "</h%d>\n", level + 1);
    if (!st && level <= 2) {
        st = tt_buf_printf(&r->contents, "<li class=\"toc%d\"><a href=\"#part-%u\">", level, id);
        if (!st) st = tt_svg_escape(&r->contents, text, strlen(text));
        if (!st) st = tt_buf_puts(&r->contents, "</a></li>\n");
    }
    return st;
}

tt_status tt_report_para(tt_report *r, const char *text, int note)
{
    tt_status st = tt_buf_puts(&r->body, note ? "<p class=\"note\">" : "<p>");
    if (!st) st = tt_svg_escape(&r->body, text, strlen(text));
    if (!st) st = tt_buf_puts(&r->body, "</p>\n");
    return st;
}

/* A column is numeric when every chosen cell is a number or "n/a". */
static int numeric_column(const tt_tsv *t, size_t col, const size_t *rows, size_t nrows)
{
    if (!nrows)
        return 0;
    for (size_t i = 0; i < nrows; i++) {
        size_t r = rows ? rows[i] : i;
        double v;
        const char *s = tt_tsv_cell(t, r, col);
        if (!strcmp(s, "n/a"))
            continue;
        if (!s[0] || !tt_tsv_number(t, r, col, &v))
            return 0;
    }
    return 1;
}

tt_status tt_report_table(tt_report *r, const tt_tsv *t, const char *source,
                          const tt_report_column *cols, size_t ncols, const size_t *rows,
                          size_t nrows, const char *caption, tt_error *err)
{
    if (!rows && nrows > t->nrows)
        return TT_EINVAL;
    size_t idx[64];
    unsigned cls[64];
    if (ncols > sizeof idx / sizeof idx[0])
        return tt_error_set(err, TT_ELIMIT, source, -1, "more than %zu columns in one report table",
                            sizeof idx / sizeof idx[0]);
    for (size_t c = 0; c < ncols; c++) {
        long k = tt_tsv_column(t, cols[c].name);
        if (k < 0)
            return tt_error_set(err, TT_EPARSE, source, -1, "no column '%s'", cols[c].name);
        idx[c] = (size_t)k;
        cls[c] = cols[c].flags;
        if (numeric_column(t, idx[c], rows, nrows))
            cls[c] |= 0x100u;
    }
    for (size_t i = 0; rows && i < nrows; i++)
        if (rows[i] >= t->nrows)
            return TT_EINVAL;
    tt_buf *b = &r->body;
    tt_status st = tt_buf_puts(b, "<div class=\"scroll\"><table>\n");
    if (!st && caption) {
        st = tt_buf_puts(b, "<caption>");
        if (!st) st = tt_svg_escape(b, caption, strlen(caption));
        if (!st) st = tt_buf_puts(b, "</caption>\n");
    }
    if (!st) st = tt_buf_puts(b, "<thead><tr>");
    for (size_t c = 0; c < ncols && !st; c++) {
        const char *label = cols[c].label ? cols[c].label : cols[c].name;
        st = tt_buf_puts(b, cls[c] & 0x100u ? "<th class=\"num\">" : "<th>");
        if (!st) st = tt_svg_escape(b, label, strlen(label));
        if (!st) st = tt_buf_puts(b, "</th>");
    }
    if (!st) st = tt_buf_puts(b, "</tr></thead>\n<tbody>\n");
    for (size_t i = 0; i < nrows && !st; i++) {
        size_t row = rows ? rows[i] : i;
        st = tt_buf_puts(b, "<tr>");
        for (size_t c = 0; c < ncols && !st; c++) {
            const char *s = tt_tsv_cell(t, row, idx[c]);
            unsigned f = cls[c];
            const char *open = f & 0x100u            ? "<td class=\"num\">"
                               : f & TT_REPORT_MARK  ? "<td class=\"hit\"><mark>"
                               : f & TT_REPORT_RIGHT ? "<td class=\"before\">"
                               : f & TT_REPORT_WRAP  ? "<td class=\"wrap\">"
                                                     : "<td>";
            st = tt_buf_puts(b, open);
            if (!st) st = tt_svg_escape(b, s, strlen(s));
            if (!st) st = tt_buf_puts(b, (f & TT_REPORT_MARK) && !(f & 0x100u) ? "</mark></td>"
                                                                               : "</td>");
        }
        if (!st) st = tt_buf_puts(b, "</tr>\n");
    }
    if (!st) st = tt_buf_puts(b, "</tbody></table></div>\n");
    return st;
}

/* Appends svg[from, to) with the ids "tt-title" and "tt-desc" (always
 * written quoted by tt_svg_begin, and a quote in text is always escaped, so
 * the quoted form only ever is an id or a reference to one) numbered n. */
static tt_status put_numbered_ids(tt_buf *b, const char *svg, size_t len, unsigned n)
{
    static const char *const ids[] = { "\"tt-title\"", "\"tt-desc\"" };
    size_t i = 0, run = 0;
    tt_status st = TT_OK;
    while (i < len && !st) {
        size_t hit = 0;
        if (svg[i] == '"')
            for (size_t k = 0; k < 2 && !hit; k++) {
                size_t il = strlen(ids[k]);
                if (len - i >= il && !memcmp(svg + i, ids[k], il))
                    hit = il;
            }
        if (!hit) {
            i++;
            run++;
            continue;
        }
        st = tt_buf_append(b, svg + i - run, run);
        run = 0;
        if (!st) st = tt_buf_append(b, svg + i, hit - 1);
        if (!st) st = tt_buf_printf(b, "-%u\"", n);
        i += hit;
    }
    if (!st && run)
        st = tt_buf_append(b, svg + len - run, run);
    return st;
}

tt_status tt_report_figure(tt_report *r, const char *svg, size_t len, const char *caption)
{
    /* drop the XML declaration: it may only open a document */
    if (len >= 5 && !memcmp(svg, "<?xml", 5)) {
        const char *end = memchr(svg, '>', len);
        if (!end)
            return TT_EINVAL;
        size_t skip = (size_t)(end - svg) + 1;
        while (skip < len && (svg[skip] == '\n' || svg[skip] == '\r'))
            skip++;
        svg += skip;
        len -= skip;
    }
    if (len < 4 || memcmp(svg, "<svg", 4))
        return TT_EINVAL;
    unsigned n = ++r->figures;
    tt_buf *b = &r->body;
    tt_status st = tt_buf_puts(b, "<figure>\n");
    if (!st) st = put_numbered_ids(b, svg, len, n);
    if (!st && caption) {
        st = tt_buf_puts(b, "<figcaption>");
        if (!st) st = tt_svg_escape(b, caption, strlen(caption));
        if (!st) st = tt_buf_puts(b, "</figcaption>\n");
    }
    if (!st) st = tt_buf_puts(b, "</figure>\n");
    return st;
}

/* The style: a readable column of text, tables that scroll sideways rather
 * than overflow, pictures that shrink to the page, and print rules that keep
 * a figure on one sheet. No < or & here: the page must stay well-formed. */
static const char css[] =
    "body{font-family:'DejaVu Sans',Verdana,sans-serif;color:#222;background:#fff;"
    "margin:0 auto;max-width:1120px;padding:24px 32px 48px;line-height:1.45;font-size:15px}\n"
    "h1{font-size:26px;margin:0 0 4px}\n"
    "h2{font-size:22px;border-bottom:2px solid #1e4a73;padding-bottom:4px;margin-top:40px}\n"
    "h3{font-size:18px;margin-top:28px;color:#1e4a73}\n"
    "h4{font-size:15px;margin-top:20px}\n"
    ".sub{color:#555;margin:0 0 16px}\n"
    ".caution{border-left:4px solid #c0702e;background:#fbf4ec;padding:8px 12px;margin:16px 0}\n"
    ".note{color:#555;font-size:13px}\n"
    "nav ul{list-style:none;padding-left:0;columns:2}\n"
    "nav li.toc2{padding-left:18px;font-size:13px}\n"
    "a{color:#1e4a73}\n"
    ".scroll{overflow-x:auto;margin:8px 0 16px}\n"
    "table{border-collapse:collapse;font-size:13px}\n"
    "caption{text-align:left;font-weight:bold;padding:4px 0}\n"
    "th,td{border-bottom:1px solid #e3e6ea;padding:3px 8px;text-align:left;vertical-align:top;"
    "white-space:nowrap}\n"
    "th{background:#f3f5f7;border-bottom:1px solid #b9c0c8;white-space:normal;vertical-align:bottom}\n"
    "td.num,th.num{text-align:right;font-variant-numeric:tabular-nums}\n"
    "td.before{text-align:right;color:#444;white-space:normal;min-width:12em;max-width:24em}\n"
    "td.hit{white-space:normal;max-width:14em}\n"
    "td.wrap{white-space:normal;min-width:320px;max-width:640px}\n"
    "mark{background:#f5d9b8;color:#111;padding:0 2px}\n"
    "figure{margin:12px 0 24px}\n"
    "figure svg{max-width:100%;height:auto;border:1px solid #e3e6ea}\n"
    "figcaption{color:#555;font-size:13px}\n"
    "footer{margin-top:48px;border-top:1px solid #ccc;padding-top:8px;font-size:13px;color:#555}\n"
    "@media print{body{max-width:none}figure,table{break-inside:avoid}}\n";

tt_status tt_report_write(const tt_report *r, const char *title, const char *subtitle,
                          const char *generator, tt_buf *out)
{
    tt_status st = tt_buf_puts(
        out,
        "<!DOCTYPE html>\n<html xmlns=\"http://www.w3.org/1999/xhtml\" lang=\"en\">\n<head>\n"
        "<meta charset=\"utf-8\"/>\n"
        "<meta http-equiv=\"Content-Security-Policy\" content=\"default-src 'none'; "
        "style-src 'unsafe-inline'; img-src data:\"/>\n"
        "<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\"/>\n");
    if (!st && generator) {
        st = tt_buf_puts(out, "<meta name=\"generator\" content=\"");
        if (!st) st = tt_svg_escape(out, generator, strlen(generator));
        if (!st) st = tt_buf_puts(out, "\"/>\n");
    }
    if (!st) st = tt_buf_puts(out, "<title>");
    if (!st) st = tt_svg_escape(out, title, strlen(title));
    if (!st) st = tt_buf_puts(out, "</title>\n<style>\n");
    if (!st) st = tt_buf_puts(out, css);
    if (!st) st = tt_buf_puts(out, "</style>\n</head>\n<body>\n<header>\n<h1>");
    if (!st) st = tt_svg_escape(out, title, strlen(title));
    if (!st) st = tt_buf_puts(out, "</h1>\n");
    if (!st && subtitle) {
        st = tt_buf_puts(out, "<p class=\"sub\">");
        if (!st) st = tt_svg_escape(out, subtitle, strlen(subtitle));
        if (!st) st = tt_buf_puts(out, "</p>\n");
    }
    if (!st) st = tt_buf_puts(out, "<p class=\"caution\" role=\"note\">");
    if (!st) st = tt_svg_escape(out, tt_report_caution, strlen(tt_report_caution));
    if (!st) st = tt_buf_puts(out, "</p>\n</header>\n");
    if (!st && r->contents.len) {
        st = tt_buf_puts(out, "<nav aria-label=\"Contents\">\n<h2>Contents</h2>\n<ul>\n");
        /* one entry a line; past three chapters only the chapters */
        const char *p = r->contents.data, *end = p + r->contents.len;
        while (!st && p < end) {
            const char *nl = memchr(p, '\n', (size_t)(end - p));
            size_t n = nl ? (size_t)(nl - p) + 1 : (size_t)(end - p);
            if (r->chapters <= 3 || !(n > 15 && !memcmp(p, "<li class=\"toc2\"", 15)))
                st = tt_buf_append(out, p, n);
            p += n;
        }
        if (!st) st = tt_buf_puts(out, "</ul>\n</nav>\n");
    }
    if (!st) st = tt_buf_puts(out, "<main>\n");
    if (!st) st = tt_buf_append(out, r->body.data, r->body.len);
    if (!st) st = tt_buf_puts(out, "</main>\n<footer>\n<p>");
    if (!st) st = tt_svg_escape(out, tt_report_caution, strlen(tt_report_caution));
    if (!st) st = tt_buf_puts(out, "</p>\n");
    if (!st && generator) {
        st = tt_buf_puts(out, "<p>Made by ");
        if (!st) st = tt_svg_escape(out, generator, strlen(generator));
        if (!st) st = tt_buf_puts(out, ".</p>\n");
    }
    if (!st) st = tt_buf_puts(out, "</footer>\n</body>\n</html>\n");
    return st;
}
