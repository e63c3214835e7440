/* termtide — the block list the extract stage fills (see
 * include/termtide/extract.h).
 *
 * Layout: every block's text lives in one shared buffer, each block followed
 * by a '\n', so a block is a (offset, length) view and nothing downstream can
 * glue the last word of one block to the first word of the next. Blocks
 * never hold a '\n' themselves (their text is whitespace-normalized), which
 * is what makes the separator safe; tt_blocks_add refuses text that breaks
 * that invariant.
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

tt_status tt_blocks_add(tt_blocks *b, tt_block_kind kind, const char *text,
                        size_t len, long long src_off)
{
    if (len == 0)
        return TT_OK; /* empty blocks are never stored */
    if (memchr(text, '\n', len))
        return TT_EINVAL;
    if (b->n == b->cap) {
        size_t cap = b->cap ? b->cap * 2 : 64;
        tt_block *items = tt_reallocarray(b->items, cap, sizeof *items);
        if (!items)
            return TT_ENOMEM;
        b->items = items;
        b->cap = cap;
    }
    size_t off = b->text.len;
    tt_status st = tt_buf_grow(&b->text, len + 1);
    if (st)
        return st;
    memcpy(b->text.data + off, text, len);
    b->text.data[off + len] = '\n';
    b->text.len = off + len + 1;
    b->text.data[b->text.len] = '\0';

    tt_block *blk = &b->items[b->n++];
    blk->kind = kind;
    blk->off = off;
    blk->len = len;
    blk->src_off = src_off;
    return TT_OK;
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
