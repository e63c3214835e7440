/* termtide — from one input path to the documents it holds.
 *
 * Reads the file (source), decodes it (decode), detects its kind from the
 * content, splits a submission wrapper into its inner documents, extracts
 * blocks of text (extract) and hands each document to a callback. */
#ifndef TT_DOCUMENT_H
#define TT_DOCUMENT_H

#include <stddef.h>
#include "termtide/buf.h"
#include "termtide/decode.h"
#include "termtide/extract.h"
#include "termtide/status.h"

typedef enum tt_doc_kind {
    TT_KIND_TEXT = 0,
    TT_KIND_HTML,
    TT_KIND_WRAPPER /* only ever the outer file; inner parts are TEXT/HTML */
} tt_doc_kind;

const char *tt_doc_kind_name(tt_doc_kind kind); /* "text", "html", "wrapper" */

/* Detects the kind from content, looking at a bounded prefix only
 * (case-insensitive throughout):
 *  - a wrapper starts (after white space) with <SEC-DOCUMENT>, <SEC-HEADER>,
 *    <IMS-DOCUMENT>, <IMS-HEADER>, "ACCESSION NUMBER:" or "CONFORMED
 *    SUBMISSION TYPE:", or has, within its first 64 KiB, a <DOCUMENT> line
 *    whose next non-blank line is a <TYPE> line;
 *  - HTML has, within the first 4 KiB after leading white space, a tag
 *    <!DOCTYPE html, <html, <head, <body, <div or <p (the name followed by
 *    '>', '/' or white space, so <PAGE> and <pre> do not count; an XML
 *    prolog before <html is covered), or <table together with <tr or <td
 *    (plain-text filings mark tables with <TABLE>, <S>, <C> but never <TR>);
 *  - else text. */
tt_doc_kind tt_detect_kind(const char *text, size_t len);

/* One inner document of a submission wrapper. */
typedef struct tt_wrapper_part {
    size_t seq;            /* 1-based <SEQUENCE>, or position when absent */
    char type[64];         /* <TYPE>, e.g. "10-Q", "EX-99.1", "GRAPHIC" */
    char filename[256];    /* <FILENAME> or "" */
    char description[256]; /* <DESCRIPTION> or "" */
    size_t text_off, text_len; /* the <TEXT> body within the wrapper text */
    int uuencoded;         /* the body is a uuencoded binary ("begin 644 ...") */
} tt_wrapper_part;

typedef struct tt_wrapper {
    tt_wrapper_part *parts;
    size_t n, cap;
    /* From the header, "" when absent. */
    char entity[256];      /* COMPANY CONFORMED NAME */
    char period[32];       /* CONFORMED PERIOD OF REPORT (YYYYMMDD) */
    char form[64];         /* CONFORMED SUBMISSION TYPE */
} tt_wrapper;

void tt_wrapper_init(tt_wrapper *w);
void tt_wrapper_release(tt_wrapper *w);

/* Splits a decoded wrapper into parts (TT_LIMIT_WRAPPER_PARTS at most,
 * else TT_ELIMIT). out is emptied first and reused. Tags are matched at the
 * start of a line after blanks, without regard to case; CRLF is accepted.
 * Header values are the first of each key before the first <DOCUMENT>. A
 * body starts after the <TEXT> line (or right after the tag when text
 * follows it on the same line) and ends where a line starts with </TEXT> or
 * just before a </TEXT> that ends a line; nothing else ends it. An
 * unterminated <DOCUMENT> or <TEXT> runs to the end of the input and is
 * kept; a part without <TEXT> has an empty body. A body whose first
 * non-blank line (after an optional <PDF> line) is "begin MODE NAME" (octal
 * MODE) or "begin-base64 MODE NAME" is uuencoded. TT_EPARSE when no
 * <DOCUMENT> is found. */
tt_status tt_wrapper_split(const char *text, size_t len, tt_wrapper *out,
                           const char *name, tt_error *err);

/* Whether an inner document of this type (and file name) is kept.
 * types: NULL or "" for the default (every type except exhibits "EX-*",
 * "GRAPHIC", "ZIP", "EXCEL", "XML", "JSON", "PDF" and files named *.xml,
 * *.xsd, *.jpg, *.gif, *.png, *.pdf, *.zip, *.xlsx, *.json, *.js, *.css);
 * "all" for every type; else a comma-separated list of types matched without
 * regard to case, where a trailing '*' matches a prefix ("EX-99*").
 * Uuencoded parts are never kept. */
int tt_wrapper_keep(const tt_wrapper_part *part, const char *types);

struct tt_section_rules;

typedef struct tt_read_options {
    int drop_tables;       /* passed to the HTML extractor */
    const char *doc_types; /* see tt_wrapper_keep */
    /* Sections to keep (sections.h), applied by the batch runner: each
     * document is cut to these sections; one without any of them is
     * reported and skipped. n_sections 0: the whole document. */
    const char *const *sections;
    size_t n_sections;
    const struct tt_section_rules *section_rules; /* NULL: built-in structure */
    /* 1: each file's SHA-256 is computed from the bytes as they are read
     * (tt_source_read_hashed), in tt_document.sha256 and
     * tt_reader_sha256(). */
    int sha256;
} tt_read_options;

/* One document handed to the callback. Everything in it is owned by the
 * reader and valid only during the callback. */
typedef struct tt_document {
    const char *name;      /* the path, or "path#SEQ:TYPE" for an inner part */
    const char *path;      /* the outer file */
    tt_doc_kind kind;      /* TT_KIND_TEXT or TT_KIND_HTML */
    tt_doc_kind outer_kind;/* TT_KIND_WRAPPER for inner parts */
    tt_decode_info decode; /* of the outer file */
    int was_gzip;
    size_t seq;            /* wrapper sequence, 0 otherwise */
    const char *type;      /* wrapper <TYPE>, "" otherwise */
    const char *entity;    /* wrapper header values, "" otherwise */
    const char *period;
    const char *form;
    const char *raw;       /* the decoded text of this document (for a part,
                              its <TEXT> body without an outer <XBRL> or
                              <XML> tag pair); blocks' src_off are offsets
                              into raw */
    size_t raw_len;
    size_t raw_off;        /* where raw starts in the decoded file (0 except
                              for wrapper parts): a block's offset in the
                              file is raw_off + src_off */
    tt_blocks *blocks;     /* extracted text */
    const char *notes;     /* "; "-separated notes about odd but readable
                              input, in this order: "gzip-compressed";
                              "decoded as windows-1252" / "decoded as
                              utf-16le" / "decoded as utf-16be"; "3 invalid
                              UTF-8 sequences replaced" (or "undefined
                              windows-1252 bytes", "invalid UTF-16 code
                              units"); "empty file" (0 bytes) or "empty
                              document" (a part or file of white space
                              only); "HTML repaired: 2 problems". "" when
                              none. */
    const char *sha256;    /* the outer file's SHA-256 as 64 lower-case hex
                              digits when tt_read_options.sha256 asked for
                              it, else "" */
} tt_document;

/* Return non-OK from the callback to stop reading this file; that status is
 * returned. */
typedef tt_status (*tt_document_fn)(void *ctx, const tt_document *doc);

/* Reads one input path and calls fn once per document it holds (once for
 * text or HTML; once per kept part for a wrapper, in wrapper order, named
 * "path#SEQ:TYPE" or "path#SEQ" when the part has no type; never for a
 * skipped part). opt may be NULL (defaults).
 * On failure (unreadable, binary, over a limit, bad wrapper) returns the
 * status with err naming the file and the cause; no callback for the failed
 * document. For a wrapper, a part that fails to extract is reported through
 * the return value only after the other parts were handed over.
 * A status returned by the callback is passed on as is, err untouched.
 * *skipped_parts (may be NULL) receives the number of wrapper parts left out
 * by the type filter or as uuencoded. */
tt_status tt_read_documents(const char *path, const tt_read_options *opt,
                            tt_document_fn fn, void *ctx, size_t *skipped_parts,
                            tt_error *err);

/* A reader: the same as tt_read_documents, but its buffers are kept from
 * one call to the next (one reader per thread), which saves fresh memory and
 * page faults on every file of a batch. NULL when out of memory; the caller
 * frees it with tt_reader_free(). */
typedef struct tt_reader tt_reader;
tt_reader *tt_reader_new(void);
void tt_reader_free(tt_reader *r);
tt_status tt_reader_read(tt_reader *r, const char *path, const tt_read_options *opt,
                         tt_document_fn fn, void *ctx, size_t *skipped_parts, tt_error *err);

/* The SHA-256 (64 lower-case hex digits) of the file the last
 * tt_reader_read() read, when its options asked for it and the file was
 * read whole (even if a part then failed to extract, or no part was kept);
 * "" otherwise. Owned by the reader, valid until its next read. */
const char *tt_reader_sha256(const tt_reader *r);

#endif
