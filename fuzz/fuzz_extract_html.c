/* termtide fuzz target — the HTML extractor (tt_extract_html).
 *
 * Byte 0 holds the options, the rest is the document (the usual layout of
 * a fuzz input with flags in front; common practice):
 *   bit 0  drop_tables
 *   bit 1  decode the bytes first (tt_decode), as the pipeline does; else
 *          hand the raw bytes over, which the extractor's input hygiene
 *          (NUL and invalid bytes replaced) must survive
 *   bit 2  src_base = 1,000,000,000 instead of 0
 *   bit 3  extract a second time into the same blocks, which must give the
 *          same result (the reset path, and determinism)
 * Checked on success: the block layout of include/termtide/extract.h
 * (fuzz_check_blocks). On failure: a listed status with its error record. */
#include "fuzz_common.h"

#include "termtide/decode.h"
#include "termtide/extract.h"

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size)
{
    if (size < 1)
        return 0;
    const unsigned flags = data[0];
    const char *doc = (const char *)data + 1;
    size_t len = size - 1;
    const long long base = (flags & 4) ? 1000000000LL : 0;
    tt_extract_options opt = { (flags & 1) != 0 };
    tt_buf text;
    tt_blocks b;
    tt_error err;
    tt_status st;

    tt_buf_init(&text, 0);
    tt_blocks_init(&b);
    tt_error_init(&err);
    if (flags & 2) {
        tt_decode_info info;
        st = tt_decode(doc, len, &text, &info, "fuzz.html", &err);
        if (st != TT_OK) {
            fuzz_check_error(st, &err);
            goto done;
        }
        doc = text.data;
        len = text.len;
    }

    st = tt_extract_html(doc, len, base, &opt, &b, "fuzz.html", &err);
    if (st != TT_OK) {
        fuzz_check_error(st, &err);
        FUZZ_CHECK(st == TT_ELIMIT || st == TT_ENOMEM || st == TT_EPARSE);
        goto done;
    }
    fuzz_check_blocks(&b, base, len);

    if (flags & 8) {
        /* A copy of the first result, then the same call again. */
        size_t n = b.n, tlen = b.text.len;
        char *t0 = malloc(tlen + 1);
        tt_block *i0 = malloc((n ? n : 1) * sizeof *i0);
        FUZZ_CHECK(t0 && i0);
        memcpy(t0, b.text.data, tlen + 1);
        if (n)
            memcpy(i0, b.items, n * sizeof *i0);
        tt_error err2;
        tt_error_init(&err2);
        st = tt_extract_html(doc, len, base, &opt, &b, "fuzz.html", &err2);
        FUZZ_CHECK(st == TT_OK);
        FUZZ_CHECK(b.n == n && b.text.len == tlen);
        FUZZ_CHECK(memcmp(b.text.data, t0, tlen) == 0);
        for (size_t k = 0; k < n; k++) {
            FUZZ_CHECK(b.items[k].kind == i0[k].kind);
            FUZZ_CHECK(b.items[k].off == i0[k].off && b.items[k].len == i0[k].len);
            FUZZ_CHECK(b.items[k].src_off == i0[k].src_off);
        }
        free(t0);
        free(i0);
    }
done:
    tt_blocks_release(&b);
    tt_buf_release(&text);
    return 0;
}
