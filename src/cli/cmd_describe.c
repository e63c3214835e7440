/* termtide describe — is this document's (or period's) rate of a term
 * unusual: the distribution of chosen terms' rates per 10,000 words over a
 * set of documents, a period, or an entity's history, where the latest sits
 * against the earlier ones, and the terms' correlation. The statistics are
 * the library's (describe.h, stats.h); this file parses, selects documents,
 * streams them and prints. */
#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "termtide/alloc.h"
#include "termtide/describe.h"
#include "termtide/meta.h"
#include "cli.h"

/* Declared here as well as in cli.h, so this file builds on its own. */
int tt_cmd_describe(int argc, char **argv);
extern const char tt_help_describe[];

const char tt_help_describe[] =
    "Usage: termtide describe [OPTIONS] --term WORD PATH...\n"
    "       termtide describe [OPTIONS] --term WORD --manifest FILE --entity NAME\n"
    "       termtide describe [OPTIONS] --term WORD --manifest FILE --period PERIOD\n"
    "       termtide describe [OPTIONS] --term WORD --layout PATTERN ROOT... --entity NAME\n"
    "\n"
    "Describes how a term's rate per 10,000 words is distributed over documents\n"
    "(or periods), and where the latest one sits against the earlier ones: is\n"
    "this quarter's rate unusual for this company, or for its peers?\n"
    "\n"
    "Terms:\n"
    "  --term WORD           a term (repeatable), normalized like counted terms with\n"
    "                        the same reading options (case, --stem); a term of\n"
    "                        several words needs --ngram (e.g. --ngram 1-2)\n"
    "\n"
    "Documents:\n"
    "  PATH...               files and directories: the set, in the order given (the\n"
    "                        last document read is the latest)\n"
    "  --manifest FILE       metadata: a CSV or TSV with columns path, entity, period,\n"
    "                        kind (paths relative to the manifest)\n"
    "  --headers             metadata from each submission wrapper's own header under\n"
    "                        the ROOT paths (entity, period of report as a quarter or\n"
    "                        --header-period year|month|day, submission type as kind)\n"
    "  --layout PATTERN      metadata from where files sit under the ROOT directories,\n"
    "                        e.g. '{entity}/{period}-{kind}.*'\n"
    "  --period P            only documents of period P: 2025, 2025-Q3, 2025-09,\n"
    "                        2025-09-30, FY2025, FY2025-Q3 (peers side by side)\n"
    "  --entity NAME         only this entity: its history\n"
    "  --until P             only periods up to and including P\n"
    "  --kinds LIST          only these document kinds, e.g. call-transcript\n"
    "  --by-period           one value per period (the pooled rate of its documents)\n"
    "                        instead of one per document\n"
    "                        With metadata, documents are taken in period order (then\n"
    "                        entity, then manifest order); the last is the latest.\n"
    "\n"
    "Output:\n"
    "  --show stats|long|correlation\n"
    "                        stats (default): one row per term with the columns\n"
    "                          term n no_words count words mean median mode\n"
    "                          trimmed_mean winsorized_mean min max range q1 q3 iqr\n"
    "                          p<P>... mean_abs_dev var_sample var_population\n"
    "                          sd_sample sd_population cv skewness excess_kurtosis\n"
    "                          latest latest_rate earlier latest_percentile_rank\n"
    "                          latest_z\n"
    "                        long: the same as rows of term, statistic, value\n"
    "                        correlation: the Pearson correlation matrix of the\n"
    "                          terms' rate series (two or more --term)\n"
    "  --trim PERCENT        the TOTAL percent cut for the trimmed and winsorized\n"
    "                        means (default 10: 5% from each tail)\n"
    "  --percentiles LIST    percentiles to add, comma-separated (default 5,95)\n"
    "  --decimals N          digits after the point (default 4)\n"
    "  -f, --format tsv|csv|jsonl   -o, --output FILE   --no-header\n"
    "\n"
    CLI_PIPELINE_HELP
    "\n"
    "Statistics, over the rates of the units (documents, or periods) that have words\n"
    "(words: terms counted after stop-words and filters; a unit without words has no\n"
    "rate, is left out and counted in no_words):\n"
    "  rate            10,000 x count / words\n"
    "  mode            the value occurring most often, more than once; n/a otherwise\n"
    "  trimmed_mean    mean after dropping floor(n x PERCENT/200) values from each end\n"
    "  winsorized_mean the same values set to the nearest kept value instead\n"
    "  q1, q3, p<P>    percentiles at the position (n+1) x P/100 of the sorted rates,\n"
    "                  linear interpolation between neighbours, clamped to min and\n"
    "                  max (Hyndman & Fan 1996 type 6; common practice)\n"
    "  mean_abs_dev    mean absolute deviation around the mean\n"
    "  var_sample      divides by n-1; var_population by n; sd_ their square roots\n"
    "  cv              sd_sample / mean\n"
    "  skewness        adjusted Fisher-Pearson G1 = g1 x sqrt(n(n-1))/(n-2), the\n"
    "                  bias-corrected estimator (as SciPy's skew(bias=False))\n"
    "  excess_kurtosis bias-corrected G2 = ((n+1) g2 + 6)(n-1)/((n-2)(n-3)), 0 for a\n"
    "                  normal distribution (as SciPy's kurtosis(fisher=True,\n"
    "                  bias=False)); g1, g2 the moment ratios m3/m2^1.5, m4/m2^2 - 3\n"
    "  latest_percentile_rank\n"
    "                  the share of the earlier units below the latest's rate, plus\n"
    "                  half the share equal to it, x 100\n"
    "  latest_z        (latest rate - mean of the earlier) / their sample sd\n"
    "  correlation     Pearson's r of two terms' rates over the same units\n"
    "Values that the data cannot give (the sd of one value, cv with mean 0) are\n"
    "written n/a (null in JSON Lines).\n"
    "\n"
    "termtide measures language; it gives no investment, legal or compliance advice.\n";

typedef enum { SHOW_STATS, SHOW_LONG, SHOW_CORRELATION } show_kind;

typedef struct describe_ctx {
    cli_pipeline pipe; /* first: the pipeline hooks use the batch ctx as this */
    tt_describe_data data;
    /* with metadata: the selected documents, in period order */
    const tt_doc_meta **docs;
    size_t n_docs;
    int by_period;
    tt_error err;
} describe_ctx;

/* The unit a document goes to: with --by-period a new unit starts when the
 * period changes (documents arrive in period order). */
static tt_status on_document(void *vctx, const tt_doc_result *r)
{
    describe_ctx *c = vctx;
    tt_status st = TT_OK;
    if (c->by_period && c->docs) {
        const tt_doc_meta *m = c->docs[r->input];
        char label[TT_PERIOD_TEXT_MAX];
        tt_period_format(&m->period, label, sizeof label);
        size_t n = c->data.n_units;
        if (n == 0 || strcmp(c->data.labels[n - 1], label))
            st = tt_describe_begin_unit(&c->data, label, &c->err);
    } else {
        st = tt_describe_begin_unit(&c->data, r->name, &c->err);
    }
    return st ? st : tt_describe_add_table(&c->data, r->table, &c->err);
}

/* ---- output ----------------------------------------------------------------- */

typedef enum { CELL_STR, CELL_U64, CELL_NUM } cell_kind;
typedef struct cell {
    const char *name;
    cell_kind kind;
    const char *s;
    uint64_t u;
    double v;
} cell;

enum { MAX_CELLS = 40 + TT_DESCRIBE_MAX_PERCENTILES };

static char pct_names[TT_DESCRIBE_MAX_PERCENTILES][32];

static size_t build_cells(const describe_ctx *c, size_t t, const tt_describe_result *r,
                          cell *out)
{
    const tt_summary *s = &r->summary;
    size_t k = 0;
#define STR(n, x) out[k++] = (cell){ n, CELL_STR, x, 0, 0 }
#define U64(n, x) out[k++] = (cell){ n, CELL_U64, NULL, x, 0 }
#define NUM(n, x) out[k++] = (cell){ n, CELL_NUM, NULL, 0, x }
    STR("term", c->data.terms[t]);
    U64("n", s->n);
    U64("no_words", tt_describe_empty_units(&c->data));
    U64("count", r->total_count);
    U64("words", r->total_words);
    NUM("mean", s->mean);
    NUM("median", s->median);
    NUM("mode", s->has_mode ? s->mode : NAN);
    NUM("trimmed_mean", s->trimmed_mean);
    NUM("winsorized_mean", s->winsorized_mean);
    NUM("min", s->min);
    NUM("max", s->max);
    NUM("range", s->range);
    NUM("q1", s->q1);
    NUM("q3", s->q3);
    NUM("iqr", s->iqr);
    for (size_t i = 0; i < r->n_percentiles; i++)
        NUM(pct_names[i], r->percentiles[i]);
    NUM("mean_abs_dev", s->mean_abs_dev);
    NUM("var_sample", s->var_sample);
    NUM("var_population", s->var_population);
    NUM("sd_sample", s->sd_sample);
    NUM("sd_population", s->sd_population);
    NUM("cv", s->cv);
    NUM("skewness", s->skewness);
    NUM("excess_kurtosis", s->excess_kurtosis);
    STR("latest", s->n ? c->data.labels[r->latest_unit] : "");
    NUM("latest_rate", r->latest_rate);
    U64("earlier", r->n_earlier);
    NUM("latest_percentile_rank", r->latest_percentile_rank);
    NUM("latest_z", r->latest_z);
#undef STR
#undef U64
#undef NUM
    return k;
}

/* A number, or n/a for NaN (JSON Lines: null). */
static tt_status write_num(tt_table_writer *w, double v, int decimals)
{
    if (isnan(v) && w->format != TT_FORMAT_JSONL)
        return tt_table_cstr(w, "n/a");
    return tt_table_fixed(w, v, decimals);
}

static tt_status write_cell(tt_table_writer *w, const cell *x, int decimals)
{
    switch (x->kind) {
    case CELL_STR: return tt_table_cstr(w, x->s);
    case CELL_U64: return tt_table_u64(w, x->u);
    default: return write_num(w, x->v, decimals);
    }
}

static const char *const long_cols[] = { "term", "statistic", "value" };

static tt_status write_stats(describe_ctx *c, show_kind show, tt_format format, int header,
                             int decimals, double trim, const double *pcts, size_t n_pcts,
                             tt_buf *buf)
{
    static cell cells[MAX_CELLS];
    static const char *names[MAX_CELLS];
    tt_table_writer w;
    tt_status st = TT_OK;
    for (size_t t = 0; t < c->data.n_terms && !st; t++) {
        tt_describe_result r;
        st = tt_describe_term(&c->data, t, trim, pcts, n_pcts, &r, &c->err);
        if (st)
            break;
        size_t k = build_cells(c, t, &r, cells);
        if (show == SHOW_STATS) {
            if (t == 0) {
                for (size_t i = 0; i < k; i++)
                    names[i] = cells[i].name;
                st = tt_table_begin(&w, format, buf, names, k, header);
            }
            for (size_t i = 0; i < k && !st; i++)
                st = write_cell(&w, &cells[i], decimals);
            if (!st) st = tt_table_end_row(&w);
        } else {
            if (t == 0)
                st = tt_table_begin(&w, format, buf, long_cols, 3, header);
            for (size_t i = 1; i < k && !st; i++) {
                st = tt_table_cstr(&w, c->data.terms[t]);
                if (!st) st = tt_table_cstr(&w, cells[i].name);
                if (!st) st = write_cell(&w, &cells[i], decimals);
                if (!st) st = tt_table_end_row(&w);
            }
        }
    }
    return st;
}

static tt_status write_correlation(describe_ctx *c, tt_format format, int header, int decimals,
                                   tt_buf *buf)
{
    size_t k = c->data.n_terms;
    double *m = tt_reallocarray(NULL, k * k, sizeof *m);
    const char **cols = tt_reallocarray(NULL, k + 1, sizeof *cols);
    tt_status st = TT_ENOMEM;
    if (m && cols) {
        st = tt_describe_correlation(&c->data, m, &c->err);
        cols[0] = "term";
        for (size_t i = 0; i < k; i++)
            cols[i + 1] = c->data.terms[i];
        tt_table_writer w;
        if (!st) st = tt_table_begin(&w, format, buf, cols, k + 1, header);
        for (size_t i = 0; i < k && !st; i++) {
            st = tt_table_cstr(&w, c->data.terms[i]);
            for (size_t j = 0; j < k && !st; j++)
                st = write_num(&w, m[i * k + j], decimals);
            if (!st) st = tt_table_end_row(&w);
        }
    }
    tt_free(m);
    tt_free((void *)cols);
    return st;
}

/* ---- selecting documents ------------------------------------------------------ */


/* Period order, then entity, then manifest order: the last is the latest. */
static int by_period_order(const void *pa, const void *pb)
{
    const tt_doc_meta *a = *(const tt_doc_meta *const *)pa;
    const tt_doc_meta *b = *(const tt_doc_meta *const *)pb;
    int k = tt_period_compare(&a->period, &b->period);
    if (k)
        return k;
    k = strcmp(a->entity, b->entity);
    if (k)
        return k;
    return a < b ? -1 : a > b;
}

static int parse_period(const char *opt, const char *arg, tt_period *out)
{
    tt_error err;
    tt_error_init(&err);
    if (tt_period_parse(arg, strlen(arg), out, &err)) {
        cli_error("%s: %s", opt, err.message);
        return 0;
    }
    return 1;
}

enum { OPT_TERM = CLI_OPT_FIRST_FREE, OPT_MANIFEST, OPT_LAYOUT, OPT_HEADERS, OPT_HEADER_PERIOD, OPT_PERIOD, OPT_ENTITY,
       OPT_UNTIL, OPT_KINDS, OPT_BY_PERIOD, OPT_SHOW, OPT_TRIM, OPT_PERCENTILES, OPT_DECIMALS,
       OPT_NO_HEADER };

static const struct option longopts[] = {
    { "term", required_argument, NULL, OPT_TERM },
    { "manifest", required_argument, NULL, OPT_MANIFEST },
    { "layout", required_argument, NULL, OPT_LAYOUT },
    { "headers", no_argument, NULL, OPT_HEADERS },
    { "header-period", required_argument, NULL, OPT_HEADER_PERIOD },
    { "period", required_argument, NULL, OPT_PERIOD },
    { "entity", required_argument, NULL, OPT_ENTITY },
    { "until", required_argument, NULL, OPT_UNTIL },
    { "kinds", required_argument, NULL, OPT_KINDS },
    { "by-period", no_argument, NULL, OPT_BY_PERIOD },
    { "show", required_argument, NULL, OPT_SHOW },
    { "trim", required_argument, NULL, OPT_TRIM },
    { "percentiles", required_argument, NULL, OPT_PERCENTILES },
    { "decimals", required_argument, NULL, OPT_DECIMALS },
    { "format", required_argument, NULL, 'f' },
    { "output", required_argument, NULL, 'o' },
    { "no-header", no_argument, NULL, OPT_NO_HEADER },
    { "help", no_argument, NULL, 'h' },
    CLI_PIPELINE_LONGOPTS,
    { NULL, 0, NULL, 0 }
};

static int add_arg(const char ***list, size_t *n, const char *arg)
{
    const char **l = realloc((void *)*list, (*n + 1) * sizeof *l);
    if (!l)
        return 0;
    l[(*n)++] = arg;
    *list = l;
    return 1;
}

int tt_cmd_describe(int argc, char **argv)
{
    describe_ctx c;
    memset(&c, 0, sizeof c);
    cli_pipeline_init(&c.pipe);
    tt_describe_data_init(&c.data);
    tt_error_init(&c.err);
    const char **terms = NULL;
    size_t nterms = 0;
    const char *output = NULL, *manifest_path = NULL, *layout = NULL;
    int headers = 0;
    size_t header_skipped = 0;
    tt_period_granularity header_period = TT_PERIOD_QUARTER;
    const char *period_arg = NULL, *until_arg = NULL;
    show_kind show = SHOW_STATS;
    tt_format format = TT_FORMAT_TSV;
    int header = 1, rc = TT_EXIT_TROUBLE, opt, out_open = 0;
    uint64_t decimals = 4;
    double trim = TT_DEFAULT_TRIM_PERCENT;
    double pcts[TT_DESCRIBE_MAX_PERCENTILES] = { 5, 95 };
    size_t n_pcts = 2;
    tt_series_options sopt;
    tt_series_options_init(&sopt);
    tt_manifest m;
    tt_manifest_init(&m);
    tt_series series;
    tt_series_init(&series);
    tt_doc_meta *picked = NULL;
    tt_source_list list;
    tt_source_list_init(&list);
    tt_buf buf, term_buf;
    tt_buf_init(&buf, 0);
    tt_buf_init(&term_buf, 0);
    tt_outfile out;
    memset(&out, 0, sizeof out);
    char msg[TT_ERROR_FILE_MAX + TT_ERROR_MSG_MAX + 64];

    optind = 1;
    while ((opt = getopt_long(argc, argv, "f:o:j:qh", longopts, NULL)) != -1) {
        int handled = cli_pipeline_option(&c.pipe, opt, optarg);
        if (handled < 0)
            goto out;
        if (handled)
            continue;
        switch (opt) {
        case OPT_TERM:
            if (!add_arg(&terms, &nterms, optarg)) goto oom;
            break;
        case OPT_MANIFEST: manifest_path = optarg; break;
        case OPT_LAYOUT: layout = optarg; break;
        case OPT_HEADERS: headers = 1; break;
        case OPT_HEADER_PERIOD:
            if (!cli_header_period(optarg, &header_period))
                goto out;
            break;
        case OPT_PERIOD: period_arg = optarg; break;
        case OPT_ENTITY: sopt.entity = optarg; break;
        case OPT_UNTIL: until_arg = optarg; break;
        case OPT_KINDS: sopt.kinds = optarg; break;
        case OPT_BY_PERIOD: c.by_period = 1; break;
        case OPT_SHOW:
            if (!strcmp(optarg, "stats")) show = SHOW_STATS;
            else if (!strcmp(optarg, "long")) show = SHOW_LONG;
            else if (!strcmp(optarg, "correlation")) show = SHOW_CORRELATION;
            else {
                cli_error("--show: expected stats, long or correlation, got '%s'", optarg);
                goto out;
            }
            break;
        case OPT_TRIM: {
            char *end;
            trim = strtod(optarg, &end);
            if (*optarg == '\0' || *end != '\0' || !(trim >= 0 && trim < 100)) {
                cli_error("--trim: expected a percent from 0 up to (not including) 100, got "
                          "'%s'",
                          optarg);
                goto out;
            }
            break;
        }
        case OPT_PERCENTILES: {
            tt_error err;
            tt_error_init(&err);
            n_pcts = tt_describe_parse_percentiles(optarg, pcts, TT_DESCRIBE_MAX_PERCENTILES,
                                                   &err);
            if (!n_pcts) {
                cli_error("--percentiles: %s", err.message);
                goto out;
            }
            break;
        }
        case OPT_DECIMALS:
            if (!cli_parse_u64("--decimals", optarg, 0, 17, &decimals)) goto out;
            break;
        case 'f':
            if (!cli_parse_format(optarg, &format))
                goto out;
            break;
        case 'o': output = optarg; break;
        case OPT_NO_HEADER: header = 0; break;
        case 'h': fputs(tt_help_describe, stdout); rc = TT_EXIT_OK; goto out;
        default:
            fprintf(stderr, "Try 'termtide help describe'.\n");
            goto out;
        }
    }
    for (size_t i = 0; i < n_pcts; i++)
        snprintf(pct_names[i], sizeof pct_names[i], "p%g", pcts[i]);

    int with_meta = manifest_path || layout || headers;
    if (nterms == 0) {
        cli_error("give a term to describe with --term WORD");
        goto out;
    }
    if (show == SHOW_CORRELATION && nterms < 2) {
        cli_error("--show correlation needs two or more --term");
        goto out;
    }
    if ((manifest_path != NULL) + (layout != NULL) + headers > 1) {
        cli_error("give one of --manifest, --layout and --headers");
        goto out;
    }
    if (!with_meta && (period_arg || until_arg || sopt.entity || sopt.kinds || c.by_period)) {
        cli_error("--period, --entity, --until, --kinds and --by-period need document "
                  "metadata: --manifest FILE or --layout PATTERN");
        goto out;
    }
    if (manifest_path && optind < argc) {
        cli_error("unexpected argument '%s' (with --manifest the documents are its rows)",
                  argv[optind]);
        goto out;
    }
    tt_period period, until;
    memset(&period, 0, sizeof period);
    memset(&until, 0, sizeof until);
    if (period_arg && !parse_period("--period", period_arg, &period))
        goto out;
    if (until_arg && !parse_period("--until", until_arg, &until))
        goto out;
    if (!cli_pipeline_finish(&c.pipe))
        goto out;

    /* Terms, normalized like the documents' terms. */
    for (size_t i = 0; i < nterms; i++) {
        tt_error err;
        tt_error_init(&err);
        if (tt_describe_normalize_term(&c.pipe.batch.count, terms[i], &term_buf, &err) ||
            tt_describe_add_term(&c.data, term_buf.data, term_buf.len, &err)) {
            cli_error("--term: %s", err.message);
            goto out;
        }
    }

    if (manifest_path) {
        if (!cli_load_manifest(&m, manifest_path))
            goto out;
    } else if (headers) {
        if (!cli_load_headers(&m, header_period, argc - optind, argv + optind, &header_skipped))
            goto out;
    } else if (layout) {
        if (!cli_load_layout(&m, layout, argc - optind, argv + optind))
            goto out;
    }

    if (with_meta) {
        /* Only the documents of the period (and up to --until) form the
         * series; then the series checks entity, kinds and that no entity
         * mixes a fiscal year with quarters. */
        picked = malloc((m.n ? m.n : 1) * sizeof *picked);
        if (!picked)
            goto oom;
        size_t k = 0;
        for (size_t i = 0; i < m.n; i++)
            if ((!period_arg || tt_period_compare(&m.docs[i].period, &period) == 0) &&
                (!until_arg || tt_period_compare(&m.docs[i].period, &until) <= 0))
                picked[k++] = m.docs[i];
        tt_error err;
        tt_error_init(&err);
        if (tt_series_build(&series, picked, k, &sopt, &err)) {
            cli_error("%s (choose document kinds with --kinds)", err.message);
            goto out;
        }
        c.n_docs = series.n_members;
        c.docs = malloc((c.n_docs ? c.n_docs : 1) * sizeof *c.docs);
        if (!c.docs)
            goto oom;
        for (size_t i = 0; i < c.n_docs; i++)
            c.docs[i] = &picked[series.members[i]];
        qsort((void *)c.docs, c.n_docs, sizeof *c.docs, by_period_order);
        for (size_t i = 0; i < c.n_docs; i++)
            if (tt_source_expand(&list, c.docs[i]->path) != TT_OK)
                goto oom;
        if (list.n != c.n_docs) {
            cli_error("a listed document is a directory or could not be listed");
            goto out;
        }
    } else if (!cli_expand_inputs(&list, argc - optind, argv + optind)) {
        goto out;
    }
    if (list.n == 0) {
        cli_error("no documents match the period, entity and kinds asked for");
        goto out;
    }

    cli_pipeline_hooks(&c.pipe);
    c.pipe.batch.ctx = &c;
    c.pipe.batch.on_document = on_document;
    tt_batch_summary sum;
    tt_error err;
    tt_error_init(&err);
    tt_status st = tt_batch_run(&list, &c.pipe.batch, &sum, &err);
    if (st) {
        cli_error("%s", c.err.status ? tt_error_format(&c.err, msg, sizeof msg)
                                     : tt_error_format(&err, msg, sizeof msg));
        goto out;
    }
    if (c.data.n_units == 0) {
        cli_error("no document could be read");
        goto out;
    }
    size_t empty = tt_describe_empty_units(&c.data);
    if (empty == c.data.n_units) {
        cli_error("no document has words to take a rate over");
        goto out;
    }
    if (empty && !c.pipe.quiet)
        cli_note("%zu %s without words left out (no rate)", empty,
                 c.by_period ? (empty == 1 ? "period" : "periods")
                             : (empty == 1 ? "document" : "documents"));

    if (tt_outfile_open(&out, output, &c.err)) {
        cli_error("%s", tt_error_format(&c.err, msg, sizeof msg));
        goto out;
    }
    out_open = 1;
    if (show == SHOW_CORRELATION)
        st = write_correlation(&c, format, header, (int)decimals, &buf);
    else
        st = write_stats(&c, show, format, header, (int)decimals, trim, pcts, n_pcts, &buf);
    if (st) {
        cli_error("%s", c.err.status ? tt_error_format(&c.err, msg, sizeof msg)
                                     : tt_status_name(st));
        goto out;
    }
    if (tt_outfile_write(&out, buf.data, buf.len, &c.err) || tt_outfile_commit(&out, &c.err)) {
        cli_error("%s", tt_error_format(&c.err, msg, sizeof msg));
        goto out;
    }
    out_open = 0;
    cli_pipeline_summary(&c.pipe, "describe", &sum);
    rc = (sum.skipped || header_skipped) ? TT_EXIT_TROUBLE : TT_EXIT_OK;
    goto out;
oom:
    cli_error("out of memory");
out:
    if (out_open)
        tt_outfile_abort(&out);
    free((void *)c.docs);
    free(picked);
    free((void *)terms);
    tt_source_list_release(&list);
    tt_series_release(&series);
    tt_manifest_release(&m);
    tt_buf_release(&buf);
    tt_buf_release(&term_buf);
    tt_describe_data_release(&c.data);
    cli_pipeline_release(&c.pipe);
    return rc;
}
