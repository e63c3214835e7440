/* termtide CLI — helpers shared by the subcommands. */
#include <errno.h>
#include <stdarg.h>
#include <stdlib.h>
#include <string.h>
#include <time.h>
#include <unistd.h>

#include "termtide/alloc.h"
#include "termtide/filter.h"
#include "termtide/index.h"
#include "termtide/parallel.h"
#include "termtide/sections.h"
#include "termtide/sha256.h"
#include "cli.h"

const char *tt_prog = "termtide";

static int progress_shown;

static void clear_progress(void)
{
    if (progress_shown) {
        fputs("\r\033[K", stderr);
        progress_shown = 0;
    }
}

void cli_error(const char *fmt, ...)
{
    va_list ap;
    clear_progress();
    fprintf(stderr, "%s: error: ", tt_prog);
    va_start(ap, fmt);
    vfprintf(stderr, fmt, ap);
    va_end(ap);
    fputc('\n', stderr);
}

void cli_note(const char *fmt, ...)
{
    va_list ap;
    clear_progress();
    fprintf(stderr, "%s: note: ", tt_prog);
    va_start(ap, fmt);
    vfprintf(stderr, fmt, ap);
    va_end(ap);
    fputc('\n', stderr);
}

double cli_now(void)
{
    struct timespec ts;
    clock_gettime(CLOCK_MONOTONIC, &ts);
    return (double)ts.tv_sec + (double)ts.tv_nsec / 1e9;
}

int cli_parse_u64(const char *opt, const char *arg, uint64_t min, uint64_t max, uint64_t *out)
{
    const char *p = arg;
    uint64_t v = 0;
    if (!*p)
        goto bad;
    for (; *p; p++) {
        if (*p < '0' || *p > '9')
            goto bad;
        unsigned d = (unsigned)(*p - '0');
        if (v > (UINT64_MAX - d) / 10)
            goto bad;
        v = v * 10 + d;
    }
    if (v < min || v > max)
        goto bad;
    *out = v;
    return 1;
bad:
    cli_error("%s: expected a whole number from %llu to %llu, got '%s'", opt,
              (unsigned long long)min, (unsigned long long)max, arg);
    return 0;
}

void cli_pipeline_init(cli_pipeline *p)
{
    memset(p, 0, sizeof *p);
    tt_batch_options_init(&p->batch);
    p->started = cli_now();
}

void cli_pipeline_release(cli_pipeline *p)
{
    tt_index_close(p->index);
    p->index = NULL;
    tt_section_rules_free(p->section_rules);
    p->section_rules = NULL;
    free(p->sections);
    p->sections = NULL;
    tt_termtable_free(p->stopwords);
    free(p->extra_lists);
    p->stopwords = NULL;
    p->extra_lists = NULL;
}

int cli_pipeline_option(cli_pipeline *p, int opt, const char *arg)
{
    uint64_t v;
    tt_count_options *c = &p->batch.count;
    switch (opt) {
    case CLI_OPT_NGRAM: {
        const char *dash = strchr(arg, '-');
        if (strlen(arg) == 1 && arg[0] >= '1' && arg[0] <= '3') {
            c->ngram_min = c->ngram_max = arg[0] - '0';
        } else if (dash && strlen(arg) == 3 && arg[0] >= '1' && arg[0] <= '3' && arg[2] >= '1' &&
                   arg[2] <= '3' && arg[0] <= arg[2]) {
            c->ngram_min = arg[0] - '0';
            c->ngram_max = arg[2] - '0';
        } else {
            cli_error("--ngram: expected N or N-M with 1 <= N <= M <= 3, got '%s'", arg);
            return -1;
        }
        return 1;
    }
    case CLI_OPT_STEM: c->stem = 1; return 1;
    case CLI_OPT_NUMBERS: c->keep_numbers = 1; return 1;
    case CLI_OPT_MIN_LENGTH:
        if (!cli_parse_u64("--min-length", arg, 1, 1000, &v))
            return -1;
        c->min_length = (size_t)v;
        return 1;
    case CLI_OPT_STOPWORDS: {
        const char **l = realloc(p->extra_lists, (p->n_extra + 1) * sizeof *l);
        if (!l) {
            cli_error("out of memory");
            return -1;
        }
        p->extra_lists = l;
        l[p->n_extra++] = arg;
        return 1;
    }
    case CLI_OPT_NO_STOPWORDS: p->no_stopwords = 1; return 1;
    case CLI_OPT_TABLES:
        if (!strcmp(arg, "keep"))
            p->batch.read.drop_tables = 0;
        else if (!strcmp(arg, "drop"))
            p->batch.read.drop_tables = 1;
        else {
            cli_error("--tables: expected keep or drop, got '%s'", arg);
            return -1;
        }
        return 1;
    case CLI_OPT_DOC_TYPES: p->batch.read.doc_types = arg; return 1;
    case 'j':
        if (!cli_parse_u64("--jobs", arg, 1, 256, &v))
            return -1;
        p->batch.threads = (int)v;
        return 1;
    case 'q': p->quiet = 1; return 1;
    case CLI_OPT_DB: p->db = arg; return 1;
    case CLI_OPT_SECTION: {
        const char **l = realloc(p->sections, (p->n_sections + 1) * sizeof *l);
        if (!l) {
            cli_error("out of memory");
            return -1;
        }
        p->sections = l;
        l[p->n_sections++] = arg;
        p->batch.read.sections = l;
        p->batch.read.n_sections = p->n_sections;
        return 1;
    }
    case CLI_OPT_SECTION_RULES: p->section_rules_path = arg; return 1;
    }
    return 0;
}

int cli_pipeline_finish(cli_pipeline *p)
{
    tt_error err;
    tt_error_init(&err);
    p->stopwords = tt_termtable_new();
    if (!p->stopwords) {
        cli_error("out of memory");
        return 0;
    }
    if (!p->no_stopwords) {
        const char *const *names = tt_builtin_stopword_names();
        for (size_t i = 0; names[i]; i++) {
            const char *text = tt_builtin_stopwords(names[i]);
            if (tt_stopwords_load_text(p->stopwords, text, strlen(text), names[i], &err)) {
                char msg[TT_ERROR_FILE_MAX + TT_ERROR_MSG_MAX + 64];
                cli_error("built-in stop-word list %s", tt_error_format(&err, msg, sizeof msg));
                return 0;
            }
        }
    }
    for (size_t i = 0; i < p->n_extra; i++) {
        if (tt_stopwords_load_file(p->stopwords, p->extra_lists[i], &err)) {
            char msg[TT_ERROR_FILE_MAX + TT_ERROR_MSG_MAX + 64];
            cli_error("%s", tt_error_format(&err, msg, sizeof msg));
            return 0;
        }
    }
    p->batch.count.stopwords = tt_termtable_distinct(p->stopwords) ? p->stopwords : NULL;
    p->progress = !p->quiet && isatty(2);
    if (!cli_pipeline_sections(p))
        return 0;
    if (p->db) {
        tt_buf profile;
        tt_buf_init(&profile, 0);
        int ok = cli_pipeline_profile(p, &profile);
        if (ok && (tt_index_open(p->db, TT_INDEX_READ, &p->index, &err) ||
                   tt_index_profile(p->index, profile.data, &err))) {
            char msg[TT_ERROR_FILE_MAX + TT_ERROR_MSG_MAX + 64];
            cli_error("%s", tt_error_format(&err, msg, sizeof msg));
            ok = 0;
        }
        tt_buf_release(&profile);
        if (!ok)
            return 0;
        p->batch.index = p->index;
    }
    return 1;
}

int cli_expand_inputs(tt_source_list *list, int argc, char **argv)
{
    if (argc == 0)
        return tt_source_expand(list, "-") == TT_OK;
    for (int i = 0; i < argc; i++)
        if (tt_source_expand(list, argv[i]) != TT_OK) {
            cli_error("out of memory while listing inputs");
            return 0;
        }
    return 1;
}

static void on_problem(void *ctx, const char *name, const tt_error *err, int skipped)
{
    cli_pipeline *p = ctx;
    const char *msg = err->message[0] ? err->message : tt_status_name(err->status);
    if (skipped) {
        unsigned s = (unsigned)err->status;
        if (s < sizeof p->skipped_by_status / sizeof p->skipped_by_status[0])
            p->skipped_by_status[s]++;
        if (err->line > 0)
            cli_error("%s: line %ld: %s (skipped)", name, err->line, msg);
        else if (err->offset >= 0)
            cli_error("%s: byte %lld: %s (skipped)", name, err->offset, msg);
        else
            cli_error("%s: %s (skipped)", name, msg);
    } else if (!p->quiet) {
        cli_note("%s: %s", name, msg);
    }
}

static void on_progress(void *ctx, size_t done, size_t total, uint64_t bytes_done,
                        uint64_t bytes_total)
{
    cli_pipeline *p = ctx;
    if (!p->progress)
        return;
    double now = cli_now();
    if (done < total && now - p->last_progress < 0.2)
        return;
    p->last_progress = now;
    double elapsed = now - p->started;
    double mbs = elapsed > 0 ? (double)bytes_done / 1e6 / elapsed : 0;
    char left[32] = "?";
    if (bytes_done > 0 && bytes_total >= bytes_done && elapsed > 0) {
        double rest = elapsed * (double)(bytes_total - bytes_done) / (double)bytes_done;
        snprintf(left, sizeof left, "%.0f s", rest);
    }
    fprintf(stderr, "\r\033[K%s: %zu/%zu documents, %.1f MB/s, %s left", tt_prog, done, total,
            mbs, left);
    progress_shown = 1;
    if (done == total)
        clear_progress();
}

void cli_pipeline_hooks(cli_pipeline *p)
{
    p->batch.on_problem = on_problem;
    p->batch.on_progress = on_progress;
}

/* The summary's start: documents, skips by cause, wrapper parts left out. */
static void summary_head(cli_pipeline *p, const char *cmd, const tt_batch_summary *s)
{
    fprintf(stderr, "%s %s: %zu document%s read, %zu skipped", tt_prog, cmd, s->documents,
            s->documents == 1 ? "" : "s", s->skipped);
    if (s->skipped) {
        const char *sep = " (";
        for (unsigned i = 0; i < sizeof p->skipped_by_status / sizeof p->skipped_by_status[0]; i++)
            if (p->skipped_by_status[i]) {
                fprintf(stderr, "%s%zu %s", sep, p->skipped_by_status[i],
                        tt_status_name((tt_status)i));
                sep = ", ";
            }
        fputc(')', stderr);
    }
    if (s->parts_skipped)
        fprintf(stderr, ", %zu wrapper part%s left out", s->parts_skipped,
                s->parts_skipped == 1 ? "" : "s");
}

void cli_pipeline_summary(cli_pipeline *p, const char *cmd, const tt_batch_summary *s)
{
    clear_progress();
    if (p->quiet)
        return;
    double secs = cli_now() - p->started;
    summary_head(p, cmd, s);
    fprintf(stderr, ", %llu words, %llu terms counted, %.1f MB in %.2f s\n",
            (unsigned long long)s->words, (unsigned long long)s->terms, (double)s->bytes / 1e6,
            secs);
}

void cli_reading_summary(cli_pipeline *p, const char *cmd, const tt_batch_summary *s,
                         const char *extra)
{
    clear_progress();
    if (p->quiet)
        return;
    double secs = cli_now() - p->started;
    summary_head(p, cmd, s);
    fprintf(stderr, ", %llu words, %.1f MB in %.2f s%s%s\n", (unsigned long long)s->words,
            (double)s->bytes / 1e6, secs, extra && extra[0] ? ", " : "", extra ? extra : "");
}

tt_status cli_flush(tt_outfile *out, tt_buf *buf, tt_error *err, int force)
{
    if (!force && buf->len < (1u << 20))
        return TT_OK;
    tt_status st = tt_outfile_write(out, buf->data, buf->len, err);
    tt_buf_reset(buf);
    return st;
}

int cli_parse_format(const char *arg, tt_format *out)
{
    if (tt_format_parse(arg, out) == TT_OK)
        return 1;
    cli_error("--format: expected tsv, csv or jsonl, got '%s'", arg);
    return 0;
}

int cli_pipeline_profile(const cli_pipeline *p, tt_buf *out)
{
    const tt_count_options *c = &p->batch.count;
    char line[512];
    tt_buf_reset(out);
    snprintf(line, sizeof line, "ngram=%d-%d stem=%d numbers=%d min_length=%zu stopwords=%s",
             c->ngram_min, c->ngram_max, c->stem, c->keep_numbers, c->min_length,
             p->no_stopwords ? "none" : "builtin");
    if (tt_buf_append(out, line, strlen(line)))
        goto oom;
    if (tt_buf_append(out, " extra=", 7))
        goto oom;
    if (!p->n_extra && tt_buf_append(out, "none", 4))
        goto oom;
    for (size_t i = 0; i < p->n_extra; i++) {
        char hex[65];
        tt_error err;
        tt_error_init(&err);
        if (tt_sha256_file(p->extra_lists[i], hex, &err)) {
            char msg[TT_ERROR_FILE_MAX + TT_ERROR_MSG_MAX + 64];
            cli_error("%s", tt_error_format(&err, msg, sizeof msg));
            return 0;
        }
        if ((i && tt_buf_putc(out, ',')) || tt_buf_append(out, hex, 16))
            goto oom;
    }
    snprintf(line, sizeof line, " tables=%s doc_types=%s",
             p->batch.read.drop_tables ? "drop" : "keep",
             p->batch.read.doc_types ? p->batch.read.doc_types : "default");
    if (p->n_sections) {
        if (tt_buf_append(out, line, strlen(line)) || tt_buf_append(out, " sections=", 10))
            goto oom;
        for (size_t i = 0; i < p->n_sections; i++)
            if ((i && tt_buf_putc(out, ',')) ||
                tt_buf_append(out, p->sections[i], strlen(p->sections[i])))
                goto oom;
        line[0] = '\0';
        if (p->section_rules_path) {
            char hex[65];
            tt_error err;
            tt_error_init(&err);
            if (tt_sha256_file(p->section_rules_path, hex, &err)) {
                char msg[TT_ERROR_FILE_MAX + TT_ERROR_MSG_MAX + 64];
                cli_error("%s", tt_error_format(&err, msg, sizeof msg));
                return 0;
            }
            snprintf(line, sizeof line, " section_rules=%.16s", hex);
        }
    }
    if (tt_buf_append(out, line, strlen(line)) || tt_buf_putc(out, '\0'))
        goto oom;
    out->len--;
    return 1;
oom:
    cli_error("out of memory");
    return 0;
}

/* rows ahead whose term is prefetched (format_rows) */
#define ROW_AHEAD 16

/* Rows [from, to) of a sorted table, cum the counts before row from. */
static tt_status format_rows(tt_table_writer *w, const char *doc, const tt_term_entry *e,
                             size_t from, size_t to, uint64_t cum, uint64_t total, uint64_t per,
                             tt_outfile *flush_to, tt_error *err)
{
    /* the document's cell, the same on every row, escaped once */
    tt_buf doc_cell;
    tt_buf_init(&doc_cell, 0);
    tt_status st = tt_table_escape(w->format, doc, strlen(doc), &doc_cell);
    for (size_t i = from; i < to && !st; i++) {
        /* the terms lie all over the table's memory, in count order: a
         * later row's bytes are fetched while this one is written */
        if (i + ROW_AHEAD < to)
            __builtin_prefetch(e[i + ROW_AHEAD].term);
        cum += e[i].count;
        double share = (double)e[i].count / (double)total;
        /* the last cumulative share is exactly 1: cum == total there */
        double cum_share = (double)cum / (double)total;
        st = tt_table_escaped(w, doc_cell.data, doc_cell.len);
        if (!st) st = tt_table_u64(w, i + 1);
        if (!st) st = tt_table_str(w, e[i].term, e[i].len);
        if (!st) st = tt_table_u64(w, e[i].count);
        if (!st) st = tt_table_fixed(w, share, 6);
        if (!st) st = tt_table_u64(w, cum);
        if (!st) st = tt_table_fixed(w, cum_share, 6);
        if (!st && per) st = tt_table_fixed(w, share * (double)per, 4);
        if (!st) st = tt_table_end_row(w);
        if (!st && flush_to)
            st = cli_flush(flush_to, w->out, err, 0);
    }
    tt_buf_release(&doc_cell);
    return st;
}

/* A part of the rows: the first is written to the output (and flushed as
 * it grows), each later one formatted in a thread of its own into buf. */
typedef struct row_part {
    tt_table_writer w;
    tt_buf buf;
    const char *doc;
    const tt_term_entry *e;
    size_t from, to;
    uint64_t cum, total, per;
    tt_outfile *flush_to;
    tt_error *err;
    tt_status st;
} row_part;

static void format_part(void *ctx, size_t k)
{
    row_part *p = &((row_part *)ctx)[k];
    p->st = format_rows(&p->w, p->doc, p->e, p->from, p->to, p->cum, p->total, p->per,
                        p->flush_to, p->err);
}

/* Rows from 20,000 on are formatted in parallel (a share each), fewer are
 * not worth a thread. */
#define PARALLEL_ROWS 20000
#define MAX_ROW_PARTS 16

tt_status cli_write_entry_rows(tt_table_writer *w, const char *doc, const tt_term_entry *e,
                               size_t n, uint64_t total, uint64_t top, uint64_t min_count,
                               uint64_t per, int threads, tt_outfile *flush_to, tt_error *err)
{
    /* the rows shown: sorted by count, so the smaller ones are at the end */
    size_t shown = 0;
    while (shown < n && e[shown].count >= min_count && (!top || shown < top))
        shown++;
    size_t parts = threads < 1 ? 1 : (size_t)threads;
    if (parts > MAX_ROW_PARTS)
        parts = MAX_ROW_PARTS;
    if (!flush_to || shown < PARALLEL_ROWS)
        parts = 1;
    row_part part[MAX_ROW_PARTS];
    uint64_t cum = 0;
    size_t at = 0;
    for (size_t k = 0; k < parts; k++) {
        row_part *p = &part[k];
        memset(p, 0, sizeof *p);
        size_t from = shown * k / parts, to = shown * (k + 1) / parts;
        for (; at < from; at++)
            cum += e[at].count;
        p->w = *w;
        p->doc = doc;
        p->e = e;
        p->from = from;
        p->to = to;
        p->cum = cum;
        p->total = total;
        p->per = per;
        tt_buf_init(&p->buf, 0);
        if (k == 0) {
            p->flush_to = flush_to;
            p->err = err;
            continue;
        }
        /* Room for the part's rows at once (a little more than any row
         * needs, or they grow it): a buffer grown by doubling in one
         * thread, copied and faulted in page by page, holds up the other,
         * whose page faults wait for the same address-space lock. */
        size_t room = (to - from) * (strlen(doc) + 160);
        for (size_t i = from; i < to; i++)
            room += 2 * e[i].len;
        (void)tt_buf_grow(&p->buf, room); /* on failure the rows grow it */
        p->w.out = &p->buf;
        p->w.col = 0;
    }
    tt_run_tasks((int)parts, parts, format_part, part);
    *w = part[0].w;
    tt_status st = part[0].st;
    for (size_t k = 1; k < parts; k++) {
        row_part *p = &part[k];
        if (!st)
            st = p->st;
        if (!st)
            st = cli_flush(flush_to, w->out, err, 1);
        if (!st)
            st = cli_flush(flush_to, &p->buf, err, 1);
        tt_buf_release(&p->buf);
    }
    return st;
}

tt_status cli_write_term_rows(tt_table_writer *w, const char *doc, const tt_termtable *t,
                              uint64_t top, uint64_t min_count, uint64_t per,
                              tt_outfile *flush_to, tt_error *err)
{
    tt_term_entry *e = NULL;
    size_t n = 0;
    tt_status st = tt_termtable_sorted(t, &e, &n);
    if (st)
        return st;
    st = cli_write_entry_rows(w, doc, e, n, tt_termtable_total(t), top, min_count, per, 1,
                              flush_to, err);
    tt_free(e);
    return st;
}

int cli_pipeline_sections(cli_pipeline *p)
{
    if (p->section_rules_path && !p->section_rules) {
        tt_error err;
        tt_error_init(&err);
        if (tt_section_rules_load(p->section_rules_path, &p->section_rules, &err)) {
            char msg[TT_ERROR_FILE_MAX + TT_ERROR_MSG_MAX + 64];
            cli_error("%s", tt_error_format(&err, msg, sizeof msg));
            return 0;
        }
        p->batch.read.section_rules = p->section_rules;
    }
    if (p->n_sections && !p->section_rules) {
        /* a name of ours must be one we know */
        const char *const *known = tt_section_names();
        for (size_t i = 0; i < p->n_sections; i++) {
            int ok = !strncmp(p->sections[i], "item-", 5);
            for (size_t k = 0; known[k] && !ok; k++)
                ok = !strcmp(known[k], p->sections[i]);
            if (!ok) {
                cli_error("--section: no section named '%s' (termtide sections --names lists "
                          "them)", p->sections[i]);
                return 0;
            }
        }
    }
    return 1;
}

int cli_run_rows(cli_pipeline *p, cli_rows *r, const tt_source_list *inputs,
                 tt_status (*finish)(void *ctx), void *ctx, const char *cmd)
{
    char msg[TT_ERROR_FILE_MAX + TT_ERROR_MSG_MAX + 64];
    if (tt_outfile_open(&r->out, r->output, &r->err)) {
        cli_error("%s", tt_error_format(&r->err, msg, sizeof msg));
        return TT_EXIT_TROUBLE;
    }
    tt_table_writer w;
    if (r->header && tt_table_begin(&w, r->format, &r->buf, r->cols, r->ncols, 1)) {
        tt_outfile_abort(&r->out);
        cli_error("out of memory");
        return TT_EXIT_TROUBLE;
    }
    cli_pipeline_hooks(p);
    tt_batch_summary sum;
    tt_error err;
    tt_error_init(&err);
    tt_status st = tt_batch_run(inputs, &p->batch, &sum, &err);
    if (!st && finish)
        st = finish(ctx);
    if (!st)
        st = cli_flush(&r->out, &r->buf, &r->err, 1);
    if (!st)
        st = tt_outfile_commit(&r->out, &r->err);
    if (st) {
        tt_outfile_abort(&r->out);
        cli_error("%s", tt_error_format(r->err.status ? &r->err : &err, msg, sizeof msg));
        return TT_EXIT_TROUBLE;
    }
    cli_reading_summary(p, cmd, &sum, NULL);
    return sum.skipped ? TT_EXIT_TROUBLE : TT_EXIT_OK;
}
