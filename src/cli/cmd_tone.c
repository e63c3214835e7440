/* termtide tone — word-category counts per document (or per entity and
 * period, or per transcript part and speaker role): for every lexicon
 * category its weighted count and rate per 1,000 words, net tone, the words
 * that contributed most, sentence scores, and a check of the lexicon
 * against labelled text.
 *
 * Documents are read and scored on worker threads (the batch runner's
 * analyse hook); each worker packs its document's scores, and this thread
 * unpacks them in input order, so output is identical for any -j. */
#include <errno.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>
#include <sys/stat.h>

#include "termtide/document.h"
#include "termtide/index.h"
#include "termtide/lexicon.h"
#include "termtide/meta.h"
#include "termtide/stats.h"
#include "termtide/tone.h"
#include "termtide/transcript.h"
#include "cli.h"
#include "tone_cli.h"

const char tt_help_tone[] =
    "Usage: termtide tone [OPTIONS] [PATH...]\n"
    "\n"
    "Counts each document's words by lexicon category (negative, positive, hedging,\n"
    "legal, constraint with the shipped lexicon) and prints one row per document:\n"
    "  document words CATEGORY CATEGORY_per_1000 ... net_tone net_per_1000 negated\n"
    "CATEGORY is the sum of the weights of the matched entries; per_1000 divides it\n"
    "by the document's words (word tokens; numbers are not words) and multiplies\n"
    "by 1,000. net_tone = (positive - negative) / (positive + negative), n/a when\n"
    "both are 0; net_per_1000 = (positive - negative) per 1,000 words.\n"
    "\n"
    "Negation: a positive entry preceded within --window words (default 3) of the\n"
    "same sentence by a negator (no, not, none, neither, never, nobody) counts as\n"
    "negative; negated counts them. Loughran & McDonald (2011) treat such a word\n"
    "as not positive; counting it as negative is a common variant.\n"
    "\n"
    "Options:\n"
    "  --lexicon FILE        a lexicon of your own (term<TAB>category[<TAB>weight]\n"
    "                        lines; see lexicons/finance.txt); default: the shipped\n"
    "                        finance lexicon\n"
    "  --check               list the lexicon's terms that stand under two categories\n"
    "                        (they count in both) and exit\n"
    "  --window N            negation window in words (0 turns negation off)\n"
    "  --negators LIST       comma-separated negators instead of the six above\n"
    "  --total               add a row for all documents together ('*')\n"
    "\n"
    "Call transcripts (speaker turns: paragraphs that start 'Name: ' or\n"
    "'Name - Role: '):\n"
    "  --by part|role|part,role\n"
    "                        split each document's row by transcript part (prepared,\n"
    "                        qa, other = outside any turn, e.g. the title or a\n"
    "                        document without turns) and/or speaker role\n"
    "                        (management, analyst, operator, unknown, none); speaker\n"
    "                        labels are not counted as words; rows without words are\n"
    "                        left out\n"
    "  --speakers            instead, list each transcript's speakers:\n"
    "                          document speaker role found_by turns qa_found_by\n"
    "\n"
    "Other views:\n"
    "  --contributors        the entries that added most to each category:\n"
    "                          document category rank term match matches weight negated\n"
    "                        (term as the lexicon writes it; match: word, stem or\n"
    "                        phrase; negated: yes when a positive entry counted as\n"
    "                        negative)\n"
    "  --top N               entries per category for --contributors (default 10)\n"
    "  --sentences           one row per sentence: document offset words CATEGORY ...\n"
    "                        net_tone text (offset: byte offset of the sentence's first\n"
    "                        word in the file)\n"
    "  --labels FILE         check the lexicon against labelled units. FILE has\n"
    "                        document<TAB>label lines (the whole document) or\n"
    "                        document<TAB>offset<TAB>label lines (the sentence starting\n"
    "                        at that offset, as --sentences prints it); '#' comments.\n"
    "                        Each unit is predicted positive when its net tone is\n"
    "                        above --threshold, negative when below minus it, else\n"
    "                        neutral; prints the confusion matrix (actual x\n"
    "                        predicted, with totals), precision, recall and F1 per\n"
    "                        class and macro-averaged, accuracy, and the misread units\n"
    "  --threshold T         for --labels, 0 <= T < 1 (default 0)\n"
    "\n"
    "Periods (document metadata as for compare):\n"
    "  --manifest FILE, --layout PATTERN ROOT..., --headers ROOT...\n"
    "                        one row per entity and period (its documents together):\n"
    "                          entity period words CATEGORY ... negated\n"
    "  --entity NAME, --kinds LIST   which documents form each series\n"
    "  --consecutive         instead, per entity, each pair of consecutive periods and\n"
    "                        category: entity base target category base_per_1000\n"
    "                        target_per_1000 change_per_1000 z p_value direction; z is\n"
    "                        the pooled two-proportion z-test of the category's\n"
    "                        weighted count among the period's words (z squared is\n"
    "                        Pearson's chi-square on that 2x2 table), p two-sided\n"
    "  -f, --format tsv|csv|jsonl   -o, --output FILE   --no-header\n"
    "  -j, --jobs N   --tables keep|drop   --doc-types LIST   -q, --quiet   (as for count)\n"
    "  --section NAME, --section-rules FILE   only these sections (as for count)\n"
    "  --db DB               the whole-document scores stored by termtide index --tone\n"
    "                        DB (built with the same lexicon and negation rule) instead\n"
    "                        of reading the files; not with --by, --speakers,\n"
    "                        --sentences or --labels\n"
    "\n"
    "termtide measures language; it gives no investment, legal or compliance advice.\n";

enum { OPT_LEXICON = CLI_OPT_FIRST_FREE, OPT_CHECK, OPT_WINDOW, OPT_NEGATORS, OPT_TOTAL,
       OPT_NO_HEADER, OPT_MANIFEST, OPT_LAYOUT, OPT_HEADERS, OPT_HEADER_PERIOD, OPT_ENTITY,
       OPT_KINDS, OPT_CONSECUTIVE, OPT_BY, OPT_SPEAKERS, OPT_CONTRIBUTORS, OPT_TOP,
       OPT_SENTENCES, OPT_LABELS, OPT_THRESHOLD };

static const struct option longopts[] = {
    { "lexicon", required_argument, NULL, OPT_LEXICON },
    { "check", no_argument, NULL, OPT_CHECK },
    { "window", required_argument, NULL, OPT_WINDOW },
    { "negators", required_argument, NULL, OPT_NEGATORS },
    { "total", no_argument, NULL, OPT_TOTAL },
    { "manifest", required_argument, NULL, OPT_MANIFEST },
    { "layout", required_argument, NULL, OPT_LAYOUT },
    { "headers", no_argument, NULL, OPT_HEADERS },
    { "header-period", required_argument, NULL, OPT_HEADER_PERIOD },
    { "entity", required_argument, NULL, OPT_ENTITY },
    { "kinds", required_argument, NULL, OPT_KINDS },
    { "consecutive", no_argument, NULL, OPT_CONSECUTIVE },
    { "by", required_argument, NULL, OPT_BY },
    { "speakers", no_argument, NULL, OPT_SPEAKERS },
    { "contributors", no_argument, NULL, OPT_CONTRIBUTORS },
    { "top", required_argument, NULL, OPT_TOP },
    { "sentences", no_argument, NULL, OPT_SENTENCES },
    { "labels", required_argument, NULL, OPT_LABELS },
    { "threshold", required_argument, NULL, OPT_THRESHOLD },
    { "format", required_argument, NULL, 'f' },
    { "output", required_argument, NULL, 'o' },
    { "no-header", no_argument, NULL, OPT_NO_HEADER },
    { "help", no_argument, NULL, 'h' },
    { "tables", required_argument, NULL, CLI_OPT_TABLES },
    { "doc-types", required_argument, NULL, CLI_OPT_DOC_TYPES },
    { "jobs", required_argument, NULL, 'j' },
    { "section", required_argument, NULL, CLI_OPT_SECTION },
    { "section-rules", required_argument, NULL, CLI_OPT_SECTION_RULES },
    { "db", required_argument, NULL, CLI_OPT_DB },
    { "quiet", no_argument, NULL, 'q' },
    { NULL, 0, NULL, 0 }
};

typedef enum { VIEW_SCORES, VIEW_CONTRIBUTORS, VIEW_SENTENCES, VIEW_SPEAKERS,
               VIEW_LABELS } view_kind;

/* One labelled unit of --labels. */
typedef struct unit {
    char *document;
    long long offset;   /* -1: the whole document */
    char *label;
    long line;
    int scored;         /* 0 until its document (and sentence) is scored */
    double net;
} unit;

typedef struct tone_ctx {
    cli_pipeline pipe; /* first: the pipeline hooks use the batch ctx as this */
    const tt_lexicon *lex;
    tt_tone_options topt;
    view_kind view;
    int by_part, by_role;
    size_t nkeys;      /* score sets per document: 1, or parts × roles kept */
    size_t top;
    double threshold;
    long pos, neg;
    size_t ncat;
    tt_format format;
    int header;
    const char **cols; /* the main table's columns */
    size_t ncols;
    char **owned;      /* column names made here */
    size_t n_owned;
    tt_buf buf;
    tt_outfile out;
    tt_error err;
    int total;
    tt_tone_scores *doc, *all; /* nkeys each */
    /* grouped (metadata) mode */
    int grouping, consecutive;
    const tt_series *series;
    size_t *input_group;       /* per input: its group */
    size_t next_group;         /* the first group not yet written */
    tt_tone_scores *grp, *prev;
    int have_prev;
    /* --labels */
    unit *units;
    size_t n_units;
    size_t unit_problems;
} tone_ctx;

/* A worker's scorer and scratch. */
typedef struct tone_worker {
    tt_tone *tone;
    tt_transcript tr;
    tt_tone_scores *keys;
    size_t nkeys;
    const tone_ctx *c;
    const tt_document *doc;   /* --sentences: the document being walked */
    size_t block;
    tt_buf *out;
} tone_worker;

static size_t key_of(const tone_ctx *c, tt_turn_part part, tt_turn_role role)
{
    if (c->by_part && c->by_role)
        return (size_t)part * TT_TURN_ROLES + (size_t)role;
    return c->by_part ? (size_t)part : c->by_role ? (size_t)role : 0;
}

static tt_turn_part key_part(const tone_ctx *c, size_t key)
{
    return c->by_role ? (tt_turn_part)(key / TT_TURN_ROLES) : (tt_turn_part)key;
}

static tt_turn_role key_role(const tone_ctx *c, size_t key)
{
    return c->by_part ? (tt_turn_role)(key % TT_TURN_ROLES) : (tt_turn_role)key;
}

static tt_tone_scores *scores_new(const tone_ctx *c, size_t n)
{
    tt_tone_scores *s = calloc(n, sizeof *s);
    if (!s)
        return NULL;
    for (size_t k = 0; k < n; k++)
        if (tt_tone_scores_init(&s[k], c->lex)) {
            for (size_t j = 0; j < k; j++)
                tt_tone_scores_release(&s[j]);
            free(s);
            return NULL;
        }
    return s;
}

static void scores_free(tt_tone_scores *s, size_t n)
{
    if (!s)
        return;
    for (size_t k = 0; k < n; k++)
        tt_tone_scores_release(&s[k]);
    free(s);
}

static void *worker_new(void *vctx)
{
    const tone_ctx *c = vctx;
    tone_worker *w = calloc(1, sizeof *w);
    if (!w)
        return NULL;
    w->c = c;
    w->nkeys = c->nkeys;
    tt_transcript_init(&w->tr);
    if (!(w->tone = tt_tone_new(&c->topt)) || !(w->keys = scores_new(c, c->nkeys))) {
        tt_tone_free(w->tone);
        free(w);
        return NULL;
    }
    return w;
}

static void worker_free(void *vctx, void *state)
{
    (void)vctx;
    tone_worker *w = state;
    tt_tone_free(w->tone);
    tt_transcript_release(&w->tr);
    scores_free(w->keys, w->nkeys);
    free(w);
}

/* One sentence row of --sentences, written in the worker. */
static tt_status sentence_row(void *vw, size_t off, size_t len, const tt_tone_scores *s)
{
    tone_worker *w = vw;
    const tone_ctx *c = w->c;
    const tt_document *doc = w->doc;
    const char *text = doc->blocks->text.data + doc->blocks->items[w->block].off;
    long long src = tt_blocks_source_offset(doc->blocks, w->block, off, doc->raw, doc->raw_len,
                                           doc->kind == TT_KIND_HTML);
    tt_table_writer tw;
    tt_status st = tt_table_begin(&tw, c->format, w->out, c->cols, c->ncols, 0);
    if (!st) st = tt_table_cstr(&tw, doc->name);
    if (!st) st = src >= 0 ? tt_table_u64(&tw, (uint64_t)src + doc->raw_off)
                           : tt_table_cstr(&tw, "n/a");
    if (!st) st = tt_table_u64(&tw, s->words);
    for (size_t k = 0; k < c->ncat && !st; k++)
        st = tt_table_fixed(&tw, s->weight[k], 1);
    if (!st) st = tt_table_fixed(&tw, tt_tone_net(s, c->pos, c->neg), 4);
    while (len && text[off + len - 1] == ' ')
        len--;
    if (!st) st = tt_table_str(&tw, text + off, len);
    if (!st) st = tt_table_end_row(&tw);
    w->keys[0].words += s->words;
    return st;
}

/* --labels with sentence units: every sentence's offset and net tone. */
static tt_status sentence_net(void *vw, size_t off, size_t len, const tt_tone_scores *s)
{
    (void)len;
    tone_worker *w = vw;
    const tt_document *doc = w->doc;
    long long src = tt_blocks_source_offset(doc->blocks, w->block, off, doc->raw, doc->raw_len,
                                           doc->kind == TT_KIND_HTML);
    int64_t o = src >= 0 ? (int64_t)(src + (long long)doc->raw_off) : -1;
    double net = tt_tone_net(s, w->c->pos, w->c->neg);
    tt_status st = tt_buf_append(w->out, (const char *)&o, sizeof o);
    return st ? st : tt_buf_append(w->out, (const char *)&net, sizeof net);
}

static tt_status speaker_rows(tone_worker *w, const tt_document *doc, tt_buf *out)
{
    const tone_ctx *c = w->c;
    for (size_t k = 0; k < w->tr.n_speakers; k++) {
        const tt_speaker *sp = &w->tr.speakers[k];
        tt_table_writer tw;
        tt_status st = tt_table_begin(&tw, c->format, out, c->cols, c->ncols, 0);
        if (!st) st = tt_table_cstr(&tw, doc->name);
        if (!st) st = tt_table_cstr(&tw, sp->name);
        if (!st) st = tt_table_cstr(&tw, tt_turn_role_name(sp->role));
        if (!st) st = tt_table_cstr(&tw, sp->how);
        if (!st) st = tt_table_u64(&tw, sp->turns);
        if (!st) st = tt_table_cstr(&tw, w->tr.qa_block >= 0 ? w->tr.qa_how : "not found");
        if (!st) st = tt_table_end_row(&tw);
        if (st)
            return st;
    }
    return TT_OK;
}

/* The worker's part: score one document and pack the result. */
static tt_status analyse(void *vctx, void *state, const tt_document *doc, tt_buf *out,
                         tt_doc_stats *stats)
{
    const tone_ctx *c = vctx;
    tone_worker *w = state;
    const tt_blocks *b = doc->blocks;
    tt_status st = TT_OK;
    if (c->view == VIEW_SPEAKERS) {
        if ((st = tt_transcript_find(b, &w->tr)) != TT_OK)
            return st;
        tt_tone_scores_reset(&w->keys[0]);
        if ((st = tt_tone_score_blocks(w->tone, b, &w->keys[0])) != TT_OK)
            return st;
        stats->words_read = w->keys[0].words;
        return speaker_rows(w, doc, out);
    }
    if (c->view == VIEW_SENTENCES || (c->view == VIEW_LABELS && c->units)) {
        int sentences = c->view == VIEW_SENTENCES;
        w->doc = doc;
        w->out = out;
        tt_tone_scores_reset(&w->keys[0]);
        for (size_t i = 0; i < b->n && !st; i++) {
            w->block = i;
            st = tt_tone_score_sentences(w->tone, b->text.data + b->items[i].off,
                                         b->items[i].len, sentences ? sentence_row : sentence_net,
                                         w);
        }
        if (!st && !sentences) {
            /* the whole document's net tone closes the record */
            int64_t none = -2;
            st = tt_tone_score_blocks(w->tone, b, &w->keys[0]);
            double net = tt_tone_net(&w->keys[0], c->pos, c->neg);
            if (!st) st = tt_buf_append(out, (const char *)&none, sizeof none);
            if (!st) st = tt_buf_append(out, (const char *)&net, sizeof net);
        }
        stats->words_read = w->keys[0].words;
        return st;
    }
    for (size_t k = 0; k < w->nkeys; k++)
        tt_tone_scores_reset(&w->keys[k]);
    if (w->nkeys == 1) {
        st = tt_tone_score_blocks(w->tone, b, &w->keys[0]);
    } else {
        if ((st = tt_transcript_find(b, &w->tr)) != TT_OK)
            return st;
        for (size_t i = 0; i < b->n && !st; i++) {
            const tt_block_turn *bt = &w->tr.blocks[i];
            size_t skip = bt->label_len < b->items[i].len ? bt->label_len : b->items[i].len;
            st = tt_tone_score_text(w->tone, b->text.data + b->items[i].off + skip,
                                    b->items[i].len - skip, &w->keys[key_of(c, bt->part, bt->role)]);
        }
    }
    for (size_t k = 0; k < w->nkeys && !st; k++) {
        stats->words_read += w->keys[k].words;
        st = tt_tone_scores_pack(&w->keys[k], out);
    }
    return st;
}

static tt_status flush(tone_ctx *c) { return cli_flush(&c->out, &c->buf, &c->err, 0); }

/* Writes the leading label cells: document, or entity and period; then the
 * part and role of a --by key. */
static tt_status lead_cells(tone_ctx *c, tt_table_writer *w, const char *name,
                            const char *period, size_t key)
{
    tt_status st = tt_table_cstr(w, name);
    if (!st && period) st = tt_table_cstr(w, period);
    if (!st && c->by_part) st = tt_table_cstr(w, tt_turn_part_name(key_part(c, key)));
    if (!st && c->by_role) st = tt_table_cstr(w, tt_turn_role_name(key_role(c, key)));
    return st;
}

static tt_status score_row(tone_ctx *c, const char *name, const char *period, size_t key,
                           const tt_tone_scores *s)
{
    tt_table_writer w;
    tt_status st = tt_table_begin(&w, c->format, &c->buf, c->cols, c->ncols, 0);
    double words = (double)s->words;
    if (!st) st = lead_cells(c, &w, name, period, key);
    if (!st) st = tt_table_u64(&w, s->words);
    for (size_t k = 0; k < s->n_categories && !st; k++) {
        st = tt_table_fixed(&w, s->weight[k], 1);
        if (!st) st = tt_table_fixed(&w, s->words ? 1000.0 * s->weight[k] / words : NAN, 3);
    }
    double p = c->pos >= 0 ? s->weight[c->pos] : NAN, n = c->neg >= 0 ? s->weight[c->neg] : NAN;
    if (!st) st = tt_table_fixed(&w, tt_tone_net(s, c->pos, c->neg), 4);
    if (!st) st = tt_table_fixed(&w, s->words ? 1000.0 * (p - n) / words : NAN, 3);
    if (!st) st = tt_table_u64(&w, s->negated);
    if (!st) st = tt_table_end_row(&w);
    return st;
}

static tt_status contributor_rows(tone_ctx *c, const char *name, const char *period, size_t key,
                                  const tt_tone_scores *s)
{
    static const char *const kinds[] = { "word", "stem", "phrase" };
    tt_tone_contribution *top = malloc(c->top * sizeof *top);
    if (!top)
        return TT_ENOMEM;
    tt_status st = TT_OK;
    for (size_t k = 0; k < c->ncat && !st; k++) {
        size_t n = 0;
        if ((st = tt_tone_top(s, c->lex, k, c->neg, top, c->top, &n)) != TT_OK)
            break;
        for (size_t r = 0; r < n && !st; r++) {
            const tt_lexicon_entry *e = tt_lexicon_entry_at(c->lex, top[r].entry);
            tt_table_writer w;
            st = tt_table_begin(&w, c->format, &c->buf, c->cols, c->ncols, 0);
            if (!st) st = lead_cells(c, &w, name, period, key);
            if (!st) st = tt_table_cstr(&w, tt_lexicon_category_name(c->lex, k));
            if (!st) st = tt_table_u64(&w, r + 1);
            if (!st) st = tt_table_cstr(&w, e->written);
            if (!st) st = tt_table_cstr(&w, kinds[e->kind]);
            if (!st) st = tt_table_u64(&w, top[r].matches);
            if (!st) st = tt_table_fixed(&w, top[r].weight, 1);
            if (!st) st = tt_table_cstr(&w, top[r].negated ? "yes" : "no");
            if (!st) st = tt_table_end_row(&w);
        }
    }
    free(top);
    return st;
}

/* The rows of one document or group: every key with words. */
static tt_status rows_for(tone_ctx *c, const char *name, const char *period,
                          const tt_tone_scores *keys)
{
    tt_status st = TT_OK;
    for (size_t k = 0; k < c->nkeys && !st; k++) {
        if (c->nkeys > 1 && keys[k].words == 0)
            continue;
        st = c->view == VIEW_CONTRIBUTORS ? contributor_rows(c, name, period, k, &keys[k])
                                          : score_row(c, name, period, k, &keys[k]);
    }
    return st ? st : flush(c);
}

/* --consecutive: each key and category of the group against the one before. */
static tt_status change_rows(tone_ctx *c, const char *entity, const char *base,
                             const char *target)
{
    for (size_t key = 0; key < c->nkeys; key++) {
        const tt_tone_scores *a = &c->prev[key], *b = &c->grp[key];
        if (c->nkeys > 1 && a->words == 0 && b->words == 0)
            continue;
        for (size_t k = 0; k < c->ncat; k++) {
            tt_table_writer w;
            double z, pv;
            double r1 = a->words ? 1000.0 * a->weight[k] / (double)a->words : NAN;
            double r2 = b->words ? 1000.0 * b->weight[k] / (double)b->words : NAN;
            tt_two_proportion_z(a->weight[k], (double)a->words, b->weight[k], (double)b->words,
                                &z, &pv);
            tt_status st = tt_table_begin(&w, c->format, &c->buf, c->cols, c->ncols, 0);
            if (!st) st = tt_table_cstr(&w, entity);
            if (!st) st = tt_table_cstr(&w, base);
            if (!st) st = tt_table_cstr(&w, target);
            if (!st && c->by_part) st = tt_table_cstr(&w, tt_turn_part_name(key_part(c, key)));
            if (!st && c->by_role) st = tt_table_cstr(&w, tt_turn_role_name(key_role(c, key)));
            if (!st) st = tt_table_cstr(&w, tt_lexicon_category_name(c->lex, k));
            if (!st) st = tt_table_fixed(&w, r1, 3);
            if (!st) st = tt_table_fixed(&w, r2, 3);
            if (!st) st = tt_table_fixed(&w, r2 - r1, 3);
            if (!st) st = tt_table_fixed(&w, z, 3);
            if (!st) st = tt_table_sci(&w, pv, 4);
            if (!st)
                st = tt_table_cstr(&w, r2 > r1 ? "rise" : r2 < r1 ? "fall" : "same");
            if (!st) st = tt_table_end_row(&w);
            if (st)
                return st;
        }
    }
    return flush(c);
}

/* Writes every group before `upto` that is still pending. */
static tt_status flush_groups(tone_ctx *c, size_t upto)
{
    const tt_series *s = c->series;
    for (; c->next_group < upto; c->next_group++) {
        size_t g = c->next_group;
        const tt_series_group *grp = &s->groups[g];
        char period[TT_PERIOD_TEXT_MAX];
        tt_period_format(&grp->period, period, sizeof period);
        tt_status st = TT_OK;
        if (!c->consecutive) {
            st = rows_for(c, grp->entity, period, c->grp);
        } else if (c->have_prev && g > 0 && !strcmp(s->groups[g - 1].entity, grp->entity)) {
            char base[TT_PERIOD_TEXT_MAX];
            tt_period_format(&s->groups[g - 1].period, base, sizeof base);
            st = change_rows(c, grp->entity, base, period);
        }
        if (st)
            return st;
        /* this group becomes the next pair's base */
        tt_tone_scores *t = c->prev;
        c->prev = c->grp;
        c->grp = t;
        c->have_prev = 1;
        for (size_t k = 0; k < c->nkeys; k++)
            tt_tone_scores_reset(&c->grp[k]);
    }
    return TT_OK;
}

static unit *find_unit(tone_ctx *c, const char *doc, long long offset, size_t from)
{
    for (size_t i = from; i < c->n_units; i++)
        if (c->units[i].offset == offset && !strcmp(c->units[i].document, doc))
            return &c->units[i];
    return NULL;
}

static tt_status on_document(void *vctx, const tt_doc_result *r)
{
    tone_ctx *c = vctx;
    if (c->view == VIEW_SENTENCES || c->view == VIEW_SPEAKERS) {
        tt_status st = tt_buf_append(&c->buf, r->prepared, r->prepared_len);
        return st ? st : flush(c);
    }
    if (c->view == VIEW_LABELS) {
        /* records of (offset, net); offset -2 is the whole document */
        for (size_t p = 0; p + 16 <= r->prepared_len; p += 16) {
            int64_t off;
            double net;
            memcpy(&off, r->prepared + p, 8);
            memcpy(&net, r->prepared + p + 8, 8);
            long long want = off == -2 ? -1 : off;
            if (off == -1)
                continue;
            for (unit *u = find_unit(c, r->name, want, 0); u;
                 u = find_unit(c, r->name, want, (size_t)(u - c->units) + 1)) {
                u->scored = 1;
                u->net = net;
            }
        }
        return TT_OK;
    }
    const char *data = r->prepared;
    size_t len = r->prepared_len;
    for (size_t k = 0; k < c->nkeys; k++) {
        tt_tone_scores_reset(&c->doc[k]);
        if (tt_tone_scores_add_packed(&c->doc[k], &data, &len))
            return TT_EINVAL;
    }
    for (size_t k = 0; k < c->nkeys; k++)
        tt_tone_scores_add(&c->all[k], &c->doc[k]);
    if (!c->grouping)
        return rows_for(c, r->name, NULL, c->doc);
    size_t g = c->input_group[r->input];
    tt_status st = flush_groups(c, g);
    for (size_t k = 0; k < c->nkeys && !st; k++)
        st = tt_tone_scores_add(&c->grp[k], &c->doc[k]);
    return st;
}

/* Column names built from the lexicon's categories. */
static const char *own(tone_ctx *c, const char *a, const char *b)
{
    char **l = realloc(c->owned, (c->n_owned + 1) * sizeof *l);
    if (!l)
        return NULL;
    c->owned = l;
    size_t na = strlen(a), nb = strlen(b);
    char *s = malloc(na + nb + 1);
    if (!s)
        return NULL;
    memcpy(s, a, na);
    memcpy(s + na, b, nb + 1);
    c->owned[c->n_owned++] = s;
    return s;
}

static int set_columns(tone_ctx *c, int metadata)
{
    size_t max = 8 + 2 * c->ncat + 8;
    if (!(c->cols = calloc(max, sizeof *c->cols)))
        return 0;
    size_t n = 0;
    const char **k = c->cols;
    if (c->view == VIEW_SPEAKERS) {
        static const char *const sp[] = { "document", "speaker", "role", "found_by", "turns",
                                          "qa_found_by" };
        for (size_t i = 0; i < 6; i++)
            k[n++] = sp[i];
        c->ncols = n;
        return 1;
    }
    if (c->view == VIEW_SENTENCES) {
        k[n++] = "document";
        k[n++] = "offset";
        k[n++] = "words";
        for (size_t i = 0; i < c->ncat; i++)
            k[n++] = tt_lexicon_category_name(c->lex, i);
        k[n++] = "net_tone";
        k[n++] = "text";
        c->ncols = n;
        return 1;
    }
    if (c->consecutive) {
        k[n++] = "entity";
        k[n++] = "base";
        k[n++] = "target";
    } else if (metadata) {
        k[n++] = "entity";
        k[n++] = "period";
    } else {
        k[n++] = "document";
    }
    if (c->by_part)
        k[n++] = "part";
    if (c->by_role)
        k[n++] = "role";
    if (c->consecutive) {
        static const char *const pc[] = { "category", "base_per_1000", "target_per_1000",
                                          "change_per_1000", "z", "p_value", "direction" };
        for (size_t i = 0; i < 7; i++)
            k[n++] = pc[i];
    } else if (c->view == VIEW_CONTRIBUTORS) {
        static const char *const cc[] = { "category", "rank", "term", "match", "matches",
                                          "weight", "negated" };
        for (size_t i = 0; i < 7; i++)
            k[n++] = cc[i];
    } else {
        k[n++] = "words";
        for (size_t i = 0; i < c->ncat; i++) {
            const char *name = tt_lexicon_category_name(c->lex, i);
            k[n++] = name;
            if (!(k[n++] = own(c, name, "_per_1000")))
                return 0;
        }
        k[n++] = "net_tone";
        k[n++] = "net_per_1000";
        k[n++] = "negated";
    }
    c->ncols = n;
    return 1;
}

/* Reads the --labels file: document<TAB>label or document<TAB>offset<TAB>label. */
static int load_labels(tone_ctx *c, const char *path, tt_source_list *inputs)
{
    FILE *f = fopen(path, "r");
    if (!f) {
        cli_error("%s: cannot open: %s", path, strerror(errno));
        return 0;
    }
    char *line = NULL;
    size_t cap = 0;
    ssize_t got;
    long lineno = 0;
    int ok = 1;
    while (ok && (got = getline(&line, &cap, f)) != -1) {
        lineno++;
        size_t n = (size_t)got;
        while (n && (line[n - 1] == '\n' || line[n - 1] == '\r'))
            line[--n] = '\0';
        char *p = line;
        if (lineno == 1 && n >= 3 && !memcmp(p, "\xef\xbb\xbf", 3))
            p += 3;
        if (!*p || *p == '#')
            continue;
        char *f1 = p, *t1 = strchr(f1, '\t');
        char *f2 = t1 ? t1 + 1 : NULL, *t2 = f2 ? strchr(f2, '\t') : NULL;
        char *f3 = t2 ? t2 + 1 : NULL;
        if (!t1 || (f3 && strchr(f3, '\t'))) {
            cli_error("%s: line %ld: expected document<TAB>label or "
                      "document<TAB>offset<TAB>label", path, lineno);
            ok = 0;
            break;
        }
        *t1 = '\0';
        if (t2)
            *t2 = '\0';
        if (c->n_units == 0 && !strcmp(f1, "document"))
            continue; /* a header line */
        long long offset = -1;
        const char *label = f2;
        if (f3) {
            uint64_t v;
            char opt[64];
            snprintf(opt, sizeof opt, "%s: line %ld: offset", path, lineno);
            if (!cli_parse_u64(opt, f2, 0, (uint64_t)1 << 40, &v)) {
                ok = 0;
                break;
            }
            offset = (long long)v;
            label = f3;
        }
        if (!*f1 || !*label) {
            cli_error("%s: line %ld: empty document or label", path, lineno);
            ok = 0;
            break;
        }
        unit *u = realloc(c->units, (c->n_units + 1) * sizeof *u);
        if (!u) {
            ok = 0;
            break;
        }
        c->units = u;
        u = &c->units[c->n_units++];
        memset(u, 0, sizeof *u);
        u->document = strdup(f1);
        u->label = strdup(label);
        u->offset = offset;
        u->line = lineno;
        if (!u->document || !u->label) {
            ok = 0;
            break;
        }
    }
    if (ok && ferror(f)) {
        cli_error("%s: read error", path);
        ok = 0;
    }
    free(line);
    fclose(f);
    if (ok && c->n_units == 0) {
        cli_error("%s: no labelled units", path);
        ok = 0;
    }
    /* the files to read: each document's path (a wrapper part's name is
     * "path#SEQ:TYPE"), each once, in order of first mention */
    for (size_t i = 0; ok && i < c->n_units; i++) {
        char *name = c->units[i].document;
        struct stat sb;
        size_t plen = strlen(name);
        char *hash = strrchr(name, '#');
        if (stat(name, &sb) != 0 && hash)
            plen = (size_t)(hash - name);
        int seen = 0;
        for (size_t j = 0; j < inputs->n && !seen; j++)
            seen = strlen(inputs->items[j].path) == plen &&
                   !strncmp(inputs->items[j].path, name, plen);
        if (seen)
            continue;
        char save = name[plen];
        name[plen] = '\0';
        tt_status st = tt_source_expand(inputs, name);
        name[plen] = save;
        if (st == TT_ENOMEM)
            ok = 0;
    }
    return ok;
}

static int cmp_str(const void *a, const void *b)
{
    return strcmp(*(const char *const *)a, *(const char *const *)b);
}

/* The --labels report: confusion matrix, scores per class, misread units. */
static tt_status labels_report(tone_ctx *c)
{
    static const char *const predicted_names[] = { "negative", "neutral", "positive" };
    const char **classes = malloc((c->n_units + 3) * sizeof *classes);
    if (!classes)
        return TT_ENOMEM;
    size_t nc = 0;
    for (size_t i = 0; i < 3; i++)
        classes[nc++] = predicted_names[i];
    for (size_t i = 0; i < c->n_units; i++)
        classes[nc++] = c->units[i].label;
    qsort(classes, nc, sizeof *classes, cmp_str);
    size_t m = 0;
    for (size_t i = 0; i < nc; i++)
        if (!m || strcmp(classes[m - 1], classes[i]))
            classes[m++] = classes[i];
    nc = m;
    /* only classes that occur among actual or predicted labels */
    size_t *pred = calloc(c->n_units, sizeof *pred), *act = calloc(c->n_units, sizeof *act);
    uint64_t *matrix = calloc(nc * nc, sizeof *matrix);
    int *used = calloc(nc, sizeof *used);
    tt_class_scores *per = calloc(nc, sizeof *per);
    uint64_t *col_total = calloc(nc, sizeof *col_total);
    const char **mcols = calloc(nc + 2, sizeof *mcols);
    tt_status st = TT_OK;
    if (!pred || !act || !matrix || !used || !per || !col_total || !mcols) {
        st = TT_ENOMEM;
        goto done;
    }
    size_t scored = 0;
    for (size_t i = 0; i < c->n_units; i++) {
        unit *u = &c->units[i];
        if (!u->scored)
            continue;
        const char *p = u->net > c->threshold ? "positive"
                        : u->net < -c->threshold ? "negative" : "neutral";
        for (size_t k = 0; k < nc; k++) {
            if (!strcmp(classes[k], p))
                pred[i] = k;
            if (!strcmp(classes[k], u->label))
                act[i] = k;
        }
        used[pred[i]] = used[act[i]] = 1;
        scored++;
    }
    m = 0;
    size_t *map = (size_t *)col_total; /* reused: old class index -> new */
    for (size_t k = 0; k < nc; k++) {
        map[k] = m;
        if (used[k])
            classes[m++] = classes[k];
    }
    for (size_t i = 0; i < c->n_units; i++)
        if (c->units[i].scored) {
            pred[i] = map[pred[i]];
            act[i] = map[act[i]];
        }
    nc = m;
    memset(col_total, 0, nc * sizeof *col_total);
    for (size_t i = 0; i < c->n_units; i++)
        if (c->units[i].scored)
            matrix[act[i] * nc + pred[i]]++;
    tt_class_scores macro;
    double accuracy;
    tt_classification_scores(matrix, nc, per, &macro, &accuracy);

    int blank = c->format != TT_FORMAT_JSONL;
    tt_table_writer w;
    /* 1. the confusion matrix, actual in rows */
    mcols[0] = "actual";
    for (size_t k = 0; k < nc; k++)
        mcols[k + 1] = classes[k];
    mcols[nc + 1] = "total";
    if (c->header && (st = tt_table_begin(&w, c->format, &c->buf, mcols, nc + 2, 1)))
        goto done;
    for (size_t a = 0; a <= nc && !st; a++) {
        st = tt_table_begin(&w, c->format, &c->buf, mcols, nc + 2, 0);
        if (!st) st = tt_table_cstr(&w, a < nc ? classes[a] : "total");
        uint64_t row = 0;
        for (size_t p = 0; p < nc && !st; p++) {
            uint64_t v = 0;
            if (a < nc)
                v = matrix[a * nc + p];
            else
                for (size_t k = 0; k < nc; k++)
                    v += matrix[k * nc + p];
            row += v;
            st = tt_table_u64(&w, v);
        }
        if (!st) st = tt_table_u64(&w, row);
        if (!st) st = tt_table_end_row(&w);
    }
    /* 2. scores per class */
    static const char *const scols[] = { "class", "precision", "recall", "f1", "support" };
    if (!st && blank) st = tt_buf_putc(&c->buf, '\n');
    if (!st && c->header) st = tt_table_begin(&w, c->format, &c->buf, scols, 5, 1);
    for (size_t k = 0; k <= nc && !st; k++) {
        const tt_class_scores *s = k < nc ? &per[k] : &macro;
        st = tt_table_begin(&w, c->format, &c->buf, scols, 5, 0);
        if (!st) st = tt_table_cstr(&w, k < nc ? classes[k] : "macro-average");
        if (!st) st = tt_table_fixed(&w, s->precision, 4);
        if (!st) st = tt_table_fixed(&w, s->recall, 4);
        if (!st) st = tt_table_fixed(&w, s->f1, 4);
        if (!st) st = tt_table_u64(&w, s->support);
        if (!st) st = tt_table_end_row(&w);
    }
    if (!st) {
        st = tt_table_begin(&w, c->format, &c->buf, scols, 5, 0);
        if (!st) st = tt_table_cstr(&w, "accuracy");
        if (!st) st = tt_table_fixed(&w, accuracy, 4);
        if (!st) st = tt_table_cstr(&w, "");
        if (!st) st = tt_table_cstr(&w, "");
        if (!st) st = tt_table_u64(&w, scored);
        if (!st) st = tt_table_end_row(&w);
    }
    /* 3. the misread units */
    static const char *const ucols[] = { "misread_document", "offset", "actual", "predicted",
                                         "net_tone", "line" };
    if (!st && blank) st = tt_buf_putc(&c->buf, '\n');
    if (!st && c->header) st = tt_table_begin(&w, c->format, &c->buf, ucols, 6, 1);
    for (size_t i = 0; i < c->n_units && !st; i++) {
        unit *u = &c->units[i];
        if (!u->scored || pred[i] == act[i])
            continue;
        st = tt_table_begin(&w, c->format, &c->buf, ucols, 6, 0);
        if (!st) st = tt_table_cstr(&w, u->document);
        if (!st) st = u->offset >= 0 ? tt_table_u64(&w, (uint64_t)u->offset)
                                     : tt_table_cstr(&w, "");
        if (!st) st = tt_table_cstr(&w, u->label);
        if (!st) st = tt_table_cstr(&w, classes[pred[i]]);
        if (!st) st = tt_table_fixed(&w, u->net, 4);
        if (!st) st = tt_table_u64(&w, (uint64_t)u->line);
        if (!st) st = tt_table_end_row(&w);
    }
    if (!c->pipe.quiet)
        fprintf(stderr, "%s tone: %zu labelled unit%s scored; predicted positive when net tone > "
                "T, negative when < -T, else neutral (T = %g); precision, recall or F1 with a "
                "zero denominator is 0\n", tt_prog, scored, scored == 1 ? "" : "s",
                c->threshold);
done:
    free(classes);
    free(pred);
    free(act);
    free(matrix);
    free(used);
    free(per);
    free(col_total);
    free(mcols);
    return st;
}

static void check_lexicon(const tt_lexicon *lex, const char *path)
{
    size_t pairs[256][2];
    size_t n = tt_lexicon_conflicts(lex, pairs, 256);
    const char *name = path ? path : "finance";
    for (size_t i = 0; i < n && i < 256; i++) {
        const tt_lexicon_entry *a = tt_lexicon_entry_at(lex, pairs[i][0]);
        const tt_lexicon_entry *b = tt_lexicon_entry_at(lex, pairs[i][1]);
        printf("%s: \"%s\" is %s (line %ld) and %s (line %ld)\n", name, a->term,
               tt_lexicon_category_name(lex, a->category), a->line,
               tt_lexicon_category_name(lex, b->category), b->line);
    }
    printf("%s: %zu entries, %zu categories, %zu terms under more than one category\n", name,
           tt_lexicon_entry_count(lex), tt_lexicon_category_count(lex), n);
}

int tt_cmd_tone(int argc, char **argv)
{
    tone_ctx c;
    memset(&c, 0, sizeof c);
    cli_pipeline_init(&c.pipe);
    c.format = TT_FORMAT_TSV;
    c.header = 1;
    c.top = 10;
    tt_buf_init(&c.buf, 0);
    tt_error_init(&c.err);
    const char *lexicon_path = NULL, *output = NULL, *labels_path = NULL, *by = NULL;
    char *negator_list = NULL;
    cli_tone setup;
    memset(&setup, 0, sizeof setup);
    uint64_t window = 3, top = 10;
    int check = 0, opt, rc = TT_EXIT_TROUBLE, out_open = 0, headers = 0, speakers = 0;
    int contributors = 0, sentences = 0;
    const char *manifest_path = NULL, *layout = NULL;
    tt_period_granularity header_period = TT_PERIOD_QUARTER;
    tt_series_options sopt;
    tt_series_options_init(&sopt);
    tt_manifest m;
    tt_manifest_init(&m);
    tt_series series;
    tt_series_init(&series);
    tt_lexicon *lex = NULL;
    tt_source_list inputs;
    tt_source_list_init(&inputs);
    char msg[TT_ERROR_FILE_MAX + TT_ERROR_MSG_MAX + 64];

    optind = 1;
    while ((opt = getopt_long(argc, argv, "f:o:j:qh", longopts, NULL)) != -1) {
        int handled = cli_pipeline_option(&c.pipe, opt, optarg);
        if (handled < 0)
            goto out;
        if (handled)
            continue;
        switch (opt) {
        case OPT_LEXICON: lexicon_path = optarg; break;
        case OPT_CHECK: check = 1; break;
        case OPT_WINDOW:
            if (!cli_parse_u64("--window", optarg, 0, 100, &window))
                goto out;
            break;
        case OPT_NEGATORS: negator_list = optarg; break;
        case OPT_TOTAL: c.total = 1; break;
        case OPT_MANIFEST: manifest_path = optarg; break;
        case OPT_LAYOUT: layout = optarg; break;
        case OPT_HEADERS: headers = 1; break;
        case OPT_HEADER_PERIOD:
            if (!cli_header_period(optarg, &header_period))
                goto out;
            break;
        case OPT_ENTITY: sopt.entity = optarg; break;
        case OPT_KINDS: sopt.kinds = optarg; break;
        case OPT_CONSECUTIVE: c.consecutive = 1; break;
        case OPT_BY: by = optarg; break;
        case OPT_SPEAKERS: speakers = 1; break;
        case OPT_CONTRIBUTORS: contributors = 1; break;
        case OPT_TOP:
            if (!cli_parse_u64("--top", optarg, 1, 100000, &top))
                goto out;
            break;
        case OPT_SENTENCES: sentences = 1; break;
        case OPT_LABELS: labels_path = optarg; break;
        case OPT_THRESHOLD: {
            char *end = NULL;
            errno = 0;
            c.threshold = strtod(optarg, &end);
            if (errno || end == optarg || *end || !(c.threshold >= 0 && c.threshold < 1)) {
                cli_error("--threshold: expected a number from 0 to below 1, got '%s'", optarg);
                goto out;
            }
            break;
        }
        case 'f':
            if (!cli_parse_format(optarg, &c.format))
                goto out;
            break;
        case 'o': output = optarg; break;
        case OPT_NO_HEADER: c.header = 0; break;
        case 'h': fputs(tt_help_tone, stdout); rc = TT_EXIT_OK; goto out;
        default: fprintf(stderr, "Try 'termtide help tone'.\n"); goto out;
        }
    }
    c.top = (size_t)top;
    int metadata = manifest_path || layout || headers;
    if ((manifest_path != NULL) + (layout != NULL) + headers > 1) {
        cli_error("give one of --manifest, --layout and --headers");
        goto out;
    }
    if ((c.consecutive || sopt.entity || sopt.kinds) && !metadata) {
        cli_error("--consecutive, --entity and --kinds need document metadata: --manifest FILE, "
                  "--layout PATTERN ROOT or --headers ROOT");
        goto out;
    }
    if (manifest_path && optind < argc) {
        cli_error("unexpected argument '%s' (with --manifest the documents are its rows)",
                  argv[optind]);
        goto out;
    }
    if (speakers + contributors + sentences + (labels_path != NULL) > 1) {
        cli_error("give at most one of --speakers, --contributors, --sentences and --labels");
        goto out;
    }
    c.view = speakers ? VIEW_SPEAKERS : contributors ? VIEW_CONTRIBUTORS
             : sentences ? VIEW_SENTENCES : labels_path ? VIEW_LABELS : VIEW_SCORES;
    if (c.view == VIEW_CONTRIBUTORS && c.consecutive) {
        cli_error("--contributors and --consecutive do not go together");
        goto out;
    }
    if ((c.view == VIEW_SPEAKERS || c.view == VIEW_SENTENCES || c.view == VIEW_LABELS) &&
        (metadata || by || c.total)) {
        cli_error("--%s takes neither document metadata, --by nor --total",
                  speakers ? "speakers" : sentences ? "sentences" : "labels");
        goto out;
    }
    if (c.view == VIEW_LABELS && optind < argc) {
        cli_error("unexpected argument '%s' (with --labels the documents are the file's)",
                  argv[optind]);
        goto out;
    }
    if (by) {
        if (!strcmp(by, "part"))
            c.by_part = 1;
        else if (!strcmp(by, "role"))
            c.by_role = 1;
        else if (!strcmp(by, "part,role") || !strcmp(by, "role,part"))
            c.by_part = c.by_role = 1;
        else {
            cli_error("--by: expected part, role or part,role, got '%s'", by);
            goto out;
        }
    }
    c.nkeys = c.by_part && c.by_role ? TT_TURN_PARTS * TT_TURN_ROLES
              : c.by_part ? TT_TURN_PARTS : c.by_role ? TT_TURN_ROLES : 1;

    if (!cli_pipeline_sections(&c.pipe))
        goto out;
    if (!cli_tone_setup(&setup, lexicon_path, window, negator_list))
        goto out;
    lex = setup.lex;
    if (check) {
        check_lexicon(lex, lexicon_path);
        rc = TT_EXIT_OK;
        goto out;
    }
    c.topt = setup.opt;
    c.lex = lex;
    if (c.pipe.db) {
        /* scores made at indexing time (index --tone) with this set-up */
        tt_error e;
        tt_error_init(&e);
        if (c.view == VIEW_SPEAKERS || c.view == VIEW_SENTENCES || c.view == VIEW_LABELS || by ||
            c.pipe.n_sections) {
            cli_error("--db holds whole-document scores: --by, --section, --speakers, "
                      "--sentences and --labels read the files");
            goto out;
        }
        if (tt_index_open(c.pipe.db, TT_INDEX_READ, &c.pipe.index, &e) ||
            tt_index_analysis(c.pipe.index, setup.desc, &e)) {
            cli_error("%s", tt_error_format(&e, msg, sizeof msg));
            goto out;
        }
        c.pipe.batch.index = c.pipe.index;
    }
    c.ncat = tt_lexicon_category_count(lex);
    c.pos = tt_lexicon_category_find(lex, "positive", NULL);
    c.neg = tt_lexicon_category_find(lex, "negative", NULL);
    if (c.view == VIEW_LABELS && (c.pos < 0 || c.neg < 0)) {
        cli_error("--labels needs a lexicon with categories named positive and negative");
        goto out;
    }
    if (!(c.doc = scores_new(&c, c.nkeys)) || !(c.all = scores_new(&c, c.nkeys)) ||
        !(c.grp = scores_new(&c, c.nkeys)) || !(c.prev = scores_new(&c, c.nkeys)) ||
        !set_columns(&c, metadata))
        goto oom;

    if (metadata) {
        tt_error err;
        tt_error_init(&err);
        size_t meta_problems = 0;
        if (manifest_path ? !cli_load_manifest(&m, manifest_path)
            : headers ? !cli_load_headers(&m, header_period, argc - optind, argv + optind,
                                          &meta_problems)
                      : !cli_load_layout(&m, layout, argc - optind, argv + optind))
            goto out;
        if (tt_series_build(&series, m.docs, m.n, &sopt, &err)) {
            cli_error("%s (choose document kinds with --kinds)", err.message);
            goto out;
        }
        c.grouping = 1;
        c.series = &series;
        for (size_t g = 0; g < series.n_groups; g++)
            for (size_t d = 0; d < series.groups[g].n_docs; d++) {
                size_t before = inputs.n;
                if (tt_source_expand(&inputs, m.docs[series.members[series.groups[g].first + d]]
                                                  .path) == TT_ENOMEM)
                    goto oom;
                size_t *ig = realloc(c.input_group, inputs.n * sizeof *ig);
                if (!ig && inputs.n)
                    goto oom;
                c.input_group = ig;
                for (size_t i = before; i < inputs.n; i++)
                    ig[i] = g;
            }
    } else if (c.view == VIEW_LABELS) {
        if (!load_labels(&c, labels_path, &inputs))
            goto out;
    } else if (!cli_expand_inputs(&inputs, argc - optind, argv + optind)) {
        goto out;
    }
    if (tt_outfile_open(&c.out, output, &c.err)) {
        cli_error("%s", tt_error_format(&c.err, msg, sizeof msg));
        goto out;
    }
    out_open = 1;
    if (c.view != VIEW_LABELS && c.header) {
        tt_table_writer w;
        if (tt_table_begin(&w, c.format, &c.buf, c.cols, c.ncols, 1))
            goto oom;
    }
    cli_pipeline_hooks(&c.pipe);
    c.pipe.batch.analyse = analyse;
    c.pipe.batch.worker_new = worker_new;
    c.pipe.batch.worker_free = worker_free;
    c.pipe.batch.on_document = on_document;
    c.pipe.batch.ctx = &c;
    tt_batch_summary sum;
    tt_error err;
    tt_error_init(&err);
    tt_status st = tt_batch_run(&inputs, &c.pipe.batch, &sum, &err);
    if (!st && c.grouping)
        st = flush_groups(&c, series.n_groups);
    if (!st && c.total && !metadata && c.view != VIEW_LABELS && c.view != VIEW_SENTENCES &&
        c.view != VIEW_SPEAKERS)
        st = rows_for(&c, "*", NULL, c.all);
    if (!st && c.view == VIEW_LABELS) {
        for (size_t i = 0; i < c.n_units; i++)
            if (!c.units[i].scored) {
                cli_error("%s: line %ld: %s %s was not scored (%s)", labels_path,
                          c.units[i].line, c.units[i].document,
                          c.units[i].offset >= 0 ? "sentence" : "document",
                          c.units[i].offset >= 0 ? "no sentence starts at that offset, or the "
                                                   "document could not be read"
                                                 : "it could not be read");
                c.unit_problems++;
            }
        st = labels_report(&c);
    }
    if (st) {
        if (c.err.status)
            cli_error("%s", tt_error_format(&c.err, msg, sizeof msg));
        else if (err.status)
            cli_error("%s", tt_error_format(&err, msg, sizeof msg));
        else
            cli_error("%s", tt_status_name(st));
        goto out;
    }
    if (cli_flush(&c.out, &c.buf, &c.err, 1) || tt_outfile_commit(&c.out, &c.err)) {
        cli_error("%s", tt_error_format(&c.err, msg, sizeof msg));
        goto out;
    }
    out_open = 0;
    {
        char extra[600];
        snprintf(extra, sizeof extra, "lexicon %s %s", tt_lexicon_name(lex),
                 tt_lexicon_version(lex));
        cli_reading_summary(&c.pipe, "tone", &sum, extra);
    }
    rc = sum.skipped || c.unit_problems ? TT_EXIT_TROUBLE : TT_EXIT_OK;
    goto out;
oom:
    cli_error("out of memory");
out:
    if (out_open)
        tt_outfile_abort(&c.out);
    for (size_t i = 0; i < c.n_owned; i++)
        free(c.owned[i]);
    free(c.owned);
    free(c.cols);
    for (size_t i = 0; i < c.n_units; i++) {
        free(c.units[i].document);
        free(c.units[i].label);
    }
    free(c.units);
    free(c.input_group);
    scores_free(c.doc, c.nkeys);
    scores_free(c.all, c.nkeys);
    scores_free(c.grp, c.nkeys);
    scores_free(c.prev, c.nkeys);
    tt_series_release(&series);
    tt_manifest_release(&m);
    cli_tone_release(&setup);
    tt_source_list_release(&inputs);
    tt_buf_release(&c.buf);
    cli_pipeline_release(&c.pipe);
    return rc;
}
