/* termtide report — one self-contained HTML page for an entity across its
 * periods (or for two sides of a comparison): an overview per period, the
 * top movers of each consecutive pair as a table, a bar chart and a change
 * cloud, the tone trend, a heat map of the leading terms, the sentences
 * added, removed and reworded, and the watch-list hits.
 *
 * The report computes nothing of its own: it runs termtide's own commands
 * (compare, trend, tone, changes, search, chart, cloud) in this process,
 * writing their tables and pictures into one folder, and lays those out on
 * the page (tt_report). So every figure on the page is the figure the
 * command prints, and --keep-tables leaves the tables behind for audit. A
 * message the commands print twice (a skipped document is skipped by each)
 * is shown once. */
#include <errno.h>
#include <stdarg.h>
#include <fcntl.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>
#include <sys/stat.h>
#include <unistd.h>

#include "termtide/alloc.h"
#include "termtide/limits.h"
#include "termtide/meta.h"
#include "termtide/report.h"
#include "termtide/termtable.h"
#include "termtide/tsvread.h"
#include "cli.h"

const char tt_help_report[] =
    "Usage: termtide report [OPTIONS] --manifest FILE -o REPORT.html\n"
    "       termtide report [OPTIONS] --layout PATTERN ROOT... -o REPORT.html\n"
    "       termtide report [OPTIONS] --headers ROOT... -o REPORT.html\n"
    "       termtide report [OPTIONS] --base PATH... --target PATH... -o REPORT.html\n"
    "\n"
    "Writes one self-contained HTML page (inline pictures and style, no scripts,\n"
    "nothing fetched) for each entity's series of periods, or for two sides:\n"
    "  - an overview per period: words, distinct terms, similarity to the period\n"
    "    before (cosine, Jaccard), the share of words in new sentences, tone per\n"
    "    1,000 words by category, watch-list hits;\n"
    "  - the tone trend as a line chart, and a heat map of the terms that moved\n"
    "    most from the first period to the last;\n"
    "  - for each pair of consecutive periods: the top movers (signed G2, Log\n"
    "    Ratio, q-value) as a table, a diverging bar chart and a change cloud, and\n"
    "    the sentences added, removed and reworded;\n"
    "  - with --rules, the watch-list hits per rule and period, and in context.\n"
    "The figures are those of termtide compare, trend, tone, changes and search\n"
    "run with the same options; --keep-tables DIR keeps their tables and pictures.\n"
    "\n"
    "Series (as for compare):\n"
    "  --manifest FILE, --layout PATTERN ROOT..., --headers ROOT...\n"
    "                        document metadata; --header-period year|quarter|month|day\n"
    "  --entity NAME         only this entity (default: every entity, a chapter each)\n"
    "  --kinds LIST          only these document kinds (a series may not mix a fiscal\n"
    "                        year with quarters)\n"
    "  --base PATH, --target PATH   instead, two sides (repeatable)\n"
    "\n"
    "Content:\n"
    "  --rules FILE          a watch-list (as for search): hits per rule and period,\n"
    "                        and each hit in context\n"
    "  --lexicon FILE        tone categories from your lexicon (as for tone)\n"
    "  --no-tone, --no-changes   leave out tone, or the sentence changes\n"
    "  --top N               movers each way per pair, in the table and the bars (10)\n"
    "  --cloud-words N       words in each change cloud (80; 0: no clouds)\n"
    "  --heatmap-terms N     terms in the heat map (20; 0: no heat map)\n"
    "  --min-count N         test only terms counted at least N times in a pair (5)\n"
    "  --hits N              watch-list hits listed in context per entity (100)\n"
    "  --sentences N         sentences listed per kind of change and pair (12)\n"
    "  --title TEXT          the page's title\n"
    "  --text                pictures with <text> elements instead of outline paths: a\n"
    "                        page several times smaller, drawn with the reader's copy\n"
    "                        of DejaVu Sans (the font the layout was measured with)\n"
    "  --keep-tables DIR     write the tables and pictures behind the page into DIR\n"
    "                        (created if missing) and keep them\n"
    "  -o, --output FILE     write the page atomically to FILE (default standard\n"
    "                        output)\n"
    "\n"
    "Reading options passed to every command: --ngram --stem --numbers --min-length\n"
    "--stopwords --no-stopwords --tables --doc-types --section --section-rules -j -q\n"
    "(as for count; --db is not taken: changes and search need the text).\n"
    "\n"
    "Exit status: 0 written; 2 trouble (a bad option, a command that failed, or a\n"
    "document skipped: the page is still written, and says so).\n"
    "\n"
    "termtide measures language; it gives no investment, legal or compliance advice.\n";

enum { OPT_MANIFEST = CLI_OPT_FIRST_FREE, OPT_LAYOUT, OPT_HEADERS, OPT_HEADER_PERIOD,
       OPT_ENTITY, OPT_KINDS, OPT_BASE, OPT_TARGET, OPT_RULES, OPT_LEXICON, OPT_NO_TONE,
       OPT_NO_CHANGES, OPT_TOP, OPT_CLOUD_WORDS, OPT_HEATMAP_TERMS, OPT_MIN_COUNT, OPT_HITS,
       OPT_SENTENCES, OPT_TITLE, OPT_KEEP, OPT_TEXT };

static const struct option longopts[] = {
    { "manifest", required_argument, NULL, OPT_MANIFEST },
    { "layout", required_argument, NULL, OPT_LAYOUT },
    { "headers", no_argument, NULL, OPT_HEADERS },
    { "header-period", required_argument, NULL, OPT_HEADER_PERIOD },
    { "entity", required_argument, NULL, OPT_ENTITY },
    { "kinds", required_argument, NULL, OPT_KINDS },
    { "base", required_argument, NULL, OPT_BASE },
    { "target", required_argument, NULL, OPT_TARGET },
    { "rules", required_argument, NULL, OPT_RULES },
    { "lexicon", required_argument, NULL, OPT_LEXICON },
    { "no-tone", no_argument, NULL, OPT_NO_TONE },
    { "no-changes", no_argument, NULL, OPT_NO_CHANGES },
    { "top", required_argument, NULL, OPT_TOP },
    { "cloud-words", required_argument, NULL, OPT_CLOUD_WORDS },
    { "heatmap-terms", required_argument, NULL, OPT_HEATMAP_TERMS },
    { "min-count", required_argument, NULL, OPT_MIN_COUNT },
    { "hits", required_argument, NULL, OPT_HITS },
    { "sentences", required_argument, NULL, OPT_SENTENCES },
    { "title", required_argument, NULL, OPT_TITLE },
    { "keep-tables", required_argument, NULL, OPT_KEEP },
    { "text", no_argument, NULL, OPT_TEXT },
    { "output", required_argument, NULL, 'o' },
    { "help", no_argument, NULL, 'h' },
    CLI_PIPELINE_LONGOPTS,
    { NULL, 0, NULL, 0 }
};

/* ---- small string lists ------------------------------------------------ */

/* A growable list of strings; owned strings are freed with the list. */
typedef struct strv {
    char **v;
    size_t n, cap;
    unsigned char *owned;
} strv;

static void strv_release(strv *s)
{
    for (size_t i = 0; i < s->n; i++)
        if (s->owned[i])
            tt_free(s->v[i]);
    tt_free(s->v);
    tt_free(s->owned);
    memset(s, 0, sizeof *s);
}

static int strv_push(strv *s, const char *str, int own)
{
    if (s->n + 2 > s->cap) {
        size_t cap = s->cap ? s->cap * 2 : 16;
        char **v = tt_reallocarray(s->v, cap, sizeof *v);
        if (!v)
            return 0;
        s->v = v;
        unsigned char *o = tt_reallocarray(s->owned, cap, 1);
        if (!o)
            return 0;
        s->owned = o;
        s->cap = cap;
    }
    char *copy = (char *)str;
    if (own) {
        size_t len = strlen(str);
        copy = tt_malloc(len + 1);
        if (!copy)
            return 0;
        memcpy(copy, str, len + 1);
    }
    s->owned[s->n] = (unsigned char)own;
    s->v[s->n++] = copy;
    s->v[s->n] = NULL;
    return 1;
}

static int strv_has(const strv *s, const char *str)
{
    for (size_t i = 0; i < s->n; i++)
        if (!strcmp(s->v[i], str))
            return 1;
    return 0;
}

/* ---- the run ------------------------------------------------------------ */

typedef struct report_ctx {
    char dir[TT_META_PATH_MAX];  /* where the tables go */
    int keep;                     /* --keep-tables: leave them */
    strv files;                   /* names written into dir (removed unless keep) */
    strv meta;                    /* --manifest F / --layout P / --headers ..., --entity, --kinds */
    strv roots;                   /* layout and headers roots */
    strv reading;                 /* reading options for compare, trend, tone */
    strv common;                  /* the subset changes and search take */
    strv common_search;           /* what search takes besides: -j */
    strv seen;                    /* messages already shown */
    strv problems;                /* errors among them, for the page */
    char last_error[600];         /* the last error a command printed */
    int trouble;                  /* some command reported trouble */
    int text;                     /* pictures with <text> elements (--text) */
} report_ctx;

static int path_in(const report_ctx *c, const char *name, char *out, size_t size)
{
    int k = snprintf(out, size, "%s/%s", c->dir, name);
    return k > 0 && (size_t)k < size;
}

/* Shows the lines a command printed that were not shown before, and
 * remembers the last error among them. */
static void relay(report_ctx *c, const char *log)
{
    FILE *f = fopen(log, "r");
    if (!f)
        return;
    char line[4096];
    while (fgets(line, sizeof line, f)) {
        if (strstr(line, ": error: ")) {
            snprintf(c->last_error, sizeof c->last_error, "%s", strstr(line, ": error: ") + 9);
            size_t n = strlen(c->last_error);
            while (n && (c->last_error[n - 1] == '\n' || c->last_error[n - 1] == '\r'))
                c->last_error[--n] = '\0';
        }
        if (strv_has(&c->seen, line))
            continue;
        fputs(line, stderr);
        if (c->seen.n < 10000)
            strv_push(&c->seen, line, 1);
        const char *e = strstr(line, ": error: ");
        if (e && c->problems.n < 200) {
            char msg[4096];
            snprintf(msg, sizeof msg, "%s", e + 9);
            size_t n = strlen(msg);
            while (n && (msg[n - 1] == '\n' || msg[n - 1] == '\r'))
                msg[--n] = '\0';
            strv_push(&c->problems, msg, 1);
        }
    }
    fclose(f);
}

/* Runs a termtide command in this process with argv args (args->v[0] is
 * its name) and its standard error caught, so repeated messages show once.
 * Returns 1 when the command wrote `out` (a trouble status with its output
 * written means a document was skipped: noted, and the report goes on). */
static int run(report_ctx *c, tt_cmd_fn fn, strv *args, const char *out)
{
    char log[TT_META_PATH_MAX + 16];
    if (!path_in(c, ".messages", log, sizeof log))
        return 0;
    c->last_error[0] = '\0';
    (void)unlink(out);
    fflush(stdout);
    fflush(stderr);
    int saved = dup(2);
    int fd = open(log, O_WRONLY | O_CREAT | O_TRUNC, 0600);
    if (saved < 0 || fd < 0) {
        if (saved >= 0) close(saved);
        if (fd >= 0) close(fd);
        cli_error("%s: cannot open: %s", log, strerror(errno));
        return 0;
    }
    dup2(fd, 2);
    close(fd);
    int rc = fn((int)args->n, args->v);
    fflush(stderr);
    dup2(saved, 2);
    close(saved);
    relay(c, log);
    (void)unlink(log);
    if (access(out, F_OK) != 0)
        return 0;
    if (rc == TT_EXIT_TROUBLE)
        c->trouble = 1;
    return 1;
}

/* Starts the argument list of a command: its name. */
static int args_begin(strv *a, const char *cmd)
{
    strv_release(a);
    return strv_push(a, cmd, 0);
}

static int args_add(strv *a, const strv *from)
{
    for (size_t i = 0; i < from->n; i++)
        if (!strv_push(a, from->v[i], 0))
            return 0;
    return 1;
}

/* Ends the list: quiet, the output file, then the roots. */
static int args_end(report_ctx *c, strv *a, const char *out, int roots)
{
    if (!strv_push(a, "-q", 0) || !strv_push(a, "-o", 0) || !strv_push(a, out, 0))
        return 0;
    if (roots && c->roots.n)
        return strv_push(a, "--", 0) && args_add(a, &c->roots);
    return 1;
}

/* The full path of a table file, remembered for removal. */
static int table_path(report_ctx *c, const char *name, char *out, size_t size)
{
    if (!path_in(c, name, out, size))
        return 0;
    if (!strv_has(&c->files, name))
        return strv_push(&c->files, name, 1);
    return 1;
}

/* Reads a whole file (a table, an SVG) into b. */
static int slurp(const char *path, tt_buf *b)
{
    FILE *f = fopen(path, "rb");
    if (!f)
        return 0;
    char chunk[65536];
    size_t n;
    tt_status st = TT_OK;
    while (!st && (n = fread(chunk, 1, sizeof chunk, f)) > 0)
        st = tt_buf_append(b, chunk, n);
    fclose(f);
    return !st;
}

/* Reads a table a command wrote; lines starting with "# " (search's
 * provenance) are left out, and kept in *comments when given. Returns 1
 * with rows, 0 for a header without rows, -1 on a problem (printed). */
static int read_table(const char *path, tt_tsv *t, tt_buf *comments)
{
    tt_error err;
    tt_error_init(&err);
    tt_buf b;
    tt_buf_init(&b, (size_t)1 << 31);
    tt_status st = TT_OK;
    if (!slurp(path, &b)) {
        cli_error("%s: cannot read: %s", path, strerror(errno));
        tt_buf_release(&b);
        return -1;
    }
    /* search writes its provenance as lines starting "# " (before each
       document's hits too): keep them apart from the table */
    tt_buf body;
    tt_buf_init(&body, (size_t)1 << 31);
    size_t at = 0;
    while (!st && at < b.len) {
        const char *nl = memchr(b.data + at, '\n', b.len - at);
        size_t end = nl ? (size_t)(nl - b.data) + 1 : b.len;
        int comment = end - at >= 2 && b.data[at] == '#' && b.data[at + 1] == ' ';
        if (comment && comments)
            st = tt_buf_append(comments, b.data + at, end - at);
        else if (!comment)
            st = tt_buf_append(&body, b.data + at, end - at);
        at = end;
    }
    /* a header and no rows: nothing to show (e.g. no term passed --min-count) */
    const char *first_nl = body.len ? memchr(body.data, '\n', body.len) : NULL;
    int header_only = !st && (!first_nl || (size_t)(first_nl - body.data) + 1 >= body.len);
    if (!st && !header_only)
        st = tt_tsv_parse(body.data, body.len, path, t, &err);
    tt_buf_release(&body);
    if (header_only) {
        tt_buf_release(&b);
        return 0;
    }
    tt_buf_release(&b);
    if (st) {
        if (err.message[0])
            cli_error("%s: %s", path, err.message);
        else
            cli_error("%s: %s", path, tt_status_name(st));
        return -1;
    }
    return 1;
}

static const char *cellc(const tt_tsv *t, size_t r, long col)
{
    return col >= 0 ? tt_tsv_cell(t, r, (size_t)col) : "";
}

static int row_is(const tt_tsv *t, size_t r, long ce, const char *e, long cb, const char *b,
                  long ct, const char *tg)
{
    if (ce >= 0 && e && strcmp(cellc(t, r, ce), e)) return 0;
    if (cb >= 0 && b && strcmp(cellc(t, r, cb), b)) return 0;
    if (ct >= 0 && tg && strcmp(cellc(t, r, ct), tg)) return 0;
    return 1;
}

/* ---- the page ----------------------------------------------------------- */

typedef struct page {
    tt_report rep;
    report_ctx *c;
    tt_error err;
    int failed;
} page;

static void pg_heading(page *p, int level, const char *text)
{
    if (!p->failed && tt_report_heading(&p->rep, level, text)) p->failed = 1;
}

static void pg_para(page *p, int note, const char *fmt, ...) __attribute__((format(printf, 3, 4)));
static void pg_para(page *p, int note, const char *fmt, ...)
{
    char text[4096];
    va_list ap;
    va_start(ap, fmt);
    vsnprintf(text, sizeof text, fmt, ap);
    va_end(ap);
    if (!p->failed && tt_report_para(&p->rep, text, note)) p->failed = 1;
}

static void pg_table(page *p, const tt_tsv *t, const char *src, const tt_report_column *cols,
                     size_t ncols, const size_t *rows, size_t nrows, const char *caption)
{
    if (p->failed)
        return;
    if (tt_report_table(&p->rep, t, src, cols, ncols, rows, nrows, caption, &p->err)) {
        cli_error("%s: %s", src, p->err.message[0] ? p->err.message : "cannot lay out the table");
        p->failed = 1;
    }
}

/* A picture a command drew; when it could not, the reason as a note. */
static void pg_figure(page *p, const char *path, int drawn, const char *caption)
{
    if (p->failed)
        return;
    tt_buf svg;
    tt_buf_init(&svg, TT_LIMIT_REPORT_BYTES);
    if (drawn && slurp(path, &svg)) {
        if (tt_report_figure(&p->rep, svg.data, svg.len, caption))
            p->failed = 1;
    } else {
        pg_para(p, 1, "(No picture: %s.)",
                p->c->last_error[0] ? p->c->last_error : "the command drew nothing");
    }
    tt_buf_release(&svg);
}

/* ---- series: the metadata ---------------------------------------------- */

typedef struct series {
    tt_manifest m;
    size_t *docs;          /* indices into m.docs kept by --entity and --kinds */
    size_t ndocs;
    strv entities;         /* in first-seen order */
} series;

static int kind_listed(const char *kinds, const char *kind)
{
    if (!kinds)
        return 1;
    size_t kl = strlen(kind);
    const char *p = kinds;
    while (*p) {
        const char *e = strchr(p, ',');
        size_t n = e ? (size_t)(e - p) : strlen(p);
        if (n == kl && !memcmp(p, kind, n))
            return 1;
        p += n + (e ? 1 : 0);
    }
    return 0;
}

/* The periods of an entity's documents, in calendar order. */
static size_t entity_periods(const series *s, const char *entity, tt_period *out, size_t max)
{
    size_t n = 0;
    for (size_t i = 0; i < s->ndocs; i++) {
        const tt_doc_meta *d = &s->m.docs[s->docs[i]];
        if (strcmp(d->entity, entity))
            continue;
        size_t k = 0;
        while (k < n && tt_period_compare(&out[k], &d->period))
            k++;
        if (k < n || n == max)
            continue;
        /* insertion in order */
        size_t at = n;
        while (at > 0 && tt_period_compare(&out[at - 1], &d->period) > 0) {
            out[at] = out[at - 1];
            at--;
        }
        out[at] = d->period;
        n++;
    }
    return n;
}

/* ---- the parts of a chapter -------------------------------------------- */

/* The tables the page is laid out from. The large ones (movers, sentences,
 * hits) are read as streams and only the rows the page lists are kept, with
 * the counts the page states, so an archive's report never holds a table
 * of every hit or every sentence (or meets the tables' row limit). */
typedef struct tables {
    tt_tsv summary, movers, trend, tone, changes, sentences, hits;
    int has_summary, has_movers, has_trend, has_tone, has_changes, has_sentences, has_hits;
    char movers_path[TT_META_PATH_MAX], trend_path[TT_META_PATH_MAX];
    char tone_lines_path[TT_META_PATH_MAX];
    int has_tone_lines;
    int hits_ran;          /* the watch-list ran (has_hits: and hit) */
    tt_buf hits_comments;
    strv mover_entities;   /* entities with movers, and their own movers file */
    strv mover_files;
    strv rules;            /* the watch-list rules that hit, in order met */
    tt_termtable *counts;  /* "entity\tperiod\trule": hits; "entity\tbase\ttarget\tchange": sentences */
} tables;

/* A count kept under a key of tab-joined parts. */
static uint64_t count_of(const tables *tb, const char *a, const char *b, const char *c,
                         const char *d)
{
    char key[1024];
    int k = d ? snprintf(key, sizeof key, "%s\t%s\t%s\t%s", a, b, c, d)
              : snprintf(key, sizeof key, "%s\t%s\t%s", a, b, c);
    if (!tb->counts || k < 0 || (size_t)k >= sizeof key)
        return 0;
    return tt_termtable_get(tb->counts, key, (size_t)k);
}

/* The movers file of an entity, for its pictures; NULL when it has none. */
static const char *movers_file(const tables *tb, const char *entity)
{
    for (size_t i = 0; i < tb->mover_entities.n; i++)
        if (!strcmp(tb->mover_entities.v[i], entity))
            return tb->mover_files.v[i];
    return NULL;
}

/* Looks up a number in the row of `t` matching entity and a column value
 * (period in `pcol`); NaN when absent. */
static const char *lookup(const tt_tsv *t, const char *entity, const char *pcolname,
                          const char *period, const char *colname)
{
    long ce = tt_tsv_column(t, "entity"), cp = tt_tsv_column(t, pcolname),
         cv = tt_tsv_column(t, colname);
    if (cp < 0 || cv < 0)
        return NULL;
    for (size_t r = 0; r < t->nrows; r++)
        if ((ce < 0 || !strcmp(cellc(t, r, ce), entity)) && !strcmp(cellc(t, r, cp), period))
            return cellc(t, r, cv);
    return NULL;
}

/* The categories of a tone table: its columns NAME_per_1000 other than net. */
static size_t tone_categories(const tt_tsv *t, const char **names, size_t max)
{
    size_t n = 0;
    for (size_t k = 0; k < t->ncols && n < max; k++) {
        const char *h = t->cells[k];
        size_t l = strlen(h);
        if (l > 9 && !strcmp(h + l - 9, "_per_1000") && strcmp(h, "net_per_1000"))
            names[n++] = h;
    }
    return n;
}

/* The overview of an entity: one row per period, joined from the tables. */
static void overview(page *p, tables *tb, const char *entity, char (*names)[TT_PERIOD_TEXT_MAX],
                     const uint64_t *ndocs, size_t np)
{
    static const char *const fixed[] = { "period", "documents", "words", "distinct_terms",
                                         "cosine_prev", "jaccard_prev", "new_sentence_words" };
    const char *cats[16];
    size_t ncat = tb->has_tone ? tone_categories(&tb->tone, cats, 16) : 0;
    const char *cols[32];
    size_t nc = 0;
    for (size_t i = 0; i < sizeof fixed / sizeof *fixed; i++)
        cols[nc++] = fixed[i];
    for (size_t i = 0; i < ncat; i++)
        cols[nc++] = cats[i];
    if (ncat)
        cols[nc++] = "net_tone";
    if (tb->hits_ran)
        cols[nc++] = "watch_hits";
    tt_buf text;
    tt_buf_init(&text, 0);
    tt_table_writer w;
    tt_status st = tt_table_begin(&w, TT_FORMAT_TSV, &text, cols, nc, 1);
    for (size_t i = 0; i < np && !st; i++) {
        const char *pt = names[i];
        uint64_t docs = ndocs[i];
        /* words: terms counted (after stop-words), as compare and trend count them */
        const char *words = tb->has_trend ? lookup(&tb->trend, entity, "period", pt, "words")
                                          : NULL;
        const char *distinct = NULL, *cosv = NULL, *jacv = NULL, *neww = NULL;
        if (tb->has_summary) {
            distinct = lookup(&tb->summary, entity, "target", pt, "target_distinct");
            cosv = lookup(&tb->summary, entity, "target", pt, "cosine");
            jacv = lookup(&tb->summary, entity, "target", pt, "jaccard");
            if (!distinct)
                distinct = lookup(&tb->summary, entity, "base", pt, "base_distinct");
            if (!words)
                words = lookup(&tb->summary, entity, "target", pt, "target_words");
            if (!words)
                words = lookup(&tb->summary, entity, "base", pt, "base_words");
        }
        if (tb->has_changes)
            neww = lookup(&tb->changes, entity, "target", pt, "new_word_share");
        st = tt_table_cstr(&w, pt);
        if (!st) st = tt_table_u64(&w, docs);
        if (!st) st = tt_table_cstr(&w, words ? words : "");
        if (!st) st = tt_table_cstr(&w, distinct ? distinct : "");
        if (!st) st = tt_table_cstr(&w, cosv ? cosv : "");
        if (!st) st = tt_table_cstr(&w, jacv ? jacv : "");
        if (!st) st = tt_table_cstr(&w, neww ? neww : "");
        for (size_t k = 0; k < ncat && !st; k++) {
            const char *v = lookup(&tb->tone, entity, "period", pt, cats[k]);
            st = tt_table_cstr(&w, v ? v : "");
        }
        if (ncat && !st) {
            const char *v = lookup(&tb->tone, entity, "period", pt, "net_tone");
            st = tt_table_cstr(&w, v ? v : "");
        }
        if (tb->hits_ran && !st) {
            uint64_t hits = 0;
            for (size_t r = 0; r < tb->rules.n; r++)
                hits += count_of(tb, entity, pt, tb->rules.v[r], NULL);
            st = tt_table_u64(&w, hits);
        }
        if (!st) st = tt_table_end_row(&w);
    }
    tt_tsv t;
    tt_tsv_init(&t);
    if (!st)
        st = tt_tsv_parse(text.data, text.len, "overview", &t, &p->err);
    tt_buf_release(&text);
    if (st) {
        p->failed = 1;
        return;
    }
    /* short headers: the categories without their _per_1000 (the note says so) */
    static const char *const fixed_labels[] = { "period", "documents", "words",
                                                "distinct terms", "cosine prev.",
                                                "Jaccard prev.", "new-sentence words" };
    char catlabel[16][64];
    tt_report_column rc[32];
    for (size_t i = 0; i < nc; i++) {
        rc[i].name = cols[i];
        rc[i].label = i < 7 ? fixed_labels[i] : NULL;
        rc[i].flags = 0;
        if (i >= 7 && i < 7 + ncat) {
            size_t l = strlen(cols[i]) - 9;
            snprintf(catlabel[i - 7], sizeof catlabel[i - 7], "%.*s", (int)(l < 60 ? l : 60),
                     cols[i]);
            rc[i].label = catlabel[i - 7];
        } else if (!strcmp(cols[i], "net_tone")) {
            rc[i].label = "net tone";
        } else if (!strcmp(cols[i], "watch_hits")) {
            rc[i].label = "watch-list hits";
        }
    }
    pg_table(p, &t, "overview", rc, nc, NULL, t.nrows, "Each period at a glance");
    tt_tsv_release(&t);
}

/* The rows of one pair in a table with entity, base and target columns. */
static size_t pair_rows(const tt_tsv *t, const char *entity, const char *base, const char *target,
                        size_t *rows)
{
    long ce = tt_tsv_column(t, "entity"), cb = tt_tsv_column(t, "base"),
         ct = tt_tsv_column(t, "target");
    size_t n = 0;
    for (size_t r = 0; r < t->nrows; r++)
        if (row_is(t, r, ce, entity, cb, base, ct, target))
            rows[n++] = r;
    return n;
}

/* Runs chart or cloud for one picture; returns whether it was drawn. */
static int draw(report_ctx *c, tt_cmd_fn fn, const char *cmd, const char *kind, const char *from,
                const char *entity, const char *pair, const char *extra[], const char *name,
                char *out, size_t outsize)
{
    strv a = { 0 };
    int ok = table_path(c, name, out, outsize) && args_begin(&a, cmd);
    if (ok && kind) ok = strv_push(&a, kind, 0);
    if (ok) ok = strv_push(&a, "--from", 0) && strv_push(&a, from, 0);
    if (ok && entity) ok = strv_push(&a, "--entity", 0) && strv_push(&a, entity, 0);
    if (ok && pair) ok = strv_push(&a, "--pair", 0) && strv_push(&a, pair, 0);
    for (size_t i = 0; ok && extra && extra[i]; i++)
        ok = strv_push(&a, extra[i], 0);
    if (ok && c->text) ok = strv_push(&a, "--text", 0);
    if (ok) ok = strv_push(&a, "-o", 0) && strv_push(&a, out, 0);
    int drawn = ok && run(c, fn, &a, out);
    strv_release(&a);
    return drawn;
}

typedef struct report_opts {
    uint64_t top, cloud_words, heat_terms, min_count, hits, sentences;
    const char *rules, *lexicon, *title;
    int no_tone, no_changes;
} report_opts;

static const tt_report_column mover_cols[] = {
    { "term", NULL, 0 },          { "base_count", NULL, 0 }, { "target_count", NULL, 0 },
    { "base_rate", NULL, 0 },     { "target_rate", NULL, 0 }, { "log_ratio", NULL, 0 },
    { "g2", "signed_g2", 0 },     { "q_value", NULL, 0 },    { "direction", NULL, 0 },
};

static const tt_report_column modified_cols[] = {
    { "section", NULL, 0 },                 { "similarity", NULL, 0 },
    { "target_offset", NULL, 0 },           { "text", NULL, TT_REPORT_WRAP },
    { "words_added", NULL, TT_REPORT_WRAP }, { "words_removed", NULL, TT_REPORT_WRAP },
};
static const tt_report_column added_cols[] = {
    { "section", NULL, 0 }, { "target_offset", NULL, 0 }, { "text", NULL, TT_REPORT_WRAP },
};
static const tt_report_column removed_cols[] = {
    { "section", NULL, 0 }, { "base_offset", NULL, 0 }, { "text", NULL, TT_REPORT_WRAP },
};

/* One pair of consecutive periods (or the two sides). */
static void pair_part(page *p, tables *tb, const report_opts *o, const char *entity,
                      const char *base, const char *target, unsigned k)
{
    report_ctx *c = p->c;
    char head[400], pair[300], name[64], out[TT_META_PATH_MAX];
    snprintf(head, sizeof head, "%s \xE2\x86\x92 %s", base, target);
    snprintf(pair, sizeof pair, "%s,%s", base, target);
    pg_heading(p, 2, head);
    size_t *rows = NULL;
    size_t cap = tb->has_movers ? tb->movers.nrows : 0;
    if (tb->has_sentences && tb->sentences.nrows > cap) cap = tb->sentences.nrows;
    if (tb->has_summary && tb->summary.nrows > cap) cap = tb->summary.nrows;
    rows = tt_reallocarray(NULL, cap + 1, sizeof *rows);
    if (!rows) {
        p->failed = 1;
        return;
    }
    if (tb->has_summary && pair_rows(&tb->summary, entity, base, target, rows)) {
        const tt_tsv *t = &tb->summary;
        size_t r = rows[0];
        pg_para(p, 0,
                "Counted words %s \xE2\x86\x92 %s; distinct terms %s \xE2\x86\x92 %s; %s terms new and "
                "%s gone. Cosine similarity %s, Jaccard %s. Of %s terms tested, %s changed "
                "significantly (Benjamini-Hochberg q at most 0.05).",
                cellc(t, r, tt_tsv_column(t, "base_words")),
                cellc(t, r, tt_tsv_column(t, "target_words")),
                cellc(t, r, tt_tsv_column(t, "base_distinct")),
                cellc(t, r, tt_tsv_column(t, "target_distinct")),
                cellc(t, r, tt_tsv_column(t, "new_terms")),
                cellc(t, r, tt_tsv_column(t, "gone_terms")), cellc(t, r, tt_tsv_column(t, "cosine")),
                cellc(t, r, tt_tsv_column(t, "jaccard")), cellc(t, r, tt_tsv_column(t, "tested")),
                cellc(t, r, tt_tsv_column(t, "significant")));
    }
    if (tb->has_movers) {
        size_t n = pair_rows(&tb->movers, entity, base, target, rows);
        long cd = tt_tsv_column(&tb->movers, "direction");
        /* the table runs from the strongest rise to the strongest fall: take
           the first rises and the last falls, strongest first */
        size_t *sel = tt_reallocarray(NULL, 2 * o->top + 1, sizeof *sel);
        size_t ns = 0, nr = 0, nf = 0;
        for (size_t i = 0; sel && i < n && nr < o->top; i++)
            if (!strcmp(cellc(&tb->movers, rows[i], cd), "rise"))
                sel[ns++] = rows[i], nr++;
        for (size_t i = n; sel && i-- > 0 && nf < o->top;)
            if (!strcmp(cellc(&tb->movers, rows[i], cd), "fall"))
                sel[ns++] = rows[i], nf++;
        if (sel && ns) {
            char cap_[200];
            snprintf(cap_, sizeof cap_, "Top movers by signed G\xC2\xB2: %zu rises, then %zu falls",
                     nr, nf);
            pg_table(p, &tb->movers, tb->movers_path, mover_cols,
                     sizeof mover_cols / sizeof *mover_cols, sel, ns, cap_);
        } else if (sel) {
            pg_para(p, 1, "No term was counted often enough (at least %llu times on the two "
                          "sides together) to be tested.",
                    (unsigned long long)o->min_count);
        }
        tt_free(sel);
        const char *mfile = movers_file(tb, entity);
        if (n && mfile && !p->failed) {
            char top[32];
            snprintf(top, sizeof top, "%llu", (unsigned long long)o->top);
            const char *extra[] = { "--top", top, NULL };
            snprintf(name, sizeof name, "bars-%u.svg", k);
            int ok = draw(c, tt_cmd_chart, "chart", "bars", mfile, entity, pair, extra, name, out,
                          sizeof out);
            pg_figure(p, out, ok,
                      "Bars: Log Ratio (binary log of the ratio of rates); filled bars are "
                      "significant (q at most 0.05).");
            if (o->cloud_words) {
                char cw[32];
                snprintf(cw, sizeof cw, "%llu", (unsigned long long)o->cloud_words);
                const char *cextra[] = { "--top", cw, "--shrink", "--height", "520", NULL };
                snprintf(name, sizeof name, "cloud-%u.svg", k);
                ok = draw(c, tt_cmd_cloud, "cloud", NULL, mfile, entity, pair, cextra, name, out,
                          sizeof out);
                pg_figure(p, out, ok,
                          "Change cloud of the strongest movers: size follows the Log Ratio; "
                          "blue rose, orange fell.");
            }
        }
    }
    if (tb->has_changes && pair_rows(&tb->changes, entity, base, target, rows)) {
        const tt_tsv *t = &tb->changes;
        size_t r = rows[0];
        pg_heading(p, 3, "Sentences");
        pg_para(p, 0,
                "%s sentences \xE2\x86\x92 %s: %s unchanged, %s reworded, %s added, %s removed; "
                "%s of the later text's words are new. Edit similarity of the two sequences of "
                "sentences: %s.",
                cellc(t, r, tt_tsv_column(t, "base_sentences")),
                cellc(t, r, tt_tsv_column(t, "target_sentences")),
                cellc(t, r, tt_tsv_column(t, "unchanged")), cellc(t, r, tt_tsv_column(t, "modified")),
                cellc(t, r, tt_tsv_column(t, "added")), cellc(t, r, tt_tsv_column(t, "removed")),
                cellc(t, r, tt_tsv_column(t, "new_word_share")),
                cellc(t, r, tt_tsv_column(t, "edit_similarity")));
        if (tb->has_sentences) {
            size_t n = pair_rows(&tb->sentences, entity, base, target, rows);
            long ck = tt_tsv_column(&tb->sentences, "change");
            static const char *const kinds[] = { "added", "modified", "removed" };
            static const char *const titles[] = { "Added", "Reworded", "Removed" };
            size_t *sel = tt_reallocarray(NULL, n + 1, sizeof *sel);
            for (size_t kk = 0; sel && kk < 3; kk++) {
                size_t ns = 0;
                uint64_t all = count_of(tb, entity, base, target, kinds[kk]);
                for (size_t i = 0; i < n; i++)
                    if (!strcmp(cellc(&tb->sentences, rows[i], ck), kinds[kk]) &&
                        ns < o->sentences)
                        sel[ns++] = rows[i];
                if (!ns)
                    continue;
                char cap_[200];
                snprintf(cap_, sizeof cap_, "%s: %zu of %llu, by section, in document order",
                         titles[kk], ns, (unsigned long long)all);
                if (kk == 2)
                    pg_table(p, &tb->sentences, "sentences", removed_cols, 3, sel, ns, cap_);
                else if (kk == 1)
                    pg_table(p, &tb->sentences, "sentences", modified_cols, 6, sel, ns, cap_);
                else
                    pg_table(p, &tb->sentences, "sentences", added_cols, 3, sel, ns, cap_);
            }
            tt_free(sel);
        }
    }
    tt_free(rows);
}

/* The watch-list part of an entity: hits per rule and period (from the
 * counts), then the listed hits in context. */
static void hits_part(page *p, tables *tb, const char *entity,
                      char (*pnames)[TT_PERIOD_TEXT_MAX], size_t np)
{
    const tt_tsv *t = &tb->hits;
    pg_heading(p, 2, "Watch-list hits");
    if (tb->hits_comments.len) {
        /* the provenance line naming the watch-list and its SHA-256 */
        const char *s = tb->hits_comments.data;
        const char *e = memchr(s, '\n', tb->hits_comments.len);
        size_t l = e ? (size_t)(e - s) : tb->hits_comments.len;
        char line[1024];
        if (l > 2 && l < sizeof line) {
            memcpy(line, s + 2, l - 2);
            line[l - 2] = '\0';
            pg_para(p, 1, "%s", line);
        }
    }
    /* rule x period counts, for the rules that hit this entity */
    size_t npc = np < 64 ? np : 64;
    const char *cols[68];
    const char (*names)[TT_PERIOD_TEXT_MAX] = (const char (*)[TT_PERIOD_TEXT_MAX])pnames;
    size_t nc = 0;
    cols[nc++] = "rule";
    for (size_t i = 0; i < npc; i++)
        cols[nc++] = names[i];
    cols[nc++] = "total";
    tt_buf text;
    tt_buf_init(&text, 0);
    tt_table_writer w;
    tt_status st = tt_table_begin(&w, TT_FORMAT_TSV, &text, cols, nc, 1);
    uint64_t all = 0;
    size_t nrules = 0;
    for (size_t ru = 0; ru < tb->rules.n && !st; ru++) {
        uint64_t total = 0;
        for (size_t i = 0; i < np; i++)
            total += count_of(tb, entity, names[i], tb->rules.v[ru], NULL);
        if (!total)
            continue;
        nrules++;
        all += total;
        st = tt_table_cstr(&w, tb->rules.v[ru]);
        for (size_t i = 0; i < npc && !st; i++)
            st = tt_table_u64(&w, count_of(tb, entity, names[i], tb->rules.v[ru], NULL));
        if (!st) st = tt_table_u64(&w, total);
        if (!st) st = tt_table_end_row(&w);
    }
    if (!st && !nrules) {
        pg_para(p, 0, "No rule of the watch-list hit in these documents.");
        tt_buf_release(&text);
        return;
    }
    tt_tsv ct;
    tt_tsv_init(&ct);
    if (!st) st = tt_tsv_parse(text.data, text.len, "hits by period", &ct, &p->err);
    if (!st) {
        tt_report_column rc[70];
        for (size_t i = 0; i < nc; i++) {
            rc[i].name = cols[i];
            rc[i].label = NULL;
            rc[i].flags = 0;
        }
        pg_table(p, &ct, "hits by period", rc, nc, NULL, ct.nrows,
                 np > npc ? "Hits per rule and period (the first 64 periods)"
                          : "Hits per rule and period");
    } else {
        p->failed = 1;
    }
    tt_tsv_release(&ct);
    tt_buf_release(&text);
    if (!tb->has_hits)
        return;
    long ce = tt_tsv_column(t, "entity"), cp = tt_tsv_column(t, "period");
    size_t *rows = tt_reallocarray(NULL, t->nrows + 1, sizeof *rows);
    if (!rows) {
        p->failed = 1;
        return;
    }
    size_t n = 0;
    for (size_t r = 0; r < t->nrows; r++)
        if (ce < 0 || !strcmp(cellc(t, r, ce), entity))
            rows[n++] = r;
    static const tt_report_column hit_cols[] = {
        { "period", NULL, 0 },    { "rule", NULL, 0 },
        { "before", "", TT_REPORT_RIGHT }, { "match", "hit", TT_REPORT_MARK },
        { "after", "", TT_REPORT_WRAP }, { "document", NULL, 0 }, { "line", NULL, 0 },
    };
    char cap_[200];
    snprintf(cap_, sizeof cap_, "Hits in context: %zu of %llu, in document order", n,
             (unsigned long long)all);
    if (n)
        pg_table(p, t, "hits", cp >= 0 ? hit_cols : hit_cols + 1, cp >= 0 ? 7 : 6, rows, n, cap_);
    tt_free(rows);
}

/* ---- running the commands ------------------------------------------------ */

/* Which side or series document a hit's document belongs to. */
typedef int (*doc_meta_fn)(void *ctx, const char *document, const char **entity, char *period);

/* path names document, or a part of it ("path#1:10-Q", a wrapper's part). */
static int same_doc(const char *path, const char *document)
{
    size_t l = strlen(path);
    return !strncmp(document, path, l) && (document[l] == '\0' || document[l] == '#');
}

static int series_meta(void *ctx, const char *document, const char **entity, char *period)
{
    const series *s = ctx;
    for (size_t i = 0; i < s->ndocs; i++) {
        const tt_doc_meta *d = &s->m.docs[s->docs[i]];
        if (same_doc(d->path, document)) {
            *entity = d->entity;
            tt_period_format(&d->period, period, TT_PERIOD_TEXT_MAX);
            return 1;
        }
    }
    return 0;
}

typedef struct sides {
    strv base, target;
} sides;

static int sides_meta(void *ctx, const char *document, const char **entity, char *period)
{
    const sides *sd = ctx;
    *entity = "";
    for (int k = 0; k < 2; k++) {
        const strv *v = k ? &sd->target : &sd->base;
        for (size_t i = 1; i < v->n; i += 2) {
            size_t l = strlen(v->v[i]);
            while (l > 1 && v->v[i][l - 1] == '/')
                l--;
            if (!strncmp(document, v->v[i], l) &&
                (document[l] == '\0' || document[l] == '/' || document[l] == '#')) {
                snprintf(period, TT_PERIOD_TEXT_MAX, "%s", k ? "target" : "base");
                return 1;
            }
        }
    }
    return 0;
}

/* ---- reading the large tables as streams ------------------------------- */

/* Calls fn(ctx, line, len, is_header) for every line of a table file
 * (without its newline); lines starting "# " (search's provenance) go to
 * comments when given. Returns 0 when the file cannot be read or fn
 * returns 0 (a problem fn printed). */
static int each_line(const char *path, tt_buf *comments,
                     int (*fn)(void *ctx, const char *line, size_t len, int header), void *ctx)
{
    FILE *f = fopen(path, "rb");
    if (!f) {
        cli_error("%s: cannot read: %s", path, strerror(errno));
        return 0;
    }
    char *line = NULL;
    size_t cap = 0;
    ssize_t got;
    int header = 1, ok = 1;
    while (ok && (got = getline(&line, &cap, f)) >= 0) {
        size_t len = (size_t)got;
        while (len && (line[len - 1] == '\n' || line[len - 1] == '\r'))
            len--;
        if (len >= 2 && line[0] == '#' && line[1] == ' ') {
            if (comments && (tt_buf_append(comments, line, len) || tt_buf_putc(comments, '\n')))
                ok = 0;
            continue;
        }
        ok = fn(ctx, line, len, header);
        header = 0;
    }
    if (ferror(f)) {
        cli_error("%s: read error", path);
        ok = 0;
    }
    free(line);
    fclose(f);
    return ok;
}

/* Field k (0-based) of a tab-separated line, as written (TSV-escaped). */
static const char *field(const char *line, size_t len, size_t k, size_t *flen)
{
    size_t i = 0;
    for (size_t f = 0; f < k; f++) {
        const char *t = memchr(line + i, '\t', len - i);
        if (!t) {
            *flen = 0;
            return "";
        }
        i = (size_t)(t - line) + 1;
    }
    const char *t = memchr(line + i, '\t', len - i);
    *flen = t ? (size_t)(t - (line + i)) : len - i;
    return line + i;
}

/* The index of a column in a header line, or -1. */
static long header_index(const char *line, size_t len, const char *name)
{
    size_t nl = strlen(name), fl;
    for (size_t k = 0; k < TT_LIMIT_TABLE_COLUMNS; k++) {
        const char *f = field(line, len, k, &fl);
        if (fl == nl && !memcmp(f, name, nl))
            return (long)k;
        if (f + fl >= line + len)
            break;
    }
    return -1;
}

/* A field unescaped as tt_table_str escapes TSV cells, into out (NUL-ended). */
static void unescape(const char *f, size_t n, char *out, size_t size)
{
    size_t o = 0;
    for (size_t i = 0; i < n && o + 1 < size; i++) {
        char c = f[i];
        if (c == '\\' && i + 1 < n) {
            char e = f[++i];
            c = e == 't' ? '\t' : e == 'n' ? '\n' : e == 'r' ? '\r' : e;
        }
        out[o++] = c;
    }
    out[o] = '\0';
}

/* Adds 1 to the count under a key of tab-joined parts; returns the count
 * before. */
static uint64_t bump(tables *tb, const char *key, size_t len)
{
    uint64_t before = tt_termtable_get(tb->counts, key, len);
    return tt_termtable_add(tb->counts, key, len, 1) ? UINT64_MAX : before;
}

typedef struct hits_stream {
    tables *tb;
    doc_meta_fn meta;
    void *meta_ctx;
    uint64_t limit;       /* hits listed per entity */
    long cdoc, crule;
    tt_buf text;          /* header and the listed rows, entity and period in front */
    size_t rows;
    FILE *all;            /* hits.tsv: every hit with its entity and period */
    int failed;
} hits_stream;

static int hits_line(void *vctx, const char *line, size_t len, int header)
{
    hits_stream *h = vctx;
    tables *tb = h->tb;
    tt_status st = TT_OK;
    if (header) {
        h->cdoc = header_index(line, len, "document");
        h->crule = header_index(line, len, "rule");
        if (h->cdoc < 0 || h->crule < 0) {
            cli_error("the search table has no document or rule column");
            return 0;
        }
        st = tt_buf_puts(&h->text, "entity\tperiod\t");
        if (!st) st = tt_buf_append(&h->text, line, len);
        if (!st) st = tt_buf_putc(&h->text, '\n');
        if (h->all)
            fprintf(h->all, "entity\tperiod\t%.*s\n", (int)len, line);
        return !st;
    }
    size_t dl, rl;
    const char *d = field(line, len, (size_t)h->cdoc, &dl);
    const char *r = field(line, len, (size_t)h->crule, &rl);
    char doc[TT_META_PATH_MAX + 64], rule[512];
    unescape(d, dl, doc, sizeof doc);
    unescape(r, rl, rule, sizeof rule);
    const char *entity = "";
    char period[TT_PERIOD_TEXT_MAX] = "";
    if (!h->meta(h->meta_ctx, doc, &entity, period))
        return 1;
    if (!strv_has(&tb->rules, rule) && !strv_push(&tb->rules, rule, 1))
        return 0;
    char key[1200];
    int k = snprintf(key, sizeof key, "%s\t%s\t%s", entity, period, rule);
    if (k < 0 || (size_t)k >= sizeof key || bump(tb, key, (size_t)k) == UINT64_MAX)
        return 0;
    /* listed per entity: the first `limit` hits */
    k = snprintf(key, sizeof key, "\x01%s", entity);
    uint64_t listed = k > 0 && (size_t)k < sizeof key ? bump(tb, key, (size_t)k) : UINT64_MAX;
    if (listed == UINT64_MAX)
        return 0;
    char esc_entity[600];
    tt_buf eb;
    tt_buf_init(&eb, 0);
    tt_table_writer w;
    static const char *const ecols[] = { "entity", "period" };
    st = tt_table_begin(&w, TT_FORMAT_TSV, &eb, ecols, 2, 0);
    if (!st) st = tt_table_cstr(&w, entity);
    if (!st) st = tt_table_cstr(&w, period);
    snprintf(esc_entity, sizeof esc_entity, "%.*s", (int)eb.len, eb.data);
    tt_buf_release(&eb);
    if (st)
        return 0;
    if (h->all)
        fprintf(h->all, "%s\t%.*s\n", esc_entity, (int)len, line);
    if (listed < h->limit) {
        st = tt_buf_puts(&h->text, esc_entity);
        if (!st) st = tt_buf_putc(&h->text, '\t');
        if (!st) st = tt_buf_append(&h->text, line, len);
        if (!st) st = tt_buf_putc(&h->text, '\n');
        h->rows++;
    }
    return !st;
}

/* Reads search's table (raw_path): counts every hit by entity, period and
 * rule, keeps the first `limit` hits of each entity for the page, and writes
 * all hits with their entity and period to path. Returns 1 when the
 * watch-list hit, 0 when it did not, -1 on a problem (printed). */
static int hits_with_meta(const char *raw_path, const char *path, doc_meta_fn fn, void *ctx,
                          uint64_t limit, tables *tb)
{
    hits_stream h;
    memset(&h, 0, sizeof h);
    h.tb = tb;
    h.meta = fn;
    h.meta_ctx = ctx;
    h.limit = limit;
    tt_buf_init(&h.text, 0);
    h.all = fopen(path, "wb");
    int ok = h.all && each_line(raw_path, &tb->hits_comments, hits_line, &h);
    if (h.all && fclose(h.all))
        ok = 0;
    tt_error err;
    tt_error_init(&err);
    if (ok && h.rows && tt_tsv_parse(h.text.data, h.text.len, path, &tb->hits, &err))
        ok = 0;
    if (!ok)
        cli_error("%s: cannot write the hits with their periods", path);
    tt_buf_release(&h.text);
    if (!ok)
        return -1;
    tb->has_hits = h.rows > 0;
    return tb->rules.n > 0;
}

typedef struct sentence_stream {
    tables *tb;
    uint64_t limit;       /* sentences listed per pair and kind of change */
    long ce, cb, ct, ck;
    tt_buf text;
    size_t rows;
} sentence_stream;

static int sentence_line(void *vctx, const char *line, size_t len, int header)
{
    sentence_stream *ss = vctx;
    tt_status st = TT_OK;
    if (header) {
        ss->ce = header_index(line, len, "entity");
        ss->cb = header_index(line, len, "base");
        ss->ct = header_index(line, len, "target");
        ss->ck = header_index(line, len, "change");
        if (ss->ce < 0 || ss->cb < 0 || ss->ct < 0 || ss->ck < 0) {
            cli_error("the sentences table lacks a column");
            return 0;
        }
    } else {
        size_t el, bl, tl, kl;
        const char *e = field(line, len, (size_t)ss->ce, &el);
        const char *b = field(line, len, (size_t)ss->cb, &bl);
        const char *t = field(line, len, (size_t)ss->ct, &tl);
        const char *k = field(line, len, (size_t)ss->ck, &kl);
        if (kl == 9 && !memcmp(k, "unchanged", 9))
            return 1;
        char key[1200], pe[400], pb[TT_PERIOD_TEXT_MAX * 4], pt[TT_PERIOD_TEXT_MAX * 4], pk[32];
        unescape(e, el, pe, sizeof pe);
        unescape(b, bl, pb, sizeof pb);
        unescape(t, tl, pt, sizeof pt);
        unescape(k, kl, pk, sizeof pk);
        int n = snprintf(key, sizeof key, "%s\t%s\t%s\t%s", pe, pb, pt, pk);
        if (n < 0 || (size_t)n >= sizeof key)
            return 1;
        uint64_t before = bump(ss->tb, key, (size_t)n);
        if (before == UINT64_MAX)
            return 0;
        if (before >= ss->limit)
            return 1;
        ss->rows++;
    }
    st = tt_buf_append(&ss->text, line, len);
    if (!st) st = tt_buf_putc(&ss->text, '\n');
    return !st;
}

/* Reads the sentences table: counts the rows of each pair and kind of
 * change, keeps the first `limit` of each for the page (unchanged ones are
 * never listed). */
static int read_sentences(const char *path, uint64_t limit, tables *tb)
{
    sentence_stream ss;
    memset(&ss, 0, sizeof ss);
    ss.tb = tb;
    ss.limit = limit;
    tt_buf_init(&ss.text, 0);
    int ok = each_line(path, NULL, sentence_line, &ss);
    tt_error err;
    tt_error_init(&err);
    if (ok && ss.rows && !tt_tsv_parse(ss.text.data, ss.text.len, path, &tb->sentences, &err))
        tb->has_sentences = 1;
    tt_buf_release(&ss.text);
    return ok;
}

typedef struct mover_stream {
    report_ctx *c;
    tables *tb;
    uint64_t top;
    long ce, cb, ct, cd;
    tt_buf header;
    tt_buf text;          /* header and the rows the page lists */
    size_t rows;
    tt_buf pair;          /* the current pair's lines, each ending in '\n' */
    char pair_key[1200];
    FILE *f;              /* the current entity's movers file */
    char entity[600];
    int failed;
} mover_stream;

/* The page's rows of the pair held: its first `top` rises and last `top`
 * falls (the table runs from the strongest rise to the strongest fall). */
static int flush_pair(mover_stream *m)
{
    const char *p = m->pair.data, *end = m->pair.data + m->pair.len;
    size_t nrise = 0, nfall = 0;
    for (const char *q = p; q < end;) {
        const char *nl = memchr(q, '\n', (size_t)(end - q));
        size_t dl;
        const char *d = field(q, (size_t)(nl - q), (size_t)m->cd, &dl);
        if (dl == 4 && !memcmp(d, "fall", 4))
            nfall++;
        q = nl + 1;
    }
    size_t seen_fall = 0;
    tt_status st = TT_OK;
    for (const char *q = p; q < end && !st;) {
        const char *nl = memchr(q, '\n', (size_t)(end - q));
        size_t dl;
        const char *d = field(q, (size_t)(nl - q), (size_t)m->cd, &dl);
        int rise = dl == 4 && !memcmp(d, "rise", 4), fall = dl == 4 && !memcmp(d, "fall", 4);
        int keep = (rise && nrise < m->top) || (fall && seen_fall + m->top >= nfall);
        nrise += rise;
        seen_fall += fall;
        if (keep) {
            st = tt_buf_append(&m->text, q, (size_t)(nl - q) + 1);
            m->rows++;
        }
        q = nl + 1;
    }
    tt_buf_reset(&m->pair);
    return !st;
}

static int mover_line(void *vctx, const char *line, size_t len, int header)
{
    mover_stream *m = vctx;
    if (header) {
        m->ce = header_index(line, len, "entity");
        m->cb = header_index(line, len, "base");
        m->ct = header_index(line, len, "target");
        m->cd = header_index(line, len, "direction");
        if (m->ce < 0 || m->cb < 0 || m->ct < 0 || m->cd < 0) {
            cli_error("the movers table lacks a column");
            return 0;
        }
        return !tt_buf_append(&m->header, line, len) && !tt_buf_putc(&m->header, '\n') &&
               !tt_buf_append(&m->text, m->header.data, m->header.len);
    }
    size_t el, bl, tl;
    const char *e = field(line, len, (size_t)m->ce, &el);
    const char *b = field(line, len, (size_t)m->cb, &bl);
    const char *t = field(line, len, (size_t)m->ct, &tl);
    char key[1200];
    snprintf(key, sizeof key, "%.*s\t%.*s\t%.*s", (int)el, e, (int)bl, b, (int)tl, t);
    if (strcmp(key, m->pair_key)) {
        if (!flush_pair(m))
            return 0;
        snprintf(m->pair_key, sizeof m->pair_key, "%s", key);
    }
    char entity[600];
    unescape(e, el, entity, sizeof entity);
    if (!m->f || strcmp(entity, m->entity)) {
        /* the next entity's own file, for its pictures */
        if (m->f && fclose(m->f))
            return 0;
        m->f = NULL;
        char name[64], path[TT_META_PATH_MAX];
        snprintf(name, sizeof name, "movers-%zu.tsv", m->tb->mover_entities.n + 1);
        int known = strv_has(&m->tb->mover_entities, entity);
        if (!table_path(m->c, name, path, sizeof path) ||
            (!known && (!strv_push(&m->tb->mover_entities, entity, 1) ||
                        !strv_push(&m->tb->mover_files, path, 1))))
            return 0;
        if (known) {
            for (size_t i = 0; i < m->tb->mover_entities.n; i++)
                if (!strcmp(m->tb->mover_entities.v[i], entity))
                    snprintf(path, sizeof path, "%s", m->tb->mover_files.v[i]);
            m->f = fopen(path, "ab");
        } else {
            m->f = fopen(path, "wb");
            if (m->f)
                fwrite(m->header.data, 1, m->header.len, m->f);
        }
        if (!m->f) {
            cli_error("%s: cannot write: %s", path, strerror(errno));
            return 0;
        }
        snprintf(m->entity, sizeof m->entity, "%s", entity);
    }
    fprintf(m->f, "%.*s\n", (int)len, line);
    return !tt_buf_append(&m->pair, line, len) && !tt_buf_putc(&m->pair, '\n');
}

/* Reads compare's movers table: each entity's rows into its own file (the
 * pictures read those), and each pair's top rises and falls for the page. */
static int read_movers(report_ctx *c, const char *path, uint64_t top, tables *tb)
{
    mover_stream m;
    memset(&m, 0, sizeof m);
    m.c = c;
    m.tb = tb;
    m.top = top;
    tt_buf_init(&m.header, 0);
    tt_buf_init(&m.text, 0);
    tt_buf_init(&m.pair, 0);
    int ok = each_line(path, NULL, mover_line, &m) && flush_pair(&m);
    if (m.f && fclose(m.f))
        ok = 0;
    tt_error err;
    tt_error_init(&err);
    if (ok && m.rows && !tt_tsv_parse(m.text.data, m.text.len, path, &tb->movers, &err))
        tb->has_movers = 1;
    tt_buf_release(&m.header);
    tt_buf_release(&m.text);
    tt_buf_release(&m.pair);
    return ok;
}

/* tone-lines.tsv: the tone table reshaped for a line chart (entity, term =
 * the category, period, rate = per 1,000 words). */
static int tone_lines(report_ctx *c, tables *tb)
{
    const char *cats[16];
    size_t ncat = tone_categories(&tb->tone, cats, 16);
    long ce = tt_tsv_column(&tb->tone, "entity"), cp = tt_tsv_column(&tb->tone, "period");
    if (!ncat || cp < 0)
        return 0;
    static const char *const cols[] = { "entity", "term", "period", "rate" };
    tt_buf text;
    tt_buf_init(&text, 0);
    tt_table_writer w;
    tt_status st = tt_table_begin(&w, TT_FORMAT_TSV, &text, cols, 4, 1);
    for (size_t k = 0; k < ncat && !st; k++) {
        long cv = tt_tsv_column(&tb->tone, cats[k]);
        size_t l = strlen(cats[k]) - 9;
        for (size_t r = 0; r < tb->tone.nrows && !st; r++) {
            st = tt_table_cstr(&w, cellc(&tb->tone, r, ce));
            if (!st) st = tt_table_str(&w, cats[k], l);
            if (!st) st = tt_table_cstr(&w, cellc(&tb->tone, r, cp));
            if (!st) st = tt_table_cstr(&w, cellc(&tb->tone, r, cv));
            if (!st) st = tt_table_end_row(&w);
        }
    }
    int ok = !st && table_path(c, "tone-lines.tsv", tb->tone_lines_path, sizeof tb->tone_lines_path);
    FILE *f = ok ? fopen(tb->tone_lines_path, "wb") : NULL;
    ok = f && fwrite(text.data, 1, text.len, f) == text.len;
    if (f && fclose(f)) ok = 0;
    tt_buf_release(&text);
    return ok;
}

/* Runs one table-writing command; *has says whether its table was read. */
static int table_run(report_ctx *c, tt_cmd_fn fn, strv *a, const char *name, char *path,
                     size_t size, tt_tsv *t, int *has)
{
    *has = 0;
    if (!table_path(c, name, path, size))
        return 0;
    if (!run(c, fn, a, path))
        return 0;
    *has = read_table(path, t, NULL) == 1;
    return 1;
}

static void tables_release(tables *tb)
{
    tt_tsv_release(&tb->summary);
    tt_tsv_release(&tb->movers);
    tt_tsv_release(&tb->trend);
    tt_tsv_release(&tb->tone);
    tt_tsv_release(&tb->changes);
    tt_tsv_release(&tb->sentences);
    tt_tsv_release(&tb->hits);
    tt_buf_release(&tb->hits_comments);
    strv_release(&tb->mover_entities);
    strv_release(&tb->mover_files);
    strv_release(&tb->rules);
    tt_termtable_free(tb->counts);
    tb->counts = NULL;
}

static void u64s(char *out, size_t size, uint64_t v)
{
    snprintf(out, size, "%llu", (unsigned long long)v);
}

/* The commands of a series (sides NULL) or of two sides. Returns 0 when a
 * table the page cannot do without (the comparison) failed. */
static int run_tables(report_ctx *c, const report_opts *o, tables *tb, const strv *paths,
                      doc_meta_fn meta_fn, void *meta_ctx, sides *sd)
{
    strv a = { 0 };
    char path[TT_META_PATH_MAX];
    char topn[32], mc[32], ht[32];
    uint64_t ct = o->top > o->cloud_words ? o->top : o->cloud_words;
    u64s(topn, sizeof topn, ct);
    u64s(mc, sizeof mc, o->min_count);
    u64s(ht, sizeof ht, o->heat_terms);
    int ok = 1;
    /* search first, so that a watch-list with a problem stops the run before
       anything else is read; the documents themselves, then each hit joined to its period */
    if (o->rules && paths->n) {
        char raw[TT_META_PATH_MAX];
        if (args_begin(&a, "search") && strv_push(&a, "--rules", 0) &&
            strv_push(&a, o->rules, 0) && strv_push(&a, "-f", 0) && strv_push(&a, "tsv", 0) &&
            strv_push(&a, "--context", 0) && strv_push(&a, "8", 0) && args_add(&a, &c->common) &&
            args_add(&a, &c->common_search) &&
            table_path(c, "hits-raw.tsv", raw, sizeof raw) && args_end(c, &a, raw, 0) &&
            strv_push(&a, "--", 0) && args_add(&a, paths) && run(c, tt_cmd_search, &a, raw) &&
            table_path(c, "hits.tsv", path, sizeof path)) {
            int got = hits_with_meta(raw, path, meta_fn, meta_ctx, o->hits, tb);
            tb->has_hits = got == 1;
            tb->hits_ran = got >= 0;
        }
        if (!tb->hits_ran) {
            cli_error("%s: the watch-list could not be run (see above)", o->rules);
            strv_release(&a);
            return 0;
        }
    }
    /* compare: the summary, then the movers */
    for (int k = 0; k < 2 && ok; k++) {
        ok = args_begin(&a, "compare") && args_add(&a, sd ? &sd->base : &c->meta);
        if (ok && !sd) ok = strv_push(&a, "--consecutive", 0);
        if (ok && sd) ok = args_add(&a, &sd->target);
        if (ok && k == 0) ok = strv_push(&a, "--show", 0) && strv_push(&a, "summary", 0);
        if (ok && k == 1)
            ok = strv_push(&a, "--top", 0) && strv_push(&a, topn, 0) &&
                 strv_push(&a, "--min-count", 0) && strv_push(&a, mc, 0);
        if (ok) ok = args_add(&a, &c->reading);
        if (!ok) break;
        char *out = k ? tb->movers_path : path;
        ok = table_path(c, k ? "movers.tsv" : "summary.tsv", out, TT_META_PATH_MAX) &&
             args_end(c, &a, out, !sd);
        if (ok && k == 0)
            ok = table_run(c, tt_cmd_compare, &a, "summary.tsv", out, TT_META_PATH_MAX,
                           &tb->summary, &tb->has_summary);
        else if (ok)
            ok = run(c, tt_cmd_compare, &a, out) && read_movers(c, out, o->top, tb);
        if (ok && !k && !tb->has_summary && sd) {
            cli_error("%s: the comparison wrote no row", out);
            ok = 0;
        }
    }
    if (!ok) {
        strv_release(&a);
        return 0;
    }
    /* trend: the leading movers from the first period to the last */
    if (!sd && o->heat_terms) {
        if (args_begin(&a, "trend") && args_add(&a, &c->meta) &&
            strv_push(&a, "--top-movers", 0) && strv_push(&a, ht, 0) &&
            strv_push(&a, "--min-count", 0) && strv_push(&a, mc, 0) && args_add(&a, &c->reading) &&
            table_path(c, "trend.tsv", tb->trend_path, sizeof tb->trend_path) &&
            args_end(c, &a, tb->trend_path, 1))
            table_run(c, tt_cmd_trend, &a, "trend.tsv", tb->trend_path, sizeof tb->trend_path,
                      &tb->trend, &tb->has_trend);
    }
    /* tone: per period of a series; per side, the total of its documents */
    if (!o->no_tone) {
        if (!sd) {
            if (args_begin(&a, "tone") && args_add(&a, &c->meta) &&
                (!o->lexicon ||
                 (strv_push(&a, "--lexicon", 0) && strv_push(&a, o->lexicon, 0))) &&
                args_add(&a, &c->reading) && table_path(c, "tone.tsv", path, sizeof path) &&
                args_end(c, &a, path, 1))
                table_run(c, tt_cmd_tone, &a, "tone.tsv", path, sizeof path, &tb->tone,
                          &tb->has_tone);
        } else {
            tt_buf text;
            tt_buf_init(&text, 0);
            int good = 1;
            for (int k = 0; k < 2 && good; k++) {
                tt_tsv t;
                tt_tsv_init(&t);
                int has = 0;
                const char *name = k ? "tone-target.tsv" : "tone-base.tsv";
                good = args_begin(&a, "tone") && strv_push(&a, "--total", 0) &&
                       (!o->lexicon ||
                        (strv_push(&a, "--lexicon", 0) && strv_push(&a, o->lexicon, 0))) &&
                       args_add(&a, &c->reading) && table_path(c, name, path, sizeof path) &&
                       args_end(c, &a, path, 0) && strv_push(&a, "--", 0);
                /* the side's paths (the option words stripped) */
                const strv *side = k ? &sd->target : &sd->base;
                for (size_t i = 1; good && i < side->n; i += 2)
                    good = strv_push(&a, side->v[i], 0);
                good = good && table_run(c, tt_cmd_tone, &a, name, path, sizeof path, &t, &has);
                long cd = good ? tt_tsv_column(&t, "document") : -1;
                size_t total = t.nrows;
                for (size_t r = 0; good && r < t.nrows; r++)
                    if (!strcmp(cellc(&t, r, cd), "*"))
                        total = r;
                good = good && cd >= 0 && total < t.nrows;
                if (good && k == 0) {
                    tt_buf_puts(&text, "entity\tperiod");
                    for (size_t j = 0; j < t.ncols; j++)
                        if ((long)j != cd)
                            tt_buf_printf(&text, "\t%s", t.cells[j]);
                    tt_buf_putc(&text, '\n');
                }
                if (good) {
                    tt_buf_puts(&text, k ? "\ttarget" : "\tbase");
                    for (size_t j = 0; j < t.ncols; j++)
                        if ((long)j != cd)
                            tt_buf_printf(&text, "\t%s", tt_tsv_cell(&t, total, j));
                    tt_buf_putc(&text, '\n');
                }
                tt_tsv_release(&t);
            }
            tt_error err;
            tt_error_init(&err);
            if (good && !tt_tsv_parse(text.data, text.len, "tone", &tb->tone, &err))
                tb->has_tone = 1;
            tt_buf_release(&text);
        }
        if (tb->has_tone)
            tb->has_tone_lines = !sd && tone_lines(c, tb);
    }
    /* changes: the counts, then the sentences */
    for (int k = 0; k < 2 && !o->no_changes; k++) {
        const char *name = k ? "sentences.tsv" : "changes.tsv";
        if (!(args_begin(&a, "changes") && args_add(&a, sd ? &sd->base : &c->meta) &&
              (sd ? args_add(&a, &sd->target) : strv_push(&a, "--consecutive", 0)) &&
              (!k || (strv_push(&a, "--show", 0) && strv_push(&a, "sentences", 0))) &&
              args_add(&a, &c->common) && table_path(c, name, path, sizeof path) &&
              args_end(c, &a, path, !sd)))
            break;
        if (k ? !(run(c, tt_cmd_changes, &a, path) && read_sentences(path, o->sentences, tb))
              : !table_run(c, tt_cmd_changes, &a, name, path, sizeof path, &tb->changes,
                           &tb->has_changes))
            break;
    }
    strv_release(&a);
    return 1;
}

/* ---- chapters ------------------------------------------------------------ */

/* One row per entity, for a report of several: how much each rewrote
 * (the largest share of new-sentence words between consecutive periods, and
 * the lowest cosine similarity), its watch-list hits; most rewritten first. */
typedef struct entity_row {
    const char *entity;
    size_t docs, periods;
    char first[TT_PERIOD_TEXT_MAX], last[TT_PERIOD_TEXT_MAX];
    double max_new, min_cos;
    char new_at[48], cos_at[48];
    uint64_t hits;
} entity_row;

static int by_rewrite(const void *pa, const void *pb)
{
    const entity_row *a = pa, *b = pb;
    double x = isnan(a->max_new) ? -1 : a->max_new, y = isnan(b->max_new) ? -1 : b->max_new;
    if (x != y)
        return x > y ? -1 : 1;
    return strcmp(a->entity, b->entity);
}

static void entities_table(page *p, tables *tb, const series *s)
{
    size_t n = s->entities.n;
    entity_row *rows = tt_calloc(n + 1, sizeof *rows);
    if (!rows) {
        p->failed = 1;
        return;
    }
    for (size_t i = 0; i < n; i++) {
        entity_row *r = &rows[i];
        r->entity = s->entities.v[i];
        r->max_new = r->min_cos = NAN;
        tt_period per[512];
        r->periods = entity_periods(s, r->entity, per, 512);
        if (r->periods) {
            tt_period_format(&per[0], r->first, sizeof r->first);
            tt_period_format(&per[r->periods - 1], r->last, sizeof r->last);
        }
        for (size_t d = 0; d < s->ndocs; d++)
            r->docs += !strcmp(s->m.docs[s->docs[d]].entity, r->entity);
        for (size_t k = 0; k < r->periods; k++) {
            char pt[TT_PERIOD_TEXT_MAX];
            tt_period_format(&per[k], pt, sizeof pt);
            for (size_t ru = 0; ru < tb->rules.n; ru++)
                r->hits += count_of(tb, r->entity, pt, tb->rules.v[ru], NULL);
        }
        const tt_tsv *sets[2] = { tb->has_summary ? &tb->summary : NULL,
                                  tb->has_changes ? &tb->changes : NULL };
        for (int k = 0; k < 2; k++) {
            const tt_tsv *t = sets[k];
            if (!t)
                continue;
            long ce = tt_tsv_column(t, "entity"), cb = tt_tsv_column(t, "base"),
                 ct = tt_tsv_column(t, "target"),
                 cv = tt_tsv_column(t, k ? "new_word_share" : "cosine");
            for (size_t q = 0; cv >= 0 && q < t->nrows; q++) {
                double v;
                if (strcmp(cellc(t, q, ce), r->entity) || !tt_tsv_number(t, q, (size_t)cv, &v) ||
                    isnan(v))
                    continue;
                double *best = k ? &r->max_new : &r->min_cos;
                if (isnan(*best) || (k ? v > *best : v < *best)) {
                    *best = v;
                    snprintf(k ? r->new_at : r->cos_at, sizeof r->new_at, "%s \xE2\x86\x92 %s",
                             cellc(t, q, cb), cellc(t, q, ct));
                }
            }
        }
    }
    qsort(rows, n, sizeof *rows, by_rewrite);
    static const char *const cols[] = { "entity", "documents", "periods", "first", "last",
                                        "most_new", "at", "lowest_cosine", "where",
                                        "watch_hits" };
    size_t nc = tb->hits_ran ? 10 : 9;
    tt_buf text;
    tt_buf_init(&text, 0);
    tt_table_writer w;
    tt_status st = tt_table_begin(&w, TT_FORMAT_TSV, &text, cols, nc, 1);
    for (size_t i = 0; i < n && !st; i++) {
        const entity_row *r = &rows[i];
        st = tt_table_cstr(&w, r->entity);
        if (!st) st = tt_table_u64(&w, r->docs);
        if (!st) st = tt_table_u64(&w, r->periods);
        if (!st) st = tt_table_cstr(&w, r->first);
        if (!st) st = tt_table_cstr(&w, r->last);
        if (!st) st = isnan(r->max_new) ? tt_table_cstr(&w, "") : tt_table_fixed(&w, r->max_new, 4);
        if (!st) st = tt_table_cstr(&w, r->new_at);
        if (!st) st = isnan(r->min_cos) ? tt_table_cstr(&w, "") : tt_table_fixed(&w, r->min_cos, 4);
        if (!st) st = tt_table_cstr(&w, r->cos_at);
        if (!st && nc == 10) st = tt_table_u64(&w, r->hits);
        if (!st) st = tt_table_end_row(&w);
    }
    tt_tsv t;
    tt_tsv_init(&t);
    if (!st) st = tt_tsv_parse(text.data, text.len, "entities", &t, &p->err);
    if (!st) {
        static const tt_report_column rc[] = {
            { "entity", NULL, 0 },        { "documents", NULL, 0 },
            { "periods", NULL, 0 },       { "first", NULL, 0 },
            { "last", NULL, 0 },          { "most_new", "most new-sentence words", 0 },
            { "at", "between", 0 },       { "lowest_cosine", "lowest cosine prev.", 0 },
            { "where", "between", 0 },    { "watch_hits", "watch-list hits", 0 },
        };
        pg_heading(p, 1, "Entities at a glance");
        pg_table(p, &t, "entities", rc, nc, NULL, t.nrows,
                 "Most rewritten first: the largest share of a period's words in sentences added "
                 "or reworded since the period before");
    } else {
        p->failed = 1;
    }
    tt_tsv_release(&t);
    tt_buf_release(&text);
    tt_free(rows);
}

/* One entity's chapter of a series. */
static void entity_chapter(page *p, tables *tb, const report_opts *o, const series *s,
                           const char *entity, unsigned *pairno)
{
    report_ctx *c = p->c;
    tt_period per[512];
    size_t np = entity_periods(s, entity, per, 512);
    char (*names)[TT_PERIOD_TEXT_MAX] = tt_reallocarray(NULL, np + 1, sizeof *names);
    uint64_t *ndocs = tt_calloc(np + 1, sizeof *ndocs);
    if (!names || !ndocs) {
        tt_free(names);
        tt_free(ndocs);
        p->failed = 1;
        return;
    }
    for (size_t i = 0; i < np; i++) {
        tt_period_format(&per[i], names[i], TT_PERIOD_TEXT_MAX);
        for (size_t d = 0; d < s->ndocs; d++) {
            const tt_doc_meta *m = &s->m.docs[s->docs[d]];
            if (!strcmp(m->entity, entity) && !tt_period_compare(&m->period, &per[i]))
                ndocs[i]++;
        }
    }
    pg_heading(p, 1, entity);
    pg_para(p, 0, "%zu period%s, %s to %s.", np, np == 1 ? "" : "s", np ? names[0] : "",
            np ? names[np - 1] : "");
    pg_heading(p, 2, "Overview by period");
    overview(p, tb, entity, names, ndocs, np);
    pg_para(p, 1,
            "words: terms counted after stop-words and filters; cosine prev. and Jaccard prev.: "
            "similarity of the period's term counts (cosine) and term sets (Jaccard) to the "
            "period before; new-sentence words: the share of the period's words in sentences "
            "added or reworded since the period before; tone categories: lexicon words per "
            "1,000 words; net tone: (positive - negative) / (positive + negative).");
    char out[TT_META_PATH_MAX], name[64];
    unsigned id = ++*pairno;
    if (tb->has_tone_lines && np >= 2) {
        pg_heading(p, 2, "Tone across periods");
        const char *extra[] = { "--unit", "per 1,000 words", "--title", "Tone across periods",
                                "--top", "8", NULL };
        snprintf(name, sizeof name, "tone-%u.svg", id);
        int ok = draw(c, tt_cmd_chart, "chart", "lines", tb->tone_lines_path, entity, NULL, extra,
                      name, out, sizeof out);
        pg_figure(p, out, ok, "Each tone category's words per 1,000 words, period by period.");
    }
    if (tb->has_trend && o->heat_terms && np >= 2) {
        long ce = tt_tsv_column(&tb->trend, "entity");
        int any = 0;
        for (size_t r = 0; r < tb->trend.nrows && !any; r++)
            any = !strcmp(cellc(&tb->trend, r, ce), entity);
        if (any) {
            pg_heading(p, 2, "Leading terms by period");
            char ht[32];
            u64s(ht, sizeof ht, o->heat_terms);
            const char *extra[] = { "--top", ht, NULL };
            snprintf(name, sizeof name, "heatmap-%u.svg", id);
            int ok = draw(c, tt_cmd_chart, "chart", "heatmap", tb->trend_path, entity, NULL,
                          extra, name, out, sizeof out);
            pg_figure(p, out, ok,
                      "The terms that moved most (largest |signed G\xC2\xB2|) from the first "
                      "period to the last, rate per 10,000 words in every period.");
        }
    }
    if (tb->hits_ran)
        hits_part(p, tb, entity, names, np);
    size_t npairs = 0;
    if (tb->has_summary) {
        const tt_tsv *t = &tb->summary;
        long ce = tt_tsv_column(t, "entity"), cb = tt_tsv_column(t, "base"),
             ct = tt_tsv_column(t, "target");
        for (size_t r = 0; r < t->nrows && !p->failed; r++) {
            if (strcmp(cellc(t, r, ce), entity))
                continue;
            npairs++;
            pair_part(p, tb, o, entity, cellc(t, r, cb), cellc(t, r, ct), ++*pairno);
        }
    }
    if (!npairs)
        pg_para(p, 1, "Only one period: there is nothing to compare it with.");
    tt_free(names);
    tt_free(ndocs);
}

/* The two sides' chapter. */
static void sides_chapter(page *p, tables *tb, const report_opts *o, const sides *sd)
{
    char names[2][TT_PERIOD_TEXT_MAX] = { "base", "target" };
    uint64_t ndocs[2] = { (uint64_t)sd->base.n / 2, (uint64_t)sd->target.n / 2 };
    pg_heading(p, 1, "Base and target");
    pg_para(p, 0, "base: %zu path%s given; target: %zu path%s given (a folder counts once).",
            sd->base.n / 2, sd->base.n / 2 == 1 ? "" : "s", sd->target.n / 2,
            sd->target.n / 2 == 1 ? "" : "s");
    pg_heading(p, 2, "Overview");
    overview(p, tb, "", names, ndocs, 2);
    pg_para(p, 1,
            "documents: paths given for the side; words: terms counted after stop-words and "
            "filters; tone columns: lexicon words per 1,000 words.");
    if (tb->hits_ran)
        hits_part(p, tb, "", names, 2);
    unsigned k = 1;
    pair_part(p, tb, o, "", "base", "target", k);
}

static void about_chapter(page *p, const report_ctx *c, const report_opts *o, const char *reading)
{
    pg_heading(p, 1, "About these figures");
    pg_para(p, 0,
            "Change between two periods is tested term by term on the 2 x 2 contingency table of "
            "the term's count and the other words' count on each side: signed G\xC2\xB2 is the "
            "log-likelihood ratio statistic (Dunning 1993), positive for a rise; Log Ratio is "
            "the binary logarithm of the ratio of the two rates (Hardie 2014), a count of 0 "
            "taken as 0.5; p-values come from the chi-squared distribution "
            "with one degree of freedom, and q-values adjust them for the number of terms "
            "tested (Benjamini & Hochberg 1995). Only terms counted at least %llu times on "
            "the two sides together are tested.",
            (unsigned long long)o->min_count);
    pg_para(p, 0,
            "Tone counts the words of each category of the lexicon per 1,000 words; a positive "
            "word preceded within three words of its sentence by a negator counts as negative. "
            "Sentences are aligned "
            "by their exact text first, then by the Jaccard similarity of their word sets "
            "(0.5 or more: reworded).");
    pg_para(p, 0, "Reading options: %s.", reading[0] ? reading : "the defaults");
    if (c->keep)
        pg_para(p, 0, "The tables and pictures behind this page are in %s.", c->dir);
    pg_para(p, 0,
            "A change in wording is not a change in the business: read the documents before "
            "drawing a conclusion.");
}

/* ---- the command ---------------------------------------------------------- */

/* The long name of a pipeline option, for passing it on. */
static const char *option_name(int opt)
{
    for (const struct option *lo = longopts; lo->name; lo++)
        if (lo->val == opt)
            return lo->name;
    return NULL;
}

static int parse_count(const char *opt, const char *arg, uint64_t max, uint64_t *out)
{
    return cli_parse_u64(opt, arg, 0, max, out);
}

static void remove_tables(report_ctx *c)
{
    char path[TT_META_PATH_MAX + 64];
    if (c->keep)
        return;
    for (size_t i = 0; i < c->files.n; i++)
        if (path_in(c, c->files.v[i], path, sizeof path))
            (void)unlink(path);
    (void)rmdir(c->dir);
}

int tt_cmd_report(int argc, char **argv)
{
    report_ctx c;
    memset(&c, 0, sizeof c);
    report_opts o;
    memset(&o, 0, sizeof o);
    o.top = 10;
    o.cloud_words = 80;
    o.heat_terms = 20;
    o.min_count = 5;
    o.hits = 100;
    o.sentences = 12;
    const char *manifest = NULL, *layout = NULL, *output = NULL, *keep = NULL, *entity = NULL,
               *kinds = NULL, *header_period = NULL, *jobs = NULL;
    int headers = 0, quiet = 0, opt, rc = TT_EXIT_TROUBLE, dir_made = 0;
    double started = cli_now();
    sides sd;
    memset(&sd, 0, sizeof sd);
    series s;
    memset(&s, 0, sizeof s);
    tt_manifest_init(&s.m);
    strv paths = { 0 }, reading_text = { 0 };
    tables tb;
    memset(&tb, 0, sizeof tb);
    tt_tsv_init(&tb.summary);
    tt_tsv_init(&tb.movers);
    tt_tsv_init(&tb.trend);
    tt_tsv_init(&tb.tone);
    tt_tsv_init(&tb.changes);
    tt_tsv_init(&tb.sentences);
    tt_tsv_init(&tb.hits);
    tt_buf_init(&tb.hits_comments, 0);
    tb.counts = tt_termtable_new();
    page pg;
    memset(&pg, 0, sizeof pg);
    tt_report_init(&pg.rep);
    tt_error_init(&pg.err);
    pg.c = &c;
    tt_buf html;
    tt_buf_init(&html, TT_LIMIT_REPORT_BYTES);
    tt_outfile out;
    memset(&out, 0, sizeof out);
    tt_error err;
    tt_error_init(&err);
    if (!tb.counts)
        goto oom;

    optind = 1;
    while ((opt = getopt_long(argc, argv, "o:j:qh", longopts, NULL)) != -1) {
        switch (opt) {
        case OPT_MANIFEST: manifest = optarg; break;
        case OPT_LAYOUT: layout = optarg; break;
        case OPT_HEADERS: headers = 1; break;
        case OPT_HEADER_PERIOD: header_period = optarg; break;
        case OPT_ENTITY: entity = optarg; break;
        case OPT_KINDS: kinds = optarg; break;
        case OPT_BASE:
            if (!strv_push(&sd.base, "--base", 0) || !strv_push(&sd.base, optarg, 0))
                goto oom;
            break;
        case OPT_TARGET:
            if (!strv_push(&sd.target, "--target", 0) || !strv_push(&sd.target, optarg, 0))
                goto oom;
            break;
        case OPT_RULES: o.rules = optarg; break;
        case OPT_LEXICON: o.lexicon = optarg; break;
        case OPT_NO_TONE: o.no_tone = 1; break;
        case OPT_NO_CHANGES: o.no_changes = 1; break;
        case OPT_TOP:
            if (!cli_parse_u64("--top", optarg, 1, 200, &o.top)) goto out;
            break;
        case OPT_CLOUD_WORDS:
            if (!parse_count("--cloud-words", optarg, 1000, &o.cloud_words)) goto out;
            break;
        case OPT_HEATMAP_TERMS:
            if (!parse_count("--heatmap-terms", optarg, 200, &o.heat_terms)) goto out;
            break;
        case OPT_MIN_COUNT:
            if (!cli_parse_u64("--min-count", optarg, 1, UINT32_MAX, &o.min_count)) goto out;
            break;
        case OPT_HITS:
            if (!parse_count("--hits", optarg, TT_LIMIT_REPORT_ROWS, &o.hits)) goto out;
            break;
        case OPT_SENTENCES:
            if (!parse_count("--sentences", optarg, TT_LIMIT_REPORT_ROWS, &o.sentences)) goto out;
            break;
        case OPT_TITLE: o.title = optarg; break;
        case OPT_KEEP: keep = optarg; break;
        case OPT_TEXT: c.text = 1; break;
        case 'o': output = optarg; break;
        case 'q': quiet = 1; break;
        case 'j': jobs = optarg; break;
        case 'h': fputs(tt_help_report, stdout); rc = TT_EXIT_OK; goto out;
        case CLI_OPT_DB:
            cli_error("report reads the documents themselves (changes and search need their "
                      "text): --db is not taken");
            goto out;
        case CLI_OPT_NGRAM: case CLI_OPT_STEM: case CLI_OPT_NUMBERS: case CLI_OPT_MIN_LENGTH:
        case CLI_OPT_STOPWORDS: case CLI_OPT_NO_STOPWORDS: case CLI_OPT_TABLES:
        case CLI_OPT_DOC_TYPES: case CLI_OPT_SECTION: case CLI_OPT_SECTION_RULES: {
            char name[64];
            snprintf(name, sizeof name, "--%s", option_name(opt));
            int common = opt == CLI_OPT_TABLES || opt == CLI_OPT_DOC_TYPES ||
                         opt == CLI_OPT_SECTION || opt == CLI_OPT_SECTION_RULES;
            int arg = opt != CLI_OPT_STEM && opt != CLI_OPT_NUMBERS && opt != CLI_OPT_NO_STOPWORDS;
            if (!strv_push(&c.reading, name, 1) || (arg && !strv_push(&c.reading, optarg, 0)))
                goto oom;
            if (common && (!strv_push(&c.common, name, 1) || !strv_push(&c.common, optarg, 0)))
                goto oom;
            if (!strv_push(&reading_text, name, 1) || (arg && !strv_push(&reading_text, optarg, 0)))
                goto oom;
            break;
        }
        default: fprintf(stderr, "Try 'termtide help report'.\n"); goto out;
        }
    }
    if (jobs) {
        uint64_t j;
        if (!cli_parse_u64("--jobs", jobs, 1, 256, &j)) goto out;
        if (!strv_push(&c.reading, "-j", 0) || !strv_push(&c.reading, jobs, 0) ||
            !strv_push(&c.common_search, "-j", 0) || !strv_push(&c.common_search, jobs, 0))
            goto oom;
    }
    int modes = (manifest != NULL) + (layout != NULL) + headers + (sd.base.n || sd.target.n);
    if (modes != 1) {
        cli_error(modes ? "choose one of --manifest, --layout, --headers and --base/--target"
                        : "report needs documents: --manifest FILE, --layout PATTERN ROOT..., "
                          "--headers ROOT... or --base PATH --target PATH");
        goto out;
    }
    if ((sd.base.n != 0) != (sd.target.n != 0)) {
        cli_error("--base and --target go together");
        goto out;
    }
    if (sd.base.n && (entity || kinds)) {
        cli_error("--entity and --kinds choose among a series' documents; with --base and "
                  "--target, give the documents themselves");
        goto out;
    }
    if ((manifest || sd.base.n) && optind < argc) {
        cli_error("unexpected argument '%s' (paths come with --base/--target or the manifest)",
                  argv[optind]);
        goto out;
    }
    if ((layout || headers) && optind >= argc) {
        cli_error("%s needs the ROOT folders to read", layout ? "--layout" : "--headers");
        goto out;
    }
    if (o.rules && access(o.rules, R_OK) != 0) {
        cli_error("%s: cannot read the watch-list: %s", o.rules, strerror(errno));
        goto out;
    }

    /* the series' documents, as compare will see them */
    if (!sd.base.n) {
        int ok;
        if (manifest) {
            ok = cli_load_manifest(&s.m, manifest);
        } else if (layout) {
            ok = cli_load_layout(&s.m, layout, argc - optind, argv + optind);
        } else {
            tt_period_granularity g = TT_PERIOD_QUARTER;
            size_t skipped = 0;
            ok = (!header_period || cli_header_period(header_period, &g)) &&
                 cli_load_headers(&s.m, g, argc - optind, argv + optind, &skipped);
        }
        if (!ok)
            goto out;
        s.docs = tt_calloc(s.m.n + 1, sizeof *s.docs);
        if (!s.docs)
            goto oom;
        for (size_t i = 0; i < s.m.n; i++) {
            const tt_doc_meta *d = &s.m.docs[i];
            if ((entity && strcmp(d->entity, entity)) || !kind_listed(kinds, d->kind))
                continue;
            s.docs[s.ndocs++] = i;
            if (!strv_has(&s.entities, d->entity) && !strv_push(&s.entities, d->entity, 0))
                goto oom;
            if (!strv_push(&paths, d->path, 0))
                goto oom;
        }
        if (!s.ndocs) {
            cli_error("no documents%s%s%s%s", entity ? " of entity " : "", entity ? entity : "",
                      kinds ? " of kinds " : "", kinds ? kinds : "");
            goto out;
        }
        if (manifest && (!strv_push(&c.meta, "--manifest", 0) || !strv_push(&c.meta, manifest, 0)))
            goto oom;
        if (layout && (!strv_push(&c.meta, "--layout", 0) || !strv_push(&c.meta, layout, 0)))
            goto oom;
        if (headers && !strv_push(&c.meta, "--headers", 0))
            goto oom;
        if (header_period &&
            (!strv_push(&c.meta, "--header-period", 0) || !strv_push(&c.meta, header_period, 0)))
            goto oom;
        if (entity && (!strv_push(&c.meta, "--entity", 0) || !strv_push(&c.meta, entity, 0)))
            goto oom;
        if (kinds && (!strv_push(&c.meta, "--kinds", 0) || !strv_push(&c.meta, kinds, 0)))
            goto oom;
        for (int i = optind; i < argc; i++)
            if (!strv_push(&c.roots, argv[i], 0))
                goto oom;
    } else {
        for (size_t i = 1; i < sd.base.n; i += 2)
            if (!strv_push(&paths, sd.base.v[i], 0)) goto oom;
        for (size_t i = 1; i < sd.target.n; i += 2)
            if (!strv_push(&paths, sd.target.v[i], 0)) goto oom;
    }

    /* where the tables go */
    if (keep) {
        if (mkdir(keep, 0777) != 0 && errno != EEXIST) {
            cli_error("%s: cannot create the folder: %s", keep, strerror(errno));
            goto out;
        }
        snprintf(c.dir, sizeof c.dir, "%s", keep);
        c.keep = 1;
    } else {
        const char *tmp = getenv("TMPDIR");
        snprintf(c.dir, sizeof c.dir, "%s/termtide-report-XXXXXX", tmp && tmp[0] ? tmp : "/tmp");
        if (!mkdtemp(c.dir)) {
            cli_error("%s: cannot create a temporary folder: %s", c.dir, strerror(errno));
            goto out;
        }
    }
    dir_made = 1;

    /* the commands */
    if (!run_tables(&c, &o, &tb, &paths, sd.base.n ? sides_meta : series_meta,
                    sd.base.n ? (void *)&sd : (void *)&s, sd.base.n ? &sd : NULL))
        goto out;

    /* the page */
    char title[512], subtitle[1024], reading[1024] = "", gen[64];
    size_t rl = 0;
    for (size_t i = 0; i < reading_text.n && rl + 2 < sizeof reading; i++)
        rl += (size_t)snprintf(reading + rl, sizeof reading - rl, "%s%s", i ? " " : "",
                               reading_text.v[i]);
    if (rl >= sizeof reading) reading[sizeof reading - 1] = '\0';
    snprintf(gen, sizeof gen, "termtide %s", TT_VERSION);
    unsigned pairno = 0;
    if (c.problems.n) {
        pg_heading(&pg, 1, "Problems met");
        pg_para(&pg, 0,
                "The commands behind this page reported these problems (a document named here "
                "was left out of every figure):");
        for (size_t i = 0; i < c.problems.n; i++)
            pg_para(&pg, 1, "%s", c.problems.v[i]);
    }
    if (sd.base.n) {
        snprintf(title, sizeof title, "%s", o.title ? o.title : "What changed between two sides");
        snprintf(subtitle, sizeof subtitle, "%zu path%s read.", paths.n, paths.n == 1 ? "" : "s");
        sides_chapter(&pg, &tb, &o, &sd);
    } else {
        if (o.title) {
            snprintf(title, sizeof title, "%s", o.title);
        } else {
            size_t tl = (size_t)snprintf(title, sizeof title, "Language across periods: ");
            for (size_t i = 0; i < s.entities.n && i < 3 && tl < sizeof title; i++)
                tl += (size_t)snprintf(title + tl, sizeof title - tl, "%s%s", i ? ", " : "",
                                       s.entities.v[i]);
            if (s.entities.n > 3 && tl < sizeof title)
                snprintf(title + tl, sizeof title - tl, " and %zu more", s.entities.n - 3);
        }
        snprintf(subtitle, sizeof subtitle, "%zu document%s of %zu entit%s%s%s; metadata from %s.",
                 s.ndocs, s.ndocs == 1 ? "" : "s", s.entities.n, s.entities.n == 1 ? "y" : "ies",
                 kinds ? "; kinds " : "", kinds ? kinds : "",
                 manifest ? manifest : layout ? "the folder layout" : "the submission headers");
        if (s.entities.n > 1)
            entities_table(&pg, &tb, &s);
        for (size_t i = 0; i < s.entities.n && !pg.failed; i++)
            entity_chapter(&pg, &tb, &o, &s, s.entities.v[i], &pairno);
    }
    about_chapter(&pg, &c, &o, reading);
    if (pg.failed || tt_report_write(&pg.rep, title, subtitle, gen, &html)) {
        cli_error("%s: the page could not be built (out of memory or past %zu MB)",
                  output ? output : "standard output", TT_LIMIT_REPORT_BYTES >> 20);
        goto out;
    }
    if (tt_outfile_open(&out, output, &err) || tt_outfile_write(&out, html.data, html.len, &err) ||
        tt_outfile_commit(&out, &err)) {
        cli_error("%s", err.message);
        tt_outfile_abort(&out);
        goto out;
    }
    if (!quiet)
        fprintf(stderr, "%s report: %zu document%s, %u picture%s, %.1f KB written to %s in %.2f s%s\n",
                tt_prog, paths.n, paths.n == 1 ? "" : "s", pg.rep.figures,
                pg.rep.figures == 1 ? "" : "s", (double)html.len / 1e3,
                output ? output : "standard output", cli_now() - started,
                c.trouble ? " (with trouble: see above)" : "");
    rc = c.trouble ? TT_EXIT_TROUBLE : TT_EXIT_OK;
    goto out;
oom:
    cli_error("out of memory");
out:
    if (dir_made)
        remove_tables(&c);
    tables_release(&tb);
    tt_report_release(&pg.rep);
    tt_buf_release(&html);
    tt_free(s.docs);
    tt_manifest_release(&s.m);
    strv_release(&s.entities);
    strv_release(&sd.base);
    strv_release(&sd.target);
    strv_release(&paths);
    strv_release(&reading_text);
    strv_release(&c.files);
    strv_release(&c.meta);
    strv_release(&c.roots);
    strv_release(&c.reading);
    strv_release(&c.common);
    strv_release(&c.common_search);
    strv_release(&c.seen);
    strv_release(&c.problems);
    return rc;
}
