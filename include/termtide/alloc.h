/* termtide — the one place memory is allocated.
 *
 * Every allocation in the library goes through these functions, so a test
 * can install a failing allocator and prove that out-of-memory is reported as
 * TT_ENOMEM, never crashed on. tt_malloc(0) returns a valid unique pointer. */
#ifndef TT_ALLOC_H
#define TT_ALLOC_H

#include <stddef.h>

typedef struct tt_allocator {
    void *(*malloc_fn)(size_t size);
    void *(*realloc_fn)(void *ptr, size_t size);
    void (*free_fn)(void *ptr);
} tt_allocator;

/* Installs an allocator for the whole process; NULL restores the C library's.
 * Not thread-safe: call before starting workers. */
void tt_set_allocator(const tt_allocator *alloc);

/* Return NULL on failure (and on size overflow for tt_calloc / tt_reallocarray). */
void *tt_malloc(size_t size);
void *tt_calloc(size_t count, size_t size);
void *tt_realloc(void *ptr, size_t size);
void *tt_reallocarray(void *ptr, size_t count, size_t size);
void tt_free(void *ptr);

/* Copies len bytes and a NUL. The caller frees the copy with tt_free(). */
char *tt_strndup(const char *s, size_t len);
char *tt_strdup(const char *s);

#endif
