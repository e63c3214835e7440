/* termtide — the report: one self-contained HTML page (inline CSS and SVG,
 * no scripts, nothing fetched) built from headings, paragraphs, tables read
 * back from termtide's own TSV output, and pictures. Every piece of text goes
 * through the one markup escaper (tt_svg_escape), so a document's words can
 * never become markup. */
#ifndef TT_REPORT_H
#define TT_REPORT_H

#include <stddef.h>
#include "termtide/buf.h"
#include "termtide/status.h"
#include "termtide/tsvread.h"

/* A page being built: the body and the table of contents grow as parts are
 * added; tt_report_write assembles the page. */
typedef struct tt_report {
    tt_buf body;
    tt_buf contents;
    unsigned figures;  /* pictures so far: their ids get this number */
    unsigned anchors;  /* headings so far: their anchors get this number */
    unsigned chapters; /* level-1 headings so far */
} tt_report;

/* A report owns its buffers; the caller frees them with tt_report_release().
 * A page may grow to TT_LIMIT_REPORT_BYTES; past that, TT_ELIMIT. */
void tt_report_init(tt_report *r);
void tt_report_release(tt_report *r);

/* A heading of level 1 (a chapter), 2 or 3; levels 1 and 2 are listed in
 * the table of contents (level 2 only while the page has at most three
 * chapters, so an archive's contents stay one screen of entities). text is
 * escaped. */
tt_status tt_report_heading(tt_report *r, int level, const char *text);

/* A paragraph of text (escaped); with note set, in the muted style of an
 * explanation. */
tt_status tt_report_para(tt_report *r, const char *text, int note);

/* How a table column is shown. */
#define TT_REPORT_MARK 1u  /* highlighted: the matched text of a search hit */
#define TT_REPORT_RIGHT 2u /* right-aligned text: the context before a hit */
#define TT_REPORT_WRAP 4u  /* long text (a sentence): wraps in a wide cell */

typedef struct tt_report_column {
    const char *name;  /* the column of the table */
    const char *label; /* the header shown; NULL: the column's name */
    unsigned flags;
} tt_report_column;

/* A table of the chosen rows (indices into t's data rows, in the order
 * given; NULL with nrows = t->nrows: every row) and columns. A column
 * whose cells are all numbers (or n/a) is right-aligned. A column missing
 * from t is TT_EPARSE with err naming source and the column. caption may be
 * NULL. Cells are escaped. */
tt_status tt_report_table(tt_report *r, const tt_tsv *t, const char *source,
                          const tt_report_column *cols, size_t ncols, const size_t *rows,
                          size_t nrows, const char *caption, tt_error *err);

/* A picture: an SVG document as termtide writes it (its XML declaration is
 * dropped and its title and description ids are numbered, so that several
 * pictures on one page keep their accessible names apart). The SVG must
 * come from termtide's own writers: it is inserted as markup. caption may
 * be NULL. */
tt_status tt_report_figure(tt_report *r, const char *svg, size_t len, const char *caption);

/* The page: an XHTML5 document (well-formed XML, so it can be parsed back)
 * with a content security policy that forbids every fetch and script, the
 * title and subtitle, the caution, the table of contents, the body, and
 * the caution again at the end with `generator` (e.g. "termtide 0.1.0").
 * Appended to out, which the caller owns. */
tt_status tt_report_write(const tt_report *r, const char *title, const char *subtitle,
                          const char *generator, tt_buf *out);

/* The caution the report carries, as a sentence. */
extern const char tt_report_caution[];

#endif
