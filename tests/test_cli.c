/* End-to-end tests of `termtide count` through the program itself:
 * an independent cross-check against Python's standard library, the
 * bad-input cases (each named file and cause, the other documents still
 * counted, exit status 2), odd but readable inputs (notes naming the file),
 * thread-count independence, and the share/cumulative invariants. */
#include <errno.h>
#include <fcntl.h>
#include <sys/stat.h>
#include <sys/types.h>
#include <sys/wait.h>
#include <unistd.h>
#include <zlib.h>

#include "tt_test.h"

static char tmpdir[64];

static void path_in(char *out, size_t size, const char *name)
{
    snprintf(out, size, "%s/%s", tmpdir, name);
}

static void write_file(const char *name, const void *data, size_t len)
{
    char p[512];
    path_in(p, sizeof p, name);
    FILE *f = fopen(p, "wb");
    assert_non_null(f);
    assert_int_equal(fwrite(data, 1, len, f), len);
    fclose(f);
}

static char *read_all(const char *path, size_t *len_out)
{
    FILE *f = fopen(path, "rb");
    if (!f)
        return NULL;
    size_t cap = 1 << 16, len = 0;
    char *buf = malloc(cap);
    size_t n;
    while ((n = fread(buf + len, 1, cap - len - 1, f)) > 0) {
        len += n;
        if (cap - len - 1 == 0) {
            cap *= 2;
            buf = realloc(buf, cap);
        }
    }
    fclose(f);
    buf[len] = '\0';
    if (len_out)
        *len_out = len;
    return buf;
}

/* Runs a shell command line; returns the exit status and leaves stdout and
 * stderr in files out.txt / err.txt of the temporary directory. */
static int run(const char *args)
{
    char cmd[8192];
    snprintf(cmd, sizeof cmd, "%s %s >%s/out.txt 2>%s/err.txt", tt_test_bin(), args, tmpdir,
             tmpdir);
    int st = system(cmd);
    assert_true(WIFEXITED(st));
    return WEXITSTATUS(st);
}

static char *out_text(void)
{
    char p[512];
    path_in(p, sizeof p, "out.txt");
    return read_all(p, NULL);
}

static char *err_text(void)
{
    char p[512];
    path_in(p, sizeof p, "err.txt");
    return read_all(p, NULL);
}

static int setup(void **state)
{
    (void)state;
    snprintf(tmpdir, sizeof tmpdir, TT_TEST_TMP "tt_cli_XXXXXX");
    return mkdtemp(tmpdir) ? 0 : -1;
}

static int teardown(void **state)
{
    (void)state;
    char cmd[256];
    snprintf(cmd, sizeof cmd, "chmod -R u+rwx %s; rm -rf %s", tmpdir, tmpdir);
    return system(cmd) == 0 ? 0 : -1;
}

/* Independent cross-check: counts of an ASCII fixture equal a reference
 * computed now by Python's standard library (re + collections.Counter),
 * with the same rules written independently: words are runs of letters and
 * digits joined by hyphens, by an apostrophe between letters and by . or ,
 * between digits (UAX #29 on ASCII prose without colons or dotted
 * abbreviations); lower-cased; a possessive 's or trailing ' dropped;
 * tokens without a letter are numbers and left out. */
static void test_crosscheck_python(void **state)
{
    (void)state;
    const char *fixture = "tests/fixtures/cli/ascii_prose.txt";
    char args[1024];
    snprintf(args, sizeof args, "count --no-stopwords --no-header --quiet %s", fixture);
    assert_int_equal(run(args), 0);
    char cmd[4096];
    snprintf(cmd, sizeof cmd,
             "%s -c '\n"
             "import re, sys, collections\n"
             "text = open(sys.argv[1], encoding=\"ascii\").read()\n"
             "pat = r\"[A-Za-z0-9]+(?:(?:-|(?<=[A-Za-z])\\x27(?=[A-Za-z])|(?<=[0-9])[.,](?=[0-9]))[A-Za-z0-9]+)*\\x27?\"\n"
             "c = collections.Counter()\n"
             "for t in re.findall(pat, text):\n"
             "    t = t.lower()\n"
             "    if t.endswith(\"\\x27s\"): t = t[:-2]\n"
             "    t = t.rstrip(\"\\x27\")\n"
             "    if re.search(\"[a-z]\", t): c[t] += 1\n"
             "for term, n in sorted(c.items(), key=lambda kv: (-kv[1], kv[0])):\n"
             "    print(term, n, sep=\"\\t\")\n"
             "' %s > %s/ref.txt",
             tt_test_python(), fixture, tmpdir);
    assert_int_equal(system(cmd), 0);
    char p[512];
    path_in(p, sizeof p, "ref.txt");
    char *ref = read_all(p, NULL);
    char *out = out_text();
    assert_non_null(ref);
    assert_non_null(out);
    /* Reduce termtide's rows (document rank term count ...) to term\tcount. */
    size_t cap = strlen(out) + 1, len = 0;
    char *mine = malloc(cap);
    char *save = NULL;
    for (char *line = strtok_r(out, "\n", &save); line; line = strtok_r(NULL, "\n", &save)) {
        char *f[5] = { 0 };
        int k = 0;
        char *s = line;
        for (; k < 5; k++) {
            f[k] = s;
            char *tab = strchr(s, '\t');
            if (!tab)
                break;
            *tab = '\0';
            s = tab + 1;
        }
        len += (size_t)snprintf(mine + len, cap - len, "%s\t%s\n", f[2], f[3]);
    }
    assert_true(strlen(ref) > 200);
    assert_string_equal(mine, ref);
    free(mine);
    free(ref);
    free(out);
}

static unsigned char *gzip_bytes(const char *text, size_t *out_len)
{
    uLong bound = compressBound((uLong)strlen(text)) + 32;
    unsigned char *buf = malloc(bound);
    z_stream z;
    memset(&z, 0, sizeof z);
    assert_int_equal(deflateInit2(&z, 6, Z_DEFLATED, 15 + 16, 8, Z_DEFAULT_STRATEGY), Z_OK);
    z.next_in = (unsigned char *)text;
    z.avail_in = (uInt)strlen(text);
    z.next_out = buf;
    z.avail_out = (uInt)bound;
    assert_int_equal(deflate(&z, Z_FINISH), Z_STREAM_END);
    *out_len = z.total_out;
    deflateEnd(&z);
    return buf;
}

/* Bad inputs: each gives a clear error naming the file and the cause; the
 * good documents are still counted; exit status 2. */
static void test_bad_inputs(void **state)
{
    (void)state;
    char p[512], q[512], args[8192];
    write_file("good1.txt", "Harvest revenue rose sharply.\n", 30);
    write_file("good2.htm", "<p>Quillwort margins narrowed</p>", 33);
    write_file("binary.dat", "ab\0\0\0cd\x01\x02", 9);
    size_t glen;
    unsigned char *gz = gzip_bytes("Truncated archive words here and more words follow.", &glen);
    write_file("cut.txt.gz", gz, glen / 2);
    free(gz);
    /* 100,000-deep nesting */
    size_t deep_n = 100000;
    char *deep = malloc(deep_n * 5 + 64);
    size_t dl = 0;
    for (size_t i = 0; i < deep_n; i++) {
        memcpy(deep + dl, "<div>", 5);
        dl += 5;
    }
    memcpy(deep + dl, "deepword", 8);
    dl += 8;
    write_file("deep.html", deep, dl);
    free(deep);
    /* a symlink loop inside a directory */
    path_in(p, sizeof p, "tree");
    mkdir(p, 0755);
    path_in(p, sizeof p, "tree/inner.txt");
    FILE *f = fopen(p, "w");
    fputs("Marlpit inventories fell.\n", f);
    fclose(f);
    path_in(p, sizeof p, "tree/loop");
    path_in(q, sizeof q, "tree");
    assert_int_equal(symlink(q, p), 0);
    char missing[512];
    path_in(missing, sizeof missing, "does-not-exist.txt");

    snprintf(args, sizeof args,
             "count --no-stopwords %s/good1.txt %s/binary.dat %s/cut.txt.gz %s/deep.html %s/tree "
             "%s %s/good2.htm",
             tmpdir, tmpdir, tmpdir, tmpdir, tmpdir, missing, tmpdir);
    assert_int_equal(run(args), 2);
    char *out = out_text(), *err = err_text();
    /* the good documents are all counted */
    assert_non_null(strstr(out, "good1.txt\t"));
    assert_non_null(strstr(out, "\tharvest\t"));
    assert_non_null(strstr(out, "\tquillwort\t"));
    assert_non_null(strstr(out, "\tmarlpit\t"));
    /* each bad one is named with its cause */
    assert_non_null(strstr(err, "binary.dat"));
    assert_non_null(strstr(err, "binary"));
    assert_non_null(strstr(err, "cut.txt.gz"));
    assert_non_null(strstr(err, "gzip"));
    assert_non_null(strstr(err, "does-not-exist.txt"));
    assert_non_null(strstr(err, "loop"));
    /* the deep file is refused with a stated limit or read; never a crash */
    assert_true(strstr(err, "deep.html") != NULL || strstr(out, "deepword") != NULL);
    /* the closing summary */
    assert_non_null(strstr(err, "skipped"));
    free(out);
    free(err);
}

/* One 50 MB line, generated now: read (overlong runs are skipped with a
 * note), the words after it still counted. */
static void test_huge_line(void **state)
{
    (void)state;
    char p[512], args[1024];
    path_in(p, sizeof p, "huge.txt");
    FILE *f = fopen(p, "wb");
    assert_non_null(f);
    char chunk[4096];
    for (size_t i = 0; i < sizeof chunk; i++)
        chunk[i] = (i % 97 == 96) ? ' ' : (char)('a' + i % 26);
    for (int i = 0; i < 50 * 256; i++)
        fwrite(chunk, 1, sizeof chunk, f);
    for (int i = 0; i < 4 * 256; i++) {
        memset(chunk, 'z', sizeof chunk);
        fwrite(chunk, 1, sizeof chunk, f);
    }
    fputs(" finalword\n", f);
    fclose(f);
    snprintf(args, sizeof args, "count --no-stopwords %s --top 3 --show terms", p);
    int rc = run(args);
    char *out = out_text(), *err = err_text();
    assert_int_equal(rc, 0);
    char args2[1024];
    snprintf(args2, sizeof args2, "count --no-stopwords --quiet %s", p);
    assert_int_equal(run(args2), 0);
    char *all = out_text();
    assert_non_null(strstr(all, "\tfinalword\t"));
    assert_non_null(strstr(err, "huge.txt"));
    assert_non_null(strstr(err, "longer than"));
    free(out);
    free(err);
    free(all);
}

/* An unreadable file: as root permissions do not stop reads, so the program
 * is run as the unprivileged user nobody. */
static void test_unreadable(void **state)
{
    (void)state;
    char p[512], good[512];
    path_in(p, sizeof p, "secret.txt");
    write_file("secret.txt", "hidden words\n", 13);
    path_in(good, sizeof good, "open.txt");
    write_file("open.txt", "visible words\n", 14);
    chmod(p, 0);
    chmod(tmpdir, 0755);
    char cmd[4096];
    if (geteuid() == 0)
        snprintf(cmd, sizeof cmd,
                 "setpriv --reuid=65534 --regid=65534 --clear-groups %s count --no-stopwords %s %s "
                 ">%s/out.txt 2>%s/err.txt",
                 tt_test_bin(), p, good, tmpdir, tmpdir);
    else
        snprintf(cmd, sizeof cmd, "%s count --no-stopwords %s %s >%s/out.txt 2>%s/err.txt",
                 tt_test_bin(), p, good, tmpdir, tmpdir);
    int st = system(cmd);
    chmod(p, 0644);
    assert_true(WIFEXITED(st));
    char *out = out_text(), *err = err_text();
    if (WEXITSTATUS(st) == 126 || WEXITSTATUS(st) == 127 || strstr(err, "setpriv")) {
        print_message("skipped: cannot run as an unprivileged user here: %s\n", err);
        free(out);
        free(err);
        skip();
    }
    assert_int_equal(WEXITSTATUS(st), 2);
    assert_non_null(strstr(err, "secret.txt"));
    assert_non_null(strstr(err, "ermission"));
    assert_non_null(strstr(out, "\tvisible\t"));
    free(out);
    free(err);
}

/* Odd but readable inputs are read with a note naming the file. */
static void test_odd_inputs(void **state)
{
    (void)state;
    char args[4096];
    write_file("empty.txt", "", 0);
    /* Windows-1252: curly quotes 0x93/0x94, apostrophe 0x92, e-acute 0xE9 */
    { const char *s = "The \x93" "caf\xe9\x94 plant\x92s output fell.\n"; write_file("old.txt", s, strlen(s)); }
    /* UTF-16LE with BOM: "Ledger rose" */
    const char u16[] = "\xff\xfeL\0e\0d\0g\0e\0r\0 \0r\0o\0s\0e\0";
    write_file("wide.txt", u16, sizeof u16 - 1);
    /* UTF-8 with one stray byte */
    { const char *s = "Na\xc3\xafve tallies \xff counted here and here.\n"; write_file("stray.txt", s, strlen(s)); }
    { const char *s = "<p>alpha <b>beta <p>gamma</i></td> delta"; write_file("broken.html", s, strlen(s)); }
    snprintf(args, sizeof args,
             "count --no-stopwords %s/empty.txt %s/old.txt %s/wide.txt %s/stray.txt "
             "%s/broken.html",
             tmpdir, tmpdir, tmpdir, tmpdir, tmpdir);
    assert_int_equal(run(args), 0);
    char *out = out_text(), *err = err_text();
    assert_non_null(strstr(out, "\tcafé\t"));
    assert_non_null(strstr(out, "old.txt\t"));
    assert_non_null(strstr(out, "\tplant\t"));
    assert_non_null(strstr(out, "\tledger\t"));
    assert_non_null(strstr(out, "\tnaïve\t"));
    assert_non_null(strstr(out, "\tgamma\t"));
    assert_non_null(strstr(out, "\tdelta\t"));
    assert_non_null(strstr(err, "empty.txt"));
    assert_non_null(strstr(err, "old.txt"));
    assert_non_null(strstr(err, "windows-1252"));
    assert_non_null(strstr(err, "wide.txt"));
    assert_non_null(strstr(err, "stray.txt"));
    free(out);
    free(err);
    /* the summary of an empty document divides by nothing */
    snprintf(args, sizeof args, "count --show summary --no-stopwords %s/empty.txt", tmpdir);
    assert_int_equal(run(args), 0);
    out = out_text();
    assert_non_null(strstr(out, "empty.txt\ttext\t\tutf-8\t0\t0\t0\t0\t0\t0.000000\t0\t0.000000"));
    free(out);
}

/* Shares sum to 1 and the last cumulative share is exactly 1; output is the
 * same for -j 1 and -j 3 over a directory of many documents. */
static void test_invariants_and_threads(void **state)
{
    (void)state;
    char args[1024], dir[512];
    path_in(dir, sizeof dir, "inv");
    mkdir(dir, 0755);
    for (int i = 0; i < 24; i++) {
        char name[64], text[256];
        snprintf(name, sizeof name, "inv/doc%02d.txt", i);
        int n = snprintf(text, sizeof text,
                         "Period %d ledger entry %d shows ledger growth and margin %s.\n", i,
                         i * 7, i % 3 ? "pressure" : "relief");
        write_file(name, text, (size_t)n);
    }
    snprintf(args, sizeof args, "count --total-only --no-stopwords --quiet %s", dir);
    assert_int_equal(run(args), 0);
    char *out = out_text();
    double sum = 0;
    char *last_cum = NULL;
    char *save = NULL;
    int rows = 0;
    for (char *line = strtok_r(out, "\n", &save); line; line = strtok_r(NULL, "\n", &save)) {
        if (!strncmp(line, "document\t", 9))
            continue;
        char *f[7];
        char *s = line;
        for (int k = 0; k < 7; k++) {
            f[k] = s;
            char *tab = strchr(s, '\t');
            if (tab) {
                *tab = '\0';
                s = tab + 1;
            }
        }
        assert_string_equal(f[0], "*");
        sum += strtod(f[4], NULL);
        last_cum = f[6];
        rows++;
    }
    assert_true(rows > 5);
    assert_true(sum > 0.999 && sum < 1.001);
    assert_string_equal(last_cum, "1.000000");
    free(out);

    char p1[512], p3[512];
    snprintf(args, sizeof args, "count --ngram 1-2 --quiet -j 1 -o %s/j1.tsv %s", tmpdir, dir);
    assert_int_equal(run(args), 0);
    snprintf(args, sizeof args, "count --ngram 1-2 --quiet -j 3 -o %s/j3.tsv %s", tmpdir, dir);
    assert_int_equal(run(args), 0);
    path_in(p1, sizeof p1, "j1.tsv");
    path_in(p3, sizeof p3, "j3.tsv");
    size_t l1, l3;
    char *a = read_all(p1, &l1), *b = read_all(p3, &l3);
    assert_non_null(a);
    assert_non_null(b);
    assert_true(l1 > 1000);
    assert_int_equal(l1, l3);
    assert_memory_equal(a, b, l1);
    free(a);
    free(b);

    /* --total-only sums in the worker threads: the same for any count */
    snprintf(args, sizeof args, "count --total-only --quiet -j 1 -o %s/t1.tsv %s", tmpdir, dir);
    assert_int_equal(run(args), 0);
    snprintf(args, sizeof args, "count --total-only --quiet -j 3 -o %s/t3.tsv %s", tmpdir, dir);
    assert_int_equal(run(args), 0);
    path_in(p1, sizeof p1, "t1.tsv");
    path_in(p3, sizeof p3, "t3.tsv");
    a = read_all(p1, &l1);
    b = read_all(p3, &l3);
    assert_true(l1 > 200);
    assert_int_equal(l1, l3);
    assert_memory_equal(a, b, l1);
    free(a);
    free(b);
}

/* The running total of --total-only (hits held in each worker's token
 * cache until it ends) equals the '*' table of --total (each document's
 * own table, merged), with -j 1 and -j 2, on documents whose vocabulary is
 * far larger than the cache (ways evicted while holding hits). */
static void test_total_only_equals_merged_tables(void **state)
{
    (void)state;
    char args[1024], dir[512];
    path_in(dir, sizeof dir, "bigvocab");
    mkdir(dir, 0755);
    uint64_t x = 7;
    size_t cap = 600000;
    char *text = malloc(cap);
    assert_non_null(text);
    for (int d = 0; d < 5; d++) {
        size_t n = 0;
        while (n + 40 < cap) {
            x = x * 6364136223846793005ULL + 1442695040888963407ULL;
            double u = (double)(x >> 11) / 9007199254740992.0;
            uint64_t w = (uint64_t)(50000.0 * u * u * u) * 0x9E3779B97F4A7C15ULL;
            size_t len = 1 + (size_t)(w >> 60);
            for (size_t k = 0; k < len; k++) {
                char ch = (char)('a' + (w >> (k * 3)) % 26);
                text[n++] = (k == 0 && (w >> 58 & 3) == 1) ? (char)(ch - 32) : ch;
            }
            text[n++] = (x >> 40) % 11 ? ' ' : '\n';
        }
        char name[64];
        snprintf(name, sizeof name, "bigvocab/doc%d.txt", d);
        write_file(name, text, n);
    }
    free(text);
    /* the '*' rows of --total, in the layout of --total-only */
    snprintf(args, sizeof args, "count --total --quiet -j 1 %s", dir);
    assert_int_equal(run(args), 0);
    char *all = out_text();
    size_t cap2 = strlen(all) + 1, m = 0;
    char *want = malloc(cap2);
    assert_non_null(want);
    for (char *line = all; *line;) {
        char *eol = strchr(line, '\n');
        size_t ll = eol ? (size_t)(eol - line) + 1 : strlen(line);
        if (!strncmp(line, "document\t", 9) || !strncmp(line, "*\t", 2)) {
            memcpy(want + m, line, ll);
            m += ll;
        }
        line += ll;
    }
    want[m] = '\0';
    assert_true(m > 100000);
    for (int j = 1; j <= 3; j++) {
        snprintf(args, sizeof args, "count --total-only --quiet -j %d %s", j, dir);
        assert_int_equal(run(args), 0);
        char *got = out_text();
        assert_string_equal(got, want);
        free(got);
    }
    /* With more than one thread the partial tables are sorted together,
     * never merged, and the rows formatted in parts (one per thread): the
     * same rows in every format, with --top, --min-count and --per cutting
     * inside a part. */
    static const char *const variants[] = {
        "--format csv", "--format jsonl --per 1000", "--min-count 3", "--top 25001",
    };
    for (size_t v = 0; v < sizeof variants / sizeof *variants; v++) {
        snprintf(args, sizeof args, "count --total-only --quiet -j 1 %s %s", variants[v], dir);
        assert_int_equal(run(args), 0);
        char *one = out_text();
        assert_true(strlen(one) > 100000);
        for (int j = 2; j <= 3; j++) {
            snprintf(args, sizeof args, "count --total-only --quiet -j %d %s %s", j, variants[v],
                     dir);
            assert_int_equal(run(args), 0);
            char *got = out_text();
            assert_string_equal(got, one);
            free(got);
        }
        free(one);
    }
    /* The table (over 1 MiB, so written out in pieces as it is formatted)
     * is whole: ranks run 1, 2, 3, ... and each cum_count is the one
     * before plus the row's count. */
    unsigned long long rank = 0, cum = 0;
    for (char *line = strchr(want, '\n') + 1; *line; line = strchr(line, '\n') + 1) {
        unsigned long long r, count, c;
        char term[64];
        assert_int_equal(sscanf(line, "*\t%llu\t%63[^\t]\t%llu\t%*s\t%llu", &r, term, &count, &c),
                         4);
        assert_int_equal(r, ++rank);
        cum += count;
        assert_int_equal(c, cum);
    }
    assert_true(m > (1u << 20));
    free(want);
    free(all);
}

/* --total-only with more threads than the 64 tables sorted together
 * (-j 80 over 80 documents, each worker with a partial of its own): the
 * same table as -j 1. */
static void test_total_only_many_threads(void **state)
{
    (void)state;
    char args[1024], dir[512];
    path_in(dir, sizeof dir, "many");
    mkdir(dir, 0755);
    for (int d = 0; d < 80; d++) {
        char name[64], text[128];
        snprintf(name, sizeof name, "many/doc%02d.txt", d);
        int n = snprintf(text, sizeof text, "ledger%d accrual ledger%d reserve%d accrual\n", d,
                         d % 7, d % 13);
        write_file(name, text, (size_t)n);
    }
    snprintf(args, sizeof args, "count --total-only --quiet -j 1 %s", dir);
    assert_int_equal(run(args), 0);
    char *one = out_text();
    assert_non_null(strstr(one, "*\t1\taccrual\t160\t"));
    snprintf(args, sizeof args, "count --total-only --quiet -j 80 %s", dir);
    assert_int_equal(run(args), 0);
    char *many = out_text();
    assert_string_equal(many, one);
    free(many);
    free(one);
}

static void test_usage_errors(void **state)
{
    (void)state;
    assert_int_equal(run("count --format xml"), 2);
    char *err = err_text();
    assert_non_null(strstr(err, "--format"));
    free(err);
    assert_int_equal(run("count --ngram 4"), 2);
    assert_int_equal(run("frobnicate"), 2);
    assert_int_equal(run("--version"), 0);
    char *out = out_text();
    assert_non_null(strstr(out, "Unicode 15"));
    free(out);
    assert_int_equal(run("help count"), 0);
    out = out_text();
    assert_non_null(strstr(out, "Usage: termtide count"));
    free(out);
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_crosscheck_python),
        cmocka_unit_test(test_bad_inputs),
        cmocka_unit_test(test_huge_line),
        cmocka_unit_test(test_unreadable),
        cmocka_unit_test(test_odd_inputs),
        cmocka_unit_test(test_invariants_and_threads),
        cmocka_unit_test(test_total_only_equals_merged_tables),
        cmocka_unit_test(test_total_only_many_threads),
        cmocka_unit_test(test_usage_errors),
    };
    return cmocka_run_group_tests(tests, setup, teardown);
}
