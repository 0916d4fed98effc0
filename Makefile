# edgewise: build, run and test. `make run` and `make test` are the two
# commands that matter; see README.md.

SHELL     := /bin/bash
GO        ?= go
GOROOT    := $(shell $(GO) env GOROOT)
PORT      ?= 8080
CHROMIUM  ?= $(shell command -v chromium 2>/dev/null || echo /usr/bin/chromium)
WASMEXEC  := $(GOROOT)/lib/wasm/wasm_exec.js
GOJSEXEC  := $(GOROOT)/lib/wasm/go_js_wasm_exec
# the build's name in reports: the commit it was built from
RELEASE   ?= $(shell git describe --tags --always --dirty 2>/dev/null || echo unknown)
NATIVE    := $(shell $(GO) list ./... | grep -v /scripts/e2e)

.PHONY: all build run test vet test-native test-wasm test-fuzz test-browser chromium dist sizes size-baseline size-parts tiering bench bench-browser fuzz clean

all: build

## build: the engine as WebAssembly next to the page, with the matching wasm_exec.js,
## the published check cases (testdata/checks.json) for the page's checks panel,
## and the physics and colour tables the page reads
build: site/app.wasm site/wasm_exec.js site/checks.json site/physics.json site/colours.json

site/checks.json: $(wildcard testdata/checks.json)
	@if [ -f testdata/checks.json ]; then cp testdata/checks.json $@; else echo '{"cases": []}' > $@; fi

# the physics table (names, units, labels, hints) as the page reads it
site/physics.json: $(wildcard solver/physics/*.go solver/physics/examples/*.json solver/jsonlite/*.go scripts/physicsjson/*.go)
	$(GO) run ./scripts/physicsjson -o $@

# the engine's two colour maps as tables, so that the page draws with the
# engine's colours without a call to it
site/colours.json: $(wildcard solver/colour/*.go scripts/colourjson/*.go)
	$(GO) run ./scripts/colourjson -o $@

site/app.wasm: $(shell find solver wasm -name '*.go' -not -name '*_test.go') go.mod go.sum
	GOOS=js GOARCH=wasm $(GO) build -trimpath -ldflags='-s -w -X edgewise/solver/report.Release=$(RELEASE)' -o $@ ./wasm

site/wasm_exec.js: $(WASMEXEC)
	cp $< $@

## run: build and serve the page on localhost:$(PORT) (default 8080) with the demo project
run: build
	$(GO) run ./scripts/serve -addr 127.0.0.1:$(PORT) -dir site

## test: everything: vet, native tests with -race, short fuzzing, wasm tests under Node, browser tests
test: vet test-native test-sweep test-fuzz test-wasm test-browser
	@echo "make test: all suites passed"

vet:
	$(GO) vet ./...
	GOOS=js GOARCH=wasm $(GO) vet ./wasm/...

test-native:
	$(GO) test -race -count=1 $(NATIVE)

# The heavy numerical sweeps, too slow under the race detector, run once
# more without it.
test-sweep:
	set -o pipefail; $(GO) test -count=1 -run 'AllKindCombinations' -v ./solver/ | grep -E '^(---|ok|FAIL|PASS)|sweep_test'

# Every fuzz target runs its seed corpus in test-native. Here the parsers'
# targets also fuzz for FUZZTIME (a count of inputs: a duration can end a
# healthy run with "context deadline exceeded") to look for new crashes;
# `make fuzz` fuzzes every target longer, FuzzSolve (the whole engine on
# random projects) included.
FUZZ_QUICK := ./solver/expr:FuzzParse ./solver/expr:FuzzEval ./solver/jsonlite:FuzzParse ./solver/project:FuzzDecode
FUZZ_ALL   := $(FUZZ_QUICK) ./solver:FuzzSolve

test-fuzz:
	@set -e; for t in $(FUZZ_QUICK); do \
	  echo "fuzz $${t%%:*} $${t##*:} ($(FUZZTIME))"; \
	  $(GO) test -run='^$$' -fuzz="^$${t##*:}$$" -fuzztime=$(FUZZTIME) $${t%%:*}; \
	done

## fuzz: longer fuzzing of every target on demand (FUZZTIME=10m make fuzz)
fuzz:
	@set -e; for t in $(FUZZ_ALL); do \
	  echo "fuzz $${t%%:*} $${t##*:} ($(FUZZTIME))"; \
	  $(GO) test -run='^$$' -fuzz="^$${t##*:}$$" -fuzztime=$(FUZZTIME) $${t%%:*}; \
	done

test-wasm:
	GOOS=js GOARCH=wasm $(GO) test -count=1 -exec "$(GOJSEXEC)" ./wasm/...

## test-browser: the page in headless chromium (installed from Debian when missing and root)
test-browser: build dist chromium
	EDGEWISE_E2E=require EDGEWISE_CHROMIUM=$(CHROMIUM) $(GO) test -count=1 -v -timeout 45m ./scripts/e2e/ 2>&1 | tee /tmp/edgewise-e2e.log | grep -E '^(=== RUN|--- |PASS|FAIL|ok|panic)|_test.go' ; \
	  exit $${PIPESTATUS[0]}

chromium:
	@if [ -x "$(CHROMIUM)" ]; then exit 0; fi; \
	if [ "$$(id -u)" = 0 ]; then \
	  echo "chromium is missing: installing Debian's package"; \
	  apt-get update -qq && DEBIAN_FRONTEND=noninteractive apt-get install -y -qq chromium >/dev/null; \
	else \
	  echo "The browser tests need Debian's chromium. Install it with:"; \
	  echo "  sudo apt-get update && sudo apt-get install -y chromium"; \
	  exit 1; \
	fi

## dist: dist/site/ for any static server, dist/edgewise.html for offline use;
## prints both sizes and fails if one grew by more than 5% over testdata/size-baseline.txt
dist: build
	rm -rf dist/site && mkdir -p dist/site
	cp site/*.html site/*.js site/*.css site/*.json site/app.wasm dist/site/
	$(GO) run ./scripts/bundle -site site -o dist/edgewise.html
	@$(MAKE) --no-print-directory sizes

# The size report. testdata/size-baseline.txt holds one line per artefact,
# "NAME BYTES"; a size more than 5% over its baseline fails the build (a
# size over its target only warns). After a change that grows or shrinks
# the engine on purpose, record the new sizes with `make size-baseline`
# and commit the file with that change.
SIZE_BASELINE := testdata/size-baseline.txt
SIZE_FILES    := app.wasm=site/app.wasm edgewise.html=dist/edgewise.html
SIZE_TARGETS  := app.wasm=3.5 edgewise.html=1.5

sizes:
	@status=0; for f in $(SIZE_FILES); do \
	  name=$${f%%=*}; path=$${f#*=}; bytes=$$(stat -c %s $$path); \
	  target=$$(for t in $(SIZE_TARGETS); do [ "$${t%%=*}" = $$name ] && echo $${t#*=}; done); \
	  base=$$(awk -v n=$$name '$$1 == n { print $$2 }' $(SIZE_BASELINE) 2>/dev/null); \
	  awk -v n=$$name -v b=$$bytes -v t=$$target -v base="$$base" 'BEGIN { \
	    line = sprintf("size: %s %.2f MiB (%d bytes; target <= %s MiB", n, b/1048576, b, t); \
	    if (base == "") { print line "; no baseline in $(SIZE_BASELINE))"; exit 0 } \
	    d = 100 * (b - base) / base; \
	    printf "%s; baseline %d bytes, %+.1f%%)\n", line, base, d; \
	    if (b > t * 1048576) print "size: warning: " n " is over its target"; \
	    if (d > 5) { print "size: FAILED: " n " grew " sprintf("%.1f", d) "% over the baseline (more than 5%); if that is intended, run make size-baseline and commit $(SIZE_BASELINE) with the change"; exit 1 } }' \
	  || status=1; \
	done; exit $$status

## size-baseline: record the current sizes (after make dist) as the baseline
size-baseline:
	@{ echo "# make dist fails when an artefact grows more than 5% over its size here (bytes)"; \
	  for f in $(SIZE_FILES); do echo "$${f%%=*} $$(stat -c %s $${f#*=})"; done; } > $(SIZE_BASELINE)
	@cat $(SIZE_BASELINE)

## size-parts: what app.wasm is made of, part by part (a build that keeps the function names)
size-parts:
	GOOS=js GOARCH=wasm $(GO) build -trimpath -ldflags='-w' -o $${TMPDIR:-/tmp}/edgewise-parts.wasm ./wasm
	$(GO) run ./scripts/wasmsize -funcs 20 $${TMPDIR:-/tmp}/edgewise-parts.wasm

## tiering: the engine's functions the browser's optimizing compiler takes up during the demo's first solve (Node)
tiering:
	GOOS=js GOARCH=wasm $(GO) build -trimpath -o $${TMPDIR:-/tmp}/edgewise-named.wasm ./wasm
	GOROOT_WASM=$(GOROOT)/lib/wasm node scripts/tiering/tiering.js $${TMPDIR:-/tmp}/edgewise-named.wasm site/demo.json

## bench: the Go benchmarks
bench:
	$(GO) test -run='^$$' -bench=. -benchmem ./solver/...

## bench-browser: edit-to-picture time and, from the offline file, time to the first picture, in headless chromium
bench-browser: build dist chromium
	EDGEWISE_E2E=require EDGEWISE_CHROMIUM=$(CHROMIUM) $(GO) test -count=1 -run='^$$' -bench=EditToPicture -benchtime=20x ./scripts/e2e/
	EDGEWISE_E2E=require EDGEWISE_CHROMIUM=$(CHROMIUM) $(GO) test -count=1 -run='^$$' -bench=FirstPicture -benchtime=5x ./scripts/e2e/

# FUZZTIME from the environment or the command line wins; when it is unset
# test-fuzz runs 200000 inputs per target and `make fuzz` two minutes.
ifeq ($(origin FUZZTIME),undefined)
test-fuzz: FUZZTIME = 200000x
fuzz: FUZZTIME = 2m
endif

clean:
	rm -rf dist site/app.wasm site/wasm_exec.js site/checks.json site/physics.json site/colours.json
