/* termtide — periods and series (see include/termtide/meta.h).
 *
 * A period is a value: granularity (year, quarter, month, day), basis
 * (calendar or fiscal) and its numbers. Parsing is a hand-written scanner
 * over the six forms, strict so that a typo never becomes a different
 * period ("2025-9" is refused rather than read as September), with a
 * message per way of going wrong.
 *
 * Time line. Days are counted with the days-from-civil algorithm of Howard
 * Hinnant ("chrono-Compatible Low-Level Date Algorithms", 2013), exact for
 * the proleptic Gregorian calendar over any year, shifted so 0000-01-01 is
 * day 0. Quarters and months are counted as year * 4 + quarter - 1 and
 * year * 12 + month - 1, so neighbours always differ by one, across year
 * ends too. Mixed classes order by last day, then length, then basis: a
 * total order in which each (last day, granularity, basis) names exactly
 * one period.
 *
 * Series. tt_series_build sorts (entity, period, document index) records,
 * O(n log n), then walks each entity's run once to check it holds one class,
 * cut it into groups of equal periods and pair neighbouring groups. */
#include <stdio.h>
#include <stdlib.h>

#include "termtide/meta.h"
#include "tt_internal.h"

/* Shared with manifest.c (this module has no internal header of its own):
 * writes s[0..len) into out for a message, without the surrounding quotes,
 * escaping '"', '\\', control characters and bytes that are not valid
 * UTF-8 as \xNN, and cutting at a character boundary with "..." when it
 * does not fit. out always NUL-terminated; size >= 8. */
void tti_meta_quote(const char *s, size_t len, char *out, size_t size);

void tti_meta_quote(const char *s, size_t len, char *out, size_t size)
{
    static const char hex[] = "0123456789abcdef";
    size_t o = 0, i = 0;
    while (i < len) {
        unsigned char c = (unsigned char)s[i];
        char piece[8];
        size_t pn = 0, adv = 1;
        if (c == '"' || c == '\\') {
            piece[pn++] = '\\';
            piece[pn++] = (char)c;
        } else if (c < 0x20 || c == 0x7f) {
            piece[pn++] = '\\';
            piece[pn++] = 'x';
            piece[pn++] = hex[c >> 4];
            piece[pn++] = hex[c & 15];
        } else if (c < 0x80) {
            piece[pn++] = (char)c;
        } else {
            uint32_t cp;
            adv = tti_utf8_decode((const unsigned char *)s + i, len - i, &cp);
            if (cp == 0xFFFD && adv == 1) {
                piece[pn++] = '\\';
                piece[pn++] = 'x';
                piece[pn++] = hex[c >> 4];
                piece[pn++] = hex[c & 15];
            } else {
                memcpy(piece, s + i, adv);
                pn = adv;
            }
        }
        /* Keep room for "..." and the NUL unless this is the last piece. */
        size_t room = (i + adv < len) ? size - 4 : size - 1;
        if (o + pn > room) {
            if (o + 3 < size) {
                memcpy(out + o, "...", 3);
                o += 3;
            }
            break;
        }
        memcpy(out + o, piece, pn);
        o += pn;
        i += adv;
    }
    out[o] = '\0';
}

/* ---- calendar arithmetic ------------------------------------------------- */

static int is_leap(int y) { return (y % 4 == 0 && y % 100 != 0) || y % 400 == 0; }

static int days_in_month(int y, int m)
{
    static const int dim[12] = { 31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31 };
    return (m == 2 && is_leap(y)) ? 29 : dim[m - 1];
}

/* Days since 1970-01-01 of a proleptic Gregorian date: Hinnant (2013),
 * "days_from_civil". Eras of 400 years (146,097 days) make it exact for any
 * year; the year is taken to start in March so the leap day comes last. */
static long days_from_civil(int y, int m, int d)
{
    long yy = (long)y - (m <= 2);
    long era = (yy >= 0 ? yy : yy - 399) / 400;
    long yoe = yy - era * 400;
    long doy = (153L * (m > 2 ? m - 3 : m + 9) + 2) / 5 + d - 1;
    long doe = yoe * 365 + yoe / 4 - yoe / 100 + doy;
    return era * 146097 + doe - 719468;
}

/* 0000-01-01 as day 0. */
static long day_number(int y, int m, int d) { return days_from_civil(y, m, d) - days_from_civil(0, 1, 1); }

/* ---- parsing ------------------------------------------------------------- */

#define EXPECTED "expected 2025, 2025-Q3, 2025-09, 2025-09-30, FY2025 or FY2025-Q3"

static size_t count_digits(const char *s, size_t n)
{
    size_t k = 0;
    while (k < n && tti_is_ascii_digit(s[k]))
        k++;
    return k;
}

static int number(const char *s, size_t n)
{
    int v = 0;
    for (size_t i = 0; i < n; i++)
        v = v * 10 + (s[i] - '0');
    return v;
}

static tt_status parse_fail(tt_error *err, const char *what, const char *text, size_t len,
                            const char *reason)
{
    char q[96];
    tti_meta_quote(text, len, q, sizeof q);
    return tt_error_set_line(err, TT_EPARSE, NULL, 0, "%s \"%s\": %s", what, q, reason);
}

static tt_status day_fail(tt_error *err, const char *what, const char *text, size_t len, int y,
                          int m)
{
    char reason[64];
    snprintf(reason, sizeof reason, "%04d-%02d has %d days", y, m, days_in_month(y, m));
    return parse_fail(err, what, text, len, reason);
}

tt_status tt_period_parse(const char *text, size_t len, tt_period *out, tt_error *err)
{
    static const char what[] = "unknown period syntax";
    tt_period p = { TT_PERIOD_NONE, TT_BASIS_CALENDAR, 0, 0, 0, 0 };
    if (!text)
        len = 0;
    if (len == 0)
        return tt_error_set_line(err, TT_EPARSE, NULL, 0, "empty period: " EXPECTED);
    const char *s = text;
    size_t n = len;
    if (n >= 2 && tti_ascii_lower(s[0]) == 'f' && tti_ascii_lower(s[1]) == 'y') {
        p.basis = TT_BASIS_FISCAL;
        s += 2;
        n -= 2;
    }
    size_t nd = count_digits(s, n);
    if (nd == 0) {
        if (n > 0 && tti_ascii_lower(s[0]) == 'q')
            return parse_fail(err, what, text, len, "the year comes first, as in 2025-Q3");
        return parse_fail(err, what, text, len, EXPECTED);
    }
    if (nd != 4)
        return parse_fail(err, what, text, len,
                          p.basis == TT_BASIS_FISCAL ? "a fiscal year has four digits, as in FY2025"
                                                     : "a year has four digits, as in 2025");
    p.year = number(s, 4);
    s += 4;
    n -= 4;
    if (n == 0) {
        p.granularity = TT_PERIOD_YEAR;
        *out = p;
        return TT_OK;
    }
    if (s[0] != '-' || n == 1)
        return parse_fail(err, what, text, len, EXPECTED);
    s++;
    n--;
    if (tti_ascii_lower(s[0]) == 'q') {
        size_t qd = count_digits(s + 1, n - 1);
        if (qd + 1 != n)
            return parse_fail(err, what, text, len, EXPECTED);
        if (qd != 1 || s[1] < '1' || s[1] > '4')
            return parse_fail(err, what, text, len, "a quarter is Q1 to Q4");
        p.granularity = TT_PERIOD_QUARTER;
        p.quarter = s[1] - '0';
        *out = p;
        return TT_OK;
    }
    if (p.basis == TT_BASIS_FISCAL)
        return parse_fail(err, what, text, len, "a fiscal period is FY2025 or FY2025-Q3");
    size_t md = count_digits(s, n);
    if (md == 0)
        return parse_fail(err, what, text, len, EXPECTED);
    if (md != 2)
        return parse_fail(err, what, text, len, "a month has two digits, as in 2025-09");
    p.month = number(s, 2);
    if (p.month < 1 || p.month > 12)
        return parse_fail(err, what, text, len, "a month is 01 to 12");
    s += 2;
    n -= 2;
    if (n == 0) {
        p.granularity = TT_PERIOD_MONTH;
        *out = p;
        return TT_OK;
    }
    if (s[0] != '-' || n == 1)
        return parse_fail(err, what, text, len, EXPECTED);
    s++;
    n--;
    size_t dd = count_digits(s, n);
    if (dd != n)
        return parse_fail(err, what, text, len, EXPECTED);
    if (dd != 2)
        return parse_fail(err, what, text, len, "a day has two digits, as in 2025-09-30");
    p.day = number(s, 2);
    if (p.day < 1 || p.day > days_in_month(p.year, p.month))
        return day_fail(err, what, text, len, p.year, p.month);
    p.granularity = TT_PERIOD_DAY;
    *out = p;
    return TT_OK;
}

tt_status tt_period_parse_basic_date(const char *text, size_t len, tt_period *out, tt_error *err)
{
    static const char what[] = "unknown report date";
    if (!text)
        len = 0;
    if (len != 8 || count_digits(text, len) != 8)
        return parse_fail(err, what, text, len, "expected eight digits YYYYMMDD, as in 20250930");
    tt_period p = { TT_PERIOD_DAY, TT_BASIS_CALENDAR, number(text, 4), 0, number(text + 4, 2),
                    number(text + 6, 2) };
    if (p.month < 1 || p.month > 12)
        return parse_fail(err, what, text, len, "a month is 01 to 12");
    if (p.day < 1 || p.day > days_in_month(p.year, p.month))
        return day_fail(err, what, text, len, p.year, p.month);
    *out = p;
    return TT_OK;
}

/* ---- the period as a value ----------------------------------------------- */

int tt_period_valid(const tt_period *p)
{
    if (!p || p->year < 0 || p->year > 9999)
        return 0;
    if (p->basis != TT_BASIS_CALENDAR && p->basis != TT_BASIS_FISCAL)
        return 0;
    switch (p->granularity) {
    case TT_PERIOD_YEAR:
        return p->quarter == 0 && p->month == 0 && p->day == 0;
    case TT_PERIOD_QUARTER:
        return p->quarter >= 1 && p->quarter <= 4 && p->month == 0 && p->day == 0;
    case TT_PERIOD_MONTH:
        return p->basis == TT_BASIS_CALENDAR && p->quarter == 0 && p->month >= 1 &&
               p->month <= 12 && p->day == 0;
    case TT_PERIOD_DAY:
        return p->basis == TT_BASIS_CALENDAR && p->quarter == 0 && p->month >= 1 &&
               p->month <= 12 && p->day >= 1 && p->day <= days_in_month(p->year, p->month);
    case TT_PERIOD_NONE:
        break;
    }
    return 0;
}

char *tt_period_format(const tt_period *p, char *out, size_t size)
{
    if (!size)
        return out;
    if (!tt_period_valid(p)) {
        snprintf(out, size, "?");
        return out;
    }
    const char *fy = p->basis == TT_BASIS_FISCAL ? "FY" : "";
    switch (p->granularity) {
    case TT_PERIOD_YEAR: snprintf(out, size, "%s%04d", fy, p->year); break;
    case TT_PERIOD_QUARTER: snprintf(out, size, "%s%04d-Q%d", fy, p->year, p->quarter); break;
    case TT_PERIOD_MONTH: snprintf(out, size, "%04d-%02d", p->year, p->month); break;
    case TT_PERIOD_DAY: snprintf(out, size, "%04d-%02d-%02d", p->year, p->month, p->day); break;
    case TT_PERIOD_NONE: snprintf(out, size, "?"); break;
    }
    return out;
}

const char *tt_period_class_name(const tt_period *p)
{
    if (!tt_period_valid(p))
        return "invalid period";
    int fiscal = p->basis == TT_BASIS_FISCAL;
    switch (p->granularity) {
    case TT_PERIOD_YEAR: return fiscal ? "fiscal year" : "calendar year";
    case TT_PERIOD_QUARTER: return fiscal ? "fiscal quarter" : "calendar quarter";
    case TT_PERIOD_MONTH: return "month";
    case TT_PERIOD_DAY: return "day";
    case TT_PERIOD_NONE: break;
    }
    return "invalid period";
}

static int ascii_ieq(const char *a, const char *b)
{
    for (; *a && *b; a++, b++)
        if (tti_ascii_lower((unsigned char)*a) != tti_ascii_lower((unsigned char)*b))
            return 0;
    return *a == *b;
}

tt_status tt_period_class_parse(const char *name, tt_period_granularity *granularity,
                                tt_period_basis *basis, tt_error *err)
{
    static const struct {
        const char *name;
        tt_period_granularity g;
        tt_period_basis b;
    } classes[] = {
        { "year", TT_PERIOD_YEAR, TT_BASIS_CALENDAR },
        { "calendar-year", TT_PERIOD_YEAR, TT_BASIS_CALENDAR },
        { "quarter", TT_PERIOD_QUARTER, TT_BASIS_CALENDAR },
        { "calendar-quarter", TT_PERIOD_QUARTER, TT_BASIS_CALENDAR },
        { "month", TT_PERIOD_MONTH, TT_BASIS_CALENDAR },
        { "day", TT_PERIOD_DAY, TT_BASIS_CALENDAR },
        { "fiscal-year", TT_PERIOD_YEAR, TT_BASIS_FISCAL },
        { "fiscal-quarter", TT_PERIOD_QUARTER, TT_BASIS_FISCAL },
    };
    for (size_t i = 0; name && i < sizeof classes / sizeof classes[0]; i++) {
        if (ascii_ieq(name, classes[i].name)) {
            *granularity = classes[i].g;
            *basis = classes[i].b;
            return TT_OK;
        }
    }
    char q[96];
    tti_meta_quote(name ? name : "", name ? strlen(name) : 0, q, sizeof q);
    return tt_error_set_line(err, TT_EINVAL, NULL, 0,
                             "unknown kind of period \"%s\": expected year, quarter, month, day, "
                             "fiscal-year or fiscal-quarter",
                             q);
}

int tt_period_same_class(const tt_period *a, const tt_period *b)
{
    return a->granularity == b->granularity && a->basis == b->basis;
}

/* The last day of the period (fiscal periods placed as calendar ones). */
static long last_day(const tt_period *p)
{
    switch (p->granularity) {
    case TT_PERIOD_DAY: return day_number(p->year, p->month, p->day);
    case TT_PERIOD_MONTH: return day_number(p->year, p->month, days_in_month(p->year, p->month));
    case TT_PERIOD_QUARTER:
        return day_number(p->year, p->quarter * 3, days_in_month(p->year, p->quarter * 3));
    case TT_PERIOD_YEAR: return day_number(p->year, 12, 31);
    case TT_PERIOD_NONE: break;
    }
    return -1;
}

/* Shorter periods first when two end on the same day. */
static int length_rank(tt_period_granularity g)
{
    switch (g) {
    case TT_PERIOD_DAY: return 0;
    case TT_PERIOD_MONTH: return 1;
    case TT_PERIOD_QUARTER: return 2;
    case TT_PERIOD_YEAR: return 3;
    case TT_PERIOD_NONE: break;
    }
    return 4;
}

int tt_period_compare(const tt_period *a, const tt_period *b)
{
    long ea = last_day(a), eb = last_day(b);
    if (ea != eb)
        return ea < eb ? -1 : 1;
    int ra = length_rank(a->granularity), rb = length_rank(b->granularity);
    if (ra != rb)
        return ra < rb ? -1 : 1;
    if (a->basis != b->basis)
        return a->basis == TT_BASIS_CALENDAR ? -1 : 1;
    return 0;
}

long tt_period_index(const tt_period *p)
{
    if (!tt_period_valid(p))
        return -1;
    switch (p->granularity) {
    case TT_PERIOD_YEAR: return p->year;
    case TT_PERIOD_QUARTER: return (long)p->year * 4 + p->quarter - 1;
    case TT_PERIOD_MONTH: return (long)p->year * 12 + p->month - 1;
    case TT_PERIOD_DAY: return day_number(p->year, p->month, p->day);
    case TT_PERIOD_NONE: break;
    }
    return -1;
}

int tt_period_consecutive(const tt_period *a, const tt_period *b)
{
    if (!tt_period_valid(a) || !tt_period_valid(b) || !tt_period_same_class(a, b))
        return 0;
    return tt_period_index(b) == tt_period_index(a) + 1;
}

static const char *granularity_name(tt_period_granularity g, tt_period_basis b)
{
    tt_period p = { g, b, 2000, g == TT_PERIOD_QUARTER, g >= TT_PERIOD_MONTH, g == TT_PERIOD_DAY };
    return tt_period_class_name(&p);
}

tt_status tt_period_coarsen(const tt_period *p, tt_period_granularity granularity,
                            tt_period *out, tt_error *err)
{
    if (!tt_period_valid(p))
        return tt_error_set_line(err, TT_EINVAL, NULL, 0, "invalid period");
    if (granularity == p->granularity) {
        *out = *p;
        return TT_OK;
    }
    /* Coarser means a smaller enum value (YEAR < QUARTER < MONTH < DAY);
     * fiscal periods exist only as years and quarters. */
    int ok = granularity >= TT_PERIOD_YEAR && granularity < p->granularity &&
             (p->basis == TT_BASIS_CALENDAR || granularity == TT_PERIOD_YEAR);
    if (!ok)
        return tt_error_set_line(
            err, TT_EINVAL, NULL, 0, "cannot turn a %s into a %s", tt_period_class_name(p),
            granularity >= TT_PERIOD_YEAR && granularity <= TT_PERIOD_DAY
                ? granularity_name(granularity, granularity <= TT_PERIOD_QUARTER ? p->basis
                                                                                 : TT_BASIS_CALENDAR)
                : "period of no known granularity");
    tt_period c = { granularity, p->basis, p->year, 0, 0, 0 };
    if (granularity == TT_PERIOD_QUARTER)
        c.quarter = (p->month - 1) / 3 + 1;
    else if (granularity == TT_PERIOD_MONTH)
        c.month = p->month;
    *out = c;
    return TT_OK;
}

/* ---- series -------------------------------------------------------------- */

void tt_series_options_init(tt_series_options *o)
{
    o->kinds = NULL;
    o->entity = NULL;
    o->granularity = TT_PERIOD_NONE;
    o->basis = -1;
}

void tt_series_init(tt_series *s) { memset(s, 0, sizeof *s); }

void tt_series_release(tt_series *s)
{
    tt_free(s->groups);
    tt_free(s->members);
    tt_free(s->pairs);
    tt_series_init(s);
}

void tt_series_clear(tt_series *s)
{
    tt_series_release(s);
    tt_series_init(s);
}

/* Whether kind is one of the comma-separated items of list (ASCII case
 * ignored, blanks around items trimmed). */
static int kind_listed(const char *list, const char *kind)
{
    size_t klen = strlen(kind);
    const char *p = list;
    for (;;) {
        const char *end = strchr(p, ',');
        const char *stop = end ? end : p + strlen(p);
        const char *a = p, *b = stop;
        while (a < b && (*a == ' ' || *a == '\t'))
            a++;
        while (b > a && (b[-1] == ' ' || b[-1] == '\t'))
            b--;
        if ((size_t)(b - a) == klen) {
            size_t i = 0;
            while (i < klen && tti_ascii_lower((unsigned char)a[i]) ==
                                   tti_ascii_lower((unsigned char)kind[i]))
                i++;
            if (i == klen)
                return 1;
        }
        if (!end)
            return 0;
        p = end + 1;
    }
}

static int keep_doc(const tt_doc_meta *d, const tt_series_options *o)
{
    if (!o)
        return 1;
    if (o->entity && strcmp(o->entity, d->entity) != 0)
        return 0;
    if (o->granularity != TT_PERIOD_NONE && d->period.granularity != o->granularity)
        return 0;
    if (o->basis >= 0 && (int)d->period.basis != o->basis)
        return 0;
    if (o->kinds && o->kinds[0] && !kind_listed(o->kinds, d->kind ? d->kind : ""))
        return 0;
    return 1;
}

typedef struct series_item {
    const tt_doc_meta *doc;
    size_t index;
} series_item;

static int cmp_items(const void *pa, const void *pb)
{
    const series_item *a = pa, *b = pb;
    int c = strcmp(a->doc->entity, b->doc->entity);
    if (c)
        return c;
    c = tt_period_compare(&a->doc->period, &b->doc->period);
    if (c)
        return c;
    return a->index < b->index ? -1 : a->index > b->index;
}

/* A path for a message: its last 150 bytes at most, cut at a character
 * boundary, "..." in front when cut. */
static void short_path(const char *path, char *out, size_t size)
{
    size_t len = strlen(path);
    const size_t keep = 150;
    if (len <= keep) {
        tti_strlcpy(out, path, size);
        return;
    }
    const char *t = path + len - keep;
    while (((unsigned char)*t & 0xC0) == 0x80)
        t++;
    snprintf(out, size, "...%s", t);
}

static tt_status clash_error(tt_error *err, const tt_doc_meta *a, const tt_doc_meta *b)
{
    char pa[160], pb[160], ta[TT_PERIOD_TEXT_MAX], tb[TT_PERIOD_TEXT_MAX], kinds[160] = "";
    short_path(a->path, pa, sizeof pa);
    short_path(b->path, pb, sizeof pb);
    const char *ka = a->kind ? a->kind : "", *kb = b->kind ? b->kind : "";
    if (strcmp(ka, kb) != 0) {
        char qa[64], qb[64];
        tti_meta_quote(ka, strlen(ka), qa, sizeof qa);
        tti_meta_quote(kb, strlen(kb), qb, sizeof qb);
        snprintf(kinds, sizeof kinds, " (kinds %s and %s)", qa[0] ? qa : "\"\"",
                 qb[0] ? qb : "\"\"");
    }
    return tt_error_set_line(err, TT_EINVAL, NULL, 0,
                             "%s has %s but %s has %s: a %s and a %s cannot be in one series%s", pa,
                             tt_period_format(&a->period, ta, sizeof ta), pb,
                             tt_period_format(&b->period, tb, sizeof tb),
                             tt_period_class_name(&a->period), tt_period_class_name(&b->period),
                             kinds);
}

tt_status tt_series_build(tt_series *s, const tt_doc_meta *docs, size_t n,
                          const tt_series_options *opt, tt_error *err)
{
    tt_status st = TT_OK;
    series_item *items = NULL;
    tt_series_release(s);

    size_t kept = 0;
    for (size_t i = 0; i < n; i++)
        kept += (size_t)keep_doc(&docs[i], opt);
    s->excluded = n - kept;
    if (kept == 0)
        return TT_OK;

    items = tt_reallocarray(NULL, kept, sizeof *items);
    s->members = tt_reallocarray(NULL, kept, sizeof *s->members);
    s->groups = tt_reallocarray(NULL, kept, sizeof *s->groups);
    s->pairs = tt_reallocarray(NULL, kept, sizeof *s->pairs);
    if (!items || !s->members || !s->groups || !s->pairs) {
        st = tt_error_set_line(err, TT_ENOMEM, NULL, 0, "out of memory grouping %zu documents",
                               kept);
        goto fail;
    }
    size_t k = 0;
    for (size_t i = 0; i < n; i++)
        if (keep_doc(&docs[i], opt))
            items[k++] = (series_item){ &docs[i], i };
    qsort(items, kept, sizeof *items, cmp_items);

    for (size_t a = 0; a < kept;) {
        size_t b = a + 1;
        while (b < kept && strcmp(items[b].doc->entity, items[a].doc->entity) == 0)
            b++;
        /* One class per entity: the entity's first document in docs order
         * sets it; the first document in docs order that differs clashes. */
        size_t ref = a;
        for (size_t i = a + 1; i < b; i++)
            if (items[i].index < items[ref].index)
                ref = i;
        size_t clash = b;
        for (size_t i = a; i < b; i++)
            if (!tt_period_same_class(&items[i].doc->period, &items[ref].doc->period) &&
                (clash == b || items[i].index < items[clash].index))
                clash = i;
        if (clash != b) {
            st = clash_error(err, items[ref].doc, items[clash].doc);
            goto fail;
        }
        s->n_entities++;
        size_t first_group = s->n_groups;
        for (size_t i = a; i < b;) {
            size_t j = i + 1;
            while (j < b && tt_period_compare(&items[j].doc->period, &items[i].doc->period) == 0)
                j++;
            tt_series_group *g = &s->groups[s->n_groups++];
            g->entity = items[i].doc->entity;
            g->period = items[i].doc->period;
            g->first = s->n_members;
            g->n_docs = j - i;
            for (size_t x = i; x < j; x++)
                s->members[s->n_members++] = items[x].index;
            i = j;
        }
        for (size_t g = first_group; g + 1 < s->n_groups; g++) {
            tt_series_pair *p = &s->pairs[s->n_pairs++];
            p->base = g;
            p->target = g + 1;
            p->gap = tt_period_index(&s->groups[g + 1].period) -
                     tt_period_index(&s->groups[g].period) - 1;
        }
        a = b;
    }
    tt_free(items);
    return TT_OK;

fail:
    tt_free(items);
    tt_series_release(s);
    return st;
}

long tt_series_find(const tt_series *s, const char *entity, const tt_period *period)
{
    size_t lo = 0, hi = s->n_groups;
    while (lo < hi) {
        size_t mid = lo + (hi - lo) / 2;
        const tt_series_group *g = &s->groups[mid];
        int c = strcmp(g->entity, entity);
        if (!c)
            c = tt_period_compare(&g->period, period);
        if (c == 0)
            return (long)mid;
        if (c < 0)
            lo = mid + 1;
        else
            hi = mid;
    }
    return -1;
}
