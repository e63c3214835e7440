/* termtide — weighted word clouds: sizes from weights, a collision-free
 * layout on the words' real glyph outlines, and the SVG picture. */
#ifndef TT_CLOUD_H
#define TT_CLOUD_H

#include <stddef.h>
#include <stdint.h>
#include "termtide/buf.h"
#include "termtide/font.h"
#include "termtide/status.h"

/* How a weight becomes a font size between min_size and max_size. */
typedef enum tt_cloud_scale {
    TT_CLOUD_SQRT = 0, /* size grows with the square root: area follows weight */
    TT_CLOUD_LINEAR,
    TT_CLOUD_LOG       /* log(1 + weight): for long-tailed counts */
} tt_cloud_scale;

typedef struct tt_cloud_options {
    int width, height;         /* canvas, px (default 900 x 600) */
    double min_size, max_size; /* font size of the lightest / heaviest word, px */
    tt_cloud_scale scale;
    uint64_t seed;             /* start angles and turned words */
    int rotate_some;           /* turn about one word in four a quarter turn */
    int shrink;                /* lower all sizes until every word fits */
    int text;                  /* <text> elements instead of outline paths */
    int change;                /* signed weights: rise (> 0) and fall (< 0) */
    const char *title;         /* the picture's title (escaped) */
    const char *weight_name;   /* what a weight is, e.g. "count", "log ratio" */
    const char *font_family;   /* for <text>; NULL: the font's own name */
} tt_cloud_options;

/* Defaults: 900 x 600, sizes 10..72, square-root scale, seed 1, no turned
 * words, no shrinking, outline paths, weights "count". */
void tt_cloud_options_init(tt_cloud_options *o);

typedef struct tt_cloud_word {
    char *term;        /* owned, NUL-terminated */
    size_t len;
    double weight;
    double size;       /* font size after layout, px */
    int placed;        /* 0: did not fit */
    int vertical;      /* reads upward */
    int x, y, w, h;    /* the ink mask's box on the canvas, px */
    double ox, oy;     /* pen origin in SVG coordinates */
} tt_cloud_word;

typedef struct tt_cloud {
    tt_cloud_word *words; /* heaviest first after tt_cloud_layout */
    size_t n, cap;
    size_t unplaced;      /* words that did not fit */
    double factor;        /* size factor --shrink settled on (1 = none) */
    int width, height;    /* canvas */
    int area_height;      /* the words' area above the legend */
} tt_cloud;

/* A cloud owns its words (copies of the terms); the caller frees them with
 * tt_cloud_release() (tt_cloud_clear releases and starts again empty). */
void tt_cloud_init(tt_cloud *c);
void tt_cloud_release(tt_cloud *c);
void tt_cloud_clear(tt_cloud *c);

/* Adds a word (copied; a term longer than TT_LIMIT_CLOUD_WORD_BYTES is cut at
 * a character boundary and ends in an ellipsis). A weight that is not finite
 * is TT_EINVAL; past TT_LIMIT_CLOUD_WORDS words TT_ELIMIT. */
tt_status tt_cloud_add(tt_cloud *c, const char *term, size_t len, double weight);

/* Sorts the words heaviest first (|weight|, then term bytewise), gives each
 * a size, and places them one by one along an Archimedean spiral from the
 * centre (r = a·θ, stretched to the canvas' aspect), testing each candidate
 * position against a bitmap of the ink already placed (one bit per pixel,
 * ink grown by a gap of 1 px or more so words never touch). Words that fit nowhere stay
 * unplaced and are counted in c->unplaced; with o->shrink every size is
 * lowered by 10% and the layout redone until all fit (or sizes would fall
 * below 1 px). Deterministic for the same words, options and seed. Sizes,
 * canvas and options out of range are TT_EINVAL with err filled. */
tt_status tt_cloud_layout(tt_cloud *c, tt_font *f, const tt_cloud_options *o, tt_error *err);

/* The layout's own check: rasterises every placed word again at its place
 * and counts pixels inked by two or more words, and inked pixels outside the
 * canvas. Both are 0 for a correct layout. */
tt_status tt_cloud_verify(const tt_cloud *c, tt_font *f, size_t *overlap, size_t *outside);

/* Writes the picture (appended to out, which the caller owns): title, a <desc> with the method and every word's
 * weight, the words (outline paths with <title> and aria-label, or <text>),
 * a legend and the caution. Appends to out. */
tt_status tt_cloud_svg(const tt_cloud *c, tt_font *f, const tt_cloud_options *o, tt_buf *out);

#endif
