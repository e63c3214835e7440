/* termtide — status names and the error record. */
#include <stdarg.h>
#include <stdio.h>

#include "tt_internal.h"

void tt_error_init(tt_error *err)
{
    if (!err)
        return;
    err->status = TT_OK;
    err->file[0] = '\0';
    err->line = 0;
    err->offset = -1;
    err->message[0] = '\0';
}

static tt_status vset(tt_error *err, tt_status status, const char *file,
                      long line, long long offset, const char *fmt, va_list ap)
{
    if (!err)
        return status;
    err->status = status;
    tti_strlcpy(err->file, file ? file : "", sizeof err->file);
    err->line = line;
    err->offset = offset;
    vsnprintf(err->message, sizeof err->message, fmt, ap);
    return status;
}

tt_status tt_error_set(tt_error *err, tt_status status, const char *file,
                       long long offset, const char *fmt, ...)
{
    va_list ap;
    va_start(ap, fmt);
    vset(err, status, file, 0, offset, fmt, ap);
    va_end(ap);
    return status;
}

tt_status tt_error_set_line(tt_error *err, tt_status status, const char *file,
                            long line, const char *fmt, ...)
{
    va_list ap;
    va_start(ap, fmt);
    vset(err, status, file, line, -1, fmt, ap);
    va_end(ap);
    return status;
}

const char *tt_status_name(tt_status status)
{
    switch (status) {
    case TT_OK: return "ok";
    case TT_ENOMEM: return "out of memory";
    case TT_EIO: return "read/write error";
    case TT_ENOENT: return "no such file";
    case TT_EPARSE: return "parse error";
    case TT_ELIMIT: return "limit reached";
    case TT_EBINARY: return "binary file";
    case TT_EINVAL: return "invalid argument";
    case TT_ELOOP: return "symlink loop";
    }
    return "unknown status";
}

char *tt_error_format(const tt_error *err, char *out, size_t size)
{
    if (!size)
        return out;
    const char *msg = err->message[0] ? err->message : tt_status_name(err->status);
    if (err->file[0] && err->line > 0)
        snprintf(out, size, "%s: line %ld: %s", err->file, err->line, msg);
    else if (err->file[0] && err->offset >= 0)
        snprintf(out, size, "%s: byte %lld: %s", err->file, err->offset, msg);
    else if (err->file[0])
        snprintf(out, size, "%s: %s", err->file, msg);
    else
        snprintf(out, size, "%s", msg);
    return out;
}

void tti_strlcpy(char *dst, const char *src, size_t size)
{
    if (!size)
        return;
    size_t n = strlen(src);
    if (n >= size)
        n = size - 1;
    memcpy(dst, src, n);
    dst[n] = '\0';
}
