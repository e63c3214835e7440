/* termtide — finding sections.
 *
 * One pass collects the candidate headings (item headings with the part in
 * force, or user-rule matches); a second resolves each section's mention
 * (see sections.h: the last mention with a body of at least
 * TT_SECTION_MIN_WORDS words before the next candidate, else the last);
 * the resolved headings, sorted, cut the document into sections. Headings
 * are parsed by hand, not by a regular expression: the forms are few and
 * this keeps the common path free of PCRE2. Words are estimated from
 * spaces (a block's text is whitespace-normalized). O(blocks × candidates)
 * at worst for the word counts, candidates being few. */
#define PCRE2_CODE_UNIT_WIDTH 8
#include <pcre2.h>
#include <stdio.h>
#include <stdlib.h>

#include "termtide/sections.h"
#include "termtide/source.h"
#include "termtide/transcript.h"
#include "tt_internal.h"

void tt_sections_init(tt_sections *s)
{
    memset(s, 0, sizeof *s);
    s->form = "none";
}

void tt_sections_release(tt_sections *s)
{
    tt_free(s->items);
    tt_sections_init(s);
}

static tt_section *push(tt_sections *s)
{
    if (s->n == s->cap) {
        size_t cap = s->cap ? 2 * s->cap : 16;
        tt_section *t = tt_reallocarray(s->items, cap, sizeof *t);
        if (!t)
            return NULL;
        s->items = t;
        s->cap = cap;
    }
    tt_section *x = &s->items[s->n++];
    memset(x, 0, sizeof *x);
    return x;
}

/* ---- the item tables: our names ---------------------------------------- */

typedef struct item_name {
    const char *item, *name;
} item_name;

static const item_name annual_items[] = {
    { "1", "business" }, { "1A", "risk-factors" }, { "1B", "unresolved-comments" },
    { "1C", "cybersecurity" }, { "2", "properties" }, { "3", "legal-proceedings" },
    { "4", "mine-safety" }, { "5", "market-for-equity" }, { "6", "reserved" }, { "7", "mdna" },
    { "7A", "market-risk" }, { "8", "financial-statements" }, { "9", "accountant-changes" },
    { "9A", "controls" }, { "9B", "other-information" }, { "9C", "foreign-inspection" },
    { "10", "governance" }, { "11", "compensation" }, { "12", "ownership" },
    { "13", "relationships" }, { "14", "accountant-fees" }, { "15", "exhibits" },
    { "16", "summary" }, { NULL, NULL }
};

static const item_name quarterly_items[] = {
    { "I-1", "financial-statements" }, { "I-2", "mdna" }, { "I-3", "market-risk" },
    { "I-4", "controls" }, { "II-1", "legal-proceedings" }, { "II-1A", "risk-factors" },
    { "II-2", "equity-sales" }, { "II-3", "defaults" }, { "II-4", "mine-safety" },
    { "II-5", "other-information" }, { "II-6", "exhibits" }, { NULL, NULL }
};

static const item_name current_items[] = {
    { "1.01", "material-agreement" }, { "1.02", "agreement-ended" }, { "1.05", "cyber-incident" },
    { "2.01", "acquisition" }, { "2.02", "results" }, { "2.03", "obligation" },
    { "2.05", "exit-costs" }, { "2.06", "impairment" }, { "3.01", "delisting" },
    { "4.01", "auditor-change" }, { "4.02", "non-reliance" }, { "5.02", "officers" },
    { "5.03", "bylaws" }, { "5.07", "shareholder-vote" }, { "7.01", "regulation-fd" },
    { "8.01", "other-events" }, { "9.01", "exhibits" }, { NULL, NULL }
};

const char *const *tt_section_names(void)
{
    static const char *names[64];
    if (!names[0]) {
        size_t n = 0;
        const item_name *tables[] = { annual_items, quarterly_items, current_items };
        for (size_t t = 0; t < 3; t++)
            for (const item_name *i = tables[t]; i->item && n < 60; i++) {
                int seen = 0;
                for (size_t k = 0; k < n && !seen; k++)
                    seen = !strcmp(names[k], i->name);
                if (!seen)
                    names[n++] = i->name;
            }
        names[n++] = "prepared-remarks";
        names[n++] = "qa";
        names[n] = NULL;
    }
    return names;
}

/* ---- parsing headings ------------------------------------------------------ */

static int lower(int c) { return tti_ascii_lower(c); }

static int starts_word(const char *s, size_t n, const char *w)
{
    size_t m = strlen(w);
    if (n < m)
        return 0;
    for (size_t i = 0; i < m; i++)
        if (lower((unsigned char)s[i]) != w[i])
            return 0;
    return n == m || !tti_is_ascii_alpha((unsigned char)s[m]);
}

/* A roman part number at s: 1..4, its length in *len; 0 when none. */
static int roman(const char *s, size_t n, size_t *len)
{
    static const char *const r[] = { "iv", "iii", "ii", "i" };
    static const int v[] = { 4, 3, 2, 1 };
    for (int k = 0; k < 4; k++)
        if (starts_word(s, n, r[k])) {
            *len = strlen(r[k]);
            return v[k];
        }
    return 0;
}

static size_t skip_seps(const char *s, size_t n, size_t i)
{
    while (i < n) {
        unsigned char c = (unsigned char)s[i];
        if (c == ' ' || c == '.' || c == ',' || c == ':' || c == '-')
            i++;
        else if (c == 0xE2 && i + 2 < n && (unsigned char)s[i + 1] == 0x80 &&
                 ((unsigned char)s[i + 2] == 0x93 || (unsigned char)s[i + 2] == 0x94))
            i += 3; /* en and em dash */
        else
            break;
    }
    return i;
}

/* "PART II" alone (with a title after it at most): its number, else 0. */
static int part_heading(const char *s, size_t n)
{
    size_t i = 0, len;
    if (n > 80 || !starts_word(s, n, "part"))
        return 0;
    i = 4;
    while (i < n && s[i] == ' ')
        i++;
    int p = roman(s + i, n - i, &len);
    if (!p)
        return 0;
    i = skip_seps(s, n, i + len);
    /* "Part II of this report" is prose, not a heading */
    if (i < n && (starts_word(s + i, n - i, "of") || starts_word(s + i, n - i, "and")))
        return 0;
    return p;
}

/* "Item 1A. Risk Factors", "ITEM 7 —", "Part II, Item 1A", "Item 2.02":
 * 1 with the item number (upper case) in item and a part in *part (0 when
 * the heading names none). */
static int item_heading(const char *s, size_t n, char *item, size_t size, int *part)
{
    size_t i = 0, len;
    *part = 0;
    if (starts_word(s, n, "part")) {
        i = 4;
        while (i < n && s[i] == ' ')
            i++;
        if (!(*part = roman(s + i, n - i, &len)))
            return 0;
        i = skip_seps(s, n, i + len);
    }
    if (starts_word(s + i, n - i, "item"))
        i += 4;
    else if (starts_word(s + i, n - i, "items"))
        i += 5;
    else
        return 0;
    while (i < n && s[i] == ' ')
        i++;
    size_t d = i;
    while (i < n && i - d < 2 && tti_is_ascii_digit((unsigned char)s[i]))
        i++;
    if (i == d)
        return 0;
    size_t k = 0;
    for (size_t j = d; j < i && k + 1 < size; j++)
        item[k++] = s[j];
    if (i + 2 < n && s[i] == '.' && tti_is_ascii_digit((unsigned char)s[i + 1]) &&
        tti_is_ascii_digit((unsigned char)s[i + 2])) {
        for (size_t j = i; j < i + 3 && k + 1 < size; j++)
            item[k++] = s[j];
        i += 3;
    } else if (i < n && (s[i] | 32) >= 'a' && (s[i] | 32) <= 'c' &&
               (i + 1 == n || !tti_is_ascii_alpha((unsigned char)s[i + 1]))) {
        if (k + 1 < size)
            item[k++] = (char)(s[i] & ~32);
        i++;
    }
    item[k] = '\0';
    /* the number ends the heading or a separator follows */
    if (i < n && tti_is_ascii_alpha((unsigned char)s[i]))
        return 0;
    if (i < n && tti_is_ascii_digit((unsigned char)s[i]))
        return 0;
    /* periodic reports number their items 1 to 16 */
    if (!strchr(item, '.') && (strtol(item, NULL, 10) < 1 || strtol(item, NULL, 10) > 16))
        return 0;
    return 1;
}

static int heading_block(const tt_blocks *b, size_t i)
{
    const tt_block *x = &b->items[i];
    if (x->kind == TT_BLOCK_CELL)
        return 0;
    return x->kind == TT_BLOCK_HEADING || x->len <= TT_SECTION_HEADING_BYTES;
}

static size_t words_in(const tt_blocks *b, size_t from, size_t to)
{
    size_t w = 0;
    for (size_t i = from; i < to; i++) {
        const char *t = b->text.data + b->items[i].off;
        size_t n = b->items[i].len;
        if (!n)
            continue;
        w++;
        for (size_t k = 0; k < n; k++)
            w += t[k] == ' ';
    }
    return w;
}

/* A candidate heading. */
typedef struct cand {
    size_t block;
    char key[24];      /* the item as numbered ("II-1A") or the rule's name */
} cand;

typedef struct cands {
    cand *v;
    size_t n, cap;
} cands;

static int cand_push(cands *c, size_t block, const char *key)
{
    if (c->n == c->cap) {
        size_t cap = c->cap ? 2 * c->cap : 32;
        cand *v = tt_reallocarray(c->v, cap, sizeof *v);
        if (!v)
            return 0;
        c->v = v;
        c->cap = cap;
    }
    c->v[c->n].block = block;
    tti_strlcpy(c->v[c->n].key, key, sizeof c->v[c->n].key);
    c->n++;
    return 1;
}

static int cmp_first(const void *a, const void *b)
{
    const tt_section *x = a, *y = b;
    return x->first < y->first ? -1 : x->first > y->first;
}

/* Resolves the candidates into sections: per key, the mention where the
 * body starts; names from name_of(key). */
static tt_status resolve(const tt_blocks *b, const cands *c, tt_sections *out,
                         const char *(*name_of)(const char *key, void *ctx), void *ctx,
                         const char *what)
{
    for (size_t i = 0; i < c->n; i++) {
        /* handled already? */
        int seen = 0;
        for (size_t k = 0; k < out->n && !seen; k++)
            seen = !strcmp(out->items[k].item, c->v[i].key);
        if (seen)
            continue;
        size_t with_body = SIZE_MAX, last = SIZE_MAX, mentions = 0, body_words = 0;
        for (size_t j = i; j < c->n; j++) {
            if (strcmp(c->v[j].key, c->v[i].key))
                continue;
            mentions++;
            size_t next = j + 1 < c->n ? c->v[j + 1].block : b->n;
            size_t w = words_in(b, c->v[j].block + 1, next);
            if (w >= TT_SECTION_MIN_WORDS) {
                with_body = j;
                body_words = w;
            }
            last = j;
        }
        size_t chosen = with_body != SIZE_MAX ? with_body : last;
        tt_section *s = push(out);
        if (!s)
            return TT_ENOMEM;
        const char *name = name_of(c->v[i].key, ctx);
        if (name)
            tti_strlcpy(s->name, name, sizeof s->name);
        else
            snprintf(s->name, sizeof s->name, "item-%s", c->v[i].key);
        tti_strlcpy(s->item, c->v[i].key, sizeof s->item);
        s->first = c->v[chosen].block;
        s->mentions = mentions;
        const tt_block *h = &b->items[s->first];
        int hl = h->len > 60 ? 60 : (int)h->len;
        snprintf(s->how, sizeof s->how, "%s \"%.*s%s\" (block %zu)%s", what, hl,
                 b->text.data + h->off, h->len > 60 ? "..." : "", s->first,
                 mentions > 1 ? (body_words >= TT_SECTION_MIN_WORDS
                                     ? "; earlier mentions without a body skipped"
                                     : "; no mention has a body, the last taken")
                              : "");
    }
    if (out->n)
        qsort(out->items, out->n, sizeof *out->items, cmp_first);
    for (size_t k = 0; k < out->n; k++)
        out->items[k].end = k + 1 < out->n ? out->items[k + 1].first : b->n;
    return TT_OK;
}

static const char *table_name(const item_name *t, const char *key)
{
    for (; t->item; t++)
        if (!strcmp(t->item, key))
            return t->name;
    return NULL;
}

static const char *report_name(const char *key, void *ctx)
{
    return table_name((const item_name *)ctx, key);
}

/* ---- user rules -------------------------------------------------------------- */

typedef struct rule {
    char name[48];
    pcre2_code *code;
} rule;

struct tt_section_rules {
    rule *v;
    size_t n;
    pcre2_match_data *md;
};

void tt_section_rules_free(tt_section_rules *r)
{
    if (!r)
        return;
    for (size_t i = 0; i < r->n; i++)
        pcre2_code_free(r->v[i].code);
    tt_free(r->v);
    pcre2_match_data_free(r->md);
    tt_free(r);
}

tt_status tt_section_rules_load(const char *path, tt_section_rules **out, tt_error *err)
{
    *out = NULL;
    tt_buf text;
    tt_buf_init(&text, (size_t)1 << 20);
    int gz = 0;
    tt_status st = tt_source_read(path, &text, &gz, err);
    if (st) {
        tt_buf_release(&text);
        return st;
    }
    tt_section_rules *r = tt_calloc(1, sizeof *r);
    if (!r) {
        tt_buf_release(&text);
        return tt_error_set(err, TT_ENOMEM, path, -1, "out of memory");
    }
    const char *p = text.data, *end = text.data + text.len;
    long line = 0;
    if (end - p >= 3 && !memcmp(p, "\xef\xbb\xbf", 3))
        p += 3;
    while (p < end && !st) {
        const char *nl = memchr(p, '\n', (size_t)(end - p));
        const char *le = nl ? nl : end;
        line++;
        size_t n = (size_t)(le - p);
        if (n && p[n - 1] == '\r')
            n--;
        const char *l = p;
        p = nl ? nl + 1 : end;
        if (!n || l[0] == '#')
            continue;
        const char *tab = memchr(l, '\t', n);
        if (!tab || tab == l || (size_t)(tab - l) >= sizeof r->v[0].name) {
            st = tt_error_set_line(err, TT_EPARSE, path, line,
                                   "expected name<TAB>pattern (a name of at most 47 bytes)");
            break;
        }
        for (const char *c = l; c < tab; c++)
            if (!tti_is_ascii_alpha((unsigned char)*c) && !tti_is_ascii_digit((unsigned char)*c) &&
                *c != '-') {
                st = tt_error_set_line(err, TT_EPARSE, path, line,
                                       "a section name is letters, digits and '-'");
                break;
            }
        if (st)
            break;
        rule *v = tt_reallocarray(r->v, r->n + 1, sizeof *v);
        if (!v) {
            st = tt_error_set(err, TT_ENOMEM, path, -1, "out of memory");
            break;
        }
        r->v = v;
        rule *x = &r->v[r->n];
        memset(x, 0, sizeof *x);
        memcpy(x->name, l, (size_t)(tab - l));
        int ec;
        PCRE2_SIZE eo;
        x->code = pcre2_compile((PCRE2_SPTR)(tab + 1), (size_t)(l + n - tab - 1),
                                PCRE2_UTF | PCRE2_UCP | PCRE2_CASELESS, &ec, &eo, NULL);
        if (!x->code) {
            PCRE2_UCHAR msg[160];
            pcre2_get_error_message(ec, msg, sizeof msg);
            st = tt_error_set_line(err, TT_EPARSE, path, line, "pattern at offset %zu: %s",
                                   (size_t)eo, (const char *)msg);
            break;
        }
        r->n++;
    }
    if (!st && !r->n)
        st = tt_error_set(err, TT_EPARSE, path, -1, "no section rules");
    if (!st && !(r->md = pcre2_match_data_create(4, NULL)))
        st = tt_error_set(err, TT_ENOMEM, path, -1, "out of memory");
    tt_buf_release(&text);
    if (st) {
        tt_section_rules_free(r);
        return st;
    }
    *out = r;
    return TT_OK;
}

static const char *rule_name(const char *key, void *ctx)
{
    (void)ctx;
    return key;
}

/* ---- finding ------------------------------------------------------------------- */

static tt_status find_transcript(const tt_blocks *b, tt_sections *out, int *found)
{
    tt_transcript t;
    tt_transcript_init(&t);
    tt_status st = tt_transcript_find(b, &t);
    *found = 0;
    if (!st && t.found) {
        size_t first = b->n;
        for (size_t i = 0; i < b->n && first == b->n; i++)
            if (t.blocks[i].part == TT_PART_PREPARED)
                first = i;
        size_t qa = t.qa_block >= 0 ? (size_t)t.qa_block : b->n;
        tt_section *s;
        if (first < qa) {
            if (!(s = push(out))) {
                st = TT_ENOMEM;
                goto done;
            }
            tti_strlcpy(s->name, "prepared-remarks", sizeof s->name);
            s->first = first;
            s->end = qa;
            s->mentions = 1;
            snprintf(s->how, sizeof s->how, "the first speaker turn (block %zu)", first);
        }
        if (qa < b->n) {
            if (!(s = push(out))) {
                st = TT_ENOMEM;
                goto done;
            }
            tti_strlcpy(s->name, "qa", sizeof s->name);
            s->first = qa;
            s->end = b->n;
            s->mentions = 1;
            snprintf(s->how, sizeof s->how, "%s (block %zu)", t.qa_how, qa);
        }
        out->form = "transcript";
        *found = 1;
    }
done:
    tt_transcript_release(&t);
    return st;
}

tt_status tt_sections_find(const tt_blocks *b, const tt_section_rules *rules, tt_sections *out)
{
    out->n = 0;
    out->form = "none";
    cands c = { NULL, 0, 0 };
    tt_status st = TT_OK;
    if (rules) {
        for (size_t i = 0; i < b->n; i++) {
            if (!heading_block(b, i))
                continue;
            for (size_t k = 0; k < rules->n; k++)
                if (pcre2_match(rules->v[k].code, (PCRE2_SPTR)(b->text.data + b->items[i].off),
                                b->items[i].len, 0, 0, rules->md, NULL) >= 0) {
                    if (!cand_push(&c, i, rules->v[k].name))
                        st = TT_ENOMEM;
                    break;
                }
        }
        if (!st)
            st = resolve(b, &c, out, rule_name, NULL, "rule matched");
        if (!st && out->n)
            out->form = "user rules";
        tt_free(c.v);
        return st;
    }
    /* candidates with the part in force */
    typedef struct raw {
        size_t block;
        int part;
        char item[16];
    } raw;
    raw *r = NULL;
    size_t nr = 0, capr = 0;
    int part = 0, max_item = 0, part2 = 0, decimal = 0;
    for (size_t i = 0; i < b->n && !st; i++) {
        if (!heading_block(b, i))
            continue;
        const char *t = b->text.data + b->items[i].off;
        size_t n = b->items[i].len;
        char item[16];
        int p = part_heading(t, n);
        if (p && !item_heading(t, n, item, sizeof item, &p)) {
            part = p;
            part2 |= p == 2;
            continue;
        }
        if (!item_heading(t, n, item, sizeof item, &p))
            continue;
        if (p) {
            part = p;
            part2 |= p == 2;
        }
        if (strchr(item, '.'))
            decimal = 1;
        int num = (int)strtol(item, NULL, 10);
        if (num > max_item)
            max_item = num;
        if (nr == capr) {
            size_t cap = capr ? 2 * capr : 32;
            raw *v = tt_reallocarray(r, cap, sizeof *v);
            if (!v) {
                st = TT_ENOMEM;
                break;
            }
            r = v;
            capr = cap;
        }
        r[nr].block = i;
        r[nr].part = part;
        tti_strlcpy(r[nr].item, item, sizeof r[nr].item);
        nr++;
    }
    const item_name *table = annual_items;
    const char *form = "annual report";
    int quarterly = 0;
    if (decimal) {
        table = current_items;
        form = "current report";
    } else if (part2 && max_item <= 6) {
        table = quarterly_items;
        form = "quarterly report";
        quarterly = 1;
    }
    for (size_t i = 0; i < nr && !st; i++) {
        char key[24];
        if (quarterly)
            snprintf(key, sizeof key, "%s-%s", r[i].part >= 2 ? "II" : "I", r[i].item);
        else
            tti_strlcpy(key, r[i].item, sizeof key);
        if (!cand_push(&c, r[i].block, key))
            st = TT_ENOMEM;
    }
    tt_free(r);
    if (!st)
        st = resolve(b, &c, out, report_name, (void *)table, "heading");
    tt_free(c.v);
    if (!st && out->n) {
        out->form = form;
        return TT_OK;
    }
    int found;
    if (!st)
        st = find_transcript(b, out, &found);
    return st;
}

tt_status tt_blocks_keep_sections(tt_blocks *b, const tt_sections *s, const char *const *names,
                                  size_t n, size_t *kept)
{
    *kept = 0;
    unsigned char *keep = tt_calloc(b->n ? b->n : 1, 1);
    if (!keep)
        return TT_ENOMEM;
    for (size_t k = 0; k < n; k++) {
        int found = 0;
        for (size_t i = 0; i < s->n; i++)
            if (!strcmp(s->items[i].name, names[k])) {
                found = 1;
                for (size_t j = s->items[i].first; j < s->items[i].end && j < b->n; j++)
                    keep[j] = 1;
            }
        *kept += found;
    }
    size_t w = 0;
    for (size_t i = 0; i < b->n; i++)
        if (keep[i])
            b->items[w++] = b->items[i];
    b->n = w;
    tt_free(keep);
    return TT_OK;
}
