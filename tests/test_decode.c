/* Tests for the decode stage (src/decode.c).
 *
 * Reference: Python's standard codecs, run at test time with
 * /usr/bin/python3: 'cp1252' for the Windows-1252 table (errors='replace'
 * for its five undefined bytes), 'utf-8' / 'utf-8-sig' with errors='replace'
 * for the replacement of invalid UTF-8 (Python substitutes maximal subparts,
 * as the Unicode Standard recommends in chapter 3.9), and 'utf-16-le' /
 * 'utf-16-be' for UTF-16. The encoding-choice rule (I invalid sequences
 * against M valid multi-byte ones) is the project's own and is tested on
 * both sides of its boundary. */
#include "tt_test.h"

#include <time.h>
#include <unistd.h>

#include "termtide/alloc.h"
#include "termtide/decode.h"
#include "termtide/simd.h"

/* ---- Python reference ------------------------------------------------------ */

/* Runs `python3 -c` on a script that reads hex-encoded inputs, one per line,
 * from a file and prints, one per line, the hex of the UTF-8 output of
 * `expr` (with `b` the input bytes). */
static char *python_hex_map(const char *expr, const char *inputs_path)
{
    char cmd[2048];
    snprintf(cmd, sizeof cmd,
             "%s -c \"import sys\n"
             "for l in open(sys.argv[1]):\n"
             "  b=bytes.fromhex(l.strip())\n"
             "  print((%s).encode('utf-8').hex())\" %s",
             tt_test_python(), expr, inputs_path);
    FILE *p = popen(cmd, "r");
    assert_non_null(p);
    size_t cap = 1 << 20, n = 0, r;
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

static void hex_line(FILE *f, const unsigned char *s, size_t n)
{
    for (size_t i = 0; i < n; i++)
        fprintf(f, "%02x", s[i]);
    fputc('\n', f);
}

static size_t unhex(const char *h, size_t n, unsigned char *out)
{
    size_t o = 0;
    for (size_t i = 0; i + 1 < n; i += 2) {
        unsigned v;
        assert_int_equal(sscanf(h + i, "%2x", &v), 1);
        out[o++] = (unsigned char)v;
    }
    return o;
}

typedef struct ref_case {
    unsigned char in[256];
    size_t n;
} ref_case;

/* Decodes every case with Python's `expr` and compares with tt_decode's
 * output and encoding; with check_count, `replaced` must equal the number of
 * U+FFFD in Python's output (the inputs hold no literal U+FFFD). */
static void compare_with_python(const ref_case *cases, size_t ncases, const char *expr,
                                tt_encoding want_enc, int check_count)
{
    char path[] = TT_TEST_TMP "tt_decode_refXXXXXX";
    int fd = mkstemp(path);
    assert_true(fd >= 0);
    FILE *f = fdopen(fd, "w");
    assert_non_null(f);
    for (size_t i = 0; i < ncases; i++)
        hex_line(f, cases[i].in, cases[i].n);
    fclose(f);
    char *ref = python_hex_map(expr, path);
    unlink(path);

    char *line = ref;
    tt_buf out;
    tt_buf_init(&out, 0);
    unsigned char want[1024];
    for (size_t i = 0; i < ncases; i++) {
        char *nl = strchr(line, '\n');
        assert_non_null(nl);
        size_t wn = unhex(line, (size_t)(nl - line), want);
        tt_decode_info info;
        tt_error err;
        assert_int_equal(tt_decode((const char *)cases[i].in, cases[i].n, &out, &info, "t", &err),
                         TT_OK);
        assert_int_equal(info.encoding, want_enc);
        if (out.len != wn || memcmp(out.data, want, wn) != 0) {
            fprintf(stderr, "case %zu differs from Python\n", i);
            fail();
        }
        if (check_count) {
            size_t fffd = 0;
            for (size_t k = 0; k + 2 < wn; k++)
                fffd += want[k] == 0xEF && want[k + 1] == 0xBF && want[k + 2] == 0xBD;
            assert_int_equal(info.replaced, fffd);
        }
        line = nl + 1;
    }
    assert_int_equal(*line, '\0');
    tt_buf_release(&out);
    free(ref);
}

/* ---- helpers ----------------------------------------------------------- */

static tt_status dec(const char *s, size_t n, tt_buf *out, tt_decode_info *info, tt_error *err)
{
    tt_error_init(err);
    return tt_decode(s, n, out, info, "doc.txt", err);
}

/* ---- cases ------------------------------------------------------------- */

static void test_ascii_and_utf8_copied(void **state)
{
    (void)state;
    tt_buf out;
    tt_decode_info info;
    tt_error err;
    tt_buf_init(&out, 0);
    const char *a = "Harborline Fabrication Corp\r\nQ3 net sales rose.\f\n";
    assert_int_equal(dec(a, strlen(a), &out, &info, &err), TT_OK);
    assert_int_equal(info.encoding, TT_ENC_UTF8);
    assert_int_equal(out.len, strlen(a));
    assert_memory_equal(out.data, a, out.len);
    const char *u = "Caf\xc3\xa9 \xe2\x80\x9cquoted\xe2\x80\x9d \xe2\x82\xac" "5 \xf0\x9f\x9a\xa2";
    assert_int_equal(dec(u, strlen(u), &out, &info, &err), TT_OK);
    assert_int_equal(info.encoding, TT_ENC_UTF8);
    assert_int_equal(info.replaced, 0);
    assert_int_equal(info.skipped, 0);
    assert_string_equal(out.data, u);
    assert_int_equal(dec("", 0, &out, &info, &err), TT_OK);
    assert_int_equal(out.len, 0);
    assert_string_equal(tt_encoding_name(TT_ENC_CP1252), "windows-1252");
    assert_string_equal(tt_encoding_name(TT_ENC_UTF16BE), "utf-16be");
    tt_buf_release(&out);
}

static void test_utf8_bom(void **state)
{
    (void)state;
    tt_buf out;
    tt_decode_info info;
    tt_error err;
    tt_buf_init(&out, 0);
    const char *s = "\xef\xbb\xbfNet sales \xe2\x80\x94 up";
    assert_int_equal(dec(s, strlen(s), &out, &info, &err), TT_OK);
    assert_int_equal(info.encoding, TT_ENC_UTF8_BOM);
    assert_int_equal(info.skipped, 3);
    assert_string_equal(out.data, "Net sales \xe2\x80\x94 up");
    /* With a BOM, stray bytes are replaced even where they outnumber the
     * valid sequences (the BOM declares UTF-8). */
    const char *t = "\xef\xbb\xbf" "a\x92" "b\x93";
    assert_int_equal(dec(t, strlen(t), &out, &info, &err), TT_OK);
    assert_int_equal(info.encoding, TT_ENC_UTF8_BOM);
    assert_int_equal(info.replaced, 2);
    assert_string_equal(out.data, "a\xef\xbf\xbd" "b\xef\xbf\xbd");
    tt_buf_release(&out);
}

/* UTF-16 with BOMs, surrogate pairs, lone surrogates and an odd final byte,
 * against Python's utf-16-le / utf-16-be codecs (errors='replace') applied
 * to the bytes after the BOM. */
static void test_utf16_against_python(void **state)
{
    (void)state;
    /* Code units: 'H', 'é', U+20AC, U+1F6A2 (D83D DEA2), 'x'. */
    static const unsigned units[][8] = {
        { 0x0048, 0x00E9, 0x20AC, 0xD83D, 0xDEA2, 0x0078, 0, 0 },
        { 0x0041, 0xD83D, 0x0042, 0, 0, 0, 0, 0 },         /* lone high */
        { 0x0041, 0xDEA2, 0x0042, 0, 0, 0, 0, 0 },         /* lone low */
        { 0x0041, 0xDEA2, 0xD83D, 0, 0, 0, 0, 0 },         /* reversed pair */
        { 0x0041, 0x0042, 0xD83D, 0, 0, 0, 0, 0 },         /* high at the end */
        { 0x4E2D, 0x6587, 0x000A, 0xFF0C, 0, 0, 0, 0 },
    };
    for (int be = 0; be < 2; be++) {
        ref_case cases[8];
        size_t nc = 0;
        for (size_t i = 0; i < sizeof units / sizeof units[0]; i++) {
            ref_case *c = &cases[nc++];
            c->n = 0;
            c->in[c->n++] = be ? 0xFE : 0xFF;
            c->in[c->n++] = be ? 0xFF : 0xFE;
            for (size_t k = 0; k < 8 && units[i][k]; k++) {
                unsigned u = units[i][k];
                c->in[c->n++] = (unsigned char)(be ? u >> 8 : u & 0xFF);
                c->in[c->n++] = (unsigned char)(be ? u & 0xFF : u >> 8);
            }
        }
        /* An odd final byte. */
        ref_case *c = &cases[nc++];
        *c = cases[0];
        c->in[c->n++] = 0x41;
        compare_with_python(cases, nc, be ? "b[2:].decode('utf-16-be','replace')"
                                          : "b[2:].decode('utf-16-le','replace')",
                            be ? TT_ENC_UTF16BE : TT_ENC_UTF16LE, 1);
    }
    tt_buf out;
    tt_decode_info info;
    tt_error err;
    tt_buf_init(&out, 0);
    /* A U+0000 code unit is binary even in UTF-16. */
    static const char nul16[] = { '\xff', '\xfe', 'A', 0, 0, 0, 'B', 0 };
    assert_int_equal(dec(nul16, sizeof nul16, &out, &info, &err), TT_EBINARY);
    assert_non_null(strstr(err.message, "offset 4"));
    tt_buf_release(&out);
}

/* The full Windows-1252 table, 0x80–0xFF, against Python's cp1252 codec. */
static void test_cp1252_table_against_python(void **state)
{
    (void)state;
    ref_case all;
    all.n = 0;
    for (unsigned b = 0x80; b <= 0xFF; b++)
        all.in[all.n++] = (unsigned char)b;
    /* And each byte alone between ASCII letters. */
    static ref_case each[128];
    for (unsigned b = 0x80; b <= 0xFF; b++) {
        ref_case *c = &each[b - 0x80];
        c->n = 3;
        c->in[0] = 'a';
        c->in[1] = (unsigned char)b;
        c->in[2] = 'z';
    }
    compare_with_python(&all, 1, "b.decode('cp1252','replace')", TT_ENC_CP1252, 1);
    compare_with_python(each, 128, "b.decode('cp1252','replace')", TT_ENC_CP1252, 1);

    tt_buf out;
    tt_decode_info info;
    tt_error err;
    tt_buf_init(&out, 0);
    assert_int_equal(dec((const char *)all.in, all.n, &out, &info, &err), TT_OK);
    /* 81 8D 8F 90 9D are undefined in the code page (Python's codec agrees,
     * checked above through the U+FFFD count). */
    assert_int_equal(info.replaced, 5);
    tt_buf_release(&out);
}

/* An old filing in Windows-1252: curly quotes 0x92-0x94, euro 0x80, é 0xE9. */
static void test_cp1252_document(void **state)
{
    (void)state;
    ref_case c;
    const char *s = "Harborline\x92s \x93" "caf\xe9\x94 line cost \x80" "4.2 million "
                    "\x96 na\xefve estimates \x85";
    c.n = strlen(s);
    memcpy(c.in, s, c.n);
    compare_with_python(&c, 1, "b.decode('cp1252')", TT_ENC_CP1252, 1);
    tt_buf out;
    tt_decode_info info;
    tt_error err;
    tt_buf_init(&out, 0);
    assert_int_equal(dec(s, strlen(s), &out, &info, &err), TT_OK);
    assert_int_equal(info.replaced, 0);
    assert_non_null(strstr(out.data, "Harborline\xe2\x80\x99s"));
    assert_non_null(strstr(out.data, "\xe2\x82\xac" "4.2"));
    tt_buf_release(&out);
}

/* A UTF-8 file with two stray bytes: replaced and counted, as Python's
 * utf-8 codec with errors='replace' does. */
static void test_utf8_with_stray_bytes(void **state)
{
    (void)state;
    ref_case c;
    const char *s = "R\xc3\xa9sum\xc3\xa9 \xe2\x80\x94 the company\xe2\x80\x99s "
                    "\xe2\x80\x9cplan\xe2\x80\x9d \x92 stays \xe9 firm";
    c.n = strlen(s);
    memcpy(c.in, s, c.n);
    compare_with_python(&c, 1, "b.decode('utf-8','replace')", TT_ENC_UTF8, 1);
    tt_buf out;
    tt_decode_info info;
    tt_error err;
    tt_buf_init(&out, 0);
    assert_int_equal(dec(s, strlen(s), &out, &info, &err), TT_OK);
    assert_int_equal(info.replaced, 2);
    tt_buf_release(&out);
}

/* Both sides of the rule: UTF-8 while I <= M, Windows-1252 when I > M. */
static void test_rule_boundary(void **state)
{
    (void)state;
    tt_buf out;
    tt_decode_info info;
    tt_error err;
    tt_buf_init(&out, 0);
    /* I = 1, M = 1: UTF-8 (a tie goes to UTF-8). */
    const char *tie = "caf\xc3\xa9 and \x92";
    assert_int_equal(dec(tie, strlen(tie), &out, &info, &err), TT_OK);
    assert_int_equal(info.encoding, TT_ENC_UTF8);
    assert_int_equal(info.replaced, 1);
    assert_string_equal(out.data, "caf\xc3\xa9 and \xef\xbf\xbd");
    /* I = 2, M = 1: Windows-1252; the valid pair becomes two characters. */
    const char *more = "caf\xc3\xa9 and \x92 \x93";
    assert_int_equal(dec(more, strlen(more), &out, &info, &err), TT_OK);
    assert_int_equal(info.encoding, TT_ENC_CP1252);
    assert_int_equal(info.replaced, 0);
    assert_string_equal(out.data, "caf\xc3\x83\xc2\xa9 and \xe2\x80\x99 \xe2\x80\x9c");
    /* I = 1, M = 0: Windows-1252. */
    const char *one = "Harborline\x92s";
    assert_int_equal(dec(one, strlen(one), &out, &info, &err), TT_OK);
    assert_int_equal(info.encoding, TT_ENC_CP1252);
    assert_string_equal(out.data, "Harborline\xe2\x80\x99s");
    /* A maximal subpart counts once: E2 80 followed by ASCII is one invalid
     * sequence, so I = 1 against M = 1 stays UTF-8. */
    const char *sub = "\xc3\xa9 \xe2\x80x";
    assert_int_equal(dec(sub, strlen(sub), &out, &info, &err), TT_OK);
    assert_int_equal(info.encoding, TT_ENC_UTF8);
    assert_int_equal(info.replaced, 1);
    assert_string_equal(out.data, "\xc3\xa9 \xef\xbf\xbdx");
    tt_buf_release(&out);
}

/* Seeded random byte strings after a UTF-8 BOM (so the replacement reading
 * is always used), against Python's utf-8-sig codec with errors='replace':
 * overlongs, surrogates, truncations and stray continuation bytes. */
static void test_maximal_subparts_against_python(void **state)
{
    (void)state;
    static ref_case cases[400];
    uint32_t seed = 12345;
    static const unsigned char pool[] = { 0x41, 0x20, 0x80, 0x8F, 0x90, 0x9F, 0xA0, 0xBF,
                                          0xC0, 0xC1, 0xC2, 0xDF, 0xE0, 0xE1, 0xED, 0xEF,
                                          0xF0, 0xF1, 0xF4, 0xF5, 0xFF, 0x7F };
    for (size_t i = 0; i < 400; i++) {
        ref_case *c = &cases[i];
        c->n = 0;
        c->in[c->n++] = 0xEF;
        c->in[c->n++] = 0xBB;
        c->in[c->n++] = 0xBF;
        size_t len = 1 + i % 24;
        for (size_t k = 0; k < len; k++) {
            seed = seed * 1103515245u + 12345u;
            c->in[c->n++] = pool[(seed >> 16) % sizeof pool];
        }
    }
    /* The pool lacks 0xBD, so no input holds a literal U+FFFD (EF BF BD). */
    compare_with_python(cases, 400, "b.decode('utf-8-sig','replace')", TT_ENC_UTF8_BOM, 1);
}

/* Long ASCII runs (so the 32- and 16-byte run finders take whole steps)
 * between the awkward bytes of the test above, after a UTF-8 BOM, against
 * Python's utf-8-sig codec: with the AVX2 run finder (where the CPU has
 * it) and with the word-at-a-time one. */
static void test_long_runs_against_python(void **state)
{
    (void)state;
    static ref_case cases[300];
    uint32_t seed = 777;
    static const unsigned char pool[] = { 0x80, 0xA0, 0xBF, 0xC2, 0xC3, 0xE0, 0xE2, 0xED,
                                          0xF0, 0xF4, 0xFF, 0xA9, 0x99 };
    for (size_t i = 0; i < 300; i++) {
        ref_case *c = &cases[i];
        c->n = 0;
        c->in[c->n++] = 0xEF;
        c->in[c->n++] = 0xBB;
        c->in[c->n++] = 0xBF;
        while (c->n < 180) {
            seed = seed * 1103515245u + 12345u;
            size_t run = (seed >> 16) % 71;
            for (size_t k = 0; k < run; k++)
                c->in[c->n++] = (unsigned char)(k % 7 == 6 ? ' ' : 'a' + (seed >> (k % 9)) % 26);
            seed = seed * 1103515245u + 12345u;
            c->in[c->n++] = pool[(seed >> 16) % sizeof pool];
        }
    }
    for (int level = TT_SIMD_AVX2; level >= TT_SIMD_SSE2; level -= TT_SIMD_AVX2 - TT_SIMD_SSE2) {
        tt_simd_level(level);
        compare_with_python(cases, 300, "b.decode('utf-8-sig','replace')", TT_ENC_UTF8_BOM, 1);
    }
    tt_simd_level(TT_SIMD_AVX2);
}

static void test_binary(void **state)
{
    (void)state;
    tt_buf out;
    tt_decode_info info;
    tt_error err;
    tt_buf_init(&out, 0);
    static const char nul[] = "Harb\0rline";
    assert_int_equal(dec(nul, sizeof nul - 1, &out, &info, &err), TT_EBINARY);
    assert_string_equal(err.message, "binary file (NUL bytes at offset 4)");
    assert_string_equal(err.file, "doc.txt");
    /* The NUL found past the 16-byte fast path too. */
    /* A NUL at every position of the 32-, 16- and 8-byte fast paths and
     * the tail, after ASCII and after a multi-byte character; with the
     * AVX2 run finder (where the CPU has it) and without. */
    for (int lead = 0; lead < 4; lead++) {
        tt_simd_level(lead < 2 ? TT_SIMD_AVX2 : TT_SIMD_SSE2);
        for (size_t at = 0; at < 100; at++) {
            char big[100], want[64];
            memset(big, 'a', sizeof big);
            if (lead % 2)
                memcpy(big, "\xc3\xa9", 2);
            if (lead % 2 && at < 2)
                continue;
            big[at] = '\0';
            assert_int_equal(dec(big, sizeof big, &out, &info, &err), TT_EBINARY);
            snprintf(want, sizeof want, "binary file (NUL bytes at offset %zu)", at);
            assert_string_equal(err.message, want);
        }
    }
    tt_simd_level(TT_SIMD_AVX2);
    /* PNG signature (ISO/IEC 15948 section 5.2). */
    static const char png[] = "\x89PNG\r\n\x1a\n\x00\x00\x00\x0dIHDR";
    assert_int_equal(dec(png, sizeof png - 1, &out, &info, &err), TT_EBINARY);
    assert_string_equal(err.message, "binary file (PNG image)");
    const char *pdf = "%PDF-1.7\n%\xe2\xe3\xcf\xd3\n";
    assert_int_equal(dec(pdf, strlen(pdf), &out, &info, &err), TT_EBINARY);
    assert_string_equal(err.message, "binary file (PDF document)");
    const char *zip = "PK\x03\x04\x14";
    assert_int_equal(dec(zip, strlen(zip), &out, &info, &err), TT_EBINARY);
    const char *elf = "\x7f" "ELF\x02\x01\x01";
    assert_int_equal(dec(elf, strlen(elf), &out, &info, &err), TT_EBINARY);
    const char *gif = "GIF89a\x01";
    assert_int_equal(dec(gif, strlen(gif), &out, &info, &err), TT_EBINARY);
    const char *jpg = "\xff\xd8\xff\xe0";
    assert_int_equal(dec(jpg, strlen(jpg), &out, &info, &err), TT_EBINARY);
    /* UTF-16 without a BOM is refused as binary. */
    static const char u16[] = { 'N', 0, 'e', 0, 't', 0 };
    assert_int_equal(dec(u16, sizeof u16, &out, &info, &err), TT_EBINARY);
    /* A text that merely mentions a format is not binary. */
    const char *t = "The PDF and PNG files follow.";
    assert_int_equal(dec(t, strlen(t), &out, &info, &err), TT_OK);
    tt_buf_release(&out);
}

static void test_output_limit(void **state)
{
    (void)state;
    tt_buf out;
    tt_decode_info info;
    tt_error err;
    /* Six Windows-1252 bytes become 18 bytes of UTF-8: over a 10-byte cap. */
    tt_buf_init(&out, 10);
    const char *s = "\x80\x80\x80\x80\x80\x80";
    assert_int_equal(dec(s, strlen(s), &out, &info, &err), TT_ELIMIT);
    assert_int_equal(out.len, 0);
    assert_int_equal(dec("0123456789", 10, &out, &info, &err), TT_OK);
    tt_buf_release(&out);
}

/* Decoding a buffer's own contents: no copy for valid UTF-8, the BOM moved
 * out, other encodings decoded into the scratch buffer and exchanged. */
static void test_decode_in_place(void **state)
{
    (void)state;
    tt_buf buf, scratch;
    tt_decode_info info;
    tt_error err;
    tt_buf_init(&buf, 0);
    tt_buf_init(&scratch, 0);
    const char *u = "Net sales \xe2\x80\x94 steady";
    assert_int_equal(tt_buf_puts(&buf, u), TT_OK);
    const char *before = buf.data;
    assert_int_equal(tt_decode_buf(&buf, &scratch, &info, "d", &err), TT_OK);
    assert_ptr_equal(buf.data, before);
    assert_string_equal(buf.data, u);
    assert_int_equal(scratch.len, 0);

    tt_buf_reset(&buf);
    assert_int_equal(tt_buf_puts(&buf, "\xef\xbb\xbfOK"), TT_OK);
    assert_int_equal(tt_decode_buf(&buf, &scratch, &info, "d", &err), TT_OK);
    assert_int_equal(info.encoding, TT_ENC_UTF8_BOM);
    assert_string_equal(buf.data, "OK");
    assert_int_equal(buf.len, 2);

    tt_buf_reset(&buf);
    assert_int_equal(tt_buf_puts(&buf, "caf\xe9"), TT_OK);
    assert_int_equal(tt_decode_buf(&buf, &scratch, &info, "d", &err), TT_OK);
    assert_int_equal(info.encoding, TT_ENC_CP1252);
    assert_string_equal(buf.data, "caf\xc3\xa9");
    assert_string_equal(scratch.data, "caf\xe9");

    /* On failure the buffer is unchanged. */
    tt_buf_reset(&buf);
    assert_int_equal(tt_buf_append(&buf, "ab\0cd", 5), TT_OK);
    assert_int_equal(tt_decode_buf(&buf, &scratch, &info, "d", &err), TT_EBINARY);
    assert_int_equal(buf.len, 5);
    assert_memory_equal(buf.data, "ab\0cd", 5);
    tt_buf_release(&buf);
    tt_buf_release(&scratch);
}

static void *no_malloc(size_t n)
{
    (void)n;
    return NULL;
}
static void *no_realloc(void *p, size_t n)
{
    (void)p;
    (void)n;
    return NULL;
}

/* Out of memory is reported as TT_ENOMEM, for each decoder. */
static void test_out_of_memory(void **state)
{
    (void)state;
    static const char *inputs[] = { "plain", "caf\xc3\xa9 \x92", "\x93quoted\x94",
                                    "\xff\xfe" "A\x00" };
    tt_allocator none = { no_malloc, no_realloc, free };
    for (size_t i = 0; i < sizeof inputs / sizeof inputs[0]; i++) {
        tt_buf out;
        tt_decode_info info;
        tt_error err;
        tt_buf_init(&out, 0);
        tt_set_allocator(&none);
        tt_status st = dec(inputs[i], strlen(inputs[i]) + (i == 3), &out, &info, &err);
        tt_set_allocator(NULL);
        assert_int_equal(st, TT_ENOMEM);
        assert_string_equal(err.file, "doc.txt");
        tt_buf_release(&out);
    }
}

/* Throughput on large inputs: printed, not asserted (machines differ). */
static void test_throughput(void **state)
{
    (void)state;
    size_t n = (size_t)64 << 20;
    char *a = malloc(n);
    assert_non_null(a);
    static const char words[] = "net sales rose on steady demand for coil stock; ";
    for (size_t i = 0; i < n; i++)
        a[i] = words[i % (sizeof words - 1)];
    tt_buf out;
    tt_decode_info info;
    tt_error err;
    tt_buf_init(&out, 0);
    struct timespec t0, t1;
    for (int kind = 0; kind < 3; kind++) {
        if (kind == 1) {
            /* About one non-ASCII character per 48 bytes: é and ’. */
            for (size_t i = 40; i + 3 < n; i += 48) {
                memcpy(a + i, "\xc3\xa9", 2);
                if ((i / 48) % 2)
                    memcpy(a + i + 2, "\xe2\x80\x99", 3);
            }
        } else if (kind == 2) {
            /* The same density of Windows-1252 bytes. */
            for (size_t i = 40; i + 3 < n; i += 48)
                memcpy(a + i, "\xe9\x92x  ", 5);
        }
        /* The first call also faults in the output pages; time the second. */
        assert_int_equal(tt_decode(a, n, &out, &info, "bench", &err), TT_OK);
        clock_gettime(CLOCK_MONOTONIC, &t0);
        assert_int_equal(tt_decode(a, n, &out, &info, "bench", &err), TT_OK);
        clock_gettime(CLOCK_MONOTONIC, &t1);
        double s = (double)(t1.tv_sec - t0.tv_sec) + (double)(t1.tv_nsec - t0.tv_nsec) / 1e9;
        printf("decode throughput (%s, 64 MiB): %.0f MB/s\n",
               kind == 0 ? "ASCII" : kind == 1 ? "UTF-8 mixed" : "windows-1252",
               (double)n / 1e6 / s);
    }
    assert_int_equal(info.encoding, TT_ENC_CP1252);

    /* In place, on valid UTF-8: the validating scan alone. */
    tt_buf in, scratch;
    tt_buf_init(&in, 0);
    tt_buf_init(&scratch, 0);
    for (size_t i = 40; i + 5 < n; i += 48)
        memcpy(a + i, "\xc3\xa9   ", 5);
    assert_int_equal(tt_buf_append(&in, a, n), TT_OK);
    clock_gettime(CLOCK_MONOTONIC, &t0);
    assert_int_equal(tt_decode_buf(&in, &scratch, &info, "bench", &err), TT_OK);
    clock_gettime(CLOCK_MONOTONIC, &t1);
    double s = (double)(t1.tv_sec - t0.tv_sec) + (double)(t1.tv_nsec - t0.tv_nsec) / 1e9;
    printf("decode throughput (UTF-8 in place, 64 MiB): %.0f MB/s\n", (double)n / 1e6 / s);
    assert_int_equal(scratch.len, 0);
    tt_buf_release(&in);
    tt_buf_release(&scratch);
    tt_buf_release(&out);
    free(a);
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_ascii_and_utf8_copied),
        cmocka_unit_test(test_utf8_bom),
        cmocka_unit_test(test_utf16_against_python),
        cmocka_unit_test(test_cp1252_table_against_python),
        cmocka_unit_test(test_cp1252_document),
        cmocka_unit_test(test_utf8_with_stray_bytes),
        cmocka_unit_test(test_rule_boundary),
        cmocka_unit_test(test_maximal_subparts_against_python),
        cmocka_unit_test(test_long_runs_against_python),
        cmocka_unit_test(test_binary),
        cmocka_unit_test(test_output_limit),
        cmocka_unit_test(test_decode_in_place),
        cmocka_unit_test(test_out_of_memory),
        cmocka_unit_test(test_throughput),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
