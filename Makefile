# edgewise: build, run and test. `make run` and `make test` are the two
# commands that matter; see README.md.

SHELL     := /bin/bash
GO        ?= go
GOROOT    := $(shell $(GO) env GOROOT)
PORT      ?= 8080
CHROMIUM  ?= $(shell command -v chromium 2>/dev/null || echo /usr/bin/chromium)
WASMEXEC  := $(GOROOT)/lib/wasm/wasm_exec.js
GOJSEXEC  := $(GOROOT)/lib/wasm/go_js_wasm_exec
FUZZTIME  ?= 200000x
# the build's name in reports: the commit it was built from
RELEASE   ?= $(shell git describe --tags --always --dirty 2>/dev/null || echo unknown)
NATIVE    := $(shell $(GO) list ./... | grep -v /scripts/e2e)

.PHONY: all build run test vet test-native test-wasm test-fuzz test-browser chromium dist bench bench-browser fuzz clean

all: build

## build: the engine as WebAssembly next to the page, with the matching wasm_exec.js
## and the published check cases (testdata/checks.json) for the page's checks panel
build: site/app.wasm site/wasm_exec.js site/checks.json site/physics.json

site/checks.json: $(wildcard testdata/checks.json)
	@if [ -f testdata/checks.json ]; then cp testdata/checks.json $@; else echo '{"cases": []}' > $@; fi

# the physics table (names, units, labels, hints) as the page reads it
site/physics.json: $(wildcard solver/physics/*.go solver/physics/examples/*.json solver/jsonlite/*.go scripts/physicsjson/*.go)
	$(GO) run ./scripts/physicsjson -o $@

site/app.wasm: $(shell find solver wasm -name '*.go' -not -name '*_test.go') go.mod go.sum
	GOOS=js GOARCH=wasm $(GO) build -trimpath -ldflags='-s -w -X edgewise/solver/report.Release=$(RELEASE)' -o $@ ./wasm

site/wasm_exec.js: $(WASMEXEC)
	cp $< $@

## run: build and serve the page on localhost with the demo project
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
FUZZ_QUICK := ./solver/expr:FuzzParse ./solver/expr:FuzzEval ./solver/jsonlite:FuzzParse ./solver:FuzzDecode
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
	EDGEWISE_E2E=require EDGEWISE_CHROMIUM=$(CHROMIUM) $(GO) test -count=1 -v -timeout 20m ./scripts/e2e/ 2>&1 | tee /tmp/edgewise-e2e.log | grep -E '^(=== RUN|--- |PASS|FAIL|ok|panic)|_test.go' ; \
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

## dist: dist/site/ for any static server, dist/edgewise.html for offline use
dist: build
	rm -rf dist/site && mkdir -p dist/site
	cp site/*.html site/*.js site/*.css site/*.json site/app.wasm dist/site/
	$(GO) run ./scripts/bundle -site site -o dist/edgewise.html
	@wasm=$$(stat -c %s site/app.wasm); html=$$(stat -c %s dist/edgewise.html); \
	  awk -v w=$$wasm -v h=$$html 'BEGIN { \
	    printf "size: app.wasm %.2f MiB (target <= 3.5 MiB)\n", w/1048576; \
	    printf "size: edgewise.html %.2f MiB (target <= 1.5 MiB)\n", h/1048576; \
	    if (w > 3.5*1048576 || h > 1.5*1048576) print "size: WARNING: over target" }'

## bench: the Go benchmarks
bench:
	$(GO) test -run='^$$' -bench=. -benchmem ./solver/...

## bench-browser: edit-to-picture time in headless chromium
bench-browser: build chromium
	EDGEWISE_E2E=require EDGEWISE_CHROMIUM=$(CHROMIUM) $(GO) test -count=1 -run='^$$' -bench=. -benchtime=20x ./scripts/e2e/

fuzz: FUZZTIME=2m

clean:
	rm -rf dist site/app.wasm site/wasm_exec.js site/checks.json
