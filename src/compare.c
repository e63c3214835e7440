/* termtide — comparing two term tables.
 *
 * Rows are built from the union of the two vocabularies: every term of the
 * base table, then the target's terms absent from the base. Each row's
 * statistics come from tt_change_compute (G² on the full 2×2 table, Dunning
 * 1993; Log Ratio, Hardie 2014), and q-values from tt_bh_q_values
 * (Benjamini & Hochberg 1995) over exactly the rows tested, i.e. those that
 * pass min_count, since filtering after the adjustment would understate
 * the number of tests. Sorting is by the chosen key, then by term
 * bytewise, so output is deterministic. O(V log V), V the union's size. */
#include <math.h>
#include <stdlib.h>

#include "termtide/compare.h"
#include "tt_internal.h"

tt_status tt_compare_sort_parse(const char *name, tt_compare_sort *out)
{
    if (!strcmp(name, "g2"))
        *out = TT_SORT_SIGNED_G2;
    else if (!strcmp(name, "log-ratio"))
        *out = TT_SORT_LOG_RATIO;
    else if (!strcmp(name, "change"))
        *out = TT_SORT_CHANGE;
    else
        return TT_EINVAL;
    return TT_OK;
}

void tt_compare_options_init(tt_compare_options *o)
{
    o->min_count = 1;
    o->sort = TT_SORT_SIGNED_G2;
}

void tt_compare_result_init(tt_compare_result *r)
{
    memset(r, 0, sizeof *r);
}

void tt_compare_result_release(tt_compare_result *r)
{
    tt_free(r->rows);
    tt_compare_result_init(r);
}

typedef struct build_ctx {
    const tt_termtable *other;
    int from_target;      /* walking the target: skip terms the base has */
    uint64_t n1, n2;
    uint64_t min_count;
    tt_compare_result *out;
    size_t cap;
    tt_status status;
} build_ctx;

static int add_row(void *vctx, const tt_term_entry *e)
{
    build_ctx *b = vctx;
    uint64_t other = tt_termtable_get(b->other, e->term, e->len);
    if (b->from_target && other)
        return 0;
    uint64_t a = b->from_target ? other : e->count;
    uint64_t t = b->from_target ? e->count : other;
    if (a == 0)
        b->out->new_terms++;
    if (t == 0)
        b->out->gone_terms++;
    if (a + t < b->min_count)
        return 0;
    if (b->out->n == b->cap) {
        size_t cap = b->cap ? b->cap * 2 : 1024;
        tt_compare_row *rows = tt_reallocarray(b->out->rows, cap, sizeof *rows);
        if (!rows) {
            b->status = TT_ENOMEM;
            return 1;
        }
        b->out->rows = rows;
        b->cap = cap;
    }
    tt_compare_row *r = &b->out->rows[b->out->n++];
    r->term = e->term;
    r->len = e->len;
    tt_status st = tt_change_compute(a, b->n1, t, b->n2, &r->change, NULL);
    if (st) {
        b->status = st;
        return 1;
    }
    return 0;
}

static int term_cmp(const tt_compare_row *a, const tt_compare_row *b)
{
    size_t n = a->len < b->len ? a->len : b->len;
    int c = memcmp(a->term, b->term, n);
    if (c)
        return c;
    return a->len < b->len ? -1 : a->len > b->len;
}

/* Descending by key; NaN keys last. */
static int key_cmp(double x, double y)
{
    int xn = isnan(x), yn = isnan(y);
    if (xn || yn)
        return xn - yn;
    return x > y ? -1 : x < y;
}

static int cmp_g2(const void *pa, const void *pb)
{
    const tt_compare_row *a = pa, *b = pb;
    int c = key_cmp(a->change.signed_g2, b->change.signed_g2);
    return c ? c : term_cmp(a, b);
}

static int cmp_log_ratio(const void *pa, const void *pb)
{
    const tt_compare_row *a = pa, *b = pb;
    int c = key_cmp(a->change.log_ratio, b->change.log_ratio);
    return c ? c : term_cmp(a, b);
}

static int cmp_change(const void *pa, const void *pb)
{
    const tt_compare_row *a = pa, *b = pb;
    int c = key_cmp(a->change.rate_change_per_10k, b->change.rate_change_per_10k);
    return c ? c : term_cmp(a, b);
}

tt_status tt_compare_tables(const tt_termtable *base, const tt_termtable *target,
                            const tt_compare_options *opt, tt_compare_result *out,
                            tt_error *err)
{
    tt_compare_options defaults;
    if (!opt) {
        tt_compare_options_init(&defaults);
        opt = &defaults;
    }
    tt_compare_result_release(out);
    out->base_words = tt_termtable_total(base);
    out->target_words = tt_termtable_total(target);
    out->base_distinct = tt_termtable_distinct(base);
    out->target_distinct = tt_termtable_distinct(target);
    out->cosine = tt_cosine_termtables(base, target);
    out->jaccard = tt_jaccard_termtables(base, target);
    if (out->base_words == 0 || out->target_words == 0)
        return tt_error_set(err, TT_EINVAL, NULL, -1,
                            "the %s side has no words to compare",
                            out->base_words == 0 ? "base" : "target");

    build_ctx b = { target, 0, out->base_words, out->target_words,
                    opt->min_count ? opt->min_count : 1, out, 0, TT_OK };
    tt_termtable_foreach(base, add_row, &b);
    if (b.status == TT_OK) {
        b.other = base;
        b.from_target = 1;
        tt_termtable_foreach(target, add_row, &b);
    }
    if (b.status) {
        tt_compare_result_release(out);
        return tt_error_set(err, b.status, NULL, -1, "%s while comparing",
                            tt_status_name(b.status));
    }

    if (out->n) {
        double *p = tt_reallocarray(NULL, out->n, sizeof *p);
        if (!p) {
            tt_compare_result_release(out);
            return tt_error_set(err, TT_ENOMEM, NULL, -1, "out of memory while comparing");
        }
        for (size_t i = 0; i < out->n; i++)
            p[i] = out->rows[i].change.p_value;
        tt_status st = tt_bh_q_values(p, out->n, p, err);
        if (st == TT_OK)
            for (size_t i = 0; i < out->n; i++)
                out->rows[i].change.q_value = p[i];
        tt_free(p);
        if (st) {
            tt_compare_result_release(out);
            return st;
        }
    }
    int (*cmp)(const void *, const void *) =
        opt->sort == TT_SORT_LOG_RATIO ? cmp_log_ratio
        : opt->sort == TT_SORT_CHANGE  ? cmp_change
                                       : cmp_g2;
    if (out->n) /* rows is NULL when no term passed --min-count */
        qsort(out->rows, out->n, sizeof *out->rows, cmp);
    return TT_OK;
}
