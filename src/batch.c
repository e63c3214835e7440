/* termtide — the batch runner.
 *
 * Workers take inputs in order from a shared counter, read and count every
 * document an input holds into that input's result slot, and mark it done.
 * The calling thread delivers results strictly in input order and frees
 * them. A worker may run at most `window` inputs ahead of delivery, so
 * memory is bounded by window × (one input's tables) whatever the batch
 * size, and output is identical whatever the thread count.
 *
 * When only the total is wanted, each worker counts straight into its own
 * partial table, and the partials are merged at the end (or handed over
 * unmerged, total_parts, for the caller to sort together); otherwise each
 * document gets its own table, delivered with its result (and merged into
 * the worker's partial when a total is wanted too).
 *
 * Failures are per input: a file that cannot be read, decoded or parsed is
 * recorded as a problem in its slot and delivered in order like a result;
 * the batch goes on. */
#include <pthread.h>
#include <sys/stat.h>


#include "termtide/batch.h"
#include "termtide/index.h"
#include "termtide/sections.h"
#include "termtable_internal.h"
#include "tt_internal.h"

typedef enum { EV_DOC, EV_PROBLEM } event_kind;

typedef struct event {
    event_kind kind;
    char *name;
    /* EV_DOC */
    char *path, *type, *entity, *period, *form, *notes;
    const char *encoding;
    char sha256[65];
    tt_doc_kind doc_kind, outer_kind;
    uint64_t bytes;
    tt_doc_stats stats;
    tt_termtable *table;
    tt_buf prepared;
    tt_status prepare_status;
    /* EV_PROBLEM */
    tt_error err;
    int skipped;
} event;

typedef struct slot {
    event *events;
    size_t n, cap;
    size_t parts_skipped;
    uint64_t bytes;
    int done;
    int oom; /* an event could not be recorded */
} slot;

typedef struct runner {
    const tt_source_list *inputs;
    const tt_batch_options *opt;
    slot *slots;
    size_t window;
    pthread_mutex_t lock;
    pthread_cond_t cond_done, cond_space;
    size_t next, delivered;
    size_t waiting_for; /* the input the calling thread waits for, or SIZE_MAX */
    int stop;
    tt_termtable **partials; /* one per worker thread, handed over at exit */
    size_t n_partials;
    tt_status total_status;  /* first failure adding to a partial table */
} runner;

typedef struct worker_ctx {
    runner *r;
    tt_counter *counter;
    void *astate;          /* opt->analyse is set: the worker's own state */
    slot *s;
    size_t input;
    tt_termtable *partial; /* opt->total is set: this worker's running sum */
    tt_status *partial_status; /* the first failure adding to it */
} worker_ctx;

/* Per-thread state: a counter and a reader, both reused across inputs, and
 * the worker's partial sum when the caller asked for a total. */
typedef struct worker_state {
    tt_counter *counter;
    tt_reader *reader;
    tt_termtable *partial;
    tt_status partial_status;
    void *astate;
    int astate_ok;
} worker_state;

/* Analysis in place of counting (analyse set, analyse_with_count not). */
static int only_analyse(const tt_batch_options *opt)
{
    return opt->analyse && !opt->analyse_with_count;
}

/* A worker's state: a counter, the caller's analysis state, or both. */
static void worker_state_init(worker_state *ws, const tt_batch_options *opt,
                              tt_termtable *partial)
{
    memset(ws, 0, sizeof *ws);
    ws->reader = tt_reader_new();
    ws->astate_ok = 1;
    if (opt->analyse) {
        ws->astate = opt->worker_new ? opt->worker_new(opt->ctx) : NULL;
        ws->astate_ok = !opt->worker_new || ws->astate;
        if (only_analyse(opt))
            return;
    }
    ws->counter = tt_counter_new(&opt->count);
    ws->partial = partial;
}

/* Brings the worker's partial table up to date with the hits its counter
 * still holds (see tti_counter_count_held); before the partial is read. */
static void worker_state_finish(worker_state *ws)
{
    if (ws->counter && ws->partial) {
        tt_status st = tti_counter_flush(ws->counter, ws->partial);
        if (st && ws->partial_status == TT_OK)
            ws->partial_status = st;
    }
}

static int worker_state_ok(const worker_state *ws, const tt_batch_options *opt)
{
    return ws->reader && ws->astate_ok && (only_analyse(opt) || ws->counter);
}

static void worker_state_release(worker_state *ws, const tt_batch_options *opt)
{
    tt_counter_free(ws->counter);
    tt_reader_free(ws->reader);
    if (opt->worker_free && ws->astate)
        opt->worker_free(opt->ctx, ws->astate);
}

void tt_batch_options_init(tt_batch_options *o)
{
    memset(o, 0, sizeof *o);
    tt_count_options_init(&o->count);
    o->threads = 1;
}

static void event_release(event *e)
{
    tt_free(e->name);
    tt_free(e->path);
    tt_free(e->type);
    tt_free(e->entity);
    tt_free(e->period);
    tt_free(e->form);
    tt_free(e->notes);
    tt_termtable_free(e->table);
    if (e->kind == EV_DOC)
        tt_buf_release(&e->prepared);
}

static void slot_reset(slot *s)
{
    for (size_t i = 0; i < s->n; i++)
        event_release(&s->events[i]);
    tt_free(s->events);
    memset(s, 0, sizeof *s);
}

static event *slot_push(slot *s)
{
    if (s->n == s->cap) {
        size_t cap = s->cap ? s->cap * 2 : 4;
        event *e = tt_reallocarray(s->events, cap, sizeof *e);
        if (!e) {
            s->oom = 1;
            return NULL;
        }
        s->events = e;
        s->cap = cap;
    }
    event *e = &s->events[s->n++];
    memset(e, 0, sizeof *e);
    return e;
}

static void add_problem(slot *s, const char *name, const tt_error *err, int skipped)
{
    event *e = slot_push(s);
    if (!e)
        return;
    e->kind = EV_PROBLEM;
    e->name = tt_strdup(name);
    e->err = *err;
    e->skipped = skipped;
}

/* The caller's view of a counted document. */
static tt_doc_result result_of(const event *e, size_t input)
{
    tt_doc_result res = {
        .input = input, .name = e->name, .path = e->path,
        .kind = e->doc_kind, .outer_kind = e->outer_kind,
        .encoding = e->encoding, .type = e->type, .entity = e->entity,
        .period = e->period, .form = e->form, .notes = e->notes, .sha256 = e->sha256,
        .bytes = e->bytes, .stats = e->stats, .table = e->table,
        .prepared = e->prepared.data, .prepared_len = e->prepared.len,
    };
    return res;
}

static tt_status on_doc(void *vctx, const tt_document *doc)
{
    worker_ctx *w = vctx;
    slot *s = w->s;
    tt_error err;
    tt_error_init(&err);
    const tt_batch_options *opt = w->r->opt;
    tt_termtable *table = NULL;
    tt_buf out;
    tt_buf_init(&out, 0);
    tt_doc_stats stats;
    memset(&stats, 0, sizeof stats);
    tt_status st;
    if (opt->read.n_sections) {
        /* the document cut to the sections asked for */
        tt_sections secs;
        tt_sections_init(&secs);
        size_t kept = 0;
        st = tt_sections_find(doc->blocks, opt->read.section_rules, &secs);
        if (!st)
            st = tt_blocks_keep_sections(doc->blocks, &secs, opt->read.sections,
                                         opt->read.n_sections, &kept);
        tt_sections_release(&secs);
        if (st || kept == 0) {
            if (st)
                tt_error_set(&err, st, doc->name, -1, "%s while finding sections",
                             tt_status_name(st));
            else
                tt_error_set(&err, TT_EINVAL, doc->name, -1, "no section %s%s found",
                             opt->read.sections[0], opt->read.n_sections > 1 ? " or the others" : "");
            add_problem(s, doc->name, &err, 1);
            tt_buf_release(&out);
            return TT_OK;
        }
        if (kept < opt->read.n_sections) {
            tt_error_set(&err, TT_OK, doc->name, -1, "%zu of the %zu sections asked for found",
                         kept, opt->read.n_sections);
            add_problem(s, doc->name, &err, 0);
        }
    }
    int analysing = only_analyse(opt);
    if (analysing) {
        st = opt->analyse(opt->ctx, w->astate, doc, &out, &stats);
    } else if (w->partial && !opt->analyse) {
        /* Only the total is wanted: count straight into the worker's
         * partial table, with no table per document to fill and merge. A
         * failure here (out of memory, too many distinct terms) may leave
         * part of the document in the partial, so it fails the total, as a
         * failed merge would. The counter may hold hits of the partial
         * until the worker ends (worker_state_finish). */
        st = tti_counter_count_held(w->counter, doc->blocks, w->partial, &stats);
        if (st && *w->partial_status == TT_OK)
            *w->partial_status = st;
    } else {
        table = tt_termtable_new();
        st = table ? tt_counter_count(w->counter, doc->blocks, table, &stats) : TT_ENOMEM;
        if (!st && opt->analyse) {
            tt_doc_stats astats;
            memset(&astats, 0, sizeof astats);
            analysing = 1;
            st = opt->analyse(opt->ctx, w->astate, doc, &out, &astats);
        }
    }
    if (st) {
        tt_error_set(&err, st, doc->name, -1, "%s while %s",
                     st == TT_ELIMIT && !analysing ? "too many distinct terms"
                                                   : tt_status_name(st),
                     analysing ? "analysing" : "counting");
        add_problem(s, doc->name, &err, 1);
        tt_termtable_free(table);
        tt_buf_release(&out);
        return TT_OK; /* go on with the other parts of a wrapper */
    }
    if (doc->notes && doc->notes[0]) {
        tt_error_set(&err, TT_OK, doc->name, -1, "%s", doc->notes);
        add_problem(s, doc->name, &err, 0);
    }
    if (stats.words_read == 0 && !(doc->notes && strstr(doc->notes, "empty"))) {
        tt_error_set(&err, TT_OK, doc->name, -1, "no words found");
        add_problem(s, doc->name, &err, 0);
    }
    if (stats.overlong) {
        tt_error_set(&err, TT_OK, doc->name, -1,
                     "%llu token(s) longer than %d bytes skipped",
                     (unsigned long long)stats.overlong, TT_LIMIT_TOKEN_BYTES);
        add_problem(s, doc->name, &err, 0);
    }
    event *e = slot_push(s);
    if (!e) {
        tt_termtable_free(table);
        tt_buf_release(&out);
        return TT_OK;
    }
    e->kind = EV_DOC;
    e->name = tt_strdup(doc->name);
    e->path = tt_strdup(doc->path);
    e->type = tt_strdup(doc->type ? doc->type : "");
    e->entity = tt_strdup(doc->entity ? doc->entity : "");
    e->period = tt_strdup(doc->period ? doc->period : "");
    e->form = tt_strdup(doc->form ? doc->form : "");
    e->notes = tt_strdup(doc->notes ? doc->notes : "");
    e->encoding = tt_encoding_name(doc->decode.encoding);
    tti_strlcpy(e->sha256, doc->sha256 ? doc->sha256 : "", sizeof e->sha256);
    e->doc_kind = doc->kind;
    e->outer_kind = doc->outer_kind;
    e->bytes = doc->raw_len;
    e->stats = stats;
    e->table = table;
    e->prepared = out; /* moved: the event owns it now */
    if (!e->name || !e->path || !e->type || !e->entity || !e->period || !e->form || !e->notes) {
        s->oom = 1;
        return TT_OK;
    }
    if (w->partial && table) {
        tt_status mst = tt_termtable_merge(w->partial, table);
        if (mst && *w->partial_status == TT_OK)
            *w->partial_status = mst;
        tt_termtable_free(table);
        e->table = NULL;
    }
    if (opt->prepare && !opt->analyse) {
        tt_doc_result res = result_of(e, w->input);
        e->prepare_status = w->r->opt->prepare(w->r->opt->ctx, &res, &e->prepared);
    }
    return TT_OK;
}

static void process_input(runner *r, worker_state *ws, size_t i, slot *s)
{
    const tt_source_entry *in = &r->inputs->items[i];
    tt_error err;
    tt_error_init(&err);
    if (in->status != TT_OK) {
        tt_error_set(&err, in->status, in->path, -1, "%s",
                     in->message ? in->message : tt_status_name(in->status));
        add_problem(s, in->path, &err, 1);
        return;
    }
    struct stat sb;
    if (strcmp(in->path, "-") != 0 && stat(in->path, &sb) == 0)
        s->bytes = (uint64_t)sb.st_size;
    if (!worker_state_ok(ws, r->opt) || (r->opt->total && !only_analyse(r->opt) && !ws->partial)) {
        tt_error_set(&err, TT_ENOMEM, in->path, -1, "out of memory");
        add_problem(s, in->path, &err, 1);
        return;
    }
    worker_ctx w = { r, ws->counter, ws->astate, s, i, ws->partial, &ws->partial_status };
    size_t parts_skipped = 0;
    tt_status st = tt_reader_read(ws->reader, in->path, &r->opt->read, on_doc, &w,
                                  &parts_skipped, &err);
    s->parts_skipped = parts_skipped;
    if (st) {
        if (!err.file[0])
            tti_strlcpy(err.file, in->path, sizeof err.file);
        if (!err.message[0])
            tti_strlcpy(err.message, tt_status_name(st), sizeof err.message);
        add_problem(s, err.file, &err, 1);
    }
}

/* Under the lock, after an input is done: whether the calling thread,
 * waiting for an input, should wake now. Not after every input: only once
 * the input it waits for is done and the window is half full (or every
 * input is taken, or the batch stops), so that it delivers several inputs
 * a wake-up. Each wake-up takes a CPU from a worker for a moment, and the
 * switches cost microseconds each on a virtual machine; a worker that
 * finds the window full is woken by the deliveries as before. */
static int wake_deliverer(const runner *r)
{
    if (r->waiting_for == SIZE_MAX || !r->slots[r->waiting_for % r->window].done)
        return 0;
    return r->stop || r->next >= r->inputs->n || r->next - r->delivered >= r->window / 2;
}

/* In the calling thread, with the lock held: waits until s (input i) is
 * done. */
static void wait_done(runner *r, const slot *s, size_t i)
{
    r->waiting_for = i;
    while (!s->done)
        pthread_cond_wait(&r->cond_done, &r->lock);
    r->waiting_for = SIZE_MAX;
}

static void *worker_main(void *arg)
{
    runner *r = arg;
    worker_state ws;
    worker_state_init(&ws, r->opt,
                      r->opt->total && !only_analyse(r->opt) ? tt_termtable_new_large() : NULL);
    pthread_mutex_lock(&r->lock);
    for (;;) {
        while (!r->stop && r->next < r->inputs->n && r->next >= r->delivered + r->window)
            pthread_cond_wait(&r->cond_space, &r->lock);
        if (r->stop || r->next >= r->inputs->n)
            break;
        size_t i = r->next++;
        slot *s = &r->slots[i % r->window];
        pthread_mutex_unlock(&r->lock);
        process_input(r, &ws, i, s);
        pthread_mutex_lock(&r->lock);
        s->done = 1;
        if (wake_deliverer(r))
            pthread_cond_signal(&r->cond_done);
    }
    pthread_mutex_unlock(&r->lock);
    worker_state_finish(&ws);
    pthread_mutex_lock(&r->lock);
    if (ws.partial)
        r->partials[r->n_partials++] = ws.partial; /* under the lock */
    if (ws.partial_status && r->total_status == TT_OK)
        r->total_status = ws.partial_status;
    pthread_mutex_unlock(&r->lock);
    worker_state_release(&ws, r->opt);
    return NULL;
}

/* Hands one input's events to the caller. */
static tt_status deliver(runner *r, slot *s, size_t i, tt_batch_summary *sum, tt_error *err)
{
    const tt_batch_options *opt = r->opt;
    sum->parts_skipped += s->parts_skipped;
    sum->bytes += s->bytes;
    if (s->oom) {
        tt_error e;
        tt_error_init(&e);
        tt_error_set(&e, TT_ENOMEM, r->inputs->items[i].path, -1, "out of memory");
        if (opt->on_problem)
            opt->on_problem(opt->ctx, r->inputs->items[i].path, &e, 1);
        sum->skipped++;
        return TT_OK;
    }
    for (size_t k = 0; k < s->n; k++) {
        event *e = &s->events[k];
        if (e->kind == EV_PROBLEM) {
            if (e->skipped)
                sum->skipped++;
            else
                sum->notes++;
            if (opt->on_problem)
                opt->on_problem(opt->ctx, e->name, &e->err, e->skipped);
            continue;
        }
        tt_doc_result res = result_of(e, i);
        if (e->prepare_status)
            return tt_error_set(err, e->prepare_status, e->name, -1, "stopped: %s",
                                tt_status_name(e->prepare_status));
        sum->documents++;
        sum->words += e->stats.words_read;
        sum->terms += e->stats.terms_kept;
        if (opt->on_document) {
            tt_status st = opt->on_document(opt->ctx, &res);
            if (st)
                return tt_error_set(err, st, e->name, -1, "stopped: %s", tt_status_name(st));
        }
    }
    return TT_OK;
}

static uint64_t total_bytes(const tt_source_list *inputs)
{
    uint64_t total = 0;
    struct stat sb;
    for (size_t i = 0; i < inputs->n; i++)
        if (inputs->items[i].status == TT_OK && strcmp(inputs->items[i].path, "-") != 0 &&
            stat(inputs->items[i].path, &sb) == 0)
            total += (uint64_t)sb.st_size;
    return total;
}

tt_status tt_batch_run(const tt_source_list *inputs, const tt_batch_options *opt,
                       tt_batch_summary *sum, tt_error *err)
{
    if (opt->index)
        return tt_index_replay(opt->index, inputs, opt, sum, err);
    memset(sum, 0, sizeof *sum);
    sum->inputs = inputs->n;
    uint64_t bytes_total = opt->on_progress ? total_bytes(inputs) : 0;
    int threads = opt->threads < 1 ? 1 : opt->threads;
    if (threads > 256)
        threads = 256;
    runner r;
    memset(&r, 0, sizeof r);
    r.inputs = inputs;
    r.opt = opt;
    r.waiting_for = SIZE_MAX;
    /* Each input's event waits in the window until delivered. With a total
     * summed in the workers and nothing prepared, an event is a few figures,
     * so the window is wide and the calling thread wakes (every window / 2
     * inputs) 8 times less often: each wake-up takes a CPU from a worker
     * (count --total-only -j 2 over the benchmark 243 -> 239 ms). */
    int small_events = opt->total && !opt->prepare && !opt->analyse;
    r.window = opt->window ? opt->window : (size_t)threads * (small_events ? 32 : 4);
    r.slots = tt_calloc(r.window, sizeof *r.slots);
    if (!r.slots)
        return tt_error_set(err, TT_ENOMEM, NULL, -1, "out of memory");
    tt_status st = TT_OK;

    if (threads == 1) {
        /* One thread: documents are added straight to the caller's total. */
        worker_state ws;
        worker_state_init(&ws, opt, only_analyse(opt) ? NULL : opt->total);
        if (!worker_state_ok(&ws, opt)) {
            worker_state_release(&ws, opt);
            tt_free(r.slots);
            return tt_error_set(err, TT_ENOMEM, NULL, -1, "out of memory (or bad count options)");
        }
        for (size_t i = 0; i < inputs->n && !st; i++) {
            slot *s = &r.slots[0];
            process_input(&r, &ws, i, s);
            st = deliver(&r, s, i, sum, err);
            slot_reset(s);
            if (opt->on_progress)
                opt->on_progress(opt->ctx, i + 1, inputs->n, sum->bytes, bytes_total);
        }
        worker_state_finish(&ws);
        worker_state_release(&ws, opt);
        tt_free(r.slots);
        r.total_status = ws.partial_status;
        if (!st && r.total_status)
            st = tt_error_set(err, r.total_status, NULL, -1, "%s while adding up the total",
                              tt_status_name(r.total_status));
        return st;
    }

    pthread_mutex_init(&r.lock, NULL);
    pthread_cond_init(&r.cond_done, NULL);
    pthread_cond_init(&r.cond_space, NULL);
    pthread_t *tids = tt_calloc((size_t)threads, sizeof *tids);
    r.partials = tt_calloc((size_t)threads, sizeof *r.partials);
    int started = 0;
    if (tids && r.partials)
        for (; started < threads; started++)
            if (tti_thread_start(&tids[started], worker_main, &r, (unsigned)started) != 0)
                break;
    if (started == 0) {
        st = tt_error_set(err, TT_ENOMEM, NULL, -1, "could not start worker threads");
    } else {
        for (size_t i = 0; i < inputs->n; i++) {
            slot *s = &r.slots[i % r.window];
            pthread_mutex_lock(&r.lock);
            wait_done(&r, s, i);
            pthread_mutex_unlock(&r.lock);
            if (!st)
                st = deliver(&r, s, i, sum, err);
            pthread_mutex_lock(&r.lock);
            slot_reset(s);
            r.delivered = i + 1;
            if (st) {
                r.stop = 1;
                pthread_cond_broadcast(&r.cond_space);
                /* wait for the inputs already taken, then stop */
                size_t taken = r.next;
                pthread_mutex_unlock(&r.lock);
                for (size_t j = i + 1; j < taken; j++) {
                    slot *t = &r.slots[j % r.window];
                    pthread_mutex_lock(&r.lock);
                    wait_done(&r, t, j);
                    pthread_mutex_unlock(&r.lock);
                    slot_reset(t);
                }
                break;
            }
            pthread_cond_broadcast(&r.cond_space);
            pthread_mutex_unlock(&r.lock);
            if (opt->on_progress)
                opt->on_progress(opt->ctx, i + 1, inputs->n, sum->bytes, bytes_total);
        }
    }
    for (int t = 0; t < started; t++)
        pthread_join(tids[t], NULL);
    tt_free(tids);
    if (opt->total_parts && !st && r.total_status == TT_OK) {
        /* handed over unmerged (see total_parts) */
        opt->total_parts->tables = r.partials;
        opt->total_parts->n = r.n_partials;
        r.partials = NULL;
        r.n_partials = 0;
    }
    for (size_t k = 0; k < r.n_partials; k++) {
        if (!st && r.total_status == TT_OK) {
            /* Into an empty total the first partial moves whole: the total
             * takes its slots and terms instead of adding them one by one
             * (merging is exact in any order). */
            if (tt_termtable_distinct(opt->total) == 0 && tt_termtable_total(opt->total) == 0)
                tti_termtable_swap(opt->total, r.partials[k]);
            else
                r.total_status = tt_termtable_merge(opt->total, r.partials[k]);
        }
        tt_termtable_free(r.partials[k]);
    }
    tt_free(r.partials);
    if (!st && r.total_status)
        st = tt_error_set(err, r.total_status, NULL, -1, "%s while adding up the total",
                          tt_status_name(r.total_status));
    pthread_cond_destroy(&r.cond_space);
    pthread_cond_destroy(&r.cond_done);
    pthread_mutex_destroy(&r.lock);
    tt_free(r.slots);
    return st;
}
