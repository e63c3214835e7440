/* termtide merge — indexes built over parts of an archive (on several
 * machines, or as the tasks of a job array) combined into one. */
#include <errno.h>
#include <stdlib.h>
#include <string.h>

#include "termtide/index.h"
#include "termtide/termtable.h"
#include "cli.h"

const char tt_help_merge[] =
    "Usage: termtide merge [OPTIONS] OUT SHARD...\n"
    "       termtide merge --tables [-o FILE] TABLE...\n"
    "\n"
    "Merges the indexes SHARD... (each written by termtide index over a part of an\n"
    "archive) into the index OUT (created when missing, or added to), so that OUT\n"
    "holds what one termtide index run over all the files would have written:\n"
    "count --db OUT (and every other --db reader) then gives the output of reading\n"
    "every file. All shards must have been built with the same counting options.\n"
    "A file whose bytes (SHA-256) OUT already holds, from an earlier shard or under\n"
    "another path, is an overlap: it is reported and counted once.\n"
    "\n"
    "With --tables, merges term tables written by termtide count (TSV, the terms\n"
    "view, whole tables: no --top or --min-count) over parts of an archive: the\n"
    "documents' tables follow one another in the order given, a document named in\n"
    "two tables is reported and kept once, and the table for all documents ('*') is\n"
    "computed again from the documents (or, for --total-only tables, from the parts'\n"
    "totals, where a document in two parts cannot be seen): the result is what\n"
    "count --total (or --total-only) over all the documents writes.\n"
    "\n"
    "Options:\n"
    "  --tables              merge count tables instead of indexes\n"
    "  -o, --output FILE     with --tables: write to FILE atomically (default stdout)\n"
    "  -q, --quiet           no notes and no closing summary on stderr\n"
    "\n"
    "Exit status: 0 when every shard was merged, 2 when a shard could not be read\n"
    "or has other counting options (the others are still merged).\n";

enum { OPT_TABLES = 1000 };

static const struct option longopts[] = {
    { "tables", no_argument, NULL, OPT_TABLES },
    { "output", required_argument, NULL, 'o' },
    { "quiet", no_argument, NULL, 'q' },
    { "help", no_argument, NULL, 'h' },
    { NULL, 0, NULL, 0 }
};

/* Overlap notes: the first few of each shard by name, the rest counted. */
#define OVERLAPS_NAMED 3

typedef struct merge_notes {
    int quiet;
    size_t in_shard;
} merge_notes;

static void on_overlap(void *ctx, const char *shard, const char *path, const char *held_as)
{
    merge_notes *m = ctx;
    if (m->quiet || ++m->in_shard > OVERLAPS_NAMED)
        return;
    if (!strcmp(path, held_as))
        cli_note("%s: %s is already merged (same bytes); counted once", shard, path);
    else
        cli_note("%s: %s has the same bytes as %s, already merged; counted once", shard, path,
                 held_as);
}

/* Undoes tt_table_str's TSV escapes (\\t \\n \\r \\\\) in place. */
static void tsv_unescape(char *s)
{
    char *w = s;
    for (char *r = s; *r; r++) {
        if (*r == '\\' && r[1]) {
            r++;
            *w++ = *r == 't' ? '\t' : *r == 'n' ? '\n' : *r == 'r' ? '\r' : *r;
        } else {
            *w++ = *r;
        }
    }
    *w = '\0';
}

/* The cells of one TSV line (cut in place), at most max. */
static size_t tsv_cells(char *line, char **cells, size_t max)
{
    size_t n = 0;
    for (char *p = line; n < max;) {
        cells[n++] = p;
        char *tab = strchr(p, '\t');
        if (!tab)
            break;
        *tab = '\0';
        p = tab + 1;
    }
    return n;
}

typedef struct table_merge {
    tt_termtable *all, *stars, *seen, *doc;
    tt_buf out, doc_rows;
    char header[256];
    uint64_t per;
    int has_star, has_docs, quiet;
    size_t documents, overlaps;
    char *doc_name;
    const char *file;
    long doc_line;
    uint64_t rank;
    char last_cum_share[32];
} table_merge;

/* Closes the document being read: checks it is whole, then keeps it. */
static int end_document(table_merge *m)
{
    if (!m->doc_name)
        return 1;
    if (strcmp(m->last_cum_share, "1.000000")) {
        cli_error("%s: line %ld: the table of %s is cut (its last cum_share is %s, not "
                  "1.000000): merging needs whole tables, without --top or --min-count",
                  m->file, m->doc_line, m->doc_name, m->last_cum_share);
        return 0;
    }
    tt_status st = TT_OK;
    if (!strcmp(m->doc_name, "*")) {
        m->has_star = 1;
        st = tt_termtable_merge(m->stars, m->doc);
    } else if (tt_termtable_get(m->seen, m->doc_name, strlen(m->doc_name))) {
        m->overlaps++;
        if (!m->quiet)
            cli_note("%s: %s is already merged; counted once", m->file, m->doc_name);
    } else {
        m->has_docs = 1;
        m->documents++;
        st = tt_termtable_add(m->seen, m->doc_name, strlen(m->doc_name), 1);
        if (!st) st = tt_termtable_merge(m->all, m->doc);
        if (!st) st = tt_buf_append(&m->out, m->doc_rows.data, m->doc_rows.len);
    }
    free(m->doc_name);
    m->doc_name = NULL;
    tt_termtable_reset(m->doc);
    tt_buf_reset(&m->doc_rows);
    if (st) {
        cli_error("out of memory");
        return 0;
    }
    return 1;
}

static int merge_table_file(table_merge *m, const char *path)
{
    FILE *f = strcmp(path, "-") ? fopen(path, "r") : stdin;
    if (!f) {
        cli_error("%s: cannot open: %s", path, strerror(errno));
        return 0;
    }
    m->file = path;
    char *line = NULL;
    size_t cap = 0;
    ssize_t got;
    long lineno = 0;
    int ok = 1;
    while (ok && (got = getline(&line, &cap, f)) != -1) {
        lineno++;
        size_t n = (size_t)got;
        if (n && line[n - 1] == '\n')
            line[--n] = '\0';
        if (lineno == 1) {
            static const char rate_head[] =
                "document\trank\tterm\tcount\tshare\tcum_count\tcum_share\trate_per_";
            int rate = !strncmp(line, rate_head, sizeof rate_head - 1);
            if (strcmp(line, "document\trank\tterm\tcount\tshare\tcum_count\tcum_share") &&
                !rate) {
                cli_error("%s: not a TSV term table from termtide count (the header must be "
                          "document rank term count share cum_count cum_share)", path);
                ok = 0;
                break;
            }
            if (!m->header[0]) {
                snprintf(m->header, sizeof m->header, "%s", line);
                m->per = rate ? strtoull(line + sizeof rate_head - 1, NULL, 10) : 0;
            } else if (strcmp(m->header, line)) {
                cli_error("%s: its columns differ from the first table's", path);
                ok = 0;
            }
            continue;
        }
        char *copy = strdup(line);
        char *c[9];
        if (!copy) {
            cli_error("out of memory");
            ok = 0;
            break;
        }
        size_t k = tsv_cells(line, c, 9);
        if (k != (m->per ? 8u : 7u)) {
            cli_error("%s: line %ld: expected %u cells, found %zu", path, lineno,
                      m->per ? 8u : 7u, k);
            free(copy);
            ok = 0;
            break;
        }
        tsv_unescape(c[0]);
        tsv_unescape(c[2]);
        if (!m->doc_name || strcmp(m->doc_name, c[0])) {
            if (!end_document(m) || !(m->doc_name = strdup(c[0]))) {
                free(copy);
                ok = 0;
                break;
            }
            m->doc_line = lineno;
            m->rank = 0;
        }
        char *end = NULL;
        uint64_t rank = strtoull(c[1], &end, 10), count = strtoull(c[3], NULL, 10);
        if (rank != ++m->rank || count == 0) {
            cli_error("%s: line %ld: rank %s where %llu was expected", path, lineno, c[1],
                      (unsigned long long)m->rank);
            free(copy);
            ok = 0;
            break;
        }
        snprintf(m->last_cum_share, sizeof m->last_cum_share, "%s", c[6]);
        tt_status st = tt_termtable_add(m->doc, c[2], strlen(c[2]), count);
        if (!st) st = tt_buf_append(&m->doc_rows, copy, strlen(copy));
        if (!st) st = tt_buf_putc(&m->doc_rows, '\n');
        free(copy);
        if (st) {
            cli_error("out of memory");
            ok = 0;
        }
    }
    if (ok && ferror(f)) {
        cli_error("%s: read error", path);
        ok = 0;
    }
    if (ok && lineno == 0) {
        cli_error("%s: empty", path);
        ok = 0;
    }
    if (ok)
        ok = end_document(m);
    free(line);
    if (f != stdin)
        fclose(f);
    return ok;
}

static int merge_tables(int nfiles, char **files, const char *output, int quiet)
{
    table_merge m;
    memset(&m, 0, sizeof m);
    m.quiet = quiet;
    tt_buf_init(&m.out, 0);
    tt_buf_init(&m.doc_rows, 0);
    int rc = TT_EXIT_TROUBLE;
    tt_outfile out;
    tt_error err;
    tt_error_init(&err);
    char msg[TT_ERROR_FILE_MAX + TT_ERROR_MSG_MAX + 64];
    double started = cli_now();
    if (!(m.all = tt_termtable_new()) || !(m.stars = tt_termtable_new()) ||
        !(m.seen = tt_termtable_new()) || !(m.doc = tt_termtable_new())) {
        cli_error("out of memory");
        goto done;
    }
    for (int i = 0; i < nfiles; i++)
        if (!merge_table_file(&m, files[i]))
            goto done;
    if (tt_outfile_open(&out, output, &err)) {
        cli_error("%s", tt_error_format(&err, msg, sizeof msg));
        goto done;
    }
    tt_buf head;
    tt_buf_init(&head, 0);
    tt_status st = tt_buf_append(&head, m.header, strlen(m.header));
    if (!st) st = tt_buf_putc(&head, '\n');
    if (!st) st = tt_outfile_write(&out, head.data, head.len, &err);
    tt_buf_release(&head);
    if (!st) st = tt_outfile_write(&out, m.out.data, m.out.len, &err);
    if (!st && m.has_star) {
        /* the table for all documents, as count --total writes it */
        static const char *term_cols[] = { "document", "rank", "term", "count", "share",
                                           "cum_count", "cum_share", "rate" };
        tt_table_writer w;
        tt_buf_reset(&m.out);
        st = tt_table_begin(&w, TT_FORMAT_TSV, &m.out, term_cols, m.per ? 8 : 7, 0);
        if (!st)
            st = cli_write_term_rows(&w, "*", m.has_docs ? m.all : m.stars, 0, 0, m.per, &out,
                                     &err);
        if (!st)
            st = tt_outfile_write(&out, m.out.data, m.out.len, &err);
    }
    if (!st)
        st = tt_outfile_commit(&out, &err);
    if (st) {
        tt_outfile_abort(&out);
        cli_error("%s", err.status ? tt_error_format(&err, msg, sizeof msg) : tt_status_name(st));
        goto done;
    }
    if (!quiet)
        fprintf(stderr, "%s merge: %d table%s, %zu documents, %zu overlap%s counted once, in "
                "%.2f s\n", tt_prog, nfiles, nfiles == 1 ? "" : "s", m.documents, m.overlaps,
                m.overlaps == 1 ? "" : "s", cli_now() - started);
    rc = TT_EXIT_OK;
done:
    tt_termtable_free(m.all);
    tt_termtable_free(m.stars);
    tt_termtable_free(m.seen);
    tt_termtable_free(m.doc);
    tt_buf_release(&m.out);
    tt_buf_release(&m.doc_rows);
    free(m.doc_name);
    return rc;
}

int tt_cmd_merge(int argc, char **argv)
{
    int opt, rc = TT_EXIT_TROUBLE, tables = 0;
    const char *output = NULL;
    merge_notes notes = { 0, 0 };
    tt_index *out = NULL;
    char msg[TT_ERROR_FILE_MAX + TT_ERROR_MSG_MAX + 64];
    double started = cli_now();
    optind = 1;
    while ((opt = getopt_long(argc, argv, "o:qh", longopts, NULL)) != -1) {
        switch (opt) {
        case OPT_TABLES: tables = 1; break;
        case 'o': output = optarg; break;
        case 'q': notes.quiet = 1; break;
        case 'h': fputs(tt_help_merge, stdout); return TT_EXIT_OK;
        default: fprintf(stderr, "Try 'termtide help merge'.\n"); return TT_EXIT_TROUBLE;
        }
    }
    if (tables) {
        if (argc - optind < 1) {
            cli_error("expected at least one table (termtide merge --tables TABLE...)");
            return TT_EXIT_TROUBLE;
        }
        return merge_tables(argc - optind, argv + optind, output, notes.quiet);
    }
    if (output) {
        cli_error("-o goes with --tables; an index merge names its output first");
        return TT_EXIT_TROUBLE;
    }
    if (argc - optind < 2) {
        cli_error("expected the output index and at least one shard (termtide merge OUT "
                  "SHARD...)");
        return TT_EXIT_TROUBLE;
    }
    const char *path = argv[optind++];
    tt_error err;
    tt_error_init(&err);
    if (tt_index_open(path, TT_INDEX_WRITE, &out, &err)) {
        cli_error("%s", tt_error_format(&err, msg, sizeof msg));
        return TT_EXIT_TROUBLE;
    }
    tt_index_merge_stats ms;
    memset(&ms, 0, sizeof ms);
    size_t failed = 0;
    for (int i = optind; i < argc; i++) {
        tt_error_init(&err);
        if (!strcmp(argv[i], path)) {
            cli_error("%s: is the output itself (skipped)", argv[i]);
            failed++;
            continue;
        }
        notes.in_shard = 0;
        tt_status st = tt_index_merge(out, argv[i], &ms, on_overlap, &notes, &err);
        if (!notes.quiet && notes.in_shard > OVERLAPS_NAMED)
            cli_note("%s: %zu more files already merged; counted once", argv[i],
                     notes.in_shard - OVERLAPS_NAMED);
        if (st) {
            cli_error("%s (skipped)", tt_error_format(&err, msg, sizeof msg));
            failed++;
            if (err.status == TT_ENOMEM)
                goto done;
        }
    }
    tt_index_stats is;
    tt_error_init(&err);
    if (tt_index_stats_get(out, &is, &err)) {
        cli_error("%s", tt_error_format(&err, msg, sizeof msg));
        goto done;
    }
    if (!notes.quiet)
        fprintf(stderr,
                "%s merge: %d shard%s, %zu skipped; %zu files and %zu documents added, %zu "
                "overlap%s counted once, in %.2f s; %s holds %llu files, %llu documents, %llu "
                "words\n",
                tt_prog, argc - optind, argc - optind == 1 ? "" : "s", failed, ms.files,
                ms.documents, ms.overlaps, ms.overlaps == 1 ? "" : "s", cli_now() - started,
                path,
                (unsigned long long)is.files, (unsigned long long)is.documents,
                (unsigned long long)is.words);
    rc = failed ? TT_EXIT_TROUBLE : TT_EXIT_OK;
done:
    tt_index_close(out);
    return rc;
}
