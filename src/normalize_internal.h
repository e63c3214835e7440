/* termtide — the part of the normalize stage that the counting hot path
 * shares (tier `tti_`): where the term lies inside a folded token. Kept in
 * one place so that tt_normalize and the token cache of count.c cannot
 * disagree about it. */
#ifndef TT_NORMALIZE_INTERNAL_H
#define TT_NORMALIZE_INTERNAL_H

#include <stddef.h>

static inline int tti_is_term_edge(unsigned char c) { return c == '\'' || c == '-'; }

/* Finds the term inside s[0, len), a token already folded (lowercased, its
 * apostrophe and dash variants mapped to '\'' and '-'): leading and trailing
 * apostrophes and hyphens stripped, then a final possessive "'s" dropped
 * (with any edges it uncovers). The term is s[*start, *end). */
static inline void tti_term_bounds(const unsigned char *s, size_t len, size_t *start,
                                   size_t *end)
{
    size_t a = 0, b = len;
    while (a < b && tti_is_term_edge(s[a]))
        a++;
    while (b > a && tti_is_term_edge(s[b - 1]))
        b--;
    /* "'s" needs something before it: a lone "s" left by "'s" is kept. */
    if (b - a > 2 && s[b - 1] == 's' && s[b - 2] == '\'') {
        b -= 2;
        while (b > a && tti_is_term_edge(s[b - 1]))
            b--;
    }
    *start = a;
    *end = b;
}

#endif
