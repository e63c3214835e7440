/* termtide — the count stage's data structure: a term table mapping term
 * strings to counts (open addressing, keyed SipHash, strings in an arena). */
#ifndef TT_TERMTABLE_H
#define TT_TERMTABLE_H

#include <stddef.h>
#include <stdint.h>
#include "termtide/status.h"

typedef struct tt_termtable tt_termtable;

typedef struct tt_term_entry {
    const char *term; /* NUL-terminated, owned by the table */
    size_t len;
    uint64_t count;
} tt_term_entry;

/* Several tables, e.g. partial sums (see tt_batch_options.total_parts). */
typedef struct tt_termtable_set {
    tt_termtable **tables;
    size_t n;
} tt_termtable_set;

/* Frees every table of s and the array; s is left empty. */
void tt_termtable_set_release(tt_termtable_set *s);

/* Returns a new empty table, NULL when out of memory. The caller frees it
 * with tt_termtable_free(). The hash key is the process-wide seed (see
 * tt_termtable_set_seed), so hash order never leaks into output. */
tt_termtable *tt_termtable_new(void);

/* A table expected to grow large (a corpus's running total), the same in
 * use: its slots start at 65,536 (2 MiB) and its terms' memory grows 2 MiB
 * at a time, so on Linux both are on huge pages from the start, where a
 * table grown from small faults in each doubling's slots and each chunk of
 * terms 4 KiB at a time (a few hundred faults of microseconds each in a
 * virtual machine for a total of 97,000 terms). NULL when out of memory. */
tt_termtable *tt_termtable_new_large(void);
void tt_termtable_free(tt_termtable *t);
/* Empties the table, keeping its memory. */
void tt_termtable_reset(tt_termtable *t);

/* Sets the process-wide 128-bit hash key (tests use a fixed one; the CLI
 * seeds it from the OS at start). Call before creating tables. */
void tt_termtable_set_seed(uint64_t k0, uint64_t k1);

/* Adds count to term (len bytes, may hold any byte but NUL). TT_ENOMEM, or
 * TT_ELIMIT past TT_LIMIT_DISTINCT_TERMS distinct terms. */
tt_status tt_termtable_add(tt_termtable *t, const char *term, size_t len, uint64_t count);

/* The count of term, 0 when absent. */
uint64_t tt_termtable_get(const tt_termtable *t, const char *term, size_t len);

size_t tt_termtable_distinct(const tt_termtable *t);
uint64_t tt_termtable_total(const tt_termtable *t);

/* Adds every term of src to dst. */
tt_status tt_termtable_merge(tt_termtable *dst, const tt_termtable *src);

/* Fills *out with every entry, sorted by count descending, then by term
 * bytewise ascending, so output is deterministic. The caller frees *out with
 * tt_free(); the strings stay owned by the table. */
tt_status tt_termtable_sorted(const tt_termtable *t, tt_term_entry **out, size_t *n);

/* The same for the union of ntables tables (at most 64), a term's counts
 * added up, without building a merged table: what merging them all into
 * one table and calling tt_termtable_sorted() gives. Uses up to threads
 * threads (1: only the caller's). The strings stay owned by the tables,
 * which must outlive *out. TT_EINVAL for more than 64 tables. */
tt_status tt_termtable_sorted_union(const tt_termtable *const *tables, size_t ntables,
                                    int threads, tt_term_entry **out, size_t *n);

/* Calls fn for every entry in unspecified order; stop by returning non-zero. */
void tt_termtable_foreach(const tt_termtable *t,
                          int (*fn)(void *ctx, const tt_term_entry *e), void *ctx);

#endif
