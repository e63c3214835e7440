/* termtide — running the pipeline over a batch of inputs, on N worker
 * threads, delivering each document's result to the caller in input order.
 *
 * Memory stays bounded: workers run at most `window` inputs ahead of the
 * caller, and each result is freed once delivered, so a batch of any size
 * holds a few documents' tables at a time. */
#ifndef TT_BATCH_H
#define TT_BATCH_H

#include <stddef.h>
#include <stdint.h>
#include "termtide/count.h"
#include "termtide/document.h"
#include "termtide/source.h"
#include "termtide/status.h"

typedef struct tt_doc_result {
    size_t input;            /* index in the source list */
    const char *name;        /* document name (see tt_document) */
    const char *path;
    tt_doc_kind kind, outer_kind;
    const char *encoding;    /* tt_encoding_name of the file */
    const char *type;        /* wrapper <TYPE> or "" */
    const char *entity, *period, *form; /* wrapper header or "" */
    const char *notes;       /* "" when none */
    const char *sha256;      /* the file's SHA-256 (64 hex digits) from the bytes read,
                                when read.sha256 is set; else "" */
    uint64_t bytes;          /* decoded bytes of this document */
    tt_doc_stats stats;
    const tt_termtable *table;
    const char *prepared;    /* what `prepare` wrote for this document */
    size_t prepared_len;
} tt_doc_result;

struct tt_index;

typedef struct tt_batch_options {
    tt_read_options read;
    tt_count_options count;
    int threads;             /* 1 = run in the calling thread */
    size_t window;           /* inputs in flight; 0 = 4 × threads (32 × threads
                              * with total and neither prepare nor analyse) */
    /* Called in input order, in the calling thread. Non-OK stops the batch
     * and is returned by tt_batch_run (e.g. a write error). */
    tt_status (*on_document)(void *ctx, const tt_doc_result *r);
    /* Optional: called in the worker thread right after a document is
     * counted, to turn its result into output bytes (appended to out) while
     * other workers count; on_document then receives them as r->prepared.
     * Must only read ctx. Non-OK stops the batch like on_document. */
    tt_status (*prepare)(void *ctx, const tt_doc_result *r, tt_buf *out);
    /* A problem, in input order: skipped = 1 when the input or document was
     * not counted, 0 for a note on odd but readable input. */
    void (*on_problem)(void *ctx, const char *name, const tt_error *err, int skipped);
    /* After each input; may be NULL. */
    void (*on_progress)(void *ctx, size_t inputs_done, size_t inputs_total,
                        uint64_t bytes_done, uint64_t bytes_total);
    void *ctx;
    /* Optional: when set, every document's table is added to this table in
     * the worker threads (each worker sums into a partial table of its own;
     * the partials are added here at the end), and on_document and prepare
     * see table == NULL. For callers that need only the sum (a total, one
     * side of a comparison): the main thread then merges nothing. Sums do
     * not depend on the order, so the result is the same for any thread
     * count. */
    tt_termtable *total;
    /* Optional, with total and more than one thread: the workers' partial
     * tables are not merged into total but handed over here (tables[0..n),
     * one per worker; the caller frees each with tt_termtable_free() and
     * the array with tt_free()); the sum is then the union of total (which
     * may hold counts too) and these, as tt_termtable_sorted_union() sorts
     * it in parallel without a merged table. On failure nothing is handed
     * over. */
    tt_termtable_set *total_parts;
    /* Optional: analysis instead of counting. Each document goes to
     * `analyse` in a worker thread with that worker's own state (made by
     * worker_new and freed by worker_free, both in that thread; either may
     * be NULL, then state is NULL); it appends what it makes of the document
     * to out, delivered in order as r->prepared, and may fill *stats
     * (words_read feeds the summary and the "no words found" note). Then no
     * table is made: `count`, `prepare` and `total` are ignored and
     * r->table is NULL. worker_new returning NULL is out of memory; a
     * non-OK from analyse skips that document as a problem (TT_ENOMEM,
     * TT_ELIMIT and the like), the batch goes on. */
    void *(*worker_new)(void *ctx);
    void (*worker_free)(void *ctx, void *state);
    tt_status (*analyse)(void *ctx, void *state, const tt_document *doc, tt_buf *out,
                         tt_doc_stats *stats);
    /* With analyse: count as well. The worker counts the document as usual
     * (r->table, r->stats, `total`), then calls analyse (its stats are
     * ignored), whose output is r->prepared; `prepare` is not called. */
    int analyse_with_count;
    /* Optional: an open index (index.h) to replay the inputs from instead
     * of reading them; the callbacks see what reading would give (see
     * tt_index_replay). Not with `analyse`. */
    struct tt_index *index;
} tt_batch_options;

void tt_batch_options_init(tt_batch_options *o);

typedef struct tt_batch_summary {
    size_t inputs;           /* paths in the list */
    size_t documents;        /* documents counted */
    size_t skipped;          /* inputs or documents not counted (errors) */
    size_t parts_skipped;    /* wrapper parts left out by type or uuencoded */
    size_t notes;            /* documents read with a note */
    uint64_t words;          /* words read */
    uint64_t terms;          /* terms counted */
    uint64_t bytes;          /* input bytes (file sizes) */
} tt_batch_summary;

/* Runs the batch. Returns TT_OK when the batch ran to the end (even if some
 * inputs were skipped: see summary->skipped), or the first fatal status
 * (out of memory in the coordinator, or a non-OK from on_document) with err
 * filled. */
tt_status tt_batch_run(const tt_source_list *inputs, const tt_batch_options *opt,
                       tt_batch_summary *summary, tt_error *err);

#endif
