/* termtide — the transcript stage: speaker turns in a call transcript.
 *
 * A transcript marks each turn with a speaker label at the start of a
 * paragraph ("Name: remarks", "Name — Role: remarks"); the paragraphs that
 * follow without a label belong to the same turn. The call has prepared
 * remarks and then a question-and-answer part. This stage finds the turns,
 * the part each paragraph belongs to and each speaker's role, and says how
 * it decided, so tone and counts can be split by part and role. */
#ifndef TT_TRANSCRIPT_H
#define TT_TRANSCRIPT_H

#include <stddef.h>
#include "termtide/extract.h"
#include "termtide/status.h"

typedef enum tt_turn_part {
    TT_PART_OTHER = 0, /* not inside a turn: title, participant lists, part headings */
    TT_PART_PREPARED,  /* turns before the question-and-answer part */
    TT_PART_QA         /* turns from the question-and-answer part on */
} tt_turn_part;
#define TT_TURN_PARTS 3

typedef enum tt_turn_role {
    TT_ROLE_NONE = 0,   /* not inside a turn */
    TT_ROLE_MANAGEMENT, /* the company's speakers */
    TT_ROLE_ANALYST,    /* the questioners */
    TT_ROLE_OPERATOR,   /* the call's moderator */
    TT_ROLE_UNKNOWN     /* a speaker none of the rules placed */
} tt_turn_role;
#define TT_TURN_ROLES 5

const char *tt_turn_part_name(tt_turn_part part); /* "other", "prepared", "qa" */
const char *tt_turn_role_name(tt_turn_role role); /* "none", "management", ... */

typedef struct tt_speaker {
    char *name;           /* as in the label, before any role part */
    tt_turn_role role;
    const char *how;      /* static text: which rule set the role */
    size_t turns;
} tt_speaker;

/* What one block is in the transcript. */
typedef struct tt_block_turn {
    tt_turn_part part;
    tt_turn_role role;
    size_t speaker;       /* index in speakers, or (size_t)-1 */
    size_t label_len;     /* bytes of the speaker label at the block start
                             ("Name: "), not remarks; 0 when none */
} tt_block_turn;

typedef struct tt_transcript {
    int found;            /* 1: the document has speaker turns */
    tt_block_turn *blocks;
    size_t n_blocks;
    tt_speaker *speakers;
    size_t n_speakers;
    long qa_block;        /* first block of the question-and-answer part, -1 */
    const char *qa_how;   /* static text: how that start was found, "" */
} tt_transcript;

void tt_transcript_init(tt_transcript *t);
void tt_transcript_release(tt_transcript *t);
void tt_transcript_clear(tt_transcript *t);

/* Finds the turns of the document in b. The rules, in order:
 * - A speaker label is a paragraph start "Name: " or "Name <dash or comma>
 *   Role: " with a name of one to six capitalised words (particles such as
 *   "de" or "van" allowed), no digits, under TT_LIMIT_SPEAKER_LABEL bytes.
 *   A document is a transcript when it holds at least four labelled
 *   paragraphs by at least two speakers; otherwise found = 0 and every
 *   block is part "other", role "none".
 * - The question-and-answer part starts at a short paragraph that names it
 *   ("Question-and-Answer Session", "Questions and Answers", "Q&A"), or else
 *   at the first operator turn after a company turn that mentions a
 *   question. Without either, every turn is prepared remarks.
 * - Roles: a label "Operator" is the operator; a name listed under a
 *   participant heading before the first turn is management ("Corporate
 *   Participants", "Company Participants", "Executives", ...) or analyst
 *   ("Conference Call Participants", "Analysts", ...); a role in the label
 *   naming an officer or an analyst decides next; then a speaker heard in
 *   the prepared remarks is management, and one first heard in the
 *   question-and-answer part is an analyst when that first turn follows
 *   the operator or asks a question, management otherwise.
 * out is reset first. TT_ENOMEM leaves it empty. O(total block bytes ×
 * speakers) at worst (the participant lists are searched for each name). */
tt_status tt_transcript_find(const tt_blocks *b, tt_transcript *out);

#endif
