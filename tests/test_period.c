/* Tests for periods and series (src/period.c, include/termtide/meta.h).
 *
 * References:
 *  - the period forms: ISO 8601 calendar dates (YYYY-MM-DD extended,
 *    YYYYMMDD basic format), months (YYYY-MM) and years; quarters written
 *    2025-Q3 and fiscal years FY2025 / FY2025-Q3 are common practice in
 *    filings and analysts' tables (not a standard; the strict forms are the
 *    library's own rule, checked here case by case);
 *  - which dates exist, day numbers, the day after, the end of a month or
 *    quarter: Python's datetime module (the standard library; proleptic
 *    Gregorian calendar, date.toordinal() counts 0001-01-01 as day 1, so the
 *    library's day index, which counts 0000-01-01 as day 0 and year 0 as a
 *    leap year of 366 days, is toordinal() + 365), run at test time;
 *  - the mixed-class order: the rule stated in meta.h (last day, then
 *    shorter first, then calendar before fiscal), recomputed in Python from
 *    datetime's dates and calendar.monthrange, so the date arithmetic is
 *    not the library's own. */
#include "tt_test.h"

#include "termtide/alloc.h"
#include "termtide/meta.h"

static char *run_capture(const char *cmd)
{
    FILE *p = popen(cmd, "r");
    assert_non_null(p);
    size_t cap = 1 << 16, n = 0, r;
    char *out = malloc(cap);
    assert_non_null(out);
    while ((r = fread(out + n, 1, cap - 1 - n, p)) > 0) {
        n += r;
        if (n + 1 == cap) {
            cap *= 2;
            out = realloc(out, cap);
            assert_non_null(out);
        }
    }
    out[n] = '\0';
    assert_int_equal(pclose(p), 0);
    return out;
}

/* Runs a Python program given as text (through a temporary file, so quotes
 * need no shell escaping) and returns its output. */
static char *run_python(const char *program)
{
    char path[] = TT_TEST_TMP "tt_period_py_XXXXXX";
    int fd = mkstemp(path);
    assert_true(fd >= 0);
    FILE *f = fdopen(fd, "w");
    assert_non_null(f);
    fputs(program, f);
    fclose(f);
    char cmd[256];
    snprintf(cmd, sizeof cmd, "%s %s", tt_test_python(), path);
    char *out = run_capture(cmd);
    remove(path);
    return out;
}

static tt_period P(const char *text)
{
    tt_period p;
    tt_error err;
    tt_error_init(&err);
    tt_status st = tt_period_parse(text, strlen(text), &p, &err);
    if (st != TT_OK)
        fail_msg("%s: %s", text, err.message);
    return p;
}

/* ---- parsing ------------------------------------------------------------- */

static void test_parse_valid_forms(void **state)
{
    (void)state;
    static const struct {
        const char *text, *canonical;
        tt_period_granularity g;
        tt_period_basis b;
        int year, quarter, month, day;
    } cases[] = {
        { "2025", "2025", TT_PERIOD_YEAR, TT_BASIS_CALENDAR, 2025, 0, 0, 0 },
        { "2025-Q3", "2025-Q3", TT_PERIOD_QUARTER, TT_BASIS_CALENDAR, 2025, 3, 0, 0 },
        { "2025-q1", "2025-Q1", TT_PERIOD_QUARTER, TT_BASIS_CALENDAR, 2025, 1, 0, 0 },
        { "2025-09", "2025-09", TT_PERIOD_MONTH, TT_BASIS_CALENDAR, 2025, 0, 9, 0 },
        { "2025-09-30", "2025-09-30", TT_PERIOD_DAY, TT_BASIS_CALENDAR, 2025, 0, 9, 30 },
        { "2024-02-29", "2024-02-29", TT_PERIOD_DAY, TT_BASIS_CALENDAR, 2024, 0, 2, 29 },
        { "2000-02-29", "2000-02-29", TT_PERIOD_DAY, TT_BASIS_CALENDAR, 2000, 0, 2, 29 },
        { "FY2025", "FY2025", TT_PERIOD_YEAR, TT_BASIS_FISCAL, 2025, 0, 0, 0 },
        { "fy2025", "FY2025", TT_PERIOD_YEAR, TT_BASIS_FISCAL, 2025, 0, 0, 0 },
        { "FY2025-Q3", "FY2025-Q3", TT_PERIOD_QUARTER, TT_BASIS_FISCAL, 2025, 3, 0, 0 },
        { "Fy2025-q4", "FY2025-Q4", TT_PERIOD_QUARTER, TT_BASIS_FISCAL, 2025, 4, 0, 0 },
        { "0000", "0000", TT_PERIOD_YEAR, TT_BASIS_CALENDAR, 0, 0, 0, 0 },
        { "9999-12-31", "9999-12-31", TT_PERIOD_DAY, TT_BASIS_CALENDAR, 9999, 0, 12, 31 },
    };
    for (size_t i = 0; i < sizeof cases / sizeof cases[0]; i++) {
        tt_period p = P(cases[i].text);
        assert_int_equal(p.granularity, cases[i].g);
        assert_int_equal(p.basis, cases[i].b);
        assert_int_equal(p.year, cases[i].year);
        assert_int_equal(p.quarter, cases[i].quarter);
        assert_int_equal(p.month, cases[i].month);
        assert_int_equal(p.day, cases[i].day);
        assert_true(tt_period_valid(&p));
        char out[TT_PERIOD_TEXT_MAX];
        assert_string_equal(tt_period_format(&p, out, sizeof out), cases[i].canonical);
        /* The canonical text parses back to the same period. */
        tt_period q = P(out);
        assert_int_equal(tt_period_compare(&p, &q), 0);
    }
}

static void test_parse_invalid_forms(void **state)
{
    (void)state;
    /* Each refused text with what the message must say was expected. */
    static const struct {
        const char *text, *message;
    } cases[] = {
        { "2025-Q5", "unknown period syntax \"2025-Q5\": a quarter is Q1 to Q4" },
        { "2025-Q0", "unknown period syntax \"2025-Q0\": a quarter is Q1 to Q4" },
        { "2025-Q12", "unknown period syntax \"2025-Q12\": a quarter is Q1 to Q4" },
        { "2025-Q", "unknown period syntax \"2025-Q\": a quarter is Q1 to Q4" },
        { "2025-13", "unknown period syntax \"2025-13\": a month is 01 to 12" },
        { "2025-00", "unknown period syntax \"2025-00\": a month is 01 to 12" },
        { "2025-9", "unknown period syntax \"2025-9\": a month has two digits, as in 2025-09" },
        { "2025-02-30", "unknown period syntax \"2025-02-30\": 2025-02 has 28 days" },
        { "2025-02-29", "unknown period syntax \"2025-02-29\": 2025-02 has 28 days" },
        { "1900-02-29", "unknown period syntax \"1900-02-29\": 1900-02 has 28 days" },
        { "2025-04-31", "unknown period syntax \"2025-04-31\": 2025-04 has 30 days" },
        { "2025-09-00", "unknown period syntax \"2025-09-00\": 2025-09 has 30 days" },
        { "2025-09-3", "a day has two digits, as in 2025-09-30" },
        { "FY25", "unknown period syntax \"FY25\": a fiscal year has four digits, as in FY2025" },
        { "25", "a year has four digits, as in 2025" },
        { "20250", "a year has four digits, as in 2025" },
        { "Q3-2025", "unknown period syntax \"Q3-2025\": the year comes first, as in 2025-Q3" },
        { "FY2025-09", "a fiscal period is FY2025 or FY2025-Q3" },
        { "FY2025-09-30", "a fiscal period is FY2025 or FY2025-Q3" },
        { " 2025", "expected 2025, 2025-Q3, 2025-09, 2025-09-30, FY2025 or FY2025-Q3" },
        { "2025 ", "expected 2025, 2025-Q3, 2025-09, 2025-09-30, FY2025 or FY2025-Q3" },
        { "2025-Q3x", "expected 2025, 2025-Q3" },
        { "2025-", "expected 2025, 2025-Q3" },
        { "2025/09", "expected 2025, 2025-Q3" },
        { "2025-09-", "expected 2025, 2025-Q3" },
        { "2025-09-30T00", "expected 2025, 2025-Q3" },
        { "FY", "expected 2025, 2025-Q3" },
        { "H1-2025", "expected 2025, 2025-Q3" },
        { "20250930", "a year has four digits" }, /* only tt_period_parse_basic_date takes it */
        { "", "empty period" },
        { "2025-Q3\"\n", "unknown period syntax \"2025-Q3\\\"\\x0a\"" },
    };
    for (size_t i = 0; i < sizeof cases / sizeof cases[0]; i++) {
        tt_period p = { TT_PERIOD_MONTH, TT_BASIS_CALENDAR, 1111, 0, 1, 0 };
        tt_error err;
        tt_error_init(&err);
        tt_status st = tt_period_parse(cases[i].text, strlen(cases[i].text), &p, &err);
        if (st != TT_EPARSE)
            fail_msg("\"%s\" was accepted", cases[i].text);
        assert_int_equal(err.status, TT_EPARSE);
        if (!strstr(err.message, cases[i].message))
            fail_msg("\"%s\": message \"%s\" lacks \"%s\"", cases[i].text, err.message,
                     cases[i].message);
        assert_string_equal(err.file, "");
        assert_int_equal(p.year, 1111); /* untouched */
    }
    /* A length shorter than the string: only that prefix is parsed. */
    tt_period p;
    assert_int_equal(tt_period_parse("2025-Q3-x", 7, &p, NULL), TT_OK);
    assert_int_equal(p.quarter, 3);
    assert_int_equal(tt_period_parse("2025-09-30", 7, &p, NULL), TT_OK);
    assert_int_equal(p.granularity, TT_PERIOD_MONTH);
}

static void test_basic_date(void **state)
{
    (void)state;
    tt_period p;
    tt_error err;
    tt_error_init(&err);
    assert_int_equal(tt_period_parse_basic_date("20250930", 8, &p, &err), TT_OK);
    char out[TT_PERIOD_TEXT_MAX];
    assert_string_equal(tt_period_format(&p, out, sizeof out), "2025-09-30");
    assert_int_equal(p.granularity, TT_PERIOD_DAY);
    assert_int_equal(tt_period_parse_basic_date("20240229", 8, &p, &err), TT_OK);
    static const struct {
        const char *text, *message;
    } bad[] = {
        { "20250229", "unknown report date \"20250229\": 2025-02 has 28 days" },
        { "20251301", "a month is 01 to 12" },
        { "2025093", "expected eight digits YYYYMMDD" },
        { "202509300", "expected eight digits YYYYMMDD" },
        { "2025-09-30", "expected eight digits YYYYMMDD" },
        { "2025093a", "expected eight digits YYYYMMDD" },
        { "", "expected eight digits YYYYMMDD" },
    };
    for (size_t i = 0; i < sizeof bad / sizeof bad[0]; i++) {
        assert_int_equal(tt_period_parse_basic_date(bad[i].text, strlen(bad[i].text), &p, &err),
                         TT_EPARSE);
        if (!strstr(err.message, bad[i].message))
            fail_msg("%s: %s", bad[i].text, err.message);
    }
}

/* Every YYYY-MM-DD with a day from 27 to 32 in chosen years is accepted
 * exactly when Python's datetime.date accepts it. */
static void test_day_validity_against_python(void **state)
{
    (void)state;
    char *out = run_python(
        "import datetime\n"
        "for y in (1, 4, 100, 1582, 1900, 2000, 2023, 2024, 2025, 2100, 2400, 9999):\n"
        "  for m in range(1, 13):\n"
        "    for d in range(27, 33):\n"
        "      try:\n"
        "        datetime.date(y, m, d); ok = 1\n"
        "      except ValueError:\n"
        "        ok = 0\n"
        "      print('%04d-%02d-%02d %d' % (y, m, d, ok))\n");
    size_t checked = 0;
    char *save = NULL;
    for (char *line = strtok_r(out, "\n", &save); line; line = strtok_r(NULL, "\n", &save)) {
        char text[16];
        int ok;
        assert_int_equal(sscanf(line, "%15s %d", text, &ok), 2);
        tt_period p;
        tt_status st = tt_period_parse(text, strlen(text), &p, NULL);
        if ((st == TT_OK) != ok)
            fail_msg("%s: library says %d, Python says %d", text, st == TT_OK, ok);
        checked++;
    }
    assert_int_equal(checked, 12 * 12 * 6);
    free(out);
}

/* ---- the time line ------------------------------------------------------- */

/* Random days over years 1..9999: the index is Python's ordinal + 365; the
 * next day (Python's date + timedelta(days=1)) is consecutive, the day after
 * that is not; the order of two days follows their ordinals. */
static void test_days_against_python(void **state)
{
    (void)state;
    char *out = run_python(
        "import datetime, random\n"
        "r = random.Random(20250930)\n"
        "top = datetime.date(9999, 12, 30).toordinal()\n"
        "days = [r.randint(1, top) for _ in range(3000)]\n"
        "days += [datetime.date(y, m, d).toordinal() for (y, m, d) in\n"
        "  [(2024,2,28),(2024,2,29),(2025,2,28),(2024,12,31),(1999,12,31),(2000,2,28),\n"
        "   (2000,2,29),(1900,2,28),(1,1,1),(2025,9,30),(9999,12,30)]]\n"
        "for o in days:\n"
        "  d = datetime.date.fromordinal(o); n = d + datetime.timedelta(days=1)\n"
        "  print(d.isoformat(), o, n.isoformat())\n");
    size_t checked = 0;
    char *save = NULL;
    tt_period prev = { 0 };
    long prev_ord = 0;
    for (char *line = strtok_r(out, "\n", &save); line; line = strtok_r(NULL, "\n", &save)) {
        char a[16], b[16];
        long ord;
        assert_int_equal(sscanf(line, "%15s %ld %15s", a, &ord, b), 3);
        tt_period d = P(a), n = P(b);
        assert_int_equal(tt_period_index(&d), ord + 365);
        assert_true(tt_period_consecutive(&d, &n));
        assert_false(tt_period_consecutive(&n, &d));
        assert_false(tt_period_consecutive(&d, &d));
        assert_true(tt_period_compare(&d, &n) < 0);
        if (checked) {
            int c = tt_period_compare(&prev, &d);
            assert_int_equal(c < 0, prev_ord < ord);
            assert_int_equal(c == 0, prev_ord == ord);
        }
        prev = d;
        prev_ord = ord;
        checked++;
    }
    assert_int_equal(checked, 3011);
    /* 0000-01-01 is day 0 (one day before Python's range starts at
     * 0001-01-01, which is 366 since year 0 is a leap year). */
    tt_period z = P("0000-01-01");
    assert_int_equal(tt_period_index(&z), 0);
    z = P("0000-12-31");
    assert_int_equal(tt_period_index(&z), 365);
    free(out);
}

/* Months and quarters: Python finds the next one as the period holding the
 * day after the last day (calendar.monthrange for the month length). */
static void test_months_quarters_against_python(void **state)
{
    (void)state;
    char *out = run_python(
        "import datetime, calendar\n"
        "for y in (1999, 2000, 2023, 2024, 2025, 9998):\n"
        "  for m in range(1, 13):\n"
        "    last = datetime.date(y, m, calendar.monthrange(y, m)[1])\n"
        "    n = last + datetime.timedelta(days=1)\n"
        "    print('M %04d-%02d %04d-%02d' % (y, m, n.year, n.month))\n"
        "  for q in range(1, 5):\n"
        "    lm = 3 * q\n"
        "    last = datetime.date(y, lm, calendar.monthrange(y, lm)[1])\n"
        "    n = last + datetime.timedelta(days=1)\n"
        "    print('Q %04d-Q%d %04d-Q%d' % (y, q, n.year, (n.month - 1) // 3 + 1))\n"
        "    print('F FY%04d-Q%d FY%04d-Q%d' % (y, q, n.year, (n.month - 1) // 3 + 1))\n"
        "  print('Y %04d %04d' % (y, y + 1))\n"
        "  print('Y FY%04d FY%04d' % (y, y + 1))\n");
    size_t checked = 0;
    char *save = NULL;
    for (char *line = strtok_r(out, "\n", &save); line; line = strtok_r(NULL, "\n", &save)) {
        char kind, a[16], b[16];
        assert_int_equal(sscanf(line, "%c %15s %15s", &kind, a, b), 3);
        tt_period pa = P(a), pb = P(b);
        assert_true(tt_period_consecutive(&pa, &pb));
        assert_false(tt_period_consecutive(&pb, &pa));
        assert_int_equal(tt_period_index(&pb), tt_period_index(&pa) + 1);
        assert_true(tt_period_compare(&pa, &pb) < 0);
        checked++;
    }
    assert_int_equal(checked, 6 * (12 + 8 + 2));
    free(out);

    /* The cases named in the brief, by hand. */
    static const char *const pairs[][2] = {
        { "2025-Q4", "2026-Q1" }, { "FY2024", "FY2025" }, { "2025-12", "2026-01" },
        { "2025-12-31", "2026-01-01" }, { "FY2025-Q4", "FY2026-Q1" }, { "2024", "2025" },
    };
    for (size_t i = 0; i < sizeof pairs / sizeof pairs[0]; i++) {
        tt_period a = P(pairs[i][0]), b = P(pairs[i][1]);
        assert_true(tt_period_consecutive(&a, &b));
    }
    /* Never across classes, even where the dates touch. */
    static const char *const apart[][2] = {
        { "2025-Q3", "FY2025-Q4" }, { "2025", "FY2026" }, { "2025-09", "2025-Q4" },
        { "2025-09-30", "2025-10" }, { "2025-Q1", "2025-Q3" }, { "2025", "2025" },
        { "FY2024", "2025" },
    };
    for (size_t i = 0; i < sizeof apart / sizeof apart[0]; i++) {
        tt_period a = P(apart[i][0]), b = P(apart[i][1]);
        assert_false(tt_period_consecutive(&a, &b));
    }
    /* Quarter index is quarters since year 0 (meta.h). */
    tt_period q = P("2025-Q3");
    assert_int_equal(tt_period_index(&q), 2025 * 4 + 2);
    q = P("2025-09");
    assert_int_equal(tt_period_index(&q), 2025 * 12 + 8);
    tt_period bad = { TT_PERIOD_QUARTER, TT_BASIS_CALENDAR, 2025, 5, 0, 0 };
    assert_int_equal(tt_period_index(&bad), -1);
    assert_false(tt_period_valid(&bad));
    char out2[TT_PERIOD_TEXT_MAX];
    assert_string_equal(tt_period_format(&bad, out2, sizeof out2), "?");
}

/* Mixed classes: a shuffled list sorted by tt_period_compare matches the
 * order Python computes from the rule in meta.h. */
static void test_mixed_order_against_python(void **state)
{
    (void)state;
    char *out = run_python(
        "import datetime, calendar, random\n"
        "r = random.Random(7)\n"
        "items = []\n"
        "def last(y, m): return datetime.date(y, m, calendar.monthrange(y, m)[1]).toordinal()\n"
        "for y in (2023, 2024, 2025):\n"
        "  items.append(('%04d' % y, (last(y, 12), 3, 0)))\n"
        "  items.append(('FY%04d' % y, (last(y, 12), 3, 1)))\n"
        "  for q in range(1, 5):\n"
        "    items.append(('%04d-Q%d' % (y, q), (last(y, 3 * q), 2, 0)))\n"
        "    items.append(('FY%04d-Q%d' % (y, q), (last(y, 3 * q), 2, 1)))\n"
        "  for m in range(1, 13):\n"
        "    items.append(('%04d-%02d' % (y, m), (last(y, m), 1, 0)))\n"
        "  for m in (1, 3, 6, 9, 12):\n"
        "    d = calendar.monthrange(y, m)[1]\n"
        "    items.append(('%04d-%02d-%02d' % (y, m, d), (last(y, m), 0, 0)))\n"
        "    items.append(('%04d-%02d-01' % (y, m), (datetime.date(y, m, 1).toordinal(), 0, 0)))\n"
        "r.shuffle(items)\n"
        "print(' '.join(t for t, k in items))\n"
        "print(' '.join(t for t, k in sorted(items, key=lambda e: e[1])))\n");
    char *nl = strchr(out, '\n');
    assert_non_null(nl);
    *nl = '\0';
    char *shuffled = out, *expected = nl + 1;
    char *end = strchr(expected, '\n');
    if (end)
        *end = '\0';
    tt_period list[256];
    char texts[256][16];
    size_t n = 0;
    char *save = NULL;
    for (char *t = strtok_r(shuffled, " ", &save); t; t = strtok_r(NULL, " ", &save)) {
        assert_true(n < 256);
        list[n++] = P(t);
    }
    /* Insertion sort with the library's comparison. */
    for (size_t i = 1; i < n; i++)
        for (size_t j = i; j > 0 && tt_period_compare(&list[j - 1], &list[j]) > 0; j--) {
            tt_period x = list[j];
            list[j] = list[j - 1];
            list[j - 1] = x;
        }
    save = NULL;
    size_t k = 0;
    for (char *t = strtok_r(expected, " ", &save); t; t = strtok_r(NULL, " ", &save), k++) {
        tt_period_format(&list[k], texts[k], sizeof texts[k]);
        if (strcmp(texts[k], t) != 0)
            fail_msg("position %zu: library %s, Python %s", k, texts[k], t);
    }
    assert_int_equal(k, n);
    /* The total order: only a period equals itself. */
    for (size_t i = 0; i < n; i++)
        for (size_t j = 0; j < n; j++)
            assert_int_equal(tt_period_compare(&list[i], &list[j]) == 0, i == j);
    free(out);
}

static void test_class_names(void **state)
{
    (void)state;
    static const struct {
        const char *text, *name;
    } cases[] = {
        { "2025", "calendar year" },  { "2025-Q3", "calendar quarter" }, { "2025-09", "month" },
        { "2025-09-30", "day" },      { "FY2025", "fiscal year" },       { "FY2025-Q1", "fiscal quarter" },
    };
    for (size_t i = 0; i < sizeof cases / sizeof cases[0]; i++) {
        tt_period p = P(cases[i].text);
        assert_string_equal(tt_period_class_name(&p), cases[i].name);
    }
    static const struct {
        const char *name;
        tt_period_granularity g;
        tt_period_basis b;
    } names[] = {
        { "year", TT_PERIOD_YEAR, TT_BASIS_CALENDAR },
        { "calendar-quarter", TT_PERIOD_QUARTER, TT_BASIS_CALENDAR },
        { "Quarter", TT_PERIOD_QUARTER, TT_BASIS_CALENDAR },
        { "month", TT_PERIOD_MONTH, TT_BASIS_CALENDAR },
        { "day", TT_PERIOD_DAY, TT_BASIS_CALENDAR },
        { "fiscal-year", TT_PERIOD_YEAR, TT_BASIS_FISCAL },
        { "fiscal-quarter", TT_PERIOD_QUARTER, TT_BASIS_FISCAL },
    };
    for (size_t i = 0; i < sizeof names / sizeof names[0]; i++) {
        tt_period_granularity g = TT_PERIOD_NONE;
        tt_period_basis b = TT_BASIS_CALENDAR;
        assert_int_equal(tt_period_class_parse(names[i].name, &g, &b, NULL), TT_OK);
        assert_int_equal(g, names[i].g);
        assert_int_equal(b, names[i].b);
    }
    tt_error err;
    tt_period_granularity g;
    tt_period_basis b;
    assert_int_equal(tt_period_class_parse("fiscal-month", &g, &b, &err), TT_EINVAL);
    assert_non_null(strstr(err.message, "\"fiscal-month\""));
}

/* Coarsening: the month of a day from its own fields, the calendar quarter
 * as common practice defines it (Q1 = January to March), checked for every
 * day of 2024 (a leap year) against Python's datetime. */
static void test_coarsen(void **state)
{
    (void)state;
    char *out = run_python(
        "import datetime\n"
        "d = datetime.date(2024, 1, 1)\n"
        "while d.year == 2024:\n"
        "  print(d.isoformat(), '%04d-%02d' % (d.year, d.month), '%04d-Q%d' % (d.year, (d.month + 2) // 3))\n"
        "  d += datetime.timedelta(days=1)\n");
    size_t checked = 0;
    char *save = NULL;
    for (char *line = strtok_r(out, "\n", &save); line; line = strtok_r(NULL, "\n", &save)) {
        char a[16], mo[16], qu[16], t[TT_PERIOD_TEXT_MAX];
        assert_int_equal(sscanf(line, "%15s %15s %15s", a, mo, qu), 3);
        tt_period d = P(a), c;
        assert_int_equal(tt_period_coarsen(&d, TT_PERIOD_MONTH, &c, NULL), TT_OK);
        assert_string_equal(tt_period_format(&c, t, sizeof t), mo);
        assert_int_equal(tt_period_coarsen(&d, TT_PERIOD_QUARTER, &c, NULL), TT_OK);
        assert_string_equal(tt_period_format(&c, t, sizeof t), qu);
        assert_int_equal(tt_period_coarsen(&d, TT_PERIOD_YEAR, &c, NULL), TT_OK);
        assert_string_equal(tt_period_format(&c, t, sizeof t), "2024");
        checked++;
    }
    assert_int_equal(checked, 366);
    free(out);

    static const struct {
        const char *from;
        tt_period_granularity to;
        const char *result; /* NULL: refused with this message */
        const char *message;
    } cases[] = {
        { "2024-09-30", TT_PERIOD_DAY, "2024-09-30", NULL },
        { "2024-11", TT_PERIOD_QUARTER, "2024-Q4", NULL },
        { "2024-Q2", TT_PERIOD_YEAR, "2024", NULL },
        { "FY2024-Q2", TT_PERIOD_YEAR, "FY2024", NULL },
        { "FY2024-Q2", TT_PERIOD_MONTH, NULL, "cannot turn a fiscal quarter into a month" },
        { "2024", TT_PERIOD_QUARTER, NULL, "cannot turn a calendar year into a calendar quarter" },
        { "FY2024", TT_PERIOD_QUARTER, NULL, "cannot turn a fiscal year into a fiscal quarter" },
        { "2024-Q2", TT_PERIOD_NONE, NULL, "cannot turn a calendar quarter into a period" },
    };
    for (size_t i = 0; i < sizeof cases / sizeof cases[0]; i++) {
        tt_period p = P(cases[i].from), c = { TT_PERIOD_NONE, TT_BASIS_CALENDAR, 1, 0, 0, 0 };
        tt_error err;
        tt_error_init(&err);
        tt_status st = tt_period_coarsen(&p, cases[i].to, &c, &err);
        if (cases[i].result) {
            char t[TT_PERIOD_TEXT_MAX];
            assert_int_equal(st, TT_OK);
            assert_string_equal(tt_period_format(&c, t, sizeof t), cases[i].result);
        } else {
            assert_int_equal(st, TT_EINVAL);
            assert_int_equal(c.year, 1);
            if (!strstr(err.message, cases[i].message))
                fail_msg("%s: %s", cases[i].from, err.message);
        }
    }
}

/* ---- series -------------------------------------------------------------- */

static tt_doc_meta D(const char *path, const char *entity, const char *period, const char *kind)
{
    tt_doc_meta d;
    memset(&d, 0, sizeof d);
    d.path = path;
    d.entity = entity;
    d.period = P(period);
    d.kind = kind;
    return d;
}

/* The clash message, word for word as the brief gives it. */
static void test_clash_message(void **state)
{
    (void)state;
    tt_doc_meta docs[] = {
        D("demo/a.htm", "acme", "FY2025", "report"),
        D("demo/b.htm", "acme", "2025-Q3", "report"),
    };
    tt_series s;
    tt_series_init(&s);
    tt_error err;
    tt_error_init(&err);
    assert_int_equal(tt_series_build(&s, docs, 2, NULL, &err), TT_EINVAL);
    assert_string_equal(err.message, "demo/a.htm has FY2025 but demo/b.htm has 2025-Q3: a fiscal "
                                     "year and a calendar quarter cannot be in one series");
    assert_int_equal(s.n_groups, 0);
    assert_null(s.groups);

    /* Different kinds are named, so the caller can suggest a kind filter;
     * the first document in docs order sets the series, the first that
     * differs is named, whatever their periods' order. */
    tt_doc_meta docs2[] = {
        D("x/q2.htm", "acme", "2025-Q2", "quarterly-report"),
        D("x/q1.htm", "acme", "2025-Q1", "quarterly-report"),
        D("x/m.htm", "acme", "2025-09", "monthly-note"),
        D("x/fy.htm", "acme", "FY2024", "annual-report"),
    };
    assert_int_equal(tt_series_build(&s, docs2, 4, NULL, &err), TT_EINVAL);
    assert_string_equal(err.message,
                        "x/q2.htm has 2025-Q2 but x/m.htm has 2025-09: a calendar quarter and a "
                        "month cannot be in one series (kinds quarterly-report and monthly-note)");

    /* Per entity: another entity may keep another class. */
    tt_doc_meta docs3[] = {
        D("b/1", "beta", "FY2024", "annual-report"),
        D("a/1", "alpha", "2024-Q4", "call"),
        D("b/2", "beta", "FY2025", "annual-report"),
        D("a/2", "alpha", "2025-Q1", "call"),
    };
    assert_int_equal(tt_series_build(&s, docs3, 4, NULL, &err), TT_OK);
    assert_int_equal(s.n_entities, 2);
    assert_int_equal(s.n_groups, 4);
    tt_series_release(&s);
}

static void test_series_groups_and_pairs(void **state)
{
    (void)state;
    /* Out of order on purpose; two documents share alpha's 2025-Q1. */
    tt_doc_meta docs[] = {
        D("a/q3", "alpha", "2025-Q3", "call"),            /* 0 */
        D("b/fy25", "beta", "FY2025", "annual"),          /* 1 */
        D("a/q1-call", "alpha", "2025-Q1", "call"),       /* 2 */
        D("a/q4-24", "alpha", "2024-Q4", "call"),         /* 3 */
        D("a/q1-rep", "alpha", "2025-Q1", "report"),      /* 4 */
        D("b/fy23", "beta", "FY2023", "annual"),          /* 5 */
        D("a/fy24", "alpha", "FY2024", "annual"),         /* 6 */
    };
    tt_series s;
    tt_series_init(&s);
    tt_series_options o;
    tt_series_options_init(&o);
    tt_error err;
    tt_error_init(&err);

    /* Only alpha's quarters: by granularity and basis. */
    o.granularity = TT_PERIOD_QUARTER;
    o.basis = TT_BASIS_CALENDAR;
    assert_int_equal(tt_series_build(&s, docs, 7, &o, &err), TT_OK);
    assert_int_equal(s.n_entities, 1);
    assert_int_equal(s.excluded, 3);
    assert_int_equal(s.n_members, 4);
    assert_int_equal(s.n_groups, 3);
    const char *want[] = { "2024-Q4", "2025-Q1", "2025-Q3" };
    for (size_t g = 0; g < 3; g++) {
        char t[TT_PERIOD_TEXT_MAX];
        assert_string_equal(s.groups[g].entity, "alpha");
        assert_string_equal(tt_period_format(&s.groups[g].period, t, sizeof t), want[g]);
    }
    assert_int_equal(s.groups[1].n_docs, 2);
    assert_int_equal(s.members[s.groups[1].first], 2); /* ascending document index */
    assert_int_equal(s.members[s.groups[1].first + 1], 4);
    assert_int_equal(s.members[s.groups[0].first], 3);
    assert_int_equal(s.n_pairs, 2);
    assert_int_equal(s.pairs[0].base, 0);
    assert_int_equal(s.pairs[0].target, 1);
    assert_int_equal(s.pairs[0].gap, 0);
    assert_int_equal(s.pairs[1].base, 1);
    assert_int_equal(s.pairs[1].target, 2);
    assert_int_equal(s.pairs[1].gap, 1); /* 2025-Q2 missing */

    tt_period q1 = P("2025-Q1"), q2 = P("2025-Q2");
    assert_int_equal(tt_series_find(&s, "alpha", &q1), 1);
    assert_int_equal(tt_series_find(&s, "alpha", &q2), -1);
    assert_int_equal(tt_series_find(&s, "beta", &q1), -1);

    /* By kind: annual reports of both entities, years apart. */
    tt_series_options_init(&o);
    o.kinds = " Annual ,other";
    assert_int_equal(tt_series_build(&s, docs, 7, &o, &err), TT_OK);
    assert_int_equal(s.n_entities, 2);
    assert_int_equal(s.n_groups, 3);
    assert_string_equal(s.groups[0].entity, "alpha");
    assert_string_equal(s.groups[1].entity, "beta");
    assert_int_equal(s.n_pairs, 1); /* alpha has one group: no pair */
    assert_int_equal(s.pairs[0].base, 1);
    assert_int_equal(s.pairs[0].gap, 1); /* FY2024 missing */
    tt_period fy25 = P("FY2025");
    assert_int_equal(tt_series_find(&s, "beta", &fy25), 2);

    /* One entity; nothing kept is not an error. */
    tt_series_options_init(&o);
    o.entity = "gamma";
    assert_int_equal(tt_series_build(&s, docs, 7, &o, &err), TT_OK);
    assert_int_equal(s.n_groups, 0);
    assert_int_equal(s.excluded, 7);
    assert_int_equal(tt_series_find(&s, "alpha", &q1), -1);

    /* Unfiltered, alpha mixes quarters and a fiscal year. */
    assert_int_equal(tt_series_build(&s, docs, 7, NULL, &err), TT_EINVAL);
    assert_string_equal(err.message,
                        "a/q3 has 2025-Q3 but a/fy24 has FY2024: a calendar quarter and a fiscal "
                        "year cannot be in one series (kinds call and annual)");
    tt_series_release(&s);
}

/* Out of memory at each allocation in turn: TT_ENOMEM, nothing leaked
 * (AddressSanitizer's leak check in `make SAN=1 test`). */
static void test_series_out_of_memory(void **state)
{
    (void)state;
    tt_doc_meta docs[] = {
        D("a/1", "alpha", "2025-Q1", "call"),
        D("a/2", "alpha", "2025-Q2", "call"),
    };
    int saw_enomem = 0;
    for (int k = 0; k < 10; k++) {
        tt_series s;
        tt_series_init(&s);
        tt_error err;
        tt_error_init(&err);
        tt_test_fail_after = k;
        tt_set_allocator(&(tt_allocator){ tt_test_failing_malloc, tt_test_failing_realloc, free });
        tt_status st = tt_series_build(&s, docs, 2, NULL, &err);
        tt_set_allocator(NULL);
        tt_test_fail_after = -1;
        if (st == TT_ENOMEM) {
            saw_enomem = 1;
            assert_int_equal(s.n_groups, 0);
            assert_int_equal(err.status, TT_ENOMEM);
        } else {
            assert_int_equal(st, TT_OK);
            assert_int_equal(s.n_groups, 2);
        }
        tt_series_release(&s);
    }
    assert_true(saw_enomem);
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_parse_valid_forms),
        cmocka_unit_test(test_parse_invalid_forms),
        cmocka_unit_test(test_basic_date),
        cmocka_unit_test(test_day_validity_against_python),
        cmocka_unit_test(test_days_against_python),
        cmocka_unit_test(test_months_quarters_against_python),
        cmocka_unit_test(test_mixed_order_against_python),
        cmocka_unit_test(test_class_names),
        cmocka_unit_test(test_coarsen),
        cmocka_unit_test(test_clash_message),
        cmocka_unit_test(test_series_groups_and_pairs),
        cmocka_unit_test(test_series_out_of_memory),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
