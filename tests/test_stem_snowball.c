/* termtide tests — the stemmer against Snowball's published English
 * vocabulary.
 *
 * Reference: the Snowball project's English (Porter2) test vocabulary,
 * voc.txt (29,417 words) and output.txt (the stem of each), as shipped by
 * Debian's snowball-data package. Every word goes through termtide's own
 * path, tt_normalize then tt_stem, and must give the published stem.
 *
 * Fourteen vocabulary words exist to exercise Porter2's apostrophe rules
 * ("'", "'s", "'a'", "a''", ...). termtide strips leading and trailing
 * apostrophes before stemming (normalize.h), so for those the input that
 * reaches the stemmer is not the vocabulary word. For each of them the test
 * checks two things instead: tt_stem on the raw word gives the published
 * stem (the stemmer itself agrees on all 29,417), and the normalized word
 * stems to Snowball's published stem of that normalized word, looked up in
 * the same vocabulary (or, when it is not listed, to the original's stem,
 * since Porter2 strips those apostrophes too), or normalizes to nothing and
 * is dropped, as a lone "'" is. What termtide changes is only Porter2's
 * rule that words of two letters or fewer are left alone, apostrophes
 * included ("'a" stays "'a" in Snowball, is "a" in termtide). */
#include "tt_test.h"

#include "termtide/filter.h"
#include "termtide/normalize.h"

#define VOC "/usr/share/snowball/data/english/voc.txt"
#define OUT "/usr/share/snowball/data/english/output.txt"
#define VOC_SIZE 29417

struct vocab {
    char **word, **stem;
    size_t n;
};

static char *dup_line(const char *s)
{
    size_t k = strcspn(s, "\r\n");
    char *p = malloc(k + 1);
    assert_non_null(p);
    memcpy(p, s, k);
    p[k] = '\0';
    return p;
}

static void load_vocab(struct vocab *v)
{
    FILE *fv = fopen(VOC, "r");
    FILE *fo = fopen(OUT, "r");
    if (!fv || !fo)
        fail_msg("cannot open %s or %s (Debian package snowball-data)", VOC, OUT);
    v->word = malloc(VOC_SIZE * 2 * sizeof *v->word);
    v->stem = malloc(VOC_SIZE * 2 * sizeof *v->stem);
    assert_non_null(v->word);
    assert_non_null(v->stem);
    v->n = 0;
    char a[512], b[512];
    while (fgets(a, sizeof a, fv)) {
        if (!fgets(b, sizeof b, fo))
            fail_msg("output.txt is shorter than voc.txt");
        if (v->n == VOC_SIZE * 2)
            fail_msg("more lines than expected");
        v->word[v->n] = dup_line(a);
        v->stem[v->n] = dup_line(b);
        v->n++;
    }
    assert_null(fgets(b, sizeof b, fo));
    fclose(fv);
    fclose(fo);
}

static void free_vocab(struct vocab *v)
{
    for (size_t i = 0; i < v->n; i++) {
        free(v->word[i]);
        free(v->stem[i]);
    }
    free(v->word);
    free(v->stem);
}

/* The published stem of word, or NULL when it is not in the vocabulary. */
static const char *published_stem(const struct vocab *v, const char *word, size_t len)
{
    for (size_t i = 0; i < v->n; i++)
        if (strlen(v->word[i]) == len && memcmp(v->word[i], word, len) == 0)
            return v->stem[i];
    return NULL;
}

static void test_snowball_vocabulary(void **state)
{
    (void)state;
    struct vocab v;
    load_vocab(&v);
    assert_int_equal(v.n, VOC_SIZE);

    tt_stemmer *st = tt_stemmer_new();
    assert_non_null(st);
    tt_normalizer nz;
    tt_buf norm, stem;
    tt_normalizer_init(&nz);
    tt_buf_init(&norm, 0);
    tt_buf_init(&stem, 0);

    size_t direct = 0, changed = 0, dropped = 0, via_own_entry = 0, norm_ok = 0, raw_ok = 0;
    size_t bad = 0;
    for (size_t i = 0; i < v.n; i++) {
        const char *w = v.word[i];
        size_t wl = strlen(w);
        assert_int_equal(tt_normalize(&nz, w, wl, &norm), TT_OK);
        if (norm.len == wl && memcmp(norm.data, w, wl) == 0) {
            assert_int_equal(tt_stem(st, norm.data, norm.len, &stem), TT_OK);
            if (strcmp(stem.data, v.stem[i]) == 0) {
                direct++;
            } else if (bad++ < 10) {
                print_message("\"%s\": stem \"%s\", Snowball \"%s\"\n", w, stem.data, v.stem[i]);
            }
            continue;
        }
        /* Normalization changed the word (only the apostrophe words). */
        changed++;
        assert_non_null(strchr(w, '\''));
        assert_int_equal(tt_stem(st, w, wl, &stem), TT_OK);
        if (strcmp(stem.data, v.stem[i]) == 0)
            raw_ok++;
        else if (bad++ < 10)
            print_message("raw \"%s\": stem \"%s\", Snowball \"%s\"\n", w, stem.data, v.stem[i]);
        if (norm.len == 0) {
            dropped++;
            continue;
        }
        /* Porter2 strips an initial apostrophe and a final "'", "'s" or
         * "'s'" itself, so where the normalized word is not in the
         * vocabulary ("aa"), the published stem of the original applies. */
        const char *want = published_stem(&v, norm.data, norm.len);
        if (want)
            via_own_entry++;
        else
            want = v.stem[i];
        assert_int_equal(tt_stem(st, norm.data, norm.len, &stem), TT_OK);
        if (strcmp(stem.data, want) == 0)
            norm_ok++;
        else if (bad++ < 10)
            print_message("\"%s\" -> \"%s\": stem \"%s\", Snowball \"%s\"\n", w, norm.data,
                          stem.data, want);
    }
    print_message("Snowball English vocabulary: %zu pairs; %zu equal through normalize+stem; "
                  "%zu changed by normalization (apostrophes): raw stem equal for %zu, "
                  "%zu dropped as empty, %zu stemmed as Snowball stems them (%zu by the "
                  "normalized word's own entry, the rest by the original's); %zu mismatches\n",
                  v.n, direct, changed, raw_ok, dropped, norm_ok, via_own_entry, bad);
    assert_int_equal(bad, 0);
    assert_int_equal(direct + changed, v.n);
    assert_int_equal(raw_ok, changed);
    assert_int_equal(dropped + norm_ok, changed);
    /* Counted from voc.txt: 14 words hold an apostrophe. */
    assert_int_equal(changed, 14);

    tt_buf_release(&norm);
    tt_buf_release(&stem);
    tt_normalizer_release(&nz);
    tt_stemmer_free(st);
    free_vocab(&v);
}

/* tt_stem resets out, and may read its input from out itself. */
static void test_stem_in_place(void **state)
{
    (void)state;
    tt_stemmer *st = tt_stemmer_new();
    assert_non_null(st);
    tt_buf b;
    tt_buf_init(&b, 0);
    assert_int_equal(tt_buf_puts(&b, "generalization"), TT_OK);
    assert_int_equal(tt_stem(st, b.data, b.len, &b), TT_OK);
    /* The expected stem is looked up in Snowball's output.txt. */
    struct vocab v;
    load_vocab(&v);
    const char *want = published_stem(&v, "generalization", strlen("generalization"));
    assert_non_null(want);
    assert_string_equal(b.data, want);
    free_vocab(&v);
    tt_buf_release(&b);
    tt_stemmer_free(st);
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_snowball_vocabulary),
        cmocka_unit_test(test_stem_in_place),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
