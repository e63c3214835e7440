/* termtide — the index on SQLite.
 *
 * Schema (version 1; documented in the README):
 *   meta(key, value)            schema_version, profile, created_by
 *   files(id, path, sha256, size, parts_skipped, indexed_at)
 *   documents(id, file, ord, seq, name, name_rel, kind, outer_kind, encoding, type,
 *             entity, period, form, notes, bytes, words_read, numbers,
 *             stopwords, short_words, terms_kept, overlong, sentences,
 *             distinct_terms, terms BLOB, analysis BLOB)
 *   problems(id, file, ord, name, name_rel, status, line, offset, message, skipped)
 *   terms(id, term)             the dictionary: every term once (kept so by
 *                               the writer, which holds it in memory: no SQL
 *                               index on term; see "Writes")
 * A document's table is one BLOB: its (term id, count) pairs sorted by id,
 * each as the id's difference from the previous one and the count, both
 * LEB128 varints. Reading a table is one row and a walk of the blob against
 * the dictionary, which is loaded once into memory (an array by id, and a
 * term table from term to id + 1 for writing), so neither direction needs
 * a join or a lookup per term in SQLite. `ord` orders a file's documents
 * and problems as they arose, so a replay repeats them in that order.
 * files.path is the file's absolute path with symlinks resolved, so any
 * spelling of it finds it; a name that starts with the path as the run
 * spelled it is kept without it (name_rel = 1) and a replay puts back the
 * path as the query spells it, so output matches reading the files.
 *
 * `analysis` holds what an analysis made of the document at indexing time
 * (tone scores, packed by the caller), described by meta.analysis; a
 * replay for that analysis hands it back as the analysis output.
 *
 * Writes: one transaction per file, begun with BEGIN IMMEDIATE; new terms
 * go into the dictionary inside the same transaction, so a rollback also
 * drops them from memory (the in-memory maps are trimmed back to the
 * committed size). One writer at a time: flock() on the database file
 * (independent of SQLite's own fcntl locks on Linux), held while open.
 * The write-ahead log is copied back into the database (a checkpoint, with
 * its fsync) once it holds 16384 pages (64 MiB at 4 KiB pages) instead of
 * SQLite's default 1000: an index of the 200 MB benchmark corpus then
 * checkpoints once, at the end, instead of at every 4 MiB (3.3 s -> 2.8 s).
 * Durability is unchanged: synchronous=NORMAL keeps the database whole
 * after a crash, at worst without the last transactions.
 * terms.term has no UNIQUE constraint (an index in SQLite): new terms, a
 * few hundred a file, then land at random all over that B-tree, and each
 * file's transaction wrote its touched pages to the write-ahead log again:
 * some 260 MB of log for a 9 MB index of the benchmark corpus, and 2.05 s
 * to index it instead of 1.24 s. Terms get ids in order, so the table only
 * grows at its end. The writer alone adds terms, through the in-memory
 * dictionary, which never holds a term twice; a database that does (a
 * foreign writer's) is refused as damaged when the dictionary is loaded.
 * An index written with the constraint (before it was dropped) reads and
 * grows the same way. */
#include <sqlite3.h>
#include <sys/file.h>
#include <sys/stat.h>
#include <fcntl.h>
#include <limits.h>
#include <errno.h>
#include <stdio.h>
#include <stdlib.h>
#include <time.h>
#include <unistd.h>

#include "termtide/index.h"
#include "termtide/termtable.h"
#include "termtable_internal.h"
#include "tt_internal.h"

struct tt_index {
    sqlite3 *db;
    char *path;
    int writer;
    int lock_fd;
    /* the dictionary */
    char **term_of;          /* by id - 1 */
    size_t n_terms, cap_terms, committed_terms;
    tt_termtable *id_of;     /* term -> id (the table's count) */
    int dict_loaded;
    int analysing;           /* documents carry an analysis (tt_index_analysis) */
    /* the file being written */
    char *spelled;           /* its path as the run spells it */
    long long file_id;
    long ord;
    sqlite3_stmt *ins_doc, *ins_problem, *ins_term;
    tt_buf blob;
};

static const char *const schema =
    "CREATE TABLE meta(key TEXT PRIMARY KEY, value TEXT NOT NULL) WITHOUT ROWID;"
    "CREATE TABLE files(id INTEGER PRIMARY KEY, path TEXT NOT NULL UNIQUE,"
    " sha256 TEXT NOT NULL, size INTEGER NOT NULL, parts_skipped INTEGER NOT NULL,"
    " indexed_at TEXT NOT NULL);"
    "CREATE INDEX files_sha256 ON files(sha256);"
    "CREATE TABLE documents(id INTEGER PRIMARY KEY,"
    " file INTEGER NOT NULL REFERENCES files(id) ON DELETE CASCADE, ord INTEGER NOT NULL,"
    " seq INTEGER NOT NULL, name TEXT NOT NULL, name_rel INTEGER NOT NULL,"
    " kind INTEGER NOT NULL,"
    " outer_kind INTEGER NOT NULL, encoding TEXT NOT NULL, type TEXT NOT NULL,"
    " entity TEXT NOT NULL, period TEXT NOT NULL, form TEXT NOT NULL, notes TEXT NOT NULL,"
    " bytes INTEGER NOT NULL, words_read INTEGER NOT NULL, numbers INTEGER NOT NULL,"
    " stopwords INTEGER NOT NULL, short_words INTEGER NOT NULL, terms_kept INTEGER NOT NULL,"
    " overlong INTEGER NOT NULL, sentences INTEGER NOT NULL, distinct_terms INTEGER NOT NULL,"
    " terms BLOB NOT NULL, analysis BLOB);"
    "CREATE INDEX documents_file ON documents(file, ord);"
    "CREATE TABLE problems(id INTEGER PRIMARY KEY,"
    " file INTEGER NOT NULL REFERENCES files(id) ON DELETE CASCADE, ord INTEGER NOT NULL,"
    " name TEXT NOT NULL, name_rel INTEGER NOT NULL, status INTEGER NOT NULL,"
    " line INTEGER NOT NULL,"
    " offset INTEGER NOT NULL, message TEXT NOT NULL, skipped INTEGER NOT NULL);"
    "CREATE INDEX problems_file ON problems(file, ord);"
    "CREATE TABLE terms(id INTEGER PRIMARY KEY, term TEXT NOT NULL);";

static tt_status db_error(tt_index *ix, tt_error *err, const char *what)
{
    int code = sqlite3_extended_errcode(ix->db);
    tt_status st = (code & 0xff) == SQLITE_NOTADB || (code & 0xff) == SQLITE_CORRUPT
                       ? TT_EPARSE
                   : (code & 0xff) == SQLITE_NOMEM ? TT_ENOMEM
                                                   : TT_EIO;
    const char *why = sqlite3_errmsg(ix->db);
    if (st == TT_EPARSE)
        return tt_error_set(err, st, ix->path, -1, "%s: not a termtide index (%s)", what, why);
    return tt_error_set(err, st, ix->path, -1, "%s: %s", what, why);
}

static tt_status exec(tt_index *ix, const char *sql, tt_error *err)
{
    char *msg = NULL;
    if (sqlite3_exec(ix->db, sql, NULL, NULL, &msg) != SQLITE_OK) {
        tt_status st = db_error(ix, err, "database");
        sqlite3_free(msg);
        return st;
    }
    return TT_OK;
}

static tt_status prepare(tt_index *ix, const char *sql, sqlite3_stmt **st, tt_error *err)
{
    if (sqlite3_prepare_v2(ix->db, sql, -1, st, NULL) != SQLITE_OK)
        return db_error(ix, err, "database");
    return TT_OK;
}

/* The value of a meta key into out ("" when absent). */
static tt_status meta_get(tt_index *ix, const char *key, tt_buf *out, tt_error *err)
{
    sqlite3_stmt *q;
    tt_status st = prepare(ix, "SELECT value FROM meta WHERE key = ?", &q, err);
    if (st)
        return st;
    tt_buf_reset(out);
    sqlite3_bind_text(q, 1, key, -1, SQLITE_STATIC);
    int rc = sqlite3_step(q);
    if (rc == SQLITE_ROW)
        st = tt_buf_append(out, (const char *)sqlite3_column_text(q, 0),
                           (size_t)sqlite3_column_bytes(q, 0));
    else if (rc != SQLITE_DONE)
        st = db_error(ix, err, "reading the index");
    sqlite3_finalize(q);
    if (!st)
        st = tt_buf_putc(out, '\0');
    if (!st)
        out->len--;
    return st;
}

static tt_status meta_set(tt_index *ix, const char *key, const char *value, tt_error *err)
{
    sqlite3_stmt *q;
    tt_status st = prepare(ix, "INSERT OR REPLACE INTO meta(key, value) VALUES(?, ?)", &q, err);
    if (st)
        return st;
    sqlite3_bind_text(q, 1, key, -1, SQLITE_STATIC);
    sqlite3_bind_text(q, 2, value, -1, SQLITE_STATIC);
    if (sqlite3_step(q) != SQLITE_DONE)
        st = db_error(ix, err, "writing the index");
    sqlite3_finalize(q);
    return st;
}

void tt_index_close(tt_index *ix)
{
    if (!ix)
        return;
    sqlite3_finalize(ix->ins_doc);
    sqlite3_finalize(ix->ins_problem);
    sqlite3_finalize(ix->ins_term);
    if (ix->db)
        sqlite3_close(ix->db);
    if (ix->lock_fd >= 0)
        close(ix->lock_fd); /* releases the flock */
    for (size_t i = 0; i < ix->n_terms; i++)
        tt_free(ix->term_of[i]);
    tt_free(ix->term_of);
    tt_termtable_free(ix->id_of);
    tt_buf_release(&ix->blob);
    tt_free(ix->spelled);
    tt_free(ix->path);
    tt_free(ix);
}

tt_status tt_index_open(const char *path, tt_index_mode mode, tt_index **out, tt_error *err)
{
    *out = NULL;
    tt_index *ix = tt_calloc(1, sizeof *ix);
    if (!ix || !(ix->path = tt_strdup(path))) {
        tt_free(ix);
        return tt_error_set(err, TT_ENOMEM, path, -1, "out of memory");
    }
    ix->lock_fd = -1;
    ix->writer = mode == TT_INDEX_WRITE;
    tt_buf_init(&ix->blob, 0);
    tt_status st = TT_OK;
    struct stat sb;
    int exists = stat(path, &sb) == 0;
    if (!exists && mode == TT_INDEX_READ) {
        st = tt_error_set(err, TT_ENOENT, path, -1, "no such index (build it with termtide index)");
        goto fail;
    }
    if (exists && !S_ISREG(sb.st_mode)) {
        st = tt_error_set(err, TT_EPARSE, path, -1, "not a termtide index (not a regular file)");
        goto fail;
    }
    if (ix->writer) {
        /* the writer's lock, taken before SQLite touches the file */
        ix->lock_fd = open(path, O_RDWR | O_CREAT | O_CLOEXEC, 0644);
        if (ix->lock_fd < 0) {
            st = tt_error_set(err, TT_EIO, path, -1, "cannot open for writing: %s",
                              strerror(errno));
            goto fail;
        }
        if (flock(ix->lock_fd, LOCK_EX | LOCK_NB) != 0) {
            st = tt_error_set(err, TT_EIO, path, -1,
                              "another termtide run is writing this index; try again when it "
                              "has finished");
            goto fail;
        }
    }
    int flags = ix->writer ? SQLITE_OPEN_READWRITE | SQLITE_OPEN_CREATE : SQLITE_OPEN_READONLY;
    if (sqlite3_open_v2(path, &ix->db, flags | SQLITE_OPEN_NOMUTEX, NULL) != SQLITE_OK) {
        st = ix->db ? db_error(ix, err, "cannot open")
                    : tt_error_set(err, TT_ENOMEM, path, -1, "out of memory");
        goto fail;
    }
    sqlite3_busy_timeout(ix->db, 10000);
    sqlite3_extended_result_codes(ix->db, 1);
    /* Is it SQLite, and ours? Reading the schema fails on a file that is
     * not a database or is truncated. */
    sqlite3_stmt *q;
    if ((st = prepare(ix, "SELECT count(*), sum(name = 'meta') FROM sqlite_master", &q, err)))
        goto fail;
    int rc = sqlite3_step(q);
    long long tables = rc == SQLITE_ROW ? sqlite3_column_int64(q, 0) : -1;
    long long has_meta = rc == SQLITE_ROW ? sqlite3_column_int64(q, 1) : 0;
    sqlite3_finalize(q);
    if (rc != SQLITE_ROW) {
        st = db_error(ix, err, "cannot read");
        goto fail;
    }
    if (tables > 0 && !has_meta) {
        st = tt_error_set(err, TT_EPARSE, path, -1,
                          "not a termtide index (an SQLite database with other tables)");
        goto fail;
    }
    if (tables == 0) {
        if (!ix->writer) {
            st = tt_error_set(err, TT_EPARSE, path, -1, "not a termtide index (empty)");
            goto fail;
        }
        char version[32];
        snprintf(version, sizeof version, "%d", TT_INDEX_SCHEMA_VERSION);
        if ((st = exec(ix, "PRAGMA journal_mode=WAL", err)) ||
            (st = exec(ix, "BEGIN IMMEDIATE", err)) || (st = exec(ix, schema, err)) ||
            (st = meta_set(ix, "schema_version", version, err)) ||
            (st = meta_set(ix, "created_by", "termtide " TT_VERSION, err)) ||
            (st = exec(ix, "COMMIT", err)))
            goto fail;
    } else {
        tt_buf v;
        tt_buf_init(&v, 0);
        st = meta_get(ix, "schema_version", &v, err);
        long ver = st ? 0 : strtol(v.data, NULL, 10);
        tt_buf_release(&v);
        if (st)
            goto fail;
        if (ver != TT_INDEX_SCHEMA_VERSION) {
            st = tt_error_set(err, TT_EPARSE, path, -1,
                              "index schema version %ld, this termtide reads version %d", ver,
                              TT_INDEX_SCHEMA_VERSION);
            goto fail;
        }
        if (ix->writer && (st = exec(ix, "PRAGMA journal_mode=WAL", err)))
            goto fail;
    }
    if ((st = exec(ix, "PRAGMA foreign_keys=ON", err)))
        goto fail;
    if (ix->writer && ((st = exec(ix, "PRAGMA synchronous=NORMAL", err)) ||
                       (st = exec(ix, "PRAGMA wal_autocheckpoint=16384", err))))
        goto fail;
    *out = ix;
    return TT_OK;
fail:
    tt_index_close(ix);
    return st;
}

/* Splits "k=v k=v" and names the keys whose values differ. */
static void profile_diff(const char *have, const char *want, char *out, size_t size)
{
    out[0] = '\0';
    size_t used = 0;
    for (const char *p = want; *p;) {
        while (*p == ' ')
            p++;
        const char *end = strchr(p, ' ');
        size_t n = end ? (size_t)(end - p) : strlen(p);
        const char *eq = memchr(p, '=', n);
        if (n && eq) {
            size_t klen = (size_t)(eq - p) + 1;
            const char *h = have;
            const char *hv = NULL;
            size_t hn = 0;
            while (h && *h) {
                while (*h == ' ')
                    h++;
                const char *he = strchr(h, ' ');
                size_t hl = he ? (size_t)(he - h) : strlen(h);
                if (hl >= klen && !memcmp(h, p, klen)) {
                    hv = h;
                    hn = hl;
                    break;
                }
                h += hl;
            }
            if (!hv || hn != n || memcmp(hv, p, n)) {
                int w = snprintf(out + used, size - used, "%sthe index has %.*s, this run %.*s",
                                 used ? "; " : "", hv ? (int)hn : 9, hv ? hv : "(missing)",
                                 (int)n, p);
                if (w > 0 && (size_t)w < size - used)
                    used += (size_t)w;
            }
        }
        p += n;
    }
}

tt_status tt_index_profile(tt_index *ix, const char *profile, tt_error *err)
{
    tt_buf have;
    tt_buf_init(&have, 0);
    tt_status st = meta_get(ix, "profile", &have, err);
    if (!st && have.len == 0) {
        if (ix->writer)
            st = meta_set(ix, "profile", profile, err);
        else
            st = tt_error_set(err, TT_EPARSE, ix->path, -1, "the index holds no documents yet");
    } else if (!st && strcmp(have.data, profile)) {
        char diff[TT_ERROR_MSG_MAX];
        profile_diff(have.data, profile, diff, sizeof diff);
        if (!diff[0])
            profile_diff(profile, have.data, diff, sizeof diff);
        st = tt_error_set(err, TT_EINVAL, ix->path, -1,
                          "built with other counting options (%s); use the same options or "
                          "another index", diff);
    }
    tt_buf_release(&have);
    return st;
}

static char *canonical(const char *path);

tt_status tt_index_analysis(tt_index *ix, const char *analysis, tt_error *err)
{
    tt_buf have;
    tt_buf_init(&have, 0);
    tt_status st = meta_get(ix, "analysis", &have, err);
    const char *want = analysis ? analysis : "";
    if (!st && strcmp(have.data ? have.data : "", want)) {
        tt_index_stats is;
        if (ix->writer && have.len == 0 && !(st = tt_index_stats_get(ix, &is, err)) &&
            is.files == 0) {
            st = meta_set(ix, "analysis", want, err);
        } else if (!st && !have.len) {
            st = tt_error_set(err, TT_EINVAL, ix->path, -1,
                              "the index holds no analysis; this run asks for \"%s\" (build a "
                              "new index with it)", want);
        } else if (!st && !want[0]) {
            st = tt_error_set(err, TT_EINVAL, ix->path, -1,
                              "the index holds the analysis \"%s\"; give the same options "
                              "(index --tone, the same --lexicon) to keep it", have.data);
        } else if (!st) {
            st = tt_error_set(err, TT_EINVAL, ix->path, -1,
                              "the index holds the analysis \"%s\"; this run asks for \"%s\"",
                              have.data, want);
        }
    }
    if (!st)
        ix->analysing = want[0] != '\0';
    tt_buf_release(&have);
    return st;
}

tt_status tt_index_file_lookup(tt_index *ix, const char *path, tt_index_file *out,
                               tt_error *err)
{
    memset(out, 0, sizeof *out);
    sqlite3_stmt *q;
    char *key = canonical(path);
    if (!key)
        return tt_error_set(err, TT_ENOMEM, ix->path, -1, "out of memory");
    tt_status st = prepare(ix, "SELECT sha256, size FROM files WHERE path = ?", &q, err);
    if (st) {
        tt_free(key);
        return st;
    }
    sqlite3_bind_text(q, 1, key, -1, SQLITE_TRANSIENT);
    tt_free(key);
    int rc = sqlite3_step(q);
    if (rc == SQLITE_ROW) {
        out->found = 1;
        tti_strlcpy(out->sha256, (const char *)sqlite3_column_text(q, 0), sizeof out->sha256);
        out->size = (uint64_t)sqlite3_column_int64(q, 1);
    } else if (rc != SQLITE_DONE) {
        st = db_error(ix, err, "reading the index");
    }
    sqlite3_finalize(q);
    return st;
}

/* Loads the dictionary into memory, once. */
static tt_status load_dictionary(tt_index *ix, tt_error *err)
{
    if (ix->dict_loaded)
        return TT_OK;
    if (!ix->id_of && !(ix->id_of = tt_termtable_new()))
        return tt_error_set(err, TT_ENOMEM, ix->path, -1, "out of memory");
    sqlite3_stmt *q;
    tt_status st = prepare(ix, "SELECT id, term FROM terms ORDER BY id", &q, err);
    if (st)
        return st;
    int rc;
    while ((rc = sqlite3_step(q)) == SQLITE_ROW) {
        long long id = sqlite3_column_int64(q, 0);
        const char *term = (const char *)sqlite3_column_text(q, 1);
        size_t len = (size_t)sqlite3_column_bytes(q, 1);
        if (id != (long long)ix->n_terms + 1) {
            st = tt_error_set(err, TT_EPARSE, ix->path, -1,
                              "damaged index: term ids are not consecutive at %lld", id);
            break;
        }
        if (ix->n_terms == ix->cap_terms) {
            size_t cap = ix->cap_terms ? 2 * ix->cap_terms : 4096;
            char **t = tt_reallocarray(ix->term_of, cap, sizeof *t);
            if (!t) {
                st = TT_ENOMEM;
                break;
            }
            ix->term_of = t;
            ix->cap_terms = cap;
        }
        if (!(ix->term_of[ix->n_terms] = tt_strndup(term, len))) {
            st = TT_ENOMEM;
            break;
        }
        ix->n_terms++;
        /* one hash for the check and the entry */
        uint64_t h = tti_termtable_hash(term, len);
        tti_slot *seen = tti_termtable_find(ix->id_of, term, len, h);
        if (seen->term) {
            st = tt_error_set(err, TT_EPARSE, ix->path, -1,
                              "damaged index: term ids %llu and %lld hold the same term",
                              (unsigned long long)seen->count, id);
            break;
        }
        if ((st = tti_termtable_insert(ix->id_of, seen, term, len, h, (uint64_t)id)) != TT_OK)
            break;
    }
    if (!st && rc != SQLITE_DONE)
        st = db_error(ix, err, "reading the index");
    if (st == TT_ENOMEM)
        tt_error_set(err, st, ix->path, -1, "out of memory");
    sqlite3_finalize(q);
    if (!st) {
        ix->dict_loaded = 1;
        ix->committed_terms = ix->n_terms;
    }
    return st;
}

static tt_status put_varint(tt_buf *b, uint64_t v)
{
    char tmp[10];
    size_t n = 0;
    do {
        unsigned char byte = v & 0x7f;
        v >>= 7;
        tmp[n++] = (char)(byte | (v ? 0x80 : 0));
    } while (v);
    return tt_buf_append(b, tmp, n);
}

static int get_varint(const unsigned char **p, const unsigned char *end, uint64_t *v)
{
    uint64_t x = 0;
    for (unsigned shift = 0; *p < end && shift < 64; shift += 7) {
        unsigned char byte = *(*p)++;
        x |= (uint64_t)(byte & 0x7f) << shift;
        if (!(byte & 0x80)) {
            *v = x;
            return 1;
        }
    }
    return 0;
}

static tt_status file_begin(tt_index *ix, const char *path, const char *sha256, uint64_t size,
                            tt_error *err);

/* The key a file is kept under: its absolute path with symlinks resolved
 * (realpath), so "docs/a.txt" and "/home/x/docs/a.txt" are one file; for a
 * path that no longer exists, the path made absolute against the working
 * directory. NULL when out of memory. The caller frees it with tt_free. */
static char *canonical(const char *path)
{
    char *r = realpath(path, NULL);
    if (r) {
        char *c = tt_strdup(r);
        free(r);
        return c;
    }
    if (path[0] == '/')
        return tt_strdup(path);
    char cwd[4096];
    if (!getcwd(cwd, sizeof cwd))
        return tt_strdup(path);
    size_t a = strlen(cwd), b = strlen(path);
    char *c = tt_malloc(a + b + 2);
    if (!c)
        return NULL;
    memcpy(c, cwd, a);
    c[a] = '/';
    memcpy(c + a + 1, path, b + 1);
    return c;
}

/* Forgets the spelled path of the last file (a merged file has none);
 * returns the old one for the caller to free. */
static char *ix_spelled_reset(tt_index *ix)
{
    char *old = ix->spelled;
    ix->spelled = NULL;
    return old;
}

tt_status tt_index_file_begin(tt_index *ix, const char *path, const char *sha256, uint64_t size,
                              tt_error *err)
{
    char *key = canonical(path);
    tt_free(ix->spelled);
    ix->spelled = tt_strdup(path);
    if (!key || !ix->spelled) {
        tt_free(key);
        return tt_error_set(err, TT_ENOMEM, ix->path, -1, "out of memory");
    }
    tt_status st = file_begin(ix, key, sha256, size, err);
    tt_free(key);
    return st;
}

static tt_status file_begin(tt_index *ix, const char *path, const char *sha256, uint64_t size,
                            tt_error *err)
{
    tt_status st = load_dictionary(ix, err);
    if (st)
        return st;
    if ((st = exec(ix, "BEGIN IMMEDIATE", err)))
        return st;
    sqlite3_stmt *q = NULL;
    /* documents and problems go with the file (ON DELETE CASCADE) */
    if (!(st = prepare(ix, "DELETE FROM files WHERE path = ?", &q, err))) {
        sqlite3_bind_text(q, 1, path, -1, SQLITE_STATIC);
        if (sqlite3_step(q) != SQLITE_DONE)
            st = db_error(ix, err, "writing the index");
        sqlite3_finalize(q);
    }
    char when[32];
    time_t now = time(NULL);
    struct tm tmv;
    gmtime_r(&now, &tmv);
    strftime(when, sizeof when, "%Y-%m-%dT%H:%M:%SZ", &tmv);
    if (!st && !(st = prepare(ix, "INSERT INTO files(path, sha256, size, parts_skipped, "
                                  "indexed_at) VALUES(?, ?, ?, 0, ?)", &q, err))) {
        sqlite3_bind_text(q, 1, path, -1, SQLITE_STATIC);
        sqlite3_bind_text(q, 2, sha256, -1, SQLITE_STATIC);
        sqlite3_bind_int64(q, 3, (sqlite3_int64)size);
        sqlite3_bind_text(q, 4, when, -1, SQLITE_STATIC);
        if (sqlite3_step(q) != SQLITE_DONE)
            st = db_error(ix, err, "writing the index");
        sqlite3_finalize(q);
    }
    if (st) {
        tt_index_file_abort(ix);
        return st;
    }
    ix->file_id = sqlite3_last_insert_rowid(ix->db);
    ix->ord = 0;
    return TT_OK;
}

/* The id of a term (hash: tti_termtable_hash of it), added to the
 * dictionary when new. */
static tt_status term_id(tt_index *ix, const char *term, size_t len, uint64_t hash, uint64_t *id,
                         tt_error *err)
{
    *id = tti_termtable_get_hashed(ix->id_of, term, len, hash);
    if (*id)
        return TT_OK;
    if (!ix->ins_term) {
        tt_status st = prepare(ix, "INSERT INTO terms(id, term) VALUES(?, ?)", &ix->ins_term, err);
        if (st)
            return st;
    }
    if (ix->n_terms == ix->cap_terms) {
        size_t cap = ix->cap_terms ? 2 * ix->cap_terms : 4096;
        char **t = tt_reallocarray(ix->term_of, cap, sizeof *t);
        if (!t)
            return tt_error_set(err, TT_ENOMEM, ix->path, -1, "out of memory");
        ix->term_of = t;
        ix->cap_terms = cap;
    }
    if (!(ix->term_of[ix->n_terms] = tt_strndup(term, len)))
        return tt_error_set(err, TT_ENOMEM, ix->path, -1, "out of memory");
    ix->n_terms++;
    *id = ix->n_terms;
    sqlite3_reset(ix->ins_term);
    sqlite3_bind_int64(ix->ins_term, 1, (sqlite3_int64)*id);
    sqlite3_bind_text(ix->ins_term, 2, term, (int)len, SQLITE_STATIC);
    if (sqlite3_step(ix->ins_term) != SQLITE_DONE)
        return db_error(ix, err, "writing the index");
    if (tti_termtable_add_hashed(ix->id_of, term, len, hash, *id))
        return tt_error_set(err, TT_ENOMEM, ix->path, -1, "out of memory");
    return TT_OK;
}

typedef struct pair {
    uint64_t id, count;
} pair;

/* Sorts pairs by id: least significant digit first, 11 bits a pass, as
 * many passes as the largest id needs (two for a dictionary of up to four
 * million terms); tmp holds n pairs. Stable, O(n) per pass. */
static void sort_pairs(pair *p, pair *tmp, size_t n, uint64_t max_id)
{
    enum { BITS = 11, BUCKETS = 1 << BITS };
    size_t count[BUCKETS];
    for (unsigned shift = 0; shift < 64 && (max_id >> shift); shift += BITS) {
        memset(count, 0, sizeof count);
        for (size_t i = 0; i < n; i++)
            count[(p[i].id >> shift) & (BUCKETS - 1)]++;
        tti_prefix_sums(count, BUCKETS);
        for (size_t i = 0; i < n; i++)
            tmp[count[(p[i].id >> shift) & (BUCKETS - 1)]++] = p[i];
        memcpy(p, tmp, n * sizeof *p);
    }
}

tt_status tt_index_file_add_document(tt_index *ix, const tt_doc_result *r, tt_error *err)
{
    size_t distinct = r->table ? tt_termtable_distinct(r->table) : 0;
    pair *pairs = tt_calloc(distinct ? 2 * distinct : 1, sizeof(pair));
    if (!pairs)
        return tt_error_set(err, TT_ENOMEM, ix->path, -1, "out of memory");
    /* Each term's id, looked up with the hash the document's table already
     * holds (every table shares the process's key), the dictionary's slot
     * of the term 16 slots on prefetched. */
    size_t n = 0;
    uint64_t max_id = 0;
    tt_status st = TT_OK;
    if (r->table) {
        const tt_termtable *t = r->table;
        enum { AHEAD = 16 };
        for (size_t i = 0; i < t->cap && !st; i++) {
            if (i + AHEAD < t->cap && t->slots[i + AHEAD].term)
                __builtin_prefetch(
                    &ix->id_of->slots[t->slots[i + AHEAD].hash & (ix->id_of->cap - 1)]);
            const tti_slot *sl = &t->slots[i];
            if (!sl->term)
                continue;
            uint64_t id;
            if ((st = term_id(ix, sl->term, sl->len, sl->hash, &id, err)))
                break;
            pairs[n++] = (pair){ id, sl->count };
            if (id > max_id)
                max_id = id;
        }
    }
    tt_buf_reset(&ix->blob);
    if (!st) {
        sort_pairs(pairs, pairs + distinct, n, max_id);
        uint64_t prev = 0;
        for (size_t i = 0; i < n && !st; i++) {
            st = put_varint(&ix->blob, pairs[i].id - prev);
            if (!st) st = put_varint(&ix->blob, pairs[i].count);
            prev = pairs[i].id;
        }
        if (st)
            tt_error_set(err, st, ix->path, -1, "out of memory");
    }
    tt_free(pairs);
    if (st)
        return st;
    if (!ix->ins_doc &&
        (st = prepare(ix, "INSERT INTO documents(file, ord, seq, name, name_rel, kind, "
                          "outer_kind, encoding, type, entity, period, form, notes, bytes, "
                          "words_read, numbers, stopwords, short_words, terms_kept, overlong, "
                          "sentences, distinct_terms, terms, analysis) VALUES(?, ?, ?, ?, ?, ?, "
                          "?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)", &ix->ins_doc,
                      err)))
        return st;
    sqlite3_stmt *q = ix->ins_doc;
    sqlite3_reset(q);
    int k = 1;
    sqlite3_bind_int64(q, k++, ix->file_id);
    sqlite3_bind_int64(q, k++, ix->ord++);
    const char *hash = strrchr(r->name, '#');
    sqlite3_bind_int64(q, k++, hash && r->outer_kind == TT_KIND_WRAPPER ? strtoll(hash + 1, NULL, 10) : 0);
    /* the name without the path as spelled ("", "#1:10-Q"): a replay puts
     * the path back as the query spells it */
    size_t plen = r->path ? strlen(r->path) : 0;
    int rel = plen && !strncmp(r->name, r->path, plen);
    sqlite3_bind_text(q, k++, rel ? r->name + plen : r->name, -1, SQLITE_STATIC);
    sqlite3_bind_int(q, k++, rel);
    sqlite3_bind_int(q, k++, (int)r->kind);
    sqlite3_bind_int(q, k++, (int)r->outer_kind);
    sqlite3_bind_text(q, k++, r->encoding ? r->encoding : "", -1, SQLITE_STATIC);
    sqlite3_bind_text(q, k++, r->type ? r->type : "", -1, SQLITE_STATIC);
    sqlite3_bind_text(q, k++, r->entity ? r->entity : "", -1, SQLITE_STATIC);
    sqlite3_bind_text(q, k++, r->period ? r->period : "", -1, SQLITE_STATIC);
    sqlite3_bind_text(q, k++, r->form ? r->form : "", -1, SQLITE_STATIC);
    sqlite3_bind_text(q, k++, r->notes ? r->notes : "", -1, SQLITE_STATIC);
    sqlite3_bind_int64(q, k++, (sqlite3_int64)r->bytes);
    sqlite3_bind_int64(q, k++, (sqlite3_int64)r->stats.words_read);
    sqlite3_bind_int64(q, k++, (sqlite3_int64)r->stats.numbers);
    sqlite3_bind_int64(q, k++, (sqlite3_int64)r->stats.stopwords);
    sqlite3_bind_int64(q, k++, (sqlite3_int64)r->stats.short_words);
    sqlite3_bind_int64(q, k++, (sqlite3_int64)r->stats.terms_kept);
    sqlite3_bind_int64(q, k++, (sqlite3_int64)r->stats.overlong);
    sqlite3_bind_int64(q, k++, (sqlite3_int64)r->stats.sentences);
    sqlite3_bind_int64(q, k++, (sqlite3_int64)distinct);
    sqlite3_bind_blob(q, k++, ix->blob.len ? ix->blob.data : "", (int)ix->blob.len,
                      SQLITE_STATIC);
    if (ix->analysing)
        sqlite3_bind_blob(q, k++, r->prepared_len ? r->prepared : "", (int)r->prepared_len,
                          SQLITE_STATIC);
    else
        sqlite3_bind_null(q, k++);
    if (sqlite3_step(q) != SQLITE_DONE)
        return db_error(ix, err, "writing the index");
    return TT_OK;
}

tt_status tt_index_file_add_problem(tt_index *ix, const char *name, const tt_error *problem,
                                    int skipped, tt_error *err)
{
    tt_status st;
    if (!ix->ins_problem &&
        (st = prepare(ix, "INSERT INTO problems(file, ord, name, name_rel, status, line, offset, "
                          "message, skipped) VALUES(?, ?, ?, ?, ?, ?, ?, ?, ?)",
                      &ix->ins_problem, err)))
        return st;
    sqlite3_stmt *q = ix->ins_problem;
    sqlite3_reset(q);
    if (!name)
        name = "";
    size_t plen = ix->spelled ? strlen(ix->spelled) : 0;
    int rel = plen && !strncmp(name, ix->spelled, plen);
    sqlite3_bind_int64(q, 1, ix->file_id);
    sqlite3_bind_int64(q, 2, ix->ord++);
    sqlite3_bind_text(q, 3, rel ? name + plen : name, -1, SQLITE_STATIC);
    sqlite3_bind_int(q, 4, rel);
    sqlite3_bind_int(q, 5, (int)problem->status);
    sqlite3_bind_int64(q, 6, problem->line);
    sqlite3_bind_int64(q, 7, problem->offset);
    sqlite3_bind_text(q, 8, problem->message, -1, SQLITE_STATIC);
    sqlite3_bind_int(q, 9, skipped);
    if (sqlite3_step(q) != SQLITE_DONE)
        return db_error(ix, err, "writing the index");
    return TT_OK;
}

tt_status tt_index_file_commit(tt_index *ix, size_t parts_skipped, tt_error *err)
{
    sqlite3_stmt *q;
    tt_status st = prepare(ix, "UPDATE files SET parts_skipped = ? WHERE id = ?", &q, err);
    if (!st) {
        sqlite3_bind_int64(q, 1, (sqlite3_int64)parts_skipped);
        sqlite3_bind_int64(q, 2, ix->file_id);
        if (sqlite3_step(q) != SQLITE_DONE)
            st = db_error(ix, err, "writing the index");
        sqlite3_finalize(q);
    }
    if (!st)
        st = exec(ix, "COMMIT", err);
    if (st) {
        tt_index_file_abort(ix);
        return st;
    }
    ix->committed_terms = ix->n_terms;
    return TT_OK;
}

void tt_index_file_abort(tt_index *ix)
{
    if (!sqlite3_get_autocommit(ix->db))
        sqlite3_exec(ix->db, "ROLLBACK", NULL, NULL, NULL);
    /* terms added in the rolled-back transaction leave the maps too */
    if (ix->n_terms > ix->committed_terms) {
        tt_termtable_free(ix->id_of);
        ix->id_of = NULL;
        for (size_t i = 0; i < ix->n_terms; i++)
            tt_free(ix->term_of[i]);
        ix->n_terms = 0;
        ix->dict_loaded = 0;
    }
}

tt_status tt_index_prune(tt_index *ix, const tt_source_list *keep, size_t *removed,
                         tt_error *err)
{
    *removed = 0;
    tt_termtable *present = tt_termtable_new();
    if (!present)
        return tt_error_set(err, TT_ENOMEM, ix->path, -1, "out of memory");
    tt_status st = TT_OK;
    for (size_t i = 0; i < keep->n && !st; i++) {
        char *key = canonical(keep->items[i].path);
        st = key ? tt_termtable_add(present, key, strlen(key), 1) : TT_ENOMEM;
        tt_free(key);
    }
    sqlite3_stmt *q = NULL, *del = NULL;
    if (!st && !(st = exec(ix, "BEGIN IMMEDIATE", err)) &&
        !(st = prepare(ix, "SELECT id, path FROM files", &q, err)) &&
        !(st = prepare(ix, "DELETE FROM files WHERE id = ?", &del, err))) {
        int rc;
        while ((rc = sqlite3_step(q)) == SQLITE_ROW) {
            const char *path = (const char *)sqlite3_column_text(q, 1);
            if (tt_termtable_get(present, path, (size_t)sqlite3_column_bytes(q, 1)))
                continue;
            sqlite3_reset(del);
            sqlite3_bind_int64(del, 1, sqlite3_column_int64(q, 0));
            if (sqlite3_step(del) != SQLITE_DONE) {
                st = db_error(ix, err, "writing the index");
                break;
            }
            (*removed)++;
        }
        if (!st && rc != SQLITE_DONE)
            st = db_error(ix, err, "reading the index");
    }
    sqlite3_finalize(q);
    sqlite3_finalize(del);
    if (!st)
        st = exec(ix, "COMMIT", err);
    if (st && ix->db && !sqlite3_get_autocommit(ix->db))
        sqlite3_exec(ix->db, "ROLLBACK", NULL, NULL, NULL);
    tt_termtable_free(present);
    return st;
}

tt_status tt_index_stats_get(tt_index *ix, tt_index_stats *out, tt_error *err)
{
    memset(out, 0, sizeof *out);
    sqlite3_stmt *q;
    tt_status st = prepare(ix, "SELECT (SELECT count(*) FROM files), count(*), "
                               "coalesce(sum(words_read), 0), coalesce(sum(terms_kept), 0), "
                               "(SELECT count(*) FROM terms) FROM documents", &q, err);
    if (st)
        return st;
    if (sqlite3_step(q) == SQLITE_ROW) {
        out->files = (uint64_t)sqlite3_column_int64(q, 0);
        out->documents = (uint64_t)sqlite3_column_int64(q, 1);
        out->words = (uint64_t)sqlite3_column_int64(q, 2);
        out->terms = (uint64_t)sqlite3_column_int64(q, 3);
        out->distinct_terms = (uint64_t)sqlite3_column_int64(q, 4);
    } else {
        st = db_error(ix, err, "reading the index");
    }
    sqlite3_finalize(q);
    return st;
}

/* Decodes a document's blob into t. */
static tt_status blob_table(tt_index *ix, const unsigned char *p, size_t n, tt_termtable *t,
                            tt_error *err)
{
    const unsigned char *end = p + n;
    uint64_t id = 0;
    while (p < end) {
        uint64_t delta, count;
        if (!get_varint(&p, end, &delta) || !get_varint(&p, end, &count) || delta == 0 ||
            id + delta > ix->n_terms)
            return tt_error_set(err, TT_EPARSE, ix->path, -1, "damaged index: a term table");
        id += delta;
        const char *term = ix->term_of[id - 1];
        tt_status st = tt_termtable_add(t, term, strlen(term), count);
        if (st)
            return tt_error_set(err, st, ix->path, -1, "%s", tt_status_name(st));
    }
    return TT_OK;
}

static const char *col_text(sqlite3_stmt *q, int i)
{
    const unsigned char *s = sqlite3_column_text(q, i);
    return s ? (const char *)s : "";
}

/* Replays one file's events, in their order. */
static tt_status replay_file(tt_index *ix, size_t input, const char *path, long long file_id,
                             const tt_batch_options *opt, tt_batch_summary *sum,
                             sqlite3_stmt *docs, sqlite3_stmt *probs, tt_termtable *t,
                             tt_buf *prepared, tt_buf *name, tt_error *err)
{
    sqlite3_reset(docs);
    sqlite3_reset(probs);
    sqlite3_bind_int64(docs, 1, file_id);
    sqlite3_bind_int64(probs, 1, file_id);
    int drc = sqlite3_step(docs), prc = sqlite3_step(probs);
    while (drc == SQLITE_ROW || prc == SQLITE_ROW) {
        long long dord = drc == SQLITE_ROW ? sqlite3_column_int64(docs, 0) : LLONG_MAX;
        long long pord = prc == SQLITE_ROW ? sqlite3_column_int64(probs, 0) : LLONG_MAX;
        if (pord < dord) {
            tt_error e;
            tt_error_init(&e);
            tt_buf_reset(name);
            const char *suffix = col_text(probs, 1);
            if ((sqlite3_column_int(probs, 7) &&
                 tt_buf_append(name, path, strlen(path))) ||
                tt_buf_append(name, suffix, strlen(suffix) + 1))
                return tt_error_set(err, TT_ENOMEM, ix->path, -1, "out of memory");
            e.status = (tt_status)sqlite3_column_int(probs, 2);
            tti_strlcpy(e.file, name->data, sizeof e.file);
            e.line = (long)sqlite3_column_int64(probs, 3);
            e.offset = sqlite3_column_int64(probs, 4);
            tti_strlcpy(e.message, col_text(probs, 5), sizeof e.message);
            int skipped = sqlite3_column_int(probs, 6);
            if (skipped)
                sum->skipped++;
            else
                sum->notes++;
            if (opt->on_problem)
                opt->on_problem(opt->ctx, name->data, &e, skipped);
            prc = sqlite3_step(probs);
            continue;
        }
        tt_termtable_reset(t);
        const void *blob = sqlite3_column_blob(docs, 21);
        tt_status st = blob_table(ix, blob, (size_t)sqlite3_column_bytes(docs, 21), t, err);
        if (st)
            return st;
        tt_doc_result r;
        memset(&r, 0, sizeof r);
        r.input = input;
        tt_buf_reset(name);
        const char *suffix = col_text(docs, 1);
        if ((sqlite3_column_int(docs, 20) && (st = tt_buf_append(name, path, strlen(path)))) ||
            (st = tt_buf_append(name, suffix, strlen(suffix) + 1)))
            return tt_error_set(err, st, ix->path, -1, "out of memory");
        r.name = name->data;
        r.path = path;
        r.kind = (tt_doc_kind)sqlite3_column_int(docs, 2);
        r.outer_kind = (tt_doc_kind)sqlite3_column_int(docs, 3);
        r.encoding = col_text(docs, 4);
        r.type = col_text(docs, 5);
        r.entity = col_text(docs, 6);
        r.period = col_text(docs, 7);
        r.form = col_text(docs, 8);
        r.notes = col_text(docs, 9);
        r.sha256 = "";
        r.bytes = (uint64_t)sqlite3_column_int64(docs, 10);
        r.stats.words_read = (uint64_t)sqlite3_column_int64(docs, 11);
        r.stats.numbers = (uint64_t)sqlite3_column_int64(docs, 12);
        r.stats.stopwords = (uint64_t)sqlite3_column_int64(docs, 13);
        r.stats.short_words = (uint64_t)sqlite3_column_int64(docs, 14);
        r.stats.terms_kept = (uint64_t)sqlite3_column_int64(docs, 15);
        r.stats.overlong = (uint64_t)sqlite3_column_int64(docs, 16);
        r.stats.sentences = (uint64_t)sqlite3_column_int64(docs, 17);
        r.table = t;
        if (opt->total) {
            if ((st = tt_termtable_merge(opt->total, t)) != TT_OK)
                return tt_error_set(err, st, ix->path, -1, "%s while adding up the total",
                                    tt_status_name(st));
            r.table = NULL;
        }
        tt_buf_reset(prepared);
        if (opt->analyse) {
            /* the analysis made at indexing time stands for analyse's output */
            if (sqlite3_column_type(docs, 22) == SQLITE_NULL) {
                tt_error e;
                tt_error_init(&e);
                tt_error_set(&e, TT_EINVAL, r.name, -1, "not analysed in the index %s",
                             ix->path);
                sum->skipped++;
                if (opt->on_problem)
                    opt->on_problem(opt->ctx, r.name, &e, 1);
                drc = sqlite3_step(docs);
                continue;
            }
            if ((st = tt_buf_append(prepared, sqlite3_column_blob(docs, 22),
                                    (size_t)sqlite3_column_bytes(docs, 22))))
                return tt_error_set(err, st, ix->path, -1, "out of memory");
        } else if (opt->prepare && (st = opt->prepare(opt->ctx, &r, prepared)) != TT_OK) {
            return tt_error_set(err, st, r.name, -1, "stopped: %s", tt_status_name(st));
        }
        r.prepared = prepared->data;
        r.prepared_len = prepared->len;
        sum->documents++;
        sum->words += r.stats.words_read;
        sum->terms += r.stats.terms_kept;
        if (opt->on_document && (st = opt->on_document(opt->ctx, &r)) != TT_OK)
            return tt_error_set(err, st, r.name, -1, "stopped: %s", tt_status_name(st));
        drc = sqlite3_step(docs);
    }
    if (drc != SQLITE_DONE || prc != SQLITE_DONE)
        return db_error(ix, err, "reading the index");
    return TT_OK;
}

tt_status tt_index_replay(tt_index *ix, const tt_source_list *inputs, const tt_batch_options *opt,
                          tt_batch_summary *sum, tt_error *err)
{
    memset(sum, 0, sizeof *sum);
    sum->inputs = inputs->n;
    if (opt->analyse && !ix->analysing)
        return tt_error_set(err, TT_EINVAL, ix->path, -1,
                            "this analysis cannot read from an index (it needs the text)");
    tt_status st = load_dictionary(ix, err);
    if (st)
        return st;
    sqlite3_stmt *file = NULL, *docs = NULL, *probs = NULL;
    tt_termtable *t = tt_termtable_new();
    tt_buf prepared, name;
    tt_buf_init(&prepared, 0);
    tt_buf_init(&name, 0);
    if (!t) {
        st = tt_error_set(err, TT_ENOMEM, ix->path, -1, "out of memory");
        goto done;
    }
    /* one snapshot for the whole replay */
    if ((st = exec(ix, "BEGIN", err)) ||
        (st = prepare(ix, "SELECT id, size, parts_skipped FROM files WHERE path = ?", &file,
                      err)) ||
        (st = prepare(ix, "SELECT ord, name, kind, outer_kind, encoding, type, entity, "
                          "period, form, notes, bytes, words_read, numbers, stopwords, "
                          "short_words, terms_kept, overlong, sentences, distinct_terms, seq, "
                          "name_rel, terms, analysis FROM documents WHERE file = ? ORDER BY ord",
                      &docs,
                      err)) ||
        (st = prepare(ix, "SELECT ord, name, status, line, offset, message, skipped, name_rel "
                          "FROM problems WHERE file = ? ORDER BY ord", &probs, err)))
        goto done;
    for (size_t i = 0; i < inputs->n && !st; i++) {
        const tt_source_entry *in = &inputs->items[i];
        tt_error e;
        tt_error_init(&e);
        if (in->status != TT_OK) {
            tt_error_set(&e, in->status, in->path, -1, "%s",
                         in->message ? in->message : tt_status_name(in->status));
            sum->skipped++;
            if (opt->on_problem)
                opt->on_problem(opt->ctx, in->path, &e, 1);
            continue;
        }
        sqlite3_reset(file);
        char *key = canonical(in->path);
        if (!key) {
            st = tt_error_set(err, TT_ENOMEM, ix->path, -1, "out of memory");
            break;
        }
        sqlite3_bind_text(file, 1, key, -1, SQLITE_TRANSIENT);
        tt_free(key);
        int rc = sqlite3_step(file);
        if (rc == SQLITE_DONE) {
            tt_error_set(&e, TT_ENOENT, in->path, -1, "not in the index %s", ix->path);
            sum->skipped++;
            if (opt->on_problem)
                opt->on_problem(opt->ctx, in->path, &e, 1);
        } else if (rc == SQLITE_ROW) {
            long long id = sqlite3_column_int64(file, 0);
            sum->bytes += (uint64_t)sqlite3_column_int64(file, 1);
            sum->parts_skipped += (size_t)sqlite3_column_int64(file, 2);
            st = replay_file(ix, i, in->path, id, opt, sum, docs, probs, t, &prepared, &name,
                             err);
        } else {
            st = db_error(ix, err, "reading the index");
        }
        if (!st && opt->on_progress)
            opt->on_progress(opt->ctx, i + 1, inputs->n, sum->bytes, 0);
    }
done:
    sqlite3_finalize(file);
    sqlite3_finalize(docs);
    sqlite3_finalize(probs);
    if (ix->db && !sqlite3_get_autocommit(ix->db))
        sqlite3_exec(ix->db, "COMMIT", NULL, NULL, NULL);
    tt_termtable_free(t);
    tt_buf_release(&prepared);
    tt_buf_release(&name);
    return st;
}

tt_status tt_index_paths(tt_index *ix, tt_source_list *list, tt_error *err)
{
    sqlite3_stmt *q;
    tt_status st = prepare(ix, "SELECT path FROM files ORDER BY path", &q, err);
    if (st)
        return st;
    int rc;
    while ((rc = sqlite3_step(q)) == SQLITE_ROW)
        if (tt_source_list_add(list, col_text(q, 0)) != TT_OK) {
            st = tt_error_set(err, TT_ENOMEM, ix->path, -1, "out of memory");
            break;
        }
    if (!st && rc != SQLITE_DONE)
        st = db_error(ix, err, "reading the index");
    sqlite3_finalize(q);
    return st;
}


/* Merging: every file of a shard that the output does not hold (by
 * SHA-256) is copied with its documents and problems in one transaction;
 * term ids are the shard's own, so each document's blob is decoded,
 * mapped to the output's ids (new terms join its dictionary) and encoded
 * again in id order. */
static tt_status copy_blob(tt_index *out, tt_index *shard, const unsigned char *p, size_t n,
                           tt_error *err)
{
    const unsigned char *end = p + n;
    size_t cap = n / 2 + 1, m = 0;
    pair *pairs = tt_calloc(2 * cap, sizeof *pairs); /* the pairs, then room to sort them */
    uint64_t max_id = 0;
    if (!pairs)
        return tt_error_set(err, TT_ENOMEM, out->path, -1, "out of memory");
    uint64_t id = 0;
    tt_status st = TT_OK;
    while (p < end && !st) {
        uint64_t delta, count, nid;
        if (!get_varint(&p, end, &delta) || !get_varint(&p, end, &count) || delta == 0 ||
            id + delta > shard->n_terms || m == cap) {
            st = tt_error_set(err, TT_EPARSE, shard->path, -1, "damaged index: a term table");
            break;
        }
        id += delta;
        const char *term = shard->term_of[id - 1];
        size_t len = strlen(term);
        if ((st = term_id(out, term, len, tti_termtable_hash(term, len), &nid, err)) != TT_OK)
            break;
        pairs[m++] = (pair){ nid, count };
        if (nid > max_id)
            max_id = nid;
    }
    tt_buf_reset(&out->blob);
    if (!st) {
        sort_pairs(pairs, pairs + cap, m, max_id);
        uint64_t prev = 0;
        for (size_t i = 0; i < m && !st; i++) {
            st = put_varint(&out->blob, pairs[i].id - prev);
            if (!st) st = put_varint(&out->blob, pairs[i].count);
            prev = pairs[i].id;
        }
        if (st)
            tt_error_set(err, st, out->path, -1, "out of memory");
    }
    tt_free(pairs);
    return st;
}

/* Copies the rows of `table` for one shard file into the output, all
 * columns but id and file, with the terms blob (when `blob_col` >= 0)
 * remapped. */
static tt_status copy_rows(tt_index *out, tt_index *shard, const char *table, const char *cols,
                           int ncols, int blob_col, long long shard_file, tt_error *err)
{
    char sql[1024];
    sqlite3_stmt *sel = NULL, *ins = NULL;
    snprintf(sql, sizeof sql, "SELECT %s FROM %s WHERE file = ? ORDER BY ord", cols, table);
    tt_status st = prepare(shard, sql, &sel, err);
    if (st)
        return st;
    char marks[256] = "?";
    size_t ml = 1;
    for (int i = 1; i < ncols + 1 && ml + 4 < sizeof marks; i++) {
        memcpy(marks + ml, ", ?", 4);
        ml += 3;
    }
    snprintf(sql, sizeof sql, "INSERT INTO %s(file, %s) VALUES(%s)", table, cols, marks);
    if ((st = prepare(out, sql, &ins, err))) {
        sqlite3_finalize(sel);
        return st;
    }
    sqlite3_bind_int64(sel, 1, shard_file);
    int rc;
    while (!st && (rc = sqlite3_step(sel)) == SQLITE_ROW) {
        sqlite3_reset(ins);
        sqlite3_bind_int64(ins, 1, out->file_id);
        for (int c = 0; c < ncols && !st; c++) {
            if (c == blob_col) {
                st = copy_blob(out, shard, sqlite3_column_blob(sel, c),
                               (size_t)sqlite3_column_bytes(sel, c), err);
                sqlite3_bind_blob(ins, c + 2, out->blob.len ? out->blob.data : "",
                                  (int)out->blob.len, SQLITE_TRANSIENT);
            } else {
                sqlite3_bind_value(ins, c + 2, sqlite3_column_value(sel, c));
            }
        }
        if (!st && sqlite3_step(ins) != SQLITE_DONE)
            st = db_error(out, err, "writing the index");
    }
    if (!st && rc != SQLITE_DONE)
        st = db_error(shard, err, "reading the shard");
    sqlite3_finalize(sel);
    sqlite3_finalize(ins);
    return st;
}

tt_status tt_index_merge(tt_index *out, const char *shard_path, tt_index_merge_stats *ms,
                         tt_index_overlap_fn on_overlap, void *ctx, tt_error *err)
{
    tt_index *shard = NULL;
    tt_status st = tt_index_open(shard_path, TT_INDEX_READ, &shard, err);
    if (st)
        return st;
    tt_buf profile;
    tt_buf_init(&profile, 0);
    sqlite3_stmt *files = NULL, *dup = NULL;
    if ((st = meta_get(shard, "profile", &profile, err)))
        goto done;
    if (profile.len == 0)
        goto done; /* an empty shard adds nothing */
    if ((st = tt_index_profile(out, profile.data, err))) {
        /* name the shard, not the output, as the one that differs */
        char why[TT_ERROR_MSG_MAX];
        tti_strlcpy(why, err->message, sizeof why);
        st = tt_error_set(err, st, shard_path, -1, "cannot be merged into %s: %s", out->path,
                          why);
        goto done;
    }
    if ((st = meta_get(shard, "analysis", &profile, err)))
        goto done;
    if ((st = tt_index_analysis(out, profile.data, err))) {
        char why[TT_ERROR_MSG_MAX];
        tti_strlcpy(why, err->message, sizeof why);
        st = tt_error_set(err, st, shard_path, -1, "cannot be merged into %s: %s", out->path,
                          why);
        goto done;
    }
    if ((st = load_dictionary(shard, err)) || (st = load_dictionary(out, err)) ||
        (st = prepare(shard, "SELECT id, path, sha256, size, parts_skipped, indexed_at FROM "
                             "files ORDER BY path", &files, err)) ||
        (st = prepare(out, "SELECT path FROM files WHERE sha256 = ? AND path <> ? LIMIT 1", &dup,
                      err)))
        goto done;
    int rc;
    while (!st && (rc = sqlite3_step(files)) == SQLITE_ROW) {
        const char *path = col_text(files, 1), *sha = col_text(files, 2);
        sqlite3_reset(dup);
        sqlite3_bind_text(dup, 1, sha, -1, SQLITE_TRANSIENT);
        sqlite3_bind_text(dup, 2, path, -1, SQLITE_TRANSIENT);
        int drc = sqlite3_step(dup);
        if (drc == SQLITE_ROW) {
            ms->overlaps++;
            if (on_overlap)
                on_overlap(ctx, shard_path, path, col_text(dup, 0));
            continue;
        }
        tt_index_file same;
        /* the same path with the same bytes: already merged */
        char *key = tt_strdup(path);
        if (!key) {
            st = tt_error_set(err, TT_ENOMEM, out->path, -1, "out of memory");
            break;
        }
        sqlite3_stmt *q = NULL;
        memset(&same, 0, sizeof same);
        if (!(st = prepare(out, "SELECT sha256 FROM files WHERE path = ?", &q, err))) {
            sqlite3_bind_text(q, 1, key, -1, SQLITE_STATIC);
            if (sqlite3_step(q) == SQLITE_ROW && !strcmp(col_text(q, 0), sha))
                same.found = 1;
            sqlite3_finalize(q);
        }
        if (!st && same.found) {
            ms->overlaps++;
            if (on_overlap)
                on_overlap(ctx, shard_path, path, path);
            tt_free(key);
            continue;
        }
        tt_free(ix_spelled_reset(out));
        if (!st)
            st = file_begin(out, key, sha, (uint64_t)sqlite3_column_int64(files, 3), err);
        tt_free(key);
        if (st)
            break;
        long long sid = sqlite3_column_int64(files, 0);
        st = copy_rows(out, shard, "documents",
                       "ord, seq, name, name_rel, kind, outer_kind, encoding, type, entity, "
                       "period, form, notes, bytes, words_read, numbers, stopwords, "
                       "short_words, terms_kept, overlong, sentences, distinct_terms, terms, "
                       "analysis",
                       23, 21, sid, err);
        if (!st)
            st = copy_rows(out, shard, "problems",
                           "ord, name, name_rel, status, line, offset, message, skipped", 8, -1,
                           sid, err);
        sqlite3_stmt *u = NULL;
        if (!st && !(st = prepare(out, "UPDATE files SET indexed_at = ? WHERE id = ?", &u,
                                  err))) {
            sqlite3_bind_value(u, 1, sqlite3_column_value(files, 5));
            sqlite3_bind_int64(u, 2, out->file_id);
            if (sqlite3_step(u) != SQLITE_DONE)
                st = db_error(out, err, "writing the index");
            sqlite3_finalize(u);
        }
        if (!st)
            st = tt_index_file_commit(out, (size_t)sqlite3_column_int64(files, 4), err);
        else
            tt_index_file_abort(out);
        if (!st) {
            ms->files++;
            sqlite3_stmt *c = NULL;
            if (!prepare(out, "SELECT count(*) FROM documents WHERE file = ?", &c, err)) {
                sqlite3_bind_int64(c, 1, out->file_id);
                if (sqlite3_step(c) == SQLITE_ROW)
                    ms->documents += (size_t)sqlite3_column_int64(c, 0);
                sqlite3_finalize(c);
            }
        }
    }
    if (!st && rc != SQLITE_DONE)
        st = db_error(shard, err, "reading the shard");
done:
    sqlite3_finalize(files);
    sqlite3_finalize(dup);
    tt_buf_release(&profile);
    tt_index_close(shard);
    return st;
}
