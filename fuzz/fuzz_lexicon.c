/* termtide fuzz target — the lexicon loader (tt_lexicon_load_text).
 *
 * Byte 0 holds the options, the rest is the lexicon text:
 *   bit 0  load a small valid lexicon first, so a failing text must leave
 *          exactly those entries behind (the roll-back)
 * Checked (include/termtide/lexicon.h): a failure is a listed status with
 * its error record, and the lexicon then holds only what the first load
 * added, every entry still found by its key; on success every entry has a
 * category in range, a positive finite weight, a line within the text, and
 * is found again by tt_lexicon_match under its own kind and key; conflicts
 * pair entries with equal keys. */
#include <math.h>

#include "fuzz_common.h"

#include "termtide/lexicon.h"

static void check_entries(const tt_lexicon *lex, long max_line)
{
    size_t n = tt_lexicon_entry_count(lex);
    for (size_t i = 0; i < n; i++) {
        const tt_lexicon_entry *e = tt_lexicon_entry_at(lex, i);
        FUZZ_CHECK(e != NULL);
        FUZZ_CHECK(e->category < tt_lexicon_category_count(lex));
        FUZZ_CHECK(isfinite(e->weight) && e->weight > 0);
        FUZZ_CHECK(e->line >= 1 && (max_line < 0 || e->line <= max_line));
        size_t idx[64];
        size_t m = tt_lexicon_match(lex, e->kind, e->term, strlen(e->term), idx, 64);
        int found = 0;
        for (size_t k = 0; k < m && k < 64; k++)
            found |= idx[k] == i;
        FUZZ_CHECK(found || m > 64);
    }
    size_t pairs[16][2];
    size_t c = tt_lexicon_conflicts(lex, pairs, 16);
    for (size_t k = 0; k < c && k < 16; k++) {
        const tt_lexicon_entry *a = tt_lexicon_entry_at(lex, pairs[k][0]);
        const tt_lexicon_entry *b = tt_lexicon_entry_at(lex, pairs[k][1]);
        FUZZ_CHECK(a->kind == b->kind && strcmp(a->term, b->term) == 0);
    }
}

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size)
{
    if (size < 1)
        return 0;
    const unsigned flags = data[0];
    const char *in = (const char *)data + 1;
    size_t len = size - 1;
    tt_lexicon *lex = tt_lexicon_new();
    FUZZ_CHECK(lex != NULL);
    tt_error err;
    tt_error_init(&err);
    size_t before = 0;
    if (flags & 1) {
        const char *base = "decline\tnegative\ngoing concern\tnegative\nsettlement*\tlegal\n";
        FUZZ_CHECK(tt_lexicon_load_text(lex, base, strlen(base), "base.lex", &err) == TT_OK);
        before = tt_lexicon_entry_count(lex);
    }
    long lines = 1;
    for (size_t i = 0; i < len; i++)
        lines += in[i] == '\n';
    tt_status st = tt_lexicon_load_text(lex, in, len, "fuzz.lex", &err);
    if (st != TT_OK) {
        fuzz_check_error(st, &err);
        FUZZ_CHECK(tt_lexicon_entry_count(lex) == before);
        check_entries(lex, -1);
    } else {
        FUZZ_CHECK(tt_lexicon_entry_count(lex) > before);
        check_entries(lex, (flags & 1) ? -1 : lines);
    }
    tt_lexicon_free(lex);
    return 0;
}
