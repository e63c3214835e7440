/* termtide readability — how hard each document's prose is to read: Gunning
 * Fog, Flesch reading ease and Flesch–Kincaid grade, with the counts behind
 * them. */
#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "termtide/readability.h"
#include "cli.h"

const char tt_help_readability[] =
    "Usage: termtide readability [OPTIONS] [PATH...]\n"
    "\n"
    "One row per document:\n"
    "  document sentences words syllables complex_words words_per_sentence\n"
    "  syllables_per_word complex_share fog flesch_reading_ease flesch_kincaid_grade\n"
    "fog = 0.4 x (words per sentence + 100 x complex share) (Gunning 1952);\n"
    "flesch_reading_ease = 206.835 - 1.015 x words per sentence - 84.6 x syllables per\n"
    "word (Flesch 1948); flesch_kincaid_grade = 0.39 x words per sentence + 11.8 x\n"
    "syllables per word - 15.59 (Kincaid et al. 1975).\n"
    "\n"
    "What counts: paragraphs and list items (headings and table cells are left out);\n"
    "words are word tokens (numbers are not words); sentences end as for every\n"
    "command (after No., U.S., approx., e.g. and the like a sentence goes on);\n"
    "syllables by a rule: groups of vowels, with the usual silent endings (-e, -es,\n"
    "-ed) and the vowel pairs spoken apart (-ia-, -io-, -ua-, -iu-), not a\n"
    "dictionary, so a few words come out one off; complex words have three syllables\n"
    "or more, hyphenated compounds and capitalised words inside a sentence (names)\n"
    "left out, as Gunning does.\n"
    "\n"
    "Options:\n"
    "  --total               add a row for all documents together ('*')\n"
    "  -f, --format tsv|csv|jsonl   -o, --output FILE   --no-header\n"
    "  -j, --jobs N   --tables keep|drop   --doc-types LIST   -q, --quiet   (as for count)\n"
    "  --section NAME, --section-rules FILE   only these sections (as for count)\n"
    "\n"
    "termtide measures language; it gives no investment, legal or compliance advice.\n";

enum { OPT_TOTAL = CLI_OPT_FIRST_FREE, OPT_NO_HEADER };

static const struct option longopts[] = {
    { "total", no_argument, NULL, OPT_TOTAL },
    { "format", required_argument, NULL, 'f' },
    { "output", required_argument, NULL, 'o' },
    { "no-header", no_argument, NULL, OPT_NO_HEADER },
    { "help", no_argument, NULL, 'h' },
    { "tables", required_argument, NULL, CLI_OPT_TABLES },
    { "doc-types", required_argument, NULL, CLI_OPT_DOC_TYPES },
    { "jobs", required_argument, NULL, 'j' },
    { "section", required_argument, NULL, CLI_OPT_SECTION },
    { "section-rules", required_argument, NULL, CLI_OPT_SECTION_RULES },
    { "quiet", no_argument, NULL, 'q' },
    { NULL, 0, NULL, 0 }
};

static const char *const cols[] = { "document", "sentences", "words", "syllables",
                                    "complex_words", "words_per_sentence", "syllables_per_word",
                                    "complex_share", "fog", "flesch_reading_ease",
                                    "flesch_kincaid_grade" };

typedef struct read_ctx {
    cli_pipeline pipe; /* first: the pipeline hooks use the batch ctx as this */
    cli_rows rows;
    tt_readability all;
    int total;         /* --total: a row for all documents after the run */
} read_ctx;

/* In a worker: the document's counts, as four numbers. */
static tt_status analyse(void *ctx, void *state, const tt_document *doc, tt_buf *out,
                         tt_doc_stats *stats)
{
    (void)ctx;
    (void)state;
    tt_readability r;
    memset(&r, 0, sizeof r);
    tt_readability_add(&r, doc->blocks);
    stats->words_read = r.words;
    return tt_buf_append(out, (const char *)&r, sizeof r);
}

static tt_status row(read_ctx *c, const char *name, const tt_readability *r)
{
    tt_readability_scores s;
    tt_readability_scores_of(r, &s);
    tt_table_writer w;
    tt_status st = tt_table_begin(&w, c->rows.format, &c->rows.buf, cols, 11, 0);
    if (!st) st = tt_table_cstr(&w, name);
    if (!st) st = tt_table_u64(&w, r->sentences);
    if (!st) st = tt_table_u64(&w, r->words);
    if (!st) st = tt_table_u64(&w, r->syllables);
    if (!st) st = tt_table_u64(&w, r->complex_words);
    if (!st) st = tt_table_fixed(&w, s.words_per_sentence, 2);
    if (!st) st = tt_table_fixed(&w, s.syllables_per_word, 3);
    if (!st) st = tt_table_fixed(&w, s.complex_share, 4);
    if (!st) st = tt_table_fixed(&w, s.fog, 2);
    if (!st) st = tt_table_fixed(&w, s.flesch, 2);
    if (!st) st = tt_table_fixed(&w, s.flesch_kincaid, 2);
    if (!st) st = tt_table_end_row(&w);
    return st ? st : cli_flush(&c->rows.out, &c->rows.buf, &c->rows.err, 0);
}

static tt_status on_document(void *ctx, const tt_doc_result *r)
{
    read_ctx *c = ctx;
    tt_readability d;
    if (r->prepared_len != sizeof d)
        return TT_EINVAL;
    memcpy(&d, r->prepared, sizeof d);
    c->all.sentences += d.sentences;
    c->all.words += d.words;
    c->all.syllables += d.syllables;
    c->all.complex_words += d.complex_words;
    return row(c, r->name, &d);
}

/* After the run: the row for all documents, with --total. */
static tt_status total_row(void *ctx)
{
    read_ctx *c = ctx;
    return c->total ? row(c, "*", &c->all) : TT_OK;
}

int tt_cmd_readability(int argc, char **argv)
{
    read_ctx c;
    memset(&c, 0, sizeof c);
    cli_pipeline_init(&c.pipe);
    c.rows.format = TT_FORMAT_TSV;
    tt_buf_init(&c.rows.buf, 0);
    tt_error_init(&c.rows.err);
    int opt, rc = TT_EXIT_TROUBLE, total = 0, header = 1;
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
        case OPT_TOTAL: total = 1; break;
        case OPT_NO_HEADER: header = 0; break;
        case 'f':
            if (!cli_parse_format(optarg, &c.rows.format))
                goto out;
            break;
        case 'o': output = optarg; break;
        case 'h': fputs(tt_help_readability, stdout); rc = TT_EXIT_OK; goto out;
        default: fprintf(stderr, "Try 'termtide help readability'.\n"); goto out;
        }
    }
    if (!cli_pipeline_sections(&c.pipe))
        goto out;
    if (!cli_expand_inputs(&inputs, argc - optind, argv + optind))
        goto out;
    c.rows.header = header;
    c.rows.output = output;
    c.rows.cols = cols;
    c.rows.ncols = 11;
    c.total = total;
    c.pipe.batch.analyse = analyse;
    c.pipe.batch.on_document = on_document;
    c.pipe.batch.ctx = &c;
    rc = cli_run_rows(&c.pipe, &c.rows, &inputs, total_row, &c, "readability");
out:
    tt_buf_release(&c.rows.buf);
    tt_source_list_release(&inputs);
    cli_pipeline_release(&c.pipe);
    return rc;
}
