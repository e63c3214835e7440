/* termtide — the segment stage: UAX #29 default word boundaries and the
 * tokens (words and numbers) built from them.
 *
 * Word boundaries follow Unicode Standard Annex #29, "Unicode Text
 * Segmentation", section 4.1.1 (Word Boundary Rules, WB1–WB999), for
 * Unicode 15.0 (TT_UNICODE_VERSION); they are checked against all cases of
 * Unicode's WordBreakTest.txt by tests/test_wordbreak_uax29.c.
 *
 * How the rules are run. segment_end() walks forward from a boundary one
 * character at a time and decides, at each position between the previous
 * character and the current one, "break" or "no break", in rule order:
 *   - rules WB3–WB3d look at the raw neighbours (CR LF, newlines, ZWJ before
 *     an Extended_Pictographic, WSegSpace runs);
 *   - WB4 makes Extend, Format and ZWJ invisible to the later rules: they
 *     never break from what precedes them, and the later rules see the last
 *     character that was not one of them. So the walk keeps three facts:
 *     `raw` (the property of the character just before the position, for
 *     WB3c/WB3d), `prev` and `prev2` (the last two characters the later rules
 *     see, for WB7, WB7c and WB11, which look one character back);
 *   - WB6, WB7b and WB12 look one visible character ahead (skipping
 *     Extend/Format/ZWJ) with next_visible();
 *   - WB15/WB16 pair regional indicators: `ri_odd` says an odd number of
 *     them ends at `prev`.
 * Starting at a boundary with no history is exact. WB7, WB7c and WB11 look
 * back past the character after a boundary only if that character is a
 * Mid* or quote character whose right neighbour completes the rule; but then WB6, WB7b or
 * WB12, seeing the same three characters, would have refused the break, so
 * the position was no boundary. For WB15/WB16, a boundary between regional
 * indicators only falls after an even number of them, so counting restarts.
 *
 * Cost. Each character is classified by one lookup in a two-stage table
 * generated from the Unicode data (src/wordbreak_data.h); bytes below 0x80
 * index the table directly with no UTF-8 decoding. Inside a word, ASCII
 * letters, digits and '_' never break from a letter, digit or '_' before
 * them (WB5, WB8–WB10, WB13a, WB13b), so such runs are consumed by a tight
 * loop. The lookahead of WB6/WB7b/WB12 crosses only Extend/Format/ZWJ
 * characters that the walk then consumes, so every byte is read at most
 * twice: O(n) per text, whatever its shape.
 *
 * Tokens. A token is a segment holding a letter or a digit (Word_Break
 * Numeric, which covers every decimal digit, General_Category Nd). Token
 * segments joined by a single hyphen segment (U+002D, U+2010 or U+2011,
 * nothing attached) become one token. ASCII spaces and punctuation, the
 * most common non-token segments, are stepped over without entering
 * segment_end(). Most tokens of filing prose (nine in ten on the
 * benchmark's) are ASCII runs followed by a space or a punctuation mark:
 * fast_token() takes them with the chunk masks alone. tt_tokenizer_fill()
 * goes further: where the text is ASCII (and the dashes, quotes and euro
 * sign of filings, and the two-byte Latin letters) it takes all the tokens
 * of a 64-byte window from its bit masks, with no walk (the windows are in
 * segment_internal.h, shared with the counter's fused path; a text's last
 * bytes are padded to a window): 99.6% of the benchmark's tokens, 7 a
 * window, and hardly a mispredicted branch. The tokenizer
 * never allocates or copies, and never walks back: an over-long token (a
 * 50 MB run of letters, a base64 blob) is walked once, counted, and
 * dropped. */
#include "segment_internal.h" /* the windows; first, for its SIMD headers */

#include <pthread.h>

#include "termtide/simd.h"
#include "tt_internal.h"

#include "termtide/segment.h"
#include "wordbreak_data.h"

/* Bits segment_end() reports about the characters of a segment. The letter
 * and terminal bits are those of the class table; the digit bit is ours. */
#define SEEN_LETTER TTI_WB_LETTER
#define SEEN_TERMINAL TTI_WB_TERMINAL
#define SEEN_DIGIT 0x100u

#define BIT(p) (1u << (p))
/* AHLetter, MidNumLetQ and friends, as sets of property values (UAX #29
 * section 4.1.1 macros). */
#define SET_AHLETTER (BIT(TTI_WB_ALETTER) | BIT(TTI_WB_HEBREW_LETTER))
#define SET_MIDNUMLETQ (BIT(TTI_WB_MIDNUMLET) | BIT(TTI_WB_SINGLE_QUOTE))
#define SET_IGNORED (BIT(TTI_WB_EXTEND) | BIT(TTI_WB_FORMAT) | BIT(TTI_WB_ZWJ))
#define SET_NEWLINE (BIT(TTI_WB_CR) | BIT(TTI_WB_LF) | BIT(TTI_WB_NEWLINE))
/* Previous characters after which an ASCII letter, digit or '_' (the bytes
 * of tti_wb_ascii_run) never breaks (WB5, WB8, WB9, WB10, WB13a, WB13b). */
#define SET_WORDRUN_PREV \
    (SET_AHLETTER | BIT(TTI_WB_NUMERIC) | BIT(TTI_WB_EXTENDNUMLET))

const char *tt_unicode_version(void)
{
    return TT_UNICODE_VERSION;
}

/* Decodes the character at s (n > 0 bytes available) and returns its class
 * byte, storing its length in *adv. Kept inline here, rather than calling
 * tti_utf8_decode(), because it runs once per non-ASCII character on the hot
 * path. Invalid or truncated sequences (the decode stage has already
 * repaired the text, so these only come from a careless caller) count as one
 * byte of U+FFFD, class Other, exactly as tti_utf8_decode() reads them. */
static inline unsigned class_at(const unsigned char *s, size_t n, size_t *adv)
{
    unsigned c = s[0];
    if (c < 0x80) {
        *adv = 1;
        return tti_wb_stage2[c];
    }
    uint32_t cp, min;
    size_t len;
    if (c >= 0xC2 && c <= 0xDF) {
        len = 2; cp = c & 0x1F; min = 0x80;
    } else if (c >= 0xE0 && c <= 0xEF) {
        len = 3; cp = c & 0x0F; min = 0x800;
    } else if (c >= 0xF0 && c <= 0xF4) {
        len = 4; cp = c & 0x07; min = 0x10000;
    } else {
        goto invalid;
    }
    if (n < len)
        goto invalid;
    for (size_t i = 1; i < len; i++) {
        if ((s[i] & 0xC0) != 0x80)
            goto invalid;
        cp = (cp << 6) | (s[i] & 0x3Fu);
    }
    if (cp < min || cp > TTI_WB_MAX_CP || (cp >= 0xD800 && cp <= 0xDFFF))
        goto invalid;
    *adv = len;
    return tti_wb_class(cp);
invalid:
    *adv = 1;
    return tti_wb_class(0xFFFD);
}

/* The property of the first character at or after q that is not Extend,
 * Format or ZWJ (WB4), or Other at the end of the text. */
static unsigned next_visible(const unsigned char *s, size_t len, size_t q)
{
    while (q < len) {
        size_t n;
        unsigned p = class_at(s + q, len - q, &n) & TTI_WB_PROP_MASK;
        if (!(BIT(p) & SET_IGNORED))
            return p;
        q += n;
    }
    return TTI_WB_OTHER;
}

/* Whether the character at s[q..] (q < len) is a segment alone whatever
 * precedes it, and no token: Word_Break Other with no letter, terminal or
 * Extended_Pictographic bit (dashes, most quotation marks, symbols),
 * followed by an ASCII byte or the end. No rule joins anything to Other
 * (WB4 and WB3d need Extend/Format/ZWJ or WSegSpace; WB3c needs ZWJ before
 * an Extended_Pictographic), and after it only a non-ASCII character could
 * be joined (WB4). *n gets its length. */
static inline int lone_other(const unsigned char *s, size_t len, size_t q, size_t *n)
{
    return class_at(s + q, len - q, n) == TTI_WB_OTHER && (q + *n >= len || s[q + *n] < 0x80);
}

/* Rules WB5–WB16 at the position before cur (at s[q..], the character
 * after it at s[after..]). Returns 1 for "no break". WB999 is the fallback:
 * break. */
static int joins(unsigned prev2, unsigned prev, unsigned cur, int ri_odd,
                 const unsigned char *s, size_t len, size_t after)
{
    unsigned bp = BIT(prev), bc = BIT(cur);

    if (bp & SET_AHLETTER) {
        if (bc & SET_AHLETTER)                                   /* WB5 */
            return 1;
        if ((bc & (BIT(TTI_WB_MIDLETTER) | SET_MIDNUMLETQ)) &&   /* WB6 */
            (BIT(next_visible(s, len, after)) & SET_AHLETTER))
            return 1;
        if (prev == TTI_WB_HEBREW_LETTER) {
            if (cur == TTI_WB_SINGLE_QUOTE)                      /* WB7a */
                return 1;
            if (cur == TTI_WB_DOUBLE_QUOTE &&                    /* WB7b */
                next_visible(s, len, after) == TTI_WB_HEBREW_LETTER)
                return 1;
        }
        if (cur == TTI_WB_NUMERIC)                               /* WB9 */
            return 1;
        return cur == TTI_WB_EXTENDNUMLET;                       /* WB13a */
    }
    if ((bp & (BIT(TTI_WB_MIDLETTER) | SET_MIDNUMLETQ)) &&      /* WB7 */
        (BIT(prev2) & SET_AHLETTER) && (bc & SET_AHLETTER))
        return 1;
    if (prev == TTI_WB_DOUBLE_QUOTE && prev2 == TTI_WB_HEBREW_LETTER && /* WB7c */
        cur == TTI_WB_HEBREW_LETTER)
        return 1;
    if (prev == TTI_WB_NUMERIC) {
        if (cur == TTI_WB_NUMERIC)                               /* WB8 */
            return 1;
        if (bc & SET_AHLETTER)                                   /* WB10 */
            return 1;
        if ((bc & (BIT(TTI_WB_MIDNUM) | SET_MIDNUMLETQ)) &&      /* WB12 */
            next_visible(s, len, after) == TTI_WB_NUMERIC)
            return 1;
        return cur == TTI_WB_EXTENDNUMLET;                       /* WB13a */
    }
    if ((bp & (BIT(TTI_WB_MIDNUM) | SET_MIDNUMLETQ)) &&          /* WB11 */
        prev2 == TTI_WB_NUMERIC && cur == TTI_WB_NUMERIC)
        return 1;
    if (prev == TTI_WB_KATAKANA)                           /* WB13, WB13a */
        return cur == TTI_WB_KATAKANA || cur == TTI_WB_EXTENDNUMLET;
    if (prev == TTI_WB_EXTENDNUMLET)                       /* WB13a, WB13b */
        return (bc & (SET_AHLETTER | BIT(TTI_WB_NUMERIC) | BIT(TTI_WB_KATAKANA) |
                      BIT(TTI_WB_EXTENDNUMLET))) != 0;
    if (prev == TTI_WB_REGIONAL_INDICATOR)                 /* WB15, WB16 */
        return cur == TTI_WB_REGIONAL_INDICATOR && ri_odd;
    return 0;                                                     /* WB999 */
}

/* The next word boundary after pos (< len), a boundary itself. *seen gets
 * the SEEN_ bits of the segment's characters. */
static size_t segment_end(const unsigned char *s, size_t len, size_t pos,
                          unsigned *seen)
{
    size_t n, p;
    unsigned c = class_at(s + pos, len - pos, &n);
    unsigned prev = c & TTI_WB_PROP_MASK;
    unsigned acc = c, digit = prev == TTI_WB_NUMERIC ? SEEN_DIGIT : 0;

    p = pos + n;
    if (BIT(prev) & SET_NEWLINE) {
        /* WB3: CR × LF; WB3a: break after any newline. */
        if (prev == TTI_WB_CR && p < len && s[p] == '\n')
            p++;
        *seen = acc & (SEEN_LETTER | SEEN_TERMINAL);
        return p;
    }
    unsigned prev2 = TTI_WB_OTHER, raw = prev;
    int ri_odd = prev == TTI_WB_REGIONAL_INDICATOR;

    while (p < len) {
        if (BIT(prev) & SET_WORDRUN_PREV) {
            /* Fast path: ASCII letters, digits and '_' inside a word. */
            size_t q = p;
            unsigned f, run = 0;
            while (q < len && (f = tti_wb_ascii_run[s[q]]) != 0) {
                run |= f;
                q++;
            }
            if (q > p) {
                acc |= run & SEEN_LETTER;
                if (run & TTI_WB_RUN_DIGIT)
                    digit = SEEN_DIGIT;
                prev2 = q - p >= 2 ? tti_wb_stage2[s[q - 2]] & TTI_WB_PROP_MASK : prev;
                prev = raw = tti_wb_stage2[s[q - 1]] & TTI_WB_PROP_MASK;
                ri_odd = 0;
                p = q;
                if (p >= len)
                    break;
            }
        }

        c = class_at(s + p, len - p, &n);
        unsigned cur = c & TTI_WB_PROP_MASK;
        if (BIT(cur) & SET_NEWLINE)                                 /* WB3b */
            break;
        if ((raw == TTI_WB_ZWJ && (c & TTI_WB_EXTPICT)) ||         /* WB3c */
            (raw == TTI_WB_WSEGSPACE && cur == TTI_WB_WSEGSPACE)) { /* WB3d */
            /* joined; falls through to the bookkeeping below */
        } else if (BIT(cur) & SET_IGNORED) {                          /* WB4 */
            acc |= c;
            raw = cur;
            p += n;
            continue;
        } else if (!joins(prev2, prev, cur, ri_odd, s, len, p + n)) {
            break;
        }
        acc |= c;
        if (cur == TTI_WB_NUMERIC)
            digit = SEEN_DIGIT;
        ri_odd = cur == TTI_WB_REGIONAL_INDICATOR ? !ri_odd : 0;
        prev2 = prev;
        prev = raw = cur;
        p += n;
    }
    *seen = (acc & (SEEN_LETTER | SEEN_TERMINAL)) | digit;
    return p;
}

size_t tt_wordbreak_next(const char *text, size_t len, size_t pos)
{
    unsigned seen;
    if (!text || pos >= len)
        return len;
    return segment_end((const unsigned char *)text, len, pos, &seen);
}

/* ---- chunk masks ---------------------------------------------------------
 *
 * Between tokens and inside ASCII words the walk asks two questions: where
 * does this run of [A-Za-z0-9_] end, and where is the next byte that is not
 * a plain ASCII separator. Both are answered with bit masks of a 64-byte
 * chunk, made once per chunk (about one instruction per byte with SSE2),
 * then a count of trailing zeros per question, instead of a table lookup
 * per byte:
 *   m_word   [A-Za-z0-9_] (tti_wb_ascii_run != 0)
 *   m_stop   m_word, bytes >= 0x80, CR, and the ASCII sentence terminals
 *            . ! ? (tti_wb_stage2 & TTI_WB_TERMINAL)
 * Positions at or past the end of the text are in m_stop and not in m_word,
 * so both searches stop at the end. Whether a run holds a letter or a digit
 * is read from its bytes, and only for a run that does not start with a
 * letter (most start with one, and then it is a word). */
static void chunk_masks_portable(tt_tokenizer *t, const unsigned char *c, size_t n)
{
    uint64_t w = 0, st = 0;
    for (size_t i = 0; i < n; i++) {
        unsigned b = c[i], f = tti_wb_ascii_run[b];
        uint64_t bit = (uint64_t)1 << i;
        if (f)
            w |= bit;
        if (f || b >= 0x80 || b == '\r' || (tti_wb_stage2[b] & TTI_WB_TERMINAL))
            st |= bit;
    }
    t->m_word = w;
    t->m_stop = st;
}

#if defined(__SSE2__)

static void chunk_masks_sse2(tt_tokenizer *t, const unsigned char *c)
{
    uint64_t w = 0, st = 0;
    for (int k = 0; k < 4; k++) {
        __m128i v = _mm_loadu_si128((const __m128i *)(c + 16 * k));
        uint64_t word = in_range(_mm_or_si128(v, _mm_set1_epi8(0x20)), 'a', 26) |
                        in_range(v, '0', 10) |
                        (unsigned)_mm_movemask_epi8(_mm_cmpeq_epi8(v, _mm_set1_epi8('_')));
        __m128i other = _mm_or_si128(
            _mm_or_si128(_mm_cmpeq_epi8(v, _mm_set1_epi8('.')), _mm_cmpeq_epi8(v, _mm_set1_epi8('!'))),
            _mm_or_si128(_mm_cmpeq_epi8(v, _mm_set1_epi8('?')), _mm_cmpeq_epi8(v, _mm_set1_epi8('\r'))));
        w |= word << (16 * k);
        st |= (word | (unsigned)_mm_movemask_epi8(_mm_or_si128(v, other))) << (16 * k);
    }
    t->m_word = w;
    t->m_stop = st;
}
#endif

#if TTI_SIMD_WIDE
/* The same masks 32 bytes at a time (AVX2, where the CPU has it). */

__attribute__((target("avx2"))) static inline uint32_t in_range32(__m256i v, int lo, int span)
{
    return (uint32_t)_mm256_movemask_epi8(in_range_v32(v, lo, span));
}

__attribute__((target("avx2"))) static void chunk_masks_avx2(tt_tokenizer *t, const unsigned char *c)
{
    uint64_t w = 0, st = 0;
    for (int k = 0; k < 2; k++) {
        __m256i v = _mm256_loadu_si256((const __m256i *)(const void *)(c + 32 * k));
        uint64_t word = in_range32(_mm256_or_si256(v, _mm256_set1_epi8(0x20)), 'a', 26) |
                        in_range32(v, '0', 10) |
                        (uint32_t)_mm256_movemask_epi8(_mm256_cmpeq_epi8(v, _mm256_set1_epi8('_')));
        __m256i other = _mm256_or_si256(
            _mm256_or_si256(_mm256_cmpeq_epi8(v, _mm256_set1_epi8('.')),
                            _mm256_cmpeq_epi8(v, _mm256_set1_epi8('!'))),
            _mm256_or_si256(_mm256_cmpeq_epi8(v, _mm256_set1_epi8('?')),
                            _mm256_cmpeq_epi8(v, _mm256_set1_epi8('\r'))));
        w |= word << (32 * k);
        st |= (word | (uint32_t)_mm256_movemask_epi8(_mm256_or_si256(v, other))) << (32 * k);
    }
    t->m_word = w;
    t->m_stop = st;
}
#endif

/* Makes the masks of the chunk holding position p current; returns p's bit
 * index in them. */
static inline unsigned chunk_at(tt_tokenizer *t, size_t p)
{
    size_t base = p & ~(size_t)63;
    if (t->chunk != base) {
        const unsigned char *c = (const unsigned char *)t->text + base;
        size_t n = t->len - base;
        t->chunk = base;
#if defined(__SSE2__)
        if (tti_use_simd) {
            unsigned char pad[64];
            if (n < 64) {
                /* the text's last chunk, padded with NUL, a byte of no mask */
                memset(pad, 0, sizeof pad);
                memcpy(pad, c, n);
                c = pad;
            }
#if TTI_SIMD_WIDE
            if (t->wide)
                chunk_masks_avx2(t, c);
            else
#endif
                chunk_masks_sse2(t, c);
            if (n >= 64)
                return (unsigned)(p - base);
            t->m_stop |= ~(uint64_t)0 << n;
            return (unsigned)(p - base);
        }
#endif
        chunk_masks_portable(t, c, n < 64 ? n : 64);
        if (n < 64)
            t->m_stop |= ~(uint64_t)0 << n;
    }
    return (unsigned)(p - base);
}

/* The end of the run of [A-Za-z0-9_] starting at p; *seen gets SEEN_LETTER
 * and SEEN_DIGIT for what the run holds. */
static inline size_t word_run_end(tt_tokenizer *t, const unsigned char *s, size_t p,
                                  unsigned *seen)
{
    size_t start = p;
    for (;;) {
        unsigned i = chunk_at(t, p);
        uint64_t past = ~t->m_word >> i; /* bits i.. of the chunk: not in the run */
        if (past) {
            p += (size_t)__builtin_ctzll(past);
            break;
        }
        p += 64 - i;
    }
    unsigned f = tti_wb_ascii_run[s[start]];
    if (f & TTI_WB_LETTER) {
        *seen = SEEN_LETTER;
        return p;
    }
    for (size_t q = start + 1; q < p; q++)
        f |= tti_wb_ascii_run[s[q]];
    *seen = ((f & TTI_WB_LETTER) ? SEEN_LETTER : 0) | ((f & TTI_WB_RUN_DIGIT) ? SEEN_DIGIT : 0);
    return p;
}

/* The first position at or after p whose byte is in m_stop (or the end). */
static inline size_t next_stop(tt_tokenizer *t, size_t p)
{
    for (;;) {
        unsigned i = chunk_at(t, p);
        uint64_t ahead = t->m_stop >> i;
        if (ahead)
            return p + (size_t)__builtin_ctzll(ahead);
        p += 64 - i;
    }
}

void tt_tokenizer_init(tt_tokenizer *t, const char *text, size_t len)
{
    t->text = text;
    t->len = text ? len : 0;
    t->pos = 0;
    t->at_sentence_start = 1;
    t->overlong = 0;
    t->prev_off = t->prev_end = (size_t)-1;
    t->pending_suffix = 0;
    t->chunk = (size_t)-1;
    t->m_word = t->m_stop = 0;
    t->wide = tti_simd_level() >= TT_SIMD_AVX2;
}

/* Abbreviations whose period never ends a sentence: titles, "No.", "U.S.",
 * "approx.", "e.g.", month names, and a single capital letter (an
 * initial). And company suffixes ("Inc.", "Corp.", "Ltd."), whose period
 * ends a sentence unless a lower-case word or a number follows. The lists
 * are common practice in filings, written for this project. */
typedef struct abbrev {
    const char *s;
    unsigned char n;
} abbrev;
#define AB(x) { x, sizeof x - 1 }
static const abbrev never_end[] = {
    AB("mr"), AB("mrs"), AB("ms"), AB("dr"), AB("prof"), AB("no"), AB("nos"), AB("vs"),
    AB("approx"), AB("fig"), AB("figs"), AB("sec"), AB("secs"), AB("st"), AB("jr"), AB("sr"),
    AB("e.g"), AB("i.e"), AB("u.s"), AB("u.k"), AB("cf"), AB("al"), AB("p"), AB("pp"),
    AB("vol"), AB("dept"), AB("govt"), AB("jan"), AB("feb"), AB("apr"), AB("jun"), AB("jul"),
    AB("aug"), AB("sep"), AB("sept"), AB("oct"), AB("nov"), AB("dec"), AB("est"), AB("ref"),
    AB("art"), AB("para"), AB("ch"), AB("sch"), AB("u.s.a"), AB("n.y"), AB("d.c")
};
static const abbrev company_suffix[] = { AB("inc"), AB("corp"), AB("co"), AB("ltd"), AB("llc"),
                                         AB("plc"), AB("lp"), AB("l.p"), AB("n.a"), AB("s.a"),
                                         AB("nv"), AB("n.v"), AB("ag"), AB("etc"), AB("bros"),
                                         AB("assn") };
#undef AB
#define ABBREV_MAX TTI_ABBREV_MAX /* the longest entry */
_Static_assert(ABBREV_MAX <= 8, "an abbreviation's key is one word");

/* The lists as one small hash set of keys: a word of up to eight bytes
 * read into a uint64_t, every byte ORed with 0x20. That lowercases ASCII
 * letters and leaves '.' as it is, and no other byte a token can hold
 * turns into a letter or '.', so equal keys mean the same word in either
 * case. Open addressing, 128 slots for the 63 entries (a multiply-shift of
 * the key), value 1 for never_end and 2 for company_suffix. Made once per
 * process. */
#define ABBREV_SLOTS 128
static uint64_t abbrev_keys[ABBREV_SLOTS];
static unsigned char abbrev_kind[ABBREV_SLOTS];
/* A first filter: per length, a bit for each letter some entry of that
 * length starts with (most words before a period pass no entry's). */
static uint32_t abbrev_first[ABBREV_MAX + 1];
static pthread_once_t abbrev_once = PTHREAD_ONCE_INIT;

static uint64_t abbrev_key(const unsigned char *w, size_t n)
{
    uint64_t k = tti_load_upto8((const char *)w, n);
    return k | (0x2020202020202020ULL >> (8 * (8 - n)));
}

static size_t abbrev_slot(uint64_t k)
{
    return (size_t)((k * 0x9E3779B97F4A7C15ULL) >> 57);
}

static void abbrev_add(const abbrev *list, size_t count, unsigned char kind)
{
    for (size_t i = 0; i < count; i++) {
        uint64_t k = abbrev_key((const unsigned char *)list[i].s, list[i].n);
        size_t j = abbrev_slot(k);
        while (abbrev_kind[j])
            j = (j + 1) % ABBREV_SLOTS;
        abbrev_keys[j] = k;
        abbrev_kind[j] = kind;
        abbrev_first[list[i].n] |= 1u << (list[i].s[0] - 'a');
    }
}

static int abbrev_ready; /* set (release) once the set is made */

static void abbrev_init(void)
{
    abbrev_add(never_end, sizeof never_end / sizeof *never_end, 1);
    abbrev_add(company_suffix, sizeof company_suffix / sizeof *company_suffix, 2);
    __atomic_store_n(&abbrev_ready, 1, __ATOMIC_RELEASE);
}

/* 1: w (n letters, 1..ABBREV_MAX) is in never_end; 2: in company_suffix;
 * 0: neither. */
static unsigned abbrev_lookup(const unsigned char *w, size_t n)
{
    if (!__atomic_load_n(&abbrev_ready, __ATOMIC_ACQUIRE))
        pthread_once(&abbrev_once, abbrev_init);
    unsigned first = (unsigned)(w[0] | 32u) - 'a';
    if (first >= 26 || !((abbrev_first[n] >> first) & 1u))
        return 0;
    uint64_t k = abbrev_key(w, n);
    for (size_t j = abbrev_slot(k); abbrev_kind[j]; j = (j + 1) % ABBREV_SLOTS)
        if (abbrev_keys[j] == k)
            return abbrev_kind[j];
    return 0;
}

/* A segment s[from, to) holding a sentence terminal: a sentence ends
 * there, unless it is the single period of an abbreviation right after it. */
void tti_terminal(tt_tokenizer *t, const unsigned char *s, size_t from, size_t to)
{
    t->pending_suffix = 0;
    if (to == from + 1 && s[from] == '.' && t->prev_end == from) {
        const unsigned char *w = s + t->prev_off;
        size_t n = t->prev_end - t->prev_off;
        if (n > ABBREV_MAX) {
            t->at_sentence_start = 1;
            return;
        }
        if (n == 1 && w[0] >= 'A' && w[0] <= 'Z')
            return;
        unsigned kind = abbrev_lookup(w, n);
        if (kind == 1)
            return;
        if (kind == 2)
            t->pending_suffix = 1;
    }
    t->at_sentence_start = 1;
}

/* The length of a hyphen (U+002D, U+2010 HYPHEN, U+2011 NON-BREAKING
 * HYPHEN) at s, or 0. */
static size_t hyphen_len(const unsigned char *s, size_t n)
{
    if (s[0] == '-')
        return 1;
    if (n >= 3 && s[0] == 0xE2 && s[1] == 0x80 && (s[2] == 0x90 || s[2] == 0x91))
        return 3;
    return 0;
}

#define SEEN_TOKEN (SEEN_LETTER | SEEN_DIGIT)

/* Fast path for the commonest token: runs of ASCII letters, digits and '_'
 * starting at a boundary. Such a run never breaks inside (WB5, WB8–WB10,
 * WB13a, WB13b). At its end, by the character c after it:
 *   - c ASCII: no ASCII character is Extend/Format/ZWJ (WB4), and only the
 *     Mid* and quote characters . : ' , ; can join a letter or digit to what
 *     follows (WB6/WB7: letter, MidLetter or MidNumLetQ, letter; WB11/WB12:
 *     digit, MidNum or MidNumLetQ, digit); every other one breaks (WB999);
 *   - c non-ASCII of Word_Break Other (dashes, most quotation marks):
 *     nothing joins to it, so the segment ends;
 *   - c non-ASCII MidLetter/MidNum/MidNumLet (U+2019 in "company’s"):
 *     as for . : ' , ; when the byte after it is ASCII;
 *   - anything else (a non-ASCII letter, a mark): segment_end() decides.
 * A join is taken when the run's last byte and the byte after c are both
 * ASCII letters (and c is no MidNum) or both digits (and c is no
 * MidLetter); the run then goes on after c. Returns the end, or 0 to leave
 * the decision to segment_end(). */
static inline size_t ascii_word_end(tt_tokenizer *t, const unsigned char *s, size_t len, size_t p,
                             unsigned *seen)
{
    if (!tti_wb_ascii_run[s[p]])
        return 0;
    unsigned run = 0, part;
    size_t q = p;
    for (;;) {
        q = word_run_end(t, s, q, &part);
        run |= part;
        if (q >= len)
            break;
        unsigned c = s[q], prop;
        size_t n = 1;
        if (c < 0x80) {
            prop = tti_wb_stage2[c] & TTI_WB_PROP_MASK;
        } else {
            unsigned cls = class_at(s + q, len - q, &n);
            if (cls == TTI_WB_OTHER)
                break;
            prop = cls & TTI_WB_PROP_MASK;
            if (prop != TTI_WB_MIDLETTER && prop != TTI_WB_MIDNUM && prop != TTI_WB_MIDNUMLET &&
                prop != TTI_WB_SINGLE_QUOTE)
                return 0;
        }
        if (prop != TTI_WB_MIDLETTER && prop != TTI_WB_MIDNUM && prop != TTI_WB_MIDNUMLET &&
            prop != TTI_WB_SINGLE_QUOTE)
            break;
        if (q + n >= len)
            break;
        unsigned next = s[q + n], last = s[q - 1];
        if (next >= 0x80)
            return 0;
        int letters = tti_is_ascii_alpha((int)last) && tti_is_ascii_alpha((int)next) &&
                      prop != TTI_WB_MIDNUM;
        int digits = last >= '0' && last <= '9' && next >= '0' && next <= '9' &&
                     prop != TTI_WB_MIDLETTER;
        if (!letters && !digits)
            break;
        q += n;
    }
    *seen = run;
    return q;
}

static inline int is_mid(unsigned prop)
{
    return prop == TTI_WB_MIDLETTER || prop == TTI_WB_MIDNUM || prop == TTI_WB_MIDNUMLET ||
           prop == TTI_WB_SINGLE_QUOTE;
}

/* The fastest path, for the commonest tokens: runs of [A-Za-z0-9_] from p
 * (whose byte is one), joined across Mid* characters followed by an ASCII
 * letter or digit as ascii_word_end joins them ("U.S", "1,200.50",
 * "company\u2019s") and across a hyphen followed by one ("long-term"), up
 * to a character that cannot join: the token is then the one
 * ascii_word_end and the hyphen loop of tt_tokenizer_next find. After it, a
 * space or LF, or one ASCII punctuation character (not CR) and a space or
 * LF, are stepped over too ("rose, ", "year.\n"): an LF is a segment alone
 * (WB3a), so is a single space before an ASCII byte (WB3d joins spaces
 * only) and so is the punctuation, and only a terminal among them matters;
 * otherwise the walk goes on at the token's end. Anything
 * else (a Mid* character before non-ASCII, a mark, a hyphen before no
 * letter or digit, an over-long run) returns 0, having changed nothing but
 * the chunk masks, and the full walk decides. */
__attribute__((always_inline)) static inline int
fast_token(tt_tokenizer *restrict t, const unsigned char *s, size_t len, size_t p,
           tt_token *restrict tok)
{
    size_t q = p, e;
    unsigned c;
    for (;;) {
        unsigned i = chunk_at(t, q);
        uint64_t past = ~t->m_word >> i;
        if (!past) { /* the run goes on into the next chunk */
            q += 64 - i;
            if (q - p > TT_LIMIT_TOKEN_BYTES)
                return 0;
            continue;
        }
        e = q + (size_t)__builtin_ctzll(past);
        if (e + 1 >= len || e - p > TT_LIMIT_TOKEN_BYTES)
            return 0;
        c = s[e];
        if (c == ' ' || c == '\n')
            break;
        size_t n = 1;
        unsigned prop;
        if (c < 0x80) {
            if (c == '-') {
                /* token, hyphen, token ("year-over-year"): joined as the
                 * hyphen loop of tt_tokenizer_next joins them when the
                 * token so far starts with a letter or digit (so holds
                 * one) and an ASCII letter or digit follows the hyphen
                 * (the segment after it is a token); anything else there
                 * is left to it */
                if (!(tti_wb_ascii_run[s[e + 1]] & (TTI_WB_LETTER | TTI_WB_RUN_DIGIT)) ||
                    !(tti_wb_ascii_run[s[p]] & (TTI_WB_LETTER | TTI_WB_RUN_DIGIT)))
                    return 0;
                q = e + 1;
                continue;
            }
            prop = tti_wb_stage2[c] & TTI_WB_PROP_MASK;
        } else {
            if (hyphen_len(s + e, len - e))
                return 0;
            unsigned cls = class_at(s + e, len - e, &n);
            if (cls == TTI_WB_OTHER)
                break;
            prop = cls & TTI_WB_PROP_MASK;
            if (!is_mid(prop))
                return 0;
        }
        if (!is_mid(prop))
            break;
        if (e + n >= len)
            return 0;
        unsigned next = s[e + n], last = s[e - 1];
        if (next >= 0x80)
            return 0;
        int letters = tti_is_ascii_alpha((int)last) && tti_is_ascii_alpha((int)next) &&
                      prop != TTI_WB_MIDNUM;
        int digits = tti_is_ascii_digit((int)last) && tti_is_ascii_digit((int)next) &&
                     prop != TTI_WB_MIDLETTER;
        if (!letters && !digits)
            break;
        q = e + n;
    }
    unsigned b = s[p];
    tt_token_kind kind = TT_TOKEN_WORD;
    if (!tti_is_ascii_alpha((int)b)) {
        /* a word if any letter, a number if digits only, else ("__") no
         * token: the full walk */
        unsigned f = 0;
        for (size_t k = p; k < e; k++)
            f |= tti_wb_ascii_run[s[k]];
        if (f & TTI_WB_LETTER)
            kind = TT_TOKEN_WORD;
        else if (f & TTI_WB_RUN_DIGIT)
            kind = TT_TOKEN_NUMBER;
        else
            return 0;
    }
    tok->off = p;
    tok->len = e - p;
    tok->kind = kind;
    tok->sentence_start = t->at_sentence_start;
    /* after "Inc." a lower-case word or a number goes on the sentence */
    if (tok->sentence_start && t->pending_suffix &&
        ((b >= 'a' && b <= 'z') || (b >= '0' && b <= '9')))
        tok->sentence_start = 0;
    t->pending_suffix = 0;
    t->at_sentence_start = 0;
    t->prev_off = p;
    t->prev_end = e;
    size_t after;
    unsigned d = s[e + 1];
    if (c == ' ' || c == '\n') {
        after = e + 1;
    } else if ((d == ' ' || d == '\n') && c < 0x80 && c != '\r') {
        after = e + 2;
        if (tti_wb_stage2[c] & TTI_WB_TERMINAL)
            tti_terminal(t, s, e, e + 1);
    } else {
        t->pos = e;
        return 1;
    }
    t->pos = after < len && s[after] < 0x80 ? after : after - 1;
    return 1;
}

/* window_take_into's tokens into an array (ctx). */
__attribute__((always_inline)) static inline void emit_token(void *ctx, size_t n, size_t off,
                                                             size_t len, tt_token_kind kind,
                                                             int sentence_start)
{
    tt_token *tok = (tt_token *)ctx + n;
    tok->off = off;
    tok->len = len;
    tok->kind = kind;
    tok->sentence_start = sentence_start;
}

/* The tokens of the window of the 64 bytes c, the window at p of the text
 * s, into toks (at most max). */
#if TTI_SIMD_WIDE
__attribute__((target("avx2"))) static size_t
window_tokens_avx2(tt_tokenizer *restrict t, const unsigned char *s, const unsigned char *c,
                   size_t p, tt_token *restrict toks, size_t max)
{
    window w;
    window_avx2(&w, c);
    return window_take_into(t, s, p, max, &w, emit_token, toks);
}
#endif

static size_t window_tokens(tt_tokenizer *restrict t, const unsigned char *s,
                            const unsigned char *c, size_t p, tt_token *restrict toks, size_t max)
{
    window w;
#if TTI_SIMD_WIDE
    if (t->wide && tti_use_simd)
        return window_tokens_avx2(t, s, c, p, toks, max);
#endif
#if defined(__SSE2__)
    if (tti_use_simd)
        window_sse2(&w, c);
    else
#endif
        window_portable(&w, c);
    return window_take_into(t, s, p, max, &w, emit_token, toks);
}

int tt_tokenizer_next(tt_tokenizer *t, tt_token *tok)
{
    const unsigned char *s = (const unsigned char *)t->text;
    size_t len = t->len, p = t->pos;

    while (p < len) {
        unsigned b = s[p];
        if (tti_wb_ascii_run[b] && fast_token(t, s, len, p, tok))
            return 1;
        if (b < 0x80 && !tti_wb_ascii_run[b] && b != '\r') {
            /* Fast path: ASCII spaces and punctuation. An ASCII character
             * that is not a letter, digit, '_' or CR starts no rule that
             * joins it to the next character, except WB3d (a space run) and
             * WB4 (Extend/Format/ZWJ, never ASCII); so, before an ASCII
             * byte or the end, it is a segment alone. A run of such
             * characters that are not terminals either is stepped over with
             * the chunk masks, up to the next byte that matters; if that
             * byte is not ASCII, the run's last segment (a space run or one
             * character) is left to the walk below, which then meets it. */
            if (!(tti_wb_stage2[b] & TTI_WB_TERMINAL)) {
                size_t r = next_stop(t, p + 1), n;
                while (r < len && s[r] >= 0x80 && lone_other(s, len, r, &n))
                    r = next_stop(t, r + n);
                if (r >= len || s[r] < 0x80) {
                    p = r;
                    continue;
                }
                size_t q = r - 1;
                if (s[q] == ' ')
                    while (q > p && s[q - 1] == ' ')
                        q--;
                p = q;
                b = s[p];
            }
            size_t q = p + 1;
            if (b == ' ')
                while (q < len && s[q] == ' ')
                    q++;
            if (q == len || s[q] < 0x80) {
                if (tti_wb_stage2[b] & TTI_WB_TERMINAL)
                    tti_terminal(t, s, p, q);
                p = q;
                continue;
            }
        }
        unsigned seen;
        size_t n;
        if (b >= 0x80 && lone_other(s, len, p, &n)) {
            p += n;
            continue;
        }
        size_t end = b < 0x80 ? ascii_word_end(t, s, len, p, &seen) : 0;
        if (!end)
            end = segment_end(s, len, p, &seen);
        if (!(seen & SEEN_TOKEN)) {
            /* Punctuation, spaces, symbols: only a sentence end matters.
             * Terminals inside a token segment ("3.5", "e.g") are not
             * sentence ends, which is why only these segments count. */
            if (seen & SEEN_TERMINAL)
                tti_terminal(t, s, p, end);
            p = end;
            continue;
        }

        size_t start = p;
        unsigned kinds = seen;
        int ends_sentence = 0;
        p = end;
        /* Hyphen joining: token, one hyphen, token. A token segment ends
         * before any hyphen (Other breaks from everything, WB999), so the
         * hyphen always starts a segment. If marks are attached to it (WB4),
         * the segment after the hyphen starts with a mark, which breaks from
         * whatever follows (WB999) and holds no letter or digit: such a
         * hyphen never joins, as the contract wants. A follower that is not
         * a token is consumed here too (its only effect is a sentence end),
         * so nothing is walked twice. */
        while (p < len) {
            size_t h = hyphen_len(s + p, len - p);
            unsigned fseen;
            if (!h || p + h >= len)
                break;
            size_t fend = s[p + h] < 0x80 ? ascii_word_end(t, s, len, p + h, &fseen) : 0;
            if (!fend)
                fend = segment_end(s, len, p + h, &fseen);
            if (!(fseen & SEEN_TOKEN)) {
                ends_sentence = (fseen & SEEN_TERMINAL) != 0;
                t->pos = fend;
                goto emit;
            }
            kinds |= fseen;
            p = fend;
        }
        t->pos = p;
    emit:
        if (p - start > TT_LIMIT_TOKEN_BYTES) {
            /* Skipped, and the pending sentence start waits for the next
             * token that is kept, so sentence counts do not drop. */
            t->overlong++;
            if (ends_sentence)
                t->at_sentence_start = 1;
            p = t->pos;
            continue;
        }
        tok->off = start;
        tok->len = p - start;
        tok->kind = (kinds & SEEN_LETTER) ? TT_TOKEN_WORD : TT_TOKEN_NUMBER;
        tok->sentence_start = t->at_sentence_start;
        /* after "Inc." a lower-case word or a number goes on the sentence */
        if (tok->sentence_start && t->pending_suffix &&
            ((s[start] >= 'a' && s[start] <= 'z') || (s[start] >= '0' && s[start] <= '9')))
            tok->sentence_start = 0;
        t->pending_suffix = 0;
        t->at_sentence_start = ends_sentence;
        t->prev_off = start;
        t->prev_end = p;
        return 1;
    }
    t->pos = len;
    return 0;
}

size_t tt_tokenizer_fill(tt_tokenizer *restrict t, tt_token *restrict toks, size_t max)
{
    const unsigned char *s = (const unsigned char *)t->text;
    size_t len = t->len, n = 0;
    while (n < max) {
        size_t p = t->pos;
        if (p < len) {
            size_t k;
            if (len - p >= 64) {
                k = window_tokens(t, s, s + p, p, toks + n, max - n);
            } else {
                /* the text's last bytes (a paragraph's, mostly), padded */
                unsigned char pad[64];
                memcpy(pad, s + p, len - p);
                memset(pad + (len - p), 0, 64 - (len - p));
                k = window_tokens(t, s, pad, p, toks + n, max - n);
            }
            if (k) {
                n += k;
                continue;
            }
        }
        if (!tti_tokenizer_walk(t, &toks[n]))
            break;
        n++;
    }
    return n;
}

int tti_tokenizer_walk(tt_tokenizer *t, tt_token *tok)
{
    const unsigned char *s = (const unsigned char *)t->text;
    size_t p = t->pos;
    if (p < t->len && tti_wb_ascii_run[s[p]] && fast_token(t, s, t->len, p, tok))
        return 1;
    return tt_tokenizer_next(t, tok);
}
