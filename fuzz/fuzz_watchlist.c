/* termtide fuzz target — the watch-list parser and compiler
 * (tt_watchlist_parse) and, when it succeeds, the search of a document with
 * it (tt_searcher_run).
 *
 * Byte 0 holds the options, the rest is the watch-list text, optionally
 * followed by a NUL byte and a document:
 *   bit 0  case-sensitive          bit 1  whole words
 *   bit 2  the document is HTML    bit 3  context 0 (else 3 words)
 *   bit 4  counts only
 * Without a document part, a small fixed document is searched.
 * Checked (include/termtide/search.h): a failure is TT_EPARSE or TT_ENOMEM
 * with its error record, at least one problem is kept, each with a line
 * within the text; on success every rule has a non-empty unique name and a
 * non-empty pattern, and the SHA-256 is 64 hex digits. A search lists its
 * hits in text order, each within its block, with valid UTF-8 text,
 * counts at least the listed hits per rule, and an exact offset lies
 * within the file and (for plain text) points at the match's first byte
 * unless the match starts with white space; a stop names a rule in range. */
#include "fuzz_common.h"

#include "termtide/document.h"
#include "termtide/search.h"

static const char fixed_doc[] =
    "Conditions raise substantial doubt about our ability to continue as a going\n"
    "concern. The off-\nbalance sheet items\xC2\xA0grew; caf\xC3\xA9 sales fell 12%.\n\n"
    "A lawsuit was filed. aaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaa!\n";

static void check_search(const tt_watchlist *wl, const char *doc, size_t len, int html,
                         int counts_only)
{
    tt_blocks b;
    tt_blocks_init(&b);
    tt_error err;
    tt_error_init(&err);
    tt_status st = html ? tt_extract_html(doc, len, 0, NULL, &b, "doc", &err)
                        : tt_extract_text(doc, len, 0, &b, "doc", &err);
    if (st) {
        tt_blocks_release(&b);
        return;
    }
    tt_searcher *s = tt_searcher_new(wl);
    FUZZ_CHECK(s != NULL);
    tt_searcher_set_counts_only(s, counts_only);
    tt_document d;
    memset(&d, 0, sizeof d);
    d.name = d.path = "doc";
    d.kind = html ? TT_KIND_HTML : TT_KIND_TEXT;
    d.raw = doc;
    d.raw_len = len;
    d.blocks = &b;
    tt_search_result r;
    tt_search_result_init(&r);
    st = tt_searcher_run(s, &d, &r, &err);
    if (st) {
        fuzz_check_error(st, &err);
    } else {
        size_t n = tt_watchlist_size(wl);
        FUZZ_CHECK(r.n_rules == n);
        if (counts_only)
            FUZZ_CHECK(r.n_hits == 0);
        uint64_t listed[64] = { 0 };
        for (size_t h = 0; h < r.n_hits; h++) {
            const tt_search_hit *hit = &r.hits[h];
            FUZZ_CHECK(hit->rule < n && hit->block < b.n);
            FUZZ_CHECK(hit->match_len > 0);
            if (hit->rule < 64)
                listed[hit->rule]++;
            if (h)
                FUZZ_CHECK(hit->block >= r.hits[h - 1].block);
            const char *t = r.text.data + hit->text;
            FUZZ_CHECK(hit->text + hit->before_len + hit->match_len + hit->after_len <=
                       r.text.len);
            FUZZ_CHECK(fuzz_utf8_valid((const unsigned char *)t,
                                       hit->before_len + hit->match_len + hit->after_len));
            FUZZ_CHECK(hit->line >= 1);
            if (hit->exact) {
                FUZZ_CHECK(hit->offset >= 0 && (size_t)hit->offset <= len);
                const char *m = t + hit->before_len;
                if (!html && m[0] != ' ')
                    FUZZ_CHECK((size_t)hit->offset < len && doc[hit->offset] == m[0]);
            }
        }
        for (size_t k = 0; k < n && k < 64; k++)
            FUZZ_CHECK(r.counts[k] >= listed[k]);
        for (size_t k = 0; k < r.n_stops; k++)
            FUZZ_CHECK(r.stops[k].rule < n && r.stops[k].block < b.n);
    }
    tt_search_result_release(&r);
    tt_searcher_free(s);
    tt_blocks_release(&b);
}

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size)
{
    if (size < 1)
        return 0;
    const unsigned flags = data[0];
    const char *in = (const char *)data + 1;
    size_t len = size - 1;
    const char *doc = fixed_doc;
    size_t doc_len = sizeof fixed_doc - 1;
    const char *nul = memchr(in, '\0', len);
    if (nul) {
        doc = nul + 1;
        doc_len = len - (size_t)(doc - in);
        len = (size_t)(nul - in);
        if (!fuzz_utf8_valid((const unsigned char *)doc, doc_len) ||
            memchr(doc, '\0', doc_len))
            return 0; /* documents reach search decoded: valid UTF-8, no NUL */
    }
    tt_search_options o;
    tt_search_options_init(&o);
    o.case_sensitive = flags & 1;
    o.whole_words = (flags >> 1) & 1;
    o.context = (flags & 8) ? 0 : 3;
    tt_watchlist *wl = tt_watchlist_new(&o);
    FUZZ_CHECK(wl != NULL);
    tt_error err;
    tt_error_init(&err);
    long lines = 1;
    for (size_t i = 0; i < len; i++)
        lines += in[i] == '\n';
    tt_status st = tt_watchlist_parse(wl, in, len, "fuzz.tsv", &err);
    FUZZ_CHECK(strlen(tt_watchlist_sha256(wl)) == 64);
    if (st != TT_OK) {
        fuzz_check_error(st, &err);
        FUZZ_CHECK(st == TT_EPARSE || st == TT_ENOMEM);
        if (st == TT_EPARSE) {
            FUZZ_CHECK(tt_watchlist_problem_count(wl) >= 1);
            for (size_t i = 0; i < tt_watchlist_problem_count(wl); i++) {
                const tt_error *e = tt_watchlist_problem(wl, i);
                FUZZ_CHECK(e->line >= 0 && e->line <= lines);
                FUZZ_CHECK(e->message[0] != '\0');
            }
        }
    } else {
        size_t n = tt_watchlist_size(wl);
        FUZZ_CHECK(n >= 1 && tt_watchlist_problem_count(wl) == 0);
        for (size_t i = 0; i < n; i++) {
            const tt_rule *r = tt_watchlist_rule(wl, i);
            FUZZ_CHECK(r->name[0] && r->pattern[0]);
            FUZZ_CHECK(r->line >= 1 && r->line <= lines);
            for (size_t j = 0; j < i; j++)
                FUZZ_CHECK(strcmp(r->name, tt_watchlist_rule(wl, j)->name) != 0);
        }
        check_search(wl, doc, doc_len, (flags >> 2) & 1, (flags >> 4) & 1);
    }
    tt_watchlist_free(wl);
    return 0;
}
