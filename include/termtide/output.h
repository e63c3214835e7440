/* termtide — the render stage for tables: rows of typed cells written as
 * TSV, CSV (RFC 4180, formula-safe) or JSON Lines, with locale-free
 * numbers; and files written atomically (temporary file, then rename). */
#ifndef TT_OUTPUT_H
#define TT_OUTPUT_H

#include <stddef.h>
#include <stdint.h>
#include <stdio.h>
#include "termtide/buf.h"
#include "termtide/status.h"

typedef enum tt_format { TT_FORMAT_TSV = 0, TT_FORMAT_CSV, TT_FORMAT_JSONL } tt_format;

/* Parses "tsv", "csv", "jsonl"; TT_EINVAL otherwise. */
tt_status tt_format_parse(const char *name, tt_format *out);

/* Writes x with exactly `decimals` digits after the point, rounded half
 * away from zero, without the C locale (never a decimal comma). NaN and
 * infinities are written "nan", "inf", "-inf". Returns the length; out must
 * hold 40 bytes. */
size_t tt_format_fixed(double x, int decimals, char *out);

/* Writes x with `digits` significant digits: fixed notation when
 * 1e-4 <= |x| < 1e6 (trailing zeros kept), else d.ddde-NN / d.ddde+NN; 0 is
 * "0". Locale-free like tt_format_fixed. For p- and q-values that may be far
 * below 1e-4. Returns the length; out must hold 48 bytes. */
size_t tt_format_sci(double x, int digits, char *out);

/* A table being written: a header of column names, then rows. */
typedef struct tt_table_writer {
    tt_format format;
    tt_buf *out;           /* rows are appended here */
    const char *const *columns;
    size_t ncolumns;
    size_t col;            /* cells written in the current row */
} tt_table_writer;

/* Starts a table; writes the header line (TSV and CSV; JSON Lines has none)
 * when header is non-zero. columns must outlive the writer. */
tt_status tt_table_begin(tt_table_writer *w, tt_format format, tt_buf *out,
                         const char *const *columns, size_t ncolumns, int header);

/* Cells of the current row, in column order. A string cell is escaped for
 * the format: TSV turns tab, newline, CR and backslash into \t \n \r \\;
 * CSV quotes cells holding a comma, quote, CR or LF (RFC 4180) and prefixes
 * a cell starting with = + - @ tab or CR with an apostrophe so a spreadsheet
 * never runs it as a formula; JSON escapes per RFC 8259. */
tt_status tt_table_str(tt_table_writer *w, const char *s, size_t len);
tt_status tt_table_cstr(tt_table_writer *w, const char *s);
/* The same string cell in two steps, for a value repeated on many rows (a
 * document's name): tt_table_escape appends s to out as format f writes
 * it in a cell, and tt_table_escaped writes such bytes as the next cell. */
tt_status tt_table_escape(tt_format f, const char *s, size_t len, tt_buf *out);
tt_status tt_table_escaped(tt_table_writer *w, const char *s, size_t len);
tt_status tt_table_u64(tt_table_writer *w, uint64_t v);
/* NaN (an undefined statistic) is written "n/a" in TSV and CSV, null in
 * JSON Lines. */
tt_status tt_table_fixed(tt_table_writer *w, double v, int decimals);
tt_status tt_table_sci(tt_table_writer *w, double v, int digits);
/* Ends the row (newline). */
tt_status tt_table_end_row(tt_table_writer *w);

/* An output file written atomically: data goes to a temporary file in the
 * same directory, and tt_outfile_commit renames it into place; abort (or a
 * crash) leaves the destination untouched. path "-" or NULL means stdout. */
typedef struct tt_outfile {
    FILE *fp;
    char *path;      /* destination, NULL for stdout */
    char *tmp_path;
    int failed;
} tt_outfile;

tt_status tt_outfile_open(tt_outfile *f, const char *path, tt_error *err);
/* Writes len bytes; on failure the file is marked failed and TT_EIO returned. */
tt_status tt_outfile_write(tt_outfile *f, const void *data, size_t len, tt_error *err);
/* Flushes, fsyncs and renames into place (or flushes stdout). */
tt_status tt_outfile_commit(tt_outfile *f, tt_error *err);
/* Removes the temporary file; safe after commit (does nothing). */
void tt_outfile_abort(tt_outfile *f);

#endif
