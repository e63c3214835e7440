/* termtide CLI — tone set-up shared by `tone` and `index --tone`. */
#ifndef TT_TONE_CLI_H
#define TT_TONE_CLI_H

#include "termtide/lexicon.h"
#include "termtide/tone.h"
#include "cli.h"

typedef struct cli_tone {
    tt_lexicon *lex;
    tt_tone_options opt;
    const char **negators;
    size_t n_negators;
    char *desc;   /* the set-up as an index records it */
} cli_tone;

/* Loads the lexicon (NULL: the shipped finance lexicon) and sets the
 * negation rule (window 0: off; negator_list NULL: the default six, else
 * comma-separated and cut in place). Prints the error and returns 0 on
 * failure; release with cli_tone_release either way. */
int cli_tone_setup(cli_tone *t, const char *lexicon_path, uint64_t window, char *negator_list);
void cli_tone_release(cli_tone *t);

/* A per-thread scorer for t (NULL when out of memory), and scoring one
 * document into one set of scores appended to out with
 * tt_tone_scores_pack (stats->words_read: its word tokens). For the batch
 * runner's worker_new, worker_free and analyse hooks. */
void *cli_tone_scorer_new(const cli_tone *t);
void cli_tone_scorer_free(void *state);
tt_status cli_tone_score(void *state, const tt_document *doc, tt_buf *out, tt_doc_stats *stats);

#endif
