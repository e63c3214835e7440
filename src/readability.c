/* termtide — readability measures.
 *
 * One pass of the segment stage's tokenizer over each paragraph and list
 * item: sentences from its sentence starts, words from its word tokens,
 * syllables by the rule of tt_syllables (see readability.h), which works on
 * the word folded to lower-case Latin letters (accented vowels to their base
 * vowel, other letters to a consonant stand-in). O(bytes). The formulas:
 * Gunning (1952), Flesch (1948), Kincaid, Fishburne, Rogers & Chissom (1975),
 * with the constants as published. */
#include <math.h>

#include "termtide/readability.h"
#include "termtide/segment.h"
#include "tt_internal.h"

#define MAX_LETTERS 256

/* The word as lower-case letters, a part boundary as '-' (hyphens), the
 * possessive 's dropped; returns the length. */
static size_t fold(const char *word, size_t len, char *out)
{
    size_t n = 0;
    for (size_t i = 0; i < len && n < MAX_LETTERS - 1;) {
        uint32_t cp;
        size_t k = tti_utf8_decode((const unsigned char *)word + i, len - i, &cp);
        i += k;
        char c = 0;
        if (cp < 0x80) {
            if (cp >= 'A' && cp <= 'Z')
                c = (char)(cp + 32);
            else if (cp >= 'a' && cp <= 'z')
                c = (char)cp;
            else if (cp == '-')
                c = '-';
            else if (cp == '\'')
                c = '\'';
        } else if (cp == 0x2019 || cp == 0x2018) {
            c = '\'';
        } else if (cp == 0x2010 || cp == 0x2011) {
            c = '-';
        } else if ((cp >= 0xC0 && cp <= 0xFF) && cp != 0xD7 && cp != 0xF7) {
            uint32_t l = cp | 0x20; /* Latin-1: lower case */
            c = l >= 0xE0 && l <= 0xE6 ? 'a' : l >= 0xE8 && l <= 0xEB ? 'e'
                : l >= 0xEC && l <= 0xEF ? 'i' : l >= 0xF2 && l <= 0xF6 ? 'o'
                : l >= 0xF9 && l <= 0xFC ? 'u' : l == 0xFD || l == 0xFF ? 'y' : 'b';
        } else if (cp >= 0x100) {
            c = 'b'; /* another letter: a consonant stand-in */
        }
        if (c)
            out[n++] = c;
    }
    /* the possessive 's (or s') goes */
    if (n >= 2 && out[n - 2] == '\'' && out[n - 1] == 's')
        n -= 2;
    else if (n >= 1 && out[n - 1] == '\'')
        n -= 1;
    out[n] = '\0';
    return n;
}

static int is_vowel(const char *w, size_t i)
{
    char c = w[i];
    if (c == 'a' || c == 'e' || c == 'i' || c == 'o')
        return 1;
    if (c == 'u')
        return !(i > 0 && w[i - 1] == 'q');
    if (c == 'y')
        return i > 0;
    return 0;
}

static int in(char c, const char *set)
{
    return c && strchr(set, c) != NULL;
}

/* Syllables of one part (letters only, no hyphen). */
static unsigned part_syllables(const char *w, size_t n)
{
    unsigned count = 0;
    int letters = 0;
    for (size_t i = 0; i < n;) {
        if (w[i] >= 'a' && w[i] <= 'z')
            letters = 1;
        if (!is_vowel(w, i)) {
            i++;
            continue;
        }
        count++;
        size_t j = i + 1;
        while (j < n && is_vowel(w, j)) {
            /* vowel pairs spoken apart */
            char a = w[j - 1], b = w[j];
            char before = j >= 2 ? w[j - 2] : 0;
            if ((a == 'i' && b == 'a' && !in(before, "cgst")) ||
                (a == 'i' && b == 'o' && !in(before, "cgstx")) ||
                (a == 'u' && b == 'a' && !in(before, "gq")) || (a == 'u' && b == 'o') ||
                (a == 'i' && b == 'u') || (a == 'i' && b == 'i'))
                count++;
            j++;
        }
        i = j;
    }
    if (!letters)
        return 0;
    /* silent endings, each only while another syllable is left */
    if (count > 1 && n >= 2 && w[n - 1] == 'e' && !is_vowel(w, n - 2) &&
        !(w[n - 2] == 'l' && n >= 3 && !is_vowel(w, n - 3)))
        count--;
    else if (count > 1 && n >= 3 && w[n - 2] == 'e' && w[n - 1] == 's' && !is_vowel(w, n - 3) &&
             !in(w[n - 3], "cgsxz") &&
             !(n >= 4 && w[n - 3] == 'h' && (w[n - 4] == 'c' || w[n - 4] == 's')))
        count--;
    else if (count > 1 && n >= 3 && w[n - 2] == 'e' && w[n - 1] == 'd' && !is_vowel(w, n - 3) &&
             !in(w[n - 3], "dt"))
        count--;
    else if (count > 1 && n >= 4 && !memcmp(w + n - 3, "ely", 3) && !is_vowel(w, n - 4))
        count--;
    /* "-ement" after a consonant: the e of the stem is silent (statement),
     * except after a consonant and l (settlement) */
    if (count > 1 && n >= 6 && !memcmp(w + n - 5, "ement", 5) && !is_vowel(w, n - 6) &&
        !(w[n - 6] == 'l' && n >= 7 && !is_vowel(w, n - 7)))
        count--;
    /* "-ing" after a vowel is a syllable of its own (going, being) */
    if (n >= 4 && !memcmp(w + n - 3, "ing", 3) && is_vowel(w, n - 4))
        count++;
    return count ? count : 1;
}

unsigned tt_syllables(const char *word, size_t len)
{
    char w[MAX_LETTERS];
    size_t n = fold(word, len, w);
    unsigned total = 0;
    size_t start = 0;
    for (size_t i = 0; i <= n; i++) {
        if (i < n && w[i] != '-' && w[i] != '\'')
            continue;
        if (i > start)
            total += part_syllables(w + start, i - start);
        start = i + 1;
    }
    return total;
}

static int has_hyphen(const char *s, size_t n)
{
    for (size_t i = 0; i < n; i++)
        if (s[i] == '-' || (i + 2 < n && (unsigned char)s[i] == 0xE2 &&
                            (unsigned char)s[i + 1] == 0x80 &&
                            ((unsigned char)s[i + 2] == 0x90 || (unsigned char)s[i + 2] == 0x91)))
            return 1;
    return 0;
}

void tt_readability_add(tt_readability *r, const tt_blocks *b)
{
    for (size_t k = 0; k < b->n; k++) {
        if (b->items[k].kind != TT_BLOCK_PARAGRAPH && b->items[k].kind != TT_BLOCK_ITEM)
            continue;
        const char *text = b->text.data + b->items[k].off;
        tt_tokenizer t;
        tt_token tok;
        tt_tokenizer_init(&t, text, b->items[k].len);
        int sentence_has_words = 0;
        while (tt_tokenizer_next(&t, &tok)) {
            if (tok.sentence_start)
                sentence_has_words = 0;
            if (tok.kind != TT_TOKEN_WORD)
                continue;
            if (!sentence_has_words) {
                r->sentences++;
                sentence_has_words = 1;
            }
            const char *w = text + tok.off;
            unsigned syl = tt_syllables(w, tok.len);
            r->words++;
            r->syllables += syl;
            /* Gunning leaves out compounds and proper nouns: a hyphenated
             * word, or a capitalised one that does not start its sentence */
            int capital = w[0] >= 'A' && w[0] <= 'Z';
            if (syl >= 3 && !has_hyphen(w, tok.len) && !(capital && !tok.sentence_start))
                r->complex_words++;
        }
    }
}

void tt_readability_scores_of(const tt_readability *r, tt_readability_scores *out)
{
    if (!r->words || !r->sentences) {
        out->words_per_sentence = out->syllables_per_word = out->complex_share = NAN;
        out->fog = out->flesch = out->flesch_kincaid = NAN;
        return;
    }
    double wps = (double)r->words / (double)r->sentences;
    double spw = (double)r->syllables / (double)r->words;
    double cs = (double)r->complex_words / (double)r->words;
    out->words_per_sentence = wps;
    out->syllables_per_word = spw;
    out->complex_share = cs;
    out->fog = 0.4 * (wps + 100.0 * cs);                  /* Gunning (1952) */
    out->flesch = 206.835 - 1.015 * wps - 84.6 * spw;    /* Flesch (1948) */
    out->flesch_kincaid = 0.39 * wps + 11.8 * spw - 15.59; /* Kincaid et al. (1975) */
}
