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

/* Longest word of a lexicon term once normalized, in bytes; the tone
 * scorer keeps the sentence's last words in fixed slots of this size to
 * test phrases. The longest English words in filings are far shorter. */
#define TT_LIMIT_LEXICON_WORD_BYTES 64

/* Longest speaker label in a transcript ("Name — Role, Firm: "), in bytes;
 * a longer run before a colon is prose, not a label. Also bounds the
 * speakers of one transcript, each a distinct label. */
#define TT_LIMIT_SPEAKER_LABEL 120
#define TT_LIMIT_SPEAKERS 4096

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

/* Search (search.h). PCRE2's match limit: the most backtracking steps one
 * match attempt may take. A phrase or a bounded pattern needs a few per
 * character of a block; a nested quantifier such as (a+)+$ on a run of 40
 * a's needs 2^40. Ten million (PCRE2's own default) finishes in well under a
 * second with the JIT, so a hostile pattern costs at most that per block
 * before its rule is stopped for the document and reported. */
#define TT_LIMIT_REGEX_MATCH 10000000u

/* PCRE2's depth limit (the interpreter's backtracking depth; the JIT is
 * bounded by its stack instead). Real phrases nest a few levels; 10,000
 * bounds recursion-like patterns without refusing long repeats of groups. */
#define TT_LIMIT_REGEX_DEPTH 10000u

/* PCRE2's heap limit for the interpreter's backtracking frames, in KiB:
 * 20 MiB per thread (PCRE2's default), far above what a sane pattern needs. */
#define TT_LIMIT_REGEX_HEAP_KIB 20480u

/* The largest JIT stack per searcher thread (it grows from 32 KiB as
 * needed); a pattern needing more stops with "JIT stack limit". */
#define TT_LIMIT_REGEX_JIT_STACK ((size_t)1 << 20)

/* Largest watch-list file, longest line, most rules and most problems kept
 * for one report. A compliance watch-list has tens to a few hundred rules;
 * each rule is compiled and run over every block. */
#define TT_LIMIT_WATCHLIST_BYTES ((size_t)4 << 20)
#define TT_LIMIT_WATCHLIST_LINE 8192
#define TT_LIMIT_WATCHLIST_RULES 10000
#define TT_LIMIT_WATCHLIST_PROBLEMS 100

/* Largest N in near(A, B, N): a sentence rarely has 100 words. */
#define TT_LIMIT_NEAR_WORDS 100

/* Most hits listed per document (with offsets and context), and most bytes
 * of context text per document; beyond them hits are still counted, and the
 * number not listed is reported. A pattern such as "e" lists at most this. */
#define TT_LIMIT_SEARCH_HITS 1000000
#define TT_LIMIT_SEARCH_TEXT_BYTES ((size_t)256 << 20)

/* Most words of context on each side of a hit. */
#define TT_LIMIT_SEARCH_CONTEXT 200

/* Pictures (cloud.h, chart.h). Largest canvas side in px: the layout keeps
 * one bit per pixel and a word's mask one byte per pixel, so 8,000 x 8,000 is
 * 8 MB of grid; a poster is far smaller. */
#define TT_LIMIT_CANVAS_SIDE 8000

/* Most words in one cloud: layout time grows with words x canvas area;
 * 5,000 words no longer read as a picture. */
#define TT_LIMIT_CLOUD_WORDS 5000

/* Longest term drawn, in bytes; a longer one is cut at a character
 * boundary and marked with an ellipsis (a base64 run is not a word). */
#define TT_LIMIT_CLOUD_WORD_BYTES 200

/* Most outline points written per word's path, and most rows or points in
 * one chart, so a hostile table cannot make a picture of gigabytes. */
#define TT_LIMIT_SVG_POINTS 200000
#define TT_LIMIT_CHART_ROWS 100000

/* Most columns of a table read back for a picture: termtide's widest table
 * (trend's contingency view, one column per period) has a few hundred. */
#define TT_LIMIT_TABLE_COLUMNS 4096

/* Largest report page: the pictures and tables of an archive's every
 * entity and period; a page past this no longer opens in a browser. */
#define TT_LIMIT_REPORT_BYTES ((size_t)512 << 20)

/* Most rows of one table on a report page (watch-list hits, sentences):
 * the rest stay in the tables behind the report, and the page says how
 * many were left out. */
#define TT_LIMIT_REPORT_ROWS 2000

#endif
