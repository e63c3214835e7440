/* termtide — describing chosen terms' distribution over units (documents, or
 * periods pooling their documents): the per-unit rate per 10,000 words, its
 * descriptive statistics (tt_summary), chosen percentiles, where the latest
 * unit sits against the earlier ones, and the correlation of the terms' rate
 * series.
 *
 * Memory: only the chosen terms' counts and each unit's words are kept
 * (units × terms integers); documents stream through the batch runner and
 * are dropped once their counts are read. */
#ifndef TT_DESCRIBE_H
#define TT_DESCRIBE_H

#include <stddef.h>
#include <stdint.h>

#include "termtide/buf.h"
#include "termtide/count.h"
#include "termtide/stats.h"
#include "termtide/status.h"
#include "termtide/termtable.h"

/* Most terms one description takes (TT_ELIMIT beyond): the correlation
 * matrix grows with the square of the list. */
#define TT_DESCRIBE_MAX_TERMS 256

/* Most percentiles asked for at once (TT_ELIMIT beyond). */
#define TT_DESCRIBE_MAX_PERCENTILES 64

/* Normalizes a term as written by a user the way counted terms are, with the
 * same count options (case folding, NFKC, stemming, n-grams): text is counted
 * as one block and the n-gram covering every word read is kept. Writes the
 * term into out (reset first). Fails with TT_EINVAL and a message when the
 * text yields no counted term (empty, a stop-word, a number without
 * --numbers, too short), or holds more words than opt->ngram_max ("needs
 * --ngram N"); TT_ENOMEM. */
tt_status tt_describe_normalize_term(const tt_count_options *opt, const char *text, tt_buf *out,
                                     tt_error *err);

/* The counts of the chosen terms in each unit. Units are kept in the order
 * they were begun (the caller's period order or input order). */
typedef struct tt_describe_data {
    size_t n_terms;
    char **terms;       /* normalized terms, owned, NUL-terminated */
    size_t *term_lens;
    size_t n_units;
    char **labels;      /* per unit: document name or period, owned */
    uint64_t *words;    /* per unit: terms counted after filters */
    uint64_t *counts;   /* n_units × n_terms, row-major: counts[u · n_terms + t] */
    /* private */
    size_t cap;
} tt_describe_data;

void tt_describe_data_init(tt_describe_data *d);
/* Frees everything; d is left initialised (empty). */
void tt_describe_data_release(tt_describe_data *d);
void tt_describe_data_clear(tt_describe_data *d);

/* Adds a (normalized) term; a term already listed is ignored. Only before
 * the first unit (TT_EINVAL after). TT_ELIMIT past TT_DESCRIBE_MAX_TERMS;
 * TT_ENOMEM. */
tt_status tt_describe_add_term(tt_describe_data *d, const char *term, size_t len, tt_error *err);

/* Starts a new unit labelled label (copied) with zero counts. TT_ENOMEM. */
tt_status tt_describe_begin_unit(tt_describe_data *d, const char *label, tt_error *err);

/* Adds one document's counts of the chosen terms and its words (the table's
 * total) to the current unit. TT_EINVAL when no unit was begun or a total
 * would overflow. The table is only read. */
tt_status tt_describe_add_table(tt_describe_data *d, const tt_termtable *table, tt_error *err);

/* The rates per 10,000 words of term t over the units that have words, in
 * unit order, into rates (room for n_units values); returns how many. Units
 * without words have no rate and are left out (the same units for every
 * term, so series stay aligned). unit_index, when not NULL, receives the
 * unit of each rate. */
size_t tt_describe_rates(const tt_describe_data *d, size_t t, double *rates, size_t *unit_index);

/* Units that have no words (left out of every statistic). */
size_t tt_describe_empty_units(const tt_describe_data *d);

/* One term's description. */
typedef struct tt_describe_result {
    tt_summary summary;    /* over the rates of the units with words */
    uint64_t total_count;  /* the term's count over every unit */
    uint64_t total_words;  /* words over every unit */
    size_t n_percentiles;
    double percentiles[TT_DESCRIBE_MAX_PERCENTILES]; /* tt_percentile_sorted, in the order
                                                        asked */
    /* The latest unit (the last with words) against the earlier ones. */
    size_t latest_unit;    /* index into labels; meaningful when summary.n >= 1 */
    double latest_rate;
    size_t n_earlier;      /* summary.n − 1 */
    double latest_percentile_rank; /* tt_percentile_rank against the earlier rates
                                      (SciPy percentileofscore kind="mean"); NaN with none */
    double latest_z;       /* tt_z_score against the earlier rates (their mean and sample
                              sd); NaN with fewer than 2 earlier or a constant history */
} tt_describe_result;

/* Describes term t: its rates over the units with words, the summary with
 * the total trim trim_percent (0 <= trim < 100; 10 → 5% from each tail), the
 * percentiles pcts[0..n_pcts) (each in [0, 100], Hyndman & Fan type 6) and
 * the latest unit's place. Every unit without words is left out; with no
 * unit left, summary.n is 0 and every statistic NaN (not an error: the
 * caller reports it). TT_EINVAL for a bad trim, a percentile outside [0,
 * 100] or t out of range; TT_ELIMIT for too many percentiles; TT_ENOMEM. */
tt_status tt_describe_term(const tt_describe_data *d, size_t t, double trim_percent,
                           const double *pcts, size_t n_pcts, tt_describe_result *out,
                           tt_error *err);

/* The n_terms × n_terms Pearson correlation matrix of the terms' rate
 * series over the units with words, row-major, into out (the caller's,
 * n_terms² values); NaN for a constant series or fewer than two units.
 * TT_ENOMEM. */
tt_status tt_describe_correlation(const tt_describe_data *d, double *out, tt_error *err);

/* Parses a comma-separated list of percentiles ("5,95", "2.5, 50 ,97.5")
 * into out (room for max values); each in [0, 100]. Returns the count, or 0
 * with a message in err (TT_EINVAL; TT_ELIMIT past max). */
size_t tt_describe_parse_percentiles(const char *text, double *out, size_t max, tt_error *err);

#endif
