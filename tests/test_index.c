/* Tests of the index (src/index.c, src/cli/cmd_index.c): reading from the
 * index gives byte for byte what reading the files gives (every count view,
 * stderr notes included); incremental runs (unchanged, changed, new and
 * removed files); a run killed with SIGKILL at several points leaves a
 * database that SQLite's own PRAGMA integrity_check (run through Python's
 * standard sqlite3 module, an implementation outside this project) calls
 * "ok", holding whole files only, and the next run completes it; files that
 * are not an index are refused by name and left untouched; a second writer
 * is refused while readers go on; options that change counting are
 * refused with the differing option named. */
#include <fcntl.h>
#include <signal.h>
#include <sys/file.h>
#include <sys/stat.h>
#include <sys/wait.h>
#include <time.h>
#include <unistd.h>

#include "tt_test.h"

static char tmpdir[256];

static char *run(const char *cmd, int *status)
{
    char full[8192];
    snprintf(full, sizeof full, "%s", cmd);
    FILE *p = popen(full, "r");
    assert_non_null(p);
    size_t cap = 1 << 16, n = 0, k;
    char *out = malloc(cap);
    while ((k = fread(out + n, 1, cap - 1 - n, p)) > 0) {
        n += k;
        if (n + 1 == cap) {
            cap *= 2;
            out = realloc(out, cap);
        }
    }
    out[n] = '\0';
    int st = pclose(p);
    *status = WIFEXITED(st) ? WEXITSTATUS(st) : -1;
    return out;
}

/* The program's stdout and stderr (less the timing of the summary line)
 * for one command line, into files under tmpdir named by tag. */
static int tt(const char *args, const char *tag)
{
    char cmd[8192];
    snprintf(cmd, sizeof cmd, "%s %s > %s/%s.out 2> %s/%s.err", tt_test_bin(), args, tmpdir, tag,
             tmpdir, tag);
    int st = system(cmd);
    return WIFEXITED(st) ? WEXITSTATUS(st) : -1;
}

static int same_file(const char *a, const char *b)
{
    char pa[512], pb[512];
    snprintf(pa, sizeof pa, "%s/%s", tmpdir, a);
    snprintf(pb, sizeof pb, "%s/%s", tmpdir, b);
    size_t na, nb;
    char *x = tt_test_slurp(pa, &na), *y = tt_test_slurp(pb, &nb);
    int same = x && y && na == nb && !memcmp(x, y, na);
    if (!same)
        print_message("%s and %s differ (%zu and %zu bytes)\n", a, b, na, nb);
    free(x);
    free(y);
    return same;
}

/* Drops the lines holding " MB in " (the summary line, with its timing). */
static void drop_summary(char *s)
{
    char *w = s;
    for (char *line = s; *line;) {
        char *end = strchr(line, '\n');
        size_t len = end ? (size_t)(end - line) + 1 : strlen(line);
        char save = line[len - (end ? 1 : 0)];
        line[len - (end ? 1 : 0)] = '\0';
        int keep = !strstr(line, " MB in ");
        line[len - (end ? 1 : 0)] = save;
        if (keep) {
            memmove(w, line, len);
            w += len;
        }
        line += len;
    }
    *w = '\0';
}

/* stderr without the closing summary line (it holds the time taken) */
static int same_notes(const char *a, const char *b)
{
    char pa[512], pb[512];
    snprintf(pa, sizeof pa, "%s/%s", tmpdir, a);
    snprintf(pb, sizeof pb, "%s/%s", tmpdir, b);
    size_t na, nb;
    char *x = tt_test_slurp(pa, &na), *y = tt_test_slurp(pb, &nb);
    int same = x && y;
    if (same) {
        drop_summary(x);
        drop_summary(y);
        same = !strcmp(x, y);
        if (!same)
            print_message("notes differ:\n%s\n---\n%s\n", x, y);
    }
    free(x);
    free(y);
    return same;
}

static int setup(void **state)
{
    (void)state;
    snprintf(tmpdir, sizeof tmpdir, TT_TEST_TMP "tt_index_XXXXXX");
    assert_non_null(mkdtemp(tmpdir));
    return 0;
}

static int teardown(void **state)
{
    (void)state;
    char cmd[512];
    snprintf(cmd, sizeof cmd, "rm -rf %s", tmpdir);
    return system(cmd);
}

/* Every count view from the index equals reading the files. */
static void test_same_as_files(void **state)
{
    (void)state;
    char args[1024];
    snprintf(args, sizeof args, "index %s/demo.db demo-corpus/hollowmere demo-corpus/ambleworth",
             tmpdir);
    assert_int_equal(tt(args, "index"), 0);
    static const char *const views[] = { "", "--show summary", "--show classes --total",
                                         "--total-only -f jsonl", "--top 5 --per 1000 -f csv",
                                         "--total -j 2" };
    for (size_t i = 0; i < sizeof views / sizeof *views; i++) {
        snprintf(args, sizeof args, "count %s demo-corpus/hollowmere demo-corpus/ambleworth",
                 views[i]);
        int a = tt(args, "files");
        snprintf(args, sizeof args,
                 "count %s --db %s/demo.db demo-corpus/hollowmere demo-corpus/ambleworth",
                 views[i], tmpdir);
        int b = tt(args, "db");
        assert_int_equal(a, 0);
        assert_int_equal(b, 0);
        if (!same_file("files.out", "db.out") || !same_notes("files.err", "db.err"))
            fail_msg("count %s: the index gives other output than the files", views[i]);
    }
    /* the other reading commands through the same pipeline option */
    static const char *const others[] = {
        "compare --base demo-corpus/hollowmere/2024-Q2-call-transcript.txt --target "
        "demo-corpus/hollowmere/2025-Q4-call-transcript.txt",
        "compare --manifest demo-corpus/manifest.tsv --kinds call-transcript --consecutive",
        "trend --manifest demo-corpus/manifest.tsv --kinds call-transcript --entity hollowmere",
        "describe --term covenant demo-corpus/hollowmere",
    };
    for (size_t i = 0; i < sizeof others / sizeof *others; i++) {
        snprintf(args, sizeof args, "%s", others[i]);
        int a = tt(args, "files");
        snprintf(args, sizeof args, "%s --db %s/demo.db", others[i], tmpdir);
        int b = tt(args, "db");
        assert_int_equal(a, 0);
        assert_int_equal(b, 0);
        if (!same_file("files.out", "db.out") || !same_notes("files.err", "db.err"))
            fail_msg("%s: the index gives other output than the files", others[i]);
    }
    /* indexed under absolute paths, asked with relative ones: the same file,
     * and the names as the query spells them */
    char cwd[512];
    assert_non_null(getcwd(cwd, sizeof cwd));
    snprintf(args, sizeof args, "index -q %s/abs.db %s/demo-corpus/hollowmere", tmpdir, cwd);
    assert_int_equal(tt(args, "abs"), 0);
    assert_int_equal(tt("count --show summary demo-corpus/hollowmere", "files"), 0);
    snprintf(args, sizeof args, "count --show summary --db %s/abs.db demo-corpus/hollowmere",
             tmpdir);
    assert_int_equal(tt(args, "db"), 0);
    assert_true(same_file("files.out", "db.out"));
    assert_true(same_notes("files.err", "db.err"));
    /* the same options with stems refused, the option named */
    snprintf(args, sizeof args, "count --stem --db %s/demo.db", tmpdir);
    assert_int_equal(tt(args, "stem"), 2);
    char p[512];
    snprintf(p, sizeof p, "%s/stem.err", tmpdir);
    size_t n;
    char *err = tt_test_slurp(p, &n);
    assert_non_null(strstr(err, "stem=0"));
    assert_non_null(strstr(err, "stem=1"));
    free(err);
    /* a path the index does not hold is reported, the rest still counted */
    snprintf(args, sizeof args, "count --db %s/demo.db demo-corpus/manifest.tsv "
             "demo-corpus/hollowmere/2024-Q1-call-transcript.txt", tmpdir);
    assert_int_equal(tt(args, "partial"), 2);
    snprintf(p, sizeof p, "%s/partial.err", tmpdir);
    err = tt_test_slurp(p, &n);
    assert_non_null(strstr(err, "demo-corpus/manifest.tsv: not in the index"));
    free(err);
}

static void write_text(const char *name, const char *text)
{
    char p[512];
    snprintf(p, sizeof p, "%s/docs/%s", tmpdir, name);
    FILE *f = fopen(p, "w");
    assert_non_null(f);
    fputs(text, f);
    fclose(f);
}

/* Copies the files named (shell words) into the test's docs folder. */
static void copy_docs(const char *files)
{
    char cmd[2048];
    snprintf(cmd, sizeof cmd, "mkdir -p %s/docs && cp %s %s/docs/", tmpdir, files, tmpdir);
    assert_int_equal(system(cmd), 0);
}

static void test_incremental(void **state)
{
    (void)state;
    char cmd[1024], args[1024], p[512];
    size_t n;
    copy_docs("demo-corpus/hollowmere/2024-Q*-call-*");
    write_text("extra.txt", "Revenue rose. Margins held.\n");
    snprintf(args, sizeof args, "index %s/inc.db %s/docs", tmpdir, tmpdir);
    assert_int_equal(tt(args, "i1"), 0);
    snprintf(p, sizeof p, "%s/i1.err", tmpdir);
    char *err = tt_test_slurp(p, &n);
    assert_non_null(strstr(err, "5 new, 0 changed, 0 unchanged, 0 removed"));
    free(err);
    /* change one, add one, remove one */
    write_text("extra.txt", "Revenue fell. Margins shrank.\n");
    write_text("added.txt", "A new document about covenants.\n");
    snprintf(cmd, sizeof cmd, "rm %s/docs/2024-Q1-call-transcript.txt", tmpdir);
    assert_int_equal(system(cmd), 0);
    snprintf(args, sizeof args, "index --prune %s/inc.db %s/docs", tmpdir, tmpdir);
    assert_int_equal(tt(args, "i2"), 0);
    snprintf(p, sizeof p, "%s/i2.err", tmpdir);
    err = tt_test_slurp(p, &n);
    if (!strstr(err, "1 new, 1 changed, 3 unchanged, 1 removed"))
        fail_msg("second run: %s", err);
    free(err);
    snprintf(args, sizeof args, "count %s/docs", tmpdir);
    assert_int_equal(tt(args, "files"), 0);
    snprintf(args, sizeof args, "count --db %s/inc.db", tmpdir);
    assert_int_equal(tt(args, "db"), 0);
    assert_true(same_file("files.out", "db.out"));
    snprintf(p, sizeof p, "%s/db.out", tmpdir);
    char *out = tt_test_slurp(p, &n);
    assert_non_null(strstr(out, "\tshrank\t"));
    assert_null(strstr(out, "\trose\t"));
    assert_null(strstr(out, "2024-Q1-call"));
    free(out);
}

/* Each file's recorded SHA-256 equals Python's hashlib.sha256 of the file
 * (the reference, run at test time), whether it came from the bytes read
 * for counting (a new file, a gzip file, a file of no documents, a file
 * whose size changed) or from hashing before reading (a file of unchanged
 * size); a change that keeps the size is found by its hash. */
static void test_file_hashes(void **state)
{
    (void)state;
    char cmd[2048], args[1024], p[512];
    size_t n;
    copy_docs("demo-corpus/hollowmere/2024-Q1-call-transcript.txt "
              "demo-corpus/ambleworth/2023-Q4-call-transcript.txt.gz");
    write_text("same.txt", "Revenue glimmered. Margins held.\n");
    write_text("grows.txt", "Costs fell.\n");
    write_text("empty.txt", "");
    for (int round = 0; round < 2; round++) {
        snprintf(args, sizeof args, "index %s/h.db %s/docs", tmpdir, tmpdir);
        assert_int_equal(tt(args, round ? "h2" : "h1"), 0);
        snprintf(p, sizeof p, "%s/%s.err", tmpdir, round ? "h2" : "h1");
        char *err = tt_test_slurp(p, &n);
        const char *want = round ? "0 new, 2 changed, 3 unchanged" : "5 new, 0 changed, 0 unchanged";
        if (!strstr(err, want))
            fail_msg("run %d: %s (expected %s)", round + 1, err, want);
        free(err);
        snprintf(cmd, sizeof cmd,
                 "%s -c 'import hashlib, sqlite3, sys\n"
                 "c = sqlite3.connect(sys.argv[1])\n"
                 "rows = c.execute(\"SELECT path, sha256, size FROM files\").fetchall()\n"
                 "assert len(rows) == 5, rows\n"
                 "for path, sha, size in rows:\n"
                 "    data = open(path, \"rb\").read()\n"
                 "    assert sha == hashlib.sha256(data).hexdigest(), (path, sha)\n"
                 "    assert size == len(data), (path, size)\n' %s/h.db",
                 tt_test_python(), tmpdir);
        assert_int_equal(system(cmd), 0);
        /* the same size with other bytes, and a longer file */
        write_text("same.txt", "Revenue shimmered. Margins held.\n");
        write_text("grows.txt", "Costs fell sharply.\n");
    }
    snprintf(args, sizeof args, "count %s/docs", tmpdir);
    assert_int_equal(tt(args, "files"), 0);
    snprintf(args, sizeof args, "count --db %s/h.db", tmpdir);
    assert_int_equal(tt(args, "db"), 0);
    assert_true(same_file("files.out", "db.out"));
    snprintf(p, sizeof p, "%s/db.out", tmpdir);
    char *out = tt_test_slurp(p, &n);
    assert_null(strstr(out, "\tglimmered\t")); /* the same-size change was read again */
    assert_non_null(strstr(out, "\tshimmered\t"));
    assert_non_null(strstr(out, "\tsharply\t"));
    free(out);
}

/* PRAGMA integrity_check by Python's sqlite3 module; also that every file
 * row has its documents (each test file holds one). */
static void check_integrity(const char *db, long *files)
{
    char cmd[2048];
    snprintf(cmd, sizeof cmd,
             "%s -c 'import sqlite3, sys\n"
             "c = sqlite3.connect(sys.argv[1])\n"
             "print(c.execute(\"PRAGMA integrity_check\").fetchone()[0])\n"
             "print(c.execute(\"SELECT count(*) FROM files\").fetchone()[0])\n"
             "print(c.execute(\"SELECT count(*) FROM files f WHERE NOT EXISTS (SELECT 1 FROM documents d WHERE d.file = f.id)\").fetchone()[0])\n"
             "' %s",
             tt_test_python(), db);
    int st;
    char *out = run(cmd, &st);
    assert_int_equal(st, 0);
    char ok[64] = "";
    long empty = -1;
    assert_int_equal(sscanf(out, "%63s %ld %ld", ok, files, &empty), 3);
    if (strcmp(ok, "ok") || empty != 0)
        fail_msg("after SIGKILL: integrity_check says %s, %ld files without documents", ok,
                 empty);
    free(out);
}

static void test_kill9(void **state)
{
    (void)state;
    char cmd[2048], db[512], args[2048];
    /* 600 small documents: a run of a few tenths of a second */
    snprintf(cmd, sizeof cmd,
             "mkdir -p %s/many && for i in $(seq 1 150); do for f in demo-corpus/hollowmere/"
             "2024-Q*-call-*; do cp $f %s/many/$i-$(basename $f); done; done",
             tmpdir, tmpdir);
    assert_int_equal(system(cmd), 0);
    /* kill at a quarter, half and three quarters of a full run's time, so
     * the kills land mid-run on a fast or a slow (sanitizer) build alike */
    struct timespec t0, t1;
    clock_gettime(CLOCK_MONOTONIC, &t0);
    snprintf(args, sizeof args, "index -q %s/timing.db %s/many", tmpdir, tmpdir);
    assert_int_equal(tt(args, "timing"), 0);
    clock_gettime(CLOCK_MONOTONIC, &t1);
    long full_ms = (t1.tv_sec - t0.tv_sec) * 1000 + (t1.tv_nsec - t0.tv_nsec) / 1000000;
    long delays_ms[4] = { 1, full_ms / 4, full_ms / 2, 3 * full_ms / 4 };
    for (size_t k = 0; k < 4; k++) {
        snprintf(db, sizeof db, "%s/kill%zu.db", tmpdir, k);
        char dir[512];
        snprintf(dir, sizeof dir, "%s/many", tmpdir);
        pid_t pid = fork();
        assert_true(pid >= 0);
        if (pid == 0) {
            int devnull = open("/dev/null", O_WRONLY);
            dup2(devnull, 1);
            dup2(devnull, 2);
            execl(tt_test_bin(), tt_test_bin(), "index", "-q", db, dir, (char *)NULL);
            _exit(127);
        }
        struct timespec ts = { delays_ms[k] / 1000, (delays_ms[k] % 1000) * 1000000L };
        nanosleep(&ts, NULL);
        kill(pid, SIGKILL);
        int st;
        waitpid(pid, &st, 0);
        long files = 0;
        if (access(db, F_OK) == 0) {
            check_integrity(db, &files);
        }
        print_message("killed after %ld of %ld ms: %ld of 600 files were committed\n",
                      delays_ms[k], full_ms, files);
        /* the next run completes it and gives what reading the files gives */
        snprintf(args, sizeof args, "index -q %s %s", db, dir);
        assert_int_equal(tt(args, "resume"), 0);
        check_integrity(db, &files);
        assert_int_equal(files, 600);
    }
    snprintf(args, sizeof args, "count --total-only %s/many", tmpdir);
    assert_int_equal(tt(args, "files"), 0);
    snprintf(args, sizeof args, "count --total-only --db %s", db);
    assert_int_equal(tt(args, "db"), 0);
    assert_true(same_file("files.out", "db.out"));
}

/* The schema is what the README documents (checked with Python's sqlite3
 * module reading the database termtide wrote). */
static void test_schema(void **state)
{
    (void)state;
    char args[1024], cmd[4096];
    snprintf(args, sizeof args, "index -q %s/s.db demo-corpus/hollowmere", tmpdir);
    assert_int_equal(tt(args, "ix"), 0);
    /* the script goes in a file: no shell quoting to get wrong */
    static const char script[] =
        "import sqlite3, sys\n"
        "c = sqlite3.connect(sys.argv[1])\n"
        "want = {\n"
        " 'meta': 'key value',\n"
        " 'files': 'id path sha256 size parts_skipped indexed_at',\n"
        " 'documents': 'id file ord seq name name_rel kind outer_kind encoding type entity period "
        "form notes bytes words_read numbers stopwords short_words terms_kept overlong sentences "
        "distinct_terms terms analysis',\n"
        " 'problems': 'id file ord name name_rel status line offset message skipped',\n"
        " 'terms': 'id term'}\n"
        "tables = sorted(r[0] for r in c.execute(\"SELECT name FROM sqlite_master WHERE type = 'table'\"))\n"
        "assert tables == sorted(want), tables\n"
        "for t, cols in want.items():\n"
        "    have = ' '.join(r[1] for r in c.execute('PRAGMA table_info(%s)' % t))\n"
        "    assert have == cols, (t, have)\n"
        "meta = dict(c.execute('SELECT key, value FROM meta'))\n"
        "assert meta['schema_version'] == '1' and 'stem=0' in meta['profile'], meta\n"
        "assert c.execute('PRAGMA journal_mode').fetchone()[0] == 'wal'\n"
        "n = c.execute('SELECT count(*), sum(words_read) FROM documents').fetchone()\n"
        "print(n[0], n[1])\n";
    char path[512];
    snprintf(path, sizeof path, "%s/schema.py", tmpdir);
    FILE *sf = fopen(path, "w");
    assert_non_null(sf);
    fputs(script, sf);
    fclose(sf);
    snprintf(cmd, sizeof cmd, "%s %s %s/s.db", tt_test_python(), path, tmpdir);
    FILE *p = popen(cmd, "r");
    assert_non_null(p);
    long docs = 0, words = 0;
    int got = fscanf(p, "%ld %ld", &docs, &words);
    int st = pclose(p);
    if (st != 0 || got != 2)
        fail_msg("the schema differs from the README's (see the assertion above)");
    assert_int_equal(docs, 19);
    assert_true(words > 10000);
}

/* Readers go on while a run writes: each sees whole files only (a
 * committed snapshot), and never fails for the writer's sake. */
static void test_readers_while_writing(void **state)
{
    (void)state;
    char cmd[2048], db[512], args[1024], dir[512];
    snprintf(cmd, sizeof cmd,
             "mkdir -p %s/many && for i in $(seq 1 150); do for f in demo-corpus/hollowmere/"
             "2024-Q*-call-*; do cp $f %s/many/$i-$(basename $f); done; done",
             tmpdir, tmpdir);
    assert_int_equal(system(cmd), 0);
    snprintf(db, sizeof db, "%s/busy.db", tmpdir);
    snprintf(dir, sizeof dir, "%s/many", tmpdir);
    /* a first file so that readers have an index to open */
    snprintf(args, sizeof args, "index -q %s demo-corpus/hollowmere/2024-Q1-call-transcript.txt",
             db);
    assert_int_equal(tt(args, "first"), 0);
    pid_t pid = fork();
    assert_true(pid >= 0);
    if (pid == 0) {
        int devnull = open("/dev/null", O_WRONLY);
        dup2(devnull, 1);
        dup2(devnull, 2);
        execl(tt_test_bin(), tt_test_bin(), "index", "-q", db, dir, (char *)NULL);
        _exit(127);
    }
    int reads = 0, during = 0;
    for (;;) {
        int st;
        pid_t done = waitpid(pid, &st, WNOHANG);
        snprintf(args, sizeof args, "count --total-only --top 3 --db %s", db);
        assert_int_equal(tt(args, "reader"), 0);
        reads++;
        if (done == pid) {
            assert_true(WIFEXITED(st) && WEXITSTATUS(st) == 0);
            break;
        }
        during++;
    }
    print_message("%d reads while the index was written, all succeeded\n", during);
    long files = 0;
    check_integrity(db, &files);
    assert_int_equal(files, 601);
}

/* Files that are not an index: refused by name, never written. */
static void test_not_an_index(void **state)
{
    (void)state;
    char path[512], args[1024], p[512], cmd[2048];
    size_t n0, n1, n;
    /* a text file */
    snprintf(path, sizeof path, "%s/notes.txt", tmpdir);
    FILE *f = fopen(path, "w");
    fputs("These are notes, not a database. They must stay as they are.\n", f);
    fclose(f);
    /* a truncated index */
    char trunc[512];
    snprintf(trunc, sizeof trunc, "%s/trunc.db", tmpdir);
    snprintf(args, sizeof args, "index -q %s demo-corpus/hollowmere", trunc);
    assert_int_equal(tt(args, "full"), 0);
    snprintf(cmd, sizeof cmd, "truncate -s 3000 %s && rm -f %s-wal %s-shm", trunc, trunc, trunc);
    assert_int_equal(system(cmd), 0);
    /* an SQLite database of something else */
    char other[512];
    snprintf(other, sizeof other, "%s/other.db", tmpdir);
    snprintf(cmd, sizeof cmd,
             "%s -c 'import sqlite3, sys; c = sqlite3.connect(sys.argv[1]); "
             "c.execute(\"CREATE TABLE t(x)\"); c.commit()' %s", tt_test_python(), other);
    assert_int_equal(system(cmd), 0);
    const char *files[] = { path, trunc, other };
    for (size_t i = 0; i < 3; i++) {
        char *before = tt_test_slurp(files[i], &n0);
        for (int reader = 0; reader < 2; reader++) {
            if (reader)
                snprintf(args, sizeof args, "count --db %s", files[i]);
            else
                snprintf(args, sizeof args, "index %s demo-corpus/ambleworth", files[i]);
            assert_int_equal(tt(args, "bad"), 2);
            snprintf(p, sizeof p, "%s/bad.err", tmpdir);
            char *err = tt_test_slurp(p, &n);
            if (!strstr(err, files[i]) ||
                !(strstr(err, "not a termtide index") || strstr(err, "malformed")))
                fail_msg("%s: %s", files[i], err);
            free(err);
        }
        char *after = tt_test_slurp(files[i], &n1);
        assert_true(n0 == n1 && !memcmp(before, after, n0));
        free(before);
        free(after);
    }
    /* a missing index for reading */
    snprintf(args, sizeof args, "count --db %s/missing.db", tmpdir);
    assert_int_equal(tt(args, "missing"), 2);
}

/* The dictionary holds each term once: the writer keeps it so (terms.term
 * has no SQL index to do it); a database holding a term twice, as a foreign
 * writer could leave it, is refused as damaged by name, for reading and for
 * writing, and left as it was. The duplicate goes in with Python's sqlite3
 * module. */
static void test_duplicate_term(void **state)
{
    (void)state;
    char db[512], args[1024], cmd[2048], p[512];
    size_t n0, n1, n;
    snprintf(db, sizeof db, "%s/dup.db", tmpdir);
    snprintf(args, sizeof args, "index -q %s demo-corpus/hollowmere", db);
    assert_int_equal(tt(args, "dup"), 0);
    snprintf(cmd, sizeof cmd,
             "%s -c 'import sqlite3, sys; c = sqlite3.connect(sys.argv[1]); "
             "t = c.execute(\"SELECT term FROM terms WHERE id = 7\").fetchone()[0]; "
             "c.execute(\"INSERT INTO terms(id, term) VALUES((SELECT max(id) + 1 FROM terms), ?)\", "
             "(t,)); c.commit(); c.execute(\"PRAGMA wal_checkpoint(TRUNCATE)\")' %s",
             tt_test_python(), db);
    assert_int_equal(system(cmd), 0);
    char *before = tt_test_slurp(db, &n0);
    for (int reader = 0; reader < 2; reader++) {
        if (reader)
            snprintf(args, sizeof args, "count --total-only --db %s", db);
        else
            snprintf(args, sizeof args, "index %s demo-corpus/ambleworth", db);
        assert_int_equal(tt(args, "dupbad"), 2);
        snprintf(p, sizeof p, "%s/dupbad.err", tmpdir);
        char *err = tt_test_slurp(p, &n);
        if (!strstr(err, db) || !strstr(err, "damaged index: term ids 7 and"))
            fail_msg("%s", err);
        free(err);
    }
    char *after = tt_test_slurp(db, &n1);
    assert_true(n0 == n1 && !memcmp(before, after, n0));
    free(before);
    free(after);
}

/* A second writer is refused while the first holds the index; readers go on. */
static void test_locked(void **state)
{
    (void)state;
    char db[512], args[1024], p[512];
    size_t n;
    snprintf(db, sizeof db, "%s/locked.db", tmpdir);
    snprintf(args, sizeof args, "index -q %s demo-corpus/hollowmere", db);
    assert_int_equal(tt(args, "first"), 0);
    int fd = open(db, O_RDWR);
    assert_true(fd >= 0);
    assert_int_equal(flock(fd, LOCK_EX | LOCK_NB), 0); /* as a running writer holds it */
    snprintf(args, sizeof args, "index %s demo-corpus/ambleworth", db);
    assert_int_equal(tt(args, "second"), 2);
    snprintf(p, sizeof p, "%s/second.err", tmpdir);
    char *err = tt_test_slurp(p, &n);
    assert_non_null(strstr(err, "another termtide run is writing"));
    free(err);
    snprintf(args, sizeof args, "count --total-only --db %s", db);
    assert_int_equal(tt(args, "reader"), 0);
    close(fd);
    snprintf(args, sizeof args, "index -q %s demo-corpus/ambleworth", db);
    assert_int_equal(tt(args, "third"), 0);
}

/* A directory the user cannot write: a new index there is refused with
 * the file named. As root permissions do not bind, the program runs as the
 * unprivileged user nobody. */
static void test_readonly_dir(void **state)
{
    (void)state;
    char dir[512], cmd[4096], p[512];
    size_t n;
    snprintf(dir, sizeof dir, "%s/ro", tmpdir);
    mkdir(dir, 0555);
    chmod(tmpdir, 0755);
    if (geteuid() == 0)
        snprintf(cmd, sizeof cmd, "setpriv --reuid=65534 --regid=65534 --clear-groups %s index "
                 "%s/new.db %s/demo-corpus/hollowmere > %s/ro.out 2> %s/ro.err",
                 tt_test_bin(), dir, getcwd(p, sizeof p), tmpdir, tmpdir);
    else
        snprintf(cmd, sizeof cmd, "%s index %s/new.db demo-corpus/hollowmere > %s/ro.out "
                 "2> %s/ro.err", tt_test_bin(), dir, tmpdir, tmpdir);
    int st = system(cmd);
    snprintf(p, sizeof p, "%s/ro.err", tmpdir);
    char *err = tt_test_slurp(p, &n);
    if (strstr(err, "setpriv")) {
        print_message("skipped: cannot run as an unprivileged user here: %s\n", err);
        free(err);
        skip();
    }
    assert_int_equal(WEXITSTATUS(st), 2);
    if (!strstr(err, "new.db") || !strstr(err, "ermission"))
        fail_msg("read-only directory: %s", err);
    free(err);
}

/* Shards merged equal one run over all the files: the demo corpus split by
 * company and a generated archive split three ways, in every count view;
 * a file in two shards is reported and counted once; a shard with other
 * counting options is refused by name and the rest still merged. */
static void test_merge(void **state)
{
    (void)state;
    char cmd[4096], args[4096], p[512];
    size_t n;
    snprintf(cmd, sizeof cmd, "%s bench/gen_corpus.py --seed 11 --doc-mb 0.01 --docs 30 "
             "%s/archive > /dev/null", tt_test_python(), tmpdir);
    assert_int_equal(system(cmd), 0);
    snprintf(cmd, sizeof cmd, "cd %s/archive && mkdir a b c && i=0; for f in *.txt; do "
             "mv $f $(echo a b c | cut -d' ' -f$((i %% 3 + 1)))/; i=$((i+1)); done", tmpdir);
    assert_int_equal(system(cmd), 0);
    snprintf(args, sizeof args, "index -q %s/all.db demo-corpus/hollowmere demo-corpus/ambleworth "
             "%s/archive", tmpdir, tmpdir);
    assert_int_equal(tt(args, "all"), 0);
    static const char *const shards[] = { "demo-corpus/hollowmere", "demo-corpus/ambleworth",
                                          "archive/a", "archive/b", "archive/c" };
    for (size_t i = 0; i < 5; i++) {
        if (!strncmp(shards[i], "archive", 7))
            snprintf(args, sizeof args, "index -q %s/shard%zu.db %s/%s", tmpdir, i, tmpdir,
                     shards[i]);
        else
            snprintf(args, sizeof args, "index -q %s/shard%zu.db %s", tmpdir, i, shards[i]);
        assert_int_equal(tt(args, "shard"), 0);
    }
    /* shard 1 again: every file an overlap */
    snprintf(args, sizeof args, "merge %s/merged.db %s/shard3.db %s/shard0.db %s/shard4.db "
             "%s/shard1.db %s/shard2.db %s/shard1.db", tmpdir, tmpdir, tmpdir, tmpdir, tmpdir,
             tmpdir, tmpdir);
    assert_int_equal(tt(args, "merge"), 0);
    snprintf(p, sizeof p, "%s/merge.err", tmpdir);
    char *err = tt_test_slurp(p, &n);
    assert_non_null(strstr(err, "already merged (same bytes); counted once"));
    assert_non_null(strstr(err, "19 overlaps counted once"));
    free(err);
    static const char *const views[] = { "", "--show summary", "--show classes --total",
                                         "--total-only" };
    for (size_t i = 0; i < sizeof views / sizeof *views; i++) {
        snprintf(args, sizeof args, "count %s --db %s/all.db demo-corpus/hollowmere "
                 "demo-corpus/ambleworth %s/archive", views[i], tmpdir, tmpdir);
        assert_int_equal(tt(args, "files"), 0);
        snprintf(args, sizeof args, "count %s --db %s/merged.db", views[i], tmpdir);
        assert_int_equal(tt(args, "db"), 0);
        snprintf(args, sizeof args, "count %s --db %s/all.db", views[i], tmpdir);
        assert_int_equal(tt(args, "files"), 0);
        if (!same_file("files.out", "db.out"))
            fail_msg("count %s: the merged index differs from one run", views[i]);
    }
    /* count tables merge the same way: per document and total, with a part
     * given twice counted once, and --total-only totals */
    static const char *const table_opts[] = { "--total", "--total --per 10000", "--total-only" };
    for (size_t i = 0; i < 3; i++) {
        snprintf(args, sizeof args, "count %s demo-corpus/hollowmere demo-corpus/ambleworth "
                 "%s/archive/a %s/archive/b", table_opts[i], tmpdir, tmpdir);
        assert_int_equal(tt(args, "files"), 0);
        char parts[4][512];
        const char *dirs[4] = { "demo-corpus/hollowmere", "demo-corpus/ambleworth", NULL, NULL };
        char da[512], dbb[512];
        snprintf(da, sizeof da, "%s/archive/a", tmpdir);
        snprintf(dbb, sizeof dbb, "%s/archive/b", tmpdir);
        dirs[2] = da;
        dirs[3] = dbb;
        for (int k = 0; k < 4; k++) {
            snprintf(parts[k], sizeof parts[k], "part%d", k);
            snprintf(args, sizeof args, "count %s %s", table_opts[i], dirs[k]);
            assert_int_equal(tt(args, parts[k]), 0);
        }
        if (i < 2)
            snprintf(args, sizeof args, "merge --tables %s/part0.out %s/part1.out %s/part0.out "
                     "%s/part2.out %s/part3.out", tmpdir, tmpdir, tmpdir, tmpdir, tmpdir);
        else
            snprintf(args, sizeof args, "merge --tables %s/part0.out %s/part1.out %s/part2.out "
                     "%s/part3.out", tmpdir, tmpdir, tmpdir, tmpdir);
        assert_int_equal(tt(args, "db"), 0);
        if (!same_file("files.out", "db.out"))
            fail_msg("merge --tables (count %s) differs from one run", table_opts[i]);
    }
    /* a cut table is refused, by line */
    assert_int_equal(tt("count --top 5 demo-corpus/hollowmere", "cut"), 0);
    snprintf(args, sizeof args, "merge --tables %s/cut.out", tmpdir);
    assert_int_equal(tt(args, "bad"), 2);
    snprintf(p, sizeof p, "%s/bad.err", tmpdir);
    err = tt_test_slurp(p, &n);
    assert_non_null(strstr(err, "cut.out: line 2: the table of"));
    free(err);
    /* a shard with other counting options */
    snprintf(args, sizeof args, "index -q --stem %s/stem.db demo-corpus/hollowmere", tmpdir);
    assert_int_equal(tt(args, "stem"), 0);
    snprintf(args, sizeof args, "merge %s/merged2.db %s/shard0.db %s/stem.db %s/shard1.db",
             tmpdir, tmpdir, tmpdir, tmpdir);
    assert_int_equal(tt(args, "merge2"), 2);
    snprintf(p, sizeof p, "%s/merge2.err", tmpdir);
    err = tt_test_slurp(p, &n);
    assert_non_null(strstr(err, "stem.db: cannot be merged into"));
    /* the two good shards still merged: 19 files each */
    assert_non_null(strstr(err, "3 shards, 1 skipped; 38 files and 38 documents added"));
    free(err);
}

/* index --tone stores each document's tone scores; tone --db then gives
 * what scoring the files gives, and every mismatch of set-up is refused. */
static void test_tone_db(void **state)
{
    (void)state;
    char args[2048], p[512];
    size_t n;
    snprintf(args, sizeof args, "index -q --tone %s/tone.db demo-corpus/hollowmere "
             "demo-corpus/ambleworth", tmpdir);
    assert_int_equal(tt(args, "ix"), 0);
    static const char *const views[] = {
        "demo-corpus/hollowmere demo-corpus/ambleworth --total",
        "--contributors --top 3 demo-corpus/ambleworth",
        "--manifest demo-corpus/manifest.tsv --kinds call-transcript --consecutive",
        "-j 2 -f jsonl --manifest demo-corpus/manifest.tsv --kinds quarterly-report",
    };
    for (size_t i = 0; i < sizeof views / sizeof *views; i++) {
        snprintf(args, sizeof args, "tone %s", views[i]);
        assert_int_equal(tt(args, "files"), 0);
        snprintf(args, sizeof args, "tone %s --db %s/tone.db", views[i], tmpdir);
        assert_int_equal(tt(args, "db"), 0);
        if (!same_file("files.out", "db.out"))
            fail_msg("tone %s: the index gives other scores than the files", views[i]);
    }
    /* the count tables are there too */
    assert_int_equal(tt("count demo-corpus/hollowmere", "files"), 0);
    snprintf(args, sizeof args, "count --db %s/tone.db demo-corpus/hollowmere", tmpdir);
    assert_int_equal(tt(args, "db"), 0);
    assert_true(same_file("files.out", "db.out"));
    /* refused: another negation window; an index without tone; a run
     * without --tone on a tone index; a view that needs the text */
    static const struct {
        const char *args, *message;
    } bad[] = {
        { "tone --window 2 --db %s/tone.db demo-corpus/hollowmere", "window=2" },
        { "index %s/tone.db demo-corpus/hollowmere", "index --tone" },
        { "tone --by part --db %s/tone.db demo-corpus/hollowmere", "read the files" },
    };
    for (size_t i = 0; i < sizeof bad / sizeof *bad; i++) {
        snprintf(args, sizeof args, bad[i].args, tmpdir);
        assert_int_equal(tt(args, "bad"), 2);
        snprintf(p, sizeof p, "%s/bad.err", tmpdir);
        char *err = tt_test_slurp(p, &n);
        if (!strstr(err, bad[i].message))
            fail_msg("%s: %s", args, err);
        free(err);
    }
    snprintf(args, sizeof args, "index -q %s/plain.db demo-corpus/hollowmere", tmpdir);
    assert_int_equal(tt(args, "plain"), 0);
    snprintf(args, sizeof args, "tone --db %s/plain.db demo-corpus/hollowmere", tmpdir);
    assert_int_equal(tt(args, "bad"), 2);
    snprintf(p, sizeof p, "%s/bad.err", tmpdir);
    char *err = tt_test_slurp(p, &n);
    assert_non_null(strstr(err, "holds no analysis"));
    free(err);
    /* a merge keeps the scores; a shard without them is refused */
    snprintf(args, sizeof args, "merge %s/m.db %s/tone.db %s/plain.db", tmpdir, tmpdir, tmpdir);
    assert_int_equal(tt(args, "merge"), 2);
    snprintf(args, sizeof args, "tone demo-corpus/hollowmere --db %s/m.db", tmpdir);
    assert_int_equal(tt(args, "db"), 0);
    assert_int_equal(tt("tone demo-corpus/hollowmere", "files"), 0);
    assert_true(same_file("files.out", "db.out"));
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test_setup_teardown(test_same_as_files, setup, teardown),
        cmocka_unit_test_setup_teardown(test_incremental, setup, teardown),
        cmocka_unit_test_setup_teardown(test_file_hashes, setup, teardown),
        cmocka_unit_test_setup_teardown(test_kill9, setup, teardown),
        cmocka_unit_test_setup_teardown(test_schema, setup, teardown),
        cmocka_unit_test_setup_teardown(test_readers_while_writing, setup, teardown),
        cmocka_unit_test_setup_teardown(test_not_an_index, setup, teardown),
        cmocka_unit_test_setup_teardown(test_duplicate_term, setup, teardown),
        cmocka_unit_test_setup_teardown(test_locked, setup, teardown),
        cmocka_unit_test_setup_teardown(test_readonly_dir, setup, teardown),
        cmocka_unit_test_setup_teardown(test_merge, setup, teardown),
        cmocka_unit_test_setup_teardown(test_tone_db, setup, teardown),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
