/* termtide — the decode stage: document bytes to UTF-8 (see
 * include/termtide/decode.h).
 *
 * The rule, in order:
 *
 *  1. Binary. The magic number of a PNG, JPEG, GIF, PDF, ZIP, gzip, ELF,
 *     7z, RAR or OLE2 compound file at offset 0 means a binary file. So does
 *     any NUL byte, unless the input starts with a UTF-16 BOM; in UTF-16 a
 *     U+0000 code unit means binary too. UTF-16 without a BOM is full of
 *     NUL bytes and is therefore refused as binary (out of scope).
 *     → TT_EBINARY "binary file (PNG image)" / "binary file (NUL bytes at
 *     offset N)". The output can thus never hold a NUL byte.
 *  2. BOM. EF BB BF → UTF-8 (BOM dropped; invalid sequences are always
 *     replaced, since the BOM declares the encoding). FF FE → UTF-16LE,
 *     FE FF → UTF-16BE (BOM dropped; surrogate pairs joined; a lone
 *     surrogate, or an odd final byte, becomes U+FFFD, counted in
 *     `replaced`).
 *  3. No BOM. One pass counts I, the invalid UTF-8 sequences (each maximal
 *     subpart counted once, see below), and M, the valid multi-byte
 *     sequences (the non-ASCII characters).
 *       I == 0      → UTF-8, an exact copy.
 *       I <= M      → UTF-8; each invalid sequence becomes U+FFFD.
 *       I >  M      → Windows-1252.
 *     Why: whichever reading is wrong damages characters. Read as UTF-8, a
 *     Windows-1252 file loses each of its I non-ASCII characters to U+FFFD;
 *     read as Windows-1252, a UTF-8 file turns each of its M characters into
 *     two or three wrong ones ("Ã©"). The rule takes the reading that damages
 *     fewer characters, and UTF-8 on a tie. Real inputs are far from the
 *     tie: Windows-1252 text (old filings with accented letters and smart
 *     quotes) almost never forms valid UTF-8 pairs, so M is 0 or tiny, while
 *     a UTF-8 file with a few stray bytes has many more valid sequences than
 *     strays. A file with no non-ASCII character but one stray byte (M = 0,
 *     I = 1) is read as Windows-1252, where that byte is most likely a smart
 *     quote or an accented letter rather than an error.
 *
 * Invalid UTF-8 is measured as the Unicode Standard recommends ("U+FFFD
 * Substitution of Maximal Subparts", chapter 3.9, with the well-formed byte
 * sequences of Table 3-7): a maximal prefix of a well-formed sequence, or a
 * single byte that cannot start one, is one invalid sequence. Python's
 * bytes.decode('utf-8', 'replace') does the same, and the tests use it as the
 * reference.
 *
 * Windows-1252: 0xA0–0xFF are Latin-1 (the code point equals the byte);
 * 0x80–0x9F map to the typographic characters in the table below; the five
 * bytes the code page leaves undefined (81 8D 8F 90 9D) become U+FFFD and are
 * counted in `replaced`, as Python's cp1252 codec does with errors='replace'
 * (the tests compare the whole table with that codec). Mapping them to the C1
 * controls instead, as web browsers do, would put invisible control
 * characters into the text.
 *
 * Speed: the validating pass reads 16 bytes at a time while they are ASCII
 * and free of NUL, one word test for both (32 with AVX2 where the CPU has
 * it); valid UTF-8 is then copied with
 * one memcpy. The other decoders first count their exact output size, so
 * the output buffer is allocated once and the caller's limit is checked on
 * the real size. */
#include <stdint.h>
#if (defined(__x86_64__) || defined(__i386__)) && defined(__SSE2__)
#include <immintrin.h> /* the AVX2 version (TTI_SIMD_WIDE) */
#endif

#include "termtide/decode.h"
#include "termtide/simd.h"
#include "tt_internal.h"

const char *tt_encoding_name(tt_encoding enc)
{
    switch (enc) {
    case TT_ENC_UTF8: return "utf-8";
    case TT_ENC_UTF8_BOM: return "utf-8-bom";
    case TT_ENC_UTF16LE: return "utf-16le";
    case TT_ENC_UTF16BE: return "utf-16be";
    case TT_ENC_CP1252: return "windows-1252";
    }
    return "unknown";
}

/* ---- binary detection --------------------------------------------------- */

typedef struct magic {
    const char *bytes;
    size_t len;
    const char *what;
} magic;

/* Signatures from each format's own specification (PNG: ISO/IEC 15948
 * section 5.2; GIF89a; PDF: ISO 32000 section 7.5.2; ZIP: APPNOTE 4.3.7;
 * gzip: RFC 1952; ELF: System V ABI) and, for JPEG, 7z, RAR and OLE2, common
 * practice (the values file(1)'s magic database uses). */
static const magic magics[] = {
    { "\x89PNG\r\n\x1a\n", 8, "PNG image" },
    { "\xff\xd8\xff", 3, "JPEG image" },
    { "GIF87a", 6, "GIF image" },
    { "GIF89a", 6, "GIF image" },
    { "%PDF-", 5, "PDF document" },
    { "PK\x03\x04", 4, "ZIP archive" },
    { "PK\x05\x06", 4, "ZIP archive" },
    { "\x1f\x8b", 2, "gzip data" },
    { "\x7f" "ELF", 4, "ELF executable" },
    { "7z\xbc\xaf\x27\x1c", 6, "7z archive" },
    { "Rar!\x1a\x07", 6, "RAR archive" },
    { "\xd0\xcf\x11\xe0\xa1\xb1\x1a\xe1", 8, "OLE2 compound file" },
};

static const char *binary_magic(const unsigned char *p, size_t n)
{
    for (size_t i = 0; i < sizeof magics / sizeof magics[0]; i++)
        if (n >= magics[i].len && memcmp(p, magics[i].bytes, magics[i].len) == 0)
            return magics[i].what;
    return NULL;
}

/* ---- UTF-8 ---------------------------------------------------------------- */

#define HI8 UINT64_C(0x8080808080808080)
#define LO8 UINT64_C(0x0101010101010101)

/* Nonzero when some byte of w has its high bit set or is zero: (w - LO8)
 * sets a byte's high bit only through a borrow that starts at a zero byte
 * when no byte of w is >= 0x80. */
static inline uint64_t not_plain_ascii(uint64_t w) { return (w | (w - LO8)) & HI8; }

static inline uint64_t load64(const unsigned char *p)
{
    uint64_t w;
    memcpy(&w, p, 8);
    return w;
}

/* Length of the run of ASCII bytes other than NUL starting at p. */
static size_t ascii_run(const unsigned char *p, size_t n)
{
    size_t i = 0;
    while (i + 16 <= n && !(not_plain_ascii(load64(p + i)) | not_plain_ascii(load64(p + i + 8))))
        i += 16;
    while (i + 8 <= n && !not_plain_ascii(load64(p + i)))
        i += 8;
    while (i < n && p[i] && p[i] < 0x80)
        i++;
    return i;
}

/* At a byte >= 0x80: returns the length of the well-formed sequence there
 * (2..4), or 0 with *bad set to the length of the maximal subpart to
 * replace (Unicode Table 3-7). */
static size_t utf8_seq(const unsigned char *p, size_t n, size_t *bad)
{
    unsigned c = p[0];
    size_t need;
    unsigned lo = 0x80, hi = 0xBF; /* range of the second byte */
    if (c >= 0xC2 && c <= 0xDF)
        need = 2;
    else if (c >= 0xE0 && c <= 0xEF) {
        need = 3;
        if (c == 0xE0) lo = 0xA0;
        if (c == 0xED) hi = 0x9F;
    } else if (c >= 0xF0 && c <= 0xF4) {
        need = 4;
        if (c == 0xF0) lo = 0x90;
        if (c == 0xF4) hi = 0x8F;
    } else {
        *bad = 1;
        return 0;
    }
    if (n < 2 || p[1] < lo || p[1] > hi) {
        *bad = 1;
        return 0;
    }
    for (size_t k = 2; k < need; k++) {
        if (k >= n || (p[k] & 0xC0) != 0x80) {
            *bad = k;
            return 0;
        }
    }
    return need;
}


typedef struct utf8_scan {
    size_t invalid;       /* I: maximal subparts */
    size_t invalid_bytes; /* bytes inside them */
    size_t multibyte;     /* M: valid non-ASCII characters */
    size_t nul_at;        /* first NUL, or SIZE_MAX */
} utf8_scan;

/* At p[*i], a byte that is not plain ASCII: a NUL ends the scan (returns 0,
 * with nul_at set); anything else is counted, a valid sequence or a
 * maximal invalid subpart, and stepped over. */
static inline int scan_at(const unsigned char *p, size_t n, size_t *i, utf8_scan *s)
{
    if (p[*i] == 0) {
        s->nul_at = *i;
        return 0;
    }
    size_t bad, len = utf8_seq(p + *i, n - *i, &bad);
    if (len) {
        s->multibyte++;
        *i += len;
    } else {
        s->invalid++;
        s->invalid_bytes += bad;
        *i += bad;
    }
    return 1;
}

#if TTI_SIMD_WIDE
/* scan_utf8 in one AVX2 function: the 32-byte steps and the sequences
 * between them in one loop, so that each of a text's non-ASCII characters
 * (one in 150 bytes in filing prose) costs no call and no new set-up. */
__attribute__((target("avx2"))) static void scan_utf8_avx2(const unsigned char *p, size_t n,
                                                           utf8_scan *s)
{
    const __m256i zero = _mm256_setzero_si256();
    size_t i = 0;
    while (i < n) {
        if (n - i >= 32) {
            __m256i v = _mm256_loadu_si256((const __m256i *)(const void *)(p + i));
            unsigned m = (unsigned)_mm256_movemask_epi8(v) |
                         (unsigned)_mm256_movemask_epi8(_mm256_cmpeq_epi8(v, zero));
            if (!m) {
                i += 32;
                continue;
            }
            i += (size_t)__builtin_ctz(m);
        } else {
            i += ascii_run(p + i, n - i);
            if (i >= n)
                break;
        }
        if (!scan_at(p, n, &i, s))
            return;
    }
}
#endif

static void scan_utf8(const unsigned char *p, size_t n, utf8_scan *s)
{
    s->invalid = s->invalid_bytes = s->multibyte = 0;
    s->nul_at = SIZE_MAX;
    size_t i = 0;
#if TTI_SIMD_WIDE
    if (tti_simd_level() >= TT_SIMD_AVX2) {
        scan_utf8_avx2(p, n, s);
        return;
    }
#endif
    while (i < n) {
        i += ascii_run(p + i, n - i);
        if (i >= n)
            break;
        if (!scan_at(p, n, &i, s))
            return;
    }
}

/* Writes p as UTF-8 with each maximal invalid subpart replaced by U+FFFD.
 * dst has room for exactly the size the scan predicted. */
static size_t write_utf8_replaced(const unsigned char *p, size_t n, char *dst)
{
    size_t i = 0, o = 0;
    while (i < n) {
        size_t run = ascii_run(p + i, n - i);
        size_t j = i + run;
        /* Extend the run over valid multi-byte sequences too. */
        while (j < n) {
            j += ascii_run(p + j, n - j);
            if (j >= n)
                break;
            size_t bad, len = utf8_seq(p + j, n - j, &bad);
            if (!len)
                break;
            j += len;
        }
        memcpy(dst + o, p + i, j - i);
        o += j - i;
        i = j;
        if (i < n) {
            size_t bad;
            utf8_seq(p + i, n - i, &bad);
            memcpy(dst + o, "\xEF\xBF\xBD", 3);
            o += 3;
            i += bad;
        }
    }
    return o;
}

/* ---- Windows-1252 ------------------------------------------------------- */

/* 0x80–0x9F; 0 marks the five undefined bytes. Code page 1252 as published
 * by its vendor; checked in the tests against Python's cp1252 codec. */
static const uint16_t cp1252_high[32] = {
    0x20AC, 0,      0x201A, 0x0192, 0x201E, 0x2026, 0x2020, 0x2021, /* 80-87 */
    0x02C6, 0x2030, 0x0160, 0x2039, 0x0152, 0,      0x017D, 0,      /* 88-8F */
    0,      0x2018, 0x2019, 0x201C, 0x201D, 0x2022, 0x2013, 0x2014, /* 90-97 */
    0x02DC, 0x2122, 0x0161, 0x203A, 0x0153, 0,      0x017E, 0x0178, /* 98-9F */
};

static uint32_t cp1252_cp(unsigned c)
{
    if (c < 0x80 || c >= 0xA0)
        return c;
    uint32_t cp = cp1252_high[c - 0x80];
    return cp ? cp : 0xFFFD;
}

static size_t utf8_len(uint32_t cp)
{
    return cp < 0x80 ? 1 : cp < 0x800 ? 2 : cp < 0x10000 ? 3 : 4;
}

static size_t put_utf8(char *dst, uint32_t cp)
{
    unsigned char *d = (unsigned char *)dst;
    if (cp < 0x80) {
        d[0] = (unsigned char)cp;
        return 1;
    }
    if (cp < 0x800) {
        d[0] = (unsigned char)(0xC0 | (cp >> 6));
        d[1] = (unsigned char)(0x80 | (cp & 0x3F));
        return 2;
    }
    if (cp < 0x10000) {
        d[0] = (unsigned char)(0xE0 | (cp >> 12));
        d[1] = (unsigned char)(0x80 | ((cp >> 6) & 0x3F));
        d[2] = (unsigned char)(0x80 | (cp & 0x3F));
        return 3;
    }
    d[0] = (unsigned char)(0xF0 | (cp >> 18));
    d[1] = (unsigned char)(0x80 | ((cp >> 12) & 0x3F));
    d[2] = (unsigned char)(0x80 | ((cp >> 6) & 0x3F));
    d[3] = (unsigned char)(0x80 | (cp & 0x3F));
    return 4;
}

/* dst NULL: only counts. Returns the output size; *replaced counts the
 * undefined bytes. The input holds no NUL (checked by the scan). */
static size_t cp1252_decode(const unsigned char *p, size_t n, char *dst, size_t *replaced)
{
    size_t o = 0, rep = 0, i = 0;
    while (i < n) {
        size_t run = ascii_run(p + i, n - i);
        if (dst)
            memcpy(dst + o, p + i, run);
        o += run;
        i += run;
        while (i < n && p[i] >= 0x80) {
            uint32_t cp = cp1252_cp(p[i]);
            rep += cp == 0xFFFD;
            o += dst ? put_utf8(dst + o, cp) : utf8_len(cp);
            i++;
        }
    }
    *replaced = rep;
    return o;
}

/* ---- UTF-16 --------------------------------------------------------------- */

/* dst NULL: only counts. Returns the output size, or SIZE_MAX with *nul_at
 * set when a U+0000 code unit is found. */
static size_t utf16_decode(const unsigned char *p, size_t n, int be, char *dst,
                           size_t *replaced, size_t *nul_at)
{
    size_t o = 0, rep = 0, i = 0;
    while (i + 1 < n) {
        uint32_t u = be ? (uint32_t)p[i] << 8 | p[i + 1] : (uint32_t)p[i + 1] << 8 | p[i];
        uint32_t cp = u;
        size_t used = 2;
        if (u == 0) {
            *nul_at = i;
            return SIZE_MAX;
        }
        if (u >= 0xD800 && u <= 0xDBFF) {
            cp = 0xFFFD;
            if (i + 3 < n) {
                uint32_t v = be ? (uint32_t)p[i + 2] << 8 | p[i + 3]
                                : (uint32_t)p[i + 3] << 8 | p[i + 2];
                if (v >= 0xDC00 && v <= 0xDFFF) {
                    cp = 0x10000 + ((u - 0xD800) << 10) + (v - 0xDC00);
                    used = 4;
                }
            }
        } else if (u >= 0xDC00 && u <= 0xDFFF) {
            cp = 0xFFFD;
        }
        rep += cp == 0xFFFD && u != 0xFFFD;
        o += dst ? put_utf8(dst + o, cp) : utf8_len(cp);
        i += used;
    }
    if (i < n) { /* an odd final byte */
        rep++;
        if (dst)
            put_utf8(dst + o, 0xFFFD);
        o += 3;
    }
    *replaced = rep;
    return o;
}

/* ---- the stage -------------------------------------------------------------- */

static tt_status reserve(tt_buf *out, size_t size, const char *name, tt_error *err)
{
    tt_status st = tt_buf_grow(out, size);
    if (st == TT_ELIMIT)
        return tt_error_set(err, TT_ELIMIT, name, -1,
                            "decoded text is larger than the limit of %zu bytes", out->limit);
    if (st != TT_OK)
        return tt_error_set(err, st, name, -1, "out of memory");
    return TT_OK;
}

static void commit(tt_buf *out, size_t size)
{
    out->len = size;
    out->data[size] = '\0';
}

/* The stage. With as_is not NULL, input that is valid UTF-8 (after an
 * optional BOM) is not copied: *as_is is set to 1 and out is left empty. */
static tt_status decode_to(const char *bytes, size_t len, tt_buf *out, tt_decode_info *info,
                           const char *name, tt_error *err, int *as_is)
{
    const unsigned char *p = (const unsigned char *)bytes;
    tt_status st;

    info->encoding = TT_ENC_UTF8;
    info->replaced = 0;
    info->skipped = 0;
    tt_buf_reset(out);
    if (len == 0)
        return TT_OK;

    const char *what = binary_magic(p, len);
    if (what)
        return tt_error_set(err, TT_EBINARY, name, -1, "binary file (%s)", what);

    if (len >= 2 && ((p[0] == 0xFF && p[1] == 0xFE) || (p[0] == 0xFE && p[1] == 0xFF))) {
        int be = p[0] == 0xFE;
        size_t rep, nul_at = 0;
        info->encoding = be ? TT_ENC_UTF16BE : TT_ENC_UTF16LE;
        info->skipped = 2;
        size_t size = utf16_decode(p + 2, len - 2, be, NULL, &rep, &nul_at);
        if (size == SIZE_MAX)
            return tt_error_set(err, TT_EBINARY, name, -1,
                                "binary file (NUL character at offset %zu)", nul_at + 2);
        if ((st = reserve(out, size, name, err)) != TT_OK)
            return st;
        utf16_decode(p + 2, len - 2, be, out->data, &rep, &nul_at);
        info->replaced = rep;
        commit(out, size);
        return TT_OK;
    }

    size_t skip = 0;
    if (len >= 3 && p[0] == 0xEF && p[1] == 0xBB && p[2] == 0xBF) {
        skip = 3;
        info->encoding = TT_ENC_UTF8_BOM;
        info->skipped = 3;
    }
    p += skip;
    len -= skip;

    utf8_scan scan;
    scan_utf8(p, len, &scan);
    if (scan.nul_at != SIZE_MAX)
        return tt_error_set(err, TT_EBINARY, name, -1, "binary file (NUL bytes at offset %zu)",
                            scan.nul_at + skip);

    if (scan.invalid == 0) {
        if (as_is) {
            *as_is = 1;
            return TT_OK;
        }
        if ((st = reserve(out, len, name, err)) != TT_OK)
            return st;
        memcpy(out->data, p, len);
        commit(out, len);
        return TT_OK;
    }
    if (skip || scan.invalid <= scan.multibyte) {
        size_t size = len - scan.invalid_bytes + 3 * scan.invalid;
        if ((st = reserve(out, size, name, err)) != TT_OK)
            return st;
        commit(out, write_utf8_replaced(p, len, out->data));
        info->replaced = scan.invalid;
        return TT_OK;
    }
    size_t rep;
    size_t size = cp1252_decode(p, len, NULL, &rep);
    if ((st = reserve(out, size, name, err)) != TT_OK)
        return st;
    cp1252_decode(p, len, out->data, &rep);
    commit(out, size);
    info->encoding = TT_ENC_CP1252;
    info->replaced = rep;
    return TT_OK;
}

tt_status tt_decode(const char *bytes, size_t len, tt_buf *out, tt_decode_info *info,
                    const char *name, tt_error *err)
{
    tt_decode_info local;
    return decode_to(bytes, len, out, info ? info : &local, name, err, NULL);
}

tt_status tt_decode_buf(tt_buf *buf, tt_buf *scratch, tt_decode_info *info, const char *name,
                        tt_error *err)
{
    tt_decode_info local;
    int as_is = 0;
    if (!info)
        info = &local;
    tt_status st = decode_to(buf->data, buf->len, scratch, info, name, err, &as_is);
    if (st != TT_OK)
        return st;
    if (as_is) {
        if (info->skipped) {
            memmove(buf->data, buf->data + info->skipped, buf->len - info->skipped);
            buf->len -= info->skipped;
            buf->data[buf->len] = '\0';
        }
        return TT_OK;
    }
    tt_buf t = *buf;
    *buf = *scratch;
    *scratch = t;
    return TT_OK;
}
