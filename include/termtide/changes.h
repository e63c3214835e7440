/* termtide — sentence-level change between two documents (or two sets of
 * documents, or one section of each): which sentences stayed, which were
 * reworded, which are new and which went.
 *
 * Sentences come from paragraphs and list items (headings and table cells
 * are no prose), split where the segment stage ends sentences (so "Inc.",
 * "No.", "U.S." and "approx." do not cut one). A sentence's words are its
 * word tokens, normalized as the counter does (NFKC, case folded); numbers
 * count as words here, so a changed figure makes a sentence "modified".
 *
 * Alignment (linear in the number of sentences, never all pairs):
 * 1. unchanged: the same words in the same order on both sides, matched
 *    through a hash of the word sequence (first unused match, in order);
 * 2. modified: for each target sentence left, the base sentences left that
 *    share a word pair (a shingle) with it are candidates, found through an
 *    inverted index of shingles, each shingle's list capped at
 *    TT_CHANGES_SHINGLE_CAP sentences (a shingle in more is too common to
 *    tell sentences apart and is not indexed); the candidate with the
 *    highest Jaccard similarity of word sets, at least `threshold`, is the
 *    base of the modified sentence, each base used once;
 * 3. added: target sentences left; removed: base sentences left.
 * The edit similarity is 1 - d / max(n_base, n_target), d being the
 * Levenshtein distance between the two sequences of sentences (a modified
 * pair counts as equal), computed on the sentences' hashes in O(n × m)
 * time and O(m) space; 1 for two empty sides. */
#ifndef TT_CHANGES_H
#define TT_CHANGES_H

#include <stddef.h>
#include <stdint.h>
#include "termtide/extract.h"
#include "termtide/status.h"

#define TT_CHANGES_SHINGLE_CAP 64

typedef struct tt_sentence {
    size_t text_off, len;   /* in the list's text */
    long long offset;       /* byte offset in its file, -1 when unknown */
    size_t doc;             /* index in the list's documents */
    size_t words_off, n_words; /* the word ids, in the list's words */
    uint64_t hash;          /* of the word sequence */
    size_t block_off;       /* where its block starts in the document's block text */
    size_t section;         /* 1 + index in the list's section names; 0: none */
} tt_sentence;

typedef struct tt_sentence_list tt_sentence_list;

/* An empty list. NULL when out of memory. Free with tt_sentence_list_free. */
tt_sentence_list *tt_sentence_list_new(void);
void tt_sentence_list_free(tt_sentence_list *l);
void tt_sentence_list_reset(tt_sentence_list *l);
size_t tt_sentence_list_count(const tt_sentence_list *l);
const tt_sentence *tt_sentence_at(const tt_sentence_list *l, size_t i);
const char *tt_sentence_text(const tt_sentence_list *l, const tt_sentence *s);
const char *tt_sentence_doc(const tt_sentence_list *l, const tt_sentence *s);
uint64_t tt_sentence_list_words(const tt_sentence_list *l);

/* Adds the sentences of one document's blocks. raw/raw_len/raw_off and
 * html locate them in the file (see tt_blocks_source_offset); doc names
 * the document (copied). TT_ENOMEM, TT_ELIMIT (TT_LIMIT_DISTINCT_TERMS). */
tt_status tt_sentence_list_add(tt_sentence_list *l, const tt_blocks *b, const char *raw,
                               size_t raw_len, size_t raw_off, int html, const char *doc);

/* A named stretch of a document's block text, [start, end) in
 * tt_blocks.text: a section (sections.h) as the sentences know it. */
typedef struct tt_text_range {
    size_t start, end;
    const char *name;
} tt_text_range;

/* Labels the sentences of the list's last document with the name of the
 * range holding the start of their block (offsets of the blocks the
 * sentences were read from, which tt_blocks_keep_sections leaves as they
 * were); a sentence outside every range keeps no section. Names are
 * copied. TT_ENOMEM. */
tt_status tt_sentence_list_label(tt_sentence_list *l, const tt_text_range *r, size_t n);

/* The sentence's section name, "" when it has none. */
const char *tt_sentence_section(const tt_sentence_list *l, const tt_sentence *s);

typedef enum tt_change_kind {
    TT_CHANGE_UNCHANGED = 0,
    TT_CHANGE_MODIFIED,
    TT_CHANGE_ADDED,
    TT_CHANGE_REMOVED
} tt_change_kind;

const char *tt_change_kind_name(tt_change_kind k); /* "unchanged", ... */

typedef struct tt_sentence_change {
    tt_change_kind kind;
    size_t base, target;    /* sentence indices; (size_t)-1 for none */
    double similarity;      /* Jaccard of the word sets: 1 unchanged, 0 added/removed */
} tt_sentence_change;

typedef struct tt_alignment {
    tt_sentence_change *v;  /* the target's sentences in order, then the
                               removed ones in base order */
    size_t n, cap;
    size_t unchanged, modified, added, removed;
    uint64_t target_words, new_words; /* words of added sentences plus words
                                         a modified sentence added */
    double edit_similarity;
} tt_alignment;

void tt_alignment_init(tt_alignment *a);
void tt_alignment_release(tt_alignment *a);

/* Aligns target against base (see above). threshold in (0, 1]. TT_ENOMEM,
 * TT_EINVAL for a bad threshold or lists not made together (the word ids
 * of both must come from one dictionary: make target with
 * tt_sentence_list_new_sharing(base)). */
tt_status tt_align_sentences(const tt_sentence_list *base, const tt_sentence_list *target,
                             double threshold, tt_alignment *out);

/* Document-level similarity of two lists of one dictionary: cosine of
 * their word-count vectors and Jaccard of their word sets (words as
 * normalized, numbers included). Both 1 for two empty lists; -1 when out
 * of memory. */
void tt_sentence_lists_similarity(const tt_sentence_list *a, const tt_sentence_list *b,
                                  double *cosine, double *jaccard);

/* A list sharing base's word dictionary, so the two can be aligned. */
tt_sentence_list *tt_sentence_list_new_sharing(tt_sentence_list *base);

/* The words of t (ids in the shared dictionary) that s lacks, as text
 * joined by spaces: *out is a new string the caller frees with tt_free
 * (NULL on failure). TT_ENOMEM. */
tt_status tt_sentence_words_missing(const tt_sentence_list *from, const tt_sentence *t,
                                    const tt_sentence_list *in, const tt_sentence *s,
                                    char **out);

#endif
