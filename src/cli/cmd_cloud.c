/* termtide cloud — a weighted word cloud as SVG, from documents (weights =
 * counts) or from a table termtide wrote (count: counts or shares; compare:
 * change, drawn in two hues for rise and fall). */
#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "termtide/aggregate.h"
#include "termtide/alloc.h"
#include "termtide/cloud.h"
#include "termtide/font.h"
#include "termtide/limits.h"
#include "termtide/tsvread.h"
#include "cli.h"

const char tt_help_cloud[] =
    "Usage: termtide cloud [OPTIONS] PATH...\n"
    "       termtide cloud [OPTIONS] --from TABLE.tsv\n"
    "\n"
    "Draws the heaviest terms as a word cloud in SVG: a term's font size grows\n"
    "with its weight, the heaviest sit nearest the centre, no two words touch.\n"
    "From documents (PATH...), a weight is the term's count over all of them.\n"
    "\n"
    "Weights from a table (--from):\n"
    "  --from FILE           a TSV table written by 'termtide count' (weights: count)\n"
    "                        or 'termtide compare' (weights: log_ratio, a change\n"
    "                        cloud: rises in blue, falls in orange)\n"
    "  --weight COLUMN       the column to use: count, share, rate (count tables);\n"
    "                        log_ratio, g2 (signed by direction), rate_change\n"
    "                        (compare tables)\n"
    "  --document NAME       the document's rows of a count table (default: '*',\n"
    "                        the total, when present, else the only document)\n"
    "  --pair BASE,TARGET    the comparison to draw from a compare table with\n"
    "                        several (default: the last one); --entity NAME too\n"
    "\n"
    "Picture:\n"
    "  --top N               the N heaviest terms (default 100, at most 5000)\n"
    "  --scale sqrt|linear|log\n"
    "                        weight to font size (default sqrt: a word's area follows\n"
    "                        its weight; log is log(1 + weight))\n"
    "  --min-size PX, --max-size PX\n"
    "                        font sizes of the lightest and heaviest word (10, 72)\n"
    "  --width PX, --height PX  the canvas (900 x 600; 40 px at the bottom hold the\n"
    "                        legend)\n"
    "  --seed N              where each word starts its search, and which words turn\n"
    "                        (default 1); the same input and seed give the same bytes\n"
    "  --rotate none|some    some: about one word in four reads upward (default none)\n"
    "  --shrink              lower every size by 10% until all words fit\n"
    "  --font FILE           the font to measure and draw with (default DejaVu Sans,\n"
    "                        " TT_FONT_DEFAULT ")\n"
    "  --text                <text> elements instead of outline paths (smaller files;\n"
    "                        the viewer's copy of the font then decides the shapes)\n"
    "  --title TEXT          the picture's title\n"
    "  -o, --output FILE     write the SVG to FILE atomically (default standard output)\n"
    "\n"
    "Words are drawn as outline paths, each with a <title> and an aria-label, so\n"
    "the picture looks the same in every viewer and stays readable to search and\n"
    "screen readers. Words that fit nowhere are counted on standard error and in\n"
    "the picture's legend and description, never dropped silently.\n"
    "\n"
    CLI_PIPELINE_HELP
    "\n"
    "termtide measures language; it gives no investment, legal or compliance advice.\n";

enum { OPT_FROM = CLI_OPT_FIRST_FREE, OPT_WEIGHT, OPT_DOCUMENT, OPT_PAIR, OPT_ENTITY, OPT_TOP,
       OPT_SCALE, OPT_MIN_SIZE, OPT_MAX_SIZE, OPT_WIDTH, OPT_HEIGHT, OPT_SEED, OPT_ROTATE,
       OPT_SHRINK, OPT_FONT, OPT_TEXT, OPT_TITLE };

static const struct option longopts[] = {
    { "from", required_argument, NULL, OPT_FROM },
    { "weight", required_argument, NULL, OPT_WEIGHT },
    { "document", required_argument, NULL, OPT_DOCUMENT },
    { "pair", required_argument, NULL, OPT_PAIR },
    { "entity", required_argument, NULL, OPT_ENTITY },
    { "top", required_argument, NULL, OPT_TOP },
    { "scale", required_argument, NULL, OPT_SCALE },
    { "min-size", required_argument, NULL, OPT_MIN_SIZE },
    { "max-size", required_argument, NULL, OPT_MAX_SIZE },
    { "width", required_argument, NULL, OPT_WIDTH },
    { "height", required_argument, NULL, OPT_HEIGHT },
    { "seed", required_argument, NULL, OPT_SEED },
    { "rotate", required_argument, NULL, OPT_ROTATE },
    { "shrink", no_argument, NULL, OPT_SHRINK },
    { "font", required_argument, NULL, OPT_FONT },
    { "text", no_argument, NULL, OPT_TEXT },
    { "title", required_argument, NULL, OPT_TITLE },
    { "output", required_argument, NULL, 'o' },
    { "help", no_argument, NULL, 'h' },
    CLI_PIPELINE_LONGOPTS,
    { NULL, 0, NULL, 0 }
};

/* A candidate word before the top N are chosen. */
typedef struct cand {
    const char *term;
    size_t len;
    double weight;
} cand;

static int by_abs_weight(const void *pa, const void *pb)
{
    const cand *a = pa, *b = pb;
    double wa = fabs(a->weight), wb = fabs(b->weight);
    if (wa != wb)
        return wa > wb ? -1 : 1;
    size_t n = a->len < b->len ? a->len : b->len;
    int k = memcmp(a->term, b->term, n);
    return k ? k : (a->len > b->len) - (a->len < b->len);
}

typedef struct from_opts {
    const char *path, *weight, *document, *pair, *entity;
} from_opts;

static long need_col(const tt_tsv *t, const char *path, const char *name)
{
    long c = tt_tsv_column(t, name);
    if (c < 0)
        cli_error("%s: no column '%s' (columns: %s ...)", path, name, t->cells[0]);
    return c;
}

/* Picks the rows and weights of a count or compare table; fills cands
 * (pointing into t). Returns 0 on a problem (printed). */
/* The default title of a change cloud: which comparison it shows. */
static char change_title[600];

static int read_table(const tt_tsv *t, const from_opts *fo, cand **out, size_t *n, int *change,
                      const char **weight_name)
{
    long term = need_col(t, fo->path, "term");
    if (term < 0)
        return 0;
    long cbase = tt_tsv_column(t, "base"), ctarget = tt_tsv_column(t, "target");
    long cdir = tt_tsv_column(t, "direction"), cent = tt_tsv_column(t, "entity");
    long cdoc = tt_tsv_column(t, "document");
    *change = cbase >= 0 && ctarget >= 0;
    const char *wname = fo->weight ? fo->weight : *change ? "log_ratio" : "count";
    long wcol = need_col(t, fo->path, wname);
    if (wcol < 0)
        return 0;
    *weight_name = *change && !strcmp(wname, "g2") ? "signed G2" : wname;
    if (*change && !strcmp(wname, "g2") && cdir < 0) {
        cli_error("%s: g2 needs the direction column to sign it", fo->path);
        return 0;
    }
    /* which rows */
    const char *want_doc = fo->document, *want_base = NULL, *want_target = NULL;
    const char *want_entity = fo->entity;
    char pairbuf[512] = "";
    if (!*change && cdoc >= 0 && !want_doc) {
        for (size_t r = 0; r < t->nrows && !want_doc; r++)
            if (!strcmp(tt_tsv_cell(t, r, (size_t)cdoc), "*"))
                want_doc = "*";
        if (!want_doc) {
            want_doc = tt_tsv_cell(t, 0, (size_t)cdoc);
            for (size_t r = 1; r < t->nrows; r++)
                if (strcmp(tt_tsv_cell(t, r, (size_t)cdoc), want_doc)) {
                    cli_error("%s: rows of several documents; choose one with --document "
                              "NAME (or write the table with count --total)",
                              fo->path);
                    return 0;
                }
        }
    }
    if (*change) {
        if (fo->pair) {
            snprintf(pairbuf, sizeof pairbuf, "%s", fo->pair);
            char *comma = strchr(pairbuf, ',');
            if (!comma) {
                cli_error("--pair: expected BASE,TARGET, got '%s'", fo->pair);
                return 0;
            }
            *comma = '\0';
            want_base = pairbuf;
            want_target = comma + 1;
            /* one entity's rows: the last entity holding this pair */
            for (size_t r = t->nrows; r-- > 0 && cent >= 0 && !want_entity;)
                if (!strcmp(tt_tsv_cell(t, r, (size_t)cbase), want_base) &&
                    !strcmp(tt_tsv_cell(t, r, (size_t)ctarget), want_target))
                    want_entity = tt_tsv_cell(t, r, (size_t)cent);
        } else {
            size_t last = t->nrows - 1;
            want_base = tt_tsv_cell(t, last, (size_t)cbase);
            want_target = tt_tsv_cell(t, last, (size_t)ctarget);
            if (cent >= 0 && !want_entity)
                want_entity = tt_tsv_cell(t, last, (size_t)cent);
            /* say which comparison is drawn when the table holds several */
            for (size_t r = 0; r < t->nrows; r++)
                if (strcmp(tt_tsv_cell(t, r, (size_t)cbase), want_base) ||
                    strcmp(tt_tsv_cell(t, r, (size_t)ctarget), want_target) ||
                    (cent >= 0 && strcmp(tt_tsv_cell(t, r, (size_t)cent), want_entity))) {
                    cli_note("%s: several comparisons; drawing the last, %s%s%s -> %s (choose "
                             "with --pair BASE,TARGET and --entity NAME)",
                             fo->path, want_entity ? want_entity : "", want_entity ? " " : "",
                             want_base, want_target);
                    break;
                }
        }
    }
    if (*change)
        snprintf(change_title, sizeof change_title, "Change cloud: %s%s%s \xE2\x86\x92 %s",
                 want_entity ? want_entity : "", want_entity ? ", " : "", want_base, want_target);
    cand *c = tt_reallocarray(NULL, t->nrows, sizeof *c);
    if (!c) {
        cli_error("out of memory");
        return 0;
    }
    size_t k = 0;
    for (size_t r = 0; r < t->nrows; r++) {
        if (want_doc && cdoc >= 0 && strcmp(tt_tsv_cell(t, r, (size_t)cdoc), want_doc))
            continue;
        if (want_base && strcmp(tt_tsv_cell(t, r, (size_t)cbase), want_base))
            continue;
        if (want_target && strcmp(tt_tsv_cell(t, r, (size_t)ctarget), want_target))
            continue;
        if (want_entity && cent >= 0 && strcmp(tt_tsv_cell(t, r, (size_t)cent), want_entity))
            continue;
        double v;
        if (!tt_tsv_number(t, r, (size_t)wcol, &v)) {
            cli_error("%s: row %zu: %s is not a number: '%s'", fo->path, r + 2, wname,
                      tt_tsv_cell(t, r, (size_t)wcol));
            tt_free(c);
            return 0;
        }
        if (!isfinite(v) || v == 0)
            continue;
        if (*change && !strcmp(wname, "g2") && !strcmp(tt_tsv_cell(t, r, (size_t)cdir), "fall"))
            v = -fabs(v);
        if (!*change && v < 0)
            continue;
        const char *s = tt_tsv_cell(t, r, (size_t)term);
        c[k].term = s;
        c[k].len = strlen(s);
        c[k].weight = v;
        k++;
    }
    if (!k) {
        cli_error("%s: no rows with a weight to draw%s%s%s%s", fo->path,
                  want_base ? " for " : "", want_base ? want_base : "",
                  want_base ? " -> " : "", want_target ? want_target : "");
        tt_free(c);
        return 0;
    }
    *out = c;
    *n = k;
    return 1;
}

static int parse_size(const char *opt, const char *arg, double *out)
{
    uint64_t v;
    if (!cli_parse_u64(opt, arg, 1, 2000, &v))
        return 0;
    *out = (double)v;
    return 1;
}

int tt_cmd_cloud(int argc, char **argv)
{
    cli_pipeline pipe;
    cli_pipeline_init(&pipe);
    tt_cloud_options o;
    tt_cloud_options_init(&o);
    from_opts fo;
    memset(&fo, 0, sizeof fo);
    const char *output = NULL, *font_path = TT_FONT_DEFAULT;
    uint64_t top = 100, v;
    int opt, rc = TT_EXIT_TROUBLE, rotate_given = 0;
    tt_source_list inputs;
    tt_source_list_init(&inputs);
    tt_termtable *table = NULL;
    tt_term_entry *entries = NULL;
    cand *cands = NULL;
    size_t ncands = 0;
    tt_tsv tsv;
    tt_tsv_init(&tsv);
    tt_font *font = NULL;
    tt_cloud cloud;
    tt_cloud_init(&cloud);
    tt_buf svg;
    tt_buf_init(&svg, 0);
    tt_outfile out;
    memset(&out, 0, sizeof out);
    tt_error err;
    tt_error_init(&err);
    char msg[TT_ERROR_FILE_MAX + TT_ERROR_MSG_MAX + 64];
    tt_batch_summary sum;
    memset(&sum, 0, sizeof sum);
    int read_docs = 0;

    optind = 1;
    while ((opt = getopt_long(argc, argv, "o:j:qh", longopts, NULL)) != -1) {
        int handled = cli_pipeline_option(&pipe, opt, optarg);
        if (handled < 0)
            goto done;
        if (handled)
            continue;
        switch (opt) {
        case OPT_FROM: fo.path = optarg; break;
        case OPT_WEIGHT: fo.weight = optarg; break;
        case OPT_DOCUMENT: fo.document = optarg; break;
        case OPT_PAIR: fo.pair = optarg; break;
        case OPT_ENTITY: fo.entity = optarg; break;
        case OPT_TOP:
            if (!cli_parse_u64("--top", optarg, 1, TT_LIMIT_CLOUD_WORDS, &top)) goto done;
            break;
        case OPT_SCALE:
            if (!strcmp(optarg, "sqrt")) o.scale = TT_CLOUD_SQRT;
            else if (!strcmp(optarg, "linear")) o.scale = TT_CLOUD_LINEAR;
            else if (!strcmp(optarg, "log")) o.scale = TT_CLOUD_LOG;
            else {
                cli_error("--scale: expected sqrt, linear or log, got '%s'", optarg);
                goto done;
            }
            break;
        case OPT_MIN_SIZE: if (!parse_size("--min-size", optarg, &o.min_size)) goto done; break;
        case OPT_MAX_SIZE: if (!parse_size("--max-size", optarg, &o.max_size)) goto done; break;
        case OPT_WIDTH:
            if (!cli_parse_u64("--width", optarg, 50, TT_LIMIT_CANVAS_SIDE, &v)) goto done;
            o.width = (int)v;
            break;
        case OPT_HEIGHT:
            if (!cli_parse_u64("--height", optarg, 100, TT_LIMIT_CANVAS_SIDE, &v)) goto done;
            o.height = (int)v;
            break;
        case OPT_SEED:
            if (!cli_parse_u64("--seed", optarg, 0, UINT64_MAX, &o.seed)) goto done;
            break;
        case OPT_ROTATE:
            rotate_given = 1;
            if (!strcmp(optarg, "none")) o.rotate_some = 0;
            else if (!strcmp(optarg, "some")) o.rotate_some = 1;
            else {
                cli_error("--rotate: expected none or some, got '%s'", optarg);
                goto done;
            }
            break;
        case OPT_SHRINK: o.shrink = 1; break;
        case OPT_FONT: font_path = optarg; break;
        case OPT_TEXT: o.text = 1; break;
        case OPT_TITLE: o.title = optarg; break;
        case 'o': output = optarg; break;
        case 'h': fputs(tt_help_cloud, stdout); rc = TT_EXIT_OK; goto done;
        default:
            fprintf(stderr, "Try 'termtide help cloud'.\n");
            goto done;
        }
    }
    (void)rotate_given;
    if (o.min_size > o.max_size) {
        cli_error("--min-size %g is above --max-size %g", o.min_size, o.max_size);
        goto done;
    }
    if (fo.path && optind < argc) {
        cli_error("give either documents or --from FILE, not both");
        goto done;
    }
    if (tt_font_open(font_path, &font, &err)) {
        cli_error("%s", tt_error_format(&err, msg, sizeof msg));
        goto done;
    }
    if (fo.path) {
        if (tt_tsv_read(fo.path, &tsv, &err)) {
            cli_error("%s", tt_error_format(&err, msg, sizeof msg));
            goto done;
        }
        const char *wname = "count";
        if (!read_table(&tsv, &fo, &cands, &ncands, &o.change, &wname))
            goto done;
        o.weight_name = wname;
        if (!strcmp(o.title, "Word cloud") && o.change)
            o.title = change_title;
    } else {
        if (!cli_pipeline_finish(&pipe))
            goto done;
        if (!cli_expand_inputs(&inputs, argc - optind, argv + optind))
            goto done;
        if (!(table = tt_termtable_new())) {
            cli_error("out of memory");
            goto done;
        }
        cli_pipeline_hooks(&pipe);
        pipe.batch.ctx = &pipe;
        if (tt_aggregate_run(&inputs, &pipe.batch, table, &sum, &err)) {
            cli_error("%s", tt_error_format(&err, msg, sizeof msg));
            goto done;
        }
        read_docs = 1;
        size_t n = 0;
        if (tt_termtable_sorted(table, &entries, &n) ||
            !(cands = tt_reallocarray(NULL, n ? n : 1, sizeof *cands))) {
            cli_error("out of memory");
            goto done;
        }
        for (size_t i = 0; i < n; i++) {
            cands[i].term = entries[i].term;
            cands[i].len = entries[i].len;
            cands[i].weight = (double)entries[i].count;
        }
        ncands = n;
        if (!n) {
            cli_error("no terms to draw in the input");
            goto done;
        }
    }
    qsort(cands, ncands, sizeof *cands, by_abs_weight);
    if (ncands > top)
        ncands = (size_t)top;
    for (size_t i = 0; i < ncands; i++)
        if (tt_cloud_add(&cloud, cands[i].term, cands[i].len, cands[i].weight)) {
            cli_error("out of memory");
            goto done;
        }
    if (tt_cloud_layout(&cloud, font, &o, &err)) {
        cli_error("%s", tt_error_format(&err, msg, sizeof msg));
        goto done;
    }
    tt_status st = tt_cloud_svg(&cloud, font, &o, &svg);
    if (!st) st = tt_outfile_open(&out, output, &err);
    if (!st) st = tt_outfile_write(&out, svg.data, svg.len, &err);
    if (!st) st = tt_outfile_commit(&out, &err);
    if (st) {
        tt_outfile_abort(&out);
        cli_error("%s", err.status ? tt_error_format(&err, msg, sizeof msg) : tt_status_name(st));
        goto done;
    }
    if (cloud.unplaced)
        cli_error("%zu of %zu words did not fit the %d x %d canvas and are not drawn (try "
                  "--shrink, a larger canvas or fewer words with --top)",
                  cloud.unplaced, cloud.n, o.width, o.height);
    else if (cloud.factor < 1 && !pipe.quiet)
        cli_note("sizes lowered to %.0f%% so that all %zu words fit", cloud.factor * 100,
                 cloud.n);
    if (read_docs)
        cli_reading_summary(&pipe, "cloud", &sum, NULL);
    rc = read_docs && sum.skipped ? TT_EXIT_TROUBLE : TT_EXIT_OK;
done:
    tt_buf_release(&svg);
    tt_cloud_release(&cloud);
    tt_font_free(font);
    tt_tsv_release(&tsv);
    tt_free(cands);
    tt_free(entries);
    tt_termtable_free(table);
    tt_source_list_release(&inputs);
    cli_pipeline_release(&pipe);
    return rc;
}
