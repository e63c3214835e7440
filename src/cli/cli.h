/* termtide CLI — shared helpers for the subcommands (option values, the
 * pipeline options every reading command takes, messages). The CLI includes
 * only public headers from include/termtide/. */
#ifndef TT_CLI_H
#define TT_CLI_H

#include <getopt.h>
#include <stdint.h>
#include <stdio.h>

#include "termtide/batch.h"
#include "termtide/meta.h"
#include "termtide/output.h"
#include "termtide/source.h"
#include "termtide/status.h"
#include "termtide/termtable.h"

#include "../banned.h"

#define TT_EXIT_OK 0
#define TT_EXIT_NONE 1    /* reserved: nothing found (search) */
#define TT_EXIT_TROUBLE 2 /* bad usage, or an input skipped or failed */

typedef int (*tt_cmd_fn)(int argc, char **argv);

typedef struct tt_command {
    const char *name;
    tt_cmd_fn run;
    const char *summary;
    const char *help; /* full help text */
} tt_command;

int tt_cmd_count(int argc, char **argv);
extern const char tt_help_count[];
int tt_cmd_compare(int argc, char **argv);
extern const char tt_help_compare[];
int tt_cmd_describe(int argc, char **argv);
extern const char tt_help_describe[];
int tt_cmd_trend(int argc, char **argv);
extern const char tt_help_trend[];
int tt_cmd_tone(int argc, char **argv);
extern const char tt_help_tone[];
int tt_cmd_index(int argc, char **argv);
extern const char tt_help_index[];
int tt_cmd_merge(int argc, char **argv);
extern const char tt_help_merge[];
int tt_cmd_readability(int argc, char **argv);
extern const char tt_help_readability[];
int tt_cmd_sections(int argc, char **argv);
extern const char tt_help_sections[];
int tt_cmd_changes(int argc, char **argv);
extern const char tt_help_changes[];
int tt_cmd_search(int argc, char **argv);
extern const char tt_help_search[];
int tt_cmd_cloud(int argc, char **argv);
extern const char tt_help_cloud[];
int tt_cmd_chart(int argc, char **argv);
extern const char tt_help_chart[];
int tt_cmd_report(int argc, char **argv);
extern const char tt_help_report[];

/* The program name for messages. */
extern const char *tt_prog;

void cli_error(const char *fmt, ...) __attribute__((format(printf, 1, 2)));
void cli_note(const char *fmt, ...) __attribute__((format(printf, 1, 2)));

/* Parses a non-negative decimal integer (no sign, no junk) within
 * [min, max]; prints an error naming the option and returns 0 on failure. */
int cli_parse_u64(const char *opt, const char *arg, uint64_t min, uint64_t max, uint64_t *out);

/* Options shared by every command that reads documents. */
typedef struct cli_pipeline {
    tt_batch_options batch;
    tt_termtable *stopwords;
    int no_stopwords;
    const char **extra_lists;
    size_t n_extra;
    int quiet;
    const char *db;   /* --db: the index to read instead of the files */
    const char **sections;     /* --section NAME... */
    size_t n_sections;
    const char *section_rules_path;
    struct tt_section_rules *section_rules;
    struct tt_index *index;
    int progress;     /* stderr is a terminal and not quiet */
    double started;   /* monotonic seconds */
    double last_progress;
    size_t skipped_by_status[16];
} cli_pipeline;

/* getopt_long ids for the pipeline options, above any short option. */
enum {
    CLI_OPT_NGRAM = 1000, CLI_OPT_STEM, CLI_OPT_NUMBERS, CLI_OPT_MIN_LENGTH,
    CLI_OPT_STOPWORDS, CLI_OPT_NO_STOPWORDS, CLI_OPT_TABLES, CLI_OPT_DOC_TYPES,
    CLI_OPT_QUIET, CLI_OPT_DB, CLI_OPT_SECTION, CLI_OPT_SECTION_RULES, CLI_OPT_FIRST_FREE
};

#define CLI_PIPELINE_LONGOPTS                                           \
    { "ngram", required_argument, NULL, CLI_OPT_NGRAM },                \
    { "stem", no_argument, NULL, CLI_OPT_STEM },                        \
    { "numbers", no_argument, NULL, CLI_OPT_NUMBERS },                  \
    { "min-length", required_argument, NULL, CLI_OPT_MIN_LENGTH },      \
    { "stopwords", required_argument, NULL, CLI_OPT_STOPWORDS },        \
    { "no-stopwords", no_argument, NULL, CLI_OPT_NO_STOPWORDS },        \
    { "tables", required_argument, NULL, CLI_OPT_TABLES },              \
    { "doc-types", required_argument, NULL, CLI_OPT_DOC_TYPES },        \
    { "jobs", required_argument, NULL, 'j' },                           \
    { "db", required_argument, NULL, CLI_OPT_DB },                      \
    { "section", required_argument, NULL, CLI_OPT_SECTION },            \
    { "section-rules", required_argument, NULL, CLI_OPT_SECTION_RULES }, \
    { "quiet", no_argument, NULL, 'q' }

#define CLI_PIPELINE_HELP                                                          \
    "Reading options (every command that reads documents):\n"                       \
    "  -j, --jobs N          worker threads (default 1); output is identical for any N\n" \
    "  --ngram N|N-M         count n-grams of N (to M) words, N, M in 1..3 (default 1);\n" \
    "                        never across a sentence or block, never starting or ending\n" \
    "                        with a stop-word\n"                                        \
    "  --stem                reduce words to Snowball English (Porter2) stems\n"        \
    "  --numbers             count numbers, amounts and percentages as terms\n"         \
    "  --min-length N        leave out words shorter than N characters\n"               \
    "  --stopwords FILE      add a stop-word list (repeatable; one word a line, #\n"    \
    "                        comments)\n"                                               \
    "  --no-stopwords        do not use the built-in lists (english, filing)\n"         \
    "  --tables keep|drop    keep (default) or leave out the text of HTML tables\n"     \
    "  --doc-types LIST      submission-wrapper parts to keep: comma-separated types,\n" \
    "                        a trailing * matches a prefix (EX-99*), or 'all'; the\n"   \
    "                        default keeps the main documents and skips exhibits\n"     \
    "                        (EX-*), graphics, archives and XML; uuencoded parts are\n" \
    "                        always skipped\n"                                          \
    "  --section NAME        read only this section of each document (repeatable):\n" \
    "                        a report's items (risk-factors, mdna, business,\n"    \
    "                        legal-proceedings, controls, financial-statements, ...;\n" \
    "                        termtide sections --names lists them) or a transcript's\n" \
    "                        prepared-remarks and qa; a document without any is\n"   \
    "                        reported and skipped\n"                                  \
    "  --section-rules FILE  sections from your own rules (name<TAB>pattern lines)\n" \
    "  --db DB               read the documents from the index DB (termtide index)\n"   \
    "                        instead of the files; the output is the same; the\n"   \
    "                        counting options must be those the index was built with\n" \
    "  -q, --quiet           no progress and no closing summary on stderr\n"

void cli_pipeline_init(cli_pipeline *p);
void cli_pipeline_release(cli_pipeline *p);
/* Handles one getopt result if it is a pipeline option: returns 1 when
 * handled, 0 when not a pipeline option, -1 on a bad value (message printed). */
int cli_pipeline_option(cli_pipeline *p, int opt, const char *arg);
/* Loads the stop-word lists and opens the --db index (checking that it was
 * built with these counting options); prints errors; returns 0 on failure. */
int cli_pipeline_finish(cli_pipeline *p);
/* Loads --section-rules and checks --section names (also done by
 * cli_pipeline_finish, for commands that do not call it); prints errors and
 * returns 0 on failure. */
int cli_pipeline_sections(cli_pipeline *p);
/* Expands the paths (or "-" when none); returns 0 on out-of-memory. */
int cli_expand_inputs(tt_source_list *list, int argc, char **argv);
/* Installs progress and problem reporting on p->batch (ctx must be p). */
void cli_pipeline_hooks(cli_pipeline *p);
/* Prints the closing one-line summary on stderr (unless quiet). */
void cli_pipeline_summary(cli_pipeline *p, const char *cmd, const tt_batch_summary *s);
/* The same for commands that read without counting terms: no term total;
 * extra (may be NULL) is appended after a comma. */
void cli_reading_summary(cli_pipeline *p, const char *cmd, const tt_batch_summary *s,
                         const char *extra);
double cli_now(void);
/* The counting profile of p for an index: the options that change what is
 * counted, as space-separated key=value pairs (extra stop-word lists by the
 * SHA-256 of their bytes). Prints the error and returns 0 on failure. */
int cli_pipeline_profile(const cli_pipeline *p, tt_buf *out);

/* Writes buf to out when it holds 1 MiB or more, or always with force;
 * empties buf. TT_EIO with err filled on a write error. */
tt_status cli_flush(tt_outfile *out, tt_buf *buf, tt_error *err, int force);
/* The rows of a term table (count's terms view) after tt_table_begin:
 * document rank term count share cum_count cum_share [rate_per_N], by
 * descending count; top and min_count 0 for all, per 0 for no rate. With
 * flush_to, the writer's buffer goes to it whenever it holds 1 MiB
 * (cli_flush; err filled on a write error), so a large table is never
 * built whole in memory; NULL keeps every row in the buffer. */
tt_status cli_write_term_rows(tt_table_writer *w, const char *doc, const tt_termtable *t,
                              uint64_t top, uint64_t min_count, uint64_t per,
                              tt_outfile *flush_to, tt_error *err);
/* The same for entries e[0..n) sorted as tt_termtable_sorted() sorts
 * them, total their counts' sum; with flush_to and threads > 1, a large
 * table's later rows are formatted in up to threads threads, each into a
 * buffer of its own, and written in order after the first part. */
tt_status cli_write_entry_rows(tt_table_writer *w, const char *doc, const tt_term_entry *e,
                               size_t n, uint64_t total, uint64_t top, uint64_t min_count,
                               uint64_t per, int threads, tt_outfile *flush_to, tt_error *err);

/* The run of a command whose rows an analysis writes (readability,
 * sections): opens the output (atomic), writes the header unless
 * header is 0, runs the batch (p->batch's hooks set by the caller; their
 * rows go to *buf), lets finish(ctx) add rows after it (may be NULL),
 * flushes, commits and prints the summary. Prints any error. Returns the
 * exit status. */
typedef struct cli_rows {
    tt_format format;
    int header;
    const char *output;
    const char *const *cols;
    size_t ncols;
    tt_buf buf;
    tt_outfile out;
    tt_error err;
} cli_rows;
int cli_run_rows(cli_pipeline *p, cli_rows *r, const tt_source_list *inputs,
                 tt_status (*finish)(void *ctx), void *ctx, const char *cmd);

/* Parses --format tsv|csv|jsonl; prints the error and returns 0 if bad. */
int cli_parse_format(const char *arg, tt_format *out);

/* Document metadata (meta_cli.c); each prints its problems and returns 0 on
 * failure. Headers: a root that is not a submission wrapper is reported,
 * counted in *skipped and left out. */
int cli_load_manifest(tt_manifest *m, const char *path);
int cli_load_layout(tt_manifest *m, const char *pattern, int nroots, char **roots);
int cli_load_headers(tt_manifest *m, tt_period_granularity g, int nroots, char **roots,
                     size_t *skipped);
/* Parses --header-period year|quarter|month|day. */
int cli_header_period(const char *arg, tt_period_granularity *out);

#endif
