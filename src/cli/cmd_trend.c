/* termtide trend — how chosen terms (or each entity's top movers) move
 * across the periods of a series: rates per period, statistics across
 * periods, dispersion across a period's documents, tf-idf per document and
 * the term × period contingency table. The counting is the library's
 * (trend.h), the statistics are stats.h's; this file picks and prints. */
#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "termtide/aggregate.h"
#include "termtide/alloc.h"
#include "termtide/compare.h"
#include "termtide/meta.h"
#include "termtide/stats.h"
#include "termtide/trend.h"
#include "cli.h"

/* Declared here too so the file builds before main.c registers it. */
int tt_cmd_trend(int argc, char **argv);
extern const char tt_help_trend[];

const char tt_help_trend[] =
    "Usage: termtide trend [OPTIONS] --manifest FILE [--terms LIST | --terms-file FILE]\n"
    "       termtide trend [OPTIONS] --layout PATTERN ROOT... [--terms LIST]\n"
    "\n"
    "Follows terms across the periods of each entity's series of documents.\n"
    "\n"
    "Series:\n"
    "  --manifest FILE       metadata: a CSV or TSV with columns path, entity, period,\n"
    "                        kind (paths relative to the manifest)\n"
    "  --headers             metadata from each submission wrapper's own header under\n"
    "                        the ROOT paths (entity, period of report as a quarter or\n"
    "                        --header-period year|month|day, submission type as kind)\n"
    "  --layout PATTERN      metadata from where files sit under the ROOT directories,\n"
    "                        e.g. '{entity}/{period}-{kind}.*'\n"
    "  --entity NAME         only this entity\n"
    "  --kinds LIST          only these document kinds (one series may not mix a\n"
    "                        fiscal year with quarters: choose kinds to keep it whole)\n"
    "\n"
    "Terms:\n"
    "  --terms LIST          comma-separated terms; each is normalized like counted\n"
    "                        terms (case, --stem), so write it as you would read it;\n"
    "                        a term of several words needs --ngram\n"
    "  --terms-file FILE     the same, one term a line (# comments, blank lines skipped)\n"
    "  --top-movers N        without a term list: for each entity, the N terms (default\n"
    "                        10) with the largest |signed G²| between its first and last\n"
    "                        period, among terms counted at least --min-count times\n"
    "                        (default 5) in the two\n"
    "\n"
    "Output (--show, one table):\n"
    "  rates (default)       one row per entity, term and period:\n"
    "                          entity term period count words rate\n"
    "                        words: terms counted in the period's documents (after\n"
    "                        stop-words and filters); rate: per 10,000 words\n"
    "  stats                 one row per entity and term, over the periods that have\n"
    "                        documents (a period missing from the data is a gap, not a 0):\n"
    "                          entity term periods first last mean median sd cv min max\n"
    "                          slope pearson_r\n"
    "                        of the rates; sd is the sample standard deviation (n - 1),\n"
    "                        cv = sd / mean; slope is the least-squares change of the rate\n"
    "                        per period and pearson_r the correlation of rate with time,\n"
    "                        time being the period's position on the calendar (2025-Q1\n"
    "                        to 2025-Q3 is 2 periods, so gaps count)\n"
    "  dispersion            one row per entity, term and period, across the period's\n"
    "                        documents (empty documents left out):\n"
    "                          entity term period documents doc_freq dp dp_norm\n"
    "                          juilland_d\n"
    "                        dp: Gries's DP (2008), 0 spread evenly, near 1 in one\n"
    "                        document; dp_norm = DP / (1 - smallest document share)\n"
    "                        (Lijffijt & Gries 2012); juilland_d: Juilland's D = 1 -\n"
    "                        CV / sqrt(n - 1) over the term's rates per document\n"
    "  tfidf                 one row per document and term:\n"
    "                          entity period document term count words doc_freq idf\n"
    "                          tfidf\n"
    "                        over the N documents of the run (every entity kept): idf =\n"
    "                        ln((1 + N) / (1 + doc_freq)) + 1; the document's vector of\n"
    "                        count x idf covers its WHOLE vocabulary and is scaled to\n"
    "                        length 1; tfidf is the chosen term's weight in it (as\n"
    "                        scikit-learn's TfidfVectorizer defaults); the documents are\n"
    "                        read twice, so memory stays bounded by the vocabulary\n"
    "  table                 per entity, the term x period contingency table of the\n"
    "                        chosen terms' counts, one column per period (the periods\n"
    "                        of every entity shown) and a total column:\n"
    "                          entity measure term PERIOD... total\n"
    "                        measure 'count' rows: joint counts, then a '(total)' row\n"
    "                        of column totals; measure 'share' rows: count / the grand\n"
    "                        total of the entity's table, and its '(total)' row\n"
    "  --tfidf, --table      the same as --show tfidf and --show table\n"
    "  -f, --format tsv|csv|jsonl   -o, --output FILE   --no-header\n"
    "\n"
    CLI_PIPELINE_HELP
    "\n"
    "termtide measures language; it gives no investment, legal or compliance advice.\n";

typedef enum { SHOW_RATES, SHOW_STATS, SHOW_DISPERSION, SHOW_TFIDF, SHOW_TABLE } show_kind;

/* One entity of the series: its groups and the terms followed for it. */
typedef struct entity_info {
    const char *name;
    size_t first_group, n_groups;
    char **terms;   /* the user's list (shared) or the entity's movers (owned) */
    size_t *lens;
    size_t n_terms;
    int owned;
} entity_info;

typedef struct trend_ctx {
    cli_pipeline pipe;
    show_kind show;
    uint64_t top_movers, min_count;
    tt_format format;
    int header;
    tt_outfile out;
    tt_buf buf;
    tt_error err;
    size_t skipped_docs;
    /* the user's terms: normalized, distinct, at most TT_TREND_MAX_TERMS */
    char **terms;
    size_t *lens;
    size_t n_terms, cap_terms;
    entity_info *ents;
    size_t n_ents;
    /* the current entity's groups: summed counts of its terms (group-major)
     * and words */
    uint64_t *group_counts;
    uint64_t *group_words;
} trend_ctx;

static const char *const rate_cols[] = { "entity", "term", "period", "count", "words", "rate" };
static const char *const stat_cols[] = { "entity", "term", "periods", "first", "last", "mean",
                                         "median", "sd", "cv", "min", "max", "slope",
                                         "pearson_r" };
static const char *const disp_cols[] = { "entity", "term", "period", "documents", "doc_freq",
                                         "dp", "dp_norm", "juilland_d" };
static const char *const tfidf_cols[] = { "entity", "period", "document", "term", "count",
                                          "words", "doc_freq", "idf", "tfidf" };

static tt_status flush(trend_ctx *c, int force)
{
    return cli_flush(&c->out, &c->buf, &c->err, force);
}

/* Adds a normalized term to the user's list (once) and returns its index, or
 * (size_t)-1 when out of memory or past TT_TREND_MAX_TERMS (printed). */
static size_t pool_add(trend_ctx *c, const char *term, size_t len)
{
    for (size_t i = 0; i < c->n_terms; i++)
        if (c->lens[i] == len && !memcmp(c->terms[i], term, len))
            return i;
    if (c->n_terms == TT_TREND_MAX_TERMS) {
        cli_error("more than %d terms: follow fewer at a time", TT_TREND_MAX_TERMS);
        return (size_t)-1;
    }
    if (c->n_terms == c->cap_terms) {
        size_t cap = c->cap_terms ? 2 * c->cap_terms : 16;
        char **t = realloc(c->terms, cap * sizeof *t);
        if (!t)
            goto oom;
        c->terms = t;
        size_t *l = realloc(c->lens, cap * sizeof *l);
        if (!l)
            goto oom;
        c->lens = l;
        c->cap_terms = cap;
    }
    char *copy = tt_strndup(term, len);
    if (!copy)
        goto oom;
    c->terms[c->n_terms] = copy;
    c->lens[c->n_terms] = len;
    return c->n_terms++;
oom:
    cli_error("out of memory");
    return (size_t)-1;
}

/* Normalizes one user term into the list; prints the problem. */
static int add_user_term(trend_ctx *c, const char *text, size_t len, const char *where)
{
    while (len && (text[0] == ' ' || text[0] == '\t')) {
        text++;
        len--;
    }
    while (len && (text[len - 1] == ' ' || text[len - 1] == '\t' || text[len - 1] == '\r'))
        len--;
    if (len == 0)
        return 1;
    tt_buf norm;
    tt_buf_init(&norm, 0);
    tt_error err;
    tt_error_init(&err);
    tt_status st = tt_trend_term_normalize(&c->pipe.batch.count, text, len, &norm, &err);
    int ok = 1;
    if (st) {
        cli_error("%s: %s", where, err.message);
        ok = 0;
    } else if (pool_add(c, norm.data, norm.len) == (size_t)-1) {
        ok = 0;
    }
    tt_buf_release(&norm);
    return ok;
}

static int terms_from_list(trend_ctx *c, const char *list)
{
    const char *p = list;
    for (;;) {
        const char *comma = strchr(p, ',');
        size_t len = comma ? (size_t)(comma - p) : strlen(p);
        if (!add_user_term(c, p, len, "--terms"))
            return 0;
        if (!comma)
            return 1;
        p = comma + 1;
    }
}

static int terms_from_file(trend_ctx *c, const char *path)
{
    FILE *f = fopen(path, "r");
    if (!f) {
        cli_error("--terms-file: %s: cannot be opened", path);
        return 0;
    }
    char line[1024];
    char where[1100];
    long lineno = 0;
    int ok = 1;
    while (ok && fgets(line, sizeof line, f)) {
        lineno++;
        size_t len = strlen(line);
        if (len && line[len - 1] == '\n')
            len--;
        else if (!feof(f)) {
            cli_error("%s: line %ld: longer than %zu bytes", path, lineno, sizeof line - 2);
            ok = 0;
            break;
        }
        size_t i = 0;
        while (i < len && (line[i] == ' ' || line[i] == '\t'))
            i++;
        if (i == len || line[i] == '#')
            continue;
        snprintf(where, sizeof where, "%s: line %ld", path, lineno);
        ok = add_user_term(c, line, len, where);
    }
    if (ok && ferror(f)) {
        cli_error("--terms-file: %s: read error", path);
        ok = 0;
    }
    fclose(f);
    return ok;
}

/* Source list of groups [g0, g0 + ng), with the group of each input. */
static int group_inputs(const tt_series *s, const tt_doc_meta *docs, size_t g0, size_t ng,
                        tt_source_list *list, size_t **input_group)
{
    size_t *ig = NULL, cap = 0;
    for (size_t g = g0; g < g0 + ng; g++) {
        const tt_series_group *grp = &s->groups[g];
        for (size_t i = 0; i < grp->n_docs; i++) {
            size_t before = list->n;
            if (tt_source_expand(list, docs[s->members[grp->first + i]].path) != TT_OK)
                goto oom;
            if (list->n > cap) {
                size_t ncap = list->n * 2;
                size_t *n = realloc(ig, ncap * sizeof *n);
                if (!n)
                    goto oom;
                ig = n;
                cap = ncap;
            }
            for (size_t k = before; k < list->n; k++)
                ig[k] = g;
        }
    }
    *input_group = ig;
    return 1;
oom:
    free(ig);
    cli_error("out of memory");
    return 0;
}

static void print_fatal(const tt_error *err)
{
    char msg[TT_ERROR_FILE_MAX + TT_ERROR_MSG_MAX + 64];
    cli_error("%s", tt_error_format(err, msg, sizeof msg));
}

static tt_termtable *count_group(trend_ctx *c, const tt_series *s, const tt_doc_meta *docs,
                                 size_t g)
{
    tt_source_list list;
    tt_source_list_init(&list);
    size_t *ig = NULL;
    tt_termtable *t = tt_termtable_new();
    if (!t || !group_inputs(s, docs, g, 1, &list, &ig)) {
        if (!t)
            cli_error("out of memory");
        tt_termtable_free(t);
        tt_source_list_release(&list);
        return NULL;
    }
    free(ig);
    tt_batch_summary sum;
    tt_error err;
    tt_error_init(&err);
    tt_status st = tt_aggregate_run(&list, &c->pipe.batch, t, &sum, &err);
    tt_source_list_release(&list);
    c->skipped_docs += sum.skipped;
    if (st) {
        print_fatal(&err);
        tt_termtable_free(t);
        return NULL;
    }
    return t;
}

typedef struct mover {
    size_t row;
    double key;
} mover;

static int mover_cmp(const void *a, const void *b)
{
    const mover *x = a, *y = b;
    if (x->key != y->key)
        return x->key > y->key ? -1 : 1;
    return x->row < y->row ? -1 : x->row > y->row;
}

/* The entity's top movers between its first and last period become its
 * own term list, strongest first. Returns 0 on a fatal error. */
static int find_movers(trend_ctx *c, const tt_series *s, const tt_doc_meta *docs,
                       entity_info *e)
{
    if (e->n_groups < 2) {
        if (!c->pipe.quiet)
            cli_note("%s: one period only, no movers to follow (skipped)", e->name);
        return 1;
    }
    tt_termtable *a = count_group(c, s, docs, e->first_group);
    tt_termtable *b = a ? count_group(c, s, docs, e->first_group + e->n_groups - 1) : NULL;
    if (!b) {
        tt_termtable_free(a);
        return 0;
    }
    tt_compare_options copt;
    tt_compare_options_init(&copt);
    copt.min_count = c->min_count;
    tt_compare_result r;
    tt_compare_result_init(&r);
    tt_error err;
    tt_error_init(&err);
    int ok = 1;
    mover *m = NULL;
    tt_status st = tt_compare_tables(a, b, &copt, &r, &err);
    if (st == TT_EINVAL) {
        cli_error("%s: %s (skipped)", e->name, err.message);
        c->skipped_docs++;
        goto out;
    }
    if (st) {
        print_fatal(&err);
        ok = 0;
        goto out;
    }
    /* Rows come sorted by signed G² with ties by term; ranking by |signed
     * G²| keeps that order among ties (the row index breaks them), and the
     * movers are followed in rank order, strongest first. */
    size_t k = c->top_movers < r.n ? (size_t)c->top_movers : r.n;
    m = malloc((r.n ? r.n : 1) * sizeof *m);
    e->terms = calloc(k ? k : 1, sizeof *e->terms);
    e->lens = malloc((k ? k : 1) * sizeof *e->lens);
    e->owned = 1;
    if (!m || !e->terms || !e->lens) {
        cli_error("out of memory");
        ok = 0;
        goto out;
    }
    for (size_t i = 0; i < r.n; i++) {
        m[i].row = i;
        m[i].key = fabs(r.rows[i].change.signed_g2);
    }
    qsort(m, r.n, sizeof *m, mover_cmp);
    for (size_t i = 0; i < k; i++) {
        const tt_compare_row *row = &r.rows[m[i].row];
        if (!(e->terms[i] = tt_strndup(row->term, row->len))) {
            cli_error("out of memory");
            ok = 0;
            goto out;
        }
        e->lens[i] = row->len;
        e->n_terms = i + 1;
    }
out:
    free(m);
    tt_compare_result_release(&r);
    tt_termtable_free(a);
    tt_termtable_free(b);
    return ok;
}

static tt_status write_rates(trend_ctx *c, const tt_series *s, const entity_info *e,
                             int *header)
{
    tt_table_writer w;
    tt_status st = tt_table_begin(&w, c->format, &c->buf, rate_cols, 6, *header);
    *header = 0;
    for (size_t t = 0; t < e->n_terms && !st; t++) {
        for (size_t g = e->first_group; g < e->first_group + e->n_groups && !st; g++) {
            char pt[TT_PERIOD_TEXT_MAX];
            size_t gi = g - e->first_group;
            uint64_t n = c->group_words[gi], k = c->group_counts[gi * e->n_terms + t];
            st = tt_table_cstr(&w, e->name);
            if (!st) st = tt_table_str(&w, e->terms[t], e->lens[t]);
            if (!st) st = tt_table_cstr(&w, tt_period_format(&s->groups[g].period, pt, sizeof pt));
            if (!st) st = tt_table_u64(&w, k);
            if (!st) st = tt_table_u64(&w, n);
            if (!st) st = tt_table_fixed(&w, n ? 10000.0 * (double)k / (double)n : NAN, 4);
            if (!st) st = tt_table_end_row(&w);
            if (!st) st = flush(c, 0);
        }
    }
    return st;
}

static tt_status write_stats(trend_ctx *c, const tt_series *s, const entity_info *e,
                             int *header)
{
    tt_table_writer w;
    tt_status st = tt_table_begin(&w, c->format, &c->buf, stat_cols, 13, *header);
    *header = 0;
    double *x = tt_malloc((e->n_groups ? e->n_groups : 1) * sizeof *x);
    double *y = tt_malloc((e->n_groups ? e->n_groups : 1) * sizeof *y);
    size_t *gs = tt_malloc((e->n_groups ? e->n_groups : 1) * sizeof *gs);
    if (!x || !y || !gs)
        st = TT_ENOMEM;
    for (size_t t = 0; t < e->n_terms && !st; t++) {
        size_t n = 0;
        /* A period whose documents hold no words has no rate: left out. */
        for (size_t g = e->first_group; g < e->first_group + e->n_groups; g++) {
            size_t gi = g - e->first_group;
            if (!c->group_words[gi])
                continue;
            x[n] = (double)tt_period_index(&s->groups[g].period);
            y[n] = 10000.0 * (double)c->group_counts[gi * e->n_terms + t] /
                   (double)c->group_words[gi];
            gs[n++] = g;
        }
        tt_summary sum;
        if (tt_summary_compute(y, n, 0, &sum, &c->err)) {
            st = c->err.status;
            break;
        }
        double slope = NAN;
        tt_linear_fit(x, y, n, &slope, NULL);
        double r = tt_pearson(x, y, n);
        char p0[TT_PERIOD_TEXT_MAX] = "", p1[TT_PERIOD_TEXT_MAX] = "";
        if (n) {
            tt_period_format(&s->groups[gs[0]].period, p0, sizeof p0);
            tt_period_format(&s->groups[gs[n - 1]].period, p1, sizeof p1);
        }
        st = tt_table_cstr(&w, e->name);
        if (!st) st = tt_table_str(&w, e->terms[t], e->lens[t]);
        if (!st) st = tt_table_u64(&w, n);
        if (!st) st = tt_table_cstr(&w, p0);
        if (!st) st = tt_table_cstr(&w, p1);
        if (!st) st = tt_table_fixed(&w, sum.mean, 4);
        if (!st) st = tt_table_fixed(&w, sum.median, 4);
        if (!st) st = tt_table_fixed(&w, sum.sd_sample, 4);
        if (!st) st = tt_table_fixed(&w, sum.cv, 4);
        if (!st) st = tt_table_fixed(&w, sum.min, 4);
        if (!st) st = tt_table_fixed(&w, sum.max, 4);
        if (!st) st = tt_table_fixed(&w, slope, 4);
        if (!st) st = tt_table_fixed(&w, r, 4);
        if (!st) st = tt_table_end_row(&w);
        if (!st) st = flush(c, 0);
    }
    tt_free(x);
    tt_free(y);
    tt_free(gs);
    return st;
}

static tt_status write_dispersion(trend_ctx *c, const tt_series *s, const entity_info *e,
                                  const tt_trend_counts *tc, const size_t *doc_group,
                                  int *header)
{
    tt_table_writer w;
    tt_status st = tt_table_begin(&w, c->format, &c->buf, disp_cols, 8, *header);
    *header = 0;
    size_t nd = tc->n_docs ? tc->n_docs : 1;
    uint64_t *counts = tt_malloc(nd * sizeof *counts), *sizes = tt_malloc(nd * sizeof *sizes);
    if (!counts || !sizes)
        st = TT_ENOMEM;
    for (size_t t = 0; t < e->n_terms && !st; t++) {
        for (size_t g = e->first_group; g < e->first_group + e->n_groups && !st; g++) {
            size_t parts = 0;
            for (size_t d = 0; d < tc->n_docs; d++)
                if (doc_group[d] == g && tc->docs[d].words) {
                    counts[parts] = tc->counts[d * tc->n_terms + t];
                    sizes[parts++] = tc->docs[d].words;
                }
            if (parts == 0)
                continue;
            tt_dispersion dsp;
            if (tt_dispersion_compute(counts, sizes, parts, &dsp, &c->err)) {
                st = c->err.status;
                break;
            }
            char pt[TT_PERIOD_TEXT_MAX];
            st = tt_table_cstr(&w, e->name);
            if (!st) st = tt_table_str(&w, e->terms[t], e->lens[t]);
            if (!st) st = tt_table_cstr(&w, tt_period_format(&s->groups[g].period, pt, sizeof pt));
            if (!st) st = tt_table_u64(&w, parts);
            if (!st) st = tt_table_u64(&w, dsp.doc_freq);
            if (!st) st = tt_table_fixed(&w, dsp.dp, 4);
            if (!st) st = tt_table_fixed(&w, dsp.dp_norm, 4);
            if (!st) st = tt_table_fixed(&w, dsp.juilland_d, 4);
            if (!st) st = tt_table_end_row(&w);
            if (!st) st = flush(c, 0);
        }
    }
    tt_free(counts);
    tt_free(sizes);
    return st;
}

static tt_status write_tfidf(trend_ctx *c, const tt_series *s, const entity_info *e,
                             const tt_trend_counts *tc, const size_t *doc_group,
                             const tt_termtable *doc_freq, uint64_t n_docs, int *header)
{
    tt_table_writer w;
    tt_status st = tt_table_begin(&w, c->format, &c->buf, tfidf_cols, 9, *header);
    *header = 0;
    for (size_t d = 0; d < tc->n_docs && !st; d++) {
        size_t g = doc_group[d];
        if (g < e->first_group || g >= e->first_group + e->n_groups)
            continue;
        for (size_t t = 0; t < e->n_terms && !st; t++) {
            uint64_t k = tc->counts[d * tc->n_terms + t];
            uint64_t df = tt_termtable_get(doc_freq, e->terms[t], e->lens[t]);
            double idf = tt_idf(n_docs, df);
            double norm = tc->docs[d].tfidf_norm;
            char pt[TT_PERIOD_TEXT_MAX];
            st = tt_table_cstr(&w, e->name);
            if (!st) st = tt_table_cstr(&w, tt_period_format(&s->groups[g].period, pt, sizeof pt));
            if (!st) st = tt_table_cstr(&w, tc->docs[d].name);
            if (!st) st = tt_table_str(&w, e->terms[t], e->lens[t]);
            if (!st) st = tt_table_u64(&w, k);
            if (!st) st = tt_table_u64(&w, tc->docs[d].words);
            if (!st) st = tt_table_u64(&w, df);
            if (!st) st = tt_table_fixed(&w, idf, 6);
            if (!st) st = tt_table_fixed(&w, norm > 0 ? (double)k * idf / norm : 0.0, 6);
            if (!st) st = tt_table_end_row(&w);
            if (!st) st = flush(c, 0);
        }
    }
    return st;
}

/* The periods of every entity, sorted and distinct: the table's columns. */
typedef struct period_cols {
    tt_period *periods;
    char **names; /* "entity", "measure", "term", periods..., "total" */
    size_t n_periods;
} period_cols;

static int period_cmp(const void *a, const void *b)
{
    return tt_period_compare(a, b);
}

static int build_period_cols(const tt_series *s, period_cols *pc)
{
    size_t n = s->n_groups ? s->n_groups : 1;
    pc->periods = malloc(n * sizeof *pc->periods);
    pc->names = calloc(n + 4, sizeof *pc->names);
    if (!pc->periods || !pc->names)
        return 0;
    for (size_t g = 0; g < s->n_groups; g++)
        pc->periods[g] = s->groups[g].period;
    qsort(pc->periods, s->n_groups, sizeof *pc->periods, period_cmp);
    size_t k = 0;
    for (size_t g = 0; g < s->n_groups; g++)
        if (k == 0 || tt_period_compare(&pc->periods[k - 1], &pc->periods[g]))
            pc->periods[k++] = pc->periods[g];
    pc->n_periods = k;
    const char *fixed[] = { "entity", "measure", "term" };
    for (size_t i = 0; i < 3; i++)
        if (!(pc->names[i] = strdup(fixed[i])))
            return 0;
    for (size_t i = 0; i < k; i++) {
        char pt[TT_PERIOD_TEXT_MAX];
        if (!(pc->names[3 + i] = strdup(tt_period_format(&pc->periods[i], pt, sizeof pt))))
            return 0;
    }
    return (pc->names[3 + k] = strdup("total")) != NULL;
}

static void period_cols_release(period_cols *pc)
{
    if (pc->names)
        for (size_t i = 0; i < pc->n_periods + 4; i++)
            free(pc->names[i]);
    free(pc->names);
    free(pc->periods);
}

static tt_status write_table(trend_ctx *c, const tt_series *s, const entity_info *e,
                             const period_cols *pc, int *header)
{
    size_t rows = e->n_terms, cols = pc->n_periods;
    tt_status st = TT_OK;
    uint64_t *cells = tt_calloc((rows * cols) > 0 ? rows * cols : 1, sizeof *cells);
    uint64_t *rt = tt_malloc((rows ? rows : 1) * sizeof *rt);
    uint64_t *ct = tt_malloc((cols ? cols : 1) * sizeof *ct);
    int *present = tt_calloc(cols ? cols : 1, sizeof *present);
    uint64_t total = 0;
    if (!cells || !rt || !ct || !present) {
        st = TT_ENOMEM;
        goto out;
    }
    /* Place each group in its column; a period the entity lacks stays empty. */
    for (size_t g = e->first_group; g < e->first_group + e->n_groups; g++) {
        tt_period *p = bsearch(&s->groups[g].period, pc->periods, cols, sizeof *pc->periods,
                               period_cmp);
        size_t col = (size_t)(p - pc->periods);
        present[col] = 1;
        for (size_t t = 0; t < rows; t++)
            cells[t * cols + col] = c->group_counts[(g - e->first_group) * rows + t];
    }
    if (tt_contingency_margins(cells, rows, cols, rt, ct, &total, &c->err)) {
        st = c->err.status;
        goto out;
    }
    tt_table_writer w;
    st = tt_table_begin(&w, c->format, &c->buf, (const char *const *)pc->names, cols + 4,
                        *header);
    *header = 0;
    for (int share = 0; share < 2 && !st; share++)
        for (size_t t = 0; t <= rows && !st; t++) {
            st = tt_table_cstr(&w, e->name);
            if (!st) st = tt_table_cstr(&w, share ? "share" : "count");
            if (!st)
                st = t < rows ? tt_table_str(&w, e->terms[t], e->lens[t])
                              : tt_table_cstr(&w, "(total)");
            for (size_t k = 0; k <= cols && !st; k++) {
                uint64_t v = k < cols ? (t < rows ? cells[t * cols + k] : ct[k])
                                      : (t < rows ? rt[t] : total);
                if (k < cols && !present[k])
                    st = tt_table_cstr(&w, "");
                else if (share)
                    st = tt_table_fixed(&w, total ? (double)v / (double)total : NAN, 6);
                else
                    st = tt_table_u64(&w, v);
            }
            if (!st) st = tt_table_end_row(&w);
            if (!st) st = flush(c, 0);
        }
out:
    tt_free(cells);
    tt_free(rt);
    tt_free(ct);
    tt_free(present);
    return st;
}

enum { OPT_MANIFEST = CLI_OPT_FIRST_FREE, OPT_LAYOUT, OPT_HEADERS, OPT_HEADER_PERIOD, OPT_ENTITY, OPT_KINDS, OPT_TERMS,
       OPT_TERMS_FILE, OPT_TOP_MOVERS, OPT_MIN_COUNT, OPT_SHOW, OPT_NO_HEADER, OPT_TFIDF,
       OPT_TABLE };

static const struct option longopts[] = {
    { "manifest", required_argument, NULL, OPT_MANIFEST },
    { "layout", required_argument, NULL, OPT_LAYOUT },
    { "headers", no_argument, NULL, OPT_HEADERS },
    { "header-period", required_argument, NULL, OPT_HEADER_PERIOD },
    { "entity", required_argument, NULL, OPT_ENTITY },
    { "kinds", required_argument, NULL, OPT_KINDS },
    { "terms", required_argument, NULL, OPT_TERMS },
    { "terms-file", required_argument, NULL, OPT_TERMS_FILE },
    { "top-movers", required_argument, NULL, OPT_TOP_MOVERS },
    { "min-count", required_argument, NULL, OPT_MIN_COUNT },
    { "show", required_argument, NULL, OPT_SHOW },
    { "tfidf", no_argument, NULL, OPT_TFIDF },
    { "table", no_argument, NULL, OPT_TABLE },
    { "format", required_argument, NULL, 'f' },
    { "output", required_argument, NULL, 'o' },
    { "no-header", no_argument, NULL, OPT_NO_HEADER },
    { "help", no_argument, NULL, 'h' },
    CLI_PIPELINE_LONGOPTS,
    { NULL, 0, NULL, 0 }
};


int tt_cmd_trend(int argc, char **argv)
{
    trend_ctx c;
    memset(&c, 0, sizeof c);
    cli_pipeline_init(&c.pipe);
    c.header = 1;
    c.format = TT_FORMAT_TSV;
    c.top_movers = 10;
    c.min_count = 5;
    tt_buf_init(&c.buf, 0);
    tt_error_init(&c.err);
    const char *output = NULL, *manifest_path = NULL, *layout = NULL;
    int headers = 0;
    tt_period_granularity header_period = TT_PERIOD_QUARTER;
    const char *terms_list = NULL, *terms_file = NULL;
    int rc = TT_EXIT_TROUBLE, opt, out_open = 0, movers_given = 0;
    tt_series_options sopt;
    tt_series_options_init(&sopt);
    tt_manifest m;
    tt_manifest_init(&m);
    tt_series series;
    tt_series_init(&series);
    tt_source_list list;
    tt_source_list_init(&list);
    tt_trend_counts tc, run_df;
    tt_trend_counts_init(&tc);
    tt_trend_counts_init(&run_df);
    size_t *input_group = NULL, *doc_group = NULL;
    period_cols pc;
    memset(&pc, 0, sizeof pc);

    optind = 1;
    while ((opt = getopt_long(argc, argv, "f:o:j:qh", longopts, NULL)) != -1) {
        int handled = cli_pipeline_option(&c.pipe, opt, optarg);
        if (handled < 0)
            goto out;
        if (handled)
            continue;
        switch (opt) {
        case OPT_MANIFEST: manifest_path = optarg; break;
        case OPT_LAYOUT: layout = optarg; break;
        case OPT_HEADERS: headers = 1; break;
        case OPT_HEADER_PERIOD:
            if (!cli_header_period(optarg, &header_period))
                goto out;
            break;
        case OPT_ENTITY: sopt.entity = optarg; break;
        case OPT_KINDS: sopt.kinds = optarg; break;
        case OPT_TERMS: terms_list = optarg; break;
        case OPT_TERMS_FILE: terms_file = optarg; break;
        case OPT_TOP_MOVERS:
            if (!cli_parse_u64("--top-movers", optarg, 1, 100000, &c.top_movers)) goto out;
            movers_given = 1;
            break;
        case OPT_MIN_COUNT:
            if (!cli_parse_u64("--min-count", optarg, 1, UINT64_MAX, &c.min_count)) goto out;
            break;
        case OPT_TFIDF: c.show = SHOW_TFIDF; break;
        case OPT_TABLE: c.show = SHOW_TABLE; break;
        case OPT_SHOW:
            if (!strcmp(optarg, "rates")) c.show = SHOW_RATES;
            else if (!strcmp(optarg, "stats")) c.show = SHOW_STATS;
            else if (!strcmp(optarg, "dispersion")) c.show = SHOW_DISPERSION;
            else if (!strcmp(optarg, "tfidf")) c.show = SHOW_TFIDF;
            else if (!strcmp(optarg, "table")) c.show = SHOW_TABLE;
            else {
                cli_error("--show: expected rates, stats, dispersion, tfidf or table, got '%s'",
                          optarg);
                goto out;
            }
            break;
        case 'f':
            if (!cli_parse_format(optarg, &c.format))
                goto out;
            break;
        case 'o': output = optarg; break;
        case OPT_NO_HEADER: c.header = 0; break;
        case 'h': fputs(tt_help_trend, stdout); rc = TT_EXIT_OK; goto out;
        default:
            fprintf(stderr, "Try 'termtide help trend'.\n");
            goto out;
        }
    }
    if ((manifest_path != NULL) + (layout != NULL) + headers > 1) {
        cli_error("give one of --manifest, --layout and --headers");
        goto out;
    }
    if (!manifest_path && !layout && !headers) {
        cli_error("trend needs document metadata: --manifest FILE, --layout PATTERN ROOT or "
                  "--headers ROOT");
        goto out;
    }
    if ((terms_list || terms_file) && movers_given) {
        cli_error("--top-movers replaces a term list: give one or the other");
        goto out;
    }
    if (!layout && !headers && optind < argc) {
        cli_error("unexpected argument '%s' (documents come from --manifest)", argv[optind]);
        goto out;
    }
    if (!cli_pipeline_finish(&c.pipe))
        goto out;
    cli_pipeline_hooks(&c.pipe);
    c.pipe.batch.ctx = &c.pipe;
    c.pipe.progress = 0; /* several batches: a per-batch progress line would mislead */

    if (terms_list && !terms_from_list(&c, terms_list))
        goto out;
    if (terms_file && !terms_from_file(&c, terms_file))
        goto out;
    if ((terms_list || terms_file) && c.n_terms == 0) {
        cli_error("the term list is empty");
        goto out;
    }

    if (manifest_path) {
        if (!cli_load_manifest(&m, manifest_path))
            goto out;
    } else if (headers) {
        if (!cli_load_headers(&m, header_period, argc - optind, argv + optind, &c.skipped_docs))
            goto out;
    } else {
        if (!cli_load_layout(&m, layout, argc - optind, argv + optind))
            goto out;
    }
    {
        tt_error err;
        tt_error_init(&err);
        if (tt_series_build(&series, m.docs, m.n, &sopt, &err)) {
            cli_error("%s (choose document kinds with --kinds)", err.message);
            goto out;
        }
    }
    if (series.n_groups == 0) {
        cli_error("no documents match the entity and kinds asked for");
        goto out;
    }

    /* Entities and their term lists. */
    c.ents = calloc(series.n_entities ? series.n_entities : 1, sizeof *c.ents);
    if (!c.ents)
        goto oom;
    for (size_t g = 0; g < series.n_groups; g++) {
        if (g == 0 || strcmp(series.groups[g - 1].entity, series.groups[g].entity)) {
            c.ents[c.n_ents].name = series.groups[g].entity;
            c.ents[c.n_ents++].first_group = g;
        }
        c.ents[c.n_ents - 1].n_groups++;
    }
    size_t followed = 0;
    for (size_t i = 0; i < c.n_ents; i++) {
        entity_info *e = &c.ents[i];
        if (c.n_terms) {
            e->terms = c.terms;
            e->lens = c.lens;
            e->n_terms = c.n_terms;
        } else if (!find_movers(&c, &series, m.docs, e)) {
            goto out;
        }
        followed += e->n_terms;
    }
    if (followed == 0) {
        cli_error("no terms to follow (no entity has two periods with terms counted at least "
                  "--min-count times)");
        goto out;
    }

    tt_error err;
    tt_error_init(&err);
    tt_batch_summary sum;
    if (c.show == SHOW_TFIDF) {
        /* First pass: document frequencies over every document of the run. */
        tt_trend_options first;
        tt_trend_options_init(&first);
        first.want_doc_freq = 1;
        if (!group_inputs(&series, m.docs, 0, series.n_groups, &list, &input_group))
            goto out;
        if (tt_trend_collect(&list, &c.pipe.batch, &first, &run_df, &sum, &err)) {
            print_fatal(&err);
            goto out;
        }
        tt_source_list_release(&list);
        tt_source_list_init(&list);
        free(input_group);
        input_group = NULL;
    }
    if (c.show == SHOW_TABLE && !build_period_cols(&series, &pc))
        goto oom;
    if (tt_outfile_open(&c.out, output, &c.err)) {
        print_fatal(&c.err);
        goto out;
    }
    out_open = 1;
    int header = c.header;
    size_t n_docs = 0;
    /* Entity after entity: its documents are read once for its terms, and
     * only its documents' counts of its terms are held. */
    for (size_t i = 0; i < c.n_ents; i++) {
        const entity_info *e = &c.ents[i];
        if (e->n_terms == 0)
            continue;
        if (!group_inputs(&series, m.docs, e->first_group, e->n_groups, &list, &input_group))
            goto out;
        tt_trend_options what;
        tt_trend_options_init(&what);
        what.terms = (const char *const *)e->terms;
        what.lens = e->lens;
        what.n_terms = e->n_terms;
        if (c.show == SHOW_TFIDF) {
            what.idf_doc_freq = run_df.doc_freq;
            what.idf_docs = run_df.n_docs;
        }
        if (tt_trend_collect(&list, &c.pipe.batch, &what, &tc, &sum, &err)) {
            print_fatal(&err);
            goto out;
        }
        c.skipped_docs += sum.skipped;
        n_docs += tc.n_docs;
        doc_group = malloc((tc.n_docs ? tc.n_docs : 1) * sizeof *doc_group);
        c.group_counts = calloc(e->n_groups * e->n_terms, sizeof *c.group_counts);
        c.group_words = calloc(e->n_groups, sizeof *c.group_words);
        if (!doc_group || !c.group_counts || !c.group_words)
            goto oom;
        for (size_t d = 0; d < tc.n_docs; d++) {
            size_t g = input_group[tc.docs[d].input], gi = g - e->first_group;
            doc_group[d] = g;
            c.group_words[gi] += tc.docs[d].words;
            for (size_t t = 0; t < e->n_terms; t++)
                c.group_counts[gi * e->n_terms + t] += tc.counts[d * e->n_terms + t];
        }
        tt_status st = TT_OK;
        switch (c.show) {
        case SHOW_RATES: st = write_rates(&c, &series, e, &header); break;
        case SHOW_STATS: st = write_stats(&c, &series, e, &header); break;
        case SHOW_DISPERSION:
            st = write_dispersion(&c, &series, e, &tc, doc_group, &header);
            break;
        case SHOW_TFIDF:
            st = write_tfidf(&c, &series, e, &tc, doc_group, run_df.doc_freq, run_df.n_docs,
                             &header);
            break;
        case SHOW_TABLE: st = write_table(&c, &series, e, &pc, &header); break;
        }
        free(doc_group);
        doc_group = NULL;
        free(c.group_counts);
        c.group_counts = NULL;
        free(c.group_words);
        c.group_words = NULL;
        free(input_group);
        input_group = NULL;
        tt_source_list_release(&list);
        tt_source_list_init(&list);
        if (st) {
            if (c.err.status)
                print_fatal(&c.err);
            else
                cli_error("%s", tt_status_name(st));
            goto out;
        }
    }
    if (flush(&c, 1) || tt_outfile_commit(&c.out, &c.err)) {
        print_fatal(&c.err);
        goto out;
    }
    out_open = 0;
    if (!c.pipe.quiet)
        fprintf(stderr, "%s trend: %zu entit%s, %zu series, %zu document%s, %zu skipped\n",
                tt_prog, c.n_ents, c.n_ents == 1 ? "y" : "ies", followed, n_docs,
                n_docs == 1 ? "" : "s", c.skipped_docs);
    rc = c.skipped_docs ? TT_EXIT_TROUBLE : TT_EXIT_OK;
    goto out;
oom:
    cli_error("out of memory");
out:
    if (out_open)
        tt_outfile_abort(&c.out);
    period_cols_release(&pc);
    free(doc_group);
    free(input_group);
    free(c.group_counts);
    free(c.group_words);
    if (c.ents)
        for (size_t i = 0; i < c.n_ents; i++)
            if (c.ents[i].owned) {
                for (size_t j = 0; j < c.ents[i].n_terms; j++)
                    tt_free(c.ents[i].terms[j]);
                free(c.ents[i].terms);
                free(c.ents[i].lens);
            }
    free(c.ents);
    for (size_t i = 0; i < c.n_terms; i++)
        tt_free(c.terms[i]);
    free(c.terms);
    free(c.lens);
    tt_trend_counts_release(&tc);
    tt_trend_counts_release(&run_df);
    tt_source_list_release(&list);
    tt_series_release(&series);
    tt_manifest_release(&m);
    tt_buf_release(&c.buf);
    cli_pipeline_release(&c.pipe);
    return rc;
}
