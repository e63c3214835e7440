/* Tests for the submission-wrapper splitter, the type filter and kind
 * detection (src/wrapper.c).
 *
 * The fixture tests/fixtures/wrapper/harborline-q3.txt is an invented
 * four-document filing (10-Q in HTML inside <XBRL>, EX-31 text, a uuencoded
 * GRAPHIC, EX-99.1 text). The parts' metadata and body offsets are checked
 * against an independent reading of the same file by Python's `re` module
 * (the standard library), run at test time; the header values and the
 * filter's choices are checked against what the fixture says in plain
 * sight. */
#include "tt_test.h"

#include <stdlib.h>
#include <unistd.h>

#include "termtide/alloc.h"
#include "termtide/document.h"
#include "termtide/limits.h"

#define FIXTURE "tests/fixtures/wrapper/harborline-q3.txt"

static char *to_crlf(const char *s, size_t n, size_t *out_len)
{
    char *p = malloc(2 * n + 1);
    size_t o = 0;
    assert_non_null(p);
    for (size_t i = 0; i < n; i++) {
        if (s[i] == '\n')
            p[o++] = '\r';
        p[o++] = s[i];
    }
    p[o] = '\0';
    *out_len = o;
    return p;
}

static void write_file(const char *path, const char *s, size_t n)
{
    FILE *f = fopen(path, "wb");
    assert_non_null(f);
    assert_int_equal(fwrite(s, 1, n, f), n);
    fclose(f);
}

/* Reference: Python's re module reads every <DOCUMENT> block and prints
 * type, sequence, filename, description, body offset and body length, one
 * tab-separated line per part. The body starts after the <TEXT> line's line
 * break and ends where the </TEXT> line starts. */
static const char *py_parts =
    "import re,sys\n"
    "s=open(sys.argv[1],'rb').read().decode('ascii')\n"
    "for m in re.finditer(r'^<DOCUMENT>\\r?$(.*?)^</DOCUMENT>', s, re.S|re.M|re.I):\n"
    "  blk=m.group(1); base=m.start(1)\n"
    "  def tag(t):\n"
    "    x=re.search(r'^<'+t+r'>([^\\r\\n]*)', blk, re.M|re.I)\n"
    "    return x.group(1).strip() if x else ''\n"
    "  b=re.search(r'^<TEXT>\\r?\\n(.*?)^</TEXT>', blk, re.S|re.M|re.I)\n"
    "  print('\\t'.join([tag('TYPE'),tag('SEQUENCE'),tag('FILENAME'),tag('DESCRIPTION'),"
    "str(base+b.start(1)),str(len(b.group(1)))]))\n";

static char *run_python(const char *script, const char *arg)
{
    char cmd[4096];
    char sp[] = TT_TEST_TMP "tt_wrapper_pyXXXXXX";
    int fd = mkstemp(sp);
    assert_true(fd >= 0);
    assert_int_equal(write(fd, script, strlen(script)), (ssize_t)strlen(script));
    close(fd);
    snprintf(cmd, sizeof cmd, "%s %s %s", tt_test_python(), sp, arg);
    FILE *p = popen(cmd, "r");
    assert_non_null(p);
    size_t cap = 1 << 16, n = 0;
    char *out = malloc(cap);
    assert_non_null(out);
    size_t r;
    while ((r = fread(out + n, 1, cap - 1 - n, p)) > 0)
        n += r;
    out[n] = '\0';
    assert_int_equal(pclose(p), 0);
    unlink(sp);
    return out;
}

/* Compares the splitter's parts with the Python reading of path. */
static void check_against_python(const char *path, const char *text, size_t len)
{
    tt_wrapper w;
    tt_error err;
    tt_wrapper_init(&w);
    assert_int_equal(tt_wrapper_split(text, len, &w, path, &err), TT_OK);
    char *ref = run_python(py_parts, path);
    size_t i = 0;
    for (char *line = ref; *line; i++) {
        char *nl = strchr(line, '\n');
        assert_non_null(nl);
        *nl = '\0';
        char *f[6];
        char *p = line;
        for (int k = 0; k < 6; k++) {
            f[k] = p;
            char *tab = strchr(p, '\t');
            if (tab) {
                *tab = '\0';
                p = tab + 1;
            }
        }
        assert_true(i < w.n);
        assert_string_equal(w.parts[i].type, f[0]);
        assert_int_equal(w.parts[i].seq, strtoul(f[1], NULL, 10));
        assert_string_equal(w.parts[i].filename, f[2]);
        assert_string_equal(w.parts[i].description, f[3]);
        assert_int_equal(w.parts[i].text_off, strtoul(f[4], NULL, 10));
        assert_int_equal(w.parts[i].text_len, strtoul(f[5], NULL, 10));
        line = nl + 1;
    }
    assert_int_equal(i, 4);
    assert_int_equal(w.n, 4);
    free(ref);
    tt_wrapper_release(&w);
}

static void check_fixture_fields(const char *text, size_t len)
{
    tt_wrapper w;
    tt_error err;
    tt_wrapper_init(&w);
    assert_int_equal(tt_wrapper_split(text, len, &w, "q3.txt", &err), TT_OK);
    assert_int_equal(w.n, 4);
    /* The first COMPANY CONFORMED NAME / PERIOD wins (the subject company's
     * come later in the fixture). */
    assert_string_equal(w.entity, "Harborline Fabrication Corp");
    assert_string_equal(w.period, "20250930");
    assert_string_equal(w.form, "10-Q");
    assert_int_equal(w.parts[0].uuencoded, 0);
    assert_int_equal(w.parts[1].uuencoded, 0);
    assert_int_equal(w.parts[2].uuencoded, 1);
    assert_int_equal(w.parts[3].uuencoded, 0);
    assert_string_equal(w.parts[2].type, "GRAPHIC");
    assert_string_equal(w.parts[2].description, "");
    const char *b0 = text + w.parts[0].text_off;
    assert_memory_equal(b0, "<XBRL>", 6);
    const char *b3 = text + w.parts[3].text_off;
    assert_memory_equal(b3, "Harborline Fabrication Corp announces", 37);

    /* Default filter: the main document only. */
    size_t kept = 0;
    for (size_t i = 0; i < w.n; i++)
        kept += (size_t)tt_wrapper_keep(&w.parts[i], NULL);
    assert_int_equal(kept, 1);
    assert_true(tt_wrapper_keep(&w.parts[0], ""));
    /* "all": everything but the uuencoded graphic. */
    kept = 0;
    for (size_t i = 0; i < w.n; i++)
        kept += (size_t)tt_wrapper_keep(&w.parts[i], "all");
    assert_int_equal(kept, 3);
    assert_false(tt_wrapper_keep(&w.parts[2], "all"));
    assert_false(tt_wrapper_keep(&w.parts[2], "GRAPHIC"));
    /* A prefix pattern picks the press release alone. */
    assert_false(tt_wrapper_keep(&w.parts[0], "EX-99*"));
    assert_false(tt_wrapper_keep(&w.parts[1], "EX-99*"));
    assert_true(tt_wrapper_keep(&w.parts[3], "EX-99*"));
    /* A list, without regard to case or blanks. */
    assert_true(tt_wrapper_keep(&w.parts[1], "10-q, ex-31"));
    assert_true(tt_wrapper_keep(&w.parts[0], "10-q, ex-31"));
    assert_false(tt_wrapper_keep(&w.parts[3], "10-q, ex-31"));
    assert_false(tt_wrapper_keep(&w.parts[3], "EX-99"));
    tt_wrapper_release(&w);
}

static void test_fixture_lf(void **state)
{
    (void)state;
    size_t len;
    char *text = tt_test_read(FIXTURE, &len);
    check_fixture_fields(text, len);
    check_against_python(FIXTURE, text, len);
    assert_int_equal(tt_detect_kind(text, len), TT_KIND_WRAPPER);
    free(text);
}

static void test_fixture_crlf(void **state)
{
    (void)state;
    size_t len, clen;
    char *text = tt_test_read(FIXTURE, &len);
    char *crlf = to_crlf(text, len, &clen);
    char path[] = TT_TEST_TMP "tt_wrapper_crlfXXXXXX";
    int fd = mkstemp(path);
    assert_true(fd >= 0);
    close(fd);
    write_file(path, crlf, clen);
    check_fixture_fields(crlf, clen);
    check_against_python(path, crlf, clen);
    assert_int_equal(tt_detect_kind(crlf, clen), TT_KIND_WRAPPER);
    unlink(path);
    free(crlf);
    free(text);
}

static void test_lowercase_and_inline_close(void **state)
{
    (void)state;
    const char *s = "<document>\n<type>ex-99.2\n<text><html><body><p>Brief</p></body></html>"
                    "</text>\n</document>\n"
                    "<Document>\n<Type>10-K\n<Text>\n<p>Annual</p></html></TEXT>\n</Document>\n";
    tt_wrapper w;
    tt_error err;
    tt_wrapper_init(&w);
    assert_int_equal(tt_wrapper_split(s, strlen(s), &w, "x", &err), TT_OK);
    assert_int_equal(w.n, 2);
    assert_string_equal(w.parts[0].type, "ex-99.2");
    /* No <SEQUENCE>: numbered by position. */
    assert_int_equal(w.parts[0].seq, 1);
    assert_int_equal(w.parts[1].seq, 2);
    /* A body on the <TEXT> line itself, closed on the same line. */
    assert_int_equal(w.parts[0].text_len, strlen("<html><body><p>Brief</p></body></html>"));
    assert_memory_equal(s + w.parts[0].text_off, "<html><body>", 12);
    /* A closing tag at a line's end. */
    assert_int_equal(w.parts[1].text_len, strlen("<p>Annual</p></html>"));
    assert_memory_equal(s + w.parts[1].text_off, "<p>Annual</p></html>", 20);
    tt_wrapper_release(&w);
}

static void test_uuencoded_bodies(void **state)
{
    (void)state;
    /* uuencode's header line: "begin", an octal mode, a name (POSIX
     * uuencode(1)); a wrapper may put a <PDF> line before it. */
    const char *s = "<DOCUMENT>\n<TYPE>PDF\n<TEXT>\n<PDF>\nbegin 644 r.pdf\nM1\n`\nend\n</PDF>\n"
                    "</TEXT>\n</DOCUMENT>\n"
                    "<DOCUMENT>\n<TYPE>EX-99\n<TEXT>\n\n  begin-base64 600 x.zip\n</TEXT>\n"
                    "</DOCUMENT>\n"
                    "<DOCUMENT>\n<TYPE>EX-99\n<TEXT>\nbegin 9 lives of the plan\n</TEXT>\n"
                    "</DOCUMENT>\n"
                    "<DOCUMENT>\n<TYPE>EX-99\n<TEXT>\nbegin 644\n</TEXT>\n</DOCUMENT>\n"
                    "<DOCUMENT>\n<TYPE>EX-99\n<TEXT>\nWe begin 644 new projects.\nbegin 644 "
                    "x\n</TEXT>\n</DOCUMENT>\n";
    tt_wrapper w;
    tt_error err;
    tt_wrapper_init(&w);
    assert_int_equal(tt_wrapper_split(s, strlen(s), &w, "x", &err), TT_OK);
    assert_int_equal(w.n, 5);
    assert_int_equal(w.parts[0].uuencoded, 1);
    assert_int_equal(w.parts[1].uuencoded, 1);
    assert_int_equal(w.parts[2].uuencoded, 0);
    assert_int_equal(w.parts[3].uuencoded, 0);
    assert_int_equal(w.parts[4].uuencoded, 0);
    tt_wrapper_release(&w);
}

static void test_unterminated_runs_to_end(void **state)
{
    (void)state;
    const char *s = "<DOCUMENT>\n<TYPE>8-K\n<SEQUENCE>7\n<TEXT>\nItem 8.01 Other Events.\n"
                    "<DOCUMENT>\nstill the body\n";
    tt_wrapper w;
    tt_error err;
    tt_wrapper_init(&w);
    assert_int_equal(tt_wrapper_split(s, strlen(s), &w, "x", &err), TT_OK);
    assert_int_equal(w.n, 1);
    assert_int_equal(w.parts[0].seq, 7);
    const char *body = strstr(s, "Item 8.01");
    assert_int_equal(w.parts[0].text_off, (size_t)(body - s));
    assert_int_equal(w.parts[0].text_off + w.parts[0].text_len, strlen(s));
    tt_wrapper_release(&w);
}

static void test_no_document_is_parse_error(void **state)
{
    (void)state;
    const char *s = "<SEC-HEADER>\nACCESSION NUMBER: 1\n</SEC-HEADER>\n";
    tt_wrapper w;
    tt_error err;
    tt_wrapper_init(&w);
    tt_error_init(&err);
    assert_int_equal(tt_wrapper_split(s, strlen(s), &w, "hdr.txt", &err), TT_EPARSE);
    assert_string_equal(err.file, "hdr.txt");
    assert_non_null(strstr(err.message, "<DOCUMENT>"));
    tt_wrapper_release(&w);
}

static void test_parts_limit(void **state)
{
    (void)state;
    const char *unit = "<DOCUMENT>\n";
    size_t un = strlen(unit), n = (size_t)TT_LIMIT_WRAPPER_PARTS + 1;
    char *s = malloc(un * n + 1);
    assert_non_null(s);
    for (size_t i = 0; i < n; i++)
        memcpy(s + i * un, unit, un);
    s[un * n] = '\0';
    tt_wrapper w;
    tt_error err;
    tt_wrapper_init(&w);
    tt_error_init(&err);
    /* Exactly at the limit: accepted. */
    assert_int_equal(tt_wrapper_split(s, un * (n - 1), &w, "big", &err), TT_OK);
    assert_int_equal(w.n, (size_t)TT_LIMIT_WRAPPER_PARTS);
    /* One more: refused, naming the limit. */
    assert_int_equal(tt_wrapper_split(s, un * n, &w, "big", &err), TT_ELIMIT);
    assert_non_null(strstr(err.message, "TT_LIMIT_WRAPPER_PARTS"));
    tt_wrapper_release(&w);
    free(s);
}

static void test_default_filter_by_filename(void **state)
{
    (void)state;
    tt_wrapper_part p;
    memset(&p, 0, sizeof p);
    snprintf(p.type, sizeof p.type, "10-K");
    snprintf(p.filename, sizeof p.filename, "report.htm");
    assert_true(tt_wrapper_keep(&p, NULL));
    snprintf(p.filename, sizeof p.filename, "schema.XSD");
    assert_false(tt_wrapper_keep(&p, NULL));
    assert_true(tt_wrapper_keep(&p, "all"));
    snprintf(p.filename, sizeof p.filename, "r1.js");
    assert_false(tt_wrapper_keep(&p, NULL));
    snprintf(p.filename, sizeof p.filename, "r1.json");
    assert_false(tt_wrapper_keep(&p, NULL));
    p.filename[0] = '\0';
    snprintf(p.type, sizeof p.type, "xml");
    assert_false(tt_wrapper_keep(&p, NULL));
    snprintf(p.type, sizeof p.type, "ex-10.1");
    assert_false(tt_wrapper_keep(&p, NULL));
    assert_true(tt_wrapper_keep(&p, "EX-10*"));
    assert_false(tt_wrapper_keep(&p, "EX-1"));
}

static void test_detect_kind(void **state)
{
    (void)state;
    /* A document block with its <TYPE> line, no header. */
    const char *w = "\n\n<DOCUMENT>\n\n<TYPE>10-K\n<TEXT>\nx\n</TEXT>\n</DOCUMENT>\n";
    assert_int_equal(tt_detect_kind(w, strlen(w)), TT_KIND_WRAPPER);
    /* A memo that merely names the tag is text. */
    const char *memo = "Attach the file below.\n<DOCUMENT>\nPlease review.\n";
    assert_int_equal(tt_detect_kind(memo, strlen(memo)), TT_KIND_TEXT);
    const char *hdr = "<SEC-HEADER>0001.hdr.sgml\nACCESSION NUMBER: 1\n";
    assert_int_equal(tt_detect_kind(hdr, strlen(hdr)), TT_KIND_WRAPPER);

    const char *html[] = {
        "<!DOCTYPE html><title>x</title>",
        "  <HTML><BODY>x</BODY></HTML>",
        "<?xml version=\"1.0\"?>\n<html xmlns=\"http://www.w3.org/1999/xhtml\">",
        "<p>Opening remarks</p>",
        "<div class=\"a\">x</div>",
        "<table>\n<tr><td>1</td></tr></table>",
    };
    for (size_t i = 0; i < sizeof html / sizeof html[0]; i++)
        assert_int_equal(tt_detect_kind(html[i], strlen(html[i])), TT_KIND_HTML);

    const char *text[] = {
        "Plain prepared remarks.\n\nSecond paragraph.",
        /* A plain-text filing's table markup and page marks. */
        "<PAGE>\n<TABLE>\n<CAPTION>\n<S>      <C>\nNet sales  1,204\n</TABLE>\n",
        "An XML exhibit:\n<?xml version=\"1.0\"?><xbrl></xbrl>",
        "<pre>x</pre> and <param>",
        "",
    };
    for (size_t i = 0; i < sizeof text / sizeof text[0]; i++)
        assert_int_equal(tt_detect_kind(text[i], strlen(text[i])), TT_KIND_TEXT);

    /* The HTML window is bounded: a <p> after 4 KiB of text is not seen. */
    size_t n = 5000;
    char *late = malloc(n + 16);
    assert_non_null(late);
    memset(late, 'a', n);
    memcpy(late + n, "<p>x</p>", 9);
    assert_int_equal(tt_detect_kind(late, n + 8), TT_KIND_TEXT);
    memcpy(late + 100, "<p>", 3);
    assert_int_equal(tt_detect_kind(late, n + 8), TT_KIND_HTML);
    free(late);

    assert_string_equal(tt_doc_kind_name(TT_KIND_TEXT), "text");
    assert_string_equal(tt_doc_kind_name(TT_KIND_HTML), "html");
    assert_string_equal(tt_doc_kind_name(TT_KIND_WRAPPER), "wrapper");
}

/* Out of memory at each allocation in turn is reported, never crashed on. */

static void test_split_out_of_memory(void **state)
{
    (void)state;
    size_t len;
    char *text = tt_test_read(FIXTURE, &len);
    tt_allocator a = { tt_test_failing_malloc, tt_test_failing_realloc, free };
    int ok = 0;
    for (int k = 0; k < 20 && !ok; k++) {
        tt_wrapper w;
        tt_error err;
        tt_wrapper_init(&w);
        tt_test_fail_after = k;
        tt_set_allocator(&a);
        tt_status st = tt_wrapper_split(text, len, &w, "q3", &err);
        tt_set_allocator(NULL);
        tt_test_fail_after = -1;
        assert_true(st == TT_OK || st == TT_ENOMEM);
        ok = st == TT_OK;
        tt_wrapper_release(&w);
    }
    assert_true(ok);
    free(text);
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_fixture_lf),
        cmocka_unit_test(test_fixture_crlf),
        cmocka_unit_test(test_lowercase_and_inline_close),
        cmocka_unit_test(test_uuencoded_bodies),
        cmocka_unit_test(test_unterminated_runs_to_end),
        cmocka_unit_test(test_no_document_is_parse_error),
        cmocka_unit_test(test_parts_limit),
        cmocka_unit_test(test_default_filter_by_filename),
        cmocka_unit_test(test_detect_kind),
        cmocka_unit_test(test_split_out_of_memory),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
