/* termtide — the command-line program: dispatches to one function per
 * subcommand, from the table below, which also drives --help. */
#include <stdlib.h>
#include <string.h>
#if defined(__GLIBC__)
#include <malloc.h>
#endif
#include <time.h>
#include <unistd.h>

#include <libxml/xmlversion.h>
#include <utf8proc.h>
#include <zlib.h>

#include "termtide/segment.h"
#include "termtide/termtable.h"
#include "cli.h"

static const tt_command commands[] = {
    { "count", tt_cmd_count, "term-frequency tables per document or for all input",
      tt_help_count },
    { "compare", tt_cmd_compare, "what changed between two sides or periods (G², Log Ratio, q)", tt_help_compare },
    { "describe", tt_cmd_describe, "a term's distribution, and where the latest document sits", tt_help_describe },
    { "trend", tt_cmd_trend, "terms across periods: rates, statistics, dispersion, tf-idf", tt_help_trend },
    { "tone", tt_cmd_tone, "words by lexicon category per document, with negation", tt_help_tone },
    { "index", tt_cmd_index, "count files into a persistent index, reading only what changed", tt_help_index },
    { "merge", tt_cmd_merge, "combine indexes built over parts of an archive into one", tt_help_merge },
    { "changes", tt_cmd_changes, "sentences added, removed and reworded between periods", tt_help_changes },
    { "sections", tt_cmd_sections, "each document's sections: report items, transcript parts", tt_help_sections },
    { "readability", tt_cmd_readability, "how hard the prose is to read: Fog, Flesch, Flesch-Kincaid", tt_help_readability },
    { "search", tt_cmd_search, "where watched language appears: hits in context, counts", tt_help_search },
    { "cloud", tt_cmd_cloud, "a word cloud of the heaviest terms or of a change, as SVG", tt_help_cloud },
    { "chart", tt_cmd_chart, "bars, lines, heat map and more as SVG from a saved table", tt_help_chart },
    { "report", tt_cmd_report, "one self-contained HTML page: overview, movers, pictures, hits",
      tt_help_report },
};
#define NCOMMANDS (sizeof commands / sizeof commands[0])

static const char caution[] =
    "termtide measures language. It gives no investment, legal or compliance advice;\n"
    "defer to your firm's policies and to licensed professionals.\n";

static void usage(FILE *f)
{
    fprintf(f, "Usage: termtide COMMAND [OPTIONS] [PATH...]\n\n"
               "Term-frequency tables and change measures for filings and call transcripts.\n\n"
               "Commands:\n");
    for (size_t i = 0; i < NCOMMANDS; i++)
        fprintf(f, "  %-12s %s\n", commands[i].name, commands[i].summary);
    fprintf(f, "  %-12s %s\n", "help", "help on a command: termtide help COMMAND");
    fprintf(f, "\nOptions:\n  -h, --help     this help\n  -V, --version  version and "
               "library versions\n\n%s",
            caution);
}

static void version(void)
{
    printf("termtide %s\n", TT_VERSION);
    printf("Unicode %s (word boundaries, UAX #29); utf8proc %s (Unicode normalization)\n",
           tt_unicode_version(), utf8proc_version());
    printf("libxml2 %s; zlib %s; Snowball English (Porter2) stemmer from libstemmer\n",
           LIBXML_DOTTED_VERSION, zlibVersion());
}

static const tt_command *find(const char *name)
{
    for (size_t i = 0; i < NCOMMANDS; i++)
        if (!strcmp(commands[i].name, name))
            return &commands[i];
    return NULL;
}

/* A per-run hash key, so crafted input cannot aim at the term table. */
static void seed_hash(void)
{
    uint64_t k[2] = { 0, 0 };
    FILE *f = fopen("/dev/urandom", "rb");
    if (!f || fread(k, sizeof k, 1, f) != 1) {
        k[0] = (uint64_t)time(NULL) ^ ((uint64_t)getpid() << 32);
        k[1] = (uint64_t)clock() * 0x9E3779B97F4A7C15ULL;
    }
    if (f)
        fclose(f);
    tt_termtable_set_seed(k[0], k[1]);
}

/* A batch allocates and frees the same sizes for every document: a term
 * table per document (a megabyte of slots for a long one), the file's
 * buffers. glibc serves blocks past its mmap threshold from fresh mappings
 * and gives freed heap tops back to the system, so each document would fault
 * its pages in again (a third of the time of a table per document on the
 * benchmark corpus went to the kernel). Blocks up to 4 MiB come from the
 * heap, and up to 8 MiB of free heap top is kept for the next document.
 * Larger blocks (the slots of a table for the whole input, which double as
 * it grows) still come from their own mappings and go back when freed: with
 * 16 and 32 MiB here, a table's old slots stayed resident after it grew and
 * peak memory on 1 GB of text rose from 56 to 66 MB. */
static void keep_memory_between_documents(void)
{
#if defined(__GLIBC__)
    mallopt(M_MMAP_THRESHOLD, 4 << 20);
    mallopt(M_TRIM_THRESHOLD, 8 << 20);
#endif
}

int main(int argc, char **argv)
{
    keep_memory_between_documents();
    if (argc < 2) {
        usage(stderr);
        return TT_EXIT_TROUBLE;
    }
    const char *cmd = argv[1];
    if (!strcmp(cmd, "-h") || !strcmp(cmd, "--help")) {
        usage(stdout);
        return TT_EXIT_OK;
    }
    if (!strcmp(cmd, "-V") || !strcmp(cmd, "--version")) {
        version();
        return TT_EXIT_OK;
    }
    if (!strcmp(cmd, "help")) {
        if (argc < 3) {
            usage(stdout);
            return TT_EXIT_OK;
        }
        const tt_command *c = find(argv[2]);
        if (!c) {
            cli_error("no such command: '%s' (see termtide --help)", argv[2]);
            return TT_EXIT_TROUBLE;
        }
        fputs(c->help, stdout);
        return TT_EXIT_OK;
    }
    const tt_command *c = find(cmd);
    if (!c) {
        cli_error("no such command: '%s' (see termtide --help)", cmd);
        return TT_EXIT_TROUBLE;
    }
    seed_hash();
    return c->run(argc - 1, argv + 1);
}
