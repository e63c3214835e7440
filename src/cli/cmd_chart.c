/* termtide chart — a chart as SVG from a table termtide wrote. */
#include <stdlib.h>
#include <string.h>

#include "termtide/chart.h"
#include "termtide/font.h"
#include "termtide/limits.h"
#include "termtide/svg.h"
#include "termtide/tsvread.h"
#include "cli.h"

const char tt_help_chart[] =
    "Usage: termtide chart KIND --from TABLE.tsv [OPTIONS]\n"
    "\n"
    "Draws a chart as SVG from a TSV table written by another termtide command.\n"
    "\n"
    "Kinds, and the table each reads:\n"
    "  bars        termtide compare (--show terms): diverging bars of the strongest\n"
    "              rises (right, blue) and falls (left, orange) of one comparison;\n"
    "              a solid bar has q <= --max-q, an outlined one does not\n"
    "  lines       termtide trend (--show rates): one line per term across periods,\n"
    "              each with its own marker shape\n"
    "  heatmap     termtide trend (--show rates): terms x periods, darker = higher rate\n"
    "  histogram   termtide count --show classes: distinct terms per count class\n"
    "  polygon     the same as a frequency polygon\n"
    "  cumulative  the same, cumulative (with --relative: cumulative share)\n"
    "  box         termtide trend --show tfidf: a term's rate per document, one box\n"
    "              per period (or, with --value COLUMN, any table with a period\n"
    "              column, e.g. tone with --manifest): quartiles by Hyndman & Fan\n"
    "              type 6, whiskers to the furthest value within 1.5 IQR (Tukey),\n"
    "              points beyond as outliers\n"
    "  scatter     termtide trend --show tfidf: two terms' rates per document, with\n"
    "              Pearson's r\n"
    "  treemap     termtide tone --contributors: categories by their share of the\n"
    "              weighted count, squarified (Bruls, Huizing & van Wijk 2000), with\n"
    "              each category's leading entries nested inside\n"
    "\n"
    "Options:\n"
    "  --from FILE           the table (TSV with its header; - for standard input)\n"
    "  --value COLUMN        bars: log_ratio (default), rate_change or g2 (signed by\n"
    "                        the direction); box: any numeric\n"
    "                        column grouped by the period column, e.g. a tone table\n"
    "                        written with --manifest and --value negative_per_1000\n"
    "  --pair BASE,TARGET    bars: the comparison to draw (default: the last one)\n"
    "  --entity NAME         rows of this entity (default: the pair's or the first)\n"
    "  --document NAME       histogram, polygon, cumulative, treemap: rows of this\n"
    "                        document (default '*', the total, when present)\n"
    "  --term WORD           box: the term; scatter: the x term (default: the first)\n"
    "  --term2 WORD          scatter: the y term (default: the next one)\n"
    "  --top N               bars: movers each way (10); lines: terms (6, at most 8);\n"
    "                        heatmap: terms (25); treemap: entries per category (6)\n"
    "  --max-q Q             bars: the significance threshold (default 0.05)\n"
    "  --relative            histogram, polygon, cumulative: shares (%) instead of\n"
    "                        numbers of terms\n"
    "  --width PX, --height PX  the canvas (900 x 560)\n"
    "  --title TEXT          the chart's title\n"
    "  --unit TEXT           lines, heatmap: what the rate column holds, for the axis\n"
    "                        (default 'rate per 10,000 words')\n"
    "  --font FILE           the font that measures and draws labels (default DejaVu\n"
    "                        Sans, " TT_FONT_DEFAULT ")\n"
    "  --text                <text> labels instead of outline paths\n"
    "  -o, --output FILE     write the SVG to FILE atomically (default standard output)\n"
    "\n"
    "Tick values are round numbers (1, 2 or 5 times a power of ten); a label too\n"
    "long for its room ends in an ellipsis; every label is escaped.\n"
    "\n"
    "termtide measures language; it gives no investment, legal or compliance advice.\n";

enum { OPT_FROM = 1000, OPT_VALUE, OPT_PAIR, OPT_ENTITY, OPT_DOCUMENT, OPT_TERM, OPT_TERM2,
       OPT_TOP, OPT_MAX_Q, OPT_RELATIVE, OPT_WIDTH, OPT_HEIGHT, OPT_TITLE, OPT_FONT, OPT_TEXT, OPT_UNIT };

static const struct option longopts[] = {
    { "from", required_argument, NULL, OPT_FROM },
    { "value", required_argument, NULL, OPT_VALUE },
    { "pair", required_argument, NULL, OPT_PAIR },
    { "entity", required_argument, NULL, OPT_ENTITY },
    { "document", required_argument, NULL, OPT_DOCUMENT },
    { "term", required_argument, NULL, OPT_TERM },
    { "term2", required_argument, NULL, OPT_TERM2 },
    { "top", required_argument, NULL, OPT_TOP },
    { "max-q", required_argument, NULL, OPT_MAX_Q },
    { "relative", no_argument, NULL, OPT_RELATIVE },
    { "width", required_argument, NULL, OPT_WIDTH },
    { "height", required_argument, NULL, OPT_HEIGHT },
    { "title", required_argument, NULL, OPT_TITLE },
    { "unit", required_argument, NULL, OPT_UNIT },
    { "font", required_argument, NULL, OPT_FONT },
    { "text", no_argument, NULL, OPT_TEXT },
    { "output", required_argument, NULL, 'o' },
    { "help", no_argument, NULL, 'h' },
    { NULL, 0, NULL, 0 }
};

int tt_cmd_chart(int argc, char **argv)
{
    tt_chart_options o;
    tt_chart_options_init(&o);
    const char *from = NULL, *output = NULL, *font_path = TT_FONT_DEFAULT;
    int opt, rc = TT_EXIT_TROUBLE;
    uint64_t v;
    tt_tsv t;
    tt_tsv_init(&t);
    tt_font *font = NULL;
    tt_buf svg;
    tt_buf_init(&svg, 0);
    tt_outfile out;
    memset(&out, 0, sizeof out);
    tt_error err;
    tt_error_init(&err);
    char msg[TT_ERROR_FILE_MAX + TT_ERROR_MSG_MAX + 64];

    optind = 1;
    while ((opt = getopt_long(argc, argv, "o:h", longopts, NULL)) != -1) {
        switch (opt) {
        case OPT_FROM: from = optarg; break;
        case OPT_VALUE: o.value = optarg; break;
        case OPT_PAIR: o.pair = optarg; break;
        case OPT_ENTITY: o.entity = optarg; break;
        case OPT_DOCUMENT: o.document = optarg; break;
        case OPT_TERM: o.x_term = optarg; break;
        case OPT_TERM2: o.y_term = optarg; break;
        case OPT_TOP:
            if (!cli_parse_u64("--top", optarg, 1, 200, &v)) goto done;
            o.top = (size_t)v;
            break;
        case OPT_MAX_Q: {
            char *end;
            double q = strtod(optarg, &end);
            if (!*optarg || *end || !(q > 0 && q <= 1)) {
                cli_error("--max-q: expected a number above 0 and at most 1, got '%s'", optarg);
                goto done;
            }
            o.max_q = q;
            break;
        }
        case OPT_RELATIVE: o.relative = 1; break;
        case OPT_WIDTH:
            if (!cli_parse_u64("--width", optarg, 300, TT_LIMIT_CANVAS_SIDE, &v)) goto done;
            o.width = (int)v;
            break;
        case OPT_HEIGHT:
            if (!cli_parse_u64("--height", optarg, 200, TT_LIMIT_CANVAS_SIDE, &v)) goto done;
            o.height = (int)v;
            break;
        case OPT_TITLE: o.title = optarg; break;
        case OPT_UNIT: o.unit = optarg; break;
        case OPT_FONT: font_path = optarg; break;
        case OPT_TEXT: o.text = 1; break;
        case 'o': output = optarg; break;
        case 'h': fputs(tt_help_chart, stdout); rc = TT_EXIT_OK; goto done;
        default:
            fprintf(stderr, "Try 'termtide help chart'.\n");
            goto done;
        }
    }
    if (optind >= argc) {
        cli_error("which chart? bars, lines, heatmap, histogram, polygon, cumulative, box, "
                  "scatter or treemap (see termtide help chart)");
        goto done;
    }
    tt_chart_kind kind;
    if (tt_chart_kind_parse(argv[optind], &kind)) {
        cli_error("no such chart: '%s' (bars, lines, heatmap, histogram, polygon, cumulative, "
                  "box, scatter, treemap)", argv[optind]);
        goto done;
    }
    if (optind + 1 < argc) {
        cli_error("unexpected argument '%s' (the table comes with --from FILE)", argv[optind + 1]);
        goto done;
    }
    if (!from) {
        cli_error("chart %s needs --from FILE, a table written by termtide", argv[optind]);
        goto done;
    }
    if (tt_font_open(font_path, &font, &err) || tt_tsv_read(from, &t, &err)) {
        cli_error("%s", tt_error_format(&err, msg, sizeof msg));
        goto done;
    }
    tt_status st = tt_chart_draw(kind, &t, from, font, &o, &svg, &err);
    if (!st) st = tt_outfile_open(&out, output, &err);
    if (!st) st = tt_outfile_write(&out, svg.data, svg.len, &err);
    if (!st) st = tt_outfile_commit(&out, &err);
    if (st) {
        tt_outfile_abort(&out);
        cli_error("%s", err.status ? tt_error_format(&err, msg, sizeof msg) : tt_status_name(st));
        goto done;
    }
    rc = TT_EXIT_OK;
done:
    tt_buf_release(&svg);
    tt_font_free(font);
    tt_tsv_release(&t);
    return rc;
}
