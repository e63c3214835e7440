/* termtide fuzz target — the decode stage (tt_decode, tt_decode_buf).
 *
 * Byte 0 holds the options, the rest is the input:
 *   bit 0  decode into a buffer capped at 1 + len/2 bytes, so the
 *          TT_ELIMIT path runs too
 *   bit 1  decode into a buffer that already holds text (it must be reset)
 * Checked (include/termtide/decode.h): on success the output is valid UTF-8
 * (strict, Unicode chapter 3.9 Table 3-7) with no NUL, info.encoding is a
 * listed one with a name, and valid UTF-8 input without a BOM and without
 * NUL comes out as an exact copy; decoding the output again changes nothing
 * (it is valid UTF-8 without NUL; skipped when it starts with a BOM or a
 * binary file's magic bytes, which the first rule refuses by design). On
 * failure: a listed status with its error record. tt_decode_buf on a copy
 * of the input gives the same status, text and info as tt_decode (without
 * the small cap, which only tt_decode's copy can reach), leaves the buffer
 * unchanged on failure, and, when it decoded through scratch, leaves the
 * original bytes there. */
#include "fuzz_common.h"

#include "termtide/decode.h"

/* The in-place variant against the copying one. */
static void check_decode_buf(const char *in, size_t len, tt_status want,
                             const tt_buf *want_text, const tt_decode_info *want_info)
{
    tt_buf buf, scratch;
    tt_decode_info info;
    tt_error err;
    tt_buf_init(&buf, 0);
    tt_buf_init(&scratch, 0);
    tt_error_init(&err);
    FUZZ_CHECK(tt_buf_append(&buf, in, len) == TT_OK);
    FUZZ_CHECK(tt_buf_puts(&scratch, "stale scratch") == TT_OK);

    tt_status st = tt_decode_buf(&buf, &scratch, &info, "fuzz.txt", &err);
    FUZZ_CHECK(st == want);
    if (st != TT_OK) {
        fuzz_check_error(st, &err);
        FUZZ_CHECK(buf.len == len && memcmp(buf.data, in, len) == 0);
    } else {
        FUZZ_CHECK(buf.data[buf.len] == '\0');
        FUZZ_CHECK(buf.len == want_text->len && memcmp(buf.data, want_text->data, buf.len) == 0);
        FUZZ_CHECK(info.encoding == want_info->encoding);
        FUZZ_CHECK(info.replaced == want_info->replaced);
        FUZZ_CHECK(info.skipped == want_info->skipped);
        if (info.encoding != TT_ENC_UTF8 && info.encoding != TT_ENC_UTF8_BOM)
            FUZZ_CHECK(scratch.len == len && memcmp(scratch.data, in, len) == 0);
    }
    tt_buf_release(&buf);
    tt_buf_release(&scratch);
}

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size)
{
    if (size < 1)
        return 0;
    const unsigned flags = data[0];
    const char *in = (const char *)data + 1;
    size_t len = size - 1;
    tt_buf out, again;
    tt_decode_info info;
    tt_error err;

    tt_buf_init(&out, (flags & 1) ? 1 + len / 2 : 0);
    tt_buf_init(&again, 0);
    tt_error_init(&err);
    if (flags & 2)
        (void)tt_buf_puts(&out, "left over from an earlier document"); /* may hit the cap */

    tt_status st = tt_decode(in, len, &out, &info, "fuzz.txt", &err);
    const tt_status st_first = st;
    if (st != TT_OK) {
        fuzz_check_error(st, &err);
        FUZZ_CHECK(st == TT_EBINARY || st == TT_ELIMIT || st == TT_ENOMEM);
        goto done;
    }
    FUZZ_CHECK(out.data[out.len] == '\0');
    FUZZ_CHECK(memchr(out.data, '\0', out.len) == NULL);
    FUZZ_CHECK(fuzz_utf8_valid((const unsigned char *)out.data, out.len));
    FUZZ_CHECK(info.encoding >= TT_ENC_UTF8 && info.encoding <= TT_ENC_CP1252);
    FUZZ_CHECK(tt_encoding_name(info.encoding) != NULL);
    FUZZ_CHECK(info.skipped <= len);

    int has_bom = len >= 3 && memcmp(in, "\xEF\xBB\xBF", 3) == 0;
    if (!has_bom && memchr(in, '\0', len) == NULL &&
        fuzz_utf8_valid((const unsigned char *)in, len)) {
        FUZZ_CHECK(info.encoding == TT_ENC_UTF8);
        FUZZ_CHECK(info.replaced == 0);
        FUZZ_CHECK(out.len == len && memcmp(out.data, in, len) == 0);
    }

    /* Idempotence: valid UTF-8 output decodes to itself. */
    if (!(out.len >= 3 && memcmp(out.data, "\xEF\xBB\xBF", 3) == 0)) {
        tt_decode_info info2;
        tt_error err2;
        tt_error_init(&err2);
        st = tt_decode(out.data, out.len, &again, &info2, "fuzz.txt", &err2);
        if (st == TT_OK) {
            FUZZ_CHECK(info2.encoding == TT_ENC_UTF8 && info2.replaced == 0);
            FUZZ_CHECK(again.len == out.len && memcmp(again.data, out.data, out.len) == 0);
        } else {
            /* Only a binary magic number at the start may refuse it. */
            FUZZ_CHECK(st == TT_EBINARY);
        }
    }
done:
    if (!(flags & 1))
        check_decode_buf(in, len, st_first, &out, &info);
    tt_buf_release(&out);
    tt_buf_release(&again);
    return 0;
}
