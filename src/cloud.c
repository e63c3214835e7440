/* termtide — word cloud layout and picture.
 *
 * Layout. Words are sorted heaviest first (|weight| descending, then term
 * bytes, so ties never depend on input order) and placed one at a time. A
 * word's font size comes from its weight by the chosen scale. Its ink is the
 * FreeType rasterisation of its real glyph outlines (font.c): every pixel a
 * glyph touches at all counts, so the test is on the shapes, not on loose
 * boxes, and a small word may sit inside the bowl of a large one.
 *
 * Candidate positions follow an Archimedean spiral r = a·θ from the centre
 * of the words' area (ring spacing 2 px, about 1.5 px along the arc),
 * stretched horizontally to the canvas' aspect; each word starts at its own
 * seeded angle. The first free position wins, so the heaviest words, placed
 * first, sit nearest the centre.
 *
 * Collision test: the placed ink lives in a bitmap of one bit per canvas
 * pixel (rows of 64-bit words). A placed word's ink is written grown by a gap
 * (across its line 1 px for small words, about size/18 for large ones; along
 * its line about a space, size/5), so two words always keep clear pixels
 * between them, anti-aliased edges never meet, and neighbours on one line
 * never read as one word. A candidate tests its own
 * (un-grown) ink rows, shifted to the candidate's column, with AND; the
 * middle row is tested first because it is the likeliest to collide, and the
 * test stops at the first hit. Before it, one bit: the word's ink pixel
 * nearest its middle (the anchor) against the placed ink under it; on a
 * crowded canvas most candidates end there (a 2,000-word cloud tests about
 * a billion candidates, and this made it 20% faster, with the same picture). One test costs (rows x words-per-row) word
 * operations at worst and usually one.
 *
 * Invariants after tt_cloud_layout: every placed word's mask box lies inside
 * [margin, width - margin) x [margin, area_height - margin); no two placed
 * words' ink shares a pixel (tt_cloud_verify recounts this independently of
 * the bitmap). Unplaced words are counted, never silently dropped.
 *
 * Cost: O(words x spiral positions tried x rows tested); positions are at
 * most the words' area / 3 px² per word. */
#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "termtide/alloc.h"
#include "termtide/cloud.h"
#include "termtide/limits.h"
#include "termtide/output.h"
#include "termtide/svg.h"
#include "tt_internal.h"

#define MARGIN 4       /* clear pixels kept along the canvas' edges */
#define LEGEND_H 40    /* the band under the words for the legend */

/* Colours. Chosen for this project by these rules: the data a colour carries
 * is carried by lightness (which every form of colour-vision deficiency keeps),
 * never by hue alone; the two hues of a change cloud sit on the blue-orange
 * axis, which red-green deficiencies (protan, deutan) keep intact and which
 * tritan vision still separates by lightness; every colour keeps a contrast of
 * at least 3.4:1 against the white background (WCAG 2 relative luminance),
 * and the plain ramp 4.7:1, so small words stay readable.
 * Plain cloud: one blue-slate family, darker = heavier (contrast 13.8, 9.2,
 * 6.4, 4.7). Change cloud: rise in blue, fall in burnt orange, darker =
 * larger change (rise 11.0, 5.6, 3.4; fall 9.1, 5.9, 3.8). */
static const char *const plain_ramp[4] = { "#0f2e4f", "#1e4a73", "#2d6291", "#3f78a8" };
static const char *const rise_ramp[3] = { "#0b3c73", "#2f6aa8", "#5b8fc4" };
static const char *const fall_ramp[3] = { "#7a3300", "#a14d0a", "#c0702e" };

void tt_cloud_options_init(tt_cloud_options *o)
{
    memset(o, 0, sizeof *o);
    o->width = 900;
    o->height = 600;
    o->min_size = 10;
    o->max_size = 72;
    o->scale = TT_CLOUD_SQRT;
    o->seed = 1;
    o->title = "Word cloud";
    o->weight_name = "count";
}

void tt_cloud_init(tt_cloud *c)
{
    memset(c, 0, sizeof *c);
    c->factor = 1;
}

void tt_cloud_release(tt_cloud *c)
{
    for (size_t i = 0; i < c->n; i++)
        tt_free(c->words[i].term);
    tt_free(c->words);
    tt_cloud_init(c);
}

void tt_cloud_clear(tt_cloud *c)
{
    tt_cloud_release(c);
}

tt_status tt_cloud_add(tt_cloud *c, const char *term, size_t len, double weight)
{
    if (!isfinite(weight))
        return TT_EINVAL;
    if (c->n >= TT_LIMIT_CLOUD_WORDS)
        return TT_ELIMIT;
    if (c->n == c->cap) {
        size_t nc = c->cap ? c->cap * 2 : 64;
        tt_cloud_word *w = tt_reallocarray(c->words, nc, sizeof *w);
        if (!w)
            return TT_ENOMEM;
        c->words = w;
        c->cap = nc;
    }
    size_t keep = len, extra = 0;
    if (len > TT_LIMIT_CLOUD_WORD_BYTES) {
        keep = TT_LIMIT_CLOUD_WORD_BYTES - 3;
        while (keep > 0 && ((unsigned char)term[keep] & 0xC0) == 0x80)
            keep--; /* never cut inside a character */
        extra = 3;
    }
    char *t = tt_malloc(keep + extra + 1);
    if (!t)
        return TT_ENOMEM;
    memcpy(t, term, keep);
    if (extra)
        memcpy(t + keep, "\xE2\x80\xA6", 3); /* … */
    t[keep + extra] = '\0';
    tt_cloud_word *w = &c->words[c->n++];
    memset(w, 0, sizeof *w);
    w->term = t;
    w->len = keep + extra;
    w->weight = weight;
    return TT_OK;
}

static int by_weight(const void *pa, const void *pb)
{
    const tt_cloud_word *a = pa, *b = pb;
    double wa = fabs(a->weight), wb = fabs(b->weight);
    if (wa != wb)
        return wa > wb ? -1 : 1;
    size_t n = a->len < b->len ? a->len : b->len;
    int k = memcmp(a->term, b->term, n);
    if (k)
        return k;
    if (a->len != b->len)
        return a->len < b->len ? -1 : 1;
    /* equal term: rise before fall, so the order is total */
    return (a->weight < b->weight) - (a->weight > b->weight);
}

static double scaled(tt_cloud_scale s, double w)
{
    w = fabs(w);
    switch (s) {
    case TT_CLOUD_LINEAR: return w;
    case TT_CLOUD_LOG: return log1p(w);
    default: return sqrt(w);
    }
}

/* splitmix64: a small, well-mixed generator; layouts depend only on it. */
static uint64_t next_rand(uint64_t *s)
{
    uint64_t z = (*s += 0x9E3779B97F4A7C15ULL);
    z = (z ^ (z >> 30)) * 0xBF58476D1CE4E5B9ULL;
    z = (z ^ (z >> 27)) * 0x94D049BB133111EBULL;
    return z ^ (z >> 31);
}

/* The occupancy bitmap: the words' area with PAD columns and rows of
 * padding on every side, so a grown word near the edge stays inside. */
typedef struct grid {
    int w, h;      /* the words' area */
    int pad;
    size_t stride; /* 64-bit words per row */
    uint64_t *bits;
} grid;

/* The clear gap kept around a word of a size: across its lines 1 px for
 * small words, growing with the size (5 px at 72 px); along its line about a
 * space's width (size / 5), so two words side by side never read as one. */
static int gap_across(double size)
{
    int g = 1 + (int)(size / 18.0);
    return g > 60 ? 60 : g;
}

static int gap_along(double size)
{
    int g = 2 + (int)(size / 5.0);
    return g > 300 ? 300 : g;
}

/* A word's ink as bit rows (for testing) and the ink grown by gx pixels
 * left and right and gy up and down (for marking). Bit k of a row is column
 * k - gx. */
typedef struct wordbits {
    int w, h;           /* of the ink */
    int gx, gy;
    size_t stride;      /* words per row: w + 2·gx bits plus shift room */
    uint64_t *ink;      /* h rows */
    uint64_t *grown;    /* h + 2·gy rows from row -gy */
    int ax, ay;         /* an ink pixel near the middle, tested first */
} wordbits;

static void set_bit(uint64_t *row, int k)
{
    row[k >> 6] |= (uint64_t)1 << (k & 63);
}

/* Builds the bit rows of a mask (turned when vertical). The growth is a
 * rectangular dilation, done separably: along rows, then along columns,
 * with running counts, so it costs O(area) whatever the gap. */
static tt_status make_bits(const tt_font_mask *m, int vertical, int gx, int gy, wordbits *b)
{
    int w = vertical ? m->h : m->w, h = vertical ? m->w : m->h;
    int gw = w + 2 * gx, gh = h + 2 * gy;
    b->w = w;
    b->h = h;
    b->gx = gx;
    b->gy = gy;
    b->stride = (size_t)(gw + 63) / 64 + 1;
    b->ink = tt_calloc((size_t)h * b->stride, sizeof(uint64_t));
    b->grown = tt_calloc((size_t)gh * b->stride, sizeof(uint64_t));
    unsigned char *rot = tt_calloc((size_t)w * (size_t)h, 1);
    unsigned char *hz = tt_calloc((size_t)gw * (size_t)h, 1);
    tt_status st = b->ink && b->grown && rot && hz ? TT_OK : TT_ENOMEM;
    if (!st) {
        for (int r = 0; r < m->h; r++)
            for (int col = 0; col < m->w; col++) {
                if (!m->ink[(size_t)r * (size_t)m->w + (size_t)col])
                    continue;
                /* turned: row' = m->w - 1 - col, col' = r (see font.h) */
                int rr = vertical ? m->w - 1 - col : r, cc = vertical ? r : col;
                rot[(size_t)rr * (size_t)w + (size_t)cc] = 1;
                set_bit(b->ink + (size_t)rr * b->stride, cc + gx);
            }
        /* along rows: hz[r][k] = any ink in columns k - 2·gx .. k of the padded row */
        for (int r = 0; r < h; r++) {
            int run = 0;
            const unsigned char *src = rot + (size_t)r * (size_t)w;
            unsigned char *dst = hz + (size_t)r * (size_t)gw;
            for (int k = 0; k < gw; k++) {
                int in = k < w ? src[k] : 0, out = k - 2 * gx - 1;
                run += in - (out >= 0 && out < w ? src[out] : 0);
                dst[k] = run > 0;
            }
        }
        /* along columns into the grown bits */
        for (int k = 0; k < gw; k++) {
            int run = 0;
            for (int r = 0; r < gh; r++) {
                int in = r < h ? hz[(size_t)r * (size_t)gw + (size_t)k] : 0, out = r - 2 * gy - 1;
                run += in - (out >= 0 && out < h ? hz[(size_t)out * (size_t)gw + (size_t)k] : 0);
                if (run > 0)
                    set_bit(b->grown + (size_t)r * b->stride, k);
            }
        }
    }
    /* the anchor: the ink pixel nearest the middle (where placed ink is
       likeliest), so most candidates are turned down by one bit test */
    if (!st) {
        long best = -1;
        b->ax = b->ay = 0;
        for (int r = 0; r < h; r++)
            for (int col = 0; col < w; col++)
                if (rot[(size_t)r * (size_t)w + (size_t)col]) {
                    long d = labs((long)(2 * r - h)) + labs((long)(2 * col - w));
                    if (best < 0 || d < best) {
                        best = d;
                        b->ax = col;
                        b->ay = r;
                    }
                }
    }
    tt_free(rot);
    tt_free(hz);
    return st;
}

static void free_bits(wordbits *b)
{
    tt_free(b->ink);
    tt_free(b->grown);
    memset(b, 0, sizeof *b);
}

/* Word k of a bit row shifted left by s bits (towards higher columns). */
static inline uint64_t shifted(const uint64_t *row, size_t k, unsigned s)
{
    uint64_t v = row[k] << s;
    if (s && k > 0)
        v |= row[k - 1] >> (64 - s);
    return v;
}

/* Does the word's ink, its top-left corner at (x, y) of the area, meet
 * placed (grown) ink? */
static int collides(const grid *g, const wordbits *b, int x, int y)
{
    int x0 = x + g->pad - b->gx; /* grid column of bit 0, >= 0 */
    unsigned s = (unsigned)(x0 & 63);
    size_t base = (size_t)(x0 >> 6);
    size_t nk = b->stride;
    int mid = b->h / 2;
    for (int i = -1; i < b->h; i++) {
        int r = i < 0 ? mid : i;
        if (i == mid)
            continue;
        const uint64_t *wr = b->ink + (size_t)r * b->stride;
        const uint64_t *gr = g->bits + (size_t)(y + g->pad + r) * g->stride;
        for (size_t k = 0; k < nk && base + k < g->stride; k++)
            if (shifted(wr, k, s) & gr[base + k])
                return 1;
    }
    return 0;
}

static void mark(grid *g, const wordbits *b, int x, int y)
{
    int x0 = x + g->pad - b->gx;
    unsigned s = (unsigned)(x0 & 63);
    size_t base = (size_t)(x0 >> 6);
    int rows = b->h + 2 * b->gy;
    for (int r = 0; r < rows; r++) {
        int gy = y + g->pad - b->gy + r;
        if (gy < 0 || gy >= g->h + 2 * g->pad)
            continue;
        const uint64_t *wr = b->grown + (size_t)r * b->stride;
        uint64_t *gr = g->bits + (size_t)gy * g->stride;
        for (size_t k = 0; k < b->stride && base + k < g->stride; k++)
            gr[base + k] |= shifted(wr, k, s);
    }
}

/* The spiral's points as whole-pixel offsets from the centre, stretched to
 * the canvas' aspect, computed once per pass and grown on demand: r = a·θ
 * with 2 px between rings and about 1.5 px between points along the arc; a
 * point equal to the one before is not repeated. Each word walks it turned
 * by its own seeded quarter (the signs of the offsets), so words do not all
 * start to the right; integer offsets keep the walk free of floating point. */
typedef struct spiral {
    int *pt; /* dx, dy pairs */
    size_t n, cap;
    double theta, rmax, stretch;
    int done;
} spiral;

static tt_status spiral_more(spiral *s)
{
    const double a = 2.0 / (2 * M_PI);
    if (s->done)
        return TT_OK;
    size_t nc = s->cap ? s->cap * 2 : 4096;
    int *p = tt_reallocarray(s->pt, nc, 2 * sizeof *p);
    if (!p)
        return TT_ENOMEM;
    s->pt = p;
    s->cap = nc;
    while (s->n < s->cap) {
        double r = a * s->theta;
        if (r > s->rmax) {
            s->done = 1;
            break;
        }
        int dx = (int)floor(s->stretch * r * cos(s->theta) + 0.5);
        int dy = (int)floor(r * sin(s->theta) + 0.5);
        s->theta += 1.5 / (r > 1.5 ? r * (s->stretch > 1 ? s->stretch : 1) : 1.5);
        if (s->n && s->pt[2 * s->n - 2] == dx && s->pt[2 * s->n - 1] == dy)
            continue;
        s->pt[2 * s->n] = dx;
        s->pt[2 * s->n + 1] = dy;
        s->n++;
    }
    return TT_OK;
}

/* One layout pass at a size factor. Returns the number of unplaced words.
 * With stop_at_miss the pass ends at the first word that does not fit (it
 * is a --shrink pass that will be redone smaller: the words after it could
 * not change that), so a failed pass costs one walk of the whole spiral, not
 * one per word that does not fit; the pass that is kept is always whole. */
static tt_status layout_pass(tt_cloud *c, tt_font *f, const tt_cloud_options *o, double factor,
                             int stop_at_miss, size_t *unplaced)
{
    grid g;
    g.w = c->width;
    g.h = c->area_height;
    g.pad = gap_along(o->max_size * factor) + 1;
    g.stride = (size_t)(g.w + 2 * g.pad + 63) / 64 + 2;
    g.bits = tt_calloc((size_t)(g.h + 2 * g.pad) * g.stride, sizeof(uint64_t));
    if (!g.bits)
        return TT_ENOMEM;
    double fmin = 0, fmax = 0;
    for (size_t i = 0; i < c->n; i++) {
        double v = scaled(o->scale, c->words[i].weight);
        if (i == 0 || v < fmin) fmin = v;
        if (i == 0 || v > fmax) fmax = v;
    }
    uint64_t rng = o->seed ^ 0x7465726D74696465ULL; /* "termtide" */
    double cx = g.w / 2.0, cy = g.h / 2.0;
    double stretch = (double)g.w / (double)g.h;
    if (stretch < 0.5) stretch = 0.5;
    if (stretch > 4) stretch = 4;
    spiral sp;
    memset(&sp, 0, sizeof sp);
    sp.rmax = hypot(cx / stretch, cy) + 4;
    sp.stretch = stretch;
    tt_font_mask m;
    tt_font_mask_init(&m);
    tt_status st = TT_OK;
    size_t missed = 0;
    for (size_t i = 0; i < c->n && !st; i++) {
        tt_cloud_word *w = &c->words[i];
        double t = fmax > fmin ? (scaled(o->scale, w->weight) - fmin) / (fmax - fmin) : 1.0;
        w->size = (o->min_size + t * (o->max_size - o->min_size)) * factor;
        uint64_t r1 = next_rand(&rng), r2 = next_rand(&rng);
        w->vertical = o->rotate_some && (r1 & 3) == 0;
        w->placed = 0;
        st = tt_font_mask_word(f, w->term, w->len, w->size, &m);
        if (st)
            break;
        wordbits b;
        memset(&b, 0, sizeof b);
        /* the wider gap lies along the word's line, turned with it */
        int ga = gap_along(w->size), gc = gap_across(w->size);
        st = make_bits(&m, w->vertical, w->vertical ? gc : ga, w->vertical ? ga : gc, &b);
        if (st) {
            free_bits(&b);
            break;
        }
        int sx = (r2 & 1) ? -1 : 1, sy = (r2 & 2) ? -1 : 1;
        int fits = b.w <= g.w - 2 * MARGIN && b.h <= g.h - 2 * MARGIN;
        /* the word's top-left corner when its box centre is on the spiral */
        int bx = (int)floor(cx - b.w / 2.0 + 0.5), by = (int)floor(cy - b.h / 2.0 + 0.5);
        for (size_t k = 0; fits; k++) {
            if (k == sp.n && (st = spiral_more(&sp)))
                break;
            if (k >= sp.n)
                break; /* the spiral has left the canvas */
            int x = bx + sx * sp.pt[2 * k], y = by + sy * sp.pt[2 * k + 1];
            if (x < MARGIN || y < MARGIN || x + b.w > g.w - MARGIN || y + b.h > g.h - MARGIN)
                continue;
            /* the anchor pixel on placed ink: a collision, without the full test */
            size_t acol = (size_t)(x + g.pad + b.ax);
            if ((g.bits[(size_t)(y + g.pad + b.ay) * g.stride + (acol >> 6)] >> (acol & 63)) & 1)
                continue;
            if (!collides(&g, &b, x, y)) {
                mark(&g, &b, x, y);
                w->placed = 1;
                w->x = x;
                w->y = y;
                w->w = b.w;
                w->h = b.h;
                if (w->vertical) {
                    /* point (X, Y) of the flat mask lands at (Y, w - X):
                     * the origin (origin_x, origin_y) at (origin_y, w - origin_x) */
                    w->ox = x + m.origin_y;
                    w->oy = y + (m.w - m.origin_x);
                } else {
                    w->ox = x + m.origin_x;
                    w->oy = y + m.origin_y;
                }
                break;
            }
        }
        if (!w->placed)
            missed++;
        free_bits(&b);
        if (missed && stop_at_miss)
            break;
    }
    tt_font_mask_release(&m);
    tt_free(g.bits);
    tt_free(sp.pt);
    *unplaced = missed;
    return st;
}

tt_status tt_cloud_layout(tt_cloud *c, tt_font *f, const tt_cloud_options *o, tt_error *err)
{
    if (o->width < 50 || o->height < 50 || o->width > TT_LIMIT_CANVAS_SIDE ||
        o->height > TT_LIMIT_CANVAS_SIDE)
        return tt_error_set(err, TT_EINVAL, NULL, -1,
                            "canvas %d x %d px: each side must be 50 to %d", o->width, o->height,
                            TT_LIMIT_CANVAS_SIDE);
    if (!(o->min_size >= 1) || !(o->max_size >= o->min_size) || o->max_size > 2000)
        return tt_error_set(err, TT_EINVAL, NULL, -1,
                            "font sizes: need 1 <= min-size <= max-size <= 2000");
    c->width = o->width;
    c->height = o->height;
    c->area_height = o->height - LEGEND_H;
    c->factor = 1;
    c->unplaced = 0;
    if (c->n > 1)
        qsort(c->words, c->n, sizeof *c->words, by_weight);
    double factor = 1;
    for (;;) {
        size_t missed = 0;
        /* a --shrink pass that may be redone can stop at its first miss */
        int redo_possible = o->shrink && o->max_size * factor * 0.9 >= 1;
        tt_status st = layout_pass(c, f, o, factor, redo_possible, &missed);
        if (st == TT_ELIMIT)
            return tt_error_set(err, st, NULL, -1, "a word is too large to set at this size");
        if (st)
            return tt_error_set(err, st, NULL, -1, "word cloud layout: %s", tt_status_name(st));
        c->unplaced = missed;
        c->factor = factor;
        if (!missed || !redo_possible)
            return TT_OK;
        factor *= 0.9;
    }
}

tt_status tt_cloud_verify(const tt_cloud *c, tt_font *f, size_t *overlap, size_t *outside)
{
    *overlap = *outside = 0;
    size_t W = (size_t)c->width, H = (size_t)c->height;
    unsigned char *cnt = tt_calloc(W * H, 1);
    if (!cnt)
        return TT_ENOMEM;
    tt_font_mask m;
    tt_font_mask_init(&m);
    tt_status st = TT_OK;
    for (size_t i = 0; i < c->n && !st; i++) {
        const tt_cloud_word *w = &c->words[i];
        if (!w->placed)
            continue;
        st = tt_font_mask_word(f, w->term, w->len, w->size, &m);
        if (st)
            break;
        /* canvas pixel of mask pixel (col, r) from the pen origin alone */
        for (int r = 0; r < m.h; r++)
            for (int col = 0; col < m.w; col++) {
                if (!m.ink[(size_t)r * (size_t)m.w + (size_t)col])
                    continue;
                long X, Y;
                if (w->vertical) {
                    X = lround(w->ox) - m.origin_y + r;
                    Y = lround(w->oy) - (m.w - m.origin_x) + (m.w - 1 - col);
                } else {
                    X = lround(w->ox) - m.origin_x + col;
                    Y = lround(w->oy) - m.origin_y + r;
                }
                if (X < 0 || Y < 0 || (size_t)X >= W || (size_t)Y >= H) {
                    (*outside)++;
                    continue;
                }
                unsigned char *p = &cnt[(size_t)Y * W + (size_t)X];
                if (*p == 1)
                    (*overlap)++;
                if (*p < 2)
                    (*p)++;
            }
    }
    tt_font_mask_release(&m);
    tt_free(cnt);
    return st;
}

/* The colour of a word: a lightness step by the word's place between the
 * lightest and heaviest weight (sizes already rank them; colour repeats it
 * for readers who compare shades more easily than sizes). */
static const char *word_colour(const tt_cloud_options *o, const tt_cloud_word *w, double lo,
                               double hi)
{
    double t = hi > lo ? (scaled(o->scale, w->weight) - lo) / (hi - lo) : 1;
    if (o->change) {
        int k = t >= 2.0 / 3 ? 0 : t >= 1.0 / 3 ? 1 : 2;
        return w->weight < 0 ? fall_ramp[k] : rise_ramp[k];
    }
    int k = t >= 0.75 ? 0 : t >= 0.5 ? 1 : t >= 0.25 ? 2 : 3;
    return plain_ramp[k];
}

static const char *scale_name(tt_cloud_scale s)
{
    return s == TT_CLOUD_LINEAR ? "linear" : s == TT_CLOUD_LOG ? "logarithmic (log(1 + w))"
                                                              : "square-root";
}

static tt_status put_num(tt_buf *b, double v, int decimals)
{
    char num[48];
    size_t k = tt_svg_number(v, decimals, num);
    return tt_buf_append(b, num, k);
}

tt_status tt_cloud_svg(const tt_cloud *c, tt_font *f, const tt_cloud_options *o, tt_buf *out)
{
    tt_buf desc;
    tt_buf_init(&desc, 0);
    size_t placed = c->n - c->unplaced;
    tt_status st = tt_buf_printf(&desc, "Word cloud of %zu words", placed);
    if (!st && c->unplaced)
        st = tt_buf_printf(&desc, " (%zu more did not fit and are not drawn)", c->unplaced);
    if (!st)
        st = tt_buf_printf(&desc, ". Weight: %s%s. Font size from |weight| on a %s scale, ",
                           o->weight_name, o->change ? " (above 0 a rise, below 0 a fall)" : "",
                           scale_name(o->scale));
    if (!st) st = put_num(&desc, o->min_size * c->factor, 2);
    if (!st) st = tt_buf_puts(&desc, " to ");
    if (!st) st = put_num(&desc, o->max_size * c->factor, 2);
    if (!st) st = tt_buf_printf(&desc, " px%s. Layout by termtide: heaviest first, each word "
                                       "placed at the first free point of an Archimedean spiral "
                                       "from the centre, collisions tested on the rasterised glyph "
                                       "outlines (font %s), seed %llu. Weights:",
                                c->factor < 1 ? " (shrunk to fit)" : "", tt_font_family(f),
                                (unsigned long long)o->seed);
    for (size_t i = 0; i < c->n && !st; i++) {
        st = tt_buf_puts(&desc, i ? "; " : " ");
        if (!st) st = tt_buf_append(&desc, c->words[i].term, c->words[i].len);
        if (!st) st = tt_buf_puts(&desc, " ");
        if (!st) st = put_num(&desc, c->words[i].weight, 4);
        if (!st && !c->words[i].placed) st = tt_buf_puts(&desc, " (not drawn)");
    }
    if (!st) st = tt_buf_printf(&desc, ". %s", tt_svg_caution);
    if (!st) st = tt_svg_begin(out, c->width, c->height, o->title, desc.data, desc.len);
    tt_buf_release(&desc);
    const char *family = o->font_family ? o->font_family : tt_font_family(f);
    double lo = -1, hi = 0; /* the scaled weights' range, for the shades */
    for (size_t i = 0; i < c->n; i++) {
        double v = scaled(o->scale, c->words[i].weight);
        if (lo < 0 || v < lo) lo = v;
        if (v > hi) hi = v;
    }
    if (!st) st = tt_buf_puts(out, "<g class=\"words\">\n");
    for (size_t i = 0; i < c->n && !st; i++) {
        const tt_cloud_word *w = &c->words[i];
        if (!w->placed)
            continue;
        const char *fill = word_colour(o, w, lo, hi);
        if (o->text) {
            st = tt_svg_put(out, "<text x=\"%n\" y=\"%n\" font-family=\"%s\" font-size=\"%n\" "
                                 "fill=\"%s\"",
                            w->ox, w->oy, family, w->size, fill);
            if (!st && w->vertical)
                st = tt_svg_put(out, " transform=\"rotate(-90 %n %n)\"", w->ox, w->oy);
            if (!st)
                st = tt_svg_put(out, "><title>%S (", w->term, w->len);
            if (!st) st = put_num(out, w->weight, 4);
            if (!st)
                st = tt_svg_put(out, ")</title>%S</text>\n", w->term, w->len);
            continue;
        }
        st = tt_svg_put(out, "<path fill=\"%s\" aria-label=\"%S\" d=\"", fill, w->term, w->len);
        if (!st) st = tt_font_word_path(f, w->term, w->len, w->size, w->ox, w->oy, w->vertical, out);
        if (!st) st = tt_svg_put(out, "\"><title>%S (", w->term, w->len);
        if (!st) st = put_num(out, w->weight, 4);
        if (!st) st = tt_buf_puts(out, ")</title></path>\n");
    }
    if (!st) st = tt_buf_puts(out, "</g>\n<g class=\"legend\">\n");
    /* The legend band: swatches and what they mean, then the caution. */
    double ly = c->area_height + 14;
    double x = 8;
    if (!st && o->change) {
        static const char *const lbl[3] = { "large", "medium", "small" };
        for (int side = 0; side < 2 && !st; side++) {
            const char *const *ramp = side ? fall_ramp : rise_ramp;
            const char *name = side ? "fall:" : "rise:";
            st = tt_font_label(f, out, name, strlen(name), 11, x, ly, 0, 0, "#333333", o->text,
                               family);
            x += tt_font_advance(f, name, strlen(name), 11) + 4;
            for (int k = 0; k < 3 && !st; k++) {
                st = tt_svg_put(out, "<rect x=\"%n\" y=\"%n\" width=\"10\" height=\"10\" "
                                     "fill=\"%r\"/>\n", x, ly - 9, ramp[k]);
                x += 13;
                if (!st) st = tt_font_label(f, out, lbl[k], strlen(lbl[k]), 11, x, ly, 0, 0,
                                            "#333333", o->text, family);
                x += tt_font_advance(f, lbl[k], strlen(lbl[k]), 11) + 8;
            }
            x += 10;
        }
    } else if (!st) {
        const char *name = "heavier";
        st = tt_font_label(f, out, name, strlen(name), 11, x, ly, 0, 0, "#333333", o->text, family);
        x += tt_font_advance(f, name, strlen(name), 11) + 4;
        for (int k = 0; k < 4 && !st; k++, x += 12)
            st = tt_svg_put(out, "<rect x=\"%n\" y=\"%n\" width=\"10\" height=\"10\" "
                                 "fill=\"%r\"/>\n", x, ly - 9, plain_ramp[k]);
        name = "lighter";
        if (!st) st = tt_font_label(f, out, name, strlen(name), 11, x + 2, ly, 0, 0, "#333333",
                                    o->text, family);
        x += tt_font_advance(f, name, strlen(name), 11) + 16;
    }
    if (!st) {
        tt_buf note;
        tt_buf_init(&note, 0);
        st = tt_buf_printf(&note, "size: %s%s%s, %s scale; %zu words", o->change ? "|" : "",
                           o->weight_name, o->change ? "|" : "",
                           o->scale == TT_CLOUD_LINEAR ? "linear" : o->scale == TT_CLOUD_LOG
                                                                        ? "log" : "square-root",
                           placed);
        if (!st && c->unplaced)
            st = tt_buf_printf(&note, ", %zu did not fit", c->unplaced);
        if (!st)
            st = tt_font_label(f, out, note.data, note.len, 11, x, ly, 0, 0, "#333333", o->text,
                               family);
        tt_buf_release(&note);
    }
    if (!st)
        st = tt_font_label(f, out, tt_svg_caution, strlen(tt_svg_caution), 9, 8, ly + 16, 0, 0,
                           "#666666", o->text, family);
    if (!st) st = tt_buf_puts(out, "</g>\n");
    if (!st) st = tt_svg_end(out);
    return st;
}
