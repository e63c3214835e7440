/* Tests of table output (src/output.c): TSV escaping, CSV per RFC 4180 with
 * formula neutralisation, JSON Lines per RFC 8259, locale-free numbers, and
 * atomic files. The CSV output is read back with Python's csv module and the
 * JSON Lines with Python's json module (reference parsers, standard library). */
#include <locale.h>
#include <math.h>
#include <sys/stat.h>
#include <unistd.h>

#include "tt_test.h"

#include "termtide/alloc.h"
#include "termtide/output.h"

static void test_fixed(void **state)
{
    (void)state;
    char b[40];
    tt_format_fixed(0.5, 6, b);
    assert_string_equal(b, "0.500000");
    tt_format_fixed(1.0, 6, b);
    assert_string_equal(b, "1.000000");
    tt_format_fixed(2.0 / 3.0, 4, b);
    assert_string_equal(b, "0.6667");
    tt_format_fixed(-0.00004, 4, b);
    assert_string_equal(b, "0.0000"); /* rounds to zero: no "-0.0000" */
    tt_format_fixed(-12.345, 2, b);
    assert_string_equal(b, "-12.35");
    tt_format_fixed(1234567.0, 0, b);
    assert_string_equal(b, "1234567");
    tt_format_fixed(0.000123, 6, b);
    assert_string_equal(b, "0.000123");
    /* a locale with a decimal comma must not leak in */
    if (setlocale(LC_NUMERIC, "de_DE.UTF-8")) {
        tt_format_fixed(0.25, 2, b);
        assert_string_equal(b, "0.25");
        setlocale(LC_NUMERIC, "C");
    }
}

/* Scientific notation: the expected strings are what printf's %.3e and
 * %.Nf print for these values in the C locale (worked out by hand from the
 * definition, not taken from the code under test). */
/* Whole numbers and fixed-point numbers in every format against the C
 * library's printf ("%llu", "%.*f"; the C locale is in force in the tests):
 * every digit count of a 64-bit number, and shares at 4 and 6 decimals
 * between 0 and 1 as count writes them; each cell after a first one, so
 * the separator is written with it. */
static void test_numbers_against_printf(void **state)
{
    (void)state;
    static const tt_format formats[] = { TT_FORMAT_TSV, TT_FORMAT_CSV, TT_FORMAT_JSONL };
    static const char *const cols[] = { "a", "b" };
    uint64_t x = 0x9e3779b97f4a7c15ull;
    for (size_t f = 0; f < 3; f++) {
        tt_buf out;
        tt_buf_init(&out, 0);
        for (int i = 0; i < 3000; i++) {
            x ^= x << 13;
            x ^= x >> 7;
            x ^= x << 17;
            uint64_t v = i < 64 ? (i < 20 ? (uint64_t)1 << (i * 3) : ~(uint64_t)0 >> (i - 20))
                                : x >> (x % 64);
            if (i % 10 == 0)
                v = (uint64_t)i / 10 - 1 + (uint64_t)(i % 20 == 0); /* 0, 1, 9, 10, 99, ... */
            double share = (double)(x % 1000003) / 1000003.0;
            int dec = i % 2 ? 4 : 6;
            tt_table_writer w;
            tt_buf_reset(&out);
            assert_int_equal(tt_table_begin(&w, formats[f], &out, cols, 2, 0), TT_OK);
            assert_int_equal(tt_table_u64(&w, v), TT_OK);
            assert_int_equal(tt_table_fixed(&w, share, dec), TT_OK);
            assert_int_equal(tt_table_end_row(&w), TT_OK);
            char want[128];
            const char *fmt = formats[f] == TT_FORMAT_TSV   ? "%llu\t%.*f\n"
                              : formats[f] == TT_FORMAT_CSV ? "%llu,%.*f\r\n"
                                                            : "{\"a\":%llu,\"b\":%.*f}\n";
            snprintf(want, sizeof want, fmt, (unsigned long long)v, dec, share);
            assert_string_equal(out.data, want);
        }
        tt_buf_release(&out);
    }
}

/* tt_format_fixed at every number of decimals (0 to 12) and magnitudes
 * from 1e-9 to 1e9, both signs, against printf's "%.*f" (the C locale):
 * values within a hair of a rounding tie are left out, where the two may
 * round differently (printf rounds the exact binary value, half to even). */
static void test_fixed_against_printf(void **state)
{
    (void)state;
    uint64_t x = 0x2545f4914f6cdd1dull;
    int checked = 0;
    for (int i = 0; i < 20000; i++) {
        x ^= x << 13;
        x ^= x >> 7;
        x ^= x << 17;
        int dec = (int)(x % 13);
        double mant = (double)(x >> 11) / 9007199254740992.0;
        double v = mant * pow(10.0, (double)((int)((x >> 4) % 19) - 9));
        if (x & 8)
            v = -v;
        double scaled = fabs(v) * pow(10.0, dec);
        if (scaled > 1e15 || fabs(scaled - floor(scaled) - 0.5) < 1e-6)
            continue;
        char got[64], want[64];
        tt_format_fixed(v, dec, got);
        snprintf(want, sizeof want, "%.*f", dec, v);
        if (!strcmp(want, "-0") || !strncmp(want, "-0.", 3)) {
            /* printf keeps the sign of a negative that rounds to zero; the
             * tables write 0 */
            int zero = 1;
            for (const char *c = want + 1; *c; c++)
                zero &= *c == '0' || *c == '.';
            if (zero)
                memmove(want, want + 1, strlen(want));
        }
        assert_string_equal(got, want);
        checked++;
    }
    assert_true(checked > 15000);
}

/* A string escaped once (tt_table_escape) and written as a cell
 * (tt_table_escaped) gives the same row as tt_table_str, in every format,
 * first cell or not: strings with tabs, newlines, CR, backslashes, quotes,
 * commas, formula starts, control bytes and non-ASCII. */
static void test_escaped_cells_same_as_str(void **state)
{
    (void)state;
    static const char *const strings[] = {
        "plain", "", "tab\there", "line\nbreak", "cr\rx", "back\\slash", "quo\"te",
        "com,ma", "=SUM(A1)", "+1", "-2", "@x", "\x01ctl", "caf\xc3\xa9 \xe2\x82\xac",
        "/corpus/doc 1.txt#2:10-Q",
    };
    static const tt_format formats[] = { TT_FORMAT_TSV, TT_FORMAT_CSV, TT_FORMAT_JSONL };
    static const char *const cols[] = { "a", "b", "c" };
    for (size_t f = 0; f < 3; f++) {
        for (size_t i = 0; i < sizeof strings / sizeof *strings; i++) {
            const char *str = strings[i];
            tt_buf one, two, esc;
            tt_buf_init(&one, 0);
            tt_buf_init(&two, 0);
            tt_buf_init(&esc, 0);
            tt_table_writer w1, w2;
            assert_int_equal(tt_table_begin(&w1, formats[f], &one, cols, 3, 0), TT_OK);
            assert_int_equal(tt_table_begin(&w2, formats[f], &two, cols, 3, 0), TT_OK);
            assert_int_equal(tt_table_escape(formats[f], str, strlen(str), &esc), TT_OK);
            /* as the first cell and as a later one */
            assert_int_equal(tt_table_str(&w1, str, strlen(str)), TT_OK);
            assert_int_equal(tt_table_escaped(&w2, esc.data, esc.len), TT_OK);
            assert_int_equal(tt_table_u64(&w1, 7), TT_OK);
            assert_int_equal(tt_table_u64(&w2, 7), TT_OK);
            assert_int_equal(tt_table_str(&w1, str, strlen(str)), TT_OK);
            assert_int_equal(tt_table_escaped(&w2, esc.data, esc.len), TT_OK);
            assert_int_equal(tt_table_end_row(&w1), TT_OK);
            assert_int_equal(tt_table_end_row(&w2), TT_OK);
            assert_int_equal(one.len, two.len);
            assert_memory_equal(one.data, two.data, one.len);
            tt_buf_release(&one);
            tt_buf_release(&two);
            tt_buf_release(&esc);
        }
    }
}

static void test_sci(void **state)
{
    (void)state;
    char b[48];
    tt_format_sci(0.0, 4, b);
    assert_string_equal(b, "0");
    tt_format_sci(1.234567e-12, 4, b);
    assert_string_equal(b, "1.235e-12");
    tt_format_sci(9.99996e-7, 4, b);
    assert_string_equal(b, "1.000e-06");
    tt_format_sci(0.012345, 3, b);
    assert_string_equal(b, "0.0123");
    tt_format_sci(123.456, 4, b);
    assert_string_equal(b, "123.5");
    tt_format_sci(-2.5e8, 2, b);
    assert_string_equal(b, "-2.5e+08");
    tt_format_sci(3e-300, 3, b);
    assert_string_equal(b, "3.00e-300");
}

static const char *const cols[] = { "document", "term", "count" };

static void write_rows(tt_format f, tt_buf *out)
{
    tt_table_writer w;
    assert_int_equal(tt_table_begin(&w, f, out, cols, 3, 1), TT_OK);
    const char *cells[] = { "plain", "=SUM(A1:A2)", "a,b", "say \"hi\"", "+1", "-x", "@cmd",
                            "\ttab", "line\nbreak", "back\\slash", "caf\xc3\xa9" };
    for (size_t i = 0; i < sizeof cells / sizeof cells[0]; i++) {
        assert_int_equal(tt_table_cstr(&w, "doc.htm"), TT_OK);
        assert_int_equal(tt_table_cstr(&w, cells[i]), TT_OK);
        assert_int_equal(tt_table_u64(&w, i), TT_OK);
        assert_int_equal(tt_table_end_row(&w), TT_OK);
    }
}

static void run_python(const char *script, const char *data, char *result, size_t size)
{
    char in[] = TT_TEST_TMP "tt_output_XXXXXX";
    int fd = mkstemp(in);
    assert_true(fd >= 0);
    assert_int_equal(write(fd, data, strlen(data)), (ssize_t)strlen(data));
    close(fd);
    char cmd[4096];
    snprintf(cmd, sizeof cmd, "%s -c '%s' %s", tt_test_python(), script, in);
    FILE *p = popen(cmd, "r");
    assert_non_null(p);
    size_t n = fread(result, 1, size - 1, p);
    result[n] = '\0';
    assert_int_equal(pclose(p), 0);
    unlink(in);
}

static void test_csv_roundtrip(void **state)
{
    (void)state;
    tt_buf out;
    tt_buf_init(&out, 0);
    write_rows(TT_FORMAT_CSV, &out);
    char res[8192];
    /* Python's csv module (RFC 4180 dialect "excel") reads back every cell. */
    run_python("import csv,sys\n"
               "rows=list(csv.reader(open(sys.argv[1],newline=\"\",encoding=\"utf-8\")))\n"
               "print(len(rows)); [print(repr(r[1])) for r in rows[1:]]",
               out.data, res, sizeof res);
    const char *want = "12\n'plain'\n\"'=SUM(A1:A2)\"\n'a,b'\n'say \"hi\"'\n\"'+1\"\n\"'-x\"\n"
                       "\"'@cmd\"\n\"'\\ttab\"\n'line\\nbreak'\n'back\\\\slash'\n'café'\n";
    assert_string_equal(res, want);
    tt_buf_release(&out);
}

static void test_jsonl_roundtrip(void **state)
{
    (void)state;
    tt_buf out;
    tt_buf_init(&out, 0);
    write_rows(TT_FORMAT_JSONL, &out);
    char res[8192];
    /* Python's json module (RFC 8259) parses every line. */
    run_python("import json,sys\n"
               "for l in open(sys.argv[1],encoding=\"utf-8\"):\n"
               "  o=json.loads(l); print(o[\"term\"]+\"|\"+str(o[\"count\"]))",
               out.data, res, sizeof res);
    assert_non_null(strstr(res, "=SUM(A1:A2)|1\n"));
    assert_non_null(strstr(res, "say \"hi\"|3\n"));
    assert_non_null(strstr(res, "line\nbreak|8\n"));
    assert_non_null(strstr(res, "café|10\n"));
    tt_buf_release(&out);
}

static void test_tsv_escapes(void **state)
{
    (void)state;
    tt_buf out;
    tt_buf_init(&out, 0);
    write_rows(TT_FORMAT_TSV, &out);
    assert_non_null(strstr(out.data, "document\tterm\tcount\n"));
    assert_non_null(strstr(out.data, "doc.htm\t\\ttab\t7\n"));
    assert_non_null(strstr(out.data, "doc.htm\tline\\nbreak\t8\n"));
    assert_non_null(strstr(out.data, "doc.htm\tback\\\\slash\t9\n"));
    tt_buf_release(&out);
}

/* A buffer's limit holds for every cell kind, byte for byte: each write
 * either fits under the limit and is appended whole, or fails with
 * TT_ELIMIT and leaves the buffer as it was (the writer's quick room check
 * must not let a cell past the limit). Expected bytes built by hand. */
static void test_limit_holds(void **state)
{
    (void)state;
    for (size_t limit = 1; limit <= 64; limit++) {
        for (int kind = 0; kind < 3; kind++) {
            tt_buf out;
            tt_buf_init(&out, limit);
            tt_table_writer w;
            assert_int_equal(tt_table_begin(&w, TT_FORMAT_TSV, &out, cols, 3, 0), TT_OK);
            char expect[256] = "";
            size_t elen = 0;
            for (int i = 0; i < 40; i++) {
                char cell[32];
                tt_status st;
                if (i % 4 == 3) {
                    strcpy(cell, "\n");
                    st = tt_table_end_row(&w);
                } else if (kind == 0) {
                    snprintf(cell, sizeof cell, "%s%d", (i % 4) ? "\t" : "", 1000 + i);
                    st = tt_table_u64(&w, (uint64_t)(1000 + i));
                } else if (kind == 1) {
                    snprintf(cell, sizeof cell, "%sterm%d", (i % 4) ? "\t" : "", i);
                    char t[16];
                    snprintf(t, sizeof t, "term%d", i);
                    st = tt_table_cstr(&w, t);
                } else {
                    snprintf(cell, sizeof cell, "%s0.%06d", (i % 4) ? "\t" : "", i);
                    st = tt_table_fixed(&w, i / 1e6, 6);
                }
                size_t n = strlen(cell);
                if (elen + n <= limit) {
                    assert_int_equal(st, TT_OK);
                    memcpy(expect + elen, cell, n + 1);
                    elen += n;
                } else {
                    assert_int_equal(st, TT_ELIMIT);
                    assert_int_equal(out.len, elen);
                    assert_memory_equal(out.data, expect, elen + 1);
                    break;
                }
                assert_int_equal(out.len, elen);
                assert_memory_equal(out.data, expect, elen + 1);
            }
            assert_true(out.len <= limit);
            tt_buf_release(&out);
        }
    }
}

static void test_atomic_file(void **state)
{
    (void)state;
    char dir[] = TT_TEST_TMP "tt_atomic_XXXXXX";
    assert_non_null(mkdtemp(dir));
    char path[256];
    snprintf(path, sizeof path, "%s/out.tsv", dir);
    tt_error err;
    tt_error_init(&err);
    tt_outfile f;
    /* aborted: nothing appears */
    assert_int_equal(tt_outfile_open(&f, path, &err), TT_OK);
    assert_int_equal(tt_outfile_write(&f, "half", 4, &err), TT_OK);
    tt_outfile_abort(&f);
    struct stat sb;
    assert_int_not_equal(stat(path, &sb), 0);
    /* committed: the whole content appears at once */
    assert_int_equal(tt_outfile_open(&f, path, &err), TT_OK);
    assert_int_equal(tt_outfile_write(&f, "whole\n", 6, &err), TT_OK);
    assert_int_not_equal(stat(path, &sb), 0);
    assert_int_equal(tt_outfile_commit(&f, &err), TT_OK);
    assert_int_equal(stat(path, &sb), 0);
    assert_int_equal(sb.st_size, 6);
    unlink(path);
    /* a directory that does not exist: a clear error naming the file */
    assert_int_equal(tt_outfile_open(&f, "/nonexistent-dir/x.tsv", &err), TT_EIO);
    assert_string_equal(err.file, "/nonexistent-dir/x.tsv");
    rmdir(dir);
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_fixed),
        cmocka_unit_test(test_numbers_against_printf),
        cmocka_unit_test(test_fixed_against_printf),
        cmocka_unit_test(test_escaped_cells_same_as_str),
        cmocka_unit_test(test_sci),
        cmocka_unit_test(test_csv_roundtrip),
        cmocka_unit_test(test_jsonl_roundtrip),
        cmocka_unit_test(test_tsv_escapes),
        cmocka_unit_test(test_limit_holds),
        cmocka_unit_test(test_atomic_file),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
