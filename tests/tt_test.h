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

#endif
