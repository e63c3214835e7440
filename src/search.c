/* termtide — the search stage: a compiled watch-list run over a document's
 * blocks, hits mapped back to the source and given context, and the
 * threaded batch runner for search.
 *
 * Four ways to run a rule, chosen per rule by watchlist.c, all giving the
 * matches the rule gets over each block alone (the subject is the block's
 * text, so ^ and $ are its edges and nothing crosses into the next block):
 *  - pair scan: patterns whose start watchlist.c can read (literal
 *    characters, escaped punctuation, \s and \s+ runs, passing over \b),
 *    when there are three or more, share one pass over each block's bytes
 *    (pair_scan). A 64 KiB table says which two bytes can begin some rule's
 *    match; where they can, bit-set tables for the first four bytes and for
 *    the byte after a \s+ run among them leave the rules that may start
 *    there, their further steps are checked byte by byte (pair_fits), and
 *    only then is a rule tried anchored, if it is not inside its own
 *    previous match. Every set holds at least the bytes the rule's match
 *    can have there (a byte above ASCII only says "maybe": the check stops
 *    there), so each rule is tried at every position where it matches, in
 *    rising order, and gets exactly its own successive non-overlapping
 *    matches, as in scan. Before the tables, a first look passes over
 *    positions where no rule can start. With SSSE3 or AVX2 (asked of the
 *    CPU at run time), 16 or 32 positions at a time: the rules sit in
 *    eight buckets, and for each of the first TTI_PAIR_PRINT (6) offsets
 *    two 16-entry tables give, by the low and by the high nibble of the
 *    byte there, the buckets whose rules may have that byte (PSHUFB
 *    lookups, ANDed across the offsets; the fingerprint-by-nibble idea of
 *    the Teddy literal matcher of the Hyperscan regular-expression
 *    library, named from memory).
 *    Its sets are supersets of the steps' (watchlist.c, build_print), and
 *    after a byte above ASCII every later byte passes, so it lets through
 *    every position where the tables would let a rule be tried: the
 *    rules are tried at the same positions, with the same results, as
 *    without it. With SSE2 alone, when at most eight letters (either case)
 *    and the class of white space and bytes above ASCII start the rules,
 *    16 positions at a time are first compared with them.
 *  - whole text: another pattern that starts with a known character and
 *    holds no anchor, lookaround or verb runs once over the document's
 *    text, blocks and separators together (whole_text_pass): the JIT finds
 *    the first character with SIMD, and one call replaces one per block. A
 *    match over a separator is redone on its block alone.
 *  - scan: the other patterns share one pass. The prefilter alternation
 *    (watchlist.c) stops at each leftmost position where some rule matches,
 *    and there every such rule not inside its own previous match is tried
 *    anchored (scan_block); a rule's leftmost match from any point is at
 *    such a position, so each gets exactly its own successive
 *    non-overlapping, non-empty matches.
 *  - alone: rules the alternation cannot hold run over each block.
 * A near(A, B, N) rule runs on blocks where the prefilter (which holds its
 * A) matched: it matches A and B over the block, and for each A match takes
 * the nearest B match before it and the nearest after it (matches of one
 * pattern do not overlap, so their starts and ends rise together and the
 * nearest on each side is the last before / first after); a pair in the
 * same sentence with at most N words between them is a hit spanning both.
 * Words and sentences come from the segment stage's tokenizer (UAX #29
 * words, sentence starts), run once per block that needs them.
 *
 * Hits of a block are sorted by start (then rule), so the two walks that
 * follow only move forward:
 *  - the source walk, from the block's src_off in the raw text, steps
 *    through source and block text together up to the hit's start. Plain
 *    text: the block's non-space bytes are exactly the source's non-space
 *    bytes in order, and each block space stands for one run of source
 *    white space (ASCII, NBSP; a run the extractor dropped at a hyphenated
 *    line end is skipped before the next byte). HTML: the same, where tags,
 *    comments and white-space references (&nbsp; &#160; ...) count as white
 *    space or nothing, an element the extractor drops (script, style, the
 *    hidden attribute, display:none) is stepped over whole, and any other
 *    character reference stands for one character of the block. A mismatch gives up (exact = 0, the block's
 *    start).
 *  - the line count, from the start of the file to the offset (LF, CRLF,
 *    lone CR), kept across blocks and wrapper parts of one file.
 * Context: the N tokens before the hit's first word and after its last,
 * cut at the block's edges.
 *
 * Limits: each searcher's match context carries TT_LIMIT_REGEX_MATCH, _DEPTH
 * and _HEAP_KIB and a JIT stack of at most TT_LIMIT_REGEX_JIT_STACK; a rule
 * that reaches one is stopped for the rest of the document and recorded.
 *
 * Cost: one pass over each block for all pair-scanned rules: with SSSE3
 * or AVX2 about 40 vector instructions per 16 or 32 bytes (1.3 per byte
 * with AVX2), and per position the first look lets through a table
 * lookup, then a few more where it passes; without them a table lookup
 * per byte (SSE2: about one instruction per byte when at most eight
 * letters start the rules); PCRE2 runs only where a rule's first steps
 * fit, a handful of times per hit. On the 10 MB below the first look lets
 * through about 2.3% of positions, the pair table 10%. Per whole-text rule one pass at the JIT's first-character
 * speed (several GB/s for a phrase); one alternation pass for the scanned
 * rules plus, per position where one matches, an anchored attempt per
 * rule; a pass per block for the rest. The walks and tokenization are
 * O(block) per block with a hit. Measured on 10 MB of generated prose made
 * of common short words, with 20 caseless two-word phrases of those words
 * (`search --counts`, callgrind, SHA-256 left out): 0.20 G instructions
 * for the search itself instead of 0.67 G when each phrase ran over the
 * whole text with the JIT; with the wide first look (AVX2) 0.07 G for the
 * pair scan and its PCRE2 calls, and on 200 MB one thread 1.0 s -> 0.5 s
 * (SHA-256 included). */
#include <pthread.h>
#include <stdlib.h>
#include <strings.h>
#include <sys/stat.h>

#ifdef __SSE2__
#include <emmintrin.h>
#endif
#if (defined(__x86_64__) || defined(__i386__)) && defined(__SSE2__) && \
    (defined(__GNUC__) || defined(__clang__))
#include <immintrin.h>
#endif

#include "termtide/segment.h"
#include "termtide/simd.h"
#include "search_internal.h"

/* ---- results ------------------------------------------------------------ */

void tt_search_result_init(tt_search_result *r)
{
    memset(r, 0, sizeof *r);
    tt_buf_init(&r->text, TT_LIMIT_SEARCH_TEXT_BYTES);
}

void tt_search_result_release(tt_search_result *r)
{
    tt_free(r->hits);
    tt_free(r->counts);
    tt_free(r->stops);
    tt_buf_release(&r->text);
    memset(r, 0, sizeof *r);
}

void tt_search_result_reset(tt_search_result *r)
{
    r->n_hits = 0;
    r->n_stops = 0;
    r->unlisted = 0;
    if (r->counts)
        memset(r->counts, 0, r->n_rules * sizeof *r->counts);
    tt_buf_reset(&r->text);
}

const char *tt_search_limit_name(tt_search_limit l)
{
    switch (l) {
    case TT_SEARCH_LIMIT_MATCH: return "match limit";
    case TT_SEARCH_LIMIT_DEPTH: return "depth limit";
    case TT_SEARCH_LIMIT_HEAP: return "heap limit";
    case TT_SEARCH_LIMIT_JIT_STACK: return "JIT stack limit";
    case TT_SEARCH_LIMIT_OTHER: break;
    }
    return "match error";
}

/* ---- the searcher ------------------------------------------------------- */

typedef struct span {
    size_t start, end;
    size_t rule;
} span;

struct tt_searcher {
    const tt_watchlist *wl;
    pcre2_match_data *md;
    pcre2_match_context *mctx;
    pcre2_jit_stack *jit_stack;
    unsigned char *stopped; /* per rule, for the current document */
    size_t *next_allowed;   /* per scanned rule: where its next match may start */
    size_t *pair_next;      /* per pair rule: where its next match may start */
    int counts_only;
    span *hits, *a, *b;     /* one block's hits; near()'s A and B matches */
    size_t n_hits, cap_hits, n_a, cap_a, n_b, cap_b;
    span *whole;            /* the whole-text rules' matches in the document */
    size_t n_whole, cap_whole;
    tt_token *tokens;       /* one block's tokens */
    size_t *sentence;       /* sentence number of each token */
    size_t n_tokens, cap_tokens;
    int tokens_ready;
    /* line counting, kept across the parts of one file */
    char *line_path;
    const char *line_base;
    size_t line_pos;
    long line_no;
};

tt_searcher *tt_searcher_new(const tt_watchlist *wl)
{
    tt_searcher *s = tt_calloc(1, sizeof *s);
    if (!s)
        return NULL;
    s->wl = wl;
    pcre2_general_context *g = wl->gctx;
    s->md = pcre2_match_data_create(1, g);
    s->mctx = pcre2_match_context_create(g);
    s->stopped = tt_calloc(wl->n ? wl->n : 1, 1);
    s->next_allowed = tt_calloc(wl->n ? wl->n : 1, sizeof *s->next_allowed);
    s->pair_next = tt_calloc(wl->n_pair ? wl->n_pair : 1, sizeof *s->pair_next);
    if (!s->md || !s->mctx || !s->stopped || !s->next_allowed || !s->pair_next)
        goto fail;
    pcre2_set_match_limit(s->mctx, TT_LIMIT_REGEX_MATCH);
    pcre2_set_depth_limit(s->mctx, TT_LIMIT_REGEX_DEPTH);
    pcre2_set_heap_limit(s->mctx, TT_LIMIT_REGEX_HEAP_KIB);
    if (wl->jit) {
        s->jit_stack = pcre2_jit_stack_create(32 * 1024, TT_LIMIT_REGEX_JIT_STACK, g);
        if (!s->jit_stack)
            goto fail;
        pcre2_jit_stack_assign(s->mctx, NULL, s->jit_stack);
    }
    return s;
fail:
    tt_searcher_free(s);
    return NULL;
}

void tt_searcher_free(tt_searcher *s)
{
    if (!s)
        return;
    if (s->md)
        pcre2_match_data_free(s->md);
    if (s->mctx)
        pcre2_match_context_free(s->mctx);
    if (s->jit_stack)
        pcre2_jit_stack_free(s->jit_stack);
    tt_free(s->stopped);
    tt_free(s->next_allowed);
    tt_free(s->pair_next);
    tt_free(s->hits);
    tt_free(s->whole);
    tt_free(s->a);
    tt_free(s->b);
    tt_free(s->tokens);
    tt_free(s->sentence);
    tt_free(s->line_path);
    tt_free(s);
}

void tt_searcher_set_counts_only(tt_searcher *s, int counts_only)
{
    s->counts_only = counts_only;
}

static tt_status push_span(span **v, size_t *n, size_t *cap, size_t start, size_t end,
                           size_t rule)
{
    if (*n == *cap) {
        size_t c = *cap ? *cap * 2 : 16;
        span *nv = tt_reallocarray(*v, c, sizeof *nv);
        if (!nv)
            return TT_ENOMEM;
        *v = nv;
        *cap = c;
    }
    (*v)[(*n)++] = (span){ start, end, rule };
    return TT_OK;
}

static size_t next_char(const char *t, size_t len, size_t pos)
{
    pos++;
    while (pos < len && ((unsigned char)t[pos] & 0xC0) == 0x80)
        pos++;
    return pos;
}

static tt_search_limit limit_of(int rc)
{
    switch (rc) {
    case PCRE2_ERROR_MATCHLIMIT: return TT_SEARCH_LIMIT_MATCH;
    case PCRE2_ERROR_DEPTHLIMIT: return TT_SEARCH_LIMIT_DEPTH;
    case PCRE2_ERROR_HEAPLIMIT: return TT_SEARCH_LIMIT_HEAP;
    case PCRE2_ERROR_JIT_STACKLIMIT: return TT_SEARCH_LIMIT_JIT_STACK;
    default: return TT_SEARCH_LIMIT_OTHER;
    }
}

/* All non-overlapping non-empty matches of code in t[0..len) appended to
 * v. Returns 0 when done, a PCRE2 error code (< 0) when a limit stopped it,
 * or 1 on out of memory. */
static int match_from(tt_searcher *s, const pcre2_code *code, const char *t, size_t len,
                      size_t pos, span **v, size_t *n, size_t *cap, size_t rule)
{
    while (pos <= len) {
        int rc = pcre2_match(code, (PCRE2_SPTR)t, len, pos, 0, s->md, s->mctx);
        if (rc == PCRE2_ERROR_NOMATCH)
            return 0;
        if (rc < 0)
            return rc;
        PCRE2_SIZE *ov = pcre2_get_ovector_pointer(s->md);
        size_t ms = ov[0], me = ov[1];
        if (me > ms) {
            if (push_span(v, n, cap, ms, me, rule))
                return 1;
            pos = me;
        } else {
            /* an empty match (or \K past the end): step one character */
            size_t at = ms > me ? ms : me;
            if (at < pos)
                at = pos;
            if (at >= len)
                return 0;
            pos = next_char(t, len, at);
        }
    }
    return 0;
}

static int match_all(tt_searcher *s, const pcre2_code *code, const char *t, size_t len,
                     span **v, size_t *n, size_t *cap, size_t rule)
{
    return match_from(s, code, t, len, 0, v, n, cap, rule);
}

static tt_status tokenize(tt_searcher *s, const char *t, size_t len)
{
    if (s->tokens_ready)
        return TT_OK;
    enum { AT_ONCE = 64 }; /* tokens asked of the tokenizer at a time */
    tt_tokenizer tz;
    tt_tokenizer_init(&tz, t, len);
    size_t sentence = 0, got;
    s->n_tokens = 0;
    do {
        if (s->cap_tokens - s->n_tokens < AT_ONCE) {
            size_t c = s->cap_tokens ? s->cap_tokens * 2 : AT_ONCE;
            tt_token *nt = tt_reallocarray(s->tokens, c, sizeof *nt);
            if (!nt)
                return TT_ENOMEM;
            s->tokens = nt;
            size_t *ns = tt_reallocarray(s->sentence, c, sizeof *ns);
            if (!ns)
                return TT_ENOMEM;
            s->sentence = ns;
            s->cap_tokens = c;
        }
        got = tt_tokenizer_fill(&tz, s->tokens + s->n_tokens, AT_ONCE);
        for (size_t i = s->n_tokens; i < s->n_tokens + got; i++) {
            if (s->tokens[i].sentence_start && i)
                sentence++;
            s->sentence[i] = sentence;
        }
        s->n_tokens += got;
    } while (got == AT_ONCE);
    s->tokens_ready = 1;
    return TT_OK;
}

/* Index of the first token ending after pos (n_tokens if none). */
static size_t token_at(const tt_searcher *s, size_t pos)
{
    size_t lo = 0, hi = s->n_tokens;
    while (lo < hi) {
        size_t mid = lo + (hi - lo) / 2;
        if (s->tokens[mid].off + s->tokens[mid].len > pos)
            hi = mid;
        else
            lo = mid + 1;
    }
    return lo;
}

/* Index of the first token starting at or after pos. */
static size_t token_from(const tt_searcher *s, size_t pos)
{
    size_t lo = 0, hi = s->n_tokens;
    while (lo < hi) {
        size_t mid = lo + (hi - lo) / 2;
        if (s->tokens[mid].off >= pos)
            hi = mid;
        else
            lo = mid + 1;
    }
    return lo;
}

/* A match's first and last word (token indices) and its sentence. A match
 * holding no token sits between words: first = last + 1. */
static void words_of(const tt_searcher *s, const span *m, size_t *first, size_t *last,
                     size_t *sentence)
{
    *first = token_at(s, m->start);
    size_t after = token_from(s, m->end);
    *last = after ? after - 1 : 0;
    if (after == 0 || *last < *first)
        *last = *first ? *first - 1 : 0;
    size_t k = *first < s->n_tokens ? *first : (s->n_tokens ? s->n_tokens - 1 : 0);
    *sentence = s->n_tokens ? s->sentence[k] : 0;
}

/* Words strictly between two matches (0 when they overlap or touch). */
static size_t gap(size_t af, size_t al, size_t bf, size_t bl)
{
    if (bf > al + 1)
        return bf - al - 1;
    if (af > bl + 1)
        return af - bl - 1;
    return 0;
}

static tt_status near_hits(tt_searcher *s, const tti_rule *r, size_t rule, const char *t,
                           size_t len)
{
    tt_status st = tokenize(s, t, len);
    if (st)
        return st;
    size_t nb = s->n_b, j = 0;
    for (size_t i = 0; i < s->n_a; i++) {
        const span *a = &s->a[i];
        size_t af, al, as;
        words_of(s, a, &af, &al, &as);
        while (j < nb && s->b[j].start < a->start)
            j++;
        /* the last B starting before A, and the first at or after it */
        const span *best = NULL;
        size_t best_gap = 0;
        for (size_t c = j ? j - 1 : 0; c < nb && c <= j; c++) {
            size_t bf, bl, bs;
            words_of(s, &s->b[c], &bf, &bl, &bs);
            if (bs != as)
                continue;
            size_t g = gap(af, al, bf, bl);
            if (g <= r->pub.near_words && (!best || g < best_gap)) {
                best = &s->b[c];
                best_gap = g;
            }
        }
        if (best) {
            size_t hs = a->start < best->start ? a->start : best->start;
            size_t he = a->end > best->end ? a->end : best->end;
            if ((st = push_span(&s->hits, &s->n_hits, &s->cap_hits, hs, he, rule)))
                return st;
        }
    }
    return TT_OK;
}

static tt_status add_stop(tt_search_result *out, size_t rule, size_t block, int rc)
{
    if (out->n_stops == out->cap_stops) {
        size_t c = out->cap_stops ? out->cap_stops * 2 : 8;
        tt_search_stop *ns = tt_reallocarray(out->stops, c, sizeof *ns);
        if (!ns)
            return TT_ENOMEM;
        out->stops = ns;
        out->cap_stops = c;
    }
    out->stops[out->n_stops++] = (tt_search_stop){ rule, block, limit_of(rc) };
    return TT_OK;
}

/* Runs one rule over a block, adding to s->hits. */
static tt_status run_rule(tt_searcher *s, size_t rule, size_t block, const char *t, size_t len,
                          tt_search_result *out)
{
    const tti_rule *r = &s->wl->rules[rule];
    int rc;
    if (r->pub.kind == TT_RULE_PATTERN) {
        rc = match_all(s, r->code, t, len, &s->hits, &s->n_hits, &s->cap_hits, rule);
    } else {
        s->n_a = s->n_b = 0;
        rc = match_all(s, r->code, t, len, &s->a, &s->n_a, &s->cap_a, rule);
        if (rc == 0 && s->n_a)
            rc = match_all(s, r->code_b, t, len, &s->b, &s->n_b, &s->cap_b, rule);
        if (rc == 0 && s->n_a && s->n_b && near_hits(s, r, rule, t, len))
            rc = 1;
    }
    if (rc == 1)
        return TT_ENOMEM;
    if (rc < 0) {
        s->stopped[rule] = 1;
        return add_stop(out, rule, block, rc);
    }
    return TT_OK;
}

static int span_cmp(const void *x, const void *y)
{
    const span *a = x, *b = y;
    if (a->start != b->start)
        return a->start < b->start ? -1 : 1;
    if (a->rule != b->rule)
        return a->rule < b->rule ? -1 : 1;
    return (a->end > b->end) - (a->end < b->end);
}

/* The scanned rules over one block in a single pass: the prefilter finds
 * each leftmost position where some rule matches; there every scanned rule
 * that is not inside its own previous match is tried anchored. A rule's
 * leftmost match from any point is at a position the prefilter stops at,
 * so each rule gets exactly the matches it gets alone. Returns 0 when the
 * prefilter found nothing in the block, 2 when it found something, 1 on
 * out of memory, or a PCRE2 error (< 0) when the prefilter reached a limit
 * (nothing is then kept from the block). */
static int scan_block(tt_searcher *s, size_t block, const char *t, size_t len,
                      tt_search_result *out)
{
    const tt_watchlist *wl = s->wl;
    size_t pos = 0;
    int found = 0;
    for (size_t k = 0; k < wl->n_scan; k++)
        s->next_allowed[k] = 0;
    while (pos <= len) {
        int rc = pcre2_match(wl->prefilter, (PCRE2_SPTR)t, len, pos, 0, s->md, s->mctx);
        if (rc == PCRE2_ERROR_NOMATCH)
            break;
        if (rc < 0)
            return rc;
        found = 2;
        size_t at = pcre2_get_ovector_pointer(s->md)[0];
        if (at < pos)
            at = pos;
        for (size_t k = 0; k < wl->n_scan; k++) {
            size_t r = wl->scan[k];
            if (s->stopped[r] || s->next_allowed[k] > at)
                continue;
            rc = pcre2_match(wl->rules[r].anchored, (PCRE2_SPTR)t, len, at, 0, s->md, s->mctx);
            if (rc == PCRE2_ERROR_NOMATCH)
                continue;
            if (rc < 0) {
                s->stopped[r] = 1;
                if (add_stop(out, r, block, rc))
                    return 1;
                continue;
            }
            PCRE2_SIZE *ov = pcre2_get_ovector_pointer(s->md);
            if (ov[1] > ov[0]) {
                if (push_span(&s->hits, &s->n_hits, &s->cap_hits, ov[0], ov[1], r))
                    return 1;
                s->next_allowed[k] = ov[1];
            }
        }
        if (at >= len)
            break;
        pos = next_char(t, len, at);
    }
    return found;
}

/* Whether a match of a pair rule may start at u[q]: each of the rule's
 * steps (watchlist.c, start_steps) fits the bytes. A step's character is
 * one byte when that byte is ASCII; at a byte above ASCII that may start
 * one of the step's characters, the character may be longer, and the check
 * ends there with a yes. A \s+ run goes over the ASCII white space that
 * follows; the step after it cannot match white space, so the run must end
 * there. */
static int pair_fits(const unsigned char *sets, const tti_pair_rule *pr, const unsigned char *u,
                     size_t len, size_t q, size_t from)
{
    for (size_t j = from; j < pr->n_steps; j++) {
        const unsigned char *set = sets + pr->step[j].set * 256;
        if (q >= len)
            return 0;
        unsigned v = set[u[q]];
        if (v != 1)
            return v;
        q++;
        if (pr->step[j].run) {
            while (q < len && set[u[q]] == 1)
                q++;
            if (q < len && set[u[q]] == 2)
                return 1;
        }
    }
    return 1;
}

/* Tries, anchored at t[i], the pair rules of word w of the rule sets that
 * are in m (the tables allowed them, having checked the first `seen`
 * bytes), whose further steps fit and which are not inside their own
 * previous match. Returns 1 on out of memory, else 0 (a rule that reaches a
 * limit is stopped and recorded). */
static int pair_rules(tt_searcher *s, size_t block, const char *t, size_t len, size_t i,
                      size_t w, uint64_t m, size_t seen, tt_search_result *out)
{
    const tt_watchlist *wl = s->wl;
    const unsigned char *u = (const unsigned char *)t;
    while (m) {
        size_t k = w * 64 + (size_t)__builtin_ctzll(m);
        m &= m - 1;
        const tti_pair_rule *pr = &wl->pair[k];
        if (s->pair_next[k] > i || s->stopped[pr->rule])
            continue;
        /* the steps the tables checked are passed over; a byte above ASCII
         * among them ends the check (see pair_fits) */
        size_t from = pr->fixed < seen ? pr->fixed : seen;
        if (!(from && u[i + from - 1] >= 0x80) &&
            !pair_fits(wl->pair_sets, pr, u, len, i + from, from))
            continue;
        int rc = pcre2_match(wl->rules[pr->rule].anchored, (PCRE2_SPTR)t, len, i, 0, s->md,
                             s->mctx);
        if (rc == PCRE2_ERROR_NOMATCH)
            continue;
        if (rc < 0) {
            s->stopped[pr->rule] = 1;
            if (add_stop(out, pr->rule, block, rc))
                return 1;
            continue;
        }
        PCRE2_SIZE *ov = pcre2_get_ovector_pointer(s->md);
        if (ov[1] > ov[0]) {
            if (push_span(&s->hits, &s->n_hits, &s->cap_hits, ov[0], ov[1], pr->rule))
                return 1;
            s->pair_next[k] = ov[1];
        }
    }
    return 0;
}

/* The row of pair_after for a \s+ run at u[i + r] (an ASCII white-space
 * byte): the rules it leaves, by the byte after the run; NULL when that
 * byte is above ASCII (it may start a longer white-space character). */
static const uint64_t *pair_after_row(const tt_watchlist *wl, const unsigned char *u, size_t len,
                                      size_t i, size_t r)
{
    const unsigned char *space = wl->pair_sets + TTI_PAIR_SPACE * 256;
    size_t e = i + r + 1;
    while (e < len && space[u[e]] == 1)
        e++;
    if (e < len && u[e] >= 0x80)
        return NULL;
    return wl->pair_after + (r * 257 + (e == len ? 256 : u[e])) * wl->pair_words;
}

/* The pair rules that may start a match at t[i], by the tables: the bytes
 * at offsets 0 to TTI_PAIR_FIXED - 1 (while the bytes before are ASCII
 * and in the block) and the byte after a \s+ run at one of those offsets;
 * then pair_rules. */
static int pair_try(tt_searcher *s, size_t block, const char *t, size_t len, size_t i,
                    tt_search_result *out)
{
    const tt_watchlist *wl = s->wl;
    const unsigned char *u = (const unsigned char *)t;
    size_t words = wl->pair_words;
    const uint64_t *rows[2 * TTI_PAIR_FIXED];
    size_t seen = 1; /* bytes the tables checked */
    rows[0] = wl->pair_at + u[i] * words;
    while (seen < TTI_PAIR_FIXED && i + seen < len && u[i + seen - 1] < 0x80) {
        rows[seen] = wl->pair_at + (seen * 256 + u[i + seen]) * words;
        seen++;
    }
    const unsigned char *space = wl->pair_sets + TTI_PAIR_SPACE * 256;
    size_t n_rows = seen;
    for (size_t r = 1; r < seen; r++)
        if (space[u[i + r]] == 1 && (rows[n_rows] = pair_after_row(wl, u, len, i, r)))
            n_rows++;
    for (size_t w = 0; w < words; w++) {
        uint64_t m = rows[0][w];
        for (size_t j = 1; j < n_rows && m; j++)
            m &= rows[j][w];
        if (m && pair_rules(s, block, t, len, i, w, m, seen, out))
            return 1;
    }
    return 0;
}

_Static_assert(TTI_PAIR_FIXED == 4, "pair_try4 checks four bytes");
_Static_assert(TTI_PAIR_KEYS == 8, "pair_scan compares eight keys");

/* pair_try for up to 64 pair rules (one word) where t[i .. i + 3] is in
 * the block and t[i .. i + 2] is ASCII, the common case, unrolled: the
 * tables check all four bytes (TTI_PAIR_FIXED is 4). */
static int pair_try4(tt_searcher *s, size_t block, const char *t, size_t len, size_t i,
                     tt_search_result *out)
{
    const tt_watchlist *wl = s->wl;
    const unsigned char *u = (const unsigned char *)t;
    const uint64_t *at = wl->pair_at;
    uint64_t m = at[u[i]] & at[256 + u[i + 1]] & at[512 + u[i + 2]] & at[768 + u[i + 3]];
    if (m & wl->pair_run_rules) {
        const unsigned char *space = wl->pair_sets + TTI_PAIR_SPACE * 256;
        for (size_t r = 1; r < 4 && m; r++) {
            if (space[u[i + r]] != 1)
                continue;
            const uint64_t *row = pair_after_row(wl, u, len, i, r);
            if (row)
                m &= *row;
        }
    }
    return m ? pair_rules(s, block, t, len, i, 0, m, 4, out) : 0;
}

/* Where the pair table allows u[p] u[p + 1] (p + 1 < len): the rules that
 * may start there are tried (pair_try4 in the common case). Returns 1 on
 * out of memory. */
static int pair_at_byte(tt_searcher *s, size_t block, const char *t, size_t len, size_t p,
                        int quick, tt_search_result *out)
{
    const unsigned char *u = (const unsigned char *)t;
    if (quick && p + 4 <= len && (u[p] | u[p + 1] | u[p + 2]) < 0x80)
        return pair_try4(s, block, t, len, p, out);
    return pair_try(s, block, t, len, p, out);
}

static unsigned two_bytes(const unsigned char *u)
{
    uint16_t x;
    memcpy(&x, u, 2);
    return x;
}

#if TTI_SIMD_WIDE
/* The wide first look (see the top of the file and search_internal.h):
 * the candidates among the W positions at p, one bit each, from
 * p[0 .. W + TTI_PAIR_PRINT - 1). Per offset j, from the last: the bucket
 * bits of the byte there (both nibbles looked up, ANDed), ANDed with what
 * the offsets after it leave; a byte above ASCII at an offset j > 0 lets
 * every bucket through from there on (the tables hold only ASCII there:
 * a longer character may start at it, and what follows is unknown), and
 * at offset 0 it must be in the tables, and lets every later byte
 * through. */
#define PRINT_STEP(T, load, and, or, shuffle, srli16, neg, set1)                             \
    do {                                                                                 \
        const T nib = set1(0x0F);                                                        \
        _Pragma("GCC unroll 16")                                                         \
        for (int j = TTI_PAIR_PRINT - 1; j >= 0; j--) {                                  \
            T x = load(p + j);                                                           \
            T m = and(shuffle(tab[j][0], and(x, nib)), shuffle(tab[j][1], and(srli16(x, 4), nib))); \
            if (j == TTI_PAIR_PRINT - 1)                                                 \
                acc = or(m, neg(x));                                                     \
            else if (j > 0)                                                              \
                acc = or(and(m, acc), neg(x));                                           \
            else                                                                         \
                acc = and(m, or(acc, neg(x)));                                           \
        }                                                                                \
    } while (0)

static inline __m128i load16(const unsigned char *p)
{
    return _mm_loadu_si128((const __m128i *)p);
}

__attribute__((target("ssse3"))) static inline __m128i neg16(__m128i x)
{
    return _mm_cmplt_epi8(x, _mm_setzero_si128());
}

__attribute__((target("ssse3"))) static inline unsigned print16(const __m128i tab[][2],
                                                                const unsigned char *p)
{
    __m128i acc = _mm_setzero_si128();
    PRINT_STEP(__m128i, load16, _mm_and_si128, _mm_or_si128, _mm_shuffle_epi8, _mm_srli_epi16,
               neg16, _mm_set1_epi8);
    return ~(unsigned)_mm_movemask_epi8(_mm_cmpeq_epi8(acc, _mm_setzero_si128())) & 0xFFFFu;
}

__attribute__((target("avx2"))) static inline __m256i load32(const unsigned char *p)
{
    return _mm256_loadu_si256((const __m256i *)p);
}

__attribute__((target("avx2"))) static inline __m256i neg32(__m256i x)
{
    return _mm256_cmpgt_epi8(_mm256_setzero_si256(), x);
}

__attribute__((target("avx2"))) static inline uint32_t print32(const __m256i tab[][2],
                                                               const unsigned char *p)
{
    __m256i acc = _mm256_setzero_si256();
    PRINT_STEP(__m256i, load32, _mm256_and_si256, _mm256_or_si256, _mm256_shuffle_epi8,
               _mm256_srli_epi16, neg32, _mm256_set1_epi8);
    return ~(uint32_t)_mm256_movemask_epi8(_mm256_cmpeq_epi8(acc, _mm256_setzero_si256()));
}

/* The pair scan's loop with the wide first look, W positions at a time
 * (16 with SSSE3, 32 with AVX2): the rules are tried where it and the pair
 * table let a position through, in rising order; the positions whose
 * window would pass the block's end are looked at in a copy padded with
 * zeros, all but the last, which pair_try takes. What the padding holds
 * cannot matter: a rule is tried only where the bytes of its steps lie in
 * the block (pair_fits ends at the block's end) or a byte above ASCII
 * comes first (which lets every later byte through), and at offsets past
 * its last step the first look takes any byte (build_print). */
/* The positions i + k, for each bit k of m, that the pair table lets
 * through, tried in rising order; 1 on out of memory. */
static inline int pair_candidates(tt_searcher *s, size_t block, const char *t, size_t len,
                                  size_t i, uint32_t m, int quick, tt_search_result *out)
{
    const unsigned char *u = (const unsigned char *)t;
    const unsigned char *table = s->wl->pair_table;
    while (m) {
        size_t p = i + (size_t)__builtin_ctz(m);
        m &= m - 1;
        if (table[two_bytes(u + p)] && pair_at_byte(s, block, t, len, p, quick, out))
            return 1;
    }
    return 0;
}

#define PAIR_SCAN_WIDE(W, look)                                                         \
    do {                                                                                \
        const unsigned char *u = (const unsigned char *)t;                              \
        int quick = s->wl->pair_words == 1;                                             \
        size_t i = 0;                                                                   \
        for (; i + (W) + TTI_PAIR_PRINT - 1 <= len; i += (W))                           \
            if (pair_candidates(s, block, t, len, i, look(tab, u + i), quick, out))    \
                return 1;                                                               \
        for (; i + 1 < len; i += (W)) {                                                 \
            unsigned char pad[(W) + TTI_PAIR_PRINT - 1];                                \
            size_t n = len - i < sizeof pad ? len - i : sizeof pad;                     \
            memset(pad, 0, sizeof pad);                                                 \
            memcpy(pad, u + i, n);                                                      \
            uint32_t m = look(tab, pad);                                                \
            if (len - 1 - i < (W))                                                      \
                m &= ((uint32_t)1 << (len - 1 - i)) - 1;                                \
            if (pair_candidates(s, block, t, len, i, m, quick, out))                    \
                return 1;                                                               \
        }                                                                               \
        return pair_try(s, block, t, len, len - 1, out);                                \
    } while (0)

__attribute__((target("ssse3"))) static int pair_scan_ssse3(tt_searcher *s, size_t block,
                                                            const char *t, size_t len,
                                                            tt_search_result *out)
{
    __m128i tab[TTI_PAIR_PRINT][2];
    for (size_t j = 0; j < TTI_PAIR_PRINT; j++)
        for (size_t h = 0; h < 2; h++)
            tab[j][h] = load16(s->wl->pair_print[j][h]);
    PAIR_SCAN_WIDE(16, print16);
}

__attribute__((target("avx2"))) static int pair_scan_avx2(tt_searcher *s, size_t block,
                                                          const char *t, size_t len,
                                                          tt_search_result *out)
{
    __m256i tab[TTI_PAIR_PRINT][2];
    for (size_t j = 0; j < TTI_PAIR_PRINT; j++)
        for (size_t h = 0; h < 2; h++)
            tab[j][h] = _mm256_broadcastsi128_si256(load16(s->wl->pair_print[j][h]));
    PAIR_SCAN_WIDE(32, print32);
}
#endif

/* The pair rules over one block (see the top of the file): one pass over
 * the block's byte pairs, four at a time, the rules tried where one can
 * start, in rising order of position. With SSSE3 or AVX2, the wide first
 * look lets through the positions to try (PAIR_SCAN_WIDE); with SSE2 and
 * few first bytes, 16 positions at a time are first matched against them
 * (as in the watch-list's pair_first). Returns 1 on out of memory, else 0. */
static int pair_scan(tt_searcher *s, size_t block, const char *t, size_t len,
                     tt_search_result *out)
{
    const tt_watchlist *wl = s->wl;
    const unsigned char *u = (const unsigned char *)t;
    const unsigned char *table = wl->pair_table;
    if (!len)
        return 0;
    memset(s->pair_next, 0, wl->n_pair * sizeof *s->pair_next);
#if TTI_SIMD_WIDE
    int level = tti_simd_level();
    if (level >= TT_SIMD_AVX2)
        return pair_scan_avx2(s, block, t, len, out);
    if (level >= TT_SIMD_SSSE3)
        return pair_scan_ssse3(s, block, t, len, out);
#endif
    int quick = wl->pair_words == 1;
    size_t i = 0;
#ifdef __SSE2__
    if (wl->pair_simd && tti_use_simd) {
        const __m128i case_bit = _mm_set1_epi8(0x20);
        /* signed: below 0x21 or above ASCII (negative); -128: nothing */
        const __m128i low = _mm_set1_epi8(wl->pair_low ? 0x21 : -128);
        const __m128i k0 = _mm_set1_epi8((char)wl->pair_first[0]);
        const __m128i k1 = _mm_set1_epi8((char)wl->pair_first[1]);
        const __m128i k2 = _mm_set1_epi8((char)wl->pair_first[2]);
        const __m128i k3 = _mm_set1_epi8((char)wl->pair_first[3]);
        const __m128i k4 = _mm_set1_epi8((char)wl->pair_first[4]);
        const __m128i k5 = _mm_set1_epi8((char)wl->pair_first[5]);
        const __m128i k6 = _mm_set1_epi8((char)wl->pair_first[6]);
        const __m128i k7 = _mm_set1_epi8((char)wl->pair_first[7]);
        for (; i + 16 < len; i += 16) {
            __m128i v = _mm_loadu_si128((const __m128i *)(u + i));
            __m128i f = _mm_or_si128(v, case_bit);
            __m128i lanes = _mm_or_si128(
                _mm_or_si128(_mm_cmplt_epi8(v, low), _mm_cmpeq_epi8(f, k0)),
                _mm_or_si128(_mm_or_si128(_mm_cmpeq_epi8(f, k1), _mm_cmpeq_epi8(f, k2)),
                             _mm_cmpeq_epi8(f, k3)));
            lanes = _mm_or_si128(
                lanes, _mm_or_si128(_mm_or_si128(_mm_cmpeq_epi8(f, k4), _mm_cmpeq_epi8(f, k5)),
                                    _mm_or_si128(_mm_cmpeq_epi8(f, k6), _mm_cmpeq_epi8(f, k7))));
            unsigned m = (unsigned)_mm_movemask_epi8(lanes);
            while (m) {
                size_t p = i + (size_t)__builtin_ctz(m);
                m &= m - 1;
                if (table[two_bytes(u + p)] && pair_at_byte(s, block, t, len, p, quick, out))
                    return 1;
            }
        }
    }
#endif
    for (; i + 4 < len; i += 4) {
        const unsigned char *q = u + i;
        if (!(table[two_bytes(q)] | table[two_bytes(q + 1)] | table[two_bytes(q + 2)] |
              table[two_bytes(q + 3)]))
            continue;
        for (size_t p = i; p < i + 4; p++)
            if (table[two_bytes(u + p)] && pair_at_byte(s, block, t, len, p, quick, out))
                return 1;
    }
    for (; i + 1 < len; i++)
        if (table[two_bytes(u + i)] && pair_at_byte(s, block, t, len, i, quick, out))
            return 1;
    return pair_try(s, block, t, len, len - 1, out);
}

/* The block holding text position pos (the last block starting at or
 * before it); pos may be a block's separator. */
static size_t block_at(const tt_blocks *bl, size_t pos)
{
    size_t lo = 0, hi = bl->n;
    while (lo < hi) {
        size_t mid = lo + (hi - lo) / 2;
        if (bl->items[mid].off <= pos)
            lo = mid + 1;
        else
            hi = mid;
    }
    return lo ? lo - 1 : 0;
}

/* The whole-text rules (watchlist.c: they start with a known character and
 * hold no anchor, lookaround or verb) run once over all of the document's
 * text, blocks and their '\n' separators together, which saves a call per
 * block. A match inside one block is the match the block alone gives (the
 * pattern cannot see past the block's end except by consuming the
 * separator); a match that runs over a separator is not a hit, and the
 * rule is run again over that block alone from the match's start (no
 * match started earlier in the block: it would have been found first),
 * then the pass goes on at the next block. Matches go to s->whole, sorted
 * by start, with positions in the text buffer. */
static int whole_text_pass(tt_searcher *s, const tt_blocks *bl, tt_search_result *out)
{
    const tt_watchlist *wl = s->wl;
    const char *t = bl->text.data;
    size_t len = bl->text.len;
    s->n_whole = 0;
    if (!bl->n)
        return 0;
    for (size_t k = 0; k < wl->n_whole; k++) {
        size_t r = wl->whole[k];
        const pcre2_code *code = wl->rules[r].code;
        size_t pos = 0;
        while (pos < len) {
            int rc = pcre2_match(code, (PCRE2_SPTR)t, len, pos, 0, s->md, s->mctx);
            if (rc == PCRE2_ERROR_NOMATCH)
                break;
            if (rc < 0) {
                s->stopped[r] = 1;
                if (add_stop(out, r, block_at(bl, pos), rc))
                    return 1;
                break;
            }
            PCRE2_SIZE *ov = pcre2_get_ovector_pointer(s->md);
            size_t ms = ov[0], me = ov[1];
            size_t bi = block_at(bl, ms);
            const tt_block *blk = &bl->items[bi];
            size_t bend = blk->off + blk->len;
            if (ms >= bend) {
                pos = next_char(t, len, ms > pos ? ms : pos); /* at a separator */
                continue;
            }
            if (me <= bend) {
                if (me > ms) {
                    if (push_span(&s->whole, &s->n_whole, &s->cap_whole, ms, me, r))
                        return 1;
                    pos = me;
                } else {
                    pos = next_char(t, len, ms > pos ? ms : pos);
                }
                continue;
            }
            /* over a separator: this block alone, from the match's start */
            size_t before = s->n_whole;
            rc = match_from(s, code, t + blk->off, blk->len, ms - blk->off, &s->whole,
                            &s->n_whole, &s->cap_whole, r);
            if (rc == 1)
                return 1;
            for (size_t q = before; q < s->n_whole; q++) {
                s->whole[q].start += blk->off;
                s->whole[q].end += blk->off;
            }
            if (rc < 0) {
                s->stopped[r] = 1;
                if (add_stop(out, r, bi, rc))
                    return 1;
                break;
            }
            pos = bend + 1;
        }
    }
    if (s->n_whole > 1 && wl->n_whole > 1)
        qsort(s->whole, s->n_whole, sizeof *s->whole, span_cmp);
    return 0;
}

/* ---- the source walk ------------------------------------------------------ */

typedef struct walker {
    const char *src;  /* the document's raw text */
    size_t n;
    size_t i;         /* position in src */
    const char *blk;  /* the block's text */
    size_t blen;
    size_t j;         /* position in blk */
    int html;
    int failed;
} walker;

/* Length of a white-space item at w->src + i (ASCII white space or NBSP),
 * 0 if none. */
static size_t text_space(const char *s, size_t n, size_t i)
{
    unsigned char c = (unsigned char)s[i];
    if (c == ' ' || c == '\t' || c == '\n' || c == '\r' || c == '\f' || c == '\v')
        return 1;
    if (c == 0xC2 && i + 1 < n && (unsigned char)s[i + 1] == 0xA0)
        return 2;
    return 0;
}

/* A character reference at s + i: its length (through ';') and whether it
 * decodes to white space the extractor collapses; 0 when not a reference. */
static size_t html_ref(const char *s, size_t n, size_t i, int *space)
{
    size_t k = i + 1;
    *space = 0;
    if (k < n && s[k] == '#') {
        k++;
        int hex = k < n && (s[k] == 'x' || s[k] == 'X');
        if (hex)
            k++;
        unsigned long v = 0;
        size_t d = k;
        while (k < n && k - d < 8 &&
               (tti_is_ascii_digit(s[k]) ||
                (hex && ((unsigned)(s[k] | 32) - 'a') < 6u))) {
            unsigned c = (unsigned char)s[k];
            v = v * (hex ? 16 : 10) +
                (tti_is_ascii_digit((int)c) ? c - '0' : (c | 32) - 'a' + 10);
            k++;
        }
        if (k == d || k >= n || s[k] != ';')
            return 0;
        *space = v == 0xA0 || v == 0x20 || v == 0x09 || v == 0x0A || v == 0x0D || v == 0x0C;
        return k + 1 - i;
    }
    size_t d = k;
    while (k < n && k - d < 32 && (tti_is_ascii_alpha(s[k]) || tti_is_ascii_digit(s[k])))
        k++;
    if (k == d || k >= n || s[k] != ';')
        return 0;
    *space = k - d == 4 && !memcmp(s + d, "nbsp", 4);
    return k + 1 - i;
}

/* Length of markup at s + i (a tag, comment, declaration or processing
 * instruction), 0 if '<' does not start one. */
static size_t html_markup(const char *s, size_t n, size_t i)
{
    if (s[i] != '<' || i + 1 >= n)
        return 0;
    char c = s[i + 1];
    if (c == '!' && i + 3 < n && s[i + 2] == '-' && s[i + 3] == '-') {
        for (size_t k = i + 4; k + 2 < n; k++)
            if (s[k] == '-' && s[k + 1] == '-' && s[k + 2] == '>')
                return k + 3 - i;
        return n - i;
    }
    if (!(tti_is_ascii_alpha(c) || c == '/' || c == '!' || c == '?'))
        return 0;
    char quote = 0;
    for (size_t k = i + 1; k < n; k++) {
        if (quote) {
            if (s[k] == quote)
                quote = 0;
        } else if (s[k] == '"' || s[k] == '\'') {
            if (k > i + 1 && s[k - 1] == '=')
                quote = s[k];
        } else if (s[k] == '>') {
            return k + 1 - i;
        }
    }
    return n - i;
}

static int lower_eq(const char *s, size_t n, const char *lower)
{
    size_t k = 0;
    for (; k < n && lower[k]; k++)
        if (tti_ascii_lower((unsigned char)s[k]) != lower[k])
            return 0;
    return k == n && !lower[k];
}

/* Whether the start tag s[0..n) leaves its content out of the text as the
 * extractor does: a dropped element (script, style, head, title, template,
 * noscript, svg, ix:header), the `hidden` attribute, or a style with
 * display:none. *name, *name_len receive the element name. */
static int tag_drops(const char *s, size_t n, const char **name, size_t *name_len)
{
    static const char *const dropped[] = { "script", "style", "head", "title", "template",
                                           "noscript", "svg", "ix:header" };
    size_t k = 1;
    while (k < n && (tti_is_ascii_alpha(s[k]) || tti_is_ascii_digit(s[k]) || s[k] == ':' ||
                     s[k] == '-' || s[k] == '_'))
        k++;
    *name = s + 1;
    *name_len = k - 1;
    if (k == 1 || s[n - 2] == '/')
        return 0; /* not a start tag, or self-closing */
    for (size_t d = 0; d < sizeof dropped / sizeof dropped[0]; d++)
        if (lower_eq(s + 1, k - 1, dropped[d]))
            return 1;
    char quote = 0;
    for (; k < n; k++) {
        char c = s[k];
        if (quote) {
            if (c == quote)
                quote = 0;
            /* style="...display: none..." */
            if (tti_ascii_lower((unsigned char)c) == 'd' && k + 7 <= n &&
                lower_eq(s + k, 7, "display")) {
                size_t q = k + 7;
                while (q < n && tti_is_ascii_space((unsigned char)s[q]))
                    q++;
                if (q < n && s[q] == ':') {
                    q++;
                    while (q < n && tti_is_ascii_space((unsigned char)s[q]))
                        q++;
                    if (q + 4 <= n && lower_eq(s + q, 4, "none"))
                        return 1;
                }
            }
            continue;
        }
        if (c == '"' || c == '\'') {
            quote = c;
        } else if (tti_is_ascii_space((unsigned char)c) && k + 7 <= n &&
                   lower_eq(s + k + 1, 6, "hidden")) {
            char after = k + 7 < n ? s[k + 7] : '>';
            if (after == '=' || after == '>' || after == '/' ||
                tti_is_ascii_space((unsigned char)after))
                return 1;
        }
    }
    return 0;
}

/* Length of a dropped element starting with the tag s[i..i+tag) through
 * its matching end tag (nested elements of the same name counted), or the
 * rest of the input when it is not closed; 0 when the tag drops nothing. */
static size_t html_dropped(const char *s, size_t n, size_t i, size_t tag)
{
    const char *name;
    size_t nl;
    if (!tag_drops(s + i, tag, &name, &nl))
        return 0;
    size_t depth = 1, k = i + tag;
    while (k < n) {
        const char *lt = memchr(s + k, '<', n - k);
        if (!lt)
            return n - i;
        k = (size_t)(lt - s);
        int close = k + 1 < n && s[k + 1] == '/';
        size_t at = k + 1 + (size_t)close;
        if (at + nl <= n && !strncasecmp(s + at, name, nl) &&
            (at + nl == n || !(tti_is_ascii_alpha(s[at + nl]) || s[at + nl] == ':' ||
                               s[at + nl] == '-'))) {
            size_t m = html_markup(s, n, k);
            if (!m)
                m = 1;
            if (close) {
                if (--depth == 0)
                    return k + m - i;
            } else if (s[k + m - 2] != '/') {
                depth++;
            }
            k += m;
        } else {
            k++;
        }
    }
    return n - i;
}

/* Skips white space (and, in HTML, markup and white-space references);
 * returns whether anything that stands for white space was skipped. */
static int skip_space(walker *w)
{
    int any = 0;
    while (w->i < w->n) {
        size_t k = text_space(w->src, w->n, w->i);
        if (k) {
            any = 1;
            w->i += k;
            continue;
        }
        if (!w->html)
            break;
        if (w->src[w->i] == '<') {
            k = html_markup(w->src, w->n, w->i);
            if (!k)
                break;
            size_t d = html_dropped(w->src, w->n, w->i, k);
            w->i += d ? d : k;
            continue;
        }
        if (w->src[w->i] == '&') {
            int sp;
            k = html_ref(w->src, w->n, w->i, &sp);
            if (!k || !sp)
                break;
            any = 1;
            w->i += k;
            continue;
        }
        break;
    }
    return any;
}

static void walk_to(walker *w, size_t target)
{
    while (!w->failed && w->j < target) {
        if (w->blk[w->j] == ' ') {
            skip_space(w);
            w->j++;
            continue;
        }
        skip_space(w);
        if (w->i >= w->n) {
            w->failed = 1;
            break;
        }
        if (w->html && w->src[w->i] == '&') {
            int sp;
            size_t k = html_ref(w->src, w->n, w->i, &sp);
            if (k && !sp) {
                /* a reference stands for one character of the block */
                w->i += k;
                w->j = next_char(w->blk, w->blen, w->j);
                continue;
            }
        }
        if (w->src[w->i] != w->blk[w->j]) {
            w->failed = 1;
            break;
        }
        w->i++;
        w->j++;
    }
    if (!w->failed && w->j > target)
        w->failed = 1; /* a reference spanned the target */
    if (!w->failed)
        skip_space(w); /* land on the visible character */
}

/* ---- lines ---------------------------------------------------------------- */

static long line_of(tt_searcher *s, const char *base, size_t pos)
{
    if (base != s->line_base || pos < s->line_pos) {
        s->line_base = base;
        s->line_pos = 0;
        s->line_no = 1;
    }
    /* pos is a visible character, so a CR just before it is a lone CR */
    const char *p = base + s->line_pos, *end = base + pos;
    long line = s->line_no;
    for (; p < end; p++) {
        if (*p == '\n')
            line++;
        else if (*p == '\r' && !(p + 1 < end && p[1] == '\n'))
            line++;
    }
    s->line_pos = pos;
    s->line_no = line;
    return line;
}

/* ---- one document --------------------------------------------------------- */

static tt_status store_hits(tt_searcher *s, const tt_document *doc, size_t bi,
                            const tt_block *blk, const char *t, tt_search_result *out,
                            walker *w, const char *file_base, long long shift)
{
    tt_status st;
    size_t ctx = s->wl->opt.context;
    if (ctx && (st = tokenize(s, t, blk->len)))
        return st;
    for (size_t h = 0; h < s->n_hits; h++) {
        const span *m = &s->hits[h];
        if (out->n_hits >= TT_LIMIT_SEARCH_HITS) {
            out->unlisted++;
            continue;
        }
        long long offset = -1;
        long line = 0;
        int exact = 0;
        if (blk->src_off >= 0) {
            if (w->j > m->start || w->failed) {
                /* restart the walk from the block start */
                w->i = (size_t)blk->src_off;
                w->j = 0;
                w->failed = 0;
            }
            walk_to(w, m->start);
            size_t at = w->failed ? (size_t)blk->src_off : w->i;
            exact = !w->failed;
            offset = shift + (long long)doc->raw_off + (long long)at;
            line = line_of(s, file_base, doc->raw_off + at);
        }
        size_t from = m->start, to = m->end;
        if (ctx && s->n_tokens) {
            size_t first = token_at(s, m->start);
            if (first > 0 && first <= s->n_tokens)
                from = s->tokens[first > ctx ? first - ctx : 0].off;
            if (from > m->start)
                from = m->start;
            size_t after = token_from(s, m->end);
            if (after < s->n_tokens) {
                size_t lastk = after + ctx - 1 < s->n_tokens ? after + ctx - 1 : s->n_tokens - 1;
                to = s->tokens[lastk].off + s->tokens[lastk].len;
            }
            if (to < m->end)
                to = m->end;
        }
        size_t text = out->text.len;
        st = tt_buf_append(&out->text, t + from, to - from);
        if (st == TT_ELIMIT) {
            out->unlisted++;
            continue;
        }
        if (st)
            return st;
        if (out->n_hits == out->cap_hits) {
            size_t c = out->cap_hits ? out->cap_hits * 2 : 64;
            tt_search_hit *nh = tt_reallocarray(out->hits, c, sizeof *nh);
            if (!nh)
                return TT_ENOMEM;
            out->hits = nh;
            out->cap_hits = c;
        }
        out->hits[out->n_hits++] = (tt_search_hit){
            .rule = m->rule, .block = bi, .block_kind = blk->kind, .offset = offset,
            .line = line, .exact = exact, .text = text, .before_len = m->start - from,
            .match_len = m->end - m->start, .after_len = to - m->end,
        };
    }
    return TT_OK;
}

tt_status tt_searcher_run(tt_searcher *s, const tt_document *doc, tt_search_result *out,
                          tt_error *err)
{
    const tt_watchlist *wl = s->wl;
    tt_status st = TT_OK;
    if (out->n_rules != wl->n || !out->counts) {
        tt_free(out->counts);
        out->counts = tt_calloc(wl->n ? wl->n : 1, sizeof *out->counts);
        out->n_rules = out->counts ? wl->n : 0;
        if (!out->counts)
            return tt_error_set(err, TT_ENOMEM, doc->name, -1, "out of memory");
    }
    tt_search_result_reset(out);
    memset(s->stopped, 0, wl->n ? wl->n : 1);
    /* a new file restarts the line count */
    if (!s->line_path || strcmp(s->line_path, doc->path ? doc->path : "")) {
        tt_free(s->line_path);
        s->line_path = tt_strdup(doc->path ? doc->path : "");
        if (!s->line_path)
            return tt_error_set(err, TT_ENOMEM, doc->name, -1, "out of memory");
        s->line_base = NULL;
    }
    const char *file_base = doc->raw - doc->raw_off;
    long long shift = doc->decode.encoding == TT_ENC_UTF8_BOM ? (long long)doc->decode.skipped : 0;
    const tt_blocks *bl = doc->blocks;
    int wrc = whole_text_pass(s, bl, out);
    if (wrc) {
        st = TT_ENOMEM;
        goto nomem;
    }
    size_t wcur = 0;
    for (size_t bi = 0; bi < bl->n; bi++) {
        const tt_block *blk = &bl->items[bi];
        const char *t = bl->text.data + blk->off;
        size_t len = blk->len;
        s->n_hits = 0;
        s->tokens_ready = 0;
        for (; wcur < s->n_whole && s->whole[wcur].start < blk->off + len; wcur++)
            if ((st = push_span(&s->hits, &s->n_hits, &s->cap_hits,
                                s->whole[wcur].start - blk->off, s->whole[wcur].end - blk->off,
                                s->whole[wcur].rule)))
                goto nomem;
        size_t from_whole = s->n_hits;
        if (!wl->prefilter) {
            for (size_t k = 0; k < wl->n_always; k++) {
                size_t r = wl->always[k];
                if (!s->stopped[r] && (st = run_rule(s, r, bi, t, len, out)))
                    goto nomem;
            }
        } else {
            int rc = scan_block(s, bi, t, len, out);
            if (rc == 1) {
                st = TT_ENOMEM;
                goto nomem;
            }
            if (rc < 0) {
                /* the alternation stopped at a limit: every rule on its own */
                s->n_hits = from_whole;
                for (size_t r = 0; r < wl->n; r++)
                    if (!s->stopped[r] && !wl->rules[r].whole_text && !wl->rules[r].paired &&
                        (st = run_rule(s, r, bi, t, len, out)))
                        goto nomem;
            } else {
                if (rc == 2)
                    for (size_t k = 0; k < wl->n_gated; k++) {
                        size_t r = wl->gated[k];
                        if (!s->stopped[r] && (st = run_rule(s, r, bi, t, len, out)))
                            goto nomem;
                    }
                for (size_t k = 0; k < wl->n_always; k++) {
                    size_t r = wl->always[k];
                    if (!s->stopped[r] && (st = run_rule(s, r, bi, t, len, out)))
                        goto nomem;
                }
            }
        }
        if (wl->n_pair && pair_scan(s, bi, t, len, out)) {
            st = TT_ENOMEM;
            goto nomem;
        }
        if (!s->n_hits)
            continue;
        for (size_t h = 0; h < s->n_hits; h++)
            out->counts[s->hits[h].rule]++;
        if (s->counts_only)
            continue;
        if (s->n_hits > 1)
            qsort(s->hits, s->n_hits, sizeof *s->hits, span_cmp);
        walker w = { doc->raw, doc->raw_len, blk->src_off >= 0 ? (size_t)blk->src_off : 0,
                     t, len, 0, doc->kind == TT_KIND_HTML, 0 };
        if ((st = store_hits(s, doc, bi, blk, t, out, &w, file_base, shift)))
            goto nomem;
    }
    return TT_OK;
nomem:
    return tt_error_set(err, st, doc->name, -1, "out of memory while searching");
}

/* ---- the batch ------------------------------------------------------------ */

typedef enum { EV_INPUT, EV_DOC, EV_PROBLEM } event_kind;

typedef struct event {
    event_kind kind;
    char *name, *path, *type, *entity, *period, *notes;
    tt_doc_kind doc_kind;
    tt_search_result result;
    char sha256[65];
    tt_error err;
    int skipped;
} event;

typedef struct slot {
    event *events;
    size_t n, cap;
    int done, oom;
} slot;

typedef struct runner {
    const tt_source_list *inputs;
    const tt_search_batch_options *opt;
    slot *slots;
    size_t window;
    pthread_mutex_t lock;
    pthread_cond_t cond_done, cond_space;
    size_t next, delivered;
    int stop;
} runner;

typedef struct worker {
    runner *r;
    tt_reader *reader;
    tt_searcher *searcher;
    slot *s;
    size_t input;
} worker;

void tt_search_batch_options_init(tt_search_batch_options *o)
{
    memset(o, 0, sizeof *o);
    o->threads = 1;
    o->hash_files = 1;
}

static void event_release(event *e)
{
    tt_free(e->name);
    tt_free(e->path);
    tt_free(e->type);
    tt_free(e->entity);
    tt_free(e->period);
    tt_free(e->notes);
    if (e->kind == EV_DOC)
        tt_search_result_release(&e->result);
}

static void slot_reset(slot *s)
{
    for (size_t i = 0; i < s->n; i++)
        event_release(&s->events[i]);
    tt_free(s->events);
    memset(s, 0, sizeof *s);
}

static event *slot_push(slot *s, event_kind kind)
{
    if (s->n == s->cap) {
        size_t cap = s->cap ? s->cap * 2 : 4;
        event *e = tt_reallocarray(s->events, cap, sizeof *e);
        if (!e) {
            s->oom = 1;
            return NULL;
        }
        s->events = e;
        s->cap = cap;
    }
    event *e = &s->events[s->n++];
    memset(e, 0, sizeof *e);
    e->kind = kind;
    return e;
}

static void add_problem(slot *s, const tt_error *err, int skipped)
{
    event *e = slot_push(s, EV_PROBLEM);
    if (e) {
        e->err = *err;
        e->skipped = skipped;
    }
}

static tt_status on_doc(void *vctx, const tt_document *doc)
{
    worker *w = vctx;
    slot *s = w->s;
    tt_error err;
    tt_error_init(&err);
    event *e = slot_push(s, EV_DOC);
    if (!e)
        return TT_OK;
    tt_search_result_init(&e->result);
    if (tt_searcher_run(w->searcher, doc, &e->result, &err)) {
        tt_search_result_release(&e->result);
        s->n--;
        add_problem(s, &err, 1);
        return TT_OK;
    }
    e->name = tt_strdup(doc->name);
    e->path = tt_strdup(doc->path);
    e->type = tt_strdup(doc->type ? doc->type : "");
    e->entity = tt_strdup(doc->entity ? doc->entity : "");
    e->period = tt_strdup(doc->period ? doc->period : "");
    e->notes = tt_strdup(doc->notes ? doc->notes : "");
    e->doc_kind = doc->kind;
    if (!e->name || !e->path || !e->type || !e->entity || !e->period || !e->notes)
        s->oom = 1;
    return TT_OK;
}

static void process_input(runner *r, worker *w, size_t i, slot *s)
{
    const tt_source_entry *in = &r->inputs->items[i];
    tt_error err;
    tt_error_init(&err);
    event *e = slot_push(s, EV_INPUT);
    if (!e)
        return;
    e->path = tt_strdup(in->path);
    if (!e->path) {
        s->oom = 1;
        return;
    }
    if (in->status != TT_OK) {
        tt_error_set(&err, in->status, in->path, -1, "%s",
                     in->message ? in->message : tt_status_name(in->status));
        add_problem(s, &err, 1);
        return;
    }
    if (!w->reader || !w->searcher) {
        tt_error_set(&err, TT_ENOMEM, in->path, -1, "out of memory");
        add_problem(s, &err, 1);
        return;
    }
    /* The hash comes from the reader, over the very bytes it read; the
     * input's event may move as the documents' events are pushed. */
    size_t input_event = s->n - 1;
    tt_read_options ro = r->opt->read;
    ro.sha256 = r->opt->hash_files;
    w->s = s;
    w->input = i;
    tt_status st = tt_reader_read(w->reader, in->path, &ro, on_doc, w, NULL, &err);
    memcpy(s->events[input_event].sha256, tt_reader_sha256(w->reader), 65);
    if (st) {
        if (!err.file[0])
            tti_strlcpy(err.file, in->path, sizeof err.file);
        if (!err.message[0])
            tti_strlcpy(err.message, tt_status_name(st), sizeof err.message);
        add_problem(s, &err, 1);
    }
}

static tt_status deliver(runner *r, slot *s, size_t i, tt_search_summary *sum, tt_error *err)
{
    const tt_search_batch_options *opt = r->opt;
    if (s->oom) {
        tt_error e;
        tt_error_init(&e);
        tt_error_set(&e, TT_ENOMEM, r->inputs->items[i].path, -1, "out of memory");
        if (opt->on_problem)
            opt->on_problem(opt->ctx, &e, 1);
        sum->skipped++;
        return TT_OK;
    }
    tt_status st = TT_OK;
    for (size_t k = 0; k < s->n && !st; k++) {
        event *e = &s->events[k];
        switch (e->kind) {
        case EV_INPUT:
            if (opt->on_input)
                st = opt->on_input(opt->ctx, i, e->path, e->sha256);
            break;
        case EV_PROBLEM:
            if (e->skipped)
                sum->skipped++;
            else
                sum->notes++;
            if (opt->on_problem)
                opt->on_problem(opt->ctx, &e->err, e->skipped);
            break;
        case EV_DOC: {
            sum->documents++;
            sum->stops += e->result.n_stops;
            for (size_t q = 0; q < e->result.n_rules; q++)
                sum->hits += e->result.counts[q];
            tt_search_doc d = { i, e->name, e->path, e->type, e->entity, e->period, e->notes,
                                e->doc_kind, &e->result };
            if (opt->on_document)
                st = opt->on_document(opt->ctx, &d);
            break;
        }
        }
    }
    if (st)
        return tt_error_set(err, st, r->inputs->items[i].path, -1, "stopped: %s",
                            tt_status_name(st));
    return TT_OK;
}

static void worker_setup(runner *r, worker *w)
{
    memset(w, 0, sizeof *w);
    w->r = r;
    w->reader = tt_reader_new();
    w->searcher = tt_searcher_new(r->opt->watchlist);
    if (w->searcher)
        tt_searcher_set_counts_only(w->searcher, r->opt->counts_only);
}

static void worker_teardown(worker *w)
{
    tt_reader_free(w->reader);
    tt_searcher_free(w->searcher);
}

static void *worker_main(void *arg)
{
    runner *r = arg;
    worker w;
    worker_setup(r, &w);
    pthread_mutex_lock(&r->lock);
    for (;;) {
        while (!r->stop && r->next < r->inputs->n && r->next >= r->delivered + r->window)
            pthread_cond_wait(&r->cond_space, &r->lock);
        if (r->stop || r->next >= r->inputs->n)
            break;
        size_t i = r->next++;
        slot *s = &r->slots[i % r->window];
        pthread_mutex_unlock(&r->lock);
        process_input(r, &w, i, s);
        pthread_mutex_lock(&r->lock);
        s->done = 1;
        pthread_cond_broadcast(&r->cond_done);
    }
    pthread_mutex_unlock(&r->lock);
    worker_teardown(&w);
    return NULL;
}

tt_status tt_search_batch(const tt_source_list *inputs, const tt_search_batch_options *opt,
                          tt_search_summary *sum, tt_error *err)
{
    memset(sum, 0, sizeof *sum);
    sum->inputs = inputs->n;
    int threads = opt->threads < 1 ? 1 : opt->threads > 256 ? 256 : opt->threads;
    runner r;
    memset(&r, 0, sizeof r);
    r.inputs = inputs;
    r.opt = opt;
    r.window = (size_t)threads * 4;
    r.slots = tt_calloc(r.window, sizeof *r.slots);
    if (!r.slots)
        return tt_error_set(err, TT_ENOMEM, NULL, -1, "out of memory");
    tt_status st = TT_OK;
    if (threads == 1) {
        worker w;
        worker_setup(&r, &w);
        for (size_t i = 0; i < inputs->n && !st; i++) {
            process_input(&r, &w, i, &r.slots[0]);
            st = deliver(&r, &r.slots[0], i, sum, err);
            slot_reset(&r.slots[0]);
        }
        worker_teardown(&w);
        tt_free(r.slots);
        return st;
    }
    pthread_mutex_init(&r.lock, NULL);
    pthread_cond_init(&r.cond_done, NULL);
    pthread_cond_init(&r.cond_space, NULL);
    pthread_t *tids = tt_calloc((size_t)threads, sizeof *tids);
    int started = 0;
    if (tids)
        for (; started < threads; started++)
            if (tti_thread_start(&tids[started], worker_main, &r, (unsigned)started) != 0)
                break;
    if (started == 0) {
        st = tt_error_set(err, TT_ENOMEM, NULL, -1, "could not start worker threads");
    } else {
        for (size_t i = 0; i < inputs->n; i++) {
            slot *s = &r.slots[i % r.window];
            pthread_mutex_lock(&r.lock);
            while (!s->done)
                pthread_cond_wait(&r.cond_done, &r.lock);
            pthread_mutex_unlock(&r.lock);
            if (!st)
                st = deliver(&r, s, i, sum, err);
            pthread_mutex_lock(&r.lock);
            slot_reset(s);
            r.delivered = i + 1;
            if (st) {
                r.stop = 1;
                pthread_cond_broadcast(&r.cond_space);
                size_t taken = r.next;
                pthread_mutex_unlock(&r.lock);
                for (size_t j = i + 1; j < taken; j++) {
                    slot *t = &r.slots[j % r.window];
                    pthread_mutex_lock(&r.lock);
                    while (!t->done)
                        pthread_cond_wait(&r.cond_done, &r.lock);
                    pthread_mutex_unlock(&r.lock);
                    slot_reset(t);
                }
                break;
            }
            pthread_cond_broadcast(&r.cond_space);
            pthread_mutex_unlock(&r.lock);
        }
    }
    for (int t = 0; t < started; t++)
        pthread_join(tids[t], NULL);
    tt_free(tids);
    pthread_cond_destroy(&r.cond_space);
    pthread_cond_destroy(&r.cond_done);
    pthread_mutex_destroy(&r.lock);
    tt_free(r.slots);
    return st;
}
