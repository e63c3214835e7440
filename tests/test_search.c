/* Tests of the search stage (src/watchlist.c, src/search.c, src/sha256.c)
 * and of `termtide search`: watch-list parsing and its problems, whole
 * words, case, near(), phrases split by markup, line breaks, hyphenation and
 * NBSP, offsets and line numbers (checked against the fixture's bytes), the
 * context cut at block edges, PCRE2 limits, a cross-check of hits and
 * offsets against Python's re module run at test time, SHA-256 against FIPS
 * 180-4's examples and Python's hashlib, out-of-memory, and the demo
 * corpus's story (going-concern and lawsuit language in the right
 * periods). */
#include <sys/wait.h>
#include <unistd.h>

#include "tt_test.h"

#define PCRE2_CODE_UNIT_WIDTH 8
#include <pcre2.h>

#include "termtide/alloc.h"
#include "termtide/document.h"
#include "termtide/search.h"
#include "termtide/sha256.h"
#include "termtide/simd.h"

#define FIX "tests/fixtures/search/"

/* ---- helpers -------------------------------------------------------------- */

static tt_watchlist *parse_ok(const char *text, const tt_search_options *o)
{
    tt_watchlist *wl = tt_watchlist_new(o);
    assert_non_null(wl);
    tt_error err;
    tt_error_init(&err);
    tt_status st = tt_watchlist_parse(wl, text, strlen(text), "wl.tsv", &err);
    if (st)
        fail_msg("watch-list: %s (line %ld)", err.message, err.line);
    return wl;
}

typedef struct search_ctx {
    tt_searcher *s;
    tt_search_result *res;
    size_t docs;
} search_ctx;

static tt_status on_doc(void *vctx, const tt_document *doc)
{
    search_ctx *c = vctx;
    tt_error err;
    tt_error_init(&err);
    if (c->docs++)
        return TT_OK; /* the first document only */
    return tt_searcher_run(c->s, doc, c->res, &err);
}

/* Searches the first document of a file; res must be initialised. */
static void search_file(const tt_watchlist *wl, const char *path, tt_search_result *res)
{
    search_ctx c = { tt_searcher_new(wl), res, 0 };
    assert_non_null(c.s);
    tt_error err;
    tt_error_init(&err);
    assert_int_equal(tt_read_documents(path, NULL, on_doc, &c, NULL, &err), TT_OK);
    assert_int_equal(c.docs, 1);
    tt_searcher_free(c.s);
}

static char *write_temp(const char *text, size_t len, const char *suffix)
{
    char *path = malloc(256);
    snprintf(path, 256, TT_TEST_TMP "tt_search_XXXXXX%s", suffix);
    int fd = mkstemps(path, (int)strlen(suffix));
    assert_true(fd >= 0);
    assert_int_equal(write(fd, text, len), (ssize_t)len);
    close(fd);
    return path;
}

/* Searches a text given in memory (written to a temporary file). */
static void search_text(const tt_watchlist *wl, const char *text, const char *suffix,
                        tt_search_result *res)
{
    char *path = write_temp(text, strlen(text), suffix);
    search_file(wl, path, res);
    unlink(path);
    free(path);
}

static int hit_is(const tt_search_result *r, size_t h, const char *match)
{
    const tt_search_hit *hit = &r->hits[h];
    return hit->match_len == strlen(match) &&
           !memcmp(r->text.data + hit->text + hit->before_len, match, hit->match_len);
}

/* Runs a shell command, returns its standard output and exit status. */
static char *run(const char *cmd, int *status)
{
    FILE *p = popen(cmd, "r");
    assert_non_null(p);
    size_t cap = 1 << 16, n = 0;
    char *out = malloc(cap);
    size_t k;
    while ((k = fread(out + n, 1, cap - n - 1, p)) > 0) {
        n += k;
        if (n + 1 == cap)
            out = realloc(out, cap *= 2);
    }
    out[n] = '\0';
    int st = pclose(p);
    if (status)
        *status = WIFEXITED(st) ? WEXITSTATUS(st) : -1;
    return out;
}

/* ---- SHA-256 ---------------------------------------------------------------- */

/* FIPS 180-4 examples (NIST, "SHA256.pdf" in the Cryptographic Standards
 * and Guidelines examples): one block "abc" and the two-block 448-bit
 * message. */
static void test_sha256_fips_examples(void **state)
{
    (void)state;
    /* the CPU's SHA instructions (when present), then the portable code */
    for (int accel = 1; accel >= 0; accel--) {
        tt_sha256_accelerated(accel);
        char hex[65];
        tt_sha256_hex("abc", 3, hex);
        assert_string_equal(hex,
                            "ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad");
        const char *m448 = "abcdbcdecdefdefgefghfghighijhijkijkljklmklmnlmnomnopnopq";
        tt_sha256_hex(m448, strlen(m448), hex);
        assert_string_equal(hex,
                            "248d6a61d20638b8e5c026930c3e6039a33ce45964ff2167f6ecedd419db06c1");
    }
    tt_sha256_accelerated(1);
}

/* Every length from 0 to 300 bytes (each padding case, one to six
 * blocks), fed whole and in uneven pieces, against Python's hashlib. */
static void test_sha256_against_hashlib(void **state)
{
    (void)state;
    char cmd[512];
    snprintf(cmd, sizeof cmd,
             "%s -c \"import hashlib\nfor n in range(301): "
             "print(hashlib.sha256(bytes((i*7+3)%%256 for i in range(n))).hexdigest())\"",
             tt_test_python());
    char *want = run(cmd, NULL);
    unsigned char data[300];
    for (int i = 0; i < 300; i++)
        data[i] = (unsigned char)((i * 7 + 3) % 256);
    for (int accel = 1; accel >= 0; accel--) {
        tt_sha256_accelerated(accel);
        const char *line = want;
        for (size_t n = 0; n <= 300; n++) {
            char hex[65];
            tt_sha256_hex(data, n, hex);
            assert_memory_equal(hex, line, 64);
            /* in pieces of 1, 2, 3, ... bytes */
            tt_sha256 h;
            tt_sha256_init(&h);
            for (size_t off = 0, step = 1; off < n; off += step, step++)
                tt_sha256_update(&h, data + off, off + step <= n ? step : n - off);
            unsigned char d[32];
            tt_sha256_final(&h, d);
            char hex2[65];
            for (int i = 0; i < 32; i++)
                snprintf(hex2 + 2 * i, 3, "%02x", d[i]);
            assert_memory_equal(hex2, line, 64);
            line = strchr(line, '\n') + 1;
        }
    }
    tt_sha256_accelerated(1);
    free(want);
    /* a file, against hashlib on the same file */
    snprintf(cmd, sizeof cmd,
             "%s -c \"import hashlib;print(hashlib.sha256(open('%sphrases.htm','rb').read())"
             ".hexdigest())\"",
             tt_test_python(), FIX);
    want = run(cmd, NULL);
    char hex[65];
    tt_error err;
    tt_error_init(&err);
    assert_int_equal(tt_sha256_file(FIX "phrases.htm", hex, &err), TT_OK);
    assert_memory_equal(hex, want, 64);
    free(want);
    assert_int_equal(tt_sha256_file(FIX "no-such-file", hex, &err), TT_ENOENT);
    assert_string_equal(err.file, FIX "no-such-file");
}

/* The reader hashes the bytes as it reads them (tt_read_options.sha256):
 * a plain file and a gzip file of two members (hashed compressed, as stored)
 * against Python's hashlib over the same files; a file that cannot be read
 * has no hash. */
static tt_status count_docs(void *ctx, const tt_document *doc)
{
    (void)doc;
    ++*(int *)ctx;
    return TT_OK;
}

static void test_sha256_while_reading(void **state)
{
    (void)state;
    char gz[] = TT_TEST_TMP "tt-search-hash-XXXXXX";
    int fd = mkstemp(gz);
    assert_true(fd >= 0);
    close(fd);
    char cmd[1024];
    snprintf(cmd, sizeof cmd,
             "%s -c \"import gzip,hashlib;d=open('%sphrases.htm','rb').read();"
             "b=gzip.compress(d[:300])+gzip.compress(d[300:]);open('%s','wb').write(b);"
             "print(hashlib.sha256(d).hexdigest());print(hashlib.sha256(b).hexdigest())\"",
             tt_test_python(), FIX, gz);
    char *want = run(cmd, NULL);
    assert_true(strlen(want) >= 130);
    tt_reader *r = tt_reader_new();
    assert_non_null(r);
    tt_read_options ro;
    memset(&ro, 0, sizeof ro);
    ro.sha256 = 1;
    tt_error err;
    tt_error_init(&err);
    const char *paths[2] = { FIX "phrases.htm", gz };
    for (int k = 0; k < 2; k++) {
        int docs = 0;
        assert_int_equal(tt_reader_read(r, paths[k], &ro, count_docs, &docs, NULL, &err), TT_OK);
        assert_int_equal(docs, 1);
        assert_memory_equal(tt_reader_sha256(r), want + 65 * k, 64);
        assert_int_equal(strlen(tt_reader_sha256(r)), 64);
    }
    assert_int_equal(tt_reader_read(r, FIX "no-such-file", &ro, count_docs, NULL, NULL, &err),
                     TT_ENOENT);
    assert_string_equal(tt_reader_sha256(r), "");
    ro.sha256 = 0; /* not asked: no hash */
    int docs = 0;
    assert_int_equal(tt_reader_read(r, paths[0], &ro, count_docs, &docs, NULL, &err), TT_OK);
    assert_string_equal(tt_reader_sha256(r), "");
    tt_reader_free(r);
    free(want);
    unlink(gz);
}

/* A watch-list of the patterns as rules r0, r1, ... with no context. */
static tt_watchlist *watchlist_of(const char *const *pats, size_t np)
{
    tt_buf text;
    tt_buf_init(&text, 0);
    for (size_t i = 0; i < np; i++)
        tt_buf_printf(&text, "r%zu\t%s\n", i, pats[i]);
    tt_search_options o;
    tt_search_options_init(&o);
    o.context = 0;
    tt_watchlist *wl = parse_ok(text.data, &o);
    tt_buf_release(&text);
    return wl;
}

/* Python's re (the reference: /usr/bin/python3's standard library) run over
 * the file at path with the patterns, caseless: one line per match, sorted,
 * "byte offset<TAB>rule", and with full = 1 also "<TAB>line<TAB>the match
 * with its white space collapsed". The caller frees the result. */
static char *python_re_hits(const char *const *pats, size_t np, const char *path, int full)
{
    char script[] = TT_TEST_TMP "tt_search_py_XXXXXX";
    int fd = mkstemp(script);
    assert_true(fd >= 0);
    FILE *f = fdopen(fd, "w");
    fprintf(f, "import re\npats = [");
    for (size_t i = 0; i < np; i++)
        fprintf(f, "r'%s', ", pats[i]);
    fprintf(f, "]\n"
               "t = open('%s', encoding='utf-8').read()\n"
               "rows = []\n"
               "for k, p in enumerate(pats):\n"
               "    for m in re.finditer(p, t, re.IGNORECASE):\n"
               "        off = len(t[:m.start()].encode('utf-8'))\n"
               "        if %d:\n"
               "            rows.append((off, k, t.count('\\n', 0, m.start()) + 1,\n"
               "                         ' '.join(m.group().split())))\n"
               "        else:\n"
               "            rows.append((off, k))\n"
               "for row in sorted(rows):\n"
               "    print('\\t'.join(str(x) for x in row))\n",
            path, full);
    fclose(f);
    char cmd[512];
    snprintf(cmd, sizeof cmd, "%s %s", tt_test_python(), script);
    char *want = run(cmd, NULL);
    unlink(script);
    return want;
}

/* ---- watch-list parsing ------------------------------------------------------- */

static void test_watchlist_parse(void **state)
{
    (void)state;
    /* BOM, CRLF, comments, blank lines, notes, a near() rule */
    const char *text = "\xEF\xBB\xBF# a comment\r\n"
                       "\r\n"
                       "going-concern\tgoing\\s+concern\tthe phrase\r\n"
                       "  # an indented comment\r\n"
                       "weakness\tmaterial weakness\r\n"
                       "doubt\tnear(substantial doubt, going\\s+concern, 12)\tproximity\r\n"
                       "counted\t\\d{1,3}(?:,\\d{3})+\r\n";
    tt_watchlist *wl = parse_ok(text, NULL);
    assert_int_equal(tt_watchlist_size(wl), 4);
    const tt_rule *r = tt_watchlist_rule(wl, 0);
    assert_string_equal(r->name, "going-concern");
    assert_string_equal(r->pattern, "going\\s+concern");
    assert_string_equal(r->note, "the phrase");
    assert_int_equal(r->line, 3);
    assert_int_equal(r->kind, TT_RULE_PATTERN);
    r = tt_watchlist_rule(wl, 1);
    assert_string_equal(r->note, "");
    assert_int_equal(r->line, 5);
    r = tt_watchlist_rule(wl, 2);
    assert_int_equal(r->kind, TT_RULE_NEAR);
    assert_int_equal(r->near_words, 12);
    assert_string_equal(tt_watchlist_rule(wl, 3)->pattern, "\\d{1,3}(?:,\\d{3})+");
    /* the SHA-256 is that of the bytes parsed (Python's hashlib agrees with
     * tt_sha256_hex, tested above) */
    char hex[65];
    tt_sha256_hex(text, strlen(text), hex);
    assert_string_equal(tt_watchlist_sha256(wl), hex);
    tt_watchlist_free(wl);
}

static void expect_problems(const char *text, size_t n, const long *lines, const char **needles)
{
    tt_watchlist *wl = tt_watchlist_new(NULL);
    tt_error err;
    tt_error_init(&err);
    assert_int_equal(tt_watchlist_parse(wl, text, strlen(text), "bad.tsv", &err), TT_EPARSE);
    assert_string_equal(err.file, "bad.tsv");
    if (tt_watchlist_problem_count(wl) != n) {
        for (size_t i = 0; i < tt_watchlist_problem_count(wl); i++)
            print_error("problem: line %ld: %s\n", tt_watchlist_problem(wl, i)->line,
                        tt_watchlist_problem(wl, i)->message);
        fail_msg("expected %zu problems", n);
    }
    for (size_t i = 0; i < n; i++) {
        const tt_error *e = tt_watchlist_problem(wl, i);
        assert_int_equal(e->line, lines[i]);
        if (!strstr(e->message, needles[i]))
            fail_msg("line %ld: '%s' lacks '%s'", e->line, e->message, needles[i]);
    }
    tt_watchlist_free(wl);
}

static void test_watchlist_problems(void **state)
{
    (void)state;
    /* every problem at once, each with its line; a PCRE2 compile error with
     * its byte offset in the pattern field ("abc(def": missing ')' found at
     * the end, offset 7; in near(), B's error offset counts from the start
     * of the field: "near(ok, a)b, 3)" has B at 9, its error at 9 + 1) */
    const char *text = "good\tfine\n"
                       "paren\tabc(def\n"
                       "notab only a name\n"
                       "\tno name\n"
                       "good\tduplicate name\n"
                       "nopat\t\n"
                       "four\ta\tb\tc\n"
                       "nearbad\tnear(x, y)\n"
                       "nearn\tnear(x, y, 500)\n"
                       "nearb\tnear(ok, a)b, 3)\n"
                       "bad-utf8\tcaf\xE9\n"
                       "ctrl\ta\x01" "b\n";
    const long lines[] = { 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12 };
    const char *needles[] = { "offset 7", "no tab", "no name", "used twice (first on line 1)",
                              "no pattern", "more than three", "three arguments",
                              "N must be", "offset 10", "invalid UTF-8", "control character" };
    expect_problems(text, 11, lines, needles);

    /* empty, and comments only */
    const long l0[] = { 0 };
    const char *n0[] = { "no rule" };
    expect_problems("", 1, l0, n0);
    expect_problems("# only a comment\r\n\r\n", 1, l0, n0);

    /* a rule added directly (-e) */
    tt_watchlist *wl = tt_watchlist_new(NULL);
    tt_error err;
    tt_error_init(&err);
    assert_int_equal(tt_watchlist_add(wl, "e1", "a(?<=b+)c(", "", &err), TT_EPARSE);
    assert_true(strstr(err.message, "pattern error at offset") != NULL);
    tt_watchlist_free(wl);
    /* \C would match half a UTF-8 character (found by fuzz/fuzz_watchlist.c) */
    wl = tt_watchlist_new(NULL);
    assert_int_equal(tt_watchlist_add(wl, "e1", "c(\\C", "", &err), TT_EPARSE);
    assert_true(strstr(err.message, "offset 4") != NULL);
    tt_watchlist_free(wl);
}

/* ---- matching ------------------------------------------------------------------ */

static void test_words_and_case(void **state)
{
    (void)state;
    const char *doc = "Losses grew; the gross loss was glossy. LOSS, loss-making and loss.\n";
    tt_search_result r;
    tt_search_result_init(&r);
    tt_watchlist *wl = parse_ok("loss\tloss\n", NULL);
    search_text(wl, doc, ".txt", &r);
    /* Losses, loss, glossy, LOSS, loss-making, loss */
    assert_int_equal(r.counts[0], 6);
    tt_watchlist_free(wl);

    tt_search_options o;
    tt_search_options_init(&o);
    o.whole_words = 1;
    wl = parse_ok("loss\tloss\nmoney\t\\$5\n", &o);
    search_text(wl, doc, ".txt", &r);
    /* whole words: "loss", "LOSS", "loss" of loss-making ('-' is no word
     * character), "loss" */
    assert_int_equal(r.counts[0], 4);
    assert_true(hit_is(&r, 0, "loss"));
    assert_true(hit_is(&r, 1, "LOSS"));
    tt_watchlist_free(wl);

    o.case_sensitive = 1;
    wl = parse_ok("loss\tloss\nmoney\t\\$5\n", &o);
    search_text(wl, "Fees of $5 and $50 and x$5; LOSS and loss.\n", ".txt", &r);
    assert_int_equal(r.counts[0], 1); /* case: only "loss" */
    /* a pattern starting with a non-word character works as a whole word:
     * "$5" but not "$50" nor "x$5" */
    assert_int_equal(r.counts[1], 1);
    tt_watchlist_free(wl);
    tt_search_result_release(&r);
}

/* near(A, B, N): at most N words between, within one sentence. */
static void test_near(void **state)
{
    (void)state;
    tt_search_result r;
    tt_search_result_init(&r);
    tt_watchlist *wl = parse_ok("n3\tnear(doubt, concern, 3)\n", NULL);
    search_text(wl, "Doubt about our going concern.\n", ".txt", &r); /* 3 between */
    assert_int_equal(r.counts[0], 1);
    assert_true(hit_is(&r, 0, "Doubt about our going concern"));
    search_text(wl, "Doubt about all our going concern.\n", ".txt", &r); /* 4 between */
    assert_int_equal(r.counts[0], 0);
    search_text(wl, "The concern, doubt.\n", ".txt", &r); /* B before A */
    assert_int_equal(r.counts[0], 1);
    assert_true(hit_is(&r, 0, "concern, doubt"));
    search_text(wl, "No doubt. Concern grew.\n", ".txt", &r); /* across a sentence end */
    assert_int_equal(r.counts[0], 0);
    search_text(wl, "No doubt\n\nconcern grew.\n", ".txt", &r); /* across blocks */
    assert_int_equal(r.counts[0], 0);
    /* two A matches, each with its nearest B */
    search_text(wl, "doubt x concern y y y y y doubt concern.\n", ".txt", &r);
    assert_int_equal(r.counts[0], 2);
    assert_true(hit_is(&r, 0, "doubt x concern"));
    assert_true(hit_is(&r, 1, "doubt concern"));
    tt_watchlist_free(wl);
    /* commas inside a pattern's braces or class do not split it */
    wl = parse_ok("money\tnear(\\d{1,3}(?:,\\d{3})+, [,;]?\\s*dollars?, 0)\n", NULL);
    assert_int_equal(tt_watchlist_size(wl), 1);
    search_text(wl, "It cost 1,200 dollars.\n", ".txt", &r);
    assert_int_equal(r.counts[0], 1);
    tt_watchlist_free(wl);
    tt_search_result_release(&r);
}

/* The one-pass scan (the prefilter alternation, then each rule anchored
 * where it matches) gives every rule exactly the hits it gets when it is
 * the only rule (then no prefilter is used): overlapping rules, a
 * lookbehind, a rule matching empty strings, a back-reference (outside the
 * alternation), a near() rule. */
static void test_scan_equals_alone(void **state)
{
    (void)state;
    static const char *rules[] = { "going\\s+concern", "concern", "go\\w+", "(?<=going )concern",
                                   "\\bc", "ern\\b", "x*", "(o)\\1", "near(doubt, concern, 6)",
                                   "\\d+(?:,\\d{3})*", "the" };
    size_t nr = sizeof rules / sizeof rules[0];
    static const char *files[] = { FIX "crosscheck.txt", FIX "phrases.htm", FIX "crlf.txt" };
    tt_buf all;
    tt_buf_init(&all, 0);
    for (size_t i = 0; i < nr; i++)
        tt_buf_printf(&all, "r%zu\t%s\n", i, rules[i]);
    tt_watchlist *wl = parse_ok(all.data, NULL);
    for (size_t f = 0; f < 3; f++) {
        tt_search_result r;
        tt_search_result_init(&r);
        search_file(wl, files[f], &r);
        for (size_t i = 0; i < nr; i++) {
            char one[256];
            snprintf(one, sizeof one, "r%zu\t%s\n", i, rules[i]);
            tt_watchlist *w1 = parse_ok(one, NULL);
            tt_search_result r1;
            tt_search_result_init(&r1);
            search_file(w1, files[f], &r1);
            assert_int_equal(r.counts[i], r1.counts[0]);
            size_t k = 0;
            for (size_t h = 0; h < r.n_hits; h++) {
                if (r.hits[h].rule != i)
                    continue;
                assert_true(k < r1.n_hits);
                assert_int_equal(r.hits[h].offset, r1.hits[k].offset);
                assert_int_equal(r.hits[h].match_len, r1.hits[k].match_len);
                k++;
            }
            assert_int_equal(k, r1.n_hits);
            tt_search_result_release(&r1);
            tt_watchlist_free(w1);
        }
        assert_true(r.n_hits > 10);
        tt_search_result_release(&r);
    }
    tt_watchlist_free(wl);
    tt_buf_release(&all);
}

/* Rules ra and rb of r hit the same places, in the same order. */
static void assert_same_hits(const tt_search_result *r, size_t ra, size_t rb)
{
    size_t a = 0, b = 0;
    for (;;) {
        while (a < r->n_hits && r->hits[a].rule != ra)
            a++;
        while (b < r->n_hits && r->hits[b].rule != rb)
            b++;
        if (a == r->n_hits || b == r->n_hits)
            break;
        assert_int_equal(r->hits[a].offset, r->hits[b].offset);
        assert_int_equal(r->hits[a].match_len, r->hits[b].match_len);
        a++;
        b++;
    }
    assert_true(a == r->n_hits && b == r->n_hits);
}

/* Rules that start with a known character run once over a document's whole
 * text (blocks and separators); their hits equal those of the same pattern
 * behind a lookahead, (?=[\s\S])(?:P), which means the same but is run
 * block by block. The patterns reach over block ends (greedy white space,
 * \s+ between words at a block's end), so the fall-back to the block alone
 * is exercised. */
static void test_whole_text_equals_per_block(void **state)
{
    (void)state;
    static const char *pats[] = { "going\\s+concern", "e\\s*", "n\\s+\\w+", "t[\\s\\S]{0,3}",
                                  "concern", "a\\w*", "o", "y\\W+\\w", "d\\s*$\\s*x",
                                  "o[\\s\\S]*" };
    size_t np = sizeof pats / sizeof pats[0];
    tt_buf wl_text;
    tt_buf_init(&wl_text, 0);
    for (size_t i = 0; i < np; i++) {
        tt_buf_printf(&wl_text, "w%zu\t%s\n", i, pats[i]);
        tt_buf_printf(&wl_text, "b%zu\t(?=[\\s\\S])(?:%s)\n", i, pats[i]);
    }
    tt_watchlist *wl = parse_ok(wl_text.data, NULL);
    const char *synthetic = "The going\n\nconcern. Yes, a year\n\nagain and then\n\n"
                            "n\n\nx going concern\n\ny\n\nod\n\nxd\n\nxt\n\nt a\n";
    static const char *files[] = { FIX "crosscheck.txt", FIX "phrases.htm", FIX "crlf.txt", NULL };
    for (size_t f = 0; f < 4; f++) {
        tt_search_result r;
        tt_search_result_init(&r);
        if (files[f])
            search_file(wl, files[f], &r);
        else
            search_text(wl, synthetic, ".txt", &r);
        for (size_t i = 0; i < np; i++) {
            assert_int_equal(r.counts[2 * i], r.counts[2 * i + 1]);
            assert_same_hits(&r, 2 * i, 2 * i + 1);
        }
        tt_search_result_release(&r);
    }
    tt_watchlist_free(wl);
    tt_buf_release(&wl_text);
}

/* The whole-text path as before the pair scan took most phrase rules:
 * each pattern of test_whole_text_equals_per_block with its lookahead
 * twin in a watch-list of their own, where it is the only rule whose start
 * the pair scan reads, so it runs over the whole text. */
static void test_whole_text_alone_equals_per_block(void **state)
{
    (void)state;
    static const char *pats[] = { "going\\s+concern", "e\\s*", "n\\s+\\w+", "t[\\s\\S]{0,3}",
                                  "concern", "a\\w*", "o", "y\\W+\\w", "d\\s*$\\s*x",
                                  "o[\\s\\S]*" };
    const char *synthetic = "The going\n\nconcern. Yes, a year\n\nagain and then\n\n"
                            "n\n\nx going concern\n\ny\n\nod\n\nxd\n\nxt\n\nt a\n";
    for (size_t i = 0; i < sizeof pats / sizeof pats[0]; i++) {
        char text[256];
        snprintf(text, sizeof text, "w\t%s\nb\t(?=[\\s\\S])(?:%s)\n", pats[i], pats[i]);
        tt_watchlist *wl = parse_ok(text, NULL);
        for (size_t f = 0; f < 2; f++) {
            tt_search_result r;
            tt_search_result_init(&r);
            if (f)
                search_text(wl, synthetic, ".txt", &r);
            else
                search_file(wl, FIX "crosscheck.txt", &r);
            assert_int_equal(r.counts[0], r.counts[1]);
            assert_same_hits(&r, 0, 1);
            tt_search_result_release(&r);
        }
        tt_watchlist_free(wl);
    }
}

/* ---- the pair scan ------------------------------------------------------------ */

/* The ways the pair scan can run, in order: the portable code (tt_simd(0)),
 * then SSE2, SSSE3 and AVX2 where the build and the CPU have them (the
 * first look with eight keys, then the nibble-table first look 16 and 32
 * positions at a time). Switches to way i and returns 1, or returns 0 when
 * this build or CPU lacks it; simd_restore goes back to the default. */
static const char *const simd_names[] = { "portable", "SSE2", "SSSE3", "AVX2" };
#define SIMD_WAYS 4

static int simd_way(int i)
{
    if (i == 0)
        return tt_simd(0) == 0;
    if (!tt_simd(1))
        return 0;
    return tt_simd_level(i) == i;
}

static void simd_restore(void)
{
    tt_simd(1);
    tt_simd_level(TT_SIMD_AVX2);
}

/* Appends code point cp as UTF-8. */
static void put_utf8(tt_buf *b, uint32_t cp)
{
    char u[4];
    size_t n;
    if (cp < 0x80) {
        u[0] = (char)cp;
        n = 1;
    } else if (cp < 0x800) {
        u[0] = (char)(0xC0 | cp >> 6);
        u[1] = (char)(0x80 | (cp & 0x3F));
        n = 2;
    } else if (cp < 0x10000) {
        u[0] = (char)(0xE0 | cp >> 12);
        u[1] = (char)(0x80 | (cp >> 6 & 0x3F));
        u[2] = (char)(0x80 | (cp & 0x3F));
        n = 3;
    } else {
        u[0] = (char)(0xF0 | cp >> 18);
        u[1] = (char)(0x80 | (cp >> 12 & 0x3F));
        u[2] = (char)(0x80 | (cp >> 6 & 0x3F));
        u[3] = (char)(0x80 | (cp & 0x3F));
        n = 4;
    }
    assert_int_equal(tt_buf_append(b, u, n), TT_OK);
}

/* Every code point from `from` on, once each (no surrogates). */
static void all_code_points(tt_buf *b, uint32_t from)
{
    for (uint32_t cp = from; cp <= 0x10FFFF; cp++)
        if (cp < 0xD800 || cp > 0xDFFF)
            put_utf8(b, cp);
}

/* The code point starting at s. */
static uint32_t utf8_at(const unsigned char *s)
{
    if (s[0] < 0x80)
        return s[0];
    if (s[0] < 0xE0)
        return (uint32_t)(s[0] & 0x1F) << 6 | (s[1] & 0x3F);
    if (s[0] < 0xF0)
        return (uint32_t)(s[0] & 0x0F) << 12 | (uint32_t)(s[1] & 0x3F) << 6 | (s[2] & 0x3F);
    return (uint32_t)(s[0] & 0x07) << 18 | (uint32_t)(s[1] & 0x3F) << 12 |
           (uint32_t)(s[2] & 0x3F) << 6 | (s[3] & 0x3F);
}

/* The facts the pair scan's reading of a rule's start rests on (watchlist.c,
 * fill_pair_sets), checked against PCRE2 itself (the library the rules run
 * on, with the options rules are compiled with) over every character: under
 * caseless UTF matching, with or without UCP, a printable ASCII character
 * matches no character above ASCII but k and K U+212A KELVIN SIGN and s and
 * S U+017F LATIN SMALL LETTER LONG S, and among ASCII only itself and its
 * other case; the characters \s matches under UCP are ASCII TAB to CR, 0x1C
 * to 0x1F or space, or start with byte C2, E1, E2 or E3. */
static void test_pair_sets_against_pcre2(void **state)
{
    (void)state;
    tt_buf subject;
    tt_buf_init(&subject, 0);
    all_code_points(&subject, 1);
    PCRE2_SPTR subj = (PCRE2_SPTR)subject.data;
    pcre2_match_data *md = pcre2_match_data_create(1, NULL);
    for (int ucp = 0; ucp < 2; ucp++)
        for (unsigned c = 0x21; c < 0x7F; c++) {
            char pat[3] = { '\\', (char)c, '\0' };
            int plain = (c | 0x20) >= 'a' && (c | 0x20) <= 'z';
            if (plain || (c >= '0' && c <= '9')) { /* a backslash would make an escape */
                pat[0] = (char)c;
                pat[1] = '\0';
            }
            int err;
            PCRE2_SIZE off;
            pcre2_code *code = pcre2_compile((PCRE2_SPTR)pat, PCRE2_ZERO_TERMINATED,
                                             PCRE2_UTF | PCRE2_CASELESS | (ucp ? PCRE2_UCP : 0),
                                             &err, &off, NULL);
            assert_non_null(code);
            pcre2_jit_compile(code, PCRE2_JIT_COMPLETE);
            PCRE2_SIZE pos = 0;
            size_t found = 0;
            while (pcre2_match(code, subj, subject.len, pos, PCRE2_NO_UTF_CHECK, md, NULL) >= 0) {
                PCRE2_SIZE *ov = pcre2_get_ovector_pointer(md);
                uint32_t cp = utf8_at(subj + ov[0]);
                found++;
                if (cp < 0x80)
                    assert_true(cp == c || (plain && cp == (c ^ 0x20)));
                else if ((c | 0x20) == 'k' && plain)
                    assert_int_equal(cp, 0x212A);
                else if ((c | 0x20) == 's' && plain)
                    assert_int_equal(cp, 0x17F);
                else
                    fail_msg("'%c' matches U+%04X caselessly", c, cp);
                pos = ov[1];
            }
            /* itself, its other case, and for k and s one more */
            assert_int_equal(found, (plain ? 2 : 1) + ((c | 0x20) == 'k' || (c | 0x20) == 's'));
            pcre2_code_free(code);
        }
    int err;
    PCRE2_SIZE off;
    pcre2_code *space = pcre2_compile((PCRE2_SPTR) "\\s", PCRE2_ZERO_TERMINATED,
                                      PCRE2_UTF | PCRE2_UCP | PCRE2_CASELESS, &err, &off, NULL);
    assert_non_null(space);
    pcre2_jit_compile(space, PCRE2_JIT_COMPLETE);
    PCRE2_SIZE pos = 0;
    size_t found = 0;
    while (pcre2_match(space, subj, subject.len, pos, PCRE2_NO_UTF_CHECK, md, NULL) >= 0) {
        PCRE2_SIZE *ov = pcre2_get_ovector_pointer(md);
        unsigned char lead = subj[ov[0]];
        if (lead < 0x80)
            assert_true((lead >= 0x09 && lead <= 0x0D) || (lead >= 0x1C && lead <= 0x20));
        else
            assert_true(lead == 0xC2 || lead == 0xE1 || lead == 0xE2 || lead == 0xE3);
        found++;
        pos = ov[1];
    }
    assert_true(found >= 20);
    pcre2_code_free(space);
    pcre2_match_data_free(md);
    tt_buf_release(&subject);
}

/* Searches text with all the rules in one watch-list and with each rule
 * alone; every rule must get the same hits (offset and length). Returns
 * the hits of the whole list. */
static size_t check_equals_alone(const char *const *rules, size_t nr, const char *text,
                                 const tt_search_options *o)
{
    tt_buf all;
    tt_buf_init(&all, 0);
    for (size_t i = 0; i < nr; i++)
        tt_buf_printf(&all, "r%zu\t%s\n", i, rules[i]);
    tt_watchlist *wl = parse_ok(all.data, o);
    tt_search_result r;
    tt_search_result_init(&r);
    search_text(wl, text, ".txt", &r);
    for (size_t i = 0; i < nr; i++) {
        char one[256];
        snprintf(one, sizeof one, "r%zu\t%s\n", i, rules[i]);
        tt_watchlist *w1 = parse_ok(one, o);
        tt_search_result r1;
        tt_search_result_init(&r1);
        search_text(w1, text, ".txt", &r1);
        if (r.counts[i] != r1.counts[0])
            fail_msg("rule %s: %zu hits among all, %zu alone", rules[i], r.counts[i],
                     r1.counts[0]);
        size_t k = 0;
        for (size_t h = 0; h < r.n_hits; h++) {
            if (r.hits[h].rule != i)
                continue;
            assert_true(k < r1.n_hits);
            if (r.hits[h].offset != r1.hits[k].offset ||
                r.hits[h].match_len != r1.hits[k].match_len)
                fail_msg("rule %s: hit %zu at %lld+%zu among all, %lld+%zu alone", rules[i], k,
                         r.hits[h].offset, r.hits[h].match_len, r1.hits[k].offset,
                         r1.hits[k].match_len);
            k++;
        }
        assert_int_equal(k, r1.n_hits);
        tt_search_result_release(&r1);
        tt_watchlist_free(w1);
    }
    size_t n = r.n_hits;
    tt_search_result_release(&r);
    tt_watchlist_free(wl);
    tt_buf_release(&all);
    return n;
}

/* 70 two-word phrase rules (more than one 64-bit word of rules): the
 * pattern strings in store, pointers to them in many. */
static void seventy_rules(char store[70][32], const char *many[70])
{
    static const char *firsts[] = { "the", "a", "is", "ok", "th", "and", "q" };
    static const char *seconds[] = { "are", "and", "then", "the", "a", "is", "end", "th", "k",
                                     "q" };
    for (size_t i = 0; i < 70; i++) {
        snprintf(store[i], 32, "%s\\s+%s", firsts[i % 7], seconds[i / 7]);
        many[i] = store[i];
    }
}

/* Rules whose start the pair scan reads (watchlist.c, start_steps) give
 * exactly the hits each gets alone (then it runs on its own, over the
 * whole text or per block), caseless, with --case and with --words: rules
 * sharing a prefix and overlapping each other, one overlapping its own
 * matches, caseless k and s against U+212A and U+017F, every character
 * PCRE2's \s matches under UCP inside a phrase, white-space runs broken by
 * a character above ASCII, \b-led rules, \s-led rules, matches at the very
 * last byte of a block (and of the text), and rules the reading refuses or
 * stops early on (a group, a class, an alternative at the top level, also
 * behind quoting or a comment, a verb, an optional character, a dot). Run
 * with few first bytes (the SIMD first look), with many, and with more
 * than 64 rules. */
static void test_pair_scan_equals_alone(void **state)
{
    (void)state;
    static const char *rules[] = {
        "the\\s+are", "the\\s+a", "the", "th", "he\\s+a", "ok\\s+then", "is\\s+and", "ask",
        "\\bis\\b", "\\bthe\\s+end\\b", "s\\b", "q", "xq", "aa", "a\\s+\\s+b", "\\s+and",
        "a\\s\\S", "k+s", "(?:the)\\s+are", "the|q", "x\\Q|\\E", "th?e", "[Tt]he\\s+are",
        "the.are", "t\\w+", "K\\s+then", "S\\s*and", "\\$5", "a\\+b", "o\\s+?then",
        "ok{0,2}\\s+then", "a\\Q[\\E|the", "a(?#[)|the", "a(*COMMIT)nd", "ask\\s"
    };
    static const char *few[] = { "the\\s+are", "the", "a\\s+and", "aa", "q", "th",
                                 "t\\s+q", "a\\b", "\\s+and", "k\\s+then" };
    /* as many first letters as the SIMD first look takes */
    static const char *eight[] = { "the\\s+are", "of\\s+the", "and\\s+a", "was\\s+the",
                                   "for\\s+a", "is\\s+and", "ok\\s+then", "q", "xq" };
    tt_buf text;
    tt_buf_init(&text, 0);
    tt_buf_puts(&text, "xq wxq The are then the  are. tHe\xE2\x80\x83" "are the\xE3\x80\x80\xE3\x80\x80"
                       "are the \xE2\x80\x83 are\n\n"
                       "O\xE2\x84\xAA then ok then oK\xE2\x80\x89then i\xC5\xBF and I\xC5\xBF"
                       "\xC2\xA0" "and Is and a\xE2\x84\xAA" "sk \xC5\xBF" "and\n\n"
                       "aaaaa is this is. xq a+b $5 $50\n\nq\n\nxxq\n\nt q\n\n"
                       "the end theend a  b a \xE2\x80\x83" "b and\xE3\x80\x80" "and "
                       "k\xE2\x84\xAAss o   then o\xE2\x80\x83then as\xE2\x84\xAA then\n\n");
    /* every White_Space character (by PCRE2's \s under UCP) inside a phrase */
    tt_buf cps;
    tt_buf_init(&cps, 0);
    all_code_points(&cps, 0x80);
    int err;
    PCRE2_SIZE off;
    pcre2_code *space = pcre2_compile((PCRE2_SPTR) "\\s", PCRE2_ZERO_TERMINATED,
                                      PCRE2_UTF | PCRE2_UCP, &err, &off, NULL);
    assert_non_null(space);
    pcre2_match_data *md = pcre2_match_data_create(1, NULL);
    PCRE2_SIZE pos = 0;
    while (pcre2_match(space, (PCRE2_SPTR)cps.data, cps.len, pos, PCRE2_NO_UTF_CHECK, md,
                       NULL) >= 0) {
        PCRE2_SIZE *ov = pcre2_get_ovector_pointer(md);
        for (int form = 0; form < 3; form++) {
            tt_buf_puts(&text, form == 0 ? "the" : form == 1 ? " a" : " is ");
            tt_buf_append(&text, cps.data + ov[0], ov[1] - ov[0]);
            tt_buf_puts(&text, form == 0 ? "are" : form == 1 ? "and" : " and");
        }
        pos = ov[1];
    }
    pcre2_match_data_free(md);
    pcre2_code_free(space);
    tt_buf_release(&cps);
    tt_buf_puts(&text, " tha\n\nend aa\n\nthe are th");

    tt_search_options o;
    for (int mode = 0; mode < 3; mode++) {
        tt_search_options_init(&o);
        o.case_sensitive = mode == 1;
        o.whole_words = mode == 2;
        assert_true(check_equals_alone(rules, sizeof rules / sizeof rules[0], text.data, &o) >
                    100);
        assert_true(check_equals_alone(few, sizeof few / sizeof few[0], text.data, &o) > 50);
        assert_true(check_equals_alone(eight, sizeof eight / sizeof eight[0], text.data, &o) > 15);
    }
    /* 70 rules: more than one 64-bit word of rules */
    char store[70][32];
    const char *many[70];
    seventy_rules(store, many);
    tt_search_options_init(&o);
    assert_true(check_equals_alone(many, 70, text.data, &o) > 50);
    tt_buf_release(&text);
}

/* Cross-check at scale: on a generated text of common short words (with
 * U+212A, U+017F, U+2003 among them), every hit's rule and byte offset
 * equals what Python's re module (CPython standard library, re.finditer
 * with re.IGNORECASE) finds in the file, run at test time; once with more
 * first letters than the SIMD first look takes and once with few, each
 * through the portable code and every SIMD way the CPU has. */
static void test_pair_scan_against_python_re(void **state)
{
    (void)state;
    static const char *words[] = { "the", "are", "of", "that", "to", "and", "a", "was", "which",
                                   "this", "or", "is", "on", "for", "in", "ok", "ask", "kiss",
                                   "data", "then", "THE", "The", "O\xE2\x84\xAA",
                                   "i\xC5\xBF", "a\xE2\x84\xAAsk", "\xC5\xBFo", "tha", "at" };
    static const char *seps[] = { " ", " ", " ", " ", " ", "  ", "\n", "\xE2\x80\x83", ", ",
                                  " \xE2\x80\x83 " };
    static const char *many[] = {
        "the\\s+are", "of\\s+that", "to\\s+to", "and\\s+a", "are\\s+the", "was\\s+the",
        "a\\s+and", "for\\s+of", "of\\s+for", "the\\s+was", "the\\s+which", "this\\s+the",
        "the\\s+this", "the\\s+or", "on\\s+of", "which\\s+the", "or\\s+the", "to\\s+in",
        "is\\s+and", "of\\s+on", "ok\\s+then", "ask\\s+the", "is", "kiss", "a\\s+a",
        "\\bthe\\b", "s\\s+t", "at", "k\\s", "ta\\b", "so\\s+the", "data\\s+the", "en\\s+a",
        "n\\s+t"
    };
    static const char *few[] = { "the\\s+are", "the\\s+was", "a\\s+and", "at", "ta\\b",
                                 "the\\s+a" };
    tt_buf text;
    tt_buf_init(&text, 0);
    uint32_t seed = 12345;
    for (int para = 0; para < 40; para++) {
        for (int w = 0; w < 800; w++) {
            seed = seed * 1103515245u + 12345u;
            tt_buf_puts(&text, words[(seed >> 16) % (sizeof words / sizeof words[0])]);
            seed = seed * 1103515245u + 12345u;
            tt_buf_puts(&text, seps[(seed >> 16) % (sizeof seps / sizeof seps[0])]);
        }
        tt_buf_puts(&text, "end.\n\n");
    }
    char *path = write_temp(text.data, text.len, ".txt");
    for (int list = 0; list < 2; list++) {
        const char *const *pats = list ? few : many;
        size_t np = list ? sizeof few / sizeof few[0] : sizeof many / sizeof many[0];
        tt_watchlist *wl = watchlist_of(pats, np);
        char *want = python_re_hits(pats, np, path, 0);
        for (int way = 0; way < SIMD_WAYS; way++) {
            if (!simd_way(way))
                continue;
            tt_search_result r;
            tt_search_result_init(&r);
            search_file(wl, path, &r);
            tt_buf got;
            tt_buf_init(&got, 0);
            for (size_t h = 0; h < r.n_hits; h++)
                tt_buf_printf(&got, "%lld\t%zu\n", r.hits[h].offset, r.hits[h].rule);
            assert_true(r.n_hits > 1000);
            if (strcmp(got.data, want))
                fail_msg("list %d, %s: the hits differ from Python's re", list,
                         simd_names[way]);
            tt_buf_release(&got);
            tt_search_result_release(&r);
        }
        simd_restore();
        free(want);
        tt_watchlist_free(wl);
    }
    unlink(path);
    free(path);
    tt_buf_release(&text);
}

/* Two results of one search are the same: every hit (rule, block, byte
 * offset, line, exactness, matched text and context), the counts and the
 * stops. */
static void assert_same_result(const tt_search_result *a, const tt_search_result *b,
                               const char *what)
{
    if (a->n_hits != b->n_hits)
        fail_msg("%s: %zu hits, %zu expected", what, b->n_hits, a->n_hits);
    for (size_t h = 0; h < a->n_hits; h++) {
        const tt_search_hit *x = &a->hits[h], *y = &b->hits[h];
        size_t n = x->before_len + x->match_len + x->after_len;
        if (x->rule != y->rule || x->block != y->block || x->offset != y->offset ||
            x->line != y->line || x->exact != y->exact || x->before_len != y->before_len ||
            x->match_len != y->match_len || x->after_len != y->after_len ||
            memcmp(a->text.data + x->text, b->text.data + y->text, n))
            fail_msg("%s: hit %zu is rule %zu at %lld+%zu, expected rule %zu at %lld+%zu", what,
                     h, y->rule, y->offset, y->match_len, x->rule, x->offset, x->match_len);
    }
    assert_int_equal(a->n_rules, b->n_rules);
    for (size_t r = 0; r < a->n_rules; r++)
        assert_int_equal(a->counts[r], b->counts[r]);
    assert_int_equal(a->n_stops, b->n_stops);
}

/* Every SIMD way of the pair scan gives the portable code's result on
 * random text shaped to hit the edges of the wide steps: paragraphs (each
 * a block) of every length from 0 to about 120 bytes and a few of several
 * thousand, phrases after fillers of every length from 0 to 40, so that
 * their starts, their white-space runs and their ends fall on every offset
 * of a 16- and a 32-byte window, across a window's end and up to the
 * block's last byte; runs of white space mixing ASCII (space, 0x1C to
 * 0x1F) and Unicode (U+2003, U+3000, U+00A0); typographic quotes and
 * dashes (E2 80 xx, the lead byte of many Unicode spaces) next to words;
 * caseless k and s as U+212A and U+017F; words that share a phrase's first
 * letters. Watch-lists: 20 two-word phrases of common words (more first
 * words than buckets), rules led by \s, \b, k and s, one-letter and
 * one-word rules, and 70 rules (more than one 64-bit word of rules);
 * caseless, with --case and with --words. */
static void test_pair_scan_simd_same_as_portable(void **state)
{
    (void)state;
    static const char *words[] = {
        "the", "are", "of", "that", "to", "and", "a", "was", "which", "this", "or", "is", "on",
        "for", "in", "ok", "ask", "kiss", "then", "th", "tha", "thee", "an", "ar", "o", "wa",
        "whic", "fo", "i", "s", "k", "THE", "The", "xq", "q", "O\xE2\x84\xAA", "i\xC5\xBF",
        "a\xE2\x84\xAAsk", "\xC5\xBFo", "\xE2\x84\xAA"
    };
    static const char *seps[] = {
        " ", " ", " ", " ", " ", "\x1C", " \x1D ", "\x1E\x1F", "\xE2\x80\x83",
        " \xE3\x80\x80 ", "\xC2\xA0", "\xE2\x80\x99 ", " \xE2\x80\x9C", " \xE2\x80\x94 ", ", ",
        ". ", "-", " \xE2\x80\x83"
    };
    static const char *phrases[] = {
        "the\\s+are", "of\\s+that", "to\\s+to", "and\\s+a", "are\\s+the", "was\\s+the",
        "a\\s+and", "for\\s+of", "of\\s+for", "the\\s+was", "the\\s+which", "this\\s+the",
        "the\\s+this", "the\\s+or", "on\\s+of", "which\\s+the", "or\\s+the", "to\\s+in",
        "is\\s+and", "of\\s+on"
    };
    static const char *edges[] = {
        "\\s+and", "\\bthe\\s+are\\b", "k\\s+then", "s\\s+t", "ask\\s+the", "is", "a", "th",
        "kiss", "o\\s+k", "\\bis\\s+a", "t\\s\\s+o", "ok\\s+then", "\\s\\s", "q\\b"
    };
    char store[70][32];
    const char *many[70];
    seventy_rules(store, many);
    tt_buf text;
    tt_buf_init(&text, 0);
    uint32_t seed = 20261203;
#define NEXT() (seed = seed * 1103515245u + 12345u, seed >> 16)
    for (int para = 0; para < 3000; para++) {
        size_t filler = para % 41, nwords = NEXT() % 12;
        if (para % 500 == 499)
            nwords = 1500;
        for (size_t f = 0; f < filler; f++)
            tt_buf_putc(&text, "zyxv0123456789"[NEXT() % 14]);
        if (filler && nwords)
            tt_buf_puts(&text, seps[NEXT() % (sizeof seps / sizeof seps[0])]);
        for (size_t w = 0; w < nwords; w++) {
            if (w)
                tt_buf_puts(&text, seps[NEXT() % (sizeof seps / sizeof seps[0])]);
            tt_buf_puts(&text, words[NEXT() % (sizeof words / sizeof words[0])]);
        }
        tt_buf_puts(&text, "\n\n");
    }
#undef NEXT
    char *path = write_temp(text.data, text.len, ".txt");
    struct {
        const char *const *rules;
        size_t n;
    } lists[] = { { phrases, sizeof phrases / sizeof phrases[0] },
                  { edges, sizeof edges / sizeof edges[0] },
                  { many, 70 } };
    for (size_t l = 0; l < sizeof lists / sizeof lists[0]; l++)
        for (int mode = 0; mode < 3; mode++) {
            tt_search_options o;
            tt_search_options_init(&o);
            o.context = 2;
            o.case_sensitive = mode == 1;
            o.whole_words = mode == 2;
            tt_buf all;
            tt_buf_init(&all, 0);
            for (size_t i = 0; i < lists[l].n; i++)
                tt_buf_printf(&all, "r%zu\t%s\n", i, lists[l].rules[i]);
            tt_watchlist *wl = parse_ok(all.data, &o);
            tt_buf_release(&all);
            tt_search_result want;
            tt_search_result_init(&want);
            assert_true(simd_way(0));
            search_file(wl, path, &want);
            assert_true(want.n_hits > 200);
            for (int way = 1; way < SIMD_WAYS; way++) {
                if (!simd_way(way))
                    continue;
                tt_search_result got;
                tt_search_result_init(&got);
                search_file(wl, path, &got);
                char what[64];
                snprintf(what, sizeof what, "list %zu, mode %d, %s", l, mode, simd_names[way]);
                assert_same_result(&want, &got, what);
                tt_search_result_release(&got);
            }
            simd_restore();
            tt_search_result_release(&want);
            tt_watchlist_free(wl);
        }
    unlink(path);
    free(path);
    tt_buf_release(&text);
}

/* A phrase split by markup, a line break, a hyphenated line end or NBSP is
 * found, and never across two blocks (table cells). */
static void test_split_phrases(void **state)
{
    (void)state;
    tt_search_result r;
    tt_search_result_init(&r);
    tt_watchlist *wl = parse_ok("gc\tgoing concern\nobs\toff-balance sheet\nnl\tnet loss\n", NULL);
    search_text(wl, "The going\nconcern and the off-\nbalance sheet items; going\xC2\xA0\x20 concern.\n",
                ".txt", &r);
    assert_int_equal(r.counts[0], 2);
    assert_int_equal(r.counts[1], 1);
    search_text(wl,
                "<html><body><p>The <b>going</b>\n<i>concern</i> and going&nbsp;concern and "
                "going&#160;concern.</p><table><tr><td>net</td><td>loss</td></tr></table>"
                "<p>net <span>loss</span></p></body></html>\n",
                ".htm", &r);
    assert_int_equal(r.counts[0], 3);
    assert_int_equal(r.counts[2], 1); /* not "net" | "loss" across cells */
    tt_watchlist_free(wl);
    tt_search_result_release(&r);
}

/* Offsets and lines in an HTML file (CRLF line ends, tags inside the
 * phrase, entities before it, a comment inside it): each offset points at
 * the matched text's first character in the file's bytes. */
static void test_html_offsets(void **state)
{
    (void)state;
    size_t len;
    char *file = tt_test_read(FIX "phrases.htm", &len);
    tt_search_result r;
    tt_search_result_init(&r);
    tt_watchlist *wl = parse_ok("gc\tgoing\\s+concern\nrd\tR&D\nmw\tmaterial weakness\n"
                                "cafe\tcaf\xC3\xA9 cr\xC3\xA8me\nq\tfourth quarter\n"
                                "lit\tlitigation|lawsuit\n",
                                NULL);
    search_file(wl, FIX "phrases.htm", &r);
    /* the title's "going concern" is dropped with <head> */
    assert_int_equal(r.counts[0], 3);
    assert_int_equal(r.n_hits, 9);
    for (size_t h = 0; h < r.n_hits; h++) {
        const tt_search_hit *hit = &r.hits[h];
        assert_int_equal(hit->exact, 1);
        assert_true(hit->offset >= 0 && (size_t)hit->offset < len);
        /* the line: 1 + the line ends before the offset */
        long line = 1;
        for (long long i = 0; i < hit->offset; i++)
            line += file[i] == '\n';
        assert_int_equal(hit->line, line);
    }
    /* "Going</b>\r\n   Concern": starts at "Going" */
    assert_memory_equal(file + r.hits[0].offset, "Going</b>", 9);
    assert_int_equal(r.hits[0].block_kind, TT_BLOCK_HEADING);
    assert_memory_equal(file + r.hits[1].offset, "going&#160;concern", 18);
    assert_memory_equal(file + r.hits[2].offset, "R&amp;D", 7);
    assert_memory_equal(file + r.hits[3].offset, "material</span>", 15);
    assert_memory_equal(file + r.hits[4].offset, "fourth", 6);
    assert_memory_equal(file + r.hits[5].offset, "Caf&eacute;", 11);
    assert_memory_equal(file + r.hits[6].offset, "going <!--", 10);
    assert_memory_equal(file + r.hits[7].offset, "Litigation", 10);
    assert_int_equal(r.hits[7].block_kind, TT_BLOCK_CELL);
    assert_memory_equal(file + r.hits[8].offset, "lawsuit", 7);
    tt_watchlist_free(wl);
    tt_search_result_release(&r);
    free(file);
}

/* Content the extractor leaves out inside a block (a hidden inline element,
 * a script) is stepped over by the offset walk too, so the offset stays
 * exact; a class named "hidden" hides nothing. */
static void test_html_hidden_offsets(void **state)
{
    (void)state;
    const char *html = "<html><body><p>A <span hidden>x <b>going</b> concern</span>going "
                       "<script>var going=1;</script>concern and <i style=\"color:red; "
                       "DISPLAY : none\">going <i>concern</i></i> fin, going &amp; concern; "
                       "going&#32;concern.</p><p class=\"hidden\">going concern</p></body></html>\n";
    tt_search_result r;
    tt_search_result_init(&r);
    tt_watchlist *wl = parse_ok("gc\tgoing\\s+(?:&\\s+)?concern\n", NULL);
    search_text(wl, html, ".htm", &r);
    assert_int_equal(r.n_hits, 4);
    static const char *at[] = { "going <script>", "going &amp;", "going&#32;", "going concern</p>" };
    for (size_t h = 0; h < 4; h++) {
        assert_int_equal(r.hits[h].exact, 1);
        assert_memory_equal(html + r.hits[h].offset, at[h], strlen(at[h]));
    }
    tt_watchlist_free(wl);
    tt_search_result_release(&r);
}

/* Context: N words each side, never past the block's edges. */
static void test_context(void **state)
{
    (void)state;
    tt_search_options o;
    tt_search_options_init(&o);
    o.context = 3;
    tt_search_result r;
    tt_search_result_init(&r);
    tt_watchlist *wl = parse_ok("x\ttarget\n", &o);
    search_text(wl,
                "One two three four five target six, seven eight nine.\n\n"
                "Target at the start.\n\nAt the end a target\n",
                ".txt", &r);
    assert_int_equal(r.n_hits, 3);
    const char *t = r.text.data;
    const tt_search_hit *h = &r.hits[0];
    assert_int_equal(h->before_len, strlen("three four five "));
    assert_memory_equal(t + h->text, "three four five target six, seven eight", h->before_len +
                        h->match_len + h->after_len);
    h = &r.hits[1]; /* first words of its block: nothing before, nothing
                       from the block before */
    assert_int_equal(h->before_len, 0);
    assert_memory_equal(t + h->text, "Target at the start", h->match_len + h->after_len);
    h = &r.hits[2]; /* last word of the document */
    assert_int_equal(h->after_len, 0);
    assert_memory_equal(t + h->text, "the end a target", h->before_len + h->match_len);
    /* past the first 64 words (the tokenizer hands them out 64 at a time) */
    char many[1024] = "";
    for (int i = 0; i < 100; i++)
        strcat(many, "word ");
    strcat(many, "one two three target four five six seven\n");
    search_text(wl, many, ".txt", &r);
    assert_int_equal(r.n_hits, 1);
    h = &r.hits[0];
    assert_memory_equal(r.text.data + h->text, "one two three target four five six",
                        h->before_len + h->match_len + h->after_len);
    /* context 0 */
    tt_watchlist_free(wl);
    o.context = 0;
    wl = parse_ok("x\ttarget\n", &o);
    search_text(wl, "a target b\n", ".txt", &r);
    assert_int_equal(r.hits[0].before_len + r.hits[0].after_len, 0);
    tt_watchlist_free(wl);
    tt_search_result_release(&r);
}

/* A catastrophic pattern stops at PCRE2's match limit on the one document,
 * is recorded, and the other rules go on; never hangs. */
static void test_catastrophic_pattern(void **state)
{
    (void)state;
    size_t n = 50000;
    char *doc = malloc(n + 64);
    memset(doc, 'a', n);
    memcpy(doc + n, "! a clean phrase.\n", 19);
    tt_search_result r;
    tt_search_result_init(&r);
    tt_watchlist *wl = parse_ok("slow\t(a+)+$\nfine\tclean phrase\n", NULL);
    search_text(wl, doc, ".txt", &r);
    assert_int_equal(r.n_stops, 1);
    assert_int_equal(r.stops[0].rule, 0);
    assert_true(r.stops[0].limit == TT_SEARCH_LIMIT_MATCH ||
                r.stops[0].limit == TT_SEARCH_LIMIT_JIT_STACK);
    assert_int_equal(r.counts[1], 1);
    tt_watchlist_free(wl);
    tt_search_result_release(&r);
    free(doc);
}

/* Cross-check: on a plain-text fixture, every hit (rule, byte offset, line,
 * matched text with white space collapsed) equals what Python's re module
 * (CPython standard library, re.finditer with re.IGNORECASE) finds in the
 * file's raw text, run at test time, through the portable code and every
 * SIMD way the CPU has. The patterns cross line breaks and non-ASCII
 * letters, so the offsets are followed through the normalization. */
static void test_crosscheck_python_re(void **state)
{
    (void)state;
    static const char *patterns[] = { "going\\s+concern", "material\\s+weakness(?:es)?",
                                      "\\d{1,3}(?:,\\d{3})+", "\\brestat\\w*", "lawsuits?",
                                      "caf\\w", "z\\w+rich", "doubt\\s+\\w+" };
    size_t np = sizeof patterns / sizeof patterns[0];
    tt_watchlist *wl = watchlist_of(patterns, np);
    char *want = python_re_hits(patterns, np, FIX "crosscheck.txt", 1);
    for (int way = 0; way < SIMD_WAYS; way++) {
        if (!simd_way(way))
            continue;
        tt_search_result r;
        tt_search_result_init(&r);
        search_file(wl, FIX "crosscheck.txt", &r);
        tt_buf got;
        tt_buf_init(&got, 0);
        for (size_t h = 0; h < r.n_hits; h++) {
            const tt_search_hit *hit = &r.hits[h];
            assert_int_equal(hit->exact, 1);
            tt_buf_printf(&got, "%lld\t%zu\t%ld\t%.*s\n", hit->offset, hit->rule, hit->line,
                          (int)hit->match_len, r.text.data + hit->text + hit->before_len);
        }
        assert_true(r.n_hits >= 15);
        if (strcmp(got.data, want))
            fail_msg("%s: the hits differ from Python's re", simd_names[way]);
        tt_buf_release(&got);
        tt_search_result_release(&r);
    }
    simd_restore();
    free(want);
    tt_watchlist_free(wl);
}

/* CRLF text: line numbers count CRLF once; a phrase across the break is
 * found at its first word. */
static void test_crlf_lines(void **state)
{
    (void)state;
    size_t len;
    char *file = tt_test_read(FIX "crlf.txt", &len);
    tt_search_result r;
    tt_search_result_init(&r);
    tt_watchlist *wl = parse_ok("gc\tgoing concern\n", NULL);
    search_file(wl, FIX "crlf.txt", &r);
    assert_int_equal(r.n_hits, 2);
    assert_memory_equal(file + r.hits[0].offset, "going\r\nconcern", 14);
    assert_int_equal(r.hits[0].line, 2);
    assert_memory_equal(file + r.hits[1].offset, "going concern", 13);
    assert_int_equal(r.hits[1].line, 5);
    /* a UTF-8 BOM is counted in the offset: the same text behind a BOM */
    char *bom = malloc(len + 4);
    memcpy(bom, "\xEF\xBB\xBF", 3);
    memcpy(bom + 3, file, len + 1);
    search_text(wl, bom, ".txt", &r);
    assert_memory_equal(bom + r.hits[0].offset, "going\r\nconcern", 14);
    free(bom);
    tt_watchlist_free(wl);
    tt_search_result_release(&r);
    free(file);
}

/* Out of memory anywhere in parsing or searching is reported as
 * TT_ENOMEM, never crashed on (every allocation fails in turn). */
static void test_out_of_memory(void **state)
{
    (void)state;
    const char *text = "a\tgoing\\s+concern\nb\tnear(doubt, concern, 4)\nc\tR&D\n";
    int reached_ok = 0;
    for (int k = 0; k < 400 && !reached_ok; k++) {
        tt_set_allocator(&(tt_allocator){ tt_test_failing_malloc, tt_test_failing_realloc,
                                          free });
        tt_test_fail_after = k;
        tt_error err;
        tt_error_init(&err);
        tt_watchlist *wl = tt_watchlist_new(NULL);
        tt_status st = wl ? tt_watchlist_parse(wl, text, strlen(text), "oom", &err) : TT_ENOMEM;
        tt_searcher *s = NULL;
        tt_search_result r;
        tt_search_result_init(&r);
        if (st == TT_OK) {
            s = tt_searcher_new(wl);
            if (!s) {
                st = TT_ENOMEM;
            } else {
                tt_blocks b;
                tt_blocks_init(&b);
                const char *raw = "Doubt about the going concern; R&D.";
                tt_document doc;
                memset(&doc, 0, sizeof doc);
                doc.name = doc.path = "mem";
                doc.raw = raw;
                doc.raw_len = strlen(raw);
                doc.blocks = &b;
                st = tt_extract_text(raw, strlen(raw), 0, &b, "mem", &err);
                if (st == TT_OK)
                    st = tt_searcher_run(s, &doc, &r, &err);
                if (st == TT_OK) {
                    assert_int_equal(r.counts[0] + r.counts[1] + r.counts[2], 3);
                    reached_ok = 1;
                }
                tt_blocks_release(&b);
            }
        }
        tt_set_allocator(NULL);
        tt_test_fail_after = -1;
        if (st != TT_OK)
            assert_true(st == TT_ENOMEM || st == TT_EPARSE);
        tt_search_result_release(&r);
        tt_searcher_free(s);
        tt_watchlist_free(wl);
    }
    assert_true(reached_ok);
}

/* ---- the program ------------------------------------------------------------ */

/* Exit status as grep has it; a bad watch-list names its line and offset
 * and nothing is searched (no output at all). */
static void test_cli_exit_and_errors(void **state)
{
    (void)state;
    char cmd[1024];
    int st;
    snprintf(cmd, sizeof cmd, "%s search -q -e 'going concern' %scrlf.txt", tt_test_bin(), FIX);
    free(run(cmd, &st));
    assert_int_equal(st, 0);
    snprintf(cmd, sizeof cmd, "%s search -q -e 'no such phrase' %scrlf.txt", tt_test_bin(), FIX);
    free(run(cmd, &st));
    assert_int_equal(st, 1);
    snprintf(cmd, sizeof cmd, "%s search -q -e 'going concern' %snot-here.txt 2>/dev/null",
             tt_test_bin(), FIX);
    free(run(cmd, &st));
    assert_int_equal(st, 2);

    const char *bad_list = "ok\tfine\nbroken\tgoing (concern\n";
    char *wl = write_temp(bad_list, strlen(bad_list), ".tsv");
    char out[] = TT_TEST_TMP "tt_search_out_XXXXXX";
    int fd = mkstemp(out);
    close(fd);
    unlink(out);
    snprintf(cmd, sizeof cmd, "%s search --rules %s -o %s %scrlf.txt 2>&1", tt_test_bin(), wl,
             out, FIX);
    char *msg = run(cmd, &st);
    assert_int_equal(st, 2);
    assert_non_null(strstr(msg, "line 2: rule 'broken': pattern error at offset 14"));
    assert_non_null(strstr(msg, "nothing searched"));
    assert_int_equal(access(out, F_OK), -1); /* no output file */
    free(msg);
    unlink(wl);
    free(wl);

    /* a catastrophic rule: exit 2, the limit reported, the other rule's hit
     * printed */
    const char *slow_list = "slow\t(a+)+$\nfine\tgoing concern\n";
    wl = write_temp(slow_list, strlen(slow_list), ".tsv");
    char *doc = malloc(30100);
    memset(doc, 'a', 30000);
    memcpy(doc + 30000, "!\n\ngoing concern\n", 18);
    char *docp = write_temp(doc, strlen(doc), ".txt");
    snprintf(cmd, sizeof cmd, "%s search -f tsv --rules %s %s 2>&1", tt_test_bin(), wl, docp);
    msg = run(cmd, &st);
    assert_int_equal(st, 2);
    assert_non_null(strstr(msg, "rule 'slow' stopped at block 1 by the PCRE2 match limit"));
    assert_non_null(strstr(msg, "\tfine\tparagraph\t30003\t3\t1\t"));
    free(msg);
    unlink(docp);
    unlink(wl);
    free(docp);
    free(wl);
    free(doc);
}

/* CSV is formula-safe, JSON Lines parse with Python's json module. */
static void test_cli_formats(void **state)
{
    (void)state;
    const char *text = "Total =SUM(A1) and going concern.\n";
    char *docp = write_temp(text, strlen(text), ".txt");
    char cmd[1024];
    int st;
    snprintf(cmd, sizeof cmd, "%s search -q -f csv --context 0 -e '=SUM\\(A1\\)' %s",
             tt_test_bin(), docp);
    char *out = run(cmd, &st);
    assert_int_equal(st, 0);
    assert_non_null(strstr(out, ",'=SUM(A1),"));
    free(out);
    snprintf(cmd, sizeof cmd,
             "%s search -q -f jsonl -e 'going concern' %s | %s -c \"import json,sys\n"
             "recs=[json.loads(l) for l in sys.stdin]\n"
             "print(recs[0]['record'], recs[1]['record'], recs[2]['record'], recs[2]['match'],"
             " recs[2]['offset'])\"",
             tt_test_bin(), docp, tt_test_python());
    out = run(cmd, &st);
    assert_string_equal(out, "run input hit going concern 19\n");
    free(out);
    /* --counts in JSON Lines: the cells add up to the totals (summed by
     * Python's json module) */
    snprintf(cmd, sizeof cmd,
             "%s search -q --counts -f jsonl --rules demo-corpus/watchlist.tsv "
             "--manifest demo-corpus/manifest.tsv | "
             "%s -c \"import json,sys\n"
             "recs=[json.loads(l) for l in sys.stdin]\n"
             "cells=[r for r in recs if r['record']=='count']\n"
             "tot={r['rule']:(r['hits'],r['documents_with_hits']) for r in recs if "
             "r['record']=='rule_total'}\n"
             "ok=all(tot[k]==(sum(c['hits'] for c in cells if c['rule']==k),"
             "sum(1 for c in cells if c['rule']==k and c['hits']>0)) for k in tot)\n"
             "t=[r for r in recs if r['record']=='total'][0]\n"
             "print(ok, len(tot), t['hits']==sum(c['hits'] for c in cells), t['documents'])\"",
             tt_test_bin(), tt_test_python());
    out = run(cmd, &st);
    assert_string_equal(out, "True 6 True 38\n");
    free(out);
    unlink(docp);
    free(docp);
}

/* The output is the same for any number of threads. */
static void test_cli_threads_same_output(void **state)
{
    (void)state;
    char cmd[1024];
    snprintf(cmd, sizeof cmd,
             "%s search -q -f tsv --rules demo-corpus/watchlist.tsv demo-corpus tests/fixtures/search",
             tt_test_bin());
    char *one = run(cmd, NULL);
    char cmd4[1100];
    snprintf(cmd4, sizeof cmd4, "%s -j 4", cmd);
    char *four = run(cmd4, NULL);
    assert_true(strlen(one) > 1000);
    assert_string_equal(one, four);
    free(one);
    free(four);
}

/* The demo corpus (golden): counts per document and rule from the manifest
 * equal tests/fixtures/search/demo-counts.tsv; and the story holds:
 * going-concern language only in Hollowmere's documents from 2024-Q3 to
 * FY2025, most in the FY2024 annual report; lawsuit and court language in
 * Hollowmere from 2024-Q2 on; the material weakness only at Ambleworth from
 * 2024-Q4 on. */
static void test_demo_corpus(void **state)
{
    (void)state;
    char cmd[1024];
    int st;
    snprintf(cmd, sizeof cmd,
             "%s search -q --counts -f tsv --rules demo-corpus/watchlist.tsv "
             "--manifest demo-corpus/manifest.tsv | grep -v '^#'",
             tt_test_bin());
    char *out = run(cmd, &st);
    char *want = tt_test_read(FIX "demo-counts.tsv", NULL);
    assert_string_equal(out, want);
    free(want);
    /* columns: document entity period going-concern doubt-near-concern
     * material-weakness litigation restatement recall total */
    size_t gc_max = 0;
    char gc_max_doc[256] = "";
    char *save = NULL;
    for (char *line = strtok_r(out, "\n", &save); line; line = strtok_r(NULL, "\n", &save)) {
        if (!strncmp(line, "document\t", 9) || line[0] == '(')
            continue;
        char *f[11];
        char *s = line;
        for (int k = 0; k < 11; k++) {
            f[k] = s;
            char *tab = strchr(s, '\t');
            if (tab) {
                *tab = '\0';
                s = tab + 1;
            }
        }
        size_t gc = strtoul(f[3], NULL, 10), mw = strtoul(f[5], NULL, 10),
               lit = strtoul(f[6], NULL, 10);
        int hollowmere = !strcmp(f[1], "hollowmere");
        const char *period = f[2];
        /* "2024-Q3" < "2025-..." and "FY2024" sort as strings after digits */
        int from_2024q3 = (period[0] == 'F' && strcmp(period, "FY2024") >= 0) ||
                          (period[0] != 'F' && strcmp(period, "2024-Q3") >= 0);
        if (gc) {
            assert_true(hollowmere);
            assert_true(from_2024q3);
        }
        if (gc > gc_max) {
            gc_max = gc;
            snprintf(gc_max_doc, sizeof gc_max_doc, "%s", f[0]);
        }
        if (mw)
            assert_false(hollowmere);
        if (hollowmere && lit && period[0] != 'F')
            assert_true(strcmp(period, "2024-Q2") >= 0);
    }
    assert_string_equal(gc_max_doc, "demo-corpus/hollowmere/FY2024-annual-report.htm");
    free(out);
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_sha256_fips_examples),
        cmocka_unit_test(test_sha256_against_hashlib),
        cmocka_unit_test(test_sha256_while_reading),
        cmocka_unit_test(test_watchlist_parse),
        cmocka_unit_test(test_watchlist_problems),
        cmocka_unit_test(test_words_and_case),
        cmocka_unit_test(test_near),
        cmocka_unit_test(test_scan_equals_alone),
        cmocka_unit_test(test_whole_text_equals_per_block),
        cmocka_unit_test(test_whole_text_alone_equals_per_block),
        cmocka_unit_test(test_pair_sets_against_pcre2),
        cmocka_unit_test(test_pair_scan_equals_alone),
        cmocka_unit_test(test_pair_scan_against_python_re),
        cmocka_unit_test(test_pair_scan_simd_same_as_portable),
        cmocka_unit_test(test_split_phrases),
        cmocka_unit_test(test_html_offsets),
        cmocka_unit_test(test_html_hidden_offsets),
        cmocka_unit_test(test_context),
        cmocka_unit_test(test_catastrophic_pattern),
        cmocka_unit_test(test_crosscheck_python_re),
        cmocka_unit_test(test_crlf_lines),
        cmocka_unit_test(test_out_of_memory),
        cmocka_unit_test(test_cli_exit_and_errors),
        cmocka_unit_test(test_cli_formats),
        cmocka_unit_test(test_cli_threads_same_output),
        cmocka_unit_test(test_demo_corpus),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
