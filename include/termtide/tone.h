/* termtide — tone: counting the words of a document by lexicon category,
 * with negation.
 *
 * Every word token is normalized as the counter does; a word matches the
 * lexicon as a word, by its Snowball English stem (when the lexicon has stem
 * entries) and as the last word of any lexicon phrase, phrases never
 * crossing a sentence or block boundary. A match in the positive category
 * preceded within `window` words of the same sentence by a negator counts
 * in the negative category instead (Loughran & McDonald 2011 treat such a
 * word as not positive; counting it as negative is a common variant, and is
 * what termtide does). Numbers are not words here. */
#ifndef TT_TONE_H
#define TT_TONE_H

#include <stddef.h>
#include <stdint.h>
#include "termtide/buf.h"
#include "termtide/extract.h"
#include "termtide/lexicon.h"
#include "termtide/status.h"

typedef struct tt_tone_options {
    const tt_lexicon *lexicon;   /* borrowed; must outlive the scorer */
    long positive, negative;     /* category indices, -1: no negation rule */
    size_t window;               /* words before a positive term, default 3 */
    const char *const *negators; /* NULL: no, not, none, neither, never, nobody */
    size_t n_negators;
} tt_tone_options;

/* Defaults for lex: the categories named "positive" and "negative" (when
 * present), window 3, the six negators. */
void tt_tone_options_init(tt_tone_options *o, const tt_lexicon *lex);

/* Per-category results of one document (or a sum of documents). */
typedef struct tt_tone_scores {
    size_t n_categories;
    uint64_t words;      /* word tokens read */
    double *weight;      /* per category: sum of matched entries' weights */
    uint64_t *matches;   /* per category: matches counted */
    uint64_t negated;    /* positive matches turned negative */
    size_t n_entries;    /* the lexicon's entries */
    uint64_t *entry_hits;    /* per entry: matches counted in its category */
    uint64_t *entry_negated; /* per entry: matches turned negative */
} tt_tone_scores;

/* Allocates the per-category and per-entry arrays for lex (zeroed).
 * TT_ENOMEM. */
tt_status tt_tone_scores_init(tt_tone_scores *s, const tt_lexicon *lex);
void tt_tone_scores_release(tt_tone_scores *s);
void tt_tone_scores_reset(tt_tone_scores *s);
/* dst += src. TT_EINVAL when they were made for different lexicons. */
tt_status tt_tone_scores_add(tt_tone_scores *dst, const tt_tone_scores *src);

/* Appends s to out in a compact binary form (only entries with matches),
 * to pass scores between threads of one process. TT_ENOMEM, TT_ELIMIT. */
tt_status tt_tone_scores_pack(const tt_tone_scores *s, tt_buf *out);
/* Adds the scores packed at *data (len bytes left) to dst and advances
 * *data and *len past them. TT_EINVAL when the bytes are not a packing of
 * scores for dst's lexicon. */
tt_status tt_tone_scores_add_packed(tt_tone_scores *dst, const char **data, size_t *len);

/* One lexicon entry's part in a category's weight. */
typedef struct tt_tone_contribution {
    size_t entry;       /* index in the lexicon */
    int negated;        /* 1: a positive entry counted here by negation */
    uint64_t matches;
    double weight;      /* matches × the entry's weight */
} tt_tone_contribution;

/* The entries that added most weight to `category`, heaviest first (ties:
 * more matches, then the term's bytes, then not negated first): up to k into
 * out, their number in *n. When category == negative, positive entries
 * turned negative by the negation rule are candidates too (negated = 1).
 * TT_ENOMEM. */
tt_status tt_tone_top(const tt_tone_scores *s, const tt_lexicon *lex, size_t category,
                      long negative, tt_tone_contribution *out, size_t k, size_t *n);

typedef struct tt_tone tt_tone;

/* A scorer (one per thread). NULL when out of memory. Free with
 * tt_tone_free(). */
tt_tone *tt_tone_new(const tt_tone_options *opt);
void tt_tone_free(tt_tone *t);

/* Adds the matches of every block to *s. TT_ENOMEM. */
tt_status tt_tone_score_blocks(tt_tone *t, const tt_blocks *blocks, tt_tone_scores *s);
/* The same over one run of text as a single block. */
tt_status tt_tone_score_text(tt_tone *t, const char *text, size_t len, tt_tone_scores *s);

/* Calls fn once per sentence of one block of text (sentences as the
 * segment stage ends them), in order, with the sentence's byte range in
 * text (from its first token to the next sentence's first token or the end)
 * and its scores alone (valid during the call). A non-OK from fn stops the
 * walk and is returned; else TT_OK or TT_ENOMEM. */
typedef tt_status (*tt_tone_sentence_fn)(void *ctx, size_t off, size_t len,
                                         const tt_tone_scores *s);
tt_status tt_tone_score_sentences(tt_tone *t, const char *text, size_t len,
                                  tt_tone_sentence_fn fn, void *ctx);

/* Net tone (positive − negative) / (positive + negative) from the weights
 * of the two categories; NaN when both are 0 or a category is missing. */
double tt_tone_net(const tt_tone_scores *s, long positive, long negative);

#endif
