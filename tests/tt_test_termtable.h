/* termtide tests — comparing two term tables. */
#ifndef TT_TEST_TERMTABLE_H
#define TT_TEST_TERMTABLE_H

#include "tt_test.h"

#include "termtide/alloc.h"
#include "termtide/termtable.h"

/* Fails unless got holds the same terms as want with the same counts;
 * what names the case in the message. */
static inline void tt_test_same_table(const tt_termtable *got, const tt_termtable *want,
                                      const char *what)
{
    tt_term_entry *g, *w;
    size_t ng, nw;
    assert_int_equal(tt_termtable_sorted(got, &g, &ng), TT_OK);
    assert_int_equal(tt_termtable_sorted(want, &w, &nw), TT_OK);
    if (ng != nw)
        fail_msg("%s: %zu terms counted, %zu wanted", what, ng, nw);
    for (size_t i = 0; i < ng; i++) {
        if (g[i].len != w[i].len || memcmp(g[i].term, w[i].term, g[i].len) != 0 ||
            g[i].count != w[i].count)
            fail_msg("%s: entry %zu: counted \"%.*s\" %llu, wanted \"%.*s\" %llu", what, i,
                     (int)g[i].len, g[i].term, (unsigned long long)g[i].count, (int)w[i].len,
                     w[i].term, (unsigned long long)w[i].count);
    }
    tt_free(g);
    tt_free(w);
}

#endif
