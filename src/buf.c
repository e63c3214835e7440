/* termtide — growable buffer with a cap (see include/termtide/buf.h).
 * Growth doubles the capacity, so n appends cost O(n) amortised. */
#include <stdarg.h>
#include <stdint.h>
#include <stdio.h>
#include <sys/mman.h>

#include "tt_internal.h"

/* Large buffers (a whole filing, its extracted text) are first touched page
 * by page; with 4 KiB pages the page faults alone cost as much as reading
 * the text. Asking for transparent huge pages on the aligned interior of a
 * large buffer cuts that to a few faults per MiB. A hint only: where the
 * kernel says no, nothing changes. */
#define HUGE_PAGE ((size_t)2 << 20)

static void advise_huge(char *p, size_t cap)
{
#ifdef MADV_HUGEPAGE
    if (cap < 2 * HUGE_PAGE)
        return;
    uintptr_t start = ((uintptr_t)p + HUGE_PAGE - 1) & ~(uintptr_t)(HUGE_PAGE - 1);
    uintptr_t end = ((uintptr_t)p + cap) & ~(uintptr_t)(HUGE_PAGE - 1);
    if (end > start)
        madvise((void *)start, end - start, MADV_HUGEPAGE);
#else
    (void)p;
    (void)cap;
#endif
}

static char empty_string[1];

void tt_buf_init(tt_buf *b, size_t limit)
{
    b->data = empty_string;
    b->len = 0;
    b->cap = 0;
    b->limit = limit ? limit : SIZE_MAX / 2;
}

void tt_buf_release(tt_buf *b)
{
    if (b->cap)
        tt_free(b->data);
    b->data = empty_string;
    b->len = 0;
    b->cap = 0;
}

void tt_buf_clear(tt_buf *b)
{
    size_t limit = b->limit;
    tt_buf_release(b);
    tt_buf_init(b, limit);
}

void tt_buf_reset(tt_buf *b)
{
    b->len = 0;
    if (b->cap)
        b->data[0] = '\0';
}

tt_status tt_buf_grow(tt_buf *b, size_t extra)
{
    if (extra > b->limit || b->len > b->limit - extra)
        return TT_ELIMIT;
    size_t need = b->len + extra + 1;
    if (need <= b->cap)
        return TT_OK;
    size_t cap = b->cap ? b->cap : 64;
    while (cap < need)
        cap = cap > SIZE_MAX / 2 ? need : cap * 2;
    if (cap > b->limit + 1)
        cap = b->limit + 1;
    char *p = b->cap ? tt_realloc(b->data, cap) : tt_malloc(cap);
    if (!p)
        return TT_ENOMEM;
    if (!b->cap)
        p[0] = '\0';
    b->data = p;
    b->cap = cap;
    advise_huge(p, cap);
    return TT_OK;
}

#define KEPT_HUGE_MIN ((size_t)256 << 10)

tt_status tti_buf_grow_kept(tt_buf *b, size_t extra)
{
    /* a request within the limit is widened to whole huge pages (when that
     * still is); tt_buf_grow does the rest, checks included */
    int fits = extra <= b->limit && b->len <= b->limit - extra;
    size_t need = fits ? b->len + extra + 1 : 0;
    if (need > b->cap && need >= KEPT_HUGE_MIN && need <= SIZE_MAX - HUGE_PAGE) {
        size_t whole = (need + HUGE_PAGE - 1) & ~(HUGE_PAGE - 1);
        if (whole - 1 - b->len <= b->limit - b->len)
            extra = whole - 1 - b->len;
    }
    return tt_buf_grow(b, extra);
}

tt_status tt_buf_append(tt_buf *b, const void *data, size_t len)
{
    tt_status st = tt_buf_grow(b, len);
    if (st)
        return st;
    if (len)
        memcpy(b->data + b->len, data, len);
    b->len += len;
    b->data[b->len] = '\0';
    return TT_OK;
}

tt_status tt_buf_puts(tt_buf *b, const char *s) { return tt_buf_append(b, s, strlen(s)); }

tt_status tt_buf_putc(tt_buf *b, int c)
{
    char ch = (char)c;
    return tt_buf_append(b, &ch, 1);
}

tt_status tt_buf_put_utf8(tt_buf *b, unsigned long cp)
{
    unsigned char s[4];
    size_t n;
    if (cp > 0x10FFFF || (cp >= 0xD800 && cp <= 0xDFFF))
        cp = 0xFFFD;
    if (cp < 0x80) {
        s[0] = (unsigned char)cp;
        n = 1;
    } else if (cp < 0x800) {
        s[0] = (unsigned char)(0xC0 | (cp >> 6));
        s[1] = (unsigned char)(0x80 | (cp & 0x3F));
        n = 2;
    } else if (cp < 0x10000) {
        s[0] = (unsigned char)(0xE0 | (cp >> 12));
        s[1] = (unsigned char)(0x80 | ((cp >> 6) & 0x3F));
        s[2] = (unsigned char)(0x80 | (cp & 0x3F));
        n = 3;
    } else {
        s[0] = (unsigned char)(0xF0 | (cp >> 18));
        s[1] = (unsigned char)(0x80 | ((cp >> 12) & 0x3F));
        s[2] = (unsigned char)(0x80 | ((cp >> 6) & 0x3F));
        s[3] = (unsigned char)(0x80 | (cp & 0x3F));
        n = 4;
    }
    return tt_buf_append(b, s, n);
}

tt_status tt_buf_printf(tt_buf *b, const char *fmt, ...)
{
    va_list ap;
    va_start(ap, fmt);
    int n = vsnprintf(NULL, 0, fmt, ap);
    va_end(ap);
    if (n < 0)
        return TT_EINVAL;
    tt_status st = tt_buf_grow(b, (size_t)n);
    if (st)
        return st;
    va_start(ap, fmt);
    vsnprintf(b->data + b->len, (size_t)n + 1, fmt, ap);
    va_end(ap);
    b->len += (size_t)n;
    return TT_OK;
}

char *tt_buf_detach(tt_buf *b, size_t *len_out)
{
    char *p;
    if (len_out)
        *len_out = b->len;
    if (b->cap)
        p = b->data;
    else
        p = tt_strndup("", 0);
    tt_buf_init(b, b->limit);
    return p;
}

size_t tti_utf8_decode(const unsigned char *s, size_t n, uint32_t *cp)
{
    unsigned c = s[0];
    if (c < 0x80) {
        *cp = c;
        return 1;
    }
    size_t len;
    uint32_t min, v;
    if (c >= 0xC2 && c <= 0xDF) {
        len = 2; v = c & 0x1F; min = 0x80;
    } else if (c >= 0xE0 && c <= 0xEF) {
        len = 3; v = c & 0x0F; min = 0x800;
    } else if (c >= 0xF0 && c <= 0xF4) {
        len = 4; v = c & 0x07; min = 0x10000;
    } else {
        *cp = 0xFFFD;
        return 1;
    }
    if (n < len) {
        *cp = 0xFFFD;
        return 1;
    }
    for (size_t i = 1; i < len; i++) {
        if ((s[i] & 0xC0) != 0x80) {
            *cp = 0xFFFD;
            return 1;
        }
        v = (v << 6) | (s[i] & 0x3F);
    }
    if (v < min || v > 0x10FFFF || (v >= 0xD800 && v <= 0xDFFF)) {
        *cp = 0xFFFD;
        return 1;
    }
    *cp = v;
    return len;
}
