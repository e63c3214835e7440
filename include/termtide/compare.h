/* termtide — comparing two term tables (the measure stage behind
 * `termtide compare`): one row per term with its change statistics
 * (see stats.h), Benjamini–Hochberg q-values over the rows tested, a sort
 * order, and a summary with the two sides' similarity. */
#ifndef TT_COMPARE_H
#define TT_COMPARE_H

#include <stddef.h>
#include <stdint.h>
#include "termtide/stats.h"
#include "termtide/status.h"
#include "termtide/termtable.h"

typedef enum tt_compare_sort {
    TT_SORT_SIGNED_G2 = 0, /* signed G² descending: strongest rises first,
                              strongest falls last */
    TT_SORT_LOG_RATIO,     /* Log Ratio descending */
    TT_SORT_CHANGE         /* change of the rate per 10,000 words, descending */
} tt_compare_sort;

/* Parses "g2", "log-ratio", "change"; TT_EINVAL otherwise. */
tt_status tt_compare_sort_parse(const char *name, tt_compare_sort *out);

typedef struct tt_compare_options {
    uint64_t min_count;    /* rows with base + target count below this are not
                              tested (and get no q-value); default 1 */
    tt_compare_sort sort;
} tt_compare_options;

void tt_compare_options_init(tt_compare_options *o);

typedef struct tt_compare_row {
    const char *term;      /* owned by the side's table */
    size_t len;
    tt_change change;      /* q_value filled over all rows tested */
} tt_compare_row;

typedef struct tt_compare_result {
    tt_compare_row *rows;  /* sorted; ties by term bytewise */
    size_t n;
    uint64_t base_words, target_words;       /* terms counted on each side */
    size_t base_distinct, target_distinct;
    size_t new_terms, gone_terms;            /* among all terms, before min_count */
    double cosine, jaccard;                  /* of the two tables */
} tt_compare_result;

void tt_compare_result_init(tt_compare_result *r);
void tt_compare_result_release(tt_compare_result *r);

/* Compares base with target into out (released first). Each term of either
 * table with base + target count >= min_count gets a row: counts, rates per
 * 10,000 words, change, G² on the full 2×2 table with its p-value, Log Ratio
 * (zero counts replaced by 0.5), and the BH q-value over all rows. The rows
 * point at the tables' strings: keep both tables alive while out is used.
 * TT_EINVAL (with err) when a side has no words; TT_ENOMEM. O(V log V) for
 * V distinct terms on both sides. */
tt_status tt_compare_tables(const tt_termtable *base, const tt_termtable *target,
                            const tt_compare_options *opt, tt_compare_result *out,
                            tt_error *err);

#endif
