package main

import (
	"bytes"
	"encoding/csv"
	"encoding/json"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

const square = `{"schema":"edgewise/1","physics":"heat","width":1,"height":1,"conductivity":2,
 "edges":{"bottom":{"kind":"value","expr":"0"},"top":{"kind":"value","expr":"1"},
 "left":{"kind":"value","expr":"0"},"right":{"kind":"value","expr":"0"}},
 "probes":[{"x":0.5,"y":0.5,"label":"centre"}]}`

func TestSolvePrintsResult(t *testing.T) {
	dir := t.TempDir()
	proj := filepath.Join(dir, "p.json")
	if err := os.WriteFile(proj, []byte(square), 0o644); err != nil {
		t.Fatal(err)
	}
	csvPath := filepath.Join(dir, "field.csv")
	var out, errb bytes.Buffer
	if st := run([]string{"-grid", "8", "-csv", csvPath, proj}, nil, &out, &errb); st != 0 {
		t.Fatalf("exit %d, stderr %q", st, errb.String())
	}
	var r struct {
		Schema string
		Probes []struct{ Value float64 }
		Grid   struct{ Nx, Ny int }
	}
	if err := json.Unmarshal(out.Bytes(), &r); err != nil {
		t.Fatalf("stdout is not JSON: %v\n%s", err, out.String())
	}
	// Exact identity: a square with one edge at 1 and three at 0 is 1/4 at
	// the centre.
	if r.Schema != "edgewise-result/1" || len(r.Probes) != 1 || r.Grid.Nx != 8 || r.Grid.Ny != 8 {
		t.Fatalf("result %+v", r)
	}
	if v := r.Probes[0].Value; v < 0.25-1e-6 || v > 0.25+1e-6 {
		t.Errorf("centre = %v, want 0.25", v)
	}
	f, err := os.Open(csvPath)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	rows, err := csv.NewReader(f).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	if len(rows) != 1+9*9 || !strings.HasPrefix(strings.Join(rows[0], ","), "x [m],y [m],temperature [°C]") {
		t.Errorf("CSV has %d rows, header %q", len(rows), rows[0])
	}
}

func TestSolveBadInput(t *testing.T) {
	tests := []struct {
		name, project string
		args          []string
		want          string
	}{
		{"formula", strings.Replace(square, `"expr":"1"`, `"expr":"1 + tt"`, 1), nil,
			`edges.top.expr: col 5: unknown name "tt"`},
		{"field", strings.Replace(square, `"width":1`, `"width":0`, 1), nil,
			"width: must be greater than zero, got 0"},
		{"not json", `{"schema": `, nil, "not a project file: JSON syntax error at line 1, col 12: unexpected end of text"},
		{"grid flag", square, []string{"-grid", "1"}, "-grid: must be from 2 to 1024, got 1"},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			var out, errb bytes.Buffer
			args := append(tc.args, "-")
			st := run(args, strings.NewReader(tc.project), &out, &errb)
			if st != 1 {
				t.Errorf("exit %d, want 1", st)
			}
			if got := errb.String(); got != tc.want+"\n" {
				t.Errorf("stderr %q, want the one line %q", got, tc.want)
			}
			if out.Len() != 0 {
				t.Errorf("stdout %q, want nothing", out.String())
			}
		})
	}
}
