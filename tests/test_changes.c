/* Tests of sentence-level change (src/changes.c, termtide changes):
 * constructed pairs with known unchanged, modified, added and removed
 * sentences (the counts and the modified pairs must match exactly), the
 * similarity threshold, the edit similarity and the document similarities
 * worked by hand from their definitions (Jaccard 1901/1912, cosine,
 * Levenshtein 1966), and the demo corpus's story: the risk factors of the
 * year of the supply problem gain the going-concern sentences. */
#include <math.h>
#include <sys/wait.h>

#include "tt_test.h"

#include "termtide/alloc.h"
#include "termtide/changes.h"

static void add_text(tt_sentence_list *l, const char *text)
{
    tt_blocks b;
    tt_blocks_init(&b);
    tt_error err;
    tt_error_init(&err);
    assert_int_equal(tt_extract_text(text, strlen(text), 0, &b, "t", &err), TT_OK);
    assert_int_equal(tt_sentence_list_add(l, &b, text, strlen(text), 0, 0, "doc"), TT_OK);
    tt_blocks_release(&b);
}

static void test_known_pairs(void **state)
{
    (void)state;
    tt_sentence_list *base = tt_sentence_list_new();
    tt_sentence_list *target = tt_sentence_list_new_sharing(base);
    assert_non_null(base);
    assert_non_null(target);
    add_text(base, "Revenue rose in the quarter. "                        /* b0 unchanged */
                   "We depend on one foundry for castings. "              /* b1 modified */
                   "The dividend was paid in March. "                     /* b2 removed */
                   "Our backlog is at a record level of orders.\n\n"      /* b3 modified */
                   "Weather did not affect shipments.");                  /* b4 removed */
    add_text(target, "We depend on two foundries for castings. "          /* t0 ~ b1 */
                     "Revenue rose in the quarter. "                      /* t1 = b0 */
                     "A lawsuit was filed against us in May. "            /* t2 added */
                     "Our backlog is at a record level of late orders. "  /* t3 ~ b3 */
                     "REVENUE ROSE IN THE QUARTER!");                     /* t4 added (b0 used) */
    assert_int_equal(tt_sentence_list_count(base), 5);
    assert_int_equal(tt_sentence_list_count(target), 5);
    tt_alignment a;
    tt_alignment_init(&a);
    assert_int_equal(tt_align_sentences(base, target, 0.5, &a), TT_OK);
    assert_int_equal(a.unchanged, 1);
    assert_int_equal(a.modified, 2);
    assert_int_equal(a.added, 2);
    assert_int_equal(a.removed, 2);
    /* target order, then the removed in base order */
    static const struct {
        tt_change_kind kind;
        size_t base, target;
    } want[] = {
        { TT_CHANGE_MODIFIED, 1, 0 }, { TT_CHANGE_UNCHANGED, 0, 1 }, { TT_CHANGE_ADDED, SIZE_MAX, 2 },
        { TT_CHANGE_MODIFIED, 3, 3 }, { TT_CHANGE_ADDED, SIZE_MAX, 4 },
        { TT_CHANGE_REMOVED, 2, SIZE_MAX }, { TT_CHANGE_REMOVED, 4, SIZE_MAX },
    };
    assert_int_equal(a.n, 7);
    for (size_t i = 0; i < 7; i++) {
        if (a.v[i].kind != want[i].kind || a.v[i].base != want[i].base ||
            a.v[i].target != want[i].target)
            fail_msg("change %zu: %s %zu->%zu, expected %s %zu->%zu", i,
                     tt_change_kind_name(a.v[i].kind), a.v[i].base, a.v[i].target,
                     tt_change_kind_name(want[i].kind), want[i].base, want[i].target);
    }
    /* t0 ~ b1: {we depend on one foundry for castings} against {we depend
     * on two foundries for castings}: 5 shared of 9 distinct words */
    assert_true(fabs(a.v[0].similarity - 5.0 / 9.0) < 1e-12);
    /* t3 ~ b3: 9 words of b3, one more (late) in t3: 9 / 10 */
    assert_true(fabs(a.v[3].similarity - 9.0 / 10.0) < 1e-12);
    /* new words: t2 (8) + t4 (5) + "two foundries" (2) + "late" (1) */
    assert_int_equal(a.new_words, 16);
    assert_int_equal(a.target_words, 7 + 5 + 8 + 10 + 5);
    /* Levenshtein over the sequences b0..b4 and t0..t4 where t0=b1, t1=b0,
     * t3=b3 (substitution, insertion and deletion cost 1, an equal pair 0):
     * substituting along the diagonal costs 4 (only b3=t3 is free); using
     * b0=t1 instead needs an insertion before it and a deletion after, so
     * also 4; no script does better. d = 4: 1 - 4/5 */
    assert_true(fabs(a.edit_similarity - (1.0 - 4.0 / 5.0)) < 1e-12);
    /* the words a modified sentence added and lost */
    char *added = NULL, *removed = NULL;
    const tt_sentence *t0 = tt_sentence_at(target, 0), *b1 = tt_sentence_at(base, 1);
    assert_int_equal(tt_sentence_words_missing(target, t0, base, b1, &added), TT_OK);
    assert_int_equal(tt_sentence_words_missing(base, b1, target, t0, &removed), TT_OK);
    assert_string_equal(added, "two foundries");
    assert_string_equal(removed, "one foundry");
    tt_free(added);
    tt_free(removed);
    /* a stricter threshold leaves t0 ~ b1 (0.56) unpaired: added and removed */
    assert_int_equal(tt_align_sentences(base, target, 0.6, &a), TT_OK);
    assert_int_equal(a.modified, 1);
    assert_int_equal(a.added, 3);
    assert_int_equal(a.removed, 3);
    assert_int_equal(tt_align_sentences(base, target, 0.0, &a), TT_EINVAL);
    tt_alignment_release(&a);
    tt_sentence_list_free(target);
    tt_sentence_list_free(base);
}

/* Cosine and Jaccard of the two sides, by hand:
 * base  "a b b c." -> counts a1 b2 c1;   target "b c d." -> b1 c1 d1.
 * cosine = (2*1 + 1*1) / (sqrt(1+4+1) * sqrt(3)) = 3 / sqrt(18);
 * Jaccard = |{b,c}| / |{a,b,c,d}| = 2/4. Lists of other dictionaries and
 * empty sides. */
static void test_document_similarity(void **state)
{
    (void)state;
    tt_sentence_list *a = tt_sentence_list_new();
    tt_sentence_list *b = tt_sentence_list_new_sharing(a);
    add_text(a, "Apple bank bank cash.");
    add_text(b, "Bank cash debt.");
    double cos, jac;
    tt_sentence_lists_similarity(a, b, &cos, &jac);
    assert_true(fabs(cos - 3.0 / sqrt(18.0)) < 1e-12);
    assert_true(fabs(jac - 0.5) < 1e-12);
    tt_sentence_list *other = tt_sentence_list_new();
    tt_alignment al;
    tt_alignment_init(&al);
    assert_int_equal(tt_align_sentences(a, other, 0.5, &al), TT_EINVAL);
    tt_sentence_list *e1 = tt_sentence_list_new_sharing(a), *e2 = tt_sentence_list_new_sharing(a);
    assert_int_equal(tt_align_sentences(e1, e2, 0.5, &al), TT_OK);
    assert_true(al.edit_similarity == 1.0 && al.n == 0);
    tt_alignment_release(&al);
    tt_sentence_list_free(e1);
    tt_sentence_list_free(e2);
    tt_sentence_list_free(other);
    tt_sentence_list_free(b);
    tt_sentence_list_free(a);
}

static char *capture(const char *args, int *status)
{
    return tt_test_run(args, 1, status);
}

/* The demo story: from FY2023 to FY2024 the first company's risk factors
 * gain the going-concern and covenant-default sentences, and from FY2024
 * to FY2025 the going-concern sentence goes; offsets point into the files. */
static void test_demo_story(void **state)
{
    (void)state;
    int st;
    char *out = capture("changes -q --manifest demo-corpus/manifest.tsv --kinds annual-report "
                        "--entity hollowmere --consecutive --section risk-factors "
                        "--show sentences", &st);
    assert_int_equal(st, 0);
    int gained = 0, lost = 0, covenant = 0;
    for (char *line = out, *end; (end = strchr(line, '\n')); line = end + 1) {
        *end = '\0';
        if (strstr(line, "FY2023\tFY2024\tadded\t") && strstr(line, "going concern"))
            gained++;
        if (strstr(line, "FY2023\tFY2024\tadded\t") && strstr(line, "covenant"))
            covenant++;
        if (strstr(line, "FY2024\tFY2025\tremoved\t") && strstr(line, "going concern"))
            lost++;
    }
    assert_true(gained >= 1 && covenant >= 1 && lost >= 1);
    free(out);
    out = capture("changes --base demo-corpus/hollowmere/FY2024-annual-report.htm "
                  "--target demo-corpus/hollowmere/FY2024-annual-report.htm", &st);
    assert_int_equal(st, 0);
    /* a document against itself: all unchanged, similarities 1 */
    char *row = strchr(out, '\n') + 1;
    assert_non_null(strstr(row, "\t0\t0\t0\t0.0000\t1.0000\t1.0000\t1.0000"));
    free(out);
    out = capture("changes --base demo-corpus/hollowmere", &st);
    assert_int_equal(st, 2);
    assert_non_null(strstr(out, "give --base PATH and --target PATH"));
    free(out);
}

/* Each sentence carries its section (found on the whole document), and
 * the rows of a pair are grouped by section: once the rows leave a
 * section they never come back to it. The going-concern sentence FY2023 ->
 * FY2024 is added in the risk factors. (The sections themselves are checked
 * in test_sections.) */
static void test_sentences_grouped_by_section(void **state)
{
    (void)state;
    int st;
    char *out = capture("changes -q --manifest demo-corpus/manifest.tsv --kinds annual-report "
                        "--entity hollowmere --consecutive --show sentences",
                        &st);
    assert_int_equal(st, 0);
    char seen[64][64];
    size_t nseen = 0;
    char prev[64] = "", pair[64] = "";
    int risk_going = 0, rows = 0;
    for (char *line = strchr(out, '\n') + 1, *end; (end = strchr(line, '\n')); line = end + 1) {
        *end = '\0';
        /* entity base target change similarity section ... */
        char *f[13];
        size_t nf = 0;
        for (char *p = line; nf < 13; nf++) {
            f[nf] = p;
            char *tab = strchr(p, '\t');
            if (!tab)
                break;
            *tab = '\0';
            p = tab + 1;
        }
        assert_true(nf >= 10);
        rows++;
        char thispair[64];
        snprintf(thispair, sizeof thispair, "%s>%s", f[1], f[2]);
        if (strcmp(thispair, pair)) {
            snprintf(pair, sizeof pair, "%s", thispair);
            nseen = 0;
            prev[0] = '\1';
        }
        if (strcmp(prev, f[5])) {
            for (size_t k = 0; k < nseen; k++)
                assert_string_not_equal(seen[k], f[5]); /* came back: not grouped */
            assert_true(nseen < 64);
            snprintf(seen[nseen++], sizeof seen[0], "%s", f[5]);
            snprintf(prev, sizeof prev, "%s", f[5]);
        }
        if (!strcmp(f[1], "FY2023") && !strcmp(f[3], "added") && !strcmp(f[5], "risk-factors") &&
            strstr(f[10], "going concern"))
            risk_going++;
    }
    assert_true(rows > 100);
    assert_true(risk_going >= 1);
    free(out);
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_known_pairs),
        cmocka_unit_test(test_document_similarity),
        cmocka_unit_test(test_demo_story),
        cmocka_unit_test(test_sentences_grouped_by_section),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
