/* termtide tests — the extract stage (HTML and plain text to blocks).
 *
 * Where the expected values come from:
 *   - Character references: Python's standard library. html.entities
 *     .name2codepoint is the HTML 4.01 table of 252 named references (HTML
 *     4.01, section 24), the set libxml2's HTML parser knows; every one of
 *     them, and numeric references across the code space, are compared with
 *     Python's chr() / html.unescape, run at test time.
 *   - Which elements end a block, which are dropped, the block kinds, white
 *     space (ASCII white space and U+00A0 collapse to one space) and the
 *     plain-text paragraph and hyphen rules: the contract in
 *     include/termtide/extract.h. That block elements break words and
 *     inline ones (span, b, font) do not is how browsers render HTML
 *     (common practice, HTML Living Standard's block/inline split, from
 *     memory).
 *   - "Letter" for the hyphen join: Unicode general category L* (Unicode
 *     15.0 UnicodeData.txt; U+00E9 is Ll, U+0661 ARABIC-INDIC DIGIT ONE is
 *     Nd, from memory and checked with Python's unicodedata.category below).
 *   - Offsets: the input itself; each block's src_off must point at the
 *     block's first word in the document.
 * All text is invented. */
#include "tt_test.h"

#include <pthread.h>
#include <time.h>
#include <unistd.h>

#include "termtide/alloc.h"
#include "termtide/simd.h"
#include "termtide/extract.h"
#include "termtide/limits.h"

/* ---- helpers ----------------------------------------------------------- */

/* Checks the layout invariants, then renders the blocks as
 * "kind:text|kind:text" with the kind's first letter (p, h, c, i). */
static void render(const tt_blocks *b, char *out, size_t size)
{
    size_t o = 0;
    out[0] = '\0';
    for (size_t k = 0; k < b->n; k++) {
        const tt_block *blk = &b->items[k];
        const char *t = b->text.data + blk->off;
        assert_true(blk->len > 0);
        assert_true(blk->off + blk->len < b->text.len + 1);
        assert_int_equal(t[blk->len], '\n');               /* the separator */
        assert_null(memchr(t, '\n', blk->len));
        assert_true(t[0] != ' ' && t[blk->len - 1] != ' '); /* trimmed */
        for (size_t i = 0; i + 1 < blk->len; i++)
            assert_false(t[i] == ' ' && t[i + 1] == ' ');   /* collapsed */
        int n = snprintf(out + o, size - o, "%s%c:%.*s", k ? "|" : "",
                         tt_block_kind_name(blk->kind)[0], (int)blk->len, t);
        assert_true(n > 0 && (size_t)n < size - o);
        o += (size_t)n;
    }
}

static void expect_html_opt(const char *html, int drop_tables, const char *want)
{
    tt_blocks b;
    tt_error err;
    tt_extract_options opt = { drop_tables };
    char got[8192];
    tt_blocks_init(&b);
    tt_error_init(&err);
    tt_status st = tt_extract_html(html, strlen(html), 0, &opt, &b, "t.html", &err);
    if (st != TT_OK) {
        print_error("html: %s\n  status %d: %s\n", html, st, err.message);
        fail();
    }
    render(&b, got, sizeof got);
    if (strcmp(got, want) != 0) {
        print_error("html: %s\n  want: %s\n  got:  %s\n", html, want, got);
        fail();
    }
    tt_blocks_release(&b);
}

static void expect_html(const char *html, const char *want)
{
    expect_html_opt(html, 0, want);
}

static void expect_text(const char *text, const char *want)
{
    tt_blocks b;
    tt_error err;
    char got[8192];
    tt_blocks_init(&b);
    tt_error_init(&err);
    assert_int_equal(tt_extract_text(text, strlen(text), 0, &b, "t.txt", &err), TT_OK);
    render(&b, got, sizeof got);
    if (strcmp(got, want) != 0) {
        print_error("text: \"%s\"\n  want: %s\n  got:  %s\n", text, want, got);
        fail();
    }
    assert_int_equal(b.repaired, 0);
    tt_blocks_release(&b);
}

static double now_seconds(void)
{
    struct timespec ts;
    clock_gettime(CLOCK_MONOTONIC, &ts);
    return (double)ts.tv_sec + (double)ts.tv_nsec / 1e9;
}

/* ---- the block list ---------------------------------------------------- */

static void test_blocks_api(void **state)
{
    (void)state;
    tt_blocks b;
    char got[256];
    tt_blocks_init(&b);
    assert_int_equal(b.n, 0);
    assert_int_equal(tt_blocks_add(&b, TT_BLOCK_HEADING, "Fleet", 5, 7), TT_OK);
    assert_int_equal(tt_blocks_add(&b, TT_BLOCK_CELL, "", 0, 9), TT_OK); /* not stored */
    assert_int_equal(tt_blocks_add(&b, TT_BLOCK_CELL, "a\nb", 3, 9), TT_EINVAL);
    for (int i = 0; i < 200; i++) /* past the first growth of the item array */
        assert_int_equal(tt_blocks_add(&b, TT_BLOCK_ITEM, "dock", 4, i), TT_OK);
    assert_int_equal(b.n, 201);
    assert_int_equal(b.items[0].src_off, 7);
    assert_int_equal(b.items[200].src_off, 199);
    assert_int_equal(b.text.len, 6 + 200 * 5);
    tt_blocks_reset(&b);
    assert_int_equal(b.n, 0);
    assert_int_equal(b.text.len, 0);
    assert_int_equal(tt_blocks_add(&b, TT_BLOCK_PARAGRAPH, "x y", 3, -1), TT_OK);
    render(&b, got, sizeof got);
    assert_string_equal(got, "p:x y");
    tt_blocks_clear(&b);
    assert_int_equal(b.n, 0);
    tt_blocks_release(&b);

    assert_string_equal(tt_block_kind_name(TT_BLOCK_PARAGRAPH), "paragraph");
    assert_string_equal(tt_block_kind_name(TT_BLOCK_HEADING), "heading");
    assert_string_equal(tt_block_kind_name(TT_BLOCK_CELL), "cell");
    assert_string_equal(tt_block_kind_name(TT_BLOCK_ITEM), "item");
}

/* ---- HTML: blocks, kinds, words ----------------------------------------- */

static void test_html_kinds(void **state)
{
    (void)state;
    expect_html("<html><body><h1>Annual Review</h1><p>Ferry traffic grew.</p>"
                "<h3>Outlook</h3><ul><li>New dock</li><li>Two vessels</li></ul>"
                "<dl><dt>Term</dt><dd>Meaning</dd></dl>"
                "<table><tr><th>Item</th><td>4,210</td></tr></table></body></html>",
                "h:Annual Review|p:Ferry traffic grew.|h:Outlook|i:New dock|i:Two vessels|"
                "i:Term|i:Meaning|c:Item|c:4,210");
    /* A generic block inside a cell or item keeps the cell or item kind;
     * text after a nested block goes back to the enclosing kind. */
    expect_html("<table><tr><td><p>Net</p><div>loss</div></td></tr></table>", "c:Net|c:loss");
    expect_html("<ul><li>before<p>inside</p>after</li></ul>", "i:before|i:inside|i:after");
    expect_html("<div>top<table><tr><td>cell</td></tr></table>tail</div>",
                "p:top|c:cell|p:tail");
    expect_html("<h2><span>Risk</span> <b>Factors</b></h2>", "h:Risk Factors");
    /* <br> and <hr> end a block. */
    expect_html("<p>line one<br>line two<hr/>line three</p>",
                "p:line one|p:line two|p:line three");
    /* Plain text without any element is one paragraph. */
    expect_html("just some text", "p:just some text");
    expect_html("", "");
}

static void test_html_block_elements_break_words(void **state)
{
    (void)state;
    /* Every element the contract calls a block, placed between two words
     * inside a <div>: the words must never glue. */
    static const char *const blocks[] = {
        "p", "div", "h1", "h2", "h3", "h4", "h5", "h6", "li", "dt", "dd", "td", "th",
        "tr", "table", "section", "article", "blockquote", "pre", "ul", "ol", "dl",
        "center", "form", "header", "footer", "nav", "aside", "address", "figure",
        "figcaption", "caption", "main",
    };
    for (size_t k = 0; k < sizeof blocks / sizeof blocks[0]; k++) {
        char html[256];
        snprintf(html, sizeof html, "<div>alpha<%s>beta</%s>gamma</div>", blocks[k], blocks[k]);
        tt_blocks b;
        tt_error err;
        tt_blocks_init(&b);
        assert_int_equal(tt_extract_html(html, strlen(html), 0, NULL, &b, "t", &err), TT_OK);
        if (strstr(b.text.data, "alphabeta") || strstr(b.text.data, "betagamma") ||
            !strstr(b.text.data, "alpha") || !strstr(b.text.data, "beta") ||
            !strstr(b.text.data, "gamma")) {
            print_error("element <%s>: text \"%s\"\n", blocks[k], b.text.data);
            fail();
        }
        tt_blocks_release(&b);
    }
    expect_html("<div>alpha<br>beta<hr>gamma</div>", "p:alpha|p:beta|p:gamma");
    expect_html("<p>one</p><p>two</p>", "p:one|p:two");
    /* body: text before and in the body never glue either. */
    expect_html("<html>lead<body>body</body></html>", "p:lead|p:body");
}

static void test_html_inline_elements_keep_words(void **state)
{
    (void)state;
    expect_html("<p><b>Reve</b>nue</p>", "p:Revenue");
    expect_html("<p>Reve<span>nu</span><i>e</i> <font size=2>rose</font> "
                "<a href=\"#x\">sharply</a></p>",
                "p:Revenue rose sharply");
    expect_html("<p>total <ix:nonFraction name=\"ex:A\" scale=\"3\">4,210</ix:nonFraction>"
                "<ix:nonNumeric name=\"ex:B\">k</ix:nonNumeric> units</p>",
                "p:total 4,210k units");
    expect_html("<p><span>net </span><span>loss</span></p>", "p:net loss");
    expect_html("<p><span>net</span>\n<span>loss</span></p>", "p:net loss");
}

static void test_html_whitespace(void **state)
{
    (void)state;
    expect_html("<p>  fuel \n\t costs&nbsp;&nbsp;rose\xc2\xa0\xc2\xa0sharply \r\n </p>",
                "p:fuel costs rose sharply");
    /* Empty and white-space-only blocks are not added. */
    expect_html("<p> </p><div>&nbsp;\xc2\xa0</div><td>\n</td><p></p><p>x</p>", "p:x");
    /* Other non-ASCII characters are not white space. */
    expect_html("<p>a\xe2\x80\x83" "b</p>", "p:a\xe2\x80\x83" "b"); /* U+2003 EM SPACE kept */
}

/* Runs Python and returns its standard output (the caller frees it). */
static char *run_python(const char *script)
{
    char cmd[4096];
    snprintf(cmd, sizeof cmd, "%s -c '%s'", tt_test_python(), script);
    FILE *p = popen(cmd, "r");
    assert_non_null(p);
    size_t cap = 1 << 16, len = 0;
    char *out = malloc(cap);
    assert_non_null(out);
    size_t n;
    while ((n = fread(out + len, 1, cap - len - 1, p)) > 0) {
        len += n;
        if (cap - len < 1024) {
            cap *= 2;
            out = realloc(out, cap);
            assert_non_null(out);
        }
    }
    out[len] = '\0';
    assert_int_equal(pclose(p), 0);
    return out;
}

/* The UTF-8 of cp, with U+00A0 (white space to the extractor) written as a
 * space, which is what a block holds between two letters. */
static void utf8_of(unsigned long cp, char *out)
{
    if (cp == 0xA0) {
        out[0] = ' ';
        out[1] = '\0';
    } else if (cp < 0x80) {
        out[0] = (char)cp;
        out[1] = '\0';
    } else if (cp < 0x800) {
        out[0] = (char)(0xC0 | (cp >> 6));
        out[1] = (char)(0x80 | (cp & 0x3F));
        out[2] = '\0';
    } else if (cp < 0x10000) {
        out[0] = (char)(0xE0 | (cp >> 12));
        out[1] = (char)(0x80 | ((cp >> 6) & 0x3F));
        out[2] = (char)(0x80 | (cp & 0x3F));
        out[3] = '\0';
    } else {
        out[0] = (char)(0xF0 | (cp >> 18));
        out[1] = (char)(0x80 | ((cp >> 12) & 0x3F));
        out[2] = (char)(0x80 | ((cp >> 6) & 0x3F));
        out[3] = (char)(0x80 | (cp & 0x3F));
        out[4] = '\0';
    }
}

/* Each line of `table` is "reference<TAB>hex code point"; each reference,
 * between 'x' and 'y' in its own <p>, must decode to that code point. */
static void check_references(const char *table, size_t want_at_least)
{
    size_t cap = strlen(table) * 3 + 64, len = 0, count = 0;
    char *html = malloc(cap);
    assert_non_null(html);
    html[0] = '\0';
    for (const char *line = table; *line;) {
        const char *tab = strchr(line, '\t');
        const char *eol = strchr(line, '\n');
        assert_non_null(tab);
        assert_non_null(eol);
        len += (size_t)snprintf(html + len, cap - len, "<p>x%.*sy</p>", (int)(tab - line), line);
        assert_true(len < cap);
        count++;
        line = eol + 1;
    }
    assert_true(count >= want_at_least);

    tt_blocks b;
    tt_error err;
    tt_blocks_init(&b);
    assert_int_equal(tt_extract_html(html, len, 0, NULL, &b, "refs", &err), TT_OK);
    assert_int_equal(b.n, count);
    size_t k = 0;
    for (const char *line = table; *line; k++) {
        const char *tab = strchr(line, '\t');
        const char *eol = strchr(line, '\n');
        unsigned long cp = strtoul(tab + 1, NULL, 16);
        char want[16], ch[8];
        utf8_of(cp, ch);
        snprintf(want, sizeof want, "x%sy", ch);
        const tt_block *blk = &b.items[k];
        if (blk->len != strlen(want) || memcmp(b.text.data + blk->off, want, blk->len) != 0) {
            print_error("%.*s: want U+%04lX, got \"%.*s\"\n", (int)(tab - line), line, cp,
                        (int)blk->len, b.text.data + blk->off);
            fail();
        }
        line = eol + 1;
    }
    tt_blocks_release(&b);
    free(html);
}

static void test_html_character_references(void **state)
{
    (void)state;
    /* Python's html.entities.name2codepoint: the 252 HTML 4.01 names. */
    char *named = run_python(
        "import html.entities as e\n"
        "for n, c in sorted(e.name2codepoint.items()): print(\"&%s;\\t%x\" % (n, c))\n");
    check_references(named, 250);
    free(named);

    /* Numeric references, decimal and hexadecimal, across the planes; the
     * expected code point is Python's html.unescape of the same reference. */
    char *numeric = run_python(
        "import html\n"
        "cps = [0x21, 0x41, 0xe9, 0x100, 0x3b1, 0x5d0, 0x20ac, 0x2014, 0x2019, 0x4e2d, 0xfb01,"
        " 0x1f600, 0x10348]\n"
        "for c in cps:\n"
        "  for r in (\"&#%d;\" % c, \"&#x%x;\" % c, \"&#X%X;\" % c):\n"
        "    print(\"%s\\t%x\" % (r, ord(html.unescape(r))))\n");
    check_references(numeric, 39);
    free(numeric);

    /* The ones the contract names, spelled out. */
    expect_html("<p>R&amp;D&nbsp;costs &#8217; &#x2014; &rsquo; caf&eacute;</p>",
                "p:R&D costs \xe2\x80\x99 \xe2\x80\x94 \xe2\x80\x99 caf\xc3\xa9");
}

static void test_html_dropped_content(void **state)
{
    (void)state;
    expect_html("<html><head><title>Secret title</title><style>p{color:red}</style>"
                "<script>var x = '<p>no</p>';</script></head>"
                "<body><p>kept</p><script>document.write('no')</script>"
                "<noscript>no script</noscript><template><p>tmpl</p></template>"
                "<svg><text>chart label</text></svg><p>also kept</p></body></html>",
                "p:kept|p:also kept");
    /* The hidden attribute, in any case, with or without a value. */
    expect_html("<p>shown</p><p hidden>gone</p><div HIDDEN=\"hidden\"><p>gone too</p></div>"
                "<p>a<span hidden>GONE</span>b</p>",
                "p:shown|p:ab");
    /* display:none with any spacing and case; other declarations around it;
     * look-alikes stay visible. */
    expect_html("<div style=\"display:none\">x1</div>"
                "<div style=\"DISPLAY : NONE\">x2</div>"
                "<div style=\"color: red;display:\tnone !important; margin:0\">x3</div>"
                "<div style='Display:None;'>x4</div>"
                "<div style=\"display:block\">v1</div>"
                "<div style=\"display: nonexistent\">v2</div>"
                "<div style=\"mso-display:none\">v3</div>"
                "<div style=\"font-family:none; color:blue\">v4</div>",
                "p:v1|p:v2|p:v3|p:v4");
    /* ix:header, whatever the case of the tag. */
    expect_html("<p>before</p><ix:header><ix:hidden>hid</ix:hidden></ix:header>"
                "<IX:HEADER>HID2</IX:HEADER><p>after</p>",
                "p:before|p:after");
    /* Text after a dropped subtree continues; nested drops unwind. */
    expect_html("<div>one<div hidden><div hidden>x</div>y</div>two</div>", "p:one|p:two");
}

static void test_html_inline_xbrl_fixture(void **state)
{
    (void)state;
    size_t len;
    char *doc = tt_test_read("tests/fixtures/extract/inline_xbrl.xhtml", &len);
    tt_blocks b;
    tt_error err;
    char got[4096];
    tt_blocks_init(&b);
    assert_int_equal(tt_extract_html(doc, len, 0, NULL, &b, "inline_xbrl.xhtml", &err), TT_OK);
    render(&b, got, sizeof got);
    assert_string_equal(got,
                        "h:Quarterly Report|h:Results of Operations|"
                        "p:Ferry revenue rose to 4,210 thousand dollars as crossings recovered; "
                        "the company\xe2\x80\x99s fuel costs fell.|"
                        "c:Line item|c:Amount|c:Net|c:loss|c:Fuel costs|c:1,385|"
                        "i:Dock repairs finished early.|i:Two vessels refitted.|"
                        "p:Outlook: steady\xe2\x80\x94subject to weather.");
    assert_null(strstr(b.text.data, "hidden"));
    assert_null(strstr(b.text.data, "Brindlewick"));
    assert_null(strstr(b.text.data, "Netloss"));
    tt_blocks_release(&b);

    /* drop_tables leaves the statement table out, nothing else. */
    tt_extract_options opt = { 1 };
    tt_blocks_init(&b);
    assert_int_equal(tt_extract_html(doc, len, 0, &opt, &b, "inline_xbrl.xhtml", &err), TT_OK);
    assert_null(strstr(b.text.data, "1,385"));
    assert_null(strstr(b.text.data, "Line item"));
    assert_non_null(strstr(b.text.data, "4,210 thousand"));
    assert_non_null(strstr(b.text.data, "Dock repairs"));
    tt_blocks_release(&b);
    free(doc);
}

static void test_html_drop_tables(void **state)
{
    (void)state;
    const char *doc = "<p>intro</p><table><caption>cap</caption><tr><td>a<table><tr><td>inner"
                      "</td></tr></table>b</td></tr></table><p>outro</p>"
                      "<td>orphan cell</td>";
    expect_html_opt(doc, 0, "p:intro|p:cap|c:a|c:inner|c:b|p:outro|c:orphan cell");
    /* A <td> outside any <table> is not table content. */
    expect_html_opt(doc, 1, "p:intro|p:outro|c:orphan cell");
}

static void test_html_malformed(void **state)
{
    (void)state;
    /* Unclosed and misnested tags are read. */
    expect_html("<p>a<b>b<p>c", "p:ab|p:c");
    expect_html("<td>net</td><td>loss</td>", "c:net|c:loss");
    expect_html("<div><b>bold<i>both</b>italic</i></div>", "p:boldbothitalic");
    expect_html("<p>x</span></div></td>y</p>", "p:xy");
    expect_html("<p>unterminated <b attr=\"x\">z", "p:unterminated z");
    expect_html("<p>a < b and c > d</p>", "p:a < b and c > d");

    /* Repairs are counted; a clean document has none. */
    tt_blocks b;
    tt_error err;
    tt_blocks_init(&b);
    const char *bad = "<div><b>x</div></span><p>y</p><html><body><p>z</p>";
    assert_int_equal(tt_extract_html(bad, strlen(bad), 0, NULL, &b, "t", &err), TT_OK);
    /* div/b mismatch, stray </span>, misplaced <html>, misplaced <body>. */
    assert_true(b.repaired >= 4);
    const char *good = "<html><head><title>t</title></head><body><p>fine <b>bold</b></p>"
                       "<ix:nonFraction name=\"a\">1</ix:nonFraction></body></html>";
    assert_int_equal(tt_extract_html(good, strlen(good), 0, NULL, &b, "t", &err), TT_OK);
    assert_int_equal(b.repaired, 0);
    assert_int_equal(b.n, 2); /* "fine bold", then the fact in its own implied paragraph */
    tt_blocks_release(&b);
}

static char *nested(size_t depth, const char *open, const char *close, const char *inner)
{
    size_t lo = strlen(open), lc = strlen(close), li = strlen(inner);
    char *s = malloc(depth * (lo + lc) + li + 1);
    assert_non_null(s);
    char *p = s;
    for (size_t i = 0; i < depth; i++, p += lo)
        memcpy(p, open, lo);
    memcpy(p, inner, li);
    p += li;
    for (size_t i = 0; i < depth; i++, p += lc)
        memcpy(p, close, lc);
    *p = '\0';
    return s;
}

static void expect_too_deep(const char *doc)
{
    tt_blocks b;
    tt_error err;
    char msg[2048];
    tt_blocks_init(&b);
    tt_error_init(&err);
    double t0 = now_seconds();
    tt_status st = tt_extract_html(doc, strlen(doc), 100, NULL, &b, "deep.html", &err);
    double dt = now_seconds() - t0;
    assert_int_equal(st, TT_ELIMIT);
    assert_int_equal(err.status, TT_ELIMIT);
    assert_string_equal(err.file, "deep.html");
    assert_non_null(strstr(err.message, "TT_LIMIT_HTML_DEPTH"));
    snprintf(msg, sizeof msg, "%d", TT_LIMIT_HTML_DEPTH);
    assert_non_null(strstr(err.message, msg));
    assert_true(err.offset >= 100);
    assert_int_equal(b.n, 0); /* nothing half-read is left behind */
    /* The stop is at the limit, not after reading 100,000 levels: well
     * under a second even under AddressSanitizer. */
    assert_true(dt < 5.0);
    tt_error_format(&err, msg, sizeof msg);
    assert_non_null(strstr(msg, "deep.html"));
    tt_blocks_release(&b);
}

static void test_html_depth_limit(void **state)
{
    (void)state;
    char *doc = nested(100000, "<div>", "</div>", "deep");
    expect_too_deep(doc);
    free(doc);
    /* Mismatched end tags: libxml2 scans its element stack for each, which
     * would be quadratic at this depth without the limit. */
    doc = nested(100000, "<div>", "</span>", "deep");
    expect_too_deep(doc);
    free(doc);
    doc = nested(100000, "<b>", "", "deep");
    expect_too_deep(doc);
    free(doc);

    /* Within the limit: html + body + 250 divs = 252 open elements. */
    doc = nested(250, "<div>", "</div>", "deep but fine");
    expect_html(doc, "p:deep but fine");
    free(doc);
}

static void test_html_offsets(void **state)
{
    (void)state;
    /* Each block's src_off points at its first word in the input. */
    const char *doc = "<html>\r\n<body>\r\n<h1>  Title here</h1>\n<p>\n   First para "
                      "<b>bold</b> text.</p><table><tr><td> 12 </td><td>&amp; co</td></tr>"
                      "</table><p><!-- note -->&nbsp;After a comment</p><ul><li>item "
                      "<span>one</span></li></ul>\xc3\xa9t\xc3\xa9 end";
    const char *firsts[] = { "Title", "First", "12",  "&amp;",
                             "After", "item",  "\xc3\xa9t\xc3\xa9" };
    tt_blocks b;
    tt_error err;
    tt_blocks_init(&b);
    const long long base = 5000;
    assert_int_equal(tt_extract_html(doc, strlen(doc), base, NULL, &b, "t", &err), TT_OK);
    assert_int_equal(b.n, sizeof firsts / sizeof firsts[0]);
    for (size_t k = 0; k < b.n; k++) {
        long long at = b.items[k].src_off - base;
        assert_true(at >= 0 && (size_t)at < strlen(doc));
        if (strncmp(doc + at, firsts[k], strlen(firsts[k])) != 0) {
            print_error("block %zu: want \"%s\" at %lld, found \"%.12s\"\n", k, firsts[k], at,
                        doc + at);
            fail();
        }
    }
    tt_blocks_release(&b);

    /* A block longer than libxml2's 1000-byte text piece, and one after it. */
    char big[8000];
    size_t o = (size_t)snprintf(big, sizeof big, "<p>\n");
    for (int i = 0; i < 300; i++)
        o += (size_t)snprintf(big + o, sizeof big - o, "word%03d ", i);
    o += (size_t)snprintf(big + o, sizeof big - o, "</p><div>  second one</div>");
    tt_blocks_init(&b);
    assert_int_equal(tt_extract_html(big, o, 0, NULL, &b, "t", &err), TT_OK);
    assert_int_equal(b.n, 2);
    assert_int_equal(b.items[0].src_off, 4);
    assert_memory_equal(big + b.items[1].src_off, "second one", 10);
    tt_blocks_release(&b);
}

static void test_html_encoding_hints_ignored(void **state)
{
    (void)state;
    /* The input is already UTF-8; a declared legacy charset must not make
     * libxml2 decode it again ("café" would become "cafÃ©"). */
    expect_html("<html><head><meta charset=\"windows-1252\"></head><body><p>caf\xc3\xa9"
                "</p></body></html>",
                "p:caf\xc3\xa9");
    expect_html("<html><head><meta http-equiv=\"Content-Type\" content=\"text/html; "
                "charset=iso-8859-1\"></head><body><p>na\xc3\xafve \xe2\x82\xac"
                "</p></body></html>",
                "p:na\xc3\xafve \xe2\x82\xac");
    expect_html("<?xml version=\"1.0\" encoding=\"windows-1252\"?><html><body><p>\xc3\xa9t\xc3\xa9"
                "</p></body></html>",
                "p:\xc3\xa9t\xc3\xa9");
    /* A byte order mark is not text. */
    expect_html("\xef\xbb\xbf<p>bom</p>", "p:bom");
}

static void test_html_bad_bytes(void **state)
{
    (void)state;
    /* Invalid UTF-8 and NUL bytes (the decode stage never passes them on,
     * but a library caller might) become spaces; the rest reads correctly
     * instead of being re-read as Latin-1. */
    static const char doc1[] = "<p>ab\xff" "cd</p><p>caf\xc3\xa9</p>";
    static const char doc2[] = "<\0p\0>\0x\0<p>caf\xc3\xa9</p>";
    static const char doc3[] = "<p>one\0two</p><p>\xc3(</p>";
    tt_blocks b;
    tt_error err;
    char got[256];
    tt_blocks_init(&b);
    assert_int_equal(tt_extract_html(doc1, sizeof doc1 - 1, 0, NULL, &b, "t", &err), TT_OK);
    render(&b, got, sizeof got);
    assert_string_equal(got, "p:ab cd|p:caf\xc3\xa9");
    assert_int_equal(tt_extract_html(doc2, sizeof doc2 - 1, 0, NULL, &b, "t", &err), TT_OK);
    render(&b, got, sizeof got);
    assert_non_null(strstr(got, "caf\xc3\xa9"));
    assert_int_equal(tt_extract_html(doc3, sizeof doc3 - 1, 0, NULL, &b, "t", &err), TT_OK);
    render(&b, got, sizeof got);
    assert_string_equal(got, "p:one two|p:(");
    tt_blocks_release(&b);
}

static void test_html_prints_nothing(void **state)
{
    (void)state;
    /* libxml2 must never write to stderr, whatever the input. */
    fflush(stderr);
    int saved = dup(2);
    assert_true(saved >= 0);
    FILE *tmp = tmpfile();
    assert_non_null(tmp);
    assert_true(dup2(fileno(tmp), 2) >= 0);
    const char *docs[] = {
        "<div><b>x</div></span><html><body>&bogus; &#xZZ; <p attr=\"unterminated>q",
        "<?xml version=\"1.0\" encoding=\"no-such-charset\"?><!DOCTYPE x SYSTEM "
        "\"http://example.invalid/x.dtd\"><p>&ext;</p><![CDATA[ c ]]>",
        "<p>\xff\xfe broken</p><",
    };
    tt_blocks b;
    tt_error err;
    tt_blocks_init(&b);
    for (size_t k = 0; k < sizeof docs / sizeof docs[0]; k++)
        assert_int_equal(tt_extract_html(docs[k], strlen(docs[k]), 0, NULL, &b, "t", &err), TT_OK);
    tt_blocks_release(&b);
    fflush(stderr);
    assert_true(dup2(saved, 2) >= 0);
    close(saved);
    assert_int_equal(fseek(tmp, 0, SEEK_END), 0);
    assert_int_equal(ftell(tmp), 0);
    fclose(tmp);
}

/* ---- out of memory ------------------------------------------------------ */

static long alloc_budget; /* allocations left before failing; -1: never fail */

static void *failing_malloc(size_t n)
{
    if (alloc_budget == 0)
        return NULL;
    if (alloc_budget > 0)
        alloc_budget--;
    return malloc(n);
}

static void *failing_realloc(void *p, size_t n)
{
    if (alloc_budget == 0)
        return NULL;
    if (alloc_budget > 0)
        alloc_budget--;
    return realloc(p, n);
}

static void test_out_of_memory(void **state)
{
    (void)state;
    /* Fails the 1st, 2nd, ... allocation of our own code in turn (libxml2
     * allocates through its own hooks): each failure is reported as
     * TT_ENOMEM, never a crash or a leak (ASan's leak checker watches). */
    static const tt_allocator failing = { failing_malloc, failing_realloc, free };
    char html[20000], text[20000];
    size_t ho = 0, to = 0;
    for (int i = 0; i < 200; i++) {
        ho += (size_t)snprintf(html + ho, sizeof html - ho, "<p>para %d \xc3\xa9t\xc3\xa9</p>", i);
        to += (size_t)snprintf(text + to, sizeof text - to, "para %d off-\nbalance\n\n", i);
    }
    for (int which = 0; which < 2; which++) {
        int saw_ok = 0;
        for (long budget = 0; budget < 400 && !saw_ok; budget++) {
            tt_blocks b;
            tt_error err;
            tt_blocks_init(&b);
            tt_error_init(&err);
            alloc_budget = budget;
            tt_set_allocator(&failing);
            tt_status st = which == 0
                               ? tt_extract_html(html, ho, 0, NULL, &b, "oom.html", &err)
                               : tt_extract_text(text, to, 0, &b, "oom.txt", &err);
            tt_set_allocator(NULL);
            if (st == TT_OK) {
                saw_ok = 1;
                assert_int_equal(b.n, 200);
            } else {
                assert_int_equal(st, TT_ENOMEM);
                assert_int_equal(err.status, TT_ENOMEM);
                assert_int_equal(b.n, 0);
            }
            tt_blocks_release(&b);
        }
        assert_true(saw_ok);
    }
}

/* ---- threads ------------------------------------------------------------ */

static void *extract_in_thread(void *arg)
{
    (void)arg;
    const char *doc = "<h1>Ferry</h1><p>a<b>b</b></p><table><tr><td>1</td></tr></table>";
    for (int i = 0; i < 200; i++) {
        tt_blocks b;
        tt_error err;
        tt_blocks_init(&b);
        if (tt_extract_html(doc, strlen(doc), 0, NULL, &b, "t", &err) != TT_OK || b.n != 3) {
            tt_blocks_release(&b);
            return (void *)1;
        }
        tt_blocks_release(&b);
    }
    return NULL;
}

static void test_html_threads(void **state)
{
    (void)state;
    pthread_t t[4];
    for (int i = 0; i < 4; i++)
        assert_int_equal(pthread_create(&t[i], NULL, extract_in_thread, NULL), 0);
    for (int i = 0; i < 4; i++) {
        void *r;
        assert_int_equal(pthread_join(t[i], &r), 0);
        assert_null(r);
    }
}

/* ---- plain text --------------------------------------------------------- */

static void test_text_paragraphs(void **state)
{
    (void)state;
    expect_text("First line\nsecond line.\n\nNext paragraph.\n",
                "p:First line second line.|p:Next paragraph.");
    /* A blank line may hold spaces, tabs or NBSP. */
    expect_text("one\n  \t \ntwo\n\xc2\xa0\ntree", "p:one|p:two|p:tree");
    /* Many blank lines are one break; leading and trailing ones vanish. */
    expect_text("\n\n\n  a\n\n\n\n\nb  \n\n", "p:a|p:b");
    /* CRLF and a lone CR are line breaks. */
    expect_text("a\r\nb\r\n\r\nc\rd\r\re", "p:a b|p:c d|p:e");
    /* White space inside a line collapses, NBSP included. */
    expect_text("  fuel\t\tcosts \xc2\xa0 rose\f\vsharply  ", "p:fuel costs rose sharply");
    /* A 0xC2 that does not start NBSP is text. */
    expect_text("\xc2\xa9 2031 ferry", "p:\xc2\xa9 2031 ferry");
    expect_text("", "");
    expect_text(" \n\t\r\n \xc2\xa0 ", "");
}

static void test_text_hyphenation(void **state)
{
    (void)state;
    expect_text("the off-\nbalance sheet", "p:the off-balance sheet");
    expect_text("the off-  \n   balance sheet", "p:the off-balance sheet");
    expect_text("the off-\r\nbalance", "p:the off-balance");
    /* Only across one line break, and only letter '-' letter. */
    expect_text("the off-\n\nbalance", "p:the off-|p:balance");
    expect_text("the off- balance", "p:the off- balance");
    expect_text("pages 10-\n12", "p:pages 10- 12");
    expect_text("class A-\n2031 notes", "p:class A- 2031 notes");
    expect_text("the 3-\nyear term", "p:the 3- year term");
    expect_text("dash --\nthen", "p:dash -- then");
    expect_text("list:\n- first\n- second", "p:list: - first - second");
    /* Non-ASCII letters count (U+00E9 is Ll; U+0661 is Nd, not a letter). */
    expect_text("caf\xc3\xa9-\nbar", "p:caf\xc3\xa9-bar");
    expect_text("over-\n\xc3\xa9t\xc3\xa9", "p:over-\xc3\xa9t\xc3\xa9");
    expect_text("x\xd9\xa1-\nbar", "p:x\xd9\xa1- bar");
}

static void test_text_categories_match_python(void **state)
{
    (void)state;
    /* The letters used above, checked against Python's unicodedata. */
    char *cats = run_python("import unicodedata as u\n"
                            "print(u.category(chr(0xe9)), u.category(chr(0x661)))\n");
    assert_string_equal(cats, "Ll Nd\n");
    free(cats);
}

/* The SSE2 and AVX2 run skips against the byte-by-byte loop they shortcut
 * (tt_simd(0), the loop the cases above pin down): random texts, long
 * enough for the 16- and 32-byte steps (pieces of plain words up to 40
 * bytes), from pieces that stop the skip (every white space, NBSP, 0xC2
 * that is no NBSP, hyphens at line ends), must give the same blocks (kind,
 * text, source offset). */
static void test_text_simd_same_as_portable(void **state)
{
    (void)state;
    static const char *const pieces[] = {
        "a", "Revenue", "off", "-", " ", "  ", "\t", "\n", "\n\n", "\r\n", "\r", "\v", "\f",
        "\xc2\xa0", "\xc2\xa9", "\xc3\xa9", "2031", ",", ".",
        "operating income rose in every region", "net sales of the third quarter",
    };
    const size_t np = sizeof pieces / sizeof *pieces;
    char text[8000];
    uint32_t x = 4242u;
    int simd = tt_simd(1);
    for (int k = 0; k < 4000; k++) {
        size_t len = 0;
        x = x * 1664525u + 1013904223u;
        size_t n = 1 + (x >> 16) % 150;
        for (size_t i = 0; i < n; i++) {
            x = x * 1664525u + 1013904223u;
            const char *p = pieces[(x >> 12) % np];
            size_t pl = strlen(p);
            memcpy(text + len, p, pl);
            len += pl;
        }
        tt_blocks a, b;
        tt_error err;
        tt_blocks_init(&a);
        tt_simd(0);
        assert_int_equal(tt_extract_text(text, len, 5, &a, "t", &err), TT_OK);
        for (int level = TT_SIMD_SSE2; level <= TT_SIMD_AVX2; level++) {
            tt_simd(1);
            if (tt_simd_level(level) != level)
                continue; /* not on this CPU */
            tt_blocks_init(&b);
            assert_int_equal(tt_extract_text(text, len, 5, &b, "t", &err), TT_OK);
            assert_int_equal(a.n, b.n);
            for (size_t i = 0; i < a.n; i++) {
                assert_int_equal(a.items[i].kind, b.items[i].kind);
                assert_int_equal(a.items[i].src_off, b.items[i].src_off);
                assert_int_equal(a.items[i].len, b.items[i].len);
                assert_memory_equal(a.text.data + a.items[i].off, b.text.data + b.items[i].off,
                                    a.items[i].len);
            }
            tt_blocks_release(&b);
        }
        tt_blocks_release(&a);
    }
    tt_simd_level(TT_SIMD_AVX2);
    tt_simd(simd);
}

static void test_text_offsets(void **state)
{
    (void)state;
    const char *text = "  \n  First para\nline two\n\n\t\xc2\xa0Second\n \n\nthird";
    const char *firsts[] = { "First", "Second", "third" };
    tt_blocks b;
    tt_error err;
    tt_blocks_init(&b);
    assert_int_equal(tt_extract_text(text, strlen(text), 77, &b, "t", &err), TT_OK);
    assert_int_equal(b.n, 3);
    for (size_t k = 0; k < b.n; k++) {
        long long at = b.items[k].src_off - 77;
        assert_true(at >= 0);
        assert_memory_equal(text + at, firsts[k], strlen(firsts[k]));
        assert_int_equal(b.items[k].kind, TT_BLOCK_PARAGRAPH);
    }
    tt_blocks_release(&b);
}

static void test_text_reuses_blocks(void **state)
{
    (void)state;
    /* out is reset first: a second call does not append. */
    tt_blocks b;
    tt_error err;
    char got[128];
    tt_blocks_init(&b);
    assert_int_equal(tt_extract_text("a\n\nb", 4, 0, &b, "t", &err), TT_OK);
    assert_int_equal(tt_extract_html("<p>c</p>", 8, 0, NULL, &b, "t", &err), TT_OK);
    render(&b, got, sizeof got);
    assert_string_equal(got, "p:c");
    assert_int_equal(tt_extract_text("d", 1, 0, &b, "t", &err), TT_OK);
    render(&b, got, sizeof got);
    assert_string_equal(got, "p:d");
    tt_blocks_release(&b);
}

/* ---- throughput (printed, not asserted) ---------------------------------- */

static void test_throughput(void **state)
{
    (void)state;
    const size_t target = 4u << 20;
    char *html = malloc(target + 4096), *text = malloc(target + 4096);
    assert_non_null(html);
    assert_non_null(text);
    size_t ho = 0, to = 0;
    unsigned seed = 12345;
    static const char *const words[] = { "ferry", "revenue", "crossings", "the", "of",
                                         "dock", "fuel", "costs", "vessel", "quarter",
                                         "operating", "income", "tidewater", "and" };
    ho += (size_t)snprintf(html, 200, "<html><head><title>t</title></head><body>");
    while (ho < target && to < target) {
        seed = seed * 1103515245u + 12345u;
        if ((seed >> 16) % 3 == 0) {
            ho += (size_t)snprintf(html + ho, 4096, "<table><tr><td><span style=\"font-size:9pt\">"
                                   "Net&nbsp;revenue</span></td><td><ix:nonFraction name=\"a\">"
                                   "%u</ix:nonFraction></td></tr></table>\n", seed % 100000);
        }
        ho += (size_t)snprintf(html + ho, 64, "<p><font size=\"2\">");
        for (int w = 0; w < 40; w++) {
            seed = seed * 1103515245u + 12345u;
            const char *wd = words[(seed >> 16) % (sizeof words / sizeof words[0])];
            ho += (size_t)snprintf(html + ho, 64, "%s%s", wd, w % 9 == 8 ? " &amp; " : " ");
            to += (size_t)snprintf(text + to, 64, "%s%s", wd, w % 10 == 9 ? "\n" : " ");
        }
        ho += (size_t)snprintf(html + ho, 64, "</font></p>\n");
        to += (size_t)snprintf(text + to, 8, "\n\n");
    }
    tt_blocks b;
    tt_error err;
    tt_blocks_init(&b);
    double best = 1e9;
    for (int r = 0; r < 3; r++) {
        double t0 = now_seconds();
        assert_int_equal(tt_extract_html(html, ho, 0, NULL, &b, "bench.html", &err), TT_OK);
        double dt = now_seconds() - t0;
        if (dt < best)
            best = dt;
    }
    printf("tt_extract_html: %.1f MB in %.3f s = %.1f MB/s (%zu blocks)\n", ho / 1e6, best,
           ho / 1e6 / best, b.n);
    best = 1e9;
    for (int r = 0; r < 3; r++) {
        double t0 = now_seconds();
        assert_int_equal(tt_extract_text(text, to, 0, &b, "bench.txt", &err), TT_OK);
        double dt = now_seconds() - t0;
        if (dt < best)
            best = dt;
    }
    printf("tt_extract_text: %.1f MB in %.3f s = %.1f MB/s (%zu blocks)\n", to / 1e6, best,
           to / 1e6 / best, b.n);
    tt_blocks_release(&b);
    free(html);
    free(text);
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_blocks_api),
        cmocka_unit_test(test_html_kinds),
        cmocka_unit_test(test_html_block_elements_break_words),
        cmocka_unit_test(test_html_inline_elements_keep_words),
        cmocka_unit_test(test_html_whitespace),
        cmocka_unit_test(test_html_character_references),
        cmocka_unit_test(test_html_dropped_content),
        cmocka_unit_test(test_html_inline_xbrl_fixture),
        cmocka_unit_test(test_html_drop_tables),
        cmocka_unit_test(test_html_malformed),
        cmocka_unit_test(test_html_depth_limit),
        cmocka_unit_test(test_html_offsets),
        cmocka_unit_test(test_html_encoding_hints_ignored),
        cmocka_unit_test(test_html_bad_bytes),
        cmocka_unit_test(test_html_prints_nothing),
        cmocka_unit_test(test_out_of_memory),
        cmocka_unit_test(test_html_threads),
        cmocka_unit_test(test_text_paragraphs),
        cmocka_unit_test(test_text_hyphenation),
        cmocka_unit_test(test_text_categories_match_python),
        cmocka_unit_test(test_text_simd_same_as_portable),
        cmocka_unit_test(test_text_offsets),
        cmocka_unit_test(test_text_reuses_blocks),
        cmocka_unit_test(test_throughput),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
