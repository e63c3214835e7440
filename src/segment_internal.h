/* termtide — internal: the tokenizer's 64-byte windows, shared by the
 * segment stage (tt_tokenizer_fill, src/segment.c) and the counter's fused
 * path (src/count.c), which takes each token of a window as it is found
 * instead of through an array of tokens.
 *
 * window_take_into() is always inlined with its per-token function, so that
 * a caller compiled for AVX2 gets the masks and the token loop in registers;
 * what a window decides is the same whoever takes its tokens. */
#ifndef TT_SEGMENT_INTERNAL_H
#define TT_SEGMENT_INTERNAL_H

#if defined(__SSE2__)
#include <emmintrin.h>
#endif
#if (defined(__x86_64__) || defined(__i386__)) && defined(__SSE2__)
#include <immintrin.h> /* the AVX2 version (TTI_SIMD_WIDE) */
#endif

#include "termtide/segment.h"
#include "tt_internal.h"

/* A segment s[from, to) holding a sentence terminal: a sentence ends
 * there, unless it is the single period of an abbreviation right after the
 * last token (t->prev_off, t->prev_end). src/segment.c. */
void tti_terminal(tt_tokenizer *t, const unsigned char *s, size_t from, size_t to);

/* The longest abbreviation whose period tti_terminal may take for no
 * sentence end ("approx"). */
#define TTI_ABBREV_MAX 6

/* The next token by the walk (the chunk masks' fast path, then the full
 * rules), for where a window cannot decide: as tt_tokenizer_next. */
int tti_tokenizer_walk(tt_tokenizer *t, tt_token *tok);

#if defined(__SSE2__)
/* Unsigned v - lo < span for each byte, as a 16-bit mask: the difference
 * moved by 0x80 into signed order (SSE2 compares signed bytes only). */
static inline unsigned in_range(__m128i v, int lo, int span)
{
    __m128i d = _mm_add_epi8(v, _mm_set1_epi8((char)(0x80 - lo)));
    return (unsigned)_mm_movemask_epi8(_mm_cmplt_epi8(d, _mm_set1_epi8((char)(0x80 + span))));
}
#endif

#if TTI_SIMD_WIDE
/* Unsigned v - lo < span for each byte, as a vector of 0x00 / 0xFF. */
__attribute__((target("avx2"))) static inline __m256i in_range_v32(__m256i v, int lo, int span)
{
    __m256i d = _mm256_add_epi8(v, _mm256_set1_epi8((char)(0x80 - lo)));
    return _mm256_cmpgt_epi8(_mm256_set1_epi8((char)(0x80 + span)), d);
}
#endif

/* ---- windows -------------------------------------------------------------
 *
 * Where the text is ASCII, tt_tokenizer_fill takes tokens a 64-byte window
 * at a time, with no walk at all: the window's bytes are classified into
 * bit masks (one bit a byte), the joins of UAX #29 that ASCII can make are
 * worked out on the masks for all positions at once, and then each token is
 * two counts of trailing zeros (its start and its end). For ASCII text:
 *   - [A-Za-z0-9_] never break from each other (WB5, WB8–WB10, WB13a,
 *     WB13b);
 *   - a Mid* or quote character joins what is around it when it is
 *     letter, (':' '.' '\'') letter (WB6, WB7) or digit, (',' ';' '.' '\'')
 *     digit (WB11, WB12): ':' is MidLetter, ',' and ';' MidNum, '.'
 *     MidNumLet and '\'' Single_Quote (WordBreakProperty.txt); no other
 *     ASCII character joins anything to a word (WB3–WB4 need CR LF,
 *     spaces or non-ASCII Extend/Format/ZWJ; WB7a–WB7c need a Hebrew
 *     letter), so every other byte after a run ends it;
 *   - a '-' right after a run joins it to a following run that starts with
 *     a letter or digit (the tokens' hyphen rule, segment.h);
 *   - between tokens every character is a segment alone or a space run,
 *     and only the terminals . ! ? matter (tti_terminal()).
 * The window starts at the tokenizer's position, a boundary, so nothing
 * before it joins (the walk, too, starts fresh at a boundary). It stops at
 * the first byte the masks cannot decide, and the walk takes over from the
 * end of the last token taken: a byte >= 0x80 other than those of the
 * filings' dashes, quotes and euro sign and of the two-byte letters
 * U+00C0-U+027F (see window_decide: any other non-ASCII letter, a mark or
 * a terminal), a '-' after a run that does not join, a Mid* or
 * quote after a run followed by a byte >= 0x80, a run starting with '_'
 * (which may hold no letter or digit), and the window's last byte, whose
 * right neighbour it does not see. */
typedef struct window {
    uint64_t alpha, digit, under, high, hyphen;
    uint64_t mid_letter; /* : . '  (MidLetter, MidNumLetQ) */
    uint64_t mid_num;    /* , ; . '  (MidNum, MidNumLetQ) */
    uint64_t term;       /* . ! ? */
    /* the bytes of the three-byte characters below (all 0 without high) */
    uint64_t e2, b80, b82, dash_quote, apos, euro;
    /* and of the two-byte letters U+00C0-U+027F (all 0 without high): lead
     * bytes C3-C9, continuation bytes 80-BF, C3, and 97 or B7 (the second
     * bytes of U+00D7 and U+00F7, the two code points there that are no
     * letter) */
    uint64_t lead2, cont, c3, x97;
} window;

static inline void window_portable(window *w, const unsigned char *c)
{
    memset(w, 0, sizeof *w);
    for (unsigned i = 0; i < 64; i++) {
        unsigned b = c[i];
        uint64_t bit = (uint64_t)1 << i;
        w->alpha |= tti_is_ascii_alpha((int)b) ? bit : 0;
        w->digit |= tti_is_ascii_digit((int)b) ? bit : 0;
        w->under |= b == '_' ? bit : 0;
        w->high |= b >= 0x80 ? bit : 0;
        w->hyphen |= b == '-' ? bit : 0;
        w->mid_letter |= b == ':' || b == '.' || b == '\'' ? bit : 0;
        w->mid_num |= b == ',' || b == ';' || b == '.' || b == '\'' ? bit : 0;
        w->term |= b == '.' || b == '!' || b == '?' ? bit : 0;
        w->e2 |= b == 0xE2 ? bit : 0;
        w->b80 |= b == 0x80 ? bit : 0;
        w->b82 |= b == 0x82 ? bit : 0;
        w->dash_quote |= b == 0x93 || b == 0x94 || b == 0x9C || b == 0x9D ? bit : 0;
        w->apos |= b == 0x98 || b == 0x99 ? bit : 0;
        w->euro |= b == 0xAC ? bit : 0;
        w->lead2 |= b >= 0xC3 && b <= 0xC9 ? bit : 0;
        w->cont |= b >= 0x80 && b <= 0xBF ? bit : 0;
        w->c3 |= b == 0xC3 ? bit : 0;
        w->x97 |= b == 0x97 || b == 0xB7 ? bit : 0;
    }
}

#if defined(__SSE2__)
static inline __m128i eq16(__m128i v, char x)
{
    return _mm_cmpeq_epi8(v, _mm_set1_epi8(x));
}

static inline uint64_t bits16(__m128i m, unsigned k)
{
    return (uint64_t)(unsigned)_mm_movemask_epi8(m) << (16 * k);
}

static inline void window_sse2(window *w, const unsigned char *c)
{
    memset(w, 0, sizeof *w);
    for (unsigned k = 0; k < 4; k++) {
        __m128i v = _mm_loadu_si128((const __m128i *)(const void *)(c + 16 * k));
        __m128i dot_quote = _mm_or_si128(eq16(v, '.'), eq16(v, '\''));
        w->alpha |= (uint64_t)in_range(_mm_or_si128(v, _mm_set1_epi8(0x20)), 'a', 26) << (16 * k);
        w->digit |= (uint64_t)in_range(v, '0', 10) << (16 * k);
        w->under |= bits16(eq16(v, '_'), k);
        w->high |= bits16(v, k);
        w->hyphen |= bits16(eq16(v, '-'), k);
        w->mid_letter |= bits16(_mm_or_si128(dot_quote, eq16(v, ':')), k);
        w->mid_num |= bits16(_mm_or_si128(dot_quote, _mm_or_si128(eq16(v, ','), eq16(v, ';'))), k);
        w->term |= bits16(_mm_or_si128(eq16(v, '.'), _mm_or_si128(eq16(v, '!'), eq16(v, '?'))), k);
        w->e2 |= bits16(eq16(v, (char)0xE2), k);
        w->b80 |= bits16(eq16(v, (char)0x80), k);
        w->b82 |= bits16(eq16(v, (char)0x82), k);
        __m128i dq = _mm_or_si128(_mm_or_si128(eq16(v, (char)0x93), eq16(v, (char)0x94)),
                                  _mm_or_si128(eq16(v, (char)0x9C), eq16(v, (char)0x9D)));
        w->dash_quote |= bits16(dq, k);
        w->apos |= bits16(_mm_or_si128(eq16(v, (char)0x98), eq16(v, (char)0x99)), k);
        w->euro |= bits16(eq16(v, (char)0xAC), k);
        w->lead2 |= (uint64_t)in_range(v, 0xC3, 7) << (16 * k);
        w->cont |= (uint64_t)in_range(v, 0x80, 64) << (16 * k);
        w->c3 |= bits16(eq16(v, (char)0xC3), k);
        w->x97 |= bits16(_mm_or_si128(eq16(v, (char)0x97), eq16(v, (char)0xB7)), k);
    }
}
#endif

#if TTI_SIMD_WIDE
__attribute__((target("avx2"))) static inline __m256i eq32(__m256i v, char x)
{
    return _mm256_cmpeq_epi8(v, _mm256_set1_epi8(x));
}

__attribute__((target("avx2"))) static inline __m256i or32(__m256i a, __m256i b)
{
    return _mm256_or_si256(a, b);
}

/* The 64-bit mask of a byte test f on both halves. */
#define BOTH(f) ((uint64_t)(uint32_t)_mm256_movemask_epi8(f(lo)) | \
                 (uint64_t)(uint32_t)_mm256_movemask_epi8(f(hi)) << 32)

__attribute__((target("avx2"))) static inline void window_avx2(window *w, const unsigned char *c)
{
    const __m256i lo = _mm256_loadu_si256((const __m256i *)(const void *)c);
    const __m256i hi = _mm256_loadu_si256((const __m256i *)(const void *)(c + 32));
#define ALPHA(v) in_range_v32(or32(v, _mm256_set1_epi8(0x20)), 'a', 26)
#define DIGIT(v) in_range_v32(v, '0', 10)
#define SELF(v) (v)
#define UNDER(v) eq32(v, '_')
#define HYPHEN(v) eq32(v, '-')
#define MID_LETTER(v) or32(or32(eq32(v, '.'), eq32(v, '\'')), eq32(v, ':'))
#define MID_NUM(v) or32(or32(eq32(v, '.'), eq32(v, '\'')), or32(eq32(v, ','), eq32(v, ';')))
#define TERM(v) or32(eq32(v, '.'), or32(eq32(v, '!'), eq32(v, '?')))
#define E2(v) eq32(v, (char)0xE2)
#define B80(v) eq32(v, (char)0x80)
#define B82(v) eq32(v, (char)0x82)
#define DASH_QUOTE(v) or32(or32(eq32(v, (char)0x93), eq32(v, (char)0x94)), \
                           or32(eq32(v, (char)0x9C), eq32(v, (char)0x9D)))
#define APOS(v) or32(eq32(v, (char)0x98), eq32(v, (char)0x99))
#define EURO(v) eq32(v, (char)0xAC)
#define LEAD2(v) in_range_v32(v, 0xC3, 7)
#define CONT(v) in_range_v32(v, 0x80, 64)
#define C3(v) eq32(v, (char)0xC3)
#define X97(v) or32(eq32(v, (char)0x97), eq32(v, (char)0xB7))
    w->alpha = BOTH(ALPHA);
    w->digit = BOTH(DIGIT);
    w->under = BOTH(UNDER);
    w->high = BOTH(SELF);
    w->hyphen = BOTH(HYPHEN);
    w->mid_letter = BOTH(MID_LETTER);
    w->mid_num = BOTH(MID_NUM);
    w->term = BOTH(TERM);
    if (w->high) {
        w->e2 = BOTH(E2);
        w->b80 = BOTH(B80);
        w->b82 = BOTH(B82);
        w->dash_quote = BOTH(DASH_QUOTE);
        w->apos = BOTH(APOS);
        w->euro = BOTH(EURO);
        w->lead2 = BOTH(LEAD2);
        w->cont = BOTH(CONT);
        w->c3 = BOTH(C3);
        w->x97 = BOTH(X97);
    } else {
        w->e2 = w->b80 = w->b82 = w->dash_quote = w->apos = w->euro = 0;
        w->lead2 = w->cont = w->c3 = w->x97 = 0;
    }
#undef ALPHA
#undef DIGIT
#undef SELF
#undef UNDER
#undef HYPHEN
#undef MID_LETTER
#undef MID_NUM
#undef TERM
#undef E2
#undef B80
#undef B82
#undef DASH_QUOTE
#undef APOS
#undef EURO
#undef LEAD2
#undef CONT
#undef C3
#undef X97
}
#undef BOTH
#endif

/* What the masks of a window decide: the tokens' start bits and end bits
 * (the i-th end is the i-th start's token's end; the ends stop before the
 * first byte the masks cannot decide, the starts do not), the terminals
 * . ! ? outside tokens, and word_ends: a token's end bit is in it when the
 * token holds a letter (a word; else a number). */
typedef struct window_tokens_of {
    uint64_t starts, ends, terminals, word_ends;
} window_tokens_of;

__attribute__((always_inline)) static inline window_tokens_of window_decide(const window *wp)
{
    window w = *wp;
    /* Two-byte letters (U+00C0-U+027F but U+00D7 and U+00F7, all
     * Word_Break ALetter in WordBreakProperty.txt): both bytes count as
     * letters, so that "Ibáñez" and "Château-Brume" stay in the window.
     * (A lead in the last byte pairs with nothing: cont >> 1 has no bit 63,
     * since the window does not see that byte's continuation.) */
    const uint64_t pair = w.lead2 & (w.cont >> 1) & ~(w.c3 & (w.x97 >> 1));
    const uint64_t latin = pair | pair << 1;
    w.alpha |= latin;
    w.high &= ~latin;
    const uint64_t word = w.alpha | w.digit | w.under;
    const uint64_t mid_letter = w.mid_letter, mid_num = w.mid_num;
    /* Three-byte characters the window knows (the first byte's bit): the
     * dashes and double quotes U+2013, U+2014, U+201C, U+201D and the euro
     * sign U+20AC, of Word_Break Other (segments alone, no terminals), and
     * the single quotes U+2018, U+2019, MidNumLet (joined like '.' and
     * '\'', looking three bytes on; not in the window's last four bytes,
     * whose right neighbour it does not see). */
    const uint64_t lead = w.e2 & (w.b80 >> 1);
    const uint64_t other3 = (lead & (w.dash_quote >> 2)) | (w.e2 & (w.b82 >> 1) & (w.euro >> 2));
    const uint64_t apos3 = lead & (w.apos >> 2) & ~((uint64_t)0xF << 60);
    const uint64_t known = other3 | apos3, high = w.high & ~(known | known << 1 | known << 2);
    const uint64_t apos_join = apos3 & (((w.alpha << 1) & (w.alpha >> 3)) |
                                        ((w.digit << 1) & (w.digit >> 3)));
    const uint64_t join = (mid_letter & (w.alpha << 1) & (w.alpha >> 1)) |
                          (mid_num & (w.digit << 1) & (w.digit >> 1)) |
                          (w.hyphen & (word << 1) & ((w.alpha | w.digit) >> 1)) |
                          apos_join | apos_join << 1 | apos_join << 2;
    const uint64_t in = word | join, before = in << 1;
    window_tokens_of r;
    r.starts = in & ~before;
    r.ends = ~in & before;
    const uint64_t stop = high | (r.ends & w.hyphen) |
                          (r.ends & (mid_letter | mid_num) & (high >> 1)) |
                          (r.ends & apos3 & (high >> 3)) | (r.starts & w.under) |
                          ((uint64_t)1 << 63);
    r.ends &= ((uint64_t)1 << __builtin_ctzll(stop)) - 1;
    /* the terminals not yet passed (none is inside a token), and a bit at
     * the end of each token that holds a letter: adding a token's letters
     * to its bits carries out of its last bit onto the byte after it (a
     * byte outside every token, so the carry stops there) */
    r.terminals = w.term & ~in;
    r.word_ends = (in + w.alpha) & ~in;
    return r;
}

/* The terminals gap (bits of the window at p, all before the next token)
 * passed: each a sentence end or an abbreviation's period (tti_terminal),
 * the last token before them (when have_prev) at prev_a..prev_end of the
 * window. *at_start and *suffix are the tokenizer's pending sentence start
 * and "Inc."-like suffix, before and after. */
static inline void window_terminals(tt_tokenizer *t, const unsigned char *s, size_t p,
                                    uint64_t gap, int have_prev, unsigned prev_a,
                                    unsigned prev_end, int *at_start, int *suffix)
{
    t->at_sentence_start = *at_start;
    if (have_prev) {
        t->prev_off = p + prev_a;
        t->prev_end = p + prev_end;
    }
    for (; gap; gap &= gap - 1) {
        size_t at = p + (size_t)__builtin_ctzll(gap);
        if (s[at] == '.' && t->prev_end == at && at - t->prev_off <= TTI_ABBREV_MAX) {
            tti_terminal(t, s, at, at + 1); /* maybe an abbreviation's period */
        } else {
            /* what tti_terminal decides without a list: a sentence end */
            t->pending_suffix = 0;
            t->at_sentence_start = 1;
        }
    }
    *at_start = t->at_sentence_start;
    *suffix = t->pending_suffix;
}

/* Whether the token starting at first starts a sentence, given the pending
 * sentence start and suffix: after "Inc." a lower-case word or a number
 * goes on the sentence. */
static inline int window_suffix_rule(const unsigned char *first, int at_start, int suffix)
{
    if (at_start && suffix) {
        unsigned b = *first;
        return !((b >= 'a' && b <= 'z') || (b >= '0' && b <= '9'));
    }
    return at_start;
}

/* The tokenizer after a window whose last token taken is [a, e) of the
 * window at p: it goes on from the token's end, which it remembers, with no
 * sentence start or suffix pending. */
static inline void window_close(tt_tokenizer *t, size_t p, size_t a, size_t e)
{
    t->pos = p + e;
    t->prev_off = p + a;
    t->prev_end = p + e;
    t->at_sentence_start = 0;
    t->pending_suffix = 0;
}

/* What window_take_into hands each token to: ctx, the token's number in
 * this window (from 0), and the token (as tt_token's fields). */
typedef void (*tti_window_emit)(void *ctx, size_t n, size_t off, size_t len, tt_token_kind kind,
                                int sentence_start);

/* The tokens of the window at t->pos = p whose masks are w, at most max of
 * them, each to emit(ctx, ...) in text order; t->pos goes to the end of the
 * last one. The masks are of the 64 bytes from p, or of the text's last
 * bytes padded with NUL (a byte that joins nothing and is no terminal, as
 * the end of the text). Returns how many: 0 when the first token is not one
 * the masks decide, and the walk must. Always inlined, with emit (a
 * constant at every call), so the masks stay in registers. */
__attribute__((always_inline)) static inline size_t
window_take_into(tt_tokenizer *restrict t, const unsigned char *s, size_t p, size_t max,
                 const window *wp, tti_window_emit emit, void *ctx)
{
    const window_tokens_of d = window_decide(wp);
    uint64_t starts = d.starts, ends = d.ends, terminals = d.terminals;
    const uint64_t word_ends = d.word_ends;

    size_t n = 0;
    unsigned from = 0, a = 0, e = 0, prev_a = 0;
    int at_start = t->at_sentence_start, suffix = t->pending_suffix;
    while (ends && n < max) {
        const uint64_t start_bit = starts & -starts, end_bit = ends & -ends;
        a = (unsigned)__builtin_ctzll(starts);
        e = (unsigned)__builtin_ctzll(ends);
        starts ^= start_bit;
        ends ^= end_bit;
        const uint64_t gap = terminals & (start_bit - 1);
        if (gap) {
            terminals ^= gap;
            window_terminals(t, s, p, gap, n != 0, prev_a, from, &at_start, &suffix);
        }
        at_start = window_suffix_rule(s + p + a, at_start, suffix);
        emit(ctx, n, p + a, e - a, (word_ends & end_bit) ? TT_TOKEN_WORD : TT_TOKEN_NUMBER,
             at_start);
        n++;
        prev_a = a;
        suffix = 0;
        at_start = 0;
        from = e;
    }
    if (n)
        window_close(t, p, a, e);
    return n;
}


#endif
