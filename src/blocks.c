/* termtide — the block list the extract stage fills (see
 * include/termtide/extract.h).
 *
 * Layout: every block's text lives in one shared buffer, each block followed
 * by a '\n', so a block is a (offset, length) view and nothing downstream can
 * glue the last word of one block to the first word of the next. Blocks
 * never hold a '\n' themselves (their text is whitespace-normalized), which
 * is what makes the separator safe; tt_blocks_add refuses text that breaks
 * that invariant. The plain-text extractor builds its paragraphs in place
 * (tti_blocks_close: the text appended to b->text since the block's start
 * becomes a block), with no copy and no check: it never writes a '\n'.
 *
 * Cost: appending a block is amortised O(len) (both the text buffer and the
 * item array double). The text buffer's cap is twice the largest document,
 * which the normalized text of any accepted document stays under. */
#include <stdint.h>

#include "termtide/extract.h"
#include "tt_internal.h"

/* Normalized text is never longer than the document it came from plus one
 * separator per block, and a block needs at least one source byte, so twice
 * the file limit is never reached by a document the source stage accepts. */
#define BLOCKS_TEXT_LIMIT (2 * TT_LIMIT_FILE_BYTES)

void tt_blocks_init(tt_blocks *b)
{
    tt_buf_init(&b->text, BLOCKS_TEXT_LIMIT);
    b->items = NULL;
    b->n = 0;
    b->cap = 0;
    b->repaired = 0;
}

void tt_blocks_release(tt_blocks *b)
{
    tt_buf_release(&b->text);
    tt_free(b->items);
    b->items = NULL;
    b->n = 0;
    b->cap = 0;
    b->repaired = 0;
}

void tt_blocks_clear(tt_blocks *b)
{
    tt_blocks_release(b);
    tt_blocks_init(b);
}

void tt_blocks_reset(tt_blocks *b)
{
    tt_buf_reset(&b->text);
    b->n = 0;
    b->repaired = 0;
}

/* The item for a block of len bytes at off of b->text, whose '\n'
 * separator is still to be written. */
static tt_status add_item(tt_blocks *b, tt_block_kind kind, size_t off, size_t len,
                          long long src_off)
{
    if (b->n == b->cap) {
        size_t cap = b->cap ? b->cap * 2 : 64;
        tt_block *items = tt_reallocarray(b->items, cap, sizeof *items);
        if (!items)
            return TT_ENOMEM;
        b->items = items;
        b->cap = cap;
    }
    tt_block *blk = &b->items[b->n++];
    blk->kind = kind;
    blk->off = off;
    blk->len = len;
    blk->src_off = src_off;
    return TT_OK;
}

tt_status tt_blocks_add(tt_blocks *b, tt_block_kind kind, const char *text,
                        size_t len, long long src_off)
{
    if (len == 0)
        return TT_OK; /* empty blocks are never stored */
    if (memchr(text, '\n', len))
        return TT_EINVAL;
    size_t off = b->text.len;
    tt_status st = tt_buf_grow(&b->text, len + 1);
    if (st)
        return st;
    st = add_item(b, kind, off, len, src_off);
    if (st)
        return st;
    memcpy(b->text.data + off, text, len);
    b->text.data[off + len] = '\n';
    b->text.len = off + len + 1;
    b->text.data[b->text.len] = '\0';
    return TT_OK;
}

tt_status tti_blocks_close(tt_blocks *b, int kind, size_t off, long long src_off)
{
    size_t len = b->text.len - off;
    if (len == 0)
        return TT_OK;
    tt_status st = tt_buf_putc(&b->text, '\n');
    if (!st)
        st = add_item(b, (tt_block_kind)kind, off, len, src_off);
    if (st)
        b->text.len = off; /* the open block is dropped */
    if (b->text.data)
        b->text.data[b->text.len] = '\0';
    return st;
}

const char *tt_block_kind_name(tt_block_kind kind)
{
    switch (kind) {
    case TT_BLOCK_PARAGRAPH: return "paragraph";
    case TT_BLOCK_HEADING: return "heading";
    case TT_BLOCK_CELL: return "cell";
    case TT_BLOCK_ITEM: return "item";
    }
    return "unknown";
}

/* White space extraction collapses: ASCII white space and U+00A0. Returns
 * its length at raw[i], 0 when none. */
static size_t ws_len(const char *raw, size_t n, size_t i)
{
    unsigned char c = (unsigned char)raw[i];
    if (tti_is_ascii_space(c))
        return 1;
    if (c == 0xC2 && i + 1 < n && (unsigned char)raw[i + 1] == 0xA0)
        return 2;
    return 0;
}

/* The length of a character reference at raw[r] ("&amp;", "&#8212;"), 0
 * when none. */
static size_t ref_len(const char *raw, size_t n, size_t r)
{
    size_t k = r + 1;
    while (k < n && k - r <= 32 && (tti_is_ascii_alpha((unsigned char)raw[k]) ||
                                    tti_is_ascii_digit((unsigned char)raw[k]) || raw[k] == '#'))
        k++;
    return k < n && raw[k] == ';' && k > r + 1 ? k + 1 - r : 0;
}

long long tt_blocks_source_offset(const tt_blocks *b, size_t i, size_t off, const char *raw,
                                  size_t raw_len, int html)
{
    if (i >= b->n || b->items[i].src_off < 0 || (size_t)b->items[i].src_off > raw_len)
        return -1;
    const char *t = b->text.data + b->items[i].off;
    size_t tn = b->items[i].len < off ? b->items[i].len : off;
    size_t r = (size_t)b->items[i].src_off, k = 0;
    /* Walk block and source in step: equal bytes advance both; a block
     * space eats a run of source white space; source white space the block
     * dropped (a hyphenated line end) is skipped; markup is skipped; a
     * character reference stands for one block character. */
    while (k < tn && r < raw_len) {
        size_t w;
        if (html && raw[r] == '&' && (w = ref_len(raw, raw_len, r)) != 0) {
            r += w;
            uint32_t cp;
            k += tti_utf8_decode((const unsigned char *)t + k, b->items[i].len - k, &cp);
        } else if (t[k] == raw[r]) {
            k++;
            r++;
        } else if ((w = ws_len(raw, raw_len, r)) != 0) {
            r += w;
            while (r < raw_len && (w = ws_len(raw, raw_len, r)) != 0)
                r += w;
            if (t[k] == ' ')
                k++;
        } else if (html && raw[r] == '<') {
            const char *gt = memchr(raw + r, '>', raw_len - r);
            if (!gt)
                break;
            r = (size_t)(gt - raw) + 1;
        } else {
            break; /* lost step: the best position found so far */
        }
    }
    /* land on the character itself, not on white space or markup before it */
    for (;;) {
        size_t w;
        if (r < raw_len && (w = ws_len(raw, raw_len, r)) != 0)
            r += w;
        else if (html && r < raw_len && raw[r] == '<' && k < b->items[i].len && t[k] != '<') {
            const char *gt = memchr(raw + r, '>', raw_len - r);
            if (!gt)
                break;
            r = (size_t)(gt - raw) + 1;
        } else
            break;
    }
    return (long long)r;
}
