/* termtide — charts.
 *
 * Every chart is drawn the same way: a title and a line saying what the data
 * are, a plot area with round tick values (Heckbert 1990) and light grid
 * lines, axis titles with units, a legend where colour or shape carries
 * meaning, and the caution line at the foot. Labels are measured with the
 * same font that draws them (font.c), so a label that would not fit its room
 * is cut and ends in an ellipsis instead of running into its neighbour. All
 * text goes through the single SVG escaper.
 *
 * Colours (chosen for this project; see also cloud.c): rise blue and fall
 * orange on the blue-orange axis that red-green colour-vision deficiencies
 * keep; sequential values (heat map) on one hue whose lightness alone
 * orders them; series of a line chart carry a marker shape of their own as
 * well as a colour, so identity never rests on colour alone. Statistical
 * significance is shown by fill (solid vs outline), not by colour.
 *
 * Cost: linear in the rows of the table, plus a sort of the rows kept. */
#include <math.h>
#include <stdarg.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "termtide/alloc.h"
#include "termtide/chart.h"
#include "termtide/limits.h"
#include "termtide/meta.h"
#include "termtide/stats.h"
#include "termtide/svg.h"
#include "tt_internal.h"

#define RISE "#2f6aa8"
#define FALL "#a14d0a"
#define INK "#222222"
#define SOFT "#555555"
#define GRID "#e3e6ea"

static const char *const series_colour[8] = { "#1e4a73", "#c0702e", "#5b8fc4", "#7a3300",
                                              "#555555", "#2e7d6f", "#9c4f7e", "#b8902a" };

static const char *const kind_names[] = { "bars", "lines", "heatmap", "histogram", "polygon",
                                          "cumulative", "box", "scatter", "treemap" };

tt_status tt_chart_kind_parse(const char *name, tt_chart_kind *out)
{
    for (size_t i = 0; i < sizeof kind_names / sizeof kind_names[0]; i++)
        if (!strcmp(name, kind_names[i])) {
            *out = (tt_chart_kind)i;
            return TT_OK;
        }
    return TT_EINVAL;
}

const char *tt_chart_kind_name(tt_chart_kind k)
{
    return (size_t)k < sizeof kind_names / sizeof kind_names[0] ? kind_names[k] : "?";
}

void tt_chart_options_init(tt_chart_options *o)
{
    memset(o, 0, sizeof *o);
    o->width = 900;
    o->height = 560;
    o->max_q = 0.05;
}

/* ---- round ticks ------------------------------------------------------- */

/* Heckbert's nice number: 1, 2, 5 or 10 times a power of ten near x. */
static double nice_num(double x, int round_it)
{
    double e = floor(log10(x)), f = x / pow(10, e), nf;
    if (round_it)
        nf = f < 1.5 ? 1 : f < 3 ? 2 : f < 7 ? 5 : 10;
    else
        nf = f <= 1 ? 1 : f <= 2 ? 2 : f <= 5 ? 5 : 10;
    return nf * pow(10, e);
}

size_t tt_chart_ticks(double lo, double hi, size_t n, double *first, double *step)
{
    if (!(hi > lo)) {
        double pad = fabs(lo) > 0 ? fabs(lo) * 0.5 : 1;
        hi = lo + pad;
        if (lo > 0)
            lo = 0;
    }
    if (n < 2)
        n = 2;
    double range = nice_num(hi - lo, 0);
    double d = nice_num(range / (double)(n - 1), 1);
    double start = floor(lo / d) * d, end = ceil(hi / d) * d;
    *first = start;
    *step = d;
    return (size_t)lround((end - start) / d) + 1;
}

static int tick_decimals(double step)
{
    int d = 0;
    while (d < 6 && fabs(step * pow(10, d) - round(step * pow(10, d))) > 1e-9)
        d++;
    return d;
}

/* ---- squarified treemap ------------------------------------------------ */

/* The worst aspect ratio of a row of areas with sum s, extremes lo and hi,
 * laid along a side of length w (Bruls, Huizing & van Wijk 2000, eq. 1). */
static double worst(double s, double lo, double hi, double w)
{
    double a = w * w * hi / (s * s), b = s * s / (w * w * lo);
    return a > b ? a : b;
}

tt_status tt_chart_squarify(const double *values, size_t n, double x, double y, double w,
                            double h, double *out)
{
    double total = 0;
    for (size_t i = 0; i < n; i++)
        total += values[i];
    if (n == 0 || !(total > 0))
        return TT_OK;
    double *a = tt_reallocarray(NULL, n, sizeof *a);
    if (!a)
        return TT_ENOMEM;
    for (size_t i = 0; i < n; i++)
        a[i] = values[i] * (w * h) / total;
    size_t i = 0;
    while (i < n) {
        double side = w < h ? w : h;
        double s = a[i], lo = a[i], hi = a[i], cur = worst(s, lo, hi, side);
        size_t j = i + 1;
        /* grow the row while its worst aspect ratio does not get worse */
        while (j < n) {
            double s2 = s + a[j], lo2 = a[j] < lo ? a[j] : lo, hi2 = a[j] > hi ? a[j] : hi;
            double w2 = worst(s2, lo2, hi2, side);
            if (w2 > cur)
                break;
            s = s2;
            lo = lo2;
            hi = hi2;
            cur = w2;
            j++;
        }
        if (j == n) {
            /* the last row takes the whole remaining rectangle */
            s = 0;
            for (size_t k = i; k < n; k++)
                s += a[k];
        }
        if (w >= h) { /* a column along the left, h tall */
            double cw = h > 0 ? s / h : 0, yy = y;
            for (size_t k = i; k < j; k++) {
                double hk = cw > 0 ? a[k] / cw : 0;
                out[4 * k] = x;
                out[4 * k + 1] = yy;
                out[4 * k + 2] = cw;
                out[4 * k + 3] = hk;
                yy += hk;
            }
            x += cw;
            w -= cw;
        } else { /* a row along the top, w wide */
            double rh = w > 0 ? s / w : 0, xx = x;
            for (size_t k = i; k < j; k++) {
                double wk = rh > 0 ? a[k] / rh : 0;
                out[4 * k] = xx;
                out[4 * k + 1] = y;
                out[4 * k + 2] = wk;
                out[4 * k + 3] = rh;
                xx += wk;
            }
            y += rh;
            h -= rh;
        }
        i = j;
    }
    tt_free(a);
    return TT_OK;
}

/* ---- the drawing context ----------------------------------------------- */

typedef struct cv {
    tt_buf *b;
    tt_font *f;
    const tt_chart_options *o;
    const char *family;
    tt_status st;
    double px, py, pw, ph; /* plot area */
} cv;

static void put(cv *c, const char *fmt, ...)
{
    if (c->st)
        return;
    va_list ap;
    va_start(ap, fmt);
    c->st = tt_svg_vput(c->b, fmt, ap);
    va_end(ap);
}

/* The longest prefix of s (whole characters) that fits maxw px with an
 * ellipsis after it; the ellipsis is written into buf. Returns the label. */
static const char *fit(cv *c, const char *s, double size, double maxw, char *buf, size_t cap,
                       size_t *len)
{
    size_t n = strlen(s);
    *len = n;
    /* a label longer than the font stage sets is cut first, whatever room */
    int too_long = n > TT_LIMIT_CLOUD_WORD_BYTES || n > cap - 4;
    if (!too_long && (maxw <= 0 || tt_font_advance(c->f, s, n, size) <= maxw))
        return s;
    if (maxw <= 0)
        maxw = 1e9;
    size_t most = cap - 4 < TT_LIMIT_CLOUD_WORD_BYTES - 3 ? cap - 4 : TT_LIMIT_CLOUD_WORD_BYTES - 3;
    size_t k = n < most ? n + 1 : most + 1;
    while (k > 0) {
        k--;
        while (k > 0 && ((unsigned char)s[k] & 0xC0) == 0x80)
            k--;
        memcpy(buf, s, k);
        memcpy(buf + k, "\xE2\x80\xA6", 3);
        if (tt_font_advance(c->f, buf, k + 3, size) <= maxw)
            break;
    }
    if (k == 0)
        memcpy(buf, "\xE2\x80\xA6", 3);
    *len = k + 3;
    buf[*len] = '\0';
    return buf;
}

/* A label: anchor 0 start, 1 middle, 2 end; maxw > 0 cuts it to fit. */
static void label(cv *c, const char *s, double size, double x, double y, int anchor, int vertical,
                  const char *fill, double maxw)
{
    if (c->st)
        return;
    char buf[TT_LIMIT_CLOUD_WORD_BYTES + 8];
    size_t len;
    const char *t = fit(c, s, size, maxw, buf, sizeof buf, &len);
    c->st = tt_font_label(c->f, c->b, t, len, size, x, y, anchor, vertical, fill, c->o->text,
                          c->family);
}

static double width_of(cv *c, const char *s, double size)
{
    size_t n = strlen(s);
    if (n > TT_LIMIT_CLOUD_WORD_BYTES) { /* measure what the label can hold */
        n = TT_LIMIT_CLOUD_WORD_BYTES;
        while (n > 0 && ((unsigned char)s[n] & 0xC0) == 0x80)
            n--;
    }
    return tt_font_advance(c->f, s, n, size);
}

/* Text colour on a fill: white on dark fills, near-black on light ones,
 * whichever keeps the larger WCAG 2 contrast. */
static const char *text_on(const char *hex)
{
    unsigned rgb[3] = { 0, 0, 0 };
    for (int i = 0; i < 3; i++) {
        for (int k = 1; k <= 2; k++) {
            char ch = hex[1 + 2 * i + k - 1];
            unsigned d = ch >= 'a' ? (unsigned)(ch - 'a' + 10) : (unsigned)(ch - '0');
            rgb[i] = rgb[i] * 16 + d;
        }
    }
    double lum = 0;
    const double wgt[3] = { 0.2126, 0.7152, 0.0722 };
    for (int i = 0; i < 3; i++) {
        double c = rgb[i] / 255.0;
        c = c <= 0.03928 ? c / 12.92 : pow((c + 0.055) / 1.055, 2.4);
        lum += wgt[i] * c;
    }
    return 1.05 / (lum + 0.05) >= (lum + 0.05) / 0.05 ? "#ffffff" : "#111111";
}

static void numtext(double v, int decimals, char *out)
{
    tt_svg_number(v, decimals, out);
}

/* The frame: document, title, subtitle, caution. desc is the method. */
static void frame_begin(cv *c, const char *title, const char *subtitle, const char *desc)
{
    tt_buf d;
    tt_buf_init(&d, 0);
    tt_status st = tt_buf_printf(&d, "%s. %s %s", subtitle, desc, tt_svg_caution);
    if (!st)
        st = tt_svg_begin(c->b, c->o->width, c->o->height, title, d.data, d.len);
    tt_buf_release(&d);
    c->st = st;
    label(c, title, 17, 20, 28, 0, 0, INK, c->o->width - 40);
    label(c, subtitle, 11.5, 20, 46, 0, 0, SOFT, c->o->width - 40);
}

static void frame_end(cv *c)
{
    label(c, tt_svg_caution, 9, 20, c->o->height - 8, 0, 0, "#777777", c->o->width - 40);
    if (!c->st)
        c->st = tt_svg_end(c->b);
}

/* A value axis (vertical, on the left) from lo to hi; returns the scale
 * through t0 and t1 (the tick range actually drawn). */
static void y_axis(cv *c, double lo, double hi, const char *title, double *t0, double *t1)
{
    double first, step;
    size_t n = tt_chart_ticks(lo, hi, 6, &first, &step);
    *t0 = first;
    *t1 = first + step * (double)(n - 1);
    int dec = tick_decimals(step);
    for (size_t k = 0; k < n; k++) {
        double v = first + step * (double)k;
        double y = c->py + c->ph - (v - *t0) / (*t1 - *t0) * c->ph;
        put(c, "<line x1=\"%n\" y1=\"%n\" x2=\"%n\" y2=\"%n\" stroke=\"%r\" stroke-width=\"1\"/>\n",
            c->px, y, c->px + c->pw, y, fabs(v) < step / 1e6 && lo < 0 ? "#999999" : GRID);
        char num[48];
        numtext(v, dec, num);
        label(c, num, 11, c->px - 6, y + 4, 2, 0, SOFT, 0);
    }
    label(c, title, 11.5, c->px - 52, c->py + c->ph / 2, 1, 1, INK, c->ph);
}

static double y_of(const cv *c, double v, double t0, double t1)
{
    return c->py + c->ph - (v - t0) / (t1 - t0) * c->ph;
}

/* Category labels under the plot, one per slot; every k-th when crowded. */
static void x_categories(cv *c, const char *const *names, size_t n, const char *title)
{
    double slot = c->pw / (double)n;
    size_t every = 1;
    double widest = 0;
    for (size_t i = 0; i < n; i++) {
        double w = width_of(c, names[i], 11);
        if (w > widest) widest = w;
    }
    while (every < n && slot * (double)every < (widest < 70 ? widest : 70) + 8)
        every++;
    for (size_t i = 0; i < n; i += every)
        label(c, names[i], 11, c->px + slot * ((double)i + 0.5), c->py + c->ph + 16, 1, 0, SOFT,
              slot * (double)every - 6);
    label(c, title, 11.5, c->px + c->pw / 2, c->py + c->ph + 36, 1, 0, INK, c->pw);
}

/* ---- table access --------------------------------------------------------- */

static long col(const tt_tsv *t, const char *source, const char *name, tt_error *err)
{
    long k = tt_tsv_column(t, name);
    if (k < 0 && !err->status) /* the first missing column is named */
        tt_error_set(err, TT_EPARSE, source, -1,
                     "no column '%s': this chart needs a table with it (see termtide help "
                     "chart)", name);
    return k;
}

static const char *cell(const tt_tsv *t, size_t r, long c)
{
    return tt_tsv_cell(t, r, (size_t)c);
}

static double num(const tt_tsv *t, size_t r, long c)
{
    double v;
    if (!tt_tsv_number(t, r, (size_t)c, &v))
        return NAN;
    return v;
}

/* A list of distinct strings in first-seen order (periods, terms). */
typedef struct names {
    const char **v;
    size_t n, cap;
} names;

static long names_find(const names *s, const char *x)
{
    for (size_t i = 0; i < s->n; i++)
        if (!strcmp(s->v[i], x))
            return (long)i;
    return -1;
}

static tt_status names_add(names *s, const char *x, long *at)
{
    long k = names_find(s, x);
    if (k >= 0) {
        if (at) *at = k;
        return TT_OK;
    }
    if (s->n == s->cap) {
        size_t nc = s->cap ? 2 * s->cap : 16;
        const char **v = tt_reallocarray(s->v, nc, sizeof *v);
        if (!v)
            return TT_ENOMEM;
        s->v = v;
        s->cap = nc;
    }
    if (at) *at = (long)s->n;
    s->v[s->n++] = x;
    return TT_OK;
}

static int cmp_str(const void *a, const void *b)
{
    return strcmp(*(const char *const *)a, *(const char *const *)b);
}

/* ---- diverging bars --------------------------------------------------------- */

typedef struct mover {
    const char *term;
    double v, q;
} mover;

static int by_value_desc(const void *pa, const void *pb)
{
    const mover *a = pa, *b = pb;
    if (a->v != b->v)
        return a->v > b->v ? -1 : 1;
    return strcmp(a->term, b->term);
}

static tt_status draw_bars(cv *c, const tt_tsv *t, const char *src, tt_error *err)
{
    const tt_chart_options *o = c->o;
    const char *vname = o->value ? o->value : "log_ratio";
    long cterm = col(t, src, "term", err), cbase = col(t, src, "base", err),
         ctarget = col(t, src, "target", err), cv_ = col(t, src, vname, err);
    if (cterm < 0 || cbase < 0 || ctarget < 0 || cv_ < 0)
        return err->status;
    long cq = tt_tsv_column(t, "q_value"), cent = tt_tsv_column(t, "entity"),
         cdir = tt_tsv_column(t, "direction");
    const char *base, *target, *entity = o->entity;
    char pairbuf[256];
    if (o->pair) {
        snprintf(pairbuf, sizeof pairbuf, "%s", o->pair);
        char *comma = strchr(pairbuf, ',');
        if (!comma)
            return tt_error_set(err, TT_EINVAL, NULL, -1, "--pair: expected BASE,TARGET");
        *comma = '\0';
        base = pairbuf;
        target = comma + 1;
        /* one entity's rows: the last entity holding this pair */
        for (size_t r = t->nrows; r-- > 0 && cent >= 0 && !entity;)
            if (!strcmp(cell(t, r, cbase), base) && !strcmp(cell(t, r, ctarget), target))
                entity = cell(t, r, cent);
    } else {
        base = cell(t, t->nrows - 1, cbase);
        target = cell(t, t->nrows - 1, ctarget);
        if (!entity && cent >= 0)
            entity = cell(t, t->nrows - 1, cent);
    }
    mover *m = tt_reallocarray(NULL, t->nrows, sizeof *m);
    if (!m)
        return TT_ENOMEM;
    size_t n = 0;
    for (size_t r = 0; r < t->nrows; r++) {
        if (strcmp(cell(t, r, cbase), base) || strcmp(cell(t, r, ctarget), target))
            continue;
        if (entity && cent >= 0 && strcmp(cell(t, r, cent), entity))
            continue;
        double v = num(t, r, cv_);
        if (!isfinite(v) || v == 0)
            continue;
        if (cdir >= 0 && !strcmp(vname, "g2") && !strcmp(cell(t, r, cdir), "fall"))
            v = -fabs(v); /* G² has no sign: the direction gives it */
        m[n].term = cell(t, r, cterm);
        m[n].v = v;
        m[n].q = cq >= 0 ? num(t, r, cq) : NAN;
        n++;
    }
    if (!n) {
        tt_free(m);
        return tt_error_set(err, TT_EINVAL, src, -1, "no rows with a %s for %s -> %s", vname,
                            base, target);
    }
    qsort(m, n, sizeof *m, by_value_desc);
    size_t top = o->top ? o->top : 10;
    /* the strongest rises (from the front) and falls (from the back) */
    size_t nr = 0, nf = 0;
    while (nr < n && m[nr].v > 0) nr++;
    nf = n - nr;
    size_t kr = nr < top ? nr : top, kf = nf < top ? nf : top;
    mover *keep = m; /* kr rises, then kf falls moved next to them */
    memmove(keep + kr, m + n - kf, kf * sizeof *m);
    size_t k = kr + kf;
    double vmax = 0;
    for (size_t i = 0; i < k; i++)
        if (fabs(keep[i].v) > vmax) vmax = fabs(keep[i].v);

    char title[512], sub[512];
    snprintf(title, sizeof title, "%s", o->title ? o->title : "Top movers");
    snprintf(sub, sizeof sub, "%s%s%s \xE2\x86\x92 %s: %s; strongest rises: %zu, falls: %zu",
             entity ? entity : "", entity ? ", " : "", base, target, vname, kr, kf);
    frame_begin(c, title, sub,
                "Diverging bar chart drawn by termtide from a compare table: rises to the right, "
                "falls to the left; a solid bar has q at or below the threshold "
                "(Benjamini-Hochberg), an outlined bar does not.");
    /* labels sit beside the zero line, on the side away from the bar */
    double lab = 0;
    for (size_t i = 0; i < k; i++) {
        double w = width_of(c, keep[i].term, 11.5);
        if (w > lab) lab = w;
    }
    if (lab > 160) lab = 160;
    c->px = 60;
    c->py = 64;
    c->pw = o->width - 80;
    c->ph = o->height - 64 - 92;
    double first, step;
    size_t nt = tt_chart_ticks(-vmax, vmax, 7, &first, &step);
    double t1 = fmax(fabs(first), fabs(first + step * (double)(nt - 1)));
    double zero = c->px + c->pw / 2;
    double half = c->pw / 2 - lab - 12;
    if (half < 40) half = 40;
    int dec = tick_decimals(step);
    /* vertical grid at round values */
    for (double v = -floor(t1 / step) * step; v <= t1 + step / 2; v += step) {
        double x = zero + v / t1 * half;
        put(c, "<line x1=\"%n\" y1=\"%n\" x2=\"%n\" y2=\"%n\" stroke=\"%r\"/>\n", x, c->py, x,
            c->py + c->ph, fabs(v) < step / 1e6 ? "#888888" : GRID);
        char nb[48];
        numtext(fabs(v) < step / 1e6 ? 0 : v, dec, nb);
        label(c, nb, 10.5, x, c->py + c->ph + 14, 1, 0, SOFT, 0);
    }
    char axis[160];
    snprintf(axis, sizeof axis, "%s (%s)", vname,
             !strcmp(vname, "log_ratio") ? "log2 of the ratio of rates; 1 = doubled"
             : !strcmp(vname, "rate_change") ? "per 10,000 words"
             : !strcmp(vname, "g2") ? "log-likelihood, signed by the direction" : "from the table");
    label(c, axis, 11.5, zero, c->py + c->ph + 32, 1, 0, INK, c->pw);
    double slot = c->ph / (double)k, bh = slot * 0.7;
    if (bh > 26) bh = 26;
    for (size_t i = 0; i < k; i++) {
        const mover *mv = &keep[i];
        double yc = c->py + slot * ((double)i + 0.5);
        double len = fabs(mv->v) / t1 * half;
        double x = mv->v > 0 ? zero : zero - len;
        const char *colr = mv->v > 0 ? RISE : FALL;
        int sig = isfinite(mv->q) && mv->q <= o->max_q;
        put(c, "<rect x=\"%n\" y=\"%n\" width=\"%n\" height=\"%n\" fill=\"%r\" stroke=\"%r\" "
               "stroke-width=\"1.5\"><title>%s: %n (q %n)</title></rect>\n",
            x, yc - bh / 2, len, bh, sig ? colr : "#ffffff", colr, mv->term, mv->v,
            isfinite(mv->q) ? mv->q : -1.0);
        label(c, mv->term, 11.5, mv->v > 0 ? zero - 6 : zero + 6, yc + 4, mv->v > 0 ? 2 : 0, 0,
              INK, lab);
    }
    /* legend */
    double ly = o->height - 30, lx = 20;
    put(c, "<rect x=\"%n\" y=\"%n\" width=\"14\" height=\"10\" fill=\"%r\"/>\n", lx, ly - 9, RISE);
    label(c, "rise", 11, lx + 18, ly, 0, 0, INK, 0);
    lx += 60;
    put(c, "<rect x=\"%n\" y=\"%n\" width=\"14\" height=\"10\" fill=\"%r\"/>\n", lx, ly - 9, FALL);
    label(c, "fall", 11, lx + 18, ly, 0, 0, INK, 0);
    lx += 60;
    put(c, "<rect x=\"%n\" y=\"%n\" width=\"14\" height=\"10\" fill=\"#ffffff\" stroke=\"%r\" "
           "stroke-width=\"1.5\"/>\n", lx, ly - 9, SOFT);
    char q[256], qn[48];
    numtext(o->max_q, 4, qn);
    snprintf(q, sizeof q, "outlined: not significant (q > %s, Benjamini-Hochberg); solid: q "
                          "\xE2\x89\xA4 %s", qn, qn);
    label(c, q, 11, lx + 18, ly, 0, 0, INK, o->width - lx - 40);
    frame_end(c);
    tt_free(m);
    return c->st;
}

/* ---- series by period (lines, heat map) ----------------------------------- */

typedef struct grid2 {
    names terms, periods; /* periods: every slot of the axis, gaps included */
    double *v;            /* terms.n x periods.n, NaN where absent */
    const char *entity;
    size_t present;       /* periods with rows */
    char *gapnames;       /* the names of gap slots */
} grid2;

static void grid2_release(grid2 *g)
{
    tt_free(g->terms.v);
    tt_free(g->periods.v);
    tt_free(g->v);
    tt_free(g->gapnames);
}

/* When every period is a year, quarter or month of one class, orders them
 * on the calendar and inserts the missing periods between as gap slots, so
 * the axis keeps time's spacing and a missing quarter shows as missing (as
 * trend treats it). Otherwise the periods stay in text order. */
static tt_status calendar_slots(grid2 *g)
{
    size_t n = g->periods.n;
    g->present = n;
    long *idx = tt_reallocarray(NULL, n, sizeof *idx);
    if (!idx)
        return TT_ENOMEM;
    tt_period first;
    memset(&first, 0, sizeof first);
    int ok = 1;
    for (size_t i = 0; i < n && ok; i++) {
        tt_period p;
        if (tt_period_parse(g->periods.v[i], strlen(g->periods.v[i]), &p, NULL) ||
            p.granularity == TT_PERIOD_DAY || (i && !tt_period_same_class(&p, &first))) {
            ok = 0;
            break;
        }
        if (!i)
            first = p;
        idx[i] = tt_period_index(&p);
    }
    long lo = 0, hi = 0;
    for (size_t i = 0; i < n && ok; i++) {
        if (!i || idx[i] < lo) lo = idx[i];
        if (!i || idx[i] > hi) hi = idx[i];
    }
    size_t slots = ok ? (size_t)(hi - lo + 1) : 0;
    if (!ok || slots > 400 || slots < n) {
        tt_free(idx);
        return TT_OK;
    }
    const char **v = tt_calloc(slots, sizeof *v);
    g->gapnames = tt_calloc(slots, TT_PERIOD_TEXT_MAX);
    if (!v || !g->gapnames) {
        tt_free(v);
        tt_free(idx);
        return TT_ENOMEM;
    }
    for (size_t i = 0; i < n; i++)
        v[idx[i] - lo] = g->periods.v[i];
    for (size_t k = 0; k < slots; k++) {
        if (v[k])
            continue;
        long x = lo + (long)k;
        tt_period p = first;
        if (p.granularity == TT_PERIOD_YEAR) {
            p.year = (int)x;
        } else if (p.granularity == TT_PERIOD_QUARTER) {
            p.year = (int)(x / 4);
            p.quarter = (int)(x % 4) + 1;
        } else {
            p.year = (int)(x / 12);
            p.month = (int)(x % 12) + 1;
        }
        v[k] = tt_period_format(&p, g->gapnames + k * TT_PERIOD_TEXT_MAX, TT_PERIOD_TEXT_MAX);
    }
    tt_free(g->periods.v);
    g->periods.v = v;
    g->periods.n = g->periods.cap = slots;
    tt_free(idx);
    return TT_OK;
}

/* Terms x periods of one entity from a trend rates table. */
static tt_status read_grid(const tt_tsv *t, const char *src, const tt_chart_options *o, size_t top,
                           grid2 *g, tt_error *err)
{
    memset(g, 0, sizeof *g);
    long cterm = col(t, src, "term", err), cper = col(t, src, "period", err),
         crate = col(t, src, "rate", err);
    if (cterm < 0 || cper < 0 || crate < 0)
        return err->status;
    long cent = tt_tsv_column(t, "entity");
    g->entity = o->entity ? o->entity : cent >= 0 ? cell(t, 0, cent) : NULL;
    tt_status st = TT_OK;
    for (size_t r = 0; r < t->nrows && !st; r++) {
        if (g->entity && cent >= 0 && strcmp(cell(t, r, cent), g->entity))
            continue;
        st = names_add(&g->periods, cell(t, r, cper), NULL);
        if (!st && (g->terms.n < top || names_find(&g->terms, cell(t, r, cterm)) >= 0))
            st = names_add(&g->terms, cell(t, r, cterm), NULL);
    }
    if (st)
        return st;
    if (!g->terms.n)
        return tt_error_set(err, TT_EINVAL, src, -1, "no rows for entity %s",
                            g->entity ? g->entity : "");
    qsort(g->periods.v, g->periods.n, sizeof *g->periods.v, cmp_str);
    st = calendar_slots(g);
    if (st)
        return st;
    g->v = tt_reallocarray(NULL, g->terms.n * g->periods.n, sizeof *g->v);
    if (!g->v)
        return TT_ENOMEM;
    for (size_t i = 0; i < g->terms.n * g->periods.n; i++)
        g->v[i] = NAN;
    for (size_t r = 0; r < t->nrows; r++) {
        if (g->entity && cent >= 0 && strcmp(cell(t, r, cent), g->entity))
            continue;
        long ti = names_find(&g->terms, cell(t, r, cterm));
        long pi = names_find(&g->periods, cell(t, r, cper));
        if (ti >= 0 && pi >= 0)
            g->v[(size_t)ti * g->periods.n + (size_t)pi] = num(t, r, crate);
    }
    return TT_OK;
}

static void marker(cv *c, int shape, double x, double y, const char *colr)
{
    double s = 4.5;
    switch (shape % 6) {
    case 0: put(c, "<circle cx=\"%n\" cy=\"%n\" r=\"%n\" fill=\"%r\"/>\n", x, y, s, colr); break;
    case 1: put(c, "<rect x=\"%n\" y=\"%n\" width=\"%n\" height=\"%n\" fill=\"%r\"/>\n", x - s, y - s,
                2 * s, 2 * s, colr); break;
    case 2: put(c, "<path d=\"M%n %nL%n %nL%n %nZ\" fill=\"%r\"/>\n", x, y - s * 1.2, x + s * 1.1,
                y + s * 0.8, x - s * 1.1, y + s * 0.8, colr); break;
    case 3: put(c, "<path d=\"M%n %nL%n %nL%n %nL%n %nZ\" fill=\"%r\"/>\n", x, y - s * 1.3,
                x + s * 1.1, y, x, y + s * 1.3, x - s * 1.1, y, colr); break;
    case 4: put(c, "<circle cx=\"%n\" cy=\"%n\" r=\"%n\" fill=\"#ffffff\" stroke=\"%r\" "
                   "stroke-width=\"2\"/>\n", x, y, s, colr); break;
    default: put(c, "<rect x=\"%n\" y=\"%n\" width=\"%n\" height=\"%n\" fill=\"#ffffff\" "
                    "stroke=\"%r\" stroke-width=\"2\"/>\n", x - s, y - s, 2 * s, 2 * s, colr); break;
    }
}

/* What a value of a lines or heat-map chart is. */
static const char *unit_of(const tt_chart_options *o)
{
    return o->unit && o->unit[0] ? o->unit : "rate per 10,000 words";
}

static tt_status draw_lines(cv *c, const tt_tsv *t, const char *src, tt_error *err)
{
    const tt_chart_options *o = c->o;
    grid2 g;
    size_t top = o->top ? o->top : 6;
    if (top > 8) top = 8;
    tt_status st = read_grid(t, src, o, top, &g, err);
    if (st) {
        grid2_release(&g);
        return st;
    }
    double vmax = 0;
    for (size_t i = 0; i < g.terms.n * g.periods.n; i++)
        if (isfinite(g.v[i]) && g.v[i] > vmax) vmax = g.v[i];
    char sub[512];
    snprintf(sub, sizeof sub, "%s%s%zu terms across %zu periods, %s%s",
             g.entity ? g.entity : "", g.entity ? ": " : "", g.terms.n, g.present, unit_of(o),
             g.present < g.periods.n ? "; dashed across periods without documents" : "");
    frame_begin(c, o->title ? o->title : "Terms across periods", sub,
                "Line chart drawn by termtide from a trend table (rates): one line and marker "
                "shape per term; a period without documents leaves a gap.");
    /* legend on the right */
    double legw = 0;
    for (size_t i = 0; i < g.terms.n; i++) {
        double w = width_of(c, g.terms.v[i], 11.5);
        if (w > legw) legw = w;
    }
    if (legw > 150) legw = 150;
    c->px = 80;
    c->py = 66;
    c->pw = o->width - c->px - legw - 60;
    c->ph = o->height - c->py - 78;
    double t0, t1;
    y_axis(c, 0, vmax, unit_of(o), &t0, &t1);
    x_categories(c, g.periods.v, g.periods.n, "period");
    double slot = c->pw / (double)g.periods.n;
    for (size_t i = 0; i < g.terms.n; i++) {
        const char *colr = series_colour[i % 8];
        /* the line, broken where a period has no value */
        int open = 0;
        for (size_t p = 0; p < g.periods.n; p++) {
            double v = g.v[i * g.periods.n + p];
            if (!isfinite(v)) {
                if (open) put(c, "\" fill=\"none\" stroke=\"%r\" stroke-width=\"2\"/>\n", colr);
                open = 0;
                continue;
            }
            double x = c->px + slot * ((double)p + 0.5), y = y_of(c, v, t0, t1);
            if (!open) put(c, "<path d=\"M%n %n", x, y);
            else put(c, "L%n %n", x, y);
            open = 1;
        }
        if (open) put(c, "\" fill=\"none\" stroke=\"%r\" stroke-width=\"2\"/>\n", colr);
        /* a dashed line across periods without documents */
        long prev = -1;
        for (size_t p = 0; p < g.periods.n; p++) {
            double v = g.v[i * g.periods.n + p];
            if (!isfinite(v))
                continue;
            if (prev >= 0 && (size_t)prev + 1 < p)
                put(c, "<line x1=\"%n\" y1=\"%n\" x2=\"%n\" y2=\"%n\" stroke=\"%r\" "
                       "stroke-width=\"1.5\" stroke-dasharray=\"4 4\"/>\n",
                    c->px + slot * ((double)prev + 0.5),
                    y_of(c, g.v[i * g.periods.n + (size_t)prev], t0, t1),
                    c->px + slot * ((double)p + 0.5), y_of(c, v, t0, t1), colr);
            prev = (long)p;
        }
        for (size_t p = 0; p < g.periods.n; p++) {
            double v = g.v[i * g.periods.n + p];
            if (isfinite(v))
                marker(c, (int)i, c->px + slot * ((double)p + 0.5), y_of(c, v, t0, t1), colr);
        }
        double ly = c->py + 10 + 22 * (double)i;
        double lx = c->px + c->pw + 20;
        put(c, "<line x1=\"%n\" y1=\"%n\" x2=\"%n\" y2=\"%n\" stroke=\"%r\" stroke-width=\"2\"/>\n",
            lx, ly, lx + 22, ly, colr);
        marker(c, (int)i, lx + 11, ly, colr);
        label(c, g.terms.v[i], 11.5, lx + 28, ly + 4, 0, 0, INK, legw);
    }
    frame_end(c);
    grid2_release(&g);
    return c->st;
}

/* The heat map's ramp: one blue hue from near white to deep navy, by
 * linear interpolation in sRGB between three stops; lightness falls
 * monotonically, so the order reads without colour vision. */
static void ramp(double t, char out[8])
{
    static const int stop[3][3] = { { 0xf4, 0xf7, 0xfb }, { 0x7f, 0xa7, 0xcc }, { 0x0f, 0x2e, 0x4f } };
    if (!(t >= 0)) t = 0;
    if (t > 1) t = 1;
    int k = t < 0.5 ? 0 : 1;
    double u = t < 0.5 ? t * 2 : (t - 0.5) * 2;
    int rgb[3];
    for (int i = 0; i < 3; i++)
        rgb[i] = (int)lround(stop[k][i] + (stop[k + 1][i] - stop[k][i]) * u);
    snprintf(out, 8, "#%02x%02x%02x", rgb[0], rgb[1], rgb[2]);
}

static tt_status draw_heatmap(cv *c, const tt_tsv *t, const char *src, tt_error *err)
{
    const tt_chart_options *o = c->o;
    grid2 g;
    size_t top = o->top ? o->top : 25;
    tt_status st = read_grid(t, src, o, top, &g, err);
    if (st) {
        grid2_release(&g);
        return st;
    }
    double vmax = 0;
    for (size_t i = 0; i < g.terms.n * g.periods.n; i++)
        if (isfinite(g.v[i]) && g.v[i] > vmax) vmax = g.v[i];
    double first, step;
    size_t nt = tt_chart_ticks(0, vmax, 5, &first, &step);
    double top_v = first + step * (double)(nt - 1);
    /* rows at most 32 px tall: a short map gets a shorter picture */
    tt_chart_options o2 = *o;
    double need = 64 + 32.0 * (double)g.terms.n + 78;
    if (need < 300) need = 300;
    if (need < o2.height) o2.height = (int)need;
    c->o = o = &o2;
    char sub[512];
    snprintf(sub, sizeof sub, "%s%s%zu terms by %zu periods, %s%s",
             g.entity ? g.entity : "", g.entity ? ": " : "", g.terms.n, g.present, unit_of(o),
             g.present < g.periods.n ? "; hatched: no documents" : "");
    frame_begin(c, o->title ? o->title : "Heat map of terms by period", sub,
                "Heat map drawn by termtide from a trend table (rates): darker is a higher rate; "
                "a hatched cell has no documents.");
    double lab = 0;
    for (size_t i = 0; i < g.terms.n; i++) {
        double w = width_of(c, g.terms.v[i], 11);
        if (w > lab) lab = w;
    }
    if (lab > 150) lab = 150;
    c->px = 20 + lab + 8;
    c->py = 64;
    c->pw = o->width - c->px - 90;
    c->ph = o->height - c->py - 78;
    double cw = c->pw / (double)g.periods.n, ch = c->ph / (double)g.terms.n;
    if (ch > 32) {
        ch = 32;
        c->ph = ch * (double)g.terms.n;
    }
    int dec = tick_decimals(step);
    for (size_t i = 0; i < g.terms.n; i++) {
        double y = c->py + ch * (double)i;
        label(c, g.terms.v[i], 11, c->px - 8, y + ch / 2 + 4, 2, 0, INK, lab);
        for (size_t p = 0; p < g.periods.n; p++) {
            double v = g.v[i * g.periods.n + p], x = c->px + cw * (double)p;
            char colr[8];
            if (!isfinite(v)) {
                put(c, "<rect x=\"%n\" y=\"%n\" width=\"%n\" height=\"%n\" fill=\"#ffffff\" "
                       "stroke=\"#cccccc\"/>\n", x, y, cw, ch);
                put(c, "<line x1=\"%n\" y1=\"%n\" x2=\"%n\" y2=\"%n\" stroke=\"#cccccc\"/>\n", x, y + ch,
                    x + cw, y);
                continue;
            }
            double u = top_v > 0 ? v / top_v : 0;
            ramp(u, colr);
            put(c, "<rect x=\"%n\" y=\"%n\" width=\"%n\" height=\"%n\" fill=\"%r\" stroke=\"#ffffff\">"
                   "<title>%s, %s: %n</title></rect>\n",
                x, y, cw, ch, colr, g.terms.v[i], g.periods.v[p], v);
            char nb[48];
            numtext(v, v >= 100 ? 0 : 1, nb);
            if (ch >= 14 && width_of(c, nb, 10) < cw - 4)
                label(c, nb, 10, x + cw / 2, y + ch / 2 + 3.5, 1, 0, u > 0.55 ? "#ffffff" : INK, 0);
        }
    }
    /* periods under the grid */
    double save_ph = c->ph;
    x_categories(c, g.periods.v, g.periods.n, "period");
    c->ph = save_ph;
    /* the colour scale */
    double sx = c->px + c->pw + 20, sy = c->py, sh = c->ph < 200 ? c->ph : 200;
    for (int k = 0; k < 40; k++) {
        char colr[8];
        ramp(1 - (k + 0.5) / 40.0, colr);
        put(c, "<rect x=\"%n\" y=\"%n\" width=\"14\" height=\"%n\" fill=\"%r\"/>\n", sx,
            sy + sh * k / 40.0, sh / 40.0 + 0.3, colr);
    }
    for (size_t k = 0; k < nt; k++) {
        double v = first + step * (double)k;
        double y = sy + sh - v / top_v * sh;
        char nb[48];
        numtext(v, dec, nb);
        put(c, "<line x1=\"%n\" y1=\"%n\" x2=\"%n\" y2=\"%n\" stroke=\"%r\"/>\n", sx + 14, y, sx + 18,
            y, SOFT);
        label(c, nb, 10, sx + 21, y + 3.5, 0, 0, SOFT, 0);
    }
    label(c, unit_of(o), 10, sx + 48, sy + sh / 2, 1, 1, SOFT, sh);
    frame_end(c);
    grid2_release(&g);
    return c->st;
}

/* ---- frequency distribution ------------------------------------------------ */

static tt_status draw_distribution(cv *c, tt_chart_kind kind, const tt_tsv *t, const char *src,
                                   tt_error *err)
{
    const tt_chart_options *o = c->o;
    long cclass = col(t, src, "class", err), cterms = col(t, src, "terms", err),
         cshare = col(t, src, "share", err), ccum = col(t, src, "cum_terms", err),
         ccs = col(t, src, "cum_share", err);
    if (cclass < 0 || cterms < 0 || cshare < 0 || ccum < 0 || ccs < 0)
        return err->status;
    long cdoc = tt_tsv_column(t, "document");
    const char *doc = o->document;
    if (!doc && cdoc >= 0) {
        doc = cell(t, 0, cdoc);
        for (size_t r = 0; r < t->nrows; r++)
            if (!strcmp(cell(t, r, cdoc), "*"))
                doc = "*";
    }
    const char **cls = tt_reallocarray(NULL, t->nrows, sizeof *cls);
    double *v = tt_reallocarray(NULL, t->nrows, sizeof *v);
    if (!cls || !v) {
        tt_free(cls);
        tt_free(v);
        return TT_ENOMEM;
    }
    size_t n = 0;
    for (size_t r = 0; r < t->nrows; r++) {
        if (doc && cdoc >= 0 && strcmp(cell(t, r, cdoc), doc))
            continue;
        long cc = kind == TT_CHART_CUMULATIVE ? (o->relative ? ccs : ccum)
                                               : (o->relative ? cshare : cterms);
        cls[n] = cell(t, r, cclass);
        v[n] = num(t, r, cc);
        if (o->relative)
            v[n] *= 100;
        n++;
    }
    if (!n) {
        tt_free(cls);
        tt_free(v);
        return tt_error_set(err, TT_EINVAL, src, -1, "no rows for document %s", doc ? doc : "");
    }
    double vmax = 0;
    for (size_t i = 0; i < n; i++)
        if (isfinite(v[i]) && v[i] > vmax) vmax = v[i];
    const char *what = kind == TT_CHART_HISTOGRAM ? "Histogram" : kind == TT_CHART_POLYGON
                                                                    ? "Frequency polygon"
                                                                    : "Cumulative frequency";
    char title[256], sub[512];
    snprintf(title, sizeof title, "%s of terms by count class", what);
    snprintf(sub, sizeof sub, "%s%s: %zu count classes; classes are unequal (1, 2-4, "
                              "5-9, 10-19, ...), each drawn as one slot",
             !doc || !strcmp(doc, "*") ? "all documents" : "document ",
             doc && strcmp(doc, "*") ? doc : "", n);
    frame_begin(c, o->title ? o->title : title, sub,
                "Drawn by termtide from a count table (--show classes): how many distinct terms "
                "occur a number of times within each class; a count on a class edge is in the "
                "higher class.");
    c->px = 80;
    c->py = 66;
    c->pw = o->width - 110;
    c->ph = o->height - c->py - 78;
    double t0, t1;
    const char *yt = kind == TT_CHART_CUMULATIVE
                         ? (o->relative ? "cumulative share of distinct terms (%)"
                                        : "distinct terms, cumulative")
                         : (o->relative ? "share of distinct terms (%)" : "distinct terms");
    y_axis(c, 0, vmax, yt, &t0, &t1);
    x_categories(c, cls, n, "times a term occurs (count class)");
    double slot = c->pw / (double)n;
    if (kind == TT_CHART_HISTOGRAM) {
        for (size_t i = 0; i < n; i++) {
            double y = y_of(c, isfinite(v[i]) ? v[i] : 0, t0, t1);
            put(c, "<rect x=\"%n\" y=\"%n\" width=\"%n\" height=\"%n\" fill=\"%r\"><title>%s: %n"
                   "</title></rect>\n",
                c->px + slot * (double)i + 1, y, slot - 2, c->py + c->ph - y, series_colour[0],
                cls[i], v[i]);
        }
    } else {
        put(c, "<path d=\"");
        for (size_t i = 0; i < n; i++)
            put(c, "%r%n %n", i ? "L" : "M", c->px + slot * ((double)i + 0.5),
                y_of(c, isfinite(v[i]) ? v[i] : 0, t0, t1));
        put(c, "\" fill=\"none\" stroke=\"%r\" stroke-width=\"2\"/>\n", series_colour[0]);
        for (size_t i = 0; i < n; i++)
            marker(c, 0, c->px + slot * ((double)i + 0.5), y_of(c, isfinite(v[i]) ? v[i] : 0, t0, t1),
                   series_colour[0]);
    }
    frame_end(c);
    tt_free(cls);
    tt_free(v);
    return c->st;
}

/* ---- per-document rates (box plot, scatter) -------------------------------- */

typedef struct docrate {
    const char *document, *period;
    double rate;
} docrate;

/* The rows of one term from a trend tfidf table: rate = count / words per
 * 10,000 words (documents without words left out). */
static tt_status read_docrates(const tt_tsv *t, const char *src, const char *entity,
                               const char *term, docrate **out, size_t *n, tt_error *err)
{
    long cterm = col(t, src, "term", err), cdoc = col(t, src, "document", err),
         cper = col(t, src, "period", err), ccount = col(t, src, "count", err),
         cwords = col(t, src, "words", err);
    if (cterm < 0 || cdoc < 0 || cper < 0 || ccount < 0 || cwords < 0)
        return err->status;
    long cent = tt_tsv_column(t, "entity");
    docrate *d = tt_reallocarray(NULL, t->nrows, sizeof *d);
    if (!d)
        return TT_ENOMEM;
    size_t k = 0;
    for (size_t r = 0; r < t->nrows; r++) {
        if (strcmp(cell(t, r, cterm), term))
            continue;
        if (entity && cent >= 0 && strcmp(cell(t, r, cent), entity))
            continue;
        double cnt = num(t, r, ccount), words = num(t, r, cwords);
        if (!(words > 0) || !isfinite(cnt))
            continue;
        d[k].document = cell(t, r, cdoc);
        d[k].period = cell(t, r, cper);
        d[k].rate = cnt / words * 10000.0;
        k++;
    }
    *out = d;
    *n = k;
    return TT_OK;
}

static const char *first_term(const tt_tsv *t, long cterm, const char *not)
{
    for (size_t r = 0; r < t->nrows; r++)
        if (!not || strcmp(cell(t, r, cterm), not))
            return cell(t, r, cterm);
    return NULL;
}

/* Any numeric column grouped by the period column (a tone table written
 * with document metadata: one row per entity and period, e.g.
 * negative_per_1000). */
static tt_status read_column_by_period(const tt_tsv *t, const char *src, const char *entity,
                                       const char *name, docrate **out, size_t *n, tt_error *err)
{
    long cper = col(t, src, "period", err), cv_ = col(t, src, name, err);
    if (cper < 0 || cv_ < 0)
        return err->status;
    long cent = tt_tsv_column(t, "entity");
    docrate *d = tt_reallocarray(NULL, t->nrows, sizeof *d);
    if (!d)
        return TT_ENOMEM;
    size_t k = 0;
    for (size_t r = 0; r < t->nrows; r++) {
        if (entity && cent >= 0 && strcmp(cell(t, r, cent), entity))
            continue;
        double v = num(t, r, cv_);
        if (!isfinite(v))
            continue;
        d[k].document = cent >= 0 ? cell(t, r, cent) : "";
        d[k].period = cell(t, r, cper);
        d[k].rate = v;
        k++;
    }
    *out = d;
    *n = k;
    return TT_OK;
}

static tt_status draw_box(cv *c, const tt_tsv *t, const char *src, tt_error *err)
{
    const tt_chart_options *o = c->o;
    /* --value COLUMN: that column by period; else a term's rate per document */
    int by_column = o->value != NULL;
    long cterm = by_column ? -1 : col(t, src, "term", err);
    if (!by_column && cterm < 0)
        return err->status;
    const char *term = by_column ? o->value : o->x_term ? o->x_term : first_term(t, cterm, NULL);
    docrate *d = NULL;
    size_t n = 0;
    tt_status st = by_column ? read_column_by_period(t, src, o->entity, term, &d, &n, err)
                             : read_docrates(t, src, o->entity, term, &d, &n, err);
    if (st)
        return st;
    if (!n) {
        tt_free(d);
        return tt_error_set(err, TT_EINVAL, src, -1, "no documents with words for term '%s'",
                            term);
    }
    names periods;
    memset(&periods, 0, sizeof periods);
    for (size_t i = 0; i < n && !st; i++)
        st = names_add(&periods, d[i].period, NULL);
    double *vals = tt_reallocarray(NULL, n, sizeof *vals);
    if (st || !vals) {
        tt_free(d);
        tt_free(vals);
        tt_free(periods.v);
        return TT_ENOMEM;
    }
    qsort(periods.v, periods.n, sizeof *periods.v, cmp_str);
    double vmax = 0;
    for (size_t i = 0; i < n; i++)
        if (d[i].rate > vmax) vmax = d[i].rate;
    char sub[512];
    if (by_column)
        snprintf(sub, sizeof sub, "%s by period (%zu rows, %s%s)", term, n,
                 o->entity ? "entity " : "all entities", o->entity ? o->entity : "");
    else
        snprintf(sub, sizeof sub, "'%s': rate per 10,000 words in each document, by period (%zu "
                                  "documents, %s%s)", term, n,
                 o->entity ? "entity " : "all entities", o->entity ? o->entity : "");
    frame_begin(c, o->title ? o->title : by_column ? "Values by period" : "Rate per document, by period", sub,
                "Box plot drawn by termtide from a table with a period column (trend --show "
                "tfidf, or a column named with --value): box from the 25th "
                "to the 75th percentile (Hyndman & Fan type 6), line at the median, whiskers to "
                "the furthest value within 1.5 IQR of the box (Tukey), points beyond drawn as "
                "outliers.");
    c->px = 80;
    c->py = 66;
    c->pw = o->width - 110;
    c->ph = o->height - c->py - 96;
    double t0, t1;
    y_axis(c, 0, vmax, by_column ? term : "rate per 10,000 words", &t0, &t1);
    x_categories(c, periods.v, periods.n, "period");
    double slot = c->pw / (double)periods.n, bw = slot * 0.45;
    if (bw > 60) bw = 60;
    for (size_t p = 0; p < periods.n; p++) {
        size_t k = 0;
        for (size_t i = 0; i < n; i++)
            if (!strcmp(d[i].period, periods.v[p]))
                vals[k++] = d[i].rate;
        tt_sort_doubles(vals, k);
        double q1 = tt_percentile_sorted(vals, k, 25), med = tt_percentile_sorted(vals, k, 50),
               q3 = tt_percentile_sorted(vals, k, 75), iqr = q3 - q1;
        double lo = q1, hi = q3;
        for (size_t i = 0; i < k; i++) {
            if (vals[i] >= q1 - 1.5 * iqr && vals[i] < lo) lo = vals[i];
            if (vals[i] <= q3 + 1.5 * iqr && vals[i] > hi) hi = vals[i];
        }
        double xc = c->px + slot * ((double)p + 0.5);
        put(c, "<line x1=\"%n\" y1=\"%n\" x2=\"%n\" y2=\"%n\" stroke=\"%r\" stroke-width=\"1.5\"/>\n",
            xc, y_of(c, lo, t0, t1), xc, y_of(c, hi, t0, t1), series_colour[0]);
        put(c, "<line x1=\"%n\" y1=\"%n\" x2=\"%n\" y2=\"%n\" stroke=\"%r\" stroke-width=\"1.5\"/>\n",
            xc - bw / 4, y_of(c, lo, t0, t1), xc + bw / 4, y_of(c, lo, t0, t1), series_colour[0]);
        put(c, "<line x1=\"%n\" y1=\"%n\" x2=\"%n\" y2=\"%n\" stroke=\"%r\" stroke-width=\"1.5\"/>\n",
            xc - bw / 4, y_of(c, hi, t0, t1), xc + bw / 4, y_of(c, hi, t0, t1), series_colour[0]);
        double yq3 = y_of(c, q3, t0, t1), yq1 = y_of(c, q1, t0, t1);
        put(c, "<rect x=\"%n\" y=\"%n\" width=\"%n\" height=\"%n\" fill=\"#dce7f2\" stroke=\"%r\" "
               "stroke-width=\"1.5\"><title>%s: n %u, q1 %n, median %n, q3 %n</title></rect>\n",
            xc - bw / 2, yq3, bw, yq1 - yq3 < 1 ? 1.0 : yq1 - yq3, series_colour[0], periods.v[p],
            k, q1, med, q3);
        put(c, "<line x1=\"%n\" y1=\"%n\" x2=\"%n\" y2=\"%n\" stroke=\"%r\" stroke-width=\"2.5\"/>\n",
            xc - bw / 2, y_of(c, med, t0, t1), xc + bw / 2, y_of(c, med, t0, t1), INK);
        for (size_t i = 0; i < k; i++)
            if (vals[i] < lo || vals[i] > hi)
                put(c, "<circle cx=\"%n\" cy=\"%n\" r=\"3.5\" fill=\"none\" stroke=\"%r\" "
                       "stroke-width=\"1.5\"/>\n", xc, y_of(c, vals[i], t0, t1), FALL);
    }
    label(c, "box: 25th-75th percentile (type 6); bar: median; whiskers: furthest value within "
             "1.5 IQR (Tukey); circles: beyond",
          10.5, 20, o->height - 26, 0, 0, SOFT, o->width - 40);
    frame_end(c);
    tt_free(d);
    tt_free(vals);
    tt_free(periods.v);
    return c->st;
}

static tt_status draw_scatter(cv *c, const tt_tsv *t, const char *src, tt_error *err)
{
    const tt_chart_options *o = c->o;
    long cterm = col(t, src, "term", err);
    if (cterm < 0)
        return err->status;
    const char *xt = o->x_term ? o->x_term : first_term(t, cterm, NULL);
    const char *yt = o->y_term ? o->y_term : first_term(t, cterm, xt);
    if (!yt)
        return tt_error_set(err, TT_EINVAL, src, -1, "a scatter plot needs two terms");
    docrate *dx = NULL, *dy = NULL;
    size_t nx = 0, ny = 0;
    tt_status st = read_docrates(t, src, o->entity, xt, &dx, &nx, err);
    if (!st)
        st = read_docrates(t, src, o->entity, yt, &dy, &ny, err);
    double *x = tt_reallocarray(NULL, nx ? nx : 1, sizeof *x);
    double *y = tt_reallocarray(NULL, nx ? nx : 1, sizeof *y);
    const char **doc = tt_reallocarray(NULL, nx ? nx : 1, sizeof *doc);
    size_t n = 0;
    if (!st && (!x || !y || !doc))
        st = TT_ENOMEM;
    /* pair the two terms' rows by document */
    for (size_t i = 0; i < nx && !st; i++)
        for (size_t j = 0; j < ny; j++)
            if (!strcmp(dx[i].document, dy[j].document)) {
                x[n] = dx[i].rate;
                y[n] = dy[j].rate;
                doc[n] = dx[i].document;
                n++;
                break;
            }
    if (!st && n < 2)
        st = tt_error_set(err, TT_EINVAL, src, -1,
                          "fewer than two documents have both '%s' and '%s' rows", xt, yt);
    if (!st) {
        double r = tt_pearson(x, y, n);
        double xmax = 0, ymax = 0;
        for (size_t i = 0; i < n; i++) {
            if (x[i] > xmax) xmax = x[i];
            if (y[i] > ymax) ymax = y[i];
        }
        char rs[48], sub[512];
        if (isfinite(r))
            tt_svg_number(r, 3, rs);
        else
            snprintf(rs, sizeof rs, "undefined (a constant series)");
        snprintf(sub, sizeof sub, "rate per 10,000 words in each of %zu documents; Pearson's r "
                                  "= %s", n, rs);
        frame_begin(c, o->title ? o->title : "Two terms across documents", sub,
                    "Scatter plot drawn by termtide from a trend table (--show tfidf): one point "
                    "per document; Pearson's r = cov(x, y) / (sd x sd y).");
        c->px = 80;
        c->py = 66;
        c->pw = o->width - 110;
        c->ph = o->height - c->py - 78;
        double t0, t1;
        char axis[300];
        snprintf(axis, sizeof axis, "'%s', rate per 10,000 words", yt);
        y_axis(c, 0, ymax, axis, &t0, &t1);
        double f0, fs;
        size_t nt = tt_chart_ticks(0, xmax, 7, &f0, &fs);
        double u1 = f0 + fs * (double)(nt - 1);
        int dec = tick_decimals(fs);
        for (size_t k = 0; k < nt; k++) {
            double v = f0 + fs * (double)k, xx = c->px + (v - f0) / (u1 - f0) * c->pw;
            put(c, "<line x1=\"%n\" y1=\"%n\" x2=\"%n\" y2=\"%n\" stroke=\"%r\"/>\n", xx, c->py, xx,
                c->py + c->ph, GRID);
            char nb[48];
            numtext(v, dec, nb);
            label(c, nb, 11, xx, c->py + c->ph + 16, 1, 0, SOFT, 0);
        }
        snprintf(axis, sizeof axis, "'%s', rate per 10,000 words", xt);
        label(c, axis, 11.5, c->px + c->pw / 2, c->py + c->ph + 36, 1, 0, INK, c->pw);
        for (size_t i = 0; i < n; i++)
            put(c, "<circle cx=\"%n\" cy=\"%n\" r=\"4.5\" fill=\"%r\" fill-opacity=\"0.75\">"
                   "<title>%s: %n, %n</title></circle>\n",
                c->px + (x[i] - f0) / (u1 - f0) * c->pw, y_of(c, y[i], t0, t1), series_colour[0],
                doc[i], x[i], y[i]);
        frame_end(c);
        st = c->st;
    }
    tt_free(dx);
    tt_free(dy);
    tt_free(x);
    tt_free(y);
    tt_free(doc);
    return st;
}

/* ---- treemap ----------------------------------------------------------------- */

typedef struct cat {
    const char *name;
    double total;
    size_t first, n; /* its words in the word array */
} cat;

typedef struct cword {
    const char *cat, *term;
    double v;
} cword;

static int by_cat_then_value(const void *pa, const void *pb)
{
    const cword *a = pa, *b = pb;
    int k = strcmp(a->cat, b->cat);
    if (k)
        return k;
    if (a->v != b->v)
        return a->v > b->v ? -1 : 1;
    return strcmp(a->term, b->term);
}

static int by_total_desc(const void *pa, const void *pb)
{
    const cat *a = pa, *b = pb;
    if (a->total != b->total)
        return a->total > b->total ? -1 : 1;
    return strcmp(a->name, b->name);
}

static tt_status draw_treemap(cv *c, const tt_tsv *t, const char *src, tt_error *err)
{
    const tt_chart_options *o = c->o;
    long ccat = col(t, src, "category", err), cterm = col(t, src, "term", err),
         cmatch = col(t, src, "matches", err), cw = col(t, src, "weight", err);
    if (ccat < 0 || cterm < 0 || cmatch < 0 || cw < 0)
        return err->status;
    long cdoc = tt_tsv_column(t, "document");
    const char *doc = o->document;
    if (!doc && cdoc >= 0) {
        doc = cell(t, 0, cdoc);
        for (size_t r = 0; r < t->nrows; r++)
            if (!strcmp(cell(t, r, cdoc), "*"))
                doc = "*";
    }
    cword *w = tt_reallocarray(NULL, t->nrows, sizeof *w);
    cat *cats = tt_reallocarray(NULL, t->nrows, sizeof *cats);
    double *vals = tt_reallocarray(NULL, t->nrows, sizeof *vals);
    double *rects = tt_reallocarray(NULL, t->nrows, 4 * sizeof *rects);
    double *inner = tt_reallocarray(NULL, t->nrows, 4 * sizeof *inner);
    tt_status st = w && cats && vals && rects && inner ? TT_OK : TT_ENOMEM;
    size_t n = 0, nc = 0;
    for (size_t r = 0; r < t->nrows && !st; r++) {
        if (doc && cdoc >= 0 && strcmp(cell(t, r, cdoc), doc))
            continue;
        double v = num(t, r, cw); /* the weighted count the entry added */
        if (!(v > 0))
            continue;
        w[n].cat = cell(t, r, ccat);
        w[n].term = cell(t, r, cterm);
        w[n].v = v;
        n++;
    }
    if (!st && !n)
        st = tt_error_set(err, TT_EINVAL, src, -1, "no entries with a weight for document %s",
                          doc ? doc : "");
    if (!st) {
        qsort(w, n, sizeof *w, by_cat_then_value);
        for (size_t i = 0; i < n; i++) {
            if (!nc || strcmp(cats[nc - 1].name, w[i].cat)) {
                cats[nc].name = w[i].cat;
                cats[nc].total = 0;
                cats[nc].first = i;
                cats[nc].n = 0;
                nc++;
            }
            cats[nc - 1].total += w[i].v;
            cats[nc - 1].n++;
        }
        qsort(cats, nc, sizeof *cats, by_total_desc);
        double all = 0;
        for (size_t i = 0; i < nc; i++) {
            vals[i] = cats[i].total;
            all += cats[i].total;
        }
        char sub[512];
        snprintf(sub, sizeof sub, "%s%s: %zu categories; area = share of the weighted matches "
                                  "the table lists; inside, the leading entries",
                 !doc || !strcmp(doc, "*") ? "all documents" : "",
                 doc && strcmp(doc, "*") ? doc : "", nc);
        frame_begin(c, o->title ? o->title : "Tone categories and their leading words", sub,
                    "Treemap drawn by termtide from a tone table (--contributors), squarified "
                    "layout (Bruls, Huizing & van Wijk 2000); entries beyond those listed are "
                    "summed into the category's remaining area.");
        double X = 20, Y = 62, W = o->width - 40, H = o->height - 62 - 24;
        st = tt_chart_squarify(vals, nc, X, Y, W, H, rects);
        size_t top = o->top ? o->top : 6;
        for (size_t i = 0; i < nc && !st && !c->st; i++) {
            const double *R = &rects[4 * i];
            const char *colr = series_colour[i % 8];
            put(c, "<g><rect x=\"%n\" y=\"%n\" width=\"%n\" height=\"%n\" fill=\"%r\" "
                   "stroke=\"#ffffff\" stroke-width=\"3\"/>\n", R[0], R[1], R[2], R[3], colr);
            char head[300], pc[48];
            tt_svg_number(100 * cats[i].total / all, 1, pc);
            snprintf(head, sizeof head, "%s %s%%", cats[i].name, pc);
            if (R[3] > 18)
                label(c, head, 12, R[0] + 6, R[1] + 15, 0, 0, text_on(colr), R[2] - 12);
            /* the leading entries inside, below the heading */
            double iy = R[1] + 22, ih = R[3] - 26;
            size_t k = cats[i].n < top ? cats[i].n : top;
            if (ih > 20 && R[2] > 30 && k) {
                double rest = cats[i].total;
                for (size_t j = 0; j < k; j++) {
                    vals[nc + j < t->nrows ? nc + j : 0] = w[cats[i].first + j].v;
                    rest -= w[cats[i].first + j].v;
                }
                size_t kk = k + (rest > 1e-9 && nc + k < t->nrows ? 1 : 0);
                if (kk > k)
                    vals[nc + k] = rest;
                st = tt_chart_squarify(vals + nc, kk, R[0] + 4, iy, R[2] - 8, ih, inner);
                for (size_t j = 0; j < kk && !st; j++) {
                    const double *Q = &inner[4 * j];
                    const char *nm = j < k ? w[cats[i].first + j].term : "other entries";
                    put(c, "<rect x=\"%n\" y=\"%n\" width=\"%n\" height=\"%n\" fill=\"#ffffff\" "
                           "fill-opacity=\"%r\" stroke=\"%r\"><title>%s: %n</title></rect>\n",
                        Q[0], Q[1], Q[2], Q[3], j < k ? "0.22" : "0.08", colr, nm,
                        j < k ? w[cats[i].first + j].v : rest);
                    if (Q[3] >= 15 && Q[2] >= 24)
                        label(c, nm, Q[3] >= 30 && Q[2] > 60 ? 12 : 10, Q[0] + 4, Q[1] + 13, 0, 0,
                              text_on(colr), Q[2] - 8);
                }
            }
            put(c, "</g>\n");
        }
        frame_end(c);
        if (!st)
            st = c->st;
    }
    tt_free(w);
    tt_free(cats);
    tt_free(vals);
    tt_free(rects);
    tt_free(inner);
    return st;
}

tt_status tt_chart_draw(tt_chart_kind kind, const tt_tsv *table, const char *source, tt_font *f,
                        const tt_chart_options *o, tt_buf *out, tt_error *err)
{
    if (o->width < 300 || o->height < 200 || o->width > TT_LIMIT_CANVAS_SIDE ||
        o->height > TT_LIMIT_CANVAS_SIDE)
        return tt_error_set(err, TT_EINVAL, NULL, -1, "canvas %d x %d px: width 300 to %d, "
                            "height 200 to %d", o->width, o->height, TT_LIMIT_CANVAS_SIDE,
                            TT_LIMIT_CANVAS_SIDE);
    if (!table->nrows)
        return tt_error_set(err, TT_EPARSE, source, -1, "no rows");
    cv c;
    memset(&c, 0, sizeof c);
    c.b = out;
    c.f = f;
    c.o = o;
    c.family = o->font_family ? o->font_family : tt_font_family(f);
    tt_status st;
    switch (kind) {
    case TT_CHART_BARS: st = draw_bars(&c, table, source, err); break;
    case TT_CHART_LINES: st = draw_lines(&c, table, source, err); break;
    case TT_CHART_HEATMAP: st = draw_heatmap(&c, table, source, err); break;
    case TT_CHART_HISTOGRAM:
    case TT_CHART_POLYGON:
    case TT_CHART_CUMULATIVE: st = draw_distribution(&c, kind, table, source, err); break;
    case TT_CHART_BOX: st = draw_box(&c, table, source, err); break;
    case TT_CHART_SCATTER: st = draw_scatter(&c, table, source, err); break;
    case TT_CHART_TREEMAP: st = draw_treemap(&c, table, source, err); break;
    default: return tt_error_set(err, TT_EINVAL, NULL, -1, "unknown chart kind");
    }
    if (st && !err->status)
        tt_error_set(err, st, source, -1, "%s", tt_status_name(st));
    return st;
}
