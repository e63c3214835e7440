/* termtide fuzz target — kind detection and the submission wrapper
 * (tt_detect_kind, tt_wrapper_split, tt_wrapper_keep).
 *
 * Byte 0 holds the options, the rest is the file, decoded first with
 * tt_decode as the pipeline does (the splitter's contract is decoded text):
 *   bit 0  also extract every kept part (text or HTML by its detected kind),
 *          the way tt_read_documents does
 *   bit 1  take the type list for tt_wrapper_keep from the first line of the
 *          file (at most 63 bytes), so the list parser is fuzzed too
 * Checked (include/termtide/document.h): the kind is a listed one; a split
 * yields 1..TT_LIMIT_WRAPPER_PARTS parts whose bodies lie inside the text in
 * order, with NUL-terminated fields; tt_wrapper_keep never keeps a uuencoded
 * part, keeps every other part under "all", and keeps a part whose plain
 * type (letters, digits, '-', '.') is listed, in either case. */
#include "fuzz_common.h"

#include "termtide/decode.h"
#include "termtide/document.h"
#include "termtide/extract.h"
#include "termtide/limits.h"

static int plain_type(const char *t)
{
    if (!t[0])
        return 0;
    for (; *t; t++) {
        unsigned char c = (unsigned char)*t;
        int ok = (c >= 'A' && c <= 'Z') || (c >= 'a' && c <= 'z') || (c >= '0' && c <= '9') ||
                 c == '-' || c == '.';
        if (!ok)
            return 0;
    }
    return 1;
}

static void check_part(const tt_wrapper_part *p, const char *fuzz_types)
{
    FUZZ_CHECK(memchr(p->type, '\0', sizeof p->type) != NULL);
    FUZZ_CHECK(memchr(p->filename, '\0', sizeof p->filename) != NULL);
    FUZZ_CHECK(memchr(p->description, '\0', sizeof p->description) != NULL);

    int dflt = tt_wrapper_keep(p, NULL);
    FUZZ_CHECK(dflt == tt_wrapper_keep(p, ""));
    FUZZ_CHECK(tt_wrapper_keep(p, "all") == !p->uuencoded);
    (void)tt_wrapper_keep(p, "10-Q, ex-99* ,,*,GRAPHIC");
    if (fuzz_types)
        (void)tt_wrapper_keep(p, fuzz_types);
    if (p->uuencoded) {
        FUZZ_CHECK(!dflt);
        return;
    }
    if (plain_type(p->type)) {
        char lower[sizeof p->type];
        size_t i = 0;
        for (; p->type[i]; i++) {
            char c = p->type[i];
            lower[i] = (c >= 'A' && c <= 'Z') ? (char)(c + 32) : c;
        }
        lower[i] = '\0';
        FUZZ_CHECK(tt_wrapper_keep(p, p->type));
        FUZZ_CHECK(tt_wrapper_keep(p, lower));
    }
}

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size)
{
    if (size < 1)
        return 0;
    const unsigned flags = data[0];
    tt_buf text;
    tt_wrapper w;
    tt_blocks blocks;
    tt_decode_info info;
    tt_error err;
    char types[64];
    const char *fuzz_types = NULL;

    tt_buf_init(&text, 0);
    tt_wrapper_init(&w);
    tt_blocks_init(&blocks);
    tt_error_init(&err);

    tt_status st = tt_decode((const char *)data + 1, size - 1, &text, &info, "fuzz.txt", &err);
    if (st != TT_OK)
        goto done;
    const char *t = text.data;
    const size_t len = text.len;

    if (flags & 2) {
        size_t n = 0;
        while (n < len && n < sizeof types - 1 && t[n] != '\n')
            n++;
        memcpy(types, t, n);
        types[n] = '\0';
        fuzz_types = types;
    }

    tt_doc_kind kind = tt_detect_kind(t, len);
    FUZZ_CHECK(kind == TT_KIND_TEXT || kind == TT_KIND_HTML || kind == TT_KIND_WRAPPER);
    FUZZ_CHECK(tt_detect_kind(t, len) == kind);

    st = tt_wrapper_split(t, len, &w, "fuzz.txt", &err);
    if (st != TT_OK) {
        fuzz_check_error(st, &err);
        FUZZ_CHECK(st == TT_EPARSE || st == TT_ELIMIT || st == TT_ENOMEM);
        goto done;
    }
    FUZZ_CHECK(w.n >= 1 && w.n <= TT_LIMIT_WRAPPER_PARTS);
    FUZZ_CHECK(memchr(w.entity, '\0', sizeof w.entity) != NULL);
    FUZZ_CHECK(memchr(w.period, '\0', sizeof w.period) != NULL);
    FUZZ_CHECK(memchr(w.form, '\0', sizeof w.form) != NULL);
    size_t prev_end = 0;
    for (size_t i = 0; i < w.n; i++) {
        const tt_wrapper_part *p = &w.parts[i];
        FUZZ_CHECK(p->text_off <= len && p->text_len <= len - p->text_off);
        FUZZ_CHECK(p->text_off >= prev_end);
        prev_end = p->text_off + p->text_len;
        check_part(p, fuzz_types);

        if ((flags & 1) && tt_wrapper_keep(p, fuzz_types)) {
            const char *body = t + p->text_off;
            tt_doc_kind pk = tt_detect_kind(body, p->text_len);
            tt_extract_options xopt = { 0 };
            tt_error perr;
            tt_error_init(&perr);
            if (pk == TT_KIND_HTML)
                st = tt_extract_html(body, p->text_len, (long long)p->text_off, &xopt, &blocks,
                                     "fuzz.txt#part", &perr);
            else
                st = tt_extract_text(body, p->text_len, (long long)p->text_off, &blocks,
                                     "fuzz.txt#part", &perr);
            if (st == TT_OK)
                fuzz_check_blocks(&blocks, (long long)p->text_off, p->text_len);
            else
                fuzz_check_error(st, &perr);
        }
    }
done:
    tt_blocks_release(&blocks);
    tt_wrapper_release(&w);
    tt_buf_release(&text);
    return 0;
}
