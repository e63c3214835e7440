/* termtide — descriptive statistics, correlation, dispersion across parts,
 * tf-idf and document similarity (the measure stage, apart from two-sided
 * change, which is in change.c).
 *
 * Design. Samples here are small (one value per document or period: tens to
 * thousands), so clarity and accuracy win over speed: sums are accumulated in
 * long double with Neumaier's compensation, the variance is the corrected
 * two-pass one (Chan, Golub & LeVeque 1983: Σd² − (Σd)²/n with d taken from
 * the mean, which removes the mean's own rounding), and a constant sample is
 * recognised exactly instead of trusting a tiny computed variance, so its
 * variance is 0 and its skewness NaN, never noise. Everything that needs the
 * order works on a sorted array; tt_summary_compute is the one place that
 * allocates (a sorted copy). Quantiles follow NumPy's arithmetic step for
 * step, so the "weibull" method agrees to the last bit or two.
 *
 * Similarity walks the smaller term table and looks each term up in the
 * other: O(min(|A|, |B|)) lookups plus one pass over each table for the
 * norms, no allocation. */
#include <math.h>
#include <stdlib.h>

#include "termtide/stats.h"
#include "tt_internal.h"

/* ---------------------------------------------------------------------
 * Compensated sums
 * --------------------------------------------------------------------- */

typedef struct ksum {
    long double s, c;
} ksum;

/* Neumaier's variant of Kahan summation: the lost low part of each addition
 * is kept in c, whichever operand is larger. */
static void ksum_add(ksum *k, long double v)
{
    long double t = k->s + v;
    if (fabsl(k->s) >= fabsl(v))
        k->c += (k->s - t) + v;
    else
        k->c += (v - t) + k->s;
    k->s = t;
}

static long double ksum_value(const ksum *k)
{
    return k->s + k->c;
}

static long double mean_ld(const double *x, size_t n)
{
    ksum k = {0, 0};
    for (size_t i = 0; i < n; i++)
        ksum_add(&k, x[i]);
    return ksum_value(&k) / (long double)n;
}

static int all_equal(const double *x, size_t n)
{
    for (size_t i = 1; i < n; i++)
        if (x[i] != x[0])
            return 0;
    return 1;
}

/* Σ(x − m)², corrected two-pass (see the design note). */
static long double sum_sq_dev(const double *x, size_t n, long double m)
{
    ksum d = {0, 0}, d2 = {0, 0};
    for (size_t i = 0; i < n; i++) {
        long double v = (long double)x[i] - m;
        ksum_add(&d, v);
        ksum_add(&d2, v * v);
    }
    long double s = ksum_value(&d);
    long double r = ksum_value(&d2) - s * s / (long double)n;
    return r < 0.0L ? 0.0L : r;
}

double tt_mean(const double *x, size_t n)
{
    if (n == 0)
        return NAN;
    return (double)mean_ld(x, n);
}

/* ---------------------------------------------------------------------
 * Order statistics
 * --------------------------------------------------------------------- */

static int double_cmp(const void *pa, const void *pb)
{
    double a = *(const double *)pa, b = *(const double *)pb;
    return (a > b) - (a < b);
}

void tt_sort_doubles(double *x, size_t n)
{
    if (n > 1)
        qsort(x, n, sizeof *x, double_cmp);
}

/* Hyndman & Fan (1996) type 6, as NumPy 1.24 evaluates method="weibull":
 * virtual 0-based index n·q + q − 1, clamped to [0, n−1], then the lerp
 * a + (b−a)·g, or b − (b−a)·(1−g) when g >= ½ (which keeps the result
 * monotone and exact at g = 1). */
double tt_percentile_sorted(const double *sorted, size_t n, double p)
{
    if (n == 0 || !(p >= 0.0 && p <= 100.0))
        return NAN;
    double q = p / 100.0, nd = (double)n;
    double v = nd * q + (0.0 + q * 1.0) - 1.0;
    if (v >= nd - 1.0)
        return sorted[n - 1];
    if (v < 0.0)
        return sorted[0];
    double lo_d = floor(v);
    size_t lo = (size_t)lo_d;
    double g = v - lo_d, a = sorted[lo], b = sorted[lo + 1], diff = b - a;
    return g >= 0.5 ? b - diff * (1.0 - g) : a + diff * g;
}

double tt_percentile_rank(const double *x, size_t n, double v)
{
    if (n == 0 || isnan(v))
        return NAN;
    size_t below = 0, equal = 0;
    for (size_t i = 0; i < n; i++) {
        below += x[i] < v;
        equal += x[i] == v;
    }
    /* multiply before dividing: (n/n)·100 is exactly 100, (1/n·100)·n may not be */
    return ((double)below + 0.5 * (double)equal) * 100.0 / (double)n;
}

double tt_z_score(const double *x, size_t n, double v)
{
    if (n < 2 || all_equal(x, n))
        return NAN;
    long double m = mean_ld(x, n);
    long double sd = sqrtl(sum_sq_dev(x, n, m) / (long double)(n - 1));
    return (double)(((long double)v - m) / sd);
}

/* ---------------------------------------------------------------------
 * Summary
 * --------------------------------------------------------------------- */

static void summary_nan(tt_summary *s, size_t n, double trim_percent)
{
    s->n = n;
    s->has_mode = 0;
    s->trim_percent = trim_percent;
    s->mean = s->median = s->mode = s->trimmed_mean = s->winsorized_mean = NAN;
    s->min = s->max = s->range = s->q1 = s->q3 = s->iqr = NAN;
    s->mean_abs_dev = s->var_sample = s->var_population = NAN;
    s->sd_sample = s->sd_population = s->cv = s->skewness = s->excess_kurtosis = NAN;
}

/* The most frequent value when it is unique and occurs more than once. */
static int find_mode(const double *x, size_t n, double *mode)
{
    size_t best = 0, best_runs = 0;
    double best_v = NAN;
    for (size_t i = 0; i < n;) {
        size_t j = i + 1;
        while (j < n && x[j] == x[i])
            j++;
        size_t run = j - i;
        if (run > best) {
            best = run;
            best_runs = 1;
            best_v = x[i];
        } else if (run == best) {
            best_runs++;
        }
        i = j;
    }
    if (best < 2 || best_runs != 1)
        return 0;
    *mode = best_v;
    return 1;
}

tt_status tt_summary_of_sorted(const double *x, size_t n, double trim_percent, tt_summary *s,
                               tt_error *err)
{
    summary_nan(s, n, trim_percent);
    if (!(trim_percent >= 0.0 && trim_percent < 100.0))
        return tt_error_set(err, TT_EINVAL, NULL, -1, "trim percent %g is outside [0, 100)",
                            trim_percent);
    for (size_t i = 0; i < n; i++) {
        if (!isfinite(x[i]))
            return tt_error_set(err, TT_EINVAL, NULL, -1, "value %zu is not finite", i + 1);
        if (i && x[i] < x[i - 1])
            return tt_error_set(err, TT_EINVAL, NULL, -1, "sample is not sorted at value %zu",
                                i + 1);
    }
    if (n == 0)
        return TT_OK;

    long double nl = (long double)n;
    int constant = x[0] == x[n - 1];
    long double m = constant ? (long double)x[0] : mean_ld(x, n);
    s->mean = (double)m;
    s->min = x[0];
    s->max = x[n - 1];
    s->range = x[n - 1] - x[0];
    s->median = (n & 1) ? x[n / 2] : (x[n / 2 - 1] + x[n / 2]) / 2.0;
    s->has_mode = find_mode(x, n, &s->mode);
    s->q1 = tt_percentile_sorted(x, n, 25.0);
    s->q3 = tt_percentile_sorted(x, n, 75.0);
    s->iqr = s->q3 - s->q1;

    /* Trimmed and winsorized means: k = int(t·n) per tail with t the per-tail
     * proportion, as SciPy's trim_mean and mstats.winsorize truncate it; the
     * percent given is the total, so t = trim/200. 2k < n always holds for
     * trim < 100. */
    double per_tail = trim_percent / 200.0;
    size_t k = (size_t)(per_tail * (double)n);
    ksum mid = {0, 0};
    for (size_t i = k; i < n - k; i++)
        ksum_add(&mid, x[i]);
    s->trimmed_mean = (double)(ksum_value(&mid) / (long double)(n - 2 * k));
    ksum win = mid;
    ksum_add(&win, (long double)k * x[k]);
    ksum_add(&win, (long double)k * x[n - k - 1]);
    s->winsorized_mean = (double)(ksum_value(&win) / nl);

    /* Central moments around the long double mean. */
    ksum abs_dev = {0, 0}, d3 = {0, 0}, d4 = {0, 0};
    long double ss = 0.0L;
    if (!constant) {
        for (size_t i = 0; i < n; i++) {
            long double d = (long double)x[i] - m;
            ksum_add(&abs_dev, fabsl(d));
            ksum_add(&d3, d * d * d);
            ksum_add(&d4, d * d * d * d);
        }
        ss = sum_sq_dev(x, n, m);
    }
    s->mean_abs_dev = (double)(ksum_value(&abs_dev) / nl);
    s->var_population = (double)(ss / nl);
    s->sd_population = (double)sqrtl(ss / nl);
    if (n >= 2) {
        s->var_sample = (double)(ss / (nl - 1.0L));
        s->sd_sample = (double)sqrtl(ss / (nl - 1.0L));
        if (m != 0.0L)
            s->cv = (double)(sqrtl(ss / (nl - 1.0L)) / m);
    }
    if (!constant && ss > 0.0L) {
        long double m2 = ss / nl, m3 = ksum_value(&d3) / nl, m4 = ksum_value(&d4) / nl;
        if (n >= 3) {
            /* Adjusted Fisher–Pearson skewness G1 (as SciPy skew(bias=False)). */
            long double g1 = m3 / (m2 * sqrtl(m2));
            s->skewness = (double)(g1 * sqrtl(nl * (nl - 1.0L)) / (nl - 2.0L));
        }
        if (n >= 4) {
            /* Bias-corrected excess kurtosis G2 (as SciPy kurtosis(fisher=True,
             * bias=False)). */
            long double g2 = m4 / (m2 * m2) - 3.0L;
            s->excess_kurtosis =
                (double)(((nl + 1.0L) * g2 + 6.0L) * (nl - 1.0L) / ((nl - 2.0L) * (nl - 3.0L)));
        }
    }
    return TT_OK;
}

tt_status tt_summary_compute(const double *x, size_t n, double trim_percent, tt_summary *out,
                             tt_error *err)
{
    if (n == 0)
        return tt_summary_of_sorted(x, 0, trim_percent, out, err);
    double *copy = tt_calloc(n, sizeof *copy);
    if (!copy) {
        summary_nan(out, n, trim_percent);
        return tt_error_set(err, TT_ENOMEM, NULL, -1, "out of memory sorting %zu values", n);
    }
    for (size_t i = 0; i < n; i++) {
        if (isnan(x[i])) { /* qsort needs a total order */
            tt_free(copy);
            summary_nan(out, n, trim_percent);
            return tt_error_set(err, TT_EINVAL, NULL, -1, "value %zu is not finite", i + 1);
        }
        copy[i] = x[i];
    }
    tt_sort_doubles(copy, n);
    tt_status st = tt_summary_of_sorted(copy, n, trim_percent, out, err);
    tt_free(copy);
    return st;
}

/* ---------------------------------------------------------------------
 * Correlation and least squares
 * --------------------------------------------------------------------- */

/* Sxx, Syy, Sxy around the means (callers rule out constant series first,
 * exactly, not by a small computed variance). */
static void co_moments(const double *x, const double *y, size_t n, long double *sxx,
                       long double *syy, long double *sxy, long double *mx, long double *my)
{
    *mx = mean_ld(x, n);
    *my = mean_ld(y, n);
    ksum a = {0, 0}, b = {0, 0}, c = {0, 0};
    for (size_t i = 0; i < n; i++) {
        long double dx = (long double)x[i] - *mx, dy = (long double)y[i] - *my;
        ksum_add(&a, dx * dx);
        ksum_add(&b, dy * dy);
        ksum_add(&c, dx * dy);
    }
    *sxx = ksum_value(&a);
    *syy = ksum_value(&b);
    *sxy = ksum_value(&c);
}

double tt_pearson(const double *x, const double *y, size_t n)
{
    if (n < 2 || all_equal(x, n) || all_equal(y, n))
        return NAN;
    long double sxx, syy, sxy, mx, my;
    co_moments(x, y, n, &sxx, &syy, &sxy, &mx, &my);
    if (sxx <= 0.0L || syy <= 0.0L)
        return NAN;
    long double r = sxy / sqrtl(sxx * syy);
    if (r > 1.0L)
        r = 1.0L;
    if (r < -1.0L)
        r = -1.0L;
    return (double)r;
}

void tt_linear_fit(const double *x, const double *y, size_t n, double *slope, double *intercept)
{
    double b = NAN, a = NAN;
    if (n >= 2 && !all_equal(x, n)) {
        long double sxx, syy, sxy, mx, my;
        co_moments(x, y, n, &sxx, &syy, &sxy, &mx, &my);
        if (sxx > 0.0L) {
            long double bl = sxy / sxx;
            b = (double)bl;
            a = (double)(my - bl * mx);
        }
    }
    if (slope)
        *slope = b;
    if (intercept)
        *intercept = a;
}

void tt_correlation_matrix(const double *const *series, size_t k, size_t n, double *out)
{
    for (size_t i = 0; i < k; i++) {
        int constant = n < 2 || all_equal(series[i], n);
        out[i * k + i] = constant ? NAN : 1.0;
        for (size_t j = i + 1; j < k; j++)
            out[i * k + j] = out[j * k + i] = tt_pearson(series[i], series[j], n);
    }
}

/* ---------------------------------------------------------------------
 * Dispersion across parts
 * --------------------------------------------------------------------- */

tt_status tt_dispersion_compute(const uint64_t *term_counts, const uint64_t *part_sizes,
                                size_t parts, tt_dispersion *out, tt_error *err)
{
    out->parts = parts;
    out->doc_freq = 0;
    out->term_total = 0;
    out->dp = out->dp_norm = out->juilland_d = NAN;
    if (parts == 0)
        return tt_error_set(err, TT_EINVAL, NULL, -1, "dispersion needs at least one part");
    uint64_t S = 0, T = 0, min_size = UINT64_MAX;
    for (size_t i = 0; i < parts; i++) {
        if (part_sizes[i] == 0)
            return tt_error_set(err, TT_EINVAL, NULL, -1, "part %zu has no words", i + 1);
        if (term_counts[i] > part_sizes[i])
            return tt_error_set(err, TT_EINVAL, NULL, -1,
                                "part %zu: the term count exceeds the part's words", i + 1);
        if (S > UINT64_MAX - part_sizes[i])
            return tt_error_set(err, TT_EINVAL, NULL, -1, "total part size overflows");
        S += part_sizes[i];
        T += term_counts[i]; /* T <= S, so no overflow once S passed */
        out->doc_freq += term_counts[i] != 0;
        if (part_sizes[i] < min_size)
            min_size = part_sizes[i];
    }
    out->term_total = T;
    if (T == 0)
        return TT_OK;

    /* Gries's DP (2008): ½ Σ |v_i − s_i|. */
    long double Sl = (long double)S, Tl = (long double)T;
    ksum dp = {0, 0};
    for (size_t i = 0; i < parts; i++)
        ksum_add(&dp, fabsl((long double)term_counts[i] / Tl - (long double)part_sizes[i] / Sl));
    long double dpv = ksum_value(&dp) / 2.0L;
    out->dp = (double)dpv;
    if (parts < 2)
        return TT_OK;
    /* DPnorm (Lijffijt & Gries 2012): DP / (1 − min s_i). */
    out->dp_norm = (double)(dpv / (1.0L - (long double)min_size / Sl));

    /* Juilland's D over the rates per part (parts differ in size): 1 −
     * CV/√(n−1), CV the population standard deviation over the mean. */
    ksum rs = {0, 0};
    for (size_t i = 0; i < parts; i++)
        ksum_add(&rs, (long double)term_counts[i] / (long double)part_sizes[i]);
    long double nl = (long double)parts, mean = ksum_value(&rs) / nl;
    ksum d2 = {0, 0};
    for (size_t i = 0; i < parts; i++) {
        long double d = (long double)term_counts[i] / (long double)part_sizes[i] - mean;
        ksum_add(&d2, d * d);
    }
    long double cv = sqrtl(ksum_value(&d2) / nl) / mean;
    out->juilland_d = (double)(1.0L - cv / sqrtl(nl - 1.0L));
    return TT_OK;
}

/* ---------------------------------------------------------------------
 * tf-idf (scikit-learn TfidfVectorizer defaults)
 * --------------------------------------------------------------------- */

/* smooth_idf=True adds one document containing every term:
 * idf = ln((1 + n) / (1 + df)) + 1, evaluated as scikit-learn 1.2 does
 * (quotient in double, then the log). */
double tt_idf(uint64_t n_docs, uint64_t doc_freq)
{
    if (doc_freq > n_docs)
        return NAN;
    return log(((double)n_docs + 1.0) / ((double)doc_freq + 1.0)) + 1.0;
}

double tt_l2_normalize(double *v, size_t n)
{
    ksum ss = {0, 0};
    for (size_t i = 0; i < n; i++)
        ksum_add(&ss, (long double)v[i] * v[i]);
    long double norm = sqrtl(ksum_value(&ss));
    if (norm == 0.0L)
        return 0.0;
    double nd = (double)norm;
    for (size_t i = 0; i < n; i++)
        v[i] /= nd;
    return nd;
}

tt_status tt_tfidf_vector(const uint64_t *counts, const uint64_t *doc_freq, size_t n,
                          uint64_t n_docs, double *weights, tt_error *err)
{
    for (size_t i = 0; i < n; i++) {
        if (doc_freq[i] > n_docs)
            return tt_error_set(err, TT_EINVAL, NULL, -1,
                                "term %zu: document frequency exceeds the documents", i + 1);
        if (counts[i] && !doc_freq[i])
            return tt_error_set(err, TT_EINVAL, NULL, -1,
                                "term %zu is counted but has document frequency 0", i + 1);
        weights[i] = (double)counts[i] * tt_idf(n_docs, doc_freq[i]);
    }
    tt_l2_normalize(weights, n);
    return TT_OK;
}

/* ---------------------------------------------------------------------
 * Similarity of two term tables
 * --------------------------------------------------------------------- */

typedef struct pair_walk {
    const tt_termtable *other;
    long double dot;  /* Σ a_t b_t */
    long double sq;   /* Σ of squares of the walked table */
    uint64_t present; /* terms with count > 0 in the walked table */
    uint64_t shared;  /* ... and in the other */
} pair_walk;

static int walk_entry(void *ctx, const tt_term_entry *e)
{
    pair_walk *w = ctx;
    if (e->count == 0)
        return 0;
    long double c = (long double)e->count;
    w->sq += c * c;
    w->present++;
    if (w->other) {
        uint64_t o = tt_termtable_get(w->other, e->term, e->len);
        if (o) {
            w->dot += c * (long double)o;
            w->shared++;
        }
    }
    return 0;
}

/* Walks the smaller table against the larger one (dot and shared), and the
 * larger alone (its squares and its present terms). */
static void walk_pair(const tt_termtable *a, const tt_termtable *b, pair_walk *small,
                      pair_walk *large)
{
    const tt_termtable *s = a, *l = b;
    if (tt_termtable_distinct(b) < tt_termtable_distinct(a)) {
        s = b;
        l = a;
    }
    *small = (pair_walk){l, 0.0L, 0.0L, 0, 0};
    *large = (pair_walk){NULL, 0.0L, 0.0L, 0, 0};
    tt_termtable_foreach(s, walk_entry, small);
    tt_termtable_foreach(l, walk_entry, large);
}

double tt_cosine_termtables(const tt_termtable *a, const tt_termtable *b)
{
    pair_walk s, l;
    walk_pair(a, b, &s, &l);
    if (s.sq == 0.0L || l.sq == 0.0L)
        return 0.0;
    long double c = s.dot / (sqrtl(s.sq) * sqrtl(l.sq));
    return c > 1.0L ? 1.0 : (double)c;
}

double tt_jaccard_termtables(const tt_termtable *a, const tt_termtable *b)
{
    pair_walk s, l;
    walk_pair(a, b, &s, &l);
    uint64_t uni = s.present + l.present - s.shared;
    if (uni == 0)
        return 1.0;
    return (double)s.shared / (double)uni;
}

double tt_cosine_vectors(const double *x, const double *y, size_t n)
{
    ksum dot = {0, 0}, xx = {0, 0}, yy = {0, 0};
    for (size_t i = 0; i < n; i++) {
        ksum_add(&dot, (long double)x[i] * y[i]);
        ksum_add(&xx, (long double)x[i] * x[i]);
        ksum_add(&yy, (long double)y[i] * y[i]);
    }
    long double nx = ksum_value(&xx), ny = ksum_value(&yy);
    if (nx == 0.0L || ny == 0.0L)
        return 0.0;
    long double c = ksum_value(&dot) / (sqrtl(nx) * sqrtl(ny));
    if (c > 1.0L)
        c = 1.0L;
    if (c < -1.0L)
        c = -1.0L;
    return (double)c;
}

void tt_two_proportion_z(double x1, double n1, double x2, double n2, double *z, double *p)
{
    *z = NAN;
    *p = NAN;
    if (!(n1 > 0) || !(n2 > 0) || x1 < 0 || x2 < 0 || x1 > n1 || x2 > n2)
        return;
    double pooled = (x1 + x2) / (n1 + n2);
    double var = pooled * (1 - pooled) * (1 / n1 + 1 / n2);
    if (!(var > 0))
        return;
    *z = (x2 / n2 - x1 / n1) / sqrt(var);
    *p = erfc(fabs(*z) / sqrt(2.0));
}

/* Per-class precision, recall and F1: the usual definitions (van Rijsbergen
 * 1979 for F1), averaged as scikit-learn's average='macro'. */
void tt_classification_scores(const uint64_t *matrix, size_t n, tt_class_scores *per_class,
                              tt_class_scores *macro, double *accuracy)
{
    uint64_t total = 0, trace = 0;
    memset(macro, 0, sizeof *macro);
    for (size_t c = 0; c < n; c++) {
        uint64_t tp = matrix[c * n + c], support = 0, predicted = 0;
        for (size_t k = 0; k < n; k++) {
            support += matrix[c * n + k];
            predicted += matrix[k * n + c];
        }
        tt_class_scores *s = &per_class[c];
        s->support = support;
        s->predicted = predicted;
        s->precision = predicted ? (double)tp / (double)predicted : 0.0;
        s->recall = support ? (double)tp / (double)support : 0.0;
        s->f1 = s->precision + s->recall > 0
                    ? 2.0 * s->precision * s->recall / (s->precision + s->recall)
                    : 0.0;
        macro->precision += s->precision;
        macro->recall += s->recall;
        macro->f1 += s->f1;
        macro->support += support;
        macro->predicted += predicted;
        total += support;
        trace += tp;
    }
    if (n) {
        macro->precision /= (double)n;
        macro->recall /= (double)n;
        macro->f1 /= (double)n;
    }
    *accuracy = total ? (double)trace / (double)total : NAN;
}
