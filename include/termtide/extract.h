/* termtide — the extract stage: a decoded document to blocks of clean text.
 *
 * A block is a heading, paragraph, table cell, list item or a paragraph of
 * plain text. Each block's text is whitespace-normalized (runs of white
 * space, including U+00A0 and line breaks, become one space; no leading or
 * trailing space) and is stored in one shared text buffer, blocks separated
 * by '\n', so nothing can glue across two blocks. */
#ifndef TT_EXTRACT_H
#define TT_EXTRACT_H

#include <stddef.h>
#include "termtide/buf.h"
#include "termtide/status.h"

typedef enum tt_block_kind {
    TT_BLOCK_PARAGRAPH = 0, /* <p>, <div>, other blocks, a plain-text paragraph */
    TT_BLOCK_HEADING,       /* <h1>..<h6>, <title> is dropped with <head> */
    TT_BLOCK_CELL,          /* <td>, <th> */
    TT_BLOCK_ITEM           /* <li>, <dt>, <dd> */
} tt_block_kind;

typedef struct tt_block {
    tt_block_kind kind;
    size_t off, len;     /* the block's text: blocks->text.data + off */
    long long src_off;   /* byte offset of the block's start in the decoded
                            document (plus src_base), -1 when unknown */
} tt_block;

typedef struct tt_blocks {
    tt_buf text;
    tt_block *items;
    size_t n, cap;
    size_t repaired;     /* HTML problems libxml2 recovered from (unclosed or
                            misnested tags); 0 for plain text */
} tt_blocks;

void tt_blocks_init(tt_blocks *b);
void tt_blocks_release(tt_blocks *b);
void tt_blocks_clear(tt_blocks *b);
/* Empties the blocks, keeping memory. */
void tt_blocks_reset(tt_blocks *b);
/* Appends a block of already-normalized text. */
tt_status tt_blocks_add(tt_blocks *b, tt_block_kind kind, const char *text,
                        size_t len, long long src_off);

const char *tt_block_kind_name(tt_block_kind kind); /* "paragraph", ... */

typedef struct tt_extract_options {
    int drop_tables; /* 1: statement tables (<table>) are left out */
} tt_extract_options;

/* HTML or XHTML (inline XBRL included) through libxml2's HTML parser with
 * network access and external entities off. Drops script, style, head,
 * template, noscript, hidden elements (the `hidden` attribute,
 * style="display:none", <ix:header>). Block elements, <br> and table cells
 * end words. Every named and numeric character reference is decoded. Nesting
 * deeper than TT_LIMIT_HTML_DEPTH is refused with TT_ELIMIT. out is reset
 * first. src_base is added to every block's src_off. */
tt_status tt_extract_html(const char *html, size_t len, long long src_base,
                          const tt_extract_options *opt, tt_blocks *out,
                          const char *name, tt_error *err);

/* Plain text: paragraphs separated by blank lines; line breaks inside a
 * paragraph become spaces, except that a word hyphenated at a line end
 * ("off-\nbalance") is joined without a space, keeping the hyphen. */
tt_status tt_extract_text(const char *text, size_t len, long long src_base,
                          tt_blocks *out, const char *name, tt_error *err);

#endif
