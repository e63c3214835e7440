/* termtide — the extract stage: a decoded document to blocks of clean text.
 *
 * A block is a heading, paragraph, table cell, list item or a paragraph of
 * plain text. Each block's text is whitespace-normalized (runs of white
 * space, including U+00A0 and line breaks, become one space; no leading or
 * trailing space) and is stored in one shared text buffer, each block
 * followed by a '\n', so nothing can glue across two blocks. A block never
 * holds a '\n' itself. */
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
    long long src_off;   /* byte offset of the block's first visible
                            character in the decoded document (plus
                            src_base), -1 when unknown; exact for plain text,
                            best effort for HTML (exact for a run of text,
                            the start of the reference when the block starts
                            with a character reference) */
} tt_block;

typedef struct tt_blocks {
    tt_buf text;
    tt_block *items;
    size_t n, cap;
    size_t repaired;     /* HTML tag-structure problems libxml2 reported and
                            recovered from: end tags matching no open element
                            or closing across another, misplaced html/head/
                            body, unterminated tags. Elements left open at the
                            end, or closed implicitly, are repaired silently
                            by libxml2 and not counted. 0 for plain text. */
} tt_blocks;

void tt_blocks_init(tt_blocks *b);
/* Frees the contents; tt_blocks_init before reusing. */
void tt_blocks_release(tt_blocks *b);
void tt_blocks_clear(tt_blocks *b);
/* Empties the blocks, keeping memory. */
void tt_blocks_reset(tt_blocks *b);
/* Appends a block of already-normalized text (copied). Empty text adds
 * nothing and returns TT_OK; text holding a '\n' is refused with TT_EINVAL.
 * TT_ENOMEM or TT_ELIMIT (the text buffer's cap) leave b unchanged. */
tt_status tt_blocks_add(tt_blocks *b, tt_block_kind kind, const char *text,
                        size_t len, long long src_off);

const char *tt_block_kind_name(tt_block_kind kind); /* "paragraph", ... */

/* The byte offset in raw (the decoded document b was extracted from; see
 * tt_document.raw) of byte `off` of block i's text, found by walking raw
 * from the block's src_off in step with the block: a block space stands for
 * a run of white space, white space the extraction dropped (a line-end
 * hyphenation) is skipped; with html set, tags are skipped too and a
 * character reference stands for one character. Exact for plain text; for
 * HTML exact unless extraction dropped text inside the block (hidden
 * elements), where the result is the last position matched. -1 when the
 * block's src_off is unknown. O(off + markup skipped); never allocates. */
long long tt_blocks_source_offset(const tt_blocks *b, size_t i, size_t off, const char *raw,
                                  size_t raw_len, int html);

typedef struct tt_extract_options {
    int drop_tables; /* 1: statement tables (<table>) are left out */
} tt_extract_options;

/* HTML or XHTML (inline XBRL included) through libxml2's HTML parser with
 * network access and external entities off. Drops script, style, head
 * (title included), template, noscript, svg, hidden elements (the `hidden`
 * attribute, style="display:none" in any spacing or case, <ix:header>);
 * other inline XBRL tags keep their text. Block elements, <br> and table cells
 * end words. Every named and numeric character reference is decoded. Nesting
 * deeper than TT_LIMIT_HTML_DEPTH open elements (html and body, implied or
 * not, included) is refused with TT_ELIMIT. html is UTF-8; a <meta charset>
 * or XML encoding declaration inside is ignored, and a NUL or invalid byte
 * reads as a space. opt may be NULL (defaults: tables kept). out is reset
 * first; on failure (TT_ELIMIT, TT_ENOMEM) it is left empty and err names
 * the file (name) and the cause. src_base is added to every block's src_off.
 * Never prints. Safe to call from several threads at once, each with its own
 * out: libxml2 is initialised once inside (pthread_once), so callers need no
 * setup. */
tt_status tt_extract_html(const char *html, size_t len, long long src_base,
                          const tt_extract_options *opt, tt_blocks *out,
                          const char *name, tt_error *err);

/* Plain text: paragraphs separated by blank lines (lines holding only
 * white space, U+00A0 included); LF, CRLF and a lone CR are line breaks. A
 * line break inside a paragraph becomes a space, except that a word
 * hyphenated at a line end ("off-\nbalance": a letter, '-', the break, a
 * letter; letters are Unicode category L*) is joined without a space,
 * keeping the hyphen. Every block is a TT_BLOCK_PARAGRAPH whose src_off is
 * its first non-space byte plus src_base. out is reset first; on failure
 * (TT_ENOMEM, TT_ELIMIT) it is left empty. O(len), one pass. */
tt_status tt_extract_text(const char *text, size_t len, long long src_base,
                          tt_blocks *out, const char *name, tt_error *err);

#endif
