/* termtide — the allocation hook. A test installs a failing allocator to
 * prove every TT_ENOMEM path; production uses the C library's. */
#if defined(__linux__)
#define _GNU_SOURCE 1 /* mremap, MREMAP_*, malloc_usable_size */
#endif
#include <malloc.h>
#include <pthread.h>
#include <stdint.h>
#include <stdlib.h>
#include <sys/mman.h>

#include "tt_internal.h"

/* Big blocks: the default allocator gives blocks of BIG_MIN bytes and more
 * (a large table's entries, the rows of a total being formatted, a long
 * document's text) from mappings of their own, 2 MiB-aligned and marked
 * MADV_HUGEPAGE, so that the kernel may back them with huge pages: one
 * fault and one 2 MiB clear instead of 512 faults of 4 KiB. In a virtual
 * machine a fault can cost 10 microseconds (measured here: 8 MiB touched
 * page by page 22 ms, on huge pages 0.5 ms), which made the sorted entries
 * of a 97,000-term total (2.3 MB) cost 4 ms to write and 0.6 ms on huge
 * pages. A big block grows by moving its pages (mremap), never by copying.
 *
 * Such blocks are told apart from the C library's by a list of the live
 * ones (address and mapping length), looked at only for a 2 MiB-aligned
 * pointer, which the C library's blocks almost never are; the list is
 * short (a few dozen blocks at most in a run) and under a lock. When it is
 * full, or mmap fails, blocks come from malloc as usual. Off under
 * AddressSanitizer, which must see every block to check it. */
#if defined(MAP_ANONYMOUS) && defined(MADV_HUGEPAGE) && defined(MREMAP_MAYMOVE) && \
    !defined(__SANITIZE_ADDRESS__)
#define TT_BIG_BLOCKS 1
#else
#define TT_BIG_BLOCKS 0
#endif
#define HUGE_PAGE ((size_t)2 << 20)
#define BIG_MIN ((size_t)1 << 20)
#define BIG_SLOTS 256

static size_t large_len(size_t bytes)
{
    return (bytes + HUGE_PAGE - 1) & ~(HUGE_PAGE - 1);
}

#if defined(MAP_ANONYMOUS) && defined(MADV_HUGEPAGE)
/* len bytes (a multiple of HUGE_PAGE) of fresh zeroed 2 MiB-aligned
 * memory, marked for huge pages, or NULL. */
static char *map_aligned(size_t len)
{
    if (len > SIZE_MAX - HUGE_PAGE)
        return NULL;
    size_t span = len + HUGE_PAGE;
    char *raw = mmap(NULL, span, PROT_READ | PROT_WRITE, MAP_PRIVATE | MAP_ANONYMOUS, -1, 0);
    if (raw == MAP_FAILED)
        return NULL;
    /* keep the 2 MiB-aligned part, give back the rest */
    char *p = (char *)(((uintptr_t)raw + HUGE_PAGE - 1) & ~(uintptr_t)(HUGE_PAGE - 1));
    if (p > raw)
        munmap(raw, (size_t)(p - raw));
    if (raw + span > p + len)
        munmap(p + len, (size_t)(raw + span - (p + len)));
    madvise(p, len, MADV_HUGEPAGE); /* a hint: without it, plain pages */
    return p;
}

#endif

#if TT_BIG_BLOCKS
static pthread_mutex_t big_lock = PTHREAD_MUTEX_INITIALIZER;
static struct {
    char *p;
    size_t len;
} big[BIG_SLOTS];
static size_t big_n;

/* The list's index of big block p, or -1 (with big_lock held). */
static long big_find(const void *p)
{
    for (size_t i = 0; i < big_n; i++)
        if (big[i].p == p)
            return (long)i;
    return -1;
}

/* The mapping length of big block p, or 0 when p is the C library's. */
static size_t big_len(const void *p)
{
    if ((uintptr_t)p & (HUGE_PAGE - 1))
        return 0;
    pthread_mutex_lock(&big_lock);
    long i = big_find(p);
    size_t len = i < 0 ? 0 : big[i].len;
    pthread_mutex_unlock(&big_lock);
    return len;
}

/* Records p (len bytes) as big, or unmaps it and says no (list full). */
static int big_keep(char *p, size_t len)
{
    pthread_mutex_lock(&big_lock);
    int ok = big_n < BIG_SLOTS;
    if (ok) {
        big[big_n].p = p;
        big[big_n].len = len;
        big_n++;
    }
    pthread_mutex_unlock(&big_lock);
    if (!ok)
        munmap(p, len);
    return ok;
}

/* Takes p off the list (or changes its entry to q, qlen). */
static void big_update(const void *p, char *q, size_t qlen)
{
    pthread_mutex_lock(&big_lock);
    long i = big_find(p);
    if (i >= 0) {
        if (q) {
            big[i].p = q;
            big[i].len = qlen;
        } else {
            big[i] = big[--big_n];
        }
    }
    pthread_mutex_unlock(&big_lock);
}

static void *big_alloc(size_t n)
{
    size_t len = large_len(n);
    char *p = map_aligned(len);
    return p && big_keep(p, len) ? p : NULL;
}

static void *default_malloc(size_t n)
{
    void *p = n >= BIG_MIN ? big_alloc(n) : NULL;
    return p ? p : malloc(n);
}

static void default_free(void *p)
{
    size_t len = big_len(p);
    if (!len) {
        free(p);
        return;
    }
    big_update(p, NULL, 0);
    munmap(p, len);
}

static void *default_realloc(void *p, size_t n)
{
    size_t len = p ? big_len(p) : 0;
    if (!len) {
        if (n < BIG_MIN || !p)
            return p ? realloc(p, n) : default_malloc(n);
        /* a block of the C library's grown past BIG_MIN becomes big */
        size_t old = malloc_usable_size(p);
        void *q = big_alloc(n);
        if (!q)
            return realloc(p, n);
        memcpy(q, p, old < n ? old : n);
        free(p);
        return q;
    }
    if (n <= len)
        return p; /* a big block never shrinks */
    /* the pages move to a new aligned mapping that is larger */
    size_t qlen = large_len(n);
    char *q = map_aligned(qlen);
    if (!q)
        return NULL;
    if (mremap(p, len, len, MREMAP_MAYMOVE | MREMAP_FIXED, q) == MAP_FAILED) {
        memcpy(q, p, len);
        munmap(p, len);
    }
    big_update(p, q, qlen);
    return q;
}
#else
static void *default_malloc(size_t n) { return malloc(n); }
static void *default_realloc(void *p, size_t n) { return realloc(p, n); }
static void default_free(void *p) { free(p); }
#endif

static tt_allocator current = { default_malloc, default_realloc, default_free };

void tt_set_allocator(const tt_allocator *alloc)
{
    if (alloc)
        current = *alloc;
    else {
        current.malloc_fn = default_malloc;
        current.realloc_fn = default_realloc;
        current.free_fn = default_free;
    }
}

void *tt_malloc(size_t size) { return current.malloc_fn(size ? size : 1); }

void *tt_calloc(size_t count, size_t size)
{
    if (size && count > SIZE_MAX / size)
        return NULL;
    size_t bytes = count * size;
    void *p = tt_malloc(bytes);
#if TT_BIG_BLOCKS
    if (p && current.malloc_fn == default_malloc && big_len(p))
        return p; /* fresh from mmap: zero already, and not touched yet */
#endif
    if (p)
        memset(p, 0, bytes ? bytes : 1);
    return p;
}

void *tt_realloc(void *ptr, size_t size) { return current.realloc_fn(ptr, size ? size : 1); }

void *tt_reallocarray(void *ptr, size_t count, size_t size)
{
    if (size && count > SIZE_MAX / size)
        return NULL;
    return tt_realloc(ptr, count * size);
}

void tt_free(void *ptr)
{
    if (ptr)
        current.free_fn(ptr);
}

char *tt_strndup(const char *s, size_t len)
{
    char *p = tt_malloc(len + 1);
    if (!p)
        return NULL;
    memcpy(p, s, len);
    p[len] = '\0';
    return p;
}

char *tt_strdup(const char *s) { return tt_strndup(s, strlen(s)); }

/* Large zeroed blocks: fresh pages from mmap, 2 MiB-aligned and marked
 * MADV_HUGEPAGE, so that the kernel may back them with huge pages: one page
 * fault (and one 2 MiB clear) instead of 512 faults of 4 KiB. In a virtual
 * machine a fault costs microseconds, and a large term table's slots, grown
 * by doubling to megabytes, would otherwise take thousands of them. A test
 * allocator, once installed, serves these too (so its failures reach every
 * caller). */
#define LARGE_MIN ((size_t)1 << 20)

static int use_mmap(size_t bytes)
{
#if defined(MAP_ANONYMOUS) && defined(MADV_HUGEPAGE)
    return bytes >= LARGE_MIN && current.malloc_fn == default_malloc;
#else
    (void)bytes;
    return 0;
#endif
}

void *tti_alloc_large(size_t count, size_t size, int *mapped)
{
    *mapped = 0;
    if (size && count > SIZE_MAX / size)
        return NULL;
    size_t bytes = count * size;
    if (!use_mmap(bytes))
        return tt_calloc(count, size);
#if defined(MAP_ANONYMOUS) && defined(MADV_HUGEPAGE)
    char *p = map_aligned(large_len(bytes));
    *mapped = p != NULL;
    return p;
#else
    return NULL;
#endif
}

void tti_free_large(void *p, size_t count, size_t size, int mapped)
{
    if (!p)
        return;
    if (mapped)
        munmap(p, large_len(count * size));
    else
        tt_free(p);
}
