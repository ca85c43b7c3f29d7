# wirefield: `make run` sets up, builds and runs the demo; `make test` sets up and runs every test.
# Hardening (DEVELOPERS.md): `make test-sanitize` runs every test under the address and
# undefined-behaviour sanitizers, `make fuzz` runs each libFuzzer target for FUZZ_SECONDS,
# `make lint` runs clang-tidy and cppcheck on libmom/ and cli/.
BUILD ?= build
SAN_BUILD ?= $(BUILD)/sanitize
FUZZ_BUILD ?= $(BUILD)/fuzz
FUZZ_SECONDS ?= 180
WERROR ?= ON
JOBS ?= 2
DEMO ?= models/hiking_club_dipole.wire
FUZZERS = model touchstone
# The sanitizer and fuzz builds are optimised at -O1 (the level the AddressSanitizer
# documentation recommends for usable speed): with the instrumentation they compile in far less
# time than at -O3.
SAN_OPT ?= -O1
# Any sanitizer report ends the program with an error; a failed allocation is reported, not
# returned as null.
SAN_ENV = ASAN_OPTIONS=detect_leaks=1:abort_on_error=0:halt_on_error=1 \
          UBSAN_OPTIONS=print_stacktrace=1:halt_on_error=1

.PHONY: deps configure build run test bench format clean test-sanitize fuzz lint cppcheck

deps:
	@bash scripts/install-deps.sh

configure: deps
	@cmake -S . -B $(BUILD) -DCMAKE_BUILD_TYPE=Release -DWIREFIELD_WERROR=$(WERROR) > /dev/null

build: configure
	@cmake --build $(BUILD) -j $(JOBS)

run: build
	$(BUILD)/bin/wirefield solve $(DEMO)

test: build
	cd $(BUILD) && ctest --output-on-failure -j $(JOBS)

# The summary table of docs/performance.md (a few minutes): Google Benchmark runs of every row,
# then the table computed from them; single stages: $(BUILD)/bin/wirefield_bench.
bench: build
	$(BUILD)/bin/wirefield_perf

format:
	clang-format -i $$(git ls-files '*.cpp' '*.hpp')

test-sanitize: deps
	@cmake -S . -B $(SAN_BUILD) -DCMAKE_BUILD_TYPE=Release -DWIREFIELD_WERROR=$(WERROR) \
	  -DCMAKE_CXX_FLAGS_RELEASE="$(SAN_OPT) -DNDEBUG" -DWIREFIELD_SANITIZE=ON \
	  -DWIREFIELD_BENCH=OFF > /dev/null
	@cmake --build $(SAN_BUILD) -j $(JOBS)
	cd $(SAN_BUILD) && $(SAN_ENV) ctest --output-on-failure -j $(JOBS)

# Each target runs FUZZ_SECONDS from the seeds (models/, fuzz/corpus/) plus what earlier runs
# found (kept in $(FUZZ_BUILD)/corpus-NAME); a crash leaves $(FUZZ_BUILD)/crash-* and fails.
fuzz: deps
	@cmake -S . -B $(FUZZ_BUILD) -DCMAKE_BUILD_TYPE=Release -DCMAKE_CXX_COMPILER=clang++ \
	  -DCMAKE_CXX_FLAGS_RELEASE="$(SAN_OPT) -DNDEBUG" -DWIREFIELD_FUZZ=ON \
	  -DWIREFIELD_BENCH=OFF > /dev/null
	@cmake --build $(FUZZ_BUILD) -j $(JOBS) --target $(addprefix fuzz_,$(FUZZERS))
	@mkdir -p $(FUZZ_BUILD)/corpus-model $(FUZZ_BUILD)/corpus-touchstone
	$(SAN_ENV) $(FUZZ_BUILD)/bin/fuzz_model -max_total_time=$(FUZZ_SECONDS) -timeout=20 \
	  -rss_limit_mb=2048 -max_len=4096 -dict=fuzz/model.dict -print_final_stats=1 \
	  -artifact_prefix=$(FUZZ_BUILD)/ $(FUZZ_BUILD)/corpus-model models fuzz/corpus/model
	$(SAN_ENV) $(FUZZ_BUILD)/bin/fuzz_touchstone -max_total_time=$(FUZZ_SECONDS) -timeout=20 \
	  -rss_limit_mb=2048 -max_len=4096 -dict=fuzz/touchstone.dict -print_final_stats=1 \
	  -artifact_prefix=$(FUZZ_BUILD)/ $(FUZZ_BUILD)/corpus-touchstone fuzz/corpus/touchstone

# clang-tidy with the checks of .clang-tidy, and cppcheck; both must be silent.
LINT_SOURCES = $(shell git ls-files 'libmom/*.cpp' 'cli/*.cpp')
# `make cppcheck` alone takes seconds (CI runs it); clang-tidy takes about 13 CPU minutes.
lint: configure cppcheck
	printf '%s\n' $(LINT_SOURCES) | \
	  xargs -P $(JOBS) -n 4 clang-tidy -p $(BUILD) --quiet --warnings-as-errors='*'

cppcheck: deps
	cppcheck --quiet --error-exitcode=1 --std=c++20 --language=c++ --inline-suppr \
	  --enable=warning,performance,portability --suppressions-list=.cppcheck-suppressions \
	  -I libmom/include -I libmom/src -I cli libmom cli

clean:
	rm -rf $(BUILD)
