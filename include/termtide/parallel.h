/* termtide — running a few tasks on a few threads.
 *
 * The stages that split work over threads (a batch's workers, a search's
 * workers, sorting a total, writing its rows) start their threads here, so
 * every one of them starts where it can run at once (see src/parallel.c). */
#ifndef TT_PARALLEL_H
#define TT_PARALLEL_H

#include <stddef.h>

/* Runs fn(ctx, 0), ..., fn(ctx, ntasks - 1) on up to `threads` threads, the
 * calling thread included (it runs task 0, and task k goes to thread
 * k % threads), and returns when all have run. A thread that cannot be
 * started leaves its tasks to the calling thread, so every task runs once
 * whatever happens; fn reports its own failures through ctx. */
void tt_run_tasks(int threads, size_t ntasks, void (*fn)(void *ctx, size_t task), void *ctx);

#endif
