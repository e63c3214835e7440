/* termtide search — where watched language appears: every hit of a
 * watch-list's rules with its place in the source file and its context, or
 * a document × rule table of counts. The library does the matching
 * (search.h); this file parses options and prints. */
#include <stdlib.h>
#include <string.h>
#include <unistd.h>

#include "termtide/limits.h"
#include "termtide/search.h"
#include "cli.h"

const char tt_help_search[] =
    "Usage: termtide search (-e PATTERN | --rules FILE) [OPTIONS] [PATH...]\n"
    "\n"
    "Finds watched language in documents. Patterns run over each block of extracted,\n"
    "whitespace-normalized text (a paragraph, heading, table cell or list item), so\n"
    "markup, line breaks, a word hyphenated at a line end and non-breaking spaces\n"
    "never split a phrase; a hit never spans two blocks.\n"
    "\n"
    "Rules:\n"
    "  -e, --pattern PATTERN a pattern (repeatable; rules e1, e2, ...)\n"
    "  --rules FILE          a watch-list: one rule a line, name<TAB>pattern[<TAB>note];\n"
    "                        blank lines and lines starting with # are skipped.\n"
    "                        Patterns are PCRE2 with UTF and Unicode properties. A\n"
    "                        pattern near(A, B, N) matches A and B in one sentence\n"
    "                        with at most N words between them. Every problem is\n"
    "                        reported with its line (and the error's byte offset in\n"
    "                        the pattern); nothing is searched until there is none.\n"
    "  --case                match case (default: case-insensitive)\n"
    "  --words               whole words only: a match may not touch a letter, digit\n"
    "                        or _ on either side\n"
    "\n"
    "Output (one row per hit, in document order, then text order):\n"
    "  document [entity period] rule kind offset line exact before match after\n"
    "  offset is the byte offset of the hit in the file (for a gzip file, in its\n"
    "  decompressed bytes; for a Windows-1252 or UTF-16 file, in its UTF-8\n"
    "  decoding), line its line (LF, CRLF or CR end a line); exact is 0 when the\n"
    "  hit's place could not be followed through HTML markup and offset is that of\n"
    "  its block. before and after are --context N words (default 8), cut at the\n"
    "  block's edges.\n"
    "  --counts              instead, hits per document and rule, with row and column\n"
    "                        totals and, per rule, the documents with a hit (JSON\n"
    "                        Lines: one \"count\" object per document and rule, then\n"
    "                        \"rule_total\" objects and a \"total\")\n"
    "  --context N           words of context on each side (0 to 200)\n"
    "  -f, --format text|tsv|csv|jsonl   text (aligned, match highlighted) is the\n"
    "                        default on a terminal, tsv otherwise; csv is\n"
    "                        formula-safe\n"
    "  -o, --output FILE     write atomically to FILE   --no-header\n"
    "  Lines starting with # are the run's provenance: the tool version, the\n"
    "  watch-list's SHA-256 and each input file's SHA-256, and any rule stopped by a\n"
    "  PCRE2 limit on a document. In JSON Lines every object has a \"record\" key:\n"
    "  run, input, stopped or hit.\n"
    "\n"
    "Documents:\n"
    "  --manifest FILE       read the manifest's documents and add entity and period\n"
    "  -j, --jobs N          worker threads; output is identical for any N\n"
    "  --tables keep|drop   --doc-types LIST   -q, --quiet   (as for count)\n"
    "\n"
    "Limits: each match attempt is bounded by PCRE2's match, depth and heap limits;\n"
    "a rule that reaches one is stopped for that document, reported, and the run\n"
    "goes on.\n"
    "\n"
    "Exit status: 0 some hit, 1 no hit, 2 trouble (a bad watch-list or option, an\n"
    "input skipped, a rule stopped by a limit, a write error).\n"
    "\n"
    "termtide measures language; it gives no investment, legal or compliance advice.\n";

enum { OPT_RULES = CLI_OPT_FIRST_FREE, OPT_CASE, OPT_WORDS, OPT_CONTEXT, OPT_COUNTS,
       OPT_NO_HEADER, OPT_MANIFEST };

static const struct option longopts[] = {
    { "pattern", required_argument, NULL, 'e' },
    { "rules", required_argument, NULL, OPT_RULES },
    { "case", no_argument, NULL, OPT_CASE },
    { "words", no_argument, NULL, OPT_WORDS },
    { "context", required_argument, NULL, OPT_CONTEXT },
    { "counts", no_argument, NULL, OPT_COUNTS },
    { "format", required_argument, NULL, 'f' },
    { "output", required_argument, NULL, 'o' },
    { "no-header", no_argument, NULL, OPT_NO_HEADER },
    { "manifest", required_argument, NULL, OPT_MANIFEST },
    { "jobs", required_argument, NULL, 'j' },
    { "tables", required_argument, NULL, CLI_OPT_TABLES },
    { "doc-types", required_argument, NULL, CLI_OPT_DOC_TYPES },
    { "quiet", no_argument, NULL, 'q' },
    { "help", no_argument, NULL, 'h' },
    { NULL, 0, NULL, 0 }
};

#define FORMAT_TEXT ((tt_format)99)

/* One document's counts, kept for --counts. */
typedef struct count_row {
    char *name;
    size_t meta; /* manifest row, or (size_t)-1 */
    uint64_t *counts;
} count_row;

typedef struct search_ctx {
    const tt_watchlist *wl;
    size_t nrules;
    tt_format format;
    int header, counts, highlight, quiet;
    const tt_manifest *m;
    const size_t *input_doc; /* input index -> manifest row */
    tt_outfile out;
    tt_buf buf, line;
    tt_error err;
    count_row *rows;
    size_t n_rows, cap_rows;
    size_t stops, skipped;
    char input_sha256[65]; /* of the input being delivered (text layout) */
} search_ctx;

static const char *hit_cols[] = { "document", "entity", "period", "rule", "kind", "offset",
                                  "line", "exact", "before", "match", "after" };
static const char *hit_cols_plain[] = { "document", "rule", "kind", "offset", "line",
                                        "exact", "before", "match", "after" };
/* JSON Lines: every object says what it is */
static const char *hit_cols_json[] = { "record", "document", "entity", "period", "rule", "kind",
                                       "offset", "line", "exact", "before", "match", "after" };
static const char *hit_cols_json_plain[] = { "record", "document", "rule", "kind", "offset",
                                             "line", "exact", "before", "match", "after" };

/* Appends s for a '#' provenance line: control characters become '?'. */
static tt_status put_clean(tt_buf *b, const char *s)
{
    tt_status st = TT_OK;
    for (; *s && !st; s++)
        st = tt_buf_putc(b, (unsigned char)*s < 0x20 ? '?' : *s);
    return st;
}

static tt_status flush(search_ctx *c, int force)
{
    return cli_flush(&c->out, &c->buf, &c->err, force);
}

static void meta_of(const search_ctx *c, size_t input, const char **entity, char *period,
                    size_t psize)
{
    *entity = "";
    period[0] = '\0';
    if (!c->m)
        return;
    const tt_doc_meta *d = &c->m->docs[c->input_doc[input]];
    *entity = d->entity;
    tt_period_format(&d->period, period, psize);
}

static tt_status on_input(void *vctx, size_t input, const char *path, const char *sha256)
{
    search_ctx *c = vctx;
    (void)input;
    tt_status st;
    if (c->format == FORMAT_TEXT && !c->counts) {
        /* the readable layout names it beside the document's hits */
        memcpy(c->input_sha256, sha256, 65);
        return TT_OK;
    }
    if (c->format == TT_FORMAT_JSONL) {
        static const char *cols[] = { "record", "path", "sha256" };
        tt_table_writer w;
        st = tt_table_begin(&w, TT_FORMAT_JSONL, &c->buf, cols, 3, 0);
        if (!st) st = tt_table_cstr(&w, "input");
        if (!st) st = tt_table_cstr(&w, path);
        if (!st) st = tt_table_cstr(&w, sha256[0] ? sha256 : "n/a (not read)");
        if (!st) st = tt_table_end_row(&w);
    } else {
        st = tt_buf_puts(&c->buf, "# input ");
        if (!st) st = put_clean(&c->buf, path);
        if (!st) st = tt_buf_printf(&c->buf, " sha256 %s\n",
                                    sha256[0] ? sha256 : "n/a (not read)");
    }
    return st ? st : flush(c, 0);
}

static tt_status write_stop(search_ctx *c, const tt_search_doc *d, const tt_search_stop *s)
{
    const tt_rule *r = tt_watchlist_rule(c->wl, s->rule);
    if (!c->quiet)
        cli_note("%s: rule '%s' stopped at block %zu by the PCRE2 %s; its count in this "
                 "document is a lower bound",
                 d->name, r->name, s->block + 1, tt_search_limit_name(s->limit));
    if (c->format == TT_FORMAT_JSONL) {
        static const char *cols[] = { "record", "document", "rule", "block", "limit" };
        tt_table_writer w;
        tt_status st = tt_table_begin(&w, TT_FORMAT_JSONL, &c->buf, cols, 5, 0);
        if (!st) st = tt_table_cstr(&w, "stopped");
        if (!st) st = tt_table_cstr(&w, d->name);
        if (!st) st = tt_table_cstr(&w, r->name);
        if (!st) st = tt_table_u64(&w, s->block + 1);
        if (!st) st = tt_table_cstr(&w, tt_search_limit_name(s->limit));
        if (!st) st = tt_table_end_row(&w);
        return st;
    }
    tt_status st = tt_buf_puts(&c->buf, "# stopped ");
    if (!st) st = put_clean(&c->buf, d->name);
    if (!st) st = tt_buf_puts(&c->buf, " rule ");
    if (!st) st = put_clean(&c->buf, r->name);
    if (!st) st = tt_buf_printf(&c->buf, " block %zu: %s\n", s->block + 1,
                                tt_search_limit_name(s->limit));
    return st;
}

/* Context text for the readable layout: control characters never reach the
 * terminal. */
static tt_status put_text(tt_buf *b, const char *s, size_t n)
{
    tt_status st = TT_OK;
    for (size_t i = 0; i < n && !st; i++)
        st = tt_buf_putc(b, (unsigned char)s[i] < 0x20 || s[i] == 0x7F ? ' ' : s[i]);
    return st;
}

static tt_status write_text_hits(search_ctx *c, const tt_search_doc *d)
{
    const tt_search_result *res = d->result;
    const char *entity;
    char period[64];
    meta_of(c, d->input, &entity, period, sizeof period);
    /* the place column is as wide as this document's widest */
    size_t width = 0, rwidth = 0;
    char place[64];
    for (size_t h = 0; h < res->n_hits; h++) {
        const tt_search_hit *hit = &res->hits[h];
        int n = snprintf(place, sizeof place, "%ld:%lld%s", hit->line, hit->offset,
                         hit->exact ? "" : "~");
        if ((size_t)n > width)
            width = (size_t)n;
        size_t rl = strlen(tt_watchlist_rule(c->wl, hit->rule)->name);
        if (rl > rwidth)
            rwidth = rl;
    }
    tt_status st = TT_OK;
    if (res->n_hits) {
        st = c->highlight ? tt_buf_puts(&c->buf, "\033[1m") : TT_OK;
        if (!st) st = put_clean(&c->buf, d->name);
        if (!st && entity[0]) {
            st = tt_buf_puts(&c->buf, "  (");
            if (!st) st = put_clean(&c->buf, entity);
            if (!st) st = tt_buf_printf(&c->buf, " %s)", period);
        }
        if (!st && c->input_sha256[0])
            st = tt_buf_printf(&c->buf, "  sha256 %s", c->input_sha256);
        if (!st && c->highlight) st = tt_buf_puts(&c->buf, "\033[0m");
        if (!st) st = tt_buf_putc(&c->buf, '\n');
    }
    for (size_t h = 0; h < res->n_hits && !st; h++) {
        const tt_search_hit *hit = &res->hits[h];
        const char *t = res->text.data + hit->text;
        int n = snprintf(place, sizeof place, "%ld:%lld%s", hit->line, hit->offset,
                         hit->exact ? "" : "~");
        st = tt_buf_printf(&c->buf, "  %s%*s  %-*s  ", place, (int)(width - (size_t)n), "",
                           (int)rwidth, tt_watchlist_rule(c->wl, hit->rule)->name);
        if (!st) st = put_text(&c->buf, t, hit->before_len);
        if (!st) st = tt_buf_puts(&c->buf, c->highlight ? "\033[7m" : "[[");
        if (!st) st = put_text(&c->buf, t + hit->before_len, hit->match_len);
        if (!st) st = tt_buf_puts(&c->buf, c->highlight ? "\033[0m" : "]]");
        if (!st) st = put_text(&c->buf, t + hit->before_len + hit->match_len, hit->after_len);
        if (!st) st = tt_buf_putc(&c->buf, '\n');
    }
    return st;
}

static tt_status write_hits(search_ctx *c, const tt_search_doc *d)
{
    if (c->format == FORMAT_TEXT)
        return write_text_hits(c, d);
    const tt_search_result *res = d->result;
    const char *entity;
    char period[64];
    meta_of(c, d->input, &entity, period, sizeof period);
    tt_status st = TT_OK;
    for (size_t h = 0; h < res->n_hits && !st; h++) {
        const tt_search_hit *hit = &res->hits[h];
        const char *t = res->text.data + hit->text;
        tt_table_writer w;
        int json = c->format == TT_FORMAT_JSONL;
        if (json)
            st = c->m ? tt_table_begin(&w, c->format, &c->buf, hit_cols_json, 12, 0)
                      : tt_table_begin(&w, c->format, &c->buf, hit_cols_json_plain, 10, 0);
        else
            st = c->m ? tt_table_begin(&w, c->format, &c->buf, hit_cols, 11, c->header)
                      : tt_table_begin(&w, c->format, &c->buf, hit_cols_plain, 9, c->header);
        c->header = 0;
        if (!st && json) st = tt_table_cstr(&w, "hit");
        if (!st) st = tt_table_cstr(&w, d->name);
        if (!st && c->m) st = tt_table_cstr(&w, entity);
        if (!st && c->m) st = tt_table_cstr(&w, period);
        if (!st) st = tt_table_cstr(&w, tt_watchlist_rule(c->wl, hit->rule)->name);
        if (!st) st = tt_table_cstr(&w, tt_block_kind_name(hit->block_kind));
        if (!st) st = tt_table_u64(&w, hit->offset >= 0 ? (uint64_t)hit->offset : 0);
        if (!st) st = tt_table_u64(&w, (uint64_t)hit->line);
        if (!st) st = tt_table_u64(&w, (uint64_t)hit->exact);
        if (!st) st = tt_table_str(&w, t, hit->before_len);
        if (!st) st = tt_table_str(&w, t + hit->before_len, hit->match_len);
        if (!st) st = tt_table_str(&w, t + hit->before_len + hit->match_len, hit->after_len);
        if (!st) st = tt_table_end_row(&w);
        if (!st) st = flush(c, 0);
    }
    return st;
}

static tt_status on_document(void *vctx, const tt_search_doc *d)
{
    search_ctx *c = vctx;
    const tt_search_result *res = d->result;
    tt_status st = TT_OK;
    for (size_t k = 0; k < res->n_stops && !st; k++)
        st = write_stop(c, d, &res->stops[k]);
    c->stops += res->n_stops;
    if (d->notes[0] && !c->quiet)
        cli_note("%s: %s", d->name, d->notes);
    if (!st && res->unlisted && !c->quiet)
        cli_note("%s: %llu hits counted but not listed (more than %d)", d->name,
                 (unsigned long long)res->unlisted, TT_LIMIT_SEARCH_HITS);
    if (st)
        return st;
    if (c->counts) {
        if (c->n_rows == c->cap_rows) {
            size_t cap = c->cap_rows ? c->cap_rows * 2 : 64;
            count_row *r = realloc(c->rows, cap * sizeof *r);
            if (!r)
                return TT_ENOMEM;
            c->rows = r;
            c->cap_rows = cap;
        }
        count_row *row = &c->rows[c->n_rows];
        row->name = strdup(d->name);
        row->meta = c->m ? c->input_doc[d->input] : (size_t)-1;
        row->counts = malloc((c->nrules ? c->nrules : 1) * sizeof *row->counts);
        if (!row->name || !row->counts) {
            free(row->name);
            free(row->counts);
            return TT_ENOMEM;
        }
        memcpy(row->counts, res->counts, c->nrules * sizeof *row->counts);
        c->n_rows++;
        return flush(c, 0);
    }
    st = write_hits(c, d);
    return st ? st : flush(c, 0);
}

static void on_problem(void *vctx, const tt_error *err, int skipped)
{
    search_ctx *c = vctx;
    char msg[TT_ERROR_FILE_MAX + TT_ERROR_MSG_MAX + 64];
    if (skipped) {
        cli_error("%s (skipped)", tt_error_format(err, msg, sizeof msg));
        c->skipped++;
    } else if (!c->quiet) {
        cli_note("%s", tt_error_format(err, msg, sizeof msg));
    }
}

/* JSON Lines counts in long form, so a rule's name never meets a fixed
 * key: one object per document and rule, then per rule and in all. */
static tt_status write_counts_jsonl(search_ctx *c, const uint64_t *total, const uint64_t *docs)
{
    static const char *cell_cols[] = { "record", "document", "entity", "period", "rule", "hits" };
    static const char *rule_cols[] = { "record", "rule", "hits", "documents_with_hits" };
    static const char *all_cols[] = { "record", "documents", "hits", "documents_with_hits" };
    tt_status st = TT_OK;
    for (size_t i = 0; i < c->n_rows && !st; i++) {
        const count_row *row = &c->rows[i];
        char period[64] = "";
        const char *entity = "";
        if (c->m) {
            const tt_doc_meta *d = &c->m->docs[row->meta];
            tt_period_format(&d->period, period, sizeof period);
            entity = d->entity;
        }
        for (size_t r = 0; r < c->nrules && !st; r++) {
            tt_table_writer w;
            st = tt_table_begin(&w, TT_FORMAT_JSONL, &c->buf, cell_cols, 6, 0);
            if (!st) st = tt_table_cstr(&w, "count");
            if (!st) st = tt_table_cstr(&w, row->name);
            if (!st) st = tt_table_cstr(&w, entity);
            if (!st) st = tt_table_cstr(&w, period);
            if (!st) st = tt_table_cstr(&w, tt_watchlist_rule(c->wl, r)->name);
            if (!st) st = tt_table_u64(&w, row->counts[r]);
            if (!st) st = tt_table_end_row(&w);
        }
        if (!st) st = flush(c, 0);
    }
    for (size_t r = 0; r < c->nrules && !st; r++) {
        tt_table_writer w;
        st = tt_table_begin(&w, TT_FORMAT_JSONL, &c->buf, rule_cols, 4, 0);
        if (!st) st = tt_table_cstr(&w, "rule_total");
        if (!st) st = tt_table_cstr(&w, tt_watchlist_rule(c->wl, r)->name);
        if (!st) st = tt_table_u64(&w, total[r]);
        if (!st) st = tt_table_u64(&w, docs[r]);
        if (!st) st = tt_table_end_row(&w);
    }
    tt_table_writer w;
    if (!st) st = tt_table_begin(&w, TT_FORMAT_JSONL, &c->buf, all_cols, 4, 0);
    if (!st) st = tt_table_cstr(&w, "total");
    if (!st) st = tt_table_u64(&w, c->n_rows);
    if (!st) st = tt_table_u64(&w, total[c->nrules]);
    if (!st) st = tt_table_u64(&w, docs[c->nrules]);
    if (!st) st = tt_table_end_row(&w);
    return st;
}

/* The contingency table: documents × rules with totals. */
static tt_status write_counts(search_ctx *c)
{
    size_t lead = c->m ? 3 : 1, ncols = lead + c->nrules + 1;
    const char **cols = calloc(ncols, sizeof *cols);
    uint64_t *total = calloc(c->nrules + 1, sizeof *total);
    uint64_t *docs = calloc(c->nrules + 1, sizeof *docs);
    tt_status st = TT_OK;
    if (!cols || !total || !docs) {
        st = TT_ENOMEM;
        goto done;
    }
    cols[0] = "document";
    if (c->m) {
        cols[1] = "entity";
        cols[2] = "period";
    }
    for (size_t r = 0; r < c->nrules; r++)
        cols[lead + r] = tt_watchlist_rule(c->wl, r)->name;
    cols[ncols - 1] = "total";
    for (size_t i = 0; i < c->n_rows; i++) {
        uint64_t sum = 0;
        for (size_t r = 0; r < c->nrules; r++) {
            total[r] += c->rows[i].counts[r];
            docs[r] += c->rows[i].counts[r] > 0;
            sum += c->rows[i].counts[r];
        }
        total[c->nrules] += sum;
        docs[c->nrules] += sum > 0;
    }
    if (c->format == TT_FORMAT_JSONL) {
        st = write_counts_jsonl(c, total, docs);
        goto done;
    }
    tt_format f = c->format == FORMAT_TEXT ? TT_FORMAT_TSV : c->format;
    tt_buf table;
    tt_buf_init(&table, 0);
    for (size_t i = 0; i <= c->n_rows + 1 && !st; i++) {
        tt_table_writer w;
        st = tt_table_begin(&w, f, &table, cols, ncols, i == 0 && c->header);
        if (i < c->n_rows) {
            const count_row *row = &c->rows[i];
            uint64_t sum = 0;
            if (!st) st = tt_table_cstr(&w, row->name);
            if (c->m) {
                char period[64];
                const tt_doc_meta *d = &c->m->docs[row->meta];
                tt_period_format(&d->period, period, sizeof period);
                if (!st) st = tt_table_cstr(&w, d->entity);
                if (!st) st = tt_table_cstr(&w, period);
            }
            for (size_t r = 0; r < c->nrules && !st; r++) {
                st = tt_table_u64(&w, row->counts[r]);
                sum += row->counts[r];
            }
            if (!st) st = tt_table_u64(&w, sum);
        } else {
            const uint64_t *v = i == c->n_rows ? total : docs;
            if (!st) st = tt_table_cstr(&w, i == c->n_rows ? "(total hits)"
                                                          : "(documents with hits)");
            for (size_t k = 1; k < lead && !st; k++)
                st = tt_table_cstr(&w, "");
            for (size_t r = 0; r <= c->nrules && !st; r++)
                st = tt_table_u64(&w, v[r]);
        }
        if (!st) st = tt_table_end_row(&w);
    }
    if (!st && c->format == FORMAT_TEXT) {
        /* align the TSV into columns of spaces */
        size_t maxw[512] = { 0 };
        size_t nc = ncols < 512 ? ncols : 512;
        for (const char *p = table.data; *p;) {
            const char *eol = strchr(p, '\n');
            size_t col = 0, w = 0;
            for (const char *q = p; q < eol; q++) {
                if (*q == '\t') {
                    if (col < nc && w > maxw[col]) maxw[col] = w;
                    col++;
                    w = 0;
                } else if (((unsigned char)*q & 0xC0) != 0x80) {
                    w++;
                }
            }
            if (col < nc && w > maxw[col]) maxw[col] = w;
            p = eol + 1;
        }
        for (const char *p = table.data; *p && !st;) {
            const char *eol = strchr(p, '\n');
            size_t col = 0, w = 0;
            const char *cell = p;
            for (const char *q = p; q <= eol && !st; q++) {
                if (q == eol || *q == '\t') {
                    st = tt_buf_append(&c->buf, cell, (size_t)(q - cell));
                    if (q != eol) {
                        size_t pad = col < nc ? maxw[col] - w + 2 : 2;
                        for (size_t k = 0; k < pad && !st; k++)
                            st = tt_buf_putc(&c->buf, ' ');
                    }
                    col++;
                    w = 0;
                    cell = q + 1;
                } else if (((unsigned char)*q & 0xC0) != 0x80) {
                    w++;
                }
            }
            if (!st) st = tt_buf_putc(&c->buf, '\n');
            p = eol + 1;
        }
    } else if (!st) {
        st = tt_buf_append(&c->buf, table.data, table.len);
    }
    tt_buf_release(&table);
done:
    free(cols);
    free(total);
    free(docs);
    return st;
}

static tt_status write_run_header(search_ctx *c, const char *rules_file,
                                  const tt_search_options *so)
{
    const char *sha = tt_watchlist_sha256(c->wl);
    const char *src = rules_file ? rules_file : "-e";
    char opts[128];
    snprintf(opts, sizeof opts, "%s%s context %zu", so->case_sensitive ? "case" : "caseless",
             so->whole_words ? " words" : "", so->context);
    if (c->format == TT_FORMAT_JSONL) {
        static const char *cols[] = { "record", "tool", "version", "watchlist",
                                      "watchlist_sha256", "rules", "options", "caution" };
        tt_table_writer w;
        tt_status st = tt_table_begin(&w, TT_FORMAT_JSONL, &c->buf, cols, 8, 0);
        if (!st) st = tt_table_cstr(&w, "run");
        if (!st) st = tt_table_cstr(&w, "termtide search");
        if (!st) st = tt_table_cstr(&w, TT_VERSION);
        if (!st) st = tt_table_cstr(&w, src);
        if (!st) st = tt_table_cstr(&w, sha);
        if (!st) st = tt_table_u64(&w, c->nrules);
        if (!st) st = tt_table_cstr(&w, opts);
        if (!st) st = tt_table_cstr(&w, "termtide measures language; it gives no investment, "
                                        "legal or compliance advice");
        if (!st) st = tt_table_end_row(&w);
        return st;
    }
    tt_status st = tt_buf_printf(&c->buf, "# termtide %s search; watch-list ", TT_VERSION);
    if (!st) st = put_clean(&c->buf, src);
    if (!st) st = tt_buf_printf(&c->buf, " sha256 %s; %zu rule%s; %s\n", sha, c->nrules,
                                c->nrules == 1 ? "" : "s", opts);
    if (!st) st = tt_buf_puts(&c->buf, "# termtide measures language; it gives no investment, "
                                       "legal or compliance advice.\n");
    return st;
}

int tt_cmd_search(int argc, char **argv)
{
    search_ctx c;
    memset(&c, 0, sizeof c);
    c.header = 1;
    tt_buf_init(&c.buf, 0);
    tt_error_init(&c.err);
    tt_search_options so;
    tt_search_options_init(&so);
    const char *rules_file = NULL, *output = NULL, *manifest_path = NULL;
    const char **patterns = NULL;
    size_t n_patterns = 0;
    int opt, rc = TT_EXIT_TROUBLE, out_open = 0, format_set = 0;
    uint64_t v;
    tt_search_batch_options bo;
    tt_search_batch_options_init(&bo);
    tt_manifest m;
    tt_manifest_init(&m);
    tt_source_list inputs;
    tt_source_list_init(&inputs);
    size_t *input_doc = NULL;
    tt_watchlist *wl = NULL;
    char msg[TT_ERROR_FILE_MAX + TT_ERROR_MSG_MAX + 64];

    optind = 1;
    while ((opt = getopt_long(argc, argv, "e:f:o:j:qh", longopts, NULL)) != -1) {
        switch (opt) {
        case 'e': {
            const char **p = realloc(patterns, (n_patterns + 1) * sizeof *p);
            if (!p)
                goto oom;
            patterns = p;
            patterns[n_patterns++] = optarg;
            break;
        }
        case OPT_RULES: rules_file = optarg; break;
        case OPT_CASE: so.case_sensitive = 1; break;
        case OPT_WORDS: so.whole_words = 1; break;
        case OPT_CONTEXT:
            if (!cli_parse_u64("--context", optarg, 0, TT_LIMIT_SEARCH_CONTEXT, &v))
                goto out;
            so.context = (size_t)v;
            break;
        case OPT_COUNTS: c.counts = 1; break;
        case 'f':
            format_set = 1;
            if (!strcmp(optarg, "text"))
                c.format = FORMAT_TEXT;
            else if (tt_format_parse(optarg, &c.format)) {
                cli_error("--format: expected text, tsv, csv or jsonl, got '%s'", optarg);
                goto out;
            }
            break;
        case 'o': output = optarg; break;
        case OPT_NO_HEADER: c.header = 0; break;
        case OPT_MANIFEST: manifest_path = optarg; break;
        case 'j':
            if (!cli_parse_u64("--jobs", optarg, 1, 256, &v))
                goto out;
            bo.threads = (int)v;
            break;
        case CLI_OPT_TABLES:
            if (strcmp(optarg, "keep") && strcmp(optarg, "drop")) {
                cli_error("--tables: expected keep or drop, got '%s'", optarg);
                goto out;
            }
            bo.read.drop_tables = !strcmp(optarg, "drop");
            break;
        case CLI_OPT_DOC_TYPES: bo.read.doc_types = optarg; break;
        case 'q': c.quiet = 1; break;
        case 'h': fputs(tt_help_search, stdout); rc = TT_EXIT_OK; goto out;
        default: fprintf(stderr, "Try 'termtide help search'.\n"); goto out;
        }
    }
    if (!rules_file == !n_patterns) {
        cli_error(n_patterns ? "give either -e PATTERN or --rules FILE, not both"
                             : "nothing to search for: give -e PATTERN or --rules FILE");
        goto out;
    }
    if (manifest_path && optind < argc) {
        cli_error("unexpected argument '%s' (with --manifest the documents are its rows)",
                  argv[optind]);
        goto out;
    }
    if (!format_set)
        c.format = !output && isatty(STDOUT_FILENO) ? FORMAT_TEXT : TT_FORMAT_TSV;
    c.highlight = c.format == FORMAT_TEXT && !output && isatty(STDOUT_FILENO) &&
                  !getenv("NO_COLOR");

    /* the watch-list, all of it clean before anything is read */
    if (!(wl = tt_watchlist_new(&so)))
        goto oom;
    tt_error err;
    tt_error_init(&err);
    tt_status st;
    if (rules_file) {
        st = tt_watchlist_load(wl, rules_file, &err);
    } else {
        st = TT_OK;
        for (size_t i = 0; i < n_patterns && st != TT_ENOMEM; i++) {
            char name[32];
            snprintf(name, sizeof name, "e%zu", i + 1);
            st = tt_watchlist_add(wl, name, patterns[i], "", &err);
        }
    }
    if (st) {
        size_t np = tt_watchlist_problem_count(wl);
        if (st == TT_EPARSE && np) {
            for (size_t i = 0; i < np; i++) {
                const tt_error *e = tt_watchlist_problem(wl, i);
                if (e->file[0])
                    cli_error("%s", tt_error_format(e, msg, sizeof msg));
                else
                    cli_error("-e: %s", e->message);
            }
            cli_error("%s: %zu problem%s; nothing searched", rules_file ? rules_file : "-e",
                      np, np == 1 ? "" : "s");
        } else {
            cli_error("%s", tt_error_format(&err, msg, sizeof msg));
        }
        goto out;
    }
    c.wl = wl;
    c.nrules = tt_watchlist_size(wl);

    if (manifest_path) {
        if (!cli_load_manifest(&m, manifest_path))
            goto out;
        input_doc = malloc((m.n ? m.n : 1) * sizeof *input_doc);
        if (!input_doc)
            goto oom;
        for (size_t i = 0; i < m.n; i++) {
            size_t before = inputs.n;
            if (tt_source_expand(&inputs, m.docs[i].path))
                goto oom;
            if (inputs.n != before + 1) {
                cli_error("%s: line %ld: %s is not one file", manifest_path, m.docs[i].line,
                          m.docs[i].path);
                goto out;
            }
            input_doc[before] = i;
        }
        c.m = &m;
        c.input_doc = input_doc;
    } else if (!cli_expand_inputs(&inputs, argc - optind, argv + optind)) {
        goto out;
    }

    if (tt_outfile_open(&c.out, output, &c.err)) {
        cli_error("%s", tt_error_format(&c.err, msg, sizeof msg));
        goto out;
    }
    out_open = 1;
    if (write_run_header(&c, rules_file, &so))
        goto oom;
    bo.watchlist = wl;
    bo.counts_only = c.counts;
    bo.on_input = on_input;
    bo.on_document = on_document;
    bo.on_problem = on_problem;
    bo.ctx = &c;
    tt_search_summary sum;
    st = tt_search_batch(&inputs, &bo, &sum, &err);
    if (st) {
        if (c.err.status)
            cli_error("%s", tt_error_format(&c.err, msg, sizeof msg));
        else
            cli_error("%s", tt_error_format(&err, msg, sizeof msg));
        goto out;
    }
    if (c.counts && write_counts(&c))
        goto oom;
    if (flush(&c, 1) || tt_outfile_commit(&c.out, &c.err))
        goto write_fail;
    out_open = 0;
    if (!c.quiet)
        fprintf(stderr, "%s search: %zu document%s searched, %llu hit%s, %zu skipped, %zu rule%s "
                        "stopped by a limit\n",
                tt_prog, sum.documents, sum.documents == 1 ? "" : "s",
                (unsigned long long)sum.hits, sum.hits == 1 ? "" : "s", sum.skipped, sum.stops,
                sum.stops == 1 ? "" : "s");
    rc = (sum.skipped || sum.stops) ? TT_EXIT_TROUBLE : sum.hits ? TT_EXIT_OK : TT_EXIT_NONE;
    goto out;
write_fail:
    cli_error("%s", tt_error_format(&c.err, msg, sizeof msg));
    goto out;
oom:
    cli_error("out of memory");
out:
    if (out_open)
        tt_outfile_abort(&c.out);
    for (size_t i = 0; i < c.n_rows; i++) {
        free(c.rows[i].name);
        free(c.rows[i].counts);
    }
    free(c.rows);
    free(patterns);
    free(input_doc);
    tt_watchlist_free(wl);
    tt_manifest_release(&m);
    tt_source_list_release(&inputs);
    tt_buf_release(&c.buf);
    return rc;
}
