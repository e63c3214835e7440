/* termtide — status codes and the error record every library call fills.
 *
 * Library calls return a tt_status and, on failure, fill a caller-supplied
 * tt_error with the file, the place (line and/or byte offset) and a message.
 * The library never exits or aborts; the caller decides what to do. */
#ifndef TT_STATUS_H
#define TT_STATUS_H

#include <stddef.h>

typedef enum tt_status {
    TT_OK = 0,
    TT_ENOMEM,   /* an allocation failed */
    TT_EIO,      /* reading or writing failed (errno kept in the message) */
    TT_ENOENT,   /* a path does not exist */
    TT_EPARSE,   /* input could not be parsed */
    TT_ELIMIT,   /* input exceeded a named limit (see limits.h) */
    TT_EBINARY,  /* input is binary, not a document */
    TT_EINVAL,   /* a bad argument or option */
    TT_ELOOP     /* a symlink loop */
} tt_status;

#define TT_ERROR_FILE_MAX 1024
#define TT_ERROR_MSG_MAX 512

typedef struct tt_error {
    tt_status status;
    char file[TT_ERROR_FILE_MAX]; /* "" when no file is involved */
    long line;                    /* 1-based, 0 when unknown */
    long long offset;             /* byte offset, -1 when unknown */
    char message[TT_ERROR_MSG_MAX];
} tt_error;

/* Sets every field to its "nothing happened" value. */
void tt_error_init(tt_error *err);

/* Fills err (when not NULL) and returns status, so a caller can write
 * `return tt_error_set(err, TT_EPARSE, path, off, "bad tag %s", t);`.
 * file may be NULL; offset -1 when unknown. */
tt_status tt_error_set(tt_error *err, tt_status status, const char *file,
                       long long offset, const char *fmt, ...)
    __attribute__((format(printf, 5, 6)));

/* Same with a line number. */
tt_status tt_error_set_line(tt_error *err, tt_status status, const char *file,
                            long line, const char *fmt, ...)
    __attribute__((format(printf, 5, 6)));

/* A short lower-case name for a status ("out of memory", "limit", ...).
 * Returns a static string. */
const char *tt_status_name(tt_status status);

/* Formats "FILE: line N: message" / "FILE: offset N: message" / "FILE: message"
 * into out (always NUL-terminated). Returns out. */
char *tt_error_format(const tt_error *err, char *out, size_t size);

#endif
