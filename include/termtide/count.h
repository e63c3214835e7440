/* termtide — counting one document: blocks of text → tokens → normalized,
 * filtered (stop-words, numbers, minimum length), optionally stemmed terms
 * or n-grams → a term table. */
#ifndef TT_COUNT_H
#define TT_COUNT_H

#include <stddef.h>
#include <stdint.h>
#include "termtide/extract.h"
#include "termtide/status.h"
#include "termtide/termtable.h"

typedef struct tt_count_options {
    int ngram_min, ngram_max;       /* 1..3, default 1..1 */
    int stem;                       /* Snowball English (Porter2) */
    int keep_numbers;               /* count number tokens as terms */
    size_t min_length;              /* in code points, default 1 */
    const tt_termtable *stopwords;  /* read-only set, may be shared across
                                       threads; NULL: no stop-words */
} tt_count_options;

/* Defaults: unigrams, no stemming, numbers left out, min length 1, no list. */
void tt_count_options_init(tt_count_options *o);

typedef struct tt_doc_stats {
    uint64_t words_read;   /* every token read: words and numbers */
    uint64_t numbers;      /* number tokens (2025, 1,200.50, 3.5) */
    uint64_t stopwords;    /* word tokens matched by the stop-word lists */
    uint64_t short_words;  /* word tokens under the minimum length */
    uint64_t terms_kept;   /* terms (or n-grams) counted: the table's total */
    uint64_t overlong;     /* tokens over TT_LIMIT_TOKEN_BYTES, skipped */
    uint64_t sentences;    /* sentences seen (first token of each) */
} tt_doc_stats;

/* Per-thread counting state (normalizer, stemmer, scratch buffers). */
typedef struct tt_counter tt_counter;

/* Returns a counter using a copy of *opt (the stop-word set is borrowed and
 * must outlive the counter), or NULL when out of memory or an option is out
 * of range. The caller frees it with tt_counter_free(). */
tt_counter *tt_counter_new(const tt_count_options *opt);
void tt_counter_free(tt_counter *c);

/* Counts every block into table (added to what it holds) and adds to
 * *stats. N-grams never cross a block or sentence boundary, never start or
 * end with a stop-word or a too-short word, and a left-out number breaks
 * them; stop-words inside an n-gram are kept ("cost of revenue"). Terms of
 * an n-gram are joined by one space. TT_ENOMEM or TT_ELIMIT (too many
 * distinct terms) on failure. */
tt_status tt_counter_count(tt_counter *c, const tt_blocks *blocks,
                           tt_termtable *table, tt_doc_stats *stats);

/* Same over one run of text treated as a single block. */
tt_status tt_counter_count_text(tt_counter *c, const char *text, size_t len,
                                tt_termtable *table, tt_doc_stats *stats);

/* Frequency distribution of terms by count class. Classes run 1, 2–4, 5–9,
 * 10–19, 20–49, 50–99, 100–199, ... (a 1-2-5 series of lower edges); a value
 * on a class edge goes to the higher class (common practice), i.e. each
 * class is [lower, next lower). */
typedef struct tt_count_class {
    uint64_t lower, upper;   /* inclusive bounds; upper == UINT64_MAX: open */
    uint64_t terms;          /* distinct terms whose count falls in the class */
    uint64_t occurrences;    /* sum of their counts */
} tt_count_class;

/* Fills classes (up to max) for the given sorted entries; returns how many
 * classes were written, from the class of 1 to the class of the largest
 * count (empty classes between are included, so the table reads as a
 * distribution). */
size_t tt_count_classes(const tt_term_entry *entries, size_t n,
                        tt_count_class *classes, size_t max);

#endif
