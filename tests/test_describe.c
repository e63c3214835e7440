/* Tests of describing a term's distribution (src/describe.c and
 * `termtide describe`): the statistics of a generated set of twelve
 * documents with known counts, against Python's statistics module, SciPy
 * and NumPy run at test time; where the latest document sits against the
 * earlier ones; the correlation of two terms; normalizing a typed term; the
 * demo corpus's covenant trouble as an unusual quarter; and usage errors.
 *
 * The program tests need `describe` registered in the program; until it is,
 * they are skipped (the library tests still run). */
#include <math.h>
#include <sys/stat.h>
#include <sys/wait.h>
#include <unistd.h>

#include "tt_test.h"

#include "termtide/alloc.h"
#include "termtide/batch.h"
#include "termtide/describe.h"
#include "termtide/source.h"

/* The generated set: document i has covenant[i] "covenant", waiver[i]
 * "waiver" and the rest "valve", words[i] words in all. Documents 2, 3, 7
 * and 11 share a rate (a mode); the last (the latest) is far above the
 * others. */
enum { NDOCS = 12 };
static const unsigned covenant_n[NDOCS] = { 2, 3, 3, 5, 1, 4, 3, 8, 2, 6, 3, 12 };
static const unsigned waiver_n[NDOCS] = { 0, 1, 2, 1, 0, 3, 1, 4, 1, 2, 2, 5 };
static const unsigned words_n[NDOCS] = { 400, 500, 500, 400, 300, 600, 500, 400, 250, 500, 500, 480 };

static char dir[64];
static char paths[NDOCS][96];

static void write_docs(void)
{
    snprintf(dir, sizeof dir, TT_TEST_TMP "tt_describe_XXXXXX");
    assert_non_null(mkdtemp(dir));
    for (int i = 0; i < NDOCS; i++) {
        snprintf(paths[i], sizeof paths[i], "%s/doc%02d.txt", dir, i + 1);
        FILE *f = fopen(paths[i], "w");
        assert_non_null(f);
        unsigned k = 0;
        /* spread the terms through the text, a sentence every 20 words */
        for (unsigned w = 0; w < words_n[i]; w++) {
            const char *word = "valve";
            if (w % 7 == 0 && k < covenant_n[i] + waiver_n[i])
                word = k++ < covenant_n[i] ? "covenant" : "waiver";
            fprintf(f, "%s%s", word, w % 20 == 19 ? ".\n" : " ");
        }
        fclose(f);
    }
}

static void remove_docs(void)
{
    for (int i = 0; i < NDOCS; i++)
        unlink(paths[i]);
    rmdir(dir);
}

static tt_status on_doc(void *ctx, const tt_doc_result *r)
{
    tt_describe_data *d = ctx;
    tt_status st = tt_describe_begin_unit(d, r->name, NULL);
    return st ? st : tt_describe_add_table(d, r->table, NULL);
}

/* Counts the generated documents into d (terms covenant, waiver) through
 * the batch runner, as the program does. */
static void count_docs(tt_describe_data *d, const char *const *files, size_t n)
{
    tt_source_list list;
    tt_source_list_init(&list);
    for (size_t i = 0; i < n; i++)
        assert_int_equal(tt_source_expand(&list, files[i]), TT_OK);
    tt_batch_options o;
    tt_batch_options_init(&o);
    o.on_document = on_doc;
    o.ctx = d;
    tt_batch_summary sum;
    tt_error err;
    tt_error_init(&err);
    assert_int_equal(tt_batch_run(&list, &o, &sum, &err), TT_OK);
    assert_int_equal(sum.skipped, 0);
    tt_source_list_release(&list);
}

static int run_python(const char *script, const char *arg)
{
    char cmd[16384];
    snprintf(cmd, sizeof cmd, "%s -c '%s' %s", tt_test_python(), script, arg);
    int st = system(cmd);
    return WIFEXITED(st) ? WEXITSTATUS(st) : -1;
}

/* Every statistic of the generated set, checked in Python; each source is
 * named beside its check in the script. */
static void test_against_python(void **state)
{
    (void)state;
    write_docs();
    const char *files[NDOCS];
    for (int i = 0; i < NDOCS; i++)
        files[i] = paths[i];
    tt_describe_data d;
    tt_describe_data_init(&d);
    assert_int_equal(tt_describe_add_term(&d, "covenant", 8, NULL), TT_OK);
    assert_int_equal(tt_describe_add_term(&d, "waiver", 6, NULL), TT_OK);
    assert_int_equal(tt_describe_add_term(&d, "covenant", 8, NULL), TT_OK); /* listed once */
    assert_int_equal(d.n_terms, 2);
    count_docs(&d, files, NDOCS);
    assert_int_equal(d.n_units, NDOCS);
    /* the counts the documents were written with */
    for (int i = 0; i < NDOCS; i++) {
        assert_int_equal(d.words[i], words_n[i]);
        assert_int_equal(d.counts[i * 2], covenant_n[i]);
        assert_int_equal(d.counts[i * 2 + 1], waiver_n[i]);
    }
    const double pcts[] = { 5, 95, 37.5 };
    tt_describe_result r;
    tt_error err;
    tt_error_init(&err);
    /* --trim 20: one value from each end of twelve */
    assert_int_equal(tt_describe_term(&d, 0, 20, pcts, 3, &r, &err), TT_OK);
    assert_int_equal(r.summary.n, NDOCS);
    assert_int_equal(r.n_earlier, NDOCS - 1);
    assert_int_equal(r.latest_unit, NDOCS - 1);
    assert_true(r.summary.has_mode);
    double corr[4];
    assert_int_equal(tt_describe_correlation(&d, corr, &err), TT_OK);

    char path[] = TT_TEST_TMP "tt_describe_py_XXXXXX";
    int fd = mkstemp(path);
    assert_true(fd >= 0);
    FILE *f = fdopen(fd, "w");
    /* the counts (not our rates): Python derives the rates itself */
    for (int i = 0; i < NDOCS; i++)
        fprintf(f, "%u %u %u%c", covenant_n[i], waiver_n[i], words_n[i],
                i + 1 < NDOCS ? ' ' : '\n');
    const tt_summary *s = &r.summary;
    fprintf(f,
            "%.17g %.17g %.17g %.17g %.17g %.17g %.17g %.17g %.17g %.17g %.17g %.17g %.17g "
            "%.17g %.17g %.17g %.17g %.17g %.17g %.17g %.17g %.17g %.17g %.17g %.17g %.17g "
            "%.17g\n",
            s->mean, s->median, s->mode, s->trimmed_mean, s->winsorized_mean, s->min, s->max,
            s->range, s->q1, s->q3, s->iqr, r.percentiles[0], r.percentiles[1],
            r.percentiles[2], s->mean_abs_dev, s->var_sample, s->var_population, s->sd_sample,
            s->sd_population, s->cv, s->skewness, s->excess_kurtosis, r.latest_rate,
            r.latest_percentile_rank, r.latest_z, corr[1], corr[2]);
    fclose(f);
    static const char script[] =
        "import sys, statistics, numpy\n"
        "from scipy import stats\n"
        "from scipy.stats import mstats\n"
        "lines = open(sys.argv[1]).read().split(\"\\n\")\n"
        "v = list(map(int, lines[0].split()))\n"
        "c, w, n = v[0::3], v[1::3], v[2::3]\n"
        "x = [10000 * a / b for a, b in zip(c, n)]\n"
        "y = [10000 * a / b for a, b in zip(w, n)]\n"
        "got = list(map(float, lines[1].split()))\n"
        "ref = [\n"
        "  statistics.mean(x),                        # Python statistics.mean\n"
        "  statistics.median(x),                      # Python statistics.median\n"
        "  statistics.multimode(x)[0],                # Python statistics.multimode (one mode here)\n"
        "  stats.trim_mean(x, 0.1),                   # scipy.stats.trim_mean, 10% per tail\n"
        "  mstats.winsorize(numpy.array(x), limits=(0.1, 0.1)).mean(),  # scipy.stats.mstats.winsorize\n"
        "  min(x), max(x), max(x) - min(x),           # Python builtins\n"
        "  *numpy.percentile(x, [25, 75], method=\"weibull\"),  # numpy.percentile, Hyndman-Fan type 6\n"
        "  numpy.subtract(*numpy.percentile(x, [75, 25], method=\"weibull\")),\n"
        "  *numpy.percentile(x, [5, 95, 37.5], method=\"weibull\"),\n"
        "  numpy.mean(numpy.abs(numpy.array(x) - numpy.mean(x))),  # mean absolute deviation, numpy\n"
        "  statistics.variance(x), statistics.pvariance(x),        # Python statistics\n"
        "  statistics.stdev(x), statistics.pstdev(x),              # Python statistics\n"
        "  statistics.stdev(x) / statistics.mean(x),\n"
        "  stats.skew(x, bias=False),                 # scipy.stats.skew, bias-corrected\n"
        "  stats.kurtosis(x, fisher=True, bias=False),  # scipy.stats.kurtosis, bias-corrected excess\n"
        "  x[-1],\n"
        "  stats.percentileofscore(x[:-1], x[-1], kind=\"mean\"),  # scipy.stats.percentileofscore\n"
        "  (x[-1] - statistics.mean(x[:-1])) / statistics.stdev(x[:-1]),  # z against the earlier, Python statistics\n"
        "  numpy.corrcoef(x, y)[0, 1], numpy.corrcoef(y, x)[0, 1],  # numpy.corrcoef\n"
        "]\n"
        "bad = 0\n"
        "for i, (g, e) in enumerate(zip(got, ref)):\n"
        "    if abs(g - e) > 1e-9 * max(1.0, abs(e)):\n"
        "        bad += 1; print(\"statistic\", i, \"got\", g, \"expected\", e)\n"
        "if len(got) != len(ref): bad += 1; print(\"count\", len(got), len(ref))\n"
        "sys.exit(1 if bad else 0)\n";
    int rc = run_python(script, path);
    unlink(path);
    assert_int_equal(rc, 0);
    /* the latest (250 per 10k) is far above every earlier rate */
    if (!(fabs(r.latest_percentile_rank - 100.0) < 1e-9 && r.latest_z > 3))
        fail_msg("latest: rank %.17g z %.17g", r.latest_percentile_rank, r.latest_z);
    tt_describe_data_release(&d);
    remove_docs();
}

/* Units without words are left out of every statistic, for every term;
 * statistics the sample does not allow are NaN. */
static void test_small_and_empty(void **state)
{
    (void)state;
    tt_describe_data d;
    tt_describe_data_init(&d);
    assert_int_equal(tt_describe_add_term(&d, "covenant", 8, NULL), TT_OK);
    tt_termtable *t = tt_termtable_new();
    assert_int_equal(tt_termtable_add(t, "covenant", 8, 2), TT_OK);
    assert_int_equal(tt_termtable_add(t, "valve", 5, 98), TT_OK);
    tt_termtable *empty = tt_termtable_new();
    tt_describe_result r;
    /* no unit at all: n 0, every statistic NaN */
    assert_int_equal(tt_describe_term(&d, 0, 10, NULL, 0, &r, NULL), TT_OK);
    assert_int_equal(r.summary.n, 0);
    assert_true(isnan(r.summary.mean) && isnan(r.latest_z));
    assert_int_equal(tt_describe_begin_unit(&d, "a", NULL), TT_OK);
    assert_int_equal(tt_describe_add_table(&d, t, NULL), TT_OK);
    assert_int_equal(tt_describe_begin_unit(&d, "empty", NULL), TT_OK);
    assert_int_equal(tt_describe_add_table(&d, empty, NULL), TT_OK);
    assert_int_equal(tt_describe_empty_units(&d), 1);
    assert_int_equal(tt_describe_term(&d, 0, 10, NULL, 0, &r, NULL), TT_OK);
    /* one value: rate 10000·2/100 = 200; sd undefined; latest has no past */
    assert_int_equal(r.summary.n, 1);
    assert_true(r.summary.mean == 200.0);
    assert_true(isnan(r.summary.sd_sample) && isnan(r.summary.cv));
    assert_int_equal(r.latest_unit, 0); /* the empty unit is not the latest */
    assert_int_equal(r.n_earlier, 0);
    assert_true(isnan(r.latest_percentile_rank) && isnan(r.latest_z));
    /* terms only before units; a term index out of range; bad options */
    assert_int_equal(tt_describe_add_term(&d, "waiver", 6, NULL), TT_EINVAL);
    assert_int_equal(tt_describe_term(&d, 1, 10, NULL, 0, &r, NULL), TT_EINVAL);
    assert_int_equal(tt_describe_term(&d, 0, 100, NULL, 0, &r, NULL), TT_EINVAL);
    const double bad_pct[] = { 101 };
    assert_int_equal(tt_describe_term(&d, 0, 10, bad_pct, 1, &r, NULL), TT_EINVAL);
    tt_termtable_free(t);
    tt_termtable_free(empty);
    tt_describe_data_release(&d);
}

static void test_percentile_list(void **state)
{
    (void)state;
    double p[4];
    tt_error err;
    tt_error_init(&err);
    assert_int_equal(tt_describe_parse_percentiles("5,95", p, 4, &err), 2);
    assert_true(p[0] == 5 && p[1] == 95);
    assert_int_equal(tt_describe_parse_percentiles(" 2.5 , 50,97.5", p, 4, &err), 3);
    assert_true(p[0] == 2.5 && p[2] == 97.5);
    assert_int_equal(tt_describe_parse_percentiles("5,", p, 4, &err), 0);
    assert_int_equal(tt_describe_parse_percentiles("101", p, 4, &err), 0);
    assert_int_equal(tt_describe_parse_percentiles("5;95", p, 4, &err), 0);
    assert_int_equal(tt_describe_parse_percentiles("1,2,3,4,5", p, 4, &err), 0);
    assert_int_equal(err.status, TT_ELIMIT);
}

/* A typed term is normalized by the documents' own counter options. */
static void test_normalize_term(void **state)
{
    (void)state;
    tt_count_options o;
    tt_count_options_init(&o);
    tt_buf b;
    tt_buf_init(&b, 0);
    tt_error err;
    tt_error_init(&err);
    assert_int_equal(tt_describe_normalize_term(&o, "Covenant", &b, &err), TT_OK);
    assert_string_equal(b.data, "covenant");
    /* with --stem, the Snowball English (Porter2) stem: "supplies" ->
     * "suppli" in Snowball's vocabulary (snowball-data,
     * /usr/share/snowball/data/english/voc.txt and output.txt) */
    o.stem = 1;
    assert_int_equal(tt_describe_normalize_term(&o, "Supplies", &b, &err), TT_OK);
    assert_string_equal(b.data, "suppli");
    o.stem = 0;
    /* several words need n-grams */
    assert_int_equal(tt_describe_normalize_term(&o, "Supply chain", &b, &err), TT_EINVAL);
    assert_non_null(strstr(err.message, "--ngram 2"));
    o.ngram_max = 2;
    assert_int_equal(tt_describe_normalize_term(&o, "Supply  chain", &b, &err), TT_OK);
    assert_string_equal(b.data, "supply chain");
    /* a number is no term unless numbers are counted; nor is nothing */
    o.ngram_max = 1;
    assert_int_equal(tt_describe_normalize_term(&o, "2025", &b, &err), TT_EINVAL);
    assert_int_equal(tt_describe_normalize_term(&o, "", &b, &err), TT_EINVAL);
    tt_buf_release(&b);
}

/* ---- the program ------------------------------------------------------------ */

static char *run_capture(const char *args, int *status)
{
    char cmd[8192];
    snprintf(cmd, sizeof cmd, "%s %s 2>&1", tt_test_bin(), args);
    FILE *p = popen(cmd, "r");
    assert_non_null(p);
    size_t cap = 1 << 20, n = 0, k;
    char *out = malloc(cap);
    while ((k = fread(out + n, 1, cap - 1 - n, p)) > 0)
        n += k;
    out[n] = '\0';
    int st = pclose(p);
    *status = WIFEXITED(st) ? WEXITSTATUS(st) : -1;
    return out;
}

static int have_describe(void)
{
    int st;
    char *out = run_capture("describe --help", &st);
    free(out);
    return st == 0;
}

/* The value of one statistic in `--show long` output. */
static double long_value(const char *out, const char *term, const char *name)
{
    char key[128];
    snprintf(key, sizeof key, "\n%s\t%s\t", term, name);
    const char *p = strstr(out, key);
    assert_non_null(p);
    p += strlen(key);
    if (!strncmp(p, "n/a", 3))
        return NAN;
    return strtod(p, NULL);
}

/* The program prints what the library computes (itself checked against
 * Python above), with the trim and percentiles asked for. */
static void test_program_output(void **state)
{
    (void)state;
    if (!have_describe())
        skip();
    write_docs();
    char args[4096];
    int k = snprintf(args, sizeof args,
                     "describe -q --no-stopwords --term Covenant --term waiver --trim 20 "
                     "--percentiles 5,95,37.5 --decimals 12 --show long");
    for (int i = 0; i < NDOCS; i++)
        k += snprintf(args + k, sizeof args - (size_t)k, " %s", paths[i]);
    int st;
    char *out = run_capture(args, &st);
    assert_int_equal(st, 0);

    tt_describe_data d;
    tt_describe_data_init(&d);
    assert_int_equal(tt_describe_add_term(&d, "covenant", 8, NULL), TT_OK);
    assert_int_equal(tt_describe_add_term(&d, "waiver", 6, NULL), TT_OK);
    const char *files[NDOCS];
    for (int i = 0; i < NDOCS; i++)
        files[i] = paths[i];
    count_docs(&d, files, NDOCS);
    const double pcts[] = { 5, 95, 37.5 };
    tt_describe_result r;
    assert_int_equal(tt_describe_term(&d, 0, 20, pcts, 3, &r, NULL), TT_OK);
    const struct { const char *name; double v; } want[] = {
        { "n", (double)r.summary.n }, { "mean", r.summary.mean },
        { "median", r.summary.median }, { "mode", r.summary.mode },
        { "trimmed_mean", r.summary.trimmed_mean },
        { "winsorized_mean", r.summary.winsorized_mean }, { "q1", r.summary.q1 },
        { "p5", r.percentiles[0] }, { "p95", r.percentiles[1] },
        { "p37.5", r.percentiles[2] }, { "sd_sample", r.summary.sd_sample },
        { "skewness", r.summary.skewness }, { "excess_kurtosis", r.summary.excess_kurtosis },
        { "latest_percentile_rank", r.latest_percentile_rank }, { "latest_z", r.latest_z },
    };
    for (size_t i = 0; i < sizeof want / sizeof want[0]; i++) {
        double got = long_value(out, "covenant", want[i].name);
        if (fabs(got - want[i].v) > 1e-9 * fmax(1, fabs(want[i].v)))
            fail_msg("%s: printed %.15g, library %.15g", want[i].name, got, want[i].v);
    }
    assert_non_null(strstr(out, "\ncovenant\tlatest\t"));
    assert_non_null(strstr(out, "doc12.txt\n"));
    free(out);

    /* the correlation matrix, against the library's */
    k = snprintf(args, sizeof args,
                 "describe -q --no-stopwords --term covenant --term waiver --decimals 12 "
                 "--show correlation -f csv");
    for (int i = 0; i < NDOCS; i++)
        k += snprintf(args + k, sizeof args - (size_t)k, " %s", paths[i]);
    out = run_capture(args, &st);
    assert_int_equal(st, 0);
    double corr[4];
    assert_int_equal(tt_describe_correlation(&d, corr, NULL), TT_OK);
    const char *row = strstr(out, "\nwaiver,");
    assert_non_null(row);
    if (strncmp(out, "term,covenant,waiver", 20)) /* CSV ends lines as it likes (RFC 4180: CRLF) */
        fail_msg("correlation output: %s", out);
    assert_true(fabs(strtod(row + 8, NULL) - corr[2]) < 1e-9);
    free(out);

    /* JSON Lines writes an undefined value as null: the z-score of a
     * document against a single earlier one */
    snprintf(args, sizeof args, "describe -q --no-stopwords --term covenant -f jsonl %s %s",
             paths[0], paths[1]);
    out = run_capture(args, &st);
    assert_int_equal(st, 0);
    assert_non_null(strstr(out, "\"latest_z\":null"));
    free(out);
    tt_describe_data_release(&d);
    remove_docs();
}

/* The demo corpus's invented story: Hollowmere's covenant trouble peaks in
 * its 2024-Q4 call, so "leverage" in that call sits above every earlier
 * quarter, more than two standard deviations out. */
static void test_demo_corpus(void **state)
{
    (void)state;
    if (!have_describe())
        skip();
    int st;
    char *out = run_capture("describe -q --manifest demo-corpus/manifest.tsv --entity "
                            "hollowmere --kinds call-transcript --until 2024-Q4 --term "
                            "leverage --show long",
                            &st);
    assert_int_equal(st, 0);
    assert_true(long_value(out, "leverage", "n") == 6);
    assert_non_null(strstr(out, "\tlatest\tdemo-corpus/hollowmere/2024-Q4-call-transcript.txt\n"));
    assert_true(long_value(out, "leverage", "latest_percentile_rank") == 100);
    assert_true(long_value(out, "leverage", "latest_z") > 2);
    free(out);
    /* the same quarter pooled by period gives the same answer (one call a
     * quarter) */
    out = run_capture("describe -q --manifest demo-corpus/manifest.tsv --entity hollowmere "
                      "--kinds call-transcript --until 2024-Q4 --by-period --term leverage "
                      "--show long",
                      &st);
    assert_int_equal(st, 0);
    assert_non_null(strstr(out, "\tlatest\t2024-Q4\n"));
    assert_true(long_value(out, "leverage", "latest_z") > 2);
    free(out);
}

static void test_usage_errors(void **state)
{
    (void)state;
    if (!have_describe())
        skip();
    int st;
    char *out = run_capture("describe --manifest demo-corpus/manifest.tsv --period 2025-Q5 "
                            "--term leverage",
                            &st);
    assert_int_equal(st, 2);
    assert_non_null(strstr(out, "unknown period syntax"));
    free(out);
    out = run_capture("describe --manifest demo-corpus/manifest.tsv --entity nobody --term "
                      "leverage",
                      &st);
    assert_int_equal(st, 2);
    assert_non_null(strstr(out, "no documents"));
    free(out);
    out = run_capture("describe --manifest demo-corpus/manifest.tsv --entity hollowmere", &st);
    assert_int_equal(st, 2);
    assert_non_null(strstr(out, "--term"));
    free(out);
    out = run_capture("describe --term the demo-corpus/hollowmere", &st);
    assert_int_equal(st, 2);
    assert_non_null(strstr(out, "stop-word"));
    free(out);
    out = run_capture("describe --term leverage --show correlation demo-corpus/hollowmere", &st);
    assert_int_equal(st, 2);
    assert_non_null(strstr(out, "two or more"));
    free(out);
    out = run_capture("describe --term leverage --period 2024-Q4 demo-corpus/hollowmere", &st);
    assert_int_equal(st, 2);
    assert_non_null(strstr(out, "metadata"));
    free(out);
}

int main(void)
{
    tt_termtable_set_seed(1, 2);
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_against_python),
        cmocka_unit_test(test_small_and_empty),
        cmocka_unit_test(test_percentile_list),
        cmocka_unit_test(test_normalize_term),
        cmocka_unit_test(test_program_output),
        cmocka_unit_test(test_demo_corpus),
        cmocka_unit_test(test_usage_errors),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
