/* termtide tests — the filter stage's stop-lists (src/filter.c): the
 * built-in lists, the list format (comments, blank lines, CRLF, BOM),
 * normalization of entries, errors that name the file and line, files
 * (plain and gzip), and out-of-memory. The stemmer is checked against
 * Snowball's vocabulary in test_stem_snowball.c. */
#include <stdlib.h>
#include <unistd.h>
#include <zlib.h>

#include "tt_test.h"

#include "termtide/alloc.h"
#include "termtide/filter.h"
#include "termtide/termtable.h"

static int has(const tt_termtable *t, const char *term)
{
    return tt_termtable_get(t, term, strlen(term)) > 0;
}

static tt_termtable *new_set(void)
{
    tt_termtable *t = tt_termtable_new();
    assert_non_null(t);
    return t;
}

static void test_builtin(void **state)
{
    (void)state;
    const char *const *names = tt_builtin_stopword_names();
    assert_non_null(names);
    int seen_english = 0, seen_filing = 0;
    size_t count = 0;
    for (; names[count]; count++) {
        seen_english |= strcmp(names[count], "english") == 0;
        seen_filing |= strcmp(names[count], "filing") == 0;
    }
    assert_true(seen_english);
    assert_true(seen_filing);
    assert_int_equal(count, 2);
    assert_null(tt_builtin_stopwords("klingon"));
    assert_null(tt_builtin_stopwords(NULL));

    /* The compiled-in text is the shipped file, byte for byte. */
    for (size_t i = 0; names[i]; i++) {
        char path[256];
        snprintf(path, sizeof path, "stopwords/%s.txt", names[i]);
        size_t len;
        char *file = tt_test_read(path, &len);
        const char *text = tt_builtin_stopwords(names[i]);
        assert_non_null(text);
        assert_int_equal(strlen(text), len);
        assert_memory_equal(text, file, len);
        free(file);
    }
}

/* The lists load cleanly and hold what their headers promise. */
static void test_builtin_contents(void **state)
{
    (void)state;
    tt_error err;
    tt_error_init(&err);

    tt_termtable *en = new_set();
    const char *text = tt_builtin_stopwords("english");
    assert_int_equal(tt_stopwords_load_text(en, text, strlen(text), "english", &err), TT_OK);
    size_t n_en = tt_termtable_distinct(en);
    print_message("english: %zu distinct entries\n", n_en);
    assert_in_range(n_en, 200, 350);
    static const char *const function_words[] = {"the", "a", "of", "and", "also", "very",
                                                 "because", "themselves", "i'm", "we've"};
    for (size_t i = 0; i < sizeof function_words / sizeof function_words[0]; i++)
        if (!has(en, function_words[i]))
            fail_msg("english lacks \"%s\"", function_words[i]);
    /* Negators (Loughran & McDonald 2011 use no, not, none, neither, never,
     * nobody for negation) and modal/hedging words must stay countable. */
    static const char *const kept_out[] = {"no",    "not",   "never", "none",   "neither",
                                           "nobody", "nor",  "don't", "cannot", "may",
                                           "might", "could", "would", "should", "must",
                                           "will",  "can",   "shall", "perhaps", "possibly"};
    for (size_t i = 0; i < sizeof kept_out / sizeof kept_out[0]; i++)
        if (has(en, kept_out[i]))
            fail_msg("english must not hold \"%s\"", kept_out[i]);
    /* "it's" is listed; normalized it is "it" (possessive rule). */
    assert_true(has(en, "it"));
    assert_false(has(en, "it's"));

    tt_termtable *fi = new_set();
    text = tt_builtin_stopwords("filing");
    assert_int_equal(tt_stopwords_load_text(fi, text, strlen(text), "filing", &err), TT_OK);
    size_t n_fi = tt_termtable_distinct(fi);
    print_message("filing: %zu distinct entries\n", n_fi);
    assert_in_range(n_fi, 60, 150);
    static const char *const boilerplate[] = {"pursuant", "thereto", "registrant", "exhibit",
                                              "quarterly", "fiscal", "ended", "million"};
    for (size_t i = 0; i < sizeof boilerplate / sizeof boilerplate[0]; i++)
        if (!has(fi, boilerplate[i]))
            fail_msg("filing lacks \"%s\"", boilerplate[i]);
    assert_false(has(fi, "may"));
    assert_false(has(fi, "no"));

    tt_termtable_free(en);
    tt_termtable_free(fi);
}

static void test_format(void **state)
{
    (void)state;
    /* BOM, comments (whole-line and trailing), blank and blank-looking
     * lines, CRLF, surrounding blanks, a last line without newline. */
    static const char text[] =
        "\xef\xbb\xbf# a list\n"
        "alpha\n"
        "\n"
        "   \t \n"
        "  beta  # trailing comment\r\n"
        "gamma\r\n"
        "#delta\n"
        "\tepsilon";
    tt_termtable *t = new_set();
    tt_error err;
    tt_error_init(&err);
    assert_int_equal(tt_stopwords_load_text(t, text, sizeof text - 1, "t", &err), TT_OK);
    assert_int_equal(tt_termtable_distinct(t), 4);
    assert_true(has(t, "alpha"));
    assert_true(has(t, "beta"));
    assert_true(has(t, "gamma"));
    assert_true(has(t, "epsilon"));
    assert_false(has(t, "delta"));
    assert_false(has(t, "# a list"));
    tt_termtable_free(t);
}

/* Entries go through tt_normalize, so a list written with typographic
 * apostrophes, capitals, ligatures or full-width letters matches terms as
 * counted. Expected forms: see test_normalize.c for their sources. */
static void test_entries_normalized(void **state)
{
    (void)state;
    static const char text[] = "Company\u2019s\n"
                               "DON\u2019T\n"
                               "\ufb01scal\n"
                               "\uff29\uff34\uff25\uff2d\n"
                               "Stra\u00dfe\n"
                               "off\u2010balance\n"
                               "'\n"; /* normalizes to nothing: skipped */
    tt_termtable *t = new_set();
    tt_error err;
    tt_error_init(&err);
    assert_int_equal(tt_stopwords_load_text(t, text, sizeof text - 1, "t", &err), TT_OK);
    assert_int_equal(tt_termtable_distinct(t), 6);
    assert_true(has(t, "company"));
    assert_true(has(t, "don't"));
    assert_true(has(t, "fiscal"));
    assert_true(has(t, "item"));
    assert_true(has(t, "strasse"));
    assert_true(has(t, "off-balance"));
    assert_false(has(t, "Company\u2019s"));
    tt_termtable_free(t);
}

static void expect_error(const char *text, const char *name, long line, const char *part)
{
    tt_termtable *t = new_set();
    tt_error err;
    tt_error_init(&err);
    assert_int_equal(tt_stopwords_load_text(t, text, strlen(text), name, &err), TT_EPARSE);
    assert_int_equal(err.status, TT_EPARSE);
    assert_string_equal(err.file, name);
    assert_int_equal(err.line, line);
    char msg[2048], want[256];
    tt_error_format(&err, msg, sizeof msg);
    snprintf(want, sizeof want, "%s: line %ld: ", name, line);
    if (strncmp(msg, want, strlen(want)) != 0 || !strstr(msg, part))
        fail_msg("error \"%s\" should start \"%s\" and mention \"%s\"", msg, want, part);
    print_message("error as reported: %s\n", msg);
    tt_termtable_free(t);
}

static void test_bad_lines(void **state)
{
    (void)state;
    expect_error("alpha\n# fine\nbeta gamma\n", "lists/mine.txt", 3, "beta gamma");
    expect_error("alpha\nbeta\tgamma # tab inside\n", "tabs.txt", 2, "white space");
    /* U+00A0 becomes U+0020 under NFKC: still two words. */
    expect_error("alpha\nbeta\u00a0gamma\n", "nbsp.txt", 2, "white space");
    /* cp1252 or Latin-1 text is not UTF-8. */
    expect_error("alpha\r\nbeta\r\ncaf\xe9\r\n", "latin1.txt", 3, "UTF-8");
}

static char *write_temp(const char *suffix, const char *text, int gzip)
{
    char *path = malloc(64);
    assert_non_null(path);
    snprintf(path, 64, TT_TEST_TMP "tt_filter_XXXXXX%s", suffix);
    int fd = mkstemps(path, (int)strlen(suffix));
    assert_true(fd >= 0);
    if (gzip) {
        gzFile g = gzdopen(fd, "wb");
        assert_non_null(g);
        assert_int_equal(gzwrite(g, text, (unsigned)strlen(text)), (int)strlen(text));
        assert_int_equal(gzclose(g), Z_OK);
    } else {
        assert_int_equal(write(fd, text, strlen(text)), (ssize_t)strlen(text));
        close(fd);
    }
    return path;
}

static void test_files(void **state)
{
    (void)state;
    tt_error err;
    tt_error_init(&err);
    tt_termtable *t = new_set();

    char *plain = write_temp(".txt", "# mine\nAlpha\nBeta\u2019s\n", 0);
    assert_int_equal(tt_stopwords_load_file(t, plain, &err), TT_OK);
    assert_true(has(t, "alpha"));
    assert_true(has(t, "beta"));

    char *gz = write_temp(".txt.gz", "gamma\n\u00c9TAT\n", 1);
    assert_int_equal(tt_stopwords_load_file(t, gz, &err), TT_OK);
    assert_true(has(t, "gamma"));
    assert_true(has(t, "\u00e9tat"));
    assert_int_equal(tt_termtable_distinct(t), 4);

    /* A bad line in a file names the file's path and the line. */
    char *bad = write_temp(".txt", "one\ntwo\nthree four\n", 0);
    tt_error_init(&err);
    assert_int_equal(tt_stopwords_load_file(t, bad, &err), TT_EPARSE);
    assert_string_equal(err.file, bad);
    assert_int_equal(err.line, 3);

    /* A missing file is named too. */
    tt_error_init(&err);
    assert_int_equal(tt_stopwords_load_file(t, "/nonexistent/stop.txt", &err), TT_ENOENT);
    assert_string_equal(err.file, "/nonexistent/stop.txt");

    unlink(plain);
    unlink(gz);
    unlink(bad);
    free(plain);
    free(gz);
    free(bad);
    tt_termtable_free(t);
}

static void *fail_malloc(size_t n) { (void)n; return NULL; }
static void *fail_realloc(void *ptr, size_t n) { (void)ptr; (void)n; return NULL; }

static void test_out_of_memory(void **state)
{
    (void)state;
    static const tt_allocator failing = {fail_malloc, fail_realloc, free};
    tt_termtable *t = new_set();
    tt_error err;
    tt_error_init(&err);
    tt_set_allocator(&failing);
    tt_status st = tt_stopwords_load_text(t, "alpha\nbeta\n", 11, "oom.txt", &err);
    tt_stemmer *s = tt_stemmer_new();
    tt_set_allocator(NULL);
    assert_int_equal(st, TT_ENOMEM);
    assert_int_equal(err.status, TT_ENOMEM);
    assert_string_equal(err.file, "oom.txt");
    assert_int_equal(err.line, 1);
    assert_null(s);
    tt_termtable_free(t);
}

int main(void)
{
    tt_termtable_set_seed(0x0123456789abcdefull, 0xfedcba9876543210ull);
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_builtin),
        cmocka_unit_test(test_builtin_contents),
        cmocka_unit_test(test_format),
        cmocka_unit_test(test_entries_normalized),
        cmocka_unit_test(test_bad_lines),
        cmocka_unit_test(test_files),
        cmocka_unit_test(test_out_of_memory),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
