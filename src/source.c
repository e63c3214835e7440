/* termtide — the source stage: input arguments to a sorted list of files,
 * and one file to bytes in memory (see include/termtide/source.h).
 *
 * Expansion walks a directory tree iteratively with an explicit stack of
 * frames, one per directory on the current path. Each frame holds that
 * directory's entry names, sorted bytewise with strcmp (which compares as
 * unsigned char, so the order does not depend on the locale), and the
 * directory's (st_dev, st_ino). Before descending into a directory its
 * identity is compared with every frame on the stack: a match means a
 * symlink (or bind mount) leads back to a directory already being walked,
 * which is reported as TT_ELOOP instead of followed. The stack never holds
 * more than TT_LIMIT_DIR_DEPTH frames, so memory is bounded by the depth cap
 * times the widest directory. Entries whose names start with '.' are skipped
 * (this also skips "." and ".."). Inside a directory, entries that are
 * neither regular files nor directories (FIFOs, sockets, devices) are left
 * out silently: reading a FIFO would block, and they never hold documents.
 * A path named on the command line is listed whatever its type.
 *
 * Reading uses read(2) in large chunks. A regular file's size (fstat) sizes
 * the buffer once, so an ordinary file costs one allocation and one pass.
 * Gzip is recognised by its magic bytes 1f 8b (RFC 1952, section 2.3.1).
 * The compressed bytes are read whole (about a third of the text's size for
 * prose), then inflated by libdeflate straight into the output buffer, a
 * member at a time; concatenated members (RFC 1952, section 2.2) are
 * inflated in turn, and zero bytes after the last member (tape padding,
 * which gzip(1) also ignores) are accepted. Anything that path does not
 * finish cleanly (corrupt or truncated data, the limit, other trailing
 * bytes) is inflated again by zlib's streaming inflate, which names the
 * exact cause. The limit is checked on the inflated size, which bounds a
 * gzip bomb. */
#include <dirent.h>
#include <errno.h>
#include <fcntl.h>
#include <stdio.h>
#include <stdlib.h>
#include <sys/stat.h>
#include <sys/types.h>
#include <unistd.h>
#include <pthread.h>
#include <zlib.h>

#include <libdeflate.h>

#include "termtide/source.h"
#include "tt_internal.h"

/* Largest single read(2) request: Linux returns at most 0x7ffff000 bytes per
 * call; a smaller request keeps the loop simple and portable. */
#define READ_CHUNK_MAX ((size_t)1 << 28)
/* The smallest output growth step. */
#define GROW_MIN ((size_t)256 * 1024)
/* Largest first guess at a gzip file's inflated size; doubling does the rest. */
#define GZ_GUESS_MAX ((size_t)64 * 1024 * 1024)

void tt_source_list_init(tt_source_list *list)
{
    list->items = NULL;
    list->n = 0;
    list->cap = 0;
}

void tt_source_list_release(tt_source_list *list)
{
    for (size_t i = 0; i < list->n; i++) {
        tt_free(list->items[i].path);
        tt_free(list->items[i].message);
    }
    tt_free(list->items);
    tt_source_list_init(list);
}

/* Takes ownership of path (freed on failure). message may be NULL. */
static tt_status push_entry(tt_source_list *list, char *path, tt_status status,
                            const char *message)
{
    if (list->n == list->cap) {
        size_t cap = list->cap ? list->cap * 2 : 16;
        tt_source_entry *p = tt_reallocarray(list->items, cap, sizeof *p);
        if (!p) {
            tt_free(path);
            return TT_ENOMEM;
        }
        list->items = p;
        list->cap = cap;
    }
    char *msg = NULL;
    if (message) {
        msg = tt_strdup(message);
        if (!msg) {
            tt_free(path);
            return TT_ENOMEM;
        }
    }
    tt_source_entry *e = &list->items[list->n++];
    e->path = path;
    e->status = status;
    e->message = msg;
    return TT_OK;
}

static tt_status push_copy(tt_source_list *list, const char *path, tt_status status,
                           const char *message)
{
    char *p = tt_strdup(path);
    if (!p)
        return TT_ENOMEM;
    return push_entry(list, p, status, message);
}

/* strerror_r in its XSI form (we do not define _GNU_SOURCE), so workers on
 * other threads never share strerror's static buffer. */
static void errno_text(int errnum, char *out, size_t size)
{
    if (strerror_r(errnum, out, size) != 0)
        snprintf(out, size, "error %d", errnum);
}

/* The status and message for a failed stat/open of path. */
static tt_status stat_failure(const char *path, int errnum, char *msg, size_t size)
{
    struct stat lst;
    if (errnum == ENOENT || errnum == ENOTDIR) {
        if (lstat(path, &lst) == 0 && S_ISLNK(lst.st_mode)) {
            snprintf(msg, size, "broken symlink (its target does not exist)");
            return TT_ENOENT;
        }
        snprintf(msg, size, "no such file or directory");
        return TT_ENOENT;
    }
    if (errnum == ELOOP) {
        snprintf(msg, size, "symlink loop: %s resolves through too many symlinks", path);
        return TT_ELOOP;
    }
    errno_text(errnum, msg, size);
    return TT_EIO;
}

static char *join_path(const char *dir, const char *name)
{
    size_t dl = strlen(dir), nl = strlen(name);
    int slash = dl > 0 && dir[dl - 1] != '/';
    char *p = tt_malloc(dl + (size_t)slash + nl + 1);
    if (!p)
        return NULL;
    memcpy(p, dir, dl);
    if (slash)
        p[dl] = '/';
    memcpy(p + dl + (size_t)slash, name, nl + 1);
    return p;
}

typedef struct dir_frame {
    char *path;     /* as it will prefix its entries */
    char **names;   /* sorted; owned */
    size_t n, next;
    dev_t dev;
    ino_t ino;
} dir_frame;

static void frame_release(dir_frame *f)
{
    for (size_t i = 0; i < f->n; i++)
        tt_free(f->names[i]);
    tt_free(f->names);
    tt_free(f->path);
    f->names = NULL;
    f->path = NULL;
    f->n = f->next = 0;
}

static int cmp_names(const void *a, const void *b)
{
    return strcmp(*(char *const *)a, *(char *const *)b);
}

/* Reads and sorts the visible entries of f->path. On an open or read failure
 * returns TT_EIO with the errno text in msg; TT_ENOMEM on allocation failure. */
static tt_status frame_load(dir_frame *f, char *msg, size_t msg_size)
{
    DIR *d = opendir(f->path);
    if (!d) {
        errno_text(errno, msg, msg_size);
        return TT_EIO;
    }
    size_t cap = 0;
    tt_status st = TT_OK;
    for (;;) {
        errno = 0;
        struct dirent *de = readdir(d);
        if (!de) {
            if (errno) {
                errno_text(errno, msg, msg_size);
                st = TT_EIO;
            }
            break;
        }
        if (de->d_name[0] == '.')
            continue;
        if (f->n == cap) {
            size_t ncap = cap ? cap * 2 : 32;
            char **p = tt_reallocarray(f->names, ncap, sizeof *p);
            if (!p) {
                st = TT_ENOMEM;
                break;
            }
            f->names = p;
            cap = ncap;
        }
        f->names[f->n] = tt_strdup(de->d_name);
        if (!f->names[f->n]) {
            st = TT_ENOMEM;
            break;
        }
        f->n++;
    }
    closedir(d);
    if (st == TT_OK && f->n > 1)
        qsort(f->names, f->n, sizeof *f->names, cmp_names);
    return st;
}

/* Walks the directory at root (already stat'ed as st). */
static tt_status expand_dir(tt_source_list *list, const char *root, const struct stat *st)
{
    dir_frame stack[TT_LIMIT_DIR_DEPTH];
    size_t depth = 0;
    char msg[TT_ERROR_MSG_MAX];
    tt_status rc = TT_OK;

    memset(stack, 0, sizeof stack);
    stack[0].path = tt_strdup(root);
    if (!stack[0].path)
        return TT_ENOMEM;
    stack[0].dev = st->st_dev;
    stack[0].ino = st->st_ino;
    depth = 1;
    tt_status ls = frame_load(&stack[0], msg, sizeof msg);
    if (ls != TT_OK) {
        frame_release(&stack[0]);
        if (ls == TT_ENOMEM)
            return TT_ENOMEM;
        return push_copy(list, root, TT_EIO, msg);
    }

    while (depth > 0) {
        dir_frame *top = &stack[depth - 1];
        if (top->next == top->n) {
            frame_release(top);
            depth--;
            continue;
        }
        const char *name = top->names[top->next++];
        char *path = join_path(top->path, name);
        if (!path) {
            rc = TT_ENOMEM;
            break;
        }
        struct stat es;
        if (stat(path, &es) != 0) {
            tt_status fs = stat_failure(path, errno, msg, sizeof msg);
            if ((rc = push_entry(list, path, fs, msg)) != TT_OK)
                break;
            continue;
        }
        if (S_ISREG(es.st_mode)) {
            if ((rc = push_entry(list, path, TT_OK, NULL)) != TT_OK)
                break;
            continue;
        }
        if (!S_ISDIR(es.st_mode)) {
            tt_free(path);
            continue;
        }
        size_t back = depth;
        for (size_t i = 0; i < depth; i++) {
            if (stack[i].dev == es.st_dev && stack[i].ino == es.st_ino) {
                back = i;
                break;
            }
        }
        if (back < depth) {
            snprintf(msg, sizeof msg, "symlink loop: %s points back to %s", path,
                     stack[back].path);
            if ((rc = push_entry(list, path, TT_ELOOP, msg)) != TT_OK)
                break;
            continue;
        }
        if (depth == TT_LIMIT_DIR_DEPTH) {
            snprintf(msg, sizeof msg,
                     "directory nested deeper than %d levels (TT_LIMIT_DIR_DEPTH); not read",
                     TT_LIMIT_DIR_DEPTH);
            if ((rc = push_entry(list, path, TT_ELIMIT, msg)) != TT_OK)
                break;
            continue;
        }
        dir_frame *f = &stack[depth];
        memset(f, 0, sizeof *f);
        f->path = path;
        f->dev = es.st_dev;
        f->ino = es.st_ino;
        ls = frame_load(f, msg, sizeof msg);
        if (ls == TT_ENOMEM) {
            frame_release(f);
            rc = TT_ENOMEM;
            break;
        }
        if (ls != TT_OK) {
            rc = push_copy(list, f->path, TT_EIO, msg);
            frame_release(f);
            if (rc != TT_OK)
                break;
            continue;
        }
        depth++;
    }
    while (depth > 0)
        frame_release(&stack[--depth]);
    return rc;
}

tt_status tt_source_expand(tt_source_list *list, const char *arg)
{
    char msg[TT_ERROR_MSG_MAX];
    struct stat st;

    if (strcmp(arg, "-") == 0)
        return push_copy(list, arg, TT_OK, NULL);
    if (stat(arg, &st) != 0) {
        tt_status fs = stat_failure(arg, errno, msg, sizeof msg);
        return push_copy(list, arg, fs, msg);
    }
    if (S_ISDIR(st.st_mode))
        return expand_dir(list, arg, &st);
    return push_copy(list, arg, TT_OK, NULL);
}

/* ---- reading ---------------------------------------------------------- */

static tt_status limit_error(tt_error *err, const char *name, size_t limit, int gz)
{
    const char *what = gz ? "gzip data expands past" : "file is larger than";
    if (limit == TT_LIMIT_FILE_BYTES)
        return tt_error_set(err, TT_ELIMIT, name, -1,
                            "%s the limit of %zu bytes (TT_LIMIT_FILE_BYTES)", what, limit);
    return tt_error_set(err, TT_ELIMIT, name, -1, "%s the limit of %zu bytes", what, limit);
}

static tt_status read_error(tt_error *err, const char *name, int errnum)
{
    char msg[256];
    errno_text(errnum, msg, sizeof msg);
    return tt_error_set(err, TT_EIO, name, -1, "read failed: %s", msg);
}

/* read(2) retried on EINTR. */
static ssize_t read_some(int fd, void *p, size_t n)
{
    ssize_t r;
    do
        r = read(fd, p, n);
    while (r < 0 && errno == EINTR);
    return r;
}

/* Makes room for at least `want` more bytes in out, growing by doubling but
 * never past limit. Returns the room now available (0 at the limit). */
static tt_status ensure_room(tt_buf *out, size_t want, size_t limit, size_t *room)
{
    size_t have = out->cap ? out->cap - 1 - out->len : 0;
    if (have < want && out->len < limit) {
        size_t extra = want > out->len ? want : out->len;
        if (extra < GROW_MIN)
            extra = GROW_MIN;
        if (extra > limit - out->len)
            extra = limit - out->len;
        tt_status st = tt_buf_grow(out, extra);
        if (st != TT_OK)
            return st;
        have = out->cap - 1 - out->len;
    }
    if (have > limit - out->len)
        have = limit - out->len;
    *room = have;
    return TT_OK;
}

static void *z_alloc(void *opaque, unsigned items, unsigned size)
{
    (void)opaque;
    return tt_reallocarray(NULL, items, size);
}

static void z_free(void *opaque, void *p)
{
    (void)opaque;
    tt_free(p);
}

static int all_zero(const unsigned char *p, size_t n)
{
    for (size_t i = 0; i < n; i++)
        if (p[i])
            return 0;
    return 1;
}

/* The streaming path: zlib inflates the n compressed bytes at comp into
 * out, growing it step by step, and checks every member's end, the limit and
 * the bytes after the last member with exact messages. */
static tt_status inflate_stream(const unsigned char *comp, size_t n, size_t limit, tt_buf *out,
                                const char *name, tt_error *err)
{
    z_stream zs;
    tt_status rc = TT_OK;
    int between = 0;

    memset(&zs, 0, sizeof zs);
    zs.zalloc = z_alloc;
    zs.zfree = z_free;
    /* 15 + 32: the largest window, and a gzip or zlib header detected
     * automatically (zlib manual, inflateInit2). */
    int zr = inflateInit2(&zs, 15 + 32);
    if (zr != Z_OK) {
        if (zr == Z_MEM_ERROR)
            return tt_error_set(err, TT_ENOMEM, name, -1, "out of memory");
        return tt_error_set(err, TT_EIO, name, -1, "cannot start gzip decoder");
    }
    zs.next_in = (unsigned char *)comp; /* zlib reads through a non-const pointer */
    zs.avail_in = (uInt)n;              /* n <= TT_LIMIT_FILE_BYTES < 4 GiB */
    if (n) {
        /* Text compresses some 4-8 times; start near the likely size. */
        size_t guess = n > GZ_GUESS_MAX / 4 ? GZ_GUESS_MAX : n * 4;
        size_t room;
        if ((rc = ensure_room(out, guess, limit, &room)) != TT_OK)
            goto fail_status;
    }

    for (;;) {
        if (between) {
            if (zs.avail_in == 0)
                break;
            if (zs.avail_in >= 2 && zs.next_in[0] == 0x1f && zs.next_in[1] == 0x8b) {
                if (inflateReset(&zs) != Z_OK) {
                    rc = tt_error_set(err, TT_EIO, name, -1, "corrupt gzip data");
                    goto done;
                }
                between = 0;
                continue;
            }
            if (all_zero(zs.next_in, zs.avail_in))
                break;
            rc = tt_error_set(err, TT_EIO, name, -1,
                              "corrupt gzip data: trailing bytes after the last member");
            goto done;
        }

        size_t room;
        if ((rc = ensure_room(out, 1, limit, &room)) != TT_OK)
            goto fail_status;
        unsigned char probe;
        int at_limit = room == 0;
        if (at_limit) {
            /* One byte more would pass the limit: find out whether any
             * output is still pending. */
            zs.next_out = &probe;
            zs.avail_out = 1;
        } else {
            if (room > ((uInt)-1) / 2)
                room = ((uInt)-1) / 2;
            zs.next_out = (unsigned char *)out->data + out->len;
            zs.avail_out = (uInt)room;
        }
        uInt before_out = zs.avail_out;
        uInt before_in = zs.avail_in;
        zr = inflate(&zs, Z_NO_FLUSH);
        size_t produced = before_out - zs.avail_out;
        if (at_limit && produced) {
            rc = limit_error(err, name, limit, 1);
            goto done;
        }
        if (!at_limit) {
            out->len += produced;
            out->data[out->len] = '\0';
        }
        if (zr == Z_STREAM_END) {
            between = 1;
            continue;
        }
        if (zr == Z_DATA_ERROR || zr == Z_NEED_DICT) {
            rc = tt_error_set(err, TT_EIO, name, -1, "corrupt gzip data: %s",
                              zs.msg ? zs.msg : "invalid stream");
            goto done;
        }
        if (zr == Z_MEM_ERROR) {
            rc = tt_error_set(err, TT_ENOMEM, name, -1, "out of memory");
            goto done;
        }
        /* Z_OK or Z_BUF_ERROR: inflate wants more input or more room. With
         * room left and no input left at end of file, the member never
         * ended. */
        if (zs.avail_out > 0 && zs.avail_in == 0) {
            rc = tt_error_set(err, TT_EIO, name, -1, "truncated gzip data");
            goto done;
        }
        if (zs.avail_out > 0 && zs.avail_in > 0 && produced == 0 && before_in == zs.avail_in) {
            rc = tt_error_set(err, TT_EIO, name, -1, "corrupt gzip data: no progress");
            goto done;
        }
    }
    goto done;

fail_status:
    if (rc == TT_ELIMIT)
        rc = limit_error(err, name, limit, 1);
    else
        rc = tt_error_set(err, rc, name, -1, "out of memory");
done:
    inflateEnd(&zs);
    return rc;
}

/* libdeflate allocates through tt_malloc and tt_free, set once before its
 * first decompressor exists. */
static pthread_once_t deflate_once = PTHREAD_ONCE_INIT;

static void deflate_allocator(void)
{
    libdeflate_set_memory_allocator(tt_malloc, tt_free);
}

/* The fast path: libdeflate inflates each member of the n compressed bytes
 * at comp straight into out, about twice as fast as zlib. The output room
 * starts at the last member's ISIZE (RFC 1952, section 2.3.1: the size mod
 * 2^32, the whole size for a file of one member) or 4 times the compressed
 * size, whichever is larger, and doubles when a member does not fit (the
 * member is then inflated again). Returns 1 with out holding the text, or 0
 * to leave the file to the streaming path: any error, the limit reached,
 * bytes after the last member other than zeros, out of memory. That path
 * gives each case its exact message. */
static int inflate_whole(const unsigned char *comp, size_t n, size_t limit, tt_buf *out)
{
    pthread_once(&deflate_once, deflate_allocator);
    struct libdeflate_decompressor *d = libdeflate_alloc_decompressor();
    if (!d)
        return 0;
    int ok = 0;
    size_t off = 0, room;
    size_t guess = n >= 18 ? (size_t)comp[n - 4] | (size_t)comp[n - 3] << 8 |
                                 (size_t)comp[n - 2] << 16 | (size_t)comp[n - 1] << 24
                           : 0;
    if (guess < 4 * n)
        guess = 4 * n;
    if (ensure_room(out, guess < limit ? guess : limit, limit, &room) != TT_OK)
        goto done;
    for (;;) {
        size_t in_used = 0, out_used = 0;
        enum libdeflate_result r = libdeflate_gzip_decompress_ex(
            d, comp + off, n - off, out->data + out->len, room, &in_used, &out_used);
        if (r == LIBDEFLATE_INSUFFICIENT_SPACE) {
            if (room >= limit - out->len ||
                ensure_room(out, room * 2 + 1, limit, &room) != TT_OK)
                goto done;
            continue;
        }
        if (r != LIBDEFLATE_SUCCESS)
            goto done;
        out->len += out_used;
        out->data[out->len] = '\0';
        off += in_used;
        if (off == n || all_zero(comp + off, n - off)) {
            ok = 1;
            goto done;
        }
        if (n - off < 2 || comp[off] != 0x1f || comp[off + 1] != 0x8b ||
            ensure_room(out, GROW_MIN, limit, &room) != TT_OK)
            goto done;
    }
done:
    libdeflate_free_decompressor(d);
    return ok;
}

/* Gzip from fd into out; head holds the first nhead bytes already read. The
 * compressed bytes are read whole (and hashed), then inflated by the fast
 * path, or else by the streaming one. */
static tt_status read_plain(int fd, const unsigned char *head, size_t nhead, size_t hint,
                            size_t limit, tt_buf *out, const char *name, tt_error *err);

static tt_status read_gzip(int fd, const unsigned char *head, size_t nhead, size_t hint,
                           size_t limit, tt_buf *out, tt_sha256 *hash, const char *name,
                           tt_error *err)
{
    tt_buf comp;
    tt_buf_init(&comp, 0);
    tt_status rc = read_plain(fd, head, nhead, hint, TT_LIMIT_FILE_BYTES, &comp, name, err);
    if (rc == TT_OK) {
        if (hash)
            tt_sha256_update(hash, comp.data, comp.len);
        const unsigned char *c = (const unsigned char *)comp.data;
        if (!inflate_whole(c, comp.len, limit, out)) {
            tt_buf_reset(out);
            rc = inflate_stream(c, comp.len, limit, out, name, err);
        }
    }
    tt_buf_release(&comp);
    return rc;
}

/* Plain bytes from fd into out; head holds the first nhead bytes. */
static tt_status read_plain(int fd, const unsigned char *head, size_t nhead, size_t hint,
                            size_t limit, tt_buf *out, const char *name, tt_error *err)
{
    tt_status st;
    size_t room;
    /* With the size known, one exact allocation: one byte past the size, so
     * the read that sees end of file needs no growth. */
    if (hint && (st = tti_buf_grow_kept(out, hint < limit ? hint + 1 : limit)) != TT_OK)
        goto fail;
    if ((st = tt_buf_append(out, head, nhead)) != TT_OK)
        goto fail;
    for (;;) {
        if ((st = ensure_room(out, 1, limit, &room)) != TT_OK)
            goto fail;
        if (room == 0) {
            unsigned char probe;
            ssize_t r = read_some(fd, &probe, 1);
            if (r < 0)
                return read_error(err, name, errno);
            if (r > 0)
                return limit_error(err, name, limit, 0);
            return TT_OK;
        }
        if (room > READ_CHUNK_MAX)
            room = READ_CHUNK_MAX;
        ssize_t r = read_some(fd, out->data + out->len, room);
        if (r < 0)
            return read_error(err, name, errno);
        if (r == 0)
            return TT_OK;
        out->len += (size_t)r;
        out->data[out->len] = '\0';
    }
fail:
    if (st == TT_ELIMIT)
        return limit_error(err, name, limit, 0);
    return tt_error_set(err, st, name, -1, "out of memory");
}

tt_status tt_source_read(const char *path, tt_buf *out, int *was_gzip, tt_error *err)
{
    return tt_source_read_hashed(path, out, was_gzip, NULL, err);
}

tt_status tt_source_read_hashed(const char *path, tt_buf *out, int *was_gzip, tt_sha256 *hash,
                                tt_error *err)
{
    const int is_stdin = strcmp(path, "-") == 0;
    const char *name = is_stdin ? "<stdin>" : path;
    char msg[256];
    struct stat st;
    int fd;
    tt_status rc;
    size_t limit = out->limit < TT_LIMIT_FILE_BYTES ? out->limit : TT_LIMIT_FILE_BYTES;

    tt_buf_reset(out);
    if (was_gzip)
        *was_gzip = 0;
    if (is_stdin) {
        fd = STDIN_FILENO;
    } else {
        do
            fd = open(path, O_RDONLY | O_CLOEXEC);
        while (fd < 0 && errno == EINTR);
        if (fd < 0) {
            int e = errno;
            if (e == ENOENT || e == ENOTDIR)
                return tt_error_set(err, TT_ENOENT, name, -1, "no such file or directory");
            errno_text(e, msg, sizeof msg);
            return tt_error_set(err, e == ELOOP ? TT_ELOOP : TT_EIO, name, -1, "%s", msg);
        }
    }
    if (fstat(fd, &st) != 0) {
        rc = read_error(err, name, errno);
        goto done;
    }
    if (S_ISDIR(st.st_mode)) {
        rc = tt_error_set(err, TT_EIO, name, -1, "is a directory");
        goto done;
    }
    size_t hint = 0;
    if (S_ISREG(st.st_mode) && st.st_size > 0)
        hint = (unsigned long long)st.st_size > SIZE_MAX / 2 ? SIZE_MAX / 2
                                                              : (size_t)st.st_size;

    unsigned char head[2];
    size_t nhead = 0;
    while (nhead < 2) {
        ssize_t r = read_some(fd, head + nhead, 2 - nhead);
        if (r < 0) {
            rc = read_error(err, name, errno);
            goto done;
        }
        if (r == 0)
            break;
        nhead += (size_t)r;
    }
    if (nhead == 2 && head[0] == 0x1f && head[1] == 0x8b) {
        if (was_gzip)
            *was_gzip = 1;
        rc = read_gzip(fd, head, nhead, hint, limit, out, hash, name, err);
    } else if (hint > limit) {
        rc = limit_error(err, name, limit, 0);
    } else {
        rc = read_plain(fd, head, nhead, hint, limit, out, name, err);
        if (rc == TT_OK && hash)
            tt_sha256_update(hash, out->data, out->len);
    }
    if (rc != TT_OK)
        tt_buf_reset(out);
done:
    if (!is_stdin)
        close(fd);
    return rc;
}

tt_status tt_source_list_add(tt_source_list *list, const char *path)
{
    return push_copy(list, path, TT_OK, NULL);
}
