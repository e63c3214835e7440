/* termtide — what watchlist.c and search.c share about a compiled
 * watch-list. Library-internal. */
#ifndef TT_SEARCH_INTERNAL_H
#define TT_SEARCH_INTERNAL_H

#define PCRE2_CODE_UNIT_WIDTH 8
#include <errno.h>
#include <stdarg.h>
#include <stdio.h>

#include <pcre2.h>

#include "termtide/search.h"
#include "termtide/sha256.h"
#include "tt_internal.h"

typedef struct tti_rule {
    tt_rule pub;
    pcre2_code *code;       /* the pattern (A of near), as matched */
    pcre2_code *code_b;     /* B of near(A, B, N), else NULL */
    size_t a_off, a_len;    /* the pattern (A of near) within pub.pattern */
    pcre2_code *anchored;   /* a scanned rule's pattern compiled anchored */
    int alternation_safe;   /* may take part in the prefilter */
    int fast;               /* starts with a known character: runs on its own */
    int whole_text;         /* fast, and runs over a document's whole text */
    int paired;             /* run by the pair scan (see tti_pair_rule) */
} tti_rule;

/* Steps of a rule's start that the pair scan checks before PCRE2 runs it,
 * and how many of its first bytes a table lookup checks. */
#define TTI_PAIR_STEPS 10
#define TTI_PAIR_MIN_RULES 3 /* fewer run on their own (see build_pairs) */
#define TTI_PAIR_FIXED 4 /* search.c's pair_try4 is written for 4 */

/* The character sets of steps: an ASCII character c (with its other case
 * when caseless) is set c, \s is TTI_PAIR_SPACE. */
#define TTI_PAIR_SPACE 128
#define TTI_PAIR_SETS 129

/* One step of a rule's start (see start_steps in watchlist.c): one
 * character of a set or, with run, one or more characters of \s. */
typedef struct tti_pair_step {
    unsigned char set;      /* 0 .. TTI_PAIR_SETS - 1 */
    unsigned char run;
} tti_pair_step;

/* A rule run by the pair scan: every match of it starts with its steps. */
typedef struct tti_pair_rule {
    size_t rule;            /* index in the watch-list; its anchored code runs it */
    size_t n_steps;         /* 1 .. TTI_PAIR_STEPS */
    size_t fixed;           /* leading steps, up to TTI_PAIR_FIXED, that are one
                               character each (no run among them) */
    tti_pair_step step[TTI_PAIR_STEPS];
} tti_pair_rule;

/* The scan's SIMD first look (search.c): a byte b may start a match when
 * b | 0x20 is one of first[0 .. TTI_PAIR_KEYS) or, with low, when b is
 * below 0x21 or above ASCII. Used when every first byte of pair_table fits
 * in that many keys. */
#define TTI_PAIR_KEYS 8

/* The scan's wide first look (search.c, with SSSE3 or AVX2): the pair
 * rules are put in TTI_PAIR_BUCKETS buckets (watchlist.c, build_print),
 * and a position may start a match of a rule of bucket b only when, for
 * each offset j < TTI_PAIR_PRINT from it while the bytes before offset j
 * are ASCII, the byte there has a low nibble l and a high nibble h with
 * bit b set in pair_print[j][0][l] and in pair_print[j][1][h]. */
#define TTI_PAIR_PRINT 6
#define TTI_PAIR_BUCKETS 8

struct tt_watchlist {
    tt_search_options opt;
    tti_rule *rules;
    size_t n, cap;
    tt_error *problems;
    size_t n_problems, problems_total;
    pcre2_general_context *gctx;
    pcre2_code *prefilter;  /* NULL: every rule runs on every block */
    /* Each rule is in one list; without a prefilter, always or whole: */
    size_t *always;         /* run on every block on its own */
    size_t n_always;
    size_t *scan;           /* patterns tried anchored where the prefilter matches */
    size_t n_scan;
    size_t *gated;          /* near() rules: run on blocks where it matches */
    size_t n_gated;
    /* Without or with a prefilter: */
    size_t *whole;          /* run once over a document's whole text */
    size_t n_whole;
    tti_pair_rule *pair;    /* run by the pair scan, in one pass per block */
    size_t n_pair;
    size_t pair_words;      /* 64-bit words of a set of pair rules */
    /* [set][b]: 0 when a character of the set cannot start with byte b, 1
     * when b is an ASCII member, 2 when a longer member starts with b */
    unsigned char *pair_sets;
    /* [j][b][pair_words]: the pair rules whose match can have byte b at
     * offset j < TTI_PAIR_FIXED when the bytes before it are ASCII; a rule
     * whose byte at offset j is not known is in every b */
    uint64_t *pair_at;
    /* [r][b][pair_words], b up to 256 (the block's end): for the rules whose
     * step at offset r (1 .. TTI_PAIR_FIXED - 1, the bytes before it
     * ASCII) is a \s+ run followed by a character, those whose character
     * can start with byte b; all other rules for every b */
    uint64_t *pair_after;
    uint64_t pair_run_rules; /* with one word of rules: those with such a run */
    unsigned char *pair_table; /* 64 KiB: non-zero when some rule can start with bytes
                                  b0 b1, at the 16 bits b0 b1 read from memory */
    int pair_simd;          /* the SIMD first look is used, with these: */
    int pair_low;
    unsigned char pair_first[TTI_PAIR_KEYS];
    unsigned char pair_print[TTI_PAIR_PRINT][2][16];
    int jit;
    tt_sha256 hash;
    char sha256[65];
};

#endif
