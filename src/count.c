/* termtide — counting one document.
 *
 * For each block: tokens from the segmenter (views into the block text) →
 * normalized term in a reused buffer → stop-word and length checks → stem
 * (optional) → n-gram assembly → term table. No allocation per token: the
 * buffers grow to the longest term seen and are reused. Most tokens skip
 * the stages up to the table: a token cache (below) remembers what each
 * recent token became. On the benchmark's filing-like text about 3% of
 * tokens miss it, and the loop costs some 60 instructions a token besides
 * the tokenizer (callgrind); a kept token's count waits in the cache (see
 * "Pending counts"). Single terms without stemming, the default and most of
 * the work, take a fused path that tokenizes and counts in one loop (see
 * "the fused path" below).
 *
 * N-grams: a window of the last ngram_max kept tokens of the current
 * sentence (each with its final term form and whether it may start or end an
 * n-gram). At a sentence or block start the window empties; a left-out
 * number empties it too, since "revenue of 1,200 units" holds no n-gram
 * across the figure. Complexity O(tokens × ngram_max). */
#include "segment_internal.h" /* the tokenizer's windows; first, for its SIMD headers */

#if defined(__x86_64__) && defined(__SSE2__)
#define TT_COUNT_SSE2 1
#else
#define TT_COUNT_SSE2 0
#endif

#include "termtide/count.h"
#include "termtide/filter.h"
#include "termtide/normalize.h"
#include "termtide/segment.h"
#include "termtide/simd.h"
#include "normalize_internal.h"
#include "termtable_internal.h"
#include "tt_internal.h"

#define MAX_N 3

/* The fused path adds a kept hit to its way's pending count with no check
 * for overflow: instead, once FUSED_FLUSH tokens have been taken (from
 * windows and the walk) since the last flush, all pending hits go to the
 * table, checked after each window, so no count held (at most FUSED_FLUSH
 * plus a window's 64) comes near UINT32_MAX. */
#define FUSED_FLUSH ((uint64_t)1 << 31)

/* Token caches: from a token's raw bytes to what the slow path makes of
 * it: the final term (normalized, stemmed if asked), its table hash, and
 * whether it is a stop-word or too short. Normalization is a pure function
 * of the raw bytes, so an entry never goes stale; word frequencies follow
 * Zipf's law, so a few thousand entries catch most tokens and skip NFKC,
 * case folding, the stop-word lookup and SipHash for them. Slots are picked
 * by an unkeyed multiply-shift hash: crafted collisions only cause misses
 * (the slow path), never wrong terms, because the whole key is compared.
 *
 * The ASCII cache takes ASCII tokens of up to ASCII_RAW bytes, the bulk of
 * filing text (not with stemming, whose terms are no piece of the token). For ASCII, tt_normalize folds
 * byte by byte (lowercase, '`' → '\'') and then cuts the term out of the
 * folded token (tti_term_bounds), so a token and its lowercased form give
 * the same term: the key is the lowercased token ("The" and "the" share an
 * entry), and since the term is a piece of the key, an entry holds only
 * where the term starts and its length. That makes an entry 32 bytes, so a
 * 64-byte line holds a set of two ways (way 0 the more recently used; a hit
 * in way 1 swaps them), which keeps Zipf's head resident where a
 * direct-mapped table would let two common words evict each other. Tokens
 * holding '`' (whose term is not a piece of the key) are never entered.
 * Cost of a hit: one masked 16-byte load, an ASCII test and a lowercase of
 * all 16 bytes at once (SSE2, or two 64-bit words elsewhere), one multiply
 * for the set, one 64-byte line.
 *
 * The general cache takes every other token of up to CACHE_RAW bytes (and
 * all of them with stemming): direct-mapped, one 64-byte entry per line,
 * keyed by the raw bytes, the term stored beside them.
 *
 * Pending counts: a hit of a kept term in either cache does not touch the
 * term table; it adds one to the way's (the entry's) `pending`, and the set
 * (entry) goes on a dirty list the first time. The table is brought up to
 * date from the dirty lists at the end of each call that counts
 * (tt_counter_count, _count_text; tti_counter_flush for a running total)
 * and when a way or entry with pending hits is evicted. So the table sees
 * one add per distinct term of a call instead of one per token: its slots
 * (spread over megabytes for a large vocabulary, a cache miss each) and the
 * term's bytes are not read in the loop, only the cache's line, which the
 * lookup has just read. Between calls every pending is 0, so a counter can
 * count into another table next. On an error the pending hits are dropped
 * with the call's table, which the caller discards.
 *
 * Held hits and the figures: on the fused path (single terms, no
 * stemming; "the fused path" below) a hit in the ASCII cache only adds one
 * to its way's `pending`, whatever the word is, and the set goes on one of
 * two dirty lists at the first hit: `dirty` for kept terms, `sdirty` for
 * stop-words, short words and empty terms. The call's figures (tokens,
 * numbers and sentences come from the windows' masks) are closed at its
 * end (close_figures): the other words' held hits, from sdirty and from
 * ways evicted during the call (`held`), are its stop-words and short
 * words, and its kept terms are the tokens the ASCII cache answered
 * (`call_ascii`) less those. So the loop does one add per token and no
 * branch on the kind of word. The kept terms' hits stay held past the call
 * (a running total), as above. */
#define ASCII_BITS 14 /* 16384 sets of two ways: 1 MB (6% faster than 512 KB over the
                         * benchmark's 97,000 terms, and as fast as 2 MB) */
#define ASCII_RAW 16
#define CACHE_BITS 12 /* 4096 entries: 256 KB */
#define CACHE_RAW 24
#define CACHE_STOP 1u
#define CACHE_SHORT 2u
#define CACHE_EMPTY 4u
/* A dirty list holds the numbers of the sets (entries, for the general
 * cache) that may hold pending hits, each at most once (a byte per set says
 * whether it is on the list). */
typedef struct dirty_list {
    uint32_t *id;
    uint8_t *on;
    size_t n;
} dirty_list;

typedef struct ascii_way {
    uint64_t key[2];  /* the token, ASCII-lowercased, zero-padded */
    uint64_t hash;    /* tti_termtable_hash(term) */
    uint8_t raw_len;  /* 0: unused way */
    uint8_t term_off; /* the term is key bytes [term_off, term_off + term_len) */
    uint8_t term_len;
    uint8_t flags;
    uint32_t pending; /* hits not yet added to the table (see below) */
} ascii_way;

typedef struct ascii_set {
    ascii_way way[2]; /* way[0] the more recently used */
} ascii_set;

_Static_assert(sizeof(ascii_set) == 64, "one set of the ASCII cache per 64-byte line");
_Static_assert(ASCII_RAW == sizeof(((ascii_way *)0)->key), "an ASCII key is two words");

typedef struct cache_entry {
    uint64_t raw[CACHE_RAW / 8]; /* the raw token, zero-padded */
    uint64_t hash;               /* tti_termtable_hash(term) */
    uint32_t pending;            /* hits not yet added to the table */
    uint8_t raw_len;             /* 0: unused entry */
    uint8_t term_len;
    uint8_t flags;
    char term[CACHE_RAW];
} cache_entry;

_Static_assert(sizeof(cache_entry) == 64, "one cache entry per 64-byte line");

/* What a token resolves to (see resolve_general). */
typedef struct resolved {
    const char *term;
    size_t len;
    uint64_t hash;
    unsigned flags;
    cache_entry *entry; /* the general cache's entry now holding the token, or NULL */
} resolved;

/* Hits of an evicted way or entry wait in a batch before they are added
 * to the table, EVICT_BATCH at a time, in three passes: the terms' slots
 * are fetched (prefetched) all at once, then the terms' bytes of the slots
 * that hold them (which the add compares), then the adds run on what has
 * arrived. The table's cache misses, two per term, so overlap each other
 * instead of coming one after another; evictions come in bursts (a new
 * document's words), which a ring that prefetched a few evictions ahead
 * could not cover. */
#define EVICT_BATCH 64
typedef struct evicted {
    char term[CACHE_RAW];
    uint64_t hash;
    uint32_t count;
    uint8_t len;
} evicted;

typedef struct window_slot {
    tt_buf term;
    int edge_ok; /* may start or end an n-gram (not a stop-word, not short) */
} window_slot;

struct tt_counter {
    tt_count_options opt;
    tt_normalizer norm;
    tt_stemmer *stemmer;
    tt_buf normal;   /* normalized token */
    tt_buf stemmed;
    tt_buf gram;     /* an n-gram being assembled */
    window_slot win[MAX_N];
    size_t win_len;  /* tokens in the window, at most ngram_max */
    size_t win_head; /* index of the oldest */
    cache_entry *cache; /* 1 << CACHE_BITS entries, 64-byte aligned */
    ascii_set *ascii;   /* 1 << ASCII_BITS sets, 64-byte aligned; NULL with stemming */
    void *mem;          /* one block holding the caches and the dirty lists */
    size_t mem_size;
    int mem_mapped;
    dirty_list dirty;   /* ASCII sets with pending hits of kept terms (maybe) */
    dirty_list sdirty;  /* ASCII sets with pending hits of other words (maybe) */
    dirty_list gdirty;  /* general cache entries with pending hits (maybe) */
    tt_status fill_status; /* a failure to add evicted hits, for count_block */
    evicted evict[EVICT_BATCH]; /* evicted hits waiting, evict_n of them */
    size_t evict_n;
    resolved general;   /* the last answer of resolve_general */
    uint64_t unflushed;   /* tokens the fused path took since the last flush */
    /* This call's figures for the ASCII cache's hits (see "Held hits and
     * the figures"): tokens it answered, and the hits of stop-words, short
     * words and empty terms no longer held in a way (by CACHE_* flag) */
    uint64_t call_ascii;
    uint64_t held[8];
    uint64_t flush_every; /* FUSED_FLUSH (tests set less) */
};

void tt_count_options_init(tt_count_options *o)
{
    o->ngram_min = 1;
    o->ngram_max = 1;
    o->stem = 0;
    o->keep_numbers = 0;
    o->min_length = 1;
    o->stopwords = NULL;
}

/* A dirty list of n numbers at *at (in the counter's block, see
 * counter_tables), which it moves past the list; with base NULL only
 * *at moves, to measure. */
static void dirty_place(dirty_list *d, char *base, size_t *at, size_t n)
{
    if (base) {
        d->id = (uint32_t *)(void *)(base + *at);
        d->on = (uint8_t *)(base + *at + n * sizeof *d->id);
    }
    d->n = 0;
    *at += n * (sizeof *d->id + 1);
}

/* Lays out the counter's tables in one block from tti_alloc_large (base
 * NULL: only measures it): the general cache, the ASCII cache (none with
 * stemming) and the dirty lists, 64-byte aligned where a line is read at
 * once. In one block they share the huge page the ASCII cache takes
 * anyway (1 MiB of a 2 MiB mapping), where separately the general cache
 * (256 KB) and the lists (180 KB) were faulted in 4 KiB at a time, some
 * 110 faults of microseconds each for every counter (every worker). */
static size_t counter_tables(tt_counter *c, char *base)
{
    char *line = base ? (char *)(((uintptr_t)base + 63) & ~(uintptr_t)63) : NULL;
    if (base)
        c->cache = (cache_entry *)(void *)line;
    size_t at = ((size_t)1 << CACHE_BITS) * sizeof *c->cache;
    if (!c->opt.stem) {
        if (base)
            c->ascii = (ascii_set *)(void *)(line + at);
        at += ((size_t)1 << ASCII_BITS) * sizeof *c->ascii;
        dirty_place(&c->dirty, line, &at, (size_t)1 << ASCII_BITS);
        dirty_place(&c->sdirty, line, &at, (size_t)1 << ASCII_BITS);
    }
    dirty_place(&c->gdirty, line, &at, (size_t)1 << CACHE_BITS);
    return at + 64; /* and room to align the first line */
}

/* Puts id on the list unless it is there. */
static inline void dirty_mark(dirty_list *d, uint32_t id)
{
    if (!d->on[id]) {
        d->on[id] = 1;
        d->id[d->n++] = id;
    }
}

/* Adds the waiting evicted hits to table (none with table NULL: they are
 * dropped), and empties the batch. */
static tt_status evict_drain(tt_counter *c, tt_termtable *table)
{
    size_t n = c->evict_n;
    c->evict_n = 0;
    if (!table || !n)
        return TT_OK;
    size_t mask = table->cap - 1;
    for (size_t i = 0; i < n; i++)
        __builtin_prefetch(&table->slots[c->evict[i].hash & mask]);
    for (size_t i = 0; i < n; i++) {
        const tti_slot *sl = &table->slots[c->evict[i].hash & mask];
        if (sl->term && sl->hash == c->evict[i].hash)
            __builtin_prefetch(sl->term);
    }
    for (size_t i = 0; i < n; i++) {
        const evicted *v = &c->evict[i];
        tt_status s = tti_termtable_add_hashed(table, v->term, v->len, v->hash, v->count);
        if (s)
            return s;
    }
    return TT_OK;
}

/* Puts count hits of a term (len <= CACHE_RAW) in the batch of evicted
 * hits, adding the batch to table when it is full. */
static tt_status evict_hits(tt_counter *c, tt_termtable *table, const char *term, size_t len,
                            uint64_t hash, uint32_t count)
{
    if (c->evict_n == EVICT_BATCH) {
        tt_status s = evict_drain(c, table);
        if (s)
            return s;
    }
    evicted *v = &c->evict[c->evict_n++];
    memcpy(v->term, term, len);
    v->len = (uint8_t)len;
    v->hash = hash;
    v->count = count;
    return TT_OK;
}

/* Adds a general cache entry's pending hits to table. */
static tt_status entry_flush(cache_entry *e, tt_termtable *table)
{
    if (!e->pending)
        return TT_OK;
    uint32_t n = e->pending;
    e->pending = 0;
    return tti_termtable_add_hashed(table, e->term, e->term_len, e->hash, n);
}

tt_counter *tt_counter_new(const tt_count_options *opt)
{
    if (opt->ngram_min < 1 || opt->ngram_max > MAX_N || opt->ngram_min > opt->ngram_max)
        return NULL;
    tt_counter *c = tt_calloc(1, sizeof *c);
    if (!c)
        return NULL;
    c->opt = *opt;
    c->flush_every = FUSED_FLUSH;
    tt_normalizer_init(&c->norm);
    tt_buf_init(&c->normal, TT_LIMIT_TOKEN_BYTES * 8);
    tt_buf_init(&c->stemmed, TT_LIMIT_TOKEN_BYTES * 8);
    tt_buf_init(&c->gram, TT_LIMIT_TOKEN_BYTES * 8 * MAX_N + MAX_N);
    for (int i = 0; i < MAX_N; i++)
        tt_buf_init(&c->win[i].term, TT_LIMIT_TOKEN_BYTES * 8);
    /* One entry per cache line: the lookup touches a single line. */
    c->mem_size = counter_tables(c, NULL);
    c->mem = tti_alloc_large(c->mem_size, 1, &c->mem_mapped);
    if (!c->mem) {
        tt_counter_free(c);
        return NULL;
    }
    counter_tables(c, c->mem);
    if (opt->stem) {
        c->stemmer = tt_stemmer_new();
        if (!c->stemmer) {
            tt_counter_free(c);
            return NULL;
        }
    }
    return c;
}

void tt_counter_free(tt_counter *c)
{
    if (!c)
        return;
    tt_normalizer_release(&c->norm);
    tt_stemmer_free(c->stemmer);
    tt_buf_release(&c->normal);
    tt_buf_release(&c->stemmed);
    tt_buf_release(&c->gram);
    for (int i = 0; i < MAX_N; i++)
        tt_buf_release(&c->win[i].term);
    tti_free_large(c->mem, c->mem_size, 1, c->mem_mapped);
    tt_free(c);
}

/* Counts the n-grams that end at the newest window token (*added: how
 * many). */
static tt_status emit_grams(tt_counter *c, tt_termtable *table, size_t *added)
{
    size_t newest = (c->win_head + c->win_len - 1) % MAX_N;
    if (!c->win[newest].edge_ok)
        return TT_OK;
    for (int n = c->opt.ngram_min; n <= c->opt.ngram_max; n++) {
        if ((size_t)n > c->win_len)
            break;
        size_t first = (c->win_head + c->win_len - (size_t)n) % MAX_N;
        if (!c->win[first].edge_ok)
            continue;
        const char *term;
        size_t len;
        if (n == 1) {
            term = c->win[newest].term.data;
            len = c->win[newest].term.len;
        } else {
            tt_buf_reset(&c->gram);
            for (int k = 0; k < n; k++) {
                const tt_buf *w = &c->win[(first + (size_t)k) % MAX_N].term;
                tt_status st2 = (k ? tt_buf_putc(&c->gram, ' ') : TT_OK);
                if (!st2)
                    st2 = tt_buf_append(&c->gram, w->data, w->len);
                if (st2)
                    return st2;
            }
            term = c->gram.data;
            len = c->gram.len;
        }
        tt_status s = tt_termtable_add(table, term, len, 1);
        if (s)
            return s;
        (*added)++;
    }
    return TT_OK;
}

static tt_status push_window(tt_counter *c, const char *term, size_t len, int edge_ok)
{
    /* Append after the newest; when the window is full the slot reused is
     * the oldest's, and the head moves on. */
    size_t slot = (c->win_head + c->win_len) % MAX_N;
    if (c->win_len < (size_t)c->opt.ngram_max)
        c->win_len++;
    else
        c->win_head = (c->win_head + 1) % MAX_N;
    tt_buf_reset(&c->win[slot].term);
    c->win[slot].edge_ok = edge_ok;
    return tt_buf_append(&c->win[slot].term, term, len);
}

/* The flags of a term (a view of n bytes), and its table hash. */
static unsigned classify(const tt_counter *c, const char *t, size_t n, uint64_t *hash)
{
    if (n == 0) {
        *hash = 0;
        return CACHE_EMPTY;
    }
    uint64_t h = tti_termtable_hash(t, n);
    *hash = h;
    if (c->opt.stopwords && tti_termtable_get_hashed(c->opt.stopwords, t, n, h))
        return CACHE_STOP;
    if (c->opt.min_length > 1 && tt_utf8_length(t, n) < c->opt.min_length)
        return CACHE_SHORT;
    return 0;
}

/* What a token becomes, through the general cache and the slow path, in
 * *out: its final term (a view into the cache or into a counter buffer,
 * valid until the next token), the term's table hash, and CACHE_* flags.
 * TT_ELIMIT when normalization outgrows its buffer. */
static tt_status resolve_general(tt_counter *c, const char *raw, size_t len,
                                 tt_token_kind kind, tt_termtable *table, resolved *out)
{
    cache_entry *e = NULL;
    uint64_t key[CACHE_RAW / 8] = { 0, 0, 0 };
    if (len <= CACHE_RAW) {
        tti_token_key(raw, len, key);
        e = &c->cache[tti_token_slot(key, len, CACHE_BITS)];
        if (e->raw_len == len && e->raw[0] == key[0] && e->raw[1] == key[1] &&
            e->raw[2] == key[2]) {
            out->term = e->term;
            out->len = e->term_len;
            out->hash = e->hash;
            out->flags = e->flags;
            out->entry = e;
            return TT_OK;
        }
    }
    tt_status s = tt_normalize(&c->norm, raw, len, &c->normal);
    if (s)
        return s;
    const char *t = c->normal.data;
    size_t n = c->normal.len;
    uint64_t h;
    unsigned f = classify(c, t, n, &h);
    if (n && c->stemmer && kind == TT_TOKEN_WORD) {
        s = tt_stem(c->stemmer, t, n, &c->stemmed);
        if (s)
            return s;
        t = c->stemmed.data;
        n = c->stemmed.len;
        h = tti_termtable_hash(t, n);
    }
    out->entry = NULL;
    if (e && n <= CACHE_RAW) {
        if (e->pending && (s = evict_hits(c, table, e->term, e->term_len, e->hash, e->pending))) {
            c->fill_status = s;
            return s;
        }
        e->pending = 0;
        out->entry = e;
        memcpy(e->raw, key, sizeof key);
        e->raw_len = (uint8_t)len;
        e->term_len = (uint8_t)n;
        e->flags = (uint8_t)f;
        e->hash = h;
        if (n)
            memcpy(e->term, t, n);
    }
    out->term = t;
    out->len = n;
    out->hash = h;
    out->flags = f;
    return TT_OK;
}

#define HIGH_BITS 0x8080808080808080ULL

/* SSE2 (every x86-64) does the ASCII test and the lowercasing on all 16
 * bytes at once; elsewhere the same is done on two 64-bit words. Both give
 * the same key. */
#define ASCII_SSE2 TT_COUNT_SSE2

/* For len bytes (0..16): which bytes of the two key words to keep. */
#if TT_COUNT_SSE2
/* ASCII_RAW bytes of 0xFF then ASCII_RAW of 0: the 16 bytes from
 * key_slide + ASCII_RAW - len keep the first len (0..16). */
static const unsigned char key_slide[2 * ASCII_RAW] = {
    0xFF, 0xFF, 0xFF, 0xFF, 0xFF, 0xFF, 0xFF, 0xFF, 0xFF, 0xFF, 0xFF, 0xFF, 0xFF, 0xFF, 0xFF, 0xFF,
};
#endif

static _Alignas(16) const uint64_t key_mask[ASCII_RAW + 1][2] = {
    { 0x0000000000000000ULL, 0x0000000000000000ULL },
    { 0x00000000000000ffULL, 0x0000000000000000ULL },
    { 0x000000000000ffffULL, 0x0000000000000000ULL },
    { 0x0000000000ffffffULL, 0x0000000000000000ULL },
    { 0x00000000ffffffffULL, 0x0000000000000000ULL },
    { 0x000000ffffffffffULL, 0x0000000000000000ULL },
    { 0x0000ffffffffffffULL, 0x0000000000000000ULL },
    { 0x00ffffffffffffffULL, 0x0000000000000000ULL },
    { 0xffffffffffffffffULL, 0x0000000000000000ULL },
    { 0xffffffffffffffffULL, 0x00000000000000ffULL },
    { 0xffffffffffffffffULL, 0x000000000000ffffULL },
    { 0xffffffffffffffffULL, 0x0000000000ffffffULL },
    { 0xffffffffffffffffULL, 0x00000000ffffffffULL },
    { 0xffffffffffffffffULL, 0x000000ffffffffffULL },
    { 0xffffffffffffffffULL, 0x0000ffffffffffffULL },
    { 0xffffffffffffffffULL, 0x00ffffffffffffffULL },
    { 0xffffffffffffffffULL, 0xffffffffffffffffULL },
};

/* The first len (1..ASCII_RAW) bytes of raw as two zero-padded words, the
 * bytes in memory order (the term is read back out of them); room is how
 * many bytes can be read from raw on. */
static inline void ascii_key(const char *raw, size_t len, size_t room, uint64_t k[2])
{
#if defined(__BYTE_ORDER__) && __BYTE_ORDER__ == __ORDER_LITTLE_ENDIAN__
    if (room >= ASCII_RAW) {
        memcpy(&k[0], raw, 8);
        memcpy(&k[1], raw + 8, 8);
        k[0] &= key_mask[len][0];
        k[1] &= key_mask[len][1];
        return;
    }
    k[0] = tti_load_upto8(raw, len);
    k[1] = len > 8 ? tti_load_upto8(raw + 8, len - 8) : 0;
#else
    (void)room;
    unsigned char b[ASCII_RAW] = { 0 };
    memcpy(b, raw, len);
    memcpy(k, b, sizeof b);
#endif
}

#if !ASCII_SSE2
/* ASCII lowercase of eight bytes at once (each byte < 0x80, so no sum
 * carries into the next byte): bit 7 of c + 0x3f is set when c >= 'A', of
 * c + 0x25 when c > 'Z'; an upper-case byte gains 0x20. */
static inline uint64_t ascii_lower8(uint64_t x)
{
    uint64_t upper = (x + 0x3f3f3f3f3f3f3f3fULL) & ~(x + 0x2525252525252525ULL) & HIGH_BITS;
    return x | (upper >> 2);
}
#endif

/* The lowercased key of an ASCII token (len 1..ASCII_RAW, room bytes
 * readable from raw on); 0 when the token is not ASCII. */
static inline int ascii_lower_key(const char *raw, size_t len, size_t room, uint64_t k[2])
{
#if ASCII_SSE2
    __m128i v;
    if (room >= ASCII_RAW) {
        v = _mm_loadu_si128((const __m128i *)(const void *)raw);
        v = _mm_and_si128(v, _mm_load_si128((const __m128i *)(const void *)key_mask[len]));
    } else {
        uint64_t t[2];
        ascii_key(raw, len, room, t);
        v = _mm_set_epi64x((long long)t[1], (long long)t[0]);
    }
    if (_mm_movemask_epi8(v))
        return 0;
    __m128i upper = _mm_and_si128(_mm_cmpgt_epi8(v, _mm_set1_epi8('A' - 1)),
                                  _mm_cmplt_epi8(v, _mm_set1_epi8('Z' + 1)));
    v = _mm_or_si128(v, _mm_and_si128(upper, _mm_set1_epi8(0x20)));
    k[0] = (uint64_t)_mm_cvtsi128_si64(v);
    k[1] = (uint64_t)_mm_cvtsi128_si64(_mm_unpackhi_epi64(v, v));
    return 1;
#else
    ascii_key(raw, len, room, k);
    if ((k[0] | k[1]) & HIGH_BITS)
        return 0;
    k[0] = ascii_lower8(k[0]);
    k[1] = ascii_lower8(k[1]);
    return 1;
#endif
}

/* The set of a key: one multiply-shift of the two words folded together;
 * the top bits of a product by an odd constant depend on every bit of the
 * other factor. The length is not mixed in, nor compared below: a token
 * never holds a NUL byte, so the zero-padded key alone tells lengths apart
 * (and an unused way's all-zero key matches no token). */
static inline size_t ascii_slot_of(uint64_t folded)
{
    return (size_t)((folded * 0x9E3779B97F4A7C15ULL) >> (64 - ASCII_BITS));
}

static inline size_t ascii_slot(const uint64_t k[2], size_t len)
{
    (void)len;
    return ascii_slot_of(k[0] ^ k[1]);
}

static inline int ascii_way_holds(const ascii_way *w, const uint64_t k[2], size_t len)
{
    (void)len;
    return ((w->key[0] ^ k[0]) | (w->key[1] ^ k[1])) == 0;
}

/* Adds a way's pending hits to table. */
static tt_status way_flush(ascii_way *w, tt_termtable *table)
{
    if (!w->pending)
        return TT_OK;
    uint32_t n = w->pending;
    w->pending = 0;
    return tti_termtable_add_hashed(table, (const char *)w->key + w->term_off, w->term_len,
                                    w->hash, n);
}

/* Moves the held hits of stop-words, short words and empty terms from the
 * ways to c->held and empties their dirty list. */
static void hold_others(tt_counter *c)
{
    for (size_t i = 0; i < c->sdirty.n; i++) {
        c->sdirty.on[c->sdirty.id[i]] = 0;
        ascii_set *set = &c->ascii[c->sdirty.id[i]];
        for (int j = 0; j < 2; j++) {
            ascii_way *w = &set->way[j];
            if (w->flags) {
                c->held[w->flags] += w->pending;
                w->pending = 0;
            }
        }
    }
    c->sdirty.n = 0;
}

/* Closes a call's figures (see "Held hits and the figures"): the ASCII
 * cache's hits of other words go to st, and its kept terms are the tokens
 * it answered less those. */
static void close_figures(tt_counter *c, tt_doc_stats *st)
{
    if (!c->ascii)
        return;
    hold_others(c);
    uint64_t others = c->held[CACHE_STOP] + c->held[CACHE_SHORT] + c->held[CACHE_EMPTY];
    st->stopwords += c->held[CACHE_STOP];
    st->short_words += c->held[CACHE_SHORT];
    st->terms_kept += c->call_ascii - others;
    memset(c->held, 0, sizeof c->held);
    c->call_ascii = 0;
}

/* Brings table up to date with every pending hit of a kept term and
 * empties the dirty lists; on failure (or with table NULL) drops the hits
 * left, and the call's figures too. */
static tt_status flush_pending(tt_counter *c, tt_termtable *table)
{
    tt_status s = evict_drain(c, table);
    for (size_t i = 0; i < c->dirty.n; i++) {
        c->dirty.on[c->dirty.id[i]] = 0;
        ascii_set *set = &c->ascii[c->dirty.id[i]];
        for (int j = 0; j < 2; j++) {
            ascii_way *w = &set->way[j];
            if (w->flags)
                continue; /* held for the figures (sdirty) */
            if (!s && table)
                s = way_flush(w, table);
            else
                w->pending = 0;
        }
    }
    c->dirty.n = 0;
    for (size_t i = 0; i < c->gdirty.n; i++) {
        c->gdirty.on[c->gdirty.id[i]] = 0;
        cache_entry *e = &c->cache[c->gdirty.id[i]];
        if (!s && table)
            s = entry_flush(e, table);
        else
            e->pending = 0;
    }
    c->gdirty.n = 0;
    if (!table && c->ascii) {
        hold_others(c);
        memset(c->held, 0, sizeof c->held);
        c->call_ascii = 0;
    }
    return s;
}

/* A miss in the ASCII cache: what tt_normalize does for an ASCII token
 * (fold, then tti_term_bounds) done on the lowercased key, entered as way 0
 * of set (way 0 moving to way 1). Returns NULL, entering nothing, when the
 * token holds '`' (tt_normalize makes it '\'', so the term would not be a
 * piece of the key). */
static ascii_way *ascii_fill(tt_counter *c, ascii_set *set, const uint64_t k[2], size_t len,
                             tt_termtable *table)
{
    /* a byte of either word equal to '`' (0x60; the zero padding is not):
     * the test for a zero byte of x ^ 0x6060..., exact as a yes or no */
    const uint64_t ones = 0x0101010101010101ULL;
    uint64_t x0 = k[0] ^ (ones * '`'), x1 = k[1] ^ (ones * '`');
    if ((((x0 - ones) & ~x0) | ((x1 - ones) & ~x1)) & HIGH_BITS)
        return NULL;
    unsigned char low[ASCII_RAW];
    memcpy(low, k, sizeof low);
    size_t a, b;
    tti_term_bounds(low, len, &a, &b);
    uint64_t h;
    unsigned f = classify(c, (const char *)low + a, b - a, &h);
    const ascii_way *old = &set->way[1];
    if (old->pending && old->flags) {
        c->held[old->flags] += old->pending; /* figures only */
    } else if (old->pending) {
        tt_status s = evict_hits(c, table, (const char *)old->key + old->term_off, old->term_len,
                                 old->hash, old->pending);
        if (s) {
            c->fill_status = s;
            return NULL;
        }
    }
    set->way[1] = set->way[0];
    ascii_way *w = &set->way[0];
    w->key[0] = k[0];
    w->key[1] = k[1];
    w->hash = h;
    w->raw_len = (uint8_t)len;
    w->term_off = (uint8_t)a;
    w->term_len = (uint8_t)(b - a);
    w->flags = (uint8_t)f;
    w->pending = 0;
    return w;
}

/* ascii_find past way 0: way 1 (moved to way 0) or a fill. */
static ascii_way *ascii_find_rest(tt_counter *c, ascii_set *set, const uint64_t k[2], size_t len,
                                  tt_termtable *table)
{
    ascii_way *w = &set->way[0];
    if (ascii_way_holds(&set->way[1], k, len)) {
        ascii_way tmp = set->way[1];
        set->way[1] = *w;
        *w = tmp;
        return w;
    }
    return ascii_fill(c, set, k, len, table);
}

/* The way of set holding the lowercased key k of a token of len bytes,
 * filled on a miss; NULL when the token holds '`' (or filling it failed:
 * c->fill_status). */
static inline ascii_way *ascii_find(tt_counter *c, ascii_set *set, const uint64_t k[2],
                                    size_t len, tt_termtable *table)
{
    ascii_way *w = &set->way[0];
    if (ascii_way_holds(w, k, len))
        return w;
    return ascii_find_rest(c, set, k, len, table);
}

/* A hit of way w, single terms (the fused path): one more held hit, of a
 * kept term or not (see "Held hits and the figures"); the set goes on the
 * dirty list of its kind at the first. No branch on what the word is, and
 * no check for overflow (FUSED_FLUSH). */
__attribute__((always_inline)) static inline void ascii_hit(tt_counter *c, ascii_way *w)
{
    const uint32_t was = w->pending;
    w->pending = was + 1;
    if (__builtin_expect(was == 0, 0))
        dirty_mark(w->flags ? &c->sdirty : &c->dirty, (uint32_t)(w - &c->ascii[0].way[0]) / 2);
}

/* (The batches below serve n-grams and stemming; single terms without
 * stemming take the fused path further down.)
 *
 * Tokens are taken from the tokenizer BATCH at a time (tt_tokenizer_fill):
 * each one's cache key and set are worked out and the set's line is
 * prefetched. A batch is made ready one batch ahead of its counting, so
 * each set's line has a whole batch of counting to arrive in, the first
 * token's as long as the last's. 64 tokens (about 450 bytes of text) ran
 * 4% faster here than 16 and as fast as 128, and the tokenizer is called
 * less often. */
#define BATCH 64

typedef struct token_batch {
    tt_token toks[BATCH];
    uint64_t keys[BATCH][2];
    ascii_set *sets[BATCH]; /* NULL: not for the ASCII cache */
} token_batch;

/* Fills b with the next tokens (how many: 0 at the end), their keys and
 * sets, and prefetches the sets. */
static inline size_t batch_ready(const tt_counter *c, tt_tokenizer *tk, const char *text,
                                 size_t len, token_batch *b)
{
    ascii_set *const ascii = c->ascii;
    const int keep_numbers = c->opt.keep_numbers;
    size_t n = tt_tokenizer_fill(tk, b->toks, BATCH);
    for (size_t k = 0; k < n; k++) {
        const tt_token *t = &b->toks[k];
        b->sets[k] = NULL;
        if (ascii && t->len - 1 < ASCII_RAW && (keep_numbers || t->kind != TT_TOKEN_NUMBER) &&
            ascii_lower_key(text + t->off, t->len, len - t->off, b->keys[k])) {
            b->sets[k] = &ascii[ascii_slot(b->keys[k], t->len)];
            __builtin_prefetch(b->sets[k]);
        }
    }
    return n;
}

/* ---- the fused path ------------------------------------------------------
 *
 * Single terms without stemming (the default, and most of the work) skip
 * the batches. fused_window decides a window's tokens from its masks
 * (window_decide, segment_internal.h) and takes each one where it stands:
 * its key is a 16-byte load from the window lowercased once, kept in a
 * register, folded for the set and compared with way 0 in one go, and a hit
 * adds one to the way's held count ("Held hits and the figures"). No token
 * is written to memory and read back, and no second loop runs over a
 * batch. The tallies that need no cache come from the masks: tokens and
 * numbers by popcount, sentence starts in a rare branch taken where a
 * token's start passes the next terminal. The set's line is not
 * prefetched: the lookups of successive tokens do not depend on each other,
 * so the CPU overlaps them by itself (a prefetch pass measured slower).
 * Tokens no window decides come from the walk (tti_tokenizer_walk) and go
 * through fused_token, so every token is counted as count_block's batches
 * count it; test_random_against_reference and test_running_total_figures
 * hold the two paths to that. */

/* What the general path made of a token, for the statistics. */
enum { GEN_KEPT, GEN_STOP, GEN_SHORT, GEN_EMPTY, GEN_OVERLONG, GEN_FAILED };

/* A token the ASCII cache does not take, single terms only: through the
 * general cache and the slow path (resolve_general). GEN_FAILED leaves the
 * status in c->fill_status. */
static __attribute__((noinline)) int fused_general(tt_counter *c, tt_termtable *table,
                                                   const char *raw, size_t len,
                                                   tt_token_kind kind)
{
    tt_status s = resolve_general(c, raw, len, kind, table, &c->general);
    if (s == TT_ELIMIT && !c->fill_status)
        return GEN_OVERLONG; /* as count_block: skipped like an overlong token */
    if (s) {
        c->fill_status = s;
        return GEN_FAILED;
    }
    cache_entry *e = c->general.entry;
    unsigned flags = c->general.flags;
    if (e && !flags) {
        if (e->pending++ == 0)
            dirty_mark(&c->gdirty, (uint32_t)(e - c->cache));
        else if (e->pending == UINT32_MAX && (s = entry_flush(e, table))) {
            c->fill_status = s;
            return GEN_FAILED;
        }
        return GEN_KEPT;
    }
    if (flags & CACHE_EMPTY)
        return GEN_EMPTY;
    if (flags & CACHE_STOP)
        return GEN_STOP;
    if (flags)
        return GEN_SHORT;
    s = tti_termtable_add_hashed(table, c->general.term, c->general.len, c->general.hash, 1);
    if (s) {
        c->fill_status = s;
        return GEN_FAILED;
    }
    return GEN_KEPT;
}

typedef struct fused_state {
    tt_counter *c;
    tt_termtable *table;
    const char *text;
    size_t len;
    int keep_numbers;
    int failed; /* c->fill_status holds why; later tokens are not counted */
    uint64_t words, sentences, numbers, overlong;
    /* the tokens the general path took, and what it made of them */
    uint64_t general, kept, stopwords, shorts;
} fused_state;

/* A token of the general path (r: what fused_general made of it) in the
 * figures. */
static inline void fused_tally(fused_state *x, int r)
{
    x->general++;
    switch (r) {
    case GEN_KEPT: x->kept++; break;
    case GEN_STOP: x->stopwords++; break;
    case GEN_SHORT: x->shorts++; break;
    case GEN_OVERLONG: x->overlong++; break;
    case GEN_FAILED: x->failed = 1; break;
    default: break;
    }
}

/* One token, single terms: what count_block's loop does for it. */
__attribute__((always_inline)) static inline void fused_token(void *ctx, size_t n, size_t off,
                                                              size_t len, tt_token_kind kind,
                                                              int sentence_start)
{
    fused_state *x = ctx;
    tt_counter *c = x->c;
    (void)n;
    if (x->failed)
        return;
    x->words++;
    x->sentences += sentence_start != 0;
    if (kind == TT_TOKEN_NUMBER) {
        x->numbers++;
        if (!x->keep_numbers)
            return;
    }
    uint64_t k[2];
    if (len - 1 < ASCII_RAW && ascii_lower_key(x->text + off, len, x->len - off, k)) {
        ascii_way *w = ascii_find(c, &c->ascii[ascii_slot(k, len)], k, len, x->table);
        if (w) {
            ascii_hit(c, w);
            return;
        }
        if (c->fill_status) {
            x->failed = 1;
            return;
        }
    }
    fused_tally(x, fused_general(c, x->table, x->text + off, len, kind));
}

enum { FUSED_PORTABLE, FUSED_SSE2, FUSED_AVX2 };


/* The window's 64 bytes ASCII-lowercased into low (the rest of its 80
 * bytes zero), so that a token's key is one 16-byte load from it, with no
 * room to check and no lowercasing per token. */
#if TTI_SIMD_WIDE
__attribute__((target("avx2"))) static inline void window_lower_avx2(unsigned char low[80],
                                                                     const unsigned char *c)
{
    for (int h = 0; h < 2; h++) {
        __m256i v = _mm256_loadu_si256((const __m256i *)(const void *)(c + 32 * h));
        __m256i up = _mm256_and_si256(in_range_v32(v, 'A', 26), _mm256_set1_epi8(0x20));
        _mm256_storeu_si256((__m256i *)(void *)(low + 32 * h), _mm256_or_si256(v, up));
    }
    _mm_storeu_si128((__m128i *)(void *)(low + 64), _mm_setzero_si128());
}
#endif

static inline void window_lower(unsigned char low[80], const unsigned char *c)
{
#if TT_COUNT_SSE2
    for (int q = 0; q < 4; q++) {
        __m128i v = _mm_loadu_si128((const __m128i *)(const void *)(c + 16 * q));
        __m128i d = _mm_add_epi8(v, _mm_set1_epi8((char)(0x80 - 'A')));
        __m128i up = _mm_and_si128(_mm_cmplt_epi8(d, _mm_set1_epi8((char)(0x80 + 26))),
                                   _mm_set1_epi8(0x20));
        _mm_storeu_si128((__m128i *)(void *)(low + 16 * q), _mm_or_si128(v, up));
    }
#else
    for (int i = 0; i < 64; i++)
        low[i] = (unsigned char)(c[i] >= 'A' && c[i] <= 'Z' ? c[i] | 0x20 : c[i]);
#endif
    memset(low + 64, 0, 16);
}

#if !TT_COUNT_SSE2
/* The key of the token of len (1..ASCII_RAW) bytes at low: 0 when it is
 * not ASCII (the SSE2 path does this in a register, in fused_window). */
static inline int low_key(const unsigned char *low, size_t len, uint64_t k[2])
{
    uint64_t b[2];
    memcpy(b, low, sizeof b);
    k[0] = b[0] & key_mask[len][0];
    k[1] = b[1] & key_mask[len][1];
    return !((k[0] | k[1]) & HIGH_BITS);
}
#endif

/* The tokens of the window at tk->pos = p (masks w, bytes c, lowercased in
 * low), counted: what window_take_into and fused_token do, token for
 * token, with the rare work (terminals, a sentence's first token) out of
 * the way of the common, and the tallies that do not depend on the cache
 * (tokens, numbers) taken from the masks. Returns how many tokens (0: the
 * walk must take the next one). */
__attribute__((always_inline)) static inline size_t
fused_window(tt_tokenizer *restrict t, const unsigned char *s, size_t p, const window *w,
             const unsigned char *low, fused_state *x)
{
    const window_tokens_of d = window_decide(w);
    uint64_t starts = d.starts, ends = d.ends, terminals = d.terminals;
    if (!ends)
        return 0;
    const uint64_t number_ends = ends & ~d.word_ends;
    const size_t n = (size_t)__builtin_popcountll(ends);
    x->words += n;
    x->numbers += (uint64_t)__builtin_popcountll(number_ends);
    /* numbers left out: their end bits skip the lookup, and only the start
     * bits of tokens matter from here (a gap is found from the next start) */
    const uint64_t skip = x->keep_numbers ? 0 : number_ends;
    tt_counter *const c = x->c;
    ascii_set *const ascii = c->ascii;
    size_t a = 0, e = 0;
    const uint64_t all_starts = starts, all_ends = ends;
    int at_start = t->at_sentence_start, suffix = t->pending_suffix;
    /* The rare branch is due at the first token after the next terminal:
     * when its start bit is above the terminal's, or above 0 while a
     * sentence start is pending from before the window (no terminal left:
     * all ones, above every start bit). */
    uint64_t due = at_start ? 0 : terminals ? terminals & -terminals : ~(uint64_t)0;
    do {
        const uint64_t start_bit = starts & -starts, end_bit = ends & -ends;
        a = (size_t)__builtin_ctzll(starts);
        e = (size_t)__builtin_ctzll(ends);
        starts ^= start_bit;
        ends ^= end_bit;
        if (__builtin_expect(start_bit > due, 0)) {
            const uint64_t gap = terminals & (start_bit - 1);
            if (gap) {
                terminals ^= gap;
                /* the token before this one, if the window has one */
                const uint64_t before_s = all_starts & (start_bit - 1);
                const uint64_t before_e = all_ends & (end_bit - 1);
                window_terminals(t, s, p, gap, before_e != 0,
                                 before_e ? 63u - (unsigned)__builtin_clzll(before_s) : 0,
                                 before_e ? 63u - (unsigned)__builtin_clzll(before_e) : 0,
                                 &at_start, &suffix);
            }
            x->sentences += (unsigned)window_suffix_rule(s + p + a, at_start, suffix);
            at_start = 0;
            suffix = 0;
            due = terminals ? terminals & -terminals : ~(uint64_t)0;
        }
        if (end_bit & skip)
            continue;
        const size_t len = e - a;
        ascii_way *wy = NULL;
        int ascii_key_ok = 0;
        if (len <= ASCII_RAW) {
#if TT_COUNT_SSE2
            /* the key stays in a register: folded, and compared with way
             * 0's in one go */
            __m128i v = _mm_loadu_si128((const __m128i *)(const void *)(low + a));
            v = _mm_and_si128(
                v, _mm_loadu_si128((const __m128i *)(const void *)(key_slide + ASCII_RAW - len)));
            if (!_mm_movemask_epi8(v)) {
                ascii_key_ok = 1;
                ascii_set *set = &ascii[ascii_slot_of(
                    (uint64_t)_mm_cvtsi128_si64(_mm_xor_si128(v, _mm_unpackhi_epi64(v, v))))];
                __m128i eq = _mm_cmpeq_epi8(
                    v, _mm_load_si128((const __m128i *)(const void *)set->way[0].key));
                if (_mm_movemask_epi8(eq) == 0xFFFF) {
                    wy = &set->way[0];
                } else {
                    uint64_t k[2];
                    _mm_storeu_si128((__m128i *)(void *)k, v);
                    wy = ascii_find_rest(c, set, k, len, x->table);
                }
            }
#else
            uint64_t k[2];
            if (low_key(low + a, len, k)) {
                ascii_key_ok = 1;
                wy = ascii_find(c, &ascii[ascii_slot(k, len)], k, len, x->table);
            }
#endif
        }
        if (ascii_key_ok) {
            if (__builtin_expect(wy != NULL, 1)) {
                ascii_hit(c, wy);
                continue;
            }
            if (c->fill_status) {
                x->failed = 1;
                break;
            }
        }
        fused_tally(x, fused_general(c, x->table, (const char *)s + p + a, len,
                                     (end_bit & number_ends) ? TT_TOKEN_NUMBER : TT_TOKEN_WORD));
        if (x->failed)
            break;
    } while (ends);
    window_close(t, p, a, e);
    return n;
}

/* count_block for single terms with the ASCII cache, with the windows'
 * masks made as isa says (a constant at each call). */
__attribute__((always_inline)) static inline tt_status
fused_block(tt_counter *c, const char *text, size_t len, tt_termtable *table, tt_doc_stats *st,
            int isa)
{
    (void)isa; /* only the portable masks without SSE2 */
    const unsigned char *s = (const unsigned char *)text;
    tt_tokenizer tk;
    tt_tokenizer_init(&tk, text, len);
    fused_state x = { .c = c, .table = table, .text = text, .len = len,
                      .keep_numbers = c->opt.keep_numbers };
    for (;;) {
        size_t p = tk.pos;
        if (p < len) {
            unsigned char pad[64];
            const unsigned char *w64 = s + p;
            if (len - p < 64) {
                /* the text's last bytes (a paragraph's, mostly), padded */
                memcpy(pad, s + p, len - p);
                memset(pad + (len - p), 0, 64 - (len - p));
                w64 = pad;
            }
            window w;
#if TTI_SIMD_WIDE
            if (isa == FUSED_AVX2)
                window_avx2(&w, w64);
            else
#endif
#if defined(__SSE2__)
                if (isa == FUSED_SSE2)
                window_sse2(&w, w64);
            else
#endif
                window_portable(&w, w64);
            /* the text's last bytes hold no letter, digit, '_' or byte
             * >= 0x80 (the padding is NUL): no token is left to take, and
             * the terminals there can only start a sentence no token
             * follows in this text */
            if (w64 == pad && !(w.alpha | w.digit | w.under | w.high))
                break;
            unsigned char low[80];
#if TTI_SIMD_WIDE
            if (isa >= FUSED_AVX2)
                window_lower_avx2(low, w64);
            else
#endif
                window_lower(low, w64);
            size_t k = fused_window(&tk, s, p, &w, low, &x);
            if (x.failed)
                break;
            if (k) {
                if (__builtin_expect((c->unflushed += k) >= c->flush_every, 0)) {
                    tt_status fs = flush_pending(c, table);
                    hold_others(c);
                    c->unflushed = 0;
                    if (fs) {
                        c->fill_status = fs;
                        x.failed = 1;
                        break;
                    }
                }
                continue;
            }
        }
        tt_token tok;
        if (!tti_tokenizer_walk(&tk, &tok))
            break;
        c->unflushed++; /* fused_token checks its own counts, but the windows' hits
                           of the same way must stay under FUSED_FLUSH in all */
        fused_token(&x, 0, tok.off, tok.len, tok.kind, tok.sentence_start);
        if (x.failed)
            break;
    }
    tt_status s_ = TT_OK;
    if (x.failed) {
        s_ = c->fill_status;
        c->fill_status = TT_OK;
    }
    st->words_read += x.words;
    st->sentences += x.sentences;
    st->numbers += x.numbers;
    st->terms_kept += x.kept;
    st->stopwords += x.stopwords;
    st->short_words += x.shorts;
    /* the rest of the tokens the ASCII cache answered; their figures are
     * closed with the call (close_figures) */
    c->call_ascii += x.words - (x.keep_numbers ? 0 : x.numbers) - x.general;
    st->overlong += x.overlong + tk.overlong;
    return s_;
}

/* fused_block over the n blocks of items, whose text is base + off. */
__attribute__((always_inline)) static inline tt_status
fused_blocks(tt_counter *c, const char *base, const tt_block *items, size_t n,
             tt_termtable *table, tt_doc_stats *st, int isa)
{
    for (size_t i = 0; i < n; i++) {
        tt_status s = fused_block(c, base + items[i].off, items[i].len, table, st, isa);
        if (s)
            return s;
    }
    return TT_OK;
}

#if TTI_SIMD_WIDE
__attribute__((target("avx2,bmi,bmi2"))) static tt_status
fused_blocks_avx2(tt_counter *c, const char *base, const tt_block *items, size_t n,
                  tt_termtable *table, tt_doc_stats *st)
{
    return fused_blocks(c, base, items, n, table, st, FUSED_AVX2);
}

/* Whether the CPU has BMI1 and BMI2 (every AVX2 CPU made so far has). */
static int fused_bmi(void)
{
    static int has = -1;
    if (has < 0)
        has = __builtin_cpu_supports("bmi") && __builtin_cpu_supports("bmi2");
    return has;
}
#endif

/* The fused path over a call's blocks, for the widest SIMD the CPU has (and
 * tt_simd allows); one dispatch a call, not a block. */
static tt_status fused_any(tt_counter *c, const char *base, const tt_block *items, size_t n,
                           tt_termtable *table, tt_doc_stats *st)
{
#if TTI_SIMD_WIDE
    if (tti_use_simd && tti_simd_level() >= TT_SIMD_AVX2 && fused_bmi())
        return fused_blocks_avx2(c, base, items, n, table, st);
#endif
#if defined(__SSE2__)
    if (tti_use_simd)
        return fused_blocks(c, base, items, n, table, st, FUSED_SSE2);
#endif
    return fused_blocks(c, base, items, n, table, st, FUSED_PORTABLE);
}

/* Whether c counts on the fused path. */
static int fused_applies(const tt_counter *c)
{
    return c->opt.ngram_max == 1 && c->ascii;
}

static tt_status count_block(tt_counter *c, const char *text, size_t len,
                             tt_termtable *table, tt_doc_stats *st)
{
    if (fused_applies(c)) {
        const tt_block one = { TT_BLOCK_PARAGRAPH, 0, len, -1 };
        return fused_any(c, text, &one, 1, table, st);
    }
    tt_tokenizer tk;
    tt_status s;
    const int unigram_only = c->opt.ngram_max == 1;
    const int keep_numbers = c->opt.keep_numbers;
    token_batch batch[2];
    /* the stats in locals, written back at the end (stores through the
     * cache's pointers would otherwise make every increment a memory
     * update) */
    uint64_t words = 0, sentences = 0, numbers = 0, kept = 0, stopwords = 0, shorts = 0,
             overlong = 0;

    tt_tokenizer_init(&tk, text, len);
    c->win_len = 0;
    c->win_head = 0;
    unsigned cur = 0;
    size_t n_cur = batch_ready(c, &tk, text, len, &batch[0]);
    while (n_cur) {
        size_t n_next = batch_ready(c, &tk, text, len, &batch[cur ^ 1]);
        const token_batch *b = &batch[cur];
        cur ^= 1;
        for (size_t ti = 0; ti < n_cur; ti++) {
            const tt_token *tok = &b->toks[ti];
            words++;
            if (tok->sentence_start) {
                sentences++;
                c->win_len = 0;
                c->win_head = 0;
            }
            if (tok->kind == TT_TOKEN_NUMBER) {
                numbers++;
                if (!keep_numbers) {
                    c->win_len = 0;
                    c->win_head = 0;
                    continue;
                }
            }
            /* What the token becomes: its term (valid until the next token),
             * the term's hash and CACHE_* flags. */
            const char *term;
            size_t tlen;
            uint64_t h;
            unsigned flags;
            ascii_way *w = NULL;
            if (b->sets[ti])
                w = ascii_find(c, b->sets[ti], b->keys[ti], tok->len, table);
            if (w) {
                /* (single terms with the ASCII cache take the fused path: here
                 * the way only names the term, and holds no hits) */
                term = (const char *)w->key + w->term_off;
                tlen = w->term_len;
                h = w->hash;
                flags = w->flags;
            } else {
                if (c->fill_status) {
                    s = c->fill_status;
                    c->fill_status = TT_OK;
                    goto out;
                }
                s = resolve_general(c, text + tok->off, tok->len, tok->kind, table, &c->general);
                if (s == TT_ELIMIT && !c->fill_status) {
                    /* NFKC can expand a token many times over (one U+FDFA
                     * becomes 18 characters); a term past the buffer cap is
                     * skipped like an overlong token, never allowed to fail
                     * the document. */
                    overlong++;
                    c->win_len = 0;
                    c->win_head = 0;
                    continue;
                }
                if (s) {
                    c->fill_status = TT_OK;
                    goto out;
                }
                cache_entry *e = c->general.entry;
                if (e && !e->flags && unigram_only) {
                    kept++;
                    if (e->pending++ == 0)
                        dirty_mark(&c->gdirty, (uint32_t)(e - c->cache));
                    else if (e->pending == UINT32_MAX && (s = entry_flush(e, table)))
                        goto out;
                    continue;
                }
                term = c->general.term;
                tlen = c->general.len;
                h = c->general.hash;
                flags = c->general.flags;
            }
            int edge_ok = 1;
            if (flags) {
                if (flags & CACHE_EMPTY)
                    continue;
                if (flags & CACHE_STOP)
                    stopwords++;
                else
                    shorts++; /* CACHE_SHORT */
                if (unigram_only)
                    continue;
                edge_ok = 0;
            }
            if (unigram_only) {
                s = tti_termtable_add_hashed(table, term, tlen, h, 1);
                if (s)
                    goto out;
                kept++;
                continue;
            }
            size_t grams = 0;
            s = push_window(c, term, tlen, edge_ok);
            if (!s)
                s = emit_grams(c, table, &grams);
            kept += grams;
            if (s)
                goto out;
        }
        n_cur = n_next;
    }
    s = TT_OK;
out:
    st->words_read += words;
    st->sentences += sentences;
    st->numbers += numbers;
    st->terms_kept += kept;
    st->stopwords += stopwords;
    st->short_words += shorts;
    st->overlong += overlong + tk.overlong;
    return s;
}

tt_status tti_counter_count_held(tt_counter *c, const tt_blocks *blocks,
                                 tt_termtable *table, tt_doc_stats *stats)
{
    if (fused_applies(c)) {
        tt_status s = fused_any(c, blocks->text.data, blocks->items, blocks->n, table, stats);
        if (s) {
            flush_pending(c, NULL);
            return s;
        }
        close_figures(c, stats);
        return TT_OK;
    }
    for (size_t i = 0; i < blocks->n; i++) {
        const tt_block *b = &blocks->items[i];
        tt_status s = count_block(c, blocks->text.data + b->off, b->len, table, stats);
        if (s) {
            flush_pending(c, NULL);
            return s;
        }
    }
    close_figures(c, stats);
    return TT_OK;
}

void tti_counter_set_flush_every(tt_counter *c, uint64_t tokens)
{
    c->flush_every = tokens;
}

tt_status tti_counter_flush(tt_counter *c, tt_termtable *table)
{
    return flush_pending(c, table);
}

tt_status tt_counter_count(tt_counter *c, const tt_blocks *blocks,
                           tt_termtable *table, tt_doc_stats *stats)
{
    tt_status s = tti_counter_count_held(c, blocks, table, stats);
    return s ? s : flush_pending(c, table);
}

tt_status tt_counter_count_text(tt_counter *c, const char *text, size_t len,
                                tt_termtable *table, tt_doc_stats *stats)
{
    tt_status s = count_block(c, text, len, table, stats);
    if (!s)
        close_figures(c, stats);
    tt_status f = flush_pending(c, s ? NULL : table);
    return s ? s : f;
}

size_t tt_count_classes(const tt_term_entry *entries, size_t n,
                        tt_count_class *classes, size_t max)
{
    if (!n || !max)
        return 0;
    uint64_t largest = entries[0].count;
    for (size_t i = 1; i < n; i++)
        if (entries[i].count > largest)
            largest = entries[i].count;
    /* Lower edges 1, 2, 5, 10, 20, 50, ... */
    size_t k = 0;
    uint64_t lower = 1;
    static const uint64_t step[3] = { 2, 5, 10 };
    uint64_t decade = 1;
    int phase = 0;
    while (k < max && lower <= largest) {
        uint64_t next = decade * step[phase];
        if (phase == 2)
            decade *= 10;
        phase = (phase + 1) % 3;
        classes[k].lower = lower;
        classes[k].upper = next - 1;
        classes[k].terms = 0;
        classes[k].occurrences = 0;
        k++;
        lower = next;
    }
    for (size_t i = 0; i < n; i++) {
        uint64_t v = entries[i].count;
        for (size_t j = 0; j < k; j++) {
            if (v >= classes[j].lower && v <= classes[j].upper) {
                classes[j].terms++;
                classes[j].occurrences += v;
                break;
            }
        }
    }
    return k;
}
