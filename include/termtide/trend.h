/* termtide — collecting chosen terms across the documents of a series (the
 * aggregate step behind `termtide trend`): a chosen term normalized the way
 * counted terms are, each document's words and the chosen terms' counts,
 * and, for tf-idf, the document frequency of the whole vocabulary and each
 * document's tf-idf vector length. Statistics over what is collected come
 * from stats.h. */
#ifndef TT_TREND_H
#define TT_TREND_H

#include <stddef.h>
#include <stdint.h>
#include "termtide/batch.h"
#include "termtide/buf.h"
#include "termtide/count.h"
#include "termtide/source.h"
#include "termtide/status.h"
#include "termtide/termtable.h"

/* Turns a term as a user wrote it ("Castings", "supply  shortage") into the
 * term the counter produces with opt (case folding, normalization, stems,
 * n-gram joining), written into out (reset first). The text must make
 * exactly one counted term that covers every token of it: TT_EINVAL with a
 * message saying why not ('"the" is left out by the stop-word lists or the
 * filters', '"supply shortage" has 2 words: count n-grams with --ngram 2'),
 * TT_ENOMEM. */
tt_status tt_trend_term_normalize(const tt_count_options *opt, const char *text, size_t len,
                                  tt_buf *out, tt_error *err);

/* Most chosen terms one collection follows. Each document keeps one count
 * per chosen term, so the list bounds that memory; a trend is read by a
 * person, and a thousand series is already more than one reads. */
#define TT_TREND_MAX_TERMS 1000

/* One counted document. */
typedef struct tt_trend_doc {
    size_t input;      /* index in the source list */
    char *name;        /* document name (owned) */
    uint64_t words;    /* terms counted in it (its table's total) */
    double tfidf_norm; /* with tt_trend_options.idf_doc_freq: the Euclidean length of
                          the document's vector of count x tt_idf(idf_docs, doc_freq)
                          over its whole vocabulary; else 0 */
} tt_trend_doc;

/* What tt_trend_collect gathered: documents in delivery order, and for
 * document i the count of chosen term j at counts[i * n_terms + j]. */
typedef struct tt_trend_counts {
    size_t n_terms;
    tt_trend_doc *docs;
    size_t n_docs;
    uint64_t *counts;
    tt_termtable *doc_freq; /* NULL unless asked for: each term of every document's
                               vocabulary with the number of documents holding it */
    /* private */
    size_t cap;
} tt_trend_counts;

void tt_trend_counts_init(tt_trend_counts *c);
/* Frees what c owns; it is left initialised (empty). */
void tt_trend_counts_release(tt_trend_counts *c);

/* What to collect. */
typedef struct tt_trend_options {
    const char *const *terms; /* n_terms chosen terms, already normalized */
    const size_t *lens;
    size_t n_terms;           /* at most TT_TREND_MAX_TERMS; 0 is allowed */
    int want_doc_freq;        /* build tt_trend_counts.doc_freq */
    /* tf-idf over the whole vocabulary: the document frequencies and the
     * number of documents of a first pass (NULL: no norms). */
    const tt_termtable *idf_doc_freq;
    uint64_t idf_docs;
} tt_trend_options;

/* Nothing chosen, no document frequencies, no norms. */
void tt_trend_options_init(tt_trend_options *o);

/* Counts every document of inputs through the batch runner with opt's
 * reading, counting and thread options (its on_problem and on_progress are
 * called with opt->ctx; on_document and prepare are not used) and keeps, per
 * document, its words, the counts of the chosen terms and, when asked, its
 * tf-idf vector length. With want_doc_freq the run's document frequencies
 * are kept too, for a second pass: tf-idf over the whole vocabulary needs
 * the idf of every term of the run before any document's length is known,
 * and holding every document's table until then would grow with the
 * archive. Memory: the documents times the chosen terms, plus the run's
 * vocabulary with want_doc_freq; never a document's whole table. out is
 * released first. *sum as in tt_batch_run. TT_OK when the batch ran (failed
 * inputs are in sum->skipped); TT_ELIMIT past TT_TREND_MAX_TERMS; TT_EINVAL
 * when a document holds a term missing from idf_doc_freq (the inputs changed
 * since the first pass); else the fatal status with err. */
tt_status tt_trend_collect(const tt_source_list *inputs, const tt_batch_options *opt,
                           const tt_trend_options *what, tt_trend_counts *out,
                           tt_batch_summary *sum, tt_error *err);

#endif
