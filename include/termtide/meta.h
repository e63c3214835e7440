/* termtide — document metadata: which entity, which period and which kind of
 * document each input is, and how periods order into series.
 *
 * Three sources fill the same record (tt_doc_meta): a manifest file (CSV or
 * TSV, tt_manifest_load), a path layout such as '{entity}/{period}-*.htm'
 * (tt_layout_match, then tt_manifest_add), or a submission wrapper's header
 * (tt_period_parse_basic_date on its period of report, a day, which
 * tt_period_coarsen turns into the quarter or year a series needs, then
 * tt_manifest_add).
 * tt_series_build then sorts documents into (entity, period) groups and the
 * pairs of neighbouring periods that `compare --consecutive` and `trend` walk.
 *
 * Periods. A period has a granularity (year, quarter, month, day) and a
 * basis (calendar or fiscal; fiscal only for years and quarters):
 *
 *     text          granularity  basis     note
 *     2025          year         calendar  January to December
 *     2025-Q3       quarter      calendar  July to September
 *     2025-09       month        calendar
 *     2025-09-30    day          calendar  a valid Gregorian date
 *     FY2025        year         fiscal    the fiscal year labelled 2025
 *     FY2025-Q3     quarter      fiscal    its third quarter
 *
 * The library does not know when an entity's fiscal year ends, so a fiscal
 * period never equals, and is never consecutive with, a calendar period. A
 * series (the periods of one entity that are compared or trended) holds one
 * granularity and one basis; tt_series_build refuses a mix, naming two
 * documents that clash, and its filters (document kind, granularity, basis)
 * let a caller pick a consistent series out of an archive that holds
 * quarterly reports, call transcripts and annual reports side by side. */
#ifndef TT_META_H
#define TT_META_H

#include <stddef.h>
#include "termtide/buf.h"
#include "termtide/status.h"

/* ---- periods ------------------------------------------------------------- */

typedef enum tt_period_granularity {
    TT_PERIOD_NONE = 0, /* not set; "any" in tt_series_options */
    TT_PERIOD_YEAR,
    TT_PERIOD_QUARTER,
    TT_PERIOD_MONTH,
    TT_PERIOD_DAY
} tt_period_granularity;

typedef enum tt_period_basis {
    TT_BASIS_CALENDAR = 0,
    TT_BASIS_FISCAL
} tt_period_basis;

/* A period by value; no resources. Unused fields are 0. */
typedef struct tt_period {
    tt_period_granularity granularity;
    tt_period_basis basis; /* TT_BASIS_FISCAL only with YEAR or QUARTER */
    int year;              /* 0..9999; a fiscal period's year is its label */
    int quarter;           /* 1..4 for quarters, else 0 */
    int month;             /* 1..12 for months and days, else 0 */
    int day;               /* 1..31 (valid for the month) for days, else 0 */
} tt_period;

/* Room for any canonical period text with its NUL ("2025-09-30" is the
 * longest, 10 bytes). */
#define TT_PERIOD_TEXT_MAX 16

/* Parses one of the six forms in the table above, the whole of text[0..len)
 * and nothing else: four-digit years (0000-9999, ISO 8601's range), two-digit
 * months and days, "FY" and "Q" in either case, no blanks. Strict: 2025-Q5,
 * 2025-13, 2025-9, 2025-02-30, FY25, FY2025-09, Q3-2025 and " 2025" are
 * refused. On failure returns TT_EPARSE, *out untouched, and err (may be
 * NULL) holds 'unknown period syntax "TEXT": ' and what was expected (e.g.
 * "a quarter is Q1 to Q4", "2025-02 has 28 days"), with no file or line: a
 * caller adds its own (the manifest adds its file and line). */
tt_status tt_period_parse(const char *text, size_t len, tt_period *out, tt_error *err);

/* Parses an ISO 8601 basic-format calendar date YYYYMMDD, the form of a
 * submission wrapper's CONFORMED PERIOD OF REPORT (tt_wrapper.period):
 * "20250930" is the day 2025-09-30. Exactly eight digits, a valid date;
 * else TT_EPARSE with 'unknown report date "TEXT": ...'. */
tt_status tt_period_parse_basic_date(const char *text, size_t len, tt_period *out,
                                     tt_error *err);

/* 1 when every field is in range and consistent (as after a parse), else 0. */
int tt_period_valid(const tt_period *p);

/* Writes the canonical text ("2025-Q3", "FY2025", "2025-09-30") into out
 * (always NUL-terminated; TT_PERIOD_TEXT_MAX bytes are enough) and returns
 * out. An invalid period is written as "?". Parsing the text gives the same
 * period back. */
char *tt_period_format(const tt_period *p, char *out, size_t size);

/* The granularity and basis in words, for messages: "calendar year",
 * "calendar quarter", "month", "day", "fiscal year", "fiscal quarter"
 * ("invalid period" otherwise). A static string. */
const char *tt_period_class_name(const tt_period *p);

/* Parses a class name as a command-line option would give it: "year" or
 * "calendar-year", "quarter" or "calendar-quarter", "month", "day",
 * "fiscal-year", "fiscal-quarter" (ASCII case ignored). TT_EINVAL with a
 * message listing the names otherwise. */
tt_status tt_period_class_parse(const char *name, tt_period_granularity *granularity,
                                tt_period_basis *basis, tt_error *err);

/* 1 when a and b have the same granularity and basis, so they may share a
 * series. */
int tt_period_same_class(const tt_period *a, const tt_period *b);

/* Total order on valid periods: <0, 0 (identical) or >0. Within one class it
 * is chronological. Mixed classes order by the period's last day, then the
 * shorter period first, then calendar before fiscal; fiscal periods are
 * placed as if the fiscal year were the calendar year (FY2025-Q3 beside
 * 2025-Q3). Ordering by the last day puts an annual report after the
 * quarters it covers (2024-Q3, 2024-Q4, 2024, FY2024, 2025-Q1), the way
 * reports come out. */
int tt_period_compare(const tt_period *a, const tt_period *b);

/* The period's position on a timeline of its own granularity, so that
 * neighbours differ by exactly 1: years → year; quarters → year * 4 +
 * quarter - 1 (quarters since year 0); months → year * 12 + month - 1; days
 * → days since 0000-01-01 in the proleptic Gregorian calendar. Fiscal
 * periods use the same formulas on their labels. Meant for slopes and trend
 * x-axes within one series; indices of different classes are not
 * comparable. -1 for an invalid period. */
long tt_period_index(const tt_period *p);

/* 1 when b immediately follows a: same class and index(b) == index(a) + 1
 * (2025-Q4 → 2026-Q1, FY2024 → FY2025, 2025-12 → 2026-01, 2024-02-28 →
 * 2024-02-29). 0 otherwise, and for invalid periods. */
int tt_period_consecutive(const tt_period *a, const tt_period *b);

/* The period of a coarser granularity that contains p: a calendar day →
 * its month, calendar quarter (Q1 = January to March, common practice) or
 * calendar year; a month → its quarter or year; a calendar quarter → its
 * year; a fiscal quarter → its fiscal year; any period → itself. So the
 * report date 2024-09-30 of a wrapper becomes 2024-Q3. TT_EINVAL (message
 * 'cannot turn a fiscal quarter into a month') for a finer granularity, a
 * fiscal period into a calendar one or the reverse, or an invalid p; *out
 * untouched then. */
tt_status tt_period_coarsen(const tt_period *p, tt_period_granularity granularity,
                            tt_period *out, tt_error *err);

/* ---- one document's metadata ---------------------------------------------- */

/* Owned by the tt_manifest that holds it; valid until the manifest is
 * released or cleared (tt_manifest_add may move the array, so keep indices,
 * not pointers, across adds). */
typedef struct tt_doc_meta {
    const char *path;   /* resolved and normalized: see tt_meta_path_resolve */
    const char *entity; /* never empty */
    tt_period period;   /* valid */
    const char *kind;   /* document kind ("quarterly-report"); "" when not given */
    long line;          /* the manifest line of the row; 0 when added by tt_manifest_add */
    const char *const *tags; /* one value per tag column (tt_manifest.tag_names), "" when
                                absent */
} tt_doc_meta;

/* Longest path the metadata module stores or looks up, with its NUL: Linux's
 * PATH_MAX, past which stat() fails anyway. */
#define TT_META_PATH_MAX 4096

/* Resolves a path the way the manifest does, purely lexically (no file
 * system access), into out (reset first):
 *   1. path absolute (starts with '/') → path; else dir empty or NULL →
 *      path; else dir + "/" + path;
 *   2. runs of '/' become one '/';
 *   3. "." segments are dropped ("./a/./b" → "a/b");
 *   4. a trailing '/' is dropped ("a/b/" → "a/b"; "/" stays "/");
 *   5. ".." segments are kept as written (folding them would be wrong
 *      across symlinks);
 *   6. an empty result is ".".
 * So "./demo//a.htm", "demo/./a.htm" and "demo/a.htm" all resolve to
 * "demo/a.htm", but "/data/demo/a.htm" and "demo/a.htm" stay different:
 * relative and absolute spellings only meet in tt_manifest_find_file.
 * TT_ELIMIT when the result is TT_META_PATH_MAX bytes or longer; TT_ENOMEM. */
tt_status tt_meta_path_resolve(const char *dir, const char *path, tt_buf *out);

/* ---- the manifest: metadata of a set of documents -------------------------- */

/* At most this many problems are kept from one manifest; later ones are
 * counted in errors_more. An analyst fixing a manifest wants the whole list,
 * but a file in the wrong format would produce one error per line. */
#define TT_MANIFEST_MAX_ERRORS 20

/* Most columns a manifest header may have (TT_ELIMIT beyond). */
#define TT_MANIFEST_MAX_COLUMNS 1024

struct tti_manifest_index;

typedef struct tt_manifest {
    tt_doc_meta *docs;  /* in manifest order (or order of tt_manifest_add) */
    size_t n;
    char **tag_names;   /* the columns beyond path, entity, period, kind, in file
                           order, blanks trimmed */
    size_t n_tags;
    char *file;         /* the manifest file as given to tt_manifest_load; NULL
                           when built by tt_manifest_parse without a name */
    char *dir;          /* what relative paths were resolved against ("" = the
                           working directory) */
    tt_error *errors;   /* problems of the last load or parse, in file order */
    size_t n_errors;    /* at most TT_MANIFEST_MAX_ERRORS */
    size_t errors_more; /* problems found beyond those kept */
    /* private */
    size_t cap;
    struct tti_manifest_index *index;
} tt_manifest;

void tt_manifest_init(tt_manifest *m);
/* Frees everything the manifest owns (documents, tags, errors); it is left
 * initialised (empty). */
void tt_manifest_release(tt_manifest *m);
/* Release, then init. */
void tt_manifest_clear(tt_manifest *m);

/* Flags for tt_manifest_load and tt_manifest_parse. */
#define TT_MANIFEST_SKIP_FILE_CHECK 1u /* do not stat() listed files */

/* Loads a manifest file (gzip read transparently; decoded like a document,
 * so a UTF-8 BOM, UTF-16 with a BOM or Windows-1252 are read as text). m is
 * cleared first. The format:
 *  - the header is the first line that is not blank and does not start
 *    with '#'; it is TSV when it holds a tab outside quotes, else CSV;
 *  - fields are separated by the delimiter; a field that starts with '"' is
 *    quoted as in RFC 4180 (a doubled "" is one quote; the delimiter and line
 *    breaks may appear inside) in CSV and TSV alike; a quote inside an
 *    unquoted field is kept as written; text after a closing quote is an
 *    error. Values are kept exactly (RFC 4180: spaces are part of a field);
 *  - lines end in LF or CRLF; blank lines, lines starting with '#' and rows
 *    whose fields are all empty or blank (a spreadsheet's ",,,") are skipped,
 *    before the header too; line numbers count every physical line from 1;
 *  - columns path, entity, period and kind are required, in any order, their
 *    names matched ignoring ASCII case and surrounding blanks; every other
 *    column is a tag (its name kept as written, blanks trimmed);
 *  - paths resolve against the manifest's directory (tt_meta_path_resolve
 *    with dir = everything before the manifest path's last '/').
 * Problems: the manifest unreadable → that status (TT_ENOENT, TT_EIO,
 * TT_ELIMIT, TT_EBINARY) with err filled. Otherwise every problem is
 * collected with the manifest's name and the line of its row, and when there
 * was any, m holds no documents and TT_EPARSE is returned with err = the
 * first problem and m->errors = all of them (up to TT_MANIFEST_MAX_ERRORS;
 * m->errors_more counts the rest). Header problems end the load: 'missing
 * column "period"' (one per missing column), 'column "entity" appears twice
 * (columns 2 and 5)', 'column 5 has no name', more than
 * TT_MANIFEST_MAX_COLUMNS columns (TT_ELIMIT), 'no header line'. Row
 * problems: '3 fields, the header has 4'; 'empty path' / 'empty entity' /
 * 'empty period'; 'unknown period syntax "2025-Q5": a quarter is Q1 to Q4';
 * 'duplicate path "demo/a.htm" (also on line 3)' (same resolved path);
 * 'listed file "demo/a.htm" not found' (stat fails: other errno texts too;
 * a directory is refused: 'listed path "demo" is a directory'), unless
 * TT_MANIFEST_SKIP_FILE_CHECK; 'unterminated quoted field'; 'text after a
 * closing quote'. A row with a problem is skipped and the others checked.
 * Empty kind is allowed (""). TT_ENOMEM leaves m empty. */
tt_status tt_manifest_load(tt_manifest *m, const char *path, unsigned flags, tt_error *err);

/* The same from bytes in memory: name labels errors (may be NULL), dir is
 * what relative paths resolve against (NULL or "" = as written). */
tt_status tt_manifest_parse(tt_manifest *m, const char *bytes, size_t len, const char *name,
                            const char *dir, unsigned flags, tt_error *err);

/* Adds one document's metadata (from a path layout or a wrapper header).
 * path is resolved with tt_meta_path_resolve(NULL, path) and copied, like
 * the other strings; kind may be NULL or "". The file is not required to
 * exist, but when stat() succeeds its identity is recorded for
 * tt_manifest_find_file. Errors: TT_EINVAL for an empty entity, an invalid
 * period or a path already present ('duplicate path "..."'); TT_ELIMIT for
 * a path of TT_META_PATH_MAX bytes or more; TT_ENOMEM. m is unchanged on
 * failure. Tag values of an added document are "". */
tt_status tt_manifest_add(tt_manifest *m, const char *path, const char *entity,
                          const tt_period *period, const char *kind, tt_error *err);

/* Looks a document up by path, lexically: path is resolved with
 * tt_meta_path_resolve(NULL, path) and compared byte for byte with the
 * stored paths (hash lookup, O(1) expected). A batch runner's path for a
 * file listed as "a/x.htm" in "demo/manifest.tsv" is found whether it is
 * spelled "demo/a/x.htm", "./demo/a/x.htm" or "demo//a/x.htm"; for an inner
 * document of a wrapper ("f.txt#2:EX-99.1") look up its outer path. Returns
 * the document (owned by m) or NULL. No file system access. */
const tt_doc_meta *tt_manifest_find(const tt_manifest *m, const char *path);

/* Like tt_manifest_find, then, when that fails, by file identity: stat()s
 * path and returns the document whose file has the same device and inode
 * (recorded at load, or at tt_manifest_add when stat succeeded), so
 * "/data/demo/a.htm" finds "demo/a.htm" and a symlink finds its target's
 * row. When several rows name one file, the first is returned. NULL when
 * neither matches. */
const tt_doc_meta *tt_manifest_find_file(const tt_manifest *m, const char *path);

/* The value of tag column `name` (exact match) for document i, or NULL when
 * the manifest has no such column or i is out of range. */
const char *tt_manifest_tag(const tt_manifest *m, size_t i, const char *name);

/* Adds the metadata a submission wrapper carries in its header: entity
 * COMPANY CONFORMED NAME, period CONFORMED PERIOD OF REPORT (a day, turned
 * into `granularity` with tt_period_coarsen: TT_PERIOD_QUARTER gives
 * 2024-Q3 for 20240930), kind CONFORMED SUBMISSION TYPE. Reads and decodes
 * the file (gzip too). TT_EPARSE when the file is not a wrapper or its
 * header lacks the name or the date; read errors as tt_source_read; the
 * errors of tt_manifest_add. */
tt_status tt_manifest_add_from_header(tt_manifest *m, const char *path,
                                      tt_period_granularity granularity, tt_error *err);

/* ---- path layouts: metadata from where a file sits -------------------------- */

/* A compiled layout such as '{entity}/{period}-*' or
 * '{entity}/{period}-{kind}.*' (a '*' right after a '/' cannot be shown in a
 * C comment, but is allowed). Tokens: literal text (matched byte for
 * byte), {entity}, {period}, {kind} (each a non-empty run without '/'), '*'
 * (any run without '/', possibly empty), '**' (any run, '/' included,
 * possibly empty; '**' followed by '/' matches nothing or whole
 * directories, so the layout "a/" "**" "/b", written as one string, matches
 * a/b and a/x/y/b). The layout
 * matches the whole relative path. */
struct tti_layout_token;
typedef struct tt_layout {
    char *pattern; /* as given */
    /* private */
    struct tti_layout_token *tokens;
    size_t n_tokens;
} tt_layout;

void tt_layout_init(tt_layout *l);
/* Frees what the layout owns; it is left initialised (empty). */
void tt_layout_release(tt_layout *l);
void tt_layout_clear(tt_layout *l);

/* Most tokens in one layout (TT_ELIMIT beyond); ample for any directory
 * scheme, and it bounds the matcher's memo table. */
#define TT_LAYOUT_MAX_TOKENS 64

/* Compiles pattern into l (released first). The pattern must hold {entity}
 * and {period} once each, {kind} at most once, and no other placeholder; an
 * unclosed '{' and '***' are refused. TT_EINVAL with a message naming the
 * problem and quoting the pattern; TT_ELIMIT past TT_LAYOUT_MAX_TOKENS;
 * TT_ENOMEM. */
tt_status tt_layout_compile(tt_layout *l, const char *pattern, tt_error *err);

/* Longest {entity} or {kind} value, with its NUL (a path segment is at most
 * 255 bytes on common file systems). */
#define TT_META_NAME_MAX 256

/* What a layout found in one path. Caller-owned, no resources. */
typedef struct tt_layout_fields {
    char entity[TT_META_NAME_MAX];
    char kind[TT_META_NAME_MAX]; /* "" when the layout has no {kind} */
    tt_period period;
} tt_layout_fields;

/* Matches path against the layout. Both root and path are resolved
 * (tt_meta_path_resolve); the layout is matched against the part of path
 * after root + "/" (root NULL, "" or "." → all of path). Among the possible
 * matches the first is taken, trying {entity}, {kind}, '*' and '**' shortest
 * first; {period} takes the longest text shaped like a period (an optional
 * "FY", digits, then "-Q" and digits or "-" digits, and "-" digits again)
 * and counts only when that parses. So '{period}-*' on "2025-Q3-call.txt"
 * takes 2025-Q3, not 2025, and on "2025-Q5-call.txt" is an error, not 2025.
 * Errors (err->file = path): TT_EINVAL 'not under the root
 * "ROOT"'; TT_EPARSE 'does not match the layout "PATTERN"' or, when only the
 * period stood in the way, 'unknown period syntax "2025-Q5": ... (from the
 * layout "PATTERN")'; TT_ELIMIT for a path of TT_META_PATH_MAX bytes or more
 * or a value of TT_META_NAME_MAX or more; TT_ENOMEM. out is filled only on
 * TT_OK. */
tt_status tt_layout_match(const tt_layout *l, const char *root, const char *path,
                          tt_layout_fields *out, tt_error *err);

/* ---- series: documents grouped by entity and period ------------------------ */

typedef struct tt_series_options {
    const char *kinds;  /* NULL or "": every kind; else a comma-separated list of
                           document kinds to keep (ASCII case ignored, blanks around
                           items trimmed), e.g. "quarterly-report,call-transcript" */
    const char *entity; /* NULL: every entity; else only this one (exact) */
    tt_period_granularity granularity; /* TT_PERIOD_NONE: any */
    int basis;          /* -1: any; else TT_BASIS_CALENDAR or TT_BASIS_FISCAL */
} tt_series_options;

/* Every document, every class: kinds NULL, entity NULL, granularity
 * TT_PERIOD_NONE, basis -1. */
void tt_series_options_init(tt_series_options *o);

/* One (entity, period) group: the documents of members[first .. first +
 * n_docs), as indices into the docs array given to tt_series_build, in
 * ascending order. */
typedef struct tt_series_group {
    const char *entity; /* points into the docs given to tt_series_build */
    tt_period period;
    size_t first, n_docs;
} tt_series_group;

/* Two neighbouring groups of one entity in sorted order, for
 * `compare --consecutive`. A gap in the data (2025-Q1 then 2025-Q3) still
 * makes a pair, since they are consecutive in what the analyst has; gap
 * counts the periods missing between them (1 here, 0 for truly consecutive
 * periods), so a caller can flag or skip it. */
typedef struct tt_series_pair {
    size_t base, target; /* indices into groups; base earlier */
    long gap;
} tt_series_pair;

typedef struct tt_series {
    tt_series_group *groups; /* sorted by entity (bytewise), then period */
    size_t n_groups;
    size_t *members;         /* document indices, group after group */
    size_t n_members;        /* documents kept by the filter */
    tt_series_pair *pairs;   /* entity after entity, in period order */
    size_t n_pairs;
    size_t n_entities;
    size_t excluded;         /* documents left out by the filter */
} tt_series;

void tt_series_init(tt_series *s);
/* Frees the arrays; the series is left initialised (empty). */
void tt_series_release(tt_series *s);
void tt_series_clear(tt_series *s);

/* Groups docs[0..n) (a manifest's docs and n) that pass the filter (opt may
 * be NULL: no filter) into s (released first). Each entity's kept documents
 * must form one series: one granularity and one basis. Otherwise
 * TT_EINVAL, s empty, and err's message names the first two documents of
 * the first such entity (by name) that clash, in docs order, e.g.
 * 'demo/a.htm has FY2025 but demo/b.htm has 2025-Q3: a fiscal year and a
 * calendar quarter cannot be in one series (kinds annual-report and
 * quarterly-report)' (the kinds part only when the two differ), so a caller
 * can suggest a kind or granularity filter. No documents kept is not an
 * error (n_groups 0). TT_ENOMEM. s points into docs: keep them alive and
 * unchanged while s is used. O(n log n). */
tt_status tt_series_build(tt_series *s, const tt_doc_meta *docs, size_t n,
                          const tt_series_options *opt, tt_error *err);

/* The group of (entity, period), by binary search, or -1. */
long tt_series_find(const tt_series *s, const char *entity, const tt_period *period);

#endif
