# Makefile - builds libgainsmith.a, the gainsmith command, tests, benches.
# See LICENSE.

CC      ?= cc
BUILD   ?= build
PREFIX  ?= /usr/local
OPT     ?= -O2 -g
WARN     = -Wall -Wextra -Wpedantic -Wshadow -Wstrict-prototypes \
           -Wmissing-prototypes -Wconversion -Werror
CPPFLAGS_ALL = -Iinclude -Isrc -D_POSIX_C_SOURCE=200809L $(CPPFLAGS)
CFLAGS_ALL   = -std=c11 $(OPT) $(WARN) $(SANFLAGS) $(CFLAGS)
LDLIBS_ALL   = $(SANFLAGS) $(LDFLAGS) -lm

# src/LAYER/*.c and src/api.c make the library; src/cli/ is the command.
LIB_SRC  := $(sort $(wildcard src/*.c) $(filter-out src/cli/%,$(wildcard src/*/*.c)))
LIB_OBJ  := $(LIB_SRC:src/%.c=$(BUILD)/obj/%.o)
CLI_SRC  := $(sort $(wildcard src/cli/*.c))
CLI_OBJ  := $(CLI_SRC:src/%.c=$(BUILD)/obj/%.o)
TEST_SRC := $(sort $(wildcard tests/test_*.c))
TEST_BIN := $(TEST_SRC:tests/%.c=$(BUILD)/tests/%)
# tests/tool_*.c: small drivers that test scripts (tests/sympy) call
TOOL_SRC := $(sort $(wildcard tests/tool_*.c))
TOOL_BIN := $(TOOL_SRC:tests/%.c=$(BUILD)/tests/%)
BENCH_SRC := $(sort $(wildcard tests/bench/bench_*.c))
BENCH_BIN := $(BENCH_SRC:tests/bench/%.c=$(BUILD)/bench/%)
LIB      := $(BUILD)/libgainsmith.a
# The shared library: position-independent objects of their own, every
# symbol but the GS_API calls of include/gainsmith.h hidden.  The soname
# carries the major version; the file name the whole version.
VERSION  := $(shell sed -n 's/^\#define GS_VERSION "\(.*\)"/\1/p' include/gainsmith.h)
SOMAJOR  := $(firstword $(subst ., ,$(VERSION)))
SONAME   := libgainsmith.so.$(SOMAJOR)
SHLIB    := $(BUILD)/libgainsmith.so.$(VERSION)
PIC_OBJ  := $(LIB_SRC:src/%.c=$(BUILD)/pic/%.o)
# the command's own modules, for the tests of its option parser and
# extract; never installed
CLI_LIB  := $(BUILD)/libgainsmith_cli.a
BIN      := $(BUILD)/gainsmith

.PHONY: all check check-sanitize check-thread bench demo install clean \
        tests fuzz fuzz-run

all: $(LIB) $(SHLIB) $(BIN)

$(BUILD)/obj/%.o: src/%.c
	@mkdir -p $(dir $@)
	$(CC) $(CPPFLAGS_ALL) $(CFLAGS_ALL) -MMD -MP -c -o $@ $<

$(BUILD)/pic/%.o: src/%.c
	@mkdir -p $(dir $@)
	$(CC) $(CPPFLAGS_ALL) $(CFLAGS_ALL) -fPIC -fvisibility=hidden -MMD -MP \
	    -c -o $@ $<

$(SHLIB): $(PIC_OBJ)
	$(CC) $(CFLAGS_ALL) -shared -Wl,-soname,$(SONAME) -o $@ $^ $(LDLIBS_ALL)
	ln -sf $(notdir $(SHLIB)) $(BUILD)/$(SONAME)
	ln -sf $(SONAME) $(BUILD)/libgainsmith.so

$(LIB): $(LIB_OBJ)
	@rm -f $@
	ar rcs $@ $^

$(CLI_LIB): $(filter-out $(BUILD)/obj/cli/main.o,$(CLI_OBJ))
	@rm -f $@
	ar rcs $@ $^

$(BIN): $(CLI_OBJ) $(LIB)
	$(CC) $(CFLAGS_ALL) -o $@ $^ $(LDLIBS_ALL)

$(BUILD)/tests/%: tests/%.c tests/check.h tests/testlib.h $(LIB) $(CLI_LIB)
	@mkdir -p $(dir $@)
	$(CC) $(CPPFLAGS_ALL) -Itests $(CFLAGS_ALL) -MMD -MP -o $@ $< $(CLI_LIB) $(LIB) $(LDLIBS_ALL)

$(BUILD)/bench/%: tests/bench/%.c $(LIB)
	@mkdir -p $(dir $@)
	$(CC) $(CPPFLAGS_ALL) -Itests $(CFLAGS_ALL) -MMD -MP -o $@ $< $(LIB) $(LDLIBS_ALL)

# several threads deriving at once (tests/thread), for check-thread
THREAD_BIN := $(BUILD)/tests/thread_derive
$(THREAD_BIN): tests/thread/thread_derive.c tests/check.h tests/testapi.h $(LIB)
	@mkdir -p $(dir $@)
	$(CC) $(CPPFLAGS_ALL) -Itests $(CFLAGS_ALL) -pthread -MMD -MP -o $@ $< \
	    $(LIB) $(LDLIBS_ALL)

tests: $(TEST_BIN) $(TOOL_BIN) $(BIN) $(SHLIB)

# make check            every unit test, the command-line goldens, and the
#                       sympy cross-checks (skipped, loudly, without sympy)
# make check MOD=poly   one module's unit tests only
check: tests
	@sh tests/run_tests.sh $(BUILD) $(MOD)

check-sanitize:
	$(MAKE) BUILD=build/san OPT="-O1 -g" \
	    SANFLAGS="-fsanitize=address,undefined -fno-omit-frame-pointer -fno-sanitize-recover=all" \
	    check

# make check-thread     the library under ThreadSanitizer: several threads
#                       derive at once, several read one result at once
check-thread:
	$(MAKE) BUILD=build/tsan OPT="-O1 -g" \
	    SANFLAGS="-fsanitize=thread -fno-omit-frame-pointer" \
	    build/tsan/tests/thread_derive
	TSAN_OPTIONS="halt_on_error=1 second_deadlock_stack=1" \
	    build/tsan/tests/thread_derive

bench: $(BENCH_BIN) $(BIN)
	@sh tests/bench/run_bench.sh $(BUILD)

# make fuzz       the libFuzzer target (clang) in build/fuzz/fuzz_circuit,
#                 over the library built with the fuzzer's instrumentation
# make fuzz-run   run it for FUZZ_SECONDS (60) on a corpus seeded from
#                 examples/ and tests/ (tests/fuzz/run.sh)
FUZZ_CC    ?= clang
FUZZ_FLAGS  = -fsanitize=fuzzer-no-link,address,undefined \
              -fno-sanitize-recover=all -fno-omit-frame-pointer
FUZZ_SECONDS ?= 60

fuzz:
	$(MAKE) CC=$(FUZZ_CC) BUILD=build/fuzz OPT="-O1 -g" \
	    SANFLAGS="$(FUZZ_FLAGS)" build/fuzz/libgainsmith.a
	$(FUZZ_CC) $(CPPFLAGS_ALL) -std=c11 -O1 -g $(WARN) \
	    -fsanitize=fuzzer,address,undefined -fno-sanitize-recover=all \
	    -o build/fuzz/fuzz_circuit tests/fuzz/fuzz_circuit.c \
	    build/fuzz/libgainsmith.a -lm

fuzz-run: fuzz
	@sh tests/fuzz/run.sh build/fuzz/fuzz_circuit $(FUZZ_SECONDS)

demo: $(BIN)
	@sh examples/demo.sh $(BIN)

# make install [PREFIX=/usr/local] [DESTDIR=...]: the command, both
# libraries, the header, the pkg-config file, the man pages and the bash
# completion.
LIBDIR  ?= $(PREFIX)/lib
MANDIR  ?= $(PREFIX)/share/man
BASHCOMPDIR ?= $(PREFIX)/share/bash-completion/completions
MAN1    := $(wildcard man/*.1)
MAN5    := $(wildcard man/*.5)

install: all
	mkdir -p $(DESTDIR)$(PREFIX)/bin $(DESTDIR)$(LIBDIR)/pkgconfig \
	    $(DESTDIR)$(PREFIX)/include $(DESTDIR)$(MANDIR)/man1 \
	    $(DESTDIR)$(MANDIR)/man5 $(DESTDIR)$(BASHCOMPDIR)
	cp $(BIN) $(DESTDIR)$(PREFIX)/bin/gainsmith
	cp $(LIB) $(DESTDIR)$(LIBDIR)/libgainsmith.a
	cp $(SHLIB) $(DESTDIR)$(LIBDIR)/
	ln -sf $(notdir $(SHLIB)) $(DESTDIR)$(LIBDIR)/$(SONAME)
	ln -sf $(SONAME) $(DESTDIR)$(LIBDIR)/libgainsmith.so
	cp include/gainsmith.h $(DESTDIR)$(PREFIX)/include/gainsmith.h
	sed -e 's|@PREFIX@|$(PREFIX)|g' -e 's|@LIBDIR@|$(LIBDIR)|g' \
	    -e 's|@VERSION@|$(VERSION)|g' \
	    gainsmith.pc.in > $(DESTDIR)$(LIBDIR)/pkgconfig/gainsmith.pc
	$(if $(MAN1),cp $(MAN1) $(DESTDIR)$(MANDIR)/man1/)
	$(if $(MAN5),cp $(MAN5) $(DESTDIR)$(MANDIR)/man5/)
	$(if $(wildcard completion/gainsmith.bash),cp completion/gainsmith.bash \
	    $(DESTDIR)$(BASHCOMPDIR)/gainsmith)

clean:
	rm -rf build

-include $(LIB_OBJ:.o=.d) $(PIC_OBJ:.o=.d) $(CLI_OBJ:.o=.d) $(TEST_BIN:=.d) $(THREAD_BIN:=.d) $(TOOL_BIN:=.d) $(BENCH_BIN:=.d)
