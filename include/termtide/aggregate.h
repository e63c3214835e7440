/* termtide — the aggregate stage: the documents of a side (a set of files,
 * or the documents of one entity's period) counted into one term table. */
#ifndef TT_AGGREGATE_H
#define TT_AGGREGATE_H

#include "termtide/batch.h"
#include "termtide/source.h"
#include "termtide/status.h"
#include "termtide/termtable.h"

/* Counts every document of inputs and adds its terms to out, through the
 * batch runner with opt's reading, counting and thread options; opt's
 * on_problem and on_progress are called (with opt->ctx) as in
 * tt_batch_run, its on_document and prepare are not used. *sum as in
 * tt_batch_run. Returns TT_OK when the batch ran (inputs that failed are in
 * sum->skipped), else the fatal status with err. */
tt_status tt_aggregate_run(const tt_source_list *inputs, const tt_batch_options *opt,
                           tt_termtable *out, tt_batch_summary *sum, tt_error *err);

#endif
