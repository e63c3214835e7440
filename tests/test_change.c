/* Tests of the change statistics (src/change.c): G² on the full 2×2 table,
 * its p-value, Log Ratio, the change row (rates, new/gone, direction),
 * r × c contingency tests, the chi-square survival function, and
 * Benjamini–Hochberg q-values, plus a planted-signal test.
 *
 * References are computed at test time by Debian's /usr/bin/python3:
 *   - SciPy: scipy.stats.chi2_contingency(t, correction=False,
 *     lambda_="log-likelihood") for G², the same without lambda_ for
 *     Pearson's chi-square, scipy.stats.chi2.sf and scipy.special.gammaincc;
 *   - Python's decimal module at 80 significant digits for the exact G²
 *     (2 Σ O ln(O/E) from the definition, Dunning 1993), because SciPy's own
 *     sum cancels at large counts;
 *   - statsmodels.stats.multitest.multipletests(p, method="fdr_bh") (Debian
 *     python3-statsmodels) when installed, AND, always, an exact
 *     re-implementation of the 1995 step-up procedure in Python fractions.
 * Tables are generated here with a seeded generator, so a failure replays. */
#include <math.h>
#include <unistd.h>

#include "tt_test_numeric.h"

#include "termtide/alloc.h"
#include "termtide/stats.h"

/* ------------------------------------------------------------------ helpers */

static uint64_t rng_range(uint64_t lo, uint64_t hi)
{
    return lo + (hi > lo ? rng_next() % (hi - lo + 1) : 0);
}

/* Log-uniform integer in [lo, hi], lo >= 1: covers every order of magnitude. */
static uint64_t rng_log(uint64_t lo, uint64_t hi)
{
    double v = exp(log((double)lo) + rng_unit() * (log((double)hi) - log((double)lo)));
    uint64_t r = (uint64_t)v;
    return r < lo ? lo : r > hi ? hi : r;
}

/* ------------------------------------------------------------- 2×2 tables */

typedef struct table22 {
    uint64_t a, n1, b, n2;
} table22;

/* A few hundred tables: tiny ones with zeros, medium, huge counts with rates
 * nearly equal (where the textbook sum cancels), lopsided far tails, and the
 * corners (all words the term, absent on both sides). */
static size_t make_tables(table22 *t, size_t cap)
{
    size_t n = 0;
    rng_state = 0x2b7e151628aed2a6ull;
    for (size_t i = 0; i < 120 && n < cap; i++, n++) { /* tiny */
        t[n].n1 = rng_range(1, 20);
        t[n].n2 = rng_range(1, 20);
        t[n].a = rng_range(0, t[n].n1);
        t[n].b = rng_range(0, t[n].n2);
    }
    for (size_t i = 0; i < 120 && n < cap; i++, n++) { /* medium, log-spread */
        t[n].n1 = rng_log(100, 10000000);
        t[n].n2 = rng_log(100, 10000000);
        t[n].a = rng_range(0, 4) == 0 ? 0 : rng_log(1, t[n].n1 / 10 + 1);
        t[n].b = rng_range(0, 4) == 0 ? 0 : rng_log(1, t[n].n2 / 10 + 1);
    }
    for (size_t i = 0; i < 100 && n < cap; i++, n++) { /* huge, rates close */
        t[n].n1 = rng_log(10000000000ull, 1000000000000ull);
        t[n].n2 = rng_log(10000000000ull, 1000000000000ull);
        t[n].a = rng_log(1000000, 1000000000);
        double rate = (double)t[n].a / (double)t[n].n1;
        double jitter = 1.0 + (rng_unit() - 0.5) * (i % 3 == 0 ? 1e-6 : i % 3 == 1 ? 1e-3 : 0.2);
        t[n].b = (uint64_t)(rate * jitter * (double)t[n].n2);
    }
    for (size_t i = 0; i < 40 && n < cap; i++, n++) { /* far tails */
        t[n].n1 = rng_log(10000, 100000000);
        t[n].n2 = rng_log(10000, 100000000);
        t[n].a = t[n].n1 / rng_range(2, 50);
        t[n].b = rng_range(0, 30);
    }
    static const table22 corners[] = {
        {0, 10, 0, 10},    {5, 5, 7, 7},
        {5, 5, 0, 9},      {0, 3, 4, 4},
        {1, 1, 0, 1},      {1, 1000000000000ull, 0, 1},
        {7, 100, 14, 200}, {1000000000, 1000000000000ull, 1000000001, 1000000000000ull},
    };
    for (size_t i = 0; i < sizeof corners / sizeof corners[0] && n < cap; i++)
        t[n++] = corners[i];
    return n;
}

/* Reference: SciPy's G² and p, the exact G² (decimal, 80 digits), and
 * chi2.sf of OUR G² (so the p function is checked on identical input). */
static const char *const g2_script =
    "import sys, warnings\n"
    "from decimal import Decimal, getcontext\n"
    "import numpy as np\n"
    "from scipy.stats import chi2_contingency, chi2\n"
    "warnings.simplefilter('ignore')\n"
    "getcontext().prec = 80\n"
    "def exact(a, n1, b, n2):\n"
    "    # Dunning (1993): 2 sum O ln(O/E), E = row x column / N, 0 ln 0 = 0\n"
    "    N = Decimal(n1 + n2)\n"
    "    cells = [(a, a + b, n1), (b, a + b, n2), (n1 - a, n1 + n2 - a - b, n1),\n"
    "             (n2 - b, n1 + n2 - a - b, n2)]\n"
    "    s = Decimal(0)\n"
    "    for o, r, c in cells:\n"
    "        if o:\n"
    "            e = Decimal(r) * Decimal(c) / N\n"
    "            s += Decimal(o) * (Decimal(o) / e).ln()\n"
    "    return 2 * s\n"
    "for line in open(sys.argv[1]):\n"
    "    a, n1, b, n2, ours = line.split()\n"
    "    a, n1, b, n2 = int(a), int(n1), int(b), int(n2)\n"
    "    t = np.array([[a, b], [n1 - a, n2 - b]], dtype=np.int64)\n"
    "    try:\n"
    "        g, p, dof, _ = chi2_contingency(t, correction=False, lambda_='log-likelihood')\n"
    "        assert dof == 1\n"
    "    except ValueError:  # a zero row: SciPy refuses the table\n"
    "        g, p = float('nan'), float('nan')\n"
    "    print(repr(float(g)), repr(float(p)), repr(float(exact(a, n1, b, n2))),\n"
    "          repr(float(chi2.sf(float(ours), 1))))\n";

static void test_g2_against_scipy_and_exact(void **state)
{
    (void)state;
    table22 tabs[400];
    size_t n = make_tables(tabs, 400);
    assert_true(n >= 380);
    double *g2 = calloc(n, sizeof *g2), *p = calloc(n, sizeof *p);
    text data = {0};
    for (size_t i = 0; i < n; i++) {
        tt_change row;
        assert_int_equal(
            tt_change_compute(tabs[i].a, tabs[i].n1, tabs[i].b, tabs[i].n2, &row, NULL), TT_OK);
        g2[i] = row.g2;
        p[i] = row.p_value;
        assert_true(g2[i] >= 0.0);
        assert_true(g2[i] == tt_g2_2x2(tabs[i].a, tabs[i].n1, tabs[i].b, tabs[i].n2));
        text_printf(&data, "%llu %llu %llu %llu %.17g\n", (unsigned long long)tabs[i].a,
                    (unsigned long long)tabs[i].n1, (unsigned long long)tabs[i].b,
                    (unsigned long long)tabs[i].n2, g2[i]);
    }
    char *out = run_python(g2_script, data.s);
    char *cur = out;
    size_t compared_scipy = 0, scipy_inexact = 0;
    double worst_exact = 0.0;
    for (size_t i = 0; i < n; i++) {
        double sg = next_num(&cur), sp = next_num(&cur), ex = next_num(&cur), sf = next_num(&cur);
        double N = (double)tabs[i].n1 + (double)tabs[i].n2;
        /* exact G² from the definition, Python decimal at 80 digits */
        CHECK_CLOSE("G2 vs exact (decimal)", i, g2[i], ex, 1e-13, 1e-300);
        if (ex > 0 && fabs(g2[i] - ex) / ex > worst_exact)
            worst_exact = fabs(g2[i] - ex) / ex;
        /* scipy.stats.chi2.sf(G2, 1) on our statistic */
        CHECK_CLOSE("p vs scipy.stats.chi2.sf", i, p[i], sf, 1e-12, 1e-300);
        if (!isnan(sg)) {
            /* scipy.stats.chi2_contingency(correction=False,
             * lambda_="log-likelihood"); its plain sum carries an absolute
             * error of order N·eps, hence the absolute part */
            CHECK_CLOSE("G2 vs scipy chi2_contingency", i, g2[i], sg, 1e-9, 1e-13 * N);
            /* its p where its G² is itself accurate (near G² = 0 the p-value
             * is infinitely sensitive, and SciPy's G² is off by ~N·eps) */
            if (close_to(sg, ex, 1e-9, 0.0))
                CHECK_CLOSE("p vs scipy chi2_contingency", i, p[i], sp, 1e-8, 1e-300);
            else
                scipy_inexact++;
            compared_scipy++;
        }
    }
    assert_true(compared_scipy >= 370);
    /* the huge near-equal tables are where SciPy's plain sum loses digits */
    print_message("G2: %zu tables, largest relative error vs exact %.2g; %zu compared with "
                  "SciPy, %zu where SciPy's own G2 is off by > 1e-9\n",
                  n, worst_exact, compared_scipy, scipy_inexact);
    free(out);
    free(data.s);
    free(g2);
    free(p);
}

/* ---------------------------------------------------------- change rows */

static void test_change_row_fields(void **state)
{
    (void)state;
    tt_change r;
    /* 7 in 100 words → 14 in 200 words: equal rates (70 per 10,000). */
    assert_int_equal(tt_change_compute(7, 100, 14, 200, &r, NULL), TT_OK);
    assert_int_equal(r.kind, TT_CHANGE_BOTH);
    assert_int_equal(r.direction, 0);
    assert_true(r.g2 == 0.0 && r.signed_g2 == 0.0 && r.p_value == 1.0);
    assert_true(r.base_rate_per_10k == 700.0 && r.target_rate_per_10k == 700.0);
    assert_true(r.percent_change == 0.0 && r.rate_change_per_10k == 0.0);
    assert_true(r.log_ratio == 0.0);
    assert_true(isnan(r.q_value));

    /* 20 in 10,000 → 30 in 20,000: rate 20 → 15 per 10,000, −25 %. */
    assert_int_equal(tt_change_compute(20, 10000, 30, 20000, &r, NULL), TT_OK);
    assert_int_equal(r.direction, -1);
    assert_true(fabs(r.base_rate_per_10k - 20.0) < 1e-12);
    assert_true(fabs(r.target_rate_per_10k - 15.0) < 1e-12);
    assert_true(fabs(r.rate_change_per_10k + 5.0) < 1e-12);
    assert_true(fabs(r.percent_change + 25.0) < 1e-12);
    assert_true(r.signed_g2 < 0 && r.signed_g2 == -r.g2);
    /* Log Ratio by its formula (Hardie 2014), target over base:
     * log2((30/20000) / (20/10000)) = log2(0.75). */
    assert_true(fabs(r.log_ratio - log2(0.75)) < 1e-15);

    /* new: absent from the base; the 0.5 correction for the Log Ratio */
    assert_int_equal(tt_change_compute(0, 1000, 9, 3000, &r, NULL), TT_OK);
    assert_int_equal(r.kind, TT_CHANGE_NEW);
    assert_int_equal(r.direction, 1);
    assert_true(isnan(r.percent_change) && !isinf(r.percent_change));
    assert_true(fabs(r.log_ratio - log2((9.0 / 3000.0) / (0.5 / 1000.0))) < 1e-14);
    assert_true(r.signed_g2 > 0 && isfinite(r.g2));

    /* gone: absent from the target */
    assert_int_equal(tt_change_compute(4, 50, 0, 80, &r, NULL), TT_OK);
    assert_int_equal(r.kind, TT_CHANGE_GONE);
    assert_int_equal(r.direction, -1);
    assert_true(isnan(r.percent_change));
    assert_true(fabs(r.log_ratio - log2((0.5 / 80.0) / (4.0 / 50.0))) < 1e-14);
    assert_true(r.target_rate_per_10k == 0.0);

    /* absent from both: G² 0, p 1, Log Ratio log2(n1/n2) from two 0.5s */
    assert_int_equal(tt_change_compute(0, 40, 0, 10, &r, NULL), TT_OK);
    assert_int_equal(r.kind, TT_CHANGE_ABSENT);
    assert_true(r.g2 == 0.0 && r.p_value == 1.0 && r.direction == 0);
    assert_true(fabs(r.log_ratio - 2.0) < 1e-15);

    /* the plain function keeps the brief's orientation: base over target */
    assert_true(fabs(tt_log_ratio(20, 10000, 30, 20000) - log2(4.0 / 3.0)) < 1e-15);

    /* direction is exact where doubles would tie: 1e12-scale rates differing in
     * the last unit */
    assert_int_equal(tt_change_compute(1000000000001ull, 3000000000000ull, 1000000000000ull,
                                       3000000000000ull, &r, NULL),
                     TT_OK);
    assert_int_equal(r.direction, -1);
    assert_true(r.g2 > 0.0 && r.g2 < 1e-9);
}

static void test_change_bad_input(void **state)
{
    (void)state;
    tt_change r;
    tt_error err;
    tt_error_init(&err);
    /* a side with no words is reported, never divided by */
    assert_int_equal(tt_change_compute(0, 0, 3, 10, &r, &err), TT_EINVAL);
    assert_non_null(strstr(err.message, "base side has no words"));
    assert_true(isnan(r.base_rate_per_10k) && isnan(r.g2) && isnan(r.p_value));
    assert_int_equal(tt_change_compute(3, 10, 0, 0, &r, &err), TT_EINVAL);
    assert_non_null(strstr(err.message, "target side"));
    assert_int_equal(tt_change_compute(11, 10, 0, 5, &r, NULL), TT_EINVAL);
    assert_true(isnan(tt_g2_2x2(11, 10, 0, 5)));
    assert_true(isnan(tt_log_ratio(1, 0, 1, 5)));
    assert_true(isnan(tt_rate_per_10k(3, 0)));
}

/* ------------------------------------------------------------ r × c tables */

static const char *const rxc_script =
    "import sys, warnings\n"
    "from decimal import Decimal, getcontext\n"
    "import numpy as np\n"
    "from scipy.stats import chi2_contingency\n"
    "warnings.simplefilter('ignore')\n"
    "getcontext().prec = 80\n"
    "for line in open(sys.argv[1]):\n"
    "    v = line.split()\n"
    "    r, c = int(v[0]), int(v[1])\n"
    "    t = np.array([int(x) for x in v[2:]], dtype=np.int64).reshape(r, c)\n"
    "    # empty rows and columns take no part in the test (SciPy refuses them)\n"
    "    t = t[t.sum(axis=1) > 0][:, t[t.sum(axis=1) > 0].sum(axis=0) > 0]\n"
    "    if t.shape[0] < 2 or t.shape[1] < 2:\n"
    "        print(0.0, 1.0, 0, 0.0, 1.0, 0.0); continue\n"
    "    g, gp, dof, _ = chi2_contingency(t, correction=False, lambda_='log-likelihood')\n"
    "    x, xp, dof2, _ = chi2_contingency(t, correction=False)\n"
    "    assert dof == dof2\n"
    "    N = Decimal(int(t.sum())); R = t.sum(axis=1); C = t.sum(axis=0); s = Decimal(0)\n"
    "    for i in range(t.shape[0]):\n"
    "        for j in range(t.shape[1]):\n"
    "            if t[i, j]:\n"
    "                e = Decimal(int(R[i])) * Decimal(int(C[j])) / N\n"
    "                s += Decimal(int(t[i, j])) * (Decimal(int(t[i, j])) / e).ln()\n"
    "    print(repr(float(g)), repr(float(gp)), dof, repr(float(x)), repr(float(xp)),\n"
    "          repr(float(2 * s)))\n";

static void test_rxc_against_scipy(void **state)
{
    (void)state;
    enum { NT = 150 };
    static uint64_t cells[NT][6 * 8];
    size_t rows[NT], cols[NT];
    rng_state = 0x3243f6a8885a308dull;
    text data = {0};
    for (size_t k = 0; k < NT; k++) {
        rows[k] = (size_t)rng_range(2, 6);
        cols[k] = (size_t)rng_range(2, 8);
        uint64_t scale = k % 3 == 0 ? 10 : k % 3 == 1 ? 100000 : 1000000000ull;
        for (size_t i = 0; i < rows[k] * cols[k]; i++)
            cells[k][i] = rng_range(0, 6) == 0 ? 0 : rng_range(0, scale);
        if (k % 10 == 7) /* an empty row */
            for (size_t j = 0; j < cols[k]; j++)
                cells[k][j] = 0;
        if (k % 10 == 8) /* an empty column */
            for (size_t i = 0; i < rows[k]; i++)
                cells[k][i * cols[k]] = 0;
        text_printf(&data, "%zu %zu", rows[k], cols[k]);
        for (size_t i = 0; i < rows[k] * cols[k]; i++)
            text_printf(&data, " %llu", (unsigned long long)cells[k][i]);
        text_printf(&data, "\n");
    }
    char *out = run_python(rxc_script, data.s);
    char *cur = out;
    for (size_t k = 0; k < NT; k++) {
        tt_contingency ct;
        assert_int_equal(tt_contingency_test(cells[k], rows[k], cols[k], &ct, NULL), TT_OK);
        double sg = next_num(&cur), sgp = next_num(&cur), sdof = next_num(&cur),
               sx = next_num(&cur), sxp = next_num(&cur), ex = next_num(&cur);
        double N = (double)ct.total;
        /* scipy.stats.chi2_contingency: degrees of freedom */
        if ((double)ct.df != sdof)
            fail_msg("case %zu: df %zu, scipy %g", k, ct.df, sdof);
        /* exact G² (Python decimal, 80 digits) */
        CHECK_CLOSE("rxc G2 vs exact (decimal)", k, ct.g2, ex, 1e-11, 1e-300);
        /* scipy.stats.chi2_contingency(correction=False, lambda_="log-likelihood") */
        CHECK_CLOSE("rxc G2 vs scipy", k, ct.g2, sg, 1e-9, 1e-13 * N);
        CHECK_CLOSE("rxc G2 p vs scipy", k, ct.g2_p_value, sgp, 1e-6, 1e-12);
        /* scipy.stats.chi2_contingency(correction=False): Pearson */
        CHECK_CLOSE("rxc chi2 vs scipy", k, ct.chi2, sx, 1e-9, 1e-13 * N);
        CHECK_CLOSE("rxc chi2 p vs scipy", k, ct.chi2_p_value, sxp, 1e-6, 1e-12);
    }
    free(out);
    free(data.s);
}

static void test_rxc_margins_and_errors(void **state)
{
    (void)state;
    const uint64_t t[] = {1, 2, 3, 4, 5, 6};
    uint64_t r[2], c[3], n;
    assert_int_equal(tt_contingency_margins(t, 2, 3, r, c, &n, NULL), TT_OK);
    assert_true(r[0] == 6 && r[1] == 15 && c[0] == 5 && c[1] == 7 && c[2] == 9 && n == 21);
    const uint64_t big[] = {UINT64_MAX, 1};
    tt_error err;
    tt_error_init(&err);
    assert_int_equal(tt_contingency_margins(big, 1, 2, NULL, NULL, &n, &err), TT_EINVAL);
    assert_non_null(strstr(err.message, "overflow"));
    tt_contingency ct;
    assert_int_equal(tt_contingency_test(t, 0, 3, &ct, NULL), TT_EINVAL);
    /* one row: df 0, statistics 0, p 1 (as SciPy reports dof 0) */
    assert_int_equal(tt_contingency_test(t, 1, 3, &ct, NULL), TT_OK);
    assert_true(ct.df == 0 && ct.g2 == 0.0 && ct.g2_p_value == 1.0 && ct.chi2_p_value == 1.0);

    /* out of memory is reported, not crashed on */
    tt_set_allocator(&(tt_allocator){tt_test_failing_malloc, tt_test_failing_realloc, free});
    tt_test_fail_after = 0;
    assert_int_equal(tt_contingency_test(t, 2, 3, &ct, &err), TT_ENOMEM);
    tt_test_fail_after = -1;
    tt_set_allocator(NULL);
}

/* ----------------------------------------------------- chi-square and gamma */

static const char *const sf_script =
    "import sys\n"
    "import numpy as np\n"
    "from scipy.stats import chi2\n"
    "from scipy.special import gammaincc\n"
    "out = []\n"
    "dfs = list(range(1, 31)) + [0.5, 2.5, 7.25, 45, 100]\n"
    "for df in dfs:\n"
    "    xs = [1e-6, 0.01, 0.5, df / 2.0, df - 1.0 + 0.5, df, df + 1.0, 2.0 * df + 3.0]\n"
    "    xs += [float(chi2.isf(p, df)) for p in (0.9, 0.5, 0.05, 1e-5, 1e-20, 1e-60,\n"
    "                                           1e-120, 1e-200, 1e-280, 1e-300)]\n"
    "    for x in xs:\n"
    "        if x > 0:\n"
    "            out.append('%r %r %r' % (float(df), x, float(chi2.sf(x, df))))\n"
    "for a, x in [(0.1, 0.05), (0.1, 3.0), (3.7, 1.2), (3.7, 40.0), (50.0, 49.0),\n"
    "             (50.0, 80.0), (250.0, 200.0), (1e-3, 1e-3)]:\n"
    "    out.append('g %r %r %r' % (a, x, float(gammaincc(a, x))))\n"
    "print(len(out)); print('\\n'.join(out))\n";

static void test_chi2_sf_against_scipy(void **state)
{
    (void)state;
    char *out = run_python(sf_script, "");
    char *cur = out;
    size_t n = (size_t)next_num(&cur), far = 0;
    for (size_t i = 0; i < n; i++) {
        while (*cur == ' ' || *cur == '\n')
            cur++;
        if (*cur == 'g') { /* scipy.special.gammaincc(a, x) */
            cur++;
            double a = next_num(&cur), x = next_num(&cur), ref = next_num(&cur);
            CHECK_CLOSE("gamma_q vs scipy.special.gammaincc", i, tt_gamma_q(a, x), ref, 1e-12,
                        1e-300);
            continue;
        }
        double df = next_num(&cur), x = next_num(&cur), ref = next_num(&cur);
        double ours = tt_chi2_sf(x, df);
        far += ref < 1e-250;
        /* scipy.stats.chi2.sf(x, df): relative tolerance all the way into the
         * far tail (SciPy's own exponent is formed in double, ~x·eps) */
        if (!close_to(ours, ref, 1e-11, 1e-305))
            fail_msg("chi2_sf(%.17g, df %g): ours %.17g, scipy %.17g", x, df, ours, ref);
    }
    assert_true(n > 600);
    assert_true(far >= 60); /* the far tails were really exercised */
    free(out);
    /* definitions at the edges */
    assert_true(tt_chi2_sf(0.0, 3.0) == 1.0 && tt_chi2_sf(-1.0, 1.0) == 1.0);
    assert_true(tt_chi2_sf(INFINITY, 4.0) == 0.0);
    assert_true(isnan(tt_chi2_sf(1.0, 0.0)) && isnan(tt_chi2_sf(NAN, 1.0)));
    assert_true(isnan(tt_gamma_q(-1.0, 1.0)) && isnan(tt_gamma_q(1.0, -1.0)));
    assert_true(tt_gamma_q(2.0, 0.0) == 1.0);
}

/* ------------------------------------------------------ Benjamini–Hochberg */

static const char *const bh_script =
    "import sys\n"
    "from fractions import Fraction\n"
    "try:\n"
    "    from statsmodels.stats.multitest import multipletests\n"
    "except ImportError:\n"
    "    multipletests = None\n"
    "def step_up_q(ps):\n"
    "    # Benjamini & Hochberg (1995) step-up at level alpha: with p(1) <= ... <= p(m),\n"
    "    # take the largest k with p(k) <= k alpha / m and reject H(1..k). The q-value\n"
    "    # of a hypothesis is the smallest alpha at which it is rejected; alpha only\n"
    "    # needs trying at the values m p(k) / k. Exact arithmetic (fractions).\n"
    "    m = len(ps)\n"
    "    order = sorted(range(m), key=lambda i: ps[i])\n"
    "    fp = [Fraction(ps[i]) for i in order]\n"
    "    q = [Fraction(1)] * m\n"
    "    for alpha in sorted(set(min(Fraction(1), m * fp[k] / (k + 1)) for k in range(m))):\n"
    "        kmax = 0\n"
    "        for k in range(m):\n"
    "            if fp[k] <= (k + 1) * alpha / m: kmax = k + 1\n"
    "        for k in range(kmax):\n"
    "            if alpha < q[k]: q[k] = alpha\n"
    "    res = [0.0] * m\n"
    "    for pos, i in enumerate(order): res[i] = float(q[pos])\n"
    "    return res\n"
    "for line in open(sys.argv[1]):\n"
    "    ps = [float(x) for x in line.split()]\n"
    "    res = step_up_q(ps)\n"
    "    sm = multipletests(ps, method='fdr_bh')[1] if multipletests else [float('nan')] * "
    "len(ps)\n"
    "    print(' '.join('%r %r' % (a, float(b)) for a, b in zip(res, sm)))\n";

typedef struct bh_input {
    const double *p;
    size_t m;
} bh_input;

/* Each case's q-values against both references, one Python run for all. */
static void bh_cases(const bh_input *cases, size_t ncases)
{
    text data = {0};
    for (size_t c = 0; c < ncases; c++) {
        for (size_t i = 0; i < cases[c].m; i++)
            text_printf(&data, "%s%.17g", i ? " " : "", cases[c].p[i]);
        text_printf(&data, "\n");
    }
    char *out = run_python(bh_script, data.s);
    char *cur = out;
    size_t with_statsmodels = 0;
    for (size_t c = 0; c < ncases; c++) {
        const double *p = cases[c].p;
        size_t m = cases[c].m;
        double *q = calloc(m, sizeof *q), *inplace = calloc(m, sizeof *inplace);
        assert_int_equal(tt_bh_q_values(p, m, q, NULL), TT_OK);
        memcpy(inplace, p, m * sizeof *p);
        assert_int_equal(tt_bh_q_values(inplace, m, inplace, NULL), TT_OK);
        for (size_t i = 0; i < m; i++) {
            double exact = next_num(&cur), sm = next_num(&cur);
            assert_true(q[i] == inplace[i]);
            assert_true(q[i] >= p[i] && q[i] <= 1.0);
            /* the 1995 step-up procedure, exact, in the Python script */
            CHECK_CLOSE("BH vs step-up (fractions)", i, q[i], exact, 1e-14, 0.0);
            /* statsmodels.stats.multitest.multipletests(method="fdr_bh") */
            if (!isnan(sm)) {
                CHECK_CLOSE("BH vs statsmodels", i, q[i], sm, 1e-14, 0.0);
                with_statsmodels++;
            }
        }
        free(q);
        free(inplace);
    }
    if (!with_statsmodels)
        print_message("BH: statsmodels not installed; checked against the step-up "
                      "procedure only\n");
    free(out);
    free(data.s);
}

static void test_bh_against_references(void **state)
{
    (void)state;
    rng_state = 0x13198a2e03707344ull;
    double p[300];
    for (size_t i = 0; i < 300; i++) {
        double u = rng_unit();
        if (i % 5 == 0)
            p[i] = pow(u, 8.0); /* a cluster of small p-values */
        else if (i % 7 == 0)
            p[i] = 0.25; /* ties */
        else
            p[i] = u;
    }
    p[3] = 0.0;
    p[4] = 1.0;
    p[5] = -0.0; /* a valid zero; its sign bit must not sort it last */
    const double one[] = {0.03};
    const double same[] = {0.5, 0.5, 0.5, 0.5};
    const double steps[] = {0.04, 0.01, 0.03, 0.02, 0.9, 0.011};
    const bh_input cases[] = {{p, 300}, {one, 1}, {same, 4}, {steps, 6}};
    bh_cases(cases, sizeof cases / sizeof cases[0]);

    assert_int_equal(tt_bh_q_values(NULL, 0, NULL, NULL), TT_OK);
    tt_error err;
    tt_error_init(&err);
    const double bad[] = {0.1, NAN};
    double q[2];
    assert_int_equal(tt_bh_q_values(bad, 2, q, &err), TT_EINVAL);
    assert_non_null(strstr(err.message, "p-value 2"));
    const double p2[] = {0.1, 0.2};
    tt_set_allocator(&(tt_allocator){tt_test_failing_malloc, tt_test_failing_realloc, free});
    tt_test_fail_after = 0;
    assert_int_equal(tt_bh_q_values(p2, 2, q, &err), TT_ENOMEM);
    tt_test_fail_after = -1;
    tt_set_allocator(NULL);
}

/* ---------------------------------------------------------- planted signal */

/* Two periods drawn from one Zipf-like word distribution (weight 1/rank over
 * 5,000 terms) except 10 pairs of terms whose probabilities are swapped: a
 * term of rank r trades places with the term of rank f·r, f from 2 to 5, so
 * both change rate by the factor f (one up, one down) and the total mass, and
 * with it every other term's rate, stays exactly the same. The 20 planted
 * terms must lead by G²; among the 4,980 unchanged terms the share with
 * q <= 0.05 must stay at or under 5 % (BH controls the false discovery rate;
 * common practice is to expect far fewer). */
enum { PV = 5000, PWORDS = 500000, PPAIRS = 10 };

static size_t draw(const double *cdf, size_t v)
{
    double u = rng_unit() * cdf[v - 1];
    size_t lo = 0, hi = v - 1;
    while (lo < hi) {
        size_t mid = (lo + hi) / 2;
        if (cdf[mid] > u)
            hi = mid;
        else
            lo = mid + 1;
    }
    return lo;
}

static void test_planted_signal(void **state)
{
    (void)state;
    static double base_cdf[PV], target_cdf[PV], weight[PV], tweight[PV];
    static uint64_t a[PV], b[PV];
    static double g2[PV], p[PV], q[PV];
    static size_t order[PV];
    int planted[PV] = {0};
    for (size_t r = 0; r < PV; r++)
        weight[r] = tweight[r] = 1.0 / (double)(r + 1);
    for (size_t i = 0; i < PPAIRS; i++) {
        size_t f = 2 + i % 4, low = 10 + 7 * i,
               high = (low + 1) * f - 1; /* ranks low+1, (low+1)·f */
        assert_true(high < PV && !planted[low] && !planted[high]);
        tweight[low] = weight[high];
        tweight[high] = weight[low];
        planted[low] = planted[high] = 1;
    }
    double cb = 0, ct = 0;
    for (size_t r = 0; r < PV; r++) {
        base_cdf[r] = (cb += weight[r]);
        target_cdf[r] = (ct += tweight[r]);
    }
    rng_state = 0xa4093822299f31d0ull;
    for (size_t i = 0; i < PWORDS; i++) {
        a[draw(base_cdf, PV)]++;
        b[draw(target_cdf, PV)]++;
    }
    for (size_t r = 0; r < PV; r++) {
        tt_change row;
        assert_int_equal(tt_change_compute(a[r], PWORDS, b[r], PWORDS, &row, NULL), TT_OK);
        g2[r] = row.g2;
        p[r] = row.p_value;
        order[r] = r;
        if (planted[r]) /* the direction of every planted change is found */
            assert_int_equal(row.direction, tweight[r] > weight[r] ? 1 : -1);
    }
    assert_int_equal(tt_bh_q_values(p, PV, q, NULL), TT_OK);
    /* the row form gives the same q-values */
    static tt_change rows[PV];
    for (size_t r = 0; r < PV; r++)
        assert_int_equal(tt_change_compute(a[r], PWORDS, b[r], PWORDS, &rows[r], NULL), TT_OK);
    assert_int_equal(tt_change_q_values(rows, PV, NULL), TT_OK);
    for (size_t r = 0; r < PV; r++)
        assert_true(rows[r].q_value == q[r]);
    /* the 20 largest G² are exactly the planted terms */
    for (size_t i = 0; i < 2 * PPAIRS; i++)
        for (size_t j = i + 1; j < PV; j++)
            if (g2[order[j]] > g2[order[i]]) {
                size_t t = order[i];
                order[i] = order[j];
                order[j] = t;
            }
    for (size_t i = 0; i < 2 * PPAIRS; i++)
        if (!planted[order[i]])
            fail_msg("rank %zu by G2 is unchanged term %zu (G2 %g)", i + 1, order[i], g2[order[i]]);
    size_t flagged = 0, unchanged = 0;
    for (size_t r = 0; r < PV; r++) {
        if (planted[r]) {
            assert_true(q[r] <= 0.05);
            continue;
        }
        unchanged++;
        flagged += q[r] <= 0.05;
    }
    assert_true((double)flagged <= 0.05 * (double)unchanged);
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_g2_against_scipy_and_exact),
        cmocka_unit_test(test_change_row_fields),
        cmocka_unit_test(test_change_bad_input),
        cmocka_unit_test(test_rxc_against_scipy),
        cmocka_unit_test(test_rxc_margins_and_errors),
        cmocka_unit_test(test_chi2_sf_against_scipy),
        cmocka_unit_test(test_bh_against_references),
        cmocka_unit_test(test_planted_signal),
    };
    if (getenv("TT_TEST_FILTER"))
        cmocka_set_test_filter(getenv("TT_TEST_FILTER"));
    return cmocka_run_group_tests(tests, NULL, NULL);
}
