/* termtide — from one input path to the documents it holds (see
 * include/termtide/document.h).
 *
 * The chain per path: read the bytes (source), decode them to UTF-8 in
 * place (decode; valid UTF-8, the common case, is neither copied nor
 * moved, and otherwise the raw bytes are freed as soon as the decoded copy
 * exists), detect the kind from the content, and for a submission
 * wrapper split it into parts, which are views into the decoded text: no
 * part body is copied. A part's body often holds HTML inside an outer
 * <XBRL> or <XML> tag pair; that pair is stepped over so the HTML detector
 * sees the document's own start. Each kept part is extracted and handed to
 * the callback in wrapper order; one failing part does not stop the others
 * (the first failure is returned at the end). Blocks' src_off are offsets in
 * the document's own raw text (src_base 0).
 *
 * Notes collect what was odd but readable, in a fixed order: gzip,
 * encoding, replaced sequences, emptiness, HTML repairs. */
#include "termtide/document.h"
#include "termtide/source.h"
#include "tt_internal.h"

static tt_status add_note(tt_buf *notes, const char *text)
{
    tt_status st = TT_OK;
    if (notes->len)
        st = tt_buf_puts(notes, "; ");
    if (st == TT_OK)
        st = tt_buf_puts(notes, text);
    return st;
}

static tt_status add_count_note(tt_buf *notes, size_t n, const char *one, const char *many)
{
    tt_status st = TT_OK;
    if (notes->len)
        st = tt_buf_puts(notes, "; ");
    if (st == TT_OK)
        st = tt_buf_printf(notes, "%zu %s", n, n == 1 ? one : many);
    return st;
}

/* Notes that hold for every document of the file. */
static tt_status file_notes(tt_buf *notes, int was_gzip, const tt_decode_info *info)
{
    tt_status st = TT_OK;
    if (was_gzip)
        st = add_note(notes, "gzip-compressed");
    switch (info->encoding) {
    case TT_ENC_CP1252:
        if (st == TT_OK)
            st = add_note(notes, "decoded as windows-1252");
        if (st == TT_OK && info->replaced)
            st = add_count_note(notes, info->replaced, "undefined windows-1252 byte replaced",
                                "undefined windows-1252 bytes replaced");
        break;
    case TT_ENC_UTF16LE:
    case TT_ENC_UTF16BE:
        if (st == TT_OK)
            st = add_note(notes, info->encoding == TT_ENC_UTF16LE ? "decoded as utf-16le"
                                                                  : "decoded as utf-16be");
        if (st == TT_OK && info->replaced)
            st = add_count_note(notes, info->replaced, "invalid UTF-16 code unit replaced",
                                "invalid UTF-16 code units replaced");
        break;
    case TT_ENC_UTF8:
    case TT_ENC_UTF8_BOM:
        if (st == TT_OK && info->replaced)
            st = add_count_note(notes, info->replaced, "invalid UTF-8 sequence replaced",
                                "invalid UTF-8 sequences replaced");
        break;
    }
    return st;
}

static int all_space(const char *s, size_t n)
{
    for (size_t i = 0; i < n; i++)
        if (!tti_is_ascii_space((unsigned char)s[i]))
            return 0;
    return 1;
}

/* Steps over an outer <XBRL>…</XBRL> or <XML>…</XML> pair around a body. */
static void strip_outer_tag(const char **body, size_t *len)
{
    static const char *const open_tags[] = { "<XBRL>", "<XML>" };
    static const char *const close_tags[] = { "</XBRL>", "</XML>" };
    const char *s = *body, *e = *body + *len;
    while (s < e && tti_is_ascii_space((unsigned char)*s))
        s++;
    for (size_t i = 0; i < 2; i++) {
        size_t on = strlen(open_tags[i]), cn = strlen(close_tags[i]);
        if ((size_t)(e - s) < on)
            continue;
        int match = 1;
        for (size_t k = 0; k < on && match; k++)
            match = tti_ascii_lower((unsigned char)s[k]) ==
                    tti_ascii_lower((unsigned char)open_tags[i][k]);
        if (!match)
            continue;
        s += on;
        while (s < e && tti_is_ascii_space((unsigned char)*s))
            s++;
        const char *t = e;
        while (t > s && tti_is_ascii_space((unsigned char)t[-1]))
            t--;
        if ((size_t)(t - s) >= cn) {
            match = 1;
            for (size_t k = 0; k < cn && match; k++)
                match = tti_ascii_lower((unsigned char)t[(ptrdiff_t)k - (ptrdiff_t)cn]) ==
                        tti_ascii_lower((unsigned char)close_tags[i][k]);
            if (match) {
                e = t - cn;
                while (e > s && tti_is_ascii_space((unsigned char)e[-1]))
                    e--;
            }
        }
        *body = s;
        *len = (size_t)(e - s);
        return;
    }
}

/* Extracts one document's blocks by its kind. */
static tt_status extract(tt_doc_kind kind, const char *raw, size_t len,
                         const tt_read_options *opt, tt_blocks *blocks, const char *name,
                         tt_error *err)
{
    if (kind == TT_KIND_HTML) {
        tt_extract_options xo;
        memset(&xo, 0, sizeof xo);
        xo.drop_tables = opt ? opt->drop_tables : 0;
        return tt_extract_html(raw, len, 0, &xo, blocks, name, err);
    }
    return tt_extract_text(raw, len, 0, blocks, name, err);
}

static tt_status part_notes(tt_buf *notes, const tt_buf *base, const char *raw, size_t len,
                            const char *empty_note, const tt_blocks *blocks)
{
    tt_status st;
    tt_buf_reset(notes);
    if ((st = tt_buf_append(notes, base->data, base->len)) != TT_OK)
        return st;
    if (all_space(raw, len) && (st = add_note(notes, empty_note)) != TT_OK)
        return st;
    if (blocks->repaired) {
        if (notes->len && (st = tt_buf_puts(notes, "; ")) != TT_OK)
            return st;
        st = tt_buf_printf(notes, "HTML repaired: %zu %s", blocks->repaired,
                           blocks->repaired == 1 ? "problem" : "problems");
    }
    return st;
}

/* A reader keeps its buffers from one file to the next, so a batch of
 * many documents does not pay for fresh memory (and its page faults) each
 * time. A buffer that grew past KEEP_BYTES for a very large file is given
 * back afterwards, so a reader's memory stays bounded by typical documents. */
#define KEEP_BYTES ((size_t)16 << 20)

struct tt_reader {
    tt_buf raw, text, base_notes, notes, name;
    tt_blocks blocks;
    char sha256[65]; /* of the last file read, "" when not asked */
};

const char *tt_reader_sha256(const tt_reader *r)
{
    return r->sha256;
}

tt_reader *tt_reader_new(void)
{
    tt_reader *r = tt_calloc(1, sizeof *r);
    if (!r)
        return NULL;
    /* Both unlimited here: the source stage caps what it reads at
     * TT_LIMIT_FILE_BYTES, and decoding (which swaps the two) may expand
     * Windows-1252 or UTF-16 text past the file's size. */
    tt_buf_init(&r->raw, 0);
    tt_buf_init(&r->text, 0);
    tt_buf_init(&r->base_notes, 0);
    tt_buf_init(&r->notes, 0);
    tt_buf_init(&r->name, 0);
    tt_blocks_init(&r->blocks);
    return r;
}

void tt_reader_free(tt_reader *r)
{
    if (!r)
        return;
    tt_buf_release(&r->raw);
    tt_buf_release(&r->text);
    tt_buf_release(&r->base_notes);
    tt_buf_release(&r->notes);
    tt_buf_release(&r->name);
    tt_blocks_release(&r->blocks);
    tt_free(r);
}

static void trim(tt_buf *b)
{
    if (b->cap > KEEP_BYTES)
        tt_buf_clear(b);
    else
        tt_buf_reset(b);
}

tt_status tt_read_documents(const char *path, const tt_read_options *opt, tt_document_fn fn,
                            void *ctx, size_t *skipped_parts, tt_error *err)
{
    tt_reader *r = tt_reader_new();
    if (!r) {
        if (skipped_parts)
            *skipped_parts = 0;
        return tt_error_set(err, TT_ENOMEM, strcmp(path, "-") == 0 ? "<stdin>" : path, -1,
                            "out of memory");
    }
    tt_status st = tt_reader_read(r, path, opt, fn, ctx, skipped_parts, err);
    tt_reader_free(r);
    return st;
}

tt_status tt_reader_read(tt_reader *r, const char *path, const tt_read_options *opt,
                         tt_document_fn fn, void *ctx, size_t *skipped_parts, tt_error *err)
{
    const char *shown = strcmp(path, "-") == 0 ? "<stdin>" : path;
    tt_wrapper wrapper;
    tt_decode_info info;
    tt_document doc;
    tt_error part_err;
    tt_status st, first_fail = TT_OK;
    int was_gzip = 0, empty_file;
    tt_doc_kind kind;

    if (skipped_parts)
        *skipped_parts = 0;
    tt_buf_reset(&r->raw);
    tt_buf_reset(&r->text);
    tt_buf_reset(&r->base_notes);
    tt_buf_reset(&r->notes);
    tt_buf_reset(&r->name);
    tt_blocks_reset(&r->blocks);
    tt_wrapper_init(&wrapper);
    tt_error_init(&part_err);

    r->sha256[0] = '\0';
    if (opt && opt->sha256) {
        tt_sha256 h;
        tt_sha256_init(&h);
        if ((st = tt_source_read_hashed(path, &r->raw, &was_gzip, &h, err)) != TT_OK)
            goto done;
        tt_sha256_final_hex(&h, r->sha256);
    } else if ((st = tt_source_read(path, &r->raw, &was_gzip, err)) != TT_OK) {
        goto done;
    }
    empty_file = r->raw.len == 0;
    /* Valid UTF-8 is decoded where it lies; otherwise the decoded copy is
     * swapped in. Either way the decoded text ends in r->text and the other
     * buffer is kept for the next file. */
    if ((st = tt_decode_buf(&r->raw, &r->text, &info, shown, err)) != TT_OK)
        goto done;
    {
        tt_buf t = r->raw;
        r->raw = r->text;
        r->text = t;
    }

    if ((st = file_notes(&r->base_notes, was_gzip, &info)) != TT_OK)
        goto nomem;

    memset(&doc, 0, sizeof doc);
    doc.path = path;
    doc.decode = info;
    doc.was_gzip = was_gzip;
    doc.type = doc.entity = doc.period = doc.form = "";
    doc.sha256 = r->sha256;

    kind = tt_detect_kind(r->text.data, r->text.len);
    if (kind != TT_KIND_WRAPPER) {
        if ((st = extract(kind, r->text.data, r->text.len, opt, &r->blocks, shown, err)) != TT_OK)
            goto done;
        if ((st = part_notes(&r->notes, &r->base_notes, r->text.data, r->text.len,
                             empty_file ? "empty file" : "empty document", &r->blocks)) != TT_OK)
            goto nomem;
        doc.name = path;
        doc.kind = kind;
        doc.outer_kind = kind;
        doc.raw = r->text.data;
        doc.raw_len = r->text.len;
        doc.blocks = &r->blocks;
        doc.notes = r->notes.data;
        st = fn(ctx, &doc);
        goto done;
    }

    if ((st = tt_wrapper_split(r->text.data, r->text.len, &wrapper, shown, err)) != TT_OK)
        goto done;
    doc.outer_kind = TT_KIND_WRAPPER;
    doc.entity = wrapper.entity;
    doc.period = wrapper.period;
    doc.form = wrapper.form;
    for (size_t i = 0; i < wrapper.n; i++) {
        const tt_wrapper_part *part = &wrapper.parts[i];
        if (!tt_wrapper_keep(part, opt ? opt->doc_types : NULL)) {
            if (skipped_parts)
                (*skipped_parts)++;
            continue;
        }
        const char *body = r->text.data + part->text_off;
        size_t body_len = part->text_len;
        strip_outer_tag(&body, &body_len);
        tt_doc_kind pk = tt_detect_kind(body, body_len);
        if (pk == TT_KIND_WRAPPER)
            pk = TT_KIND_TEXT; /* a nested wrapper is not split again */

        tt_buf_reset(&r->name);
        st = part->type[0] ? tt_buf_printf(&r->name, "%s#%zu:%s", path, part->seq, part->type)
                           : tt_buf_printf(&r->name, "%s#%zu", path, part->seq);
        if (st != TT_OK)
            goto nomem;
        tt_error perr;
        tt_error_init(&perr);
        st = extract(pk, body, body_len, opt, &r->blocks, r->name.data, &perr);
        if (st != TT_OK) {
            if (first_fail == TT_OK) {
                first_fail = st;
                part_err = perr;
            }
            continue;
        }
        if ((st = part_notes(&r->notes, &r->base_notes, body, body_len, "empty document", &r->blocks)) !=
            TT_OK)
            goto nomem;
        doc.name = r->name.data;
        doc.kind = pk;
        doc.seq = part->seq;
        doc.type = part->type;
        doc.raw = body;
        doc.raw_off = (size_t)(body - r->text.data);
        doc.raw_len = body_len;
        doc.blocks = &r->blocks;
        doc.notes = r->notes.data;
        if ((st = fn(ctx, &doc)) != TT_OK)
            goto done;
    }
    st = first_fail;
    if (st != TT_OK && err)
        *err = part_err;
    goto done;

nomem:
    st = tt_error_set(err, TT_ENOMEM, shown, -1, "out of memory");
done:
    trim(&r->raw);
    trim(&r->text);
    if (r->blocks.text.cap > KEEP_BYTES) {
        tt_blocks_release(&r->blocks);
        tt_blocks_init(&r->blocks);
    } else {
        tt_blocks_reset(&r->blocks);
    }
    tt_wrapper_release(&wrapper);
    return st;
}
