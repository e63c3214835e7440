/* Tests for the manifest, path resolution and path layouts
 * (src/manifest.c, include/termtide/meta.h).
 *
 * References:
 *  - CSV quoting: RFC 4180 (Shafranovich 2005). Manifests with commas,
 *    quotes, line breaks and tabs inside fields are written at test time by
 *    Python's csv module (the standard library; csv.writer with the 'excel'
 *    and 'excel-tab' dialects, which quote as RFC 4180 does and end lines
 *    with CRLF), and every value the library reads is compared with what
 *    Python's csv.reader reads from the same bytes;
 *  - path resolution: Python's posixpath.join and posixpath.normpath (the
 *    standard library) on generated paths without ".." segments and without
 *    a leading "//" (the two places where the library's rule, stated in
 *    meta.h, differs on purpose: it keeps "..", and POSIX lets "//" mean
 *    something else);
 *  - the demo corpus: demo-corpus/manifest.tsv, written by the corpus
 *    generator (demo-corpus/make_corpus.py), must load; its rows are
 *    checked against Python's csv reading of the same file, and the layout
 *    '{entity}/{period}-{kind}.*' must find in every file name the entity,
 *    period and kind the manifest gives it;
 *  - the fixtures in tests/fixtures/manifest/ are invented; errors.tsv holds
 *    one problem per line, and the expected messages below were worked out
 *    by hand from the rules in meta.h. */
#include "tt_test.h"

#include <sys/stat.h>
#include <time.h>
#include <unistd.h>

#include "termtide/alloc.h"
#include "termtide/buf.h"
#include "termtide/meta.h"

#define FIX "tests/fixtures/manifest"

static char tmp_root[256];

static int setup(void **state)
{
    (void)state;
    const char *t = getenv("TMPDIR");
    snprintf(tmp_root, sizeof tmp_root, "%s/tt_manifest_XXXXXX", t && *t ? t : "/tmp");
    return mkdtemp(tmp_root) ? 0 : -1;
}

static int teardown(void **state)
{
    (void)state;
    char cmd[600];
    snprintf(cmd, sizeof cmd, "rm -rf '%s'", tmp_root);
    return system(cmd) == 0 ? 0 : -1;
}

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

/* Runs a Python program (through a temporary file) with one argument. */
static char *run_python(const char *program, const char *arg)
{
    char path[300];
    snprintf(path, sizeof path, "%s/prog.py", tmp_root);
    FILE *f = fopen(path, "w");
    assert_non_null(f);
    fputs(program, f);
    fclose(f);
    char cmd[1024];
    snprintf(cmd, sizeof cmd, "%s %s '%s'", tt_test_python(), path, arg ? arg : "");
    return run_capture(cmd);
}

static void put_file(const char *path, const char *text)
{
    FILE *f = fopen(path, "wb");
    assert_non_null(f);
    fputs(text, f);
    fclose(f);
}

static int hexval(int c) { return c <= '9' ? c - '0' : c - 'a' + 10; }

/* Decodes lowercase hex in place; returns the text. */
static char *unhex(char *s)
{
    size_t n = strlen(s) / 2;
    for (size_t i = 0; i < n; i++)
        s[i] = (char)(hexval(s[2 * i]) * 16 + hexval(s[2 * i + 1]));
    s[n] = '\0';
    return s;
}

static char *resolved(const char *dir, const char *path)
{
    static char out[TT_META_PATH_MAX];
    tt_buf b;
    tt_buf_init(&b, 0);
    assert_int_equal(tt_meta_path_resolve(dir, path, &b), TT_OK);
    snprintf(out, sizeof out, "%s", b.data);
    tt_buf_release(&b);
    return out;
}

static char *period_text(const tt_period *p)
{
    static char out[TT_PERIOD_TEXT_MAX];
    return tt_period_format(p, out, sizeof out);
}

/* ---- paths --------------------------------------------------------------- */

static void test_path_resolve_rule(void **state)
{
    (void)state;
    static const char *const cases[][3] = {
        { NULL, "./demo//a.htm", "demo/a.htm" },
        { NULL, "demo/./a.htm", "demo/a.htm" },
        { NULL, "demo/a.htm/", "demo/a.htm" },
        { "demo", "./a/x.htm", "demo/a/x.htm" },
        { "demo/", "a//x.htm", "demo/a/x.htm" },
        { "./demo/.", "a/x.htm", "demo/a/x.htm" },
        { "demo", "/abs/x.htm", "/abs/x.htm" },
        { "/srv//data", "x.htm", "/srv/data/x.htm" },
        { "", "x.htm", "x.htm" },
        { "/", "x.htm", "/x.htm" },
        { NULL, "/", "/" },
        { NULL, "//", "/" },
        { NULL, ".", "." },
        { NULL, "./", "." },
        { NULL, "", "." },
        { "a", "../b/./c", "a/../b/c" }, /* ".." kept as written */
        { "..", "x", "../x" },
    };
    for (size_t i = 0; i < sizeof cases / sizeof cases[0]; i++)
        assert_string_equal(resolved(cases[i][0], cases[i][1]), cases[i][2]);

    /* Too long: TT_ELIMIT. */
    char *big = malloc(TT_META_PATH_MAX + 10);
    assert_non_null(big);
    memset(big, 'a', TT_META_PATH_MAX + 9);
    big[TT_META_PATH_MAX + 9] = '\0';
    tt_buf b;
    tt_buf_init(&b, 0);
    assert_int_equal(tt_meta_path_resolve(NULL, big, &b), TT_ELIMIT);
    big[TT_META_PATH_MAX - 1] = '\0'; /* 4095 bytes: fits with its NUL */
    assert_int_equal(tt_meta_path_resolve(NULL, big, &b), TT_OK);
    assert_int_equal(b.len, TT_META_PATH_MAX - 1);
    tt_buf_release(&b);
    free(big);
}

/* Random directory and path pairs: the library agrees with
 * posixpath.normpath(posixpath.join(dir, path)). */
static void test_path_resolve_against_python(void **state)
{
    (void)state;
    char *out = run_python(
        "import posixpath, random\n"
        "r = random.Random(4180)\n"
        "parts = ['a', 'bc', '.', '', 'd e', '\\u00e9t\\u00e9', 'x.htm', 'x.txt.gz']\n"
        "def gen():\n"
        "  s = '/'.join(r.choice(parts) for _ in range(r.randint(1, 6)))\n"
        "  if r.random() < 0.2: s = '/' + s\n"
        "  return s\n"
        "n = 0\n"
        "while n < 2000:\n"
        "  d = gen() if r.random() < 0.6 else ''\n"
        "  p = gen()\n"
        "  j = posixpath.join(d, p)\n"
        "  if j.startswith('//') or not j.strip('/.'): continue\n"
        "  print(d.encode().hex() or '-', p.encode().hex() or '-', posixpath.normpath(j).encode().hex())\n"
        "  n += 1\n",
        NULL);
    size_t checked = 0;
    char *save = NULL;
    for (char *line = strtok_r(out, "\n", &save); line; line = strtok_r(NULL, "\n", &save)) {
        char d[256], p[256], want[512];
        assert_int_equal(sscanf(line, "%255s %255s %511s", d, p, want), 3);
        const char *dir = strcmp(d, "-") == 0 ? "" : unhex(d);
        const char *path = strcmp(p, "-") == 0 ? "" : unhex(p);
        unhex(want);
        const char *got = resolved(dir, path);
        if (strcmp(got, want) != 0)
            fail_msg("dir \"%s\" path \"%s\": library \"%s\", Python \"%s\"", dir, path, got, want);
        checked++;
    }
    assert_int_equal(checked, 2000);
    free(out);
}

/* ---- loading ------------------------------------------------------------- */

static void test_load_tsv_fixture(void **state)
{
    (void)state;
    tt_manifest m;
    tt_manifest_init(&m);
    tt_error err;
    tt_error_init(&err);
    assert_int_equal(tt_manifest_load(&m, FIX "/good.tsv", 0, &err), TT_OK);
    assert_string_equal(m.dir, FIX);
    assert_string_equal(m.file, FIX "/good.tsv");
    assert_int_equal(m.n, 7);
    assert_int_equal(m.n_errors, 0);
    assert_int_equal(m.n_tags, 2);
    assert_string_equal(m.tag_names[0], "sector");
    assert_string_equal(m.tag_names[1], "analyst");

    const tt_doc_meta *d = &m.docs[0];
    assert_string_equal(d->path, FIX "/docs/brindlecombe/2025-Q1-call-transcript.txt");
    assert_string_equal(d->entity, "brindlecombe");
    assert_string_equal(period_text(&d->period), "2025-Q1");
    assert_string_equal(d->kind, "call-transcript");
    assert_int_equal(d->line, 3);
    assert_string_equal(d->tags[0], "valves");
    assert_string_equal(d->tags[1], "R. Ashdown");
    assert_int_equal(m.docs[2].line, 7); /* after a blank line and a comment */
    assert_string_equal(m.docs[2].tags[1], "");
    assert_string_equal(period_text(&m.docs[4].period), "2025-Q1"); /* written 2025-q1 */
    /* "./docs//orrinford/..." resolved; empty kind allowed. */
    assert_string_equal(m.docs[6].path, FIX "/docs/orrinford/FY2025-annual-report.htm");
    assert_string_equal(m.docs[6].kind, "");
    assert_string_equal(tt_manifest_tag(&m, 4, "sector"), "pumps");
    assert_null(tt_manifest_tag(&m, 4, "Sector"));
    assert_null(tt_manifest_tag(&m, 99, "sector"));

    /* Lookup by the path a batch runner gives, in several spellings. */
    assert_ptr_equal(tt_manifest_find(&m, FIX "/docs/orrinford/FY2024-annual-report.htm"),
                     &m.docs[5]);
    assert_ptr_equal(tt_manifest_find(&m, "./" FIX "//docs/orrinford/./FY2024-annual-report.htm"),
                     &m.docs[5]);
    assert_null(tt_manifest_find(&m, "docs/orrinford/FY2024-annual-report.htm"));
    assert_null(tt_manifest_find(&m, FIX "/docs/orrinford"));

    /* An absolute spelling only meets the row by file identity. */
    char cwd[2048], abs[3000];
    assert_non_null(getcwd(cwd, sizeof cwd));
    snprintf(abs, sizeof abs, "%s/%s/docs/orrinford/FY2024-annual-report.htm", cwd, FIX);
    assert_null(tt_manifest_find(&m, abs));
    assert_ptr_equal(tt_manifest_find_file(&m, abs), &m.docs[5]);
    snprintf(abs, sizeof abs, "%s/%s/docs/orrinford/no-such-file.htm", cwd, FIX);
    assert_null(tt_manifest_find_file(&m, abs));
    tt_manifest_release(&m);
}

static void test_load_csv_fixture_bom_crlf_quotes(void **state)
{
    (void)state;
    tt_manifest m;
    tt_manifest_init(&m);
    tt_error err;
    tt_error_init(&err);
    assert_int_equal(tt_manifest_load(&m, FIX "/good.csv", 0, &err), TT_OK);
    assert_int_equal(m.n, 4);
    /* Header names matched ignoring case and blanks; a tag column. */
    assert_int_equal(m.n_tags, 1);
    assert_string_equal(m.tag_names[0], "region");
    assert_string_equal(m.docs[0].entity, "brindlecombe"); /* no BOM left on anything */
    assert_string_equal(m.docs[0].tags[0], "North, coast");
    assert_string_equal(m.docs[1].path, FIX "/docs/brindlecombe/2025-Q2-call-transcript.txt");
    assert_string_equal(m.docs[1].tags[0], "said \"hold\"");
    assert_int_equal(m.docs[1].line, 3);
    /* ",,,," and the comment skipped; a quoted line break (CRLF kept, RFC
     * 4180 section 2, rule 6) moves the next row's line on. */
    assert_int_equal(m.docs[2].line, 6);
    assert_string_equal(m.docs[2].tags[0], "two\r\nlines");
    assert_string_equal(period_text(&m.docs[2].period), "FY2024");
    assert_int_equal(m.docs[3].line, 8);
    assert_string_equal(m.docs[3].tags[0], "");
    assert_string_equal(m.docs[3].kind, "call-transcript"); /* no CR left at the line end */
    tt_manifest_release(&m);
}

/* Each problem of errors.tsv, with its line, in file order. */
static void test_error_fixture_lines(void **state)
{
    (void)state;
    static const struct {
        long line;
        const char *message;
    } want[] = {
        { 4, "unknown period syntax \"2025-Q5\": a quarter is Q1 to Q4" },
        { 5, "duplicate path \"" FIX "/docs/brindlecombe/2025-Q1-call-transcript.txt\" (also on "
             "line 3)" },
        { 6, "listed file \"" FIX "/docs/brindlecombe/2025-Q4-call-transcript.txt\" not found" },
        { 7, "3 fields, the header has 4" },
        { 8, "empty entity" },
        { 10, "unknown period syntax \"FY25\": a fiscal year has four digits, as in FY2025" },
        { 11, "listed path \"" FIX "/docs/orrinford\" is a directory" },
        { 12, "duplicate path \"" FIX "/docs/brindlecombe/2025-Q1-call-transcript.txt\" (also on "
              "line 3)" },
        { 13, "empty period" },
        { 14, "5 fields, the header has 4" },
        { 15, "unknown period syntax \"Q3-2025\": the year comes first, as in 2025-Q3" },
    };
    const size_t n = sizeof want / sizeof want[0];
    tt_manifest m;
    tt_manifest_init(&m);
    tt_error err;
    tt_error_init(&err);
    assert_int_equal(tt_manifest_load(&m, FIX "/errors.tsv", 0, &err), TT_EPARSE);
    assert_int_equal(m.n, 0); /* nothing half-loaded */
    assert_null(tt_manifest_find(&m, FIX "/docs/brindlecombe/2025-Q1-call-transcript.txt"));
    if (m.n_errors != n) {
        for (size_t i = 0; i < m.n_errors; i++)
            print_message("%ld: %s\n", m.errors[i].line, m.errors[i].message);
        fail_msg("%zu problems, expected %zu", m.n_errors, n);
    }
    assert_int_equal(m.errors_more, 0);
    for (size_t i = 0; i < n; i++) {
        assert_string_equal(m.errors[i].file, FIX "/errors.tsv");
        assert_int_equal(m.errors[i].line, want[i].line);
        assert_string_equal(m.errors[i].message, want[i].message);
    }
    assert_int_equal(m.errors[2].status, TT_ENOENT);
    /* err is the first problem, with the overall status. */
    assert_int_equal(err.status, TT_EPARSE);
    assert_int_equal(err.line, 4);
    char text[1024];
    assert_string_equal(tt_error_format(&err, text, sizeof text),
                        FIX "/errors.tsv: line 4: unknown period syntax \"2025-Q5\": a quarter is "
                            "Q1 to Q4");

    /* Without the file check the missing file and the directory pass. */
    assert_int_equal(tt_manifest_load(&m, FIX "/errors.tsv", TT_MANIFEST_SKIP_FILE_CHECK, &err),
                     TT_EPARSE);
    assert_int_equal(m.n_errors, n - 2);
    tt_manifest_release(&m);
}

static void test_header_problems(void **state)
{
    (void)state;
    tt_manifest m;
    tt_manifest_init(&m);
    tt_error err;
    tt_error_init(&err);
    assert_int_equal(tt_manifest_load(&m, FIX "/missing-column.csv", 0, &err), TT_EPARSE);
    assert_int_equal(m.n_errors, 1);
    assert_int_equal(m.errors[0].line, 2);
    assert_non_null(strstr(m.errors[0].message, "missing column \"period\""));

    static const struct {
        const char *text;
        size_t n_errors;
        long line;
        const char *message;
    } cases[] = {
        { "path\tentity\n", 2, 1, "missing column \"period\"" },
        { "path,entity,period,kind,,x\n", 1, 1, "column 5 has no name" },
        { "path,entity,period,KIND,kind\n", 1, 1,
          "column \"kind\" appears twice (columns 4 and 5)" },
        { "\n# only comments\n\n", 1, 3, "no header line" },
        { "", 1, 1, "no header line" },
        { "\"path,entity,period,kind\n", 1, 1, "header: unterminated quoted field" },
        { "path;entity;period;kind\n", 4, 1, "missing column \"path\"" },
    };
    for (size_t i = 0; i < sizeof cases / sizeof cases[0]; i++) {
        tt_status st = tt_manifest_parse(&m, cases[i].text, strlen(cases[i].text), "h.csv", NULL,
                                         TT_MANIFEST_SKIP_FILE_CHECK, &err);
        assert_int_equal(st, TT_EPARSE);
        assert_int_equal(m.n_errors, cases[i].n_errors);
        assert_int_equal(m.errors[0].line, cases[i].line);
        if (!strstr(m.errors[0].message, cases[i].message))
            fail_msg("case %zu: \"%s\"", i, m.errors[0].message);
        assert_string_equal(m.errors[0].file, "h.csv");
    }
    /* Too many columns: TT_ELIMIT. */
    tt_buf big;
    tt_buf_init(&big, 0);
    assert_int_equal(tt_buf_puts(&big, "path,entity,period,kind"), TT_OK);
    for (int i = 0; i < TT_MANIFEST_MAX_COLUMNS; i++)
        assert_int_equal(tt_buf_printf(&big, ",t%d", i), TT_OK);
    assert_int_equal(tt_manifest_parse(&m, big.data, big.len, "wide.csv", NULL, 0, &err),
                     TT_ELIMIT);
    assert_non_null(strstr(err.message, "more than 1024 columns"));
    tt_buf_release(&big);
    tt_manifest_release(&m);
}

static void test_row_syntax_problems(void **state)
{
    (void)state;
    tt_manifest m;
    tt_manifest_init(&m);
    tt_error err;
    const char *text = "path,entity,period,kind\n"            /* 1 */
                       "a.txt,\"acme\"x,2025,r\n"             /* 2 text after quote */
                       "b.txt,acme,2025-Q1,r\n"               /* 3 ok */
                       "c.txt, ,2025-Q2,r\n"                  /* 4 blank entity */
                       "d\"q.txt,acme,2025-Q3,r\n"            /* 5 ok: quote kept */
                       "e.txt,acme,2025-Q4,\"open\n"          /* 6 unterminated */
                       "f.txt,acme,2026,r\n";
    assert_int_equal(tt_manifest_parse(&m, text, strlen(text), "rows.csv", "base", 0, &err),
                     TT_EPARSE);
    /* Every problem of a row is listed, so line 4 has two. */
    assert_int_equal(m.n_errors, 6);
    assert_int_equal(m.errors[0].line, 2);
    assert_string_equal(m.errors[0].message, "text after a closing quote");
    assert_int_equal(m.errors[1].line, 3);
    assert_string_equal(m.errors[1].message, "listed file \"base/b.txt\" not found");
    assert_int_equal(m.errors[2].line, 4);
    assert_string_equal(m.errors[2].message, "empty entity");
    assert_int_equal(m.errors[3].line, 4);
    assert_string_equal(m.errors[3].message, "listed file \"base/c.txt\" not found");
    assert_int_equal(m.errors[4].line, 5);
    assert_int_equal(m.errors[4].status, TT_ENOENT);
    assert_string_equal(m.errors[4].message, "listed file \"base/d\\\"q.txt\" not found");
    assert_int_equal(m.errors[5].line, 6);
    assert_int_equal(tt_manifest_parse(&m, text, strlen(text), "rows.csv", "base",
                                       TT_MANIFEST_SKIP_FILE_CHECK, &err),
                     TT_EPARSE);
    assert_int_equal(m.n_errors, 3);
    assert_int_equal(m.errors[2].line, 6);
    assert_string_equal(m.errors[2].message, "unterminated quoted field");

    /* More than TT_MANIFEST_MAX_ERRORS problems: the first kept, the rest
     * counted. */
    tt_buf many;
    tt_buf_init(&many, 0);
    assert_int_equal(tt_buf_puts(&many, "path\tentity\tperiod\tkind\n"), TT_OK);
    for (int i = 0; i < 30; i++)
        assert_int_equal(tt_buf_printf(&many, "f%d.txt\tacme\t2025-Q%d\tr\n", i, 5 + i % 4), TT_OK);
    assert_int_equal(tt_manifest_parse(&m, many.data, many.len, "many.tsv", NULL,
                                       TT_MANIFEST_SKIP_FILE_CHECK, &err),
                     TT_EPARSE);
    assert_int_equal(m.n_errors, TT_MANIFEST_MAX_ERRORS);
    assert_int_equal(m.errors_more, 30 - TT_MANIFEST_MAX_ERRORS);
    assert_int_equal(m.errors[0].line, 2);
    assert_int_equal(m.errors[TT_MANIFEST_MAX_ERRORS - 1].line, TT_MANIFEST_MAX_ERRORS + 1);
    tt_buf_release(&many);

    /* Binary bytes are refused as such, not parsed. */
    assert_int_equal(tt_manifest_parse(&m, "path\0x", 6, "bin.csv", NULL, 0, &err), TT_EBINARY);
    assert_int_equal(tt_manifest_load(&m, FIX "/no-such.tsv", 0, &err), TT_ENOENT);
    tt_manifest_release(&m);
}

/* Manifests written by Python's csv module, CSV and TSV, with awkward
 * values, read back by both. */
static void test_csv_tsv_against_python(void **state)
{
    (void)state;
    static const char *program =
        "import csv, random, sys\n"
        "r = random.Random(1995)\n"
        "delim = sys.argv[1][0]\n"
        "name = sys.argv[1][1:]\n"
        "bits = ['a', 'b c', ',', '\"', 'x\"\"y', '\\t', '\\n', '\\r\\n', ';', \"'\", '\\u00e9', '\\u20ac', ' ']\n"
        "periods = ['2025', '2025-Q3', 'FY2024', 'FY2025-Q1', '2025-09', '2024-02-29']\n"
        "def val(): return ''.join(r.choice(bits) for _ in range(r.randint(1, 5)))\n"
        "with open(name, 'w', newline='', encoding='utf-8-sig') as f:\n"
        "  w = csv.writer(f, dialect='excel-tab' if delim == 't' else 'excel')\n"
        "  w.writerow(['kind', 'note', 'path', 'period', 'entity', 'extra'])\n"
        "  for i in range(300):\n"
        "    w.writerow([val(), val(), 'dir %d/f,%d.txt' % (i, i), r.choice(periods), 'e' + val(), val()])\n"
        "with open(name, newline='', encoding='utf-8-sig') as f:\n"
        "  for row in csv.reader(f, dialect='excel-tab' if delim == 't' else 'excel'):\n"
        "    print(' '.join(v.encode().hex() or '-' for v in row))\n";
    for (int pass = 0; pass < 2; pass++) {
        char arg[400], file[350];
        snprintf(file, sizeof file, "%s/py%d.%s", tmp_root, pass, pass ? "tsv" : "csv");
        snprintf(arg, sizeof arg, "%c%s", pass ? 't' : 'c', file);
        char *out = run_python(program, arg);
        tt_manifest m;
        tt_manifest_init(&m);
        tt_error err;
        tt_error_init(&err);
        tt_status st = tt_manifest_load(&m, file, TT_MANIFEST_SKIP_FILE_CHECK, &err);
        if (st != TT_OK) {
            char e[1024];
            fail_msg("%s", tt_error_format(&err, e, sizeof e));
        }
        assert_int_equal(m.n, 300);
        assert_int_equal(m.n_tags, 2);
        assert_string_equal(m.tag_names[0], "note");
        assert_string_equal(m.tag_names[1], "extra");
        char *save = NULL;
        size_t row = 0;
        for (char *line = strtok_r(out, "\n", &save); line; line = strtok_r(NULL, "\n", &save)) {
            char *v[6], *s2 = NULL;
            int k = 0;
            for (char *t = strtok_r(line, " ", &s2); t && k < 6; t = strtok_r(NULL, " ", &s2))
                v[k++] = strcmp(t, "-") == 0 ? (char *)"" : unhex(t);
            assert_int_equal(k, 6);
            if (row == 0) {
                assert_string_equal(v[2], "path");
            } else {
                const tt_doc_meta *d = &m.docs[row - 1];
                char dir[400];
                snprintf(dir, sizeof dir, "%s", tmp_root);
                assert_string_equal(d->kind, v[0]);
                assert_string_equal(d->tags[0], v[1]);
                assert_string_equal(d->path, resolved(dir, v[2]));
                assert_string_equal(period_text(&d->period), v[3]);
                assert_string_equal(d->entity, v[4]);
                assert_string_equal(d->tags[1], v[5]);
            }
            row++;
        }
        assert_int_equal(row, 301);
        tt_manifest_release(&m);
        free(out);
    }
}

/* A 1,000-row manifest of real files: every row found by its path in
 * another spelling, by file identity through an absolute path, absent
 * paths not found; timing printed for the record. */
static void test_thousand_rows(void **state)
{
    (void)state;
    char dir[400], path[600];
    snprintf(dir, sizeof dir, "%s/big", tmp_root);
    assert_int_equal(mkdir(dir, 0755), 0);
    tt_buf man;
    tt_buf_init(&man, 0);
    assert_int_equal(tt_buf_puts(&man, "path,entity,period,kind,seq\n"), TT_OK);
    for (int i = 0; i < 1000; i++) {
        snprintf(path, sizeof path, "%s/doc-%04d.txt", dir, i);
        put_file(path, "x\n");
        int q = i % 40; /* 40 quarters from 2016-Q1, 25 entities */
        assert_int_equal(tt_buf_printf(&man, "doc-%04d.txt,ent%02d,%d-Q%d,report,%d\n", i, i / 40,
                                       2016 + q / 4, q % 4 + 1, i),
                         TT_OK);
    }
    snprintf(path, sizeof path, "%s/manifest.csv", dir);
    put_file(path, man.data);
    tt_buf_release(&man);

    tt_manifest m;
    tt_manifest_init(&m);
    tt_error err;
    struct timespec t0, t1, t2;
    clock_gettime(CLOCK_MONOTONIC, &t0);
    assert_int_equal(tt_manifest_load(&m, path, 0, &err), TT_OK);
    clock_gettime(CLOCK_MONOTONIC, &t1);
    assert_int_equal(m.n, 1000);
    size_t found = 0;
    for (int round = 0; round < 100; round++) {
        for (int i = 0; i < 1000; i++) {
            char q[700];
            snprintf(q, sizeof q, "%s//./doc-%04d.txt", dir, (i * 7 + round) % 1000);
            const tt_doc_meta *d = tt_manifest_find(&m, q);
            assert_non_null(d);
            found += tt_manifest_tag(&m, (size_t)(d - m.docs), "seq") != NULL;
        }
    }
    clock_gettime(CLOCK_MONOTONIC, &t2);
    assert_int_equal(found, 100000);
    for (int i = 0; i < 1000; i++) {
        snprintf(path, sizeof path, "%s/doc-%04d.txt", dir, i);
        const tt_doc_meta *d = tt_manifest_find(&m, path);
        assert_non_null(d);
        assert_int_equal(d - m.docs, i);
        char seq[16];
        snprintf(seq, sizeof seq, "%d", i);
        assert_string_equal(tt_manifest_tag(&m, (size_t)i, "seq"), seq);
        snprintf(path, sizeof path, "%s/doc-%04d.txt", dir, i + 1000);
        assert_null(tt_manifest_find(&m, path));
    }
    /* Through a relative spelling that only meets by identity. */
    char cwd[2048];
    assert_non_null(getcwd(cwd, sizeof cwd));
    assert_int_equal(chdir(dir), 0);
    const tt_doc_meta *d = tt_manifest_find_file(&m, "doc-0123.txt");
    assert_int_equal(chdir(cwd), 0);
    assert_non_null(d);
    assert_int_equal(d - m.docs, 123);

    /* The series: 25 entities × 40 consecutive quarters. */
    tt_series s;
    tt_series_init(&s);
    assert_int_equal(tt_series_build(&s, m.docs, m.n, NULL, &err), TT_OK);
    assert_int_equal(s.n_entities, 25);
    assert_int_equal(s.n_groups, 1000);
    assert_int_equal(s.n_pairs, 25 * 39);
    for (size_t i = 0; i < s.n_pairs; i++) {
        assert_int_equal(s.pairs[i].gap, 0);
        assert_true(tt_period_consecutive(&s.groups[s.pairs[i].base].period,
                                          &s.groups[s.pairs[i].target].period));
    }
    tt_series_release(&s);
    print_message("1,000-row manifest: load with stat %.2f ms, 100,000 lookups %.2f ms\n",
                  (double)(t1.tv_sec - t0.tv_sec) * 1e3 + (double)(t1.tv_nsec - t0.tv_nsec) / 1e6,
                  (double)(t2.tv_sec - t1.tv_sec) * 1e3 + (double)(t2.tv_nsec - t1.tv_nsec) / 1e6);
    tt_manifest_release(&m);
}

static void test_add(void **state)
{
    (void)state;
    tt_manifest m;
    tt_manifest_init(&m);
    tt_error err;
    tt_period q3, bad = { TT_PERIOD_MONTH, TT_BASIS_CALENDAR, 2025, 0, 13, 0 };
    assert_int_equal(tt_period_parse("2025-Q3", 7, &q3, NULL), TT_OK);
    assert_int_equal(tt_manifest_add(&m, "./x//a.htm", "acme", &q3, NULL, &err), TT_OK);
    assert_int_equal(tt_manifest_add(&m, "x/a.htm", "acme", &q3, "r", &err), TT_EINVAL);
    assert_string_equal(err.message, "duplicate path \"x/a.htm\"");
    assert_int_equal(tt_manifest_add(&m, "x/b.htm", "  ", &q3, "r", &err), TT_EINVAL);
    assert_string_equal(err.message, "empty entity");
    assert_int_equal(tt_manifest_add(&m, "x/b.htm", "acme", &bad, "r", &err), TT_EINVAL);
    assert_string_equal(err.message, "invalid period");
    for (int i = 0; i < 100; i++) {
        char p[32];
        snprintf(p, sizeof p, "x/%d.htm", i);
        assert_int_equal(tt_manifest_add(&m, p, "acme", &q3, "r", &err), TT_OK);
    }
    assert_int_equal(m.n, 101);
    assert_string_equal(m.docs[0].path, "x/a.htm");
    assert_string_equal(m.docs[0].kind, "");
    assert_int_equal(m.docs[0].line, 0);
    assert_ptr_equal(tt_manifest_find(&m, "x/57.htm"), &m.docs[58]);
    tt_manifest_release(&m);
}

/* Out of memory at each allocation in turn while loading: TT_ENOMEM with
 * nothing kept, or TT_OK; no leak (AddressSanitizer in `make SAN=1 test`). */
static void test_load_out_of_memory(void **state)
{
    (void)state;
    int saw_enomem = 0, saw_ok = 0;
    for (int k = 0; k < 200 && !saw_ok; k++) {
        tt_manifest m;
        tt_manifest_init(&m);
        tt_error err;
        tt_error_init(&err);
        tt_test_fail_after = k;
        tt_set_allocator(&(tt_allocator){ tt_test_failing_malloc, tt_test_failing_realloc, free });
        tt_status st = tt_manifest_load(&m, FIX "/good.tsv", 0, &err);
        tt_set_allocator(NULL);
        tt_test_fail_after = -1;
        if (st == TT_OK) {
            saw_ok = 1;
            assert_int_equal(m.n, 7);
        } else {
            assert_int_equal(st, TT_ENOMEM);
            assert_int_equal(err.status, TT_ENOMEM);
            assert_int_equal(m.n, 0);
            saw_enomem = 1;
        }
        tt_manifest_release(&m);
    }
    assert_true(saw_enomem);
    assert_true(saw_ok);
}

/* ---- the demo corpus ---------------------------------------------------- */

static void test_demo_manifest(void **state)
{
    (void)state;
    const char *file = "demo-corpus/manifest.tsv";
    tt_manifest m;
    tt_manifest_init(&m);
    tt_error err;
    tt_error_init(&err);
    tt_status st = tt_manifest_load(&m, file, 0, &err);
    if (st != TT_OK) {
        char e[1024];
        fail_msg("%s", tt_error_format(&err, e, sizeof e));
    }
    /* Row by row against Python's csv reading of the same file. */
    char *out = run_python("import csv, sys\n"
                           "with open(sys.argv[1], newline='', encoding='utf-8') as f:\n"
                           "  rows = list(csv.DictReader(f, dialect='excel-tab'))\n"
                           "for r in rows: print(r['path'], r['entity'], r['period'], r['kind'])\n",
                           file);
    size_t row = 0;
    char *save = NULL;
    for (char *line = strtok_r(out, "\n", &save); line; line = strtok_r(NULL, "\n", &save)) {
        char p[512], e[64], per[16], k[64];
        assert_int_equal(sscanf(line, "%511s %63s %15s %63s", p, e, per, k), 4);
        assert_true(row < m.n);
        const tt_doc_meta *d = &m.docs[row];
        assert_string_equal(d->path, resolved("demo-corpus", p));
        assert_string_equal(d->entity, e);
        assert_string_equal(period_text(&d->period), per);
        assert_string_equal(d->kind, k);
        row++;
    }
    assert_int_equal(row, m.n);
    free(out);

    /* Quarterlies and annual reports of one entity cannot be one series. */
    tt_series s;
    tt_series_init(&s);
    assert_int_equal(tt_series_build(&s, m.docs, m.n, NULL, &err), TT_EINVAL);
    assert_non_null(strstr(err.message, "a calendar quarter and a fiscal year cannot be in one "
                                        "series (kinds call-transcript and annual-report)"));

    /* Quarterly series: quarterly reports and calls, both entities, 2023-Q3
     * to 2025-Q4 without a gap (the calls cover every quarter). */
    tt_series_options o;
    tt_series_options_init(&o);
    o.kinds = "quarterly-report,call-transcript";
    assert_int_equal(tt_series_build(&s, m.docs, m.n, &o, &err), TT_OK);
    assert_int_equal(s.n_entities, 2);
    assert_int_equal(s.n_groups, 20);
    assert_int_equal(s.n_pairs, 18);
    assert_int_equal(s.excluded, 6);
    for (size_t i = 0; i < s.n_pairs; i++)
        assert_int_equal(s.pairs[i].gap, 0);
    assert_string_equal(s.groups[0].entity, "ambleworth");
    assert_string_equal(period_text(&s.groups[0].period), "2023-Q3");
    assert_string_equal(period_text(&s.groups[9].period), "2025-Q4");
    tt_period p;
    assert_int_equal(tt_period_parse("2025-Q2", 7, &p, NULL), TT_OK);
    long g = tt_series_find(&s, "hollowmere", &p);
    assert_true(g >= 0);
    assert_int_equal(s.groups[g].n_docs, 2); /* the report and the call */
    /* The same series by granularity instead of kind. */
    tt_series_options_init(&o);
    o.granularity = TT_PERIOD_QUARTER;
    assert_int_equal(tt_series_build(&s, m.docs, m.n, &o, &err), TT_OK);
    assert_int_equal(s.n_groups, 20);

    /* Quarterly reports only: there is no Q4 report, so 2024-Q3 → 2025-Q1
     * is a pair with a gap of one quarter. */
    tt_series_options_init(&o);
    o.kinds = "quarterly-report";
    o.entity = "hollowmere";
    assert_int_equal(tt_series_build(&s, m.docs, m.n, &o, &err), TT_OK);
    assert_int_equal(s.n_groups, 6);
    assert_int_equal(s.n_pairs, 5);
    size_t gaps = 0;
    for (size_t i = 0; i < s.n_pairs; i++) {
        if (s.pairs[i].gap) {
            gaps++;
            assert_int_equal(s.pairs[i].gap, 1);
            assert_string_equal(period_text(&s.groups[s.pairs[i].base].period), "2024-Q3");
            assert_string_equal(period_text(&s.groups[s.pairs[i].target].period), "2025-Q1");
        }
    }
    assert_int_equal(gaps, 1);

    /* Annual reports: fiscal years. */
    tt_series_options_init(&o);
    o.kinds = "annual-report";
    assert_int_equal(tt_series_build(&s, m.docs, m.n, &o, &err), TT_OK);
    assert_int_equal(s.n_groups, 6);
    assert_string_equal(period_text(&s.groups[3].period), "FY2023");
    assert_int_equal(s.n_pairs, 4);
    tt_series_release(&s);

    /* The layout finds in each file name what the manifest says. */
    tt_layout l;
    tt_layout_init(&l);
    assert_int_equal(tt_layout_compile(&l, "{entity}/{period}-{kind}.*", &err), TT_OK);
    for (size_t i = 0; i < m.n; i++) {
        tt_layout_fields f;
        st = tt_layout_match(&l, "demo-corpus", m.docs[i].path, &f, &err);
        if (st != TT_OK)
            fail_msg("%s: %s", err.file, err.message);
        assert_string_equal(f.entity, m.docs[i].entity);
        assert_string_equal(f.kind, m.docs[i].kind);
        assert_int_equal(tt_period_compare(&f.period, &m.docs[i].period), 0);
    }
    tt_layout_release(&l);
    tt_manifest_release(&m);
}

/* ---- layouts ------------------------------------------------------------- */

static void test_layout_matches(void **state)
{
    (void)state;
    static const struct {
        const char *layout, *root, *path, *entity, *period, *kind;
    } cases[] = {
        { "{entity}/{period}/*", NULL, "acme/2025-Q3/report.htm", "acme", "2025-Q3", "" },
        { "{entity}/{period}/*", "data", "data/acme/FY2025/x", "acme", "FY2025", "" },
        { "{entity}/{period}/*", "./data/", "data//acme/2025-09/x", "acme", "2025-09", "" },
        { "{entity}/{period}/*", "/", "/acme/2025/x", "acme", "2025", "" },
        { "{entity}/{period}-*", NULL, "acme/2025-Q3-call.txt", "acme", "2025-Q3", "" },
        { "{entity}/{period}-*", NULL, "acme/2025-09-30-8k.txt", "acme", "2025-09-30", "" },
        { "{entity}-{period}.htm", NULL, "acme-corp-2025-Q3.htm", "acme-corp", "2025-Q3", "" },
        { "{entity}/**/{period}-*", NULL, "acme/filings/2025/2025-Q3-x.htm", "acme", "2025-Q3",
          "" },
        { "{entity}/**/{period}-*", NULL, "acme/2025-Q3-x.htm", "acme", "2025-Q3", "" },
        { "**/{entity}/{period}.*", NULL, "x/y/acme/2025.htm", "acme", "2025", "" },
        { "{period}{kind}/{entity}", NULL, "2025-Q3annual/acme", "acme", "2025-Q3", "annual" },
        /* {entity} is tried shortest first, but "acme" followed by "_2025"
         * leaves "2025_FY2025" for {period}, which does not parse. */
        { "{kind}/{entity}_{period}.txt", NULL, "call/acme_2025_FY2025.txt", "acme_2025", "FY2025",
          "call" },
    };
    for (size_t i = 0; i < sizeof cases / sizeof cases[0]; i++) {
        tt_layout l;
        tt_layout_init(&l);
        tt_error err;
        assert_int_equal(tt_layout_compile(&l, cases[i].layout, &err), TT_OK);
        tt_layout_fields f;
        if (tt_layout_match(&l, cases[i].root, cases[i].path, &f, &err) != TT_OK)
            fail_msg("%s on %s: %s", cases[i].layout, cases[i].path, err.message);
        assert_string_equal(f.entity, cases[i].entity);
        assert_string_equal(period_text(&f.period), cases[i].period);
        assert_string_equal(f.kind, cases[i].kind);
        tt_layout_release(&l);
    }
}

static void test_layout_errors(void **state)
{
    (void)state;
    static const struct {
        const char *layout, *message;
    } bad[] = {
        { "{entity}/{period}/{foo}", "unknown placeholder {foo}" },
        { "{entity}/*", "no {period} placeholder" },
        { "{period}/*", "no {entity} placeholder" },
        { "{entity}/{period}/***", "'***'" },
        { "{entity/{period}", "unknown placeholder {entity/{period}" },
        { "{entity}/{period}/{kind", "'{' without '}'" },
        { "{entity}/{entity}/{period}", "{entity} appears twice" },
        { "", "no {entity} placeholder" },
    };
    for (size_t i = 0; i < sizeof bad / sizeof bad[0]; i++) {
        tt_layout l;
        tt_layout_init(&l);
        tt_error err;
        assert_int_equal(tt_layout_compile(&l, bad[i].layout, &err), TT_EINVAL);
        if (!strstr(err.message, bad[i].message))
            fail_msg("%s: %s", bad[i].layout, err.message);
        assert_null(l.tokens);
        tt_layout_release(&l);
    }

    tt_layout l;
    tt_layout_init(&l);
    tt_error err;
    tt_layout_fields f;
    assert_int_equal(tt_layout_compile(&l, "{entity}/{period}-*", &err), TT_OK);
    assert_int_equal(tt_layout_match(&l, NULL, "acme/readme.txt", &f, &err), TT_EPARSE);
    assert_string_equal(err.file, "acme/readme.txt");
    assert_string_equal(err.message, "does not match the layout \"{entity}/{period}-*\"");
    assert_int_equal(tt_layout_match(&l, NULL, "acme/2025-Q5-call.txt", &f, &err), TT_EPARSE);
    assert_string_equal(err.message, "unknown period syntax \"2025-Q5\": a quarter is Q1 to Q4 "
                                     "(from the layout \"{entity}/{period}-*\")");
    assert_int_equal(tt_layout_match(&l, "data", "other/acme/2025-Q3-x", &f, &err), TT_EINVAL);
    assert_string_equal(err.message, "not under the root \"data\"");
    assert_int_equal(tt_layout_match(&l, "data", "database/acme/2025-Q3-x", &f, &err), TT_EINVAL);
    /* '*' stays inside one directory; the whole path must match. */
    assert_int_equal(tt_layout_match(&l, NULL, "acme/2025-Q3-a/b", &f, &err), TT_EPARSE);
    assert_int_equal(tt_layout_match(&l, NULL, "x/acme/2025-Q3-a", &f, &err), TT_EPARSE);
    assert_int_equal(tt_layout_match(&l, NULL, "acme/2025-Q3-a", &f, &err), TT_OK);
    tt_layout_release(&l);

    /* A layout with many wildcards on a long path ends promptly: the memo
     * of failed states keeps it polynomial. */
    assert_int_equal(tt_layout_compile(&l, "**{entity}**{period}**{kind}**x**y**z**q", &err),
                     TT_OK);
    char path[3000];
    memset(path, 'a', sizeof path - 1);
    path[sizeof path - 1] = '\0';
    for (size_t i = 50; i < sizeof path - 1; i += 50)
        path[i] = '/';
    assert_int_equal(tt_layout_match(&l, NULL, path, &f, &err), TT_EPARSE);
    tt_layout_release(&l);
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_path_resolve_rule),
        cmocka_unit_test(test_path_resolve_against_python),
        cmocka_unit_test(test_load_tsv_fixture),
        cmocka_unit_test(test_load_csv_fixture_bom_crlf_quotes),
        cmocka_unit_test(test_error_fixture_lines),
        cmocka_unit_test(test_header_problems),
        cmocka_unit_test(test_row_syntax_problems),
        cmocka_unit_test(test_csv_tsv_against_python),
        cmocka_unit_test(test_thousand_rows),
        cmocka_unit_test(test_add),
        cmocka_unit_test(test_load_out_of_memory),
        cmocka_unit_test(test_demo_manifest),
        cmocka_unit_test(test_layout_matches),
        cmocka_unit_test(test_layout_errors),
    };
    return cmocka_run_group_tests(tests, setup, teardown);
}
