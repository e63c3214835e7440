/* termtide — unsafe C library functions turned into compile errors.
 * Included (via tt_internal.h) by every library and CLI source file. */
#ifndef TT_BANNED_H
#define TT_BANNED_H

#define TT_BANNED(func) sorry_##func##_is_banned_in_termtide

#undef strcpy
#define strcpy(x, y) TT_BANNED(strcpy)
#undef strcat
#define strcat(x, y) TT_BANNED(strcat)
#undef strncpy
#define strncpy(x, y, n) TT_BANNED(strncpy)
#undef sprintf
#define sprintf(...) TT_BANNED(sprintf)
#undef vsprintf
#define vsprintf(...) TT_BANNED(vsprintf)
#undef strtok
#define strtok(x, y) TT_BANNED(strtok)
#undef atoi
#define atoi(x) TT_BANNED(atoi)
#undef atof
#define atof(x) TT_BANNED(atof)
#undef atol
#define atol(x) TT_BANNED(atol)
#undef gets
#define gets(x) TT_BANNED(gets)

#endif
