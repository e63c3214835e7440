/* Tests of lexicon loading and lookup (src/lexicon.c): the format, header
 * values, words, stems (Snowball English, the stems listed in Debian's
 * snowball-data vocabulary), phrases, terms under two categories, and the
 * bad inputs the tone issue names (empty lexicon, CRLF, BOM, a 1 MB line,
 * invalid UTF-8), each with its line. */
#include "tt_test.h"

#include "termtide/lexicon.h"

static tt_lexicon *load(const char *text, tt_status want, tt_error *err)
{
    tt_lexicon *lex = tt_lexicon_new();
    assert_non_null(lex);
    tt_error_init(err);
    assert_int_equal(tt_lexicon_load_text(lex, text, strlen(text), "test.lex", err), want);
    return lex;
}

static size_t cat_of(const tt_lexicon *lex, tt_lexicon_kind kind, const char *key)
{
    size_t idx[4];
    size_t n = tt_lexicon_match(lex, kind, key, strlen(key), idx, 4);
    assert_true(n >= 1);
    return tt_lexicon_entry_at(lex, idx[0])->category;
}

static void test_format(void **state)
{
    (void)state;
    tt_error err;
    tt_lexicon *lex = load("\xEF\xBB\xBF# name: sample\r\n# version: 2.1\r\n"
                           "# made: written for this test\r\n\r\n"
                           "Impairment\tnegative\r\n"
                           "strong\tpositive\t0.5\r\n"
                           "litigation*\tlegal\r\n"
                           "going  concern\tnegative\r\n"
                           "Company\xE2\x80\x99s\tpositive\r\n"
                           "liability\tlegal\r\n"
                           "liability\tconstraint\r\n",
                           TT_OK, &err);
    assert_string_equal(tt_lexicon_name(lex), "sample");
    assert_string_equal(tt_lexicon_version(lex), "2.1");
    assert_string_equal(tt_lexicon_made(lex), "written for this test");
    assert_int_equal(tt_lexicon_entry_count(lex), 7);
    assert_int_equal(tt_lexicon_category_count(lex), 4);
    assert_string_equal(tt_lexicon_category_name(lex, 0), "negative");
    tt_error e2;
    tt_error_init(&e2);
    assert_int_equal(tt_lexicon_category_find(lex, "legal", &e2), 2);
    assert_int_equal(tt_lexicon_category_find(lex, "optimism", &e2), -1);
    assert_non_null(strstr(e2.message, "optimism"));
    assert_non_null(strstr(e2.message, "negative, positive, legal, constraint"));
    /* words are normalized: case folded, possessive dropped */
    assert_int_equal(cat_of(lex, TT_LEXICON_WORD, "impairment"), 0);
    assert_int_equal(cat_of(lex, TT_LEXICON_WORD, "company"), 1);
    size_t idx[4];
    assert_int_equal(tt_lexicon_match(lex, TT_LEXICON_WORD, "strong", 6, idx, 4), 1);
    assert_true(tt_lexicon_entry_at(lex, idx[0])->weight == 0.5);
    /* a stem entry: "litigation" stems to "litig" (snowball-data output.txt) */
    assert_true(tt_lexicon_has_stems(lex));
    assert_int_equal(cat_of(lex, TT_LEXICON_STEM, "litig"), 2);
    /* a phrase, spaces collapsed */
    assert_int_equal(tt_lexicon_max_phrase_words(lex), 2);
    assert_int_equal(cat_of(lex, TT_LEXICON_PHRASE, "going concern"), 0);
    /* one term under two categories: both match, and the check lists it */
    assert_int_equal(tt_lexicon_match(lex, TT_LEXICON_WORD, "liability", 9, idx, 4), 2);
    size_t pairs[4][2];
    assert_int_equal(tt_lexicon_conflicts(lex, pairs, 4), 1);
    assert_int_equal(tt_lexicon_entry_at(lex, pairs[0][0])->line, 10);
    assert_int_equal(tt_lexicon_entry_at(lex, pairs[0][1])->line, 11);
    assert_int_equal(tt_lexicon_match(lex, TT_LEXICON_WORD, "absent", 6, idx, 4), 0);
    tt_lexicon_free(lex);
}

static void expect_error(const char *text, tt_status st, long line, const char *words)
{
    tt_error err;
    tt_lexicon *lex = load(text, st, &err);
    assert_string_equal(err.file, "test.lex");
    assert_int_equal(err.line, line);
    if (words && !strstr(err.message, words))
        fail_msg("message \"%s\" lacks \"%s\"", err.message, words);
    assert_int_equal(tt_lexicon_entry_count(lex), 0);
    tt_lexicon_free(lex);
}

static void test_errors(void **state)
{
    (void)state;
    expect_error("# only comments\n\n", TT_EINVAL, 0, "no entries");
    expect_error("", TT_EINVAL, 0, "no entries");
    expect_error("good\tnegative\nbad line without tab\n", TT_EPARSE, 2, "term<TAB>category");
    expect_error("a\tb\tc\td\n", TT_EPARSE, 1, "term<TAB>category");
    expect_error("word\tNegative\n", TT_EPARSE, 1, "lower-case");
    expect_error("word\tnegative\t-1\n", TT_EPARSE, 1, "positive number");
    expect_error("word\tnegative\tabc\n", TT_EPARSE, 1, "positive number");
    expect_error("wo*rd\tnegative\n", TT_EPARSE, 1, "'*'");
    expect_error("going concern*\tnegative\n", TT_EPARSE, 1, "single word");
    expect_error("a b c d e f g h i\tnegative\n", TT_EPARSE, 1, "phrase");
    /* 65 letters: one over TT_LIMIT_LEXICON_WORD_BYTES */
    expect_error("ok\tnegative\ngoing "
                 "aaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaa\tnegative\n",
                 TT_EPARSE, 2, "longer than");
    expect_error("ok\tnegative\nbad\xff\tnegative\n", TT_EPARSE, 2, "UTF-8");
    expect_error("ok\tnegative\nbad\x01word\tnegative\n", TT_EPARSE, 2, "control character");
    /* a 1 MB line */
    size_t n = 1 << 20;
    char *big = malloc(n + 32);
    memcpy(big, "fine\tpositive\n", 14);
    memset(big + 14, 'x', n);
    memcpy(big + 14 + n, "\tnegative\n", 11);
    expect_error(big, TT_ELIMIT, 2, "TT_LIMIT_LEXICON_LINE");
    free(big);
}

/* A failed load keeps what earlier loads added, and nothing of its own. */
static void test_rollback(void **state)
{
    (void)state;
    tt_error err;
    tt_lexicon *lex = load("first\tnegative\nshared\tpositive\n", TT_OK, &err);
    tt_error_init(&err);
    const char *bad = "shared\tlegal\nnew\tlegal\nbroken\n";
    assert_int_equal(tt_lexicon_load_text(lex, bad, strlen(bad), "second.lex", &err), TT_EPARSE);
    assert_int_equal(err.line, 3);
    assert_int_equal(tt_lexicon_entry_count(lex), 2);
    assert_int_equal(tt_lexicon_category_count(lex), 2);
    size_t idx[4];
    assert_int_equal(tt_lexicon_match(lex, TT_LEXICON_WORD, "shared", 6, idx, 4), 1);
    assert_int_equal(tt_lexicon_match(lex, TT_LEXICON_WORD, "new", 3, idx, 4), 0);
    assert_int_equal(tt_lexicon_match(lex, TT_LEXICON_WORD, "first", 5, idx, 4), 1);
    tt_lexicon_free(lex);
}

/* The shipped lexicon loads, has the five categories the tone issue names
 * and a header saying what it is. */
static void test_shipped(void **state)
{
    (void)state;
    FILE *f = fopen("lexicons/finance.txt", "r");
    if (!f) {
        print_message("lexicons/finance.txt not present yet\n");
        skip();
    }
    fclose(f);
    tt_lexicon *lex = tt_lexicon_new();
    tt_error err;
    tt_error_init(&err);
    assert_int_equal(tt_lexicon_load_file(lex, "lexicons/finance.txt", &err), TT_OK);
    const char *cats[] = { "negative", "positive", "hedging", "legal", "constraint" };
    for (int i = 0; i < 5; i++)
        assert_true(tt_lexicon_category_find(lex, cats[i], &err) >= 0);
    assert_true(tt_lexicon_entry_count(lex) >= 500);
    assert_true(tt_lexicon_name(lex)[0] && tt_lexicon_version(lex)[0] && tt_lexicon_made(lex)[0]);
    print_message("shipped lexicon: %zu entries\n", tt_lexicon_entry_count(lex));
    tt_lexicon_free(lex);
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_format),
        cmocka_unit_test(test_errors),
        cmocka_unit_test(test_rollback),
        cmocka_unit_test(test_shipped),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
