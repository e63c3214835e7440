/* termtide fuzz target — counting: tt_decode → tt_extract_text (or
 * tt_extract_html) → tt_counter_count with n-grams, stemming, stop-words.
 *
 * Bytes 0 and 1 hold the options, the rest is the document:
 *   byte 0 bits 0-1  ngram_max = 1 + (bits % 3), so 1..3
 *          bit 2     ngram_min = ngram_max (else 1)
 *          bit 3     stem (Snowball English)
 *          bit 4     keep_numbers
 *          bit 5     the built-in "english" stop-word list
 *          bit 6     extract as HTML (tt_extract_html) instead of plain text
 *          bit 7     drop_tables (HTML only)
 *   byte 1           min_length = 1 + byte % 4
 * Checked (include/termtide/count.h, termtable.h): the table's total equals
 * stats.terms_kept; the sorted entries are sorted (count descending, then
 * bytewise) and agree with tt_termtable_get; every term is non-empty valid
 * UTF-8 without NUL; unigrams without stemming are never stop-words nor under
 * the minimum length; counting the blocks one at a time with
 * tt_counter_count_text on the same counter gives the same table and stats
 * (a block boundary is a hard boundary either way); the count classes add up
 * to the entries. */
#include "fuzz_common.h"

#include "termtide/alloc.h"
#include "termtide/count.h"
#include "termtide/decode.h"
#include "termtide/extract.h"
#include "termtide/filter.h"
#include "termtide/normalize.h"
#include "termtide/termtable.h"

static tt_termtable *english;
/* Kept across inputs, as a worker keeps them across documents: the tables
 * are reset (which keeps their memory) and one counter is made per option
 * combination, so the reuse paths are fuzzed too and each run skips the
 * allocations. */
static tt_termtable *table, *again;
static tt_counter *counters[3][2][2][2][2][4];

static void setup(void)
{
    static int done;
    if (done)
        return;
    done = 1;
    /* A fixed key: a finding must replay the same way. */
    tt_termtable_set_seed(0x7465726d74696465ull, 0x66757a7a696e6721ull);
    english = tt_termtable_new();
    FUZZ_CHECK(english != NULL);
    const char *list = tt_builtin_stopwords("english");
    FUZZ_CHECK(list != NULL);
    tt_error err;
    tt_error_init(&err);
    FUZZ_CHECK(tt_stopwords_load_text(english, list, strlen(list), "english", &err) == TT_OK);
    table = tt_termtable_new();
    again = tt_termtable_new();
    FUZZ_CHECK(table && again);
}

static int same_stats(const tt_doc_stats *a, const tt_doc_stats *b)
{
    return a->words_read == b->words_read && a->numbers == b->numbers &&
           a->stopwords == b->stopwords && a->short_words == b->short_words &&
           a->terms_kept == b->terms_kept && a->overlong == b->overlong &&
           a->sentences == b->sentences;
}

static int same_table(const tt_termtable *a, const tt_termtable *b)
{
    tt_term_entry *e = NULL;
    size_t n = 0;
    if (tt_termtable_distinct(a) != tt_termtable_distinct(b) ||
        tt_termtable_total(a) != tt_termtable_total(b))
        return 0;
    FUZZ_CHECK(tt_termtable_sorted(a, &e, &n) == TT_OK);
    int same = 1;
    for (size_t i = 0; i < n && same; i++)
        same = tt_termtable_get(b, e[i].term, e[i].len) == e[i].count;
    tt_free(e);
    return same;
}

static void check_table(const tt_termtable *t, const tt_count_options *o,
                        const tt_doc_stats *st)
{
    tt_term_entry *e = NULL;
    size_t n = 0;
    uint64_t sum = 0;
    FUZZ_CHECK(tt_termtable_total(t) == st->terms_kept);
    FUZZ_CHECK(tt_termtable_sorted(t, &e, &n) == TT_OK);
    FUZZ_CHECK(n == tt_termtable_distinct(t));
    for (size_t i = 0; i < n; i++) {
        const tt_term_entry *x = &e[i];
        FUZZ_CHECK(x->count > 0 && x->len > 0);
        FUZZ_CHECK(x->term[x->len] == '\0' && memchr(x->term, '\0', x->len) == NULL);
        FUZZ_CHECK(fuzz_utf8_valid((const unsigned char *)x->term, x->len));
        FUZZ_CHECK(tt_termtable_get(t, x->term, x->len) == x->count);
        if (i) {
            const tt_term_entry *p = &e[i - 1];
            size_t m = p->len < x->len ? p->len : x->len;
            int c = memcmp(p->term, x->term, m);
            FUZZ_CHECK(p->count > x->count ||
                       (p->count == x->count && (c < 0 || (c == 0 && p->len < x->len))));
        }
        if (o->ngram_max == 1 && !o->stem) {
            if (o->stopwords)
                FUZZ_CHECK(tt_termtable_get(o->stopwords, x->term, x->len) == 0);
            if (o->min_length > 1 && !o->keep_numbers)
                FUZZ_CHECK(tt_utf8_length(x->term, x->len) >= o->min_length);
        }
        sum += x->count;
    }
    FUZZ_CHECK(sum == st->terms_kept);

    tt_count_class cls[64];
    size_t k = tt_count_classes(e, n, cls, 64);
    uint64_t terms = 0, occ = 0;
    for (size_t i = 0; i < k; i++) {
        FUZZ_CHECK(cls[i].lower <= cls[i].upper);
        if (i)
            FUZZ_CHECK(cls[i].lower == cls[i - 1].upper + 1);
        terms += cls[i].terms;
        occ += cls[i].occurrences;
    }
    FUZZ_CHECK(terms == n && occ == sum);
    tt_free(e);
}

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size)
{
    if (size < 2)
        return 0;
    setup();
    const unsigned flags = data[0];
    tt_count_options o;
    tt_count_options_init(&o);
    o.ngram_max = 1 + (int)(flags & 3) % 3;
    o.ngram_min = (flags & 4) ? o.ngram_max : 1;
    o.stem = (flags & 8) != 0;
    o.keep_numbers = (flags & 16) != 0;
    o.stopwords = (flags & 32) ? english : NULL;
    o.min_length = 1 + (size_t)(data[1] % 4);

    tt_buf text;
    tt_blocks blocks;
    tt_decode_info info;
    tt_error err;
    tt_counter **slot = &counters[o.ngram_max - 1][o.ngram_min == o.ngram_max][o.stem]
                                 [o.keep_numbers][o.stopwords != NULL][o.min_length - 1];
    tt_doc_stats st, st2;

    tt_buf_init(&text, 0);
    tt_blocks_init(&blocks);
    tt_error_init(&err);
    memset(&st, 0, sizeof st);
    memset(&st2, 0, sizeof st2);

    tt_status s = tt_decode((const char *)data + 2, size - 2, &text, &info, "fuzz.txt", &err);
    if (s != TT_OK)
        goto done;
    if (flags & 64) {
        tt_extract_options xo = { (flags & 128) != 0 };
        s = tt_extract_html(text.data, text.len, 0, &xo, &blocks, "fuzz.html", &err);
    } else {
        s = tt_extract_text(text.data, text.len, 0, &blocks, "fuzz.txt", &err);
    }
    if (s != TT_OK) {
        fuzz_check_error(s, &err);
        goto done;
    }
    fuzz_check_blocks(&blocks, 0, text.len);

    if (!*slot)
        *slot = tt_counter_new(&o);
    tt_counter *c = *slot;
    FUZZ_CHECK(c != NULL);
    tt_termtable_reset(table);
    tt_termtable_reset(again);
    s = tt_counter_count(c, &blocks, table, &st);
    FUZZ_CHECK(s == TT_OK); /* inputs here are far below every limit */
    FUZZ_CHECK(st.terms_kept <= st.words_read * (uint64_t)(o.ngram_max - o.ngram_min + 1));
    FUZZ_CHECK(st.numbers <= st.words_read && st.stopwords <= st.words_read &&
               st.short_words <= st.words_read && st.sentences <= st.words_read);
    check_table(table, &o, &st);

    for (size_t i = 0; i < blocks.n; i++) {
        const tt_block *b = &blocks.items[i];
        s = tt_counter_count_text(c, blocks.text.data + b->off, b->len, again, &st2);
        FUZZ_CHECK(s == TT_OK);
    }
    FUZZ_CHECK(same_stats(&st, &st2));
    FUZZ_CHECK(same_table(table, again));
done:
    tt_blocks_release(&blocks);
    tt_buf_release(&text);
    return 0;
}
