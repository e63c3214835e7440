/* termtide — term-table calls for the counting hot path (tier `tti_`):
 * hash a term once, then look it up in the stop-word set and add it to the
 * document's table with the same hash. Every table shares the process-wide
 * key, so one hash serves all of them. */
#ifndef TT_TERMTABLE_INTERNAL_H
#define TT_TERMTABLE_INTERNAL_H

#include <stddef.h>
#include <stdint.h>
#include <string.h>

#include "termtide/termtable.h"

uint64_t tti_termtable_hash(const char *term, size_t len);
uint64_t tti_termtable_get_hashed(const tt_termtable *t, const char *term, size_t len,
                                  uint64_t hash);

/* The table's layout (see termtable.c for its design and invariants). It
 * is here only so that adding a term already in the table, once per kept
 * token, is inlined into the counting loop; nothing but termtable.c and
 * tti_termtable_add_hashed below touches it. */
typedef struct tti_slot {
    uint64_t hash;
    const char *term; /* NULL: empty slot */
    size_t len;
    uint64_t count;
} tti_slot;

struct tt_termtable {
    tti_slot *slots;
    size_t cap;       /* power of two */
    size_t distinct;
    uint64_t total;
    struct tti_chunk *arena; /* newest first */
    int slots_mapped; /* slots from tti_alloc_large's pages */
    int big;          /* made by tt_termtable_new_large */
};

/* Byte equality without a library call, so that a probe loop makes no
 * calls (a call in it would make every probe pay for saving and restoring
 * registers): overlapping fixed-size loads cover any length from 4 to 16,
 * longer terms go 8 bytes at a time with an overlapping last word. Only
 * called when the hashes already match, so it nearly always succeeds. */
static inline int tti_same_bytes(const char *a, const char *b, size_t n)
{
    uint64_t x, y, u, v;
    if (n >= 8) {
        for (size_t i = 0; i + 8 < n; i += 8) {
            memcpy(&x, a + i, 8);
            memcpy(&y, b + i, 8);
            if (x != y)
                return 0;
        }
        memcpy(&u, a + n - 8, 8);
        memcpy(&v, b + n - 8, 8);
        return u == v;
    }
    if (n >= 4) {
        uint32_t x4, y4, u4, v4;
        memcpy(&x4, a, 4);
        memcpy(&y4, b, 4);
        memcpy(&u4, a + n - 4, 4);
        memcpy(&v4, b + n - 4, 4);
        return ((x4 ^ y4) | (u4 ^ v4)) == 0;
    }
    for (size_t i = 0; i < n; i++)
        if (a[i] != b[i])
            return 0;
    return 1;
}

/* The slot holding term, or the empty slot where it would go. The stored
 * hash is compared first: a probe reads the term's bytes only when all 64
 * bits agree. */
static inline tti_slot *tti_termtable_find(const tt_termtable *t, const char *term, size_t len,
                                           uint64_t h)
{
    size_t mask = t->cap - 1;
    size_t i = (size_t)h & mask;
    for (;;) {
        tti_slot *s = &t->slots[i];
        if (s->hash == h && s->len == len && s->term && tti_same_bytes(s->term, term, len))
            return s;
        if (!s->term)
            return s;
        i = (i + 1) & mask;
    }
}

/* Enters a term not in the table yet; s is the empty slot
 * tti_termtable_find gave for it. TT_ENOMEM, or TT_ELIMIT past
 * TT_LIMIT_DISTINCT_TERMS distinct terms. */
tt_status tti_termtable_insert(tt_termtable *t, tti_slot *s, const char *term, size_t len,
                               uint64_t hash, uint64_t count);

/* Exchanges the contents of two tables (terms, counts, memory). */
void tti_termtable_swap(tt_termtable *a, tt_termtable *b);

/* tt_termtable_add with the term's hash (tti_termtable_hash) already known. */
static inline tt_status tti_termtable_add_hashed(tt_termtable *t, const char *term, size_t len,
                                                 uint64_t hash, uint64_t count)
{
    tti_slot *s = tti_termtable_find(t, term, len, hash);
    if (!s->term)
        return tti_termtable_insert(t, s, term, len, hash, count);
    s->count += count;
    t->total += count;
    return TT_OK;
}

#endif
