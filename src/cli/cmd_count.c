/* termtide count — term tables per document (and for all input together):
 * rank, term, count, share, cumulative count and share; or a summary per
 * document; or the frequency distribution of terms by count class. */
#include <stdlib.h>
#include <string.h>

#include "termtide/alloc.h"
#include "termtide/count.h"
#include "termtide/index.h"
#include "cli.h"

const char tt_help_count[] =
    "Usage: termtide count [OPTIONS] [PATH...]\n"
    "\n"
    "Turns documents into term-frequency tables. PATH is a file, a directory (read\n"
    "recursively in sorted order) or - for standard input (the default); gzip files\n"
    "are read transparently. Plain text, HTML/XHTML (inline XBRL included) and the\n"
    "multi-document submission wrapper of electronic filings are told apart by\n"
    "content; each wrapper part becomes a document named FILE#SEQ:TYPE.\n"
    "\n"
    "Output options:\n"
    "  --show terms|summary|classes\n"
    "                        terms (default): one row per term and document:\n"
    "                          document rank term count share cum_count cum_share\n"
    "                        summary: one row per document: words read, numbers,\n"
    "                          stop-words, terms kept, distinct terms, type-token\n"
    "                          ratio (distinct / kept), terms seen once\n"
    "                        classes: terms by count class 1, 2-4, 5-9, 10-19, 20-49,\n"
    "                          ...; a count on a class edge goes to the higher class\n"
    "  --top N               at most N terms per document\n"
    "  --min-count N         leave out terms counted fewer than N times (shares and\n"
    "                        ranks still count them)\n"
    "  --per N               add a column rate_per_N: count per N terms kept\n"
    "  --total               add a table for all input together (document '*')\n"
    "  --total-only          only the table for all input together\n"
    "  -f, --format tsv|csv|jsonl\n"
    "                        TSV (default), CSV (RFC 4180; cells a spreadsheet would\n"
    "                        run as a formula are prefixed with ') or JSON Lines\n"
    "  -o, --output FILE     write to FILE atomically (default standard output)\n"
    "  --no-header           leave out the header line (TSV, CSV)\n"
    "  (with --db DB and no PATH: every file in the index, in path order)\n"
    "\n"
    CLI_PIPELINE_HELP
    "\n"
    "Decoding: a UTF-8 byte-order mark means UTF-8 (the mark is removed); a UTF-16\n"
    "mark means UTF-16. Otherwise, with I invalid UTF-8 sequences and M valid\n"
    "multi-byte ones: I = 0 is UTF-8; 0 < I <= M is UTF-8 with each invalid\n"
    "sequence replaced by U+FFFD; I > M is Windows-1252 (old filings), the reading\n"
    "that damages fewer characters. A note names the file and the encoding used.\n"
    "NUL bytes, images, PDFs and archives are refused as binary.\n"
    "\n"
    "Words follow Unicode UAX #29 word boundaries, then NFKC and\n"
    "case folding; typographic apostrophes and dashes are unified, a possessive 's\n"
    "is dropped, internal hyphens are kept (off-balance-sheet is one term).\n"
    "\n"
    "Exit status: 0 when every document was read, 2 when any input was skipped or\n"
    "failed (the others' results are still written) or on bad usage.\n";

typedef enum { SHOW_TERMS, SHOW_SUMMARY, SHOW_CLASSES } show_kind;

typedef struct count_ctx {
    cli_pipeline pipe; /* first: the pipeline hooks use the batch ctx as this */
    show_kind show;
    uint64_t top, min_count, per;
    int total, total_only, header;
    tt_termtable_set parts; /* --total-only: the workers' partial sums */
    tt_format format;
    tt_termtable *all;
    tt_outfile out;
    tt_buf buf;
    int header_done;
    tt_error err;
    tt_doc_stats all_stats;
} count_ctx;

static const char *term_cols[] = { "document", "rank", "term", "count", "share",
                                         "cum_count", "cum_share", "rate" };
static const char *const summary_cols[] = { "document", "kind", "type", "encoding", "words",
                                            "numbers", "stop_words", "terms", "distinct",
                                            "type_token_ratio", "hapax", "hapax_share" };
static const char *const class_cols[] = { "document", "class", "lower", "upper", "terms",
                                          "share", "cum_terms", "cum_share", "occurrences" };

static tt_status flush(count_ctx *c, int force)
{
    return cli_flush(&c->out, &c->buf, &c->err, force);
}

static char rate_col[32];

/* Starts a table in out; the header goes in only when `header` is set. */
static tt_status begin(const count_ctx *c, tt_table_writer *w, tt_buf *out, int header)
{
    const char *const *cols;
    size_t n;
    switch (c->show) {
    case SHOW_SUMMARY: cols = summary_cols; n = 12; break;
    case SHOW_CLASSES: cols = class_cols; n = 9; break;
    default: cols = term_cols; n = c->per ? 8 : 7; break;
    }
    return tt_table_begin(w, c->format, out, cols, n, header);
}

/* Writes the header line once, before the first rows. */
static tt_status header_once(count_ctx *c)
{
    tt_table_writer w;
    if (c->header_done || !c->header)
        return TT_OK;
    c->header_done = 1;
    return begin(c, &w, &c->buf, 1);
}

/* flush_to and err: as for cli_write_term_rows (NULL in a worker). */
static tt_status write_terms(const count_ctx *c, tt_buf *out, const char *doc,
                             const tt_termtable *t, tt_outfile *flush_to, tt_error *err)
{
    tt_table_writer w;
    tt_status st = begin(c, &w, out, 0);
    return st ? st
              : cli_write_term_rows(&w, doc, t, c->top, c->min_count, c->per, flush_to, err);
}

/* The total's rows from the workers' partial tables (and c->all, which
 * holds what the index replayed, if anything), sorted together in the
 * batch's threads and never merged into one table. */
static tt_status write_total_terms(count_ctx *c)
{
    /* at most 64 tables sorted together: partials past the 63rd (-j 64 and
     * more) are added to c->all first */
    const tt_termtable *tables[64];
    size_t n = 0;
    uint64_t total = 0;
    tt_status st = TT_OK;
    tables[n++] = c->all;
    for (size_t i = 0; i < c->parts.n && !st; i++) {
        if (i < 63)
            tables[n++] = c->parts.tables[i];
        else
            st = tt_termtable_merge(c->all, c->parts.tables[i]);
    }
    for (size_t i = 0; i < n; i++)
        total += tt_termtable_total(tables[i]);
    int threads = c->pipe.batch.threads;
    tt_term_entry *e = NULL;
    size_t rows = 0;
    tt_table_writer w;
    if (!st)
        st = begin(c, &w, &c->buf, 0);
    if (!st)
        st = tt_termtable_sorted_union(tables, n, threads, &e, &rows);
    if (!st)
        st = cli_write_entry_rows(&w, "*", e, rows, total, c->top, c->min_count, c->per, threads,
                                  &c->out, &c->err);
    tt_free(e);
    return st;
}

static tt_status write_classes(const count_ctx *c, tt_buf *out, const char *doc,
                               const tt_termtable *t)
{
    tt_table_writer w;
    tt_term_entry *e = NULL;
    size_t n = 0;
    tt_count_class cls[64];
    tt_status st = begin(c, &w, out, 0);
    if (!st)
        st = tt_termtable_sorted(t, &e, &n);
    if (st)
        return st;
    size_t k = tt_count_classes(e, n, cls, 64);
    uint64_t cum = 0;
    for (size_t i = 0; i < k && !st; i++) {
        char label[48];
        cum += cls[i].terms;
        if (cls[i].lower == cls[i].upper)
            snprintf(label, sizeof label, "%llu", (unsigned long long)cls[i].lower);
        else
            snprintf(label, sizeof label, "%llu-%llu", (unsigned long long)cls[i].lower,
                     (unsigned long long)cls[i].upper);
        st = tt_table_cstr(&w, doc);
        if (!st) st = tt_table_cstr(&w, label);
        if (!st) st = tt_table_u64(&w, cls[i].lower);
        if (!st) st = tt_table_u64(&w, cls[i].upper);
        if (!st) st = tt_table_u64(&w, cls[i].terms);
        if (!st) st = tt_table_fixed(&w, (double)cls[i].terms / (double)n, 6);
        if (!st) st = tt_table_u64(&w, cum);
        if (!st) st = tt_table_fixed(&w, (double)cum / (double)n, 6);
        if (!st) st = tt_table_u64(&w, cls[i].occurrences);
        if (!st) st = tt_table_end_row(&w);
    }
    tt_free(e);
    return st;
}

static uint64_t hapax(const tt_termtable *t);

static int count_once(void *ctx, const tt_term_entry *e)
{
    uint64_t *n = ctx;
    if (e->count == 1)
        (*n)++;
    return 0;
}

static uint64_t hapax(const tt_termtable *t)
{
    uint64_t n = 0;
    tt_termtable_foreach(t, count_once, &n);
    return n;
}

static tt_status write_summary(const count_ctx *c, tt_buf *out, const char *doc,
                               const char *kind, const char *type, const char *enc,
                               const tt_doc_stats *s, const tt_termtable *t)
{
    tt_table_writer w;
    tt_status st = begin(c, &w, out, 0);
    uint64_t distinct = tt_termtable_distinct(t), kept = tt_termtable_total(t);
    uint64_t once = hapax(t);
    if (!st) st = tt_table_cstr(&w, doc);
    if (!st) st = tt_table_cstr(&w, kind);
    if (!st) st = tt_table_cstr(&w, type);
    if (!st) st = tt_table_cstr(&w, enc);
    if (!st) st = tt_table_u64(&w, s->words_read);
    if (!st) st = tt_table_u64(&w, s->numbers);
    if (!st) st = tt_table_u64(&w, s->stopwords);
    if (!st) st = tt_table_u64(&w, kept);
    if (!st) st = tt_table_u64(&w, distinct);
    /* zero terms: the ratios are written as 0, never divided by zero */
    if (!st) st = tt_table_fixed(&w, kept ? (double)distinct / (double)kept : 0.0, 6);
    if (!st) st = tt_table_u64(&w, once);
    if (!st) st = tt_table_fixed(&w, distinct ? (double)once / (double)distinct : 0.0, 6);
    if (!st) st = tt_table_end_row(&w);
    return st;
}

/* In a worker thread: the document's rows, formatted while others count. */
static tt_status prepare(void *ctx, const tt_doc_result *r, tt_buf *out)
{
    const count_ctx *c = ctx;
    switch (c->show) {
    case SHOW_TERMS: return write_terms(c, out, r->name, r->table, NULL, NULL);
    case SHOW_CLASSES: return write_classes(c, out, r->name, r->table);
    case SHOW_SUMMARY:
        return write_summary(c, out, r->name, tt_doc_kind_name(r->kind), r->type, r->encoding,
                             &r->stats, r->table);
    }
    return TT_OK;
}

/* In input order: merge into the total, write the prepared rows. */
static tt_status on_document(void *ctx, const tt_doc_result *r)
{
    count_ctx *c = ctx;
    tt_status st = TT_OK;
    if (c->all) {
        if (r->table) /* NULL with --total-only: summed in the workers */
            st = tt_termtable_merge(c->all, r->table);
        c->all_stats.words_read += r->stats.words_read;
        c->all_stats.numbers += r->stats.numbers;
        c->all_stats.stopwords += r->stats.stopwords;
    }
    if (st || c->total_only)
        return st;
    st = header_once(c);
    if (!st)
        st = tt_buf_append(&c->buf, r->prepared, r->prepared_len);
    return st ? st : flush(c, 0);
}

enum { OPT_SHOW = CLI_OPT_FIRST_FREE, OPT_TOP, OPT_MIN_COUNT, OPT_PER, OPT_TOTAL,
       OPT_TOTAL_ONLY, OPT_NO_HEADER, OPT_HELP };

static const struct option longopts[] = {
    { "show", required_argument, NULL, OPT_SHOW },
    { "top", required_argument, NULL, OPT_TOP },
    { "min-count", required_argument, NULL, OPT_MIN_COUNT },
    { "per", required_argument, NULL, OPT_PER },
    { "total", no_argument, NULL, OPT_TOTAL },
    { "total-only", no_argument, NULL, OPT_TOTAL_ONLY },
    { "format", required_argument, NULL, 'f' },
    { "output", required_argument, NULL, 'o' },
    { "no-header", no_argument, NULL, OPT_NO_HEADER },
    { "help", no_argument, NULL, 'h' },
    CLI_PIPELINE_LONGOPTS,
    { NULL, 0, NULL, 0 }
};

int tt_cmd_count(int argc, char **argv)
{
    count_ctx c;
    memset(&c, 0, sizeof c);
    cli_pipeline_init(&c.pipe);
    c.header = 1;
    c.format = TT_FORMAT_TSV;
    const char *output = NULL;
    int opt, rc = TT_EXIT_TROUBLE;
    uint64_t v;
    tt_source_list inputs;
    tt_source_list_init(&inputs);
    tt_buf_init(&c.buf, 0);
    tt_error_init(&c.err);

    optind = 1;
    while ((opt = getopt_long(argc, argv, "f:o:j:qh", longopts, NULL)) != -1) {
        int handled = cli_pipeline_option(&c.pipe, opt, optarg);
        if (handled < 0)
            goto out;
        if (handled)
            continue;
        switch (opt) {
        case OPT_SHOW:
            if (!strcmp(optarg, "terms")) c.show = SHOW_TERMS;
            else if (!strcmp(optarg, "summary")) c.show = SHOW_SUMMARY;
            else if (!strcmp(optarg, "classes")) c.show = SHOW_CLASSES;
            else {
                cli_error("--show: expected terms, summary or classes, got '%s'", optarg);
                goto out;
            }
            break;
        case OPT_TOP:
            if (!cli_parse_u64("--top", optarg, 1, UINT64_MAX, &c.top)) goto out;
            break;
        case OPT_MIN_COUNT:
            if (!cli_parse_u64("--min-count", optarg, 1, UINT64_MAX, &c.min_count)) goto out;
            break;
        case OPT_PER:
            if (!cli_parse_u64("--per", optarg, 1, 1000000000, &v)) goto out;
            c.per = v;
            break;
        case OPT_TOTAL: c.total = 1; break;
        case OPT_TOTAL_ONLY: c.total = c.total_only = 1; break;
        case OPT_NO_HEADER: c.header = 0; break;
        case 'f':
            if (!cli_parse_format(optarg, &c.format))
                goto out;
            break;
        case 'o': output = optarg; break;
        case 'h': fputs(tt_help_count, stdout); rc = TT_EXIT_OK; goto out;
        default:
            fprintf(stderr, "Try 'termtide help count'.\n");
            goto out;
        }
    }
    if (c.per) {
        snprintf(rate_col, sizeof rate_col, "rate_per_%llu", (unsigned long long)c.per);
        term_cols[7] = rate_col;
    }
    if (!cli_pipeline_finish(&c.pipe))
        goto out;
    if (c.pipe.index && optind == argc) {
        /* every indexed file */
        tt_error e;
        tt_error_init(&e);
        if (tt_index_paths(c.pipe.index, &inputs, &e)) {
            char msg[TT_ERROR_FILE_MAX + TT_ERROR_MSG_MAX + 64];
            cli_error("%s", tt_error_format(&e, msg, sizeof msg));
            goto out;
        }
    } else if (!cli_expand_inputs(&inputs, argc - optind, argv + optind)) {
        goto out;
    }
    if (c.total && !(c.all = tt_termtable_new_large())) {
        cli_error("out of memory");
        goto out;
    }
    if (tt_outfile_open(&c.out, output, &c.err)) {
        char msg[TT_ERROR_FILE_MAX + TT_ERROR_MSG_MAX + 64];
        cli_error("%s", tt_error_format(&c.err, msg, sizeof msg));
        goto out;
    }
    cli_pipeline_hooks(&c.pipe);
    c.pipe.batch.on_document = on_document;
    if (!c.total_only)
        c.pipe.batch.prepare = prepare; /* with --total-only nothing per document */
    if (c.total_only)
        c.pipe.batch.total = c.all;
    if (c.total_only && c.show == SHOW_TERMS)
        c.pipe.batch.total_parts = &c.parts; /* sorted together, never merged */
    c.pipe.batch.ctx = &c;

    tt_batch_summary sum;
    tt_error err;
    tt_error_init(&err);
    tt_status st = tt_batch_run(&inputs, &c.pipe.batch, &sum, &err);
    if (!st && c.all) {
        st = header_once(&c);
        if (!st) {
            switch (c.show) {
            case SHOW_TERMS:
                st = c.parts.n ? write_total_terms(&c) :
                                 write_terms(&c, &c.buf, "*", c.all, &c.out, &c.err);
                break;
            case SHOW_CLASSES: st = write_classes(&c, &c.buf, "*", c.all); break;
            case SHOW_SUMMARY:
                st = write_summary(&c, &c.buf, "*", "all", "", "", &c.all_stats, c.all);
                break;
            }
        }
        if (st && !c.err.status)
            tt_error_set(&c.err, st, NULL, -1, "%s while writing the total", tt_status_name(st));
    }
    if (!st)
        st = flush(&c, 1);
    if (!st)
        st = tt_outfile_commit(&c.out, &c.err);
    if (st) {
        tt_outfile_abort(&c.out);
        char msg[TT_ERROR_FILE_MAX + TT_ERROR_MSG_MAX + 64];
        cli_error("%s", tt_error_format(c.err.status ? &c.err : &err, msg, sizeof msg));
        rc = TT_EXIT_TROUBLE;
        goto out;
    }
    cli_pipeline_summary(&c.pipe, "count", &sum);
    rc = sum.skipped ? TT_EXIT_TROUBLE : TT_EXIT_OK;
out:
    tt_termtable_free(c.all);
    tt_termtable_set_release(&c.parts);
    tt_buf_release(&c.buf);
    tt_source_list_release(&inputs);
    cli_pipeline_release(&c.pipe);
    return rc;
}
