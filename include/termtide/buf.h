/* termtide — a growable byte buffer with a size cap.
 *
 * Invariants: data is never NULL after tt_buf_init (it points at a shared
 * empty string until the first growth) and data[len] == '\0' always, so the
 * contents can be used as a C string when they hold no NUL. A buffer never
 * grows past `limit` bytes: an append that would exceed it returns
 * TT_ELIMIT and leaves the buffer unchanged, so a hostile file cannot take
 * all memory. */
#ifndef TT_BUF_H
#define TT_BUF_H

#include <stddef.h>
#include "termtide/status.h"

typedef struct tt_buf {
    char *data;
    size_t len;
    size_t cap;   /* 0 while data points at the shared empty string */
    size_t limit; /* most bytes the buffer may hold (excluding the NUL) */
} tt_buf;

/* limit 0 means SIZE_MAX / 2. */
void tt_buf_init(tt_buf *b, size_t limit);
/* Frees the contents; the buffer must be initialised again before reuse. */
void tt_buf_release(tt_buf *b);
/* Release, then init with the same limit. */
void tt_buf_clear(tt_buf *b);
/* Keeps the memory, empties the contents. */
void tt_buf_reset(tt_buf *b);

/* Makes room for `extra` more bytes. TT_ENOMEM or TT_ELIMIT on failure. */
tt_status tt_buf_grow(tt_buf *b, size_t extra);
tt_status tt_buf_append(tt_buf *b, const void *data, size_t len);
tt_status tt_buf_puts(tt_buf *b, const char *s);
tt_status tt_buf_putc(tt_buf *b, int c);
/* Appends a code point as UTF-8 (invalid ones as U+FFFD). */
tt_status tt_buf_put_utf8(tt_buf *b, unsigned long cp);
tt_status tt_buf_printf(tt_buf *b, const char *fmt, ...)
    __attribute__((format(printf, 2, 3)));
/* Removes and returns the contents; the caller frees them with tt_free().
 * *len_out (if not NULL) receives the length. The buffer is left empty. */
char *tt_buf_detach(tt_buf *b, size_t *len_out);

#endif
