/* termtide tests — tt_wordbreak_next() against Unicode's own conformance
 * test for default word boundaries.
 *
 * Source: WordBreakTest.txt of the Unicode Character Database, version
 * 15.0.0 (UAX #29), as shipped by Debian's unicode-data package at
 * /usr/share/unicode/auxiliary/WordBreakTest.txt. It holds 1,823 cases;
 * each is a line of hex code points with "÷" where a boundary lies and "×"
 * where none does. The file is read at test time, each case is encoded to
 * UTF-8 here, and every boundary position tt_wordbreak_next() reports must
 * equal the file's. */
#include "tt_test.h"

#include "termtide/segment.h"

#define WBTEST_PATH "/usr/share/unicode/auxiliary/WordBreakTest.txt"
/* The number of cases in the Unicode 15.0.0 file (counted from the file's
 * non-comment lines; a different count means a different file). */
#define WBTEST_CASES 1823

#define MAX_CPS 64

static size_t utf8_encode(uint32_t cp, char *out)
{
    if (cp < 0x80) {
        out[0] = (char)cp;
        return 1;
    }
    if (cp < 0x800) {
        out[0] = (char)(0xC0 | (cp >> 6));
        out[1] = (char)(0x80 | (cp & 0x3F));
        return 2;
    }
    if (cp < 0x10000) {
        out[0] = (char)(0xE0 | (cp >> 12));
        out[1] = (char)(0x80 | ((cp >> 6) & 0x3F));
        out[2] = (char)(0x80 | (cp & 0x3F));
        return 3;
    }
    out[0] = (char)(0xF0 | (cp >> 18));
    out[1] = (char)(0x80 | ((cp >> 12) & 0x3F));
    out[2] = (char)(0x80 | ((cp >> 6) & 0x3F));
    out[3] = (char)(0x80 | (cp & 0x3F));
    return 4;
}

/* One parsed case: its UTF-8 text and the expected boundaries (byte
 * offsets after the start, the last being the length). */
typedef struct wb_case {
    char text[MAX_CPS * 4];
    size_t len;
    size_t want[MAX_CPS];
    size_t nwant;
} wb_case;

/* Parses one line; returns 1 for a case, 0 for a comment or blank line,
 * -1 for a line this parser does not understand. */
static int parse_case(const char *line, wb_case *c)
{
    const char *p = line;
    int markers = 0, cps = 0;
    c->len = 0;
    c->nwant = 0;
    while (*p && *p != '#' && *p != '\n') {
        if (*p == ' ' || *p == '\t') {
            p++;
        } else if ((unsigned char)p[0] == 0xC3 && (unsigned char)p[1] == 0xB7) { /* ÷ */
            if (markers > 0 && cps > 0)
                c->want[c->nwant++] = c->len;
            markers++;
            p += 2;
        } else if ((unsigned char)p[0] == 0xC3 && (unsigned char)p[1] == 0x97) { /* × */
            markers++;
            p += 2;
        } else {
            char *endp;
            unsigned long cp = strtoul(p, &endp, 16);
            if (endp == p || cp > 0x10FFFF || cps >= MAX_CPS)
                return -1;
            c->len += utf8_encode((uint32_t)cp, c->text + c->len);
            cps++;
            p = endp;
        }
    }
    if (cps == 0)
        return markers == 0 ? 0 : -1;
    /* A well-formed case starts and ends with "÷" (WB1, WB2). */
    if (c->nwant == 0 || c->want[c->nwant - 1] != c->len || markers != cps + 1)
        return -1;
    return 1;
}

static void test_all_cases(void **state)
{
    (void)state;
    FILE *f = fopen(WBTEST_PATH, "r");
    if (!f) {
        print_error("cannot open %s: install Debian's unicode-data package; "
                    "the UAX #29 conformance check needs it\n", WBTEST_PATH);
        fail();
    }
    char line[4096];
    int lineno = 0, cases = 0, passed = 0, shown = 0;
    wb_case c;
    while (fgets(line, sizeof line, f)) {
        lineno++;
        int r = parse_case(line, &c);
        if (r < 0) {
            print_error("%s:%d: cannot parse: %s", WBTEST_PATH, lineno, line);
            fclose(f);
            fail();
        }
        if (r == 0)
            continue;
        cases++;

        size_t got[MAX_CPS * 4], ngot = 0, pos = 0;
        int ok = 1;
        while (pos < c.len && ngot < MAX_CPS * 4) {
            size_t next = tt_wordbreak_next(c.text, c.len, pos);
            if (next <= pos || next > c.len) {
                ok = 0;
                break;
            }
            got[ngot++] = next;
            pos = next;
        }
        if (ok && ngot == c.nwant) {
            for (size_t i = 0; i < ngot; i++)
                if (got[i] != c.want[i])
                    ok = 0;
        } else {
            ok = 0;
        }
        if (ok) {
            passed++;
        } else if (shown++ < 20) {
            print_error("WordBreakTest.txt line %d differs:\n  case: %s  got boundaries:",
                        lineno, line);
            for (size_t i = 0; i < ngot; i++)
                print_error(" %zu", got[i]);
            print_error("\n");
        }
    }
    fclose(f);
    printf("UAX #29 WordBreakTest.txt (Unicode %s tables): %d of %d cases pass\n",
           tt_unicode_version(), passed, cases);
    /* Unicode 15.0.0's WordBreakTest.txt has 1,823 cases. */
    assert_int_equal(cases, WBTEST_CASES);
    assert_int_equal(passed, cases);
}

static void test_version(void **state)
{
    (void)state;
    /* The tables must come from the same Unicode version as the test file:
     * its first line reads "# WordBreakTest-15.0.0.txt". */
    FILE *f = fopen(WBTEST_PATH, "r");
    char line[256], want[64];
    if (!f) {
        print_error("cannot open %s (Debian unicode-data)\n", WBTEST_PATH);
        fail();
    }
    assert_non_null(fgets(line, sizeof line, f));
    fclose(f);
    const char *v = strstr(line, "WordBreakTest-");
    assert_non_null(v);
    v += strlen("WordBreakTest-");
    size_t n = strcspn(v, "t") - 1; /* up to ".txt" */
    assert_true(n > 0 && n < sizeof want);
    memcpy(want, v, n);
    want[n] = '\0';
    assert_string_equal(tt_unicode_version(), want);
}

static void test_edges(void **state)
{
    (void)state;
    /* WB2: at or past the end the answer is the length. */
    assert_int_equal(tt_wordbreak_next("ab", 2, 2), 2);
    assert_int_equal(tt_wordbreak_next("", 0, 0), 0);
    /* Invalid UTF-8 (a lone continuation byte, a truncated sequence) is
     * read as U+FFFD one byte at a time, never past the end. */
    assert_int_equal(tt_wordbreak_next("a\x80" "b", 3, 0), 1);
    assert_int_equal(tt_wordbreak_next("a\x80" "b", 3, 1), 2);
    assert_int_equal(tt_wordbreak_next("ab\xE2\x80", 4, 0), 2);
    assert_int_equal(tt_wordbreak_next("ab\xE2\x80", 4, 2), 3);
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_all_cases),
        cmocka_unit_test(test_version),
        cmocka_unit_test(test_edges),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
