/* termtide — the decode stage: document bytes to UTF-8.
 *
 * Rule: a UTF-8 BOM → UTF-8 (BOM removed); a UTF-16 LE/BE BOM → UTF-16;
 * otherwise bytes that are valid UTF-8 → UTF-8. Bytes that are not valid
 * UTF-8 are Windows-1252 when invalid sequences are common, and UTF-8 with
 * stray bytes (each replaced by U+FFFD) when they are rare: the rule is
 * stated in decode.c and in `termtide help count`. NUL bytes outside UTF-16,
 * or the magic numbers of images, PDFs and archives, mean a binary file,
 * refused with TT_EBINARY. */
#ifndef TT_DECODE_H
#define TT_DECODE_H

#include <stddef.h>
#include "termtide/buf.h"
#include "termtide/status.h"

typedef enum tt_encoding {
    TT_ENC_UTF8 = 0,
    TT_ENC_UTF8_BOM,
    TT_ENC_UTF16LE,
    TT_ENC_UTF16BE,
    TT_ENC_CP1252
} tt_encoding;

typedef struct tt_decode_info {
    tt_encoding encoding;
    size_t replaced;   /* invalid sequences replaced by U+FFFD */
    size_t skipped;    /* bytes at the start not copied (BOM) */
} tt_decode_info;

/* "utf-8", "utf-8-bom", "utf-16le", "utf-16be", "windows-1252". */
const char *tt_encoding_name(tt_encoding enc);

/* Decodes bytes into out (reset first) as valid UTF-8 with no NUL bytes.
 * name is used in error messages. When the input is already valid UTF-8
 * without a BOM, out receives an exact copy. */
tt_status tt_decode(const char *bytes, size_t len, tt_buf *out,
                    tt_decode_info *info, const char *name, tt_error *err);

#endif
