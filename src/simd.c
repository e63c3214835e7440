/* termtide — the switch for the SIMD paths (see include/termtide/simd.h).
 * One flag, read by the stages, and a cap on the instruction sets; both set
 * only before threads start. The CPU's instruction sets come from the
 * compiler's __builtin_cpu_supports (CPUID, read once at start-up by the
 * compiler's run-time library; AVX2 counts only when the operating system
 * saves the wide registers), a load and a test per call. */
#include "termtide/simd.h"
#include "tt_internal.h"

#if defined(__SSE2__)
int tti_use_simd = 1;
#else
int tti_use_simd = 0;
#endif

static int cap = TT_SIMD_AVX2;

int tt_simd(int enable)
{
#if defined(__SSE2__)
    tti_use_simd = enable != 0;
#else
    (void)enable;
#endif
    return tti_use_simd;
}

int tti_simd_level(void)
{
    if (!tti_use_simd)
        return TT_SIMD_PORTABLE;
#if TTI_SIMD_WIDE
    if (cap >= TT_SIMD_AVX2 && __builtin_cpu_supports("avx2"))
        return TT_SIMD_AVX2;
    if (cap >= TT_SIMD_SSSE3 && __builtin_cpu_supports("ssse3"))
        return TT_SIMD_SSSE3;
#endif
    return TT_SIMD_SSE2;
}

int tt_simd_level(int level)
{
    cap = level < TT_SIMD_SSE2 ? TT_SIMD_SSE2 : level > TT_SIMD_AVX2 ? TT_SIMD_AVX2 : level;
    return tti_simd_level();
}
