/* termtide — sentence-level change (see changes.h for the method).
 *
 * A sentence list keeps its sentences' text in one buffer and their words
 * as ids in one array; the word dictionary (a term table from word to
 * id + 1, and the words by id) is shared by every list made together and
 * freed with the last of them. Alignment uses three hash tables keyed by
 * 64-bit values (sentence hashes, shingles) with open addressing, all
 * allocated per call and sized to a power of two at least twice the
 * entries. */
#include <math.h>
#include <stdlib.h>

#include "termtide/changes.h"
#include "termtide/limits.h"
#include "termtide/normalize.h"
#include "termtide/segment.h"
#include "termtide/termtable.h"
#include "tt_internal.h"

typedef struct dict {
    tt_termtable *ids;   /* word -> id + 1 */
    char **words;        /* by id */
    size_t n, cap;
    int refs;
} dict;

struct tt_sentence_list {
    dict *d;
    tt_sentence *v;
    size_t n, cap;
    tt_buf text;
    uint32_t *words;
    size_t n_words, cap_words;
    char **docs;
    size_t n_docs;
    char **sections;        /* section names, each once */
    size_t n_sections;
    tt_normalizer norm;
    tt_buf tmp;
};

static void dict_unref(dict *d)
{
    if (!d || --d->refs > 0)
        return;
    tt_termtable_free(d->ids);
    for (size_t i = 0; i < d->n; i++)
        tt_free(d->words[i]);
    tt_free(d->words);
    tt_free(d);
}

static tt_sentence_list *list_new(dict *d)
{
    tt_sentence_list *l = tt_calloc(1, sizeof *l);
    if (!l)
        return NULL;
    if (d) {
        l->d = d;
        d->refs++;
    } else if (!(l->d = tt_calloc(1, sizeof *l->d)) || !(l->d->ids = tt_termtable_new())) {
        if (l->d)
            tt_free(l->d);
        tt_free(l);
        return NULL;
    } else {
        l->d->refs = 1;
    }
    tt_buf_init(&l->text, 0);
    tt_buf_init(&l->tmp, TT_LIMIT_TOKEN_BYTES * 8);
    tt_normalizer_init(&l->norm);
    return l;
}

tt_sentence_list *tt_sentence_list_new(void) { return list_new(NULL); }

tt_sentence_list *tt_sentence_list_new_sharing(tt_sentence_list *base)
{
    return list_new(base->d);
}

void tt_sentence_list_reset(tt_sentence_list *l)
{
    l->n = 0;
    l->n_words = 0;
    tt_buf_reset(&l->text);
    for (size_t i = 0; i < l->n_docs; i++)
        tt_free(l->docs[i]);
    l->n_docs = 0;
    for (size_t i = 0; i < l->n_sections; i++)
        tt_free(l->sections[i]);
    l->n_sections = 0;
}

void tt_sentence_list_free(tt_sentence_list *l)
{
    if (!l)
        return;
    tt_sentence_list_reset(l);
    tt_free(l->docs);
    tt_free(l->sections);
    tt_free(l->v);
    tt_free(l->words);
    tt_buf_release(&l->text);
    tt_buf_release(&l->tmp);
    tt_normalizer_release(&l->norm);
    dict_unref(l->d);
    tt_free(l);
}

size_t tt_sentence_list_count(const tt_sentence_list *l) { return l->n; }
const tt_sentence *tt_sentence_at(const tt_sentence_list *l, size_t i) { return &l->v[i]; }
const char *tt_sentence_text(const tt_sentence_list *l, const tt_sentence *s)
{
    return l->text.data + s->text_off;
}
const char *tt_sentence_doc(const tt_sentence_list *l, const tt_sentence *s)
{
    return l->docs[s->doc];
}
uint64_t tt_sentence_list_words(const tt_sentence_list *l) { return l->n_words; }

static tt_status word_id(tt_sentence_list *l, const char *w, size_t n, uint32_t *id)
{
    dict *d = l->d;
    uint64_t v = tt_termtable_get(d->ids, w, n);
    if (v) {
        *id = (uint32_t)(v - 1);
        return TT_OK;
    }
    if (d->n >= TT_LIMIT_DISTINCT_TERMS)
        return TT_ELIMIT;
    if (d->n == d->cap) {
        size_t cap = d->cap ? 2 * d->cap : 1024;
        char **x = tt_reallocarray(d->words, cap, sizeof *x);
        if (!x)
            return TT_ENOMEM;
        d->words = x;
        d->cap = cap;
    }
    if (!(d->words[d->n] = tt_strndup(w, n)))
        return TT_ENOMEM;
    tt_status st = tt_termtable_add(d->ids, w, n, d->n + 1);
    if (st) {
        tt_free(d->words[d->n]);
        return st;
    }
    *id = (uint32_t)d->n++;
    return TT_OK;
}

static tt_status push_word(tt_sentence_list *l, uint32_t id)
{
    if (l->n_words == l->cap_words) {
        size_t cap = l->cap_words ? 2 * l->cap_words : 4096;
        uint32_t *x = tt_reallocarray(l->words, cap, sizeof *x);
        if (!x)
            return TT_ENOMEM;
        l->words = x;
        l->cap_words = cap;
    }
    l->words[l->n_words++] = id;
    return TT_OK;
}

/* FNV-1a over the word ids. */
static uint64_t seq_hash(const uint32_t *w, size_t n)
{
    uint64_t h = 1469598103934665603ull;
    for (size_t i = 0; i < n; i++) {
        h ^= w[i];
        h *= 1099511628211ull;
    }
    return h;
}

/* Closes the sentence being built (words from `first`), text [a, b) of
 * the block; drops it when it holds no word. */
static tt_status close_sentence(tt_sentence_list *l, const tt_blocks *b, size_t blk, size_t a,
                                size_t e, size_t first, const char *raw, size_t raw_len,
                                size_t raw_off, int html)
{
    if (l->n_words == first)
        return TT_OK;
    const char *t = b->text.data + b->items[blk].off;
    while (e > a && t[e - 1] == ' ')
        e--;
    if (l->n == l->cap) {
        size_t cap = l->cap ? 2 * l->cap : 256;
        tt_sentence *x = tt_reallocarray(l->v, cap, sizeof *x);
        if (!x)
            return TT_ENOMEM;
        l->v = x;
        l->cap = cap;
    }
    tt_sentence *s = &l->v[l->n];
    s->text_off = l->text.len;
    s->len = e - a;
    tt_status st = tt_buf_append(&l->text, t + a, e - a);
    if (!st)
        st = tt_buf_putc(&l->text, '\0');
    if (st)
        return st;
    long long src = raw ? tt_blocks_source_offset(b, blk, a, raw, raw_len, html) : -1;
    s->offset = src >= 0 ? src + (long long)raw_off : -1;
    s->doc = l->n_docs - 1;
    s->words_off = first;
    s->n_words = l->n_words - first;
    s->hash = seq_hash(l->words + first, s->n_words);
    s->block_off = b->items[blk].off;
    s->section = 0;
    l->n++;
    return TT_OK;
}

tt_status tt_sentence_list_label(tt_sentence_list *l, const tt_text_range *r, size_t n)
{
    if (!l->n_docs)
        return TT_OK;
    size_t doc = l->n_docs - 1;
    for (size_t i = l->n; i-- > 0 && l->v[i].doc == doc;) {
        tt_sentence *s = &l->v[i];
        size_t k = 0;
        while (k < n && !(r[k].start <= s->block_off && s->block_off < r[k].end))
            k++;
        if (k == n)
            continue;
        size_t id = 0;
        while (id < l->n_sections && strcmp(l->sections[id], r[k].name))
            id++;
        if (id == l->n_sections) {
            char **x = tt_reallocarray(l->sections, l->n_sections + 1, sizeof *x);
            if (!x)
                return TT_ENOMEM;
            l->sections = x;
            if (!(x[id] = tt_strdup(r[k].name)))
                return TT_ENOMEM;
            l->n_sections++;
        }
        s->section = id + 1;
    }
    return TT_OK;
}

const char *tt_sentence_section(const tt_sentence_list *l, const tt_sentence *s)
{
    return s->section && s->section <= l->n_sections ? l->sections[s->section - 1] : "";
}

tt_status tt_sentence_list_add(tt_sentence_list *l, const tt_blocks *b, const char *raw,
                               size_t raw_len, size_t raw_off, int html, const char *doc)
{
    char **docs = tt_reallocarray(l->docs, l->n_docs + 1, sizeof *docs);
    if (!docs)
        return TT_ENOMEM;
    l->docs = docs;
    if (!(l->docs[l->n_docs] = tt_strdup(doc ? doc : "")))
        return TT_ENOMEM;
    l->n_docs++;
    tt_status st = TT_OK;
    for (size_t k = 0; k < b->n && !st; k++) {
        if (b->items[k].kind != TT_BLOCK_PARAGRAPH && b->items[k].kind != TT_BLOCK_ITEM)
            continue;
        const char *t = b->text.data + b->items[k].off;
        tt_tokenizer tk;
        tt_token tok;
        tt_tokenizer_init(&tk, t, b->items[k].len);
        size_t start = 0, first = l->n_words;
        int any = 0;
        while (!st && tt_tokenizer_next(&tk, &tok)) {
            if (tok.sentence_start && any) {
                st = close_sentence(l, b, k, start, tok.off, first, raw, raw_len, raw_off, html);
                first = l->n_words;
            }
            if (tok.sentence_start || !any)
                start = tok.off;
            any = 1;
            if (st)
                break;
            /* letters, digits and hyphens in ASCII fold to lower case alone
             * (NFKC leaves ASCII as it is); anything else goes through the
             * normalizer */
            const char *w = t + tok.off;
            size_t m = 0;
            while (m < tok.len && ((w[m] >= 'a' && w[m] <= 'z') || (w[m] >= 'A' && w[m] <= 'Z') ||
                                   (w[m] >= '0' && w[m] <= '9') || w[m] == '-'))
                m++;
            if (m == tok.len) {
                tt_buf_reset(&l->tmp);
                st = tt_buf_append(&l->tmp, w, tok.len);
                for (size_t q = 0; !st && q < l->tmp.len; q++)
                    l->tmp.data[q] = (char)tti_ascii_lower((unsigned char)l->tmp.data[q]);
            } else {
                st = tt_normalize(&l->norm, w, tok.len, &l->tmp);
            }
            if (st == TT_ELIMIT) {
                st = TT_OK;
                continue;
            }
            uint32_t id;
            if (!st && l->tmp.len && !(st = word_id(l, l->tmp.data, l->tmp.len, &id)))
                st = push_word(l, id);
        }
        if (!st && any)
            st = close_sentence(l, b, k, start, b->items[k].len, first, raw, raw_len, raw_off,
                                html);
    }
    return st;
}

const char *tt_change_kind_name(tt_change_kind k)
{
    static const char *const names[] = { "unchanged", "modified", "added", "removed" };
    return (unsigned)k < 4 ? names[k] : "?";
}

void tt_alignment_init(tt_alignment *a) { memset(a, 0, sizeof *a); }

void tt_alignment_release(tt_alignment *a)
{
    tt_free(a->v);
    tt_alignment_init(a);
}

static tt_status emit(tt_alignment *a, tt_change_kind k, size_t base, size_t target, double sim)
{
    if (a->n == a->cap) {
        size_t cap = a->cap ? 2 * a->cap : 256;
        tt_sentence_change *x = tt_reallocarray(a->v, cap, sizeof *x);
        if (!x)
            return TT_ENOMEM;
        a->v = x;
        a->cap = cap;
    }
    a->v[a->n++] = (tt_sentence_change){ k, base, target, sim };
    return TT_OK;
}

/* ---- a small multimap from 64-bit keys to sentence indices -------------- */

typedef struct mmap64 {
    uint64_t *keys;
    size_t *head;       /* first entry of the key's chain, SIZE_MAX empty */
    size_t *count;      /* entries under the key */
    size_t mask;
    size_t *next, *val; /* chains */
    size_t n, cap;
} mmap64;

static int mm_init(mmap64 *m, size_t expect)
{
    memset(m, 0, sizeof *m);
    size_t size = 16;
    while (size < 2 * expect + 1)
        size *= 2;
    m->mask = size - 1;
    m->keys = tt_calloc(size, sizeof *m->keys);
    m->head = tt_malloc(size * sizeof *m->head);
    m->count = tt_calloc(size, sizeof *m->count);
    m->cap = expect ? expect : 1;
    m->next = tt_malloc(m->cap * sizeof *m->next);
    m->val = tt_malloc(m->cap * sizeof *m->val);
    if (!m->keys || !m->head || !m->count || !m->next || !m->val)
        return 0;
    for (size_t i = 0; i < size; i++)
        m->head[i] = SIZE_MAX;
    return 1;
}

static void mm_free(mmap64 *m)
{
    tt_free(m->keys);
    tt_free(m->head);
    tt_free(m->count);
    tt_free(m->next);
    tt_free(m->val);
}

static size_t mm_slot(const mmap64 *m, uint64_t key)
{
    size_t i = (size_t)(key * 0x9E3779B97F4A7C15ull >> 17) & m->mask;
    while (m->head[i] != SIZE_MAX && m->keys[i] != key)
        i = (i + 1) & m->mask;
    return i;
}

/* Adds v under key unless the key holds cap entries already (cap 0: no
 * cap). Entries keep insertion order. */
static void mm_add(mmap64 *m, uint64_t key, size_t v, size_t cap)
{
    size_t i = mm_slot(m, key);
    if (cap && m->count[i] >= cap) {
        m->count[i]++;
        return;
    }
    if (m->n == m->cap)
        return; /* sized for every entry: cannot happen */
    size_t e = m->n++;
    m->val[e] = v;
    m->next[e] = SIZE_MAX;
    if (m->head[i] == SIZE_MAX) {
        m->keys[i] = key;
        m->head[i] = e;
    } else {
        size_t t = m->head[i];
        while (m->next[t] != SIZE_MAX)
            t = m->next[t];
        m->next[t] = e;
    }
    m->count[i]++;
}

/* ---- alignment ------------------------------------------------------------- */

static int same_words(const tt_sentence_list *a, const tt_sentence *x, const tt_sentence_list *b,
                      const tt_sentence *y)
{
    return x->n_words == y->n_words &&
           !memcmp(a->words + x->words_off, b->words + y->words_off,
                   x->n_words * sizeof *a->words);
}

static int cmp_u32(const void *a, const void *b)
{
    uint32_t x = *(const uint32_t *)a, y = *(const uint32_t *)b;
    return x < y ? -1 : x > y;
}

/* The sentence's distinct word ids, sorted, into out (n_words entries at
 * most); returns how many. */
static size_t word_set(const tt_sentence_list *l, const tt_sentence *s, uint32_t *out)
{
    memcpy(out, l->words + s->words_off, s->n_words * sizeof *out);
    qsort(out, s->n_words, sizeof *out, cmp_u32);
    size_t m = 0;
    for (size_t i = 0; i < s->n_words; i++)
        if (!m || out[m - 1] != out[i])
            out[m++] = out[i];
    return m;
}

/* Every sentence's word set (sorted distinct ids), once: sets[off[i] ..
 * off[i] + len[i]). NULL arrays when out of memory. */
typedef struct sets {
    uint32_t *ids;
    size_t *off, *len;
} sets;

static int sets_build(const tt_sentence_list *l, sets *s)
{
    s->ids = tt_malloc((l->n_words ? l->n_words : 1) * sizeof *s->ids);
    s->off = tt_malloc((l->n ? l->n : 1) * sizeof *s->off);
    s->len = tt_malloc((l->n ? l->n : 1) * sizeof *s->len);
    if (!s->ids || !s->off || !s->len)
        return 0;
    size_t at = 0;
    for (size_t i = 0; i < l->n; i++) {
        s->off[i] = at;
        s->len[i] = word_set(l, &l->v[i], s->ids + at);
        at += s->len[i];
    }
    return 1;
}

static void sets_free(sets *s)
{
    tt_free(s->ids);
    tt_free(s->off);
    tt_free(s->len);
}

static double jaccard(const uint32_t *a, size_t na, const uint32_t *b, size_t nb)
{
    size_t i = 0, j = 0, both = 0;
    while (i < na && j < nb) {
        if (a[i] == b[j]) {
            both++;
            i++;
            j++;
        } else if (a[i] < b[j]) {
            i++;
        } else {
            j++;
        }
    }
    size_t any = na + nb - both;
    return any ? (double)both / (double)any : 1.0;
}

static uint64_t shingle(uint32_t a, uint32_t b)
{
    return ((uint64_t)a << 32 | b) * 0xD6E8FEB86659FD93ull + 0x9E3779B97F4A7C15ull;
}

tt_status tt_align_sentences(const tt_sentence_list *base, const tt_sentence_list *target,
                             double threshold, tt_alignment *out)
{
    if (!(threshold > 0 && threshold <= 1) || base->d != target->d)
        return TT_EINVAL;
    tt_alignment_release(out);
    size_t nb = base->n, nt = target->n;
    tt_status st = TT_OK;
    size_t *pair_of_target = tt_malloc((nt ? nt : 1) * sizeof *pair_of_target);
    unsigned char *base_used = tt_calloc(nb ? nb : 1, 1);
    double *sim = tt_malloc((nt ? nt : 1) * sizeof *sim);
    sets bs = { NULL, NULL, NULL }, ts = { NULL, NULL, NULL };
    int ok_sets = sets_build(base, &bs) && sets_build(target, &ts);
    size_t *stamp = tt_malloc((nb ? nb : 1) * sizeof *stamp);
    mmap64 exact, shingles;
    int ok_e = mm_init(&exact, nb), ok_s = mm_init(&shingles, base->n_words + nb);
    if (!pair_of_target || !base_used || !sim || !ok_sets || !stamp || !ok_e || !ok_s) {
        st = TT_ENOMEM;
        goto done;
    }
    for (size_t i = 0; i < nb; i++)
        stamp[i] = SIZE_MAX;
    /* 1. the same word sequence */
    for (size_t i = 0; i < nb; i++)
        mm_add(&exact, base->v[i].hash, i, 0);
    for (size_t j = 0; j < nt; j++) {
        pair_of_target[j] = SIZE_MAX;
        size_t slot = mm_slot(&exact, target->v[j].hash);
        for (size_t e = exact.head[slot]; e != SIZE_MAX; e = exact.next[e]) {
            size_t i = exact.val[e];
            if (!base_used[i] && same_words(base, &base->v[i], target, &target->v[j])) {
                base_used[i] = 1;
                pair_of_target[j] = i;
                sim[j] = 1.0;
                break;
            }
        }
    }
    /* 2. similar sentences through shared word pairs */
    for (size_t i = 0; i < nb; i++) {
        if (base_used[i])
            continue;
        const uint32_t *w = base->words + base->v[i].words_off;
        size_t n = base->v[i].n_words;
        if (n == 1)
            mm_add(&shingles, shingle(w[0], UINT32_MAX), i, TT_CHANGES_SHINGLE_CAP);
        for (size_t k = 0; k + 1 < n; k++)
            mm_add(&shingles, shingle(w[k], w[k + 1]), i, TT_CHANGES_SHINGLE_CAP);
    }
    for (size_t j = 0; j < nt; j++) {
        if (pair_of_target[j] != SIZE_MAX)
            continue;
        const tt_sentence *t = &target->v[j];
        const uint32_t *w = target->words + t->words_off;
        const uint32_t *sa = ts.ids + ts.off[j];
        size_t nta = ts.len[j];
        double best = -1;
        size_t best_i = SIZE_MAX;
        size_t pairs = t->n_words > 1 ? t->n_words - 1 : 1;
        for (size_t k = 0; k < pairs; k++) {
            uint64_t key = t->n_words > 1 ? shingle(w[k], w[k + 1]) : shingle(w[0], UINT32_MAX);
            size_t slot = mm_slot(&shingles, key);
            if (shingles.count[slot] > TT_CHANGES_SHINGLE_CAP)
                continue; /* too common to tell sentences apart */
            for (size_t e = shingles.head[slot]; e != SIZE_MAX; e = shingles.next[e]) {
                size_t i = shingles.val[e];
                if (base_used[i] || stamp[i] == j)
                    continue;
                stamp[i] = j;
                double jv = jaccard(sa, nta, bs.ids + bs.off[i], bs.len[i]);
                if (jv > best || (jv == best && i < best_i)) {
                    best = jv;
                    best_i = i;
                }
            }
        }
        if (best_i != SIZE_MAX && best >= threshold) {
            base_used[best_i] = 1;
            pair_of_target[j] = best_i;
            sim[j] = best;
        }
    }
    /* the changes, the counts and the new words */
    for (size_t j = 0; j < nt && !st; j++) {
        const tt_sentence *t = &target->v[j];
        out->target_words += t->n_words;
        size_t i = pair_of_target[j];
        if (i == SIZE_MAX) {
            out->added++;
            out->new_words += t->n_words;
            st = emit(out, TT_CHANGE_ADDED, SIZE_MAX, j, 0.0);
            continue;
        }
        if (sim[j] == 1.0 && same_words(base, &base->v[i], target, t)) {
            out->unchanged++;
            st = emit(out, TT_CHANGE_UNCHANGED, i, j, 1.0);
            continue;
        }
        out->modified++;
        const uint32_t *sb = bs.ids + bs.off[i];
        size_t nba = bs.len[i];
        const uint32_t *w = target->words + t->words_off;
        for (size_t k = 0; k < t->n_words; k++)
            if (!bsearch(&w[k], sb, nba, sizeof *sb, cmp_u32))
                out->new_words++;
        st = emit(out, TT_CHANGE_MODIFIED, i, j, sim[j]);
    }
    for (size_t i = 0; i < nb && !st; i++)
        if (!base_used[i]) {
            out->removed++;
            st = emit(out, TT_CHANGE_REMOVED, i, SIZE_MAX, 0.0);
        }
    /* edit similarity: Levenshtein over the sentence sequences, a pair
     * aligned above counting as equal; O(nb × nt) time, one row of space */
    if (!st) {
        if (nb == 0 && nt == 0) {
            out->edit_similarity = 1.0;
        } else {
            size_t *row = tt_malloc((nt + 1) * sizeof *row);
            if (!row) {
                st = TT_ENOMEM;
                goto done;
            }
            for (size_t j = 0; j <= nt; j++)
                row[j] = j;
            for (size_t i = 1; i <= nb; i++) {
                size_t diag = row[0];
                row[0] = i;
                for (size_t j = 1; j <= nt; j++) {
                    size_t up = row[j];
                    size_t cost = pair_of_target[j - 1] == i - 1 ? 0 : 1;
                    size_t best = diag + cost;
                    if (up + 1 < best)
                        best = up + 1;
                    if (row[j - 1] + 1 < best)
                        best = row[j - 1] + 1;
                    row[j] = best;
                    diag = up;
                }
            }
            out->edit_similarity = 1.0 - (double)row[nt] / (double)(nb > nt ? nb : nt);
            tt_free(row);
        }
    }
done:
    tt_free(pair_of_target);
    tt_free(base_used);
    tt_free(sim);
    sets_free(&bs);
    sets_free(&ts);
    tt_free(stamp);
    mm_free(&exact);
    mm_free(&shingles);
    if (st)
        tt_alignment_release(out);
    return st;
}

tt_status tt_sentence_words_missing(const tt_sentence_list *from, const tt_sentence *t,
                                    const tt_sentence_list *in, const tt_sentence *s,
                                    char **out)
{
    *out = NULL;
    tt_buf b;
    tt_buf_init(&b, 0);
    uint32_t *set = tt_malloc((s->n_words ? s->n_words : 1) * sizeof *set);
    if (!set)
        return TT_ENOMEM;
    size_t n = word_set(in, s, set);
    tt_status st = TT_OK;
    const uint32_t *w = from->words + t->words_off;
    for (size_t k = 0; k < t->n_words && !st; k++) {
        if (bsearch(&w[k], set, n, sizeof *set, cmp_u32))
            continue;
        const char *word = from->d->words[w[k]];
        if (b.len)
            st = tt_buf_putc(&b, ' ');
        if (!st)
            st = tt_buf_append(&b, word, strlen(word));
    }
    if (!st)
        st = tt_buf_putc(&b, '\0');
    tt_free(set);
    if (st) {
        tt_buf_release(&b);
        return st;
    }
    *out = b.data;
    return TT_OK;
}

void tt_sentence_lists_similarity(const tt_sentence_list *a, const tt_sentence_list *b,
                                  double *cosine, double *jaccard_out)
{
    /* counts per word id on each side, over the shared dictionary */
    size_t n = a->d->n;
    uint32_t *ca = tt_calloc(n ? n : 1, sizeof *ca), *cb = tt_calloc(n ? n : 1, sizeof *cb);
    if (!ca || !cb) {
        tt_free(ca);
        tt_free(cb);
        *cosine = *jaccard_out = -1;
        return;
    }
    for (size_t i = 0; i < a->n_words; i++)
        ca[a->words[i]]++;
    for (size_t i = 0; i < b->n_words; i++)
        cb[b->words[i]]++;
    double dot = 0, na = 0, nb = 0;
    size_t both = 0, any = 0;
    for (size_t i = 0; i < n; i++) {
        dot += (double)ca[i] * (double)cb[i];
        na += (double)ca[i] * (double)ca[i];
        nb += (double)cb[i] * (double)cb[i];
        both += ca[i] && cb[i];
        any += ca[i] || cb[i];
    }
    *cosine = na > 0 && nb > 0 ? dot / (sqrt(na) * sqrt(nb)) : (na == nb ? 1.0 : 0.0);
    *jaccard_out = any ? (double)both / (double)any : 1.0;
    tt_free(ca);
    tt_free(cb);
}
