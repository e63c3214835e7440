/* termtide — the manifest (metadata of a set of documents) and path layouts
 * (see include/termtide/meta.h).
 *
 * Storage. Each document's strings (path, entity, kind, tag values) and its
 * array of tag pointers live in one allocation, laid out as
 * [tag pointers][path NUL][entity NUL][kind NUL][tag values NUL...], so a
 * row costs one malloc and doc.tags points at the start of the block (that
 * is how release finds it). Memory grows with the manifest's size, which
 * tt_source_read bounds by TT_LIMIT_FILE_BYTES.
 *
 * Index. Two open-addressing tables with linear probing, capacity a power
 * of two at most 70% full, holding document index + 1 (0 = empty): one on
 * the resolved path, hashed with the library's keyed SipHash
 * (tti_termtable_hash) so a crafted manifest cannot force collisions; one
 * on (device, inode) for tt_manifest_find_file, with a fixed integer mixer
 * (inode numbers are not chosen by the manifest's author). Both are rebuilt
 * on growth. Lookup and insert are O(1) expected; duplicate paths are found
 * while loading at no extra cost.
 *
 * Reading. A hand-written scanner over the decoded text: one pass, records
 * as in RFC 4180 (Shafranovich 2005, "Common Format and MIME Type for
 * Comma-Separated Values (CSV) Files") with the delimiter chosen from the
 * header line, TSV fields read the same way (IANA's text/tab-separated-values
 * has no quoting; accepting it costs nothing and reads what spreadsheets
 * write). Each record's fields are unquoted into one scratch buffer.
 * Every problem is collected with its line, not just the first, because an
 * analyst fixing a manifest wants the whole list.
 *
 * Layouts. A pattern compiles to tokens; matching is a depth-first search
 * over (token, position) with a bitmap of states already known to fail, so
 * it costs at most O(tokens × length × segment length) even for patterns
 * with many wildcards, instead of the exponential time of naive
 * backtracking. */
#include <errno.h>
#include <stdarg.h>
#include <stdio.h>
#include <stdlib.h>
#include <sys/stat.h>

#include "termtide/decode.h"
#include "termtide/meta.h"
#include "termtide/source.h"
#include "tt_internal.h"
#include "termtable_internal.h"

/* Defined in period.c. */
void tti_meta_quote(const char *s, size_t len, char *out, size_t size);

/* ---- paths --------------------------------------------------------------- */

/* The resolution rule of tt_meta_path_resolve, into a caller's array of
 * TT_META_PATH_MAX bytes. TT_ELIMIT when the result would not fit with
 * its NUL. */
static tt_status resolve_into(const char *dir, const char *path, char *out, size_t *out_len)
{
    size_t o = 0;
    if (!path)
        path = "";
    const char *parts[2] = { NULL, path };
    if (path[0] != '/' && dir && dir[0])
        parts[0] = dir;
    if ((parts[0] ? parts[0] : path)[0] == '/')
        out[o++] = '/';
    for (int k = 0; k < 2; k++) {
        const char *s = parts[k];
        while (s && *s) {
            while (*s == '/')
                s++;
            const char *seg = s;
            while (*s && *s != '/')
                s++;
            size_t n = (size_t)(s - seg);
            if (n == 0 || (n == 1 && seg[0] == '.'))
                continue;
            int sep = o > 0 && out[o - 1] != '/';
            if (o + (size_t)sep + n >= TT_META_PATH_MAX)
                return TT_ELIMIT;
            if (sep)
                out[o++] = '/';
            memcpy(out + o, seg, n);
            o += n;
        }
    }
    if (o == 0)
        out[o++] = '.';
    out[o] = '\0';
    *out_len = o;
    return TT_OK;
}

tt_status tt_meta_path_resolve(const char *dir, const char *path, tt_buf *out)
{
    char tmp[TT_META_PATH_MAX];
    size_t n;
    tt_buf_reset(out);
    tt_status st = resolve_into(dir, path, tmp, &n);
    return st ? st : tt_buf_append(out, tmp, n);
}

/* ---- the index ------------------------------------------------------------ */

typedef struct file_id {
    dev_t dev;
    ino_t ino;
    int known;
} file_id;

struct tti_manifest_index {
    size_t *path_slots; /* document index + 1; 0 = empty */
    size_t *id_slots;
    size_t slots;       /* capacity of both tables, a power of two */
    file_id *ids;       /* per document, m->cap of them */
};

static uint64_t mix64(uint64_t x)
{
    /* The finalizer of SplitMix64 (Steele, Lea & Flood 2014, "Fast
     * splittable pseudorandom number generators"): every input bit reaches
     * every output bit. */
    x ^= x >> 30;
    x *= 0xbf58476d1ce4e5b9ULL;
    x ^= x >> 27;
    x *= 0x94d049bb133111ebULL;
    x ^= x >> 31;
    return x;
}

static uint64_t id_hash(const file_id *id)
{
    return mix64((uint64_t)id->dev * 0x9e3779b97f4a7c15ULL ^ mix64((uint64_t)id->ino));
}

static uint64_t path_hash(const char *p) { return tti_termtable_hash(p, strlen(p)); }

static void index_insert(struct tti_manifest_index *ix, const tt_manifest *m, size_t doc)
{
    size_t mask = ix->slots - 1;
    size_t j = (size_t)path_hash(m->docs[doc].path) & mask;
    while (ix->path_slots[j])
        j = (j + 1) & mask;
    ix->path_slots[j] = doc + 1;
    if (ix->ids[doc].known) {
        j = (size_t)id_hash(&ix->ids[doc]) & mask;
        while (ix->id_slots[j])
            j = (j + 1) & mask;
        ix->id_slots[j] = doc + 1;
    }
}

/* Makes room for one more document: the docs array, the per-document file
 * identities and the hash tables (rebuilt when they would pass 70%). */
static tt_status reserve_one(tt_manifest *m)
{
    if (!m->index) {
        m->index = tt_calloc(1, sizeof *m->index);
        if (!m->index)
            return TT_ENOMEM;
    }
    struct tti_manifest_index *ix = m->index;
    if (m->n == m->cap) {
        size_t cap = m->cap ? m->cap * 2 : 16;
        tt_doc_meta *d = tt_reallocarray(m->docs, cap, sizeof *d);
        if (!d)
            return TT_ENOMEM;
        m->docs = d;
        file_id *ids = tt_reallocarray(ix->ids, cap, sizeof *ids);
        if (!ids)
            return TT_ENOMEM;
        ix->ids = ids;
        m->cap = cap;
    }
    if ((m->n + 1) * 10 > ix->slots * 7) {
        size_t slots = ix->slots ? ix->slots * 2 : 32;
        size_t *ps = tt_calloc(slots, sizeof *ps);
        size_t *is = tt_calloc(slots, sizeof *is);
        if (!ps || !is) {
            tt_free(ps);
            tt_free(is);
            return TT_ENOMEM;
        }
        tt_free(ix->path_slots);
        tt_free(ix->id_slots);
        ix->path_slots = ps;
        ix->id_slots = is;
        ix->slots = slots;
        for (size_t i = 0; i < m->n; i++)
            index_insert(ix, m, i);
    }
    return TT_OK;
}

/* The document whose resolved path is p (already resolved), or -1. */
static long find_resolved(const tt_manifest *m, const char *p)
{
    const struct tti_manifest_index *ix = m->index;
    if (!ix || !ix->slots)
        return -1;
    size_t mask = ix->slots - 1;
    for (size_t j = (size_t)path_hash(p) & mask; ix->path_slots[j]; j = (j + 1) & mask) {
        size_t d = ix->path_slots[j] - 1;
        if (strcmp(m->docs[d].path, p) == 0)
            return (long)d;
    }
    return -1;
}

/* ---- documents ------------------------------------------------------------ */

/* Appends a document (room reserved by reserve_one). Strings are copied. */
static tt_status append_doc(tt_manifest *m, const char *path, const char *entity,
                            const tt_period *period, const char *kind, const char *const *tags,
                            long line, const struct stat *st)
{
    size_t lp = strlen(path) + 1, le = strlen(entity) + 1, lk = strlen(kind) + 1, lt = 0;
    for (size_t i = 0; i < m->n_tags; i++)
        lt += (tags ? strlen(tags[i]) : 0) + 1;
    size_t head = m->n_tags * sizeof(char *);
    char *block = tt_malloc(head + lp + le + lk + lt);
    if (!block)
        return TT_ENOMEM;
    const char **tv = (const char **)(void *)block;
    char *w = block + head;
    tt_doc_meta *d = &m->docs[m->n];
    memcpy(w, path, lp);
    d->path = w;
    w += lp;
    memcpy(w, entity, le);
    d->entity = w;
    w += le;
    memcpy(w, kind, lk);
    d->kind = w;
    w += lk;
    for (size_t i = 0; i < m->n_tags; i++) {
        const char *v = tags ? tags[i] : "";
        size_t n = strlen(v) + 1;
        memcpy(w, v, n);
        tv[i] = w;
        w += n;
    }
    d->tags = (const char *const *)tv;
    d->period = *period;
    d->line = line;
    file_id *id = &m->index->ids[m->n];
    id->known = st != NULL;
    id->dev = st ? st->st_dev : 0;
    id->ino = st ? st->st_ino : 0;
    m->n++;
    index_insert(m->index, m, m->n - 1);
    return TT_OK;
}

static void drop_docs(tt_manifest *m)
{
    for (size_t i = 0; i < m->n; i++)
        tt_free((void *)m->docs[i].tags); /* the start of the document's block */
    tt_free(m->docs);
    m->docs = NULL;
    m->n = m->cap = 0;
    if (m->index) {
        tt_free(m->index->path_slots);
        tt_free(m->index->id_slots);
        tt_free(m->index->ids);
        tt_free(m->index);
        m->index = NULL;
    }
}

void tt_manifest_init(tt_manifest *m) { memset(m, 0, sizeof *m); }

void tt_manifest_release(tt_manifest *m)
{
    drop_docs(m);
    for (size_t i = 0; i < m->n_tags; i++)
        tt_free(m->tag_names[i]);
    tt_free(m->tag_names);
    tt_free(m->file);
    tt_free(m->dir);
    tt_free(m->errors);
    tt_manifest_init(m);
}

void tt_manifest_clear(tt_manifest *m)
{
    tt_manifest_release(m);
    tt_manifest_init(m);
}

static int is_blank(const char *s)
{
    for (; *s; s++)
        if (*s != ' ' && *s != '\t')
            return 0;
    return 1;
}

tt_status tt_manifest_add(tt_manifest *m, const char *path, const char *entity,
                          const tt_period *period, const char *kind, tt_error *err)
{
    tt_buf p;
    tt_buf_init(&p, 0);
    tt_status st;
    if (!entity || is_blank(entity)) {
        st = tt_error_set_line(err, TT_EINVAL, path, 0, "empty entity");
        goto done;
    }
    if (!period || !tt_period_valid(period)) {
        st = tt_error_set_line(err, TT_EINVAL, path, 0, "invalid period");
        goto done;
    }
    if (!path || !path[0]) {
        st = tt_error_set_line(err, TT_EINVAL, NULL, 0, "empty path");
        goto done;
    }
    st = tt_meta_path_resolve(NULL, path, &p);
    if (st == TT_ELIMIT) {
        st = tt_error_set_line(err, st, path, 0, "path of %d bytes or more", TT_META_PATH_MAX);
        goto done;
    }
    if (st) {
        st = tt_error_set_line(err, st, path, 0, "out of memory adding metadata");
        goto done;
    }
    if (find_resolved(m, p.data) >= 0) {
        char q[200];
        tti_meta_quote(p.data, p.len, q, sizeof q);
        st = tt_error_set_line(err, TT_EINVAL, path, 0, "duplicate path \"%s\"", q);
        goto done;
    }
    st = reserve_one(m);
    if (!st) {
        struct stat sb;
        int have = stat(p.data, &sb) == 0;
        st = append_doc(m, p.data, entity, period, kind ? kind : "", NULL, 0, have ? &sb : NULL);
    }
    if (st)
        st = tt_error_set_line(err, st, path, 0, "out of memory adding metadata");
done:
    tt_buf_release(&p);
    return st;
}

const tt_doc_meta *tt_manifest_find(const tt_manifest *m, const char *path)
{
    if (!m->n || !path)
        return NULL;
    char p[TT_META_PATH_MAX]; /* resolved on the stack: a lookup allocates nothing */
    size_t n;
    if (resolve_into(NULL, path, p, &n) != TT_OK)
        return NULL;
    long d = find_resolved(m, p);
    return d >= 0 ? &m->docs[d] : NULL;
}

const tt_doc_meta *tt_manifest_find_file(const tt_manifest *m, const char *path)
{
    const tt_doc_meta *d = tt_manifest_find(m, path);
    if (d || !m->n || !path)
        return d;
    struct stat sb;
    if (stat(path, &sb) != 0)
        return NULL;
    file_id want = { sb.st_dev, sb.st_ino, 1 };
    const struct tti_manifest_index *ix = m->index;
    size_t mask = ix->slots - 1;
    const tt_doc_meta *best = NULL;
    for (size_t j = (size_t)id_hash(&want) & mask; ix->id_slots[j]; j = (j + 1) & mask) {
        size_t k = ix->id_slots[j] - 1;
        if (ix->ids[k].dev == want.dev && ix->ids[k].ino == want.ino &&
            (!best || &m->docs[k] < best))
            best = &m->docs[k];
    }
    return best;
}

const char *tt_manifest_tag(const tt_manifest *m, size_t i, const char *name)
{
    if (i >= m->n || !name)
        return NULL;
    for (size_t k = 0; k < m->n_tags; k++)
        if (strcmp(m->tag_names[k], name) == 0)
            return m->docs[i].tags[k];
    return NULL;
}

/* ---- reading records ------------------------------------------------------ */

typedef struct reader {
    const char *t;
    size_t len, pos;
    long line;       /* physical line of t[pos], from 1 */
    char delim;
    tt_buf scratch;  /* the current record's unquoted fields, each NUL-ended */
    size_t *offs;    /* field starts in scratch */
    size_t n_fields; /* fields in the record (may exceed those stored) */
    size_t cap_fields;
} reader;

/* Skips blank lines (only blanks before the line end) and lines starting
 * with '#'. Returns 0 at the end of the text. */
static int skip_ignored(reader *r)
{
    while (r->pos < r->len) {
        size_t e = r->pos;
        if (r->t[e] != '#') {
            while (e < r->len && (r->t[e] == ' ' || r->t[e] == '\t' || r->t[e] == '\r'))
                e++;
            if (e < r->len && r->t[e] != '\n')
                return 1;
        }
        while (e < r->len && r->t[e] != '\n')
            e++;
        r->pos = e < r->len ? e + 1 : e;
        r->line++;
    }
    return 0;
}

/* The delimiter of the line at r->pos: a tab outside quotes → TSV. */
static char detect_delim(const reader *r)
{
    int quoted = 0;
    for (size_t i = r->pos; i < r->len; i++) {
        char c = r->t[i];
        if (c == '"')
            quoted = !quoted;
        else if (!quoted && c == '\n')
            break;
        else if (!quoted && c == '\t')
            return '\t';
    }
    return ',';
}

static tt_status end_field(reader *r, size_t start)
{
    if (r->n_fields <= TT_MANIFEST_MAX_COLUMNS) {
        if (r->n_fields == r->cap_fields) {
            size_t cap = r->cap_fields ? r->cap_fields * 2 : 16;
            size_t *o = tt_reallocarray(r->offs, cap, sizeof *o);
            if (!o)
                return TT_ENOMEM;
            r->offs = o;
            r->cap_fields = cap;
        }
        r->offs[r->n_fields] = start;
        tt_status st = tt_buf_putc(&r->scratch, '\0');
        if (st)
            return st;
    }
    r->n_fields++;
    return TT_OK;
}

static void skip_line(reader *r)
{
    while (r->pos < r->len && r->t[r->pos] != '\n')
        r->pos++;
    if (r->pos < r->len) {
        r->pos++;
        r->line++;
    }
}

/* Reads one record at r->pos into r->scratch / r->offs. Returns TT_OK,
 * TT_EPARSE with *problem set (the rest of the line is skipped), or
 * TT_ENOMEM / TT_ELIMIT. */
static tt_status read_record(reader *r, const char **problem)
{
    tt_buf_reset(&r->scratch);
    r->n_fields = 0;
    /* Past the column cap fields are counted, not stored. */
    for (;;) {
        int store = r->n_fields <= TT_MANIFEST_MAX_COLUMNS;
        size_t start = r->scratch.len;
        tt_status st = TT_OK;
        if (r->pos < r->len && r->t[r->pos] == '"') {
            r->pos++;
            for (;;) {
                if (r->pos >= r->len) {
                    *problem = "unterminated quoted field";
                    return TT_EPARSE;
                }
                char c = r->t[r->pos];
                if (c == '"') {
                    if (r->pos + 1 < r->len && r->t[r->pos + 1] == '"') {
                        if (store)
                            st = tt_buf_putc(&r->scratch, '"');
                        r->pos += 2;
                    } else {
                        r->pos++;
                        break;
                    }
                } else {
                    if (c == '\n')
                        r->line++;
                    if (store)
                        st = tt_buf_putc(&r->scratch, c);
                    r->pos++;
                }
                if (st)
                    return st;
            }
            if (r->pos < r->len && r->t[r->pos] == '\r' && r->pos + 1 < r->len &&
                r->t[r->pos + 1] == '\n')
                r->pos++;
            else if (r->pos + 1 == r->len && r->t[r->pos] == '\r')
                r->pos++;
            if (r->pos < r->len && r->t[r->pos] != r->delim && r->t[r->pos] != '\n') {
                *problem = "text after a closing quote";
                skip_line(r);
                return TT_EPARSE;
            }
        } else {
            size_t s = r->pos;
            while (r->pos < r->len && r->t[r->pos] != r->delim && r->t[r->pos] != '\n')
                r->pos++;
            size_t e = r->pos;
            if ((r->pos >= r->len || r->t[r->pos] == '\n') && e > s && r->t[e - 1] == '\r')
                e--; /* CRLF line end */
            if (store)
                st = tt_buf_append(&r->scratch, r->t + s, e - s);
            if (st)
                return st;
        }
        st = end_field(r, start);
        if (st)
            return st;
        if (r->pos < r->len && r->t[r->pos] == r->delim) {
            r->pos++;
            continue;
        }
        if (r->pos < r->len) { /* '\n' */
            r->pos++;
            r->line++;
        }
        return TT_OK;
    }
}

static const char *field(const reader *r, size_t i) { return r->scratch.data + r->offs[i]; }

/* ---- loading ---------------------------------------------------------------- */

typedef struct loader {
    tt_manifest *m;
    const char *name; /* for messages */
    size_t n_problems;
    int too_many_columns;
} loader;

static tt_status problem(loader *ld, tt_status status, long line, const char *fmt, ...)
    __attribute__((format(printf, 4, 5)));

/* Records one problem (the first TT_MANIFEST_MAX_ERRORS kept). TT_ENOMEM
 * when the list cannot be allocated, else TT_OK. */
static tt_status problem(loader *ld, tt_status status, long line, const char *fmt, ...)
{
    tt_manifest *m = ld->m;
    ld->n_problems++;
    if (m->n_errors >= TT_MANIFEST_MAX_ERRORS) {
        m->errors_more++;
        return TT_OK;
    }
    if (!m->errors) {
        m->errors = tt_calloc(TT_MANIFEST_MAX_ERRORS, sizeof *m->errors);
        if (!m->errors)
            return TT_ENOMEM;
    }
    char msg[TT_ERROR_MSG_MAX];
    va_list ap;
    va_start(ap, fmt);
    vsnprintf(msg, sizeof msg, fmt, ap);
    va_end(ap);
    tt_error_set_line(&m->errors[m->n_errors++], status, ld->name, line, "%s", msg);
    return TT_OK;
}

static void trim_blanks(const char **s, size_t *n)
{
    const char *a = *s, *b = *s + *n;
    while (a < b && (*a == ' ' || *a == '\t'))
        a++;
    while (b > a && (b[-1] == ' ' || b[-1] == '\t'))
        b--;
    *s = a;
    *n = (size_t)(b - a);
}

static int name_is(const char *s, size_t n, const char *want)
{
    if (strlen(want) != n)
        return 0;
    for (size_t i = 0; i < n; i++)
        if (tti_ascii_lower((unsigned char)s[i]) != want[i])
            return 0;
    return 1;
}

enum { COL_PATH, COL_ENTITY, COL_PERIOD, COL_KIND, N_REQUIRED };
static const char *const required_names[N_REQUIRED] = { "path", "entity", "period", "kind" };

/* Reads the header record: required columns into col[], tags into m. */
static tt_status read_header(loader *ld, reader *r, size_t col[N_REQUIRED], size_t **tag_col)
{
    tt_manifest *m = ld->m;
    const char *why = NULL;
    long line = r->line;
    tt_status st = read_record(r, &why);
    if (st == TT_EPARSE)
        return problem(ld, TT_EPARSE, line, "header: %s", why);
    if (st)
        return st;
    if (r->n_fields > TT_MANIFEST_MAX_COLUMNS) {
        ld->too_many_columns = 1;
        return problem(ld, TT_ELIMIT, line, "the header has more than %d columns",
                       TT_MANIFEST_MAX_COLUMNS);
    }
    size_t nf = r->n_fields;
    for (int k = 0; k < N_REQUIRED; k++)
        col[k] = (size_t)-1;
    *tag_col = tt_reallocarray(NULL, nf ? nf : 1, sizeof **tag_col);
    m->tag_names = tt_reallocarray(NULL, nf ? nf : 1, sizeof *m->tag_names);
    if (!*tag_col || !m->tag_names)
        return TT_ENOMEM;
    for (size_t i = 0; i < nf; i++) {
        const char *s = field(r, i);
        size_t n = strlen(s);
        trim_blanks(&s, &n);
        if (n == 0) {
            st = problem(ld, TT_EPARSE, line, "column %zu has no name", i + 1);
            if (st)
                return st;
            continue;
        }
        /* A repeated name, compared like required names (ASCII case
         * ignored), so "Kind" and "kind" cannot both be there. */
        size_t dup = (size_t)-1;
        for (size_t j = 0; j < i && dup == (size_t)-1; j++) {
            const char *o = field(r, j);
            size_t on = strlen(o);
            trim_blanks(&o, &on);
            if (on == n) {
                size_t x = 0;
                while (x < n && tti_ascii_lower((unsigned char)o[x]) ==
                                    tti_ascii_lower((unsigned char)s[x]))
                    x++;
                if (x == n)
                    dup = j;
            }
        }
        if (dup != (size_t)-1) {
            char q[96];
            tti_meta_quote(s, n, q, sizeof q);
            st = problem(ld, TT_EPARSE, line, "column \"%s\" appears twice (columns %zu and %zu)",
                         q, dup + 1, i + 1);
            if (st)
                return st;
            continue;
        }
        int req = -1;
        for (int k = 0; k < N_REQUIRED; k++)
            if (name_is(s, n, required_names[k]))
                req = k;
        if (req >= 0) {
            col[req] = i;
            continue;
        }
        char *name = tt_strndup(s, n);
        if (!name)
            return TT_ENOMEM;
        (*tag_col)[m->n_tags] = i;
        m->tag_names[m->n_tags++] = name;
    }
    for (int k = 0; k < N_REQUIRED; k++) {
        if (col[k] != (size_t)-1)
            continue;
        st = problem(ld, TT_EPARSE, line, "missing column \"%s\" (required: path, entity, "
                                          "period, kind; the header is %s-separated)",
                     required_names[k], r->delim == '\t' ? "tab" : "comma");
        if (st)
            return st;
    }
    return TT_OK;
}

static tt_status read_rows(loader *ld, reader *r, const char *dir, unsigned flags,
                           const size_t col[N_REQUIRED], const size_t *tag_col)
{
    tt_manifest *m = ld->m;
    size_t n_cols = N_REQUIRED + m->n_tags;
    tt_status st = TT_OK;
    tt_buf resolved;
    const char **tags = tt_reallocarray(NULL, m->n_tags ? m->n_tags : 1, sizeof *tags);
    tt_buf_init(&resolved, 0);
    if (!tags)
        return TT_ENOMEM;
    while (skip_ignored(r)) {
        long line = r->line;
        const char *why = NULL;
        st = read_record(r, &why);
        if (st == TT_EPARSE) {
            st = problem(ld, TT_EPARSE, line, "%s", why);
            if (st || !why || strcmp(why, "unterminated quoted field") == 0)
                break;
            continue;
        }
        if (st)
            break;
        int all_blank = 1;
        for (size_t i = 0; i < r->n_fields && i <= TT_MANIFEST_MAX_COLUMNS && all_blank; i++)
            all_blank = is_blank(field(r, i));
        if (all_blank)
            continue;
        if (r->n_fields != n_cols) {
            st = problem(ld, TT_EPARSE, line, "%zu field%s, the header has %zu", r->n_fields,
                         r->n_fields == 1 ? "" : "s", n_cols);
            if (st)
                break;
            continue;
        }
        const char *path = field(r, col[COL_PATH]);
        const char *entity = field(r, col[COL_ENTITY]);
        const char *ptext = field(r, col[COL_PERIOD]);
        const char *kind = field(r, col[COL_KIND]);
        int ok = 1;
        tt_period period = { TT_PERIOD_NONE, TT_BASIS_CALENDAR, 0, 0, 0, 0 };
        if (is_blank(path)) {
            ok = 0;
            if ((st = problem(ld, TT_EPARSE, line, "empty path")))
                break;
        }
        if (is_blank(entity)) {
            ok = 0;
            if ((st = problem(ld, TT_EPARSE, line, "empty entity")))
                break;
        }
        if (!ptext[0]) {
            ok = 0;
            if ((st = problem(ld, TT_EPARSE, line, "empty period")))
                break;
        } else {
            tt_error perr;
            tt_error_init(&perr);
            if (tt_period_parse(ptext, strlen(ptext), &period, &perr) != TT_OK) {
                ok = 0;
                if ((st = problem(ld, TT_EPARSE, line, "%s", perr.message)))
                    break;
            }
        }
        struct stat sb;
        int have_stat = 0;
        if (!is_blank(path)) {
            tt_status rs = tt_meta_path_resolve(dir, path, &resolved);
            if (rs == TT_ENOMEM) {
                st = rs;
                break;
            }
            char q[200];
            if (rs) {
                ok = 0;
                tti_meta_quote(path, strlen(path), q, sizeof q);
                if ((st = problem(ld, TT_ELIMIT, line, "path \"%s\" resolves to %d bytes or more",
                                  q, TT_META_PATH_MAX)))
                    break;
            } else {
                tti_meta_quote(resolved.data, resolved.len, q, sizeof q);
                long dup = find_resolved(m, resolved.data);
                if (dup >= 0) {
                    ok = 0;
                    if ((st = problem(ld, TT_EPARSE, line, "duplicate path \"%s\" (also on line %ld)",
                                      q, m->docs[dup].line)))
                        break;
                } else if (!(flags & TT_MANIFEST_SKIP_FILE_CHECK)) {
                    if (stat(resolved.data, &sb) != 0) {
                        int e = errno;
                        ok = 0;
                        if (e == ENOENT || e == ENOTDIR)
                            st = problem(ld, TT_ENOENT, line, "listed file \"%s\" not found", q);
                        else
                            st = problem(ld, TT_EIO, line, "listed file \"%s\" cannot be checked: %s",
                                         q, strerror(e));
                        if (st)
                            break;
                    } else if (S_ISDIR(sb.st_mode)) {
                        ok = 0;
                        if ((st = problem(ld, TT_EPARSE, line, "listed path \"%s\" is a directory",
                                          q)))
                            break;
                    } else {
                        have_stat = 1;
                    }
                }
            }
        }
        if (!ok)
            continue;
        for (size_t k = 0; k < m->n_tags; k++)
            tags[k] = field(r, tag_col[k]);
        if ((st = reserve_one(m)))
            break;
        if ((st = append_doc(m, resolved.data, entity, &period, kind, tags, line,
                             have_stat ? &sb : NULL)))
            break;
    }
    tt_free(tags);
    tt_buf_release(&resolved);
    return st;
}

/* Parses decoded text into m (already cleared, file and dir set). */
static tt_status parse_text(tt_manifest *m, const char *text, size_t len, const char *name,
                            unsigned flags, tt_error *err)
{
    loader ld = { m, name, 0, 0 };
    reader r;
    memset(&r, 0, sizeof r);
    r.t = text;
    r.len = len;
    r.line = 1;
    tt_buf_init(&r.scratch, 0);
    size_t col[N_REQUIRED];
    size_t *tag_col = NULL;
    tt_status st = TT_OK;

    if (!skip_ignored(&r)) {
        st = problem(&ld, TT_EPARSE, r.line > 1 ? r.line - 1 : 1,
                     "no header line (expected columns path, entity, period, kind)");
    } else {
        r.delim = detect_delim(&r);
        st = read_header(&ld, &r, col, &tag_col);
        if (!st && !ld.n_problems)
            st = read_rows(&ld, &r, m->dir, flags, col, tag_col);
    }
    tt_free(tag_col);
    tt_free(r.offs);
    tt_buf_release(&r.scratch);

    if (st == TT_ENOMEM) {
        tt_manifest_clear(m);
        return tt_error_set_line(err, TT_ENOMEM, name, 0, "out of memory reading the manifest");
    }
    if (st) { /* a buffer limit: reported like any problem */
        drop_docs(m);
        return tt_error_set_line(err, st, name, r.line, "%s", tt_status_name(st));
    }
    if (ld.n_problems) {
        drop_docs(m);
        tt_status ret = ld.too_many_columns ? TT_ELIMIT : TT_EPARSE;
        if (err) {
            *err = m->errors[0];
            err->status = ret;
        }
        return ret;
    }
    return TT_OK;
}

static tt_status set_origin(tt_manifest *m, const char *name, const char *dir)
{
    tt_manifest_clear(m);
    if (name && !(m->file = tt_strdup(name)))
        return TT_ENOMEM;
    if (!(m->dir = tt_strdup(dir ? dir : "")))
        return TT_ENOMEM;
    return TT_OK;
}

tt_status tt_manifest_parse(tt_manifest *m, const char *bytes, size_t len, const char *name,
                            const char *dir, unsigned flags, tt_error *err)
{
    const char *label = name ? name : "<manifest>";
    if (set_origin(m, name, dir)) {
        tt_manifest_clear(m);
        return tt_error_set_line(err, TT_ENOMEM, label, 0, "out of memory");
    }
    tt_buf text;
    tt_buf_init(&text, 0);
    tt_status st = tt_decode(bytes ? bytes : "", bytes ? len : 0, &text, NULL, label, err);
    if (!st)
        st = parse_text(m, text.data, text.len, label, flags, err);
    tt_buf_release(&text);
    return st;
}

tt_status tt_manifest_load(tt_manifest *m, const char *path, unsigned flags, tt_error *err)
{
    const char *slash = strrchr(path, '/');
    char *dir = slash ? tt_strndup(path, slash == path ? 1 : (size_t)(slash - path))
                      : tt_strdup("");
    if (!dir || set_origin(m, path, dir)) {
        tt_free(dir);
        tt_manifest_clear(m);
        return tt_error_set_line(err, TT_ENOMEM, path, 0, "out of memory");
    }
    tt_free(dir);
    tt_buf raw, scratch;
    tt_buf_init(&raw, 0);
    tt_buf_init(&scratch, 0);
    tt_status st = tt_source_read(path, &raw, NULL, err);
    if (!st)
        st = tt_decode_buf(&raw, &scratch, NULL, path, err);
    if (!st)
        st = parse_text(m, raw.data, raw.len, path, flags, err);
    tt_buf_release(&raw);
    tt_buf_release(&scratch);
    return st;
}

/* ---- layouts ------------------------------------------------------------- */

enum tok_type { TOK_LITERAL, TOK_ENTITY, TOK_PERIOD, TOK_KIND, TOK_STAR, TOK_STARSTAR,
                TOK_STARSTAR_DIR };

struct tti_layout_token {
    enum tok_type type;
    size_t off, len; /* literal text in l->pattern */
};

void tt_layout_init(tt_layout *l) { memset(l, 0, sizeof *l); }

void tt_layout_release(tt_layout *l)
{
    tt_free(l->pattern);
    tt_free(l->tokens);
    tt_layout_init(l);
}

void tt_layout_clear(tt_layout *l)
{
    tt_layout_release(l);
    tt_layout_init(l);
}

static tt_status layout_fail(tt_error *err, tt_status st, const char *pattern, const char *fmt,
                             const char *arg)
{
    char q[200], msg[200];
    tti_meta_quote(pattern, strlen(pattern), q, sizeof q);
    snprintf(msg, sizeof msg, fmt, arg);
    return tt_error_set_line(err, st, NULL, 0, "layout \"%s\": %s", q, msg);
}

tt_status tt_layout_compile(tt_layout *l, const char *pattern, tt_error *err)
{
    tt_layout_release(l);
    if (!pattern)
        pattern = "";
    l->pattern = tt_strdup(pattern);
    l->tokens = tt_reallocarray(NULL, TT_LAYOUT_MAX_TOKENS, sizeof *l->tokens);
    if (!l->pattern || !l->tokens) {
        tt_layout_release(l);
        return tt_error_set_line(err, TT_ENOMEM, NULL, 0, "out of memory compiling a layout");
    }
    const char *p = l->pattern;
    int seen[3] = { 0, 0, 0 };
    size_t i = 0, n = strlen(p);
    tt_status st = TT_OK;
    while (i < n) {
        if (l->n_tokens == TT_LAYOUT_MAX_TOKENS) {
            char lim[32];
            snprintf(lim, sizeof lim, "%d", TT_LAYOUT_MAX_TOKENS);
            st = layout_fail(err, TT_ELIMIT, pattern, "more than %s parts", lim);
            goto fail;
        }
        struct tti_layout_token *t = &l->tokens[l->n_tokens];
        t->off = i;
        if (p[i] == '{') {
            const char *close = strchr(p + i, '}');
            if (!close) {
                st = layout_fail(err, TT_EINVAL, pattern, "%s",
                                 "'{' without '}' (placeholders are {entity}, {period}, {kind})");
                goto fail;
            }
            size_t nl = (size_t)(close - (p + i)) + 1;
            int which = -1;
            if (nl == 8 && memcmp(p + i, "{entity}", 8) == 0)
                which = 0;
            else if (nl == 8 && memcmp(p + i, "{period}", 8) == 0)
                which = 1;
            else if (nl == 6 && memcmp(p + i, "{kind}", 6) == 0)
                which = 2;
            char name[64];
            tti_meta_quote(p + i, nl, name, sizeof name);
            if (which < 0) {
                st = layout_fail(err, TT_EINVAL, pattern,
                                 "unknown placeholder %s (expected {entity}, {period} or {kind})",
                                 name);
                goto fail;
            }
            if (seen[which]++) {
                st = layout_fail(err, TT_EINVAL, pattern, "%s appears twice", name);
                goto fail;
            }
            t->type = which == 0 ? TOK_ENTITY : which == 1 ? TOK_PERIOD : TOK_KIND;
            t->len = nl;
            i += nl;
        } else if (p[i] == '*') {
            size_t k = i;
            while (k < n && p[k] == '*')
                k++;
            if (k - i > 2) {
                st = layout_fail(err, TT_EINVAL, pattern, "%s",
                                 "'***' (use '*' within a directory, '**' across directories)");
                goto fail;
            }
            if (k - i == 1) {
                t->type = TOK_STAR;
            } else if (k < n && p[k] == '/') {
                t->type = TOK_STARSTAR_DIR;
                k++;
            } else {
                t->type = TOK_STARSTAR;
            }
            t->len = k - i;
            i = k;
        } else {
            size_t k = i;
            while (k < n && p[k] != '{' && p[k] != '*')
                k++;
            t->type = TOK_LITERAL;
            t->len = k - i;
            i = k;
        }
        l->n_tokens++;
    }
    if (!seen[0] || !seen[1]) {
        st = layout_fail(err, TT_EINVAL, pattern, "%s",
                         !seen[0] ? "no {entity} placeholder" : "no {period} placeholder");
        goto fail;
    }
    return TT_OK;
fail:
    tt_layout_release(l);
    return st;
}

typedef struct matcher {
    const tt_layout *l;
    const char *s;
    size_t len;
    int check_period;
    unsigned char *failed; /* bit (ti * (len + 1) + pos): known not to match */
    size_t span_off[3], span_len[3]; /* entity, period, kind */
} matcher;

static int failed_get(const matcher *mt, size_t ti, size_t pos)
{
    size_t b = ti * (mt->len + 1) + pos;
    return (mt->failed[b >> 3] >> (b & 7)) & 1;
}

static void failed_set(matcher *mt, size_t ti, size_t pos)
{
    size_t b = ti * (mt->len + 1) + pos;
    mt->failed[b >> 3] |= (unsigned char)(1u << (b & 7));
}

static size_t digit_run(const char *s, size_t n)
{
    size_t k = 0;
    while (k < n && tti_is_ascii_digit(s[k]))
        k++;
    return k;
}

/* Length of the longest prefix of s[0..n) shaped like a period: an
 * optional "FY", digits, then optionally "-Q" and digits, or "-" digits
 * and optionally "-" digits again. 0 when s does not start that way. */
static size_t period_shape(const char *s, size_t n)
{
    size_t i = 0;
    if (n >= 2 && tti_ascii_lower(s[0]) == 'f' && tti_ascii_lower(s[1]) == 'y')
        i = 2;
    size_t d = digit_run(s + i, n - i);
    if (!d)
        return 0;
    i += d;
    if (i + 1 < n && s[i] == '-') {
        if (tti_ascii_lower(s[i + 1]) == 'q') {
            d = digit_run(s + i + 2, n - i - 2);
            if (d)
                return i + 2 + d;
            return i;
        }
        d = digit_run(s + i + 1, n - i - 1);
        if (!d)
            return i;
        i += 1 + d;
        if (i + 1 < n && s[i] == '-') {
            d = digit_run(s + i + 1, n - i - 1);
            if (d)
                i += 1 + d;
        }
    }
    return i;
}

/* Whether tokens ti.. match s[pos..len). Recursion depth is at most the
 * number of tokens (TT_LAYOUT_MAX_TOKENS). */
static int match_from(matcher *mt, size_t ti, size_t pos)
{
    if (ti == mt->l->n_tokens)
        return pos == mt->len;
    if (failed_get(mt, ti, pos))
        return 0;
    const struct tti_layout_token *t = &mt->l->tokens[ti];
    const char *s = mt->s;
    size_t seg_end = pos;
    while (seg_end < mt->len && s[seg_end] != '/')
        seg_end++;
    switch (t->type) {
    case TOK_LITERAL:
        if (mt->len - pos >= t->len && memcmp(s + pos, mt->l->pattern + t->off, t->len) == 0 &&
            match_from(mt, ti + 1, pos + t->len))
            return 1;
        break;
    case TOK_STAR:
        for (size_t e = pos; e <= seg_end; e++)
            if (match_from(mt, ti + 1, e))
                return 1;
        break;
    case TOK_STARSTAR:
        for (size_t e = pos; e <= mt->len; e++)
            if (match_from(mt, ti + 1, e))
                return 1;
        break;
    case TOK_STARSTAR_DIR:
        if (match_from(mt, ti + 1, pos))
            return 1;
        for (size_t e = pos; e < mt->len; e++)
            if (s[e] == '/' && match_from(mt, ti + 1, e + 1))
                return 1;
        break;
    case TOK_ENTITY:
    case TOK_KIND: {
        int k = t->type == TOK_ENTITY ? 0 : 2;
        for (size_t e = pos + 1; e <= seg_end; e++) {
            mt->span_off[k] = pos;
            mt->span_len[k] = e - pos;
            if (match_from(mt, ti + 1, e))
                return 1;
        }
        break;
    }
    case TOK_PERIOD:
        if (mt->check_period) {
            /* The text shaped like a period, and only if it parses: so
             * "2025-Q3-call" yields 2025-Q3 (not 2025), and "2025-Q5-call"
             * is refused rather than read as the year 2025. */
            size_t e = pos + period_shape(s + pos, seg_end - pos);
            tt_period p;
            if (e > pos && tt_period_parse(s + pos, e - pos, &p, NULL) == TT_OK) {
                mt->span_off[1] = pos;
                mt->span_len[1] = e - pos;
                if (match_from(mt, ti + 1, e))
                    return 1;
            }
            break;
        }
        /* Second pass, only to name the offending text: any run, longest
         * first. */
        for (size_t e = seg_end; e > pos; e--) {
            mt->span_off[1] = pos;
            mt->span_len[1] = e - pos;
            if (match_from(mt, ti + 1, e))
                return 1;
        }
        break;
    }
    failed_set(mt, ti, pos);
    return 0;
}

static int run_match(matcher *mt, int check_period)
{
    size_t bits = (mt->l->n_tokens + 1) * (mt->len + 1);
    memset(mt->failed, 0, (bits + 7) / 8);
    mt->check_period = check_period;
    return match_from(mt, 0, 0);
}

tt_status tt_layout_match(const tt_layout *l, const char *root, const char *path,
                          tt_layout_fields *out, tt_error *err)
{
    tt_buf rp, pp;
    tt_buf_init(&rp, 0);
    tt_buf_init(&pp, 0);
    matcher mt;
    memset(&mt, 0, sizeof mt);
    tt_status st;
    const char *label = path ? path : "";
    char q[200];

    if (!l->tokens || !l->n_tokens) {
        st = tt_error_set_line(err, TT_EINVAL, label, 0, "no layout compiled");
        goto done;
    }
    st = tt_meta_path_resolve(NULL, path, &pp);
    if (!st && root && root[0])
        st = tt_meta_path_resolve(NULL, root, &rp);
    if (st == TT_ELIMIT) {
        st = tt_error_set_line(err, st, label, 0, "path of %d bytes or more", TT_META_PATH_MAX);
        goto done;
    }
    if (st) {
        st = tt_error_set_line(err, st, label, 0, "out of memory matching the layout");
        goto done;
    }
    const char *rel = pp.data;
    if (rp.len && strcmp(rp.data, ".") != 0) {
        size_t n = rp.len;
        int slash_root = n == 1 && rp.data[0] == '/';
        if (slash_root && pp.data[0] == '/') {
            rel = pp.data + 1;
        } else if (!slash_root && pp.len > n && memcmp(pp.data, rp.data, n) == 0 &&
                   pp.data[n] == '/') {
            rel = pp.data + n + 1;
        } else {
            tti_meta_quote(root, strlen(root), q, sizeof q);
            st = tt_error_set_line(err, TT_EINVAL, label, 0, "not under the root \"%s\"", q);
            goto done;
        }
    }
    mt.l = l;
    mt.s = rel;
    mt.len = strlen(rel);
    size_t bits = (l->n_tokens + 1) * (mt.len + 1);
    mt.failed = tt_malloc((bits + 7) / 8);
    if (!mt.failed) {
        st = tt_error_set_line(err, TT_ENOMEM, label, 0, "out of memory matching the layout");
        goto done;
    }
    tti_meta_quote(l->pattern, strlen(l->pattern), q, sizeof q);
    if (!run_match(&mt, 1)) {
        if (run_match(&mt, 0)) {
            tt_error perr;
            tt_period p;
            tt_error_init(&perr);
            tt_period_parse(rel + mt.span_off[1], mt.span_len[1], &p, &perr);
            st = tt_error_set_line(err, TT_EPARSE, label, 0, "%s (from the layout \"%s\")",
                                   perr.message, q);
        } else {
            st = tt_error_set_line(err, TT_EPARSE, label, 0, "does not match the layout \"%s\"",
                                   q);
        }
        goto done;
    }
    if (mt.span_len[0] >= TT_META_NAME_MAX || mt.span_len[2] >= TT_META_NAME_MAX) {
        st = tt_error_set_line(err, TT_ELIMIT, label, 0,
                               "an entity or kind of %d bytes or more", TT_META_NAME_MAX);
        goto done;
    }
    memcpy(out->entity, rel + mt.span_off[0], mt.span_len[0]);
    out->entity[mt.span_len[0]] = '\0';
    memcpy(out->kind, rel + mt.span_off[2], mt.span_len[2]);
    out->kind[mt.span_len[2]] = '\0';
    st = tt_period_parse(rel + mt.span_off[1], mt.span_len[1], &out->period, err);
done:
    tt_free(mt.failed);
    tt_buf_release(&rp);
    tt_buf_release(&pp);
    return st;
}
