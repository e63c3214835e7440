/* Tests of the descriptive and document statistics (src/stats.c): summary of
 * a sample, percentiles, percentile rank and z-score, Pearson correlation and
 * least squares, the correlation matrix, dispersion (DP, DPnorm, Juilland's
 * D), tf-idf, and cosine / Jaccard similarity of term tables.
 *
 * References are computed at test time by Debian's /usr/bin/python3, each
 * named beside its check: Python's statistics module (mean, median, stdev,
 * pstdev, variance, pvariance, multimode), scipy.stats (trim_mean,
 * mstats.winsorize, skew(bias=False), kurtosis(fisher=True, bias=False),
 * percentileofscore(kind="mean")), numpy (percentile(method="weibull"),
 * corrcoef, polyfit, dot/norm for cosine), Python sets for Jaccard,
 * scikit-learn's TfidfVectorizer, and Python fractions for exact DP and
 * Juilland's D from their definitions. Samples are generated here with a
 * seeded generator, so a failure replays. */
#include <math.h>
#include <unistd.h>

#include "tt_test.h"

#include "tt_test_numeric.h"

#include "termtide/alloc.h"
#include "termtide/stats.h"
#include "termtide/termtable.h"

/* ------------------------------------------------------------------ helpers */

/* ------------------------------------------------------------- samples */

enum { MAXN = 1000 };

typedef struct sample {
    size_t n;
    double trim;
    double x[MAXN];
} sample;

/* Sizes from 1 up, shapes: uniform, skewed (exponential), integer-valued
 * with ties and modes, negative, a large offset (variance by cancellation in
 * a naive formula), constant; trims 10 (the default), 0, 25, 37.5. */
static size_t make_samples(sample *s, size_t cap)
{
    static const size_t sizes[] = {1, 2, 3, 4, 5, 7, 10, 19, 20, 21, 33, 57, 100, 1000};
    static const double trims[] = {10.0, 0.0, 25.0, 37.5};
    size_t k = 0;
    rng_state = 0x6a09e667f3bcc908ull;
    for (size_t si = 0; si < sizeof sizes / sizeof sizes[0]; si++)
        for (int shape = 0; shape < 6 && k < cap; shape++, k++) {
            sample *c = &s[k];
            c->n = sizes[si];
            c->trim = trims[(si + (size_t)shape) % 4];
            for (size_t i = 0; i < c->n; i++) {
                double u = rng_unit();
                switch (shape) {
                case 0: c->x[i] = 100.0 * u; break;
                case 1: c->x[i] = -30.0 * log1p(-u); break;
                case 2: c->x[i] = floor(u * u * 8.0); break;
                case 3: c->x[i] = -5.0 + 3.0 * u - 2.0 * u * u; break;
                case 4: c->x[i] = 1e6 + floor(u * 1000.0) / 16.0; break;
                default: c->x[i] = 42.5; break;
                }
            }
        }
    return k;
}

static const double pcts[] = {0.0, 1.0, 5.0, 10.0, 25.0, 33.3, 50.0, 66.7, 75.0, 90.0, 99.0, 100.0};
#define NPCT (sizeof pcts / sizeof pcts[0])

static const char *const summary_script =
    "import sys, math, statistics, warnings\n"
    "import numpy as np\n"
    "from scipy import stats\n"
    "from scipy.stats import mstats\n"
    "warnings.simplefilter('ignore')\n"
    "lines = open(sys.argv[1]).read().splitlines()\n"
    "P = [float(v) for v in lines[0].split()]\n"
    "nan = float('nan')\n"
    "for line in lines[1:]:\n"
    "    v = line.split(); trim = float(v[0]); x = [float(t) for t in v[1:]]\n"
    "    n = len(x); a = np.array(x); const = min(x) == max(x)\n"
    "    mean = statistics.mean(x)                       # Python statistics\n"
    "    med = statistics.median(x)\n"
    "    mm = statistics.multimode(x)\n"
    "    mode = mm[0] if len(mm) == 1 and x.count(mm[0]) > 1 else nan\n"
    "    t = trim / 200.0                                # total percent -> per tail\n"
    "    tm = stats.trim_mean(a, t)                      # scipy.stats.trim_mean\n"
    "    wm = float(mstats.winsorize(a.copy(), limits=(t, t)).mean())  # mstats.winsorize\n"
    "    mad = statistics.fmean([abs(v - mean) for v in x])\n"
    "    vs = statistics.variance(x) if n > 1 else nan\n"
    "    vp = statistics.pvariance(x)\n"
    "    ss = statistics.stdev(x) if n > 1 else nan\n"
    "    sp = statistics.pstdev(x)\n"
    "    cv = ss / mean if n > 1 and mean != 0 else nan\n"
    "    sk = float(stats.skew(a, bias=False)) if n > 2 and not const else nan\n"
    "    ku = float(stats.kurtosis(a, fisher=True, bias=False)) if n > 3 and not const else nan\n"
    "    q = [float(v) for v in np.percentile(a, [25, 75] + P, method='weibull')]\n"
    "    out = [n, mean, med, mode, tm, wm, min(x), max(x), max(x) - min(x), q[0], q[1],\n"
    "           q[1] - q[0], mad, vs, vp, ss, sp, cv, sk, ku] + q[2:]\n"
    "    print(' '.join(repr(float(o)) for o in out))\n";

static void test_summary_against_python(void **state)
{
    (void)state;
    static sample s[100];
    size_t ns = make_samples(s, 100);
    text data = {0};
    for (size_t i = 0; i < NPCT; i++)
        text_printf(&data, "%s%.17g", i ? " " : "", pcts[i]);
    text_printf(&data, "\n");
    for (size_t k = 0; k < ns; k++) {
        text_printf(&data, "%.17g", s[k].trim);
        for (size_t i = 0; i < s[k].n; i++)
            text_printf(&data, " %.17g", s[k].x[i]);
        text_printf(&data, "\n");
    }
    char *out = run_python(summary_script, data.s);
    char *cur = out;
    size_t modes = 0, trimmed_cut = 0;
    for (size_t k = 0; k < ns; k++) {
        tt_summary m;
        assert_int_equal(tt_summary_compute(s[k].x, s[k].n, s[k].trim, &m, NULL), TT_OK);
        double ref[20 + NPCT];
        for (size_t i = 0; i < 20 + NPCT; i++)
            ref[i] = next_num(&cur);
        double scale = fabs(ref[1]) + fabs(ref[8]) + 1e-300; /* for absolute slack */
        assert_int_equal((double)m.n, ref[0]);
        /* Python's statistics module: mean (exact, then rounded), median */
        CHECK_CLOSE("mean", k, m.mean, ref[1], 1e-15, 0.0);
        CHECK_CLOSE("median", k, m.median, ref[2], 1e-15, 0.0);
        /* statistics.multimode: one value, occurring more than once */
        CHECK_CLOSE("mode", k, m.mode, ref[3], 0.0, 0.0);
        assert_int_equal(m.has_mode, !isnan(ref[3]));
        modes += m.has_mode;
        /* scipy.stats.trim_mean(x, trim/200), mstats.winsorize(limits=(t, t)).mean() */
        CHECK_CLOSE("trimmed mean", k, m.trimmed_mean, ref[4], 1e-13, 1e-15 * scale);
        CHECK_CLOSE("winsorized mean", k, m.winsorized_mean, ref[5], 1e-13, 1e-15 * scale);
        trimmed_cut += m.trimmed_mean != m.mean && s[k].trim > 0;
        /* Python builtins min/max */
        CHECK_CLOSE("min", k, m.min, ref[6], 0.0, 0.0);
        CHECK_CLOSE("max", k, m.max, ref[7], 0.0, 0.0);
        CHECK_CLOSE("range", k, m.range, ref[8], 0.0, 0.0);
        /* numpy.percentile(method="weibull") */
        CHECK_CLOSE("q1", k, m.q1, ref[9], 1e-15, 1e-15 * scale);
        CHECK_CLOSE("q3", k, m.q3, ref[10], 1e-15, 1e-15 * scale);
        CHECK_CLOSE("iqr", k, m.iqr, ref[11], 1e-12, 1e-14 * scale);
        /* mean absolute deviation around the mean, by formula with statistics */
        CHECK_CLOSE("mean abs dev", k, m.mean_abs_dev, ref[12], 1e-13, 1e-15 * scale);
        /* statistics.variance / pvariance / stdev / pstdev (exact, rounded) */
        CHECK_CLOSE("sample variance", k, m.var_sample, ref[13], 1e-14, 0.0);
        CHECK_CLOSE("population variance", k, m.var_population, ref[14], 1e-14, 0.0);
        CHECK_CLOSE("sample sd", k, m.sd_sample, ref[15], 1e-14, 0.0);
        CHECK_CLOSE("population sd", k, m.sd_population, ref[16], 1e-14, 0.0);
        CHECK_CLOSE("cv", k, m.cv, ref[17], 1e-14, 0.0);
        /* scipy.stats.skew(bias=False), kurtosis(fisher=True, bias=False):
         * SciPy forms the moments in double around a double mean, so the
         * large-offset samples (shape 4) carry its error of order
         * offset·eps/sd; elsewhere they agree closely */
        double shape_tol = (k % 6 == 4) ? 1e-6 : 1e-10;
        CHECK_CLOSE("skewness", k, m.skewness, ref[18], shape_tol, 1e-12);
        CHECK_CLOSE("excess kurtosis", k, m.excess_kurtosis, ref[19], shape_tol, 1e-12);
        double sorted[MAXN];
        memcpy(sorted, s[k].x, s[k].n * sizeof(double));
        tt_sort_doubles(sorted, s[k].n);
        for (size_t i = 0; i < NPCT; i++)
            CHECK_CLOSE("percentile (numpy weibull)", k * 100 + i,
                        tt_percentile_sorted(sorted, s[k].n, pcts[i]), ref[20 + i], 1e-15,
                        1e-15 * scale);
    }
    assert_true(modes >= 10);       /* the mode rule was exercised both ways */
    assert_true(trimmed_cut >= 20); /* and trimming really cut values */
    free(out);
    free(data.s);
}

static void test_summary_edges(void **state)
{
    (void)state;
    tt_summary m;
    tt_error err;
    tt_error_init(&err);
    /* empty sample: all NaN, no failure */
    assert_int_equal(tt_summary_compute(NULL, 0, 10.0, &m, NULL), TT_OK);
    assert_true(m.n == 0 && isnan(m.mean) && isnan(m.median) && !m.has_mode);
    /* one value: defined location, undefined spread */
    const double one[] = {3.5};
    assert_int_equal(tt_summary_compute(one, 1, 10.0, &m, NULL), TT_OK);
    assert_true(m.mean == 3.5 && m.median == 3.5 && m.q1 == 3.5 && m.var_population == 0.0);
    assert_true(isnan(m.var_sample) && isnan(m.cv) && isnan(m.skewness) && !m.has_mode);
    /* constant: variance exactly 0, shape undefined, CV 0 */
    const double c[] = {0.1, 0.1, 0.1, 0.1, 0.1};
    assert_int_equal(tt_summary_compute(c, 5, 10.0, &m, NULL), TT_OK);
    assert_true(m.var_sample == 0.0 && m.cv == 0.0 && m.mean == 0.1);
    assert_true(isnan(m.skewness) && isnan(m.excess_kurtosis) && m.has_mode && m.mode == 0.1);
    /* mean 0: CV undefined */
    const double z[] = {-1.0, 1.0, -2.0, 2.0};
    assert_int_equal(tt_summary_compute(z, 4, 10.0, &m, NULL), TT_OK);
    assert_true(isnan(m.cv));
    /* two values tie for most frequent: no mode */
    const double t[] = {1, 1, 2, 2, 3};
    assert_int_equal(tt_summary_compute(t, 5, 10.0, &m, NULL), TT_OK);
    assert_true(!m.has_mode && isnan(m.mode));
    /* bad input */
    const double bad[] = {1.0, NAN};
    assert_int_equal(tt_summary_compute(bad, 2, 10.0, &m, &err), TT_EINVAL);
    assert_int_equal(tt_summary_compute(t, 5, 100.0, &m, &err), TT_EINVAL);
    assert_int_equal(tt_summary_compute(t, 5, -1.0, &m, &err), TT_EINVAL);
    const double unsorted[] = {2.0, 1.0};
    assert_int_equal(tt_summary_of_sorted(unsorted, 2, 10.0, &m, &err), TT_EINVAL);
    assert_non_null(strstr(err.message, "not sorted"));
    assert_true(isnan(tt_percentile_sorted(t, 5, 101.0)) && isnan(tt_percentile_sorted(t, 0, 5)));
    /* out of memory is reported */
    tt_set_allocator(&(tt_allocator){tt_test_failing_malloc, tt_test_failing_realloc, free});
    tt_test_fail_after = 0;
    assert_int_equal(tt_summary_compute(t, 5, 10.0, &m, &err), TT_ENOMEM);
    tt_test_fail_after = -1;
    tt_set_allocator(NULL);
}

/* ------------------------------------------- percentile rank and z-score */

static const char *const rank_script =
    "import sys, statistics, warnings\n"
    "from fractions import Fraction\n"
    "from scipy import stats\n"
    "warnings.simplefilter('ignore')\n"
    "for line in open(sys.argv[1]):\n"
    "    v = [float(t) for t in line.split()]\n"
    "    score, x = v[0], v[1:]\n"
    "    pr = stats.percentileofscore(x, score, kind='mean')   # scipy.stats\n"
    "    # statistics.stdev; the mean exact (fractions), as a float mean near 1e6\n"
    "    # would cost the difference digits\n"
    "    if len(x) > 1 and min(x) != max(x):\n"
    "        z = float(Fraction(score) - sum(map(Fraction, x)) / len(x)) / statistics.stdev(x)\n"
    "    else:\n"
    "        z = float('nan')\n"
    "    print(repr(float(pr)), repr(float(z)))\n";

static void test_rank_and_z(void **state)
{
    (void)state;
    static sample s[100];
    size_t ns = make_samples(s, 100);
    double scores[100];
    text data = {0};
    for (size_t k = 0; k < ns; k++) {
        /* a sample value (ties), a value between, or one outside */
        scores[k] = k % 3 == 0 ? s[k].x[s[k].n / 2] : k % 3 == 1 ? s[k].x[0] + 0.37 : -1e3;
        text_printf(&data, "%.17g", scores[k]);
        for (size_t i = 0; i < s[k].n; i++)
            text_printf(&data, " %.17g", s[k].x[i]);
        text_printf(&data, "\n");
    }
    char *out = run_python(rank_script, data.s);
    char *cur = out;
    for (size_t k = 0; k < ns; k++) {
        double pr = next_num(&cur), z = next_num(&cur);
        /* scipy.stats.percentileofscore(kind="mean") */
        CHECK_CLOSE("percentile rank", k, tt_percentile_rank(s[k].x, s[k].n, scores[k]), pr, 1e-14,
                    1e-13);
        /* (v − exact mean) / statistics.stdev */
        CHECK_CLOSE("z-score", k, tt_z_score(s[k].x, s[k].n, scores[k]), z, 1e-12, 1e-14);
    }
    free(out);
    free(data.s);
    assert_true(isnan(tt_percentile_rank(NULL, 0, 1.0)));
}

/* ------------------------------------------------- correlation and slope */

static const char *const corr_script =
    "import sys, warnings\n"
    "import numpy as np\n"
    "warnings.simplefilter('ignore')\n"
    "lines = open(sys.argv[1]).read().splitlines()\n"
    "for line in lines[:-1]:\n"
    "    v = [float(t) for t in line.split()]; n = len(v) // 2\n"
    "    x, y = np.array(v[:n]), np.array(v[n:])\n"
    "    r = np.corrcoef(x, y)[0, 1]                     # numpy.corrcoef\n"
    "    b, a = np.polyfit(x, y, 1)                      # numpy.polyfit\n"
    "    print(repr(float(r)), repr(float(b)), repr(float(a)))\n"
    "v = [float(t) for t in lines[-1].split()]\n"
    "m = np.corrcoef(np.array(v).reshape(5, -1))          # numpy.corrcoef, k series\n"
    "print(' '.join(repr(float(t)) for t in m.ravel()))\n";

static void test_correlation_and_slope(void **state)
{
    (void)state;
    enum { NC = 40, KS = 5, KN = 12 };
    static double xs[NC][60], ys[NC][60];
    size_t ns[NC];
    rng_state = 0xbb67ae8584caa73bull;
    text data = {0};
    for (size_t c = 0; c < NC; c++) {
        ns[c] = 3 + c;
        double slope = (double)c / 7.0 - 2.0, noise = c % 4 == 0 ? 0.0 : (double)(c % 5);
        for (size_t i = 0; i < ns[c]; i++) {
            xs[c][i] = c % 2 ? (double)i : 100.0 * rng_unit(); /* period index or any x */
            ys[c][i] = 5.0 + slope * xs[c][i] + noise * (rng_unit() - 0.5) * 10.0;
        }
        for (size_t i = 0; i < ns[c]; i++)
            text_printf(&data, "%s%.17g", i ? " " : "", xs[c][i]);
        for (size_t i = 0; i < ns[c]; i++)
            text_printf(&data, " %.17g", ys[c][i]);
        text_printf(&data, "\n");
    }
    static double series[KS][KN];
    const double *rows[KS];
    for (size_t s = 0; s < KS; s++) {
        for (size_t i = 0; i < KN; i++) {
            series[s][i] = s == 3 ? 7.0 : (double)i * (double)s - 10.0 * rng_unit();
            text_printf(&data, "%s%.17g", s + i ? " " : "", series[s][i]);
        }
        rows[s] = series[s];
    }
    text_printf(&data, "\n");
    char *out = run_python(corr_script, data.s);
    char *cur = out;
    for (size_t c = 0; c < NC; c++) {
        double r = next_num(&cur), b = next_num(&cur), a = next_num(&cur);
        double slope, intercept;
        tt_linear_fit(xs[c], ys[c], ns[c], &slope, &intercept);
        /* numpy.corrcoef(x, y)[0, 1] */
        CHECK_CLOSE("pearson", c, tt_pearson(xs[c], ys[c], ns[c]), r, 1e-12, 1e-14);
        /* numpy.polyfit(x, y, 1) */
        CHECK_CLOSE("slope", c, slope, b, 1e-10, 1e-12);
        CHECK_CLOSE("intercept", c, intercept, a, 1e-10, 1e-12);
    }
    double m[KS * KS];
    tt_correlation_matrix(rows, KS, KN, m);
    for (size_t i = 0; i < KS * KS; i++) /* numpy.corrcoef; NaN for the constant series */
        CHECK_CLOSE("correlation matrix", i, m[i], next_num(&cur), 1e-12, 1e-14);
    free(out);
    free(data.s);
    /* definitions: constant series and too-short series */
    const double x3[] = {1, 2, 3}, c3[] = {4, 4, 4};
    assert_true(isnan(tt_pearson(x3, c3, 3)) && isnan(tt_pearson(x3, x3, 1)));
    double sl, ic;
    tt_linear_fit(c3, x3, 3, &sl, &ic);
    assert_true(isnan(sl) && isnan(ic));
    tt_linear_fit(x3, c3, 3, &sl, &ic);
    assert_true(sl == 0.0 && ic == 4.0);
}

/* ------------------------------------------------------------ dispersion */

/* Gries (2008)'s illustration, from memory: a corpus of five parts of 9, 10,
 * 10, 10 and 11 words (50 in all), a word occurring 1, 2, 3, 4 and 5 times
 * (15). Worked by hand:
 *   s = 9/50, 10/50, 10/50, 10/50, 11/50;  v = 1/15, 2/15, 3/15, 4/15, 5/15
 *   |v − s| in 150ths: |10−27| = 17, |20−30| = 10, 0, 10, |50−33| = 17 → 54
 *   DP = ½ · 54/150 = 0.18;  DPnorm = 0.18 / (1 − 9/50) = 0.18/0.82 = 9/41.
 * Juilland's D over the rates 1/9, 2/10, 3/10, 4/10, 5/11: in 4950ths they
 * are 550, 990, 1485, 1980, 2250, mean 1451 (= 0.293131...); deviations
 * −901, −461, 34, 529, 799, squares summing to 1,943,720, so the population
 * variance is 1943720 / 5 / 4950² = 0.0158655, sd 0.125958, CV 0.429699 and
 * D = 1 − 0.429699/√4 = 0.785150. */
static void test_dispersion_worked_example(void **state)
{
    (void)state;
    const uint64_t sizes[] = {9, 10, 10, 10, 11}, counts[] = {1, 2, 3, 4, 5};
    tt_dispersion d;
    assert_int_equal(tt_dispersion_compute(counts, sizes, 5, &d, NULL), TT_OK);
    assert_int_equal(d.doc_freq, 5);
    assert_int_equal(d.term_total, 15);
    assert_true(fabs(d.dp - 0.18) < 1e-15);
    assert_true(fabs(d.dp_norm - 9.0 / 41.0) < 1e-15);
    assert_true(fabs(d.juilland_d - 0.785150) < 5e-7);

    /* even spread: DP 0, D 1; all in one part of equal parts: DP = 1 − s */
    const uint64_t eq[] = {100, 100, 100, 100}, even[] = {5, 5, 5, 5}, one[] = {0, 0, 20, 0};
    assert_int_equal(tt_dispersion_compute(even, eq, 4, &d, NULL), TT_OK);
    assert_true(fabs(d.dp) < 1e-18 && fabs(d.juilland_d - 1.0) < 1e-15);
    assert_int_equal(tt_dispersion_compute(one, eq, 4, &d, NULL), TT_OK);
    assert_true(fabs(d.dp - 0.75) < 1e-15 && fabs(d.dp_norm - 1.0) < 1e-15);
    assert_true(fabs(d.juilland_d) < 1e-15 && d.doc_freq == 1);
    /* absent term: undefined, not 0 */
    const uint64_t none[] = {0, 0, 0, 0};
    assert_int_equal(tt_dispersion_compute(none, eq, 4, &d, NULL), TT_OK);
    assert_true(d.doc_freq == 0 && isnan(d.dp) && isnan(d.juilland_d));
    /* errors: no parts, an empty part, a count above its part */
    tt_error err;
    tt_error_init(&err);
    assert_int_equal(tt_dispersion_compute(none, eq, 0, &d, &err), TT_EINVAL);
    const uint64_t with_empty[] = {10, 0}, c2[] = {1, 0}, small[] = {10, 5}, over[] = {11, 0};
    assert_int_equal(tt_dispersion_compute(c2, with_empty, 2, &d, &err), TT_EINVAL);
    assert_non_null(strstr(err.message, "part 2 has no words"));
    assert_int_equal(tt_dispersion_compute(over, small, 2, &d, &err), TT_EINVAL);
    assert_non_null(strstr(err.message, "part 1: the term count exceeds"));
}

static const char *const disp_script =
    "import sys, math\n"
    "from fractions import Fraction as F\n"
    "for line in open(sys.argv[1]):\n"
    "    v = [int(t) for t in line.split()]; n = len(v) // 2\n"
    "    c, s = v[:n], v[n:]\n"
    "    S, T = sum(s), sum(c)\n"
    "    # Gries (2008): DP = 1/2 sum |v_i - s_i|; Lijffijt & Gries (2012): DP/(1 - min s)\n"
    "    dp = sum(abs(F(ci, T) - F(si, S)) for ci, si in zip(c, s)) / 2\n"
    "    dpn = dp / (1 - F(min(s), S))\n"
    "    # Juilland's D on rates per part: 1 - CV / sqrt(n - 1), CV = population sd / mean\n"
    "    r = [F(ci, si) for ci, si in zip(c, s)]; m = sum(r) / n\n"
    "    var = sum((x - m) ** 2 for x in r) / n\n"
    "    D = 1 - math.sqrt(var) / m / math.sqrt(n - 1)\n"
    "    print(sum(1 for x in c if x), repr(float(dp)), repr(float(dpn)), repr(float(D)))\n";

static void test_dispersion_against_python(void **state)
{
    (void)state;
    enum { NC = 60 };
    static uint64_t counts[NC][40], sizes[NC][40];
    size_t parts[NC];
    rng_state = 0x3c6ef372fe94f82bull;
    text data = {0};
    for (size_t c = 0; c < NC; c++) {
        parts[c] = 2 + c % 38;
        for (size_t i = 0; i < parts[c]; i++) {
            sizes[c][i] = 1 + (uint64_t)(rng_unit() * (c % 3 ? 5000.0 : 50.0));
            double rate = rng_unit() < 0.3 ? 0.0 : rng_unit() * 0.02 * (double)(1 + c % 5);
            counts[c][i] = (uint64_t)(rate * (double)sizes[c][i]);
        }
        counts[c][0] += 1; /* the term occurs somewhere */
        if (counts[c][0] > sizes[c][0])
            counts[c][0] = sizes[c][0];
        for (size_t i = 0; i < parts[c]; i++)
            text_printf(&data, "%s%llu", i ? " " : "", (unsigned long long)counts[c][i]);
        for (size_t i = 0; i < parts[c]; i++)
            text_printf(&data, " %llu", (unsigned long long)sizes[c][i]);
        text_printf(&data, "\n");
    }
    char *out = run_python(disp_script, data.s);
    char *cur = out;
    for (size_t c = 0; c < NC; c++) {
        tt_dispersion d;
        assert_int_equal(tt_dispersion_compute(counts[c], sizes[c], parts[c], &d, NULL), TT_OK);
        /* exact re-computation from the definitions (Python fractions) */
        assert_int_equal((double)d.doc_freq, next_num(&cur));
        CHECK_CLOSE("DP", c, d.dp, next_num(&cur), 1e-14, 1e-16);
        CHECK_CLOSE("DPnorm", c, d.dp_norm, next_num(&cur), 1e-14, 1e-16);
        CHECK_CLOSE("Juilland D", c, d.juilland_d, next_num(&cur), 1e-13, 1e-14);
    }
    free(out);
    free(data.s);
}

/* ---------------------------------------------------------------- tf-idf */

static const char *const tfidf_script =
    "import sys\n"
    "from sklearn.feature_extraction.text import TfidfVectorizer\n"
    "lines = open(sys.argv[1]).read().split('\\n')\n"
    "vocab = lines[0].split(); docs = lines[1:-1]\n"
    "# defaults smooth_idf=True, sublinear_tf=False, norm='l2'; our tokens as given\n"
    "v = TfidfVectorizer(vocabulary=vocab, analyzer=str.split)\n"
    "m = v.fit_transform(docs).toarray()\n"
    "print(' '.join(repr(float(t)) for t in v.idf_))\n"
    "for row in m: print(' '.join(repr(float(t)) for t in row))\n";

static void test_tfidf_against_sklearn(void **state)
{
    (void)state;
    enum { ND = 9, NV = 40 };
    static uint64_t counts[ND][NV], df[NV];
    rng_state = 0xa54ff53a5f1d36f1ull;
    text data = {0};
    for (size_t t = 0; t < NV; t++)
        text_printf(&data, "%sw%02zu", t ? " " : "", t);
    text_printf(&data, "\n");
    for (size_t d = 0; d < ND; d++) {
        size_t len = d == 4 ? 0 : 20 + 13 * d; /* document 4 is empty */
        for (size_t i = 0; i < len; i++) {
            double u = rng_unit();
            size_t t = (size_t)(u * u * u * (NV - 2)); /* skewed; w38, w39 never used */
            counts[d][t]++;
            text_printf(&data, "%sw%02zu", i ? " " : "", t);
        }
        text_printf(&data, "\n");
    }
    for (size_t t = 0; t < NV; t++)
        for (size_t d = 0; d < ND; d++)
            df[t] += counts[d][t] != 0;
    char *out = run_python(tfidf_script, data.s);
    char *cur = out;
    for (size_t t = 0; t < NV; t++) /* TfidfVectorizer.idf_ */
        CHECK_CLOSE("idf", t, tt_idf(ND, df[t]), next_num(&cur), 1e-15, 0.0);
    for (size_t d = 0; d < ND; d++) {
        double w[NV];
        assert_int_equal(tt_tfidf_vector(counts[d], df, NV, ND, w, NULL), TT_OK);
        for (size_t t = 0; t < NV; t++) /* TfidfVectorizer.fit_transform */
            CHECK_CLOSE("tf-idf", d * NV + t, w[t], next_num(&cur), 1e-14, 1e-16);
    }
    free(out);
    free(data.s);
    /* definitions and errors */
    assert_true(tt_idf(5, 5) == 1.0 && isnan(tt_idf(3, 4)));
    double v[] = {3.0, 4.0}, zero[] = {0.0, 0.0};
    assert_true(tt_l2_normalize(v, 2) == 5.0 && v[0] == 0.6 && v[1] == 0.8);
    assert_true(tt_l2_normalize(zero, 2) == 0.0 && zero[0] == 0.0);
    const uint64_t c1[] = {2}, d0[] = {0}, d9[] = {9};
    double w1[1];
    assert_int_equal(tt_tfidf_vector(c1, d0, 1, 5, w1, NULL), TT_EINVAL);
    assert_int_equal(tt_tfidf_vector(c1, d9, 1, 5, w1, NULL), TT_EINVAL);
}

/* ------------------------------------------------------------- similarity */

static const char *const sim_script =
    "import sys\n"
    "import numpy as np\n"
    "for block in open(sys.argv[1]).read().split('--\\n')[:-1]:\n"
    "    rows = [l.split() for l in block.splitlines()]\n"
    "    a = np.array([float(r[1]) for r in rows]); b = np.array([float(r[2]) for r in rows])\n"
    "    na, nb = np.linalg.norm(a), np.linalg.norm(b)\n"
    "    cos = float(np.dot(a, b) / (na * nb)) if na and nb else 0.0   # numpy\n"
    "    A = {r[0] for r in rows if int(r[1]) > 0}; B = {r[0] for r in rows if int(r[2]) > 0}\n"
    "    jac = len(A & B) / len(A | B) if A | B else 1.0              # Python sets\n"
    "    print(repr(cos), repr(jac))\n";

static void test_similarity_against_python(void **state)
{
    (void)state;
    tt_termtable_set_seed(0x510e527fade682d1ull, 0x9b05688c2b3e6c1full);
    enum { NP = 8, NT = 400 };
    tt_termtable *ta[NP], *tb[NP];
    static uint64_t ca[NP][NT], cb[NP][NT];
    rng_state = 0x1f83d9abfb41bd6bull;
    text data = {0};
    for (size_t p = 0; p < NP; p++) {
        ta[p] = tt_termtable_new();
        tb[p] = tt_termtable_new();
        for (size_t t = 0; t < NT; t++) {
            double u = rng_unit(), w = rng_unit();
            switch (p) {
            case 0: /* overlapping vocabularies, skewed counts */
            case 1:
                ca[p][t] = u < 0.4 ? 0 : (uint64_t)(1.0 / (u * u));
                cb[p][t] = w < 0.5 ? 0 : (uint64_t)(1.0 / (w * w));
                break;
            case 2: /* disjoint */
                ca[p][t] = t % 2 ? 0 : 1 + t;
                cb[p][t] = t % 2 ? 3 : 0;
                break;
            case 3: /* proportional */
                ca[p][t] = 1 + t % 17;
                cb[p][t] = 3 * ca[p][t];
                break;
            case 4: /* one empty side */
                ca[p][t] = t % 5;
                cb[p][t] = 0;
                break;
            case 5: /* both empty */ ca[p][t] = cb[p][t] = 0; break;
            case 6: /* huge counts */
                ca[p][t] = (uint64_t)(u * 1e12);
                cb[p][t] = (uint64_t)(w * 1e12);
                break;
            default: /* one shared term among many */
                ca[p][t] = t < 200 ? 1 : 0;
                cb[p][t] = t >= 199 ? 1 : 0;
            }
            char term[16];
            int len = snprintf(term, sizeof term, "t%zu", t);
            /* zero-count entries exist in real tables too; they are no term */
            if (ca[p][t] || t % 3 == 0)
                assert_int_equal(tt_termtable_add(ta[p], term, (size_t)len, ca[p][t]), TT_OK);
            if (cb[p][t] || t % 4 == 0)
                assert_int_equal(tt_termtable_add(tb[p], term, (size_t)len, cb[p][t]), TT_OK);
            text_printf(&data, "%s %llu %llu\n", term, (unsigned long long)ca[p][t],
                        (unsigned long long)cb[p][t]);
        }
        text_printf(&data, "--\n");
    }
    char *out = run_python(sim_script, data.s);
    char *cur = out;
    for (size_t p = 0; p < NP; p++) {
        double cos = next_num(&cur), jac = next_num(&cur);
        /* numpy: dot / (norm · norm); 0 for a zero vector (our definition) */
        CHECK_CLOSE("cosine", p, tt_cosine_termtables(ta[p], tb[p]), cos, 1e-14, 1e-15);
        CHECK_CLOSE("cosine (swapped)", p, tt_cosine_termtables(tb[p], ta[p]), cos, 1e-14, 1e-15);
        /* Python sets: |A ∩ B| / |A ∪ B|; 1 for two empty sets (our definition) */
        CHECK_CLOSE("jaccard", p, tt_jaccard_termtables(ta[p], tb[p]), jac, 1e-15, 0.0);
        CHECK_CLOSE("jaccard (swapped)", p, tt_jaccard_termtables(tb[p], ta[p]), jac, 1e-15, 0.0);
        tt_termtable_free(ta[p]);
        tt_termtable_free(tb[p]);
    }
    free(out);
    free(data.s);
    /* dense vectors */
    const double x[] = {1, 2, 3}, y[] = {-1, -2, -3}, z[] = {0, 0, 0};
    assert_true(fabs(tt_cosine_vectors(x, y, 3) + 1.0) < 1e-15);
    assert_true(tt_cosine_vectors(x, z, 3) == 0.0 && tt_cosine_vectors(x, x, 0) == 0.0);
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_summary_against_python),
        cmocka_unit_test(test_summary_edges),
        cmocka_unit_test(test_rank_and_z),
        cmocka_unit_test(test_correlation_and_slope),
        cmocka_unit_test(test_dispersion_worked_example),
        cmocka_unit_test(test_dispersion_against_python),
        cmocka_unit_test(test_tfidf_against_sklearn),
        cmocka_unit_test(test_similarity_against_python),
    };
    if (getenv("TT_TEST_FILTER"))
        cmocka_set_test_filter(getenv("TT_TEST_FILTER"));
    return cmocka_run_group_tests(tests, NULL, NULL);
}
