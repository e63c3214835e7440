/* termtide tests — helpers for the numeric tests that check results
 * against Python at test time: a seeded generator, temporary files, running
 * a Python script on a data file, a growing text buffer, and tolerant
 * comparison. Included by tests/test_stats.c and tests/test_change.c. */
#ifndef TT_TEST_NUMERIC_H
#define TT_TEST_NUMERIC_H

#include <math.h>
#include <stdarg.h>
#include <unistd.h>

#include "tt_test.h"

static uint64_t rng_state;

static uint64_t rng_next(void) /* splitmix64 */
{
    uint64_t z = (rng_state += 0x9e3779b97f4a7c15ull);
    z = (z ^ (z >> 30)) * 0xbf58476d1ce4e5b9ull;
    z = (z ^ (z >> 27)) * 0x94d049bb133111ebull;
    return z ^ (z >> 31);
}

static double rng_unit(void)
{
    return (double)(rng_next() >> 11) * 0x1p-53;
}

static char *write_temp(const char *prefix, const char *text)
{
    char *path = malloc(64);
    assert_non_null(path);
    snprintf(path, 64, "/tmp/%sXXXXXX", prefix);
    int fd = mkstemp(path);
    assert_true(fd >= 0);
    size_t len = strlen(text);
    assert_int_equal(write(fd, text, len), (ssize_t)len);
    close(fd);
    return path;
}

/* Runs a Python script on a data file; returns its standard output (the
 * caller frees it). The test fails when Python does. */
static char *run_python(const char *script, const char *data)
{
    char *sp = write_temp("tt_num_py", script), *dp = write_temp("tt_num_in", data);
    char cmd[512];
    snprintf(cmd, sizeof cmd, "%s %s %s", tt_test_python(), sp, dp);
    FILE *p = popen(cmd, "r");
    assert_non_null(p);
    size_t cap = 1 << 16, len = 0;
    char *out = malloc(cap);
    assert_non_null(out);
    size_t got;
    while ((got = fread(out + len, 1, cap - len - 1, p)) > 0) {
        len += got;
        if (cap - len < 4096) {
            cap *= 2;
            out = realloc(out, cap);
            assert_non_null(out);
        }
    }
    out[len] = '\0';
    assert_int_equal(pclose(p), 0);
    unlink(sp);
    unlink(dp);
    free(sp);
    free(dp);
    return out;
}

typedef struct text {
    char *s;
    size_t len, cap;
} text;

static void text_printf(text *t, const char *fmt, ...)
{
    va_list ap;
    for (;;) {
        va_start(ap, fmt);
        int n = vsnprintf(t->s ? t->s + t->len : NULL, t->s ? t->cap - t->len : 0, fmt, ap);
        va_end(ap);
        assert_true(n >= 0);
        if (t->s && (size_t)n < t->cap - t->len) {
            t->len += (size_t)n;
            return;
        }
        t->cap = (t->cap + (size_t)n + 1) * 2;
        t->s = realloc(t->s, t->cap);
        assert_non_null(t->s);
    }
}

static double next_num(char **cursor)
{
    char *end;
    double v = strtod(*cursor, &end);
    assert_true(end != *cursor);
    *cursor = end;
    return v;
}

static int close_to(double ours, double ref, double rel, double abs_tol)
{
    if (isnan(ref) || isnan(ours))
        return isnan(ref) && isnan(ours);
    return fabs(ours - ref) <= rel * fabs(ref) + abs_tol;
}

/* Evaluates each argument once (ref is often a read from the Python output). */
#define CHECK_CLOSE(what, i, ours, ref, rel, abs_tol)                                              \
    do {                                                                                           \
        double o_ = (ours), r_ = (ref);                                                            \
        if (!close_to(o_, r_, (rel), (abs_tol)))                                                   \
            fail_msg("%s, case %zu: ours %.17g, reference %.17g", (what), (size_t)(i), o_, r_);    \
    } while (0)

#endif
