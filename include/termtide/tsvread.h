/* termtide — reading back a table termtide wrote as TSV (count, compare,
 * trend, describe), so pictures can be drawn from saved results. */
#ifndef TT_TSVREAD_H
#define TT_TSVREAD_H

#include <stddef.h>
#include "termtide/status.h"

typedef struct tt_tsv {
    char **cells;   /* (nrows + 1) x ncols; row 0 is the header */
    size_t ncols;
    size_t nrows;   /* data rows */
    char *data;     /* the file, cells cut in place */
} tt_tsv;

void tt_tsv_init(tt_tsv *t);
void tt_tsv_release(tt_tsv *t);

/* Reads a TSV file with a header line ("-" is standard input). Cells are
 * unescaped as tt_table_str writes them (\t \n \r \\). A row with another
 * number of cells than the header is TT_EPARSE naming the file and line; an
 * empty file or a file without data rows is TT_EPARSE; more than
 * TT_LIMIT_CHART_ROWS rows or TT_LIMIT_TABLE_COLUMNS columns is TT_ELIMIT.
 * The table owns its cells; the caller frees them with tt_tsv_release(). */
tt_status tt_tsv_read(const char *path, tt_tsv *t, tt_error *err);

/* The same from len bytes of text in memory (copied); name stands for the
 * file in errors. */
tt_status tt_tsv_parse(const char *text, size_t len, const char *name, tt_tsv *t, tt_error *err);

/* The index of the column named name, or -1. */
long tt_tsv_column(const tt_tsv *t, const char *name);

/* The cell of data row `row` (0-based) in column col. */
const char *tt_tsv_cell(const tt_tsv *t, size_t row, size_t col);

/* The cell as a number (locale-free: digits, one point, sign, exponent);
 * "n/a", "nan", "new", "gone" and empty give NaN. 0 when the cell is not a
 * number at all. */
int tt_tsv_number(const tt_tsv *t, size_t row, size_t col, double *out);

#endif
