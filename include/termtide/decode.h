/* termtide — the decode stage: document bytes to UTF-8.
 *
 * Rule: a UTF-8 BOM → UTF-8 (BOM removed; invalid sequences always replaced
 * by U+FFFD); a UTF-16 LE/BE BOM → UTF-16 (BOM removed; surrogate pairs
 * joined; a lone surrogate or an odd final byte → U+FFFD). Otherwise, with I
 * the invalid UTF-8 sequences (each maximal subpart once, as the Unicode
 * Standard recommends in chapter 3.9) and M the valid multi-byte sequences:
 * I == 0 → UTF-8, an exact copy; 0 < I <= M → UTF-8, each invalid sequence
 * replaced by U+FFFD; I > M → Windows-1252 (the reading that damages fewer
 * characters; the reasoning is in decode.c, and the rule is to be repeated
 * in `termtide help count`). In Windows-1252 the five undefined bytes
 * 81 8D 8F 90 9D become U+FFFD, counted in `replaced`. NUL bytes outside
 * UTF-16 (UTF-16 without a BOM included), a U+0000 code unit in UTF-16, or
 * the magic number of an image, PDF, archive or executable at offset 0 mean
 * a binary file, refused with TT_EBINARY ("binary file (PNG image)",
 * "binary file (NUL bytes at offset N)"). The output therefore never holds
 * a NUL byte. */
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
 * without a BOM, out receives an exact copy. bytes must not point into out.
 * info may be NULL. Errors: TT_EBINARY, TT_ELIMIT (the decoded text would
 * pass out's limit; Windows-1252 can grow to 3 bytes per input byte),
 * TT_ENOMEM; out is then empty. */
tt_status tt_decode(const char *bytes, size_t len, tt_buf *out,
                    tt_decode_info *info, const char *name, tt_error *err);

/* Decodes buf's own contents, the same way, without copying what needs no
 * change: valid UTF-8 stays where it is (a UTF-8 BOM is moved out of the
 * way); anything else is decoded into scratch and then the two buffers are
 * exchanged (whole structs, limits included), so scratch holds the original
 * bytes afterwards. Saves a copy and half the memory in the common case.
 * On failure buf is unchanged. */
tt_status tt_decode_buf(tt_buf *buf, tt_buf *scratch, tt_decode_info *info,
                        const char *name, tt_error *err);

#endif
