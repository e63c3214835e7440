/* Tests of the term table (src/termtable.c): counting, growth, sorting,
 * merging, hostile keys, and out-of-memory reported as TT_ENOMEM. */
#include "tt_test.h"

#include "termtide/alloc.h"
#include "termtide/termtable.h"

static void test_add_get_sorted(void **state)
{
    (void)state;
    tt_termtable *t = tt_termtable_new();
    assert_non_null(t);
    assert_int_equal(tt_termtable_add(t, "loss", 4, 3), TT_OK);
    assert_int_equal(tt_termtable_add(t, "gain", 4, 3), TT_OK);
    assert_int_equal(tt_termtable_add(t, "revenue", 7, 5), TT_OK);
    assert_int_equal(tt_termtable_add(t, "loss", 4, 1), TT_OK);
    assert_int_equal(tt_termtable_get(t, "loss", 4), 4);
    assert_int_equal(tt_termtable_get(t, "los", 3), 0);
    assert_int_equal(tt_termtable_distinct(t), 3);
    assert_int_equal(tt_termtable_total(t), 12);
    tt_term_entry *e;
    size_t n;
    assert_int_equal(tt_termtable_sorted(t, &e, &n), TT_OK);
    assert_int_equal(n, 3);
    /* count descending, then term bytewise ascending */
    assert_string_equal(e[0].term, "revenue");
    assert_string_equal(e[1].term, "loss");
    assert_string_equal(e[2].term, "gain");
    tt_free(e);
    tt_termtable_free(t);
}

static void test_ties_sorted_by_term(void **state)
{
    (void)state;
    tt_termtable *t = tt_termtable_new();
    const char *words[] = { "zeta", "alpha", "mu", "beta", "alphabet", "Alpha" };
    for (size_t i = 0; i < 6; i++)
        assert_int_equal(tt_termtable_add(t, words[i], strlen(words[i]), 2), TT_OK);
    tt_term_entry *e;
    size_t n;
    assert_int_equal(tt_termtable_sorted(t, &e, &n), TT_OK);
    const char *want[] = { "Alpha", "alpha", "alphabet", "beta", "mu", "zeta" };
    for (size_t i = 0; i < 6; i++)
        assert_string_equal(e[i].term, want[i]);
    tt_free(e);
    tt_termtable_free(t);
}

/* The reference order, written plainly for the C library's qsort: count
 * descending, then memcmp over the common length, the shorter term first. */
static int reference_cmp(const void *pa, const void *pb)
{
    const tt_term_entry *a = pa, *b = pb;
    if (a->count != b->count)
        return a->count > b->count ? -1 : 1;
    int c = memcmp(a->term, b->term, a->len < b->len ? a->len : b->len);
    if (c)
        return c;
    return a->len < b->len ? -1 : a->len > b->len;
}

/* tt_termtable_sorted against qsort with reference_cmp, on terms made to
 * tie: counts from a few values, terms that share their first 8 bytes or
 * are prefixes of each other, bytes 0x80-0xff (which must sort after ASCII,
 * as memcmp compares unsigned), lengths 1 to 24. */
static void test_sorted_against_qsort(void **state)
{
    (void)state;
    tt_termtable *t = tt_termtable_new();
    uint64_t x = 0x9e3779b97f4a7c15ull;
    static const char alphabet[] = { 'a', 'b', 'z', 'A', '-', '\x80', '\xc3', '\xff' };
    char w[24];
    for (int i = 0; i < 20000; i++) {
        x ^= x << 13;
        x ^= x >> 7;
        x ^= x << 17;
        size_t len = 1 + (size_t)(x % 24);
        uint64_t y = x;
        /* the first bytes from few choices, so prefixes often agree */
        w[0] = (y >> 50) & 1 ? 'a' : '\xc3';
        for (size_t j = 1; j < len; j++)
            w[j] = alphabet[(y >> (j * 2)) % (j < 6 ? 2 : 8)];
        assert_int_equal(tt_termtable_add(t, w, len, 1 + (x >> 60) % 4), TT_OK);
    }
    tt_term_entry *e;
    size_t n;
    assert_int_equal(tt_termtable_sorted(t, &e, &n), TT_OK);
    assert_int_equal(n, tt_termtable_distinct(t));
    tt_term_entry *ref = malloc(n * sizeof *ref);
    assert_non_null(ref);
    memcpy(ref, e, n * sizeof *ref);
    qsort(ref, n, sizeof *ref, reference_cmp);
    for (size_t i = 0; i < n; i++) {
        assert_ptr_equal(e[i].term, ref[i].term);
        assert_int_equal(e[i].count, ref[i].count);
    }
    free(ref);
    tt_free(e);
    tt_termtable_free(t);
}

/* tt_termtable_sorted_union against the reference order (reference_cmp
 * under qsort) of the tables' sum built plainly with tt_termtable_add: 1 to
 * 5 tables drawing from one pool of terms (so most terms are in several),
 * terms sharing 8-byte prefixes and holding bytes 0x80-0xff, counts from 1
 * to past 2^40 (every digit of the count sort in use), empty tables among
 * them; with 1, 2, 3 and 8 threads (a pool of 30,000 terms is large enough
 * for the merge to be split into ranges). */
static void test_sorted_union_against_reference(void **state)
{
    (void)state;
    uint64_t x = 0x2545f4914f6cdd1dull;
    static const char alphabet[] = { 'a', 'b', 'q', '-', '\x80', '\xe2', '\xff' };
    for (int trial = 0; trial < 8; trial++) {
        size_t ntables = 1 + (size_t)trial % 5, pool = trial < 4 ? 30000 : 1500;
        tt_termtable *tables[6], *sum = tt_termtable_new();
        assert_non_null(sum);
        for (size_t t = 0; t < ntables; t++) {
            tables[t] = tt_termtable_new();
            assert_non_null(tables[t]);
            if (trial == 6 && t == 1)
                continue; /* an empty table among full ones */
            for (size_t i = 0; i < pool; i++) {
                x ^= x << 13;
                x ^= x >> 7;
                x ^= x << 17;
                if (x % 3 == 0)
                    continue; /* not every term in every table */
                /* the term: its number in the pool, spelled to share prefixes */
                char w[40];
                size_t len = 0;
                uint64_t id = (i * 0x9e3779b97f4a7c15ull) >> 20;
                w[len++] = i % 2 ? 'a' : '\xc3';
                for (int k = 0; k < 7 + (int)(id % 3); k++)
                    w[len++] = alphabet[(id >> (k * 3)) % (k < 6 ? 2 : 7)];
                len += (size_t)snprintf(w + len, sizeof w - len, "%zu", i);
                uint64_t count = 1 + (x >> 61);
                if (x % 17 == 0)
                    count = (x >> 20) & ((1ull << 42) - 1);
                if (count == 0)
                    count = 1;
                assert_int_equal(tt_termtable_add(tables[t], w, len, count), TT_OK);
                assert_int_equal(tt_termtable_add(sum, w, len, count), TT_OK);
            }
        }
        tt_term_entry *ref;
        size_t n_ref;
        assert_int_equal(tt_termtable_sorted(sum, &ref, &n_ref), TT_OK);
        qsort(ref, n_ref, sizeof *ref, reference_cmp);
        static const int threads[] = { 1, 2, 3, 8 };
        for (size_t k = 0; k < sizeof threads / sizeof *threads; k++) {
            tt_term_entry *e;
            size_t n;
            assert_int_equal(tt_termtable_sorted_union((const tt_termtable *const *)tables,
                                                       ntables, threads[k], &e, &n),
                             TT_OK);
            assert_int_equal(n, n_ref);
            for (size_t i = 0; i < n; i++) {
                assert_int_equal(e[i].len, ref[i].len);
                assert_memory_equal(e[i].term, ref[i].term, ref[i].len);
                assert_int_equal(e[i].count, ref[i].count);
            }
            tt_free(e);
        }
        tt_free(ref);
        for (size_t t = 0; t < ntables; t++)
            tt_termtable_free(tables[t]);
        tt_termtable_free(sum);
    }
    /* no tables, and too many */
    tt_term_entry *e;
    size_t n = 99;
    assert_int_equal(tt_termtable_sorted_union(NULL, 0, 2, &e, &n), TT_OK);
    assert_int_equal(n, 0);
    tt_free(e);
    const tt_termtable *many[65] = { 0 };
    assert_int_equal(tt_termtable_sorted_union(many, 65, 1, &e, &n), TT_EINVAL);
}

/* Many distinct terms force several growths; every count must survive. */
static void test_growth_and_merge(void **state)
{
    (void)state;
    tt_termtable *a = tt_termtable_new(), *b = tt_termtable_new();
    char w[32];
    for (int i = 0; i < 200000; i++) {
        int n = snprintf(w, sizeof w, "w%d", i);
        assert_int_equal(tt_termtable_add(a, w, (size_t)n, (uint64_t)(i % 7 + 1)), TT_OK);
        if (i % 2)
            assert_int_equal(tt_termtable_add(b, w, (size_t)n, 1), TT_OK);
    }
    assert_int_equal(tt_termtable_distinct(a), 200000);
    assert_int_equal(tt_termtable_merge(a, b), TT_OK);
    for (int i = 0; i < 200000; i += 997) {
        int n = snprintf(w, sizeof w, "w%d", i);
        assert_int_equal(tt_termtable_get(a, w, (size_t)n), (uint64_t)(i % 7 + 1 + (i % 2)));
    }
    tt_termtable_reset(a);
    assert_int_equal(tt_termtable_distinct(a), 0);
    assert_int_equal(tt_termtable_get(a, "w1", 2), 0);
    assert_int_equal(tt_termtable_add(a, "again", 5, 1), TT_OK);
    assert_int_equal(tt_termtable_get(a, "again", 5), 1);
    tt_termtable_free(a);
    tt_termtable_free(b);
}

/* A table made for a large vocabulary (tt_termtable_new_large: 2 MiB of
 * slots and 2 MiB chunks of terms from the start) counts, grows, merges,
 * resets and sorts exactly as an ordinary one: the same 150,000 terms
 * (past two doublings of its slots and across many chunks, with a term
 * longer than a chunk among them) give the same entries. */
static void test_large_table_same_as_small(void **state)
{
    (void)state;
    tt_termtable *big = tt_termtable_new_large(), *small = tt_termtable_new();
    assert_non_null(big);
    assert_non_null(small);
    size_t long_len = (size_t)3 << 20;
    char *longterm = malloc(long_len);
    assert_non_null(longterm);
    memset(longterm, 'q', long_len);
    char w[40];
    for (int round = 0; round < 2; round++) {
        for (int i = 0; i < 150000; i++) {
            int n = snprintf(w, sizeof w, "term-%d-%x", i, (unsigned)i * 2654435761u);
            assert_int_equal(tt_termtable_add(big, w, (size_t)n, (uint64_t)(i % 5 + 1)), TT_OK);
            assert_int_equal(tt_termtable_add(small, w, (size_t)n, (uint64_t)(i % 5 + 1)), TT_OK);
            if (i == 70000) {
                assert_int_equal(tt_termtable_add(big, longterm, long_len, 9), TT_OK);
                assert_int_equal(tt_termtable_add(small, longterm, long_len, 9), TT_OK);
            }
        }
        assert_int_equal(tt_termtable_distinct(big), 150001);
        assert_int_equal(tt_termtable_get(big, longterm, long_len), 9);
        tt_term_entry *eb, *es;
        size_t nb, ns;
        assert_int_equal(tt_termtable_sorted(big, &eb, &nb), TT_OK);
        assert_int_equal(tt_termtable_sorted(small, &es, &ns), TT_OK);
        assert_int_equal(nb, ns);
        for (size_t i = 0; i < nb; i++) {
            assert_int_equal(eb[i].count, es[i].count);
            assert_int_equal(eb[i].len, es[i].len);
            assert_memory_equal(eb[i].term, es[i].term, eb[i].len);
        }
        tt_free(eb);
        tt_free(es);
        if (round == 0) {
            /* emptied, it is used again from its kept memory */
            tt_termtable_reset(big);
            tt_termtable_reset(small);
            assert_int_equal(tt_termtable_distinct(big), 0);
            assert_int_equal(tt_termtable_get(big, "term-1-9e3779b1", 15), 0);
        }
    }
    /* merged into an ordinary table and the other way round */
    assert_int_equal(tt_termtable_merge(small, big), TT_OK);
    assert_int_equal(tt_termtable_merge(big, small), TT_OK);
    int n = snprintf(w, sizeof w, "term-%d-%x", 4, 4u * 2654435761u);
    assert_int_equal(tt_termtable_get(small, w, (size_t)n), 10);
    assert_int_equal(tt_termtable_get(big, w, (size_t)n), 15);
    free(longterm);
    tt_termtable_free(big);
    tt_termtable_free(small);
}

/* Terms that differ only after 8-byte boundaries, embedded high bytes and
 * a long term crossing the arena chunk size must stay distinct. */
static void test_awkward_keys(void **state)
{
    (void)state;
    tt_termtable *t = tt_termtable_new();
    char big[300000];
    memset(big, 'x', sizeof big);
    assert_int_equal(tt_termtable_add(t, big, sizeof big, 1), TT_OK);
    assert_int_equal(tt_termtable_add(t, "abcdefgh1", 9, 1), TT_OK);
    assert_int_equal(tt_termtable_add(t, "abcdefgh2", 9, 1), TT_OK);
    assert_int_equal(tt_termtable_add(t, "\xc3\xa9t\xc3\xa9", 5, 1), TT_OK);
    assert_int_equal(tt_termtable_add(t, "", 0, 1), TT_OK);
    assert_int_equal(tt_termtable_distinct(t), 5);
    assert_int_equal(tt_termtable_get(t, big, sizeof big), 1);
    assert_int_equal(tt_termtable_get(t, "abcdefgh2", 9), 1);
    tt_termtable_free(t);
}

/* Out-of-memory: fail the k-th allocation for every k; each run must either
 * succeed or report TT_ENOMEM, never crash (checked under ASan too). */
static int fail_at, calls;
static void *failing_malloc(size_t n) { return ++calls == fail_at ? NULL : malloc(n); }
static void *failing_realloc(void *p, size_t n) { return ++calls == fail_at ? NULL : realloc(p, n); }

static void test_out_of_memory(void **state)
{
    (void)state;
    tt_allocator a = { failing_malloc, failing_realloc, free };
    int saw_enomem = 0;
    for (fail_at = 1; fail_at < 80; fail_at++) {
        calls = 0;
        tt_set_allocator(&a);
        tt_termtable *t = fail_at % 2 ? tt_termtable_new() : tt_termtable_new_large();
        tt_status st = t ? TT_OK : TT_ENOMEM;
        char w[16];
        for (int i = 0; i < 3000 && st == TT_OK; i++) {
            int n = snprintf(w, sizeof w, "t%d", i);
            st = tt_termtable_add(t, w, (size_t)n, 1);
        }
        if (st == TT_OK && t) {
            tt_term_entry *e;
            size_t n;
            st = tt_termtable_sorted(t, &e, &n);
            if (st == TT_OK)
                tt_free(e);
        }
        if (st == TT_OK && t) {
            /* the union sorts with buffers of its own, in two threads */
            const tt_termtable *two[2] = { t, t };
            tt_term_entry *e;
            size_t n;
            st = tt_termtable_sorted_union(two, 2, 2, &e, &n);
            if (st == TT_OK) {
                assert_int_equal(n, 3000);
                assert_int_equal(e[0].count, 2);
                tt_free(e);
            }
        }
        assert_true(st == TT_OK || st == TT_ENOMEM);
        if (st == TT_ENOMEM)
            saw_enomem = 1;
        tt_termtable_free(t);
        tt_set_allocator(NULL);
    }
    assert_true(saw_enomem);
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_add_get_sorted),
        cmocka_unit_test(test_ties_sorted_by_term),
        cmocka_unit_test(test_sorted_against_qsort),
        cmocka_unit_test(test_sorted_union_against_reference),
        cmocka_unit_test(test_growth_and_merge),
        cmocka_unit_test(test_large_table_same_as_small),
        cmocka_unit_test(test_awkward_keys),
        cmocka_unit_test(test_out_of_memory),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
