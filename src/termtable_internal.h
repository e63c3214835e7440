/* termtide — term-table calls for the counting hot path (tier `tti_`):
 * hash a term once, then look it up in the stop-word set and add it to the
 * document's table with the same hash. Every table shares the process-wide
 * key, so one hash serves all of them. */
#ifndef TT_TERMTABLE_INTERNAL_H
#define TT_TERMTABLE_INTERNAL_H

#include <stddef.h>
#include <stdint.h>

#include "termtide/termtable.h"

uint64_t tti_termtable_hash(const char *term, size_t len);
tt_status tti_termtable_add_hashed(tt_termtable *t, const char *term, size_t len, uint64_t hash,
                                   uint64_t count);
uint64_t tti_termtable_get_hashed(const tt_termtable *t, const char *term, size_t len,
                                  uint64_t hash);

#endif
