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
# the command's own modules, for the tests of its option parser and
# extract; never installed
CLI_LIB  := $(BUILD)/libgainsmith_cli.a
BIN      := $(BUILD)/gainsmith

.PHONY: all check check-sanitize bench demo install clean tests

all: $(LIB) $(BIN)

$(BUILD)/obj/%.o: src/%.c
	@mkdir -p $(dir $@)
	$(CC) $(CPPFLAGS_ALL) $(CFLAGS_ALL) -MMD -MP -c -o $@ $<

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

tests: $(TEST_BIN) $(TOOL_BIN) $(BIN)

# make check            every unit test, the command-line goldens, and the
#                       sympy cross-checks (skipped, loudly, without sympy)
# make check MOD=poly   one module's unit tests only
check: tests
	@sh tests/run_tests.sh $(BUILD) $(MOD)

check-sanitize:
	$(MAKE) BUILD=build/san OPT="-O1 -g" \
	    SANFLAGS="-fsanitize=address,undefined -fno-omit-frame-pointer -fno-sanitize-recover=all" \
	    check

bench: $(BENCH_BIN) $(BIN)
	@sh tests/bench/run_bench.sh $(BUILD)

demo: $(BIN)
	@sh examples/demo.sh $(BIN)

install: all
	mkdir -p $(DESTDIR)$(PREFIX)/bin $(DESTDIR)$(PREFIX)/lib/pkgconfig \
	    $(DESTDIR)$(PREFIX)/include
	cp $(BIN) $(DESTDIR)$(PREFIX)/bin/gainsmith
	cp $(LIB) $(DESTDIR)$(PREFIX)/lib/libgainsmith.a
	cp include/gainsmith.h $(DESTDIR)$(PREFIX)/include/gainsmith.h
	sed -e 's|@PREFIX@|$(PREFIX)|g' -e 's|@VERSION@|'"$$(sed -n 's/^#define GS_VERSION "\(.*\)"/\1/p' include/gainsmith.h)"'|' \
	    gainsmith.pc.in > $(DESTDIR)$(PREFIX)/lib/pkgconfig/gainsmith.pc

clean:
	rm -rf build

-include $(LIB_OBJ:.o=.d) $(CLI_OBJ:.o=.d) $(TEST_BIN:=.d) $(TOOL_BIN:=.d) $(BENCH_BIN:=.d)
