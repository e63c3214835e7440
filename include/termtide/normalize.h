/* termtide — the normalize stage: one token to its term form.
 *
 * NFKC and case folding (utf8proc), with an ASCII fast path; typographic
 * apostrophes (U+2018, U+2019, U+02BC, U+FF07, U+0060, U+00B4) become ';
 * dashes and hyphens (U+2010–U+2015, U+2212, U+FE58, U+FE63, U+FF0D) become
 * '-'; a possessive is dropped ("company's" → "company", "companies'" →
 * "companies"); leading and trailing apostrophes and hyphens are stripped. */
#ifndef TT_NORMALIZE_H
#define TT_NORMALIZE_H

#include <stddef.h>
#include <stdint.h>
#include "termtide/buf.h"
#include "termtide/status.h"

typedef struct tt_normalizer {
    tt_buf scratch;
    int32_t *cps;     /* code point scratch for utf8proc */
    size_t cps_cap;
} tt_normalizer;

void tt_normalizer_init(tt_normalizer *n);
void tt_normalizer_release(tt_normalizer *n);

/* Writes the normalized form of tok (valid UTF-8) into out, which is reset
 * first; out->len may be 0 when nothing is left (a lone apostrophe). Dropping
 * a final "'s" also turns "it's" into "it" (as Porter2's step 0 does).
 * Should a caller pass invalid UTF-8 anyway, each bad byte becomes U+FFFD.
 * tok must not point into out. One normalizer per thread; it keeps its
 * scratch memory between calls, so the steady state allocates nothing.
 * TT_ENOMEM on allocation failure, TT_ELIMIT when out's cap is reached. */
tt_status tt_normalize(tt_normalizer *n, const char *tok, size_t len, tt_buf *out);

/* Number of code points in a UTF-8 string (for --min-length). */
size_t tt_utf8_length(const char *s, size_t len);

#endif
