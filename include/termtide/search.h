/* termtide — the search stage: watch-lists of PCRE2 patterns run over the
 * extracted text of documents, each hit mapped back to its place in the
 * source file and shown in context.
 *
 * A watch-list holds rules, one a line: name<TAB>pattern[<TAB>note]; blank
 * lines and lines starting with '#' are skipped; a UTF-8 BOM and CRLF line
 * ends are accepted. A pattern is PCRE2 syntax with UTF and Unicode
 * properties (\w, \b, [[:alpha:]] are Unicode-aware), caseless unless the
 * options say otherwise, compiled once with the JIT. A pattern of the form
 * near(A, B, N) is a proximity rule: a match of pattern A and a match of
 * pattern B in the same sentence with at most N words between them (A and B
 * are separated by the first comma outside parentheses, brackets and braces;
 * N is 0..TT_LIMIT_NEAR_WORDS).
 *
 * Patterns run over each extracted block (a paragraph, heading, cell or
 * item; see extract.h) on its own, so ^ and $ are the block's edges, a match
 * never spans two blocks, and line breaks, markup, a hyphenated line end or
 * a non-breaking space never split a phrase (the block text has them
 * normalized to single spaces). Empty matches are not hits. */
#ifndef TT_SEARCH_H
#define TT_SEARCH_H

#include <stddef.h>
#include <stdint.h>
#include "termtide/buf.h"
#include "termtide/document.h"
#include "termtide/extract.h"
#include "termtide/source.h"
#include "termtide/status.h"

typedef struct tt_search_options {
    int case_sensitive; /* 0 (default): patterns match without regard to case */
    int whole_words;    /* 1: a match must not touch a letter, digit or '_'
                           (Unicode \w) on either side */
    size_t context;     /* words of context before and after a hit (default 8) */
} tt_search_options;

void tt_search_options_init(tt_search_options *o);

/* ---- the watch-list ---------------------------------------------------- */

typedef enum tt_rule_kind { TT_RULE_PATTERN = 0, TT_RULE_NEAR } tt_rule_kind;

typedef struct tt_rule {
    const char *name;
    const char *pattern;  /* the pattern field as written */
    const char *note;     /* "" when none */
    tt_rule_kind kind;
    size_t near_words;    /* N of near(A, B, N) */
    long line;            /* watch-list line, 0 for a rule given directly */
} tt_rule;

typedef struct tt_watchlist tt_watchlist;

/* A new, empty watch-list whose rules will be compiled with opt (NULL:
 * defaults). NULL when out of memory. The caller frees it with
 * tt_watchlist_free(). Once filled, a watch-list is read-only and may be
 * shared by any number of searchers on any threads. */
tt_watchlist *tt_watchlist_new(const tt_search_options *opt);
void tt_watchlist_free(tt_watchlist *wl);

/* Parses watch-list text and compiles every rule. Every line is checked,
 * so all problems are reported at once: each is kept (the first
 * TT_LIMIT_WATCHLIST_PROBLEMS; see tt_watchlist_problem) with the file
 * (name), its line and the cause — for a pattern that does not compile,
 * PCRE2's message and the byte offset of the error in the pattern field.
 * Problems: invalid UTF-8, a control character, a line longer than
 * TT_LIMIT_WATCHLIST_LINE, a missing name or pattern, a fourth field, a
 * name used twice, a malformed near(), more than TT_LIMIT_WATCHLIST_RULES
 * rules, and no rule at all. Returns TT_OK, TT_EPARSE (err holds the first
 * problem; the watch-list must not be used) or TT_ENOMEM. The SHA-256 of
 * the bytes parsed is kept (tt_watchlist_sha256). */
tt_status tt_watchlist_parse(tt_watchlist *wl, const char *text, size_t len,
                             const char *name, tt_error *err);

/* Reads a watch-list file (at most TT_LIMIT_WATCHLIST_BYTES) and parses it. */
tt_status tt_watchlist_load(tt_watchlist *wl, const char *path, tt_error *err);

/* Adds and compiles one rule (a pattern given on the command line); the
 * SHA-256 then covers the pattern text. Same problems as a parsed line,
 * recorded the same way, with file "" and line 0. */
tt_status tt_watchlist_add(tt_watchlist *wl, const char *name, const char *pattern,
                           const char *note, tt_error *err);

size_t tt_watchlist_problem_count(const tt_watchlist *wl);
const tt_error *tt_watchlist_problem(const tt_watchlist *wl, size_t i);
size_t tt_watchlist_size(const tt_watchlist *wl);
const tt_rule *tt_watchlist_rule(const tt_watchlist *wl, size_t i);
/* 64 hex digits, "" before anything was parsed or added. */
const char *tt_watchlist_sha256(const tt_watchlist *wl);
/* 1 when every rule runs JIT-compiled code. */
int tt_watchlist_jit(const tt_watchlist *wl);

/* ---- searching one document --------------------------------------------- */

typedef struct tt_search_hit {
    size_t rule;              /* index in the watch-list */
    size_t block;             /* index in the document's blocks */
    tt_block_kind block_kind;
    long long offset;         /* byte offset of the hit's first character in
                                 the file (see tt_searcher_run) */
    long line;                /* 1-based line of that offset */
    int exact;                /* 1: offset is the matched text's own place;
                                 0: the place could not be followed through
                                 the markup, and offset is the block's start */
    size_t text;              /* before, match and after text, one after the
                                 other in the result's text buffer */
    size_t before_len, match_len, after_len;
} tt_search_hit;

typedef enum tt_search_limit {
    TT_SEARCH_LIMIT_MATCH = 0, /* TT_LIMIT_REGEX_MATCH */
    TT_SEARCH_LIMIT_DEPTH,     /* TT_LIMIT_REGEX_DEPTH */
    TT_SEARCH_LIMIT_HEAP,      /* TT_LIMIT_REGEX_HEAP_KIB */
    TT_SEARCH_LIMIT_JIT_STACK, /* TT_LIMIT_REGEX_JIT_STACK */
    TT_SEARCH_LIMIT_OTHER      /* another PCRE2 match error */
} tt_search_limit;

/* "match limit", "depth limit", "heap limit", "JIT stack limit",
 * "match error". */
const char *tt_search_limit_name(tt_search_limit l);

/* A rule that stopped on a document: it hit a PCRE2 limit in block `block`
 * and was not run on the rest of that document (its count there is then a
 * lower bound). */
typedef struct tt_search_stop {
    size_t rule;
    size_t block;
    tt_search_limit limit;
} tt_search_stop;

typedef struct tt_search_result {
    tt_search_hit *hits;      /* in text order: block, start, rule */
    size_t n_hits, cap_hits;
    uint64_t *counts;         /* hits per rule (all of them, listed or not) */
    size_t n_rules;
    uint64_t unlisted;        /* hits counted but not listed: past
                                 TT_LIMIT_SEARCH_HITS or the text cap */
    tt_search_stop *stops;
    size_t n_stops, cap_stops;
    tt_buf text;              /* the hits' context strings */
} tt_search_result;

void tt_search_result_init(tt_search_result *r);
void tt_search_result_release(tt_search_result *r);
void tt_search_result_reset(tt_search_result *r);

/* One thread's matching state (PCRE2 match data, match context with the
 * limits, JIT stack, scratch arrays). NULL when out of memory. The
 * watch-list must outlive it. The caller frees it with tt_searcher_free(). */
typedef struct tt_searcher tt_searcher;
tt_searcher *tt_searcher_new(const tt_watchlist *wl);
void tt_searcher_free(tt_searcher *s);
/* counts_only = 1: only counts and stops are filled (no hit list, no
 * offsets, no context), which is faster. */
void tt_searcher_set_counts_only(tt_searcher *s, int counts_only);

/* Runs every rule over doc's blocks; out is reset first and its counts
 * sized for the watch-list. Offsets: for plain text exact (the walk from
 * the block's start follows the whitespace normalization and the joining of
 * hyphenated line ends byte by byte); for HTML the walk steps over tags,
 * comments, character references, white space and elements the extractor
 * leaves out (script, style, hidden), and is exact unless libxml2 repaired
 * or read the markup differently (a stray '<', a reference without ';'),
 * where the hit gets the block's start and exact = 0.
 * The offset counts the bytes of the file as read: for a UTF-8 file, its
 * own bytes (a BOM included); for a gzip file, the decompressed bytes; for a
 * file decoded from Windows-1252 or UTF-16, its UTF-8 decoding. Lines count
 * LF, CRLF and a lone CR as one break each, from the start of the file
 * (doc->raw - doc->raw_off). A rule that reaches a PCRE2 limit is recorded
 * in out->stops and the others go on. Returns TT_OK, or TT_ENOMEM with err
 * naming the document. */
tt_status tt_searcher_run(tt_searcher *s, const tt_document *doc, tt_search_result *out,
                          tt_error *err);

/* ---- searching a batch ---------------------------------------------------- */

/* A searched document, valid during the callback. */
typedef struct tt_search_doc {
    size_t input;          /* index in the input list */
    const char *name, *path, *type, *entity, *period, *notes;
    tt_doc_kind kind;
    const tt_search_result *result;
} tt_search_doc;

typedef struct tt_search_batch_options {
    const tt_watchlist *watchlist;
    tt_read_options read;
    int threads;            /* 1: in the calling thread */
    int counts_only;
    int hash_files;         /* compute each input file's SHA-256, from the
                               bytes as they are read (standard input
                               too) */
    /* In input order, in the calling thread. Non-OK stops the batch.
     * sha256 is "" when not asked for or when the file could not be read. */
    tt_status (*on_input)(void *ctx, size_t input, const char *path, const char *sha256);
    tt_status (*on_document)(void *ctx, const tt_search_doc *d);
    /* skipped = 1: the input or document was not searched. */
    void (*on_problem)(void *ctx, const tt_error *err, int skipped);
    void *ctx;
} tt_search_batch_options;

void tt_search_batch_options_init(tt_search_batch_options *o);

typedef struct tt_search_summary {
    size_t inputs, documents, skipped, notes, stops;
    uint64_t hits;
} tt_search_summary;

/* Searches every input on `threads` workers, each with its own reader and
 * searcher; results are handed over strictly in input order (a worker runs
 * at most 4 × threads inputs ahead), so the output does not depend on the
 * thread count. An input that cannot be read is reported and the batch goes
 * on. Returns TT_OK when the batch ran to the end, else the first fatal
 * status (out of memory, a callback's non-OK) with err filled. */
tt_status tt_search_batch(const tt_source_list *inputs, const tt_search_batch_options *opt,
                          tt_search_summary *summary, tt_error *err);

#endif
