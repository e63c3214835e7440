/* termtide — the render stage's SVG writer: one escaper for every text node
 * and attribute value, numbers written without the C locale, and the
 * document frame (title, description, caution) every picture shares. */
#ifndef TT_SVG_H
#define TT_SVG_H

#include <stdarg.h>
#include <stddef.h>
#include "termtide/buf.h"
#include "termtide/status.h"

/* Appends s (len bytes of UTF-8) escaped for XML text and attribute values:
 * & < > " ' become entities; control characters XML 1.0 forbids, and
 * invalid UTF-8, become U+FFFD, so any term from any document is safe in
 * any place of a picture. TT_ENOMEM or TT_ELIMIT from the buffer. */
tt_status tt_svg_escape(tt_buf *b, const char *s, size_t len);

/* Writes x with at most `decimals` (0..6) digits after the point, trailing
 * zeros and a lone point removed, "-0" written "0"; locale-free (never a
 * decimal comma). Returns the length; out must hold 48 bytes. */
size_t tt_svg_number(double x, int decimals, char *out);

/* A tiny formatter for markup. Conversions:
 *   %d  int            %u  size_t        %n  double (2 decimals, tt_svg_number)
 *   %s  C string, escaped with tt_svg_escape
 *   %S  (const char *, size_t) pair, escaped
 *   %r  C string, raw (markup the caller built)   %%  a percent sign
 * Anything else is TT_EINVAL. Strings from documents must go through %s/%S. */
tt_status tt_svg_put(tt_buf *b, const char *fmt, ...);
tt_status tt_svg_vput(tt_buf *b, const char *fmt, va_list ap);

/* Opens an SVG document of width x height px: XML declaration, the <svg>
 * element with role="img", <title> and <desc> (both escaped), and a white
 * background. desc may be NULL. */
tt_status tt_svg_begin(tt_buf *b, int width, int height, const char *title, const char *desc,
                       size_t desc_len);
/* Closes the document. */
tt_status tt_svg_end(tt_buf *b);

/* The caution every picture that feeds decisions carries. */
extern const char tt_svg_caution[];

#endif
