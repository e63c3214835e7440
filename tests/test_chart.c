/* Tests of the charts (src/chart.c) and of reading tables back
 * (src/tsvread.c): round ticks, the squarified treemap's geometry, every
 * chart kind well-formed (libxml2), what the bars, heat map, box plot,
 * scatter plot and histogram show against the table recomputed
 * independently (Python's csv and xml.etree, NumPy's percentile with
 * method="weibull" = Hyndman & Fan type 6, numpy.corrcoef for Pearson's r),
 * hostile and long labels, and errors through the program. */
#include <math.h>
#include <sys/stat.h>
#include <sys/wait.h>
#include <unistd.h>

#include <libxml/parser.h>
#include <libxml/tree.h>

#include "tt_test.h"

#include "termtide/alloc.h"
#include "termtide/chart.h"
#include "termtide/font.h"
#include "termtide/svg.h"
#include "termtide/tsvread.h"

#define TMP TT_TEST_TMP "tt_chart_"

static int run(const char *args, char *out, size_t cap)
{
    char cmd[4096];
    snprintf(cmd, sizeof cmd, "%s %s 2>&1", tt_test_bin(), args);
    FILE *p = popen(cmd, "r");
    assert_non_null(p);
    size_t n = fread(out, 1, cap - 1, p);
    out[n] = '\0';
    int st = pclose(p);
    return WIFEXITED(st) ? WEXITSTATUS(st) : -1;
}

static char out[1 << 16];

/* Runs tests/fixtures/chart/check_chart.py; it prints "ok" or the problem. */
static void python_check(const char *args)
{
    char cmd[2048];
    snprintf(cmd, sizeof cmd, "%s tests/fixtures/chart/check_chart.py %s 2>&1", tt_test_python(),
             args);
    FILE *p = popen(cmd, "r");
    assert_non_null(p);
    size_t n = fread(out, 1, sizeof out - 1, p);
    out[n] = '\0';
    pclose(p);
    if (strcmp(out, "ok\n"))
        print_error("python check %s: %s\n", args, out);
    assert_string_equal(out, "ok\n");
}

static xmlDocPtr parse_file(const char *path)
{
    return xmlReadFile(path, "UTF-8", XML_PARSE_NONET | XML_PARSE_NOERROR | XML_PARSE_NOWARNING);
}

static size_t count_elements(xmlNodePtr n, const char *name)
{
    size_t k = 0;
    for (xmlNodePtr c = n; c; c = c->next) {
        if (c->type == XML_ELEMENT_NODE && !strcmp((const char *)c->name, name))
            k++;
        k += count_elements(c->children, name);
    }
    return k;
}

/* The tables, written once by the program from the demo corpus. */
static int setup(void **state)
{
    (void)state;
    const char *cmds[] = {
        "compare -q --manifest demo-corpus/manifest.tsv --kinds quarterly-report --consecutive "
        "--min-count 3 -o " TMP "compare.tsv",
        "trend -q --manifest demo-corpus/manifest.tsv --kinds quarterly-report --top-movers 6 -o "
        TMP "trend.tsv",
        "trend -q --manifest demo-corpus/manifest.tsv --kinds call-transcript --terms "
        "recall,warranty,backlog,margin --show tfidf -o " TMP "tfidf.tsv",
        "count -q --total --show classes demo-corpus/hollowmere -o " TMP "classes.tsv",
        "tone -q --contributors --top 8 demo-corpus/hollowmere/2025-Q1-call-transcript.txt -o "
        TMP "tone.tsv",
        "tone -q --manifest demo-corpus/manifest.tsv --kinds call-transcript -o " TMP "tonep.tsv",
    };
    for (size_t i = 0; i < sizeof cmds / sizeof cmds[0]; i++)
        if (run(cmds[i], out, sizeof out) != 0) {
            fprintf(stderr, "setup: %s: %s\n", cmds[i], out);
            return -1;
        }
    return 0;
}

static int teardown(void **state)
{
    (void)state;
    const char *f[] = { "compare.tsv", "trend.tsv", "tfidf.tsv", "classes.tsv", "tone.tsv",
                        "tonep.tsv" };
    char p[256];
    for (size_t i = 0; i < 6; i++) {
        snprintf(p, sizeof p, TMP "%s", f[i]);
        unlink(p);
    }
    return 0;
}

/* Ticks are 1, 2 or 5 times a power of ten, start at or below the low end,
 * reach the high end, and are few. */
static void test_ticks(void **state)
{
    (void)state;
    uint64_t s = 99;
    for (int i = 0; i < 5000; i++) {
        s = s * 6364136223846793005ULL + 1442695040888963407ULL;
        double lo = (double)(s >> 40) / 1000.0 - 5000;
        s = s * 6364136223846793005ULL + 1442695040888963407ULL;
        double span = pow(10, (double)(s >> 53) / 1024.0 * 8 - 3);
        double hi = lo + span, first, step;
        if (i % 3 == 0)
            lo = 0, hi = span;
        size_t n = tt_chart_ticks(lo, hi, 6, &first, &step);
        double mant = step / pow(10, floor(log10(step)));
        assert_true(fabs(mant - 1) < 1e-9 || fabs(mant - 2) < 1e-9 || fabs(mant - 5) < 1e-9 ||
                    fabs(mant - 10) < 1e-9);
        assert_true(first <= lo + 1e-9 * fabs(lo) + 1e-12);
        assert_true(first + step * (double)(n - 1) >= hi - 1e-9 * fabs(hi) - 1e-12);
        assert_true(n >= 2 && n <= 12);
        /* every tick is a whole multiple of the step */
        double k = first / step;
        assert_true(fabs(k - round(k)) < 1e-6);
    }
    double first, step;
    assert_int_equal(tt_chart_ticks(0, 176, 6, &first, &step), 5);
    assert_true(first == 0 && step == 50);
}

/* The squarified treemap tiles the rectangle exactly, each area in
 * proportion to its value, and its worst aspect ratio is never worse than
 * cutting the rectangle into parallel slices (the layout the method
 * improves on, Bruls et al. 2000). */
static void test_squarify(void **state)
{
    (void)state;
    uint64_t s = 7;
    for (int trial = 0; trial < 300; trial++) {
        size_t n = 1 + trial % 25;
        double v[32], r[128], total = 0;
        for (size_t i = 0; i < n; i++) {
            s = s * 6364136223846793005ULL + 1442695040888963407ULL;
            v[i] = 1 + (double)(s >> 44) / 1000.0;
        }
        for (size_t i = 1; i < n; i++) /* descending, as the method wants */
            for (size_t j = i; j > 0 && v[j] > v[j - 1]; j--) {
                double t = v[j]; v[j] = v[j - 1]; v[j - 1] = t;
            }
        for (size_t i = 0; i < n; i++)
            total += v[i];
        double W = 300 + trial, H = 200 + 2 * (trial % 50);
        assert_int_equal(tt_chart_squarify(v, n, 10, 20, W, H, r), TT_OK);
        double area = 0, worst = 1, slice_worst = 1;
        for (size_t i = 0; i < n; i++) {
            const double *q = &r[4 * i];
            assert_true(q[0] >= 10 - 1e-6 && q[1] >= 20 - 1e-6);
            assert_true(q[0] + q[2] <= 10 + W + 1e-6 && q[1] + q[3] <= 20 + H + 1e-6);
            assert_true(fabs(q[2] * q[3] - v[i] / total * W * H) < 1e-6 * W * H);
            area += q[2] * q[3];
            double ar = q[2] > q[3] ? q[2] / q[3] : q[3] / q[2];
            if (ar > worst) worst = ar;
            double sw = v[i] / total * W; /* slices across the width */
            double sar = sw > H ? sw / H : H / sw;
            if (sar > slice_worst) slice_worst = sar;
            for (size_t j = 0; j < i; j++) { /* no two overlap */
                const double *p = &r[4 * j];
                double ox = fmin(p[0] + p[2], q[0] + q[2]) - fmax(p[0], q[0]);
                double oy = fmin(p[1] + p[3], q[1] + q[3]) - fmax(p[1], q[1]);
                assert_false(ox > 1e-6 && oy > 1e-6);
            }
        }
        assert_true(fabs(area - W * H) < 1e-6 * W * H);
        assert_true(worst <= slice_worst + 1e-9);
    }
}

static void chart(const char *kind, const char *table, const char *extra, const char *svg)
{
    char args[1024];
    snprintf(args, sizeof args, "chart %s --from " TMP "%s %s -o %s", kind, table, extra, svg);
    int rc = run(args, out, sizeof out);
    if (rc)
        print_error("%s: %s\n", args, out);
    assert_int_equal(rc, 0);
}

/* Every kind draws a well-formed picture with a title, a description that
 * carries the caution, and the caution on the picture. */
static void test_every_kind_wellformed(void **state)
{
    (void)state;
    static const char *const kinds[][3] = {
        { "bars", "compare.tsv", "" }, { "lines", "trend.tsv", "" },
        { "heatmap", "trend.tsv", "" }, { "histogram", "classes.tsv", "" },
        { "polygon", "classes.tsv", "--relative" }, { "cumulative", "classes.tsv", "" },
        { "box", "tfidf.tsv", "--term recall" }, { "scatter", "tfidf.tsv", "--term backlog --term2 margin" },
        { "treemap", "tone.tsv", "" }, { "bars", "compare.tsv", "--text --value rate_change" },
    };
    for (size_t i = 0; i < sizeof kinds / sizeof kinds[0]; i++) {
        const char *svg = TMP "kind.svg";
        chart(kinds[i][0], kinds[i][1], kinds[i][2], svg);
        xmlDocPtr d = parse_file(svg);
        assert_non_null(d);
        xmlNodePtr root = xmlDocGetRootElement(d);
        assert_string_equal((const char *)root->name, "svg");
        assert_int_equal(count_elements(root, "title") >= 1, 1);
        xmlNodePtr desc = NULL;
        for (xmlNodePtr c = root->children; c; c = c->next)
            if (c->type == XML_ELEMENT_NODE && !strcmp((const char *)c->name, "desc"))
                desc = c;
        assert_non_null(desc);
        xmlChar *t = xmlNodeGetContent(desc);
        assert_non_null(strstr((const char *)t, "no investment, legal or compliance advice"));
        xmlFree(t);
        xmlFreeDoc(d);
        unlink(svg);
    }
}

static void test_bars_against_table(void **state)
{
    (void)state;
    chart("bars", "compare.tsv", "", TMP "bars.svg");
    python_check("bars " TMP "compare.tsv " TMP "bars.svg");
    chart("bars", "compare.tsv", "--top 4 --max-q 0.5", TMP "bars.svg");
    python_check("bars " TMP "compare.tsv " TMP "bars.svg 4 0.5");
    unlink(TMP "bars.svg");
}

static void test_heatmap_against_table(void **state)
{
    (void)state;
    chart("heatmap", "trend.tsv", "", TMP "heat.svg");
    python_check("heatmap " TMP "trend.tsv " TMP "heat.svg");
    unlink(TMP "heat.svg");
}

/* The quarterly reports have no fourth quarter (the annual report stands
 * there): the axis keeps the calendar, 2024-Q4 is a slot without documents
 * (hatched in the heat map, dashed across in the line chart), never a 0. */
static void test_calendar_gaps(void **state)
{
    (void)state;
    chart("heatmap", "trend.tsv", "", TMP "gap.svg");
    char *d = tt_test_read(TMP "gap.svg", NULL);
    assert_non_null(strstr(d, "aria-label=\"2024-Q4\""));
    assert_non_null(strstr(d, "hatched: no documents"));
    assert_null(strstr(d, ", 2024-Q4: "));
    free(d);
    chart("lines", "trend.tsv", "", TMP "gap.svg");
    d = tt_test_read(TMP "gap.svg", NULL);
    assert_non_null(strstr(d, "aria-label=\"2024-Q4\""));
    assert_non_null(strstr(d, "stroke-dasharray"));
    free(d);
    unlink(TMP "gap.svg");
}

static void test_box_against_numpy(void **state)
{
    (void)state;
    chart("box", "tfidf.tsv", "--term recall", TMP "box.svg");
    python_check("box " TMP "tfidf.tsv " TMP "box.svg recall");
    chart("box", "tfidf.tsv", "--term margin", TMP "box.svg");
    python_check("box " TMP "tfidf.tsv " TMP "box.svg margin");
    /* any column by period: a tone category per entity and period */
    chart("box", "tonep.tsv", "--value negative_per_1000", TMP "box.svg");
    python_check("boxcol " TMP "tonep.tsv " TMP "box.svg negative_per_1000");
    unlink(TMP "box.svg");
}

static void test_scatter_against_numpy(void **state)
{
    (void)state;
    chart("scatter", "tfidf.tsv", "--term backlog --term2 margin", TMP "sc.svg");
    python_check("scatter " TMP "tfidf.tsv " TMP "sc.svg backlog margin");
    chart("scatter", "tfidf.tsv", "--term recall --term2 warranty", TMP "sc.svg");
    python_check("scatter " TMP "tfidf.tsv " TMP "sc.svg recall warranty");
    unlink(TMP "sc.svg");
}

static void test_histogram_against_table(void **state)
{
    (void)state;
    chart("histogram", "classes.tsv", "", TMP "h.svg");
    python_check("histogram " TMP "classes.tsv " TMP "h.svg");
    unlink(TMP "h.svg");
}

/* Hostile and very long terms: text in titles and labels, never markup; a
 * long label is cut with an ellipsis to its room (160 px for bar labels). */
static void test_hostile_and_long_labels(void **state)
{
    (void)state;
    const char *tsv = TMP "evil.tsv";
    FILE *f = fopen(tsv, "w");
    assert_non_null(f);
    fputs("entity\tbase\ttarget\tterm\tlog_ratio\tq_value\n", f);
    fputs("e\t2025-Q1\t2025-Q2\t<script>alert(1)</script>\t2.5\t0.01\n", f);
    fputs("e\t2025-Q1\t2025-Q2\t\"><svg onload=alert(1)>\t-1.5\t0.2\n", f);
    fputs("e\t2025-Q1\t2025-Q2\t", f);
    for (int i = 0; i < 30; i++)
        fputs("overcapitalisation", f);
    fputs("\t1.25\t0.04\n", f);
    fclose(f);
    for (int text = 0; text < 2; text++) {
        char args[512];
        snprintf(args, sizeof args, "chart bars --from %s %s -o " TMP "evil.svg", tsv,
                 text ? "--text" : "");
        assert_int_equal(run(args, out, sizeof out), 0);
        xmlDocPtr d = parse_file(TMP "evil.svg");
        assert_non_null(d);
        xmlNodePtr root = xmlDocGetRootElement(d);
        assert_int_equal(count_elements(root, "script"), 0);
        assert_int_equal(count_elements(root, "svg"), 1);
        xmlFreeDoc(d);
        FILE *g = fopen(TMP "evil.svg", "r");
        size_t n = fread(out, 1, sizeof out - 1, g);
        out[n] = '\0';
        fclose(g);
        assert_null(strstr(out, "<script"));
        assert_null(strstr(out, "<svg onload"));
        assert_non_null(strstr(out, "&lt;script&gt;alert(1)&lt;/script&gt;"));
        assert_non_null(strstr(out, "&quot;&gt;&lt;svg onload=alert(1)&gt;"));
        /* the long term's label ends in an ellipsis and fits 160 px */
        const char *p = strstr(out, "overcapitalisationovercapitalisation");
        assert_non_null(p);
        tt_font *font = NULL;
        tt_error err;
        tt_error_init(&err);
        assert_int_equal(tt_font_open(TT_FONT_DEFAULT, &font, &err), TT_OK);
        int found = 0;
        for (const char *q = out; (q = strstr(q, "overcap")) != NULL; q++) {
            const char *e = strstr(q, "\xE2\x80\xA6");
            const char *stop = strpbrk(q, "\"<");
            if (e && stop && e < stop) {
                double w = tt_font_advance(font, q, (size_t)(e + 3 - q), 11.5);
                assert_true(w <= 160 + 1e-9);
                assert_true(w > 100);
                found = 1;
                break;
            }
        }
        assert_true(found);
        tt_font_free(font);
    }
    unlink(tsv);
    unlink(TMP "evil.svg");
}

/* Reading tables back: escapes undone, ragged rows refused with the line. */
static void test_tsv_read(void **state)
{
    (void)state;
    const char *p = TMP "read.tsv";
    FILE *f = fopen(p, "w");
    fputs("term\tcount\r\na\\tb\t3\r\nx\\\\y\t1.5e2\n\n", f);
    fclose(f);
    tt_tsv t;
    tt_tsv_init(&t);
    tt_error err;
    tt_error_init(&err);
    assert_int_equal(tt_tsv_read(p, &t, &err), TT_OK);
    assert_int_equal(t.nrows, 2);
    assert_string_equal(tt_tsv_cell(&t, 0, 0), "a\tb");
    assert_string_equal(tt_tsv_cell(&t, 1, 0), "x\\y");
    double v;
    assert_true(tt_tsv_number(&t, 1, 1, &v));
    assert_true(v == 150);
    assert_int_equal(tt_tsv_column(&t, "count"), 1);
    assert_int_equal(tt_tsv_column(&t, "rate"), -1);
    f = fopen(p, "w");
    fputs("term\tcount\na\t1\nb\n", f);
    fclose(f);
    assert_int_equal(tt_tsv_read(p, &t, &err), TT_EPARSE);
    assert_int_equal(err.line, 3);
    assert_string_equal(err.file, p);
    f = fopen(p, "w");
    fclose(f);
    assert_int_equal(tt_tsv_read(p, &t, &err), TT_EPARSE);
    /* a CSV table is named as such */
    assert_int_equal(tt_tsv_parse("term,count\na,1\n", 15, "t.csv", &t, &err), TT_EPARSE);
    assert_non_null(strstr(err.message, "comma-separated"));
    assert_int_equal(err.line, 1);
    tt_tsv_release(&t);
    unlink(p);
}

/* Out of memory anywhere in reading a table or drawing any chart is
 * reported as TT_ENOMEM, never crashed on (the failing allocator of
 * tt_test.h fails the k-th allocation and every later one). */
static void test_out_of_memory(void **state)
{
    (void)state;
    static const char *const kinds[][2] = { { "bars", "compare.tsv" }, { "lines", "trend.tsv" },
                                             { "heatmap", "trend.tsv" },
                                             { "histogram", "classes.tsv" },
                                             { "box", "tfidf.tsv" }, { "scatter", "tfidf.tsv" },
                                             { "treemap", "tone.tsv" } };
    tt_font *font = NULL;
    tt_error err;
    tt_error_init(&err);
    assert_int_equal(tt_font_open(TT_FONT_DEFAULT, &font, &err), TT_OK);
    for (size_t i = 0; i < sizeof kinds / sizeof kinds[0]; i++) {
        char path[256];
        snprintf(path, sizeof path, TMP "%s", kinds[i][1]);
        tt_chart_kind kind;
        assert_int_equal(tt_chart_kind_parse(kinds[i][0], &kind), TT_OK);
        int ok = 0;
        for (int k = 0; k < 2000 && !ok; k += (k < 50 ? 1 : 7)) {
            tt_tsv t;
            tt_tsv_init(&t);
            tt_buf svg;
            tt_buf_init(&svg, 0);
            tt_chart_options o;
            tt_chart_options_init(&o);
            tt_error_init(&err);
            tt_set_allocator(&(tt_allocator){ tt_test_failing_malloc, tt_test_failing_realloc, free });
            tt_test_fail_after = k;
            tt_status st = tt_tsv_read(path, &t, &err);
            if (!st)
                st = tt_chart_draw(kind, &t, path, font, &o, &svg, &err);
            tt_test_fail_after = -1;
            tt_set_allocator(NULL);
            assert_true(st == TT_OK || st == TT_ENOMEM);
            ok = st == TT_OK;
            tt_buf_release(&svg);
            tt_tsv_release(&t);
        }
        assert_true(ok);
    }
    tt_font_free(font);
}

/* Errors through the program: the file and the missing column named, exit
 * 2, nothing written. */
static void test_errors(void **state)
{
    (void)state;
    const char *svg = TMP "err.svg";
    unlink(svg);
    assert_int_equal(run("chart heatmap --from " TMP "classes.tsv -o " TMP "err.svg", out,
                         sizeof out), 2);
    assert_non_null(strstr(out, TMP "classes.tsv"));
    assert_non_null(strstr(out, "no column 'term'"));
    assert_int_equal(run("chart pie --from " TMP "classes.tsv", out, sizeof out), 2);
    assert_non_null(strstr(out, "no such chart"));
    assert_int_equal(run("chart bars", out, sizeof out), 2);
    assert_non_null(strstr(out, "--from"));
    assert_int_equal(run("chart bars --from /nonexistent.tsv", out, sizeof out), 2);
    assert_non_null(strstr(out, "/nonexistent.tsv"));
    assert_int_equal(run("chart bars --from " TMP "compare.tsv --pair 1999-Q1,1999-Q2", out,
                         sizeof out), 2);
    assert_non_null(strstr(out, "1999-Q1"));
    struct stat sb;
    assert_int_equal(stat(svg, &sb), -1);
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_ticks),
        cmocka_unit_test(test_squarify),
        cmocka_unit_test(test_tsv_read),
        cmocka_unit_test(test_every_kind_wellformed),
        cmocka_unit_test(test_bars_against_table),
        cmocka_unit_test(test_heatmap_against_table),
        cmocka_unit_test(test_calendar_gaps),
        cmocka_unit_test(test_box_against_numpy),
        cmocka_unit_test(test_scatter_against_numpy),
        cmocka_unit_test(test_histogram_against_table),
        cmocka_unit_test(test_hostile_and_long_labels),
        cmocka_unit_test(test_out_of_memory),
        cmocka_unit_test(test_errors),
    };
    return cmocka_run_group_tests(tests, setup, teardown);
}
