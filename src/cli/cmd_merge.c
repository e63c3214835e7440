/* termtide merge — indexes built over parts of an archive (on several
 * machines, or as the tasks of a job array) combined into one. */
#include <stdlib.h>
#include <string.h>

#include "termtide/index.h"
#include "cli.h"

const char tt_help_merge[] =
    "Usage: termtide merge [OPTIONS] OUT SHARD...\n"
    "\n"
    "Merges the indexes SHARD... (each written by termtide index over a part of an\n"
    "archive) into the index OUT (created when missing, or added to), so that OUT\n"
    "holds what one termtide index run over all the files would have written:\n"
    "count --db OUT (and every other --db reader) then gives the output of reading\n"
    "every file. All shards must have been built with the same counting options.\n"
    "A file whose bytes (SHA-256) OUT already holds, from an earlier shard or under\n"
    "another path, is an overlap: it is reported and counted once.\n"
    "\n"
    "Options:\n"
    "  -q, --quiet           no notes and no closing summary on stderr\n"
    "\n"
    "Exit status: 0 when every shard was merged, 2 when a shard could not be read\n"
    "or has other counting options (the others are still merged).\n";

static const struct option longopts[] = {
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

int tt_cmd_merge(int argc, char **argv)
{
    int opt, rc = TT_EXIT_TROUBLE;
    merge_notes notes = { 0, 0 };
    tt_index *out = NULL;
    char msg[TT_ERROR_FILE_MAX + TT_ERROR_MSG_MAX + 64];
    double started = cli_now();
    optind = 1;
    while ((opt = getopt_long(argc, argv, "qh", longopts, NULL)) != -1) {
        switch (opt) {
        case 'q': notes.quiet = 1; break;
        case 'h': fputs(tt_help_merge, stdout); return TT_EXIT_OK;
        default: fprintf(stderr, "Try 'termtide help merge'.\n"); return TT_EXIT_TROUBLE;
        }
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
