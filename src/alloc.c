/* termtide — the allocation hook. A test installs a failing allocator to
 * prove every TT_ENOMEM path; production uses the C library's. */
#include <stdint.h>
#include <stdlib.h>

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
