# wirefield: `make run` sets up, builds and runs the demo; `make test` sets up and runs every test.
BUILD ?= build
WERROR ?= ON
JOBS ?= 2
DEMO ?= models/hiking_club_dipole.wire

.PHONY: deps configure build run test bench format clean

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

# The summary table of docs/performance.md (a few minutes); the single-stage Google Benchmark
# programs are $(BUILD)/bin/wirefield_bench.
bench: build
	$(BUILD)/bin/wirefield_perf

format:
	clang-format -i $$(git ls-files '*.cpp' '*.hpp')

clean:
	rm -rf $(BUILD)
