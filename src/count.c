/* termtide — counting one document.
 *
 * For each block: tokens from the segmenter (views into the block text) →
 * normalized term in a reused buffer → stop-word and length checks → stem
 * (optional) → n-gram assembly → term table. No allocation per token: the
 * buffers grow to the longest term seen and are reused.
 *
 * N-grams: a window of the last ngram_max kept tokens of the current
 * sentence (each with its final term form and whether it may start or end an
 * n-gram). At a sentence or block start the window empties; a left-out
 * number empties it too, since "revenue of 1,200 units" holds no n-gram
 * across the figure. Complexity O(tokens × ngram_max). */
#include "termtide/count.h"
#include "termtide/filter.h"
#include "termtide/normalize.h"
#include "termtide/segment.h"
#include "tt_internal.h"
#include "termtable_internal.h"

#define MAX_N 3

/* The token cache: a direct-mapped table from a token's raw bytes (up to
 * CACHE_RAW of them) to what the slow path makes of it: the final term
 * (normalized, stemmed if asked), its table hash, and whether it is a
 * stop-word or too short. Normalization is a pure function of the raw
 * bytes, so an entry never goes stale; word frequencies follow Zipf's law,
 * so a few thousand entries catch most tokens and skip NFKC, case folding,
 * the stop-word lookup and SipHash for them. The cache index is an unkeyed
 * multiply-shift hash: crafted collisions only cause misses (the slow path),
 * never wrong terms, because the whole raw key is compared. */
#define CACHE_BITS 12
#define CACHE_RAW 24
#define CACHE_STOP 1u
#define CACHE_SHORT 2u
#define CACHE_EMPTY 4u

typedef struct cache_entry {
    uint64_t raw[CACHE_RAW / 8]; /* the raw token, zero-padded */
    uint64_t hash;               /* tti_termtable_hash(term) */
    uint8_t raw_len;             /* 0: unused entry */
    uint8_t term_len;
    uint8_t flags;
    char term[CACHE_RAW];
} cache_entry;

_Static_assert(sizeof(cache_entry) == 64, "one cache entry per 64-byte line");

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
    void *cache_mem;    /* the allocation cache points into */
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

tt_counter *tt_counter_new(const tt_count_options *opt)
{
    if (opt->ngram_min < 1 || opt->ngram_max > MAX_N || opt->ngram_min > opt->ngram_max)
        return NULL;
    tt_counter *c = tt_calloc(1, sizeof *c);
    if (!c)
        return NULL;
    c->opt = *opt;
    tt_normalizer_init(&c->norm);
    tt_buf_init(&c->normal, TT_LIMIT_TOKEN_BYTES * 8);
    tt_buf_init(&c->stemmed, TT_LIMIT_TOKEN_BYTES * 8);
    tt_buf_init(&c->gram, TT_LIMIT_TOKEN_BYTES * 8 * MAX_N + MAX_N);
    for (int i = 0; i < MAX_N; i++)
        tt_buf_init(&c->win[i].term, TT_LIMIT_TOKEN_BYTES * 8);
    /* One entry per cache line: the lookup touches a single line. */
    c->cache_mem = tt_calloc(((size_t)1 << CACHE_BITS) + 1, sizeof *c->cache);
    if (!c->cache_mem) {
        tt_counter_free(c);
        return NULL;
    }
    c->cache = (cache_entry *)(((uintptr_t)c->cache_mem + 63) & ~(uintptr_t)63);
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
    tt_free(c->cache_mem);
    tt_free(c);
}

/* Counts the n-grams that end at the newest window token. */
static tt_status emit_grams(tt_counter *c, tt_termtable *table, tt_doc_stats *st)
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
        st->terms_kept++;
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

/* What a token becomes: its final term (a view into the cache or into a
 * counter buffer, valid until the next token), the term's table hash, and
 * CACHE_* flags. TT_ELIMIT when normalization outgrows its buffer. */
static tt_status resolve(tt_counter *c, const char *raw, size_t len, tt_token_kind kind,
                         const char **term, size_t *tlen, uint64_t *hash, unsigned *flags)
{
    cache_entry *e = NULL;
    uint64_t key[CACHE_RAW / 8] = { 0, 0, 0 };
    if (len <= CACHE_RAW) {
        tti_token_key(raw, len, key);
        e = &c->cache[tti_token_slot(key, len, CACHE_BITS)];
        if (e->raw_len == len && e->raw[0] == key[0] && e->raw[1] == key[1] &&
            e->raw[2] == key[2]) {
            *term = e->term;
            *tlen = e->term_len;
            *hash = e->hash;
            *flags = e->flags;
            return TT_OK;
        }
    }
    tt_status s = tt_normalize(&c->norm, raw, len, &c->normal);
    if (s)
        return s;
    unsigned f = 0;
    const char *t = c->normal.data;
    size_t n = c->normal.len;
    uint64_t h = 0;
    if (n == 0) {
        f = CACHE_EMPTY;
    } else {
        h = tti_termtable_hash(t, n);
        if (c->opt.stopwords && tti_termtable_get_hashed(c->opt.stopwords, t, n, h))
            f = CACHE_STOP;
        else if (c->opt.min_length > 1 && tt_utf8_length(t, n) < c->opt.min_length)
            f = CACHE_SHORT;
        if (c->stemmer && kind == TT_TOKEN_WORD) {
            s = tt_stem(c->stemmer, t, n, &c->stemmed);
            if (s)
                return s;
            t = c->stemmed.data;
            n = c->stemmed.len;
            h = tti_termtable_hash(t, n);
        }
    }
    if (e && n <= CACHE_RAW) {
        memcpy(e->raw, key, sizeof key);
        e->raw_len = (uint8_t)len;
        e->term_len = (uint8_t)n;
        e->flags = (uint8_t)f;
        e->hash = h;
        if (n)
            memcpy(e->term, t, n);
    }
    *term = t;
    *tlen = n;
    *hash = h;
    *flags = f;
    return TT_OK;
}

static tt_status count_block(tt_counter *c, const char *text, size_t len,
                             tt_termtable *table, tt_doc_stats *st)
{
    tt_tokenizer tk;
    tt_token tok;
    tt_status s;
    const int unigram_only = c->opt.ngram_max == 1;

    tt_tokenizer_init(&tk, text, len);
    c->win_len = 0;
    c->win_head = 0;
    while (tt_tokenizer_next(&tk, &tok)) {
        st->words_read++;
        if (tok.sentence_start) {
            st->sentences++;
            c->win_len = 0;
            c->win_head = 0;
        }
        if (tok.kind == TT_TOKEN_NUMBER) {
            st->numbers++;
            if (!c->opt.keep_numbers) {
                c->win_len = 0;
                c->win_head = 0;
                continue;
            }
        }
        const char *term;
        size_t tlen;
        uint64_t h;
        unsigned flags;
        s = resolve(c, text + tok.off, tok.len, tok.kind, &term, &tlen, &h, &flags);
        if (s == TT_ELIMIT) {
            /* NFKC can expand a token many times over (one U+FDFA becomes
             * 18 characters); a term past the buffer cap is skipped like an
             * overlong token, never allowed to fail the document. */
            st->overlong++;
            c->win_len = 0;
            c->win_head = 0;
            continue;
        }
        if (s)
            return s;
        if (flags & CACHE_EMPTY)
            continue;
        int edge_ok = 1;
        if (flags & CACHE_STOP) {
            st->stopwords++;
            edge_ok = 0;
        } else if (flags & CACHE_SHORT) {
            st->short_words++;
            edge_ok = 0;
        }
        if (unigram_only && !edge_ok)
            continue;
        if (unigram_only) {
            s = tti_termtable_add_hashed(table, term, tlen, h, 1);
            if (s)
                return s;
            st->terms_kept++;
            continue;
        }
        s = push_window(c, term, tlen, edge_ok);
        if (!s)
            s = emit_grams(c, table, st);
        if (s)
            return s;
    }
    st->overlong += tk.overlong;
    return TT_OK;
}

tt_status tt_counter_count(tt_counter *c, const tt_blocks *blocks,
                           tt_termtable *table, tt_doc_stats *stats)
{
    for (size_t i = 0; i < blocks->n; i++) {
        const tt_block *b = &blocks->items[i];
        tt_status s = count_block(c, blocks->text.data + b->off, b->len, table, stats);
        if (s)
            return s;
    }
    return TT_OK;
}

tt_status tt_counter_count_text(tt_counter *c, const char *text, size_t len,
                                tt_termtable *table, tt_doc_stats *stats)
{
    return count_block(c, text, len, table, stats);
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
