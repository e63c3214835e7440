/* termtide — library-internal helpers shared by the stages (tier `tti_`).
 * Nothing outside src/ includes this header. */
#ifndef TT_INTERNAL_H
#define TT_INTERNAL_H

#include <pthread.h>
#include <stddef.h>
#include <stdint.h>
#include <string.h>

#include "termtide/alloc.h"
#include "termtide/buf.h"
#include "termtide/limits.h"
#include "termtide/status.h"

#include "banned.h"

/* Locale-free ASCII classes (safe with signed char). */
static inline int tti_is_ascii_alpha(int c) { return ((unsigned)c | 32u) - 'a' < 26u; }
static inline int tti_is_ascii_digit(int c) { return (unsigned)c - '0' < 10u; }
static inline int tti_is_ascii_space(int c) {
    return c == ' ' || c == '\t' || c == '\n' || c == '\r' || c == '\f' || c == '\v';
}
static inline int tti_ascii_lower(int c) {
    return ((unsigned)c - 'A' < 26u) ? c + 32 : c;
}

/* Decodes one UTF-8 sequence at s (n bytes available). Returns its length
 * (1..4) and stores the code point; an invalid or truncated sequence returns
 * 1 and stores 0xFFFD. n must be > 0. */
size_t tti_utf8_decode(const unsigned char *s, size_t n, uint32_t *cp);

/* A raw token of up to 24 bytes as three zero-padded little-endian words,
 * built from fixed-size loads (a variable-length memcpy into the words and
 * reading them back stalls on store forwarding; this runs once per token).
 * Used as the key of the per-thread token caches (count.c, tone.c). */
static inline uint64_t tti_load_upto8(const char *p, size_t n)
{
    const unsigned char *u = (const unsigned char *)p;
    if (n >= 8) {
        uint64_t v;
        memcpy(&v, p, 8);
        return v;
    }
    if (n >= 4) {
        uint32_t a, b;
        memcpy(&a, p, 4);
        memcpy(&b, p + n - 4, 4);
        return (uint64_t)a | ((uint64_t)b << ((n - 4) * 8));
    }
    if (n == 0)
        return 0;
    return (uint64_t)u[0] | ((uint64_t)u[n / 2] << (n / 2 * 8)) |
           ((uint64_t)u[n - 1] << ((n - 1) * 8));
}

static inline void tti_token_key(const char *raw, size_t len, uint64_t key[3])
{
    key[0] = tti_load_upto8(raw, len);
    key[1] = len > 8 ? tti_load_upto8(raw + 8, len - 8) : 0;
    key[2] = len > 16 ? tti_load_upto8(raw + 16, len - 16) : 0;
}

/* The cache slot (of 1 << bits) for a token key: an unkeyed multiply-shift
 * mix. Crafted collisions only cause cache misses, since callers compare
 * the whole key. */
static inline size_t tti_token_slot(const uint64_t key[3], size_t len, unsigned bits)
{
    uint64_t mix = (key[0] * 0x9E3779B97F4A7C15ULL) ^ (key[1] * 0xC2B2AE3D27D4EB4FULL) ^
                   (key[2] * 0x165667B19E3779F9ULL) ^ len;
    return (size_t)((mix ^ (mix >> 29)) >> (64 - bits));
}

/* Whether the SSE2 paths are used (src/simd.c, tt_simd()). */
extern int tti_use_simd;

/* Whether SSSE3 and AVX2 versions are compiled in (x86 with SSE2, and a
 * compiler that takes per-function target attributes and asks the CPU
 * with __builtin_cpu_supports), and the widest level (TT_SIMD_ in
 * termtide/simd.h) the SIMD paths may use now: TT_SIMD_PORTABLE under
 * tt_simd(0), else up to the cap and what the CPU has. */
#if (defined(__x86_64__) || defined(__i386__)) && defined(__SSE2__) && \
    (defined(__GNUC__) || defined(__clang__))
#define TTI_SIMD_WIDE 1
#else
#define TTI_SIMD_WIDE 0
#endif
int tti_simd_level(void);

/* A block built in place (src/blocks.c): the text appended to b->text
 * from off on (tt_buf calls; never a '\n') becomes a block of kind, unless
 * it is empty. On failure the text from off on is dropped. */
struct tt_blocks;
tt_status tti_blocks_close(struct tt_blocks *b, int kind, size_t off, long long src_off);
/* (kind is a tt_block_kind, termtide/extract.h) */

/* Counting many documents into one table (a running total): like
 * tt_counter_count, but hits may stay held in the counter's cache between
 * calls, so the table is up to date only after tti_counter_flush. Every
 * call until that flush must name the same table. On a failure the held
 * hits are dropped (the caller discards or fails the table anyway). */
struct tt_counter;
struct tt_blocks;
struct tt_termtable;
struct tt_doc_stats;
tt_status tti_counter_count_held(struct tt_counter *c, const struct tt_blocks *blocks,
                                 struct tt_termtable *table, struct tt_doc_stats *stats);
tt_status tti_counter_flush(struct tt_counter *c, struct tt_termtable *table);
/* How many tokens the counter takes between flushes of its held hits into
 * the table it counts into (count.c, FUSED_FLUSH); tests set a small number
 * to exercise the flush. */
void tti_counter_set_flush_every(struct tt_counter *c, uint64_t tokens);

/* A text compiled into the library by tools/embed.c (stop-word lists,
 * lexicons); each generated table ends with a { NULL, NULL } entry. */
struct tti_embedded {
    const char *name;
    const char *text;
};
extern const struct tti_embedded tti_stopword_lists[];
extern const struct tti_embedded tti_lexicon_files[];

/* Copies src into a fixed array, truncating, always NUL-terminated. */
void tti_strlcpy(char *dst, const char *src, size_t size);

/* Turns counts c[0..n) into exclusive prefix sums in place (each bucket's
 * first position, for a counting or radix sort). */
static inline void tti_prefix_sums(size_t *c, size_t n)
{
    size_t sum = 0;
    for (size_t i = 0; i < n; i++) {
        size_t k = c[i];
        c[i] = sum;
        sum += k;
    }
}

/* A zeroed block of count * size bytes for a large table or buffer
 * (alloc.c): from 1 MiB on, fresh 2 MiB-aligned pages the kernel may back
 * with huge pages (*mapped = 1); smaller, or with a test allocator
 * installed, from tt_calloc (*mapped = 0). NULL when out of memory. Freed
 * with tti_free_large and the same count, size and mapped. */
void *tti_alloc_large(size_t count, size_t size, int *mapped);
void tti_free_large(void *p, size_t count, size_t size, int mapped);

/* tt_buf_grow for a buffer kept from one document to the next (a
 * reader's): once it needs 256 KiB or more, its capacity is taken in whole
 * 2 MiB steps, so it is a big block of alloc.c on huge pages, faulted in
 * once, where growing it by doubling faults its pages in 4 KiB at a time
 * (two or three hundred faults per worker for the benchmark's 0.5 MB
 * documents). */
tt_status tti_buf_grow_kept(tt_buf *b, size_t extra);

/* pthread_create(tid, NULL, fn, arg), but the thread starts on the k-th
 * allowed CPU after the caller's (k = 0 the next; the caller's own comes
 * last round the mask; parallel.c says why); once running it may go
 * anywhere the caller could. 0, or -1 if no thread started. */
int tti_thread_start(pthread_t *tid, void *(*fn)(void *), void *arg, unsigned k);

#endif
