/* termtide — the switch for the SIMD paths.
 *
 * The stages that classify bytes in bulk (plain-text extraction, the
 * tokenizer, search's pair scan) use SSE2 where the compiler targets it, as on every x86-64,
 * and portable code elsewhere; both give the same output. */
#ifndef TT_SIMD_H
#define TT_SIMD_H

/* enable = 0 forces the portable code, 1 restores SSE2 where it was
 * compiled in (for tests and measurements). Returns 1 when SSE2 is in use.
 * Call before starting threads. */
int tt_simd(int enable);

#endif
