/* termtide — the switch for the SIMD paths (see include/termtide/simd.h).
 * One flag, read by the stages; set only before threads start. */
#include "termtide/simd.h"
#include "tt_internal.h"

#if defined(__SSE2__)
int tti_use_simd = 1;
#else
int tti_use_simd = 0;
#endif

int tt_simd(int enable)
{
#if defined(__SSE2__)
    tti_use_simd = enable != 0;
#else
    (void)enable;
#endif
    return tti_use_simd;
}
