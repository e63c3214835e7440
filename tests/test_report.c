/* termtide report — the HTML page.
 *
 * Checked against references outside the project:
 *   - well-formedness: every page is parsed back with libxml2's XML parser
 *     (the page is written as XHTML5, so a strict XML parse must succeed);
 *   - a reader's browser: the demo report is opened in headless Chromium
 *     (Debian's chromium package), which must log no console message and
 *     make no network request; a control page that does both must be
 *     caught, so the check can fail. The screenshot is kept in
 *     build/report-screenshot.png for a person to look at.
 * And the page's own promises:
 *   - hostile text from documents (`<script>`, `"><svg onload=`) comes back
 *     as text: no script element, no on* attribute anywhere;
 *   - the pictures' title and description ids are unique on the page;
 *   - the demo corpus tells its story: going-concern language is hit in
 *     2024-Q3 and 2024-Q4 of hollowmere's calls and nowhere else;
 *   - the overview's similarity figures are those `termtide compare`
 *     prints, the same run twice gives the same bytes, and a failed run
 *     leaves no page and no temporary folder behind. */
#include "tt_test.h"

#include <dirent.h>
#include <sys/stat.h>
#include <unistd.h>

#include <libxml/parser.h>
#include <libxml/tree.h>
#include <libxml/xpath.h>
#include <libxml/xpathInternals.h>

#include "termtide/report.h"
#include "termtide/svg.h"
#include "termtide/tsvread.h"

static const char hostile1[] = "<script>alert(1)</script>";
static const char hostile2[] = "\"><svg onload=alert(1)>";

static xmlDocPtr parse(const char *data, size_t len)
{
    return xmlReadMemory(data, (int)len, "report.html", "UTF-8",
                         XML_PARSE_NONET | XML_PARSE_NOERROR | XML_PARSE_NOWARNING);
}

/* No script element and no on* attribute anywhere under n. */
static void assert_inert(xmlNodePtr n)
{
    for (; n; n = n->next) {
        if (n->type == XML_ELEMENT_NODE) {
            assert_true(xmlStrcasecmp(n->name, BAD_CAST "script") != 0);
            assert_true(xmlStrcasecmp(n->name, BAD_CAST "iframe") != 0);
            for (xmlAttrPtr a = n->properties; a; a = a->next)
                assert_true(xmlStrncasecmp(a->name, BAD_CAST "on", 2) != 0);
        }
        assert_inert(n->children);
    }
}

static int count_xpath(xmlDocPtr doc, const char *expr)
{
    xmlXPathContextPtr ctx = xmlXPathNewContext(doc);
    xmlXPathRegisterNs(ctx, BAD_CAST "h", BAD_CAST "http://www.w3.org/1999/xhtml");
    xmlXPathRegisterNs(ctx, BAD_CAST "s", BAD_CAST "http://www.w3.org/2000/svg");
    xmlXPathObjectPtr r = xmlXPathEvalExpression(BAD_CAST expr, ctx);
    assert_non_null(r);
    int n = r->nodesetval ? r->nodesetval->nodeNr : 0;
    xmlXPathFreeObject(r);
    xmlXPathFreeContext(ctx);
    return n;
}

/* The text of the first node expr selects (the caller frees), or NULL. */
static char *xpath_text(xmlDocPtr doc, const char *expr)
{
    xmlXPathContextPtr ctx = xmlXPathNewContext(doc);
    xmlXPathRegisterNs(ctx, BAD_CAST "h", BAD_CAST "http://www.w3.org/1999/xhtml");
    xmlXPathObjectPtr r = xmlXPathEvalExpression(BAD_CAST expr, ctx);
    char *out = NULL;
    if (r && r->nodesetval && r->nodesetval->nodeNr > 0) {
        xmlChar *c = xmlNodeGetContent(r->nodesetval->nodeTab[0]);
        out = strdup((const char *)c);
        xmlFree(c);
    }
    xmlXPathFreeObject(r);
    xmlXPathFreeContext(ctx);
    return out;
}

static void test_page_keeps_hostile_text_as_text(void **state)
{
    (void)state;
    tt_report r;
    tt_report_init(&r);
    assert_int_equal(tt_report_heading(&r, 1, hostile1), TT_OK);
    assert_int_equal(tt_report_para(&r, hostile2, 0), TT_OK);
    tt_tsv t;
    tt_tsv_init(&t);
    tt_error err;
    tt_error_init(&err);
    char table[256];
    snprintf(table, sizeof table, "term\tcount\n%s\t3\n%s\t4\n", hostile1, hostile2);
    assert_int_equal(tt_tsv_parse(table, strlen(table), "t", &t, &err), TT_OK);
    const tt_report_column cols[] = { { "term", "term <b>", TT_REPORT_MARK }, { "count", NULL, 0 } };
    assert_int_equal(tt_report_table(&r, &t, "t", cols, 2, NULL, t.nrows, hostile2, &err), TT_OK);
    tt_buf svg;
    tt_buf_init(&svg, 0);
    assert_int_equal(tt_svg_begin(&svg, 100, 50, hostile1, hostile2, strlen(hostile2)), TT_OK);
    assert_int_equal(tt_svg_end(&svg), TT_OK);
    assert_int_equal(tt_report_figure(&r, svg.data, svg.len, hostile1), TT_OK);
    tt_buf page;
    tt_buf_init(&page, 0);
    assert_int_equal(tt_report_write(&r, hostile1, hostile2, "termtide test", &page), TT_OK);

    xmlDocPtr doc = parse(page.data, page.len);
    assert_non_null(doc); /* libxml2: well-formed */
    assert_inert(xmlDocGetRootElement(doc));
    /* the hostile strings come back as text, whole */
    char *h = xpath_text(doc, "//h:main/h:h2");
    assert_non_null(h);
    assert_string_equal(h, hostile1);
    free(h);
    h = xpath_text(doc, "//h:main/h:p");
    assert_string_equal(h, hostile2);
    free(h);
    h = xpath_text(doc, "//h:td/h:mark");
    assert_string_equal(h, hostile1);
    free(h);
    /* the count column is numeric, so right-aligned */
    assert_int_equal(count_xpath(doc, "//h:td[@class='num']"), 2);
    /* the caution is there, at the top and at the end */
    assert_int_equal(count_xpath(doc, "//h:p[contains(., 'gives no investment, legal or compliance "
                                      "advice')]"),
                     2);
    /* nothing may be fetched: the content security policy */
    assert_int_equal(count_xpath(doc, "//h:meta[@http-equiv='Content-Security-Policy' and "
                                      "starts-with(@content, \"default-src 'none'\")]"),
                     1);
    xmlFreeDoc(doc);
    tt_buf_release(&page);
    tt_buf_release(&svg);
    tt_tsv_release(&t);
    tt_report_release(&r);
}

static void test_figures_get_their_own_ids(void **state)
{
    (void)state;
    tt_report r;
    tt_report_init(&r);
    for (int i = 0; i < 3; i++) {
        tt_buf svg;
        tt_buf_init(&svg, 0);
        assert_int_equal(tt_svg_begin(&svg, 100, 50, "a picture", "about it", 8), TT_OK);
        assert_int_equal(tt_svg_end(&svg), TT_OK);
        assert_int_equal(tt_report_figure(&r, svg.data, svg.len, NULL), TT_OK);
        tt_buf_release(&svg);
    }
    /* not an SVG: refused */
    assert_int_equal(tt_report_figure(&r, "<div/>", 6, NULL), TT_EINVAL);
    tt_buf page;
    tt_buf_init(&page, 0);
    assert_int_equal(tt_report_write(&r, "t", NULL, NULL, &page), TT_OK);
    assert_null(strstr(page.data, "<?xml"));
    xmlDocPtr doc = parse(page.data, page.len);
    assert_non_null(doc);
    assert_int_equal(count_xpath(doc, "//s:title[@id='tt-title-1']"), 1);
    assert_int_equal(count_xpath(doc, "//s:title[@id='tt-title-3']"), 1);
    assert_int_equal(count_xpath(doc, "//s:svg[@aria-labelledby='tt-title-2' and "
                                      "@aria-describedby='tt-desc-2']"),
                     1);
    assert_int_equal(count_xpath(doc, "//*[@id='tt-title']"), 0);
    xmlFreeDoc(doc);
    tt_buf_release(&page);
    tt_report_release(&r);
}

static void test_table_names_a_missing_column(void **state)
{
    (void)state;
    tt_report r;
    tt_report_init(&r);
    tt_tsv t;
    tt_tsv_init(&t);
    tt_error err;
    tt_error_init(&err);
    assert_int_equal(tt_tsv_parse("a\tb\n1\t2\n", 8, "small.tsv", &t, &err), TT_OK);
    const tt_report_column cols[] = { { "a", NULL, 0 }, { "zz", NULL, 0 } };
    assert_int_equal(tt_report_table(&r, &t, "small.tsv", cols, 2, NULL, 1, NULL, &err),
                     TT_EPARSE);
    assert_non_null(strstr(err.file, "small.tsv"));
    assert_non_null(strstr(err.message, "zz"));
    tt_tsv_release(&t);
    tt_report_release(&r);
}

static const char demo_args[] =
    "report --manifest demo-corpus/manifest.tsv --entity hollowmere --kinds call-transcript "
    "--rules demo-corpus/watchlist.tsv";

/* The cell of the hits-per-period table for a rule and a period column. */
static char *hits_cell(xmlDocPtr doc, const char *rule, int column)
{
    char expr[400];
    snprintf(expr, sizeof expr,
             "//h:table[h:caption='Hits per rule and period']/h:tbody/h:tr[h:td[1]='%s']/h:td[%d]",
             rule, column);
    return xpath_text(doc, expr);
}

static void test_demo_report(void **state)
{
    (void)state;
    char dir[] = TT_TEST_TMP "tt-report-XXXXXX";
    assert_non_null(mkdtemp(dir));
    char args[1024], path[256], path2[256];
    snprintf(path, sizeof path, "%s/a.html", dir);
    snprintf(path2, sizeof path2, "%s/b.html", dir);
    int st;
    snprintf(args, sizeof args, "%s -o %s", demo_args, path);
    free(tt_test_run(args, 1, &st));
    assert_int_equal(st, 0);
    snprintf(args, sizeof args, "%s -j 2 -o %s", demo_args, path2);
    free(tt_test_run(args, 1, &st));
    assert_int_equal(st, 0);
    size_t n, n2;
    char *page = tt_test_slurp(path, &n), *page2 = tt_test_slurp(path2, &n2);
    assert_non_null(page);
    assert_non_null(page2);
    /* deterministic: the same bytes, whatever the threads */
    assert_int_equal(n, n2);
    assert_memory_equal(page, page2, n);
    xmlDocPtr doc = parse(page, n);
    assert_non_null(doc); /* libxml2: well-formed */
    assert_inert(xmlDocGetRootElement(doc));
    /* ten periods: nine pairs, each with bars and a cloud; tone; heat map */
    assert_int_equal(count_xpath(doc, "//h:figure/s:svg"), 9 * 2 + 2);
    assert_int_equal(count_xpath(doc, "//h:h3[contains(., '\xE2\x86\x92')]"), 9);
    /* the story: going-concern language in 2024-Q3 and 2024-Q4 only (the
       columns: rule, 2023-Q3 ... 2025-Q4, total) */
    for (int col = 2; col <= 11; col++) {
        char *v = hits_cell(doc, "going-concern", col);
        assert_non_null(v);
        assert_string_equal(v, col == 6 || col == 7 ? "1" : "0");
        free(v);
    }
    char *total = hits_cell(doc, "going-concern", 12);
    assert_string_equal(total, "2");
    free(total);
    /* the overview's similarity is compare's: 2024-Q3 against 2024-Q2 */
    char *cos = xpath_text(doc, "//h:table[h:caption='Each period at a glance']/h:tbody/"
                                "h:tr[h:td[1]='2024-Q3']/h:td[5]");
    assert_non_null(cos);
    char *sum = tt_test_run("compare --manifest demo-corpus/manifest.tsv --entity hollowmere "
                            "--kinds call-transcript --base 2024-Q2 --target 2024-Q3 --show "
                            "summary --no-header -q",
                            0, &st);
    assert_int_equal(st, 0);
    char want[64];
    /* entity base target base_words target_words base_distinct target_distinct
       new gone cosine */
    const char *p = sum;
    for (int k = 0; k < 9; k++)
        p = strchr(p, '\t') + 1;
    size_t l = strcspn(p, "\t");
    snprintf(want, sizeof want, "%.*s", (int)l, p);
    assert_string_equal(cos, want);
    free(cos);
    free(sum);
    xmlFreeDoc(doc);
    free(page2);
    /* --text: the same pictures with <text> labels, a far smaller page */
    snprintf(args, sizeof args, "%s --text -o %s", demo_args, path2);
    free(tt_test_run(args, 1, &st));
    assert_int_equal(st, 0);
    page2 = tt_test_slurp(path2, &n2);
    assert_non_null(page2);
    assert_true(n2 * 4 < n);
    doc = parse(page2, n2);
    assert_non_null(doc);
    assert_int_equal(count_xpath(doc, "//h:figure/s:svg"), 9 * 2 + 2);
    assert_true(count_xpath(doc, "//s:text[.='going']") + count_xpath(doc, "//s:text") > 100);
    xmlFreeDoc(doc);
    free(page2);
    /* lists are cut, and the page says of how many: 13 hits, 52 sentences
       added from 2023-Q3 to 2023-Q4 */
    snprintf(args, sizeof args, "%s --text --hits 2 --sentences 1 -o %s", demo_args, path2);
    free(tt_test_run(args, 1, &st));
    assert_int_equal(st, 0);
    page2 = tt_test_slurp(path2, &n2);
    assert_non_null(page2);
    doc = parse(page2, n2);
    assert_non_null(doc);
    assert_int_equal(count_xpath(doc, "//h:caption[.='Hits in context: 2 of 13, in document order']"),
                     1);
    assert_int_equal(count_xpath(doc, "//h:caption[starts-with(., 'Added: 1 of 52,')]"), 1);
    xmlFreeDoc(doc);
    free(page);
    free(page2);
    unlink(path);
    unlink(path2);
    rmdir(dir);
}

/* Several entities: a table of them, most rewritten first, and contents
 * that list the chapters only. */
static void test_several_entities(void **state)
{
    (void)state;
    char dir[] = TT_TEST_TMP "tt-report-XXXXXX";
    assert_non_null(mkdtemp(dir));
    char path[256], args[1024];
    snprintf(path, sizeof path, "%s/q.html", dir);
    snprintf(args, sizeof args,
             "report --manifest demo-corpus/manifest.tsv --kinds quarterly-report --text -q -o %s",
             path);
    int st;
    free(tt_test_run(args, 1, &st));
    assert_int_equal(st, 0);
    size_t n;
    char *page = tt_test_slurp(path, &n);
    assert_non_null(page);
    xmlDocPtr doc = parse(page, n);
    assert_non_null(doc);
    assert_int_equal(count_xpath(doc, "//h:h2[.='Entities at a glance']"), 1);
    assert_int_equal(count_xpath(doc, "//h:table[starts-with(h:caption, 'Most rewritten first')]"
                                      "/h:tbody/h:tr"),
                     2);
    /* most rewritten first: the first row's share is the larger */
    char *a = xpath_text(doc, "//h:table[starts-with(h:caption, 'Most rewritten first')]"
                              "/h:tbody/h:tr[1]/h:td[6]");
    char *b = xpath_text(doc, "//h:table[starts-with(h:caption, 'Most rewritten first')]"
                              "/h:tbody/h:tr[2]/h:td[6]");
    assert_true(strtod(a, NULL) >= strtod(b, NULL));
    free(a);
    free(b);
    assert_int_equal(count_xpath(doc, "//h:nav//h:li[@class='toc2']"), 0);
    assert_int_equal(count_xpath(doc, "//h:nav//h:li[@class='toc1']"), 4);
    xmlFreeDoc(doc);
    free(page);
    unlink(path);
    rmdir(dir);
}

/* Folders named prefix... in dir. */
static int folder_count(const char *dir, const char *prefix)
{
    DIR *d = opendir(dir);
    int n = 0;
    struct dirent *e;
    while (d && (e = readdir(d)))
        n += !strncmp(e->d_name, prefix, strlen(prefix));
    if (d)
        closedir(d);
    return n;
}

static void test_hostile_documents_and_failures(void **state)
{
    (void)state;
    char dir[] = TT_TEST_TMP "tt-report-XXXXXX";
    assert_non_null(mkdtemp(dir));
    char a[256], b[256], rules[256], out[300], args[2048];
    snprintf(a, sizeof a, "%s/base.txt", dir);
    snprintf(b, sizeof b, "%s/target.txt", dir);
    snprintf(rules, sizeof rules, "%s/rules.tsv", dir);
    snprintf(out, sizeof out, "%s/page.html", dir);
    FILE *f = fopen(a, "w");
    fprintf(f, "The plant ran well this year. Orders grew in every region.\n");
    fclose(f);
    f = fopen(b, "w");
    fprintf(f, "The filing says %s in plain words. A reader typed %s here. Orders grew.\n",
            hostile1, hostile2);
    fclose(f);
    f = fopen(rules, "w");
    fprintf(f, "onload\tonload\nscript\tscript\n");
    fclose(f);
    /* The reports' temporary folders go to a private TMPDIR, so other runs
     * of the tests at the same time cannot change the count. */
    char tmpdir[300];
    snprintf(tmpdir, sizeof tmpdir, "%s/tmp", dir);
    assert_int_equal(mkdir(tmpdir, 0700), 0);
    const char *old_tmpdir = getenv("TMPDIR");
    char *saved = old_tmpdir ? strdup(old_tmpdir) : NULL;
    setenv("TMPDIR", tmpdir, 1);
    int before = folder_count(tmpdir, "termtide-report-");
    assert_int_equal(before, 0);
    snprintf(args, sizeof args, "report --base %s --target %s --rules %s --min-count 1 -o %s", a, b,
             rules, out);
    int st;
    char *msg = tt_test_run(args, 1, &st);
    assert_int_equal(st, 0);
    free(msg);
    size_t n;
    char *page = tt_test_slurp(out, &n);
    assert_non_null(page);
    xmlDocPtr doc = parse(page, n);
    assert_non_null(doc);
    assert_inert(xmlDocGetRootElement(doc));
    /* the sentence and the hit come back as the words typed */
    assert_true(count_xpath(doc, "//h:td[contains(., '<script>alert(1)</script>')]") >= 1);
    assert_true(count_xpath(doc, "//h:td[contains(., '\"><svg onload=alert(1)>')]") >= 1);
    assert_int_equal(count_xpath(doc, "//h:td/h:mark[.='onload']"), 1);
    xmlFreeDoc(doc);
    free(page);
    unlink(out);
    /* the temporary folder is gone */
    assert_int_equal(folder_count(tmpdir, "termtide-report-"), before);

    /* a series that cannot be formed: an error, no page, no folder left */
    snprintf(args, sizeof args, "report --manifest demo-corpus/manifest.tsv -o %s", out);
    msg = tt_test_run(args, 1, &st);
    assert_int_equal(st, 2);
    assert_non_null(strstr(msg, "cannot be in one series"));
    free(msg);
    assert_int_equal(access(out, F_OK), -1);
    assert_int_equal(folder_count(tmpdir, "termtide-report-"), before);
    /* a watch-list that does not compile: the line is named, no page */
    f = fopen(rules, "w");
    fprintf(f, "broken\t(unclosed\n");
    fclose(f);
    snprintf(args, sizeof args, "report --base %s --target %s --rules %s -o %s", a, b, rules, out);
    msg = tt_test_run(args, 1, &st);
    assert_int_equal(st, 2);
    assert_non_null(strstr(msg, "rules.tsv"));
    assert_non_null(strstr(msg, "line 1"));
    free(msg);
    assert_int_equal(access(out, F_OK), -1);
    /* one document that cannot be read: reported, the page still written */
    char gone[300];
    snprintf(gone, sizeof gone, "%s/missing.txt", dir);
    snprintf(args, sizeof args, "report --base %s --base %s --target %s -o %s", a, gone, b, out);
    msg = tt_test_run(args, 1, &st);
    assert_int_equal(st, 2);
    assert_non_null(strstr(msg, "missing.txt"));
    free(msg);
    assert_int_equal(access(out, F_OK), 0);
    /* and the page says so, once */
    page = tt_test_slurp(out, &n);
    doc = parse(page, n);
    assert_non_null(doc);
    assert_int_equal(count_xpath(doc, "//h:h2[.='Problems met']"), 1);
    assert_int_equal(count_xpath(doc, "//h:p[contains(., 'missing.txt')]"), 1);
    xmlFreeDoc(doc);
    free(page);
    assert_int_equal(folder_count(tmpdir, "termtide-report-"), before);
    if (saved)
        setenv("TMPDIR", saved, 1);
    else
        unsetenv("TMPDIR");
    free(saved);
    unlink(out);
    unlink(a);
    unlink(b);
    unlink(rules);
    rmdir(tmpdir);
    rmdir(dir);
}

static int have_chromium(void)
{
    return system("command -v chromium >/dev/null 2>&1") == 0;
}

/* Runs the browser check; returns its output (the caller frees). */
static char *browser(const char *page, const char *shot, const char *work)
{
    char cmd[2048];
    snprintf(cmd, sizeof cmd, "%s tests/report_browser_check.py %s %s %s 2>/dev/null",
             tt_test_python(), page, shot, work);
    FILE *p = popen(cmd, "r");
    assert_non_null(p);
    char *out = tt_test_read_stream(p, NULL);
    pclose(p);
    return out;
}

static void test_chromium_opens_the_report(void **state)
{
    (void)state;
    if (!have_chromium()) {
        /* CI installs chromium (.ci/run); a developer machine may not have it */
        fprintf(stderr, "chromium not installed: browser check skipped\n");
        skip();
    }
    char dir[] = TT_TEST_TMP "tt-report-XXXXXX";
    assert_non_null(mkdtemp(dir));
    char page[300], control[300], args[1024], work[300];
    snprintf(page, sizeof page, "%s/demo.html", dir);
    snprintf(control, sizeof control, "%s/control.html", dir);
    snprintf(args, sizeof args, "%s -q -o %s", demo_args, page);
    int st;
    free(tt_test_run(args, 1, &st));
    assert_int_equal(st, 0);

    /* the control: a page that logs and fetches must be caught */
    FILE *f = fopen(control, "w");
    fprintf(f, "<!DOCTYPE html><html><body><img src=\"http://192.0.2.1/x.png\"/>"
               "<script>console.error('control')</script></body></html>\n");
    fclose(f);
    snprintf(work, sizeof work, "%s/w1", dir);
    mkdir(work, 0700);
    char shot[400];
    snprintf(shot, sizeof shot, "%s/control.png", dir);
    char *out = browser(control, shot, work);
    assert_non_null(strstr(out, "console: "));
    assert_non_null(strstr(out, "request: http://192.0.2.1/x.png"));
    assert_non_null(strstr(out, "ok"));
    free(out);

    /* the report: no console message, no request, a screenshot */
    snprintf(work, sizeof work, "%s/w2", dir);
    mkdir(work, 0700);
    out = browser(page, "build/report-screenshot.png", work);
    if (strcmp(out, "ok\n"))
        fprintf(stderr, "browser said:\n%s", out);
    assert_string_equal(out, "ok\n");
    free(out);
    char rm[400];
    snprintf(rm, sizeof rm, "rm -rf %s", dir);
    assert_int_equal(system(rm), 0);
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_page_keeps_hostile_text_as_text),
        cmocka_unit_test(test_figures_get_their_own_ids),
        cmocka_unit_test(test_table_names_a_missing_column),
        cmocka_unit_test(test_demo_report),
        cmocka_unit_test(test_several_entities),
        cmocka_unit_test(test_hostile_documents_and_failures),
        cmocka_unit_test(test_chromium_opens_the_report),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
