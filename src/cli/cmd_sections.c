/* termtide sections — each document's sections (report items, transcript
 * parts, or a user's rules) with where they start and how many words they
 * hold. */
#include <stdlib.h>
#include <string.h>

#include "termtide/document.h"
#include "termtide/sections.h"
#include "termtide/segment.h"
#include "cli.h"

const char tt_help_sections[] =
    "Usage: termtide sections [OPTIONS] [PATH...]\n"
    "\n"
    "Lists each document's sections, one row each:\n"
    "  document form section item offset words found_by\n"
    "form: annual report, quarterly report, current report (told apart by their item\n"
    "numbers), transcript, user rules or none; item: as the report numbers it (II-1A\n"
    "for Part II, Item 1A); offset: byte offset of the section's heading in the\n"
    "file; found_by: the heading taken, and whether earlier mentions (a table of\n"
    "contents) were skipped. A report's item heading is a heading or a short\n"
    "paragraph starting 'Item 1A', 'ITEM 7.', 'Part II - Item 1A' or 'Item 2.02';\n"
    "table cells are never headings; of several mentions the one followed by a body\n"
    "of 30 words or more is taken (the last such). Transcripts: prepared-remarks and\n"
    "qa from the speaker turns. Every reading command takes --section NAME to read\n"
    "only those sections.\n"
    "\n"
    "Options:\n"
    "  --names               list the built-in section names and exit\n"
    "  --section-rules FILE  your own sections: name<TAB>pattern lines (PCRE2,\n"
    "                        caseless); a heading matching a pattern starts the section\n"
    "  -f, --format tsv|csv|jsonl   -o, --output FILE   --no-header\n"
    "  -j, --jobs N   --tables keep|drop   --doc-types LIST   -q, --quiet   (as for count)\n";

enum { OPT_NAMES = CLI_OPT_FIRST_FREE, OPT_NO_HEADER };

static const struct option longopts[] = {
    { "names", no_argument, NULL, OPT_NAMES },
    { "section-rules", required_argument, NULL, CLI_OPT_SECTION_RULES },
    { "format", required_argument, NULL, 'f' },
    { "output", required_argument, NULL, 'o' },
    { "no-header", no_argument, NULL, OPT_NO_HEADER },
    { "help", no_argument, NULL, 'h' },
    { "tables", required_argument, NULL, CLI_OPT_TABLES },
    { "doc-types", required_argument, NULL, CLI_OPT_DOC_TYPES },
    { "jobs", required_argument, NULL, 'j' },
    { "quiet", no_argument, NULL, 'q' },
    { NULL, 0, NULL, 0 }
};

static const char *const cols[] = { "document", "form", "section", "item", "offset", "words",
                                    "found_by" };

typedef struct sec_ctx {
    cli_pipeline pipe; /* first: the pipeline hooks use the batch ctx as this */
    cli_rows rows;
} sec_ctx;

static uint64_t words_of(const tt_blocks *b, size_t from, size_t to)
{
    uint64_t n = 0;
    for (size_t i = from; i < to && i < b->n; i++) {
        tt_tokenizer t;
        tt_token tok;
        tt_tokenizer_init(&t, b->text.data + b->items[i].off, b->items[i].len);
        while (tt_tokenizer_next(&t, &tok))
            n += tok.kind == TT_TOKEN_WORD;
    }
    return n;
}

/* In a worker: the document's rows. */
static tt_status analyse(void *vctx, void *state, const tt_document *doc, tt_buf *out,
                         tt_doc_stats *stats)
{
    (void)state;
    const sec_ctx *c = vctx;
    tt_sections s;
    tt_sections_init(&s);
    tt_status st = tt_sections_find(doc->blocks, c->pipe.batch.read.section_rules, &s);
    stats->words_read = words_of(doc->blocks, 0, doc->blocks->n);
    for (size_t i = 0; i < s.n && !st; i++) {
        const tt_section *x = &s.items[i];
        long long off = tt_blocks_source_offset(doc->blocks, x->first, 0, doc->raw, doc->raw_len,
                                                doc->kind == TT_KIND_HTML);
        tt_table_writer w;
        st = tt_table_begin(&w, c->rows.format, out, cols, 7, 0);
        if (!st) st = tt_table_cstr(&w, doc->name);
        if (!st) st = tt_table_cstr(&w, s.form);
        if (!st) st = tt_table_cstr(&w, x->name);
        if (!st) st = tt_table_cstr(&w, x->item);
        if (!st) st = off >= 0 ? tt_table_u64(&w, (uint64_t)off + doc->raw_off)
                               : tt_table_cstr(&w, "n/a");
        if (!st) st = tt_table_u64(&w, words_of(doc->blocks, x->first, x->end));
        if (!st) st = tt_table_cstr(&w, x->how);
        if (!st) st = tt_table_end_row(&w);
    }
    if (!st && s.n == 0) {
        tt_table_writer w;
        st = tt_table_begin(&w, c->rows.format, out, cols, 7, 0);
        if (!st) st = tt_table_cstr(&w, doc->name);
        if (!st) st = tt_table_cstr(&w, "none");
        if (!st) st = tt_table_cstr(&w, "");
        if (!st) st = tt_table_cstr(&w, "");
        if (!st) st = tt_table_cstr(&w, "n/a");
        if (!st) st = tt_table_u64(&w, stats->words_read);
        if (!st) st = tt_table_cstr(&w, "no item headings, speaker turns or rule matches");
        if (!st) st = tt_table_end_row(&w);
    }
    tt_sections_release(&s);
    return st;
}

static tt_status on_document(void *ctx, const tt_doc_result *r)
{
    sec_ctx *c = ctx;
    tt_status st = tt_buf_append(&c->rows.buf, r->prepared, r->prepared_len);
    return st ? st : cli_flush(&c->rows.out, &c->rows.buf, &c->rows.err, 0);
}

int tt_cmd_sections(int argc, char **argv)
{
    sec_ctx c;
    memset(&c, 0, sizeof c);
    cli_pipeline_init(&c.pipe);
    c.rows.format = TT_FORMAT_TSV;
    tt_buf_init(&c.rows.buf, 0);
    tt_error_init(&c.rows.err);
    int opt, rc = TT_EXIT_TROUBLE, header = 1;
    const char *output = NULL;
    tt_source_list inputs;
    tt_source_list_init(&inputs);
    optind = 1;
    while ((opt = getopt_long(argc, argv, "f:o:j:qh", longopts, NULL)) != -1) {
        int handled = cli_pipeline_option(&c.pipe, opt, optarg);
        if (handled < 0)
            goto out;
        if (handled)
            continue;
        switch (opt) {
        case OPT_NAMES:
            for (const char *const *n = tt_section_names(); *n; n++)
                puts(*n);
            rc = TT_EXIT_OK;
            goto out;
        case OPT_NO_HEADER: header = 0; break;
        case 'f':
            if (!cli_parse_format(optarg, &c.rows.format))
                goto out;
            break;
        case 'o': output = optarg; break;
        case 'h': fputs(tt_help_sections, stdout); rc = TT_EXIT_OK; goto out;
        default: fprintf(stderr, "Try 'termtide help sections'.\n"); goto out;
        }
    }
    if (!cli_pipeline_sections(&c.pipe) ||
        !cli_expand_inputs(&inputs, argc - optind, argv + optind))
        goto out;
    c.rows.header = header;
    c.rows.output = output;
    c.rows.cols = cols;
    c.rows.ncols = 7;
    c.pipe.batch.analyse = analyse;
    c.pipe.batch.on_document = on_document;
    c.pipe.batch.ctx = &c;
    rc = cli_run_rows(&c.pipe, &c.rows, &inputs, NULL, NULL, "sections");
out:
    tt_buf_release(&c.rows.buf);
    tt_source_list_release(&inputs);
    cli_pipeline_release(&c.pipe);
    return rc;
}
