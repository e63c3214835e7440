/* termtide — the allocation hook. A test installs a failing allocator to
 * prove every TT_ENOMEM path; production uses the C library's. */
#include <stdint.h>
#include <stdlib.h>
#include <sys/mman.h>

#include "tt_internal.h"

static void *default_malloc(size_t n) { return malloc(n); }
static void *default_realloc(void *p, size_t n) { return realloc(p, n); }
static void default_free(void *p) { free(p); }

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
#define HUGE_PAGE ((size_t)2 << 20)

static int use_mmap(size_t bytes)
{
#if defined(MAP_ANONYMOUS) && defined(MADV_HUGEPAGE)
    return bytes >= LARGE_MIN && current.malloc_fn == default_malloc;
#else
    (void)bytes;
    return 0;
#endif
}

static size_t large_len(size_t bytes)
{
    return (bytes + HUGE_PAGE - 1) & ~(HUGE_PAGE - 1);
}

void *tti_alloc_large(size_t count, size_t size, int *mapped)
{
    *mapped = 0;
    if (size && count > SIZE_MAX / size)
        return NULL;
    size_t bytes = count * size;
    if (!use_mmap(bytes) || bytes > SIZE_MAX - 2 * HUGE_PAGE)
        return tt_calloc(count, size);
#if defined(MAP_ANONYMOUS) && defined(MADV_HUGEPAGE)
    size_t len = large_len(bytes), span = len + HUGE_PAGE;
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
    *mapped = 1;
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
