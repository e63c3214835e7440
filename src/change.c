/* termtide — change statistics: one term between two sides, r × c
 * contingency tables, the chi-square distribution and Benjamini–Hochberg
 * q-values.
 *
 * Design. compare calls tt_change_compute once per distinct term (a million
 * rows is ordinary), so a row costs a few logs (about 0.3 µs) and no
 * allocation. The statistics must stay right at both ends of the scale: a
 * term seen twice in a ten-word note, and a word seen a billion times in an
 * archive of a hundred billion.
 *
 * G² without cancellation. The textbook form 2 Σ O ln(O/E) adds four terms
 * of size ~N·|t| with alternating signs to get a result of size ~N·t², so at
 * N = 1e12 a double loses everything. Since Σ O = Σ E, the same statistic is
 * 2 Σ [O ln(O/E) − (O − E)] = 2 Σ E·h(t), t = (O − E)/E,
 * h(t) = (1 + t) ln(1 + t) − t >= 0: every term is non-negative, so the sum
 * loses nothing; h is taken from its Taylor series t²/2 − t³/6 + ... near 0,
 * where the closed form would cancel. In the 2×2 table the four deviations
 * O − E are ±(a·n2 − b·n1)/N, and a·n2 − b·n1 is computed exactly in 128-bit
 * integer arithmetic (then E and t in long double), so t carries full
 * precision even when O ≈ E ≈ 1e12; h itself is then safe in double. The
 * result agrees with an 80-digit evaluation to about 1e-15 (tests), where
 * the textbook sum in double is off by ~N·eps absolute.
 *
 * Chi-square tail. Q(a, x) by its power series (for P = 1 − Q) when
 * x < a + 1 and by Legendre's continued fraction otherwise (the standard
 * split: each converges fast on its side), in long double, with the prefactor
 * x^a e^−x / Γ(a) formed as one exponential of a sum of logs so it neither
 * overflows nor underflows early. For 1 degree of freedom Q(½, x/2) =
 * erfc(√(x/2)), used directly with the square root's rounding put back. Both
 * stay within a few units in the last place down to p ~ 1e-300. p below the
 * double range underflows to 0: rows are sorted by the statistic, which
 * keeps its order.
 *
 * q-values rank the p-values by a radix sort on their bits (O(m), stable,
 * so ties keep input order and the output is deterministic). */
#include <float.h>
#include <math.h>
#include <stdlib.h>

#include "termtide/stats.h"
#include "tt_internal.h"

/* ---------------------------------------------------------------------
 * 64 × 64 → 128-bit products, portable (no compiler extension needed).
 * --------------------------------------------------------------------- */

typedef struct u128 {
    uint64_t hi, lo;
} u128;

static u128 mul_u64(uint64_t x, uint64_t y)
{
    uint64_t x0 = x & 0xffffffffu, x1 = x >> 32;
    uint64_t y0 = y & 0xffffffffu, y1 = y >> 32;
    uint64_t p00 = x0 * y0, p01 = x0 * y1, p10 = x1 * y0, p11 = x1 * y1;
    uint64_t mid = (p00 >> 32) + (p01 & 0xffffffffu) + (p10 & 0xffffffffu);
    u128 r;
    r.lo = (mid << 32) | (p00 & 0xffffffffu);
    r.hi = p11 + (p01 >> 32) + (p10 >> 32) + (mid >> 32);
    return r;
}

static int cmp_u128(u128 x, u128 y)
{
    if (x.hi != y.hi)
        return x.hi < y.hi ? -1 : 1;
    if (x.lo != y.lo)
        return x.lo < y.lo ? -1 : 1;
    return 0;
}

/* x − y for x >= y. */
static u128 sub_u128(u128 x, u128 y)
{
    u128 r;
    r.lo = x.lo - y.lo;
    r.hi = x.hi - y.hi - (x.lo < y.lo);
    return r;
}

static long double u128_to_ld(u128 x)
{
    return ldexpl((long double)x.hi, 64) + (long double)x.lo;
}

/* The sign of a·n2 − b·n1 (+1 when the base rate is higher) and its
 * magnitude as a long double (one rounding). */
static int cross_diff(uint64_t a, uint64_t n1, uint64_t b, uint64_t n2, long double *mag)
{
    u128 p = mul_u64(a, n2), q = mul_u64(b, n1);
    int c = cmp_u128(p, q);
    if (c == 0) {
        *mag = 0.0L;
        return 0;
    }
    *mag = u128_to_ld(c > 0 ? sub_u128(p, q) : sub_u128(q, p));
    return c;
}

/* ---------------------------------------------------------------------
 * G² cell terms
 * --------------------------------------------------------------------- */

/* 1/(k(k−1)) for k = 2..41: the coefficients of the series of h below. */
#define INV_KK1(k) (1.0 / ((double)(k) * (double)((k)-1)))
static const double h_coef[] = {
    INV_KK1(2),  INV_KK1(3),  INV_KK1(4),  INV_KK1(5),  INV_KK1(6),  INV_KK1(7),  INV_KK1(8),
    INV_KK1(9),  INV_KK1(10), INV_KK1(11), INV_KK1(12), INV_KK1(13), INV_KK1(14), INV_KK1(15),
    INV_KK1(16), INV_KK1(17), INV_KK1(18), INV_KK1(19), INV_KK1(20), INV_KK1(21), INV_KK1(22),
    INV_KK1(23), INV_KK1(24), INV_KK1(25), INV_KK1(26), INV_KK1(27), INV_KK1(28), INV_KK1(29),
    INV_KK1(30), INV_KK1(31), INV_KK1(32), INV_KK1(33), INV_KK1(34), INV_KK1(35), INV_KK1(36),
    INV_KK1(37), INV_KK1(38), INV_KK1(39), INV_KK1(40), INV_KK1(41),
};

/* h(t) = (1 + t) ln(1 + t) − t for t >= −1. Near 0 the closed form cancels
 * (h ~ t²/2), so for |t| < 1/4 the series Σ_{k>=2} (−t)^k / (k(k−1)) is used
 * (under 30 terms reach double precision; the terms shrink monotonically, so
 * nothing cancels); beyond, the closed form loses at most one digit. Double
 * precision suffices here: what needs the extra care is t itself, which
 * callers form from an exact O − E in long double. */
static double h_dev(double t)
{
    if (t <= -1.0)
        return 1.0;
    if (fabs(t) < 0.25) {
        double pw = t * t, sum = 0.0; /* pw = t^k, signed */
        for (size_t i = 0; i < sizeof h_coef / sizeof h_coef[0]; i++) {
            double term = pw * h_coef[i];
            sum += (i & 1) ? -term : term;
            if (fabs(term) < 1e-18 * sum)
                break;
            pw *= t;
        }
        return sum;
    }
    return (1.0 + t) * log1p(t) - t;
}

/* One cell's share of G²/2: O ln(O/E) − (O − E) = E·h(dev/E), dev = O − E.
 * An empty cell (O = 0) contributes E (0·ln 0 = 0); a cell with E = 0 has
 * O = 0 and contributes nothing. */
static long double g2_cell(long double observed, long double expected, long double dev)
{
    if (expected <= 0.0L)
        return 0.0L;
    if (observed == 0.0L)
        return expected;
    return expected * (long double)h_dev((double)(dev / expected));
}

/* G² (Dunning 1993) on the full 2×2 table; see the design note above. */
double tt_g2_2x2(uint64_t a, uint64_t n1, uint64_t b, uint64_t n2)
{
    if (n1 == 0 || n2 == 0 || a > n1 || b > n2)
        return NAN;
    long double mag;
    int s = cross_diff(a, n1, b, n2, &mag);
    if (s == 0)
        return 0.0; /* equal rates: every O equals its E */
    long double N = (long double)n1 + (long double)n2;
    long double dev = (s > 0 ? mag : -mag) / N; /* O − E of the (term, base) cell */
    long double term_row = (long double)a + (long double)b;
    long double other_row = (long double)(n1 - a) + (long double)(n2 - b);
    long double c1 = (long double)n1, c2 = (long double)n2;
    long double sum = g2_cell((long double)a, term_row * c1 / N, dev) +
                      g2_cell((long double)b, term_row * c2 / N, -dev) +
                      g2_cell((long double)(n1 - a), other_row * c1 / N, -dev) +
                      g2_cell((long double)(n2 - b), other_row * c2 / N, dev);
    return (double)(2.0L * sum);
}

/* Log Ratio (Hardie 2014), with the stated correction: a zero count becomes
 * 0.5. The quotient is formed in long double (products up to 2^128 fit its
 * exponent range), so equal rates give exactly 0. */
double tt_log_ratio(uint64_t a, uint64_t n1, uint64_t b, uint64_t n2)
{
    if (n1 == 0 || n2 == 0 || a > n1 || b > n2)
        return NAN;
    long double fa = a ? (long double)a : 0.5L, fb = b ? (long double)b : 0.5L;
    return (double)log2l((fa * (long double)n2) / (fb * (long double)n1));
}

double tt_rate_per_10k(uint64_t count, uint64_t total)
{
    if (total == 0)
        return NAN;
    return (double)(10000.0L * (long double)count / (long double)total);
}

tt_status tt_change_compute(uint64_t a, uint64_t n1, uint64_t b, uint64_t n2, tt_change *out,
                            tt_error *err)
{
    out->base_count = a;
    out->target_count = b;
    out->base_words = n1;
    out->target_words = n2;
    out->kind = a ? (b ? TT_CHANGE_BOTH : TT_CHANGE_GONE) : (b ? TT_CHANGE_NEW : TT_CHANGE_ABSENT);
    out->q_value = NAN;
    if (n1 == 0 || n2 == 0 || a > n1 || b > n2) {
        out->base_rate_per_10k = out->target_rate_per_10k = out->rate_change_per_10k = NAN;
        out->percent_change = out->g2 = out->signed_g2 = out->p_value = out->log_ratio = NAN;
        out->direction = 0;
        if (n1 == 0 || n2 == 0)
            return tt_error_set(err, TT_EINVAL, NULL, -1, "the %s side has no words",
                                n1 == 0 ? "base" : "target");
        return tt_error_set(err, TT_EINVAL, NULL, -1, "a term count exceeds its side's word count");
    }
    long double mag;
    int s = cross_diff(a, n1, b, n2, &mag); /* sign of a·n2 − b·n1 */
    out->direction = -s;
    out->base_rate_per_10k = tt_rate_per_10k(a, n1);
    out->target_rate_per_10k = tt_rate_per_10k(b, n2);
    /* 10⁴(b/n2 − a/n1) = 10⁴(b·n1 − a·n2)/(n1·n2), the difference exact. */
    long double diff = (s > 0 ? -mag : mag);
    out->rate_change_per_10k = (double)(10000.0L * diff / ((long double)n1 * (long double)n2));
    out->percent_change = out->kind == TT_CHANGE_BOTH
                              ? (double)(100.0L * diff / ((long double)a * (long double)n2))
                              : NAN;
    out->g2 = tt_g2_2x2(a, n1, b, n2);
    out->signed_g2 = out->direction < 0 ? -out->g2 : out->direction > 0 ? out->g2 : 0.0;
    out->p_value = tt_chi2_sf(out->g2, 1.0);
    out->log_ratio = tt_log_ratio(b, n2, a, n1); /* target over base */
    return TT_OK;
}

/* ---------------------------------------------------------------------
 * r × c contingency tables
 * --------------------------------------------------------------------- */

tt_status tt_contingency_margins(const uint64_t *counts, size_t rows, size_t cols,
                                 uint64_t *row_totals, uint64_t *col_totals, uint64_t *total,
                                 tt_error *err)
{
    if (rows && cols && !counts)
        return tt_error_set(err, TT_EINVAL, NULL, -1, "no table");
    if (cols && rows > SIZE_MAX / cols)
        return tt_error_set(err, TT_EINVAL, NULL, -1, "table shape overflows");
    if (col_totals)
        for (size_t j = 0; j < cols; j++)
            col_totals[j] = 0;
    uint64_t grand = 0;
    for (size_t i = 0; i < rows; i++) {
        uint64_t r = 0;
        for (size_t j = 0; j < cols; j++) {
            uint64_t o = counts[i * cols + j];
            if (r > UINT64_MAX - o || (col_totals && col_totals[j] > UINT64_MAX - o))
                return tt_error_set(err, TT_EINVAL, NULL, -1, "table total overflows");
            r += o;
            if (col_totals)
                col_totals[j] += o;
        }
        if (grand > UINT64_MAX - r)
            return tt_error_set(err, TT_EINVAL, NULL, -1, "table total overflows");
        grand += r;
        if (row_totals)
            row_totals[i] = r;
    }
    if (total)
        *total = grand;
    return TT_OK;
}

tt_status tt_contingency_test(const uint64_t *counts, size_t rows, size_t cols, tt_contingency *out,
                              tt_error *err)
{
    out->total = 0;
    out->df = 0;
    out->g2 = out->chi2 = 0.0;
    out->g2_p_value = out->chi2_p_value = 1.0;
    if (rows == 0 || cols == 0)
        return tt_error_set(err, TT_EINVAL, NULL, -1,
                            "a contingency table needs a row and a column");
    if (rows > SIZE_MAX - cols)
        return tt_error_set(err, TT_EINVAL, NULL, -1, "table shape overflows");
    uint64_t *margins = tt_calloc(rows + cols, sizeof *margins);
    if (!margins)
        return tt_error_set(err, TT_ENOMEM, NULL, -1, "out of memory for table margins");
    uint64_t *row_tot = margins, *col_tot = margins + rows, N = 0;
    tt_status st = tt_contingency_margins(counts, rows, cols, row_tot, col_tot, &N, err);
    if (st)
        goto done;
    out->total = N;
    size_t live_rows = 0, live_cols = 0;
    for (size_t i = 0; i < rows; i++)
        live_rows += row_tot[i] != 0;
    for (size_t j = 0; j < cols; j++)
        live_cols += col_tot[j] != 0;
    if (live_rows < 2 || live_cols < 2)
        goto done; /* df = 0: statistics 0, p 1 */
    out->df = (live_rows - 1) * (live_cols - 1);
    long double g2 = 0.0L, chi2 = 0.0L, NN = (long double)N;
    for (size_t i = 0; i < rows; i++) {
        if (!row_tot[i])
            continue;
        long double R = (long double)row_tot[i];
        for (size_t j = 0; j < cols; j++) {
            if (!col_tot[j])
                continue;
            long double O = (long double)counts[i * cols + j];
            long double E = R * (long double)col_tot[j] / NN;
            long double dev = O - E;
            g2 += g2_cell(O, E, dev);
            chi2 += dev * dev / E;
        }
    }
    out->g2 = (double)(2.0L * g2);
    out->chi2 = (double)chi2;
    out->g2_p_value = tt_chi2_sf(out->g2, (double)out->df);
    out->chi2_p_value = tt_chi2_sf(out->chi2, (double)out->df);
done:
    tt_free(margins);
    return st;
}

/* ---------------------------------------------------------------------
 * Incomplete gamma and chi-square
 * --------------------------------------------------------------------- */

/* ln Γ(a) for a > 0 without touching the global signgam (threads). */
static long double log_gamma(long double a)
{
#if defined(__GLIBC__)
    int sign;
    return lgammal_r(a, &sign);
#else
    return lgammal(a);
#endif
}

/* x^a e^−x / Γ(a), as one exponential. */
static long double gamma_prefactor(long double a, long double x)
{
    return expl(a * logl(x) - x - log_gamma(a));
}

#define GAMMA_EPS LDBL_EPSILON
#define GAMMA_MAX_ITER 100000
#define LENTZ_TINY 1e-300L /* representable whatever long double is */

/* P(a, x) by the series Σ x^n / (a (a+1) ... (a+n)), for x < a + 1. */
static long double gamma_p_series(long double a, long double x)
{
    long double term = 1.0L / a, sum = term, ap = a;
    for (int i = 0; i < GAMMA_MAX_ITER; i++) {
        ap += 1.0L;
        term *= x / ap;
        sum += term;
        if (fabsl(term) < fabsl(sum) * GAMMA_EPS)
            break;
    }
    return sum * gamma_prefactor(a, x);
}

/* Q(a, x) by Legendre's continued fraction
 *   Q = prefactor · 1/(x+1−a− 1·(1−a)/(x+3−a− 2·(2−a)/(x+5−a− ...)))
 * evaluated forward by the modified Lentz method (Thompson & Barnett 1986),
 * for x >= a + 1 where it converges in a few dozen steps. */
static long double gamma_q_fraction(long double a, long double x)
{
    long double bn = x + 1.0L - a;
    long double c = 1.0L / LENTZ_TINY, d = 1.0L / bn, f = d;
    for (int i = 1; i < GAMMA_MAX_ITER; i++) {
        long double an = -(long double)i * ((long double)i - a);
        bn += 2.0L;
        d = an * d + bn;
        if (fabsl(d) < LENTZ_TINY)
            d = LENTZ_TINY;
        c = bn + an / c;
        if (fabsl(c) < LENTZ_TINY)
            c = LENTZ_TINY;
        d = 1.0L / d;
        long double delta = c * d;
        f *= delta;
        if (fabsl(delta - 1.0L) < GAMMA_EPS)
            break;
    }
    return f * gamma_prefactor(a, x);
}

static long double gamma_q_ld(long double a, long double x)
{
    if (x <= 0.0L)
        return 1.0L;
    if (isinf(x))
        return 0.0L;
    if (x < a + 1.0L) {
        long double q = 1.0L - gamma_p_series(a, x);
        return q < 0.0L ? 0.0L : q;
    }
    return gamma_q_fraction(a, x);
}

double tt_gamma_q(double a, double x)
{
    if (isnan(a) || isnan(x) || a <= 0.0 || isinf(a) || x < 0.0)
        return NAN;
    return (double)gamma_q_ld(a, x);
}

double tt_chi2_sf(double x, double df)
{
    if (isnan(x) || isnan(df) || df <= 0.0 || isinf(df))
        return NAN;
    if (x <= 0.0)
        return 1.0;
    if (isinf(x))
        return 0.0;
    if (df == 1.0) {
        /* erfc(√(x/2)), with the rounding of the square root put back: for
         * z = fl(√h), the residual r = h − z² is exact by fma, √h ≈ z + r/(2z),
         * and erfc(z + δ) ≈ erfc(z) − (2/√π) e^{−z²} δ. Without it the p-value
         * would carry a relative error of about x·eps in the far tail. */
        double h = 0.5 * x, z = sqrt(h), r = fma(-z, z, h);
        double p = erfc(z);
        if (z > 0.0)
            p -= 1.1283791670955126 * exp(-h) * (r / (2.0 * z));
        return p;
    }
    if (df == 2.0)
        return (double)expl(-(long double)x / 2.0L);
    return (double)gamma_q_ld((long double)df / 2.0L, (long double)x / 2.0L);
}

/* ---------------------------------------------------------------------
 * Benjamini–Hochberg (1995)
 * --------------------------------------------------------------------- */

typedef struct ranked_p {
    uint64_t key; /* the bits of p: for 0 <= p <= 1 they order as p does */
    size_t index;
} ranked_p;

/* Sorts by key, ties kept in input order, by a least-significant-digit radix
 * sort on the 8 bytes of the key (passes whose byte is the same for every
 * entry are skipped; p-values share their top byte). O(m), against O(m log m)
 * comparator calls of qsort: a million rows rank in about 30 ms. tmp holds m
 * entries. Returns the array holding the result (r or tmp). */
static ranked_p *radix_sort(ranked_p *r, ranked_p *tmp, size_t m)
{
    static const size_t buckets = 256;
    size_t hist[8][256] = {{0}};
    for (size_t i = 0; i < m; i++)
        for (int b = 0; b < 8; b++)
            hist[b][(r[i].key >> (8 * b)) & 0xffu]++;
    for (int b = 0; b < 8; b++) {
        if (hist[b][(r[0].key >> (8 * b)) & 0xffu] == m)
            continue; /* this byte is the same everywhere */
        size_t pos = 0;
        for (size_t v = 0; v < buckets; v++) {
            size_t c = hist[b][v];
            hist[b][v] = pos;
            pos += c;
        }
        for (size_t i = 0; i < m; i++)
            tmp[hist[b][(r[i].key >> (8 * b)) & 0xffu]++] = r[i];
        ranked_p *t = r;
        r = tmp;
        tmp = t;
    }
    return r;
}

/* The step-up procedure of Benjamini & Hochberg (1995) as adjusted p-values:
 * q(i) = min_{k >= i} m·p(k)/k, capped at 1, a running minimum from the
 * largest p down. p and q are read and written with a stride in bytes, so
 * the same code serves a plain array and the p_value / q_value fields of
 * change rows. */
static tt_status bh_strided(const char *p, char *q, size_t stride, size_t m, tt_error *err)
{
    if (m == 0)
        return TT_OK;
    for (size_t i = 0; i < m; i++) {
        double v;
        memcpy(&v, p + i * stride, sizeof v);
        if (!(v >= 0.0 && v <= 1.0))
            return tt_error_set(err, TT_EINVAL, NULL, -1, "p-value %zu is not in [0, 1]", i + 1);
    }
    ranked_p *buf = m <= SIZE_MAX / 2 ? tt_reallocarray(NULL, 2 * m, sizeof *buf) : NULL;
    if (!buf)
        return tt_error_set(err, TT_ENOMEM, NULL, -1, "out of memory ranking %zu p-values", m);
    for (size_t i = 0; i < m; i++) {
        double v;
        memcpy(&v, p + i * stride, sizeof v);
        v += 0.0; /* −0 → +0, so its bits sort first */
        memcpy(&buf[i].key, &v, sizeof v);
        buf[i].index = i;
    }
    ranked_p *r = radix_sort(buf, buf + m, m);
    double running = 1.0, md = (double)m;
    for (size_t k = m; k-- > 0;) {
        double v;
        memcpy(&v, &r[k].key, sizeof v);
        double adj = v * md / (double)(k + 1);
        if (adj < running)
            running = adj;
        memcpy(q + r[k].index * stride, &running, sizeof running);
    }
    tt_free(buf);
    return TT_OK;
}

tt_status tt_bh_q_values(const double *p, size_t m, double *q, tt_error *err)
{
    return bh_strided((const char *)p, (char *)q, sizeof(double), m, err);
}

tt_status tt_change_q_values(tt_change *rows, size_t n, tt_error *err)
{
    if (n == 0)
        return TT_OK;
    return bh_strided((const char *)&rows[0].p_value, (char *)&rows[0].q_value, sizeof(tt_change),
                      n, err);
}
