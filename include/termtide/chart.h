/* termtide — charts as SVG, drawn from the tables termtide writes: top movers
 * of a comparison, terms across periods, a heat map, the frequency
 * distribution, box plots, a scatter plot and a treemap. */
#ifndef TT_CHART_H
#define TT_CHART_H

#include <stddef.h>
#include "termtide/buf.h"
#include "termtide/font.h"
#include "termtide/status.h"
#include "termtide/tsvread.h"

typedef enum tt_chart_kind {
    TT_CHART_BARS = 0,    /* compare table: diverging bars of the top movers */
    TT_CHART_LINES,       /* trend table (rates): one line per term across periods */
    TT_CHART_HEATMAP,     /* trend table (rates): terms x periods */
    TT_CHART_HISTOGRAM,   /* count --show classes: terms per count class */
    TT_CHART_POLYGON,     /* the same as a frequency polygon */
    TT_CHART_CUMULATIVE,  /* the same, cumulative */
    TT_CHART_BOX,         /* trend --show tfidf: a term's rate per document, by period */
    TT_CHART_SCATTER,     /* trend --show tfidf: two terms' rates per document */
    TT_CHART_TREEMAP      /* tone --contributors: categories and their leading words */
} tt_chart_kind;

/* "bars", "lines", "heatmap", "histogram", "polygon", "cumulative", "box",
 * "scatter", "treemap"; TT_EINVAL otherwise. */
tt_status tt_chart_kind_parse(const char *name, tt_chart_kind *out);
const char *tt_chart_kind_name(tt_chart_kind k);

typedef struct tt_chart_options {
    int width, height;       /* px (default 900 x 560) */
    const char *title;       /* NULL: a title from the data */
    int text;                /* <text> labels instead of outline paths */
    const char *font_family; /* for <text>; NULL: the font's name */
    size_t top;              /* bars: movers each way (10); lines: terms (6); heat
                                map: terms (25); treemap: words per category (6) */
    const char *value;       /* bars: log_ratio (default) or rate_change */
    const char *entity;      /* rows of this entity (default: the first) */
    const char *pair;        /* bars: "BASE,TARGET" (default: the last pair) */
    const char *document;    /* histogram etc.: rows of this document ("*") */
    const char *x_term;      /* box: the term; scatter: the x term */
    const char *y_term;      /* scatter: the y term */
    double max_q;            /* bars: q at or below this is significant (0.05) */
    int relative;            /* histogram etc.: shares instead of numbers */
    const char *unit;        /* lines, heat map: what a value is (default "rate
                                per 10,000 words"; e.g. "per 1,000 words" for a
                                tone table reshaped to term, period, rate) */
} tt_chart_options;

void tt_chart_options_init(tt_chart_options *o);

/* Draws a chart of `kind` from table (read by tt_tsv_read from the file
 * `source`, named in the picture's description) and appends the SVG to out.
 * A table without the columns the kind needs, or without rows to draw, is
 * TT_EPARSE / TT_EINVAL with err naming source and the missing column. Text
 * from the table is escaped; long labels end in an ellipsis. */
tt_status tt_chart_draw(tt_chart_kind kind, const tt_tsv *table, const char *source, tt_font *f,
                        const tt_chart_options *o, tt_buf *out, tt_error *err);

/* Round tick values for an axis from lo to hi with about n ticks: steps of
 * 1, 2 or 5 times a power of ten (Heckbert, "Nice numbers for graph labels",
 * Graphics Gems, 1990). Fills *first and *step; returns the tick count
 * (first + k·step for k < count covers [lo, hi]). */
size_t tt_chart_ticks(double lo, double hi, size_t n, double *first, double *step);

/* The squarified treemap (Bruls, Huizing & van Wijk 2000): lays out n areas
 * (sorted descending, all > 0) in the rectangle (x, y, w, h) so that each
 * rectangle's area is proportional to its value; out receives x, y, w, h per
 * item. TT_ENOMEM on failure. */
tt_status tt_chart_squarify(const double *values, size_t n, double x, double y, double w,
                            double h, double *out);

#endif
