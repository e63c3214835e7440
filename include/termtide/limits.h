/* termtide — every way hostile input can make the program grow, with a
 * named limit and its reason. A limit reached on a document is reported as
 * TT_ELIMIT naming the limit; the batch goes on with the other documents. */
#ifndef TT_LIMITS_H
#define TT_LIMITS_H

/* Largest document read into memory, after gzip decompression. The largest
 * periodic filings with all exhibits are a few hundred MB; 1 GiB leaves room
 * and still bounds a gzip bomb. */
#define TT_LIMIT_FILE_BYTES ((size_t)1 << 30)

/* Deepest element nesting the HTML extractor follows. Real filings nest a
 * few dozen levels; libxml2's own default guard is 256 and it refuses deeper
 * input unless asked, and our tree walk is iterative, so the limit is here to
 * state the behaviour: deeper content is refused with a message. */
#define TT_LIMIT_HTML_DEPTH 256

/* Most attributes on one HTML start tag. libxml2 2.9 checks each new
 * attribute against all earlier ones on the tag, so a tag with a million
 * attributes takes many minutes; real filings use fewer than 30 (inline XBRL
 * about 10). At 256 a tag costs at most ~33,000 comparisons. */
#define TT_LIMIT_HTML_ATTRIBUTES 256

/* Longest line of a lexicon file: entries are a term, a category and a
 * weight; a longer line is a wrong file (or an attack), refused with its
 * line number. */
#define TT_LIMIT_LEXICON_LINE 4096

/* Most words in one lexicon phrase ("substantial doubt about ... going
 * concern" is long at 8); bounds the phrase matcher's window. */
#define TT_LIMIT_LEXICON_PHRASE_WORDS 8

/* Longest single token, in bytes. Longer runs (base64 blobs, a 50 MB line of
 * one "word") are skipped and counted in the document's note, not stored. */
#define TT_LIMIT_TOKEN_BYTES 256

/* Most distinct terms one table may hold (about 2 GiB of strings and slots at
 * the limit). Real archives have a few million. */
#define TT_LIMIT_DISTINCT_TERMS ((size_t)64 * 1024 * 1024)

/* Most inner documents of one submission wrapper. */
#define TT_LIMIT_WRAPPER_PARTS 100000

/* Deepest directory recursion when expanding input paths. */
#define TT_LIMIT_DIR_DEPTH 64

#endif
