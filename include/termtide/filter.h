/* termtide — the filter stage: stop-word lists and the Snowball English
 * (Porter2) stemmer from libstemmer. */
#ifndef TT_FILTER_H
#define TT_FILTER_H

#include <stddef.h>
#include "termtide/buf.h"
#include "termtide/status.h"
#include "termtide/termtable.h"

/* The built-in lists, compiled in from the .txt files in stopwords/:
 * "english" (function words) and "filing" (filing boilerplate). Returns the
 * list's text (the file as shipped), or NULL for an unknown name. */
const char *tt_builtin_stopwords(const char *name);
/* NULL-terminated array of the built-in list names. */
const char *const *tt_builtin_stopword_names(void);

/* Adds the entries of a stop-word list to set (count 1 per entry line; a
 * term is in the list when its count is > 0): UTF-8, one entry a line, '#'
 * starts a comment anywhere on a line, blank lines, surrounding blanks, CR
 * before LF and a leading BOM ignored; each entry normalized with
 * tt_normalize so it matches terms as counted ("Company’s" → "company"); an
 * entry that normalizes to nothing is skipped. An entry holding white space
 * (also after NFKC, e.g. U+00A0) or invalid UTF-8 is TT_EPARSE; err gets
 * name (may be NULL) as its file and the 1-based line. TT_ENOMEM, or
 * TT_ELIMIT from the set, likewise name the line. Entries added before an
 * error stay in set. */
tt_status tt_stopwords_load_text(tt_termtable *set, const char *text, size_t len,
                                 const char *name, tt_error *err);
/* Same from a file ("-" for stdin; may be gzip), read with
 * tt_source_read, whose errors (TT_ENOENT, TT_EIO, ...) name the path. */
tt_status tt_stopwords_load_file(tt_termtable *set, const char *path, tt_error *err);

/* A Snowball English (Porter2) stemmer; one per thread. */
typedef struct tt_stemmer tt_stemmer;

/* NULL when out of memory. The caller frees it with tt_stemmer_free().
 * libstemmer allocates with the C library's malloc, not tt_malloc. */
tt_stemmer *tt_stemmer_new(void);
void tt_stemmer_free(tt_stemmer *s);
/* Stems a normalized word into out (reset first); word may point into
 * out. TT_ENOMEM (libstemmer out of memory) or TT_ELIMIT. */
tt_status tt_stem(tt_stemmer *s, const char *word, size_t len, tt_buf *out);

#endif
