package main

import (
	"bytes"
	"os"
	"path/filepath"
	"sort"
	"strconv"
	"strings"
	"testing"
)

const (
	plate = "../../testdata/study/plate.json"
	sweep = "../../testdata/study/sweep.json"
	seek  = "../../testdata/study/seek.json"
)

func runOK(t *testing.T, args ...string) string {
	t.Helper()
	var out, errb bytes.Buffer
	if st := run(args, nil, &out, &errb); st != 0 {
		t.Fatalf("%v: exit %d, stderr %q", args, st, errb.String())
	}
	return out.String()
}

// -j changes nothing in the output, byte for byte.
func TestStudyWorkersSameBytes(t *testing.T) {
	one := runOK(t, "-study", sweep, "-j", "1", plate)
	four := runOK(t, "-study", sweep, "-j", "4", plate)
	if one != four {
		t.Errorf("-j 1:\n%s\n-j 4:\n%s", one, four)
	}
	lines := strings.Split(strings.TrimSuffix(one, "\n"), "\n")
	if len(lines) != 16 || lines[0] != "row,h_top,k_plate,max.value,probes.T1.value,edges.top.flow,edges.bottom.flow,balance,error" {
		t.Errorf("%d lines, header %q", len(lines), lines[0])
	}
}

// The shards' rows, merged as the README says (header once, rows sorted by
// the row column), are the unsharded output byte for byte.
func TestStudyShardsMerge(t *testing.T) {
	whole := runOK(t, "-study", sweep, plate)
	const n = 4
	var header string
	var rows []string
	for i := range n {
		part := strings.Split(strings.TrimSuffix(runOK(t, "-study", sweep, "-shard", strconv.Itoa(i)+"/"+strconv.Itoa(n), plate), "\n"), "\n")
		if i == 0 {
			header = part[0]
		} else if part[0] != header {
			t.Errorf("shard %d header %q, shard 0 %q", i, part[0], header)
		}
		for _, r := range part[1:] {
			if k := rowIndex(t, r); k%n != i {
				t.Errorf("shard %d/%d has row %d", i, n, k)
			}
		}
		rows = append(rows, part[1:]...)
	}
	sort.SliceStable(rows, func(a, b int) bool { return rowIndex(t, rows[a]) < rowIndex(t, rows[b]) })
	if merged := header + "\n" + strings.Join(rows, "\n") + "\n"; merged != whole {
		t.Errorf("merged shards:\n%s\nunsharded:\n%s", merged, whole)
	}
}

func rowIndex(t *testing.T, line string) int {
	k, err := strconv.Atoi(line[:strings.IndexByte(line, ',')])
	if err != nil {
		t.Fatal(err)
	}
	return k
}

func TestStudySeek(t *testing.T) {
	out := strings.Split(runOK(t, "-study", seek, plate), "\n")
	if len(out) != 3 || out[0] != "h_top,bracket,probes.T1.value,target,tolerance,accuracy.estimate,solves,edges.top.flow,max.value" {
		t.Fatalf("seek output %q", out)
	}
	f := strings.Split(out[1], ",")
	h, _ := strconv.ParseFloat(f[0], 64)
	v, _ := strconv.ParseFloat(f[2], 64)
	tol, _ := strconv.ParseFloat(f[4], 64)
	if !(h > 5 && h < 500) || !(tol > 0) || v < 100-tol || v > 100+tol {
		t.Errorf("seek row %q", out[1])
	}
}

// A failed row prints its error in the last column (quoted as CSV quotes a
// field with a comma), the others are solved,
// and the exit status says a row failed.
func TestStudyFailedRowExitStatus(t *testing.T) {
	st := filepath.Join(t.TempDir(), "s.json")
	if err := os.WriteFile(st, []byte(`{"schema": "edgewise-study/1", "vary": [{"name": "h_top", "values": [25, -5, 50]}],
	  "report": ["max.value"]}`), 0o644); err != nil {
		t.Fatal(err)
	}
	var out, errb bytes.Buffer
	if code := run([]string{"-study", st, plate}, nil, &out, &errb); code != 1 {
		t.Errorf("exit %d, want 1", code)
	}
	lines := strings.Split(strings.TrimSuffix(out.String(), "\n"), "\n")
	if len(lines) != 4 || lines[2] != `1,-5,,"edges.top.h: convection coefficient must be zero or more, got -5"` ||
		!strings.HasSuffix(lines[3], ",") || strings.Count(lines[3], ",") != 3 {
		t.Errorf("output:\n%s", out.String())
	}
	if errb.String() != "1 rows failed (their error is in the last column)\n" {
		t.Errorf("stderr %q", errb.String())
	}
}

func TestStudyBadInput(t *testing.T) {
	bad := filepath.Join(t.TempDir(), "bad.json")
	if err := os.WriteFile(bad, []byte(`{"schema": "edgewise-study/1", "vary": [{"name": "h_top", "from": 0, "to": 9, "steps": 4, "scale": "log"}], "report": ["mean"]}`), 0o644); err != nil {
		t.Fatal(err)
	}
	for _, c := range []struct {
		args []string
		want string
	}{
		{[]string{"-study", sweep, "-shard", "4/4", plate}, "-shard: index 4 is out of range for 4 shards (0 <= I < 4)"},
		{[]string{"-study", sweep, "-shard", "-1/4", plate}, "-shard: index -1 is out of range for 4 shards (0 <= I < 4)"},
		{[]string{"-study", sweep, "-shard", "1/0", plate}, "-shard: the number of shards must be 1 or more, got 0"},
		{[]string{"-study", sweep, "-shard", "2", plate}, `-shard: expected I/N such as 0/4 (job I of N), got "2"`},
		{[]string{"-study", seek, "-shard", "0/2", plate}, "-shard: a seek runs as one job and cannot be split"},
		{[]string{"-shard", "0/2", plate}, "-shard and -j need -study STUDY.json"},
		{[]string{"-study", sweep, "-j", "-2", plate}, "-j: must be 1 or more (0: one worker per core), got -2"},
		{[]string{"-study", bad, plate}, bad + ": vary[0].from: a log scale needs both ends above zero, got 0"},
	} {
		var out, errb bytes.Buffer
		if st := run(c.args, nil, &out, &errb); st != 1 || errb.String() != c.want+"\n" || out.Len() != 0 {
			t.Errorf("%v: exit %d, stdout %q, stderr %q; want %q", c.args, st, out.String(), errb.String(), c.want)
		}
	}
}
