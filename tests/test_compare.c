/* Tests of comparing two term tables (src/compare.c): every row's G²,
 * p-value, Log Ratio and q-value against SciPy and an independent
 * Benjamini–Hochberg computed in Python at test time; rows tested under
 * --min-count; new and gone terms; the sort; a planted-signal test; and the
 * demo corpus's story in the top movers through the program. */
#include <math.h>
#include <sys/wait.h>
#include <unistd.h>

#include "tt_test.h"

#include "termtide/alloc.h"
#include "termtide/compare.h"
#include "termtide/termtable.h"

static void add(tt_termtable *t, const char *term, uint64_t n)
{
    if (n)
        assert_int_equal(tt_termtable_add(t, term, strlen(term), n), TT_OK);
}

/* Rows checked against scipy.stats.chi2_contingency(..., correction=False,
 * lambda_="log-likelihood") for G² and p (Debian python3-scipy), the Log
 * Ratio formula of Hardie (2014) with 0.5 for a zero count, and the
 * Benjamini–Hochberg (1995) step-up procedure written out in Python. */
static void test_against_scipy(void **state)
{
    (void)state;
    tt_termtable *a = tt_termtable_new(), *b = tt_termtable_new();
    char w[32];
    /* a varied vocabulary: shared terms with different rates, new, gone,
     * and rare terms that --min-count leaves untested */
    for (int i = 0; i < 120; i++) {
        snprintf(w, sizeof w, "term%03d", i);
        add(a, w, (uint64_t)((i * 37) % 50 + (i % 7 == 0 ? 0 : 1)));
        add(b, w, (uint64_t)((i * 53) % 61 + (i % 11 == 0 ? 0 : 1)));
    }
    add(a, "onlybase", 40);
    add(b, "onlytarget", 35);
    add(a, "rare", 1);
    tt_compare_options o;
    tt_compare_options_init(&o);
    o.min_count = 3;
    tt_compare_result r;
    tt_compare_result_init(&r);
    tt_error err;
    tt_error_init(&err);
    assert_int_equal(tt_compare_tables(a, b, &o, &r, &err), TT_OK);
    assert_true(r.n > 100);
    assert_true(r.new_terms >= 1 && r.gone_terms >= 1);

    char path[] = TT_TEST_TMP "tt_compare_XXXXXX";
    int fd = mkstemp(path);
    assert_true(fd >= 0);
    FILE *f = fdopen(fd, "w");
    fprintf(f, "%llu %llu\n", (unsigned long long)r.base_words,
            (unsigned long long)r.target_words);
    for (size_t i = 0; i < r.n; i++) {
        const tt_change *c = &r.rows[i].change;
        fprintf(f, "%.*s %llu %llu %.17g %.17g %.17g %.17g %.17g\n", (int)r.rows[i].len,
                r.rows[i].term, (unsigned long long)c->base_count,
                (unsigned long long)c->target_count, c->g2, c->p_value, c->log_ratio,
                c->q_value, c->signed_g2);
    }
    fclose(f);
    char cmd[4096];
    snprintf(cmd, sizeof cmd,
             "%s -c '\n"
             "import sys, math\n"
             "from scipy.stats import chi2_contingency\n"
             "lines = open(sys.argv[1]).read().split(\"\\n\")\n"
             "n1, n2 = map(int, lines[0].split())\n"
             "rows = [l.split() for l in lines[1:] if l]\n"
             "bad = 0\n"
             "ps = []\n"
             "for t, a, b, g2, p, lr, q, sg in rows:\n"
             "    a, b = int(a), int(b)\n"
             "    g, pp, dof, exp = chi2_contingency([[a, b], [n1 - a, n2 - b]], correction=False, lambda_=\"log-likelihood\")\n"
             "    ra = (a if a else 0.5) / n1; rb = (b if b else 0.5) / n2\n"
             "    lref = math.log2(rb / ra)\n"
             "    if abs(g - float(g2)) > 1e-9 * max(1, g) or abs(pp - float(p)) > 1e-9 * max(pp, 1e-300) + 1e-15 or abs(lref - float(lr)) > 1e-12:\n"
             "        bad += 1; print(\"row\", t, g, g2, pp, p, lref, lr)\n"
             "    ps.append(pp)\n"
             "m = len(ps)\n"
             "order = sorted(range(m), key=lambda i: ps[i])\n"
             "q = [0.0] * m\n"
             "run = 1.0\n"
             "for rank in range(m, 0, -1):\n"
             "    i = order[rank - 1]\n"
             "    run = min(run, ps[i] * m / rank)\n"
             "    q[i] = run\n"
             "for i, r in enumerate(rows):\n"
             "    if abs(q[i] - float(r[6])) > 1e-9 * max(q[i], 1e-300) + 1e-15:\n"
             "        bad += 1; print(\"q\", r[0], q[i], r[6])\n"
             "sg = [float(r[7]) for r in rows]\n"
             "if any(sg[i] < sg[i + 1] for i in range(len(sg) - 1)): bad += 1; print(\"not sorted\")\n"
             "print(\"checked\", len(rows), \"bad\", bad)\n"
             "sys.exit(1 if bad else 0)\n"
             "' %s",
             tt_test_python(), path);
    int st = system(cmd);
    unlink(path);
    assert_true(WIFEXITED(st));
    assert_int_equal(WEXITSTATUS(st), 0);
    /* "rare" (1 + 0 < 3) was not tested */
    for (size_t i = 0; i < r.n; i++)
        assert_false(r.rows[i].len == 4 && !memcmp(r.rows[i].term, "rare", 4));
    tt_compare_result_release(&r);
    tt_termtable_free(a);
    tt_termtable_free(b);
}

/* A small xorshift generator, so the planted test is the same everywhere. */
static uint64_t rng_state = 0x9E3779B97F4A7C15ULL;
static uint64_t next_rand(void)
{
    rng_state ^= rng_state << 13;
    rng_state ^= rng_state >> 7;
    rng_state ^= rng_state << 17;
    return rng_state;
}

/* Planted signal: two periods drawn from one Zipf-like distribution over
 * 2,000 words, except 20 planted words whose rate is 3x in the target. The
 * planted words must lead the table, and among unchanged words at most 5%
 * may have q <= 0.05 (the false discovery rate the procedure controls). */
static void test_planted_signal(void **state)
{
    (void)state;
    enum { V = 2000, PLANTED = 20, N = 400000 };
    static double cum[V + 1];
    double total = 0;
    for (int r = 0; r < V; r++) {
        total += 1.0 / pow(r + 1.0, 1.0);
        cum[r + 1] = total;
    }
    tt_termtable *side[2] = { tt_termtable_new(), tt_termtable_new() };
    char w[32];
    for (int s = 0; s < 2; s++) {
        for (int i = 0; i < N; i++) {
            double u = (double)(next_rand() >> 11) / 9007199254740992.0 * total;
            int lo = 0, hi = V;
            while (lo < hi) {
                int mid = (lo + hi) / 2;
                if (cum[mid + 1] < u)
                    lo = mid + 1;
                else
                    hi = mid;
            }
            /* planted words are ranks 100..119: in the target, keep every
             * draw of them and add two more, tripling their rate */
            int reps = (s == 1 && lo >= 100 && lo < 100 + PLANTED) ? 3 : 1;
            snprintf(w, sizeof w, "w%04d", lo);
            add(side[s], w, (uint64_t)reps);
        }
    }
    tt_compare_result r;
    tt_compare_result_init(&r);
    tt_error err;
    tt_error_init(&err);
    assert_int_equal(tt_compare_tables(side[0], side[1], NULL, &r, &err), TT_OK);
    int planted_on_top = 0;
    for (size_t i = 0; i < PLANTED; i++) {
        int rank;
        assert_int_equal(sscanf(r.rows[i].term, "w%d", &rank), 1);
        if (rank >= 100 && rank < 100 + PLANTED)
            planted_on_top++;
    }
    assert_int_equal(planted_on_top, PLANTED);
    size_t unchanged = 0, flagged = 0;
    for (size_t i = 0; i < r.n; i++) {
        int rank;
        sscanf(r.rows[i].term, "w%d", &rank);
        if (rank >= 100 && rank < 100 + PLANTED)
            continue;
        unchanged++;
        if (r.rows[i].change.q_value <= 0.05)
            flagged++;
    }
    print_message("planted: %d of %d lead; unchanged flagged at q <= 0.05: %zu of %zu\n",
                  planted_on_top, PLANTED, flagged, unchanged);
    assert_true((double)flagged <= 0.05 * (double)unchanged);
    tt_compare_result_release(&r);
    tt_termtable_free(side[0]);
    tt_termtable_free(side[1]);
}

static void test_empty_side(void **state)
{
    (void)state;
    tt_termtable *a = tt_termtable_new(), *b = tt_termtable_new();
    add(a, "alpha", 3);
    tt_compare_result r;
    tt_compare_result_init(&r);
    tt_error err;
    tt_error_init(&err);
    assert_int_equal(tt_compare_tables(a, b, NULL, &r, &err), TT_EINVAL);
    assert_non_null(strstr(err.message, "target"));
    tt_compare_result_release(&r);
    tt_termtable_free(a);
    tt_termtable_free(b);
}

static char *run_capture(const char *args, int *status)
{
    char cmd[4096];
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

/* The demo corpus's invented story (a supply crisis that brings covenant
 * trouble and going-concern language into the annual report) shows at the
 * top of the movers; and the usage errors name their cause. */
static void test_demo_story(void **state)
{
    (void)state;
    int st;
    char *out = run_capture("compare --quiet --manifest demo-corpus/manifest.tsv --kinds "
                            "annual-report --entity hollowmere --base FY2023 --target FY2024 "
                            "--ngram 2 --top 3",
                            &st);
    assert_int_equal(st, 0);
    char *first = strchr(out, '\n');
    assert_non_null(first);
    /* the three strongest rises, in order of signed G² */
    assert_non_null(strstr(first, "\tsubstantial doubt\t"));
    assert_non_null(strstr(first, "\tgoing concern\t"));
    assert_true(strstr(first, "\tsubstantial doubt\t") < strstr(first, "\tgoing concern\t"));
    free(out);

    out = run_capture("compare --quiet --manifest demo-corpus/manifest.tsv --consecutive", &st);
    assert_int_equal(st, 2);
    assert_non_null(strstr(out, "cannot be in one series"));
    assert_non_null(strstr(out, "--kinds"));
    free(out);
    out = run_capture("compare --consecutive --base a --target b", &st);
    assert_int_equal(st, 2);
    assert_non_null(strstr(out, "--manifest"));
    free(out);
    out = run_capture("compare --manifest /nonexistent/m.tsv --base 2024-Q1 --target 2024-Q2", &st);
    assert_int_equal(st, 2);
    assert_non_null(strstr(out, "/nonexistent/m.tsv"));
    free(out);
    out = run_capture("compare --manifest demo-corpus/manifest.tsv --base 2024-Q5 --target 2024-Q2",
                      &st);
    assert_int_equal(st, 2);
    assert_non_null(strstr(out, "2024-Q5"));
    free(out);
}

/* Metadata from submission-wrapper headers: three invented quarterly
 * filings of one company become a series of three quarters; a plain file
 * among them is reported and left out (exit status 2). */
static void test_headers(void **state)
{
    (void)state;
    char dir[] = TT_TEST_TMP "tt_headers_XXXXXX";
    assert_non_null(mkdtemp(dir));
    const char *dates[] = { "20250331", "20250630", "20250930" };
    for (int i = 0; i < 3; i++) {
        char p[256];
        snprintf(p, sizeof p, "%s/q%d.txt", dir, i);
        FILE *f = fopen(p, "w");
        assert_non_null(f);
        fprintf(f, "<SEC-DOCUMENT>\n<SEC-HEADER>\nCONFORMED SUBMISSION TYPE:\t10-Q\n"
                   "CONFORMED PERIOD OF REPORT:\t%s\n\tCOMPANY CONFORMED NAME:\t\t\tPELLWORTH "
                   "MARINE INC\n</SEC-HEADER>\n<DOCUMENT>\n<TYPE>10-Q\n<SEQUENCE>1\n<TEXT>\n"
                   "Backlog grew and orders held in quarter %d.\n</TEXT>\n</DOCUMENT>\n",
                dates[i], i);
        fclose(f);
    }
    char p[256];
    snprintf(p, sizeof p, "%s/notes.txt", dir);
    FILE *f = fopen(p, "w");
    fputs("plain words\n", f);
    fclose(f);
    char args[512];
    snprintf(args, sizeof args,
             "compare --headers %s --consecutive --show summary --min-count 1 --quiet", dir);
    int st;
    char *out = run_capture(args, &st);
    assert_int_equal(st, 2);
    assert_non_null(strstr(out, "PELLWORTH MARINE INC\t2025-Q1\t2025-Q2\t"));
    assert_non_null(strstr(out, "PELLWORTH MARINE INC\t2025-Q2\t2025-Q3\t"));
    assert_non_null(strstr(out, "notes.txt: not a submission wrapper"));
    free(out);
    char cmd[300];
    snprintf(cmd, sizeof cmd, "rm -rf %s", dir);
    assert_int_equal(system(cmd), 0);
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_against_scipy),
        cmocka_unit_test(test_planted_signal),
        cmocka_unit_test(test_empty_side),
        cmocka_unit_test(test_demo_story),
        cmocka_unit_test(test_headers),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
