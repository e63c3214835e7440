/* termtide tests — shared includes and small helpers for cmocka tests. */
#ifndef TT_TEST_H
#define TT_TEST_H

#include <setjmp.h>
#include <stdarg.h>
#include <stddef.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include <cmocka.h>

/* Where tests make their temporary files and directories (mkstemp and
 * mkdtemp templates are built on it). */
#define TT_TEST_TMP "/tmp/"

/* The program under test, set by the Makefile. */
static inline const char *tt_test_bin(void)
{
    const char *b = getenv("TT_BIN");
    return b ? b : "build/termtide";
}

/* Debian's Python with SciPy and scikit-learn; never a bare python3. */
static inline const char *tt_test_python(void)
{
    const char *p = getenv("PYTHON");
    return p ? p : "/usr/bin/python3";
}

/* A failing allocator for out-of-memory tests: with tt_test_fail_after = k
 * the (k+1)-th allocation from now fails, and every later one too; -1 never
 * fails. Install with tt_set_allocator(&(tt_allocator){ tt_test_failing_malloc,
 * tt_test_failing_realloc, free }). */
static int tt_test_fail_after = -1;

static inline void *tt_test_failing_malloc(size_t n)
{
    if (tt_test_fail_after == 0)
        return NULL;
    if (tt_test_fail_after > 0)
        tt_test_fail_after--;
    return malloc(n);
}

static inline void *tt_test_failing_realloc(void *p, size_t n)
{
    if (tt_test_fail_after == 0)
        return NULL;
    if (tt_test_fail_after > 0)
        tt_test_fail_after--;
    return realloc(p, n);
}

#endif
