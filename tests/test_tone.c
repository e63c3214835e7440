/* Tests of tone scoring (src/tone.c): the negation window (inside, at and
 * beyond three words; across a sentence end), phrases within a sentence,
 * stem entries, and category shares of a fixture against an independent
 * computation at test time with Python's standard library (re). */
#include <math.h>
#include <sys/wait.h>
#include <unistd.h>

#include "tt_test.h"

#include "termtide/lexicon.h"
#include "termtide/stats.h"
#include "termtide/tone.h"

static const char lexicon_text[] = "# name: test\n"
                                   "strong\tpositive\n"
                                   "good\tpositive\n"
                                   "improved\tpositive\t0.5\n"
                                   "weak\tnegative\n"
                                   "decline\tnegative\n"
                                   "going concern\tnegative\n"
                                   "substantial doubt\tnegative\n"
                                   "litigation*\tlegal\n"
                                   "may\thedging\n";

typedef struct fixture {
    tt_lexicon *lex;
    tt_tone *tone;
    tt_tone_scores s;
    long pos, neg, legal;
} fixture;

static void setup_fixture(fixture *f)
{
    tt_error err;
    tt_error_init(&err);
    f->lex = tt_lexicon_new();
    assert_int_equal(tt_lexicon_load_text(f->lex, lexicon_text, strlen(lexicon_text), "t", &err),
                     TT_OK);
    tt_tone_options o;
    tt_tone_options_init(&o, f->lex);
    f->pos = o.positive;
    f->neg = o.negative;
    f->legal = tt_lexicon_category_find(f->lex, "legal", NULL);
    assert_true(f->pos >= 0 && f->neg >= 0 && f->legal >= 0);
    f->tone = tt_tone_new(&o);
    assert_non_null(f->tone);
    assert_int_equal(tt_tone_scores_init(&f->s, f->lex), TT_OK);
}

static void teardown_fixture(fixture *f)
{
    tt_tone_scores_release(&f->s);
    tt_tone_free(f->tone);
    tt_lexicon_free(f->lex);
}

static void score(fixture *f, const char *text)
{
    tt_tone_scores_reset(&f->s);
    assert_int_equal(tt_tone_score_text(f->tone, text, strlen(text), &f->s), TT_OK);
}

/* Loughran & McDonald (2011): a positive word with a negator among the three
 * words before it, in the same sentence, is not positive (counted negative
 * here, a common variant). */
static void test_negation_window(void **state)
{
    (void)state;
    fixture f;
    setup_fixture(&f);
    score(&f, "Demand was not strong.");            /* 1 word before */
    assert_int_equal(f.s.matches[f.pos], 0);
    assert_int_equal(f.s.matches[f.neg], 1);
    assert_int_equal(f.s.negated, 1);
    score(&f, "Not the very strong quarter.");      /* exactly 3 words before */
    assert_int_equal(f.s.matches[f.neg], 1);
    score(&f, "Not the very best strong quarter."); /* 4 words before: beyond */
    assert_int_equal(f.s.matches[f.pos], 1);
    assert_int_equal(f.s.matches[f.neg], 0);
    score(&f, "Results were never good. Strong demand followed."); /* across a sentence end */
    assert_int_equal(f.s.matches[f.neg], 1);
    assert_int_equal(f.s.matches[f.pos], 1);
    score(&f, "No decline occurred.");              /* a negated negative stays negative */
    assert_int_equal(f.s.matches[f.neg], 1);
    assert_int_equal(f.s.negated, 0);
    score(&f, "Margins improved.");
    assert_true(fabs(f.s.weight[f.pos] - 0.5) < 1e-12);
    assert_true(isnan(tt_tone_net(&(tt_tone_scores){ 0 }, -1, 0)));
    teardown_fixture(&f);
}

static void test_phrases_and_stems(void **state)
{
    (void)state;
    fixture f;
    setup_fixture(&f);
    score(&f, "There is substantial doubt about our ability to continue as a going concern.");
    assert_int_equal(f.s.matches[f.neg], 2);
    score(&f, "We kept going. Concern grew.");      /* never across a sentence end */
    assert_int_equal(f.s.matches[f.neg], 0);
    /* litigation* matches words stemming to "litig" (Snowball English:
     * litigation -> litig, per snowball-data output.txt) */
    score(&f, "Litigations and litigated claims; litigation costs.");
    assert_int_equal(f.s.matches[f.legal], 3);
    assert_int_equal(f.s.words, 6);
    teardown_fixture(&f);
}

/* Shares per 1,000 words of a fixture against Python: words are runs of
 * ASCII letters (the fixture has no apostrophes, hyphens or digits), lower
 * cased; sentences end at . ! ?; a positive word with no/not/never/none/
 * neither/nobody among the three words before it in its sentence counts as
 * negative. */
static void test_shares_against_python(void **state)
{
    (void)state;
    fixture f;
    setup_fixture(&f);
    const char *text =
        "Demand was strong and margins improved. The board may review the decline. "
        "Results were not good in the east region and weak in the west. Strong orders may "
        "offset the decline. Management said the outlook was good, not weak, and that the "
        "quarter was never strong enough to lift the margin. Good cash flow helped.";
    score(&f, text);
    char path[] = TT_TEST_TMP "tt_tone_XXXXXX";
    int fd = mkstemp(path);
    assert_true(fd >= 0);
    assert_int_equal(write(fd, text, strlen(text)), (ssize_t)strlen(text));
    close(fd);
    char cmd[4096];
    snprintf(cmd, sizeof cmd,
             "%s -c '\n"
             "import re, sys\n"
             "lex = {\"strong\": (\"positive\", 1), \"good\": (\"positive\", 1), \"improved\": (\"positive\", 0.5),\n"
             "       \"weak\": (\"negative\", 1), \"decline\": (\"negative\", 1), \"may\": (\"hedging\", 1)}\n"
             "neg = {\"no\", \"not\", \"none\", \"neither\", \"never\", \"nobody\"}\n"
             "text = open(sys.argv[1]).read()\n"
             "w = {\"positive\": 0.0, \"negative\": 0.0, \"hedging\": 0.0}\n"
             "words = 0\n"
             "for sent in re.split(r\"[.!?]\", text):\n"
             "    toks = [t.lower() for t in re.findall(r\"[A-Za-z]+\", sent)]\n"
             "    for i, t in enumerate(toks):\n"
             "        words += 1\n"
             "        if t in lex:\n"
             "            cat, wt = lex[t]\n"
             "            if cat == \"positive\" and any(x in neg for x in toks[max(0, i - 3):i]): cat = \"negative\"\n"
             "            w[cat] += wt\n"
             "print(words, \"%%.10f %%.10f %%.10f\" %% tuple(1000 * w[c] / words for c in (\"positive\", \"negative\", \"hedging\")))\n"
             "' %s",
             tt_test_python(), path);
    FILE *p = popen(cmd, "r");
    assert_non_null(p);
    unsigned long words = 0;
    double ref[3];
    assert_int_equal(fscanf(p, "%lu %lf %lf %lf", &words, &ref[0], &ref[1], &ref[2]), 4);
    assert_int_equal(pclose(p), 0);
    unlink(path);
    assert_int_equal(f.s.words, words);
    long hedging = tt_lexicon_category_find(f.lex, "hedging", NULL);
    double mine[3] = { 1000 * f.s.weight[f.pos] / (double)f.s.words,
                       1000 * f.s.weight[f.neg] / (double)f.s.words,
                       1000 * f.s.weight[hedging] / (double)f.s.words };
    for (int i = 0; i < 3; i++)
        if (fabs(mine[i] - ref[i]) > 1e-6)
            fail_msg("category %d: %.10f per 1,000 words, Python says %.10f", i, mine[i], ref[i]);
    print_message("shares per 1,000 words: positive %.3f negative %.3f hedging %.3f (%lu words)\n",
                  mine[0], mine[1], mine[2], words);
    teardown_fixture(&f);
}

static char *capture(const char *args, int *status)
{
    char cmd[4096];
    snprintf(cmd, sizeof cmd, "%s %s 2>&1", tt_test_bin(), args);
    FILE *p = popen(cmd, "r");
    assert_non_null(p);
    size_t cap = 1 << 18, n = 0, k;
    char *out = malloc(cap);
    while ((k = fread(out + n, 1, cap - 1 - n, p)) > 0)
        n += k;
    out[n] = '\0';
    int st = pclose(p);
    *status = WIFEXITED(st) ? WEXITSTATUS(st) : -1;
    return out;
}

/* The demo corpus's invented story through the program with the shipped
 * lexicon: net tone of the first company's calls is positive before the
 * supply crisis, negative through 2024-Q2..Q4, positive again by 2025-Q4;
 * the negative share peaks inside the crisis. */
static void test_demo_story(void **state)
{
    (void)state;
    int st;
    char *out = capture("tone --quiet --no-header demo-corpus/hollowmere/2023-Q3-call-transcript.txt "
                        "demo-corpus/hollowmere/2024-Q3-call-transcript.txt "
                        "demo-corpus/hollowmere/2025-Q4-call-transcript.txt", &st);
    assert_int_equal(st, 0);
    double net[3], negative[3];
    char *line = out;
    for (int i = 0; i < 3; i++) {
        char *f[20];
        int k = 0;
        char *save = NULL;
        char *end = strchr(line, '\n');
        assert_non_null(end);
        *end = '\0';
        for (char *t = strtok_r(line, "\t", &save); t && k < 20; t = strtok_r(NULL, "\t", &save))
            f[k++] = t;
        assert_int_equal(k, 15); /* document words 5x(count rate) net net_per_1000 negated */
        negative[i] = strtod(f[3], NULL);
        net[i] = strtod(f[12], NULL);
        line = end + 1;
    }
    assert_true(net[0] > 0.3 && net[1] < -0.3 && net[2] > 0.3);
    assert_true(negative[1] > 2 * negative[0] && negative[1] > 2 * negative[2]);
    free(out);
    /* per period with the manifest: negative language rises into 2024-Q2
     * significantly (p < 0.05) and falls out of 2025-Q3 significantly */
    out = capture("tone --quiet --manifest demo-corpus/manifest.tsv --kinds call-transcript "
                  "--entity hollowmere --consecutive", &st);
    assert_int_equal(st, 0);
    char *rise = strstr(out, "hollowmere\t2024-Q1\t2024-Q2\tnegative\t");
    char *fall = strstr(out, "hollowmere\t2025-Q3\t2025-Q4\tnegative\t");
    assert_non_null(rise);
    assert_non_null(fall);
    char *r_end = strchr(rise, '\n'), *f_end = strchr(fall, '\n');
    *r_end = '\0';
    *f_end = '\0';
    assert_non_null(strstr(rise, "\trise"));
    assert_non_null(strstr(fall, "\tfall"));
    char *rp = strrchr(rise, '\t');
    *rp = '\0';
    assert_true(strtod(strrchr(rise, '\t') + 1, NULL) < 0.05);
    char *fp = strrchr(fall, '\t');
    *fp = '\0';
    assert_true(strtod(strrchr(fall, '\t') + 1, NULL) < 0.05);
    free(out);
    out = capture("tone --check", &st);
    assert_int_equal(st, 0);
    assert_non_null(strstr(out, "terms under more than one category"));
    free(out);
    out = capture("tone --lexicon tests/fixtures/cli/ascii_prose.txt demo-corpus/hollowmere", &st);
    assert_int_equal(st, 2);
    assert_non_null(strstr(out, "ascii_prose.txt: line 1:"));
    free(out);
}

/* The two-proportion z-test of a category's share between two periods:
 * z² and p against scipy.stats.chi2_contingency(correction=False) on the
 * same 2×2 table (Debian python3-scipy), with weighted (non-integer) counts
 * as tone produces them. */
static void test_two_proportion_against_scipy(void **state)
{
    (void)state;
    char path[] = TT_TEST_TMP "tt_tone_z_XXXXXX";
    int fd = mkstemp(path);
    assert_true(fd >= 0);
    FILE *f = fdopen(fd, "w");
    double zs[40], ps[40];
    for (int i = 0; i < 40; i++) {
        double n1 = 500 + 97 * i, n2 = 800 + 61 * i;
        double x1 = 0.5 * (i % 17) + 1, x2 = 0.5 * ((i * 7) % 29) + 2;
        tt_two_proportion_z(x1, n1, x2, n2, &zs[i], &ps[i]);
        fprintf(f, "%.17g %.17g %.17g %.17g\n", x1, n1, x2, n2);
    }
    fclose(f);
    char cmd[2048];
    snprintf(cmd, sizeof cmd,
             "%s -c '\n"
             "import sys\n"
             "from scipy.stats import chi2_contingency\n"
             "for line in open(sys.argv[1]):\n"
             "    x1, n1, x2, n2 = map(float, line.split())\n"
             "    c, p, dof, e = chi2_contingency([[x1, n1 - x1], [x2, n2 - x2]], correction=False)\n"
             "    print(\"%%.17g %%.17g\" %% (c, p))\n"
             "' %s",
             tt_test_python(), path);
    FILE *py = popen(cmd, "r");
    assert_non_null(py);
    for (int i = 0; i < 40; i++) {
        double chi2, p;
        assert_int_equal(fscanf(py, "%lf %lf", &chi2, &p), 2);
        if (fabs(zs[i] * zs[i] - chi2) > 1e-9 * chi2 + 1e-12 || fabs(ps[i] - p) > 1e-9 * p + 1e-15)
            fail_msg("case %d: z^2 %.12g p %.12g, SciPy chi2 %.12g p %.12g", i, zs[i] * zs[i],
                     ps[i], chi2, p);
    }
    assert_int_equal(pclose(py), 0);
    unlink(path);
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_negation_window),
        cmocka_unit_test(test_phrases_and_stems),
        cmocka_unit_test(test_shares_against_python),
        cmocka_unit_test(test_demo_story),
        cmocka_unit_test(test_two_proportion_against_scipy),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
