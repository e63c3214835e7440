/* termtide — sections: the item structure of periodic and current reports,
 * the parts of a call transcript, or sections a user's rules name.
 *
 * Reports: a heading block (a heading, or a paragraph or list item of at
 * most TT_SECTION_HEADING_BYTES) that starts "Item 1A", "ITEM 7.", "Part II
 * — Item 1A", "Item 2.02" ... names an item (1 to 16, or a current report's
 * N.NN); "PART I" / "PART II" headings
 * set the part. Table cells are never headings (a table of contents is a
 * table). An item mentioned more than once (a table of contents in
 * paragraphs, a heading repeated) is taken where its body starts: the last
 * mention followed by at least TT_SECTION_MIN_WORDS words before the next
 * item heading, else the last mention. The form follows from the items:
 * numbers like 2.02 make a current report; a Part II whose items run 1..6
 * and no item past 6 make a quarterly report; anything else is read as an
 * annual report. A section runs from its heading to the next section's.
 *
 * Transcripts (speaker turns, transcript.h): "prepared-remarks" and "qa".
 *
 * User rules: a file of name<TAB>pattern lines (PCRE2, caseless); a heading
 * block matching a pattern starts that section, which runs to the next
 * matching heading; the same choice among mentions as for items. */
#ifndef TT_SECTIONS_H
#define TT_SECTIONS_H

#include <stddef.h>
#include "termtide/extract.h"
#include "termtide/status.h"

#define TT_SECTION_HEADING_BYTES 160
#define TT_SECTION_MIN_WORDS 30

typedef struct tt_section {
    char name[48];        /* ours, e.g. "risk-factors"; "item-4.09" when unnamed */
    char item[24];        /* as the report numbers it: "1A", "II-1A", "2.02"; "" */
    size_t first, end;    /* blocks [first, end) */
    size_t mentions;      /* headings naming it; the others were skipped */
    char how[200];        /* how it was found, for the reader */
} tt_section;

typedef struct tt_sections {
    tt_section *items;    /* in document order */
    size_t n, cap;
    const char *form;     /* "annual report", "quarterly report", "current report",
                             "transcript", "user rules", "none" */
} tt_sections;

void tt_sections_init(tt_sections *s);
void tt_sections_release(tt_sections *s);

typedef struct tt_section_rules tt_section_rules;

/* Loads user rules (name<TAB>pattern lines, '#' comments, a name of
 * letters, digits and '-'). TT_EPARSE with the file, line and PCRE2's
 * message for a bad line. The caller frees them with
 * tt_section_rules_free(). */
tt_status tt_section_rules_load(const char *path, tt_section_rules **out, tt_error *err);
void tt_section_rules_free(tt_section_rules *r);

/* Finds the sections of b (with rules when given, else the built-in
 * report and transcript structure). out is emptied first. TT_ENOMEM. */
tt_status tt_sections_find(const tt_blocks *b, const tt_section_rules *rules, tt_sections *out);

/* The built-in section names, NULL-terminated, for help texts. */
const char *const *tt_section_names(void);

/* Keeps in b only the blocks of the sections named (names[0..n)), in
 * document order; *kept gets how many of the names were found. b keeps its
 * memory. TT_ENOMEM leaves b unchanged. */
tt_status tt_blocks_keep_sections(tt_blocks *b, const tt_sections *s, const char *const *names,
                                  size_t n, size_t *kept);

#endif
