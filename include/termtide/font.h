/* termtide — glyph metrics, outlines and ink masks from a real font through
 * FreeType, so that what the layout measures is exactly what is drawn. */
#ifndef TT_FONT_H
#define TT_FONT_H

#include <stddef.h>
#include <stdint.h>
#include "termtide/buf.h"
#include "termtide/status.h"

/* DejaVu Sans from Debian's fonts-dejavu-core. */
#define TT_FONT_DEFAULT "/usr/share/fonts/truetype/dejavu/DejaVuSans.ttf"

typedef struct tt_font tt_font;

/* Opens a font file (any format FreeType reads; the first face). The caller
 * frees it with tt_font_free(). TT_ENOENT/TT_EPARSE with err naming the
 * file. A font is not thread-safe: use one per thread. */
tt_status tt_font_open(const char *path, tt_font **out, tt_error *err);
void tt_font_free(tt_font *f);

/* The family name ("DejaVu Sans"), owned by the font. */
const char *tt_font_family(const tt_font *f);

/* A word's ink at a size, in whole pixels, read horizontally: w x h bytes,
 * row 0 on top, 1 where any glyph covers any part of the pixel. The word's
 * pen origin (start of the baseline) is at pixel corner (origin_x,
 * origin_y) from the mask's top-left corner. advance is the pen advance. */
typedef struct tt_font_mask {
    int w, h;
    int origin_x, origin_y;
    double advance;
    unsigned char *ink; /* owned; tt_font_mask_release frees it */
} tt_font_mask;

/* A mask owns its ink; tt_font_mask_release frees it (tt_font_mask_word
 * releases the previous contents first, so one mask can be reused). */
void tt_font_mask_init(tt_font_mask *m);
void tt_font_mask_release(tt_font_mask *m);

/* Sets len bytes of UTF-8 at `size` px (em size) and rasterises the glyph
 * outlines, unhinted, with kerning. TT_ELIMIT when the word is longer than
 * TT_LIMIT_CLOUD_WORD_BYTES or its mask larger than the canvas limit. */
tt_status tt_font_mask_word(tt_font *f, const char *s, size_t len, double size, tt_font_mask *m);

/* Appends the SVG path data of the same word (the same outlines as the
 * mask), its pen origin at (ox, oy) in SVG coordinates; vertical turns it a
 * quarter turn counter-clockwise so it reads upward from (ox, oy). */
tt_status tt_font_word_path(tt_font *f, const char *s, size_t len, double size, double ox,
                            double oy, int vertical, tt_buf *d);

/* Appends one label to an SVG: with text = 0 an outline <path> (fill
 * colour, aria-label and a <title> holding the words), else a <text>
 * element in `family` (NULL: the font's family). (x, y) is the baseline
 * point the anchor refers to: anchor 0 start, 1 middle, 2 end; vertical
 * reads upward from it. The string is escaped. */
tt_status tt_font_label(tt_font *f, tt_buf *out, const char *s, size_t len, double size,
                        double x, double y, int anchor, int vertical, const char *fill,
                        int text, const char *family);

/* The advance width of a word at a size, in px (for chart labels). */
double tt_font_advance(tt_font *f, const char *s, size_t len, double size);

#endif
