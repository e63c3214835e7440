/* termtide tone — word-category counts per document: for every lexicon
 * category its weighted count and rate per 1,000 words, net tone, and how
 * many positive words a negator turned. */
#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "termtide/document.h"
#include "termtide/lexicon.h"
#include "termtide/tone.h"
#include "cli.h"

const char tt_help_tone[] =
    "Usage: termtide tone [OPTIONS] [PATH...]\n"
    "\n"
    "Counts each document's words by lexicon category (negative, positive, hedging,\n"
    "legal, constraint with the shipped lexicon) and prints one row per document:\n"
    "  document words CATEGORY CATEGORY_per_1000 ... net_tone net_per_1000 negated\n"
    "CATEGORY is the sum of the weights of the matched entries; per_1000 divides it\n"
    "by the document's words (word tokens; numbers are not words) and multiplies\n"
    "by 1,000. net_tone = (positive - negative) / (positive + negative), n/a when\n"
    "both are 0; net_per_1000 = (positive - negative) per 1,000 words.\n"
    "\n"
    "Negation: a positive entry preceded within --window words (default 3) of the\n"
    "same sentence by a negator (no, not, none, neither, never, nobody) counts as\n"
    "negative; negated counts them. Loughran & McDonald (2011) treat such a word\n"
    "as not positive; counting it as negative is a common variant.\n"
    "\n"
    "Options:\n"
    "  --lexicon FILE        a lexicon of your own (term<TAB>category[<TAB>weight]\n"
    "                        lines; see lexicons/finance.txt); default: the shipped\n"
    "                        finance lexicon\n"
    "  --check               list the lexicon's terms that stand under two categories\n"
    "                        (they count in both) and exit\n"
    "  --window N            negation window in words (0 turns negation off)\n"
    "  --negators LIST       comma-separated negators instead of the six above\n"
    "  --total               add a row for all documents together ('*')\n"
    "  -f, --format tsv|csv|jsonl   -o, --output FILE   --no-header\n"
    "  --tables keep|drop   --doc-types LIST   -q, --quiet   (as for count)\n"
    "\n"
    "termtide measures language; it gives no investment, legal or compliance advice.\n";

enum { OPT_LEXICON = CLI_OPT_FIRST_FREE, OPT_CHECK, OPT_WINDOW, OPT_NEGATORS, OPT_TOTAL,
       OPT_NO_HEADER };

static const struct option longopts[] = {
    { "lexicon", required_argument, NULL, OPT_LEXICON },
    { "check", no_argument, NULL, OPT_CHECK },
    { "window", required_argument, NULL, OPT_WINDOW },
    { "negators", required_argument, NULL, OPT_NEGATORS },
    { "total", no_argument, NULL, OPT_TOTAL },
    { "format", required_argument, NULL, 'f' },
    { "output", required_argument, NULL, 'o' },
    { "no-header", no_argument, NULL, OPT_NO_HEADER },
    { "help", no_argument, NULL, 'h' },
    { "tables", required_argument, NULL, CLI_OPT_TABLES },
    { "doc-types", required_argument, NULL, CLI_OPT_DOC_TYPES },
    { "quiet", no_argument, NULL, 'q' },
    { NULL, 0, NULL, 0 }
};

typedef struct tone_ctx {
    tt_tone *tone;
    const tt_lexicon *lex;
    tt_tone_scores doc, all;
    long pos, neg;
    tt_format format;
    int header;
    const char **cols;
    size_t ncols;
    tt_buf buf;
    tt_outfile out;
    tt_error err;
    size_t documents, problems;
    int quiet, total;
} tone_ctx;

static tt_status write_row(tone_ctx *c, const char *name, const tt_tone_scores *s)
{
    tt_table_writer w;
    tt_status st = tt_table_begin(&w, c->format, &c->buf, c->cols, c->ncols, c->header);
    c->header = 0;
    double words = (double)s->words;
    if (!st) st = tt_table_cstr(&w, name);
    if (!st) st = tt_table_u64(&w, s->words);
    for (size_t k = 0; k < s->n_categories && !st; k++) {
        st = tt_table_fixed(&w, s->weight[k], 1);
        if (!st) st = tt_table_fixed(&w, s->words ? 1000.0 * s->weight[k] / words : NAN, 3);
    }
    double p = c->pos >= 0 ? s->weight[c->pos] : NAN, n = c->neg >= 0 ? s->weight[c->neg] : NAN;
    if (!st) st = tt_table_fixed(&w, tt_tone_net(s, c->pos, c->neg), 4);
    if (!st) st = tt_table_fixed(&w, s->words ? 1000.0 * (p - n) / words : NAN, 3);
    if (!st) st = tt_table_u64(&w, s->negated);
    if (!st) st = tt_table_end_row(&w);
    return st ? st : cli_flush(&c->out, &c->buf, &c->err, 0);
}

static tt_status on_doc(void *vctx, const tt_document *doc)
{
    tone_ctx *c = vctx;
    tt_tone_scores_reset(&c->doc);
    tt_status st = tt_tone_score_blocks(c->tone, doc->blocks, &c->doc);
    if (st)
        return st;
    if (doc->notes && doc->notes[0] && !c->quiet)
        cli_note("%s: %s", doc->name, doc->notes);
    c->all.words += c->doc.words;
    c->all.negated += c->doc.negated;
    for (size_t k = 0; k < c->doc.n_categories; k++)
        c->all.weight[k] += c->doc.weight[k];
    c->documents++;
    return write_row(c, doc->name, &c->doc);
}

int tt_cmd_tone(int argc, char **argv)
{
    tone_ctx c;
    memset(&c, 0, sizeof c);
    c.format = TT_FORMAT_TSV;
    c.header = 1;
    tt_buf_init(&c.buf, 0);
    tt_error_init(&c.err);
    const char *lexicon_path = NULL, *output = NULL;
    char *negator_list = NULL;
    const char **negators = NULL;
    size_t n_negators = 0;
    uint64_t window = 3;
    int check = 0, opt, rc = TT_EXIT_TROUBLE, out_open = 0;
    tt_read_options ro = { 0, NULL };
    tt_lexicon *lex = NULL;
    tt_reader *reader = NULL;
    tt_source_list inputs;
    tt_source_list_init(&inputs);
    char msg[TT_ERROR_FILE_MAX + TT_ERROR_MSG_MAX + 64];

    optind = 1;
    while ((opt = getopt_long(argc, argv, "f:o:qh", longopts, NULL)) != -1) {
        switch (opt) {
        case OPT_LEXICON: lexicon_path = optarg; break;
        case OPT_CHECK: check = 1; break;
        case OPT_WINDOW:
            if (!cli_parse_u64("--window", optarg, 0, 100, &window))
                goto out;
            break;
        case OPT_NEGATORS: negator_list = optarg; break;
        case OPT_TOTAL: c.total = 1; break;
        case 'f':
            if (!cli_parse_format(optarg, &c.format))
                goto out;
            break;
        case 'o': output = optarg; break;
        case OPT_NO_HEADER: c.header = 0; break;
        case CLI_OPT_TABLES:
            if (strcmp(optarg, "keep") && strcmp(optarg, "drop")) {
                cli_error("--tables: expected keep or drop, got '%s'", optarg);
                goto out;
            }
            ro.drop_tables = !strcmp(optarg, "drop");
            break;
        case CLI_OPT_DOC_TYPES: ro.doc_types = optarg; break;
        case 'q': c.quiet = 1; break;
        case 'h': fputs(tt_help_tone, stdout); rc = TT_EXIT_OK; goto out;
        default: fprintf(stderr, "Try 'termtide help tone'.\n"); goto out;
        }
    }
    tt_error err;
    tt_error_init(&err);
    if (!(lex = tt_lexicon_new()))
        goto oom;
    if (lexicon_path) {
        if (tt_lexicon_load_file(lex, lexicon_path, &err)) {
            cli_error("%s", tt_error_format(&err, msg, sizeof msg));
            goto out;
        }
    } else {
        const char *text = tt_builtin_lexicon("finance");
        if (!text || tt_lexicon_load_text(lex, text, strlen(text), "finance", &err)) {
            cli_error("built-in lexicon: %s", tt_error_format(&err, msg, sizeof msg));
            goto out;
        }
    }
    if (check) {
        size_t pairs[256][2];
        size_t n = tt_lexicon_conflicts(lex, pairs, 256);
        for (size_t i = 0; i < n && i < 256; i++) {
            const tt_lexicon_entry *a = tt_lexicon_entry_at(lex, pairs[i][0]);
            const tt_lexicon_entry *b = tt_lexicon_entry_at(lex, pairs[i][1]);
            printf("%s: \"%s\" is %s (line %ld) and %s (line %ld)\n",
                   lexicon_path ? lexicon_path : "finance", a->term,
                   tt_lexicon_category_name(lex, a->category), a->line,
                   tt_lexicon_category_name(lex, b->category), b->line);
        }
        printf("%s: %zu entries, %zu categories, %zu terms under more than one category\n",
               lexicon_path ? lexicon_path : "finance", tt_lexicon_entry_count(lex),
               tt_lexicon_category_count(lex), n);
        rc = TT_EXIT_OK;
        goto out;
    }
    tt_tone_options to;
    tt_tone_options_init(&to, lex);
    to.window = (size_t)window;
    if (window == 0)
        to.positive = to.negative = -1;
    if (negator_list) {
        for (char *p = negator_list; *p;) {
            char *comma = strchr(p, ',');
            size_t n = comma ? (size_t)(comma - p) : strlen(p);
            const char **l = realloc(negators, (n_negators + 1) * sizeof *l);
            if (!l)
                goto oom;
            negators = l;
            if (comma)
                *comma = '\0';
            negators[n_negators++] = p;
            p += n + (comma ? 1 : 0);
        }
        to.negators = negators;
        to.n_negators = n_negators;
    }
    c.pos = tt_lexicon_category_find(lex, "positive", NULL);
    c.neg = tt_lexicon_category_find(lex, "negative", NULL);
    if (!(c.tone = tt_tone_new(&to)) || tt_tone_scores_init(&c.doc, lex) ||
        tt_tone_scores_init(&c.all, lex) || !(reader = tt_reader_new()))
        goto oom;
    size_t ncat = tt_lexicon_category_count(lex);
    c.ncols = 2 + 2 * ncat + 3;
    c.cols = calloc(c.ncols, sizeof *c.cols);
    if (!c.cols)
        goto oom;
    c.cols[0] = "document";
    c.cols[1] = "words";
    for (size_t k = 0; k < ncat; k++) {
        const char *name = tt_lexicon_category_name(lex, k);
        char *per = malloc(strlen(name) + 10);
        if (!per)
            goto oom;
        memcpy(per, name, strlen(name));
        memcpy(per + strlen(name), "_per_1000", 10);
        c.cols[2 + 2 * k] = name;
        c.cols[3 + 2 * k] = per;
    }
    c.cols[c.ncols - 3] = "net_tone";
    c.cols[c.ncols - 2] = "net_per_1000";
    c.cols[c.ncols - 1] = "negated";
    c.lex = lex;
    if (!cli_expand_inputs(&inputs, argc - optind, argv + optind))
        goto out;
    if (tt_outfile_open(&c.out, output, &c.err)) {
        cli_error("%s", tt_error_format(&c.err, msg, sizeof msg));
        goto out;
    }
    out_open = 1;
    for (size_t i = 0; i < inputs.n; i++) {
        if (inputs.items[i].status != TT_OK) {
            cli_error("%s: %s (skipped)", inputs.items[i].path,
                      inputs.items[i].message ? inputs.items[i].message : "cannot be read");
            c.problems++;
            continue;
        }
        tt_error_init(&err);
        tt_status st = tt_reader_read(reader, inputs.items[i].path, &ro, on_doc, &c, NULL, &err);
        if (st == TT_EIO && c.err.status) {
            cli_error("%s", tt_error_format(&c.err, msg, sizeof msg));
            goto out;
        }
        if (st) {
            cli_error("%s (skipped)", tt_error_format(&err, msg, sizeof msg));
            c.problems++;
        }
    }
    if (c.total && write_row(&c, "*", &c.all))
        goto write_fail;
    if (cli_flush(&c.out, &c.buf, &c.err, 1) || tt_outfile_commit(&c.out, &c.err))
        goto write_fail;
    out_open = 0;
    if (!c.quiet)
        fprintf(stderr, "%s tone: %zu document%s scored, %zu skipped, lexicon %s %s\n", tt_prog,
                c.documents, c.documents == 1 ? "" : "s", c.problems, tt_lexicon_name(lex),
                tt_lexicon_version(lex));
    rc = c.problems ? TT_EXIT_TROUBLE : TT_EXIT_OK;
    goto out;
write_fail:
    cli_error("%s", tt_error_format(&c.err, msg, sizeof msg));
    goto out;
oom:
    cli_error("out of memory");
out:
    if (out_open)
        tt_outfile_abort(&c.out);
    if (c.cols)
        for (size_t k = 0; 3 + 2 * k < c.ncols - 3; k++)
            free((char *)c.cols[3 + 2 * k]);
    free(c.cols);
    free(negators);
    tt_reader_free(reader);
    tt_tone_scores_release(&c.doc);
    tt_tone_scores_release(&c.all);
    tt_tone_free(c.tone);
    tt_lexicon_free(lex);
    tt_source_list_release(&inputs);
    tt_buf_release(&c.buf);
    return rc;
}
