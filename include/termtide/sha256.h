/* termtide — SHA-256 (FIPS 180-4), so a search run can name the exact bytes
 * of its watch-list and of every document it read. */
#ifndef TT_SHA256_H
#define TT_SHA256_H

#include <stddef.h>
#include <stdint.h>
#include "termtide/status.h"

typedef struct tt_sha256 {
    uint32_t state[8];
    uint64_t bytes;          /* message length so far */
    unsigned char block[64]; /* the pending partial block */
    size_t fill;             /* bytes in block */
} tt_sha256;

void tt_sha256_init(tt_sha256 *h);
void tt_sha256_update(tt_sha256 *h, const void *data, size_t len);
/* Writes the 32-byte digest; h must be initialised again before reuse. */
void tt_sha256_final(tt_sha256 *h, unsigned char digest[32]);

/* Whether the CPU's SHA instructions are used (x86 SHA extensions, found
 * with CPUID; used by default when present). enable = 0 forces the portable
 * code (for tests and measurements). Returns 1 when they are in use. Call
 * before starting threads. */
int tt_sha256_accelerated(int enable);

/* As tt_sha256_final, the digest written as 64 lower-case hex digits and a
 * NUL. */
void tt_sha256_final_hex(tt_sha256 *h, char out[65]);

/* The digest of data[0..len) as 64 lower-case hex digits and a NUL. */
void tt_sha256_hex(const void *data, size_t len, char out[65]);

/* The digest of a file's bytes as stored (a gzip file is hashed
 * compressed, as `sha256sum` would), read in 64 KiB pieces. TT_ENOENT or
 * TT_EIO with err naming the file; out is then "". */
tt_status tt_sha256_file(const char *path, char out[65], tt_error *err);

#endif
