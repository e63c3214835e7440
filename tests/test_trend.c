/* termtide tests — the trend stage (src/trend.c) and `termtide trend`.
 *
 * Library: chosen terms are normalized like counted terms; per-document
 * collection agrees with the aggregate stage counting each document alone.
 * Program (skipped while the program at TT_BIN has no `trend` command):
 * rates, across-period statistics, tf-idf, dispersion and the contingency
 * table re-checked by tests/fixtures/trend/check_trend.py against Python's
 * statistics module, numpy.polyfit and numpy.corrcoef, scikit-learn's
 * TfidfVectorizer, scipy.stats.contingency.margins and `termtide count`
 * (each named beside its check there); the demo corpus's story; usage
 * errors. */
#include <math.h>
#include <sys/wait.h>
#include <unistd.h>

#include "tt_test.h"

#include "termtide/aggregate.h"
#include "termtide/alloc.h"
#include "termtide/trend.h"

static void normalize_ok(const tt_count_options *o, const char *text, const char *want)
{
    tt_buf out;
    tt_buf_init(&out, 0);
    tt_error err;
    tt_error_init(&err);
    assert_int_equal(tt_trend_term_normalize(o, text, strlen(text), &out, &err), TT_OK);
    assert_string_equal(out.data, want);
    tt_buf_release(&out);
}

static void normalize_fails(const tt_count_options *o, const char *text, const char *why)
{
    tt_buf out;
    tt_buf_init(&out, 0);
    tt_error err;
    tt_error_init(&err);
    assert_int_equal(tt_trend_term_normalize(o, text, strlen(text), &out, &err), TT_EINVAL);
    assert_non_null(strstr(err.message, why));
    tt_buf_release(&out);
}

static void test_normalize(void **state)
{
    (void)state;
    tt_termtable *stop = tt_termtable_new();
    assert_non_null(stop);
    assert_int_equal(tt_termtable_add(stop, "the", 3, 1), TT_OK);
    assert_int_equal(tt_termtable_add(stop, "of", 2, 1), TT_OK);
    tt_count_options o;
    tt_count_options_init(&o);
    o.stopwords = stop;
    /* Case folding (Unicode default case folding: "CASTINGS" → "castings"). */
    normalize_ok(&o, "Castings", "castings");
    normalize_ok(&o, "  CASTINGS ", "castings");
    normalize_fails(&o, "the", "never counted");
    normalize_fails(&o, "supply chain", "--ngram 2");
    normalize_fails(&o, "", "no word");
    o.ngram_max = 3;
    normalize_ok(&o, "Supply  Chain", "supply chain");
    /* A stop-word inside an n-gram is kept, as the counter keeps it. */
    normalize_ok(&o, "cost of revenue", "cost of revenue");
    normalize_fails(&o, "the supply", "never counted");
    o.ngram_min = 2;
    normalize_fails(&o, "castings", "never counted");
    tt_termtable_free(stop);
}

static void write_file(const char *path, const char *text)
{
    FILE *f = fopen(path, "w");
    assert_non_null(f);
    fputs(text, f);
    fclose(f);
}

/* Each document's words and chosen counts equal what the aggregate stage
 * counts for that document alone; doc_freq counts documents. */
static void test_collect(void **state)
{
    (void)state;
    char dir[] = TT_TEST_TMP "tt-trend-XXXXXX";
    assert_non_null(mkdtemp(dir));
    char p[3][256];
    const char *texts[3] = {
        "Castings arrived late. Castings cost more. The foundry was idle.\n",
        "The foundry restarted; valves shipped.\n",
        "Castings, castings and more castings from the second foundry.\n",
    };
    tt_source_list list;
    tt_source_list_init(&list);
    for (int i = 0; i < 3; i++) {
        snprintf(p[i], sizeof p[i], "%s/d%d.txt", dir, i);
        write_file(p[i], texts[i]);
        assert_int_equal(tt_source_expand(&list, p[i]), TT_OK);
    }
    tt_batch_options bo;
    tt_batch_options_init(&bo);
    const char *terms[2] = { "castings", "foundry" };
    size_t lens[2] = { 8, 7 };
    tt_trend_options what;
    tt_trend_options_init(&what);
    what.terms = terms;
    what.lens = lens;
    what.n_terms = 2;
    what.want_doc_freq = 1;
    tt_trend_counts tc;
    tt_trend_counts_init(&tc);
    tt_batch_summary sum;
    tt_error err;
    tt_error_init(&err);
    assert_int_equal(tt_trend_collect(&list, &bo, &what, &tc, &sum, &err), TT_OK);
    assert_int_equal(tc.n_docs, 3);
    tt_termtable *tables[3];
    for (size_t d = 0; d < 3; d++) {
        tt_source_list one;
        tt_source_list_init(&one);
        assert_int_equal(tt_source_expand(&one, p[d]), TT_OK);
        tables[d] = tt_termtable_new();
        tt_batch_summary s1;
        assert_int_equal(tt_aggregate_run(&one, &bo, tables[d], &s1, &err), TT_OK);
        assert_int_equal(tc.docs[d].input, d);
        assert_int_equal(tc.docs[d].words, tt_termtable_total(tables[d]));
        assert_true(tc.docs[d].tfidf_norm == 0); /* not asked for */
        for (size_t j = 0; j < 2; j++)
            assert_int_equal(tc.counts[d * 2 + j], tt_termtable_get(tables[d], terms[j], lens[j]));
        tt_source_list_release(&one);
    }
    /* By hand from the texts above: "castings" twice, none, three times. */
    assert_int_equal(tc.counts[0], 2);
    assert_int_equal(tc.counts[2], 0);
    assert_int_equal(tc.counts[4], 3);
    assert_int_equal(tt_termtable_get(tc.doc_freq, "castings", 8), 2);
    assert_int_equal(tt_termtable_get(tc.doc_freq, "foundry", 7), 3);
    /* Second pass: each norm is the length of the count x idf vector, idf =
     * ln((1 + n) / (1 + df)) + 1 (scikit-learn's smooth_idf, from its
     * documentation), summed here from each document's own table. */
    tt_trend_counts second;
    tt_trend_counts_init(&second);
    tt_trend_options w2;
    tt_trend_options_init(&w2);
    w2.idf_doc_freq = tc.doc_freq;
    w2.idf_docs = 3;
    assert_int_equal(tt_trend_collect(&list, &bo, &w2, &second, &sum, &err), TT_OK);
    assert_int_equal(second.n_docs, 3);
    for (int d = 0; d < 3; d++) {
        tt_term_entry *e;
        size_t n;
        assert_int_equal(tt_termtable_sorted(tables[d], &e, &n), TT_OK);
        double ss = 0;
        for (size_t i = 0; i < n; i++) {
            double df = (double)tt_termtable_get(tc.doc_freq, e[i].term, e[i].len);
            double wgt = (double)e[i].count * (log(4.0 / (1.0 + df)) + 1.0);
            ss += wgt * wgt;
        }
        assert_true(fabs(second.docs[d].tfidf_norm - sqrt(ss)) < 1e-9);
        tt_free(e);
        tt_termtable_free(tables[d]);
    }
    tt_trend_counts_release(&second);
    /* A term the first pass never saw means the inputs changed. */
    tt_termtable *partial = tt_termtable_new();
    assert_int_equal(tt_termtable_add(partial, "castings", 8, 2), TT_OK);
    w2.idf_doc_freq = partial;
    assert_int_equal(tt_trend_collect(&list, &bo, &w2, &second, &sum, &err), TT_EINVAL);
    assert_non_null(strstr(err.message, "changed"));
    tt_trend_counts_release(&second);
    tt_termtable_free(partial);
    /* Too many terms is a limit, not a crash. */
    w2.idf_doc_freq = NULL;
    w2.n_terms = TT_TREND_MAX_TERMS + 1;
    assert_int_equal(tt_trend_collect(&list, &bo, &w2, &second, &sum, &err), TT_ELIMIT);
    tt_trend_counts_release(&tc);
    tt_source_list_release(&list);
    for (int i = 0; i < 3; i++)
        remove(p[i]);
    rmdir(dir);
}

static char *run_capture(const char *args, int *status)
{
    char cmd[4096];
    snprintf(cmd, sizeof cmd, "%s %s 2>&1", tt_test_bin(), args);
    FILE *p = popen(cmd, "r");
    assert_non_null(p);
    size_t cap = 1 << 20, n = 0, k;
    char *out = malloc(cap);
    assert_non_null(out);
    while ((k = fread(out + n, 1, cap - 1 - n, p)) > 0)
        n += k;
    out[n] = '\0';
    int st = pclose(p);
    *status = WIFEXITED(st) ? WEXITSTATUS(st) : -1;
    return out;
}

/* 1 when the program at TT_BIN has the trend command. */
static int have_trend(void)
{
    int st;
    char *out = run_capture("trend --help", &st);
    int ok = st == 0 && strstr(out, "termtide trend") != NULL;
    free(out);
    return ok;
}

static void test_against_references(void **state)
{
    (void)state;
    if (!have_trend()) {
        fprintf(stderr, "   (the program has no trend command yet: skipped)\n");
        skip();
    }
    char dir[] = TT_TEST_TMP "tt-trendpy-XXXXXX";
    assert_non_null(mkdtemp(dir));
    char cmd[2048];
    snprintf(cmd, sizeof cmd, "%s tests/fixtures/trend/check_trend.py %s %s", tt_test_python(),
             tt_test_bin(), dir);
    int st = system(cmd);
    char rm[512];
    snprintf(rm, sizeof rm, "rm -rf %s", dir);
    assert_int_equal(system(rm), 0);
    assert_true(WIFEXITED(st));
    assert_int_equal(WEXITSTATUS(st), 0);
}

/* Parses the rate column of `--show rates` rows for one term into rate[]
 * by period order; returns the number of rows. */
static size_t rates_of(const char *out, const char *term, char periods[][16], double *rate,
                       size_t max)
{
    size_t n = 0;
    const char *line = strchr(out, '\n');
    while (line && line[1] && n < max) {
        line++;
        char ent[64], t[64], per[16];
        unsigned long long count, words;
        double r;
        if (sscanf(line, "%63[^\t]\t%63[^\t]\t%15[^\t]\t%llu\t%llu\t%lf", ent, t, per, &count,
                   &words, &r) == 6 &&
            !strcmp(t, term)) {
            memcpy(periods[n], per, sizeof per);
            rate[n++] = r;
        }
        line = strchr(line, '\n');
    }
    return n;
}

/* The demo corpus's invented story: hollowmere's only foundry fails in
 * early 2024 and a second source is qualified in 2025, so "castings" comes up
 * far more often on the 2024 calls than on the 2023 or 2025 ones, and peaks
 * in 2024. */
static void test_demo_story(void **state)
{
    (void)state;
    if (!have_trend())
        skip();
    int st;
    char *out = run_capture("trend --quiet --manifest demo-corpus/manifest.tsv --kinds "
                            "call-transcript --entity hollowmere --terms castings",
                            &st);
    assert_int_equal(st, 0);
    char periods[32][16];
    double rate[32];
    size_t n = rates_of(out, "castings", periods, rate, 32);
    assert_int_equal(n, 10);
    double sum[3] = { 0, 0, 0 };
    int cnt[3] = { 0, 0, 0 };
    size_t peak = 0;
    for (size_t i = 0; i < n; i++) {
        int y = (periods[i][3] - '0') - 3; /* 2023 → 0, 2024 → 1, 2025 → 2 */
        assert_true(y >= 0 && y <= 2);
        sum[y] += rate[i];
        cnt[y]++;
        if (rate[i] > rate[peak])
            peak = i;
    }
    double m2023 = sum[0] / cnt[0], m2024 = sum[1] / cnt[1], m2025 = sum[2] / cnt[2];
    assert_true(m2024 > 1.3 * m2023);
    assert_true(m2024 > 1.3 * m2025);
    assert_memory_equal(periods[peak], "2024", 4);
    free(out);
}

static void test_errors(void **state)
{
    (void)state;
    if (!have_trend())
        skip();
    int st;
    char *out = run_capture("trend --terms castings demo-corpus", &st);
    assert_int_equal(st, 2);
    assert_non_null(strstr(out, "--manifest"));
    free(out);
    out = run_capture("trend --manifest demo-corpus/manifest.tsv --kinds call-transcript "
                      "--terms-file /nonexistent/terms.txt",
                      &st);
    assert_int_equal(st, 2);
    assert_non_null(strstr(out, "/nonexistent/terms.txt"));
    free(out);
    /* Quarters and fiscal years of one entity cannot make one series. */
    out = run_capture("trend --manifest demo-corpus/manifest.tsv --terms castings", &st);
    assert_int_equal(st, 2);
    assert_non_null(strstr(out, "--kinds"));
    free(out);
    out = run_capture("trend --manifest demo-corpus/manifest.tsv --kinds call-transcript "
                      "--terms 'supply chain'",
                      &st);
    assert_int_equal(st, 2);
    assert_non_null(strstr(out, "--ngram 2"));
    free(out);
    out = run_capture("trend --manifest demo-corpus/manifest.tsv --kinds call-transcript "
                      "--terms castings --show pictures",
                      &st);
    assert_int_equal(st, 2);
    assert_non_null(strstr(out, "--show"));
    free(out);
}

/* Out of memory at every allocation in turn is reported as TT_ENOMEM (or
 * the call succeeds), never a crash or a leak (ASan checks the leaks). */
static void test_out_of_memory(void **state)
{
    (void)state;
    char dir[] = TT_TEST_TMP "tt-trendoom-XXXXXX";
    assert_non_null(mkdtemp(dir));
    char path[256];
    snprintf(path, sizeof path, "%s/d.txt", dir);
    write_file(path, "Castings arrived late from the foundry. Castings cost more.\n");
    tt_count_options co;
    tt_count_options_init(&co);
    tt_batch_options bo;
    tt_batch_options_init(&bo);
    const char *terms[1] = { "castings" };
    size_t lens[1] = { 8 };
    int normalize_ok_seen = 0, collect_ok_seen = 0, enomem_seen = 0;
    for (int k = 0; k < 400 && !(normalize_ok_seen && collect_ok_seen); k++) {
        tt_source_list list;
        tt_source_list_init(&list);
        assert_int_equal(tt_source_expand(&list, path), TT_OK);
        tt_buf out;
        tt_buf_init(&out, 0);
        tt_trend_counts tc;
        tt_trend_counts_init(&tc);
        tt_batch_summary sum;
        tt_error err;
        tt_error_init(&err);
        tt_test_fail_after = k;
        tt_set_allocator(&(tt_allocator){ tt_test_failing_malloc, tt_test_failing_realloc, free });
        tt_status a = tt_trend_term_normalize(&co, "Castings", 8, &out, &err);
        tt_test_fail_after = k;
        tt_trend_options what;
        tt_trend_options_init(&what);
        what.terms = terms;
        what.lens = lens;
        what.n_terms = 1;
        what.want_doc_freq = 1;
        tt_status b = tt_trend_collect(&list, &bo, &what, &tc, &sum, &err);
        tt_set_allocator(NULL);
        tt_test_fail_after = -1;
        assert_true(a == TT_OK || a == TT_ENOMEM);
        assert_true(b == TT_OK || b == TT_ENOMEM);
        enomem_seen += (a == TT_ENOMEM) + (b == TT_ENOMEM);
        if (a == TT_OK) {
            assert_string_equal(out.data, "castings");
            normalize_ok_seen = 1;
        }
        /* An allocation failing inside a document's counting skips that
         * document; a complete run holds it with both counts. */
        if (b == TT_OK && sum.skipped == 0) {
            assert_int_equal(tc.n_docs, 1);
            assert_int_equal(tc.counts[0], 2);
            collect_ok_seen = 1;
        }
        tt_trend_counts_release(&tc);
        tt_buf_release(&out);
        tt_source_list_release(&list);
    }
    assert_true(normalize_ok_seen && collect_ok_seen);
    assert_true(enomem_seen > 0);
    remove(path);
    rmdir(dir);
}

/* Output does not depend on the number of worker threads. */
static void test_jobs_identical(void **state)
{
    (void)state;
    if (!have_trend())
        skip();
    int st1, st2;
    char *one = run_capture("trend --quiet --manifest demo-corpus/manifest.tsv --kinds "
                            "call-transcript --top-movers 4 --show stats -j 1",
                            &st1);
    char *two = run_capture("trend --quiet --manifest demo-corpus/manifest.tsv --kinds "
                            "call-transcript --top-movers 4 --show stats -j 2",
                            &st2);
    assert_int_equal(st1, 0);
    assert_int_equal(st2, 0);
    assert_string_equal(one, two);
    assert_non_null(strstr(one, "\nhollowmere\t"));
    free(one);
    free(two);
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_normalize),
        cmocka_unit_test(test_collect),
        cmocka_unit_test(test_against_references),
        cmocka_unit_test(test_demo_story),
        cmocka_unit_test(test_errors),
        cmocka_unit_test(test_out_of_memory),
        cmocka_unit_test(test_jobs_identical),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
