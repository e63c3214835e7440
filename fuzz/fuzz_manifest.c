/* termtide fuzz target — manifests, periods, path layouts and series
 * (tt_manifest_parse, tt_period_parse, tt_layout_match, tt_series_build).
 *
 * Byte 0 holds the options, the rest is the manifest:
 *   bit 0  group the loaded documents with tt_series_build, unfiltered and
 *          then filtered by the first document's kind and granularity
 *   bit 1  the first line (at most 127 bytes) is a layout, compiled and
 *          matched against every loaded path; the manifest starts after it
 *   bit 2  resolve relative paths against "base/dir" instead of as written
 *   bit 3  also parse every line (first 31 bytes) as a period and as a
 *          YYYYMMDD report date
 * Listed files are never stat()ed (TT_MANIFEST_SKIP_FILE_CHECK): the
 * outcome must not depend on the machine's files.
 * Checked (include/termtide/meta.h): a failed load keeps no documents and
 * lists 1..TT_MANIFEST_MAX_ERRORS problems, each with the manifest's name
 * and a line; a loaded document has a resolved path that resolves to
 * itself and is found by tt_manifest_find, a non-blank entity, a valid
 * period whose canonical text parses back to it, lines in order; a parsed
 * period round-trips through tt_period_format, and tt_period_coarsen gives
 * a period of the asked granularity that ends no earlier; a series keeps or excludes
 * every document once, its groups are strictly sorted and hold the right
 * documents, its pairs join neighbouring groups of one entity with the gap
 * the period indices give, and tt_series_find finds every group; a layout
 * match yields a non-empty entity and a valid period. */
#include "fuzz_common.h"

#include "termtide/buf.h"
#include "termtide/meta.h"

static int blank(const char *s)
{
    for (; *s; s++)
        if (*s != ' ' && *s != '\t')
            return 0;
    return 1;
}

static void check_period_roundtrip(const tt_period *p)
{
    char text[TT_PERIOD_TEXT_MAX];
    tt_period q;
    FUZZ_CHECK(tt_period_valid(p));
    tt_period_format(p, text, sizeof text);
    FUZZ_CHECK(tt_period_parse(text, strlen(text), &q, NULL) == TT_OK);
    FUZZ_CHECK(tt_period_compare(p, &q) == 0);
    FUZZ_CHECK(tt_period_index(p) >= 0);
    FUZZ_CHECK(!tt_period_consecutive(p, p));
    /* A containing period ends on the same day or later. */
    for (int g = TT_PERIOD_YEAR; g <= TT_PERIOD_DAY; g++) {
        tt_period c;
        if (tt_period_coarsen(p, (tt_period_granularity)g, &c, NULL) == TT_OK) {
            FUZZ_CHECK(tt_period_valid(&c) && c.granularity == (tt_period_granularity)g);
            FUZZ_CHECK(c.basis == p->basis && c.year == p->year);
            FUZZ_CHECK(tt_period_compare(&c, p) >= 0);
        } else {
            FUZZ_CHECK(g > (int)p->granularity ||
                       (p->basis == TT_BASIS_FISCAL && g != TT_PERIOD_YEAR));
        }
    }
}

static void check_lines_as_periods(const char *t, size_t len)
{
    size_t lines = 0;
    for (size_t i = 0; i < len && lines < 256; lines++) {
        size_t e = i;
        while (e < len && t[e] != '\n')
            e++;
        size_t n = e - i < 31 ? e - i : 31;
        tt_period p;
        tt_error err;
        tt_error_init(&err);
        tt_status st = tt_period_parse(t + i, n, &p, &err);
        if (st == TT_OK) {
            check_period_roundtrip(&p);
        } else {
            fuzz_check_error(st, &err);
            FUZZ_CHECK(st == TT_EPARSE);
        }
        st = tt_period_parse_basic_date(t + i, n, &p, &err);
        if (st == TT_OK) {
            FUZZ_CHECK(p.granularity == TT_PERIOD_DAY);
            check_period_roundtrip(&p);
        } else {
            fuzz_check_error(st, &err);
            FUZZ_CHECK(st == TT_EPARSE);
        }
        i = e + 1;
    }
}

static void check_series(const tt_manifest *m, const tt_series_options *o)
{
    tt_series s;
    tt_error err;
    tt_series_init(&s);
    tt_error_init(&err);
    tt_status st = tt_series_build(&s, m->docs, m->n, o, &err);
    if (st != TT_OK) {
        fuzz_check_error(st, &err);
        FUZZ_CHECK(st == TT_EINVAL || st == TT_ENOMEM);
        FUZZ_CHECK(s.n_groups == 0);
        tt_series_release(&s);
        return;
    }
    FUZZ_CHECK(s.n_members + s.excluded == m->n);
    size_t members = 0, pairs = 0;
    for (size_t g = 0; g < s.n_groups; g++) {
        const tt_series_group *gr = &s.groups[g];
        FUZZ_CHECK(gr->n_docs >= 1 && gr->first == members);
        members += gr->n_docs;
        for (size_t k = 0; k < gr->n_docs; k++) {
            size_t d = s.members[gr->first + k];
            FUZZ_CHECK(d < m->n);
            FUZZ_CHECK(k == 0 || d > s.members[gr->first + k - 1]);
            FUZZ_CHECK(strcmp(m->docs[d].entity, gr->entity) == 0);
            FUZZ_CHECK(tt_period_compare(&m->docs[d].period, &gr->period) == 0);
        }
        if (g > 0) {
            const tt_series_group *pr = &s.groups[g - 1];
            int c = strcmp(pr->entity, gr->entity);
            FUZZ_CHECK(c < 0 || (c == 0 && tt_period_compare(&pr->period, &gr->period) < 0));
            if (c == 0) {
                FUZZ_CHECK(tt_period_same_class(&pr->period, &gr->period));
                FUZZ_CHECK(pairs < s.n_pairs);
                const tt_series_pair *p = &s.pairs[pairs++];
                FUZZ_CHECK(p->base == g - 1 && p->target == g);
                FUZZ_CHECK(p->gap >= 0);
                FUZZ_CHECK(p->gap == tt_period_index(&gr->period) -
                                         tt_period_index(&pr->period) - 1);
                FUZZ_CHECK((p->gap == 0) == tt_period_consecutive(&pr->period, &gr->period));
            }
        }
        FUZZ_CHECK(tt_series_find(&s, gr->entity, &gr->period) == (long)g);
    }
    FUZZ_CHECK(members == s.n_members);
    FUZZ_CHECK(pairs == s.n_pairs);
    tt_series_release(&s);
}

static void check_layout(const tt_manifest *m, const char *pattern)
{
    tt_layout l;
    tt_error err;
    tt_layout_init(&l);
    tt_error_init(&err);
    tt_status st = tt_layout_compile(&l, pattern, &err);
    if (st != TT_OK) {
        fuzz_check_error(st, &err);
        FUZZ_CHECK(st == TT_EINVAL || st == TT_ELIMIT || st == TT_ENOMEM);
        FUZZ_CHECK(l.tokens == NULL);
        return;
    }
    for (size_t i = 0; i < m->n; i++) {
        tt_layout_fields f;
        st = tt_layout_match(&l, (i & 1) ? "base" : NULL, m->docs[i].path, &f, &err);
        if (st == TT_OK) {
            FUZZ_CHECK(f.entity[0] != '\0');
            FUZZ_CHECK(memchr(f.kind, '\0', sizeof f.kind) != NULL);
            check_period_roundtrip(&f.period);
        } else {
            fuzz_check_error(st, &err);
            FUZZ_CHECK(st == TT_EPARSE || st == TT_EINVAL || st == TT_ELIMIT ||
                       st == TT_ENOMEM);
        }
    }
    tt_layout_release(&l);
}

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size)
{
    if (size < 1)
        return 0;
    const unsigned flags = data[0];
    const char *t = (const char *)data + 1;
    size_t len = size - 1;
    char pattern[128];
    pattern[0] = '\0';
    if (flags & 2) {
        size_t n = 0;
        while (n < len && n < sizeof pattern - 1 && t[n] != '\n' && t[n] != '\0')
            n++;
        memcpy(pattern, t, n);
        pattern[n] = '\0';
        while (n < len && t[n] != '\n')
            n++;
        t += n < len ? n + 1 : n;
        len -= n < len ? n + 1 : n;
    }
    if (flags & 8)
        check_lines_as_periods(t, len);

    tt_manifest m;
    tt_error err;
    tt_manifest_init(&m);
    tt_error_init(&err);
    const char *dir = (flags & 4) ? "base/dir" : NULL;
    tt_status st =
        tt_manifest_parse(&m, t, len, "fuzz.tsv", dir, TT_MANIFEST_SKIP_FILE_CHECK, &err);
    if (st != TT_OK) {
        fuzz_check_error(st, &err);
        FUZZ_CHECK(st == TT_EPARSE || st == TT_ELIMIT || st == TT_EBINARY || st == TT_ENOMEM);
        FUZZ_CHECK(m.n == 0);
        if (st == TT_EPARSE || (st == TT_ELIMIT && m.n_errors)) {
            FUZZ_CHECK(m.n_errors >= 1 && m.n_errors <= TT_MANIFEST_MAX_ERRORS);
            FUZZ_CHECK(m.errors_more == 0 || m.n_errors == TT_MANIFEST_MAX_ERRORS);
            for (size_t i = 0; i < m.n_errors; i++) {
                FUZZ_CHECK(strcmp(m.errors[i].file, "fuzz.tsv") == 0);
                FUZZ_CHECK(m.errors[i].line >= 1);
                FUZZ_CHECK(i == 0 || m.errors[i].line >= m.errors[i - 1].line);
                FUZZ_CHECK(m.errors[i].message[0] != '\0');
            }
            FUZZ_CHECK(err.line == m.errors[0].line);
        }
        tt_manifest_release(&m);
        return 0;
    }
    FUZZ_CHECK(m.n_errors == 0);
    tt_buf again;
    tt_buf_init(&again, 0);
    for (size_t i = 0; i < m.n; i++) {
        const tt_doc_meta *d = &m.docs[i];
        FUZZ_CHECK(d->path[0] != '\0');
        FUZZ_CHECK(tt_meta_path_resolve(NULL, d->path, &again) == TT_OK);
        FUZZ_CHECK(strcmp(again.data, d->path) == 0);
        FUZZ_CHECK(tt_manifest_find(&m, d->path) == d);
        FUZZ_CHECK(!blank(d->entity));
        FUZZ_CHECK(d->kind != NULL);
        check_period_roundtrip(&d->period);
        FUZZ_CHECK(d->line >= 1 && (i == 0 || d->line > m.docs[i - 1].line));
        for (size_t k = 0; k < m.n_tags; k++)
            FUZZ_CHECK(d->tags[k] != NULL && tt_manifest_tag(&m, i, m.tag_names[k]) != NULL);
    }
    tt_buf_release(&again);

    if (flags & 1) {
        check_series(&m, NULL);
        if (m.n) {
            tt_series_options o;
            tt_series_options_init(&o);
            o.kinds = m.docs[0].kind;
            o.granularity = m.docs[0].period.granularity;
            o.basis = (int)m.docs[0].period.basis;
            check_series(&m, &o);
        }
    }
    if (flags & 2)
        check_layout(&m, pattern);
    tt_manifest_release(&m);
    return 0;
}
