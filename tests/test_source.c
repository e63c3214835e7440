/* Tests for the source stage (src/source.c): directory expansion and file
 * reading.
 *
 * References: the expected listing of a directory tree is produced at test
 * time by an independent walk in Python's standard library (os.listdir on
 * bytes paths, sorted(), os.stat), which sorts bytewise like the contract
 * asks; gzip input is made with zlib's own deflate and the inflated bytes
 * are compared with Python's gzip.decompress (which also reads concatenated
 * members, RFC 1952 section 2.2). The trees are built in a mkdtemp()
 * directory and removed afterwards. */
#include "tt_test.h"

#include <errno.h>
#include <fcntl.h>
#include <sys/stat.h>
#include <sys/wait.h>
#include <unistd.h>
#include <zlib.h>

#include "termtide/alloc.h"
#include "termtide/limits.h"
#include "termtide/sha256.h"
#include "termtide/source.h"

static char tmp_root[256];

static void path_of(char *out, size_t size, const char *rel)
{
    snprintf(out, size, "%s/%s", tmp_root, rel);
}

static void put_file(const char *rel, const void *data, size_t n)
{
    char p[512];
    path_of(p, sizeof p, rel);
    FILE *f = fopen(p, "wb");
    assert_non_null(f);
    if (n)
        assert_int_equal(fwrite(data, 1, n, f), n);
    fclose(f);
}

static void make_dir(const char *rel)
{
    char p[512];
    path_of(p, sizeof p, rel);
    assert_int_equal(mkdir(p, 0755), 0);
}

static void make_link(const char *target, const char *rel)
{
    char p[512];
    path_of(p, sizeof p, rel);
    assert_int_equal(symlink(target, p), 0);
}

static int setup(void **state)
{
    (void)state;
    const char *t = getenv("TMPDIR");
    snprintf(tmp_root, sizeof tmp_root, "%s/tt_source_XXXXXX", t && *t ? t : "/tmp");
    if (!mkdtemp(tmp_root))
        return -1;
    return 0;
}

static int teardown(void **state)
{
    (void)state;
    char cmd[600];
    snprintf(cmd, sizeof cmd, "chmod -R u+rwx '%s' 2>/dev/null; rm -rf '%s'", tmp_root,
             tmp_root);
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

/* The reference walk, in Python: sorted bytewise, dot-entries skipped,
 * symlinks followed, a directory whose (st_dev, st_ino) is already on the
 * current path reported as LOOP, a dangling link as ENOENT, entries that are
 * neither files nor directories left out. One "STATUS<TAB>path" per line. */
static const char *py_walk =
    "import os,sys,stat\n"
    "out=sys.stdout.buffer\n"
    "def walk(d,stack):\n"
    "  for n in sorted(os.listdir(d)):\n"
    "    if n.startswith(b'.'): continue\n"
    "    p=d+b'/'+n\n"
    "    try: st=os.stat(p)\n"
    "    except FileNotFoundError:\n"
    "      out.write(b'ENOENT\\t'+p+b'\\n'); continue\n"
    "    if stat.S_ISREG(st.st_mode): out.write(b'OK\\t'+p+b'\\n')\n"
    "    elif stat.S_ISDIR(st.st_mode):\n"
    "      if (st.st_dev,st.st_ino) in stack: out.write(b'ELOOP\\t'+p+b'\\n')\n"
    "      else: walk(p,stack+[(st.st_dev,st.st_ino)])\n"
    "r=os.fsencode(sys.argv[1]); s=os.stat(r)\n"
    "walk(r,[(s.st_dev,s.st_ino)])\n";

static const char *status_word(tt_status st)
{
    switch (st) {
    case TT_OK: return "OK";
    case TT_ENOENT: return "ENOENT";
    case TT_ELOOP: return "ELOOP";
    case TT_EIO: return "EIO";
    case TT_ELIMIT: return "ELIMIT";
    default: return "OTHER";
    }
}

static void test_sorted_recursive_tree(void **state)
{
    (void)state;
    make_dir("tree");
    put_file("tree/b.txt", "b", 1);
    put_file("tree/a.txt", "a", 1);
    put_file("tree/B.txt", "B", 1);
    put_file("tree/Z.txt", "Z", 1);
    put_file("tree/\xc3\xa9t\xc3\xa9.txt", "e", 1);
    put_file("tree/.hidden.txt", "h", 1);
    make_dir("tree/.git");
    put_file("tree/.git/config", "c", 1);
    make_dir("tree/a_dir");
    put_file("tree/a_dir/one.txt", "1", 1);
    make_dir("tree/a_dir/two");
    put_file("tree/a_dir/two/three.txt", "3", 1);
    make_dir("tree/a-dir");
    put_file("tree/a-dir/x.txt", "x", 1);
    make_link("b.txt", "tree/link_to_b.txt");
    make_link("nowhere.txt", "tree/dangling.txt");
    char fifo[512];
    path_of(fifo, sizeof fifo, "tree/pipe");
    assert_int_equal(mkfifo(fifo, 0644), 0);
    make_dir("tree/loop");
    make_dir("tree/loop/a");
    make_dir("tree/loop/a/b");
    put_file("tree/loop/a/c.txt", "c", 1);
    make_link("../../a", "tree/loop/a/b/link");

    char root[512], cmd[2048], sp[] = TT_TEST_TMP "tt_walk_pyXXXXXX";
    path_of(root, sizeof root, "tree");
    tt_source_list list;
    tt_source_list_init(&list);
    assert_int_equal(tt_source_expand(&list, root), TT_OK);

    int fd = mkstemp(sp);
    assert_true(fd >= 0);
    assert_int_equal(write(fd, py_walk, strlen(py_walk)), (ssize_t)strlen(py_walk));
    close(fd);
    snprintf(cmd, sizeof cmd, "%s %s '%s'", tt_test_python(), sp, root);
    char *ref = run_capture(cmd);
    unlink(sp);

    /* Our listing in the same form. */
    size_t cap = 1 << 16, n = 0;
    char *ours = malloc(cap);
    assert_non_null(ours);
    for (size_t i = 0; i < list.n; i++)
        n += (size_t)snprintf(ours + n, cap - n, "%s\t%s\n", status_word(list.items[i].status),
                              list.items[i].path);
    assert_string_equal(ours, ref);

    /* Spot checks a reader can verify by eye: 'B' (0x42) before 'Z' before
     * 'a'; "a-dir" ('-' 0x2D) before "a.txt" ('.' 0x2E) before "a_dir"
     * ('_' 0x5F); the UTF-8 name (0xC3) last. */
    assert_non_null(strstr(ours, "/tree/B.txt\nOK\t"));
    const char *order[] = { "/B.txt", "/Z.txt", "/a-dir/x.txt", "/a.txt", "/a_dir/one.txt",
                            "/a_dir/two/three.txt", "/b.txt", "/link_to_b.txt",
                            "/loop/a/c.txt", "/\xc3\xa9t\xc3\xa9.txt" };
    const char *prev = ours;
    for (size_t i = 0; i < sizeof order / sizeof order[0]; i++) {
        const char *at = strstr(prev, order[i]);
        assert_non_null(at);
        prev = at;
    }
    assert_null(strstr(ours, "hidden"));
    assert_null(strstr(ours, ".git"));
    assert_null(strstr(ours, "pipe"));

    /* The loop entry and its message; the dangling link. */
    int saw_loop = 0, saw_dangling = 0;
    for (size_t i = 0; i < list.n; i++) {
        const tt_source_entry *e = &list.items[i];
        if (e->status == TT_ELOOP) {
            char want[1200];
            snprintf(want, sizeof want, "symlink loop: %s/loop/a/b/link points back to %s/loop/a",
                     root, root);
            assert_string_equal(e->message, want);
            saw_loop = 1;
        } else if (e->status == TT_ENOENT) {
            assert_non_null(strstr(e->path, "dangling.txt"));
            assert_non_null(e->message);
            saw_dangling = 1;
        } else {
            assert_int_equal(e->status, TT_OK);
            assert_null(e->message);
        }
    }
    assert_true(saw_loop);
    assert_true(saw_dangling);
    free(ours);
    free(ref);
    tt_source_list_release(&list);
}

static void test_single_args(void **state)
{
    (void)state;
    tt_source_list list;
    tt_source_list_init(&list);
    char missing[512], file[512];
    path_of(missing, sizeof missing, "does/not/exist.txt");
    put_file("single.txt", "x", 1);
    path_of(file, sizeof file, "single.txt");
    assert_int_equal(tt_source_expand(&list, "-"), TT_OK);
    assert_int_equal(tt_source_expand(&list, missing), TT_OK);
    assert_int_equal(tt_source_expand(&list, file), TT_OK);
    assert_int_equal(list.n, 3);
    assert_string_equal(list.items[0].path, "-");
    assert_int_equal(list.items[0].status, TT_OK);
    assert_string_equal(list.items[1].path, missing);
    assert_int_equal(list.items[1].status, TT_ENOENT);
    assert_string_equal(list.items[1].message, "no such file or directory");
    assert_string_equal(list.items[2].path, file);
    assert_int_equal(list.items[2].status, TT_OK);
    tt_source_list_release(&list);
    assert_int_equal(list.n, 0);
}

static void test_depth_cap(void **state)
{
    (void)state;
    char rel[1024] = "deep";
    make_dir(rel);
    put_file("deep/f.txt", "f", 1);
    /* TT_LIMIT_DIR_DEPTH + 5 nested directories, a file in each. */
    for (int i = 0; i < TT_LIMIT_DIR_DEPTH + 5; i++) {
        size_t l = strlen(rel);
        snprintf(rel + l, sizeof rel - l, "/d");
        make_dir(rel);
        char f[1100];
        snprintf(f, sizeof f, "%s/f.txt", rel);
        put_file(f, "f", 1);
    }
    char root[512];
    path_of(root, sizeof root, "deep");
    tt_source_list list;
    tt_source_list_init(&list);
    assert_int_equal(tt_source_expand(&list, root), TT_OK);
    /* The root and the TT_LIMIT_DIR_DEPTH - 1 directories below it are read
     * (one file each); the next one is refused and named. */
    size_t ok = 0, limited = 0;
    for (size_t i = 0; i < list.n; i++) {
        if (list.items[i].status == TT_OK)
            ok++;
        else {
            assert_int_equal(list.items[i].status, TT_ELIMIT);
            assert_non_null(strstr(list.items[i].message, "TT_LIMIT_DIR_DEPTH"));
            size_t depth = 0;
            for (const char *p = list.items[i].path + strlen(root); *p; p++)
                depth += *p == '/';
            assert_int_equal(depth, TT_LIMIT_DIR_DEPTH);
            limited++;
        }
    }
    assert_int_equal(ok, TT_LIMIT_DIR_DEPTH);
    assert_int_equal(limited, 1);
    tt_source_list_release(&list);
}

/* The checks of test_unreadable, with plain returns instead of cmocka
 * asserts so they can run in a child process. Returns 0 when all hold. */
static int unreadable_checks(const char *dir, const char *file)
{
    int bad = 0;
    tt_source_list list;
    tt_source_list_init(&list);
    if (tt_source_expand(&list, dir) != TT_OK || list.n != 1 ||
        list.items[0].status != TT_EIO || strcmp(list.items[0].message, strerror(EACCES)) != 0) {
        fprintf(stderr, "unreadable directory: wrong entry\n");
        bad = 1;
    }
    tt_source_list_release(&list);
    tt_buf b;
    tt_error err;
    tt_buf_init(&b, 0);
    tt_error_init(&err);
    if (tt_source_read(file, &b, NULL, &err) != TT_EIO ||
        strcmp(err.message, strerror(EACCES)) != 0 || strcmp(err.file, file) != 0) {
        fprintf(stderr, "unreadable file: got \"%s\"\n", err.message);
        bad = 1;
    }
    tt_buf_release(&b);
    return bad;
}

static void test_unreadable(void **state)
{
    (void)state;
    make_dir("locked");
    put_file("locked/in.txt", "x", 1);
    put_file("secret.txt", "x", 1);
    char dir[512], file[512];
    path_of(dir, sizeof dir, "locked");
    path_of(file, sizeof file, "secret.txt");
    assert_int_equal(chmod(dir, 0), 0);
    assert_int_equal(chmod(file, 0), 0);
    if (geteuid() != 0) {
        assert_int_equal(unreadable_checks(dir, file), 0);
    } else {
        /* Permission bits do not stop root, so the checks run in a child
         * that drops to the unprivileged uid/gid 65534 ("nobody" on Debian),
         * with the temporary root opened for it to traverse. */
        assert_int_equal(chmod(tmp_root, 0755), 0);
        fflush(NULL);
        pid_t pid = fork();
        assert_true(pid >= 0);
        if (pid == 0) {
            if (setgid(65534) != 0 || setuid(65534) != 0)
                _exit(2);
            _exit(unreadable_checks(dir, file));
        }
        int status = 0;
        assert_int_equal(waitpid(pid, &status, 0), pid);
        assert_true(WIFEXITED(status));
        assert_int_equal(WEXITSTATUS(status), 0);
    }
    chmod(dir, 0755);
}

static void test_read_plain(void **state)
{
    (void)state;
    size_t n = (size_t)3 << 20;
    unsigned char *data = malloc(n);
    assert_non_null(data);
    uint32_t x = 7;
    for (size_t i = 0; i < n; i++) {
        x = x * 1664525u + 1013904223u;
        data[i] = (unsigned char)(x >> 24);
    }
    data[0] = 'H'; /* not the gzip magic */
    put_file("plain.bin", data, n);
    put_file("empty.txt", "", 0);
    char p[512], e[512];
    path_of(p, sizeof p, "plain.bin");
    path_of(e, sizeof e, "empty.txt");
    tt_buf b;
    tt_error err;
    int gz = -1;
    tt_buf_init(&b, 0);
    assert_int_equal(tt_source_read(p, &b, &gz, &err), TT_OK);
    assert_int_equal(gz, 0);
    assert_int_equal(b.len, n);
    assert_memory_equal(b.data, data, n);
    assert_int_equal(b.data[b.len], '\0');
    assert_int_equal(tt_source_read(e, &b, &gz, &err), TT_OK);
    assert_int_equal(b.len, 0);
    /* One byte: shorter than the gzip magic. */
    put_file("one.txt", "\x1f", 1);
    path_of(e, sizeof e, "one.txt");
    assert_int_equal(tt_source_read(e, &b, &gz, &err), TT_OK);
    assert_int_equal(b.len, 1);
    tt_buf_release(&b);
    free(data);
}

static void test_read_errors(void **state)
{
    (void)state;
    tt_buf b;
    tt_error err;
    char p[512];
    tt_buf_init(&b, 0);
    path_of(p, sizeof p, "no-such-file.txt");
    tt_error_init(&err);
    assert_int_equal(tt_source_read(p, &b, NULL, &err), TT_ENOENT);
    assert_string_equal(err.file, p);
    assert_string_equal(err.message, "no such file or directory");
    make_dir("adir");
    path_of(p, sizeof p, "adir");
    assert_int_equal(tt_source_read(p, &b, NULL, &err), TT_EIO);
    assert_string_equal(err.message, "is a directory");
    assert_string_equal(err.file, p);
    tt_buf_release(&b);
}

/* gzip made with zlib (windowBits 15 + 16 writes a gzip wrapper, zlib
 * manual, deflateInit2). */
static size_t gzip_bytes(const void *in, size_t n, unsigned char *out, size_t cap)
{
    z_stream zs;
    memset(&zs, 0, sizeof zs);
    assert_int_equal(deflateInit2(&zs, 6, Z_DEFLATED, 15 + 16, 8, Z_DEFAULT_STRATEGY), Z_OK);
    zs.next_in = (unsigned char *)(uintptr_t)in;
    zs.avail_in = (uInt)n;
    zs.next_out = out;
    zs.avail_out = (uInt)cap;
    assert_int_equal(deflate(&zs, Z_FINISH), Z_STREAM_END);
    size_t len = cap - zs.avail_out;
    deflateEnd(&zs);
    return len;
}

static void test_gzip(void **state)
{
    (void)state;
    const char *m1 = "Harborline Fabrication Corp reports steady coil demand.\n";
    const char *m2 = "Second member: freight costs declined.\n";
    size_t cap = 1 << 16;
    unsigned char *gz = malloc(cap);
    assert_non_null(gz);
    size_t n1 = gzip_bytes(m1, strlen(m1), gz, cap);
    size_t n2 = gzip_bytes(m2, strlen(m2), gz + n1, cap - n1);
    put_file("one.gz", gz, n1);
    put_file("two.gz", gz, n1 + n2);
    char p[512], cmd[1200];
    tt_buf b;
    tt_error err;
    int was = 0;
    tt_buf_init(&b, 0);

    path_of(p, sizeof p, "one.gz");
    assert_int_equal(tt_source_read(p, &b, &was, &err), TT_OK);
    assert_int_equal(was, 1);
    assert_string_equal(b.data, m1);

    /* Concatenated members, against Python's gzip.decompress. */
    path_of(p, sizeof p, "two.gz");
    assert_int_equal(tt_source_read(p, &b, &was, &err), TT_OK);
    snprintf(cmd, sizeof cmd,
             "%s -c \"import gzip,sys; sys.stdout.buffer.write(gzip.decompress("
             "open(sys.argv[1],'rb').read()))\" '%s'",
             tt_test_python(), p);
    char *ref = run_capture(cmd);
    assert_string_equal(b.data, ref);
    free(ref);

    /* Zero padding after the last member is accepted. */
    memset(gz + n1, 0, 32);
    put_file("padded.gz", gz, n1 + 32);
    path_of(p, sizeof p, "padded.gz");
    assert_int_equal(tt_source_read(p, &b, &was, &err), TT_OK);
    assert_string_equal(b.data, m1);

    /* Other trailing bytes are not. */
    memcpy(gz + n1, "junk", 4);
    put_file("junk.gz", gz, n1 + 4);
    path_of(p, sizeof p, "junk.gz");
    assert_int_equal(tt_source_read(p, &b, &was, &err), TT_EIO);
    assert_non_null(strstr(err.message, "corrupt gzip data"));
    assert_int_equal(b.len, 0);

    /* Truncated: the trailer cut off, or half the stream. */
    put_file("cut.gz", gz, n1 - 4);
    path_of(p, sizeof p, "cut.gz");
    assert_int_equal(tt_source_read(p, &b, &was, &err), TT_EIO);
    assert_string_equal(err.message, "truncated gzip data");
    assert_string_equal(err.file, p);
    put_file("half.gz", gz, n1 / 2);
    path_of(p, sizeof p, "half.gz");
    assert_int_equal(tt_source_read(p, &b, &was, &err), TT_EIO);
    assert_string_equal(err.message, "truncated gzip data");

    /* Corrupt: a wrong CRC-32 in the trailer (RFC 1952 section 2.3.1); zlib
     * says "incorrect data check". */
    gz[n1 - 8] ^= 0xFF;
    put_file("crc.gz", gz, n1);
    path_of(p, sizeof p, "crc.gz");
    assert_int_equal(tt_source_read(p, &b, &was, &err), TT_EIO);
    assert_string_equal(err.message, "corrupt gzip data: incorrect data check");
    free(gz);
    tt_buf_release(&b);
}

/* Members whose size the reader cannot guess from the file: a first member
 * of 3 MB of repeated prose (compressed some 300 times, so its size is far
 * past 4 times the file's) and a short last one (whose ISIZE, the hint read
 * from the file's end, is tiny), then zero padding; against Python's
 * gzip.decompress. */
static void test_gzip_sizes_unguessable(void **state)
{
    (void)state;
    const char *line = "Coil demand held steady while freight costs declined again.\n";
    size_t big = 3u << 20, ll = strlen(line);
    char *text = malloc(big);
    assert_non_null(text);
    for (size_t i = 0; i < big; i++)
        text[i] = line[i % ll];
    size_t cap = big / 4;
    unsigned char *gz = malloc(cap);
    assert_non_null(gz);
    size_t n1 = gzip_bytes(text, big, gz, cap);
    size_t n2 = gzip_bytes("tail\n", 5, gz + n1, cap - n1);
    memset(gz + n1 + n2, 0, 16);
    assert_true(n1 * 4 < big);
    put_file("unguessable.gz", gz, n1 + n2 + 16);
    char p[512], cmd[1200];
    tt_buf b;
    tt_error err;
    int was = 0;
    tt_buf_init(&b, 0);
    path_of(p, sizeof p, "unguessable.gz");
    assert_int_equal(tt_source_read(p, &b, &was, &err), TT_OK);
    assert_int_equal(b.len, big + 5);
    snprintf(cmd, sizeof cmd,
             "%s -c \"import gzip,hashlib,sys; print(hashlib.sha256(gzip.decompress("
             "open(sys.argv[1],'rb').read())).hexdigest())\" '%s'",
             tt_test_python(), p);
    char *ref = run_capture(cmd);
    char hex[65];
    tt_sha256_hex(b.data, b.len, hex);
    assert_memory_equal(hex, ref, 64);
    free(ref);
    free(gz);
    free(text);
    tt_buf_release(&b);
}

/* The size limit, lowered through the output buffer's own cap: exactly at
 * the limit is read, one byte more is refused; a gzip bomb stops at the
 * limit. */
static void test_limits(void **state)
{
    (void)state;
    size_t lim = (size_t)1 << 20;
    size_t big = (size_t)8 << 20;
    unsigned char *zeros = calloc(1, big + 1);
    size_t cap = big;
    unsigned char *gz = malloc(cap);
    assert_non_null(zeros);
    assert_non_null(gz);
    char p[512];
    tt_buf b;
    tt_error err;
    tt_buf_init(&b, lim);

    memset(zeros, 'z', lim + 1);
    put_file("at-limit.txt", zeros, lim);
    put_file("over-limit.txt", zeros, lim + 1);
    path_of(p, sizeof p, "at-limit.txt");
    assert_int_equal(tt_source_read(p, &b, NULL, &err), TT_OK);
    assert_int_equal(b.len, lim);
    path_of(p, sizeof p, "over-limit.txt");
    assert_int_equal(tt_source_read(p, &b, NULL, &err), TT_ELIMIT);
    assert_non_null(strstr(err.message, "1048576"));

    size_t n = gzip_bytes(zeros, lim, gz, cap);
    put_file("at-limit.gz", gz, n);
    n = gzip_bytes(zeros, lim + 1, gz, cap);
    put_file("over-limit.gz", gz, n);
    memset(zeros, 0, big);
    n = gzip_bytes(zeros, big, gz, cap);
    assert_true(n < 20000); /* a bomb: 8 MiB from a few KiB */
    put_file("bomb.gz", gz, n);
    path_of(p, sizeof p, "at-limit.gz");
    assert_int_equal(tt_source_read(p, &b, NULL, &err), TT_OK);
    assert_int_equal(b.len, lim);
    path_of(p, sizeof p, "over-limit.gz");
    assert_int_equal(tt_source_read(p, &b, NULL, &err), TT_ELIMIT);
    path_of(p, sizeof p, "bomb.gz");
    assert_int_equal(tt_source_read(p, &b, NULL, &err), TT_ELIMIT);
    assert_non_null(strstr(err.message, "gzip"));
    assert_non_null(strstr(err.message, "1048576"));
    assert_int_equal(b.len, 0);
    tt_buf_release(&b);

    /* The library's own limit, on a sparse file one byte larger: refused
     * from its size, without reading it. */
    path_of(p, sizeof p, "sparse.txt");
    int fd = open(p, O_WRONLY | O_CREAT | O_TRUNC, 0644);
    assert_true(fd >= 0);
    assert_int_equal(write(fd, "x", 1), 1);
    assert_int_equal(ftruncate(fd, (off_t)TT_LIMIT_FILE_BYTES + 1), 0);
    close(fd);
    tt_buf_init(&b, 0);
    assert_int_equal(tt_source_read(p, &b, NULL, &err), TT_ELIMIT);
    char want[64];
    snprintf(want, sizeof want, "%zu", (size_t)TT_LIMIT_FILE_BYTES);
    assert_non_null(strstr(err.message, want));
    assert_non_null(strstr(err.message, "TT_LIMIT_FILE_BYTES"));
    unlink(p);
    tt_buf_release(&b);
    free(gz);
    free(zeros);
}

/* Out of memory at each allocation in turn: reported, never crashed on,
 * and the list stays valid. */

static void test_out_of_memory(void **state)
{
    (void)state;
    make_dir("oom");
    make_dir("oom/sub");
    put_file("oom/a.txt", "a", 1);
    put_file("oom/sub/b.txt", "b", 1);
    const char *text = "Harborline Fabrication Corp\n";
    unsigned char gz[256];
    size_t n = gzip_bytes(text, strlen(text), gz, sizeof gz);
    put_file("oom.gz", gz, n);
    char dir[512], file[512];
    path_of(dir, sizeof dir, "oom");
    path_of(file, sizeof file, "oom.gz");
    tt_allocator a = { tt_test_failing_malloc, tt_test_failing_realloc, free };

    int done_expand = 0, done_read = 0;
    for (int k = 0; k < 200 && !(done_expand && done_read); k++) {
        tt_source_list list;
        tt_source_list_init(&list);
        tt_test_fail_after = k;
        tt_set_allocator(&a);
        tt_status st = tt_source_expand(&list, dir);
        tt_set_allocator(NULL);
        assert_true(st == TT_OK || st == TT_ENOMEM);
        if (st == TT_OK) {
            assert_int_equal(list.n, 2);
            done_expand = 1;
        }
        tt_source_list_release(&list);

        tt_buf b;
        tt_error err;
        tt_buf_init(&b, 0);
        tt_test_fail_after = k;
        tt_set_allocator(&a);
        st = tt_source_read(file, &b, NULL, &err);
        tt_set_allocator(NULL);
        assert_true(st == TT_OK || st == TT_ENOMEM);
        if (st == TT_OK) {
            assert_string_equal(b.data, text);
            done_read = 1;
        }
        tt_buf_release(&b);
    }
    tt_test_fail_after = -1;
    assert_true(done_expand && done_read);
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_sorted_recursive_tree),
        cmocka_unit_test(test_single_args),
        cmocka_unit_test(test_depth_cap),
        cmocka_unit_test(test_unreadable),
        cmocka_unit_test(test_read_plain),
        cmocka_unit_test(test_read_errors),
        cmocka_unit_test(test_gzip),
        cmocka_unit_test(test_gzip_sizes_unguessable),
        cmocka_unit_test(test_limits),
        cmocka_unit_test(test_out_of_memory),
    };
    return cmocka_run_group_tests(tests, setup, teardown);
}
