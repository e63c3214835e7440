/* termtide — the switch for the SIMD paths.
 *
 * The stages that classify bytes in bulk (plain-text extraction, the
 * tokenizer, search's pair scan) use SSE2 where the compiler targets it, as on every x86-64,
 * and portable code elsewhere; both give the same output. Search's pair
 * scan also has SSSE3 and AVX2 versions, and the tokenizer's byte classes
 * an AVX2 one, compiled in on x86 and used only where the CPU has those
 * instructions (asked at run time); every version gives the same output. */
#ifndef TT_SIMD_H
#define TT_SIMD_H

/* The instruction sets the SIMD paths may go up to, in rising order. */
enum { TT_SIMD_PORTABLE = 0, TT_SIMD_SSE2 = 1, TT_SIMD_SSSE3 = 2, TT_SIMD_AVX2 = 3 };

/* enable = 0 forces the portable code, 1 restores SSE2 where it was
 * compiled in (for tests and measurements). Returns 1 when SSE2 is in use.
 * Call before starting threads. */
int tt_simd(int enable);

/* Caps the SIMD paths at level (TT_SIMD_SSE2 to TT_SIMD_AVX2; the default
 * is TT_SIMD_AVX2), for tests and measurements; the portable code is
 * chosen with tt_simd(0). Returns the level the paths now go up to: the
 * cap, lowered to what the build and the CPU have, or TT_SIMD_PORTABLE
 * while tt_simd(0) is in force. Call before starting threads. */
int tt_simd_level(int level);

#endif
