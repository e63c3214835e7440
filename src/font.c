/* termtide — glyphs through FreeType.
 *
 * A word is set glyph by glyph along one baseline: the pen advances by each
 * glyph's unhinted (linear) advance plus the font's kerning, in FreeType's
 * 26.6 fixed point at 72 dpi, so one point of em size is one pixel of the
 * picture. The same outlines feed two consumers:
 *   - tt_font_mask_word rasterises them (anti-aliased, then any coverage
 *     counted as ink) into a byte mask for the layout's collision test;
 *   - tt_font_word_path writes them as SVG path data (M/L/Q/C, absolute).
 * Because both read the same outline at the same pen positions, a word that
 * fits on the layout's grid fits in the drawn picture. Hinting is off on
 * purpose: hinted outlines snap to the pixel grid of one size and would no
 * longer be the shapes a viewer scales.
 *
 * Cost: one FT_Load_Glyph per glyph per call; masks cost their area. */
#include <ft2build.h>
#include FT_FREETYPE_H
#include FT_OUTLINE_H

#include <math.h>
#include <string.h>

#include "termtide/alloc.h"
#include "termtide/font.h"
#include "termtide/limits.h"
#include "termtide/svg.h"
#include "tt_internal.h"

struct tt_font {
    FT_Library lib;
    FT_Face face;
    long size26; /* the size set on the face, 26.6 */
    char family[128];
};

tt_status tt_font_open(const char *path, tt_font **out, tt_error *err)
{
    *out = NULL;
    tt_font *f = tt_calloc(1, sizeof *f);
    if (!f)
        return tt_error_set(err, TT_ENOMEM, path, -1, "out of memory");
    if (FT_Init_FreeType(&f->lib)) {
        tt_free(f);
        return tt_error_set(err, TT_ENOMEM, path, -1, "cannot start FreeType");
    }
    FT_Error fe = FT_New_Face(f->lib, path, 0, &f->face);
    if (fe) {
        FT_Done_FreeType(f->lib);
        tt_free(f);
        if (fe == FT_Err_Cannot_Open_Resource)
            return tt_error_set(err, TT_ENOENT, path, -1, "cannot open the font file");
        return tt_error_set(err, TT_EPARSE, path, -1, "not a font FreeType can read (error %d)",
                            (int)fe);
    }
    if (!FT_IS_SCALABLE(f->face)) {
        tt_font_free(f);
        return tt_error_set(err, TT_EPARSE, path, -1, "not an outline font");
    }
    tti_strlcpy(f->family, f->face->family_name ? f->face->family_name : "sans-serif",
                sizeof f->family);
    *out = f;
    return TT_OK;
}

void tt_font_free(tt_font *f)
{
    if (!f)
        return;
    FT_Done_Face(f->face);
    FT_Done_FreeType(f->lib);
    tt_free(f);
}

const char *tt_font_family(const tt_font *f)
{
    return f->family;
}

void tt_font_mask_init(tt_font_mask *m)
{
    memset(m, 0, sizeof *m);
}

void tt_font_mask_release(tt_font_mask *m)
{
    tt_free(m->ink);
    tt_font_mask_init(m);
}

static tt_status set_size(tt_font *f, double size)
{
    long s26 = lround(size * 64.0);
    if (s26 < 1)
        s26 = 1;
    if (s26 == f->size26)
        return TT_OK;
    if (FT_Set_Char_Size(f->face, 0, s26, 72, 72))
        return TT_EINVAL;
    f->size26 = s26;
    return TT_OK;
}

/* Calls fn for each glyph of the word with its outline (26.6, unhinted) and
 * pen x; returns the pen advance in *adv26. Glyphs a font lacks are drawn as
 * its .notdef box, so they still take room. */
typedef tt_status (*glyph_fn)(void *ctx, FT_Outline *o, long pen26);

static tt_status each_glyph(tt_font *f, const char *s, size_t len, double size, glyph_fn fn,
                            void *ctx, long *adv26)
{
    if (len > TT_LIMIT_CLOUD_WORD_BYTES)
        return TT_ELIMIT;
    tt_status st = set_size(f, size);
    if (st)
        return st;
    long pen = 0;
    FT_UInt prev = 0;
    int kern = FT_HAS_KERNING(f->face);
    size_t i = 0;
    while (i < len) {
        uint32_t cp;
        i += tti_utf8_decode((const unsigned char *)s + i, len - i, &cp);
        FT_UInt gi = FT_Get_Char_Index(f->face, cp);
        if (kern && prev && gi) {
            FT_Vector dk;
            if (!FT_Get_Kerning(f->face, prev, gi, FT_KERNING_UNFITTED, &dk))
                pen += dk.x;
        }
        if (FT_Load_Glyph(f->face, gi, FT_LOAD_NO_HINTING | FT_LOAD_NO_BITMAP))
            return TT_EPARSE;
        FT_GlyphSlot g = f->face->glyph;
        if (fn && g->format == FT_GLYPH_FORMAT_OUTLINE && g->outline.n_points > 0) {
            st = fn(ctx, &g->outline, pen);
            if (st)
                return st;
        }
        pen += (long)(g->linearHoriAdvance >> 10); /* 16.16 to 26.6 */
        prev = gi;
    }
    if (adv26)
        *adv26 = pen;
    return TT_OK;
}

double tt_font_advance(tt_font *f, const char *s, size_t len, double size)
{
    long adv = 0;
    if (each_glyph(f, s, len, size, NULL, NULL, &adv))
        return 0;
    return (double)adv / 64.0;
}

typedef struct box_ctx {
    long x0, y0, x1, y1;
    int any;
} box_ctx;

static tt_status box_glyph(void *ctx, FT_Outline *o, long pen)
{
    box_ctx *b = ctx;
    FT_BBox cb;
    FT_Outline_Get_CBox(o, &cb);
    cb.xMin += pen;
    cb.xMax += pen;
    if (!b->any || cb.xMin < b->x0) b->x0 = cb.xMin;
    if (!b->any || cb.yMin < b->y0) b->y0 = cb.yMin;
    if (!b->any || cb.xMax > b->x1) b->x1 = cb.xMax;
    if (!b->any || cb.yMax > b->y1) b->y1 = cb.yMax;
    b->any = 1;
    return TT_OK;
}

typedef struct ink_ctx {
    tt_font *f;
    tt_font_mask *m;
    long px0, py1; /* the mask's left column and top row, whole pixels */
    unsigned char *scratch;
    size_t scratch_cap;
} ink_ctx;

/* Rasterises one glyph into its own small bitmap, then ORs it into the mask
 * (FreeType's renderer overwrites coverage, so glyphs that kerning makes
 * touch must not share a target). */
static tt_status ink_glyph(void *ctx, FT_Outline *o, long pen)
{
    ink_ctx *c = ctx;
    FT_BBox cb;
    FT_Outline_Translate(o, pen, 0);
    FT_Outline_Get_CBox(o, &cb);
    long gx0 = (long)floor(cb.xMin / 64.0), gx1 = (long)ceil(cb.xMax / 64.0);
    long gy0 = (long)floor(cb.yMin / 64.0), gy1 = (long)ceil(cb.yMax / 64.0);
    if (gx1 <= gx0) gx1 = gx0 + 1;
    if (gy1 <= gy0) gy1 = gy0 + 1;
    size_t gw = (size_t)(gx1 - gx0), gh = (size_t)(gy1 - gy0);
    if (gw * gh > c->scratch_cap) {
        unsigned char *n = tt_realloc(c->scratch, gw * gh);
        if (!n)
            return TT_ENOMEM;
        c->scratch = n;
        c->scratch_cap = gw * gh;
    }
    memset(c->scratch, 0, gw * gh);
    FT_Outline_Translate(o, -gx0 * 64, -gy0 * 64);
    FT_Bitmap bm;
    memset(&bm, 0, sizeof bm);
    bm.rows = (unsigned)gh;
    bm.width = (unsigned)gw;
    bm.pitch = (int)gw;
    bm.buffer = c->scratch;
    bm.num_grays = 256;
    bm.pixel_mode = FT_PIXEL_MODE_GRAY;
    if (FT_Outline_Get_Bitmap(c->f->lib, o, &bm))
        return TT_EPARSE;
    /* scratch row 0 is y = gy1 - 1 .. gy1; mask row r is y = py1 - r - 1 */
    for (size_t r = 0; r < gh; r++) {
        long mr = c->py1 - (gy1 - (long)r);
        long mc = gx0 - c->px0;
        unsigned char *dst = c->m->ink + (size_t)mr * (size_t)c->m->w + mc;
        const unsigned char *src = c->scratch + r * gw;
        for (size_t k = 0; k < gw; k++)
            dst[k] |= (unsigned char)(src[k] != 0);
    }
    return TT_OK;
}

tt_status tt_font_mask_word(tt_font *f, const char *s, size_t len, double size, tt_font_mask *m)
{
    tt_font_mask_release(m);
    box_ctx b;
    memset(&b, 0, sizeof b);
    long adv = 0;
    tt_status st = each_glyph(f, s, len, size, box_glyph, &b, &adv);
    if (st)
        return st;
    m->advance = (double)adv / 64.0;
    if (!b.any) {
        /* nothing but spaces: an empty mask, nothing to draw */
        m->ink = tt_calloc(1, 1);
        m->w = m->h = 1;
        return m->ink ? TT_OK : TT_ENOMEM;
    }
    long px0 = (long)floor(b.x0 / 64.0), px1 = (long)ceil(b.x1 / 64.0);
    long py0 = (long)floor(b.y0 / 64.0), py1 = (long)ceil(b.y1 / 64.0);
    if (px1 <= px0) px1 = px0 + 1;
    if (py1 <= py0) py1 = py0 + 1;
    if (px1 - px0 > 4L * TT_LIMIT_CANVAS_SIDE || py1 - py0 > 4L * TT_LIMIT_CANVAS_SIDE)
        return TT_ELIMIT;
    m->w = (int)(px1 - px0);
    m->h = (int)(py1 - py0);
    m->origin_x = (int)-px0;
    m->origin_y = (int)py1;
    m->ink = tt_calloc((size_t)m->w * (size_t)m->h, 1);
    if (!m->ink)
        return TT_ENOMEM;
    ink_ctx c = { f, m, px0, py1, NULL, 0 };
    st = each_glyph(f, s, len, size, ink_glyph, &c, NULL);
    tt_free(c.scratch);
    if (st)
        tt_font_mask_release(m);
    return st;
}

typedef struct path_ctx {
    tt_buf *d;
    double ox, oy;
    long pen;
    int vertical;
    int open;
    size_t points;
    tt_status st;
} path_ctx;

static void put_point(path_ctx *c, const FT_Vector *v)
{
    double px = (double)(c->pen + v->x) / 64.0, py = (double)v->y / 64.0;
    double x = c->vertical ? c->ox - py : c->ox + px;
    double y = c->vertical ? c->oy - px : c->oy - py;
    char a[48], b[48];
    size_t na = tt_svg_number(x, 2, a), nb = tt_svg_number(y, 2, b);
    if (!c->st) c->st = tt_buf_append(c->d, a, na);
    if (!c->st) c->st = tt_buf_putc(c->d, ' ');
    if (!c->st) c->st = tt_buf_append(c->d, b, nb);
    if (++c->points > TT_LIMIT_SVG_POINTS && !c->st)
        c->st = TT_ELIMIT;
}

static int cmd(path_ctx *c, char k, const FT_Vector *p1, const FT_Vector *p2, const FT_Vector *p3)
{
    if (!c->st) c->st = tt_buf_putc(c->d, k);
    if (p1) put_point(c, p1);
    if (p2) { if (!c->st) c->st = tt_buf_putc(c->d, ' '); put_point(c, p2); }
    if (p3) { if (!c->st) c->st = tt_buf_putc(c->d, ' '); put_point(c, p3); }
    return c->st ? 1 : 0;
}

static int p_move(const FT_Vector *to, void *u)
{
    path_ctx *c = u;
    if (c->open && !c->st)
        c->st = tt_buf_putc(c->d, 'Z');
    c->open = 1;
    return cmd(c, 'M', to, NULL, NULL);
}
static int p_line(const FT_Vector *to, void *u) { return cmd(u, 'L', to, NULL, NULL); }
static int p_conic(const FT_Vector *k, const FT_Vector *to, void *u) { return cmd(u, 'Q', k, to, NULL); }
static int p_cubic(const FT_Vector *k1, const FT_Vector *k2, const FT_Vector *to, void *u)
{
    return cmd(u, 'C', k1, k2, to);
}

static tt_status path_glyph(void *ctx, FT_Outline *o, long pen)
{
    path_ctx *c = ctx;
    static const FT_Outline_Funcs funcs = { p_move, p_line, p_conic, p_cubic, 0, 0 };
    c->pen = pen;
    c->open = 0;
    FT_Error fe = FT_Outline_Decompose(o, &funcs, c);
    if (c->st)
        return c->st;
    if (fe)
        return TT_EPARSE;
    if (c->open)
        return tt_buf_putc(c->d, 'Z');
    return TT_OK;
}

tt_status tt_font_word_path(tt_font *f, const char *s, size_t len, double size, double ox,
                            double oy, int vertical, tt_buf *d)
{
    path_ctx c;
    memset(&c, 0, sizeof c);
    c.d = d;
    c.ox = ox;
    c.oy = oy;
    c.vertical = vertical;
    return each_glyph(f, s, len, size, path_glyph, &c, NULL);
}

tt_status tt_font_label(tt_font *f, tt_buf *out, const char *s, size_t len, double size,
                        double x, double y, int anchor, int vertical, const char *fill,
                        int text, const char *family)
{
    double adv = anchor ? tt_font_advance(f, s, len, size) : 0;
    double shift = anchor == 1 ? adv / 2 : anchor == 2 ? adv : 0;
    tt_status st;
    if (text) {
        const char *anc = anchor == 1 ? "middle" : anchor == 2 ? "end" : "start";
        st = tt_svg_put(out, "<text x=\"%n\" y=\"%n\" font-family=\"%s\" font-size=\"%n\" "
                             "fill=\"%s\" text-anchor=\"%r\"",
                        x, y, family ? family : f->family, size, fill, anc);
        if (!st && vertical)
            st = tt_svg_put(out, " transform=\"rotate(-90 %n %n)\"", x, y);
        if (!st)
            st = tt_svg_put(out, ">%S</text>\n", s, len);
        return st;
    }
    double ox = vertical ? x : x - shift, oy = vertical ? y + shift : y;
    st = tt_svg_put(out, "<path fill=\"%s\" aria-label=\"%S\" d=\"", fill, s, len);
    if (!st)
        st = tt_font_word_path(f, s, len, size, ox, oy, vertical, out);
    if (!st)
        st = tt_svg_put(out, "\"><title>%S</title></path>\n", s, len);
    return st;
}
