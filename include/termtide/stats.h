/* termtide — the measure stage's statistics: change between two sides,
 * contingency tests, false discovery rate, similarity, descriptive
 * statistics, correlation, dispersion across parts and tf-idf.
 *
 * Pure functions: no I/O, no global state. Only the functions that say so
 * allocate (through tt_malloc, failing with TT_ENOMEM); everything else works
 * in caller memory. Inputs are never modified unless a comment says so.
 *
 * Undefined values are NaN, never an infinity and never a silent 0: a field
 * that cannot be computed for the given data (a rate over zero words, the
 * standard deviation of one value, the correlation of a constant series) is
 * NaN, and the comment beside it says when. Callers print NaN as a word
 * ("n/a", "new", "gone"), not as a number.
 *
 * Sources are named beside each definition; the implementations are in
 * src/change.c (two-sided change, contingency tables, chi-square, BH) and
 * src/stats.c (everything else). */
#ifndef TT_STATS_H
#define TT_STATS_H

#include <stddef.h>
#include <stdint.h>

#include "termtide/status.h"
#include "termtide/termtable.h"

/* ======================================================================
 * Distributions
 * ====================================================================== */

/* The regularized upper incomplete gamma function Q(a, x) = Γ(a, x) / Γ(a),
 * for a > 0 and x >= 0 (series for x < a + 1, Legendre's continued fraction
 * otherwise, both in long double). Q(a, 0) = 1, Q(a, +inf) = 0. NaN when a
 * <= 0, x < 0 or either is NaN. Accurate to a few units in the last place
 * of a double down to the smallest normal double; results below that
 * underflow toward 0. */
double tt_gamma_q(double a, double x);

/* The chi-square survival function P(X >= x) with df degrees of freedom
 * (df > 0, need not be an integer) = Q(df/2, x/2). For df = 1 it is
 * erfc(sqrt(x/2)) and for df = 2 exp(-x/2). x <= 0 gives 1. NaN when
 * df <= 0 or an argument is NaN. Relative accuracy holds in the far tail
 * (p near 1e-300); p below about 1e-308 underflows (to a subnormal, then 0),
 * so sort by the statistic, not by p. */
double tt_chi2_sf(double x, double df);

/* ======================================================================
 * Change of one term between two sides (base and target)
 * ====================================================================== */

/* Rate per 10,000 words: 10000 · count / total. NaN when total is 0 (a side
 * with no words is reported, never divided by). */
double tt_rate_per_10k(uint64_t count, uint64_t total);

/* G² (log-likelihood ratio) on the FULL 2×2 table (Dunning 1993):
 *
 *                  base        target
 *     term         a           b
 *     other words  n1 - a      n2 - b
 *
 * E = row total × column total / N, G² = 2 Σ O ln(O/E), 0·ln 0 = 0. Computed
 * as 2 Σ E·h((O−E)/E), h(t) = (1+t)ln(1+t) − t, with O−E exact from integer
 * arithmetic, so each term is non-negative and nothing cancels, even with
 * counts near 1e12. Returns 0 when a = b = 0. NaN when a > n1, b > n2, or
 * n1 or n2 is 0. */
double tt_g2_2x2(uint64_t a, uint64_t n1, uint64_t b, uint64_t n2);

/* Log Ratio (Hardie 2014): log2((a/n1) / (b/n2)), positive when the term is
 * relatively more frequent in the BASE side. The stated correction for zeros:
 * a zero count (a or b) is replaced by 0.5 before the ratio is taken, so the
 * value is always finite; with a = b = 0 it is log2(n2/n1). NaN when n1 or n2
 * is 0, a > n1 or b > n2.
 * NOTE the orientation: compare reports change from base to target, so its
 * column is tt_log_ratio(b, n2, a, n1) — target over base (tt_change does
 * this for you: tt_change.log_ratio is target over base). */
double tt_log_ratio(uint64_t a, uint64_t n1, uint64_t b, uint64_t n2);

/* Presence of a term on the two sides; percent change is defined only for
 * TT_CHANGE_BOTH. */
typedef enum tt_change_kind {
    TT_CHANGE_BOTH = 0, /* counted on both sides */
    TT_CHANGE_NEW,      /* absent from the base (a = 0), present in the target */
    TT_CHANGE_GONE,     /* present in the base, absent from the target (b = 0) */
    TT_CHANGE_ABSENT    /* absent from both sides (a = b = 0) */
} tt_change_kind;

/* One row of `termtide compare`. */
typedef struct tt_change {
    uint64_t base_count, target_count; /* a, b */
    uint64_t base_words, target_words; /* n1, n2 */
    double base_rate_per_10k;          /* 10000 a / n1 */
    double target_rate_per_10k;        /* 10000 b / n2 */
    double rate_change_per_10k;        /* target rate − base rate */
    double percent_change;             /* 100 (target − base) / base rate; NaN unless
                                          kind == TT_CHANGE_BOTH */
    tt_change_kind kind;               /* new / gone flags */
    int direction;                     /* +1 the rate rose, −1 fell, 0 equal (exact,
                                          compared as a·n2 vs b·n1 in integers) */
    double g2;                         /* tt_g2_2x2(a, n1, b, n2), >= 0 */
    double signed_g2;                  /* direction × g2: the default sort key */
    double p_value;                    /* tt_chi2_sf(g2, 1) */
    double log_ratio;                  /* Hardie (2014), target over base:
                                          log2((b/n2)/(a/n1)), zero count → 0.5 */
    double q_value;                    /* NaN here; filled over all rows by
                                          tt_change_q_values (the caller's step) */
} tt_change;

/* Fills *out for a term counted a times among n1 base words and b times among
 * n2 target words. Allocates nothing. Fails with TT_EINVAL (message in err,
 * which may be NULL) when n1 or n2 is 0 or a count exceeds its side's words;
 * *out is then filled with the counts and NaN statistics. */
tt_status tt_change_compute(uint64_t a, uint64_t n1, uint64_t b, uint64_t n2, tt_change *out,
                            tt_error *err);

/* Two-proportion z-test (pooled): x1 of n1 against x2 of n2 (x may be a
 * weighted, non-integer count), z = (p2 − p1) / sqrt(p(1 − p)(1/n1 + 1/n2))
 * with p = (x1 + x2) / (n1 + n2); the two-sided p-value is erfc(|z|/√2).
 * z² equals Pearson's chi-square on the same 2×2 table without continuity
 * correction. *z and *p are NaN when a side has no trials or p is 0 or 1. */
void tt_two_proportion_z(double x1, double n1, double x2, double n2, double *z, double *p);

/* ======================================================================
 * r × c contingency tables (e.g. term × period)
 * ====================================================================== */

/* Row totals (rows entries), column totals (cols entries) and the grand
 * total of a row-major rows × cols table of counts. Output arrays are the
 * caller's; any may be NULL when not wanted. Allocates nothing. TT_EINVAL
 * when a total would overflow 64 bits or counts is NULL with a non-empty
 * shape. */
tt_status tt_contingency_margins(const uint64_t *counts, size_t rows, size_t cols,
                                 uint64_t *row_totals, uint64_t *col_totals, uint64_t *total,
                                 tt_error *err);

typedef struct tt_contingency {
    uint64_t total;      /* N */
    size_t df;           /* (r'−1)(c'−1), r' and c' the rows and columns with a non-zero
                            total: an empty row or column has no expected counts and
                            takes no part in the test */
    double g2;           /* 2 Σ O ln(O/E), 0·ln 0 = 0 (Dunning 1993; Wilks' G-test) */
    double g2_p_value;   /* tt_chi2_sf(g2, df); 1 when df = 0 */
    double chi2;         /* Pearson: Σ (O−E)²/E over cells with E > 0 */
    double chi2_p_value; /* tt_chi2_sf(chi2, df); 1 when df = 0 */
} tt_contingency;

/* Tests independence of rows and columns in a row-major rows × cols table of
 * counts (rows, cols >= 1). E = row total × column total / N. With df = 0
 * (one non-empty row or column, or an empty table) both statistics are 0 and
 * both p-values 1, as SciPy's chi2_contingency reports. Allocates rows + cols
 * totals with tt_malloc and frees them before returning: TT_ENOMEM; TT_EINVAL
 * as tt_contingency_margins, or when rows or cols is 0. */
tt_status tt_contingency_test(const uint64_t *counts, size_t rows, size_t cols, tt_contingency *out,
                              tt_error *err);

/* ======================================================================
 * False discovery rate
 * ====================================================================== */

/* Benjamini–Hochberg (1995) q-values (adjusted p-values) for m p-values:
 * sort ascending, q(i) = min over k >= i of m·p(k)/k, capped at 1; q is
 * written in the INPUT order. Ties get equal q. O(m) (radix ranking). q may be the same
 * array as p (in-place). Allocates a ranking of 2m entries with tt_malloc and
 * frees it: TT_ENOMEM; TT_EINVAL when a p-value is NaN or outside [0, 1]
 * (q is then left unspecified). m = 0 is valid and does nothing. */
tt_status tt_bh_q_values(const double *p, size_t m, double *q, tt_error *err);

/* The same over n change rows: reads each row's p_value, writes its q_value.
 * Every row must have a p-value (rows whose tt_change_compute failed have
 * NaN and give TT_EINVAL). Allocates and fails as tt_bh_q_values. */
tt_status tt_change_q_values(tt_change *rows, size_t n, tt_error *err);

/* ======================================================================
 * Similarity of two documents
 * ====================================================================== */

/* Cosine of the term-count vectors of a and b: Σ a_t b_t / (‖a‖ ‖b‖), in
 * [0, 1] (rounding clamped). 0 when either table has no counted term (a zero
 * vector is similar to nothing, not even to another zero vector). Iterates
 * the smaller table for the dot product; allocates nothing. */
double tt_cosine_termtables(const tt_termtable *a, const tt_termtable *b);

/* Jaccard similarity of the term sets (terms with a count > 0):
 * |A ∩ B| / |A ∪ B|. Defined as 1 when both sets are empty (two empty
 * vocabularies are identical); 0 when exactly one is. Allocates nothing. */
double tt_jaccard_termtables(const tt_termtable *a, const tt_termtable *b);

/* Cosine of two dense vectors of n values, Σ x_i y_i / (‖x‖ ‖y‖), clamped to
 * [−1, 1]; 0 when either vector is all zeros or n = 0. */
double tt_cosine_vectors(const double *x, const double *y, size_t n);

/* ======================================================================
 * Descriptive statistics of a sample
 * ====================================================================== */

/* Sorts x ascending in place (NaN must not occur). */
void tt_sort_doubles(double *x, size_t n);

/* The p-th percentile (0 <= p <= 100) of a sample SORTED ascending: the
 * position h = (n+1)·p/100 (1-based) with linear interpolation between the
 * neighbouring values, clamped to the smallest value for h < 1 and the
 * largest for h > n — common practice; Hyndman & Fan (1996) type 6, NumPy's
 * percentile(method="weibull"). NaN when n = 0 or p is outside [0, 100]. */
double tt_percentile_sorted(const double *sorted, size_t n, double p);

/* Percentile rank of value v in a sample (any order): the share of the
 * sample below v plus half the share equal to v, × 100 (SciPy's
 * percentileofscore kind="mean"). In [0, 100]; NaN when n = 0 or v is NaN. */
double tt_percentile_rank(const double *x, size_t n, double v);

/* z-score of value v against a sample (any order): (v − mean) / sample
 * standard deviation (n − 1 in the denominator, as for "where does the latest
 * document sit against the earlier ones"). NaN when n < 2 or the sample is
 * constant. */
double tt_z_score(const double *x, size_t n, double v);

/* Default total trim for trimmed and winsorized means, in percent. */
#define TT_DEFAULT_TRIM_PERCENT 10.0

typedef struct tt_summary {
    size_t n;
    double mean;
    double median;
    int has_mode;           /* 1 when one value occurs most often AND more than once */
    double mode;            /* that value; NaN when has_mode is 0 */
    double trim_percent;    /* the TOTAL percent trimmed, as given: 10 → 5% per tail */
    double trimmed_mean;    /* mean after dropping k = floor(n · trim/200) values from each
                               end (SciPy trim_mean(x, trim/200)) */
    double winsorized_mean; /* mean after setting the k lowest values to the (k+1)-th
                               lowest and the k highest to the (k+1)-th highest, same k
                               (SciPy mstats.winsorize(x, limits=(t, t)).mean(), t = trim/200) */
    double min, max, range;
    double q1, q3, iqr;    /* 25th and 75th percentiles by tt_percentile_sorted; q3 − q1 */
    double mean_abs_dev;   /* Σ|x − mean| / n, around the mean */
    double var_sample;     /* Σ(x − mean)² / (n − 1); NaN when n < 2 */
    double var_population; /* Σ(x − mean)² / n */
    double sd_sample, sd_population;
    double cv;       /* sd_sample / mean; NaN when mean is 0 or n < 2 */
    double skewness; /* adjusted Fisher–Pearson G1 = g1·√(n(n−1))/(n−2), g1 = m3/m2^1.5
                        (SciPy skew(bias=False)); NaN when n < 3 or constant */
    double excess_kurtosis; /* G2 = ((n+1)·g2 + 6)(n−1)/((n−2)(n−3)), g2 = m4/m2² − 3
                               (SciPy kurtosis(fisher=True, bias=False)); NaN when n < 4
                               or constant (SciPy returns the biased value there) */
} tt_summary;

/* Describes a sample already SORTED ascending (n >= 0). Allocates nothing.
 * Every field that the sample size does not allow is NaN (with n = 0, all
 * of them; n is 0 and has_mode 0). Sums are compensated (long double,
 * Neumaier) and the variance is the corrected two-pass one, so a constant
 * sample gives variance exactly 0. TT_EINVAL when trim_percent is outside
 * [0, 100) or a value is not finite or the sample is not sorted. */
tt_status tt_summary_of_sorted(const double *sorted, size_t n, double trim_percent, tt_summary *out,
                               tt_error *err);

/* Same for a sample in any order: copies x with tt_malloc, sorts the copy,
 * frees it. TT_ENOMEM, or the errors of tt_summary_of_sorted. */
tt_status tt_summary_compute(const double *x, size_t n, double trim_percent, tt_summary *out,
                             tt_error *err);

/* Arithmetic mean (compensated sum); NaN when n = 0. */
double tt_mean(const double *x, size_t n);

/* Pearson's correlation cov(x, y) / (sd x · sd y) of two series of n values,
 * clamped to [−1, 1]. NaN when n < 2 or either series is constant. */
double tt_pearson(const double *x, const double *y, size_t n);

/* Least-squares line y = intercept + slope·x. Fills *slope and *intercept
 * (either may be NULL); both NaN when n < 2 or x is constant. For a rate per
 * period, x is the period index 0, 1, 2, ... and slope is the change per
 * period. */
void tt_linear_fit(const double *x, const double *y, size_t n, double *slope, double *intercept);

/* The k × k Pearson correlation matrix of k series of n values each:
 * series[i] points to the n values of series i; out receives k·k values,
 * row-major, out[i·k + j] = tt_pearson(series[i], series[j], n). The
 * diagonal is 1, or NaN for a constant series. Allocates nothing. */
void tt_correlation_matrix(const double *const *series, size_t k, size_t n, double *out);

/* ======================================================================
 * Dispersion of a term across the parts (documents) of a period
 * ====================================================================== */

typedef struct tt_dispersion {
    size_t parts;        /* n */
    size_t doc_freq;     /* parts in which the term occurs */
    uint64_t term_total; /* the term's count over all parts */
    double dp;           /* Gries's DP (2008): ½ Σ |v_i − s_i|, s_i the part's share of all
                            words, v_i its share of the term; 0 even, near 1 clumped */
    double dp_norm;      /* DP / (1 − min s_i) (Lijffijt & Gries 2012); NaN when n = 1 */
    double juilland_d;   /* Juilland's D = 1 − CV/√(n−1), CV = population sd / mean of the
                            term's RATES per part (count / part size: parts are unequal,
                            so raw counts would measure part size); NaN when n = 1 */
} tt_dispersion;

/* Dispersion of a term counted term_counts[i] times in part i of part_sizes[i]
 * words, for n = parts parts (>= 1). A term absent from every part has
 * doc_freq 0 and NaN dp, dp_norm and juilland_d. Allocates nothing.
 * TT_EINVAL when parts is 0, a part has 0 words (callers leave empty
 * documents out and report them), a count exceeds its part's size, or a
 * total overflows. */
tt_status tt_dispersion_compute(const uint64_t *term_counts, const uint64_t *part_sizes,
                                size_t parts, tt_dispersion *out, tt_error *err);

/* ======================================================================
 * tf-idf (as scikit-learn's TfidfVectorizer defaults: smooth_idf=True,
 * sublinear_tf=False, norm="l2")
 * ====================================================================== */

/* Smoothed inverse document frequency: ln((1 + n_docs) / (1 + doc_freq)) + 1.
 * NaN when doc_freq > n_docs. */
double tt_idf(uint64_t n_docs, uint64_t doc_freq);

/* Scales v (n values) to unit Euclidean length in place and returns the
 * length it had. A zero vector is left as it is (and 0 returned). */
double tt_l2_normalize(double *v, size_t n);

/* One document's tf-idf vector over n terms: weights[i] = counts[i] ·
 * tt_idf(n_docs, doc_freq[i]), then L2-normalized. weights is the caller's
 * (n values). TT_EINVAL when a doc_freq exceeds n_docs, or a count is
 * positive while its doc_freq is 0. */
tt_status tt_tfidf_vector(const uint64_t *counts, const uint64_t *doc_freq, size_t n,
                          uint64_t n_docs, double *weights, tt_error *err);

/* Scores of one class of a classification (and their macro averages). */
typedef struct tt_class_scores {
    double precision, recall, f1;
    uint64_t support;    /* units of this class (actual) */
    uint64_t predicted;  /* units predicted as this class */
} tt_class_scores;

/* Precision, recall and F1 per class from an n × n confusion matrix,
 * matrix[actual * n + predicted]: precision = tp / predicted, recall = tp /
 * support, F1 = 2PR / (P + R), each 0 where its denominator is 0 (the
 * convention of scikit-learn's zero_division=0). macro holds the unweighted
 * means over the n classes (macro F1 is the mean of the F1s, not the F1 of
 * the mean P and R), support and predicted summed; *accuracy = trace /
 * total, NaN when the matrix is empty. */
void tt_classification_scores(const uint64_t *matrix, size_t n, tt_class_scores *per_class,
                              tt_class_scores *macro, double *accuracy);

#endif
