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
} tti_rule;

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
    int jit;
    tt_sha256 hash;
    char sha256[65];
};

#endif
