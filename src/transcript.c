/* termtide — speaker turns in call transcripts.
 *
 * Three passes over the blocks. (1) Every block is tested for a speaker
 * label at its start; distinct names go into a term table mapping a name to
 * its index + 1, so a label lookup is one hash probe whatever the number of
 * speakers. (2) The question-and-answer part is located: a short block that
 * names it, else the operator turn that opens the queue. (3) Parts and roles
 * are assigned: each unlabelled block continues the turn before it, a part
 * heading ends the turn; each speaker's role comes from the first rule that
 * decides it (see transcript.h), and the rule is recorded.
 *
 * Invariant: out->blocks has one entry per block of b; a block with
 * label_len > 0 starts a turn of blocks[i].speaker.
 * O(bytes) for the passes, plus the participant-list search: for each
 * speaker a substring search of the blocks before the first turn. */
#include <utf8proc.h>

#include "termtide/limits.h"
#include "termtide/termtable.h"
#include "termtide/transcript.h"
#include "tt_internal.h"

#define NO_SPEAKER ((size_t)-1)

const char *tt_turn_part_name(tt_turn_part part)
{
    static const char *const names[TT_TURN_PARTS] = { "other", "prepared", "qa" };
    return (unsigned)part < TT_TURN_PARTS ? names[part] : "?";
}

const char *tt_turn_role_name(tt_turn_role role)
{
    static const char *const names[TT_TURN_ROLES] = { "none", "management", "analyst",
                                                      "operator", "unknown" };
    return (unsigned)role < TT_TURN_ROLES ? names[role] : "?";
}

void tt_transcript_init(tt_transcript *t)
{
    memset(t, 0, sizeof *t);
    t->qa_block = -1;
    t->qa_how = "";
}

void tt_transcript_release(tt_transcript *t)
{
    for (size_t i = 0; i < t->n_speakers; i++)
        tt_free(t->speakers[i].name);
    tt_free(t->speakers);
    tt_free(t->blocks);
    t->speakers = NULL;
    t->blocks = NULL;
    t->n_speakers = t->n_blocks = 0;
}

void tt_transcript_clear(tt_transcript *t)
{
    tt_transcript_release(t);
    tt_transcript_init(t);
}

/* Case-insensitive (ASCII) search for needle in s[0..n). */
static const char *find_ci(const char *s, size_t n, const char *needle)
{
    size_t m = strlen(needle);
    for (size_t i = 0; m <= n && i <= n - m; i++) {
        size_t k = 0;
        while (k < m && tti_ascii_lower((unsigned char)s[i + k]) == needle[k])
            k++;
        if (k == m)
            return s + i;
    }
    return NULL;
}

static int equals_ci(const char *s, size_t n, const char *word)
{
    return strlen(word) == n && find_ci(s, n, word) == s;
}

static int starts_ci(const char *s, size_t n, const char *prefix)
{
    size_t m = strlen(prefix);
    return m <= n && find_ci(s, m, prefix) == s;
}

/* Words that stand before a colon at a paragraph start but name no one. */
static const char *const not_names[] = {
    "note", "notes", "source", "sources", "item", "table", "figure", "example", "re",
    "subject", "date", "time", "location", "attention", "important", "warning", "caution",
    "disclaimer", "agenda", "participants", "presentation", "question", "questions", "answer",
    "q", "a", "total", "step", "phase", "part", "section", "chapter", "exhibit", "schedule",
    "reference", "tel", "telephone", "fax", "email", "web", "website", "address", "contact",
    "contacts", "title", "name", "period", "sincerely", "dear", "summary", "highlights",
    "outlook", "guidance", "results", "overview", "background", "purpose", "conclusion"
};

static const char *const particles[] = { "de", "van", "von", "der", "den", "da", "di", "du",
                                         "del", "della", "la", "le", "bin", "al", "ter",
                                         "ten", "dos", "das", "y", "and" };

static int is_upper_start(const char *w, size_t n)
{
    uint32_t cp;
    tti_utf8_decode((const unsigned char *)w, n, &cp);
    if (cp < 0x80)
        return cp >= 'A' && cp <= 'Z';
    utf8proc_category_t cat = utf8proc_category((utf8proc_int32_t)cp);
    return cat == UTF8PROC_CATEGORY_LU || cat == UTF8PROC_CATEGORY_LT;
}

/* A name: one to six words, each capitalised or a particle, made of
 * letters, '.', '-', apostrophes; not a heading word. */
static int is_name(const char *s, size_t n)
{
    if (n == 0)
        return 0;
    size_t words = 0, i = 0;
    while (i < n) {
        size_t j = i;
        while (j < n && s[j] != ' ')
            j++;
        if (j == i)
            return 0; /* two spaces or a leading space */
        const char *w = s + i;
        size_t wl = j - i;
        for (size_t k = 0; k < wl; k++) {
            unsigned char c = (unsigned char)w[k];
            if (c < 0x80 && !tti_is_ascii_alpha(c) && c != '.' && c != '-' && c != '\'')
                return 0;
        }
        int particle = 0;
        for (size_t p = 0; p < sizeof particles / sizeof *particles; p++)
            if (equals_ci(w, wl, particles[p]) && w[0] >= 'a' && w[0] <= 'z')
                particle = 1;
        if (!particle && !is_upper_start(w, wl))
            return 0;
        if (particle && words == 0)
            return 0;
        words++;
        i = j < n ? j + 1 : j;
    }
    if (words > 6)
        return 0;
    for (size_t p = 0; p < sizeof not_names / sizeof *not_names; p++)
        if (equals_ci(s, n, not_names[p]))
            return 0;
    return 1;
}

typedef struct label {
    size_t len;              /* label bytes including ": " */
    size_t name_len;         /* the name at the start */
    size_t role_off, role_len;
} label;

/* Where the name ends and a role begins in a label: the first dash or
 * comma separator. */
static size_t name_end(const char *s, size_t n, size_t *role_off)
{
    static const char *const seps[] = { " \xe2\x80\x94 ", "\xe2\x80\x94", " \xe2\x80\x93 ",
                                        "\xe2\x80\x93", " - ", ", ", " (" };
    size_t best = n;
    *role_off = n;
    for (size_t k = 0; k < sizeof seps / sizeof *seps; k++) {
        size_t m = strlen(seps[k]);
        for (size_t i = 1; m <= n && i + m <= n && i < best; i++)
            if (!memcmp(s + i, seps[k], m)) {
                best = i;
                *role_off = i + m;
                break;
            }
    }
    return best;
}

static int parse_label(const char *s, size_t n, label *lb)
{
    size_t lim = n < TT_LIMIT_SPEAKER_LABEL ? n : TT_LIMIT_SPEAKER_LABEL;
    const char *colon = memchr(s, ':', lim);
    if (!colon || colon == s)
        return 0;
    size_t c = (size_t)(colon - s);
    if (c + 1 < n && s[c + 1] != ' ')
        return 0; /* "10:00", "http://" */
    for (size_t i = 0; i < c; i++) {
        unsigned char ch = (unsigned char)s[i];
        if (tti_is_ascii_digit(ch) || ch == '?' || ch == '!' || ch == ';' || ch == '"')
            return 0;
    }
    size_t role_off;
    size_t ne = name_end(s, c, &role_off);
    if (!is_name(s, ne))
        return 0;
    lb->name_len = ne;
    lb->role_off = role_off;
    lb->role_len = c - role_off;
    if (lb->role_len && s[c - 1] == ')')
        lb->role_len--;
    lb->len = c + 1 < n ? c + 2 : c + 1;
    return 1;
}

/* A short block that opens the question-and-answer part. */
static int is_qa_heading(const char *s, size_t n)
{
    if (n > 60)
        return 0;
    return find_ci(s, n, "question-and-answer") || find_ci(s, n, "question and answer") ||
           find_ci(s, n, "questions and answers") || find_ci(s, n, "questions & answers") ||
           find_ci(s, n, "q&a") || find_ci(s, n, "q & a");
}

/* A short block that opens the prepared remarks. */
static int is_prepared_heading(const char *s, size_t n)
{
    return equals_ci(s, n, "presentation") || equals_ci(s, n, "prepared remarks") ||
           equals_ci(s, n, "management remarks") || equals_ci(s, n, "opening remarks") ||
           equals_ci(s, n, "management presentation");
}

/* Participant-list headings, longest first so "conference call
 * participants" is not read as "call participants". */
static const struct {
    const char *text;
    tt_turn_role role;
} list_headings[] = {
    { "conference call participants", TT_ROLE_ANALYST },
    { "company representatives", TT_ROLE_MANAGEMENT },
    { "corporate participants", TT_ROLE_MANAGEMENT },
    { "company participants", TT_ROLE_MANAGEMENT },
    { "other participants", TT_ROLE_ANALYST },
    { "call participants", TT_ROLE_ANALYST },
    { "executives", TT_ROLE_MANAGEMENT },
    { "analysts", TT_ROLE_ANALYST },
};

/* The list heading at s, if any. */
static int list_heading_at(const char *s, size_t n, tt_turn_role *role, size_t *len)
{
    for (size_t k = 0; k < sizeof list_headings / sizeof *list_headings; k++)
        if (starts_ci(s, n, list_headings[k].text)) {
            *role = list_headings[k].role;
            *len = strlen(list_headings[k].text);
            return 1;
        }
    return 0;
}

/* A stretch of text under a participant-list heading. */
typedef struct list_region {
    const char *text;
    size_t len;
    tt_turn_role role;
} list_region;

/* Participant lists are short; reading at most this much of them bounds
 * the name search on hostile input (a first turn after megabytes). */
#define LIST_BYTES_MAX 65536
#define LIST_REGIONS_MAX 64

/* The participant lists before block `first`. A list runs from its heading
 * to the next heading, over the blocks that follow, until a part heading or
 * the first turn. Returns the number of regions stored. */
static size_t find_lists(const tt_blocks *b, size_t first, list_region *reg)
{
    tt_turn_role current = TT_ROLE_NONE;
    size_t nreg = 0, bytes = 0;
    for (size_t i = 0; i < first && bytes < LIST_BYTES_MAX; i++) {
        const char *s = b->text.data + b->items[i].off;
        size_t n = b->items[i].len;
        if (is_prepared_heading(s, n) || is_qa_heading(s, n)) {
            current = TT_ROLE_NONE;
            continue;
        }
        if (n > LIST_BYTES_MAX - bytes)
            n = LIST_BYTES_MAX - bytes;
        bytes += n;
        size_t seg = 0;
        while (seg < n) {
            size_t next = n, hlen = 0;
            tt_turn_role hrole = TT_ROLE_NONE;
            for (size_t k = seg; k < n; k++) {
                size_t l;
                tt_turn_role r;
                if ((k == 0 || s[k - 1] == ' ') && list_heading_at(s + k, n - k, &r, &l)) {
                    next = k;
                    hlen = l;
                    hrole = r;
                    break;
                }
            }
            if (current != TT_ROLE_NONE && next > seg && nreg < LIST_REGIONS_MAX)
                reg[nreg++] = (list_region){ s + seg, next - seg, current };
            if (next == n)
                break;
            current = hrole;
            seg = next + hlen;
        }
    }
    return nreg;
}

/* The role the lists give a name (at a word start), or NONE. */
static tt_turn_role listed_role(const list_region *reg, size_t nreg, const char *name,
                                size_t nlen)
{
    for (size_t r = 0; r < nreg; r++)
        for (size_t k = 0; k + nlen <= reg[r].len; k++)
            if (!memcmp(reg[r].text + k, name, nlen) && (k == 0 || reg[r].text[k - 1] == ' '))
                return reg[r].role;
    return TT_ROLE_NONE;
}

static tt_turn_role role_from_label(const char *role, size_t n)
{
    if (!n)
        return TT_ROLE_NONE;
    if (find_ci(role, n, "analyst"))
        return TT_ROLE_ANALYST;
    static const char *const officers[] = { "chief", "officer", "president", "ceo", "cfo",
                                            "coo", "investor relations", "treasurer",
                                            "controller", "chair", "director", "head of",
                                            "executive", "founder", "general counsel" };
    for (size_t k = 0; k < sizeof officers / sizeof *officers; k++)
        if (find_ci(role, n, officers[k]))
            return TT_ROLE_MANAGEMENT;
    return TT_ROLE_NONE;
}

tt_status tt_transcript_find(const tt_blocks *b, tt_transcript *out)
{
    tt_transcript_clear(out);
    tt_status st = TT_OK;
    label *labels = NULL;
    tt_termtable *names = NULL;
    out->n_blocks = b->n;
    if (!b->n)
        return TT_OK;
    out->blocks = tt_calloc(b->n, sizeof *out->blocks);
    labels = tt_calloc(b->n, sizeof *labels);
    names = tt_termtable_new();
    if (!out->blocks || !labels || !names) {
        st = TT_ENOMEM;
        goto done;
    }
    for (size_t i = 0; i < b->n; i++)
        out->blocks[i].speaker = NO_SPEAKER;

    /* (1) labels and speakers */
    size_t labelled = 0, first_turn = b->n, cap = 0;
    for (size_t i = 0; i < b->n; i++) {
        const char *s = b->text.data + b->items[i].off;
        if (b->items[i].kind == TT_BLOCK_CELL || !parse_label(s, b->items[i].len, &labels[i]))
            continue;
        uint64_t idx = tt_termtable_get(names, s, labels[i].name_len);
        if (!idx) {
            if (out->n_speakers >= TT_LIMIT_SPEAKERS) {
                labels[i].len = 0;
                continue;
            }
            if (out->n_speakers == cap) {
                size_t ncap = cap ? 2 * cap : 8;
                tt_speaker *sp = tt_reallocarray(out->speakers, ncap, sizeof *sp);
                if (!sp) {
                    st = TT_ENOMEM;
                    goto done;
                }
                out->speakers = sp;
                cap = ncap;
            }
            tt_speaker *sp = &out->speakers[out->n_speakers];
            memset(sp, 0, sizeof *sp);
            sp->how = "";
            if (!(sp->name = tt_malloc(labels[i].name_len + 1))) {
                st = TT_ENOMEM;
                goto done;
            }
            memcpy(sp->name, s, labels[i].name_len);
            sp->name[labels[i].name_len] = '\0';
            out->n_speakers++;
            if ((st = tt_termtable_add(names, s, labels[i].name_len, out->n_speakers)) != TT_OK)
                goto done;
            idx = out->n_speakers;
        }
        out->blocks[i].speaker = (size_t)idx - 1;
        out->blocks[i].label_len = labels[i].len;
        out->speakers[idx - 1].turns++;
        if (first_turn == b->n)
            first_turn = i;
        labelled++;
    }
    if (labelled < 4 || out->n_speakers < 2) {
        for (size_t i = 0; i < b->n; i++) {
            out->blocks[i].speaker = NO_SPEAKER;
            out->blocks[i].label_len = 0;
        }
        for (size_t k = 0; k < out->n_speakers; k++)
            tt_free(out->speakers[k].name);
        out->n_speakers = 0;
        goto done;
    }
    out->found = 1;
    for (size_t k = 0; k < out->n_speakers; k++)
        if (equals_ci(out->speakers[k].name, strlen(out->speakers[k].name), "operator")) {
            out->speakers[k].role = TT_ROLE_OPERATOR;
            out->speakers[k].how = "labelled Operator";
        }

    /* (2) the question-and-answer part */
    for (size_t i = first_turn; i < b->n; i++)
        if (out->blocks[i].speaker == NO_SPEAKER &&
            is_qa_heading(b->text.data + b->items[i].off, b->items[i].len)) {
            out->qa_block = (long)i;
            out->qa_how = "a heading names it";
            break;
        }
    if (out->qa_block < 0) {
        int company = 0, question = 0;
        for (size_t i = first_turn; i < b->n; i++) {
            size_t sp = out->blocks[i].speaker;
            if (sp == NO_SPEAKER)
                continue;
            const char *s = b->text.data + b->items[i].off;
            int mentions = find_ci(s, b->items[i].len, "question") != NULL;
            if (out->speakers[sp].role == TT_ROLE_OPERATOR) {
                if (company && (question || mentions)) {
                    out->qa_block = (long)i;
                    out->qa_how = "the operator opens the questions";
                    break;
                }
            } else {
                company = 1;
                question |= mentions;
            }
        }
    }

    /* (3) parts, continuation blocks, roles */
    size_t current = NO_SPEAKER;
    for (size_t i = 0; i < b->n; i++) {
        const char *s = b->text.data + b->items[i].off;
        size_t n = b->items[i].len;
        tt_block_turn *bt = &out->blocks[i];
        if (bt->label_len) {
            current = bt->speaker;
        } else if (i < first_turn || is_qa_heading(s, n) || is_prepared_heading(s, n)) {
            current = NO_SPEAKER;
        }
        bt->speaker = current;
        if (current == NO_SPEAKER)
            continue;
        bt->part = out->qa_block >= 0 && (long)i >= out->qa_block ? TT_PART_QA
                                                                  : TT_PART_PREPARED;
    }
    list_region reg[LIST_REGIONS_MAX];
    size_t nreg = find_lists(b, first_turn, reg);
    size_t prev_speaker = NO_SPEAKER;
    for (size_t i = first_turn; i < b->n; i++) {
        tt_block_turn *bt = &out->blocks[i];
        if (!bt->label_len)
            continue;
        tt_speaker *sp = &out->speakers[bt->speaker];
        if (sp->role == TT_ROLE_NONE) {
            const char *s = b->text.data + b->items[i].off;
            tt_turn_role r = listed_role(reg, nreg, sp->name, strlen(sp->name));
            if (r != TT_ROLE_NONE) {
                sp->role = r;
                sp->how = "participant list";
            } else if ((r = role_from_label(s + labels[i].role_off, labels[i].role_len)) !=
                       TT_ROLE_NONE) {
                sp->role = r;
                sp->how = "role in the label";
            } else if (bt->part == TT_PART_PREPARED) {
                sp->role = TT_ROLE_MANAGEMENT;
                sp->how = "spoke in the prepared remarks";
            } else if (prev_speaker != NO_SPEAKER &&
                       out->speakers[prev_speaker].role == TT_ROLE_OPERATOR) {
                sp->role = TT_ROLE_ANALYST;
                sp->how = "first spoke after the operator in the Q&A";
            } else if (memchr(s, '?', b->items[i].len)) {
                sp->role = TT_ROLE_ANALYST;
                sp->how = "first spoke with a question in the Q&A";
            } else {
                sp->role = TT_ROLE_MANAGEMENT;
                sp->how = "first spoke with an answer in the Q&A";
            }
        }
        prev_speaker = bt->speaker;
    }
    for (size_t i = 0; i < b->n; i++)
        if (out->blocks[i].speaker != NO_SPEAKER)
            out->blocks[i].role = out->speakers[out->blocks[i].speaker].role;
done:
    tt_free(labels);
    tt_termtable_free(names);
    if (st)
        tt_transcript_clear(out);
    return st;
}
