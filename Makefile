# termtide — plain Makefile with pkg-config.
#
#   make                 library (build/libtermtide.a) and program (build/termtide)
#   make check           the test suite, then again under ASan + UBSan, then portable-test
#   make portable-test   the SIMD stages' tests built with no SIMD code (build-portable)
#   make test            the test suite once (normal build)
#   make san-test        the test suite under AddressSanitizer + UBSan only
#   make bench           the benchmark (bench/)
#   make install PREFIX=/usr/local
#   make leakcheck lint format clean

PREFIX  ?= /usr/local
CC      ?= cc
PYTHON  ?= /usr/bin/python3
VERSION := 0.1.0

# libxml2 is not linked: the library loads it (dlopen, by its SONAME, read
# here from the library pkg-config names) when the first HTML document
# comes, so a run over plain text does not pay 3 ms to load it and ICU.
# The tests that parse the SVG they make link it themselves.
PKGS    := libutf8proc zlib libdeflate libpcre2-8 freetype2 sqlite3
PKG_CFLAGS := $(shell pkg-config --cflags libxml-2.0 $(PKGS))
PKG_LIBS   := $(shell pkg-config --libs $(PKGS)) -lstemmer -lpthread -lm -ldl
XML_LIBS   := $(shell pkg-config --libs libxml-2.0)
XML_SONAME := $(or $(shell objdump -p $(shell pkg-config --variable=libdir libxml-2.0)/libxml2.so 2>/dev/null | awk '/SONAME/ {print $$2}'),libxml2.so.2)
TEST_LIBS  := $(shell pkg-config --libs cmocka) $(XML_LIBS)

OPT     ?= -O2
CFLAGS  ?= $(OPT) -g
WARN    := -std=c11 -Wall -Wextra -Werror -Wshadow -Wstrict-prototypes -Wmissing-prototypes -Wvla
CPPFLAGS_ALL := -D_POSIX_C_SOURCE=200809L -D_DEFAULT_SOURCE -DTT_VERSION=\"$(VERSION)\" -DTT_LIBXML2_SONAME=\"$(XML_SONAME)\" -Iinclude -Isrc $(PKG_CFLAGS)

# SAN=1 builds into build-san with AddressSanitizer + UndefinedBehaviorSanitizer.
# PORTABLE=1 builds into build-portable with no SIMD code at all (__SSE2__
# undefined, as on a CPU without it), for portable-test.
ifeq ($(SAN),1)
B       := build-san
CFLAGS  := -O1 -g -fno-omit-frame-pointer -fsanitize=address,undefined -fno-sanitize-recover=all
LDSAN   := -fsanitize=address,undefined
else ifeq ($(PORTABLE),1)
B       := build-portable
CFLAGS  := -O2 -g -U__SSE2__
LDSAN   :=
else
B       := build
LDSAN   :=
endif

# The program links the libraries above (not the C library) statically
# where their archives are installed, as Debian's -dev packages install
# them, and is not position-independent: no shared objects to map and
# relocate and no relocations of its own at start, each a page fault of
# some microseconds in a virtual machine (termtide --version 6.0 -> 3.1 ms
# here, perf stat over 30 runs; every command starts that much sooner).
# STATIC=0 links them shared; the sanitizer build always does, and the
# tests link the library shared either way.
STATIC  ?= 1
STATIC_NAMES   := $(filter-out m pthread dl c,$(patsubst -l%,%,$(filter -l%,$(shell pkg-config --static --libs $(PKGS)) -lstemmer)))
STATIC_MISSING := $(strip $(foreach n,$(sort $(STATIC_NAMES)),$(if $(filter /%,$(shell $(CC) -print-file-name=lib$(n).a)),,$(n))))
ifeq ($(STATIC)$(SAN)$(STATIC_MISSING),1)
PROG_LIBS := -no-pie $(shell pkg-config --libs-only-L $(PKGS)) -Wl,-Bstatic $(STATIC_NAMES:%=-l%) -Wl,-Bdynamic -lpthread -lm -ldl
else
PROG_LIBS := $(PKG_LIBS)
endif

LIB_SRC := $(sort $(wildcard src/*.c))
CLI_SRC := $(sort $(wildcard src/cli/*.c))
TEST_SRC:= $(sort $(wildcard tests/test_*.c))
GEN_SRC := $(B)/gen/stopwords_data.c
LEX_GEN := $(B)/gen/lexicons_data.c
LIB_OBJ := $(LIB_SRC:src/%.c=$(B)/obj/%.o) $(B)/obj/gen/stopwords_data.o $(B)/obj/gen/lexicons_data.o
CLI_OBJ := $(CLI_SRC:src/cli/%.c=$(B)/obj/cli/%.o)
TESTS   := $(TEST_SRC:tests/%.c=$(B)/tests/%)
STOPWORDS := $(sort $(wildcard stopwords/*.txt))
LEXICONS := $(sort $(wildcard lexicons/*.txt))

.PHONY: all test check san-test portable-test bench install uninstall clean leakcheck lint format fuzz
all: $(B)/libtermtide.a $(B)/termtide

$(B)/obj/%.o: src/%.c $(wildcard include/termtide/*.h src/*.h) | $(B)/obj/cli $(B)/obj/gen
	$(CC) $(CPPFLAGS_ALL) $(CPPFLAGS) $(WARN) $(CFLAGS) -c $< -o $@

$(B)/obj/gen/%.o: $(B)/gen/%.c | $(B)/obj/gen
	$(CC) $(CPPFLAGS_ALL) $(CPPFLAGS) $(WARN) $(CFLAGS) -c $< -o $@

$(B)/obj/cli $(B)/obj/gen $(B)/gen $(B)/tests:
	mkdir -p $@

# The stop-word lists are compiled in, so the program needs no data files.
$(B)/embed: tools/embed.c | $(B)/gen
	$(CC) $(WARN) -O1 $< -o $@
$(GEN_SRC): $(B)/embed $(STOPWORDS) | $(B)/gen
	$(B)/embed tti_stopword_lists $(STOPWORDS) > $@.tmp && mv $@.tmp $@
$(LEX_GEN): $(B)/embed $(LEXICONS) | $(B)/gen
	$(B)/embed tti_lexicon_files $(LEXICONS) > $@.tmp && mv $@.tmp $@

$(B)/libtermtide.a: $(LIB_OBJ)
	rm -f $@ && ar rcs $@ $^

$(B)/termtide: $(CLI_OBJ) $(B)/libtermtide.a
	$(CC) $(CFLAGS) $(LDSAN) $(LDFLAGS) $(CLI_OBJ) $(B)/libtermtide.a $(PROG_LIBS) -o $@

$(B)/tests/%: tests/%.c tests/tt_test.h tests/tt_test_numeric.h tests/tt_test_termtable.h $(B)/libtermtide.a | $(B)/tests
	$(CC) $(CPPFLAGS_ALL) $(CPPFLAGS) $(WARN) -Wno-missing-prototypes $(CFLAGS) $(LDSAN) $< $(B)/libtermtide.a $(PKG_LIBS) $(TEST_LIBS) -o $@

# Runs every test binary from the repository root; the CLI tests find the
# program through TT_BIN. Prints "N passed, N failed" at the end.
test: all $(TESTS)
	@pass=0; fail=0; failed=""; \
	for t in $(TESTS); do \
	  echo "== $$t"; \
	  if TT_BIN=$(B)/termtide PYTHON=$(PYTHON) ./$$t; then pass=$$((pass+1)); \
	  else fail=$$((fail+1)); failed="$$failed $$t"; fi; \
	done; \
	echo "$$pass $$fail" > $(B)/test-counts; \
	echo "tests: $$pass passed, $$fail failed"; \
	if [ $$fail -ne 0 ]; then echo "failed:$$failed"; exit 1; fi

san-test:
	$(MAKE) SAN=1 test

# The tests of the stages with SIMD paths (the tokenizer, the counter, the
# decoder, the text extractor) on a build without any (PORTABLE=1).
PORTABLE_TESTS := test_segment test_count test_decode test_extract
portable-test:
	$(MAKE) PORTABLE=1 $(PORTABLE_TESTS:%=build-portable/tests/%)
	@for t in $(PORTABLE_TESTS); do ./build-portable/tests/$$t >/dev/null || exit 1; done; \
	echo "portable-test: $(words $(PORTABLE_TESTS)) passed"

# The closing line counts the test programs of both builds.
check:
	$(MAKE) test
	ASAN_OPTIONS=detect_leaks=1 UBSAN_OPTIONS=print_stacktrace=1 $(MAKE) SAN=1 test fuzz-replay
	$(MAKE) portable-test
	@read p1 f1 < build/test-counts; read p2 f2 < build-san/test-counts; \
	echo "check: $$((p1 + p2)) passed, $$((f1 + f2)) failed"

bench: all
	$(MAKE) -C bench TERMTIDE=$(abspath $(B)/termtide)

leakcheck: all $(TESTS)
	@for t in $(TESTS); do TT_BIN=$(B)/termtide valgrind -q --leak-check=full --error-exitcode=1 ./$$t || exit 1; done

lint:
	clang-tidy $(LIB_SRC) $(CLI_SRC) -- $(CPPFLAGS_ALL) -std=c11

format:
	clang-format -i $(LIB_SRC) $(CLI_SRC) include/termtide/*.h src/*.h

install: all
	install -d $(DESTDIR)$(PREFIX)/bin $(DESTDIR)$(PREFIX)/lib $(DESTDIR)$(PREFIX)/include/termtide $(DESTDIR)$(PREFIX)/share/man/man1 $(DESTDIR)$(PREFIX)/share/termtide/stopwords
	install -m 755 $(B)/termtide $(DESTDIR)$(PREFIX)/bin/termtide
	install -m 644 $(B)/libtermtide.a $(DESTDIR)$(PREFIX)/lib/libtermtide.a
	install -m 644 include/termtide/*.h $(DESTDIR)$(PREFIX)/include/termtide/
	install -m 644 man/termtide.1 $(DESTDIR)$(PREFIX)/share/man/man1/termtide.1
	install -m 644 $(STOPWORDS) $(DESTDIR)$(PREFIX)/share/termtide/stopwords/
	install -d $(DESTDIR)$(PREFIX)/share/termtide/lexicons
	install -m 644 lexicons/*.txt $(DESTDIR)$(PREFIX)/share/termtide/lexicons/

uninstall:
	rm -rf $(DESTDIR)$(PREFIX)/bin/termtide $(DESTDIR)$(PREFIX)/lib/libtermtide.a $(DESTDIR)$(PREFIX)/include/termtide $(DESTDIR)$(PREFIX)/share/man/man1/termtide.1 $(DESTDIR)$(PREFIX)/share/termtide

clean:
	rm -rf build build-san build-fuzz build-portable

# ---- fuzzing (fuzz/README.md) ------------------------------------------------
#   make fuzz       replays fuzz/corpus/<target>/ and fuzz/crashes/<target>-*
#                   through each target built as a plain driver with gcc under
#                   ASan + UBSan (build-san/fuzz/); no clang needed
#   make fuzz-run   runs each target under libFuzzer (clang) for FUZZ_SECONDS;
#                   new crashes land in build-fuzz/crashes/
FUZZ_TARGETS := extract_html wrapper decode count manifest lexicon transcript watchlist cloud
FUZZ_SECONDS ?= 60
FUZZ_CC      ?= clang
FUZZ_B       := build-fuzz
FUZZ_FLAGS   := -O1 -g -fno-omit-frame-pointer -fsanitize=address,undefined -fno-sanitize-recover=all
FUZZ_LIB_OBJ := $(LIB_SRC:src/%.c=$(FUZZ_B)/obj/%.o) $(FUZZ_B)/obj/gen/stopwords_data.o $(FUZZ_B)/obj/gen/lexicons_data.o
.PHONY: fuzz-replay fuzz-run

fuzz:
	$(MAKE) SAN=1 fuzz-replay

fuzz-replay: $(FUZZ_TARGETS:%=$(B)/fuzz/replay_%)
	@for t in $(FUZZ_TARGETS); do \
	  ./$(B)/fuzz/replay_$$t fuzz/corpus/$$t $$(ls -d fuzz/crashes/$$t-* 2>/dev/null) || exit 1; \
	done

$(B)/fuzz $(FUZZ_B)/obj/gen:
	mkdir -p $@

$(B)/fuzz/replay_%: fuzz/fuzz_%.c fuzz/fuzz_common.h $(B)/libtermtide.a | $(B)/fuzz
	$(CC) $(CPPFLAGS_ALL) $(CPPFLAGS) $(WARN) -DTT_FUZZ_STANDALONE $(CFLAGS) $(LDSAN) $< $(B)/libtermtide.a $(PKG_LIBS) $(XML_LIBS) -o $@

$(FUZZ_B)/obj/%.o: src/%.c $(wildcard include/termtide/*.h src/*.h) | $(FUZZ_B)/obj/gen
	$(FUZZ_CC) $(CPPFLAGS_ALL) $(CPPFLAGS) $(WARN) $(FUZZ_FLAGS) -fsanitize=fuzzer-no-link -c $< -o $@
$(FUZZ_B)/obj/gen/stopwords_data.o: $(GEN_SRC) | $(FUZZ_B)/obj/gen
	$(FUZZ_CC) $(CPPFLAGS_ALL) $(CPPFLAGS) $(WARN) $(FUZZ_FLAGS) -c $< -o $@
$(FUZZ_B)/obj/gen/lexicons_data.o: $(LEX_GEN) | $(FUZZ_B)/obj/gen
	$(FUZZ_CC) $(CPPFLAGS_ALL) $(CPPFLAGS) $(WARN) $(FUZZ_FLAGS) -c $< -o $@
$(FUZZ_B)/libtermtide.a: $(FUZZ_LIB_OBJ)
	rm -f $@ && ar rcs $@ $^
$(FUZZ_B)/fuzz_%: fuzz/fuzz_%.c fuzz/fuzz_common.h $(FUZZ_B)/libtermtide.a
	$(FUZZ_CC) $(CPPFLAGS_ALL) $(CPPFLAGS) $(WARN) $(FUZZ_FLAGS) -fsanitize=fuzzer $< $(FUZZ_B)/libtermtide.a $(PKG_LIBS) $(XML_LIBS) -o $@

fuzz-run: $(FUZZ_TARGETS:%=$(FUZZ_B)/fuzz_%)
	@for t in $(FUZZ_TARGETS); do \
	  mkdir -p $(FUZZ_B)/corpus/$$t $(FUZZ_B)/crashes; \
	  dict=; [ -f fuzz/$$t.dict ] && dict=-dict=fuzz/$$t.dict; \
	  ./$(FUZZ_B)/fuzz_$$t -max_total_time=$(FUZZ_SECONDS) -timeout=20 -max_len=16384 $$dict \
	    -artifact_prefix=$(FUZZ_B)/crashes/$$t- $(FUZZ_B)/corpus/$$t fuzz/corpus/$$t || exit 1; \
	done
