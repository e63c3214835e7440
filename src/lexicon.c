/* termtide — lexicon loading and lookup.
 *
 * Entries live in one array; three term tables (words, stems, phrases) map
 * a normalized key to the index + 1 of its first entry, and entries with the
 * same key and kind are chained through `next`, so a lookup is one hash
 * probe plus a walk of the (short) chain. Keys are normalized with
 * tt_normalize, stems made with the Snowball English stemmer, phrases
 * joined by single spaces: the same forms the counter produces, so a match
 * is a byte comparison. Loading is O(bytes); lookups O(1) expected. */
#include <math.h>
#include <stdlib.h>

#include "termtide/filter.h"
#include "termtide/lexicon.h"
#include "termtide/normalize.h"
#include "termtide/source.h"
#include "termtide/termtable.h"
#include "tt_internal.h"

typedef struct entry {
    tt_lexicon_entry pub;
    char *key;
    char *written;
    size_t next; /* index + 1 of the next entry with the same key, 0 = none */
} entry;

struct tt_lexicon {
    entry *entries;
    size_t n, cap;
    char **categories;
    size_t n_categories;
    tt_termtable *index[3]; /* by tt_lexicon_kind */
    size_t max_phrase_words;
    char name[256], version[64], made[512];
};

tt_lexicon *tt_lexicon_new(void)
{
    tt_lexicon *lex = tt_calloc(1, sizeof *lex);
    if (!lex)
        return NULL;
    for (int k = 0; k < 3; k++)
        if (!(lex->index[k] = tt_termtable_new())) {
            tt_lexicon_free(lex);
            return NULL;
        }
    return lex;
}

void tt_lexicon_free(tt_lexicon *lex)
{
    if (!lex)
        return;
    for (size_t i = 0; i < lex->n; i++) {
        tt_free(lex->entries[i].key);
        tt_free(lex->entries[i].written);
    }
    tt_free(lex->entries);
    for (size_t i = 0; i < lex->n_categories; i++)
        tt_free(lex->categories[i]);
    tt_free(lex->categories);
    for (int k = 0; k < 3; k++)
        tt_termtable_free(lex->index[k]);
    tt_free(lex);
}

const char *tt_lexicon_name(const tt_lexicon *lex) { return lex->name; }
const char *tt_lexicon_version(const tt_lexicon *lex) { return lex->version; }
const char *tt_lexicon_made(const tt_lexicon *lex) { return lex->made; }
size_t tt_lexicon_category_count(const tt_lexicon *lex) { return lex->n_categories; }
size_t tt_lexicon_entry_count(const tt_lexicon *lex) { return lex->n; }
size_t tt_lexicon_max_phrase_words(const tt_lexicon *lex) { return lex->max_phrase_words; }
int tt_lexicon_has_stems(const tt_lexicon *lex) { return tt_termtable_distinct(lex->index[TT_LEXICON_STEM]) > 0; }

const char *tt_lexicon_category_name(const tt_lexicon *lex, size_t i)
{
    return i < lex->n_categories ? lex->categories[i] : NULL;
}

const tt_lexicon_entry *tt_lexicon_entry_at(const tt_lexicon *lex, size_t i)
{
    return i < lex->n ? &lex->entries[i].pub : NULL;
}

long tt_lexicon_category_find(const tt_lexicon *lex, const char *name, tt_error *err)
{
    for (size_t i = 0; i < lex->n_categories; i++)
        if (!strcmp(lex->categories[i], name))
            return (long)i;
    tt_buf known;
    tt_buf_init(&known, 4096);
    for (size_t i = 0; i < lex->n_categories; i++) {
        if (i)
            tt_buf_puts(&known, ", ");
        tt_buf_puts(&known, lex->categories[i]);
    }
    tt_error_set(err, TT_EINVAL, NULL, -1, "unknown category \"%s\" (the lexicon has: %s)", name,
                 known.len ? known.data : "none");
    tt_buf_release(&known);
    return -1;
}

size_t tt_lexicon_match(const tt_lexicon *lex, tt_lexicon_kind kind, const char *key,
                        size_t len, size_t *out, size_t max)
{
    uint64_t first = tt_termtable_get(lex->index[kind], key, len);
    size_t n = 0;
    for (size_t i = (size_t)first; i; i = lex->entries[i - 1].next) {
        if (n < max)
            out[n] = i - 1;
        n++;
    }
    return n;
}

size_t tt_lexicon_conflicts(const tt_lexicon *lex, size_t (*pairs)[2], size_t max)
{
    size_t n = 0;
    for (size_t i = 0; i < lex->n; i++)
        for (size_t j = lex->entries[i].next; j; j = lex->entries[j - 1].next) {
            if (n < max) {
                pairs[n][0] = i;
                pairs[n][1] = j - 1;
            }
            n++;
        }
    return n;
}

/* ---- loading ---------------------------------------------------------- */

static int valid_utf8(const char *s, size_t n)
{
    size_t i = 0;
    while (i < n) {
        uint32_t cp;
        size_t k = tti_utf8_decode((const unsigned char *)s + i, n - i, &cp);
        if (cp == 0xFFFD && !(k == 3 && (unsigned char)s[i] == 0xEF &&
                              (unsigned char)s[i + 1] == 0xBF && (unsigned char)s[i + 2] == 0xBD))
            return 0;
        i += k;
    }
    return 1;
}

static int category_name_ok(const char *s, size_t n)
{
    if (!n)
        return 0;
    for (size_t i = 0; i < n; i++) {
        char c = s[i];
        if (!((c >= 'a' && c <= 'z') || (c >= '0' && c <= '9') || c == '-' || c == '_'))
            return 0;
    }
    return 1;
}

static void header_value(tt_lexicon *lex, const char *s, size_t n)
{
    /* "# key: value" */
    size_t i = 1;
    while (i < n && s[i] == ' ')
        i++;
    static const struct { const char *key; size_t off, size; } keys[] = {
        { "name:", offsetof(tt_lexicon, name), sizeof ((tt_lexicon *)0)->name },
        { "version:", offsetof(tt_lexicon, version), sizeof ((tt_lexicon *)0)->version },
        { "made:", offsetof(tt_lexicon, made), sizeof ((tt_lexicon *)0)->made },
    };
    for (size_t k = 0; k < 3; k++) {
        size_t kl = strlen(keys[k].key);
        if (n - i >= kl && !memcmp(s + i, keys[k].key, kl)) {
            size_t v = i + kl;
            while (v < n && s[v] == ' ')
                v++;
            char *dst = (char *)lex + keys[k].off;
            size_t len = n - v < keys[k].size - 1 ? n - v : keys[k].size - 1;
            memcpy(dst, s + v, len);
            dst[len] = '\0';
        }
    }
}

typedef struct loader {
    tt_lexicon *lex;
    tt_normalizer norm;
    tt_stemmer *stemmer;
    tt_buf word, key, stem;
} loader;

static tt_status category_index(tt_lexicon *lex, const char *s, size_t n, size_t *out)
{
    for (size_t i = 0; i < lex->n_categories; i++)
        if (strlen(lex->categories[i]) == n && !memcmp(lex->categories[i], s, n)) {
            *out = i;
            return TT_OK;
        }
    char **c = tt_reallocarray(lex->categories, lex->n_categories + 1, sizeof *c);
    if (!c)
        return TT_ENOMEM;
    lex->categories = c;
    if (!(c[lex->n_categories] = tt_strndup(s, n)))
        return TT_ENOMEM;
    *out = lex->n_categories++;
    return TT_OK;
}

/* Builds the key of a term into L->key; *kind and *words set. */
static tt_status make_key(loader *L, const char *t, size_t n, tt_lexicon_kind *kind, size_t *words,
                          const char **why)
{
    tt_buf_reset(&L->key);
    *words = 0;
    int star = n > 0 && t[n - 1] == '*';
    if (star)
        n--;
    if (memchr(t, '*', n)) {
        *why = "'*' may only end a single word";
        return TT_EPARSE;
    }
    size_t i = 0;
    while (i < n) {
        while (i < n && t[i] == ' ')
            i++;
        size_t j = i;
        while (j < n && t[j] != ' ')
            j++;
        if (j == i)
            break;
        tt_status st = tt_normalize(&L->norm, t + i, j - i, &L->word);
        if (st)
            return st;
        if (L->word.len == 0) {
            *why = "a word of the term is empty once normalized";
            return TT_EPARSE;
        }
        if (L->word.len > TT_LIMIT_LEXICON_WORD_BYTES) {
            *why = "a word longer than TT_LIMIT_LEXICON_WORD_BYTES (64) bytes once normalized";
            return TT_EPARSE;
        }
        if (*words && (st = tt_buf_putc(&L->key, ' ')) != TT_OK)
            return st;
        if ((st = tt_buf_append(&L->key, L->word.data, L->word.len)) != TT_OK)
            return st;
        (*words)++;
        i = j;
    }
    if (*words == 0) {
        *why = "empty term";
        return TT_EPARSE;
    }
    if (*words > TT_LIMIT_LEXICON_PHRASE_WORDS) {
        *why = "a phrase of more than TT_LIMIT_LEXICON_PHRASE_WORDS words";
        return TT_EPARSE;
    }
    if (star && *words > 1) {
        *why = "'*' (match by stem) applies to a single word, not a phrase";
        return TT_EPARSE;
    }
    *kind = star ? TT_LEXICON_STEM : *words > 1 ? TT_LEXICON_PHRASE : TT_LEXICON_WORD;
    if (star) {
        if (!L->stemmer && !(L->stemmer = tt_stemmer_new()))
            return TT_ENOMEM;
        tt_status st = tt_stem(L->stemmer, L->key.data, L->key.len, &L->stem);
        if (st)
            return st;
        tt_buf_reset(&L->key);
        if ((st = tt_buf_append(&L->key, L->stem.data, L->stem.len)) != TT_OK)
            return st;
    }
    return TT_OK;
}

static tt_status add_entry(loader *L, tt_lexicon_kind kind, size_t words, size_t category,
                           double weight, long line, const char *written, size_t written_len)
{
    tt_lexicon *lex = L->lex;
    if (lex->n == lex->cap) {
        size_t cap = lex->cap ? lex->cap * 2 : 256;
        entry *e = tt_reallocarray(lex->entries, cap, sizeof *e);
        if (!e)
            return TT_ENOMEM;
        lex->entries = e;
        lex->cap = cap;
    }
    entry *e = &lex->entries[lex->n];
    memset(e, 0, sizeof *e);
    if (!(e->key = tt_strndup(L->key.data, L->key.len)))
        return TT_ENOMEM;
    if (!(e->written = tt_strndup(written, written_len))) {
        tt_free(e->key);
        return TT_ENOMEM;
    }
    e->pub.term = e->key;
    e->pub.written = e->written;
    e->pub.kind = kind;
    e->pub.category = category;
    e->pub.weight = weight;
    e->pub.line = line;
    uint64_t first = tt_termtable_get(lex->index[kind], e->key, L->key.len);
    if (first) {
        size_t i = (size_t)first;
        while (lex->entries[i - 1].next)
            i = lex->entries[i - 1].next;
        lex->entries[i - 1].next = lex->n + 1;
    } else {
        tt_status st = tt_termtable_add(lex->index[kind], e->key, L->key.len, lex->n + 1);
        if (st) {
            tt_free(e->key);
            tt_free(e->written);
            return st;
        }
    }
    lex->n++;
    if (kind == TT_LEXICON_PHRASE && words > lex->max_phrase_words)
        lex->max_phrase_words = words;
    return TT_OK;
}

tt_status tt_lexicon_load_text(tt_lexicon *lex, const char *text, size_t len, const char *name,
                               tt_error *err)
{
    loader L;
    memset(&L, 0, sizeof L);
    L.lex = lex;
    tt_normalizer_init(&L.norm);
    tt_buf_init(&L.word, 0);
    tt_buf_init(&L.key, 0);
    tt_buf_init(&L.stem, 0);
    size_t n_before = lex->n, cats_before = lex->n_categories;
    tt_status st = TT_OK;
    long line = 0;
    size_t pos = 0;
    if (len >= 3 && !memcmp(text, "\xEF\xBB\xBF", 3))
        pos = 3;
    while (pos < len && st == TT_OK) {
        const char *nl = memchr(text + pos, '\n', len - pos);
        size_t end = nl ? (size_t)(nl - text) : len;
        const char *s = text + pos;
        size_t n = end - pos;
        pos = end + 1;
        line++;
        if (n && s[n - 1] == '\r')
            n--;
        if (n > TT_LIMIT_LEXICON_LINE) {
            st = tt_error_set_line(err, TT_ELIMIT, name, line,
                                   "line longer than %d bytes (TT_LIMIT_LEXICON_LINE)",
                                   TT_LIMIT_LEXICON_LINE);
            break;
        }
        if (!valid_utf8(s, n)) {
            st = tt_error_set_line(err, TT_EPARSE, name, line, "invalid UTF-8");
            break;
        }
        size_t ctl = 0;
        while (ctl < n && ((unsigned char)s[ctl] >= 0x20 || s[ctl] == '\t'))
            ctl++;
        if (ctl < n) {
            st = tt_error_set_line(err, TT_EPARSE, name, line, "control character (byte 0x%02X)",
                                   (unsigned char)s[ctl]);
            break;
        }
        size_t b = 0;
        while (b < n && (s[b] == ' ' || s[b] == '\t'))
            b++;
        if (b == n)
            continue;
        if (s[b] == '#') {
            header_value(lex, s + b, n - b);
            continue;
        }
        const char *f[4];
        size_t fl[4], nf = 0, start = 0;
        for (size_t i = 0; i <= n && nf < 4; i++)
            if (i == n || s[i] == '\t') {
                f[nf] = s + start;
                fl[nf] = i - start;
                nf++;
                start = i + 1;
            }
        if (nf < 2 || nf > 3 || start <= n) {
            st = tt_error_set_line(err, TT_EPARSE, name, line,
                                   "expected term<TAB>category[<TAB>weight]");
            break;
        }
        while (fl[1] && f[1][fl[1] - 1] == ' ')
            fl[1]--;
        if (!category_name_ok(f[1], fl[1])) {
            st = tt_error_set_line(err, TT_EPARSE, name, line,
                                   "category \"%.*s\": use lower-case letters, digits, - and _",
                                   (int)fl[1], f[1]);
            break;
        }
        double weight = 1.0;
        if (nf == 3) {
            char num[64];
            char *endp;
            if (fl[2] == 0 || fl[2] >= sizeof num) {
                st = tt_error_set_line(err, TT_EPARSE, name, line, "empty or overlong weight");
                break;
            }
            memcpy(num, f[2], fl[2]);
            num[fl[2]] = '\0';
            weight = strtod(num, &endp);
            if (*endp != '\0' || !isfinite(weight) || !(weight > 0)) {
                st = tt_error_set_line(err, TT_EPARSE, name, line,
                                       "weight \"%s\" is not a positive number", num);
                break;
            }
        }
        tt_lexicon_kind kind;
        size_t words, cat;
        const char *why = NULL;
        st = make_key(&L, f[0], fl[0], &kind, &words, &why);
        if (st == TT_EPARSE) {
            tt_error_set_line(err, st, name, line, "%s", why);
            break;
        }
        if (!st)
            st = category_index(lex, f[1], fl[1], &cat);
        if (!st)
            st = add_entry(&L, kind, words, cat, weight, line, f[0], fl[0]);
        if (st)
            tt_error_set_line(err, st, name, line, "%s", tt_status_name(st));
    }
    if (st == TT_OK && lex->n == n_before)
        st = tt_error_set(err, TT_EINVAL, name, -1, "the lexicon has no entries");
    if (st) {
        /* Roll back this text: drop its entries from the chains and indexes
         * by rebuilding the indexes from the entries kept. */
        for (size_t i = n_before; i < lex->n; i++) {
            tt_free(lex->entries[i].key);
            tt_free(lex->entries[i].written);
        }
        lex->n = n_before;
        for (size_t i = cats_before; i < lex->n_categories; i++)
            tt_free(lex->categories[i]);
        lex->n_categories = cats_before;
        for (int k = 0; k < 3; k++)
            tt_termtable_reset(lex->index[k]);
        for (size_t i = 0; i < lex->n; i++) {
            lex->entries[i].next = 0;
            entry *e = &lex->entries[i];
            size_t kl = strlen(e->key);
            uint64_t first = tt_termtable_get(lex->index[e->pub.kind], e->key, kl);
            if (first) {
                size_t j = (size_t)first;
                while (lex->entries[j - 1].next)
                    j = lex->entries[j - 1].next;
                lex->entries[j - 1].next = i + 1;
            } else if (tt_termtable_add(lex->index[e->pub.kind], e->key, kl, i + 1)) {
                st = TT_ENOMEM;
            }
        }
    }
    tt_normalizer_release(&L.norm);
    tt_stemmer_free(L.stemmer);
    tt_buf_release(&L.word);
    tt_buf_release(&L.key);
    tt_buf_release(&L.stem);
    return st;
}

/* The shipped lexicons, compiled in from lexicons/ by tools/embed.c
 * (tti_lexicon_files, declared in tt_internal.h). */

const char *tt_builtin_lexicon(const char *name)
{
    for (size_t i = 0; tti_lexicon_files[i].name; i++)
        if (!strcmp(tti_lexicon_files[i].name, name))
            return tti_lexicon_files[i].text;
    return NULL;
}

tt_status tt_lexicon_load_file(tt_lexicon *lex, const char *path, tt_error *err)
{
    tt_buf raw;
    tt_buf_init(&raw, 0);
    tt_status st = tt_source_read(path, &raw, NULL, err);
    if (!st)
        st = tt_lexicon_load_text(lex, raw.data, raw.len, path, err);
    tt_buf_release(&raw);
    return st;
}
