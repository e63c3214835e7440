/* termtide changes — which sentences stayed, were reworded, are new or went
 * between two documents, or between consecutive periods of each entity. */
#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "termtide/alloc.h"
#include "termtide/changes.h"
#include "termtide/document.h"
#include "termtide/meta.h"
#include "termtide/sections.h"
#include "cli.h"

const char tt_help_changes[] =
    "Usage: termtide changes [OPTIONS] --base PATH... --target PATH...\n"
    "       termtide changes [OPTIONS] --manifest FILE --consecutive\n"
    "\n"
    "Splits each side into sentences (paragraphs and list items; headings and tables\n"
    "are left out) and aligns them: unchanged (the same words in the same order),\n"
    "modified (the most similar sentence left on the other side, Jaccard similarity\n"
    "of their word sets at least --threshold), added, removed. Candidates for a\n"
    "modified sentence are found through shared word pairs, never by comparing all\n"
    "pairs. One row per pair of sides:\n"
    "  entity base target base_sentences target_sentences unchanged modified added\n"
    "  removed new_word_share cosine jaccard edit_similarity\n"
    "new_word_share: the target's words in added sentences, or added to a modified\n"
    "one, over its words; cosine and jaccard: of the two sides' word counts and word\n"
    "sets; edit_similarity: 1 - (Levenshtein distance between the two sequences of\n"
    "sentences, an aligned pair counting as equal) / the longer side.\n"
    "\n"
    "Options:\n"
    "  --base PATH, --target PATH   the two sides (repeatable; several documents of a\n"
    "                        side are read in order as one)\n"
    "  --manifest FILE, --layout PATTERN ROOT..., --headers ROOT...  with --consecutive:\n"
    "                        each entity's consecutive periods (as for compare)\n"
    "  --entity NAME, --kinds LIST   which documents form each series\n"
    "  --show summary|sentences    sentences: one row per sentence: entity base target\n"
    "                        change similarity section base_document base_offset\n"
    "                        target_document target_offset text words_added\n"
    "                        words_removed (text: the target's sentence, or the base's\n"
    "                        for a removed one; offsets in the files; section: the\n"
    "                        sentence's section, rows grouped by section)\n"
    "  --threshold T         the least similarity of a modified sentence (default 0.5)\n"
    "  --section NAME        compare only this section of each document (repeatable),\n"
    "                        e.g. --section risk-factors; --section-rules FILE\n"
    "  -f, --format tsv|csv|jsonl   -o, --output FILE   --no-header\n"
    "  --tables keep|drop   --doc-types LIST   -q, --quiet   (as for count)\n"
    "\n"
    "termtide measures language; it gives no investment, legal or compliance advice.\n";

enum { OPT_BASE = CLI_OPT_FIRST_FREE, OPT_TARGET, OPT_MANIFEST, OPT_LAYOUT, OPT_HEADERS,
       OPT_HEADER_PERIOD, OPT_ENTITY, OPT_KINDS, OPT_CONSECUTIVE, OPT_SHOW, OPT_THRESHOLD,
       OPT_NO_HEADER };

static const struct option longopts[] = {
    { "base", required_argument, NULL, OPT_BASE },
    { "target", required_argument, NULL, OPT_TARGET },
    { "manifest", required_argument, NULL, OPT_MANIFEST },
    { "layout", required_argument, NULL, OPT_LAYOUT },
    { "headers", no_argument, NULL, OPT_HEADERS },
    { "header-period", required_argument, NULL, OPT_HEADER_PERIOD },
    { "entity", required_argument, NULL, OPT_ENTITY },
    { "kinds", required_argument, NULL, OPT_KINDS },
    { "consecutive", no_argument, NULL, OPT_CONSECUTIVE },
    { "show", required_argument, NULL, OPT_SHOW },
    { "threshold", required_argument, NULL, OPT_THRESHOLD },
    { "format", required_argument, NULL, 'f' },
    { "output", required_argument, NULL, 'o' },
    { "no-header", no_argument, NULL, OPT_NO_HEADER },
    { "help", no_argument, NULL, 'h' },
    { "tables", required_argument, NULL, CLI_OPT_TABLES },
    { "doc-types", required_argument, NULL, CLI_OPT_DOC_TYPES },
    { "section", required_argument, NULL, CLI_OPT_SECTION },
    { "section-rules", required_argument, NULL, CLI_OPT_SECTION_RULES },
    { "quiet", no_argument, NULL, 'q' },
    { NULL, 0, NULL, 0 }
};

static const char *const summary_cols[] = {
    "entity", "base", "target", "base_sentences", "target_sentences", "unchanged", "modified",
    "added", "removed", "new_word_share", "cosine", "jaccard", "edit_similarity" };
static const char *const sentence_cols[] = {
    "entity", "base", "target", "change", "similarity", "section", "base_document",
    "base_offset", "target_document", "target_offset", "text", "words_added", "words_removed" };

typedef struct changes_ctx {
    cli_pipeline pipe;
    tt_format format;
    int sentences, header;
    double threshold;
    tt_buf buf;
    tt_outfile out;
    tt_error err;
    tt_reader *reader;
    tt_sentence_list *list; /* filled by the reader callback */
    tt_sections secs;
    size_t documents, problems;
} changes_ctx;

static tt_status on_doc(void *vctx, const tt_document *doc)
{
    changes_ctx *c = vctx;
    const tt_read_options *ro = &c->pipe.batch.read;
    /* each sentence is labelled with its section, found on the whole
       document before --section cuts it (block offsets stay as they were) */
    tt_status st = tt_sections_find(doc->blocks, ro->section_rules, &c->secs);
    if (st)
        return st;
    tt_text_range *ranges = tt_reallocarray(NULL, c->secs.n + 1, sizeof *ranges);
    if (!ranges)
        return TT_ENOMEM;
    size_t nr = 0;
    for (size_t i = 0; i < c->secs.n; i++) {
        const tt_section *sec = &c->secs.items[i];
        if (sec->end <= sec->first || sec->end > doc->blocks->n)
            continue;
        const tt_block *last = &doc->blocks->items[sec->end - 1];
        ranges[nr].start = doc->blocks->items[sec->first].off;
        ranges[nr].end = last->off + last->len + 1;
        ranges[nr].name = sec->name;
        nr++;
    }
    if (ro->n_sections) {
        size_t kept = 0;
        st = tt_blocks_keep_sections(doc->blocks, &c->secs, ro->sections, ro->n_sections, &kept);
        if (!st && !kept) {
            cli_error("%s: no section %s%s found (skipped)", doc->name, ro->sections[0],
                      ro->n_sections > 1 ? " or the others" : "");
            c->problems++;
            tt_free(ranges);
            return TT_OK;
        }
    }
    if (!st) {
        c->documents++;
        st = tt_sentence_list_add(c->list, doc->blocks, doc->raw, doc->raw_len, doc->raw_off,
                                  doc->kind == TT_KIND_HTML, doc->name);
    }
    if (!st)
        st = tt_sentence_list_label(c->list, ranges, nr);
    tt_free(ranges);
    return st;
}

/* Reads the files of one side into list. Returns 0 on a fatal error. */
static int read_side(changes_ctx *c, tt_sentence_list *list, char *const *paths, size_t n)
{
    c->list = list;
    for (size_t i = 0; i < n; i++) {
        tt_source_list in;
        tt_source_list_init(&in);
        if (tt_source_expand(&in, paths[i])) {
            tt_source_list_release(&in);
            cli_error("out of memory");
            return 0;
        }
        for (size_t k = 0; k < in.n; k++) {
            char msg[TT_ERROR_FILE_MAX + TT_ERROR_MSG_MAX + 64];
            if (in.items[k].status != TT_OK) {
                cli_error("%s: %s (skipped)", in.items[k].path,
                          in.items[k].message ? in.items[k].message : "cannot be read");
                c->problems++;
                continue;
            }
            tt_error err;
            tt_error_init(&err);
            tt_status st = tt_reader_read(c->reader, in.items[k].path, &c->pipe.batch.read,
                                          on_doc, c, NULL, &err);
            if (st == TT_ENOMEM) {
                cli_error("out of memory");
                tt_source_list_release(&in);
                return 0;
            }
            if (st) {
                cli_error("%s (skipped)", tt_error_format(&err, msg, sizeof msg));
                c->problems++;
            }
        }
        tt_source_list_release(&in);
    }
    return 1;
}

static tt_status write_pair(changes_ctx *c, const char *entity, const char *base,
                            const char *target, const tt_sentence_list *a,
                            const tt_sentence_list *b)
{
    tt_alignment al;
    tt_alignment_init(&al);
    tt_status st = tt_align_sentences(a, b, c->threshold, &al);
    if (st)
        return st;
    tt_table_writer w;
    if (!c->sentences) {
        double cosine, jaccard;
        tt_sentence_lists_similarity(a, b, &cosine, &jaccard);
        st = tt_table_begin(&w, c->format, &c->buf, summary_cols, 13, 0);
        if (!st) st = tt_table_cstr(&w, entity);
        if (!st) st = tt_table_cstr(&w, base);
        if (!st) st = tt_table_cstr(&w, target);
        if (!st) st = tt_table_u64(&w, tt_sentence_list_count(a));
        if (!st) st = tt_table_u64(&w, tt_sentence_list_count(b));
        if (!st) st = tt_table_u64(&w, al.unchanged);
        if (!st) st = tt_table_u64(&w, al.modified);
        if (!st) st = tt_table_u64(&w, al.added);
        if (!st) st = tt_table_u64(&w, al.removed);
        if (!st) st = tt_table_fixed(&w, al.target_words ? (double)al.new_words /
                                                               (double)al.target_words : NAN, 4);
        if (!st) st = tt_table_fixed(&w, cosine, 4);
        if (!st) st = tt_table_fixed(&w, jaccard, 4);
        if (!st) st = tt_table_fixed(&w, al.edit_similarity, 4);
        if (!st) st = tt_table_end_row(&w);
    }
    /* grouped by section: the sections in the order the rows first meet
       them (the target's sentences come first, then the removed ones), and
       within one section the rows in their order */
    size_t *order = NULL;
    if (c->sentences && al.n) {
        order = tt_reallocarray(NULL, al.n, sizeof *order);
        const char **names = tt_reallocarray(NULL, al.n, sizeof *names);
        size_t *rank = tt_reallocarray(NULL, al.n, sizeof *rank);
        if (!order || !names || !rank) {
            tt_free(order);
            tt_free(names);
            tt_free(rank);
            tt_alignment_release(&al);
            return TT_ENOMEM;
        }
        size_t nn = 0, at = 0;
        for (size_t k = 0; k < al.n; k++) {
            const tt_sentence_change *ch = &al.v[k];
            const char *sec = ch->target != SIZE_MAX
                                  ? tt_sentence_section(b, tt_sentence_at(b, ch->target))
                                  : tt_sentence_section(a, tt_sentence_at(a, ch->base));
            size_t r = 0;
            while (r < nn && strcmp(names[r], sec))
                r++;
            if (r == nn)
                names[nn++] = sec;
            rank[k] = r;
        }
        for (size_t r = 0; r < nn; r++)
            for (size_t k = 0; k < al.n; k++)
                if (rank[k] == r)
                    order[at++] = k;
        tt_free(names);
        tt_free(rank);
    }
    for (size_t i = 0; c->sentences && i < al.n && !st; i++) {
        const tt_sentence_change *ch = &al.v[order[i]];
        const tt_sentence *sb = ch->base != SIZE_MAX ? tt_sentence_at(a, ch->base) : NULL;
        const tt_sentence *st_ = ch->target != SIZE_MAX ? tt_sentence_at(b, ch->target) : NULL;
        char *added = NULL, *removed = NULL;
        if (ch->kind == TT_CHANGE_MODIFIED &&
            (tt_sentence_words_missing(b, st_, a, sb, &added) ||
             tt_sentence_words_missing(a, sb, b, st_, &removed))) {
            tt_free(added);
            return TT_ENOMEM;
        }
        st = tt_table_begin(&w, c->format, &c->buf, sentence_cols, 13, 0);
        if (!st) st = tt_table_cstr(&w, entity);
        if (!st) st = tt_table_cstr(&w, base);
        if (!st) st = tt_table_cstr(&w, target);
        if (!st) st = tt_table_cstr(&w, tt_change_kind_name(ch->kind));
        if (!st) st = tt_table_fixed(&w, ch->similarity, 4);
        if (!st) st = tt_table_cstr(&w, st_ ? tt_sentence_section(b, st_)
                                            : tt_sentence_section(a, sb));
        if (!st) st = tt_table_cstr(&w, sb ? tt_sentence_doc(a, sb) : "");
        if (!st) st = sb && sb->offset >= 0 ? tt_table_u64(&w, (uint64_t)sb->offset)
                                            : tt_table_cstr(&w, "");
        if (!st) st = tt_table_cstr(&w, st_ ? tt_sentence_doc(b, st_) : "");
        if (!st) st = st_ && st_->offset >= 0 ? tt_table_u64(&w, (uint64_t)st_->offset)
                                              : tt_table_cstr(&w, "");
        if (!st) st = tt_table_cstr(&w, st_ ? tt_sentence_text(b, st_) : tt_sentence_text(a, sb));
        if (!st) st = tt_table_cstr(&w, added ? added : "");
        if (!st) st = tt_table_cstr(&w, removed ? removed : "");
        if (!st) st = tt_table_end_row(&w);
        tt_free(added);
        tt_free(removed);
        if (!st)
            st = cli_flush(&c->out, &c->buf, &c->err, 0);
    }
    tt_free(order);
    tt_alignment_release(&al);
    return st ? st : cli_flush(&c->out, &c->buf, &c->err, 0);
}

int tt_cmd_changes(int argc, char **argv)
{
    changes_ctx c;
    memset(&c, 0, sizeof c);
    cli_pipeline_init(&c.pipe);
    c.format = TT_FORMAT_TSV;
    c.header = 1;
    c.threshold = 0.5;
    tt_buf_init(&c.buf, 0);
    tt_error_init(&c.err);
    tt_sections_init(&c.secs);
    int opt, rc = TT_EXIT_TROUBLE, consecutive = 0, headers = 0, out_open = 0;
    const char *output = NULL, *manifest_path = NULL, *layout = NULL;
    char **base = NULL, **target = NULL;
    size_t nbase = 0, ntarget = 0;
    tt_period_granularity header_period = TT_PERIOD_QUARTER;
    tt_series_options sopt;
    tt_series_options_init(&sopt);
    tt_manifest m;
    tt_manifest_init(&m);
    tt_series series;
    tt_series_init(&series);
    tt_sentence_list *first = NULL, *prev = NULL, *cur = NULL;
    char msg[TT_ERROR_FILE_MAX + TT_ERROR_MSG_MAX + 64];
    optind = 1;
    while ((opt = getopt_long(argc, argv, "f:o:qh", longopts, NULL)) != -1) {
        int handled = cli_pipeline_option(&c.pipe, opt, optarg);
        if (handled < 0)
            goto out;
        if (handled)
            continue;
        switch (opt) {
        case OPT_BASE:
        case OPT_TARGET: {
            char ***l = opt == OPT_BASE ? &base : &target;
            size_t *n = opt == OPT_BASE ? &nbase : &ntarget;
            char **x = realloc(*l, (*n + 1) * sizeof *x);
            if (!x)
                goto oom;
            *l = x;
            x[(*n)++] = optarg;
            break;
        }
        case OPT_MANIFEST: manifest_path = optarg; break;
        case OPT_LAYOUT: layout = optarg; break;
        case OPT_HEADERS: headers = 1; break;
        case OPT_HEADER_PERIOD:
            if (!cli_header_period(optarg, &header_period))
                goto out;
            break;
        case OPT_ENTITY: sopt.entity = optarg; break;
        case OPT_KINDS: sopt.kinds = optarg; break;
        case OPT_CONSECUTIVE: consecutive = 1; break;
        case OPT_SHOW:
            if (!strcmp(optarg, "summary"))
                c.sentences = 0;
            else if (!strcmp(optarg, "sentences"))
                c.sentences = 1;
            else {
                cli_error("--show: expected summary or sentences, got '%s'", optarg);
                goto out;
            }
            break;
        case OPT_THRESHOLD: {
            char *end = NULL;
            c.threshold = strtod(optarg, &end);
            if (end == optarg || *end || !(c.threshold > 0 && c.threshold <= 1)) {
                cli_error("--threshold: expected a number above 0 and at most 1, got '%s'",
                          optarg);
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
        case 'h': fputs(tt_help_changes, stdout); rc = TT_EXIT_OK; goto out;
        default: fprintf(stderr, "Try 'termtide help changes'.\n"); goto out;
        }
    }
    int metadata = manifest_path || layout || headers;
    if (metadata ? (!consecutive || nbase || ntarget) : (!nbase || !ntarget || consecutive)) {
        cli_error("give --base PATH and --target PATH, or document metadata (--manifest, "
                  "--layout or --headers) with --consecutive");
        goto out;
    }
    if (!cli_pipeline_sections(&c.pipe))
        goto out;
    if (!(c.reader = tt_reader_new()) || !(first = tt_sentence_list_new()))
        goto oom;
    if (tt_outfile_open(&c.out, output, &c.err)) {
        cli_error("%s", tt_error_format(&c.err, msg, sizeof msg));
        goto out;
    }
    out_open = 1;
    tt_table_writer w;
    if (c.header && (c.sentences ? tt_table_begin(&w, c.format, &c.buf, sentence_cols, 13, 1)
                                 : tt_table_begin(&w, c.format, &c.buf, summary_cols, 13, 1)))
        goto oom;
    tt_status st = TT_OK;
    if (!metadata) {
        if (!(cur = tt_sentence_list_new_sharing(first)))
            goto oom;
        if (!read_side(&c, first, base, nbase) || !read_side(&c, cur, target, ntarget))
            goto out;
        st = write_pair(&c, "", "base", "target", first, cur);
    } else {
        tt_error err;
        tt_error_init(&err);
        size_t skipped = 0;
        if (manifest_path ? !cli_load_manifest(&m, manifest_path)
            : headers ? !cli_load_headers(&m, header_period, argc - optind, argv + optind,
                                          &skipped)
                      : !cli_load_layout(&m, layout, argc - optind, argv + optind))
            goto out;
        c.problems += skipped;
        if (tt_series_build(&series, m.docs, m.n, &sopt, &err)) {
            cli_error("%s (choose document kinds with --kinds)", err.message);
            goto out;
        }
        if (!(prev = tt_sentence_list_new_sharing(first)) ||
            !(cur = tt_sentence_list_new_sharing(first)))
            goto oom;
        for (size_t g = 0; g < series.n_groups && !st; g++) {
            const tt_series_group *grp = &series.groups[g];
            tt_sentence_list_reset(cur);
            for (size_t d = 0; d < grp->n_docs; d++) {
                char *path = (char *)m.docs[series.members[grp->first + d]].path;
                if (!read_side(&c, cur, &path, 1))
                    goto out;
            }
            if (g > 0 && !strcmp(series.groups[g - 1].entity, grp->entity)) {
                char bp[TT_PERIOD_TEXT_MAX], tp[TT_PERIOD_TEXT_MAX];
                tt_period_format(&series.groups[g - 1].period, bp, sizeof bp);
                tt_period_format(&grp->period, tp, sizeof tp);
                st = write_pair(&c, grp->entity, bp, tp, prev, cur);
            }
            tt_sentence_list *t = prev;
            prev = cur;
            cur = t;
        }
    }
    if (!st)
        st = cli_flush(&c.out, &c.buf, &c.err, 1);
    if (!st)
        st = tt_outfile_commit(&c.out, &c.err);
    if (st) {
        cli_error("%s", c.err.status ? tt_error_format(&c.err, msg, sizeof msg)
                                     : tt_status_name(st));
        goto out;
    }
    out_open = 0;
    if (!c.pipe.quiet)
        fprintf(stderr, "%s changes: %zu documents read, %zu skipped, in %.2f s\n", tt_prog,
                c.documents, c.problems, cli_now() - c.pipe.started);
    rc = c.problems ? TT_EXIT_TROUBLE : TT_EXIT_OK;
    goto out;
oom:
    cli_error("out of memory");
out:
    if (out_open)
        tt_outfile_abort(&c.out);
    tt_sentence_list_free(first);
    tt_sentence_list_free(prev);
    tt_sentence_list_free(cur);
    tt_sections_release(&c.secs);
    tt_reader_free(c.reader);
    tt_series_release(&series);
    tt_manifest_release(&m);
    free(base);
    free(target);
    tt_buf_release(&c.buf);
    cli_pipeline_release(&c.pipe);
    return rc;
}
