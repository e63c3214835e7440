/* termtide — collecting chosen terms across a series of documents, for
 * `termtide trend`.
 *
 * Design. A trend follows a handful of terms over many documents, so what is
 * kept per document is its word total and one count per chosen term: the
 * batch runner delivers each document's table in input order, the chosen
 * terms are looked up in it (O(k) hash lookups), and the table is freed by
 * the runner. Memory is documents × chosen terms, never a document's whole
 * table. tf-idf over the whole vocabulary needs each document's vector
 * length, which depends on the idf of every term of the run, known only at
 * the end; so it takes a second pass (tt_trend_collect with idf_doc_freq)
 * with the run's document-frequency table (bounded by the vocabulary)
 * instead of holding every document's table between passes.
 *
 * A chosen term is normalized by counting its text with the same counter
 * options, so "Castings" is found as "castings" and, with --stem, as its
 * stem: a term is the same term in every table. */
#include <math.h>

#include "termtide/stats.h"
#include "termtide/trend.h"
#include "tt_internal.h"

/* ---- normalizing a chosen term --------------------------------------------- */

typedef struct pick_ctx {
    uint64_t words;            /* tokens in the text */
    const tt_term_entry *best; /* the counted term covering all of them */
} pick_ctx;

static size_t words_in(const char *s, size_t len)
{
    size_t n = 1;
    for (size_t i = 0; i < len; i++)
        n += s[i] == ' ';
    return n;
}

static int pick_covering(void *vctx, const tt_term_entry *e)
{
    pick_ctx *p = vctx;
    /* N-gram parts are joined by one space, so a term of w words holds
     * w - 1 spaces; only a term covering every token is the whole text. */
    if (words_in(e->term, e->len) == p->words)
        p->best = e;
    return p->best != NULL;
}

tt_status tt_trend_term_normalize(const tt_count_options *opt, const char *text, size_t len,
                                  tt_buf *out, tt_error *err)
{
    tt_buf_reset(out);
    tt_counter *c = tt_counter_new(opt);
    tt_termtable *t = tt_termtable_new();
    tt_status st = TT_OK;
    if (!c || !t) {
        st = tt_error_set(err, TT_ENOMEM, NULL, -1, "out of memory");
        goto out;
    }
    tt_doc_stats stats;
    memset(&stats, 0, sizeof stats);
    st = tt_counter_count_text(c, text, len, t, &stats);
    if (st) {
        tt_error_set(err, st, NULL, -1, "cannot count the term \"%.*s\"", (int)len, text);
        goto out;
    }
    if (stats.words_read == 0) {
        st = tt_error_set(err, TT_EINVAL, NULL, -1, "the term \"%.*s\" holds no word",
                          (int)len, text);
        goto out;
    }
    pick_ctx p = { stats.words_read, NULL };
    tt_termtable_foreach(t, pick_covering, &p);
    if (!p.best) {
        int ngram_max = opt->ngram_max > 0 ? opt->ngram_max : 1;
        if (stats.words_read > 1 && stats.words_read > (uint64_t)ngram_max)
            st = tt_error_set(err, TT_EINVAL, NULL, -1,
                              "the term \"%.*s\" has %llu words: count n-grams with --ngram %llu",
                              (int)len, text, (unsigned long long)stats.words_read,
                              (unsigned long long)stats.words_read);
        else
            st = tt_error_set(err, TT_EINVAL, NULL, -1,
                              "the term \"%.*s\" is never counted with these options (a "
                              "stop-word, a number, too short, or outside the --ngram range)",
                              (int)len, text);
        goto out;
    }
    st = tt_buf_append(out, p.best->term, p.best->len);
    if (st)
        tt_error_set(err, st, NULL, -1, "out of memory");
out:
    tt_termtable_free(t);
    tt_counter_free(c);
    return st;
}

/* ---- per-document collection --------------------------------------------------- */

void tt_trend_counts_init(tt_trend_counts *c)
{
    memset(c, 0, sizeof *c);
}

void tt_trend_counts_release(tt_trend_counts *c)
{
    for (size_t i = 0; i < c->n_docs; i++)
        tt_free(c->docs[i].name);
    tt_free(c->docs);
    tt_free(c->counts);
    tt_termtable_free(c->doc_freq);
    tt_trend_counts_init(c);
}

void tt_trend_options_init(tt_trend_options *o)
{
    memset(o, 0, sizeof *o);
}

typedef struct collect_ctx {
    tt_trend_counts *out;
    const tt_trend_options *what;
    const tt_batch_options *user;
    tt_status status; /* of the last foreach callback */
    double sum_squares;
} collect_ctx;

static void forward_problem(void *vctx, const char *name, const tt_error *err, int skipped)
{
    collect_ctx *a = vctx;
    if (a->user->on_problem)
        a->user->on_problem(a->user->ctx, name, err, skipped);
}

static void forward_progress(void *vctx, size_t done, size_t total, uint64_t bytes_done,
                             uint64_t bytes_total)
{
    collect_ctx *a = vctx;
    if (a->user->on_progress)
        a->user->on_progress(a->user->ctx, done, total, bytes_done, bytes_total);
}

static int add_doc_freq(void *vctx, const tt_term_entry *e)
{
    collect_ctx *a = vctx;
    a->status = tt_termtable_add(a->out->doc_freq, e->term, e->len, 1);
    return a->status != TT_OK;
}

/* Adds the square of the term's tf-idf weight: count x idf, with the idf of
 * scikit-learn's TfidfVectorizer defaults (tt_idf). */
static int add_square(void *vctx, const tt_term_entry *e)
{
    collect_ctx *a = vctx;
    uint64_t df = tt_termtable_get(a->what->idf_doc_freq, e->term, e->len);
    if (df == 0) {
        a->status = TT_EINVAL;
        return 1;
    }
    double w = (double)e->count * tt_idf(a->what->idf_docs, df);
    a->sum_squares += w * w;
    return 0;
}

static tt_status keep_document(void *vctx, const tt_doc_result *r)
{
    collect_ctx *a = vctx;
    tt_trend_counts *o = a->out;
    if (o->n_docs == o->cap) {
        size_t cap = o->cap ? 2 * o->cap : 16;
        tt_trend_doc *d = tt_reallocarray(o->docs, cap, sizeof *d);
        if (!d)
            return TT_ENOMEM;
        o->docs = d;
        uint64_t *cnt = tt_reallocarray(o->counts, cap, (o->n_terms ? o->n_terms : 1) *
                                                            sizeof *cnt);
        if (!cnt)
            return TT_ENOMEM;
        o->counts = cnt;
        o->cap = cap;
    }
    double norm = 0;
    if (a->what->idf_doc_freq) {
        a->sum_squares = 0;
        tt_termtable_foreach(r->table, add_square, a);
        if (a->status)
            return a->status;
        norm = sqrt(a->sum_squares);
    }
    if (o->doc_freq) {
        tt_termtable_foreach(r->table, add_doc_freq, a);
        if (a->status)
            return a->status;
    }
    char *name = tt_strdup(r->name ? r->name : r->path);
    if (!name)
        return TT_ENOMEM;
    tt_trend_doc *d = &o->docs[o->n_docs];
    d->input = r->input;
    d->name = name;
    d->words = tt_termtable_total(r->table);
    d->tfidf_norm = norm;
    uint64_t *row = o->counts + o->n_docs * o->n_terms;
    for (size_t j = 0; j < o->n_terms; j++)
        row[j] = tt_termtable_get(r->table, a->what->terms[j], a->what->lens[j]);
    o->n_docs++;
    return TT_OK;
}

tt_status tt_trend_collect(const tt_source_list *inputs, const tt_batch_options *opt,
                           const tt_trend_options *what, tt_trend_counts *out,
                           tt_batch_summary *sum, tt_error *err)
{
    tt_trend_counts_release(out);
    memset(sum, 0, sizeof *sum);
    if (what->n_terms > TT_TREND_MAX_TERMS)
        return tt_error_set(err, TT_ELIMIT, NULL, -1, "%zu terms: at most %d are followed",
                            what->n_terms, TT_TREND_MAX_TERMS);
    out->n_terms = what->n_terms;
    if (what->want_doc_freq) {
        out->doc_freq = tt_termtable_new();
        if (!out->doc_freq)
            return tt_error_set(err, TT_ENOMEM, NULL, -1, "out of memory");
    }
    collect_ctx a;
    memset(&a, 0, sizeof a);
    a.out = out;
    a.what = what;
    a.user = opt;
    tt_batch_options o = *opt;
    o.on_document = keep_document;
    o.prepare = NULL;
    o.on_problem = forward_problem;
    o.on_progress = opt->on_progress ? forward_progress : NULL;
    o.ctx = &a;
    tt_status st = tt_batch_run(inputs, &o, sum, err);
    if (st == TT_EINVAL && a.status == TT_EINVAL)
        return tt_error_set(err, TT_EINVAL, NULL, -1,
                            "a document holds a term the first tf-idf pass did not see: "
                            "the inputs changed between the two passes");
    return st;
}
