/* termtide — readability: sentences, words, syllables, and the Gunning Fog
 * index (Gunning 1952), Flesch reading ease (Flesch 1948) and the
 * Flesch–Kincaid grade (Kincaid et al. 1975).
 *
 * What counts, stated once:
 * - Text: paragraphs and list items. Headings and table cells are left out
 *   (a statement table is no prose; a heading is no sentence).
 * - Words: word tokens of the segment stage (UAX #29, hyphenated compounds
 *   one word); numbers are not words and have no syllables.
 * - Sentences: as the segment stage ends them (abbreviations of filings do
 *   not end one); each paragraph starts one.
 * - Syllables: a rule, not a dictionary (tt_syllables below).
 * - Complex words (Fog): three syllables or more, except hyphenated
 *   compounds and capitalised words inside a sentence (names), as Gunning
 *   leaves out compounds and proper nouns. */
#ifndef TT_READABILITY_H
#define TT_READABILITY_H

#include <stddef.h>
#include <stdint.h>
#include "termtide/extract.h"
#include "termtide/status.h"

/* Syllables of one word (UTF-8; letters compared without case): the groups
 * of vowels (a e i o u, y after the first letter, and the accented Latin
 * vowels), where "ia" (not after c, g, s, t), "io" (not after c, g, s, t,
 * x), "ua" (not after g, q), "uo", "iu", "eo" and "ii" count as two and a
 * 'u' after 'q' is no vowel; less one for a silent final "e" (not "le"
 * after a consonant, not "ee"), for "-es" not after c, g, s, x, z, ch, sh,
 * and for "-ed" not after d or t; at least 1 for a word with a letter, 0
 * for none. Common practice for English, not a dictionary: some words
 * come out one off (see the tests). */
unsigned tt_syllables(const char *word, size_t len);

typedef struct tt_readability {
    uint64_t sentences, words, syllables, complex_words;
} tt_readability;

/* Adds the paragraphs and list items of b to r. Never fails. */
void tt_readability_add(tt_readability *r, const tt_blocks *b);

/* The measures of r; NaN when there are no words or sentences. */
typedef struct tt_readability_scores {
    double words_per_sentence;
    double syllables_per_word;
    double complex_share;    /* complex words / words */
    double fog;              /* 0.4 × (words per sentence + 100 × complex share) */
    double flesch;           /* 206.835 − 1.015 × words per sentence − 84.6 × syllables per word */
    double flesch_kincaid;   /* 0.39 × words per sentence + 11.8 × syllables per word − 15.59 */
} tt_readability_scores;

void tt_readability_scores_of(const tt_readability *r, tt_readability_scores *out);

#endif
