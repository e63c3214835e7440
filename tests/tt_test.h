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
#include <sys/wait.h>

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

static inline char *tt_test_read_stream(FILE *f, size_t *len);

/* Runs the program with args (through the shell) and returns what it wrote
 * to stdout, with stderr too when stderr_too is set, NUL-terminated; the
 * caller frees it. *status gets the exit status, -1 when killed. */
static inline char *tt_test_run(const char *args, int stderr_too, int *status)
{
    char cmd[8192];
    snprintf(cmd, sizeof cmd, "%s %s %s", tt_test_bin(), args, stderr_too ? "2>&1" : "2>/dev/null");
    FILE *p = popen(cmd, "r");
    assert_non_null(p);
    char *out = tt_test_read_stream(p, NULL);
    int st = pclose(p);
    *status = st != -1 && WIFEXITED(st) ? WEXITSTATUS(st) : -1;
    return out;
}

/* Everything left to read from f, NUL-terminated (the caller frees it);
 * *len (when len is not NULL) gets its length. */
static inline char *tt_test_read_stream(FILE *f, size_t *len)
{
    size_t cap = 1 << 16, n = 0, k;
    char *d = malloc(cap);
    assert_non_null(d);
    while ((k = fread(d + n, 1, cap - 1 - n, f)) > 0) {
        n += k;
        if (n + 1 == cap) {
            char *grown = realloc(d, cap * 2);
            assert_non_null(grown);
            d = grown;
            cap *= 2;
        }
    }
    d[n] = '\0';
    if (len)
        *len = n;
    return d;
}

/* A whole file, NUL-terminated; the caller frees it. *len (when len is not
 * NULL) gets its length. NULL when the file cannot be opened. */
static inline char *tt_test_slurp(const char *path, size_t *len)
{
    FILE *f = fopen(path, "rb");
    if (!f) {
        if (len)
            *len = 0;
        return NULL;
    }
    char *d = tt_test_read_stream(f, len);
    fclose(f);
    return d;
}

/* The same for a file the test needs: a missing one fails the test. */
static inline char *tt_test_read(const char *path, size_t *len)
{
    char *d = tt_test_slurp(path, len);
    assert_non_null(d);
    return d;
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
