/* Tests of the allocator (src/alloc.c): big blocks (1 MiB and more, mapped
 * on their own) keep their bytes through every kind of growth, come zeroed
 * from tt_calloc, and mix freely with the C library's blocks; a reader's
 * kept buffer grows in whole huge pages (src/buf.c). */
#include "tt_test.h"

#include "termtide/alloc.h"
#include "tt_internal.h"

#define MIB ((size_t)1 << 20)

/* A byte pattern that differs at every offset a page apart. */
static unsigned char pattern(size_t i)
{
    return (unsigned char)(i * 131u + (i >> 12) * 7u + 1u);
}

static void fill(unsigned char *p, size_t from, size_t to)
{
    for (size_t i = from; i < to; i++)
        p[i] = pattern(i);
}

static void check(const unsigned char *p, size_t n)
{
    for (size_t i = 0; i < n; i++)
        if (p[i] != pattern(i))
            fail_msg("byte %zu lost: %u, expected %u", i, p[i], pattern(i));
}

static void test_big_block_grows_and_keeps_bytes(void **state)
{
    (void)state;
    size_t n = 3 * MIB + 5;
    unsigned char *p = tt_malloc(n);
    assert_non_null(p);
#if defined(__linux__) && !defined(__SANITIZE_ADDRESS__)
    assert_int_equal((uintptr_t)p & (2 * MIB - 1), 0); /* a mapping of its own */
#endif
    fill(p, 0, n);
    /* within the mapping (rounded up to 2 MiB), then past it, twice */
    size_t sizes[] = { 4 * MIB - 1, 9 * MIB + 3, 40 * MIB };
    for (size_t k = 0; k < sizeof sizes / sizeof *sizes; k++) {
        unsigned char *q = tt_realloc(p, sizes[k]);
        assert_non_null(q);
        check(q, n);
        fill(q, n, sizes[k]);
        p = q;
        n = sizes[k];
    }
    /* smaller again: the bytes that remain are the same */
    unsigned char *q = tt_realloc(p, MIB / 2);
    assert_non_null(q);
    check(q, MIB / 2);
    tt_free(q);
}

static void test_small_block_grown_big(void **state)
{
    (void)state;
    size_t n = 100 * 1024;
    unsigned char *p = tt_malloc(n);
    assert_non_null(p);
    fill(p, 0, n);
    unsigned char *q = tt_realloc(p, 5 * MIB);
    assert_non_null(q);
    check(q, n);
    fill(q, n, 5 * MIB);
    check(q, 5 * MIB);
    tt_free(q);
}

static void test_big_calloc_is_zero(void **state)
{
    (void)state;
    /* a big block, dirtied and freed, then a fresh one: zero throughout */
    unsigned char *p = tt_malloc(6 * MIB);
    assert_non_null(p);
    memset(p, 0xA5, 6 * MIB);
    tt_free(p);
    unsigned char *z = tt_calloc(3, 2 * MIB);
    assert_non_null(z);
    for (size_t i = 0; i < 6 * MIB; i += 509)
        assert_int_equal(z[i], 0);
    assert_int_equal(z[6 * MIB - 1], 0);
    tt_free(z);
}

static void test_many_blocks_mixed(void **state)
{
    (void)state;
    /* more big blocks at once than any run keeps, among small ones: all
     * distinct, all freed (the list of big blocks overflows to malloc) */
    enum { N = 300 };
    unsigned char *b[N];
    for (size_t i = 0; i < N; i++) {
        size_t n = i % 3 ? MIB + i : 64 + i;
        b[i] = tt_malloc(n);
        assert_non_null(b[i]);
        b[i][0] = (unsigned char)i;
        b[i][n - 1] = (unsigned char)(i ^ 0x5A);
    }
    for (size_t i = 0; i < N; i++) {
        size_t n = i % 3 ? MIB + i : 64 + i;
        assert_int_equal(b[i][0], (unsigned char)i);
        assert_int_equal(b[i][n - 1], (unsigned char)(i ^ 0x5A));
    }
    for (size_t i = 0; i < N; i += 2)
        tt_free(b[i]);
    for (size_t i = 1; i < N; i += 2)
        tt_free(b[i]);
    tt_free(NULL);
}

/* A reader's buffer (tti_buf_grow_kept): below 256 KiB it grows as any
 * buffer; from there its capacity is whole 2 MiB pages, never past its
 * limit, and its bytes survive each step. */
static void test_kept_buffer_whole_pages(void **state)
{
    (void)state;
    tt_buf b;
    tt_buf_init(&b, 0);
    assert_int_equal(tti_buf_grow_kept(&b, 1000), TT_OK);
    assert_true(b.cap >= 1001 && b.cap < 256 * 1024);
    fill((unsigned char *)b.data, 0, 1000);
    b.len = 1000;
    assert_int_equal(tti_buf_grow_kept(&b, 300 * 1024), TT_OK);
    assert_int_equal(b.cap, 2 * MIB);
    check((unsigned char *)b.data, 1000);
#if defined(__linux__) && !defined(__SANITIZE_ADDRESS__)
    assert_int_equal((uintptr_t)b.data & (2 * MIB - 1), 0); /* a big block */
#endif
    fill((unsigned char *)b.data, 1000, 2 * MIB - 1);
    b.len = 2 * MIB - 1;
    assert_int_equal(tti_buf_grow_kept(&b, 5), TT_OK);
    assert_int_equal(b.cap, 4 * MIB);
    check((unsigned char *)b.data, 2 * MIB - 1);
    tt_buf_release(&b);
    /* a limit below the next whole page: exactly up to the limit */
    tt_buf_init(&b, 3 * MIB);
    assert_int_equal(tti_buf_grow_kept(&b, MIB), TT_OK);
    assert_int_equal(b.cap, 2 * MIB);
    b.len = 2 * MIB - 1;
    assert_int_equal(tti_buf_grow_kept(&b, 10), TT_OK);
    assert_int_equal(b.cap, 3 * MIB + 1);
    assert_int_equal(tti_buf_grow_kept(&b, MIB + 2), TT_ELIMIT);
    tt_buf_release(&b);
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_big_block_grows_and_keeps_bytes),
        cmocka_unit_test(test_small_block_grown_big),
        cmocka_unit_test(test_big_calloc_is_zero),
        cmocka_unit_test(test_many_blocks_mixed),
        cmocka_unit_test(test_kept_buffer_whole_pages),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
