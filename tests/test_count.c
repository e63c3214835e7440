/* Tests of counting one document (src/count.c): unigrams, n-grams that
 * never cross a sentence or block and never start or end with a stop-word,
 * numbers left out or kept, minimum length, stemming, count classes, and
 * the token caches giving exactly the terms of the slow path. */
#include "tt_test.h"
#include "tt_test_termtable.h"

#include "termtide/alloc.h"
#include "termtide/count.h"
#include "termtide/extract.h"
#include "termtide/filter.h"
#include "termtide/normalize.h"
#include "termtide/segment.h"

static tt_termtable *stop_set(void)
{
    tt_termtable *s = tt_termtable_new();
    const char *list = "# test list\nthe\nof\nand\na\nin\n";
    tt_error err;
    tt_error_init(&err);
    assert_int_equal(tt_stopwords_load_text(s, list, strlen(list), "test", &err), TT_OK);
    return s;
}

static tt_termtable *count(const char *text, tt_count_options *o, tt_doc_stats *st)
{
    tt_counter *c = tt_counter_new(o);
    assert_non_null(c);
    tt_termtable *t = tt_termtable_new();
    memset(st, 0, sizeof *st);
    assert_int_equal(tt_counter_count_text(c, text, strlen(text), t, st), TT_OK);
    tt_counter_free(c);
    return t;
}

#define GET(t, s) tt_termtable_get((t), (s), strlen(s))

static void test_unigrams(void **state)
{
    (void)state;
    tt_count_options o;
    tt_count_options_init(&o);
    tt_termtable *stop = stop_set();
    o.stopwords = stop;
    tt_doc_stats st;
    tt_termtable *t = count("The company's off-balance-sheet debt rose 3.5% to $1,200 in 2025. "
                            "The Company’s debt of the COMPANY fell.",
                            &o, &st);
    assert_int_equal(GET(t, "company"), 3);
    assert_int_equal(GET(t, "off-balance-sheet"), 1);
    assert_int_equal(GET(t, "debt"), 2);
    assert_int_equal(GET(t, "the"), 0);
    assert_int_equal(GET(t, "2025"), 0);
    assert_int_equal(GET(t, "3.5"), 0);
    assert_int_equal(st.numbers, 3);
    assert_int_equal(st.stopwords, 5); /* The, in, The, of, the */
    assert_int_equal(st.words_read, 17);
    assert_int_equal(st.terms_kept, tt_termtable_total(t));
    assert_int_equal(st.sentences, 2);
    tt_termtable_free(t);

    o.keep_numbers = 1;
    t = count("Backlog 1,200 units; 3.5 percent.", &o, &st);
    assert_int_equal(GET(t, "1,200"), 1);
    assert_int_equal(GET(t, "3.5"), 1);
    tt_termtable_free(t);
    tt_termtable_free(stop);
}

static void test_ngrams(void **state)
{
    (void)state;
    tt_count_options o;
    tt_count_options_init(&o);
    tt_termtable *stop = stop_set();
    o.stopwords = stop;
    o.ngram_min = o.ngram_max = 2;
    tt_doc_stats st;
    tt_termtable *t = count("The supply chain held. Supply chain costs of the plant rose in "
                            "March 2025 revenue grew.",
                            &o, &st);
    assert_int_equal(GET(t, "supply chain"), 2);
    assert_int_equal(GET(t, "chain costs"), 1);
    assert_int_equal(GET(t, "chain held"), 1);
    assert_int_equal(GET(t, "held supply"), 0);   /* across a sentence end */
    assert_int_equal(GET(t, "the supply"), 0);    /* starts with a stop-word */
    assert_int_equal(GET(t, "costs of"), 0);      /* ends with a stop-word */
    assert_int_equal(GET(t, "march revenue"), 0); /* a left-out number breaks it */
    assert_int_equal(GET(t, "revenue grew"), 1);
    tt_termtable_free(t);

    o.ngram_min = o.ngram_max = 3;
    t = count("Cost of revenue rose; the cost of the revenue fell.", &o, &st);
    assert_int_equal(GET(t, "cost of revenue"), 1); /* stop-word inside is kept */
    assert_int_equal(GET(t, "of the revenue"), 0);
    tt_termtable_free(t);

    o.ngram_min = 1;
    o.ngram_max = 3;
    t = count("going concern doubt", &o, &st);
    assert_int_equal(GET(t, "going"), 1);
    assert_int_equal(GET(t, "going concern"), 1);
    assert_int_equal(GET(t, "going concern doubt"), 1);
    assert_int_equal(GET(t, "concern doubt"), 1);
    assert_int_equal(tt_termtable_total(t), 6);
    tt_termtable_free(t);
    tt_termtable_free(stop);
}

static void test_blocks_are_boundaries(void **state)
{
    (void)state;
    tt_blocks b;
    tt_blocks_init(&b);
    assert_int_equal(tt_blocks_add(&b, TT_BLOCK_CELL, "net", 3, 0), TT_OK);
    assert_int_equal(tt_blocks_add(&b, TT_BLOCK_CELL, "loss", 4, 10), TT_OK);
    tt_count_options o;
    tt_count_options_init(&o);
    o.ngram_min = 1;
    o.ngram_max = 2;
    tt_counter *c = tt_counter_new(&o);
    tt_termtable *t = tt_termtable_new();
    tt_doc_stats st;
    memset(&st, 0, sizeof st);
    assert_int_equal(tt_counter_count(c, &b, t, &st), TT_OK);
    assert_int_equal(GET(t, "net"), 1);
    assert_int_equal(GET(t, "loss"), 1);
    assert_int_equal(GET(t, "net loss"), 0);
    assert_int_equal(GET(t, "netloss"), 0);
    tt_termtable_free(t);
    tt_counter_free(c);
    tt_blocks_release(&b);
}

static void test_min_length_and_stem(void **state)
{
    (void)state;
    tt_count_options o;
    tt_count_options_init(&o);
    o.min_length = 3;
    tt_doc_stats st;
    tt_termtable *t = count("An ox ran to the shore; é é ångström", &o, &st);
    assert_int_equal(GET(t, "ox"), 0);
    assert_int_equal(GET(t, "ran"), 1);
    assert_int_equal(GET(t, "é"), 0);
    assert_int_equal(GET(t, "ångström"), 1);
    assert_int_equal(st.short_words, 5);
    tt_termtable_free(t);

    tt_count_options_init(&o);
    o.stem = 1;
    /* Porter2 stems as listed in the Snowball English vocabulary
     * (snowball-data voc.txt/output.txt): generously→generous,
     * settlements→settlement, settlement→settlement, liabilities→liabil. */
    t = count("settlements settlement liabilities generously", &o, &st);
    assert_int_equal(GET(t, "settlement"), 2);
    assert_int_equal(GET(t, "liabil"), 1);
    assert_int_equal(GET(t, "generous"), 1);
    tt_termtable_free(t);
}

static void test_classes(void **state)
{
    (void)state;
    /* counts 1,1,1,2,4,5,9,10,19,20,120 */
    uint64_t counts[] = { 120, 20, 19, 10, 9, 5, 4, 2, 1, 1, 1 };
    tt_term_entry e[11];
    for (int i = 0; i < 11; i++) {
        e[i].term = "x";
        e[i].len = 1;
        e[i].count = counts[i];
    }
    tt_count_class c[16];
    size_t k = tt_count_classes(e, 11, c, 16);
    /* classes 1 | 2-4 | 5-9 | 10-19 | 20-49 | 50-99 | 100-199 */
    assert_int_equal(k, 7);
    uint64_t want_terms[] = { 3, 2, 2, 2, 1, 0, 1 };
    uint64_t want_lower[] = { 1, 2, 5, 10, 20, 50, 100 };
    for (size_t i = 0; i < k; i++) {
        assert_int_equal(c[i].lower, want_lower[i]);
        assert_int_equal(c[i].terms, want_terms[i]);
    }
    /* a value on an edge goes to the higher class: 2 in 2-4, 5 in 5-9,
     * 10 in 10-19, 20 in 20-49 (common practice) */
    assert_int_equal(c[1].occurrences, 6);
    assert_int_equal(c[2].occurrences, 14);
    assert_int_equal(c[3].occurrences, 29);
    assert_int_equal(c[4].occurrences, 20);
}

/* ---- the token caches against the slow path ---- */

/* Appends one token shape: a word of len letters (a cycling alphabet, so
 * words of one length but another start differ), in a case pattern, with an
 * optional digit, underscore, hyphen, apostrophe or grave accent inside
 * or at the end. */
static void put_shape(tt_buf *b, size_t len, unsigned start, int casing, int extra)
{
    char w[320];
    size_t n = 0;
    for (size_t i = 0; i < len && n < sizeof w - 8; i++) {
        char ch = (char)('a' + (start + i * 7) % 26);
        if (casing == 1 || (casing == 2 && i % 2 == 1) || (casing == 3 && i == 0))
            ch = (char)(ch - 32);
        w[n++] = ch;
        if (i + 1 < len && i == len / 2) {
            switch (extra) {
            case 1: w[n++] = '7'; break;
            case 2: w[n++] = '_'; break;
            case 3: w[n++] = '-'; break;
            case 4: w[n++] = '\''; break;
            case 5: w[n++] = '`'; break;
            default: break;
            }
        }
    }
    if (extra == 6) {
        w[n++] = '\'';
        w[n++] = casing == 1 ? 'S' : 's';
    } else if (extra == 7) {
        w[n++] = '`';
        w[n++] = 's';
    } else if (extra == 8) {
        w[n++] = '-';
    }
    assert_int_equal(tt_buf_append(b, w, n), TT_OK);
}

/* The slow path, written out: every token of text through tt_normalize
 * (itself checked against Python's unicodedata in test_normalize.c), the
 * stop-word set and the minimum length, added to ref. */
static void slow_path(const char *text, size_t len, const tt_termtable *stop, size_t min_length,
                      tt_termtable *ref, uint64_t *stopwords, uint64_t *short_words)
{
    tt_normalizer nz;
    tt_buf term;
    tt_normalizer_init(&nz);
    tt_buf_init(&term, 0);
    tt_tokenizer tk;
    tt_token tok;
    tt_tokenizer_init(&tk, text, len);
    while (tt_tokenizer_next(&tk, &tok)) {
        if (tok.kind == TT_TOKEN_NUMBER)
            continue;
        assert_int_equal(tt_normalize(&nz, text + tok.off, tok.len, &term), TT_OK);
        if (term.len == 0)
            continue;
        if (tt_termtable_get(stop, term.data, term.len))
            ++*stopwords;
        else if (tt_utf8_length(term.data, term.len) < min_length)
            ++*short_words;
        else
            assert_int_equal(tt_termtable_add(ref, term.data, term.len, 1), TT_OK);
    }
    tt_buf_release(&term);
    tt_normalizer_release(&nz);
}

static void assert_same_table(const tt_termtable *got, const tt_termtable *want)
{
    tt_test_same_table(got, want, "against the slow path");
}

/* Every ASCII token shape — lower, upper, mixed and capitalised case;
 * digits, underscores, hyphens, apostrophes, graves inside; possessives and
 * trailing hyphens; lengths 1 to 40 (around the ASCII cache's 16-byte key
 * and the general cache's 24), and 300 (longer than a token may be) — plus
 * stop-words in every case and a few non-ASCII words, each occurring many
 * times so that the caches answer most of them: the counter's table and
 * tallies must equal the slow path's. Twice: as one text, where most tokens
 * have 16 readable bytes after them, and one token per text, where none has. */
static void test_caches_match_slow_path(void **state)
{
    (void)state;
    tt_termtable *stop = stop_set();
    tt_buf text;
    tt_buf_init(&text, 0);
    static const size_t lens[] = { 1,  2,  3,  4,  5,  7,  8,  9,  12, 14, 15, 16,
                                   17, 18, 20, 22, 23, 24, 25, 26, 30, 40, 300 };
    static const char *extras[] = { "The", "THE", "tHe", "of", "Of", "AND", "a", "A", "In",
                                    "company\xe2\x80\x99s", "Company\xe2\x80\x99S",
                                    "\xc3\xa9tude", "\xc3\x89TUDE", "year\xe2\x80\x93" "end" };
    for (int round = 0; round < 3; round++) {
        for (size_t li = 0; li < sizeof lens / sizeof lens[0]; li++)
            for (unsigned start = 0; start < 3; start++)
                for (int casing = 0; casing < 4; casing++)
                    for (int extra = 0; extra < 9; extra++) {
                        put_shape(&text, lens[li], start + (unsigned)round % 2, casing, extra);
                        assert_int_equal(tt_buf_putc(&text, (extra + casing) % 5 ? ' ' : '\n'),
                                         TT_OK);
                    }
        for (size_t i = 0; i < sizeof extras / sizeof extras[0]; i++) {
            assert_int_equal(tt_buf_append(&text, extras[i], strlen(extras[i])), TT_OK);
            assert_int_equal(tt_buf_append(&text, ". ", 2), TT_OK);
        }
    }

    for (size_t min_length = 1; min_length <= 3; min_length += 2) {
        tt_count_options o;
        tt_count_options_init(&o);
        o.stopwords = stop;
        o.min_length = min_length;
        tt_termtable *ref = tt_termtable_new();
        uint64_t stopwords = 0, short_words = 0;
        slow_path(text.data, text.len, stop, min_length, ref, &stopwords, &short_words);

        tt_counter *c = tt_counter_new(&o);
        assert_non_null(c);
        tt_termtable *got = tt_termtable_new();
        tt_doc_stats st;
        memset(&st, 0, sizeof st);
        assert_int_equal(tt_counter_count_text(c, text.data, text.len, got, &st), TT_OK);
        assert_same_table(got, ref);
        assert_int_equal(st.stopwords, stopwords);
        assert_int_equal(st.short_words, short_words);
        assert_int_equal(st.terms_kept, tt_termtable_total(ref));
        tt_termtable_free(got);

        /* One token per text, through the same counter (its caches warm):
         * no token has bytes after it to read. */
        got = tt_termtable_new();
        memset(&st, 0, sizeof st);
        tt_tokenizer tk;
        tt_token tok;
        tt_tokenizer_init(&tk, text.data, text.len);
        while (tt_tokenizer_next(&tk, &tok)) {
            char *one = tt_malloc(tok.len); /* exactly the token: ASan sees any overread */
            assert_non_null(one);
            memcpy(one, text.data + tok.off, tok.len);
            assert_int_equal(tt_counter_count_text(c, one, tok.len, got, &st), TT_OK);
            tt_free(one);
        }
        assert_same_table(got, ref);
        assert_int_equal(st.stopwords, stopwords);
        assert_int_equal(st.short_words, short_words);
        tt_termtable_free(got);
        tt_counter_free(c);
        tt_termtable_free(ref);
    }
    tt_buf_release(&text);
    tt_termtable_free(stop);
}

/* ---- pending hits in the ASCII cache ---- */

/* A text of n tokens drawn from a vocabulary of vocab random ASCII words
 * (1 to 16 letters, some capitalised or upper-case, stop-words among
 * them), skewed so that a few words are common and most are rare: far more
 * words than the ASCII cache has ways, so ways holding pending hits are
 * evicted all the time. A fixed seed; an LCG (Knuth's MMIX constants). */
static void zipfish_text(tt_buf *b, size_t n, size_t vocab, uint64_t seed)
{
    uint64_t x = seed;
#define NEXT() (x = x * 6364136223846793005ULL + 1442695040888963407ULL, x >> 33)
    static const char *stops[] = { "the", "The", "of", "and", "A", "in" };
    for (size_t i = 0; i < n; i++) {
        double u = (double)NEXT() / 2147483648.0;
        size_t w = (size_t)((double)vocab * u * u * u); /* skewed to small ids */
        if (w < 6) {
            assert_int_equal(tt_buf_append(b, stops[w], strlen(stops[w])), TT_OK);
        } else {
            uint64_t y = w * 0x9E3779B97F4A7C15ULL;
            size_t len = 1 + (size_t)(y >> 60);
            int casing = (int)((y >> 56) & 3);
            for (size_t k = 0; k < len; k++) {
                char ch = (char)('a' + (y >> (k * 3 % 50)) % 26);
                if (casing == 1 || (casing == 2 && k == 0))
                    ch = (char)(ch - 32);
                assert_int_equal(tt_buf_putc(b, ch), TT_OK);
            }
        }
        assert_int_equal(tt_buf_putc(b, NEXT() % 13 ? ' ' : '\n'), TT_OK);
    }
#undef NEXT
}

/* The library's internal hook (src/tt_internal.h): how many tokens the
 * counter takes between flushes of the hits it holds. */
void tti_counter_set_flush_every(tt_counter *c, uint64_t tokens);

static int fail_allocs; /* allocations left before the test allocator fails */
static void *failing_malloc(size_t n) { return fail_allocs-- > 0 ? malloc(n) : NULL; }
static void *failing_realloc(void *p, size_t n) { return fail_allocs-- > 0 ? realloc(p, n) : NULL; }

/* Hits held in the cache reach the table: with ways evicted while holding
 * hits, a counter reused for a second table (nothing of the first leaks
 * into it), and after a failed count (out of memory while entering a term:
 * the held hits are dropped with that table, the next table is exact). The
 * reference is the slow path above. */
static void test_pending_hits(void **state)
{
    (void)state;
    tt_termtable *stop = stop_set();
    tt_count_options o;
    tt_count_options_init(&o);
    o.stopwords = stop;
    tt_counter *c = tt_counter_new(&o);
    assert_non_null(c);
    tt_buf one, two;
    tt_buf_init(&one, 0);
    tt_buf_init(&two, 0);
    zipfish_text(&one, 300000, 60000, 1);
    zipfish_text(&two, 200000, 40000, 2);
    for (int round = 0; round < 2; round++) {
        const tt_buf *t = round ? &two : &one;
        tt_termtable *ref = tt_termtable_new(), *got = tt_termtable_new();
        uint64_t stopwords = 0, short_words = 0;
        slow_path(t->data, t->len, stop, 1, ref, &stopwords, &short_words);
        assert_true(tt_termtable_distinct(ref) > 20000); /* many more than the cache's ways */
        tt_doc_stats st;
        memset(&st, 0, sizeof st);
        assert_int_equal(tt_counter_count_text(c, t->data, t->len, got, &st), TT_OK);
        assert_same_table(got, ref);
        assert_int_equal(st.terms_kept, tt_termtable_total(ref));
        assert_int_equal(st.stopwords, stopwords);
        tt_termtable_free(got);
        tt_termtable_free(ref);
    }

    /* Held hits flushed to the table part-way through a text, as the fused
     * path does every FUSED_FLUSH tokens (src/count.c), here every few
     * windows and every window: nothing counted twice or lost. */
    for (int every = 0; every < 2; every++) {
        tti_counter_set_flush_every(c, every ? 1 : 200);
        tt_termtable *ref = tt_termtable_new(), *got = tt_termtable_new();
        uint64_t stopwords = 0, short_words = 0;
        slow_path(one.data, one.len, stop, 1, ref, &stopwords, &short_words);
        tt_doc_stats st;
        memset(&st, 0, sizeof st);
        assert_int_equal(tt_counter_count_text(c, one.data, one.len, got, &st), TT_OK);
        assert_same_table(got, ref);
        assert_int_equal(st.terms_kept, tt_termtable_total(ref));
        tt_termtable_free(got);
        tt_termtable_free(ref);
    }
    tti_counter_set_flush_every(c, (uint64_t)1 << 31);

    /* A count that runs out of memory part-way, then the second text again. */
    tt_termtable *failed = tt_termtable_new();
    tt_doc_stats st;
    memset(&st, 0, sizeof st);
    static const tt_allocator failing = { failing_malloc, failing_realloc, free };
    fail_allocs = 3;
    tt_set_allocator(&failing);
    tt_status s = tt_counter_count_text(c, one.data, one.len, failed, &st);
    tt_set_allocator(NULL);
    assert_int_equal(s, TT_ENOMEM);
    tt_termtable_free(failed);
    tt_termtable *ref = tt_termtable_new(), *got = tt_termtable_new();
    uint64_t stopwords = 0, short_words = 0;
    slow_path(two.data, two.len, stop, 1, ref, &stopwords, &short_words);
    memset(&st, 0, sizeof st);
    assert_int_equal(tt_counter_count_text(c, two.data, two.len, got, &st), TT_OK);
    assert_same_table(got, ref);
    tt_termtable_free(got);
    tt_termtable_free(ref);

    tt_counter_free(c);
    tt_buf_release(&one);
    tt_buf_release(&two);
    tt_termtable_free(stop);
}

/* A running total (the counter holds kept terms' hits from one document to
 * the next, as count --total does): each document's own figures (kept
 * terms, stop-words, short words) must be the slow path's for that
 * document, though the hits of the stop-words and short words stay in the
 * cache until the document's call ends, and the table after the flush the
 * slow path's for all of them. Five documents of a skewed vocabulary, in
 * blocks of a few hundred tokens, with stop-words and a minimum length. */
tt_status tti_counter_count_held(tt_counter *c, const tt_blocks *blocks, tt_termtable *table,
                                 tt_doc_stats *stats);
tt_status tti_counter_flush(tt_counter *c, tt_termtable *table);

static void test_running_total_figures(void **state)
{
    (void)state;
    tt_termtable *stop = stop_set();
    tt_count_options o;
    tt_count_options_init(&o);
    o.stopwords = stop;
    o.min_length = 3;
    tt_counter *c = tt_counter_new(&o);
    assert_non_null(c);
    tt_termtable *total = tt_termtable_new(), *ref_total = tt_termtable_new();
    for (int doc = 0; doc < 5; doc++) {
        tt_buf text;
        tt_buf_init(&text, 0);
        zipfish_text(&text, 20000 + 7000 * (size_t)doc, 30000, 10 + (uint64_t)doc);
        for (size_t i = 0; i < text.len; i++)
            if (text.data[i] == '\n')
                text.data[i] = ' ';
        tt_termtable *ref = tt_termtable_new();
        uint64_t stopwords = 0, short_words = 0;
        slow_path(text.data, text.len, stop, 3, ref, &stopwords, &short_words);
        slow_path(text.data, text.len, stop, 3, ref_total, &stopwords, &short_words);
        stopwords /= 2;
        short_words /= 2;
        tt_blocks b;
        tt_blocks_init(&b);
        for (size_t at = 0; at < text.len;) {
            size_t n = text.len - at < 1500 ? text.len - at : 1500;
            while (at + n < text.len && text.data[at + n] != ' ')
                n++; /* blocks end between words */
            assert_int_equal(tt_blocks_add(&b, TT_BLOCK_PARAGRAPH, text.data + at, n, 0), TT_OK);
            at += n;
        }
        tt_doc_stats st;
        memset(&st, 0, sizeof st);
        assert_int_equal(tti_counter_count_held(c, &b, total, &st), TT_OK);
        assert_int_equal(st.stopwords, stopwords);
        assert_int_equal(st.short_words, short_words);
        assert_int_equal(st.terms_kept, tt_termtable_total(ref));
        tt_blocks_release(&b);
        tt_termtable_free(ref);
        tt_buf_release(&text);
    }
    assert_int_equal(tti_counter_flush(c, total), TT_OK);
    tt_test_same_table(total, ref_total, "running total");
    tt_termtable_free(total);
    tt_termtable_free(ref_total);
    tt_counter_free(c);
    tt_termtable_free(stop);
}

static void test_bad_options(void **state)
{
    (void)state;
    tt_count_options o;
    tt_count_options_init(&o);
    o.ngram_max = 4;
    assert_null(tt_counter_new(&o));
    o.ngram_max = 1;
    o.ngram_min = 2;
    assert_null(tt_counter_new(&o));
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_unigrams),
        cmocka_unit_test(test_ngrams),
        cmocka_unit_test(test_blocks_are_boundaries),
        cmocka_unit_test(test_min_length_and_stem),
        cmocka_unit_test(test_classes),
        cmocka_unit_test(test_caches_match_slow_path),
        cmocka_unit_test(test_pending_hits),
        cmocka_unit_test(test_running_total_figures),
        cmocka_unit_test(test_bad_options),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
