/* termtide — describing chosen terms over units (documents or periods).
 *
 * Design. The question is "is this document's (or quarter's) rate of a term
 * unusual against the others": the sample is one rate per unit, small (tens
 * to thousands of values), so the data kept is a units × terms matrix of
 * counts plus each unit's words, filled one document at a time from the
 * batch runner; nothing else of a document survives its callback. A unit
 * without words has no rate (never a division by zero): it is left out of
 * every statistic, for every term alike, so the terms' series stay aligned
 * for correlation. All statistics come from stats.c (tt_summary,
 * tt_percentile_sorted, tt_percentile_rank, tt_z_score, tt_pearson): this
 * file only arranges the series.
 *
 * A term typed by the user is normalized by counting it with the very
 * counter options the documents are counted with, so "Covenants" with
 * --stem finds the stem the tables hold, and a multi-word term is the n-gram
 * spanning all its words. */
#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "tt_internal.h"
#include "termtide/alloc.h"
#include "termtide/describe.h"

/* ---- normalizing a user's term ------------------------------------------ */

typedef struct longest_ctx {
    const char *best; /* owned by the table; the entry itself is transient */
    size_t best_len;
    size_t best_words;
    size_t ties;
} longest_ctx;

static size_t words_in(const char *s, size_t len)
{
    size_t n = 1;
    for (size_t i = 0; i < len; i++)
        n += s[i] == ' ';
    return n;
}

static int pick_longest(void *vctx, const tt_term_entry *e)
{
    longest_ctx *c = vctx;
    size_t w = words_in(e->term, e->len);
    if (!c->best || w > c->best_words) {
        c->best = e->term;
        c->best_len = e->len;
        c->best_words = w;
        c->ties = 0;
    } else if (w == c->best_words) {
        c->ties++;
    }
    return 0;
}

tt_status tt_describe_normalize_term(const tt_count_options *opt, const char *text, tt_buf *out,
                                     tt_error *err)
{
    tt_buf_reset(out);
    tt_counter *counter = tt_counter_new(opt);
    tt_termtable *t = tt_termtable_new();
    tt_status st = TT_OK;
    if (!counter || !t) {
        st = tt_error_set(err, TT_ENOMEM, NULL, -1, "out of memory");
        goto done;
    }
    tt_doc_stats stats;
    memset(&stats, 0, sizeof stats);
    st = tt_counter_count_text(counter, text, strlen(text), t, &stats);
    if (st) {
        tt_error_set(err, st, NULL, -1, "term \"%s\": %s", text, tt_status_name(st));
        goto done;
    }
    longest_ctx lc = { NULL, 0, 0, 0 };
    tt_termtable_foreach(t, pick_longest, &lc);
    int ngram_max = opt->ngram_max > 0 ? opt->ngram_max : 1;
    if (!lc.best) {
        st = tt_error_set(err, TT_EINVAL, NULL, -1,
                          "term \"%s\" is never counted with these options (a stop-word, a "
                          "number without --numbers, or shorter than --min-length)",
                          text);
    } else if (stats.words_read > (uint64_t)ngram_max) {
        st = tt_error_set(err, TT_EINVAL, NULL, -1,
                          "term \"%s\" has %llu words: it needs --ngram %llu", text,
                          (unsigned long long)stats.words_read,
                          (unsigned long long)stats.words_read);
    } else if (lc.ties || lc.best_words != stats.words_read) {
        /* a word inside was left out (a number, a too-short word at an
         * edge), so no single counted term spans the text */
        st = tt_error_set(err, TT_EINVAL, NULL, -1,
                          "term \"%s\" is never counted whole with these options (a word in "
                          "it is left out)",
                          text);
    } else {
        st = tt_buf_append(out, lc.best, lc.best_len);
        if (st)
            tt_error_set(err, st, NULL, -1, "out of memory");
    }
done:
    tt_termtable_free(t);
    tt_counter_free(counter);
    return st;
}

/* ---- the data ------------------------------------------------------------ */

void tt_describe_data_init(tt_describe_data *d)
{
    memset(d, 0, sizeof *d);
}

void tt_describe_data_release(tt_describe_data *d)
{
    for (size_t i = 0; i < d->n_terms; i++)
        tt_free(d->terms[i]);
    for (size_t u = 0; u < d->n_units; u++)
        tt_free(d->labels[u]);
    tt_free(d->terms);
    tt_free(d->term_lens);
    tt_free(d->labels);
    tt_free(d->words);
    tt_free(d->counts);
    tt_describe_data_init(d);
}

void tt_describe_data_clear(tt_describe_data *d)
{
    tt_describe_data_release(d);
}

tt_status tt_describe_add_term(tt_describe_data *d, const char *term, size_t len, tt_error *err)
{
    if (d->n_units)
        return tt_error_set(err, TT_EINVAL, NULL, -1, "terms must be added before units");
    for (size_t i = 0; i < d->n_terms; i++)
        if (d->term_lens[i] == len && !memcmp(d->terms[i], term, len))
            return TT_OK;
    if (d->n_terms >= TT_DESCRIBE_MAX_TERMS)
        return tt_error_set(err, TT_ELIMIT, NULL, -1, "more than %d terms",
                            TT_DESCRIBE_MAX_TERMS);
    char **terms = tt_reallocarray(d->terms, d->n_terms + 1, sizeof *terms);
    if (!terms)
        return tt_error_set(err, TT_ENOMEM, NULL, -1, "out of memory");
    d->terms = terms;
    size_t *lens = tt_reallocarray(d->term_lens, d->n_terms + 1, sizeof *lens);
    if (!lens)
        return tt_error_set(err, TT_ENOMEM, NULL, -1, "out of memory");
    d->term_lens = lens;
    char *copy = tt_strndup(term, len);
    if (!copy)
        return tt_error_set(err, TT_ENOMEM, NULL, -1, "out of memory");
    d->terms[d->n_terms] = copy;
    d->term_lens[d->n_terms] = len;
    d->n_terms++;
    return TT_OK;
}

tt_status tt_describe_begin_unit(tt_describe_data *d, const char *label, tt_error *err)
{
    if (d->n_units == d->cap) {
        size_t cap = d->cap ? 2 * d->cap : 16;
        size_t nt = d->n_terms ? d->n_terms : 1;
        if (cap > SIZE_MAX / nt / sizeof(uint64_t))
            return tt_error_set(err, TT_ENOMEM, NULL, -1, "out of memory");
        char **labels = tt_reallocarray(d->labels, cap, sizeof *labels);
        if (!labels)
            return tt_error_set(err, TT_ENOMEM, NULL, -1, "out of memory");
        d->labels = labels;
        uint64_t *words = tt_reallocarray(d->words, cap, sizeof *words);
        if (!words)
            return tt_error_set(err, TT_ENOMEM, NULL, -1, "out of memory");
        d->words = words;
        uint64_t *counts = tt_reallocarray(d->counts, cap * nt, sizeof *counts);
        if (!counts)
            return tt_error_set(err, TT_ENOMEM, NULL, -1, "out of memory");
        d->counts = counts;
        d->cap = cap;
    }
    char *copy = tt_strdup(label ? label : "");
    if (!copy)
        return tt_error_set(err, TT_ENOMEM, NULL, -1, "out of memory");
    size_t u = d->n_units++;
    d->labels[u] = copy;
    d->words[u] = 0;
    for (size_t t = 0; t < d->n_terms; t++)
        d->counts[u * d->n_terms + t] = 0;
    return TT_OK;
}

tt_status tt_describe_add_table(tt_describe_data *d, const tt_termtable *table, tt_error *err)
{
    if (!d->n_units)
        return tt_error_set(err, TT_EINVAL, NULL, -1, "no unit begun");
    size_t u = d->n_units - 1;
    uint64_t total = tt_termtable_total(table);
    if (d->words[u] > UINT64_MAX - total)
        return tt_error_set(err, TT_EINVAL, NULL, -1, "word total overflows");
    d->words[u] += total;
    for (size_t t = 0; t < d->n_terms; t++)
        d->counts[u * d->n_terms + t] += tt_termtable_get(table, d->terms[t], d->term_lens[t]);
    return TT_OK;
}

size_t tt_describe_rates(const tt_describe_data *d, size_t t, double *rates, size_t *unit_index)
{
    size_t k = 0;
    for (size_t u = 0; u < d->n_units; u++) {
        if (d->words[u] == 0)
            continue;
        rates[k] = tt_rate_per_10k(d->counts[u * d->n_terms + t], d->words[u]);
        if (unit_index)
            unit_index[k] = u;
        k++;
    }
    return k;
}

size_t tt_describe_empty_units(const tt_describe_data *d)
{
    size_t n = 0;
    for (size_t u = 0; u < d->n_units; u++)
        n += d->words[u] == 0;
    return n;
}

/* ---- statistics ---------------------------------------------------------- */

tt_status tt_describe_term(const tt_describe_data *d, size_t t, double trim_percent,
                           const double *pcts, size_t n_pcts, tt_describe_result *out,
                           tt_error *err)
{
    memset(out, 0, sizeof *out);
    if (t >= d->n_terms)
        return tt_error_set(err, TT_EINVAL, NULL, -1, "no term %zu", t);
    if (n_pcts > TT_DESCRIBE_MAX_PERCENTILES)
        return tt_error_set(err, TT_ELIMIT, NULL, -1, "more than %d percentiles",
                            TT_DESCRIBE_MAX_PERCENTILES);
    for (size_t i = 0; i < n_pcts; i++)
        if (!(pcts[i] >= 0 && pcts[i] <= 100))
            return tt_error_set(err, TT_EINVAL, NULL, -1, "percentile %g is outside 0..100",
                                pcts[i]);
    if (!(trim_percent >= 0 && trim_percent < 100))
        return tt_error_set(err, TT_EINVAL, NULL, -1, "trim %g%% is outside 0..100",
                            trim_percent);
    size_t cap = d->n_units ? d->n_units : 1;
    double *rates = tt_reallocarray(NULL, cap, sizeof *rates);
    double *sorted = tt_reallocarray(NULL, cap, sizeof *sorted);
    size_t *units = tt_reallocarray(NULL, cap, sizeof *units);
    tt_status st = TT_OK;
    if (!rates || !sorted || !units) {
        st = tt_error_set(err, TT_ENOMEM, NULL, -1, "out of memory");
        goto done;
    }
    for (size_t u = 0; u < d->n_units; u++) {
        out->total_count += d->counts[u * d->n_terms + t];
        out->total_words += d->words[u];
    }
    size_t n = tt_describe_rates(d, t, rates, units);
    memcpy(sorted, rates, n * sizeof *rates);
    tt_sort_doubles(sorted, n);
    st = tt_summary_of_sorted(sorted, n, trim_percent, &out->summary, err);
    if (st)
        goto done;
    out->n_percentiles = n_pcts;
    for (size_t i = 0; i < n_pcts; i++)
        out->percentiles[i] = tt_percentile_sorted(sorted, n, pcts[i]);
    out->latest_rate = NAN;
    out->latest_percentile_rank = NAN;
    out->latest_z = NAN;
    if (n >= 1) {
        out->latest_unit = units[n - 1];
        out->latest_rate = rates[n - 1];
        out->n_earlier = n - 1;
        /* the earlier units only: the latest is judged against its past,
         * not against a sample that already holds it */
        out->latest_percentile_rank = tt_percentile_rank(rates, n - 1, rates[n - 1]);
        out->latest_z = tt_z_score(rates, n - 1, rates[n - 1]);
    }
done:
    tt_free(rates);
    tt_free(sorted);
    tt_free(units);
    return st;
}

tt_status tt_describe_correlation(const tt_describe_data *d, double *out, tt_error *err)
{
    size_t k = d->n_terms, cap = d->n_units ? d->n_units : 1;
    if (k == 0)
        return TT_OK;
    double *all = tt_reallocarray(NULL, k * cap, sizeof *all);
    const double **series = tt_reallocarray(NULL, k, sizeof *series);
    if (!all || !series) {
        tt_free(all);
        tt_free((void *)series);
        return tt_error_set(err, TT_ENOMEM, NULL, -1, "out of memory");
    }
    size_t n = 0;
    for (size_t t = 0; t < k; t++) {
        n = tt_describe_rates(d, t, all + t * cap, NULL);
        series[t] = all + t * cap;
    }
    tt_correlation_matrix(series, k, n, out);
    tt_free(all);
    tt_free((void *)series);
    return TT_OK;
}

size_t tt_describe_parse_percentiles(const char *text, double *out, size_t max, tt_error *err)
{
    size_t n = 0;
    const char *p = text;
    for (;;) {
        while (*p == ' ' || *p == '\t')
            p++;
        char *end;
        double v = strtod(p, &end);
        if (end == p || !(v >= 0 && v <= 100)) {
            tt_error_set(err, TT_EINVAL, NULL, -1,
                         "expected comma-separated percentiles from 0 to 100, got '%s'", text);
            return 0;
        }
        if (n >= max) {
            tt_error_set(err, TT_ELIMIT, NULL, -1, "more than %zu percentiles", max);
            return 0;
        }
        out[n++] = v;
        p = end;
        while (*p == ' ' || *p == '\t')
            p++;
        if (*p == '\0')
            return n;
        if (*p != ',') {
            tt_error_set(err, TT_EINVAL, NULL, -1,
                         "expected comma-separated percentiles from 0 to 100, got '%s'", text);
            return 0;
        }
        p++;
    }
}
