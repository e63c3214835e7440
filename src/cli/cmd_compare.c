/* termtide compare — what changed between two sides, and is it more than
 * noise: per term, rates on each side, change, G² with its p-value, Log
 * Ratio and the Benjamini–Hochberg q-value; or one summary row per
 * comparison with the two sides' similarity. */
#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "termtide/aggregate.h"
#include "termtide/alloc.h"
#include "termtide/compare.h"
#include "termtide/meta.h"
#include "cli.h"

const char tt_help_compare[] =
    "Usage: termtide compare [OPTIONS] --base PATH --target PATH\n"
    "       termtide compare [OPTIONS] --manifest FILE --base PERIOD --target PERIOD\n"
    "       termtide compare [OPTIONS] --manifest FILE --consecutive\n"
    "       termtide compare [OPTIONS] --layout PATTERN ROOT... --consecutive\n"
    "       termtide compare [OPTIONS] --headers ROOT... --consecutive\n"
    "\n"
    "Measures how each term's rate changed from a base side to a target side.\n"
    "A side is a set of files and directories (--base and --target repeated), or,\n"
    "with document metadata, the documents of one period of an entity.\n"
    "\n"
    "Sides:\n"
    "  --base X, --target X  a file or directory (repeatable); with --manifest or\n"
    "                        --layout, a period: 2025, 2025-Q3, 2025-09, 2025-09-30,\n"
    "                        FY2025, FY2025-Q3 (each entity holding both is compared)\n"
    "  --consecutive         every pair of consecutive periods of every entity (a gap\n"
    "                        in the data still pairs, with a note)\n"
    "  --manifest FILE       metadata: a CSV or TSV with columns path, entity, period,\n"
    "                        kind (paths relative to the manifest)\n"
    "  --layout PATTERN      metadata from where files sit under the ROOT directories,\n"
    "                        e.g. '{entity}/{period}-{kind}.*'\n"
    "  --headers             metadata from each submission wrapper's own header under\n"
    "                        the ROOT paths: entity = COMPANY CONFORMED NAME, period =\n"
    "                        CONFORMED PERIOD OF REPORT as a quarter (--header-period\n"
    "                        year|quarter|month|day), kind = CONFORMED SUBMISSION TYPE\n"
    "  --entity NAME         only this entity\n"
    "  --kinds LIST          only these document kinds, e.g.\n"
    "                        quarterly-report,call-transcript (one series may not mix\n"
    "                        a fiscal year with quarters: choose kinds to keep it whole)\n"
    "\n"
    "Output:\n"
    "  --show terms|summary  terms (default): one row per term:\n"
    "                          entity base target term base_count target_count\n"
    "                          base_rate target_rate rate_change percent_change\n"
    "                          log_ratio g2 p_value q_value direction\n"
    "                        summary: one row per comparison: words and distinct terms\n"
    "                          on each side, terms new and gone, cosine and Jaccard\n"
    "                          similarity, rows tested and rows with q <= --max-q\n"
    "  --sort g2|log-ratio|change\n"
    "                        signed G² (default), Log Ratio or rate change, descending:\n"
    "                        the strongest rises first, the strongest falls last\n"
    "  --min-count N         test only terms counted at least N times on both sides\n"
    "                        together (default 5); q-values adjust for the rows tested\n"
    "  --max-q Q             only rows with q <= Q (in the summary: the threshold\n"
    "                        for 'significant', default 0.05)\n"
    "  --top N               the N first and N last rows of the sort: the strongest\n"
    "                        rises and the strongest falls\n"
    "  -f, --format tsv|csv|jsonl   -o, --output FILE   --no-header\n"
    "\n"
    CLI_PIPELINE_HELP
    "\n"
    "Statistics, per term, with a its count among n1 base words and b among n2\n"
    "target words (words: terms counted after stop-words and filters):\n"
    "  rate           per 10,000 words; rate_change = target rate - base rate;\n"
    "                 percent_change = 100 x change / base rate, 'new' when the base\n"
    "                 count is 0 and 'gone' when the target count is 0\n"
    "  g2             log-likelihood G² on the full 2x2 table (this term and all\n"
    "                 other words, base and target; Dunning 1993); p_value from the\n"
    "                 chi-square distribution with 1 degree of freedom\n"
    "  log_ratio      log2((b/n2) / (a/n1)) (Hardie 2014); a zero count is replaced\n"
    "                 by 0.5 so the ratio stays finite\n"
    "  q_value        Benjamini-Hochberg (1995) false discovery rate over the rows\n"
    "                 tested\n"
    "  cosine         of the two term-count vectors; jaccard of the two term sets\n"
    "\n"
    "termtide measures language; it gives no investment, legal or compliance advice.\n";

typedef enum { SHOW_TERMS, SHOW_SUMMARY } show_kind;

typedef struct compare_ctx {
    cli_pipeline pipe; /* first: the pipeline hooks use the batch ctx as this */
    show_kind show;
    tt_compare_options copt;
    double max_q;
    int max_q_given;
    uint64_t top;
    tt_format format;
    int header, header_done;
    tt_outfile out;
    tt_buf buf;
    tt_error err;
    size_t comparisons, skipped_docs;
} compare_ctx;

static const char *const term_cols[] = {
    "entity", "base", "target", "term", "base_count", "target_count", "base_rate",
    "target_rate", "rate_change", "percent_change", "log_ratio", "g2", "p_value", "q_value",
    "direction"
};
static const char *const summary_cols[] = {
    "entity", "base", "target", "base_words", "target_words", "base_distinct",
    "target_distinct", "new_terms", "gone_terms", "cosine", "jaccard", "tested", "significant"
};

static tt_status flush(compare_ctx *c, int force)
{
    return cli_flush(&c->out, &c->buf, &c->err, force);
}

static tt_status write_result(compare_ctx *c, const char *entity, const char *base,
                              const char *target, const tt_compare_result *r)
{
    tt_table_writer w;
    int header = c->header && !c->header_done;
    c->header_done = 1;
    tt_status st;
    double q_cut = c->max_q_given ? c->max_q : 0.05;
    if (c->show == SHOW_SUMMARY) {
        size_t significant = 0;
        for (size_t i = 0; i < r->n; i++)
            if (r->rows[i].change.q_value <= q_cut)
                significant++;
        st = tt_table_begin(&w, c->format, &c->buf, summary_cols, 13, header);
        if (!st) st = tt_table_cstr(&w, entity);
        if (!st) st = tt_table_cstr(&w, base);
        if (!st) st = tt_table_cstr(&w, target);
        if (!st) st = tt_table_u64(&w, r->base_words);
        if (!st) st = tt_table_u64(&w, r->target_words);
        if (!st) st = tt_table_u64(&w, r->base_distinct);
        if (!st) st = tt_table_u64(&w, r->target_distinct);
        if (!st) st = tt_table_u64(&w, r->new_terms);
        if (!st) st = tt_table_u64(&w, r->gone_terms);
        if (!st) st = tt_table_fixed(&w, r->cosine, 6);
        if (!st) st = tt_table_fixed(&w, r->jaccard, 6);
        if (!st) st = tt_table_u64(&w, r->n);
        if (!st) st = tt_table_u64(&w, significant);
        if (!st) st = tt_table_end_row(&w);
        return st ? st : flush(c, 0);
    }
    /* Rows kept by --max-q, then the first and last --top of them. */
    size_t *keep = tt_reallocarray(NULL, r->n ? r->n : 1, sizeof *keep);
    if (!keep)
        return TT_ENOMEM;
    size_t k = 0;
    for (size_t i = 0; i < r->n; i++)
        if (!c->max_q_given || r->rows[i].change.q_value <= c->max_q)
            keep[k++] = i;
    st = tt_table_begin(&w, c->format, &c->buf, term_cols, 15, header);
    for (size_t j = 0; j < k && !st; j++) {
        if (c->top && 2 * c->top < k && j >= c->top && j < k - c->top)
            continue;
        const tt_compare_row *row = &r->rows[keep[j]];
        const tt_change *ch = &row->change;
        st = tt_table_cstr(&w, entity);
        if (!st) st = tt_table_cstr(&w, base);
        if (!st) st = tt_table_cstr(&w, target);
        if (!st) st = tt_table_str(&w, row->term, row->len);
        if (!st) st = tt_table_u64(&w, ch->base_count);
        if (!st) st = tt_table_u64(&w, ch->target_count);
        if (!st) st = tt_table_fixed(&w, ch->base_rate_per_10k, 4);
        if (!st) st = tt_table_fixed(&w, ch->target_rate_per_10k, 4);
        if (!st) st = tt_table_fixed(&w, ch->rate_change_per_10k, 4);
        if (!st) {
            if (ch->kind == TT_CHANGE_NEW)
                st = tt_table_cstr(&w, "new");
            else if (ch->kind == TT_CHANGE_GONE)
                st = tt_table_cstr(&w, "gone");
            else
                st = tt_table_fixed(&w, ch->percent_change, 2);
        }
        if (!st) st = tt_table_fixed(&w, ch->log_ratio, 4);
        if (!st) st = tt_table_fixed(&w, ch->g2, 4);
        if (!st) st = tt_table_sci(&w, ch->p_value, 4);
        if (!st) st = tt_table_sci(&w, ch->q_value, 4);
        if (!st)
            st = tt_table_cstr(&w, ch->direction > 0 ? "rise" : ch->direction < 0 ? "fall" : "same");
        if (!st) st = tt_table_end_row(&w);
        if (!st) st = flush(c, 0);
    }
    tt_free(keep);
    return st;
}

/* Counts the documents named by paths into a new table. NULL on a fatal
 * problem (printed). */
static tt_termtable *count_side(compare_ctx *c, char *const *paths, size_t n)
{
    tt_source_list list;
    tt_source_list_init(&list);
    tt_termtable *t = tt_termtable_new();
    if (!t) {
        cli_error("out of memory");
        return NULL;
    }
    for (size_t i = 0; i < n; i++)
        if (tt_source_expand(&list, paths[i]) != TT_OK) {
            cli_error("out of memory while listing inputs");
            tt_source_list_release(&list);
            tt_termtable_free(t);
            return NULL;
        }
    tt_batch_summary sum;
    tt_error err;
    tt_error_init(&err);
    tt_status st = tt_aggregate_run(&list, &c->pipe.batch, t, &sum, &err);
    tt_source_list_release(&list);
    c->skipped_docs += sum.skipped;
    if (st) {
        char msg[TT_ERROR_FILE_MAX + TT_ERROR_MSG_MAX + 64];
        cli_error("%s", tt_error_format(&err, msg, sizeof msg));
        tt_termtable_free(t);
        return NULL;
    }
    return t;
}

/* Compares two tables and writes the result; a side without words is
 * reported and skipped. Returns 0 on a fatal error. */
static int compare_and_write(compare_ctx *c, const tt_termtable *a, const tt_termtable *b,
                             const char *entity, const char *base, const char *target)
{
    tt_compare_result r;
    tt_compare_result_init(&r);
    tt_error err;
    tt_error_init(&err);
    tt_status st = tt_compare_tables(a, b, &c->copt, &r, &err);
    if (st == TT_EINVAL) {
        cli_error("%s%s%s -> %s: %s (skipped)", entity, entity[0] ? ": " : "", base, target,
                  err.message);
        c->skipped_docs++;
        return 1;
    }
    if (!st)
        st = write_result(c, entity, base, target, &r);
    tt_compare_result_release(&r);
    if (st) {
        char msg[TT_ERROR_FILE_MAX + TT_ERROR_MSG_MAX + 64];
        cli_error("%s", c->err.status ? tt_error_format(&c->err, msg, sizeof msg)
                                      : tt_status_name(st));
        return 0;
    }
    c->comparisons++;
    return 1;
}

/* The paths of one group's documents. */
static char **group_paths(const tt_series *s, const tt_doc_meta *docs, size_t g, size_t *n)
{
    const tt_series_group *grp = &s->groups[g];
    char **p = malloc((grp->n_docs ? grp->n_docs : 1) * sizeof *p);
    if (!p)
        return NULL;
    for (size_t i = 0; i < grp->n_docs; i++)
        p[i] = (char *)docs[s->members[grp->first + i]].path;
    *n = grp->n_docs;
    return p;
}

static tt_termtable *count_group(compare_ctx *c, const tt_series *s, const tt_doc_meta *docs,
                                 size_t g)
{
    size_t n;
    char **paths = group_paths(s, docs, g, &n);
    if (!paths) {
        cli_error("out of memory");
        return NULL;
    }
    tt_termtable *t = count_side(c, paths, n);
    free(paths);
    return t;
}

enum { OPT_BASE = CLI_OPT_FIRST_FREE, OPT_TARGET, OPT_CONSECUTIVE, OPT_MANIFEST, OPT_LAYOUT,
       OPT_ENTITY, OPT_KINDS, OPT_SHOW, OPT_SORT, OPT_MIN_COUNT, OPT_MAX_Q, OPT_TOP,
       OPT_NO_HEADER, OPT_HEADERS, OPT_HEADER_PERIOD };

static const struct option longopts[] = {
    { "base", required_argument, NULL, OPT_BASE },
    { "target", required_argument, NULL, OPT_TARGET },
    { "consecutive", no_argument, NULL, OPT_CONSECUTIVE },
    { "manifest", required_argument, NULL, OPT_MANIFEST },
    { "layout", required_argument, NULL, OPT_LAYOUT },
    { "entity", required_argument, NULL, OPT_ENTITY },
    { "kinds", required_argument, NULL, OPT_KINDS },
    { "show", required_argument, NULL, OPT_SHOW },
    { "sort", required_argument, NULL, OPT_SORT },
    { "min-count", required_argument, NULL, OPT_MIN_COUNT },
    { "max-q", required_argument, NULL, OPT_MAX_Q },
    { "top", required_argument, NULL, OPT_TOP },
    { "format", required_argument, NULL, 'f' },
    { "output", required_argument, NULL, 'o' },
    { "no-header", no_argument, NULL, OPT_NO_HEADER },
    { "headers", no_argument, NULL, OPT_HEADERS },
    { "header-period", required_argument, NULL, OPT_HEADER_PERIOD },
    { "help", no_argument, NULL, 'h' },
    CLI_PIPELINE_LONGOPTS,
    { NULL, 0, NULL, 0 }
};

/* Parses a q threshold in (0, 1] written as a plain decimal. */
static int parse_q(const char *arg, double *out)
{
    char *end;
    double v = strtod(arg, &end);
    if (*arg == '\0' || *end != '\0' || !(v > 0 && v <= 1)) {
        cli_error("--max-q: expected a number above 0 and at most 1, got '%s'", arg);
        return 0;
    }
    *out = v;
    return 1;
}

static int add_arg(char ***list, size_t *n, char *arg)
{
    char **l = realloc(*list, (*n + 1) * sizeof *l);
    if (!l)
        return 0;
    l[(*n)++] = arg;
    *list = l;
    return 1;
}

int tt_cmd_compare(int argc, char **argv)
{
    compare_ctx c;
    memset(&c, 0, sizeof c);
    cli_pipeline_init(&c.pipe);
    tt_compare_options_init(&c.copt);
    c.copt.min_count = 5;
    c.header = 1;
    c.format = TT_FORMAT_TSV;
    tt_buf_init(&c.buf, 0);
    tt_error_init(&c.err);
    char **base = NULL, **target = NULL;
    size_t nbase = 0, ntarget = 0;
    const char *output = NULL, *manifest_path = NULL, *layout = NULL;
    int consecutive = 0, rc = TT_EXIT_TROUBLE, opt, out_open = 0, headers = 0;
    tt_period_granularity header_period = TT_PERIOD_QUARTER;
    tt_series_options sopt;
    tt_series_options_init(&sopt);
    tt_manifest m;
    tt_manifest_init(&m);
    tt_series series;
    tt_series_init(&series);
    tt_doc_meta *picked = NULL;
    char msg[TT_ERROR_FILE_MAX + TT_ERROR_MSG_MAX + 64];
    uint64_t v;

    optind = 1;
    while ((opt = getopt_long(argc, argv, "f:o:j:qh", longopts, NULL)) != -1) {
        int handled = cli_pipeline_option(&c.pipe, opt, optarg);
        if (handled < 0)
            goto out;
        if (handled)
            continue;
        switch (opt) {
        case OPT_BASE:
            if (!add_arg(&base, &nbase, optarg)) goto oom;
            break;
        case OPT_TARGET:
            if (!add_arg(&target, &ntarget, optarg)) goto oom;
            break;
        case OPT_CONSECUTIVE: consecutive = 1; break;
        case OPT_MANIFEST: manifest_path = optarg; break;
        case OPT_LAYOUT: layout = optarg; break;
        case OPT_ENTITY: sopt.entity = optarg; break;
        case OPT_KINDS: sopt.kinds = optarg; break;
        case OPT_SHOW:
            if (!strcmp(optarg, "terms")) c.show = SHOW_TERMS;
            else if (!strcmp(optarg, "summary")) c.show = SHOW_SUMMARY;
            else {
                cli_error("--show: expected terms or summary, got '%s'", optarg);
                goto out;
            }
            break;
        case OPT_SORT:
            if (tt_compare_sort_parse(optarg, &c.copt.sort)) {
                cli_error("--sort: expected g2, log-ratio or change, got '%s'", optarg);
                goto out;
            }
            break;
        case OPT_MIN_COUNT:
            if (!cli_parse_u64("--min-count", optarg, 1, UINT64_MAX, &v)) goto out;
            c.copt.min_count = v;
            break;
        case OPT_MAX_Q:
            if (!parse_q(optarg, &c.max_q)) goto out;
            c.max_q_given = 1;
            break;
        case OPT_TOP:
            if (!cli_parse_u64("--top", optarg, 1, UINT64_MAX, &c.top)) goto out;
            break;
        case 'f':
            if (!cli_parse_format(optarg, &c.format))
                goto out;
            break;
        case 'o': output = optarg; break;
        case OPT_NO_HEADER: c.header = 0; break;
        case OPT_HEADERS: headers = 1; break;
        case OPT_HEADER_PERIOD:
            if (!cli_header_period(optarg, &header_period))
                goto out;
            break;
        case 'h': fputs(tt_help_compare, stdout); rc = TT_EXIT_OK; goto out;
        default:
            fprintf(stderr, "Try 'termtide help compare'.\n");
            goto out;
        }
    }
    int with_meta = manifest_path || layout || headers;
    if ((manifest_path != NULL) + (layout != NULL) + headers > 1) {
        cli_error("give one of --manifest, --layout and --headers");
        goto out;
    }
    if (consecutive && !with_meta) {
        cli_error("--consecutive needs document metadata: --manifest FILE or --layout PATTERN");
        goto out;
    }
    if (consecutive && (nbase || ntarget)) {
        cli_error("--consecutive replaces --base and --target");
        goto out;
    }
    if (!consecutive && (nbase == 0 || ntarget == 0)) {
        cli_error("give --base and --target (or --consecutive with metadata)");
        goto out;
    }
    if (with_meta && !consecutive && (nbase != 1 || ntarget != 1)) {
        cli_error("with metadata, --base and --target each name one period");
        goto out;
    }
    if (!layout && !headers && optind < argc) {
        cli_error("unexpected argument '%s' (sides are given with --base and --target)",
                  argv[optind]);
        goto out;
    }
    if (!cli_pipeline_finish(&c.pipe))
        goto out;
    cli_pipeline_hooks(&c.pipe);
    c.pipe.batch.ctx = &c;
    c.pipe.progress = 0; /* several batches: a per-batch progress line would mislead */

    if (manifest_path) {
        if (!cli_load_manifest(&m, manifest_path))
            goto out;
    } else if (headers) {
        if (!cli_load_headers(&m, header_period, argc - optind, argv + optind, &c.skipped_docs))
            goto out;
    } else if (layout) {
        if (!cli_load_layout(&m, layout, argc - optind, argv + optind))
            goto out;
    }

    if (tt_outfile_open(&c.out, output, &c.err)) {
        cli_error("%s", tt_error_format(&c.err, msg, sizeof msg));
        goto out;
    }
    out_open = 1;

    if (!with_meta) {
        tt_termtable *a = count_side(&c, base, nbase);
        tt_termtable *b = a ? count_side(&c, target, ntarget) : NULL;
        int ok = a && b && compare_and_write(&c, a, b, "", "base", "target");
        tt_termtable_free(a);
        tt_termtable_free(b);
        if (!ok)
            goto out;
    } else {
        const tt_doc_meta *docs = m.docs;
        size_t ndocs = m.n;
        tt_period pb, pt;
        tt_error err;
        tt_error_init(&err);
        if (!consecutive) {
            if (tt_period_parse(base[0], strlen(base[0]), &pb, &err) ||
                tt_period_parse(target[0], strlen(target[0]), &pt, &err)) {
                cli_error("%s", err.message);
                goto out;
            }
            /* Only the documents of the two periods form the series. */
            picked = malloc((ndocs ? ndocs : 1) * sizeof *picked);
            if (!picked)
                goto oom;
            size_t k = 0;
            for (size_t i = 0; i < ndocs; i++)
                if (tt_period_compare(&docs[i].period, &pb) == 0 ||
                    tt_period_compare(&docs[i].period, &pt) == 0)
                    picked[k++] = docs[i];
            docs = picked;
            ndocs = k;
        }
        if (tt_series_build(&series, docs, ndocs, &sopt, &err)) {
            cli_error("%s (choose document kinds with --kinds)", err.message);
            goto out;
        }
        if (series.n_groups == 0) {
            cli_error("no documents match the periods, entity and kinds asked for");
            goto out;
        }
        if (!consecutive) {
            char tb[TT_PERIOD_TEXT_MAX], tg[TT_PERIOD_TEXT_MAX];
            tt_period_format(&pb, tb, sizeof tb);
            tt_period_format(&pt, tg, sizeof tg);
            for (size_t g = 0; g < series.n_groups; g++) {
                const char *entity = series.groups[g].entity;
                if (g > 0 && !strcmp(series.groups[g - 1].entity, entity))
                    continue;
                long gb = tt_series_find(&series, entity, &pb);
                long gt = tt_series_find(&series, entity, &pt);
                if (gb < 0 || gt < 0) {
                    if (!c.pipe.quiet)
                        cli_note("%s: no documents for %s (skipped)", entity, gb < 0 ? tb : tg);
                    continue;
                }
                tt_termtable *a = count_group(&c, &series, docs, (size_t)gb);
                tt_termtable *b = a ? count_group(&c, &series, docs, (size_t)gt) : NULL;
                int ok = a && b && compare_and_write(&c, a, b, entity, tb, tg);
                tt_termtable_free(a);
                tt_termtable_free(b);
                if (!ok)
                    goto out;
            }
        } else {
            /* Pairs come entity after entity in period order, so each
             * group is counted once and at most two tables are held. */
            tt_termtable *prev = NULL;
            long prev_group = -1;
            for (size_t i = 0; i < series.n_pairs; i++) {
                const tt_series_pair *pr = &series.pairs[i];
                if ((long)pr->base != prev_group) {
                    tt_termtable_free(prev);
                    prev = count_group(&c, &series, docs, pr->base);
                    prev_group = (long)pr->base;
                    if (!prev)
                        goto out;
                }
                tt_termtable *cur = count_group(&c, &series, docs, pr->target);
                if (!cur) {
                    tt_termtable_free(prev);
                    goto out;
                }
                char tb[TT_PERIOD_TEXT_MAX], tg[TT_PERIOD_TEXT_MAX];
                tt_period_format(&series.groups[pr->base].period, tb, sizeof tb);
                tt_period_format(&series.groups[pr->target].period, tg, sizeof tg);
                if (pr->gap > 0 && !c.pipe.quiet)
                    cli_note("%s: %s -> %s skips %ld period%s missing from the data",
                             series.groups[pr->base].entity, tb, tg, pr->gap,
                             pr->gap == 1 ? "" : "s");
                int ok = compare_and_write(&c, prev, cur, series.groups[pr->base].entity, tb, tg);
                tt_termtable_free(prev);
                prev = cur;
                prev_group = (long)pr->target;
                if (!ok) {
                    tt_termtable_free(prev);
                    goto out;
                }
            }
            tt_termtable_free(prev);
            if (series.n_pairs == 0)
                cli_note("no entity has two periods to compare");
        }
    }
    if (flush(&c, 1) || tt_outfile_commit(&c.out, &c.err)) {
        cli_error("%s", tt_error_format(&c.err, msg, sizeof msg));
        goto out;
    }
    out_open = 0;
    if (!c.pipe.quiet)
        fprintf(stderr, "%s compare: %zu comparison%s written, %zu input%s skipped\n", tt_prog,
                c.comparisons, c.comparisons == 1 ? "" : "s", c.skipped_docs,
                c.skipped_docs == 1 ? "" : "s");
    rc = c.skipped_docs ? TT_EXIT_TROUBLE : TT_EXIT_OK;
    goto out;
oom:
    cli_error("out of memory");
out:
    if (out_open)
        tt_outfile_abort(&c.out);
    free(picked);
    free(base);
    free(target);
    tt_series_release(&series);
    tt_manifest_release(&m);
    tt_buf_release(&c.buf);
    cli_pipeline_release(&c.pipe);
    return rc;
}
