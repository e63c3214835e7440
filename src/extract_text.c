/* termtide — the extract stage for plain text: paragraphs of clean text.
 *
 * One pass over the bytes, O(n), no allocation per word. Each byte is
 * classified through a 256-entry table (locale-free): ordinary, horizontal
 * white space, LF, CR, or 0xC2 (the lead byte of U+00A0 NO-BREAK SPACE, which
 * counts as white space when followed by 0xA0). Runs of ordinary bytes, with
 * the single spaces between words, are copied in one memcpy (the ASCII fast
 * path; skip_ordinary() finds a run's end 16 bytes at a time with SSE2, 32
 * with AVX2 where the CPU has it);
 * every other white-space run is collapsed while counting the line
 * breaks in it:
 *   - two or more line breaks (a blank line, even one holding spaces or
 *     NBSP) end the paragraph;
 *   - one line break becomes one space, except after a word hyphenated at
 *     the line end: when the paragraph so far ends in a letter and '-', and
 *     the next line starts with a letter, the lines are joined with no space
 *     and the hyphen kept ("off-\nbalance" -> "off-balance"). Letters are
 *     ASCII letters or code points of Unicode general category L*
 *     (utf8proc), so "é-\nx" joins too.
 * LF, CRLF and a lone CR each count as one line break. A paragraph's src_off
 * is the offset of its first non-space byte plus src_base.
 *
 * The current paragraph is built in place at the end of the blocks' text
 * buffer and closed into a block by tti_blocks_close (blocks.c keeps the
 * layout): no second copy, and no search for a '\n' the runs cannot hold. */
#include <stdint.h>
#if defined(__SSE2__)
#include <emmintrin.h>
#endif
#if (defined(__x86_64__) || defined(__i386__)) && defined(__SSE2__)
#include <immintrin.h> /* the AVX2 version (TTI_SIMD_WIDE) */
#endif

#include <utf8proc.h>

#include "termtide/extract.h"
#include "termtide/simd.h"
#include "tt_internal.h"

enum { C_TEXT = 0, C_SPACE, C_LF, C_CR, C_C2 };

/* ASCII white space as in tti_is_ascii_space; everything else is text
 * unless it starts an NBSP. */
static const unsigned char byte_class[256] = {
    ['\t'] = C_SPACE, ['\v'] = C_SPACE, ['\f'] = C_SPACE, [' '] = C_SPACE,
    ['\n'] = C_LF,    ['\r'] = C_CR,    [0xC2] = C_C2,
};

static int is_letter(uint32_t cp)
{
    if (cp < 0x80)
        return tti_is_ascii_alpha((int)cp);
    utf8proc_category_t cat = utf8proc_category((utf8proc_int32_t)cp);
    return cat >= UTF8PROC_CATEGORY_LU && cat <= UTF8PROC_CATEGORY_LO;
}

/* The paragraph so far (n bytes at d) ends in "<letter>-". */
static int ends_in_letter_hyphen(const unsigned char *d, size_t n)
{
    if (n < 2 || d[n - 1] != '-')
        return 0;
    size_t end = n - 1, p = end - 1; /* p: last byte of the letter */
    if (d[p] < 0x80)
        return tti_is_ascii_alpha(d[p]);
    /* Walk back to the lead byte of a multi-byte sequence (at most 3
     * continuation bytes). */
    for (int k = 0; k < 3 && p > 0 && (d[p] & 0xC0) == 0x80; k++)
        p--;
    uint32_t cp;
    size_t l = tti_utf8_decode(d + p, end - p, &cp);
    return p + l == end && is_letter(cp);
}

static int starts_with_letter(const unsigned char *s, size_t n)
{
    uint32_t cp;
    tti_utf8_decode(s, n, &cp);
    return is_letter(cp);
}

/* The first position at or after j where the run loop below must look at
 * a byte itself: a byte that is not ordinary text (TAB, LF, VT, FF, CR, an
 * NBSP), or a space whose next byte is not ordinary text (0xC2 counts as not
 * ordinary here, even when it starts no NBSP: stopping early is safe, since
 * the loop then decides byte by byte). Every byte before it would make the
 * loop advance, one byte or a space-and-byte pair at a time, and a stop is
 * never the second byte of such a pair, so the loop may resume there.
 * SSE2 (the x86-64 baseline): 16 bytes per step, 1/16 of the table lookups
 * of the loop; elsewhere it returns j and the loop does all the work. */
#if TTI_SIMD_WIDE
/* The same 32 bytes per step (AVX2, where the CPU has it); returns where
 * it stopped, or the first position it did not look at. */
__attribute__((target("avx2"))) static size_t skip_ordinary_avx2(const unsigned char *s,
                                                                 size_t len, size_t j)
{
    const __m256i lo = _mm256_set1_epi8(8), hi = _mm256_set1_epi8(14);
    const __m256i sp = _mm256_set1_epi8(' '), c2 = _mm256_set1_epi8((char)0xC2);
    const __m256i a0 = _mm256_set1_epi8((char)0xA0);
    while (j + 33 <= len) {
        __m256i v = _mm256_loadu_si256((const __m256i *)(const void *)(s + j));
        __m256i w = _mm256_loadu_si256((const __m256i *)(const void *)(s + j + 1));
        __m256i ctl_v = _mm256_and_si256(_mm256_cmpgt_epi8(v, lo), _mm256_cmpgt_epi8(hi, v));
        __m256i ctl_w = _mm256_and_si256(_mm256_cmpgt_epi8(w, lo), _mm256_cmpgt_epi8(hi, w));
        __m256i odd_w = _mm256_or_si256(ctl_w, _mm256_or_si256(_mm256_cmpeq_epi8(w, sp),
                                                               _mm256_cmpeq_epi8(w, c2)));
        __m256i stop = _mm256_or_si256(
            ctl_v,
            _mm256_or_si256(_mm256_and_si256(_mm256_cmpeq_epi8(v, c2), _mm256_cmpeq_epi8(w, a0)),
                            _mm256_and_si256(_mm256_cmpeq_epi8(v, sp), odd_w)));
        unsigned m = (unsigned)_mm256_movemask_epi8(stop);
        if (m)
            return j + (size_t)__builtin_ctz(m);
        j += 32;
    }
    return j;
}
#endif

static size_t skip_ordinary(const unsigned char *s, size_t len, size_t j)
{
#if defined(__SSE2__)
    if (!tti_use_simd)
        return j;
#if TTI_SIMD_WIDE
    if (tti_simd_level() >= TT_SIMD_AVX2) {
        j = skip_ordinary_avx2(s, len, j);
        if (j + 33 <= len)
            return j; /* a stop; else the last bytes below */
    }
#endif
    const __m128i lo = _mm_set1_epi8(8), hi = _mm_set1_epi8(14);
    const __m128i sp = _mm_set1_epi8(' '), c2 = _mm_set1_epi8((char)0xC2);
    const __m128i a0 = _mm_set1_epi8((char)0xA0);
    while (j + 17 <= len) {
        __m128i v = _mm_loadu_si128((const __m128i *)(s + j));
        __m128i w = _mm_loadu_si128((const __m128i *)(s + j + 1));
        /* TAB..CR are 9..13; bytes >= 0x80 are negative and fall outside */
        __m128i ctl_v = _mm_and_si128(_mm_cmpgt_epi8(v, lo), _mm_cmplt_epi8(v, hi));
        __m128i ctl_w = _mm_and_si128(_mm_cmpgt_epi8(w, lo), _mm_cmplt_epi8(w, hi));
        __m128i odd_w = _mm_or_si128(ctl_w, _mm_or_si128(_mm_cmpeq_epi8(w, sp),
                                                         _mm_cmpeq_epi8(w, c2)));
        __m128i stop = _mm_or_si128(
            ctl_v, _mm_or_si128(_mm_and_si128(_mm_cmpeq_epi8(v, c2), _mm_cmpeq_epi8(w, a0)),
                                _mm_and_si128(_mm_cmpeq_epi8(v, sp), odd_w)));
        unsigned m = (unsigned)_mm_movemask_epi8(stop);
        if (m)
            return j + (size_t)__builtin_ctz(m);
        j += 16;
    }
#else
    (void)s;
    (void)len;
#endif
    return j;
}

tt_status tt_extract_text(const char *text, size_t len, long long src_base,
                          tt_blocks *out, const char *name, tt_error *err)
{
    const unsigned char *s = (const unsigned char *)text;
    /* The paragraph is built in place, after the blocks before it, in the
     * blocks' text buffer (tti_blocks_close): para_at is where it starts. */
    tt_buf *const buf = &out->text;
    size_t para_at;
    tt_status st = TT_OK;
    long long para_src = -1;
    size_t breaks = 0; /* line breaks in the current white-space run */
    int space = 0;     /* any white space since the last word */
    size_t i = 0;

    tt_blocks_reset(out);
    /* room for the text at once (it only shrinks; blocks add a byte each) */
    if ((st = tti_buf_grow_kept(buf, len + 64)) != TT_OK)
        goto fail;
    para_at = buf->len;
    while (i < len) {
        unsigned c = byte_class[s[i]];
        if (c == C_SPACE) {
            space = 1;
            i++;
            continue;
        }
        if (c == C_LF) {
            space = 1;
            breaks++;
            i++;
            continue;
        }
        if (c == C_CR) {
            space = 1;
            breaks++;
            i++;
            if (i < len && s[i] == '\n')
                i++;
            continue;
        }
        if (c == C_C2 && i + 1 < len && s[i + 1] == 0xA0) {
            space = 1;
            i += 2;
            continue;
        }

        /* A word: first settle the white space before it. */
        if (breaks >= 2 && buf->len > para_at) {
            st = tti_blocks_close(out, TT_BLOCK_PARAGRAPH, para_at, para_src);
            if (st)
                goto fail;
            para_at = buf->len;
        }
        if (buf->len == para_at) {
            para_src = src_base + (long long)i;
        } else if (space &&
                   !(breaks == 1 &&
                     ends_in_letter_hyphen((const unsigned char *)buf->data + para_at,
                                           buf->len - para_at) &&
                     starts_with_letter(s + i, len - i))) {
            st = tt_buf_putc(buf, ' ');
            if (st)
                goto fail;
        }
        space = 0;
        breaks = 0;

        /* The run: ordinary bytes, plus single spaces between words, which
         * are already normalized and so copied as they are (never a LF or
         * CR: the blocks' separator stays safe). */
        size_t j = i + 1;
        while (j < len) {
            j = skip_ordinary(s, len, j);
            if (j >= len)
                break;
            unsigned k = byte_class[s[j]];
            if (k == C_TEXT)
                j++;
            else if (k == C_SPACE && s[j] == ' ' && j + 1 < len &&
                     byte_class[s[j + 1]] == C_TEXT)
                j += 2;
            else if (k == C_C2 && !(j + 1 < len && s[j + 1] == 0xA0))
                j++;
            else
                break;
        }
        st = tt_buf_append(buf, (const char *)s + i, j - i);
        if (st)
            goto fail;
        i = j;
    }
    st = tti_blocks_close(out, TT_BLOCK_PARAGRAPH, para_at, para_src);
    if (st)
        goto fail;
    return TT_OK;

fail:
    tt_blocks_reset(out);
    if (st == TT_ENOMEM)
        return tt_error_set(err, st, name, src_base + (long long)i,
                            "out of memory while splitting text into paragraphs");
    return tt_error_set(err, st, name, src_base + (long long)i,
                        "extracted text exceeds its size limit");
}
