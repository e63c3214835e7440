/* termtide index — count files into a persistent index (SQLite), reading
 * only the files that are new or changed since the last run. */
#include <errno.h>
#include <stdint.h>
#include <stdlib.h>
#include <string.h>
#include <sys/stat.h>

#include "termtide/index.h"
#include "termtide/sha256.h"
#include "cli.h"
#include "tone_cli.h"

const char tt_help_index[] =
    "Usage: termtide index [OPTIONS] DB PATH...\n"
    "\n"
    "Counts the documents of PATH (files and directories, as for count) into the\n"
    "index DB, an SQLite database file created when missing. A file whose bytes are\n"
    "unchanged since it was indexed (same SHA-256) is not read again; a changed file\n"
    "is read again and replaces its old documents; each file is written in one\n"
    "transaction, so a run stopped at any point leaves every file indexed either as\n"
    "before or completely. Other commands read the index with --db DB in place of\n"
    "reading the files (count --db DB [PATH...]).\n"
    "\n"
    "The counting options (n-grams, stems, numbers, minimum length, stop-word lists,\n"
    "tables, wrapper part types) are recorded in the index; a later run or query with\n"
    "other options is refused and told which differ.\n"
    "\n"
    "Options:\n"
    "  --prune               drop files the index holds that are not among PATH\n"
    "  --tone                also score each document's tone (the shipped lexicon, or\n"
    "                        --lexicon FILE) so that tone --db answers from the index;\n"
    "                        chosen when the index is created, then required of every\n"
    "                        later run\n"
    "  --lexicon FILE        the lexicon for --tone\n"
    "\n"
    CLI_PIPELINE_HELP
    "\n"
    "Exit status: 0 when every file was indexed, 2 when any was skipped (the others\n"
    "are still indexed) or on bad usage.\n";

enum { OPT_PRUNE = CLI_OPT_FIRST_FREE, OPT_TONE, OPT_LEXICON };

static const struct option longopts[] = {
    { "prune", no_argument, NULL, OPT_PRUNE },
    { "tone", no_argument, NULL, OPT_TONE },
    { "lexicon", required_argument, NULL, OPT_LEXICON },
    { "help", no_argument, NULL, 'h' },
    CLI_PIPELINE_LONGOPTS,
    { NULL, 0, NULL, 0 }
};

typedef struct index_ctx {
    cli_pipeline pipe; /* first: the pipeline hooks use the batch ctx as this */
    tt_index *ix;
    const tt_source_list *to_read;
    char (*sha)[65];
    uint64_t *size;
    size_t current;    /* the input whose transaction is open, or SIZE_MAX */
    tt_error err;      /* the first index write error */
    void (*cli_problem)(void *, const char *, const tt_error *, int);
    void (*cli_progress)(void *, size_t, size_t, uint64_t, uint64_t);
    size_t files_done;
    cli_tone tone;     /* --tone */
} index_ctx;

static void *tone_worker_new(void *ctx)
{
    const index_ctx *c = ctx;
    return cli_tone_scorer_new(&c->tone);
}

static void tone_worker_free(void *ctx, void *state)
{
    (void)ctx;
    cli_tone_scorer_free(state);
}

static tt_status tone_analyse(void *ctx, void *state, const tt_document *doc, tt_buf *out,
                              tt_doc_stats *stats)
{
    (void)ctx;
    return cli_tone_score(state, doc, out, stats);
}

/* Opens input i's transaction when it is not open yet. The file's SHA-256
 * is the one taken before reading (a file already in the index with its
 * size unchanged), else the one of the bytes read (sha_read, from a
 * document), else, for a file that gave no document, read now; a file
 * that cannot be hashed is not recorded (its problem is reported). */
static tt_status ensure_begun(index_ctx *c, size_t i, const char *sha_read)
{
    if (c->current == i)
        return TT_OK;
    if (!c->sha[i][0]) {
        if (sha_read && strlen(sha_read) == 64) {
            memcpy(c->sha[i], sha_read, 65);
        } else {
            tt_error e;
            tt_error_init(&e);
            if (tt_sha256_file(c->to_read->items[i].path, c->sha[i], &e)) {
                c->sha[i][0] = '\0';
                return e.status ? e.status : TT_EIO;
            }
        }
    }
    c->current = i;
    return tt_index_file_begin(c->ix, c->to_read->items[i].path, c->sha[i], c->size[i],
                               &c->err);
}

static tt_status on_document(void *ctx, const tt_doc_result *r)
{
    index_ctx *c = ctx;
    tt_status st = ensure_begun(c, r->input, r->sha256);
    return st ? st : tt_index_file_add_document(c->ix, r, &c->err);
}

/* Problems arrive in input order too; the input is the one being read. */
static void on_problem(void *ctx, const char *name, const tt_error *err, int skipped)
{
    index_ctx *c = ctx;
    c->cli_problem(ctx, name, err, skipped);
    if (c->err.status)
        return;
    size_t i = c->current == SIZE_MAX ? c->files_done : c->current;
    if (ensure_begun(c, i, NULL))
        return;
    tt_index_file_add_problem(c->ix, name, err, skipped, &c->err);
}

/* After each input: its transaction commits (an input without documents
 * or problems is recorded too, so it is not read again). */
static void on_progress(void *ctx, size_t done, size_t total, uint64_t bytes_done,
                        uint64_t bytes_total)
{
    index_ctx *c = ctx;
    size_t i = done - 1;
    if (!c->err.status && ensure_begun(c, i, NULL) == TT_OK)
        tt_index_file_commit(c->ix, 0, &c->err);
    c->current = SIZE_MAX;
    c->files_done = done;
    if (c->cli_progress)
        c->cli_progress(ctx, done, total, bytes_done, bytes_total);
}

int tt_cmd_index(int argc, char **argv)
{
    index_ctx c;
    memset(&c, 0, sizeof c);
    cli_pipeline_init(&c.pipe);
    tt_error_init(&c.err);
    c.current = SIZE_MAX;
    int opt, rc = TT_EXIT_TROUBLE, prune = 0, tone = 0;
    const char *lexicon = NULL;
    tt_source_list inputs, to_read;
    tt_source_list_init(&inputs);
    tt_source_list_init(&to_read);
    tt_buf profile;
    tt_buf_init(&profile, 0);
    char msg[TT_ERROR_FILE_MAX + TT_ERROR_MSG_MAX + 64];
    size_t unchanged = 0, changed = 0, added = 0, removed = 0, missing = 0;

    optind = 1;
    while ((opt = getopt_long(argc, argv, "j:qh", longopts, NULL)) != -1) {
        int handled = cli_pipeline_option(&c.pipe, opt, optarg);
        if (handled < 0)
            goto out;
        if (handled)
            continue;
        switch (opt) {
        case OPT_PRUNE: prune = 1; break;
        case OPT_TONE: tone = 1; break;
        case OPT_LEXICON: lexicon = optarg; break;
        case 'h': fputs(tt_help_index, stdout); rc = TT_EXIT_OK; goto out;
        default: fprintf(stderr, "Try 'termtide help index'.\n"); goto out;
        }
    }
    if (argc - optind < 2) {
        cli_error("expected the index file and at least one path (termtide index DB PATH...)");
        goto out;
    }
    if (c.pipe.db) {
        cli_error("--db reads an index; to write one, name it first: termtide index DB PATH...");
        goto out;
    }
    const char *db = argv[optind++];
    if (lexicon && !tone) {
        cli_error("--lexicon goes with --tone");
        goto out;
    }
    if (!cli_pipeline_finish(&c.pipe) || !cli_pipeline_profile(&c.pipe, &profile))
        goto out;
    if (tone && !cli_tone_setup(&c.tone, lexicon, 3, NULL))
        goto out;
    if (!cli_expand_inputs(&inputs, argc - optind, argv + optind))
        goto out;
    tt_error err;
    tt_error_init(&err);
    if (tt_index_open(db, TT_INDEX_WRITE, &c.ix, &err) ||
        tt_index_profile(c.ix, profile.data, &err) ||
        tt_index_analysis(c.ix, tone ? c.tone.desc : NULL, &err)) {
        cli_error("%s", tt_error_format(&err, msg, sizeof msg));
        goto out;
    }
    c.sha = calloc(inputs.n ? inputs.n : 1, sizeof *c.sha);
    c.size = calloc(inputs.n ? inputs.n : 1, sizeof *c.size);
    if (!c.sha || !c.size)
        goto oom;
    /* Which files are new or changed. Only a file already in the index at
     * its size is hashed now (unchanged when its SHA-256 is the one
     * recorded); a new file, or one whose size changed, is read once, its
     * hash taken from the same bytes as its counts (read.sha256). */
    c.pipe.batch.read.sha256 = 1;
    for (size_t i = 0; i < inputs.n; i++) {
        const tt_source_entry *in = &inputs.items[i];
        if (in->status != TT_OK || !strcmp(in->path, "-")) {
            cli_error("%s: %s (skipped)", in->path,
                      in->status != TT_OK ? (in->message ? in->message : "cannot be read")
                                          : "standard input cannot be indexed");
            missing++;
            continue;
        }
        char hex[65] = "";
        struct stat sb;
        tt_index_file f;
        tt_error_init(&err);
        if (stat(in->path, &sb) != 0) {
            tt_error_set(&err, TT_EIO, in->path, -1, "%s", strerror(errno));
            cli_error("%s (skipped)", tt_error_format(&err, msg, sizeof msg));
            missing++;
            continue;
        }
        if (tt_index_file_lookup(c.ix, in->path, &f, &err)) {
            cli_error("%s", tt_error_format(&err, msg, sizeof msg));
            goto out;
        }
        if (f.found && f.size == (uint64_t)sb.st_size) {
            if (tt_sha256_file(in->path, hex, &err)) {
                cli_error("%s (skipped)", tt_error_format(&err, msg, sizeof msg));
                missing++;
                continue;
            }
            if (!strcmp(f.sha256, hex)) {
                unchanged++;
                continue;
            }
        }
        if (f.found)
            changed++;
        else
            added++;
        size_t k = to_read.n;
        if (tt_source_list_add(&to_read, in->path))
            goto oom;
        memcpy(c.sha[k], hex, sizeof hex);
        c.size[k] = (uint64_t)sb.st_size;
    }
    c.to_read = &to_read;
    cli_pipeline_hooks(&c.pipe);
    c.cli_problem = c.pipe.batch.on_problem;
    c.cli_progress = c.pipe.batch.on_progress;
    c.pipe.batch.on_problem = on_problem;
    c.pipe.batch.on_progress = on_progress;
    c.pipe.batch.on_document = on_document;
    c.pipe.batch.ctx = &c;
    if (tone) {
        c.pipe.batch.analyse = tone_analyse;
        c.pipe.batch.analyse_with_count = 1;
        c.pipe.batch.worker_new = tone_worker_new;
        c.pipe.batch.worker_free = tone_worker_free;
    }
    tt_batch_summary sum;
    tt_error_init(&err);
    tt_status st = tt_batch_run(&to_read, &c.pipe.batch, &sum, &err);
    if (c.current != SIZE_MAX)
        tt_index_file_abort(c.ix);
    if (st || c.err.status) {
        cli_error("%s", tt_error_format(c.err.status ? &c.err : &err, msg, sizeof msg));
        goto out;
    }
    if (prune && tt_index_prune(c.ix, &inputs, &removed, &err)) {
        cli_error("%s", tt_error_format(&err, msg, sizeof msg));
        goto out;
    }
    tt_index_stats is;
    if (tt_index_stats_get(c.ix, &is, &err)) {
        cli_error("%s", tt_error_format(&err, msg, sizeof msg));
        goto out;
    }
    if (!c.pipe.quiet)
        fprintf(stderr,
                "%s index: %zu new, %zu changed, %zu unchanged, %zu removed, %zu skipped; %zu "
                "documents read, %.1f MB in %.2f s; %s holds %llu files, %llu documents, %llu "
                "words\n",
                tt_prog, added, changed, unchanged, removed, missing + sum.skipped,
                sum.documents, (double)sum.bytes / 1e6, cli_now() - c.pipe.started, db,
                (unsigned long long)is.files, (unsigned long long)is.documents,
                (unsigned long long)is.words);
    rc = missing || sum.skipped ? TT_EXIT_TROUBLE : TT_EXIT_OK;
    goto out;
oom:
    cli_error("out of memory");
out:
    tt_index_close(c.ix);
    cli_tone_release(&c.tone);
    free(c.sha);
    free(c.size);
    tt_buf_release(&profile);
    tt_source_list_release(&inputs);
    tt_source_list_release(&to_read);
    cli_pipeline_release(&c.pipe);
    return rc;
}
