/* termtide — the source stage: input paths to a sorted list of files, and a
 * file (or stdin, or a gzip file) to bytes in memory. */
#ifndef TT_SOURCE_H
#define TT_SOURCE_H

#include <stddef.h>
#include "termtide/buf.h"
#include "termtide/sha256.h"
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
 * Inside a directory only regular files are listed: FIFOs, sockets and
 * devices are left out silently (reading a FIFO would block).
 * Problems with a path become entries with a non-OK status: TT_ENOENT "no
 * such file or directory" (or "broken symlink ..."), TT_ELOOP "symlink loop:
 * a/b/link points back to a", TT_EIO with the errno text for a directory
 * that cannot be read, TT_ELIMIT for a directory past the depth cap. The
 * return value is TT_ENOMEM only (the list is then left valid but
 * partial). The list owns every path and message; tt_source_list_release
 * frees them. */
tt_status tt_source_expand(tt_source_list *list, const char *arg);

/* Appends path as it is, unexpanded and unchecked (for paths that come
 * from somewhere other than the file system, e.g. an index). TT_ENOMEM. */
tt_status tt_source_list_add(tt_source_list *list, const char *path);

/* Reads a whole file ("-" = stdin) into out (reset first), decompressing
 * gzip transparently (detected by its magic bytes 1f 8b, not the name;
 * concatenated members are read in turn, zero padding after the last one is
 * ignored). At most TT_LIMIT_FILE_BYTES after decompression, or out's own
 * limit when that is smaller (exactly the limit is accepted). Errors:
 * TT_ENOENT, TT_EIO (unreadable: the errno text; "is a directory";
 * "truncated gzip data"; "corrupt gzip data: <zlib's message>"), TT_ELIMIT
 * (naming the limit's value), TT_ENOMEM; err names the file ("<stdin>" for
 * "-") and the cause, and out is left empty. *was_gzip (may be NULL) is set
 * to 1 when the input was gzip. */
tt_status tt_source_read(const char *path, tt_buf *out, int *was_gzip, tt_error *err);

/* As tt_source_read, and when hash is not NULL it is fed every byte of the
 * file as stored (a gzip file compressed, as `sha256sum` would hash it), in
 * the same pass that fills out: the digest names exactly the bytes the text
 * came from, standard input included. The caller initialises hash before
 * and finalises it after (tt_sha256_init, tt_sha256_final); after an error
 * its state is undefined. */
tt_status tt_source_read_hashed(const char *path, tt_buf *out, int *was_gzip, tt_sha256 *hash,
                                tt_error *err);

#endif
