/* termtide — word-category lexicons for tone: a plain-text file of
 * `term<TAB>category[<TAB>weight]` lines, loaded into lookup tables.
 *
 * A term is a word (matched against the normalized word), a word ending in
 * '*' (matched against the Snowball English stem of the word: every word
 * that stems alike), or a phrase of words separated by spaces (matched word
 * by word, within one sentence). Entries are normalized the way counted
 * terms are, so a lexicon written "Company’s" matches "company". Categories
 * are named by the file; a term may be listed under several categories (it
 * counts in each; tt_lexicon_conflicts lists them for a check). */
#ifndef TT_LEXICON_H
#define TT_LEXICON_H

#include <stddef.h>
#include "termtide/status.h"

typedef enum tt_lexicon_kind {
    TT_LEXICON_WORD = 0,
    TT_LEXICON_STEM,
    TT_LEXICON_PHRASE
} tt_lexicon_kind;

typedef struct tt_lexicon_entry {
    const char *term;      /* the normalized key: word, stem, or words joined by
                              one space */
    const char *written;   /* the term as the file writes it ("covenant*") */
    tt_lexicon_kind kind;
    size_t category;       /* index, see tt_lexicon_category_name */
    double weight;         /* > 0; 1 when the line gives none */
    long line;             /* in the lexicon file */
} tt_lexicon_entry;

typedef struct tt_lexicon tt_lexicon;

/* NULL when out of memory. The caller frees it with tt_lexicon_free(). */
tt_lexicon *tt_lexicon_new(void);
void tt_lexicon_free(tt_lexicon *lex);

/* Adds the entries of a lexicon text (name labels errors). Lines end in LF
 * or CRLF; a UTF-8 byte-order mark is skipped; blank lines and lines
 * starting with '#' are comments, and header comments of the form
 * "# name: ...", "# version: ...", "# made: ..." are kept. Errors (TT_EPARSE
 * with the file and line unless said): a line without exactly 2 or 3
 * tab-separated fields; an empty term or category; a category name that is
 * not lower-case letters, digits, '-' or '_'; a weight that is not a
 * positive number; a control character (NUL, CR inside a line...); a '*'
 * anywhere but at the end of a single word; a phrase
 * of more than TT_LIMIT_LEXICON_PHRASE_WORDS words; invalid UTF-8;
 * TT_ELIMIT for a line longer than TT_LIMIT_LEXICON_LINE; TT_EINVAL (no
 * line) when the text holds no entry at all. On error the lexicon keeps
 * what earlier calls added and nothing of this text. */
tt_status tt_lexicon_load_text(tt_lexicon *lex, const char *text, size_t len, const char *name,
                               tt_error *err);

/* The same from a file (gzip read transparently). */
tt_status tt_lexicon_load_file(tt_lexicon *lex, const char *path, tt_error *err);

/* The text of a lexicon shipped with termtide ("finance", from
 * lexicons/finance.txt, compiled in), or NULL for an unknown name. */
const char *tt_builtin_lexicon(const char *name);

/* Header values of the last text loaded, "" when absent. */
const char *tt_lexicon_name(const tt_lexicon *lex);
const char *tt_lexicon_version(const tt_lexicon *lex);
const char *tt_lexicon_made(const tt_lexicon *lex);

size_t tt_lexicon_category_count(const tt_lexicon *lex);
const char *tt_lexicon_category_name(const tt_lexicon *lex, size_t i);
/* The index of a category, or -1 with err naming the known ones. */
long tt_lexicon_category_find(const tt_lexicon *lex, const char *name, tt_error *err);

size_t tt_lexicon_entry_count(const tt_lexicon *lex);
const tt_lexicon_entry *tt_lexicon_entry_at(const tt_lexicon *lex, size_t i);
/* The most words in any phrase entry (0 when there is none). */
size_t tt_lexicon_max_phrase_words(const tt_lexicon *lex);

/* The entries matching a normalized word (as a word) and its stem (stem
 * may be NULL when no stem entry exists or stemming is off), or a phrase
 * (words joined by one space) when kind is TT_LEXICON_PHRASE. Writes up to
 * max entry indices into out and returns how many matched (which may exceed
 * max). */
size_t tt_lexicon_match(const tt_lexicon *lex, tt_lexicon_kind kind, const char *key,
                        size_t len, size_t *out, size_t max);
/* 1 when the lexicon has stem entries (the caller then stems words). */
int tt_lexicon_has_stems(const tt_lexicon *lex);

/* Pairs of entries with the same term and kind under different categories
 * (allowed: the term counts in both), for a check. Writes up to max pairs
 * of entry indices and returns how many there are. Duplicates within one
 * category are listed too. */
size_t tt_lexicon_conflicts(const tt_lexicon *lex, size_t (*pairs)[2], size_t max);

#endif
