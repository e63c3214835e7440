/* termtide — library-internal helpers shared by the stages (tier `tti_`).
 * Nothing outside src/ includes this header. */
#ifndef TT_INTERNAL_H
#define TT_INTERNAL_H

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

/* Copies src into a fixed array, truncating, always NUL-terminated. */
void tti_strlcpy(char *dst, const char *src, size_t size);

#endif
