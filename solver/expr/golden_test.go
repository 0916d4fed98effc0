package expr

import (
	"bufio"
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
)

// TestGolden runs the cases in testdata/expr/*.txt; the format is in the
// README.md there.
func TestGolden(t *testing.T) {
	files, err := filepath.Glob("../../testdata/expr/*.txt")
	if err != nil || len(files) == 0 {
		t.Fatalf("no golden files (%v)", err)
	}
	cases := 0
	for _, name := range files {
		cases += runGolden(t, name)
	}
	if cases < 30 {
		t.Errorf("only %d golden cases ran", cases)
	}
}

func runGolden(t *testing.T, name string) (cases int) {
	f, err := os.Open(name)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	base := filepath.Base(name)
	var (
		src     string
		e       *Expr
		cerr    error
		checked bool
		line    int
	)
	flush := func() {
		if src != "" && !checked {
			t.Errorf("%s: formula %q has no expectations", base, src)
		}
	}
	sc := bufio.NewScanner(f)
	for sc.Scan() {
		line++
		text := sc.Text()
		where := base + ":" + strconv.Itoa(line)
		if strings.TrimSpace(text) == "" || strings.HasPrefix(text, "#") {
			continue
		}
		if !strings.HasPrefix(text, "\t") {
			flush()
			src, checked = text, false
			e, cerr = Compile(src, edgeVars...)
			continue
		}
		if src == "" {
			t.Fatalf("%s: expectation before any formula", where)
		}
		key, want, ok := strings.Cut(strings.TrimPrefix(text, "\t"), ": ")
		if !ok {
			t.Fatalf("%s: want \"key: value\", got %q", where, text)
		}
		checked = true
		cases++
		if key == "error" || key == "caret" {
			if cerr == nil {
				t.Errorf("%s: %q compiled, want error", where, src)
				continue
			}
			got := cerr.Error()
			if key == "caret" {
				_, got = Caret(src, cerr)
				if want, err = strconv.Unquote(want); err != nil {
					t.Fatalf("%s: caret is not a quoted string: %v", where, err)
				}
			}
			if got != want {
				t.Errorf("%s: %s of %q:\n got  %q\n want %q", where, key, src, got, want)
			}
			continue
		}
		if cerr != nil {
			t.Errorf("%s: Compile(%q): %v", where, src, cerr)
			continue
		}
		switch {
		case key == "print":
			if got := e.String(); got != want {
				t.Errorf("%s: print of %q = %q, want %q", where, src, got, want)
			}
		case key == "const":
			v, isConst := e.Const()
			checkNumber(t, where, src, v, want)
			if !isConst {
				t.Errorf("%s: %q did not fold to a constant", where, src)
			}
		case strings.HasPrefix(key, "at "):
			vals := make([]float64, len(edgeVars))
			for _, kv := range strings.Fields(strings.TrimPrefix(key, "at ")) {
				n, v, _ := strings.Cut(kv, "=")
				i := indexOf(edgeVars, n)
				x, err := strconv.ParseFloat(v, 64)
				if i < 0 || err != nil {
					t.Fatalf("%s: bad variable setting %q", where, kv)
				}
				vals[i] = x
			}
			checkNumber(t, where, src, e.Eval(vals), want)
		default:
			t.Fatalf("%s: unknown key %q", where, key)
		}
	}
	flush()
	if err := sc.Err(); err != nil {
		t.Fatal(err)
	}
	return cases
}

// checkNumber compares with a relative tolerance of 1e-12 (a few roundings).
func checkNumber(t *testing.T, where, src string, got float64, wantText string) {
	t.Helper()
	want, err := strconv.ParseFloat(wantText, 64)
	if err != nil {
		t.Fatalf("%s: bad number %q", where, wantText)
	}
	if math.Abs(got-want) > 1e-12*max(1, math.Abs(want)) {
		t.Errorf("%s: %q = %.17g, want %v", where, src, got, want)
	}
}

func indexOf(list []string, s string) int {
	for i, v := range list {
		if v == s {
			return i
		}
	}
	return -1
}
