/* termtide — the segment stage: Unicode UAX #29 default word boundaries,
 * and the tokens (words and numbers) termtide counts.
 *
 * The word-break property tables are generated from Debian's unicode-data
 * files by tools/gen_wordbreak.py (Unicode version in TT_UNICODE_VERSION). */
#ifndef TT_SEGMENT_H
#define TT_SEGMENT_H

#include <stddef.h>

/* The Unicode version of the word-break tables, e.g. "15.0.0". */
const char *tt_unicode_version(void);

/* Returns the next UAX #29 default word boundary after pos (pos < len),
 * following every rule WB1–WB999 of Unicode's UAX #29 (WB3c uses
 * Extended_Pictographic). Returns len at the end (or when pos >= len).
 * pos must be 0 or a boundary this function returned: the walk starts
 * fresh at pos, so from any other position the text before it is ignored,
 * as if the text began there. text should be valid UTF-8 (the decode stage
 * guarantees it); an invalid byte is read as one U+FFFD, never past len.
 * Never allocates; O(length of the segment). */
size_t tt_wordbreak_next(const char *text, size_t len, size_t pos);

typedef enum tt_token_kind {
    TT_TOKEN_WORD = 0, /* holds at least one letter (or ideograph) */
    TT_TOKEN_NUMBER    /* digits with separators: 2025, 1,200.50, 3.5 */
} tt_token_kind;

typedef struct tt_token {
    size_t off, len;     /* a view into the text, never copied */
    tt_token_kind kind;
    int sentence_start;  /* 1 for the first token of the text and the first
                            after a sentence end: a segment that is not a
                            token and holds a Sentence_Terminal character
                            (. ! ? their full-width forms, U+3002 and the
                            other scripts' stops) or U+2026 … . A '.' inside
                            a token ("3.5", "e.g") is no sentence end, nor
                            the period right after an abbreviation of the
                            filings' usual kind ("No.", "U.S.", "approx.",
                            "e.g.", "Mr.", a month, an initial "J."), nor
                            after a company suffix ("Inc.", "Corp.",
                            "Ltd.") when a lower-case word or a number
                            follows. */
} tt_token;

/* Walks one block of text and yields tokens: UAX #29 segments that hold a
 * letter (General_Category L*, or Word_Break ALetter, Hebrew_Letter,
 * Katakana; so each CJK ideograph is a token) or a digit (Word_Break
 * Numeric). Segments joined by one hyphen (U+002D, U+2010, U+2011) with
 * nothing between become one token ("off-balance-sheet", "10-k"); it is a
 * NUMBER only if no part holds a letter ("2024-2025"). A token longer than
 * TT_LIMIT_TOKEN_BYTES is skipped and counted in `overlong`; a pending
 * sentence start passes to the next token kept. The tokenizer holds a view
 * of the text (the caller keeps it alive), never allocates, and is O(n). */
typedef struct tt_tokenizer {
    const char *text;
    size_t len;
    size_t pos;
    int at_sentence_start;
    size_t overlong;
    size_t prev_off, prev_end; /* the last token returned, (size_t)-1 none */
    int pending_suffix;        /* the last terminal followed "Inc." and the like */
    /* Byte classes of one 64-byte chunk of the text (segment.c), bit i for
     * text[chunk + i]: filled on demand, as the walk reaches a chunk. */
    size_t chunk;              /* offset of the chunk, (size_t)-1 none yet */
    unsigned long long m_word, m_stop;
    int wide;                  /* the masks made with AVX2 */
} tt_tokenizer;

void tt_tokenizer_init(tt_tokenizer *t, const char *text, size_t len);

/* Returns 1 and fills tok, or 0 at the end. */
int tt_tokenizer_next(tt_tokenizer *t, tt_token *tok);
/* The next tokens, up to max of them, into toks: the same tokens as that
 * many calls of tt_tokenizer_next, for less work a token. Returns how many
 * (fewer than max only at the end). */
size_t tt_tokenizer_fill(tt_tokenizer *t, tt_token *toks, size_t max);

#endif
