/* termtide — the aggregate stage: many documents into one term table.
 * The batch runner sums the documents' tables in its worker threads
 * (tt_batch_options.total); memory is the side's vocabulary per worker. */
#include "termtide/aggregate.h"
#include "tt_internal.h"

typedef struct agg_ctx {
    tt_termtable *out;
    const tt_batch_options *user;
} agg_ctx;

static void forward_problem(void *vctx, const char *name, const tt_error *err, int skipped)
{
    agg_ctx *a = vctx;
    if (a->user->on_problem)
        a->user->on_problem(a->user->ctx, name, err, skipped);
}

static void forward_progress(void *vctx, size_t done, size_t total, uint64_t bytes_done,
                             uint64_t bytes_total)
{
    agg_ctx *a = vctx;
    if (a->user->on_progress)
        a->user->on_progress(a->user->ctx, done, total, bytes_done, bytes_total);
}

tt_status tt_aggregate_run(const tt_source_list *inputs, const tt_batch_options *opt,
                           tt_termtable *out, tt_batch_summary *sum, tt_error *err)
{
    agg_ctx a = { out, opt };
    tt_batch_options o = *opt;
    o.on_document = NULL;
    o.prepare = NULL;
    o.total = out; /* summed in the workers */
    o.on_problem = forward_problem;
    o.on_progress = opt->on_progress ? forward_progress : NULL;
    o.ctx = &a;
    return tt_batch_run(inputs, &o, sum, err);
}
