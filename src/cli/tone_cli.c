/* termtide CLI — tone set-up shared by `tone` and `index --tone`: the
 * lexicon (shipped or a file), the negation options, a description of the
 * whole set-up for an index to record, and the per-thread scorer that packs
 * a document's scores. */
#include <stdlib.h>
#include <string.h>

#include "termtide/sha256.h"
#include "tone_cli.h"

static int parse_negators(char *list, const char ***out, size_t *n)
{
    for (char *p = list; *p;) {
        char *comma = strchr(p, ',');
        size_t len = comma ? (size_t)(comma - p) : strlen(p);
        const char **l = realloc(*out, (*n + 1) * sizeof *l);
        if (!l)
            return 0;
        *out = l;
        if (comma)
            *comma = '\0';
        l[(*n)++] = p;
        p += len + (comma ? 1 : 0);
    }
    return 1;
}

int cli_tone_setup(cli_tone *t, const char *lexicon_path, uint64_t window, char *negator_list)
{
    memset(t, 0, sizeof *t);
    tt_error err;
    char msg[TT_ERROR_FILE_MAX + TT_ERROR_MSG_MAX + 64];
    char sha[65];
    tt_error_init(&err);
    if (!(t->lex = tt_lexicon_new())) {
        cli_error("out of memory");
        return 0;
    }
    if (lexicon_path) {
        if (tt_lexicon_load_file(t->lex, lexicon_path, &err) ||
            tt_sha256_file(lexicon_path, sha, &err)) {
            cli_error("%s", tt_error_format(&err, msg, sizeof msg));
            return 0;
        }
    } else {
        const char *text = tt_builtin_lexicon("finance");
        if (!text || tt_lexicon_load_text(t->lex, text, strlen(text), "finance", &err)) {
            cli_error("built-in lexicon: %s", tt_error_format(&err, msg, sizeof msg));
            return 0;
        }
        tt_sha256_hex(text, strlen(text), sha);
    }
    tt_tone_options_init(&t->opt, t->lex);
    t->opt.window = (size_t)window;
    if (window == 0)
        t->opt.positive = t->opt.negative = -1;
    if (negator_list) {
        if (!parse_negators(negator_list, &t->negators, &t->n_negators)) {
            cli_error("out of memory");
            return 0;
        }
        t->opt.negators = t->negators;
        t->opt.n_negators = t->n_negators;
    }
    /* what an index records: the lexicon by name, version and the SHA-256
     * of its text, and the negation rule */
    tt_buf d;
    tt_buf_init(&d, 0);
    char head[512];
    snprintf(head, sizeof head, "tone lexicon=%s version=%s sha256=%.16s window=%llu negators=",
             tt_lexicon_name(t->lex), tt_lexicon_version(t->lex), sha,
             (unsigned long long)window);
    int bad = tt_buf_append(&d, head, strlen(head)) != TT_OK;
    if (!t->n_negators)
        bad |= tt_buf_append(&d, "default", 7) != TT_OK;
    for (size_t i = 0; i < t->n_negators; i++)
        bad |= (i && tt_buf_putc(&d, ',')) || tt_buf_append(&d, t->negators[i],
                                                             strlen(t->negators[i]));
    bad |= tt_buf_putc(&d, '\0') != TT_OK;
    if (bad || !(t->desc = strdup(d.data))) {
        tt_buf_release(&d);
        cli_error("out of memory");
        return 0;
    }
    tt_buf_release(&d);
    return 1;
}

void cli_tone_release(cli_tone *t)
{
    tt_lexicon_free(t->lex);
    free(t->negators);
    free(t->desc);
    memset(t, 0, sizeof *t);
}

typedef struct scorer {
    tt_tone *tone;
    tt_tone_scores s;
} scorer;

void *cli_tone_scorer_new(const cli_tone *t)
{
    scorer *w = calloc(1, sizeof *w);
    if (!w)
        return NULL;
    if (!(w->tone = tt_tone_new(&t->opt)) || tt_tone_scores_init(&w->s, t->lex)) {
        tt_tone_free(w->tone);
        free(w);
        return NULL;
    }
    return w;
}

void cli_tone_scorer_free(void *state)
{
    scorer *w = state;
    tt_tone_free(w->tone);
    tt_tone_scores_release(&w->s);
    free(w);
}

tt_status cli_tone_score(void *state, const tt_document *doc, tt_buf *out, tt_doc_stats *stats)
{
    scorer *w = state;
    tt_tone_scores_reset(&w->s);
    tt_status st = tt_tone_score_blocks(w->tone, doc->blocks, &w->s);
    if (!st) {
        stats->words_read = w->s.words;
        st = tt_tone_scores_pack(&w->s, out);
    }
    return st;
}
