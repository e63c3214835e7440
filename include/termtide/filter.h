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

/* Adds the entries of a stop-word list to set: one entry a line, '#' starts
 * a comment, blank lines ignored, each entry normalized with tt_normalize so
 * it matches terms as counted. A line holding white space inside an entry is
 * an error (TT_EPARSE with the line), name is used in messages. */
tt_status tt_stopwords_load_text(tt_termtable *set, const char *text, size_t len,
                                 const char *name, tt_error *err);
/* Same from a file (may be gzip). */
tt_status tt_stopwords_load_file(tt_termtable *set, const char *path, tt_error *err);

/* A Snowball English (Porter2) stemmer; one per thread. */
typedef struct tt_stemmer tt_stemmer;

/* NULL when out of memory. The caller frees it with tt_stemmer_free(). */
tt_stemmer *tt_stemmer_new(void);
void tt_stemmer_free(tt_stemmer *s);
/* Stems a normalized word into out (reset first). */
tt_status tt_stem(tt_stemmer *s, const char *word, size_t len, tt_buf *out);

#endif
