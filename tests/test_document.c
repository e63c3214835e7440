/* Tests for the document reader (src/document.c): one path to the documents
 * it holds, through source, decode, kind detection, the wrapper splitter and
 * the extractors.
 *
 * The expected values come from the inputs themselves (written by each test,
 * or the invented fixture tests/fixtures/wrapper/harborline-q3.txt, whose
 * parts and types can be read in the file) and from the contract in
 * include/termtide/document.h; the encodings behind the notes are checked
 * against Python's codecs in test_decode.c. */
#include "tt_test.h"

#include <sys/stat.h>
#include <unistd.h>
#include <zlib.h>

#include "termtide/alloc.h"
#include "termtide/document.h"

#define FIXTURE "tests/fixtures/wrapper/harborline-q3.txt"

static char tmp_root[256];

static int setup(void **state)
{
    (void)state;
    const char *t = getenv("TMPDIR");
    snprintf(tmp_root, sizeof tmp_root, "%s/tt_document_XXXXXX", t && *t ? t : "/tmp");
    return mkdtemp(tmp_root) ? 0 : -1;
}

static int teardown(void **state)
{
    (void)state;
    char cmd[600];
    snprintf(cmd, sizeof cmd, "rm -rf '%s'", tmp_root);
    return system(cmd) == 0 ? 0 : -1;
}

static void put(char *path, size_t size, const char *name, const void *data, size_t n)
{
    snprintf(path, size, "%s/%s", tmp_root, name);
    FILE *f = fopen(path, "wb");
    assert_non_null(f);
    if (n)
        assert_int_equal(fwrite(data, 1, n, f), n);
    fclose(f);
}

/* What the callback saw. */
#define MAX_DOCS 8
typedef struct seen {
    size_t n;
    char name[MAX_DOCS][512];
    char notes[MAX_DOCS][256];
    char text[MAX_DOCS][1024]; /* the blocks' text, each block ending in '\n' */
    char raw_head[MAX_DOCS][16];
    tt_doc_kind kind[MAX_DOCS], outer[MAX_DOCS];
    size_t seq[MAX_DOCS], nblocks[MAX_DOCS], repaired[MAX_DOCS];
    char type[MAX_DOCS][64], entity[MAX_DOCS][256], period[MAX_DOCS][32], form[MAX_DOCS][64];
    int was_gzip[MAX_DOCS];
    tt_encoding enc[MAX_DOCS];
    tt_status stop_with; /* returned from the callback when not TT_OK */
} seen;

static void copy(char *dst, size_t size, const char *s, size_t n)
{
    if (n >= size)
        n = size - 1;
    memcpy(dst, s, n);
    dst[n] = '\0';
}

static tt_status collect(void *ctx, const tt_document *doc)
{
    seen *s = ctx;
    size_t i = s->n++;
    assert_true(i < MAX_DOCS);
    copy(s->name[i], sizeof s->name[i], doc->name, strlen(doc->name));
    copy(s->notes[i], sizeof s->notes[i], doc->notes, strlen(doc->notes));
    copy(s->text[i], sizeof s->text[i], doc->blocks->text.data, doc->blocks->text.len);
    copy(s->raw_head[i], sizeof s->raw_head[i], doc->raw, doc->raw_len);
    copy(s->type[i], sizeof s->type[i], doc->type, strlen(doc->type));
    copy(s->entity[i], sizeof s->entity[i], doc->entity, strlen(doc->entity));
    copy(s->period[i], sizeof s->period[i], doc->period, strlen(doc->period));
    copy(s->form[i], sizeof s->form[i], doc->form, strlen(doc->form));
    s->kind[i] = doc->kind;
    s->outer[i] = doc->outer_kind;
    s->seq[i] = doc->seq;
    s->nblocks[i] = doc->blocks->n;
    s->repaired[i] = doc->blocks->repaired;
    s->was_gzip[i] = doc->was_gzip;
    s->enc[i] = doc->decode.encoding;
    return s->stop_with;
}

static tt_status read_all(const char *path, const char *types, seen *s, size_t *skipped,
                          tt_error *err)
{
    tt_read_options opt;
    memset(&opt, 0, sizeof opt);
    opt.doc_types = types;
    memset(s, 0, sizeof *s);
    tt_error_init(err);
    return tt_read_documents(path, &opt, collect, s, skipped, err);
}

static void test_plain_text(void **state)
{
    (void)state;
    char p[512];
    const char *t = "Harborline Fabrication Corp\nthird quarter\n\nNet sales rose.\n";
    put(p, sizeof p, "memo.txt", t, strlen(t));
    seen s;
    tt_error err;
    size_t skipped = 99;
    assert_int_equal(read_all(p, NULL, &s, &skipped, &err), TT_OK);
    assert_int_equal(s.n, 1);
    assert_int_equal(skipped, 0);
    assert_string_equal(s.name[0], p);
    assert_int_equal(s.kind[0], TT_KIND_TEXT);
    assert_int_equal(s.outer[0], TT_KIND_TEXT);
    assert_string_equal(s.notes[0], "");
    assert_int_equal(s.nblocks[0], 2);
    assert_string_equal(s.text[0], "Harborline Fabrication Corp third quarter\nNet sales rose.\n");
    assert_int_equal(s.seq[0], 0);
    assert_string_equal(s.type[0], "");
    assert_string_equal(s.entity[0], "");
    assert_int_equal(s.was_gzip[0], 0);
}

static void test_notes(void **state)
{
    (void)state;
    char p[512];
    seen s;
    tt_error err;

    const char *cp = "Harborline\x92s caf\xe9 results";
    put(p, sizeof p, "cp1252.txt", cp, strlen(cp));
    assert_int_equal(read_all(p, NULL, &s, NULL, &err), TT_OK);
    assert_string_equal(s.notes[0], "decoded as windows-1252");
    assert_int_equal(s.enc[0], TT_ENC_CP1252);
    assert_string_equal(s.text[0], "Harborline\xe2\x80\x99s caf\xc3\xa9 results\n");

    const char *u8 = "caf\xc3\xa9 \xe2\x80\x94 r\xc3\xa9sum\xc3\xa9 \x92 and \xff";
    put(p, sizeof p, "stray.txt", u8, strlen(u8));
    assert_int_equal(read_all(p, NULL, &s, NULL, &err), TT_OK);
    assert_string_equal(s.notes[0], "2 invalid UTF-8 sequences replaced");

    put(p, sizeof p, "empty.txt", "", 0);
    assert_int_equal(read_all(p, NULL, &s, NULL, &err), TT_OK);
    assert_int_equal(s.n, 1);
    assert_string_equal(s.notes[0], "empty file");
    assert_int_equal(s.nblocks[0], 0);

    static const char u16[] = { '\xff', '\xfe', 'O', 0, 'K', 0 };
    put(p, sizeof p, "u16.txt", u16, sizeof u16);
    assert_int_equal(read_all(p, NULL, &s, NULL, &err), TT_OK);
    assert_string_equal(s.notes[0], "decoded as utf-16le");
    assert_string_equal(s.text[0], "OK\n");

    /* gzip, made with zlib's gzip writer. */
    snprintf(p, sizeof p, "%s/memo.txt.gz", tmp_root);
    gzFile gz = gzopen(p, "wb");
    assert_non_null(gz);
    const char *t = "Coil \x93stock\x94 shipped.";
    assert_int_equal(gzwrite(gz, t, (unsigned)strlen(t)), (int)strlen(t));
    gzclose(gz);
    assert_int_equal(read_all(p, NULL, &s, NULL, &err), TT_OK);
    assert_string_equal(s.notes[0], "gzip-compressed; decoded as windows-1252");
    assert_int_equal(s.was_gzip[0], 1);
    assert_string_equal(s.text[0], "Coil \xe2\x80\x9cstock\xe2\x80\x9d shipped.\n");
}

static void test_html(void **state)
{
    (void)state;
    char p[512];
    seen s;
    tt_error err;
    const char *h = "<!DOCTYPE html><html><head><title>T</title></head><body>"
                    "<h1>Results</h1><p>Net sales rose.</p></body></html>";
    put(p, sizeof p, "q.htm", h, strlen(h));
    assert_int_equal(read_all(p, NULL, &s, NULL, &err), TT_OK);
    assert_int_equal(s.n, 1);
    assert_int_equal(s.kind[0], TT_KIND_HTML);
    assert_string_equal(s.text[0], "Results\nNet sales rose.\n");

    /* Misnested markup: whatever the extractor counts as repaired appears
     * in the notes, with the contract's wording. */
    const char *bad = "<html><body><p><b>Net <i>sales</b> rose</i><div>x</p></body></html>";
    put(p, sizeof p, "bad.htm", bad, strlen(bad));
    assert_int_equal(read_all(p, NULL, &s, NULL, &err), TT_OK);
    if (s.repaired[0]) {
        char want[64];
        snprintf(want, sizeof want, "HTML repaired: %zu problem%s", s.repaired[0],
                 s.repaired[0] == 1 ? "" : "s");
        assert_string_equal(s.notes[0], want);
    } else {
        assert_string_equal(s.notes[0], "");
    }
}

static void test_wrapper_default(void **state)
{
    (void)state;
    seen s;
    tt_error err;
    size_t skipped = 0;
    assert_int_equal(read_all(FIXTURE, NULL, &s, &skipped, &err), TT_OK);
    assert_int_equal(s.n, 1);
    assert_int_equal(skipped, 3);
    assert_string_equal(s.name[0], FIXTURE "#1:10-Q");
    /* The outer <XBRL> pair is stepped over; the body is inline XBRL. */
    assert_int_equal(s.kind[0], TT_KIND_HTML);
    assert_int_equal(s.outer[0], TT_KIND_WRAPPER);
    assert_memory_equal(s.raw_head[0], "<?xml", 5);
    assert_int_equal(s.seq[0], 1);
    assert_string_equal(s.type[0], "10-Q");
    assert_string_equal(s.entity[0], "Harborline Fabrication Corp");
    assert_string_equal(s.period[0], "20250930");
    assert_string_equal(s.form[0], "10-Q");
    assert_non_null(strstr(s.text[0], "Harborline Fabrication Corp reports net sales"));
    assert_null(strstr(s.text[0], "<XBRL>"));
    assert_null(strstr(s.text[0], "XBRL"));
}

static void test_wrapper_types(void **state)
{
    (void)state;
    seen s;
    tt_error err;
    size_t skipped = 0;
    assert_int_equal(read_all(FIXTURE, "all", &s, &skipped, &err), TT_OK);
    assert_int_equal(s.n, 3);
    assert_int_equal(skipped, 1);
    assert_string_equal(s.name[0], FIXTURE "#1:10-Q");
    assert_string_equal(s.name[1], FIXTURE "#2:EX-31");
    assert_string_equal(s.name[2], FIXTURE "#4:EX-99.1");
    assert_int_equal(s.kind[1], TT_KIND_TEXT);
    assert_int_equal(s.kind[2], TT_KIND_TEXT);
    assert_string_equal(s.text[2], "Harborline Fabrication Corp announces third-quarter "
                                   "results.\nNet sales of coil stock rose on steady "
                                   "shipyard demand.\n");
    assert_int_equal(s.seq[2], 4);

    assert_int_equal(read_all(FIXTURE, "EX-99*", &s, &skipped, &err), TT_OK);
    assert_int_equal(s.n, 1);
    assert_int_equal(skipped, 3);
    assert_string_equal(s.name[0], FIXTURE "#4:EX-99.1");
    assert_string_equal(s.entity[0], "Harborline Fabrication Corp");

    /* The callback stops the file. */
    memset(&s, 0, sizeof s);
    s.stop_with = TT_EINVAL;
    tt_read_options opt;
    memset(&opt, 0, sizeof opt);
    opt.doc_types = "all";
    assert_int_equal(tt_read_documents(FIXTURE, &opt, collect, &s, NULL, &err), TT_EINVAL);
    assert_int_equal(s.n, 1);
}

static void test_wrapper_part_failure(void **state)
{
    (void)state;
    /* Part 1 nests deeper than TT_LIMIT_HTML_DEPTH (the extractor refuses
     * it); part 2 is fine and is still handed over; part 3 is empty. */
    size_t cap = 64 * 1024, n = 0;
    char *w = malloc(cap);
    assert_non_null(w);
    n += (size_t)snprintf(w + n, cap - n,
                          "<DOCUMENT>\n<TYPE>10-K\n<SEQUENCE>1\n<TEXT>\n<html><body>");
    for (int i = 0; i < 400; i++)
        n += (size_t)snprintf(w + n, cap - n, "<div>");
    n += (size_t)snprintf(w + n, cap - n,
                          "deep</body></html>\n</TEXT>\n</DOCUMENT>\n"
                          "<DOCUMENT>\n<TYPE>10-K/A\n<SEQUENCE>2\n<TEXT>\n"
                          "Amended text.\n</TEXT>\n</DOCUMENT>\n"
                          "<DOCUMENT>\n<TYPE>10-K/A\n<SEQUENCE>3\n<TEXT>\n  \n</TEXT>\n"
                          "</DOCUMENT>\n");
    char p[512];
    put(p, sizeof p, "deep.txt", w, n);
    free(w);
    seen s;
    tt_error err;
    assert_int_equal(read_all(p, NULL, &s, NULL, &err), TT_ELIMIT);
    assert_int_equal(s.n, 2);
    char want[600];
    snprintf(want, sizeof want, "%s#2:10-K/A", p);
    assert_string_equal(s.name[0], want);
    assert_string_equal(s.text[0], "Amended text.\n");
    assert_string_equal(s.notes[1], "empty document");
    snprintf(want, sizeof want, "%s#1:10-K", p);
    assert_string_equal(err.file, want);
}

static void test_failures(void **state)
{
    (void)state;
    char p[512];
    seen s;
    tt_error err;
    static const char png[] = "\x89PNG\r\n\x1a\n\0\0\0\rIHDR";
    put(p, sizeof p, "logo.png.txt", png, sizeof png - 1);
    assert_int_equal(read_all(p, NULL, &s, NULL, &err), TT_EBINARY);
    assert_int_equal(s.n, 0);
    assert_string_equal(err.file, p);
    assert_string_equal(err.message, "binary file (PNG image)");

    snprintf(p, sizeof p, "%s/missing.txt", tmp_root);
    assert_int_equal(read_all(p, NULL, &s, NULL, &err), TT_ENOENT);
    assert_string_equal(err.file, p);
    assert_int_equal(s.n, 0);

    const char *hdr = "<SEC-HEADER>\nACCESSION NUMBER: 0009990001-25-000001\n</SEC-HEADER>\n";
    put(p, sizeof p, "hdr.txt", hdr, strlen(hdr));
    assert_int_equal(read_all(p, NULL, &s, NULL, &err), TT_EPARSE);
    assert_string_equal(err.file, p);
    assert_int_equal(s.n, 0);
}

/* Out of memory at each allocation in turn: a status, never a crash. */

/* One reader over files of every kind in turn (its buffers reused and
 * swapped by decoding) sees exactly what a fresh tt_read_documents sees. */
static void test_reader_reuse(void **state)
{
    (void)state;
    char p1[600], p2[600], p3[600], p4[600], p5[600];
    const char *cp1252 = "Caf\xe9 \x93quoted\x94 text\n";
    const char *big_html_head = "<html><body><p>Alpha beta</p><td>gamma</td><td>delta</td>";
    put(p1, sizeof p1, "r1.txt", "Plain words here.\n\nSecond paragraph.\n", 37);
    put(p2, sizeof p2, "r2.txt", cp1252, strlen(cp1252));
    put(p3, sizeof p3, "r3.htm", big_html_head, strlen(big_html_head));
    put(p4, sizeof p4, "r4.txt", "", 0);
    const char wrapper[] = "<DOCUMENT>\n<TYPE>10-Q\n<SEQUENCE>1\n<TEXT>\nWrapped body words\n"
                           "</TEXT>\n</DOCUMENT>\n";
    put(p5, sizeof p5, "r5.txt", wrapper, sizeof wrapper - 1);
    const char *paths[] = { p1, p2, p3, p4, p5, p2, p1, p3 };
    tt_reader *r = tt_reader_new();
    assert_non_null(r);
    tt_read_options opt;
    memset(&opt, 0, sizeof opt);
    for (size_t i = 0; i < sizeof paths / sizeof paths[0]; i++) {
        seen fresh, reused;
        size_t sk1, sk2;
        tt_error e1, e2;
        assert_int_equal(read_all(paths[i], NULL, &fresh, &sk1, &e1), TT_OK);
        memset(&reused, 0, sizeof reused);
        tt_error_init(&e2);
        assert_int_equal(tt_reader_read(r, paths[i], &opt, collect, &reused, &sk2, &e2), TT_OK);
        assert_int_equal(fresh.n, reused.n);
        for (size_t k = 0; k < fresh.n; k++) {
            assert_string_equal(fresh.name[k], reused.name[k]);
            assert_string_equal(fresh.text[k], reused.text[k]);
            assert_string_equal(fresh.notes[k], reused.notes[k]);
            assert_int_equal(fresh.enc[k], reused.enc[k]);
            assert_int_equal(fresh.nblocks[k], reused.nblocks[k]);
        }
    }
    tt_reader_free(r);
}

static void test_out_of_memory(void **state)
{
    (void)state;
    tt_allocator a = { tt_test_failing_malloc, tt_test_failing_realloc, free };
    int ok = 0;
    for (int k = 0; k < 400 && !ok; k++) {
        seen s;
        tt_error err;
        tt_test_fail_after = k;
        tt_set_allocator(&a);
        tt_status st = read_all(FIXTURE, "all", &s, NULL, &err);
        tt_set_allocator(NULL);
        tt_test_fail_after = -1;
        assert_true(st == TT_OK || st == TT_ENOMEM);
        ok = st == TT_OK;
        if (ok)
            assert_int_equal(s.n, 3);
    }
    assert_true(ok);
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_plain_text),
        cmocka_unit_test(test_notes),
        cmocka_unit_test(test_html),
        cmocka_unit_test(test_wrapper_default),
        cmocka_unit_test(test_wrapper_types),
        cmocka_unit_test(test_wrapper_part_failure),
        cmocka_unit_test(test_failures),
        cmocka_unit_test(test_reader_reuse),
        cmocka_unit_test(test_out_of_memory),
    };
    return cmocka_run_group_tests(tests, setup, teardown);
}
