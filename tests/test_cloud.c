/* Tests of the word cloud (src/cloud.c), its glyphs (src/font.c) and the SVG
 * writer (src/svg.c):
 *   - geometry: on 500 words, long words, a single word, a word larger than
 *     the canvas and turned words, no two words' ink meets and none leaves
 *     the canvas, checked twice: by the layout's own re-rasterisation
 *     (tt_cloud_verify) and independently by rendering the picture with
 *     librsvg (Debian librsvg2-bin's rsvg-convert) and counting pixels;
 *   - the SVG parses back with libxml2, and hostile terms come back as the
 *     same text, never as markup;
 *   - the same words and seed give the same bytes, and a golden picture;
 *   - the program: from documents, from count and compare tables, errors.
 * No timing here: the layout's speed is measured by the benchmark. */
#include <locale.h>
#include <math.h>
#include <sys/stat.h>
#include <sys/wait.h>
#include <unistd.h>

#include <libxml/parser.h>
#include <libxml/tree.h>
#include <zlib.h>

#include "tt_test.h"

#include "termtide/alloc.h"
#include "termtide/cloud.h"
#include "termtide/font.h"
#include "termtide/limits.h"
#include "termtide/svg.h"

#define RSVG "/usr/bin/rsvg-convert"

static tt_font *open_font(void)
{
    tt_font *f = NULL;
    tt_error err;
    tt_error_init(&err);
    assert_int_equal(tt_font_open(TT_FONT_DEFAULT, &f, &err), TT_OK);
    return f;
}

/* Invented words from syllables (demo vocabulary, no real names). */
static void make_word(unsigned i, char *out, size_t cap)
{
    static const char *const syl[] = { "ta", "ven", "lor", "mi", "qua", "dre", "sol", "bex",
                                       "nu", "ra", "kim", "sto", "pel", "vo", "gar", "lin" };
    size_t n = 0;
    unsigned k = i + 1;
    while (k && n + 4 < cap) {
        const char *s = syl[k % 16];
        size_t l = strlen(s);
        memcpy(out + n, s, l);
        n += l;
        k /= 16;
    }
    out[n] = '\0';
}

static void fill_zipf(tt_cloud *c, unsigned nwords)
{
    char w[64];
    for (unsigned i = 0; i < nwords; i++) {
        make_word(i, w, sizeof w);
        assert_int_equal(tt_cloud_add(c, w, strlen(w), 5000.0 / (i + 1) + 1), TT_OK);
    }
}

/* ---- PNG reading (zlib) for the librsvg check --------------------------- */

static uint32_t be32(const unsigned char *p)
{
    return (uint32_t)p[0] << 24 | (uint32_t)p[1] << 16 | (uint32_t)p[2] << 8 | p[3];
}

static int paeth(int a, int b, int c)
{
    int p = a + b - c, pa = abs(p - a), pb = abs(p - b), pc = abs(p - c);
    return pa <= pb && pa <= pc ? a : pb <= pc ? b : c;
}

/* Reads an 8-bit RGBA, non-interlaced PNG (what rsvg-convert writes) into
 * *rgba (w*h*4). Returns 0 on anything else. */
static int read_png(const char *path, unsigned char **rgba, int *w, int *h)
{
    FILE *f = fopen(path, "rb");
    if (!f)
        return 0;
    fseek(f, 0, SEEK_END);
    long size = ftell(f);
    fseek(f, 0, SEEK_SET);
    unsigned char *data = malloc((size_t)size);
    if (fread(data, 1, (size_t)size, f) != (size_t)size) {
        fclose(f);
        free(data);
        return 0;
    }
    fclose(f);
    unsigned char *idat = malloc((size_t)size);
    size_t idat_len = 0;
    size_t p = 8;
    int ok = 0;
    while (p + 8 <= (size_t)size) {
        uint32_t len = be32(data + p);
        const unsigned char *type = data + p + 4, *body = data + p + 8;
        if (!memcmp(type, "IHDR", 4)) {
            *w = (int)be32(body);
            *h = (int)be32(body + 4);
            ok = body[8] == 8 && body[9] == 6 && body[12] == 0;
        } else if (!memcmp(type, "IDAT", 4)) {
            memcpy(idat + idat_len, body, len);
            idat_len += len;
        }
        p += 12 + len;
    }
    free(data);
    if (!ok) {
        free(idat);
        return 0;
    }
    size_t stride = (size_t)*w * 4;
    uLongf raw_len = (uLongf)((stride + 1) * (size_t)*h);
    unsigned char *raw = malloc(raw_len);
    int zr = uncompress(raw, &raw_len, idat, (uLong)idat_len);
    free(idat);
    if (zr != Z_OK) {
        free(raw);
        return 0;
    }
    unsigned char *out = calloc(stride * (size_t)*h, 1);
    for (int y = 0; y < *h; y++) {
        unsigned char ft = raw[(size_t)y * (stride + 1)];
        const unsigned char *src = raw + (size_t)y * (stride + 1) + 1;
        unsigned char *dst = out + (size_t)y * stride;
        const unsigned char *up = y ? dst - stride : NULL;
        for (size_t x = 0; x < stride; x++) {
            int a = x >= 4 ? dst[x - 4] : 0, b = up ? up[x] : 0, c = (x >= 4 && up) ? up[x - 4] : 0;
            int v = src[x];
            switch (ft) {
            case 1: v += a; break;
            case 2: v += b; break;
            case 3: v += (a + b) / 2; break;
            case 4: v += paeth(a, b, c); break;
            default: break;
            }
            dst[x] = (unsigned char)v;
        }
    }
    free(raw);
    *rgba = out;
    return 1;
}

/* ---- the SVG parsed back with libxml2 ----------------------------------- */

static xmlDocPtr parse_svg(const char *data, size_t len)
{
    xmlDocPtr d = xmlReadMemory(data, (int)len, "cloud.svg", "UTF-8",
                                XML_PARSE_NONET | XML_PARSE_NOERROR | XML_PARSE_NOWARNING);
    return d;
}

static xmlNodePtr child_named(xmlNodePtr n, const char *name)
{
    for (xmlNodePtr c = n ? n->children : NULL; c; c = c->next)
        if (c->type == XML_ELEMENT_NODE && !strcmp((const char *)c->name, name))
            return c;
    return NULL;
}

static size_t count_elements(xmlNodePtr n, const char *name)
{
    size_t k = 0;
    for (xmlNodePtr c = n; c; c = c->next) {
        if (c->type == XML_ELEMENT_NODE && !strcmp((const char *)c->name, name))
            k++;
        k += count_elements(c->children, name);
    }
    return k;
}

/* The word group of a cloud picture. */
static xmlNodePtr words_group(xmlDocPtr d)
{
    xmlNodePtr root = xmlDocGetRootElement(d);
    for (xmlNodePtr c = root->children; c; c = c->next)
        if (c->type == XML_ELEMENT_NODE && !strcmp((const char *)c->name, "g")) {
            xmlChar *cls = xmlGetProp(c, (const xmlChar *)"class");
            int is = cls && !strcmp((const char *)cls, "words");
            xmlFree(cls);
            if (is)
                return c;
        }
    return NULL;
}

/* The independent check. Every word's path from the picture is drawn again
 * in its own colour at half opacity on a canvas with a 20 px border, by
 * librsvg (rsvg-convert from Debian librsvg2-bin). One word alone gives at
 * most alpha 0.5 (128); where two words' ink meets, even an anti-aliased
 * edge over another word, alpha rises above 0.5. Counts pixels above 0.5
 * (with 4/255 for rounding) and inked pixels (alpha > 8/255, anti-aliasing
 * allowed) in the border outside the canvas. */
static void rsvg_check(const char *svg, size_t len, int W, int H, size_t *overlap,
                       size_t *outside, size_t *words)
{
    const int B = 20;
    xmlDocPtr d = parse_svg(svg, len);
    assert_non_null(d);
    xmlNodePtr g = words_group(d);
    assert_non_null(g);
    char path[] = TT_TEST_TMP "tt_cloud_ink_XXXXXX";
    int fd = mkstemp(path);
    assert_true(fd >= 0);
    FILE *f = fdopen(fd, "w");
    fprintf(f, "<svg xmlns=\"http://www.w3.org/2000/svg\" width=\"%d\" height=\"%d\" "
               "viewBox=\"%d %d %d %d\">\n", W + 2 * B, H + 2 * B, -B, -B, W + 2 * B, H + 2 * B);
    *words = 0;
    for (xmlNodePtr c = g->children; c; c = c->next) {
        if (c->type != XML_ELEMENT_NODE)
            continue;
        unsigned k = (unsigned)++*words;
        if (!strcmp((const char *)c->name, "text")) {
            /* --text: the same element, its own colour at half opacity */
            static const char *const keep[] = { "x", "y", "font-family", "font-size",
                                                "transform" };
            fprintf(f, "<text fill=\"#%02x%02x%02x\" fill-opacity=\"0.5\"", (k * 97) & 255,
                    (k * 57) & 255, (k * 31 + 64) & 255);
            for (size_t a = 0; a < 5; a++) {
                xmlChar *v = xmlGetProp(c, (const xmlChar *)keep[a]);
                if (v) {
                    tt_buf e;
                    tt_buf_init(&e, 0);
                    tt_svg_escape(&e, (const char *)v, strlen((const char *)v));
                    fprintf(f, " %s=\"%s\"", keep[a], e.data);
                    tt_buf_release(&e);
                    xmlFree(v);
                }
            }
            xmlNodePtr last = c->last; /* the word, after its <title> */
            assert_true(last && last->type == XML_TEXT_NODE);
            tt_buf e;
            tt_buf_init(&e, 0);
            tt_svg_escape(&e, (const char *)last->content, strlen((const char *)last->content));
            fprintf(f, ">%s</text>\n", e.data);
            tt_buf_release(&e);
            continue;
        }
        assert_string_equal((const char *)c->name, "path");
        xmlChar *dd = xmlGetProp(c, (const xmlChar *)"d");
        assert_non_null(dd);
        fprintf(f, "<path fill=\"#%02x%02x%02x\" fill-opacity=\"0.5\" d=\"%s\"/>\n",
                (k * 97) & 255, (k * 57) & 255, (k * 31 + 64) & 255, (const char *)dd);
        xmlFree(dd);
    }
    fputs("</svg>\n", f);
    fclose(f);
    xmlFreeDoc(d);
    char png[sizeof path + 8];
    snprintf(png, sizeof png, "%s.png", path);
    char cmd[1024];
    snprintf(cmd, sizeof cmd, RSVG " -f png -o %s %s", png, path);
    assert_int_equal(system(cmd), 0);
    unsigned char *px = NULL;
    int pw = 0, ph = 0;
    assert_true(read_png(png, &px, &pw, &ph));
    assert_int_equal(pw, W + 2 * B);
    assert_int_equal(ph, H + 2 * B);
    *overlap = *outside = 0;
    for (int y = 0; y < ph; y++)
        for (int x = 0; x < pw; x++) {
            int a = px[((size_t)y * (size_t)pw + (size_t)x) * 4 + 3];
            if (a > 128 + 4)
                (*overlap)++;
            int in = x >= B && y >= B && x < B + W && y < B + H;
            if (!in && a > 8)
                (*outside)++;
        }
    free(px);
    unlink(png);
    unlink(path);
}

/* The librsvg check itself can fail: the same word drawn twice 6 px apart
 * meets itself, and a word drawn from x = -30 leaves the canvas. */
static void test_rsvg_check_detects(void **state)
{
    (void)state;
    tt_font *f = open_font();
    tt_buf b;
    tt_buf_init(&b, 0);
    assert_int_equal(tt_svg_begin(&b, 300, 100, "check", NULL, 0), TT_OK);
    tt_buf_puts(&b, "<g class=\"words\">\n");
    const double xs[2] = { 40, 46 };
    for (int i = 0; i < 2; i++) {
        tt_buf_puts(&b, "<path d=\"");
        assert_int_equal(tt_font_word_path(f, "backlog", 7, 30, xs[i], 60, 0, &b), TT_OK);
        tt_buf_puts(&b, "\"/>\n");
    }
    tt_buf_puts(&b, "</g>\n");
    tt_svg_end(&b);
    size_t overlap, outside, words;
    rsvg_check(b.data, b.len, 300, 100, &overlap, &outside, &words);
    assert_int_equal(words, 2);
    assert_true(overlap > 50);
    assert_int_equal(outside, 0);
    tt_buf_reset(&b);
    assert_int_equal(tt_svg_begin(&b, 300, 100, "check", NULL, 0), TT_OK);
    tt_buf_puts(&b, "<g class=\"words\">\n<path d=\"");
    assert_int_equal(tt_font_word_path(f, "backlog", 7, 30, -30, 60, 0, &b), TT_OK);
    tt_buf_puts(&b, "\"/>\n</g>\n");
    tt_svg_end(&b);
    rsvg_check(b.data, b.len, 300, 100, &overlap, &outside, &words);
    assert_int_equal(overlap, 0);
    assert_true(outside > 20);
    tt_buf_release(&b);
    tt_font_free(f);
}

/* Lays out c, checks it both ways, returns the picture in *svg. */
static void layout_and_check(tt_cloud *c, tt_font *f, const tt_cloud_options *o, tt_buf *svg)
{
    tt_error err;
    tt_error_init(&err);
    assert_int_equal(tt_cloud_layout(c, f, o, &err), TT_OK);
    size_t overlap = 99, outside = 99;
    assert_int_equal(tt_cloud_verify(c, f, &overlap, &outside), TT_OK);
    assert_int_equal(overlap, 0);
    assert_int_equal(outside, 0);
    for (size_t i = 0; i < c->n; i++) {
        const tt_cloud_word *w = &c->words[i];
        if (!w->placed)
            continue;
        assert_true(w->x >= 0 && w->y >= 0);
        assert_true(w->x + w->w <= c->width && w->y + w->h <= c->area_height);
    }
    assert_int_equal(tt_cloud_svg(c, f, o, svg), TT_OK);
    size_t words = 0;
    rsvg_check(svg->data, svg->len, c->width, c->height, &overlap, &outside, &words);
    assert_int_equal(words, c->n - c->unplaced);
    if (overlap || outside)
        print_error("librsvg: %zu pixels where words meet, %zu outside\n", overlap, outside);
    assert_int_equal(overlap, 0);
    assert_int_equal(outside, 0);
}

static void test_geometry_500_words(void **state)
{
    (void)state;
    tt_font *f = open_font();
    tt_cloud c;
    tt_cloud_init(&c);
    fill_zipf(&c, 500);
    tt_cloud_options o;
    tt_cloud_options_init(&o);
    o.width = 1000;
    o.height = 700;
    o.max_size = 80;
    o.min_size = 8;
    tt_buf svg;
    tt_buf_init(&svg, 0);
    layout_and_check(&c, f, &o, &svg);
    assert_int_equal(c.unplaced, 0);
    /* the heaviest words sit nearest the centre: the mean distance of the
     * ten heaviest is under half that of the 250 lightest */
    double cx = c.width / 2.0, cy = c.area_height / 2.0, top = 0, low = 0;
    for (size_t i = 0; i < 10; i++)
        top += hypot(c.words[i].x + c.words[i].w / 2.0 - cx, c.words[i].y + c.words[i].h / 2.0 - cy);
    for (size_t i = 250; i < 500; i++)
        low += hypot(c.words[i].x + c.words[i].w / 2.0 - cx, c.words[i].y + c.words[i].h / 2.0 - cy);
    assert_true(top / 10 < 0.5 * low / 250);
    /* the first word's box holds the centre */
    assert_true(c.words[0].x <= cx && cx <= c.words[0].x + c.words[0].w);
    tt_buf_release(&svg);
    tt_cloud_release(&c);
    tt_font_free(f);
}

static void test_geometry_turned_words(void **state)
{
    (void)state;
    tt_font *f = open_font();
    tt_cloud c;
    tt_cloud_init(&c);
    fill_zipf(&c, 200);
    tt_cloud_options o;
    tt_cloud_options_init(&o);
    o.rotate_some = 1;
    o.seed = 7;
    tt_buf svg;
    tt_buf_init(&svg, 0);
    layout_and_check(&c, f, &o, &svg);
    size_t turned = 0;
    for (size_t i = 0; i < c.n; i++)
        turned += c.words[i].vertical && c.words[i].placed;
    assert_true(turned > 20 && turned < 100); /* about one in four */
    tt_buf_release(&svg);
    tt_cloud_release(&c);
    tt_font_free(f);
}

/* --text: <text> elements in DejaVu Sans, as librsvg sets them through
 * fontconfig (the same font file), still never meet. Turned words too. */
static void test_geometry_text_mode(void **state)
{
    (void)state;
    tt_font *f = open_font();
    tt_cloud c;
    tt_cloud_init(&c);
    fill_zipf(&c, 250);
    tt_cloud_options o;
    tt_cloud_options_init(&o);
    o.text = 1;
    o.rotate_some = 1;
    o.font_family = "DejaVu Sans";
    tt_buf svg;
    tt_buf_init(&svg, 0);
    layout_and_check(&c, f, &o, &svg);
    assert_non_null(strstr(svg.data, "<text "));
    assert_non_null(strstr(svg.data, "rotate(-90 "));
    tt_buf_release(&svg);
    tt_cloud_release(&c);
    tt_font_free(f);
}

static void test_geometry_long_words(void **state)
{
    (void)state;
    tt_font *f = open_font();
    tt_cloud c;
    tt_cloud_init(&c);
    char w[512];
    for (int i = 0; i < 30; i++) {
        int n = 0;
        for (int k = 0; k < 12 + i; k++)
            n += snprintf(w + n, sizeof w - (size_t)n, "%s", (k + i) % 3 ? "lo" : "vex");
        assert_int_equal(tt_cloud_add(&c, w, (size_t)n, 100.0 - i), TT_OK);
    }
    /* longer than the limit: cut, with an ellipsis, never inside a character */
    char huge[600];
    for (int k = 0; k < 299; k++)
        memcpy(huge + 2 * k, "\xC3\xA9", 2); /* é */
    assert_int_equal(tt_cloud_add(&c, huge, 598, 1), TT_OK);
    const tt_cloud_word *last = &c.words[c.n - 1];
    assert_true(last->len <= TT_LIMIT_CLOUD_WORD_BYTES);
    assert_memory_equal(last->term + last->len - 3, "\xE2\x80\xA6", 3);
    assert_int_equal((last->len - 3) % 2, 0);
    tt_cloud_options o;
    tt_cloud_options_init(&o);
    o.width = 700;
    o.height = 500;
    o.max_size = 30;
    o.shrink = 1;
    tt_buf svg;
    tt_buf_init(&svg, 0);
    layout_and_check(&c, f, &o, &svg);
    assert_int_equal(c.unplaced, 0);
    tt_buf_release(&svg);
    tt_cloud_release(&c);
    tt_font_free(f);
}

static void test_geometry_single_word(void **state)
{
    (void)state;
    tt_font *f = open_font();
    tt_cloud c;
    tt_cloud_init(&c);
    assert_int_equal(tt_cloud_add(&c, "backlog", 7, 3), TT_OK);
    tt_cloud_options o;
    tt_cloud_options_init(&o);
    tt_buf svg;
    tt_buf_init(&svg, 0);
    layout_and_check(&c, f, &o, &svg);
    assert_int_equal(c.unplaced, 0);
    assert_true(c.words[0].placed);
    /* one word takes the largest size */
    assert_true(fabs(c.words[0].size - o.max_size) < 1e-9);
    tt_buf_release(&svg);
    tt_cloud_release(&c);
    tt_font_free(f);
}

/* A word wider than the canvas is reported, not dropped silently and not
 * drawn over the edge; --shrink lowers sizes until it fits. */
static void test_word_larger_than_canvas(void **state)
{
    (void)state;
    tt_font *f = open_font();
    tt_cloud c;
    tt_cloud_init(&c);
    const char *big = "counterparty-concentration";
    assert_int_equal(tt_cloud_add(&c, big, strlen(big), 50), TT_OK);
    assert_int_equal(tt_cloud_add(&c, "orders", 6, 10), TT_OK);
    assert_int_equal(tt_cloud_add(&c, "margin", 6, 5), TT_OK);
    tt_cloud_options o;
    tt_cloud_options_init(&o);
    o.width = 300;
    o.height = 200;
    o.max_size = 120;
    tt_buf svg;
    tt_buf_init(&svg, 0);
    layout_and_check(&c, f, &o, &svg);
    assert_int_equal(c.unplaced, 1);
    assert_false(c.words[0].placed);
    assert_non_null(strstr(svg.data, "1 did not fit"));
    assert_non_null(strstr(svg.data, "(not drawn)"));
    tt_buf_reset(&svg);
    o.shrink = 1;
    layout_and_check(&c, f, &o, &svg);
    assert_int_equal(c.unplaced, 0);
    assert_true(c.factor < 1);
    assert_true(c.words[0].w <= 300 - 8);
    tt_buf_release(&svg);
    tt_cloud_release(&c);
    tt_font_free(f);
}

/* Sizes follow the stated scales: recomputed here from the formula in the
 * help (square root, linear, log(1 + w)) between the two sizes. */
static void test_size_scales(void **state)
{
    (void)state;
    tt_font *f = open_font();
    const double wts[] = { 400, 100, 25, 9, 1 };
    for (int s = 0; s < 3; s++) {
        tt_cloud c;
        tt_cloud_init(&c);
        char w[16];
        for (int i = 0; i < 5; i++) {
            make_word((unsigned)i, w, sizeof w);
            assert_int_equal(tt_cloud_add(&c, w, strlen(w), wts[i]), TT_OK);
        }
        tt_cloud_options o;
        tt_cloud_options_init(&o);
        o.scale = (tt_cloud_scale)s;
        tt_error err;
        tt_error_init(&err);
        assert_int_equal(tt_cloud_layout(&c, f, &o, &err), TT_OK);
        for (int i = 0; i < 5; i++) {
            double (*fn)(double) = s == TT_CLOUD_SQRT ? sqrt : s == TT_CLOUD_LOG ? log1p : NULL;
            double v = fn ? fn(wts[i]) : wts[i], lo = fn ? fn(1) : 1, hi = fn ? fn(400) : 400;
            double want = o.min_size + (v - lo) / (hi - lo) * (o.max_size - o.min_size);
            assert_true(fabs(c.words[i].size - want) < 1e-9);
        }
        tt_cloud_release(&c);
    }
    tt_font_free(f);
}

/* Hostile terms: every one comes back from libxml2's parser as the same
 * text in its <title> and aria-label, and no element other than the
 * picture's own appears. Control characters and broken UTF-8 become U+FFFD. */
static void test_hostile_terms(void **state)
{
    (void)state;
    static const char *const evil[] = { "<script>alert(1)</script>", "\"><svg onload=alert(1)>",
                                         "a&amp;b", "it's", "]]><!--", "x\x01y", "bad\xff" };
    static const char *const back[] = { "<script>alert(1)</script>", "\"><svg onload=alert(1)>",
                                        "a&amp;b", "it's", "]]><!--", "x\xEF\xBF\xBDy",
                                        "bad\xEF\xBF\xBD" };
    tt_font *f = open_font();
    for (int text = 0; text < 2; text++) {
        tt_cloud c;
        tt_cloud_init(&c);
        for (int i = 0; i < 7; i++)
            assert_int_equal(tt_cloud_add(&c, evil[i], strlen(evil[i]), 10 - i), TT_OK);
        tt_cloud_options o;
        tt_cloud_options_init(&o);
        o.text = text;
        o.max_size = 30;
        o.title = "<b>title</b> & \"more\"";
        tt_error err;
        tt_error_init(&err);
        assert_int_equal(tt_cloud_layout(&c, f, &o, &err), TT_OK);
        assert_int_equal(c.unplaced, 0);
        tt_buf svg;
        tt_buf_init(&svg, 0);
        assert_int_equal(tt_cloud_svg(&c, f, &o, &svg), TT_OK);
        assert_null(strstr(svg.data, "<script"));
        assert_null(strstr(svg.data, "<svg onload"));
        xmlDocPtr d = parse_svg(svg.data, svg.len);
        assert_non_null(d);
        xmlNodePtr root = xmlDocGetRootElement(d);
        assert_int_equal(count_elements(root, "svg"), 1);
        assert_int_equal(count_elements(root, "script"), 0);
        xmlChar *title = xmlNodeGetContent(child_named(root, "title"));
        assert_string_equal((const char *)title, o.title);
        xmlFree(title);
        xmlNodePtr g = words_group(d);
        int i = 0;
        for (xmlNodePtr e = g->children; e; e = e->next) {
            if (e->type != XML_ELEMENT_NODE)
                continue;
            xmlChar *t = xmlNodeGetContent(child_named(e, "title"));
            /* the title is "term (weight)" */
            char want[128];
            snprintf(want, sizeof want, "%s (%d)", back[i], 10 - i);
            assert_string_equal((const char *)t, want);
            xmlFree(t);
            if (!text) {
                xmlChar *al = xmlGetProp(e, (const xmlChar *)"aria-label");
                assert_string_equal((const char *)al, back[i]);
                xmlFree(al);
            }
            i++;
        }
        assert_int_equal(i, 7);
        xmlFreeDoc(d);
        tt_buf_release(&svg);
        tt_cloud_release(&c);
    }
    tt_font_free(f);
}

/* Numbers never take the locale's decimal comma, and read back (with the C
 * library's strtod in the C locale) within half a unit of the last digit. */
static void test_numbers_locale_free(void **state)
{
    (void)state;
    const char *loc = setlocale(LC_NUMERIC, "de_DE.UTF-8");
    if (!loc)
        loc = setlocale(LC_NUMERIC, "fr_FR.UTF-8");
    char out[48];
    uint64_t s = 12345;
    for (int i = 0; i < 2000; i++) {
        s = s * 6364136223846793005ULL + 1442695040888963407ULL;
        double x = ((double)(s >> 11) / 9007199254740992.0 - 0.5) * 20000.0;
        size_t n = tt_svg_number(x, 2, out);
        assert_int_equal(strlen(out), n);
        assert_null(strchr(out, ','));
        setlocale(LC_NUMERIC, "C");
        double back = strtod(out, NULL);
        if (loc)
            setlocale(LC_NUMERIC, loc);
        assert_true(fabs(back - x) <= 0.005 + 1e-9);
    }
    assert_int_equal(tt_svg_number(-0.001, 2, out), 1);
    assert_string_equal(out, "0");
    tt_svg_number(12.50, 2, out);
    assert_string_equal(out, "12.5");
    tt_svg_number(3.0, 2, out);
    assert_string_equal(out, "3");
    setlocale(LC_NUMERIC, "C");
}

/* The same words and seed give byte-identical pictures; another seed moves
 * the words. */
static void test_deterministic(void **state)
{
    (void)state;
    tt_font *f = open_font();
    tt_buf a, b, d;
    tt_buf_init(&a, 0);
    tt_buf_init(&b, 0);
    tt_buf_init(&d, 0);
    for (int run = 0; run < 3; run++) {
        tt_cloud c;
        tt_cloud_init(&c);
        /* added in a different order each run: the layout sorts */
        char w[32];
        for (unsigned i = 0; i < 120; i++) {
            unsigned k = run == 1 ? 119 - i : i;
            make_word(k, w, sizeof w);
            assert_int_equal(tt_cloud_add(&c, w, strlen(w), (double)(k % 17 + 1)), TT_OK);
        }
        tt_cloud_options o;
        tt_cloud_options_init(&o);
        o.seed = run == 2 ? 43 : 42;
        o.rotate_some = 1;
        tt_error err;
        tt_error_init(&err);
        assert_int_equal(tt_cloud_layout(&c, f, &o, &err), TT_OK);
        assert_int_equal(tt_cloud_svg(&c, f, &o, run == 0 ? &a : run == 1 ? &b : &d), TT_OK);
        tt_cloud_release(&c);
    }
    assert_int_equal(a.len, b.len);
    assert_memory_equal(a.data, b.data, a.len);
    assert_true(a.len != d.len || memcmp(a.data, d.data, a.len));
    tt_buf_release(&a);
    tt_buf_release(&b);
    tt_buf_release(&d);
    tt_font_free(f);
}

/* Out of memory anywhere in layout or picture is reported, never crashed on. */
static void test_out_of_memory(void **state)
{
    (void)state;
    tt_font *f = open_font();
    int ok = 0;
    for (int k = 0; k < 400 && !ok; k++) {
        tt_cloud c;
        tt_cloud_init(&c);
        fill_zipf(&c, 30);
        tt_cloud_options o;
        tt_cloud_options_init(&o);
        tt_buf svg;
        tt_buf_init(&svg, 0);
        tt_error err;
        tt_error_init(&err);
        tt_set_allocator(&(tt_allocator){ tt_test_failing_malloc, tt_test_failing_realloc, free });
        tt_test_fail_after = k;
        tt_status st = tt_cloud_layout(&c, f, &o, &err);
        if (!st)
            st = tt_cloud_svg(&c, f, &o, &svg);
        tt_test_fail_after = -1;
        tt_set_allocator(NULL);
        assert_true(st == TT_OK || st == TT_ENOMEM);
        ok = st == TT_OK;
        tt_buf_release(&svg);
        tt_cloud_release(&c);
    }
    assert_true(ok);
    tt_font_free(f);
}

static void test_bad_options(void **state)
{
    (void)state;
    tt_font *f = open_font();
    tt_cloud c;
    tt_cloud_init(&c);
    assert_int_equal(tt_cloud_add(&c, "x", 1, NAN), TT_EINVAL);
    assert_int_equal(tt_cloud_add(&c, "x", 1, 1), TT_OK);
    tt_cloud_options o;
    tt_cloud_options_init(&o);
    tt_error err;
    tt_error_init(&err);
    o.width = 10;
    assert_int_equal(tt_cloud_layout(&c, f, &o, &err), TT_EINVAL);
    assert_non_null(strstr(err.message, "canvas"));
    tt_cloud_options_init(&o);
    o.min_size = 50;
    o.max_size = 20;
    assert_int_equal(tt_cloud_layout(&c, f, &o, &err), TT_EINVAL);
    tt_cloud_release(&c);
    tt_font_free(f);
    tt_font *g = NULL;
    tt_error_init(&err);
    assert_int_equal(tt_font_open("/nonexistent/font.ttf", &g, &err), TT_ENOENT);
    assert_string_equal(err.file, "/nonexistent/font.ttf");
    assert_int_equal(tt_font_open("/etc/hostname", &g, &err), TT_EPARSE);
}

/* ---- through the program ------------------------------------------------ */

static int run(const char *args, char *out, size_t cap)
{
    char cmd[4096];
    snprintf(cmd, sizeof cmd, "%s %s 2>&1", tt_test_bin(), args);
    FILE *p = popen(cmd, "r");
    assert_non_null(p);
    size_t n = fread(out, 1, cap - 1, p);
    out[n] = '\0';
    int st = pclose(p);
    return WIFEXITED(st) ? WEXITSTATUS(st) : -1;
}

/* Golden picture: the same table and seed give these exact bytes (DejaVu
 * Sans 2.37 and FreeType of Debian 12). TT_REGEN=1 rewrites the file. */
static void test_golden(void **state)
{
    (void)state;
    static char out[1 << 16];
    const char *golden = "tests/fixtures/cloud/golden-seed42.svg";
    const char *got = TT_TEST_TMP "tt_cloud_golden.svg";
    char args[1024];
    snprintf(args, sizeof args,
             "cloud --from tests/fixtures/cloud/counts.tsv --seed 42 --rotate some "
             "--width 480 --height 320 --title 'Hollowmere, FY2025' -o %s",
             getenv("TT_REGEN") ? golden : got);
    assert_int_equal(run(args, out, sizeof out), 0);
    if (getenv("TT_REGEN"))
        return;
    size_t la = 0, lb = 0;
    char *a = tt_test_slurp(golden, &la), *b = tt_test_slurp(got, &lb);
    assert_non_null(a);
    assert_non_null(b);
    assert_int_equal(la, lb);
    assert_memory_equal(a, b, la);
    /* and the golden picture itself passes the librsvg check */
    size_t overlap, outside, words;
    rsvg_check(b, lb, 480, 320, &overlap, &outside, &words);
    assert_int_equal(overlap, 0);
    assert_int_equal(outside, 0);
    assert_true(words > 20);
    free(a);
    free(b);
    unlink(got);
}

/* From documents and from the tables count and compare write, on the demo
 * corpus; a change cloud uses both hues. */
static void test_cli_tables(void **state)
{
    (void)state;
    static char out[1 << 16];
    const char *svg = TT_TEST_TMP "tt_cloud_cli.svg";
    const char *tsv = TT_TEST_TMP "tt_cloud_cli.tsv";
    char args[1024];
    snprintf(args, sizeof args, "cloud -q --top 60 demo-corpus/hollowmere -o %s", svg);
    assert_int_equal(run(args, out, sizeof out), 0);
    size_t len;
    char *d = tt_test_slurp(svg, &len);
    assert_non_null(d);
    xmlDocPtr x = parse_svg(d, len);
    assert_non_null(x);
    assert_int_equal(count_elements(words_group(x)->children, "path"), 60);
    xmlFreeDoc(x);
    free(d);

    snprintf(args, sizeof args, "count -q --total-only demo-corpus/hollowmere -o %s", tsv);
    assert_int_equal(run(args, out, sizeof out), 0);
    snprintf(args, sizeof args, "cloud --from %s --top 60 -o %s", tsv, svg);
    assert_int_equal(run(args, out, sizeof out), 0);
    size_t len2;
    char *d2 = tt_test_slurp(svg, &len2);
    assert_non_null(d2);
    assert_non_null(strstr(d2, "Weight: count"));
    free(d2);

    snprintf(args, sizeof args,
             "compare -q --manifest demo-corpus/manifest.tsv --kinds quarterly-report "
             "--consecutive --min-count 3 -o %s", tsv);
    assert_int_equal(run(args, out, sizeof out), 0);
    snprintf(args, sizeof args, "cloud --from %s --top 40 -o %s", tsv, svg);
    assert_int_equal(run(args, out, sizeof out), 0);
    d2 = tt_test_slurp(svg, &len2);
    assert_non_null(d2);
    assert_non_null(strstr(d2, "Change cloud"));
    assert_non_null(strstr(d2, "Weight: log_ratio"));
    assert_non_null(strstr(d2, "fill=\"#0b3c73\"") ? d2 : strstr(d2, "fill=\"#2f6aa8\""));
    /* both hues appear among the words: a rise shade and a fall shade */
    xmlDocPtr x2 = parse_svg(d2, len2);
    assert_non_null(x2);
    int rise = 0, fall = 0;
    for (xmlNodePtr e = words_group(x2)->children; e; e = e->next) {
        if (e->type != XML_ELEMENT_NODE)
            continue;
        xmlChar *fill = xmlGetProp(e, (const xmlChar *)"fill");
        rise += !strcmp((const char *)fill, "#0b3c73") || !strcmp((const char *)fill, "#2f6aa8") ||
                !strcmp((const char *)fill, "#5b8fc4");
        fall += !strcmp((const char *)fill, "#7a3300") || !strcmp((const char *)fill, "#a14d0a") ||
                !strcmp((const char *)fill, "#c0702e");
        xmlFree(fill);
    }
    assert_true(rise > 0 && fall > 0);
    xmlFreeDoc(x2);
    free(d2);
    /* signed G² from the same table */
    snprintf(args, sizeof args, "cloud --from %s --weight g2 --top 40 -o %s", tsv, svg);
    assert_int_equal(run(args, out, sizeof out), 0);
    unlink(svg);
    unlink(tsv);
}

/* Bad input: a clear error naming the file and cause, exit 2, and no
 * half-written picture left behind. */
static void test_cli_errors(void **state)
{
    (void)state;
    static char out[1 << 16];
    const char *svg = TT_TEST_TMP "tt_cloud_err.svg";
    unlink(svg);
    char args[1024];
    snprintf(args, sizeof args, "cloud --from /nonexistent/t.tsv -o %s", svg);
    assert_int_equal(run(args, out, sizeof out), 2);
    assert_non_null(strstr(out, "/nonexistent/t.tsv"));
    snprintf(args, sizeof args, "cloud --from tests/fixtures/cloud/no-term.tsv -o %s", svg);
    assert_int_equal(run(args, out, sizeof out), 2);
    assert_non_null(strstr(out, "no column 'term'"));
    snprintf(args, sizeof args, "cloud --from tests/fixtures/cloud/ragged.tsv -o %s", svg);
    assert_int_equal(run(args, out, sizeof out), 2);
    assert_non_null(strstr(out, "line 3"));
    snprintf(args, sizeof args, "cloud --from tests/fixtures/cloud/counts.tsv --font "
                                "/etc/hostname -o %s", svg);
    assert_int_equal(run(args, out, sizeof out), 2);
    assert_non_null(strstr(out, "/etc/hostname"));
    assert_int_equal(run("cloud --scale cubic demo-corpus", out, sizeof out), 2);
    assert_non_null(strstr(out, "--scale"));
    struct stat sb;
    assert_int_equal(stat(svg, &sb), -1);
    /* words that do not fit are reported */
    snprintf(args, sizeof args, "cloud --from tests/fixtures/cloud/counts.tsv --width 120 "
                                "--height 100 --max-size 60 -o %s", svg);
    assert_int_equal(run(args, out, sizeof out), 0);
    assert_non_null(strstr(out, "did not fit"));
    unlink(svg);
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_rsvg_check_detects),
        cmocka_unit_test(test_geometry_500_words),
        cmocka_unit_test(test_geometry_turned_words),
        cmocka_unit_test(test_geometry_text_mode),
        cmocka_unit_test(test_geometry_long_words),
        cmocka_unit_test(test_geometry_single_word),
        cmocka_unit_test(test_word_larger_than_canvas),
        cmocka_unit_test(test_size_scales),
        cmocka_unit_test(test_hostile_terms),
        cmocka_unit_test(test_numbers_locale_free),
        cmocka_unit_test(test_deterministic),
        cmocka_unit_test(test_out_of_memory),
        cmocka_unit_test(test_bad_options),
        cmocka_unit_test(test_golden),
        cmocka_unit_test(test_cli_tables),
        cmocka_unit_test(test_cli_errors),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
