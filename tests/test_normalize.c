/* termtide tests — the normalize stage (src/normalize.c).
 *
 * Hand-written cases for the ASCII path and termtide's own rules
 * (apostrophes, dashes, possessives, edges), hand-written Unicode cases with
 * the source of each expected value, then a seeded sample of 2,000 non-ASCII
 * words checked against Python's unicodedata (the reference, computed at
 * test time by tests/fixtures/normalize/nfkc_casefold.py), an out-of-memory
 * check, and a throughput measurement (printed, not asserted). */
#include <time.h>

#include "tt_test.h"

#include "termtide/alloc.h"
#include "termtide/normalize.h"

#define VOC_PATH "/usr/share/snowball/data/english/voc.txt"
#define REF_SCRIPT "tests/fixtures/normalize/nfkc_casefold.py"
#define REF_SEED 20240
#define REF_COUNT 2000

struct norm_case {
    const char *in;
    const char *want;
};

static void check_cases(const struct norm_case *cases, size_t n)
{
    tt_normalizer nz;
    tt_buf out;
    tt_normalizer_init(&nz);
    tt_buf_init(&out, 0);
    for (size_t i = 0; i < n; i++) {
        assert_int_equal(tt_normalize(&nz, cases[i].in, strlen(cases[i].in), &out), TT_OK);
        if (out.len != strlen(cases[i].want) || memcmp(out.data, cases[i].want, out.len) != 0)
            fail_msg("normalize(\"%s\") = \"%s\", want \"%s\"", cases[i].in, out.data,
                     cases[i].want);
        assert_int_equal(out.data[out.len], '\0');
    }
    tt_buf_release(&out);
    tt_normalizer_release(&nz);
}

/* termtide's rules from normalize.h, on ASCII input (no utf8proc call). */
static void test_ascii(void **state)
{
    (void)state;
    static const struct norm_case cases[] = {
        {"Revenue", "revenue"},
        {"EBITDA", "ebitda"},
        {"company's", "company"},       /* possessive dropped */
        {"COMPANY'S", "company"},       /* ... after folding */
        {"companies'", "companies"},    /* plural possessive */
        {"don't", "don't"},             /* internal apostrophe kept */
        {"o'neill", "o'neill"},
        {"O'Neill's", "o'neill"},
        {"it's", "it"},                 /* 's dropped here too (see normalize.c) */
        {"'tis", "tis"},                /* leading apostrophe stripped */
        {"'quoted'", "quoted"},
        {"`quoted'", "quoted"},         /* '`' is an apostrophe */
        {"rock`n`roll", "rock'n'roll"},
        {"off-balance", "off-balance"}, /* internal hyphen kept */
        {"-sheet-", "sheet"},
        {"--'s", "s"},                  /* edges first: what is left is "s" */
        {"'s", "s"},
        {"s's", "s"},
        {"x's's", "x's"},               /* only one final possessive */
        {"q3", "q3"},
        {"10-k", "10-k"},
        {"'", ""},                      /* nothing left */
        {"''-'", ""},
        {"", ""},
        {"a", "a"},
        {"A1B2-C3", "a1b2-c3"},
    };
    check_cases(cases, sizeof cases / sizeof cases[0]);
}

/* Expected values: Unicode case folding (CaseFolding.txt, full folding, the
 * F and C lines) and NFKC (UAX #15, UnicodeData.txt decompositions), as
 * cited per line; the apostrophe and dash rows are termtide's own rule. */
static void test_unicode(void **state)
{
    (void)state;
    static const struct norm_case cases[] = {
        {"Company\u2019s", "company"},            /* U+2019 → ' then possessive */
        {"COMPANIES\u2019", "companies"},
        {"\u2018quoted\u2019", "quoted"},
        {"don\u2019t", "don't"},
        {"Stra\u00dfe", "strasse"},               /* CaseFolding: 00DF; F; 0073 0073 */
        {"STRA\u1e9eE", "strasse"},               /* CaseFolding: 1E9E; F; 0073 0073 */
        {"\ufb01nancial", "financial"},           /* NFKC: FB01 → 0066 0069 */
        {"\uff21\uff22\uff23", "abc"},            /* NFKC: FF21 → 0041, then fold */
        {"off\u2010balance", "off-balance"},      /* U+2010 HYPHEN → '-' */
        {"off\u2011balance", "off-balance"},      /* U+2011 NON-BREAKING HYPHEN */
        {"year\u2013end", "year-end"},            /* U+2013 EN DASH */
        {"\u00c5ngstr\u00f6m", "\u00e5ngstr\u00f6m"}, /* CaseFolding: 00C5; C; 00E5 */
        {"e\u0301", "\u00e9"},                    /* NFC composition: 0065 0301 → 00E9 */
        {"A\u030angstro\u0308m", "\u00e5ngstr\u00f6m"},
        {"\u212bngstr\u00f6m", "\u00e5ngstr\u00f6m"}, /* ANGSTROM SIGN: NFC → 00C5 */
        {"\u212a", "k"},                          /* KELVIN SIGN: NFC → 004B */
        {"\u017ftock", "stock"},                  /* LONG S: CaseFolding 017F; C; 0073 */
        {"\u039f\u0394\u039f\u03a3", "\u03bf\u03b4\u03bf\u03c3"}, /* final sigma folds to σ */
        {"\u041e\u0442\u0447\u0451\u0442", "\u043e\u0442\u0447\u0451\u0442"}, /* Cyrillic */
        {"\u2168", "ix"},                         /* ROMAN NUMERAL NINE: NFKC → "IX" */
        {"x\u00b2", "x2"},                        /* SUPERSCRIPT TWO: NFKC → "2" */
        {"\u0132ssel", "ijssel"},                 /* LIGATURE IJ: NFKC → "IJ" */
        {"caf\u00e9\u2019s", "caf\u00e9"},
    };
    check_cases(cases, sizeof cases / sizeof cases[0]);
}

/* Every variant listed in normalize.h, inside a word and as a possessive. */
static void test_variants(void **state)
{
    (void)state;
    static const char *const apostrophes[] = {"\u2018", "\u2019", "\u02bc", "\uff07",
                                              "`",      "\u00b4"};
    static const char *const dashes[] = {"\u2010", "\u2011", "\u2012", "\u2013",
                                         "\u2014", "\u2015", "\u2212", "\ufe58",
                                         "\ufe63", "\uff0d"};
    tt_normalizer nz;
    tt_buf out;
    char in[64];
    tt_normalizer_init(&nz);
    tt_buf_init(&out, 0);
    for (size_t i = 0; i < sizeof apostrophes / sizeof apostrophes[0]; i++) {
        snprintf(in, sizeof in, "Don%st", apostrophes[i]);
        assert_int_equal(tt_normalize(&nz, in, strlen(in), &out), TT_OK);
        assert_string_equal(out.data, "don't");
        snprintf(in, sizeof in, "Issuer%ss", apostrophes[i]);
        assert_int_equal(tt_normalize(&nz, in, strlen(in), &out), TT_OK);
        assert_string_equal(out.data, "issuer");
        snprintf(in, sizeof in, "%scaf\u00e9%s", apostrophes[i], apostrophes[i]);
        assert_int_equal(tt_normalize(&nz, in, strlen(in), &out), TT_OK);
        assert_string_equal(out.data, "caf\u00e9");
    }
    for (size_t i = 0; i < sizeof dashes / sizeof dashes[0]; i++) {
        snprintf(in, sizeof in, "Off%sBalance", dashes[i]);
        assert_int_equal(tt_normalize(&nz, in, strlen(in), &out), TT_OK);
        assert_string_equal(out.data, "off-balance");
        snprintf(in, sizeof in, "%sNet%s", dashes[i], dashes[i]);
        assert_int_equal(tt_normalize(&nz, in, strlen(in), &out), TT_OK);
        assert_string_equal(out.data, "net");
    }
    /* Variants that NFKC itself creates (UnicodeData.txt decompositions):
     * U+FF40 FULLWIDTH GRAVE ACCENT → U+0060; U+0149 ŉ → U+02BC U+006E;
     * U+FE31 PRESENTATION FORM FOR VERTICAL EM DASH → U+2014. */
    static const struct norm_case made_by_nfkc[] = {
        {"Don\uff40t", "don't"},
        {"a\u0149", "a'n"},
        {"\u0149", "n"},
        {"Off\ufe31Balance", "off-balance"},
    };
    tt_buf_release(&out);
    tt_normalizer_release(&nz);
    check_cases(made_by_nfkc, sizeof made_by_nfkc / sizeof made_by_nfkc[0]);
}

/* The header asks for valid UTF-8; a caller that breaks the promise gets
 * U+FFFD for each bad byte, not a crash. */
static void test_invalid_utf8(void **state)
{
    (void)state;
    tt_normalizer nz;
    tt_buf out;
    tt_normalizer_init(&nz);
    tt_buf_init(&out, 0);
    const char bad[] = "Caf\xc3\xa9\xc3";
    assert_int_equal(tt_normalize(&nz, bad, sizeof bad - 1, &out), TT_OK);
    assert_string_equal(out.data, "caf\u00e9\ufffd");
    const char surrogate[] = "\xed\xa0\x80X\xc3\xa9";
    assert_int_equal(tt_normalize(&nz, surrogate, sizeof surrogate - 1, &out), TT_OK);
    assert_string_equal(out.data, "\ufffd\ufffd\ufffdx\u00e9");
    /* An overlong form of '`' is not an apostrophe. */
    const char overlong[] = "a\xe0\x81\xa0" "b";
    assert_int_equal(tt_normalize(&nz, overlong, sizeof overlong - 1, &out), TT_OK);
    assert_string_equal(out.data, "a\ufffd\ufffd\ufffdb");
    tt_buf_release(&out);
    tt_normalizer_release(&nz);
}

/* A buffer grown for a long token is reused; out is reset each call. */
static void test_reuse(void **state)
{
    (void)state;
    tt_normalizer nz;
    tt_buf out;
    tt_buf big;
    tt_normalizer_init(&nz);
    tt_buf_init(&out, 0);
    tt_buf_init(&big, 0);
    /* U+FDFA decomposes to 18 code points under NFKC (UnicodeData.txt). */
    for (int i = 0; i < 100; i++)
        assert_int_equal(tt_buf_puts(&big, "\ufdfa"), TT_OK);
    assert_int_equal(tt_normalize(&nz, big.data, big.len, &out), TT_OK);
    assert_int_equal(tt_utf8_length(out.data, out.len), 1800);
    size_t cap = nz.cps_cap;
    assert_true(cap >= 1800);
    assert_int_equal(tt_normalize(&nz, "\u00c9t\u00c9", strlen("\u00c9t\u00c9"), &out), TT_OK);
    assert_string_equal(out.data, "\u00e9t\u00e9");
    assert_int_equal(nz.cps_cap, cap);
    tt_buf_release(&big);
    tt_buf_release(&out);
    tt_normalizer_release(&nz);
}

static void test_utf8_length(void **state)
{
    (void)state;
    assert_int_equal(tt_utf8_length("", 0), 0);
    assert_int_equal(tt_utf8_length("abc", 3), 3);
    const char *s = "\u00c5ngstr\u00f6m";
    assert_int_equal(tt_utf8_length(s, strlen(s)), 8);
    s = "\U0001d400\u4e2d\u00e9a"; /* 4 + 3 + 2 + 1 bytes */
    assert_int_equal(tt_utf8_length(s, strlen(s)), 4);
}

/* ---- the Python reference ---- */

static size_t unhex(const char *h, size_t n, char *out)
{
    size_t k = 0;
    for (size_t i = 0; i + 1 < n; i += 2) {
        unsigned v = 0;
        for (int j = 0; j < 2; j++) {
            char c = h[i + (size_t)j];
            v = v * 16 + (unsigned)(c <= '9' ? c - '0' : (c | 32) - 'a' + 10);
        }
        out[k++] = (char)v;
    }
    return k;
}

struct ref_row {
    char word[512], plain[4096], per_char[4096], reason[32];
    size_t word_len, plain_len, per_char_len;
    long codepoints;
};

/* Splits "A\tB\tC\tD\tE\n" into the row; 0 on a malformed line. */
static int parse_row(char *line, struct ref_row *r)
{
    char *f[5];
    f[0] = line;
    for (int i = 1; i < 5; i++) {
        char *t = strchr(f[i - 1], '\t');
        if (!t)
            return 0;
        *t = '\0';
        f[i] = t + 1;
    }
    f[4][strcspn(f[4], "\n")] = '\0';
    if (strlen(f[0]) / 2 > sizeof r->word || strlen(f[1]) / 2 > sizeof r->plain ||
        strlen(f[2]) / 2 > sizeof r->per_char || strlen(f[3]) >= sizeof r->reason)
        return 0;
    r->word_len = unhex(f[0], strlen(f[0]), r->word);
    r->plain_len = unhex(f[1], strlen(f[1]), r->plain);
    r->per_char_len = unhex(f[2], strlen(f[2]), r->per_char);
    snprintf(r->reason, sizeof r->reason, "%s", f[3]);
    r->codepoints = strtol(f[4], NULL, 10);
    return 1;
}

/* Reference: Python 3.11's unicodedata (Unicode 14.0) and str.casefold (full
 * case folding, as utf8proc's UTF8PROC_CASEFOLD), run at test time. The
 * sample holds only characters assigned in Unicode 14.0, so both sides know
 * them (utf8proc here is on 15.0; normalization and folding of assigned
 * characters are stable across versions). termtide must equal the PERCHAR
 * reference on every word: the Unicode Standard's own construction of
 * toNFKC_Casefold (map each character, then NFC). Against the PLAIN one,
 * NFKC(w).casefold(), it may differ only for the two reasons the script
 * names (folding output not in NFC; U+0345 folding to a starter), and the
 * count of each is printed. */
static void test_python_reference(void **state)
{
    (void)state;
    char cmd[512];
    snprintf(cmd, sizeof cmd, "%s %s %d %d", tt_test_python(), REF_SCRIPT, REF_SEED, REF_COUNT);
    FILE *p = popen(cmd, "r");
    assert_non_null(p);

    static char line[32768];
    static struct ref_row r;
    tt_normalizer nz;
    tt_buf out;
    tt_normalizer_init(&nz);
    tt_buf_init(&out, 0);
    long rows = 0, bad = 0, diff_nfc = 0, diff_ypo = 0, unexplained = 0;
    while (fgets(line, sizeof line, p)) {
        if (!parse_row(line, &r))
            fail_msg("malformed reference line %ld", rows + 1);
        rows++;
        assert_int_equal(tt_normalize(&nz, r.word, r.word_len, &out), TT_OK);
        if (out.len != r.per_char_len || memcmp(out.data, r.per_char, out.len) != 0) {
            if (bad++ < 10)
                print_message("differs: \"%.*s\" -> \"%s\", Python \"%.*s\"\n", (int)r.word_len,
                              r.word, out.data, (int)r.per_char_len, r.per_char);
        }
        if (out.len != r.plain_len || memcmp(out.data, r.plain, out.len) != 0) {
            if (strcmp(r.reason, "nfc") == 0)
                diff_nfc++;
            else if (strcmp(r.reason, "ypogegrammeni") == 0)
                diff_ypo++;
            else
                unexplained++;
        }
        assert_int_equal((long)tt_utf8_length(r.word, r.word_len), r.codepoints);
    }
    int rc = pclose(p);
    tt_buf_release(&out);
    tt_normalizer_release(&nz);
    print_message("Python reference: %ld words, %ld differ from PERCHAR; against PLAIN: "
                  "%ld differ because folding output is not NFC, %ld because of U+0345, "
                  "%ld unexplained\n",
                  rows, bad, diff_nfc, diff_ypo, unexplained);
    assert_int_equal(rc, 0);
    assert_int_equal(rows, REF_COUNT);
    assert_int_equal(bad, 0);
    assert_int_equal(unexplained, 0);
}

/* ---- out of memory ---- */

static void *fail_malloc(size_t n) { (void)n; return NULL; }
static void *fail_realloc(void *ptr, size_t n) { (void)ptr; (void)n; return NULL; }

static void test_out_of_memory(void **state)
{
    (void)state;
    static const tt_allocator failing = {fail_malloc, fail_realloc, free};
    tt_normalizer nz;
    tt_buf out;
    tt_normalizer_init(&nz);
    tt_buf_init(&out, 0);
    tt_set_allocator(&failing);
    tt_status a = tt_normalize(&nz, "Revenue", 7, &out);
    tt_status b = tt_normalize(&nz, "Stra\u00dfe", strlen("Stra\u00dfe"), &out);
    tt_set_allocator(NULL);
    assert_int_equal(a, TT_ENOMEM);
    assert_int_equal(b, TT_ENOMEM);
    /* And it recovers once memory is back. */
    assert_int_equal(tt_normalize(&nz, "Stra\u00dfe", strlen("Stra\u00dfe"), &out), TT_OK);
    assert_string_equal(out.data, "strasse");
    tt_buf_release(&out);
    tt_normalizer_release(&nz);
}

/* ---- throughput (printed, not asserted) ---- */

struct token_list {
    char *text;    /* tokens, NUL-separated */
    size_t *off, *len;
    size_t n, bytes;
};

static double now_seconds(void)
{
    struct timespec ts;
    clock_gettime(CLOCK_MONOTONIC, &ts);
    return (double)ts.tv_sec + (double)ts.tv_nsec * 1e-9;
}

static void measure(const char *label, const struct token_list *t, int passes)
{
    tt_normalizer nz;
    tt_buf out;
    tt_normalizer_init(&nz);
    tt_buf_init(&out, 0);
    size_t sink = 0;
    double t0 = now_seconds();
    for (int p = 0; p < passes; p++)
        for (size_t i = 0; i < t->n; i++) {
            if (tt_normalize(&nz, t->text + t->off[i], t->len[i], &out) != TT_OK)
                fail_msg("normalize failed during measurement");
            sink += out.len;
        }
    double dt = now_seconds() - t0;
    double mb = (double)t->bytes * passes / 1e6;
    print_message("throughput %-40s %8.1f MB/s %7.2f M tokens/s (%zu tokens x %d, %zu B out)\n",
                  label, mb / dt, (double)t->n * passes / dt / 1e6, t->n, passes, sink);
    tt_buf_release(&out);
    tt_normalizer_release(&nz);
}

/* Builds a token list from words, each written with prefix/suffix. */
static void tokens_from_words(struct token_list *t, char **words, size_t n,
                              const char *suffix)
{
    size_t total = 0;
    for (size_t i = 0; i < n; i++)
        total += strlen(words[i]) + strlen(suffix) + 1;
    t->text = malloc(total + 1);
    t->off = malloc(n * sizeof *t->off);
    t->len = malloc(n * sizeof *t->len);
    assert_non_null(t->text);
    assert_non_null(t->off);
    assert_non_null(t->len);
    size_t pos = 0;
    t->bytes = 0;
    for (size_t i = 0; i < n; i++) {
        int k = snprintf(t->text + pos, total + 1 - pos, "%s%s", words[i], suffix);
        t->off[i] = pos;
        t->len[i] = (size_t)k;
        t->bytes += (size_t)k;
        pos += (size_t)k + 1;
    }
    t->n = n;
}

static void free_tokens(struct token_list *t)
{
    free(t->text);
    free(t->off);
    free(t->len);
}

static char **read_lines(FILE *f, size_t *n_out, int field_hex)
{
    size_t n = 0, cap = 1024;
    char **v = malloc(cap * sizeof *v);
    static char line[32768];
    assert_non_null(v);
    while (fgets(line, sizeof line, f)) {
        size_t k = strcspn(line, field_hex ? "\t\n" : "\r\n");
        if (k == 0)
            continue;
        if (n == cap) {
            cap *= 2;
            v = realloc(v, cap * sizeof *v);
            assert_non_null(v);
        }
        char *w = malloc(k + 1);
        assert_non_null(w);
        if (field_hex) {
            size_t m = unhex(line, k, w);
            w[m] = '\0';
        } else {
            memcpy(w, line, k);
            w[k] = '\0';
        }
        v[n++] = w;
    }
    *n_out = n;
    return v;
}

static void free_lines(char **v, size_t n)
{
    for (size_t i = 0; i < n; i++)
        free(v[i]);
    free(v);
}

static void test_throughput(void **state)
{
    (void)state;
    /* English words: the Snowball vocabulary (Debian snowball-data). */
    FILE *f = fopen(VOC_PATH, "r");
    assert_non_null(f);
    size_t nvoc;
    char **voc = read_lines(f, &nvoc, 0);
    fclose(f);
    /* Non-ASCII words: the seeded sample of the reference script. */
    char cmd[512];
    snprintf(cmd, sizeof cmd, "%s %s %d %d", tt_test_python(), REF_SCRIPT, REF_SEED, REF_COUNT);
    FILE *p = popen(cmd, "r");
    assert_non_null(p);
    size_t nuni;
    char **uni = read_lines(p, &nuni, 1);
    assert_int_equal(pclose(p), 0);

    struct token_list t;
    tokens_from_words(&t, voc, nvoc, "");
    measure("ASCII words (Snowball vocabulary)", &t, 20);
    free_tokens(&t);
    tokens_from_words(&t, voc, nvoc, "\u2019s");
    measure("same + typographic possessive (non-ASCII)", &t, 5);
    free_tokens(&t);
    /* Latin words with one accented letter, as in names and loanwords;
     * these take the utf8proc path. */
    for (size_t i = 0; i < nvoc; i++) {
        size_t k = strlen(voc[i]);
        char *w = malloc(k + 3);
        assert_non_null(w);
        snprintf(w, k + 3, "%s\u00e9", voc[i]);
        free(voc[i]);
        voc[i] = w;
    }
    tokens_from_words(&t, voc, nvoc, "");
    measure("same + \"\u00e9\" (utf8proc path)", &t, 5);
    free_tokens(&t);
    tokens_from_words(&t, uni, nuni, "");
    measure("non-ASCII sample (reference words)", &t, 20);
    free_tokens(&t);

    free_lines(voc, nvoc);
    free_lines(uni, nuni);
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_ascii),
        cmocka_unit_test(test_unicode),
        cmocka_unit_test(test_variants),
        cmocka_unit_test(test_invalid_utf8),
        cmocka_unit_test(test_reuse),
        cmocka_unit_test(test_utf8_length),
        cmocka_unit_test(test_python_reference),
        cmocka_unit_test(test_out_of_memory),
        cmocka_unit_test(test_throughput),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
