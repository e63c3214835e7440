/* termtide — the source stage: input paths to a sorted list of files, and a
 * file (or stdin, or a gzip file) to bytes in memory. */
#ifndef TT_SOURCE_H
#define TT_SOURCE_H

#include <stddef.h>
#include "termtide/buf.h"
#include "termtide/status.h"

/* One input after expansion. A path that could not be expanded (does not
 * exist, symlink loop, unreadable directory) is still listed, with its
 * status and message, so the batch can report it and go on. */
typedef struct tt_source_entry {
    char *path;         /* as given, or joined dir/name; "-" for stdin */
    tt_status status;   /* TT_OK, or why it cannot be read */
    char *message;      /* NULL when status is TT_OK */
} tt_source_entry;

typedef struct tt_source_list {
    tt_source_entry *items;
    size_t n, cap;
} tt_source_list;

void tt_source_list_init(tt_source_list *list);
void tt_source_list_release(tt_source_list *list);

/* Appends the inputs named by one argument: a file as is; a directory
 * recursively (entries sorted bytewise at each level, hidden entries
 * starting with '.' skipped, symlinks followed with loop detection by
 * device+inode, depth capped by TT_LIMIT_DIR_DEPTH); "-" for stdin.
 * Problems with a path become entries with a non-OK status; the return
 * value is TT_ENOMEM only (the list is then left valid but partial). */
tt_status tt_source_expand(tt_source_list *list, const char *arg);

/* Reads a whole file ("-" = stdin) into out (reset first), decompressing
 * gzip transparently (detected by its magic bytes, not the name). At most
 * TT_LIMIT_FILE_BYTES after decompression. Errors: TT_ENOENT, TT_EIO
 * (unreadable, a directory, truncated or corrupt gzip), TT_ELIMIT, TT_ENOMEM;
 * err names the file and cause. *was_gzip (may be NULL) is set to 1 when the
 * input was gzip. */
tt_status tt_source_read(const char *path, tt_buf *out, int *was_gzip, tt_error *err);

#endif
