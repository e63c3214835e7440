/* termtide tests — the tokenizer of the segment stage.
 *
 * Word boundaries themselves are checked against Unicode's WordBreakTest.txt
 * in test_wordbreak_uax29.c; here the expected tokens follow from those
 * rules (UAX #29, Unicode 15.0, section 4.1.1; the rule that decides each
 * case is named beside it, with the Word_Break values of
 * WordBreakProperty.txt) and from the token contract in
 * include/termtide/segment.h (hyphen joining, letter or digit, sentence
 * starts, the TT_LIMIT_TOKEN_BYTES limit).
 *
 * Tokens are written as "text/W" (word) or "text/N" (number), with a
 * leading "^" for a sentence start, separated by single spaces. */
#include "tt_test.h"
#include "tt_test_termtable.h"

#include <time.h>

#include "termtide/alloc.h"
#include "termtide/count.h"
#include "termtide/limits.h"
#include "termtide/normalize.h"
#include "termtide/segment.h"
#include "termtide/simd.h"
#include "termtide/termtable.h"

/* Renders every token of text into out. */
static void render(const char *text, size_t len, char *out, size_t size,
                   size_t *overlong)
{
    tt_tokenizer t;
    tt_token tok;
    size_t o = 0;
    tt_tokenizer_init(&t, text, len);
    out[0] = '\0';
    while (tt_tokenizer_next(&t, &tok)) {
        assert_true(tok.off + tok.len <= len);
        assert_true(tok.len > 0);
        int n = snprintf(out + o, size - o, "%s%s%.*s/%c", o ? " " : "",
                         tok.sentence_start ? "^" : "", (int)tok.len, text + tok.off,
                         tok.kind == TT_TOKEN_WORD ? 'W' : 'N');
        assert_true(n > 0 && (size_t)n < size - o);
        o += (size_t)n;
    }
    /* At the end it stays at the end. */
    assert_int_equal(tt_tokenizer_next(&t, &tok), 0);
    if (overlong)
        *overlong = t.overlong;
}

static void expect_tokens(const char *text, const char *want)
{
    char got[4096];
    render(text, strlen(text), got, sizeof got, NULL);
    if (strcmp(got, want) != 0) {
        print_error("text: \"%s\"\n  want: %s\n  got:  %s\n", text, want, got);
        fail();
    }
}

static void test_plain_words(void **state)
{
    (void)state;
    /* WB5 keeps letters together; WB3d/WB999 split at spaces. */
    expect_tokens("Revenue rose in the quarter", "^Revenue/W rose/W in/W the/W quarter/W");
    expect_tokens("", "");
    expect_tokens("  \t\n ... ", "");
    /* Letters and digits stay together (WB9, WB10), '_' too (WB13a/b). */
    expect_tokens("Q3 2024 FY2025 tier_1", "^Q3/W 2024/N FY2025/W tier_1/W");
    /* Tab is Word_Break Other, so it breaks like a space. */
    expect_tokens("net\tincome\r\nnext", "^net/W income/W next/W");

    tt_tokenizer t;
    tt_token tok;
    tt_tokenizer_init(&t, NULL, 0);
    assert_int_equal(tt_tokenizer_next(&t, &tok), 0);
}

static void test_hyphens(void **state)
{
    (void)state;
    /* Hyphen-minus is Word_Break Other, so UAX #29 breaks around it
     * (WB999); the tokenizer joins token, one hyphen, token. */
    expect_tokens("off-balance-sheet items", "^off-balance-sheet/W items/W");
    expect_tokens("the Form 10-K filing", "^the/W Form/W 10-K/W filing/W");
    expect_tokens("fiscal 2024-2025 plan", "^fiscal/W 2024-2025/N plan/W");
    /* U+2010 HYPHEN and U+2011 NON-BREAKING HYPHEN join too. */
    expect_tokens("co\xE2\x80\x90op non\xE2\x80\x91" "cash",
                  "^co\xE2\x80\x90op/W non\xE2\x80\x91" "cash/W");
    /* U+2013 EN DASH is a dash, not a hyphen: no join. */
    expect_tokens("2024\xE2\x80\x93" "2025", "^2024/N 2025/N");
    /* Two hyphens, spaced hyphens, leading and trailing hyphens: no join. */
    expect_tokens("cash--flow", "^cash/W flow/W");
    expect_tokens("cash - flow", "^cash/W flow/W");
    expect_tokens("well- and -5 and x-", "^well/W and/W 5/N and/W x/W");
    /* A combining mark on the hyphen (attached by WB4) makes it more than a
     * hyphen: no join. */
    expect_tokens("a-\xCC\x81" "b", "^a/W b/W");
    /* The part after the hyphen must hold a letter or a digit. */
    expect_tokens("x-$ y", "^x/W y/W");
    /* A joined word is one token; a sentence end after it still counts. */
    expect_tokens("up-to-date. Next", "^up-to-date/W ^Next/W");
    expect_tokens("well-. Next", "^well/W ^Next/W");
}

static void test_apostrophes(void **state)
{
    (void)state;
    /* U+0027 is Single_Quote and U+2019 is MidNumLet: between letters
     * neither breaks (WB6, WB7). */
    expect_tokens("the company's debt", "^the/W company's/W debt/W");
    expect_tokens("the company\xE2\x80\x99s debt", "^the/W company\xE2\x80\x99s/W debt/W");
    expect_tokens("don't", "^don't/W");
    /* Not followed by a letter: WB6 does not apply, the quote breaks off. */
    expect_tokens("the companies' debt", "^the/W companies/W debt/W");
    expect_tokens("'quoted'", "^quoted/W");
    /* MidLetter ':' joins letters (WB6, WB7) but not digits (MidLetter is
     * not in WB11/WB12). */
    expect_tokens("a:b 10:30", "^a:b/W 10/N 30/N");
}

static void test_numbers(void **state)
{
    (void)state;
    /* ',' is MidNum and '.' MidNumLet: between digits no break (WB11,
     * WB12). */
    expect_tokens("1,200.50 dollars", "^1,200.50/N dollars/W");
    /* '%' is Other: WB999 breaks it off, and it is no token. */
    expect_tokens("up 3.5% on", "^up/W 3.5/N on/W");
    /* '$' is Other. */
    expect_tokens("$1.2 billion", "^1.2/N billion/W");
    /* The euro sign (U+20AC, Other, a currency symbol) is not a token. */
    expect_tokens("\xE2\x82\xAC", "");
    expect_tokens("\xE2\x82\xAC" "5 or 5\xE2\x82\xAC", "^5/N or/W 5/N");
    /* A trailing separator is not followed by a digit: WB12 fails. */
    expect_tokens("in 2024, sales", "^in/W 2024/N sales/W");
    /* A decimal point inside a number is no sentence end. */
    expect_tokens("3.5 million", "^3.5/N million/W");
    /* Fullwidth digits are Numeric (WB8). */
    expect_tokens("\xEF\xBC\x91\xEF\xBC\x92", "^\xEF\xBC\x91\xEF\xBC\x92/N");
    /* Arabic-Indic digits (General_Category Nd) are Numeric too. */
    expect_tokens("\xD9\xA1\xD9\xA2", "^\xD9\xA1\xD9\xA2/N");
}

static void test_sentence_starts(void **state)
{
    (void)state;
    expect_tokens("Sales rose. Costs fell! Why? Margins held\xE2\x80\xA6 then grew",
                  "^Sales/W rose/W ^Costs/W fell/W ^Why/W ^Margins/W held/W ^then/W grew/W");
    /* A terminal inside quotes or brackets still ends the sentence. */
    expect_tokens("it said \"done.\" Then (see below.) more",
                  "^it/W said/W done/W ^Then/W see/W below/W ^more/W");
    /* Non-terminal punctuation does not. */
    expect_tokens("first; second: third, fourth", "^first/W second/W third/W fourth/W");
    /* U+3002 IDEOGRAPHIC FULL STOP, U+FF01 and U+FF1F fullwidth ! and ?,
     * U+FF0E FULLWIDTH FULL STOP. */
    expect_tokens("\xE5\xA3\xB2\xE3\x80\x82\xE5\x88\xA9\xEF\xBC\x81\xE7\x9B\x8A"
                  "\xEF\xBC\x9F\xE9\xA1\x8D\xEF\xBC\x8E\xE9\xAB\x98",
                  "^\xE5\xA3\xB2/W ^\xE5\x88\xA9/W ^\xE7\x9B\x8A/W ^\xE9\xA1\x8D/W ^\xE9\xAB\x98/W");
    /* Only the first token after the end is marked, however many ends. */
    expect_tokens("one... !? two three", "^one/W ^two/W three/W");
}

static void test_non_ascii(void **state)
{
    (void)state;
    /* Precomposed accented letters are ALetter (WB5). */
    expect_tokens("Ren\xC3\xA9" "e Br\xC3\xB8nholt-\xC3\x85" "berg",
                  "^Ren\xC3\xA9" "e/W Br\xC3\xB8nholt-\xC3\x85" "berg/W");
    /* A combining acute (Extend) stays with its letter (WB4). */
    expect_tokens("Rene\xCC\x81" "e", "^Rene\xCC\x81" "e/W");
    /* Greek letters are ALetter. */
    expect_tokens("\xCE\x97 \xCE\xB5\xCF\x84\xCE\xB1\xCE\xB9\xCF\x81\xCE\xB5\xCE\xAF\xCE\xB1",
                  "^\xCE\x97/W \xCE\xB5\xCF\x84\xCE\xB1\xCE\xB9\xCF\x81\xCE\xB5\xCE\xAF\xCE\xB1/W");
    /* CJK ideographs are Word_Break Other, so each is its own segment
     * (WB999), and each is a letter (General_Category Lo): one token each.
     * U+4F1A U+8BA1 U+5E74 U+5EA6. */
    expect_tokens("\xE4\xBC\x9A\xE8\xAE\xA1\xE5\xB9\xB4\xE5\xBA\xA6",
                  "^\xE4\xBC\x9A/W \xE8\xAE\xA1/W \xE5\xB9\xB4/W \xE5\xBA\xA6/W");
    /* Katakana stays together (WB13): U+30C7 U+30FC U+30BF. */
    expect_tokens("\xE3\x83\x87\xE3\x83\xBC\xE3\x82\xBF", "^\xE3\x83\x87\xE3\x83\xBC\xE3\x82\xBF/W");
    /* Hebrew with a geresh-like apostrophe (WB7a) and gershayim (WB7b/c):
     * U+05D0 U+0027 and U+05D0 U+0022 U+05D1. */
    expect_tokens("\xD7\x90' \xD7\x90\"\xD7\x91", "^\xD7\x90'/W \xD7\x90\"\xD7\x91/W");
    /* No-break space (U+00A0) is Other: it splits words. */
    expect_tokens("ten\xC2\xA0percent", "^ten/W percent/W");
    /* Emoji and regional-indicator flags are not tokens (no letter or
     * digit), and a ZWJ sequence (WB3c) does not glue words. */
    expect_tokens("ok \xF0\x9F\x91\x8D\xE2\x80\x8D\xF0\x9F\x94\xA5 \xF0\x9F\x87\xA9\xF0\x9F\x87\xAA go",
                  "^ok/W go/W");
}

/* Makes text of `prefix`, n copies of `unit` (truncated to n bytes), then
 * `suffix`. The caller frees it. */
static char *make_run(const char *prefix, const char *unit, size_t n, const char *suffix,
                      size_t *len_out)
{
    size_t lp = strlen(prefix), lu = strlen(unit), ls = strlen(suffix);
    char *s = malloc(lp + n + ls + 1);
    assert_non_null(s);
    memcpy(s, prefix, lp);
    for (size_t i = 0; i < n; i++)
        s[lp + i] = unit[i % lu];
    memcpy(s + lp + n, suffix, ls + 1);
    *len_out = lp + n + ls;
    return s;
}

static double now_seconds(void)
{
    struct timespec ts;
    clock_gettime(CLOCK_MONOTONIC, &ts);
    return (double)ts.tv_sec + (double)ts.tv_nsec / 1e9;
}

static void test_overlong(void **state)
{
    (void)state;
    char got[4096];
    size_t len, overlong;
    char *s;

    /* Exactly at the limit is kept; one byte more is skipped. */
    s = make_run("a ", "x", TT_LIMIT_TOKEN_BYTES, " b", &len);
    render(s, len, got, sizeof got, &overlong);
    assert_int_equal(overlong, 0);
    assert_int_equal(strlen(got), strlen("^a/W ") + TT_LIMIT_TOKEN_BYTES + strlen("/W b/W"));
    free(s);
    s = make_run("a ", "x", TT_LIMIT_TOKEN_BYTES + 1, " b", &len);
    render(s, len, got, sizeof got, &overlong);
    assert_int_equal(overlong, 1);
    assert_string_equal(got, "^a/W b/W");
    free(s);

    /* The limit counts the whole joined token. */
    s = make_run("a ", "xy-", TT_LIMIT_TOKEN_BYTES + 2, " b", &len);
    render(s, len, got, sizeof got, &overlong);
    assert_int_equal(overlong, 1);
    assert_string_equal(got, "^a/W b/W");
    free(s);

    /* A 50 MB run of letters: skipped, counted once, and the next token
     * still comes. A pending sentence start waits for it. */
    const size_t big = (size_t)50 * 1024 * 1024;
    s = make_run("Done. ", "abcdefghij", big, " next word", &len);
    double t0 = now_seconds();
    render(s, len, got, sizeof got, &overlong);
    double t1 = now_seconds();
    assert_int_equal(overlong, 1);
    assert_string_equal(got, "^Done/W ^next/W word/W");
    free(s);

    /* 50 MB of hyphen-joined parts: one overlong token, walked once. */
    s = make_run("", "ab-", big, "c tail", &len);
    double t2 = now_seconds();
    render(s, len, got, sizeof got, &overlong);
    double t3 = now_seconds();
    assert_int_equal(overlong, 1);
    assert_string_equal(got, "^tail/W");
    free(s);

    /* 50 MB of one letter with combining marks (WB4 path, non-ASCII). */
    s = make_run("x ", "e\xCC\x81", big - big % 3, " y", &len);
    render(s, len, got, sizeof got, &overlong);
    assert_int_equal(overlong, 1);
    assert_string_equal(got, "^x/W y/W");
    free(s);

    printf("overlong: 50 MB letter run in %.3f s, 50 MB hyphen chain in %.3f s\n",
           t1 - t0, t3 - t2);
}

/* A 50 MB run of letters after "a:" plus 50 MB of combining marks: the
 * WB6 lookahead crosses the marks, and still the walk is linear. */
static void test_lookahead_linear(void **state)
{
    (void)state;
    const size_t big = (size_t)16 * 1024 * 1024;
    size_t len, overlong;
    char got[256];
    char *s = make_run("go a:", "\xCC\x81", big, "b. z", &len);
    render(s, len, got, sizeof got, &overlong);
    assert_int_equal(overlong, 1);
    assert_string_equal(got, "^go/W ^z/W");
    free(s);
    s = make_run("go 1.", "\xCC\x81", big, " z", &len);
    render(s, len, got, sizeof got, &overlong);
    assert_int_equal(overlong, 0);
    /* "1" then "." with its marks (WB12 fails, WB4 attaches the marks to
     * the '.'), which is a sentence end. */
    assert_string_equal(got, "^go/W 1/N ^z/W");
    free(s);
}

/* Every token is a view into the text at the right place. */
static void test_views(void **state)
{
    (void)state;
    const char *text = "Net sales, 2025: 1,200.";
    tt_tokenizer t;
    tt_token tok;
    tt_tokenizer_init(&t, text, strlen(text));
    assert_int_equal(tt_tokenizer_next(&t, &tok), 1);
    assert_int_equal(tok.off, 0);
    assert_int_equal(tok.len, 3);
    assert_int_equal(tt_tokenizer_next(&t, &tok), 1);
    assert_int_equal(tok.off, 4);
    assert_int_equal(tt_tokenizer_next(&t, &tok), 1);
    assert_int_equal(tok.off, 11);
    assert_int_equal(tok.kind, TT_TOKEN_NUMBER);
    assert_int_equal(tt_tokenizer_next(&t, &tok), 1);
    assert_int_equal(tok.off, 17);
    assert_int_equal(tok.len, 5);
    assert_int_equal(tt_tokenizer_next(&t, &tok), 0);
}

/* The tokenizer has its own fast paths (ASCII punctuation never enters the
 * boundary walk). Here random strings are tokenized twice: by the
 * tokenizer, and by a plain reference written from the contract in
 * segment.h on top of tt_wordbreak_next() (itself checked against Unicode's
 * WordBreakTest.txt). Which characters are letters, digits and sentence
 * terminals is labelled by hand below (General_Category and
 * Sentence_Terminal from the Unicode Character Database). */
typedef struct rnd_char {
    const char *utf8;
    int word;     /* 1 letter, 2 digit, 0 neither */
    int terminal; /* ends a sentence */
} rnd_char;

static const rnd_char rnd_alphabet[] = {
    { "a", 1, 0 }, { "Z", 1, 0 }, { "q", 1, 0 },
    { "Operating_income2025Segments", 3, 0 }, /* a long ASCII run */
    { "   ", 0, 0 },
    { "\xC3\xA9", 1, 0 },          /* U+00E9 e acute, Ll */
    { "\xCF\x89", 1, 0 },          /* U+03C9 omega, Ll */
    { "\xD7\x90", 1, 0 },          /* U+05D0 alef, Hebrew_Letter */
    { "\xE3\x82\xAB", 1, 0 },      /* U+30AB katakana ka */
    { "\xE3\x81\xAE", 1, 0 },      /* U+306E hiragana no, Lo */
    { "\xE4\xBC\x9A", 1, 0 },      /* U+4F1A ideograph, Lo */
    { "0", 2, 0 }, { "7", 2, 0 }, { "1,250", 2, 0 }, { "3.5", 2, 0 },
    { "\xD9\xA1", 2, 0 },          /* U+0661 Arabic-Indic one, Nd */
    { " ", 0, 0 }, { " ", 0, 0 }, { "\t", 0, 0 }, { "\n", 0, 0 }, { "\r", 0, 0 },
    { ".", 0, 1 }, { "!", 0, 1 }, { "?", 0, 1 },
    { "\xE2\x80\xA6", 0, 1 },      /* U+2026 ellipsis */
    { "\xE3\x80\x82", 0, 1 },      /* U+3002 ideographic full stop */
    { ",", 0, 0 }, { ":", 0, 0 }, { ";", 0, 0 }, { "'", 0, 0 }, { "\"", 0, 0 },
    { "_", 0, 0 }, { "-", 0, 0 }, { "-", 0, 0 }, { "$", 0, 0 }, { "%", 0, 0 },
    { "\xE2\x80\x90", 0, 0 },      /* U+2010 hyphen */
    { "\xE2\x80\x93", 0, 0 },      /* U+2013 en dash */
    { "\xE2\x82\xAC", 0, 0 },      /* U+20AC euro */
    { "\xE2\x80\x99", 0, 0 },      /* U+2019 right single quote */
    { "\xC2\xA0", 0, 0 },          /* U+00A0 no-break space */
    { "\xC2\xAD", 0, 0 },          /* U+00AD soft hyphen, Format */
    { "\xCC\x81", 0, 0 },          /* U+0301 combining acute, Extend */
    { "\xE2\x80\x8D", 0, 0 },      /* U+200D ZWJ */
    { "\xF0\x9F\x91\x8D", 0, 0 },  /* U+1F44D emoji */
    { "\xF0\x9F\x87\xA9", 0, 0 },  /* U+1F1E9 regional indicator */
};

/* A second alphabet, mostly ASCII prose (words, figures, spaces and the
 * punctuation around them, the dashes, quotes and euro sign of filings),
 * so that texts hold long ASCII stretches, which the tokenizer takes a
 * 64-byte window at a time, with now and then a character the windows
 * leave to the walk: a non-ASCII letter, U+2010 HYPHEN, U+2026, a
 * combining mark, U+200C (Extend), U+202F (ExtendNumLet), a lone '_', and
 * characters whose bytes are close to those the windows know. */
static const rnd_char prose_alphabet[] = {
    { "the", 1, 0 }, { "of", 1, 0 }, { "and", 1, 0 }, { "Revenue", 1, 0 }, { "margin", 1, 0 },
    { "the", 1, 0 }, { "of", 1, 0 }, { "x", 1, 0 }, { "Q", 1, 0 }, { "year", 1, 0 },
    { "U.S", 1, 0 }, { "Inc", 1, 0 }, { "No", 1, 0 }, { "etc", 1, 0 }, { "e.g", 1, 0 },
    { "2025", 2, 0 }, { "1,250", 2, 0 }, { "3.5", 2, 0 }, { "0", 2, 0 }, { "a1", 1, 0 },
    { " ", 0, 0 }, { " ", 0, 0 }, { " ", 0, 0 }, { " ", 0, 0 }, { " ", 0, 0 }, { " ", 0, 0 },
    { "  ", 0, 0 }, { "\n", 0, 0 }, { "\r", 0, 0 }, { "\t", 0, 0 },
    { ".", 0, 1 }, { ".", 0, 1 }, { "!", 0, 1 }, { "?", 0, 1 },
    { ",", 0, 0 }, { ",", 0, 0 }, { ";", 0, 0 }, { ":", 0, 0 }, { "'", 0, 0 }, { "\"", 0, 0 },
    { "(", 0, 0 }, { ")", 0, 0 }, { "$", 0, 0 }, { "%", 0, 0 }, { "/", 0, 0 }, { "&", 0, 0 },
    { "-", 0, 0 }, { "-", 0, 0 }, { "-", 0, 0 }, { "_", 0, 0 },
    { "\xE2\x80\x99", 0, 0 },      /* U+2019 right single quote, MidNumLet */
    { "\xE2\x80\x99", 0, 0 },
    { "\xE2\x80\x98", 0, 0 },      /* U+2018 left single quote, MidNumLet */
    { "\xE2\x80\x9C", 0, 0 },      /* U+201C left double quote */
    { "\xE2\x80\x9D", 0, 0 },      /* U+201D right double quote */
    { "\xE2\x80\x93", 0, 0 },      /* U+2013 en dash */
    { "\xE2\x80\x94", 0, 0 },      /* U+2014 em dash */
    { "\xE2\x82\xAC", 0, 0 },      /* U+20AC euro */
    { "\xC3\xA9", 1, 0 },           /* U+00E9 e acute, Ll */
    { "\xE2\x80\x90", 0, 0 },      /* U+2010 hyphen */
    { "\xE2\x80\xA6", 0, 1 },      /* U+2026 ellipsis */
    { "\xCC\x81", 0, 0 },           /* U+0301 combining acute, Extend */
    { "\xE2\x80\x8C", 0, 0 },      /* U+200C zero width non-joiner, Extend */
    { "\xE2\x80\xAF", 0, 0 },      /* U+202F narrow no-break space, ExtendNumLet */
    { "\xE2\x82\x93", 1, 0 },      /* U+2093 subscript x, Lm (the bytes of U+2013 but one) */
    { "\xE2\x80\xAC", 0, 0 },      /* U+202C pop directional formatting, Format */
    /* two-byte letters and their neighbours, which the windows take as
     * letters (U+00C0-U+027F but U+00D7 and U+00F7, ALetter) */
    { "\xC4\x8D", 1, 0 },           /* U+010D c caron, Ll */
    { "\xC3\x80", 1, 0 },           /* U+00C0 A grave, Lu */
    { "\xC9\xBF", 1, 0 },           /* U+027F, Ll: the range's last */
    { "\xC3\x97", 0, 0 },           /* U+00D7 multiplication sign, Other */
    { "\xC3\xB7", 0, 0 },           /* U+00F7 division sign, Other */
    { "\xCA\x80", 1, 0 },           /* U+0280, Ll: just past the range */
    { "\xC2\xAA", 1, 0 },           /* U+00AA feminine ordinal, Lo: just before */
};

static int is_hyphen(const char *s, size_t len)
{
    return (len == 1 && s[0] == '-') ||
           (len == 3 && (memcmp(s, "\xE2\x80\x90", 3) == 0 || memcmp(s, "\xE2\x80\x91", 3) == 0));
}

/* segment.h's abbreviations, written out again for the reference: 1 when
 * w (n bytes) ends no sentence by its period; *suffix = 1 for a company
 * suffix (its period ends one unless a lower-case word or number follows). */
static int abbreviation(const char *w, size_t n, int *suffix)
{
    static const char *const never[] = {
        "mr", "mrs", "ms", "dr", "prof", "no", "nos", "vs", "approx", "fig", "figs", "sec",
        "secs", "st", "jr", "sr", "e.g", "i.e", "u.s", "u.k", "cf", "al", "p", "pp", "vol",
        "dept", "govt", "jan", "feb", "apr", "jun", "jul", "aug", "sep", "sept", "oct", "nov",
        "dec", "est", "ref", "art", "para", "ch", "sch", "u.s.a", "n.y", "d.c" };
    static const char *const company[] = { "inc", "corp", "co", "ltd", "llc", "plc", "lp", "l.p",
                                           "n.a", "s.a", "nv", "n.v", "ag", "etc", "bros", "assn" };
    char low[64];
    if (n == 1 && w[0] >= 'A' && w[0] <= 'Z')
        return 1;
    if (n >= sizeof low)
        return 0;
    for (size_t i = 0; i < n; i++)
        low[i] = (char)(w[i] >= 'A' && w[i] <= 'Z' ? w[i] + 32 : w[i]);
    low[n] = '\0';
    for (size_t i = 0; i < sizeof never / sizeof *never; i++)
        if (!strcmp(low, never[i]))
            return 1;
    for (size_t i = 0; i < sizeof company / sizeof *company; i++)
        if (!strcmp(low, company[i]))
            *suffix = 1;
    return 0;
}

/* The sentence starts around the abbreviations of filings (segment.h). */
static void test_abbreviations(void **state)
{
    (void)state;
    static const struct {
        const char *text, *starts;
    } cases[] = {
        { "Ruddock & Thane Castings, Inc. of Ironlee ships. They grew.", "Ruddock They" },
        { "We sold it to Brackwater Foundry, Inc. The board agreed.", "We The" },
        { "See Note No. 3 and the U.S. Securities rules. Fine.", "See Fine" },
        { "Costs rose approx. 5% and Mr. Ossenbrook said so, e.g. in May. Done.", "Costs Done" },
        { "J. Smith signed on Aug. 7 at the St. Louis office. Next.", "J Next" },
        { "Revenue was 1.5 million. Costs fell.", "Revenue Costs" },
        { "The plan has two parts: 1. Revenue. 2. Costs.", "The Revenue 2 Costs" },
        { "Supplies, etc. are listed. Corp. rules apply.", "Supplies Corp" },
    };
    for (size_t i = 0; i < sizeof cases / sizeof *cases; i++) {
        tt_tokenizer t;
        tt_token tok;
        char got[256] = "";
        size_t o = 0;
        tt_tokenizer_init(&t, cases[i].text, strlen(cases[i].text));
        while (tt_tokenizer_next(&t, &tok))
            if (tok.sentence_start)
                o += (size_t)snprintf(got + o, sizeof got - o, "%s%.*s", o ? " " : "",
                                      (int)tok.len, cases[i].text + tok.off);
        if (strcmp(got, cases[i].starts))
            fail_msg("%s\n  sentence starts: %s\n  expected:        %s", cases[i].text, got,
                     cases[i].starts);
    }
}

#define NALPHA(a) (sizeof(a) / sizeof(a)[0])

/* cases random texts of up to maxch characters from alphabet. Each goes
 * through the tokenizer (a token at a time, and in batches) and through a
 * counter with the default options, which takes the windows' tokens itself
 * (its fused path, src/count.c): the tokens, sentence starts and numbers
 * must be the reference's, and the terms those tt_normalize makes of the
 * reference's words. */
static void random_against_reference(const rnd_char *alphabet, size_t nalpha, int cases,
                                     size_t maxch, uint32_t x)
{
    tt_count_options opt;
    tt_count_options_init(&opt);
    tt_counter *counter = tt_counter_new(&opt);
    assert_non_null(counter);
    tt_normalizer nz;
    tt_normalizer_init(&nz);
    tt_buf normal;
    tt_buf_init(&normal, 0);
    enum { MAXCH = 400 };
    char text[MAXCH * 4 + 1];
    unsigned char word_at[MAXCH * 4], term_at[MAXCH * 4];
    size_t seg_a[MAXCH * 4], seg_b[MAXCH * 4];
    assert_true(maxch <= MAXCH);

    for (int k = 0; k < cases; k++) {
        size_t len = 0;
        x = x * 1664525u + 1013904223u;
        size_t nch = 1 + (x >> 16) % maxch;
        for (size_t i = 0; i < nch; i++) {
            x = x * 1664525u + 1013904223u;
            const rnd_char *c = &alphabet[(x >> 12) % nalpha];
            size_t n = strlen(c->utf8);
            memset(word_at + len, 0, n);
            memset(term_at + len, 0, n);
            word_at[len] = (unsigned char)c->word;
            term_at[len] = (unsigned char)c->terminal;
            memcpy(text + len, c->utf8, n);
            len += n;
        }
        text[len] = '\0';

        /* Reference: segments, then the contract's joining rule. */
        size_t nseg = 0;
        for (size_t p = 0; p < len;) {
            size_t e = tt_wordbreak_next(text, len, p);
            assert_true(e > p && e <= len);
            seg_a[nseg] = p;
            seg_b[nseg++] = e;
            p = e;
        }
        char want[MAXCH * 8 + 1], got[MAXCH * 8 + 1];
        size_t o = 0;
        int at_start = 1, suffix = 0;
        size_t prev_a = (size_t)-1, prev_b = (size_t)-1;
        want[0] = '\0';
        tt_termtable *ref_terms = tt_termtable_new();
        assert_non_null(ref_terms);
        uint64_t ref_tokens = 0, ref_sentences = 0, ref_numbers = 0, ref_overlong = 0;
        for (size_t i = 0; i < nseg;) {
            int word = 0, term = 0;
            for (size_t q = seg_a[i]; q < seg_b[i]; q++) {
                word |= word_at[q];
                term |= term_at[q];
            }
            if (!word) {
                if (term) {
                    /* the abbreviation rule of segment.h: a lone period right
                     * after an initial or a listed abbreviation ends nothing */
                    suffix = 0;
                    if (seg_b[i] == seg_a[i] + 1 && text[seg_a[i]] == '.' && prev_b == seg_a[i] &&
                        abbreviation(text + prev_a, prev_b - prev_a, &suffix)) {
                        i++;
                        continue;
                    }
                    at_start = 1;
                }
                i++;
                continue;
            }
            size_t start = seg_a[i], end = seg_b[i], j = i + 1;
            while (j + 1 < nseg && is_hyphen(text + seg_a[j], seg_b[j] - seg_a[j])) {
                int next_word = 0;
                for (size_t q = seg_a[j + 1]; q < seg_b[j + 1]; q++)
                    next_word |= word_at[q];
                if (!next_word)
                    break;
                word |= next_word;
                end = seg_b[j + 1];
                j += 2;
            }
            if (at_start && suffix && ((text[start] >= 'a' && text[start] <= 'z') ||
                                       (text[start] >= '0' && text[start] <= '9')))
                at_start = 0;
            suffix = 0;
            /* a number holds no letter (segment.h); '#' marks one */
            o += (size_t)snprintf(want + o, sizeof want - o, "%s%s%s%.*s", o ? " " : "",
                                  at_start ? "^" : "", (word & 1) ? "" : "#",
                                  (int)(end - start), text + start);
            ref_tokens++;
            ref_sentences += (uint64_t)at_start;
            if (!(word & 1)) {
                ref_numbers++;
            } else {
                tt_status ns = tt_normalize(&nz, text + start, end - start, &normal);
                if (ns == TT_ELIMIT)
                    ref_overlong++; /* the counter skips such a term (count.c) */
                else if (assert_int_equal(ns, TT_OK), normal.len)
                    assert_int_equal(tt_termtable_add(ref_terms, normal.data, normal.len, 1),
                                     TT_OK);
            }
            at_start = 0;
            prev_a = start;
            prev_b = end;
            i = j;
        }

        /* The tokenizer: the spans, kinds and sentence starts, a token at
         * a time and in batches of 1 to 5 and 16 (tt_tokenizer_fill). */
        for (int way = 0; way < 2; way++) {
            tt_tokenizer t;
            tt_token toks[16];
            size_t batch = way ? 1 + (size_t)k % 6 : 1;
            if (batch == 6)
                batch = 16;
            o = 0;
            got[0] = '\0';
            tt_tokenizer_init(&t, text, len);
            for (;;) {
                size_t n = way ? tt_tokenizer_fill(&t, toks, batch)
                               : (size_t)tt_tokenizer_next(&t, &toks[0]);
                for (size_t q = 0; q < n; q++)
                    o += (size_t)snprintf(got + o, sizeof got - o, "%s%s%s%.*s", o ? " " : "",
                                          toks[q].sentence_start ? "^" : "",
                                          toks[q].kind == TT_TOKEN_NUMBER ? "#" : "",
                                          (int)toks[q].len, text + toks[q].off);
                if (n < batch)
                    break;
            }
            if (strcmp(want, got) != 0) {
                print_error("case %d (%s), text (%zu bytes):", k,
                            way ? "tt_tokenizer_fill" : "tt_tokenizer_next", len);
                for (size_t q = 0; q < len; q++)
                    print_error(" %02X", (unsigned char)text[q]);
                print_error("\n  want: %s\n  got:  %s\n", want, got);
                fail();
            }
        }

        tt_termtable *got_terms = tt_termtable_new();
        assert_non_null(got_terms);
        tt_doc_stats st;
        memset(&st, 0, sizeof st);
        assert_int_equal(tt_counter_count_text(counter, text, len, got_terms, &st), TT_OK);
        if (st.words_read != ref_tokens || st.sentences != ref_sentences ||
            st.numbers != ref_numbers || st.overlong != ref_overlong) {
            print_error("case %d, text (%zu bytes):", k, len);
            for (size_t q = 0; q < len; q++)
                print_error(" %02X", (unsigned char)text[q]);
            fail_msg("\n  counter: %llu tokens, %llu sentences, %llu numbers, %llu overlong"
                     "\n  want:    %llu tokens, %llu sentences, %llu numbers, %llu overlong\n  %s",
                     (unsigned long long)st.words_read, (unsigned long long)st.sentences,
                     (unsigned long long)st.numbers, (unsigned long long)st.overlong,
                     (unsigned long long)ref_tokens, (unsigned long long)ref_sentences,
                     (unsigned long long)ref_numbers, (unsigned long long)ref_overlong, want);
        }
        char what[32];
        snprintf(what, sizeof what, "case %d", k);
        tt_test_same_table(got_terms, ref_terms, what);
        assert_int_equal(st.terms_kept, tt_termtable_total(ref_terms));
        tt_termtable_free(got_terms);
        tt_termtable_free(ref_terms);
    }
    tt_buf_release(&normal);
    tt_normalizer_release(&nz);
    tt_counter_free(counter);
}

/* Short texts, and texts long enough to cross the tokenizer's 64-byte chunks
 * (with words and separator runs across their edges), with the chunk masks
 * made by AVX2 (where the CPU has it), by SSE2 and by the portable code. */
static void test_random_against_reference(void **state)
{
    (void)state;
    int simd = tt_simd(1);
    for (int mode = 0; mode < 3; mode++) {
        tt_simd(mode < 2);
        int level = tt_simd_level(mode == 0 ? TT_SIMD_AVX2 : TT_SIMD_SSE2);
        if (mode == 0 && level != TT_SIMD_AVX2)
            continue; /* no AVX2 here */
        random_against_reference(rnd_alphabet, NALPHA(rnd_alphabet), 20000, 40, 2025u);
        random_against_reference(rnd_alphabet, NALPHA(rnd_alphabet), 3000, 400, 77u);
        random_against_reference(prose_alphabet, NALPHA(prose_alphabet), 6000, 400, 1913u);
    }
    tt_simd_level(TT_SIMD_AVX2);
    tt_simd(simd);
}

/* English-like text: invented vocabulary, numbers, punctuation, sentences,
 * from a fixed seed. */
static char *make_prose(size_t want, size_t *len_out)
{
    static const char *const words[] = {
        "the", "company", "revenue", "increased", "during", "quarter", "of", "and",
        "risk", "factors", "may", "adversely", "affect", "our", "results", "operations",
        "net", "income", "per", "share", "fiscal", "year", "compared", "with", "prior",
        "off-balance-sheet", "arrangements", "company's", "liquidity", "capital", "in",
        "to", "a", "for", "management", "believes", "that", "uncertain", "litigation",
    };
    static const char *const puncts[] = { " ", " ", " ", " ", " ", ", ", ". ", "; " };
    char *s = malloc(want + 64);
    assert_non_null(s);
    size_t o = 0;
    uint32_t x = 12345u;
    while (o < want) {
        x = x * 1103515245u + 12345u;
        uint32_t r = x >> 8;
        if (r % 17 == 0)
            o += (size_t)snprintf(s + o, 64, "%u,%03u.%02u", r % 1000, r % 997, r % 89);
        else {
            const char *w = words[r % (sizeof words / sizeof words[0])];
            size_t n = strlen(w);
            memcpy(s + o, w, n);
            o += n;
        }
        const char *p = puncts[(r >> 7) % (sizeof puncts / sizeof puncts[0])];
        size_t n = strlen(p);
        memcpy(s + o, p, n);
        o += n;
    }
    *len_out = o;
    return s;
}

static void test_throughput(void **state)
{
    (void)state;
    size_t len;
    char *s = make_prose((size_t)8 * 1024 * 1024, &len);
    double best = 1e9;
    size_t count = 0;
    for (int rep = 0; rep < 5; rep++) {
        tt_tokenizer t;
        tt_token tok;
        size_t n = 0;
        double t0 = now_seconds();
        tt_tokenizer_init(&t, s, len);
        while (tt_tokenizer_next(&t, &tok))
            n++;
        double dt = now_seconds() - t0;
        if (dt < best)
            best = dt;
        count = n;
    }
    assert_true(count > len / 16);
    /* Informational only: never asserted. */
    printf("tokenizer throughput: %.1f MB/s (%.1f MB of English-like text, %zu tokens, best of 5)\n",
           (double)len / 1e6 / best, (double)len / 1e6, count);
    free(s);
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_plain_words),
        cmocka_unit_test(test_hyphens),
        cmocka_unit_test(test_apostrophes),
        cmocka_unit_test(test_numbers),
        cmocka_unit_test(test_sentence_starts),
        cmocka_unit_test(test_non_ascii),
        cmocka_unit_test(test_overlong),
        cmocka_unit_test(test_lookahead_linear),
        cmocka_unit_test(test_views),
        cmocka_unit_test(test_random_against_reference),
        cmocka_unit_test(test_abbreviations),
        cmocka_unit_test(test_throughput),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
