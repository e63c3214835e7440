/* Tests of tone scoring (src/tone.c): the negation window (inside, at and
 * beyond three words; across a sentence end), phrases within a sentence,
 * stem entries, and category shares of a fixture against an independent
 * computation at test time with Python's standard library (re). */
#include <ctype.h>
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
                                   "ahead of plan\tpositive\n"
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
    /* a phrase of three words, after other words of the sentence */
    score(&f, "Shipments ran well ahead of plan.");
    assert_int_equal(f.s.matches[f.pos], 1);
    /* its words are normalized again from the text: in upper case they
     * still make the phrase */
    score(&f, "AHEAD OF PLAN, and ahead of plan.");
    assert_int_equal(f.s.matches[f.pos], 2);
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
    /* three times over: more words than the scorer takes from the
     * tokenizer at once */
#define SHARES_TEXT \
        "Demand was strong and margins improved. The board may review the decline. " \
        "Results were not good in the east region and weak in the west. Strong orders may " \
        "offset the decline. Management said the outlook was good, not weak, and that the " \
        "quarter was never strong enough to lift the margin. Good cash flow helped."
    const char *text = SHARES_TEXT " " SHARES_TEXT " " SHARES_TEXT;
#undef SHARES_TEXT
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

/* The entries behind a category, heaviest first; a negated positive entry
 * stands under negative with negated = 1. */
static void test_contributors(void **state)
{
    (void)state;
    fixture f;
    setup_fixture(&f);
    score(&f, "Weak demand. A weak quarter and a decline. Not strong. Strong and good and "
              "improved, improved, improved.");
    tt_tone_contribution top[8];
    size_t n = 0;
    assert_int_equal(tt_tone_top(&f.s, f.lex, (size_t)f.neg, f.neg, top, 8, &n), TT_OK);
    assert_int_equal(n, 3);
    assert_string_equal(tt_lexicon_entry_at(f.lex, top[0].entry)->term, "weak");
    assert_int_equal(top[0].matches, 2);
    assert_string_equal(tt_lexicon_entry_at(f.lex, top[1].entry)->term, "decline");
    assert_string_equal(tt_lexicon_entry_at(f.lex, top[2].entry)->term, "strong");
    assert_int_equal(top[2].negated, 1);
    assert_int_equal(tt_tone_top(&f.s, f.lex, (size_t)f.pos, f.neg, top, 2, &n), TT_OK);
    assert_int_equal(n, 2);
    /* improved: 3 x 0.5 = 1.5 outweighs strong and good (1 each) */
    assert_string_equal(tt_lexicon_entry_at(f.lex, top[0].entry)->term, "improved");
    assert_true(fabs(top[0].weight - 1.5) < 1e-12);
    assert_string_equal(tt_lexicon_entry_at(f.lex, top[1].entry)->term, "good");
    assert_string_equal(tt_lexicon_entry_at(f.lex, top[1].entry)->written, "good");
    /* packing round trip, and sums */
    tt_buf b;
    tt_buf_init(&b, 0);
    assert_int_equal(tt_tone_scores_pack(&f.s, &b), TT_OK);
    assert_int_equal(tt_tone_scores_pack(&f.s, &b), TT_OK);
    tt_tone_scores sum;
    assert_int_equal(tt_tone_scores_init(&sum, f.lex), TT_OK);
    const char *p = b.data;
    size_t len = b.len;
    assert_int_equal(tt_tone_scores_add_packed(&sum, &p, &len), TT_OK);
    assert_int_equal(tt_tone_scores_add_packed(&sum, &p, &len), TT_OK);
    assert_int_equal(len, 0);
    assert_int_equal(sum.words, 2 * f.s.words);
    assert_int_equal(sum.negated, 2);
    for (size_t k = 0; k < sum.n_categories; k++)
        assert_true(fabs(sum.weight[k] - 2 * f.s.weight[k]) < 1e-12);
    len = 7; /* truncated: refused */
    p = b.data;
    assert_int_equal(tt_tone_scores_add_packed(&sum, &p, &len), TT_EINVAL);
    tt_tone_scores_release(&sum);
    tt_buf_release(&b);
    teardown_fixture(&f);
}

static char *capture(const char *args, int *status)
{
    return tt_test_run(args, 1, status);
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

/* Output is identical for any thread count, in every view. */
static void test_threads_identical(void **state)
{
    (void)state;
    static const char *const views[] = {
        "demo-corpus/hollowmere demo-corpus/ambleworth --total",
        "--by part,role demo-corpus/hollowmere demo-corpus/ambleworth",
        "--contributors --top 5 demo-corpus/hollowmere",
        "--sentences demo-corpus/ambleworth/2024-Q3-call-transcript.txt "
        "demo-corpus/ambleworth/2025-Q2-quarterly-report.htm",
        "--speakers demo-corpus/hollowmere",
        "--manifest demo-corpus/manifest.tsv --kinds call-transcript --by part --consecutive",
    };
    for (size_t i = 0; i < sizeof views / sizeof *views; i++) {
        char args[512];
        int s1, s2;
        snprintf(args, sizeof args, "tone -q -j 1 %s", views[i]);
        char *one = capture(args, &s1);
        snprintf(args, sizeof args, "tone -q -j 2 %s", views[i]);
        char *two = capture(args, &s2);
        assert_int_equal(s1, 0);
        assert_int_equal(s2, 0);
        assert_true(strlen(one) > 100);
        if (strcmp(one, two))
            fail_msg("tone %s: -j 1 and -j 2 differ", views[i]);
        free(one);
        free(two);
    }
}

/* --sentences offsets point at the sentence's first word in the file
 * (plain text, gzip and HTML with markup and character references). */
static void test_sentence_offsets(void **state)
{
    (void)state;
    static const char *const files[] = { "demo-corpus/hollowmere/2024-Q2-call-transcript.txt",
                                          "demo-corpus/hollowmere/FY2024-annual-report.htm",
                                          "demo-corpus/ambleworth/2025-Q2-quarterly-report.htm" };
    for (size_t i = 0; i < 3; i++) {
        char args[512];
        int st;
        snprintf(args, sizeof args, "tone -q --no-header --sentences %s", files[i]);
        char *out = capture(args, &st);
        assert_int_equal(st, 0);
        FILE *f = fopen(files[i], "rb");
        assert_non_null(f);
        static char raw[1 << 20];
        size_t n = fread(raw, 1, sizeof raw, f);
        fclose(f);
        size_t rows = 0;
        for (char *line = out, *end; (end = strchr(line, '\n')); line = end + 1) {
            *end = '\0';
            char *tab1 = strchr(line, '\t');
            assert_non_null(tab1);
            unsigned long long off = strtoull(tab1 + 1, NULL, 10);
            const char *text = strrchr(line, '\t') + 1;
            size_t w = 0; /* the sentence's first letters or digits, up to 4 */
            while (w < 4 && (isalnum((unsigned char)text[w]) || (unsigned char)text[w] >= 0x80))
                w++;
            if (w == 0)
                w = 1;
            assert_true(off + w <= n);
            if (memcmp(raw + off, text, w))
                fail_msg("%s: offset %llu holds '%.*s', sentence starts '%.*s'", files[i], off,
                         (int)w, raw + off, (int)w, text);
            rows++;
        }
        assert_true(rows > 50);
        free(out);
    }
}

/* --labels: the confusion matrix and the scores against scikit-learn's
 * sklearn.metrics.confusion_matrix and precision_recall_fscore_support
 * (zero_division=0, average=None and 'macro') and accuracy_score on the
 * same actual and predicted labels (Debian python3-sklearn). The predicted
 * label of every unit is read back from the output: a unit not listed as
 * misread was predicted as its actual label. */
static void test_labels_against_sklearn(void **state)
{
    (void)state;
    int st;
    char *out = capture("tone -q --labels tests/fixtures/tone/labels.tsv", &st);
    assert_int_equal(st, 0);
    char truth_path[] = TT_TEST_TMP "tt_tone_labels_XXXXXX";
    int fd = mkstemp(truth_path);
    assert_true(fd >= 0);
    FILE *tf = fdopen(fd, "w");
    /* the actual labels in file order, then the misread predictions */
    FILE *lf = fopen("tests/fixtures/tone/labels.tsv", "r");
    char line[1024];
    long lineno = 0;
    while (fgets(line, sizeof line, lf)) {
        lineno++;
        if (line[0] == '#' || !strncmp(line, "document\t", 9))
            continue;
        line[strcspn(line, "\n")] = '\0';
        fprintf(tf, "unit %ld %s\n", lineno, strrchr(line, '\t') + 1);
    }
    fclose(lf);
    /* the three tables are separated by blank lines */
    char *tables[3];
    tables[0] = out;
    tables[1] = strstr(tables[0], "\n\n");
    assert_non_null(tables[1]);
    *tables[1] = '\0';
    tables[1] += 2;
    tables[2] = strstr(tables[1], "\n\n");
    assert_non_null(tables[2]);
    *tables[2] = '\0';
    tables[2] += 2;
    for (char *l = strchr(tables[2], '\n') + 1, *end; (end = strchr(l, '\n')); l = end + 1) {
        *end = '\0';
        char *f[6] = { NULL, NULL, NULL, NULL, NULL, NULL };
        int k = 0;
        char *save = NULL;
        for (char *t = strtok_r(l, "\t", &save); t && k < 6; t = strtok_r(NULL, "\t", &save))
            f[k++] = t;
        assert_true(k >= 5);
        if (k == 5) { /* a document unit has an empty offset */
            f[5] = f[4];
            f[4] = f[3];
            f[3] = f[2];
            f[2] = f[1];
        }
        fprintf(tf, "pred %s %s\n", f[5], f[3]);
    }
    fprintf(tf, "matrix\n%s\nscores\n%s\n", tables[0], tables[1]);
    fclose(tf);
    char cmd[4096];
    snprintf(cmd, sizeof cmd,
             "%s -c '\n"
             "import sys\n"
             "from sklearn.metrics import confusion_matrix, precision_recall_fscore_support, accuracy_score\n"
             "actual = {}; pred = {}; lines = open(sys.argv[1]).read().split(\"\\n\")\n"
             "i = 0\n"
             "while lines[i] != \"matrix\":\n"
             "    kind, line, label = lines[i].split(\" \"); i += 1\n"
             "    (actual if kind == \"unit\" else pred)[int(line)] = label\n"
             "keys = sorted(actual)\n"
             "y_true = [actual[k] for k in keys]; y_pred = [pred.get(k, actual[k]) for k in keys]\n"
             "j = lines.index(\"scores\")\n"
             "head = lines[i + 1].split(\"\\t\"); classes = head[1:-1]\n"
             "assert classes == sorted(set(y_true) | set(y_pred)), classes\n"
             "cm = confusion_matrix(y_true, y_pred, labels=classes)\n"
             "for r, row in enumerate(lines[i + 2:i + 2 + len(classes)]):\n"
             "    cells = row.split(\"\\t\")\n"
             "    assert cells[0] == classes[r] and [int(x) for x in cells[1:-1]] == list(cm[r]), (row, cm[r])\n"
             "    assert int(cells[-1]) == sum(cm[r])\n"
             "p, r, f, s = precision_recall_fscore_support(y_true, y_pred, labels=classes, zero_division=0)\n"
             "mp, mr, mf, _ = precision_recall_fscore_support(y_true, y_pred, labels=classes, zero_division=0, average=\"macro\")\n"
             "rows = [x.split(\"\\t\") for x in lines[j + 2:] if x]\n"
             "want = [(c, p[k], r[k], f[k], s[k]) for k, c in enumerate(classes)] + [(\"macro-average\", mp, mr, mf, len(y_true))]\n"
             "for got, w in zip(rows, want):\n"
             "    assert got[0] == w[0], (got, w)\n"
             "    for a, b in zip(got[1:4], w[1:4]): assert abs(float(a) - b) < 5e-5, (got, w)\n"
             "    assert int(got[4]) == w[4], (got, w)\n"
             "acc = [x for x in rows if x[0] == \"accuracy\"][0]\n"
             "assert abs(float(acc[1]) - accuracy_score(y_true, y_pred)) < 5e-5, acc\n"
             "print(\"ok\", len(y_true), \"units\", len(classes), \"classes, macro F1 %%.4f\" %% mf)\n"
             "' %s",
             tt_test_python(), truth_path);
    FILE *py = popen(cmd, "r");
    assert_non_null(py);
    char res[256] = "";
    if (!fgets(res, sizeof res, py))
        res[0] = '\0';
    int pst = pclose(py);
    if (pst != 0 || strncmp(res, "ok", 2))
        fail_msg("scikit-learn disagrees (see the assertion above): %s", res);
    print_message("%s", res);
    unlink(truth_path);
    free(out);
}

/* Bad --labels files: a malformed line, an offset that is no number, an
 * offset where no sentence starts, an unreadable document, an empty file. */
static void test_labels_bad_input(void **state)
{
    (void)state;
    static const struct {
        const char *text;
        const char *message;
    } cases[] = {
        { "only-one-field\n", "line 1: expected document<TAB>label" },
        { "demo-corpus/hollowmere/2024-Q2-call-transcript.txt\tabc\tnegative\n",
          "line 1: offset: expected a whole number" },
        { "demo-corpus/hollowmere/2024-Q2-call-transcript.txt\t5\tnegative\n",
          "line 1: demo-corpus/hollowmere/2024-Q2-call-transcript.txt sentence was not scored" },
        { "no/such/file.txt\tnegative\n", "no/such/file.txt" },
        { "# nothing\n", "no labelled units" },
    };
    for (size_t i = 0; i < sizeof cases / sizeof *cases; i++) {
        char path[] = TT_TEST_TMP "tt_tone_badlabels_XXXXXX";
        int fd = mkstemp(path);
        assert_true(fd >= 0);
        assert_int_equal(write(fd, cases[i].text, strlen(cases[i].text)),
                         (ssize_t)strlen(cases[i].text));
        close(fd);
        char args[512];
        int st;
        snprintf(args, sizeof args, "tone -q --labels %s", path);
        char *out = capture(args, &st);
        assert_int_equal(st, 2);
        if (!strstr(out, cases[i].message))
            fail_msg("case %zu: no '%s' in: %s", i, cases[i].message, out);
        free(out);
        unlink(path);
    }
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
        cmocka_unit_test(test_contributors),
        cmocka_unit_test(test_threads_identical),
        cmocka_unit_test(test_sentence_offsets),
        cmocka_unit_test(test_labels_against_sklearn),
        cmocka_unit_test(test_labels_bad_input),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
