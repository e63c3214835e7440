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
} tt_tone_scores;

/* Allocates the per-category arrays for lex (zeroed). TT_ENOMEM. */
tt_status tt_tone_scores_init(tt_tone_scores *s, const tt_lexicon *lex);
void tt_tone_scores_release(tt_tone_scores *s);
void tt_tone_scores_reset(tt_tone_scores *s);

typedef struct tt_tone tt_tone;

/* A scorer (one per thread). NULL when out of memory. Free with
 * tt_tone_free(). */
tt_tone *tt_tone_new(const tt_tone_options *opt);
void tt_tone_free(tt_tone *t);

/* Adds the matches of every block to *s. TT_ENOMEM. */
tt_status tt_tone_score_blocks(tt_tone *t, const tt_blocks *blocks, tt_tone_scores *s);
/* The same over one run of text as a single block. */
tt_status tt_tone_score_text(tt_tone *t, const char *text, size_t len, tt_tone_scores *s);

/* Net tone (positive − negative) / (positive + negative) from the weights
 * of the two categories; NaN when both are 0 or a category is missing. */
double tt_tone_net(const tt_tone_scores *s, long positive, long negative);

#endif
