/* termtide — term table: term string → count.
 *
 * Layout: an open-addressing table of slots {hash, term pointer, length,
 * count} with linear probing, capacity a power of two, kept at most 70%
 * full (grown by doubling, which rehashes from the stored hashes without
 * touching the strings). Term strings live in an arena of large chunks, so
 * a new term costs one memcpy and no malloc; strings never move, so entry
 * pointers stay valid until the table is freed or reset.
 *
 * Hash: SipHash-1-3 with a 128-bit key (Aumasson & Bernstein 2012, "SipHash:
 * a fast short-input PRF"), so crafted terms cannot force collisions without
 * the key. The key is process-wide, so a hash stored in one table is valid
 * in every other (merging reuses it instead of hashing again); output never
 * follows hash order, it is sorted by count then term (tt_termtable_sorted).
 *
 * A probe compares the stored 64-bit hash first and reads the term's bytes
 * only when it agrees; the probe loop makes no calls, and inserting a new
 * term is a separate function, so counting a term already in the table
 * (most of the work) runs a short path. That path (tti_termtable_find,
 * tti_termtable_add_hashed) and the layout it needs are in
 * termtable_internal.h, so the counting loop inlines it.
 *
 * Invariants: slot.term == NULL ⇔ empty; distinct < cap * 7/10; total ==
 * sum of counts. Lookup and insert are O(1) expected; sort is O(n log n). */

#include "termtide/termtable.h"
#include "tt_internal.h"
#include "termtable_internal.h"

/* The slot and table layout are in termtable_internal.h. */
typedef tti_slot slot;

typedef struct tti_chunk {
    struct tti_chunk *next;
    size_t used, size;
    char data[];
} chunk;

#define ARENA_CHUNK ((size_t)256 * 1024)
#define INITIAL_CAP 1024

static uint64_t key0 = 0x736f6d6570736575ULL, key1 = 0x646f72616e646f6dULL;

void tt_termtable_set_seed(uint64_t k0, uint64_t k1)
{
    key0 = k0;
    key1 = k1;
}

#define ROTL(x, b) (uint64_t)(((x) << (b)) | ((x) >> (64 - (b))))
#define SIPROUND                                                                   \
    do {                                                                           \
        v0 += v1; v1 = ROTL(v1, 13); v1 ^= v0; v0 = ROTL(v0, 32);                  \
        v2 += v3; v3 = ROTL(v3, 16); v3 ^= v2;                                     \
        v0 += v3; v3 = ROTL(v3, 21); v3 ^= v0;                                     \
        v2 += v1; v1 = ROTL(v1, 17); v1 ^= v2; v2 = ROTL(v2, 32);                  \
    } while (0)

/* SipHash-1-3: one compression round per 8-byte word, three finalisation
 * rounds. */
static uint64_t siphash13(const unsigned char *in, size_t len)
{
    uint64_t v0 = 0x736f6d6570736575ULL ^ key0;
    uint64_t v1 = 0x646f72616e646f6dULL ^ key1;
    uint64_t v2 = 0x6c7967656e657261ULL ^ key0;
    uint64_t v3 = 0x7465646279746573ULL ^ key1;
    uint64_t b = (uint64_t)len << 56;
    const unsigned char *end = in + (len & ~(size_t)7);
    for (; in != end; in += 8) {
        uint64_t m;
        memcpy(&m, in, 8); /* little-endian hosts; the hash stays internal */
        v3 ^= m;
        SIPROUND;
        v0 ^= m;
    }
    switch (len & 7) {
    case 7: b |= (uint64_t)in[6] << 48; /* fall through */
    case 6: b |= (uint64_t)in[5] << 40; /* fall through */
    case 5: b |= (uint64_t)in[4] << 32; /* fall through */
    case 4: b |= (uint64_t)in[3] << 24; /* fall through */
    case 3: b |= (uint64_t)in[2] << 16; /* fall through */
    case 2: b |= (uint64_t)in[1] << 8;  /* fall through */
    case 1: b |= (uint64_t)in[0]; break;
    case 0: break;
    }
    v3 ^= b;
    SIPROUND;
    v0 ^= b;
    v2 ^= 0xff;
    SIPROUND;
    SIPROUND;
    SIPROUND;
    return v0 ^ v1 ^ v2 ^ v3;
}

tt_termtable *tt_termtable_new(void)
{
    tt_termtable *t = tt_calloc(1, sizeof *t);
    if (!t)
        return NULL;
    t->slots = tt_calloc(INITIAL_CAP, sizeof *t->slots);
    if (!t->slots) {
        tt_free(t);
        return NULL;
    }
    t->cap = INITIAL_CAP;
    return t;
}

static void free_arena(chunk *c)
{
    while (c) {
        chunk *next = c->next;
        tt_free(c);
        c = next;
    }
}

void tt_termtable_free(tt_termtable *t)
{
    if (!t)
        return;
    free_arena(t->arena);
    tt_free(t->slots);
    tt_free(t);
}

void tt_termtable_reset(tt_termtable *t)
{
    memset(t->slots, 0, t->cap * sizeof *t->slots);
    t->distinct = 0;
    t->total = 0;
    /* Keep the newest chunk for reuse; free the rest. */
    if (t->arena) {
        free_arena(t->arena->next);
        t->arena->next = NULL;
        t->arena->used = 0;
    }
}

static const char *arena_copy(tt_termtable *t, const char *s, size_t len)
{
    chunk *c = t->arena;
    if (!c || c->size - c->used < len + 1) {
        size_t size = len + 1 > ARENA_CHUNK ? len + 1 : ARENA_CHUNK;
        c = tt_malloc(sizeof *c + size);
        if (!c)
            return NULL;
        c->size = size;
        c->used = 0;
        c->next = t->arena;
        t->arena = c;
    }
    char *p = c->data + c->used;
    memcpy(p, s, len);
    p[len] = '\0';
    c->used += len + 1;
    return p;
}

static tt_status grow(tt_termtable *t)
{
    size_t cap = t->cap * 2;
    slot *slots = tt_calloc(cap, sizeof *slots);
    if (!slots)
        return TT_ENOMEM;
    for (size_t i = 0; i < t->cap; i++) {
        if (!t->slots[i].term)
            continue;
        size_t j = (size_t)t->slots[i].hash & (cap - 1);
        while (slots[j].term)
            j = (j + 1) & (cap - 1);
        slots[j] = t->slots[i];
    }
    tt_free(t->slots);
    t->slots = slots;
    t->cap = cap;
    return TT_OK;
}

uint64_t tti_termtable_hash(const char *term, size_t len)
{
    return siphash13((const unsigned char *)term, len);
}

tt_status tt_termtable_add(tt_termtable *t, const char *term, size_t len, uint64_t count)
{
    return tti_termtable_add_hashed(t, term, len, siphash13((const unsigned char *)term, len),
                                    count);
}

/* Kept out of tti_termtable_add_hashed so that the path of a term already
 * counted, by far the commoner, stays short. */
tt_status tti_termtable_insert(tt_termtable *t, slot *s, const char *term, size_t len, uint64_t h,
                               uint64_t count)
{
    if (t->distinct >= TT_LIMIT_DISTINCT_TERMS)
        return TT_ELIMIT;
    if ((t->distinct + 1) * 10 > t->cap * 7) {
        tt_status st = grow(t);
        if (st)
            return st;
        s = tti_termtable_find(t, term, len, h);
    }
    const char *copy = arena_copy(t, term, len);
    if (!copy)
        return TT_ENOMEM;
    s->hash = h;
    s->term = copy;
    s->len = len;
    s->count = count;
    t->distinct++;
    t->total += count;
    return TT_OK;
}

uint64_t tt_termtable_get(const tt_termtable *t, const char *term, size_t len)
{
    return tti_termtable_get_hashed(t, term, len, siphash13((const unsigned char *)term, len));
}

uint64_t tti_termtable_get_hashed(const tt_termtable *t, const char *term, size_t len, uint64_t h)
{
    const slot *s = tti_termtable_find(t, term, len, h);
    return s->term ? s->count : 0;
}

size_t tt_termtable_distinct(const tt_termtable *t) { return t->distinct; }
uint64_t tt_termtable_total(const tt_termtable *t) { return t->total; }

/* Every table hashes with the one process-wide key, so the hash stored in
 * src's slot is the one dst would compute. */
void tti_termtable_swap(tt_termtable *a, tt_termtable *b)
{
    tt_termtable t = *a;
    *a = *b;
    *b = t;
}

tt_status tt_termtable_merge(tt_termtable *dst, const tt_termtable *src)
{
    /* The destination slot of the term 16 slots on is prefetched: merging
     * two large tables is a cache miss per term otherwise, one at a time. */
    enum { AHEAD = 16 };
    for (size_t i = 0; i < src->cap; i++) {
        const slot *s = &src->slots[i];
        if (i + AHEAD < src->cap && src->slots[i + AHEAD].term)
            __builtin_prefetch(&dst->slots[src->slots[i + AHEAD].hash & (dst->cap - 1)]);
        if (!s->term)
            continue;
        tt_status st = tti_termtable_add_hashed(dst, s->term, s->len, s->hash, s->count);
        if (st)
            return st;
    }
    return TT_OK;
}

static int bytes_cmp(const char *a, size_t alen, const char *b, size_t blen)
{
    size_t n = alen < blen ? alen : blen;
    int c = memcmp(a, b, n);
    if (c)
        return c;
    return alen < blen ? -1 : alen > blen;
}

/* Sorting: each entry carries its term's first 8 bytes as a big-endian
 * number, zero-padded, so most comparisons of equal counts (the many terms
 * seen once or twice) are one integer compare; where two prefixes differ
 * they order as bytes_cmp would (a term that ends first is padded with 0,
 * no greater than any byte the other has there), and where they agree
 * bytes_cmp decides. The order is total (terms are distinct), so the result
 * does not depend on the algorithm: a merge sort with the comparison
 * inlined, O(n log n). */
typedef struct sort_item {
    uint64_t count;
    uint64_t prefix;
    const char *term;
    size_t len;
} sort_item;

static uint64_t term_prefix(const char *term, size_t len)
{
    const unsigned char *u = (const unsigned char *)term;
    uint64_t p = 0;
    for (size_t i = 0; i < 8; i++)
        p = (p << 8) | (i < len ? u[i] : 0u);
    return p;
}

/* Whether a sorts before b: count descending, then term bytewise. */
static inline int item_before(const sort_item *a, const sort_item *b)
{
    if (a->count != b->count)
        return a->count > b->count;
    if (a->prefix != b->prefix)
        return a->prefix < b->prefix;
    return bytes_cmp(a->term, a->len, b->term, b->len) < 0;
}

/* Sorts a[0, n) using tmp (room for n / 2 + 1 items). */
static void sort_items(sort_item *a, sort_item *tmp, size_t n)
{
    if (n <= 16) {
        for (size_t i = 1; i < n; i++) {
            sort_item x = a[i];
            size_t j = i;
            for (; j > 0 && item_before(&x, &a[j - 1]); j--)
                a[j] = a[j - 1];
            a[j] = x;
        }
        return;
    }
    size_t h = n / 2;
    sort_items(a, tmp, h);
    sort_items(a + h, tmp, n - h);
    if (!item_before(&a[h], &a[h - 1]))
        return; /* already in order */
    memcpy(tmp, a, h * sizeof *a);
    size_t i = 0, j = h, k = 0;
    while (i < h && j < n)
        a[k++] = item_before(&a[j], &tmp[i]) ? a[j++] : tmp[i++];
    while (i < h)
        a[k++] = tmp[i++];
}

tt_status tt_termtable_sorted(const tt_termtable *t, tt_term_entry **out, size_t *n)
{
    size_t total = t->distinct ? t->distinct : 1;
    tt_term_entry *e = tt_reallocarray(NULL, total, sizeof *e);
    sort_item *items = tt_reallocarray(NULL, total + total / 2 + 1, sizeof *items);
    if (!e || !items) {
        tt_free(e);
        tt_free(items);
        return TT_ENOMEM;
    }
    size_t k = 0;
    for (size_t i = 0; i < t->cap; i++) {
        const slot *s = &t->slots[i];
        if (!s->term)
            continue;
        items[k].count = s->count;
        items[k].prefix = term_prefix(s->term, s->len);
        items[k].term = s->term;
        items[k].len = s->len;
        k++;
    }
    sort_items(items, items + total, k);
    for (size_t i = 0; i < k; i++) {
        e[i].term = items[i].term;
        e[i].len = items[i].len;
        e[i].count = items[i].count;
    }
    tt_free(items);
    *out = e;
    *n = k;
    return TT_OK;
}

void tt_termtable_foreach(const tt_termtable *t,
                          int (*fn)(void *ctx, const tt_term_entry *e), void *ctx)
{
    for (size_t i = 0; i < t->cap; i++) {
        const slot *s = &t->slots[i];
        if (!s->term)
            continue;
        tt_term_entry e = { s->term, s->len, s->count };
        if (fn(ctx, &e))
            return;
    }
}
