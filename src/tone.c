/* termtide — tone scoring.
 *
 * One pass over the tokens of each block. The scorer keeps, for the current
 * sentence, a ring of the last few normalized words (as many as the longest
 * lexicon phrase) to test phrase endings, and the position of the last
 * negator. A sentence or block start clears both, so neither a phrase nor
 * the negation rule reaches across a boundary. Per word: one normalization,
 * one word lookup, one stem lookup when the lexicon has stems, and one
 * phrase lookup per phrase length. O(words × longest phrase). */
#include <math.h>
#include <stdlib.h>

#include "termtide/filter.h"
#include "termtide/normalize.h"
#include "termtide/segment.h"
#include "termtide/termtable.h"
#include "termtide/tone.h"
#include "tt_internal.h"

static const char *const default_negators[] = { "no", "not", "none", "neither", "never",
                                                "nobody" };

#define MAX_HITS 16
#define RING_WORD TT_LIMIT_LEXICON_WORD_BYTES

/* The token cache: raw token bytes (up to CACHE_RAW) to what the slow path
 * makes of them: its word and stem hits, and whether it is empty, a
 * negator, or the first or last word of some phrase (a phrase's words are
 * normalized again when one is put together, so the word itself is not
 * kept). Normalization, stemming and
 * the lookups are pure functions of the raw bytes, so entries never go
 * stale; word frequencies are Zipf-like, so most tokens hit. An unkeyed
 * index only risks misses, never wrong results: the whole key is compared.
 * An entry is one 64-byte line (a word with more than CACHE_HITS hits is
 * never entered: nine fill the line), and the 8 MB of entries sit on huge pages
 * (tti_alloc_large): a lookup is one cache line and no TLB miss; tone ran
 * 4% faster than with 72-byte entries straddling lines on 4 KiB pages. A
 * miss costs some 4,000 instructions (the stemmer most of them), and
 * 65,536 entries missed 2.3% of the tokens of the benchmark's 200 MB:
 * 131,072 ran 7% faster. The entries of a batch of tokens are looked up
 * after all of the batch's keys are made and their lines fetched (the keys
 * kept, not made twice): the long tail's lines come from memory together
 * instead of one after another (tone over the benchmark 1030 -> 943 ms).
 * Keys of ASCII tokens lowercased, so "The" and "the" share an entry, made
 * it slower: the lowering costs more than the misses it saves. Entries go
 * in sets of two adjacent lines, both fetched: a hit in the second swaps
 * the two, a new entry pushes the first down and the second out, so two
 * common words whose keys meet no longer evict each other; in the same
 * 8 MB tone ran 925 -> 842 ms against one entry a slot (16 MB of single
 * entries: 885 ms; 16 MB of pairs: 834 ms, not worth the memory). */
#define CACHE_BITS 17
#define CACHE_RAW 24
#define CACHE_HITS 9
#define F_EMPTY 1u
#define F_NEGATOR 2u
#define F_PHRASE_END 4u
#define F_PHRASE_START 8u

typedef struct cache_entry {
    uint64_t raw[CACHE_RAW / 8];
    uint8_t raw_len; /* 0: unused */
    uint8_t n_hits;
    uint8_t flags;
    uint32_t hits[CACHE_HITS];
} cache_entry;

_Static_assert(sizeof(cache_entry) == 64, "one cache entry per 64-byte line");

struct tt_tone {
    tt_tone_options opt;
    tt_normalizer norm;
    tt_stemmer *stemmer;
    tt_buf word, stem;
    /* The last words of the sentence, for phrases: where each one's token
     * lies in the block's text. A phrase is put together, its words
     * normalized again (into pword), only when its first word starts some
     * phrase and its last ends one: copying every word into the ring cost
     * a library call a word. A word longer than RING_WORD bytes fails any
     * phrase through it (the lexicon refuses words that long). */
    size_t ring_off[TT_LIMIT_LEXICON_PHRASE_WORDS], ring_raw[TT_LIMIT_LEXICON_PHRASE_WORDS];
    uint8_t ring_flags[TT_LIMIT_LEXICON_PHRASE_WORDS]; /* each ring word's F_* flags */
    tt_buf pword;
    char phrase[TT_LIMIT_LEXICON_PHRASE_WORDS * (RING_WORD + 1)];
    size_t ring_len, ring_head;
    cache_entry *cache; /* tti_alloc_large: 8 MB read at random, on huge pages */
    int cache_mapped;
    tt_termtable *phrase_ends;   /* last words of the lexicon's phrases */
    tt_termtable *phrase_starts; /* and their first words */
    size_t slow_hits[MAX_HITS];
    tt_tone_scores sentence;   /* tt_tone_score_sentences' scratch */
};

void tt_tone_options_init(tt_tone_options *o, const tt_lexicon *lex)
{
    o->lexicon = lex;
    o->positive = tt_lexicon_category_find(lex, "positive", NULL);
    o->negative = tt_lexicon_category_find(lex, "negative", NULL);
    o->window = 3;
    o->negators = NULL;
    o->n_negators = 0;
}

tt_status tt_tone_scores_init(tt_tone_scores *s, const tt_lexicon *lex)
{
    memset(s, 0, sizeof *s);
    s->n_categories = tt_lexicon_category_count(lex);
    s->n_entries = tt_lexicon_entry_count(lex);
    size_t n = s->n_categories ? s->n_categories : 1;
    size_t ne = s->n_entries ? s->n_entries : 1;
    s->weight = tt_calloc(n, sizeof *s->weight);
    s->matches = tt_calloc(n, sizeof *s->matches);
    s->entry_hits = tt_calloc(ne, sizeof *s->entry_hits);
    s->entry_negated = tt_calloc(ne, sizeof *s->entry_negated);
    if (!s->weight || !s->matches || !s->entry_hits || !s->entry_negated) {
        tt_tone_scores_release(s);
        return TT_ENOMEM;
    }
    return TT_OK;
}

void tt_tone_scores_release(tt_tone_scores *s)
{
    tt_free(s->weight);
    tt_free(s->matches);
    tt_free(s->entry_hits);
    tt_free(s->entry_negated);
    s->weight = NULL;
    s->matches = NULL;
    s->entry_hits = s->entry_negated = NULL;
}

void tt_tone_scores_reset(tt_tone_scores *s)
{
    s->words = 0;
    s->negated = 0;
    for (size_t i = 0; i < s->n_categories; i++) {
        s->weight[i] = 0;
        s->matches[i] = 0;
    }
    if (s->n_entries) {
        memset(s->entry_hits, 0, s->n_entries * sizeof *s->entry_hits);
        memset(s->entry_negated, 0, s->n_entries * sizeof *s->entry_negated);
    }
}

tt_status tt_tone_scores_add(tt_tone_scores *dst, const tt_tone_scores *src)
{
    if (dst->n_categories != src->n_categories || dst->n_entries != src->n_entries)
        return TT_EINVAL;
    dst->words += src->words;
    dst->negated += src->negated;
    for (size_t k = 0; k < src->n_categories; k++) {
        dst->weight[k] += src->weight[k];
        dst->matches[k] += src->matches[k];
    }
    for (size_t e = 0; e < src->n_entries; e++) {
        dst->entry_hits[e] += src->entry_hits[e];
        dst->entry_negated[e] += src->entry_negated[e];
    }
    return TT_OK;
}

/* Packed form, native byte order (it never leaves the process):
 * u64 n_categories, n_entries, words, negated, n_nonzero; per category
 * double weight, u64 matches; per entry with matches u64 index, hits,
 * negated. */
static tt_status put_u64(tt_buf *b, uint64_t v) { return tt_buf_append(b, (const char *)&v, 8); }

tt_status tt_tone_scores_pack(const tt_tone_scores *s, tt_buf *out)
{
    uint64_t nz = 0;
    for (size_t e = 0; e < s->n_entries; e++)
        nz += s->entry_hits[e] || s->entry_negated[e];
    tt_status st = put_u64(out, s->n_categories);
    if (!st) st = put_u64(out, s->n_entries);
    if (!st) st = put_u64(out, s->words);
    if (!st) st = put_u64(out, s->negated);
    if (!st) st = put_u64(out, nz);
    for (size_t k = 0; k < s->n_categories && !st; k++) {
        st = tt_buf_append(out, (const char *)&s->weight[k], sizeof(double));
        if (!st) st = put_u64(out, s->matches[k]);
    }
    for (size_t e = 0; e < s->n_entries && !st; e++) {
        if (!s->entry_hits[e] && !s->entry_negated[e])
            continue;
        st = put_u64(out, e);
        if (!st) st = put_u64(out, s->entry_hits[e]);
        if (!st) st = put_u64(out, s->entry_negated[e]);
    }
    return st;
}

static int get_u64(const char **p, size_t *len, uint64_t *v)
{
    if (*len < 8)
        return 0;
    memcpy(v, *p, 8);
    *p += 8;
    *len -= 8;
    return 1;
}

tt_status tt_tone_scores_add_packed(tt_tone_scores *dst, const char **data, size_t *len)
{
    const char *p = *data;
    size_t n = *len;
    uint64_t ncat, nent, words, negated, nz;
    if (!get_u64(&p, &n, &ncat) || !get_u64(&p, &n, &nent) || !get_u64(&p, &n, &words) ||
        !get_u64(&p, &n, &negated) || !get_u64(&p, &n, &nz) || ncat != dst->n_categories ||
        nent != dst->n_entries || n / 16 < ncat || (n - 16 * ncat) / 24 < nz)
        return TT_EINVAL;
    dst->words += words;
    dst->negated += negated;
    for (size_t k = 0; k < ncat; k++) {
        double w;
        uint64_t m = 0;
        memcpy(&w, p, sizeof w);
        p += 8;
        n -= 8;
        if (!get_u64(&p, &n, &m))
            return TT_EINVAL;
        dst->weight[k] += w;
        dst->matches[k] += m;
    }
    for (uint64_t i = 0; i < nz; i++) {
        uint64_t e = 0, h = 0, ng = 0;
        if (!get_u64(&p, &n, &e) || !get_u64(&p, &n, &h) || !get_u64(&p, &n, &ng) || e >= nent)
            return TT_EINVAL;
        dst->entry_hits[e] += h;
        dst->entry_negated[e] += ng;
    }
    *data = p;
    *len = n;
    return TT_OK;
}

typedef struct top_sort {
    tt_tone_contribution c;
    const char *term;
} top_sort;

static int cmp_top(const void *a, const void *b)
{
    const top_sort *x = a, *y = b;
    if (x->c.weight != y->c.weight)
        return x->c.weight > y->c.weight ? -1 : 1;
    if (x->c.matches != y->c.matches)
        return x->c.matches > y->c.matches ? -1 : 1;
    int r = strcmp(x->term, y->term);
    if (r)
        return r;
    return x->c.negated - y->c.negated;
}

tt_status tt_tone_top(const tt_tone_scores *s, const tt_lexicon *lex, size_t category,
                      long negative, tt_tone_contribution *out, size_t k, size_t *n)
{
    *n = 0;
    size_t cand = 0;
    for (size_t e = 0; e < s->n_entries; e++) {
        const tt_lexicon_entry *le = tt_lexicon_entry_at(lex, e);
        cand += (le->category == category && s->entry_hits[e]) +
                (negative == (long)category && s->entry_negated[e] > 0);
    }
    if (!cand || !k)
        return TT_OK;
    top_sort *all = tt_calloc(cand, sizeof *all);
    if (!all)
        return TT_ENOMEM;
    size_t m = 0;
    for (size_t e = 0; e < s->n_entries; e++) {
        const tt_lexicon_entry *le = tt_lexicon_entry_at(lex, e);
        if (le->category == category && s->entry_hits[e])
            all[m++] = (top_sort){ { e, 0, s->entry_hits[e],
                                     (double)s->entry_hits[e] * le->weight }, le->term };
        if (negative == (long)category && s->entry_negated[e])
            all[m++] = (top_sort){ { e, 1, s->entry_negated[e],
                                     (double)s->entry_negated[e] * le->weight }, le->term };
    }
    qsort(all, m, sizeof *all, cmp_top);
    for (size_t i = 0; i < m && i < k; i++)
        out[(*n)++] = all[i].c;
    tt_free(all);
    return TT_OK;
}

tt_tone *tt_tone_new(const tt_tone_options *opt)
{
    tt_tone *t = tt_calloc(1, sizeof *t);
    if (!t)
        return NULL;
    t->opt = *opt;
    if (!t->opt.negators) {
        t->opt.negators = default_negators;
        t->opt.n_negators = sizeof default_negators / sizeof default_negators[0];
    }
    tt_normalizer_init(&t->norm);
    tt_buf_init(&t->word, TT_LIMIT_TOKEN_BYTES * 8);
    tt_buf_init(&t->pword, TT_LIMIT_TOKEN_BYTES * 8);
    tt_buf_init(&t->stem, TT_LIMIT_TOKEN_BYTES * 8);
    if (tt_lexicon_has_stems(opt->lexicon) && !(t->stemmer = tt_stemmer_new())) {
        tt_tone_free(t);
        return NULL;
    }
    t->cache = tti_alloc_large((size_t)1 << CACHE_BITS, sizeof *t->cache, &t->cache_mapped);
    t->phrase_ends = tt_termtable_new();
    t->phrase_starts = tt_termtable_new();
    if (!t->cache || !t->phrase_ends || !t->phrase_starts) {
        tt_tone_free(t);
        return NULL;
    }
    for (size_t i = 0; i < tt_lexicon_entry_count(opt->lexicon); i++) {
        const tt_lexicon_entry *e = tt_lexicon_entry_at(opt->lexicon, i);
        if (e->kind != TT_LEXICON_PHRASE)
            continue;
        const char *last = strrchr(e->term, ' ');
        last = last ? last + 1 : e->term;
        const char *gap = strchr(e->term, ' ');
        size_t first = gap ? (size_t)(gap - e->term) : strlen(e->term);
        if (tt_termtable_add(t->phrase_ends, last, strlen(last), 1) ||
            tt_termtable_add(t->phrase_starts, e->term, first, 1)) {
            tt_tone_free(t);
            return NULL;
        }
    }
    return t;
}

void tt_tone_free(tt_tone *t)
{
    if (!t)
        return;
    tt_normalizer_release(&t->norm);
    tt_stemmer_free(t->stemmer);
    tt_buf_release(&t->word);
    tt_buf_release(&t->pword);
    tt_buf_release(&t->stem);
    tti_free_large(t->cache, (size_t)1 << CACHE_BITS, sizeof *t->cache, t->cache_mapped);
    tt_termtable_free(t->phrase_ends);
    tt_termtable_free(t->phrase_starts);
    tt_tone_scores_release(&t->sentence);
    tt_free(t);
}

static int is_negator(const tt_tone *t, const char *w, size_t n)
{
    for (size_t i = 0; i < t->opt.n_negators; i++)
        if (strlen(t->opt.negators[i]) == n && !memcmp(t->opt.negators[i], w, n))
            return 1;
    return 0;
}

/* Counts the entries idx[0..n) for a word at sentence position pos. */
static void count_hits(tt_tone *t, const size_t *idx, size_t n, int negated, tt_tone_scores *s)
{
    for (size_t i = 0; i < n && i < MAX_HITS; i++) {
        const tt_lexicon_entry *e = tt_lexicon_entry_at(t->opt.lexicon, idx[i]);
        size_t cat = e->category;
        if (negated && t->opt.positive >= 0 && t->opt.negative >= 0 &&
            cat == (size_t)t->opt.positive) {
            cat = (size_t)t->opt.negative;
            s->negated++;
            s->entry_negated[idx[i]]++;
        } else {
            s->entry_hits[idx[i]]++;
        }
        s->weight[cat] += e->weight;
        s->matches[cat]++;
    }
}

/* What a token is to the scorer: up to MAX_HITS word and stem hits in
 * *hits, and F_* flags; from the cache when the raw token was seen
 * before. */
/* A token's cache key and entry, found a batch ahead (see score_block). */
typedef struct keyed {
    uint64_t key[CACHE_RAW / 8];
    cache_entry *e; /* NULL: longer than CACHE_RAW, never cached */
} keyed;

static void key_token(tt_tone *t, const char *raw, size_t len, keyed *k)
{
    if (len > CACHE_RAW) {
        k->e = NULL;
        return;
    }
    tti_token_key(raw, len, k->key);
    k->e = &t->cache[tti_token_slot(k->key, len, CACHE_BITS) & ~(size_t)1];
}

static tt_status resolve(tt_tone *t, const char *raw, size_t len, const keyed *k,
                         const size_t **hits, size_t *n_hits, unsigned *flags, size_t *scratch)
{
    const tt_lexicon *lex = t->opt.lexicon;
    cache_entry *e = k->e;
    const uint64_t *key = k->key;
    if (e) {
        for (int w = 0; w < 2; w++) {
            cache_entry *x = e + w;
            if (x->raw_len == len && x->raw[0] == key[0] && x->raw[1] == key[1] &&
                x->raw[2] == key[2]) {
                if (w) { /* way 1 hit: it becomes way 0 */
                    cache_entry tmp = e[0];
                    e[0] = e[1];
                    e[1] = tmp;
                }
                for (size_t i = 0; i < e->n_hits; i++)
                    scratch[i] = e->hits[i];
                *hits = scratch;
                *n_hits = e->n_hits;
                *flags = e->flags;
                return TT_OK;
            }
        }
    }
    tt_status st = tt_normalize(&t->norm, raw, len, &t->word);
    if (st)
        return st;
    unsigned f = 0;
    size_t n = 0;
    if (t->word.len == 0) {
        f = F_EMPTY;
    } else {
        n = tt_lexicon_match(lex, TT_LEXICON_WORD, t->word.data, t->word.len, scratch, MAX_HITS);
        if (n > MAX_HITS)
            n = MAX_HITS;
        if (t->stemmer) {
            if ((st = tt_stem(t->stemmer, t->word.data, t->word.len, &t->stem)) != TT_OK)
                return st;
            size_t m = tt_lexicon_match(lex, TT_LEXICON_STEM, t->stem.data, t->stem.len,
                                        scratch + n, MAX_HITS - n);
            n += m < MAX_HITS - n ? m : MAX_HITS - n;
        }
        if (is_negator(t, t->word.data, t->word.len))
            f |= F_NEGATOR;
        if (tt_termtable_get(t->phrase_ends, t->word.data, t->word.len))
            f |= F_PHRASE_END;
        if (tt_termtable_get(t->phrase_starts, t->word.data, t->word.len))
            f |= F_PHRASE_START;
    }
    if (e && n <= CACHE_HITS) {
        e[1] = e[0]; /* way 1 goes, way 0 moves down */
        memcpy(e->raw, key, sizeof e->raw);
        e->raw_len = (uint8_t)len;
        e->n_hits = (uint8_t)n;
        e->flags = (uint8_t)f;
        for (size_t i = 0; i < n; i++)
            e->hits[i] = (uint32_t)scratch[i];
    }
    *hits = scratch;
    *n_hits = n;
    *flags = f;
    return TT_OK;
}

/* Tokens are taken from the tokenizer this many at a time. */
#define TOKEN_BATCH 64

static tt_status score_block(tt_tone *t, const char *text, size_t len, tt_tone_scores *s)
{
    const tt_lexicon *lex = t->opt.lexicon;
    size_t max_phrase = tt_lexicon_max_phrase_words(lex);
    tt_tokenizer tk;
    tt_token toks[TOKEN_BATCH];
    keyed keys[TOKEN_BATCH];
    size_t idx[MAX_HITS];
    long pos = 0, last_negator = -1000000;
    tt_tokenizer_init(&tk, text, len);
    t->ring_len = 0;
    t->ring_head = 0;
    for (size_t ti = 0, nt = 0;; ti++) {
        if (ti == nt) {
            if (nt && nt < TOKEN_BATCH)
                break;
            if (!(nt = tt_tokenizer_fill(&tk, toks, TOKEN_BATCH)))
                break;
            ti = 0;
            /* The batch's keys and cache entries first, each entry's line
             * fetched while the next keys are made: the cache is 8 MB, and
             * a word of the long tail waits for memory once per batch
             * instead of once per word. */
            for (size_t k = 0; k < nt; k++) {
                if (toks[k].kind != TT_TOKEN_WORD)
                    continue;
                key_token(t, text + toks[k].off, toks[k].len, &keys[k]);
                if (keys[k].e) {
                    __builtin_prefetch(keys[k].e);
                    __builtin_prefetch(keys[k].e + 1);
                }
            }
        }
        const tt_token tok = toks[ti];
        if (tok.sentence_start) {
            t->ring_len = 0;
            t->ring_head = 0;
            pos = 0;
            last_negator = -1000000;
        }
        if (tok.kind != TT_TOKEN_WORD)
            continue;
        size_t nh;
        const size_t *hits;
        unsigned flags;
        tt_status st = resolve(t, text + tok.off, tok.len, &keys[ti], &hits, &nh, &flags,
                               t->slow_hits);
        if (st == TT_ELIMIT)
            continue;
        if (st)
            return st;
        if (flags & F_EMPTY)
            continue;
        s->words++;
        int negated = pos - last_negator <= (long)t->opt.window;
        count_hits(t, hits, nh, negated, s);
        if (max_phrase > 1) {
            /* The ring keeps the last max_phrase words of this sentence;
             * the current word goes in after the newest, replacing the
             * oldest when full. */
            size_t slot = (t->ring_head + t->ring_len) % TT_LIMIT_LEXICON_PHRASE_WORDS;
            if (t->ring_len < max_phrase)
                t->ring_len++;
            else
                t->ring_head = (t->ring_head + 1) % TT_LIMIT_LEXICON_PHRASE_WORDS;
            t->ring_off[slot] = tok.off;
            t->ring_raw[slot] = tok.len;
            t->ring_flags[slot] = (uint8_t)flags;
            /* ring now ends with the current word; when some phrase ends
             * with it, try every length >= 2 */
            for (size_t words = 2; (flags & F_PHRASE_END) && words <= max_phrase &&
                                   words <= t->ring_len;
                 words++) {
                size_t first = (t->ring_head + t->ring_len - words) % TT_LIMIT_LEXICON_PHRASE_WORDS;
                /* no phrase starts with that word: no lookup */
                if (!(t->ring_flags[first] & F_PHRASE_START))
                    continue;
                size_t plen = 0;
                int fits = 1;
                for (size_t w = 0; w < words && fits; w++) {
                    size_t r = (first + w) % TT_LIMIT_LEXICON_PHRASE_WORDS;
                    /* the word as resolve made it (it did once already) */
                    st = tt_normalize(&t->norm, text + t->ring_off[r], t->ring_raw[r], &t->pword);
                    if (st)
                        return st;
                    if (t->pword.len > RING_WORD) {
                        fits = 0;
                        break;
                    }
                    if (w)
                        t->phrase[plen++] = ' ';
                    memcpy(t->phrase + plen, t->pword.data, t->pword.len);
                    plen += t->pword.len;
                }
                if (!fits)
                    continue;
                size_t n = tt_lexicon_match(lex, TT_LEXICON_PHRASE, t->phrase, plen, idx, MAX_HITS);
                /* a phrase is negated when a negator precedes its first word */
                int pneg = (pos - (long)(words - 1)) - last_negator <= (long)t->opt.window &&
                           last_negator < pos - (long)(words - 1);
                count_hits(t, idx, n, pneg, s);
            }
        }
        if (flags & F_NEGATOR)
            last_negator = pos;
        pos++;
    }
    return TT_OK;
}

tt_status tt_tone_score_blocks(tt_tone *t, const tt_blocks *blocks, tt_tone_scores *s)
{
    for (size_t i = 0; i < blocks->n; i++) {
        tt_status st = score_block(t, blocks->text.data + blocks->items[i].off,
                                   blocks->items[i].len, s);
        if (st)
            return st;
    }
    return TT_OK;
}

tt_status tt_tone_score_text(tt_tone *t, const char *text, size_t len, tt_tone_scores *s)
{
    return score_block(t, text, len, s);
}

tt_status tt_tone_score_sentences(tt_tone *t, const char *text, size_t len,
                                  tt_tone_sentence_fn fn, void *ctx)
{
    tt_tokenizer tk;
    tt_token tok;
    tt_tokenizer_init(&tk, text, len);
    size_t start = 0;
    int started = 0;
    tt_status st = TT_OK;
    if (!t->sentence.weight && (st = tt_tone_scores_init(&t->sentence, t->opt.lexicon)))
        return st;
    /* A sentence runs from one sentence start to the next; each range is
     * scored alone, so the scorer's sentence state starts fresh in it. */
    for (;;) {
        int more = tt_tokenizer_next(&tk, &tok);
        if (more && !tok.sentence_start)
            continue;
        size_t end = more ? tok.off : len;
        if (started) {
            tt_tone_scores_reset(&t->sentence);
            if ((st = score_block(t, text + start, end - start, &t->sentence)) != TT_OK ||
                (st = fn(ctx, start, end - start, &t->sentence)) != TT_OK)
                return st;
        }
        if (!more)
            return TT_OK;
        start = tok.off;
        started = 1;
    }
}

double tt_tone_net(const tt_tone_scores *s, long positive, long negative)
{
    if (positive < 0 || negative < 0)
        return NAN;
    double p = s->weight[positive], n = s->weight[negative];
    return p + n > 0 ? (p - n) / (p + n) : NAN;
}
