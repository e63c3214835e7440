/* termtide — the index: a persistent SQLite database of what counting
 * made of each file, so later questions need not read the files again.
 *
 * One database holds one counting profile (the options that change what is
 * counted: n-grams, stems, numbers, minimum length, stop-word lists, HTML
 * tables, wrapper part types); a run with other options is refused and told
 * which differ. Per input file it keeps the SHA-256 and size of the bytes
 * as stored, every document the file held (name, kind, encoding, wrapper
 * values, the counting statistics and the term table) and every problem or
 * note reading it raised, in the order they arose, so replaying the file
 * gives the callbacks of tt_batch_run exactly what reading it gave.
 *
 * Each file is written in one transaction (its old rows deleted, the new
 * ones inserted, then committed): a run killed at any point leaves every
 * file either as before or fully replaced. The database is in WAL mode, so
 * readers go on while a run writes; a second writer is refused (an
 * advisory lock on the database file, held by the writer for its run). */
#ifndef TT_INDEX_H
#define TT_INDEX_H

#include <stddef.h>
#include <stdint.h>
#include "termtide/batch.h"
#include "termtide/source.h"
#include "termtide/status.h"

#define TT_INDEX_SCHEMA_VERSION 1

typedef struct tt_index tt_index;

typedef enum tt_index_mode {
    TT_INDEX_READ = 0,  /* the database must exist and be a termtide index */
    TT_INDEX_WRITE      /* created when missing; refused while another writer holds it */
} tt_index_mode;

/* Opens an index. A file that is not SQLite, is truncated, or is a
 * database without termtide's tables is refused (TT_EPARSE) and never
 * written to; a missing file in READ mode is TT_ENOENT; another writer
 * running, or a file or directory that cannot be opened or written, is
 * TT_EIO. err names the file and the cause. The caller closes it with
 * tt_index_close(). */
tt_status tt_index_open(const char *path, tt_index_mode mode, tt_index **out, tt_error *err);
void tt_index_close(tt_index *ix);

/* The counting profile: space-separated key=value pairs made by the
 * caller. An index without one (new) takes it (WRITE mode); otherwise it
 * must be equal, else TT_EINVAL with the differing keys named, e.g.
 * "the index was built with stem=0, this run has stem=1". */
tt_status tt_index_profile(tt_index *ix, const char *profile, tt_error *err);

/* The analysis stored with each document (e.g. "tone lexicon=... sha=..."),
 * or NULL/"" for none. A new, empty index (WRITE) takes it; otherwise it
 * must equal what the index holds, else TT_EINVAL naming both. Once set,
 * documents written keep r->prepared as their analysis, and a replay with
 * opt->analyse hands it back as the analysis output. */
tt_status tt_index_analysis(tt_index *ix, const char *analysis, tt_error *err);

/* What the index holds for a file path (as the source list spells it). */
typedef struct tt_index_file {
    int found;
    char sha256[65];
    uint64_t size;
} tt_index_file;
tt_status tt_index_file_lookup(tt_index *ix, const char *path, tt_index_file *out,
                               tt_error *err);

/* Writing one file: begin (its old rows go), add its documents and
 * problems in the order they arose, commit. abort rolls back. */
tt_status tt_index_file_begin(tt_index *ix, const char *path, const char *sha256, uint64_t size,
                              tt_error *err);
tt_status tt_index_file_add_document(tt_index *ix, const tt_doc_result *r, tt_error *err);
tt_status tt_index_file_add_problem(tt_index *ix, const char *name, const tt_error *problem,
                                    int skipped, tt_error *err);
tt_status tt_index_file_commit(tt_index *ix, size_t parts_skipped, tt_error *err);
void tt_index_file_abort(tt_index *ix);

/* Removes every file whose path is not in keep (entries with a non-OK
 * status count as present); *removed gets how many. One transaction. */
tt_status tt_index_prune(tt_index *ix, const tt_source_list *keep, size_t *removed,
                         tt_error *err);

/* Merging indexes built over disjoint sets of files (shards) into one
 * (out, opened for writing): the result holds what one run over all the
 * files would have written. A shard must have out's profile (an empty out
 * takes the first shard's). A shard file whose bytes (SHA-256) out already
 * holds, under any path, is an overlap: reported through on_overlap (with
 * the path out holds it under) and counted once. Each file is copied in one
 * transaction. */
typedef struct tt_index_merge_stats {
    size_t files, documents, overlaps;
} tt_index_merge_stats;
typedef void (*tt_index_overlap_fn)(void *ctx, const char *shard, const char *path,
                                    const char *held_as);
tt_status tt_index_merge(tt_index *out, const char *shard_path, tt_index_merge_stats *ms,
                         tt_index_overlap_fn on_overlap, void *ctx, tt_error *err);

/* Appends the path of every indexed file to list, in bytewise order. */
tt_status tt_index_paths(tt_index *ix, tt_source_list *list, tt_error *err);

/* Counts of what the index holds. */
typedef struct tt_index_stats {
    uint64_t files, documents, words, terms, distinct_terms;
} tt_index_stats;
tt_status tt_index_stats_get(tt_index *ix, tt_index_stats *out, tt_error *err);

/* Replays the indexed files named by inputs, in order, through opt's
 * on_problem, prepare, on_document and on_progress callbacks (and its
 * `total`, summed here) exactly as tt_batch_run would deliver them for the
 * same files read with the same profile; analyse is not supported
 * (TT_EINVAL). A path the index does not hold is reported through
 * on_problem ("not in the index") and counted as skipped. One thread; the
 * reads share one snapshot of the database. */
tt_status tt_index_replay(tt_index *ix, const tt_source_list *inputs, const tt_batch_options *opt,
                          tt_batch_summary *sum, tt_error *err);

#endif
