/* termtide tone — word-category counts per document: for every lexicon
 * category its weighted count and rate per 1,000 words, net tone, and how
 * many positive words a negator turned. */
#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "termtide/document.h"
#include "termtide/lexicon.h"
#include "termtide/meta.h"
#include "termtide/stats.h"
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
    "\n"
    "Periods (document metadata as for compare):\n"
    "  --manifest FILE, --layout PATTERN ROOT..., --headers ROOT...\n"
    "                        one row per entity and period (its documents together):\n"
    "                          entity period words CATEGORY ... negated\n"
    "  --entity NAME, --kinds LIST   which documents form each series\n"
    "  --consecutive         instead, per entity, each pair of consecutive periods and\n"
    "                        category: entity base target category base_per_1000\n"
    "                        target_per_1000 change_per_1000 z p_value direction; z is\n"
    "                        the pooled two-proportion z-test of the category's\n"
    "                        weighted count among the period's words (z squared is\n"
    "                        Pearson's chi-square on that 2x2 table), p two-sided\n"
    "  -f, --format tsv|csv|jsonl   -o, --output FILE   --no-header\n"
    "  --tables keep|drop   --doc-types LIST   -q, --quiet   (as for count)\n"
    "\n"
    "termtide measures language; it gives no investment, legal or compliance advice.\n";

enum { OPT_LEXICON = CLI_OPT_FIRST_FREE, OPT_CHECK, OPT_WINDOW, OPT_NEGATORS, OPT_TOTAL,
       OPT_NO_HEADER, OPT_MANIFEST, OPT_LAYOUT, OPT_HEADERS, OPT_HEADER_PERIOD, OPT_ENTITY,
       OPT_KINDS, OPT_CONSECUTIVE };

static const struct option longopts[] = {
    { "lexicon", required_argument, NULL, OPT_LEXICON },
    { "check", no_argument, NULL, OPT_CHECK },
    { "window", required_argument, NULL, OPT_WINDOW },
    { "negators", required_argument, NULL, OPT_NEGATORS },
    { "total", no_argument, NULL, OPT_TOTAL },
    { "manifest", required_argument, NULL, OPT_MANIFEST },
    { "layout", required_argument, NULL, OPT_LAYOUT },
    { "headers", no_argument, NULL, OPT_HEADERS },
    { "header-period", required_argument, NULL, OPT_HEADER_PERIOD },
    { "entity", required_argument, NULL, OPT_ENTITY },
    { "kinds", required_argument, NULL, OPT_KINDS },
    { "consecutive", no_argument, NULL, OPT_CONSECUTIVE },
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
    size_t lead;           /* leading label columns: 1 (document) or 2 */
    int grouping;          /* documents add to `all` only; rows per group */
} tone_ctx;

static tt_status write_row(tone_ctx *c, const char *name, const char *period,
                           const tt_tone_scores *s)
{
    tt_table_writer w;
    tt_status st = tt_table_begin(&w, c->format, &c->buf, c->cols, c->ncols, c->header);
    c->header = 0;
    double words = (double)s->words;
    if (!st) st = tt_table_cstr(&w, name);
    if (!st && period) st = tt_table_cstr(&w, period);
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
    return c->grouping ? TT_OK : write_row(c, doc->name, NULL, &c->doc);
}

/* Scores the documents of one path; a problem is reported and counted.
 * Returns 0 only on a write error (already printed). */
static int read_path(tone_ctx *c, tt_reader *reader, const char *path, const tt_read_options *ro)
{
    char msg[TT_ERROR_FILE_MAX + TT_ERROR_MSG_MAX + 64];
    tt_error err;
    tt_error_init(&err);
    tt_status st = tt_reader_read(reader, path, ro, on_doc, c, NULL, &err);
    if (st == TT_EIO && c->err.status) {
        cli_error("%s", tt_error_format(&c->err, msg, sizeof msg));
        return 0;
    }
    if (st) {
        cli_error("%s (skipped)", tt_error_format(&err, msg, sizeof msg));
        c->problems++;
    }
    return 1;
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
    int check = 0, opt, rc = TT_EXIT_TROUBLE, out_open = 0, headers = 0, consecutive = 0;
    const char *manifest_path = NULL, *layout = NULL;
    tt_period_granularity header_period = TT_PERIOD_QUARTER;
    tt_series_options sopt;
    tt_series_options_init(&sopt);
    tt_manifest m;
    tt_manifest_init(&m);
    tt_series series;
    tt_series_init(&series);
    tt_tone_scores prev;
    memset(&prev, 0, sizeof prev);
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
        case OPT_MANIFEST: manifest_path = optarg; break;
        case OPT_LAYOUT: layout = optarg; break;
        case OPT_HEADERS: headers = 1; break;
        case OPT_HEADER_PERIOD:
            if (!cli_header_period(optarg, &header_period))
                goto out;
            break;
        case OPT_ENTITY: sopt.entity = optarg; break;
        case OPT_KINDS: sopt.kinds = optarg; break;
        case OPT_CONSECUTIVE: consecutive = 1; break;
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
    int metadata = manifest_path || layout || headers;
    if ((manifest_path != NULL) + (layout != NULL) + headers > 1) {
        cli_error("give one of --manifest, --layout and --headers");
        goto out;
    }
    if ((consecutive || sopt.entity || sopt.kinds) && !metadata) {
        cli_error("--consecutive, --entity and --kinds need document metadata: --manifest FILE, "
                  "--layout PATTERN ROOT or --headers ROOT");
        goto out;
    }
    if (manifest_path && optind < argc) {
        cli_error("unexpected argument '%s' (with --manifest the documents are its rows)",
                  argv[optind]);
        goto out;
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
    size_t lead = metadata ? 2 : 1;
    c.ncols = lead + 1 + 2 * ncat + 3;
    c.cols = calloc(c.ncols, sizeof *c.cols);
    if (!c.cols)
        goto oom;
    c.lead = lead;
    c.cols[0] = metadata ? "entity" : "document";
    if (metadata)
        c.cols[1] = "period";
    c.cols[lead] = "words";
    for (size_t k = 0; k < ncat; k++) {
        const char *name = tt_lexicon_category_name(lex, k);
        char *per = malloc(strlen(name) + 10);
        if (!per)
            goto oom;
        memcpy(per, name, strlen(name));
        memcpy(per + strlen(name), "_per_1000", 10);
        c.cols[lead + 1 + 2 * k] = name;
        c.cols[lead + 2 + 2 * k] = per;
    }
    c.cols[c.ncols - 3] = "net_tone";
    c.cols[c.ncols - 2] = "net_per_1000";
    c.cols[c.ncols - 1] = "negated";
    c.lex = lex;
    if (metadata) {
        if (manifest_path ? !cli_load_manifest(&m, manifest_path)
            : headers ? !cli_load_headers(&m, header_period, argc - optind, argv + optind,
                                          &c.problems)
                      : !cli_load_layout(&m, layout, argc - optind, argv + optind))
            goto out;
        if (tt_series_build(&series, m.docs, m.n, &sopt, &err)) {
            cli_error("%s (choose document kinds with --kinds)", err.message);
            goto out;
        }
    } else if (!cli_expand_inputs(&inputs, argc - optind, argv + optind)) {
        goto out;
    }
    if (tt_outfile_open(&c.out, output, &c.err)) {
        cli_error("%s", tt_error_format(&c.err, msg, sizeof msg));
        goto out;
    }
    out_open = 1;
    if (!metadata) {
        for (size_t i = 0; i < inputs.n; i++) {
            if (inputs.items[i].status != TT_OK) {
                cli_error("%s: %s (skipped)", inputs.items[i].path,
                          inputs.items[i].message ? inputs.items[i].message : "cannot be read");
                c.problems++;
                continue;
            }
            if (!read_path(&c, reader, inputs.items[i].path, &ro))
                goto out;
        }
    } else {
        static const char *const pair_cols[] = { "entity", "base", "target", "category",
                                                 "base_per_1000", "target_per_1000",
                                                 "change_per_1000", "z", "p_value",
                                                 "direction" };
        c.grouping = 1;
        if (tt_tone_scores_init(&prev, lex))
            goto oom;
        for (size_t g = 0; g < series.n_groups; g++) {
            const tt_series_group *grp = &series.groups[g];
            char period[TT_PERIOD_TEXT_MAX];
            tt_period_format(&grp->period, period, sizeof period);
            tt_tone_scores_reset(&c.all);
            for (size_t d = 0; d < grp->n_docs; d++)
                if (!read_path(&c, reader, m.docs[series.members[grp->first + d]].path, &ro))
                    goto out;
            if (!consecutive) {
                if (write_row(&c, grp->entity, period, &c.all))
                    goto write_fail;
                continue;
            }
            int same_entity = g > 0 && !strcmp(series.groups[g - 1].entity, grp->entity);
            if (same_entity) {
                char base[TT_PERIOD_TEXT_MAX];
                tt_period_format(&series.groups[g - 1].period, base, sizeof base);
                for (size_t k = 0; k < ncat; k++) {
                    tt_table_writer w;
                    double z, pv;
                    double r1 = prev.words ? 1000.0 * prev.weight[k] / (double)prev.words : NAN;
                    double r2 = c.all.words ? 1000.0 * c.all.weight[k] / (double)c.all.words : NAN;
                    tt_two_proportion_z(prev.weight[k], (double)prev.words, c.all.weight[k],
                                        (double)c.all.words, &z, &pv);
                    tt_status st = tt_table_begin(&w, c.format, &c.buf, pair_cols, 10, c.header);
                    c.header = 0;
                    if (!st) st = tt_table_cstr(&w, grp->entity);
                    if (!st) st = tt_table_cstr(&w, base);
                    if (!st) st = tt_table_cstr(&w, period);
                    if (!st) st = tt_table_cstr(&w, tt_lexicon_category_name(lex, k));
                    if (!st) st = tt_table_fixed(&w, r1, 3);
                    if (!st) st = tt_table_fixed(&w, r2, 3);
                    if (!st) st = tt_table_fixed(&w, r2 - r1, 3);
                    if (!st) st = tt_table_fixed(&w, z, 3);
                    if (!st) st = tt_table_sci(&w, pv, 4);
                    if (!st)
                        st = tt_table_cstr(&w, r2 > r1 ? "rise" : r2 < r1 ? "fall" : "same");
                    if (!st) st = tt_table_end_row(&w);
                    if (st)
                        goto write_fail;
                }
            }
            /* keep this period as the next pair's base */
            prev.words = c.all.words;
            prev.negated = c.all.negated;
            for (size_t k = 0; k < ncat; k++) {
                prev.weight[k] = c.all.weight[k];
                prev.matches[k] = c.all.matches[k];
            }
        }
    }
    if (c.total && !metadata && write_row(&c, "*", NULL, &c.all))
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
        for (size_t k = 0; c.lead + 2 + 2 * k < c.ncols - 3; k++)
            free((char *)c.cols[c.lead + 2 + 2 * k]);
    free(c.cols);
    free(negators);
    tt_reader_free(reader);
    tt_tone_scores_release(&prev);
    tt_series_release(&series);
    tt_manifest_release(&m);
    tt_tone_scores_release(&c.doc);
    tt_tone_scores_release(&c.all);
    tt_tone_free(c.tone);
    tt_lexicon_free(lex);
    tt_source_list_release(&inputs);
    tt_buf_release(&c.buf);
    return rc;
}
