/* termtide — the normalize stage: one token to its term form.
 *
 * Design. A token arrives as a view into the document text (valid UTF-8,
 * at most TT_LIMIT_TOKEN_BYTES in the pipeline) and leaves as bytes in a
 * caller-owned buffer. Two paths:
 *
 *  - Fast path (the bulk of filing text): ASCII, optionally with the
 *    apostrophe and dash variants listed in normalize.h (HTML filings write "company’s"
 *    and "year–end" with U+2019 and U+2013). One table lookup per byte
 *    lowercases and turns '`' into '\''; a variant becomes its ASCII byte.
 *    For such text NFKC is the identity after that mapping and full case
 *    folding is ASCII lowercasing, so skipping utf8proc changes nothing but
 *    the speed. The first other non-ASCII byte sends the token to:
 *  - utf8proc, allocation-free: utf8proc_decompose_custom into the
 *    normalizer's reusable code point buffer (the custom hook maps
 *    typographic apostrophes and dashes *before* decomposition, which matters
 *    for U+00B4 ACUTE ACCENT: NFKC would turn it into a space and a
 *    combining accent), with COMPAT|CASEFOLD, then canonical composition
 *    (utf8proc_normalize_utf32 with COMPOSE), then the apostrophe/dash map
 *    once more, because compatibility mapping can *create* variants
 *    (U+FF40 FULLWIDTH GRAVE → '`', U+0149 ŉ → U+02BC 'n', U+FE31
 *    VERTICAL EM DASH → U+2014), then utf8proc_reencode in place. The buffer grows (via
 *    tt_reallocarray) only when a token decomposes to more code points than
 *    any token before it, so steady state allocates nothing.
 *
 * Then the edges: leading and trailing apostrophes and hyphens are
 * stripped, and a final "'s" is dropped ("company's" → "company"). A final
 * "'" after s ("companies'") is covered by the trailing strip. Internal
 * apostrophes and hyphens stay ("don't", "o'neill", "off-balance"). As in
 * Snowball's Porter2 step 0, dropping "'s" also folds "it's" into "it";
 * stop-lists go through this same function, so they still match.
 *
 * Cost: O(len) per token; the non-ASCII path is bounded by the longest
 * decomposition (18 code points for one input code point, U+FDFA). */
#include <stdint.h>
#include <utf8proc.h>

#include "termtide/normalize.h"
#include "normalize_internal.h"
#include "tt_internal.h"

/* ASCII lowercase, and U+0060 GRAVE ACCENT → U+0027 APOSTROPHE (typed as an
 * apostrophe in plain-text transcripts). */
static const unsigned char ascii_fold[128] = {
    0x00, 0x01, 0x02, 0x03, 0x04, 0x05, 0x06, 0x07, 0x08, 0x09, 0x0a, 0x0b, 0x0c, 0x0d, 0x0e, 0x0f,
    0x10, 0x11, 0x12, 0x13, 0x14, 0x15, 0x16, 0x17, 0x18, 0x19, 0x1a, 0x1b, 0x1c, 0x1d, 0x1e, 0x1f,
    0x20, 0x21, 0x22, 0x23, 0x24, 0x25, 0x26, 0x27, 0x28, 0x29, 0x2a, 0x2b, 0x2c, 0x2d, 0x2e, 0x2f,
    0x30, 0x31, 0x32, 0x33, 0x34, 0x35, 0x36, 0x37, 0x38, 0x39, 0x3a, 0x3b, 0x3c, 0x3d, 0x3e, 0x3f,
    0x40, 0x61, 0x62, 0x63, 0x64, 0x65, 0x66, 0x67, 0x68, 0x69, 0x6a, 0x6b, 0x6c, 0x6d, 0x6e, 0x6f,
    0x70, 0x71, 0x72, 0x73, 0x74, 0x75, 0x76, 0x77, 0x78, 0x79, 0x7a, 0x5b, 0x5c, 0x5d, 0x5e, 0x5f,
    0x27, 0x61, 0x62, 0x63, 0x64, 0x65, 0x66, 0x67, 0x68, 0x69, 0x6a, 0x6b, 0x6c, 0x6d, 0x6e, 0x6f,
    0x70, 0x71, 0x72, 0x73, 0x74, 0x75, 0x76, 0x77, 0x78, 0x79, 0x7a, 0x7b, 0x7c, 0x7d, 0x7e, 0x7f,
};

/* NFKC (compatibility decomposition, then canonical composition) with full
 * case folding; STABLE keeps composition to what Unicode promises never to
 * change. */
#define NFKC_CASEFOLD (UTF8PROC_COMPOSE | UTF8PROC_COMPAT | UTF8PROC_CASEFOLD | UTF8PROC_STABLE)

void tt_normalizer_init(tt_normalizer *n)
{
    tt_buf_init(&n->scratch, 0);
    n->cps = NULL;
    n->cps_cap = 0;
}

void tt_normalizer_release(tt_normalizer *n)
{
    tt_buf_release(&n->scratch);
    tt_free(n->cps);
    n->cps = NULL;
    n->cps_cap = 0;
}

/* The apostrophe and dash variants named in normalize.h, as one code point
 * map; everything else passes through. */
static utf8proc_int32_t map_punct(utf8proc_int32_t cp)
{
    switch (cp) {
    case 0x2018: /* LEFT SINGLE QUOTATION MARK */
    case 0x2019: /* RIGHT SINGLE QUOTATION MARK, the typographic apostrophe */
    case 0x02BC: /* MODIFIER LETTER APOSTROPHE */
    case 0xFF07: /* FULLWIDTH APOSTROPHE */
    case 0x0060: /* GRAVE ACCENT */
    case 0x00B4: /* ACUTE ACCENT */
        return '\'';
    case 0x2010: case 0x2011: case 0x2012: case 0x2013: case 0x2014: case 0x2015:
    case 0x2212: /* MINUS SIGN */
    case 0xFE58: /* SMALL EM DASH */
    case 0xFE63: /* SMALL HYPHEN-MINUS */
    case 0xFF0D: /* FULLWIDTH HYPHEN-MINUS */
        return '-';
    default:
        return cp;
    }
}

static utf8proc_int32_t map_punct_hook(utf8proc_int32_t cp, void *data)
{
    (void)data;
    return map_punct(cp);
}

/* Length of the UTF-8 sequence at s if it is one of the apostrophe or dash
 * variants of map_punct (whose NFKC + folding is just the mapped ASCII
 * byte), storing that byte; 0 otherwise. */
static size_t punct_seq(const unsigned char *s, size_t n, unsigned char *ch)
{
    if (n >= 2 && s[0] == 0xC2 && s[1] == 0xB4) { /* U+00B4 */
        *ch = '\'';
        return 2;
    }
    if (n >= 2 && s[0] == 0xCA && s[1] == 0xBC) { /* U+02BC */
        *ch = '\'';
        return 2;
    }
    if (n < 3)
        return 0;
    unsigned cp = ((s[0] & 0x0Fu) << 12) | ((s[1] & 0x3Fu) << 6) | (s[2] & 0x3Fu);
    /* cp < 0x800 would be an overlong form, invalid UTF-8: not ours. */
    if ((s[0] & 0xF0u) != 0xE0u || (s[1] & 0xC0u) != 0x80u || (s[2] & 0xC0u) != 0x80u ||
        cp < 0x800)
        return 0;
    utf8proc_int32_t m = map_punct((utf8proc_int32_t)cp);
    if (m == (utf8proc_int32_t)cp)
        return 0;
    *ch = (unsigned char)m;
    return 3;
}

/* The fast path: ASCII, possibly with the typographic apostrophes and dashes
 * (the usual non-ASCII of English filings: "company’s", "year–end").
 * NFKC of such text is the mapped text and folding is ASCII lowercasing, so
 * a table does it all. Returns 0 as soon as another non-ASCII character
 * shows up (d then holds a partial result); the caller then takes the
 * utf8proc path. */
static int normalize_fast(const unsigned char *s, size_t len, unsigned char *d, size_t *n_out)
{
    size_t k = 0;
    for (size_t i = 0; i < len;) {
        unsigned char c = s[i];
        if (c < 0x80) {
            d[k++] = ascii_fold[c];
            i++;
            continue;
        }
        size_t m = punct_seq(s + i, len - i, &d[k]);
        if (!m)
            return 0;
        k++;
        i += m;
    }
    *n_out = k;
    return 1;
}

/* Copies s into scratch with every invalid sequence replaced by U+FFFD, for
 * callers that break the valid-UTF-8 promise (utf8proc refuses such input). */
static tt_status repair_utf8(tt_buf *scratch, const unsigned char *s, size_t len)
{
    tt_buf_reset(scratch);
    for (size_t i = 0; i < len;) {
        uint32_t cp;
        size_t k = tti_utf8_decode(s + i, len - i, &cp);
        tt_status st = k > 1 || cp != 0xFFFD ? tt_buf_append(scratch, s + i, k)
                                             : tt_buf_put_utf8(scratch, cp);
        if (st)
            return st;
        i += k;
    }
    return TT_OK;
}

/* Decomposes into n->cps, growing it until the result fits with one spare
 * slot (utf8proc_reencode writes a NUL after the bytes). *count receives the
 * code point count or a negative utf8proc error; the return value is
 * TT_ENOMEM when the buffer cannot grow. */
static tt_status decompose(tt_normalizer *n, const unsigned char *s, size_t len,
                           utf8proc_ssize_t *count)
{
    if (len > (size_t)PTRDIFF_MAX / 32)
        return TT_ELIMIT;
    for (;;) {
        utf8proc_ssize_t r = 0;
        if (n->cps_cap > 1)
            r = utf8proc_decompose_custom(s, (utf8proc_ssize_t)len, n->cps,
                                          (utf8proc_ssize_t)n->cps_cap - 1, NFKC_CASEFOLD,
                                          map_punct_hook, NULL);
        if (r < 0) {
            *count = r;
            return TT_OK;
        }
        if (n->cps_cap > 1 && (size_t)r < n->cps_cap) {
            *count = r;
            return TT_OK;
        }
        /* Too small (or not yet allocated): r is the size needed. A
         * first guess of one code point per byte covers most text. */
        size_t want = (size_t)r + 1;
        if (want < len + 1)
            want = len + 1;
        if (want < 64)
            want = 64;
        int32_t *p = tt_reallocarray(n->cps, want, sizeof *p);
        if (!p)
            return TT_ENOMEM;
        n->cps = p;
        n->cps_cap = want;
    }
}

static tt_status normalize_unicode(tt_normalizer *n, const unsigned char *s, size_t len,
                                   tt_buf *out)
{
    utf8proc_ssize_t count;
    tt_status st = decompose(n, s, len, &count);
    if (st)
        return st;
    if (count == UTF8PROC_ERROR_INVALIDUTF8) {
        st = repair_utf8(&n->scratch, s, len);
        if (st)
            return st;
        st = decompose(n, (const unsigned char *)n->scratch.data, n->scratch.len, &count);
        if (st)
            return st;
    }
    if (count < 0)
        return count == UTF8PROC_ERROR_NOMEM ? TT_ENOMEM : TT_EINVAL;

    count = utf8proc_normalize_utf32(n->cps, count, NFKC_CASEFOLD);
    if (count < 0)
        return TT_EINVAL;
    for (utf8proc_ssize_t i = 0; i < count; i++)
        n->cps[i] = map_punct(n->cps[i]);
    /* Options 0: composition is done; this only encodes, in place. */
    utf8proc_ssize_t nbytes = utf8proc_reencode(n->cps, count, (utf8proc_option_t)0);
    if (nbytes < 0)
        return TT_EINVAL;

    const unsigned char *u = (const unsigned char *)n->cps;
    size_t a, b;
    tti_term_bounds(u, (size_t)nbytes, &a, &b);
    return tt_buf_append(out, u + a, b - a);
}

tt_status tt_normalize(tt_normalizer *n, const char *tok, size_t len, tt_buf *out)
{
    const unsigned char *s = (const unsigned char *)tok;
    tt_buf_reset(out);
    /* The fast path writes at most len bytes (each variant shrinks to one). */
    tt_status st = tt_buf_grow(out, len);
    if (st)
        return st;
    unsigned char *d = (unsigned char *)out->data;
    size_t k;
    if (!normalize_fast(s, len, d, &k)) {
        out->data[0] = '\0'; /* the fast path may have written before giving up */
        return normalize_unicode(n, s, len, out);
    }
    size_t a, b;
    tti_term_bounds(d, k, &a, &b);
    if (a)
        memmove(d, d + a, b - a);
    out->len = b - a;
    out->data[out->len] = '\0';
    return TT_OK;
}

size_t tt_utf8_length(const char *s, size_t len)
{
    /* Every code point has exactly one byte that is not a continuation
     * byte (10xxxxxx). */
    size_t count = 0;
    for (size_t i = 0; i < len; i++)
        count += ((unsigned char)s[i] & 0xC0u) != 0x80u;
    return count;
}
