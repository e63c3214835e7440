/* termtide — SHA-256 as specified in FIPS 180-4 (Secure Hash Standard,
 * NIST 2015), sections 4.1.2 (functions), 4.2.2 (constants), 5.1.1
 * (padding), 5.3.3 (initial value) and 6.2 (computation).
 *
 * Written for the project from the standard: a straightforward 64-round
 * compression over big-endian words, one block at a time; no table beyond
 * the 64 round constants. O(n), about 230 MB/s in portable C. On x86 CPUs
 * with the SHA extensions (checked once with CPUID) the same compression
 * runs on the SHA-NI instructions, four rounds per pair of SHA256RNDS2 and
 * the message schedule through SHA256MSG1/MSG2, about 4 times faster (the
 * instructions' use follows Intel's description of them, "Intel SHA
 * Extensions", 2013). Both paths are checked in tests/test_search.c against
 * the standard's examples ("abc" and the 448-bit message) and against
 * Python's hashlib. */
#include <errno.h>
#include <pthread.h>
#include <stdio.h>
#if defined(__x86_64__) || defined(__i386__)
#include <cpuid.h>
#include <immintrin.h>
#define TT_SHA_NI 1
#endif

#include "termtide/sha256.h"
#include "tt_internal.h"

static const uint32_t K[64] = {
    0x428a2f98, 0x71374491, 0xb5c0fbcf, 0xe9b5dba5, 0x3956c25b, 0x59f111f1, 0x923f82a4,
    0xab1c5ed5, 0xd807aa98, 0x12835b01, 0x243185be, 0x550c7dc3, 0x72be5d74, 0x80deb1fe,
    0x9bdc06a7, 0xc19bf174, 0xe49b69c1, 0xefbe4786, 0x0fc19dc6, 0x240ca1cc, 0x2de92c6f,
    0x4a7484aa, 0x5cb0a9dc, 0x76f988da, 0x983e5152, 0xa831c66d, 0xb00327c8, 0xbf597fc7,
    0xc6e00bf3, 0xd5a79147, 0x06ca6351, 0x14292967, 0x27b70a85, 0x2e1b2138, 0x4d2c6dfc,
    0x53380d13, 0x650a7354, 0x766a0abb, 0x81c2c92e, 0x92722c85, 0xa2bfe8a1, 0xa81a664b,
    0xc24b8b70, 0xc76c51a3, 0xd192e819, 0xd6990624, 0xf40e3585, 0x106aa070, 0x19a4c116,
    0x1e376c08, 0x2748774c, 0x34b0bcb5, 0x391c0cb3, 0x4ed8aa4a, 0x5b9cca4f, 0x682e6ff3,
    0x748f82ee, 0x78a5636f, 0x84c87814, 0x8cc70208, 0x90befffa, 0xa4506ceb, 0xbef9a3f7,
    0xc67178f2,
};

static inline uint32_t rotr(uint32_t x, unsigned n) { return (x >> n) | (x << (32 - n)); }

static void compress(uint32_t s[8], const unsigned char *p)
{
    uint32_t w[64];
    for (int t = 0; t < 16; t++)
        w[t] = (uint32_t)p[4 * t] << 24 | (uint32_t)p[4 * t + 1] << 16 |
               (uint32_t)p[4 * t + 2] << 8 | (uint32_t)p[4 * t + 3];
    for (int t = 16; t < 64; t++) {
        uint32_t s0 = rotr(w[t - 15], 7) ^ rotr(w[t - 15], 18) ^ (w[t - 15] >> 3);
        uint32_t s1 = rotr(w[t - 2], 17) ^ rotr(w[t - 2], 19) ^ (w[t - 2] >> 10);
        w[t] = w[t - 16] + s0 + w[t - 7] + s1;
    }
    uint32_t a = s[0], b = s[1], c = s[2], d = s[3], e = s[4], f = s[5], g = s[6], h = s[7];
    for (int t = 0; t < 64; t++) {
        uint32_t t1 = h + (rotr(e, 6) ^ rotr(e, 11) ^ rotr(e, 25)) + ((e & f) ^ (~e & g)) + K[t] +
                      w[t];
        uint32_t t2 = (rotr(a, 2) ^ rotr(a, 13) ^ rotr(a, 22)) + ((a & b) ^ (a & c) ^ (b & c));
        h = g;
        g = f;
        f = e;
        e = d + t1;
        d = c;
        c = b;
        b = a;
        a = t1 + t2;
    }
    s[0] += a;
    s[1] += b;
    s[2] += c;
    s[3] += d;
    s[4] += e;
    s[5] += f;
    s[6] += g;
    s[7] += h;
}

#ifdef TT_SHA_NI
__attribute__((target("sha,sse4.1,ssse3"))) static void compress_ni(uint32_t s[8],
                                                                    const unsigned char *p,
                                                                    size_t blocks)
{
    const __m128i swap = _mm_set_epi64x(0x0c0d0e0f08090a0bLL, 0x0405060700010203LL);
    /* state words A..H into the ABEF / CDGH lanes the instructions use */
    __m128i t = _mm_shuffle_epi32(_mm_loadu_si128((const __m128i *)&s[0]), 0xB1); /* BADC */
    __m128i s1 = _mm_shuffle_epi32(_mm_loadu_si128((const __m128i *)&s[4]), 0x1B); /* HGFE */
    __m128i s0 = _mm_alignr_epi8(t, s1, 8);    /* ABEF */
    s1 = _mm_blend_epi16(s1, t, 0xF0);          /* CDGH */
    for (; blocks; blocks--, p += 64) {
        __m128i abef = s0, cdgh = s1, m[4];
        for (int g = 0; g < 16; g++) {
            if (g < 4) {
                m[g] = _mm_shuffle_epi8(_mm_loadu_si128((const __m128i *)(p + 16 * g)), swap);
            } else {
                /* W[t] = s1(W[t-2]) + W[t-7] + s0(W[t-15]) + W[t-16], four at a time */
                __m128i x = _mm_sha256msg1_epu32(m[g & 3], m[(g + 1) & 3]);
                x = _mm_add_epi32(x, _mm_alignr_epi8(m[(g + 3) & 3], m[(g + 2) & 3], 4));
                m[g & 3] = _mm_sha256msg2_epu32(x, m[(g + 3) & 3]);
            }
            __m128i msg = _mm_add_epi32(m[g & 3], _mm_loadu_si128((const __m128i *)&K[4 * g]));
            s1 = _mm_sha256rnds2_epu32(s1, s0, msg);
            s0 = _mm_sha256rnds2_epu32(s0, s1, _mm_shuffle_epi32(msg, 0x0E));
        }
        s0 = _mm_add_epi32(s0, abef);
        s1 = _mm_add_epi32(s1, cdgh);
    }
    t = _mm_shuffle_epi32(s0, 0x1B);            /* FEBA */
    s1 = _mm_shuffle_epi32(s1, 0xB1);           /* DCHG */
    _mm_storeu_si128((__m128i *)&s[0], _mm_blend_epi16(t, s1, 0xF0)); /* DCBA */
    _mm_storeu_si128((__m128i *)&s[4], _mm_alignr_epi8(s1, t, 8));    /* HGFE */
}

static int cpu_has_sha(void)
{
    unsigned a, b, c, d;
    if (!__get_cpuid(1, &a, &b, &c, &d) || !(c & (1u << 19)) || !(c & (1u << 9)))
        return 0; /* SSE4.1, SSSE3 */
    if (__get_cpuid_max(0, NULL) < 7)
        return 0;
    __cpuid_count(7, 0, a, b, c, d);
    return (b >> 29) & 1; /* SHA */
}
#endif

/* -1 unknown, 0 portable, 1 SHA-NI; found once (pthread_once) or set by
 * tt_sha256_accelerated before threads start. */
static int accel = -1;
static pthread_once_t accel_once = PTHREAD_ONCE_INIT;

static void detect(void)
{
#ifdef TT_SHA_NI
    if (accel < 0)
        accel = cpu_has_sha();
#else
    accel = 0;
#endif
}

int tt_sha256_accelerated(int enable)
{
    pthread_once(&accel_once, detect);
#ifdef TT_SHA_NI
    accel = enable ? cpu_has_sha() : 0;
#else
    (void)enable;
    accel = 0;
#endif
    return accel;
}

static void compress_blocks(uint32_t s[8], const unsigned char *p, size_t blocks)
{
    pthread_once(&accel_once, detect);
#ifdef TT_SHA_NI
    if (accel) {
        compress_ni(s, p, blocks);
        return;
    }
#endif
    for (; blocks; blocks--, p += 64)
        compress(s, p);
}

void tt_sha256_init(tt_sha256 *h)
{
    static const uint32_t iv[8] = { 0x6a09e667, 0xbb67ae85, 0x3c6ef372, 0xa54ff53a,
                                    0x510e527f, 0x9b05688c, 0x1f83d9ab, 0x5be0cd19 };
    memcpy(h->state, iv, sizeof iv);
    h->bytes = 0;
    h->fill = 0;
}

void tt_sha256_update(tt_sha256 *h, const void *data, size_t len)
{
    const unsigned char *p = data;
    h->bytes += len;
    if (h->fill) {
        size_t take = 64 - h->fill < len ? 64 - h->fill : len;
        memcpy(h->block + h->fill, p, take);
        h->fill += take;
        p += take;
        len -= take;
        if (h->fill < 64)
            return;
        compress_blocks(h->state, h->block, 1);
        h->fill = 0;
    }
    compress_blocks(h->state, p, len / 64);
    p += len / 64 * 64;
    len %= 64;
    if (len)
        memcpy(h->block, p, len);
    h->fill = len;
}

void tt_sha256_final(tt_sha256 *h, unsigned char digest[32])
{
    uint64_t bits = h->bytes * 8;
    /* 5.1.1: a 1 bit, zeros to 448 mod 512, the length as 64 bits. */
    h->block[h->fill++] = 0x80;
    if (h->fill > 56) {
        memset(h->block + h->fill, 0, 64 - h->fill);
        compress_blocks(h->state, h->block, 1);
        h->fill = 0;
    }
    memset(h->block + h->fill, 0, 56 - h->fill);
    for (int i = 0; i < 8; i++)
        h->block[56 + i] = (unsigned char)(bits >> (56 - 8 * i));
    compress_blocks(h->state, h->block, 1);
    for (int i = 0; i < 8; i++) {
        digest[4 * i] = (unsigned char)(h->state[i] >> 24);
        digest[4 * i + 1] = (unsigned char)(h->state[i] >> 16);
        digest[4 * i + 2] = (unsigned char)(h->state[i] >> 8);
        digest[4 * i + 3] = (unsigned char)h->state[i];
    }
}

static void to_hex(const unsigned char d[32], char out[65])
{
    static const char hex[] = "0123456789abcdef";
    for (int i = 0; i < 32; i++) {
        out[2 * i] = hex[d[i] >> 4];
        out[2 * i + 1] = hex[d[i] & 15];
    }
    out[64] = '\0';
}

void tt_sha256_final_hex(tt_sha256 *h, char out[65])
{
    unsigned char d[32];
    tt_sha256_final(h, d);
    to_hex(d, out);
}

void tt_sha256_hex(const void *data, size_t len, char out[65])
{
    tt_sha256 h;
    unsigned char d[32];
    tt_sha256_init(&h);
    tt_sha256_update(&h, data, len);
    tt_sha256_final(&h, d);
    to_hex(d, out);
}

tt_status tt_sha256_file(const char *path, char out[65], tt_error *err)
{
    out[0] = '\0';
    FILE *f = fopen(path, "rb");
    if (!f)
        return tt_error_set(err, errno == ENOENT ? TT_ENOENT : TT_EIO, path, -1,
                            "cannot read for its SHA-256: %s", strerror(errno));
    unsigned char *piece = tt_malloc(65536);
    if (!piece) {
        fclose(f);
        return tt_error_set(err, TT_ENOMEM, path, -1, "out of memory");
    }
    tt_sha256 h;
    tt_sha256_init(&h);
    size_t n;
    while ((n = fread(piece, 1, 65536, f)) > 0)
        tt_sha256_update(&h, piece, n);
    int bad = ferror(f);
    fclose(f);
    tt_free(piece);
    if (bad)
        return tt_error_set(err, TT_EIO, path, -1, "read error while computing its SHA-256");
    unsigned char d[32];
    tt_sha256_final(&h, d);
    to_hex(d, out);
    return TT_OK;
}
