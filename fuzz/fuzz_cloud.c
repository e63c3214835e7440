/* termtide fuzz target — tables read back for pictures (tt_tsv_parse), and
 * the cloud and every chart drawn from whatever they hold.
 *
 * Byte 0 holds the options, the rest is the table text:
 *   bits 0-3  the chart kind (values past the last kind draw a cloud)
 *   bit 4     <text> labels instead of outline paths
 *   bit 5     a change cloud (signed weights), turned words
 * Checked (include/termtide/tsvread.h, chart.h, cloud.h, svg.h): a failure
 * is a listed status with its error record; on success every row has the
 * header's number of cells, and the picture drawn from the table (when it
 * has what the kind needs) parses as XML with one <svg> root; a cloud's
 * layout passes its own check (no two words' ink meets, none outside). */
#include <libxml/parser.h>
#include <libxml/tree.h>

#include "fuzz_common.h"

#include "termtide/chart.h"
#include "termtide/cloud.h"
#include "termtide/font.h"
#include "termtide/tsvread.h"

static tt_font *font;

static void check_xml(const tt_buf *b)
{
    xmlDocPtr d = xmlReadMemory(b->data, (int)b->len, "fuzz.svg", "UTF-8",
                                XML_PARSE_NONET | XML_PARSE_NOERROR | XML_PARSE_NOWARNING);
    FUZZ_CHECK(d != NULL);
    xmlNodePtr root = xmlDocGetRootElement(d);
    FUZZ_CHECK(root && !strcmp((const char *)root->name, "svg"));
    xmlFreeDoc(d);
}

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size)
{
    if (size < 1 || size > 65536)
        return 0;
    if (!font) {
        tt_error e;
        tt_error_init(&e);
        if (tt_font_open(TT_FONT_DEFAULT, &font, &e))
            abort(); /* the harness needs the font (Debian fonts-dejavu-core) */
    }
    unsigned opt = data[0];
    tt_tsv t;
    tt_tsv_init(&t);
    tt_error err;
    tt_error_init(&err);
    tt_status st = tt_tsv_parse((const char *)data + 1, size - 1, "fuzz.tsv", &t, &err);
    if (st) {
        FUZZ_CHECK(st == TT_EPARSE || st == TT_ELIMIT || st == TT_ENOMEM);
        FUZZ_CHECK(err.status == st && err.message[0]);
        return 0;
    }
    FUZZ_CHECK(t.nrows >= 1 && t.ncols >= 1);
    for (size_t r = 0; r < t.nrows; r++)
        for (size_t c = 0; c < t.ncols; c++)
            FUZZ_CHECK(tt_tsv_cell(&t, r, c) != NULL);
    tt_buf out;
    tt_buf_init(&out, 0);
    unsigned kind = opt & 15;
    if (kind <= TT_CHART_TREEMAP) {
        tt_chart_options o;
        tt_chart_options_init(&o);
        o.text = (opt >> 4) & 1;
        tt_error_init(&err);
        st = tt_chart_draw((tt_chart_kind)kind, &t, "fuzz.tsv", font, &o, &out, &err);
        if (st)
            FUZZ_CHECK(err.status != TT_OK);
        else
            check_xml(&out);
    } else {
        tt_cloud c;
        tt_cloud_init(&c);
        long term = tt_tsv_column(&t, "term");
        size_t wcol = t.ncols - 1;
        for (size_t r = 0; r < t.nrows && r < 60 && term >= 0; r++) {
            double v;
            if (!tt_tsv_number(&t, r, wcol, &v) || !(v == v) || v == 0 || v > 1e300 || v < -1e300)
                continue;
            const char *s = tt_tsv_cell(&t, r, (size_t)term);
            tt_cloud_add(&c, s, strlen(s), (opt & 32) ? v : (v < 0 ? -v : v));
        }
        if (c.n) {
            tt_cloud_options o;
            tt_cloud_options_init(&o);
            o.width = 300;
            o.height = 200;
            o.max_size = 40;
            o.text = (opt >> 4) & 1;
            o.change = (opt >> 5) & 1;
            o.rotate_some = o.change;
            tt_error_init(&err);
            st = tt_cloud_layout(&c, font, &o, &err);
            if (!st) {
                size_t overlap = 1, outside = 1;
                FUZZ_CHECK(tt_cloud_verify(&c, font, &overlap, &outside) == TT_OK);
                FUZZ_CHECK(overlap == 0 && outside == 0);
                FUZZ_CHECK(tt_cloud_svg(&c, font, &o, &out) == TT_OK);
                check_xml(&out);
            }
        }
        tt_cloud_release(&c);
    }
    tt_buf_release(&out);
    tt_tsv_release(&t);
    return 0;
}
