package report

import (
	"bytes"
	"encoding/csv"
	"encoding/json"
	"math"
	"strconv"
	"strings"
	"testing"
)

// slab is a heat slab between two full-side terminals: the temperature
// falls linearly from 100 at the left to 20 at the right, so every answer
// is known exactly.
const slab = `{"schema":"edgewise/1","title":"slab","physics":"heat","width":0.5,"height":0.1,"conductivity":40,
 "edges":{"bottom":{"kind":"flux","expr":"0"},"top":{"kind":"flux","expr":"0"},
 "left":{"kind":"value","expr":"100"},"right":{"kind":"value","expr":"20"}}}`

// The report carries the trade's answers in its own terms: thermal
// conductance k H / W = 8 W/(m·K) and resistance 0.125 m·K/W (exact).
func TestReportAnswers(t *testing.T) {
	p, out := solved(t, slab)
	rep := Build(p, out, "today", "test")
	rep.SetProfile(p, out, ProfileLine{0, 0.05, 0.5, 0.05})
	var doc struct {
		Answers []struct {
			Caption string     `json:"caption"`
			Rows    [][]string `json:"rows"`
		} `json:"answers"`
		Profile struct {
			Rows [][]string `json:"rows"`
		} `json:"profile"`
	}
	if err := json.Unmarshal(rep.JSON(), &doc); err != nil {
		t.Fatal(err)
	}
	cells := map[string]string{}
	for _, tb := range doc.Answers {
		for _, r := range tb.Rows {
			cells[r[0]] = strings.Join(r[1:], "|")
		}
	}
	for k, want := range map[string]string{
		"thermal conductance per metre of depth [W/(m·K)]": "8",
		"thermal resistance per metre of depth [m·K/W]":    "0.125",
		"shape factor Q/(k ΔU)":                            "0.2",
		"flow channels":                                    "8",
		"potential drops (square cells)":                   "40",
	} {
		if got := cells[k]; got != want {
			t.Errorf("%q = %q, want %q (rows %v)", k, got, want, cells)
		}
	}
	// the profile in the report: every tenth of 100 intervals, linear
	if len(doc.Profile.Rows) != 11 {
		t.Fatalf("%d profile rows, want 11", len(doc.Profile.Rows))
	}
	for i, r := range doc.Profile.Rows {
		v, _ := strconv.ParseFloat(r[3], 64)
		if want := 100 - 80*float64(i)/10; math.Abs(v-want) > 1e-6 {
			t.Errorf("profile row %d: %v, want temperature %g", i, r, want)
		}
	}
}

// The profile CSV: a header with units and 101 rows along the line, the
// values from the series.
func TestProfileCSV(t *testing.T) {
	p, out := solved(t, slab)
	line := ProfileLine{0.1, 0, 0.1, 0.1}
	d, err := Make(ProfileCSV, p, out, PictureOptions{Profile: &line})
	if err != nil {
		t.Fatal(err)
	}
	rows, err := csv.NewReader(bytes.NewReader(d.Data)).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	if d.Name != "slab-profile.csv" || len(rows) != 102 || strings.Join(rows[0], "|") !=
		"distance [m]|x [m]|y [m]|temperature [°C]|grad_x [K/m]|grad_y [K/m]|flux_x [W/m²]|flux_y [W/m²]" {
		t.Fatalf("name %q, %d rows, header %v", d.Name, len(rows), rows[0])
	}
	for _, r := range rows[1:] {
		v, _ := strconv.ParseFloat(r[3], 64)
		q, _ := strconv.ParseFloat(r[6], 64)
		// T = 100 - 160 x; flux 40 * 160 = 6400 W/m²
		if math.Abs(v-84) > 1e-6 || math.Abs(q-6400) > 1e-6 {
			t.Errorf("row %v: want 84 °C and 6400 W/m²", r)
		}
	}
	if _, err := Make(ProfileCSV, p, out, PictureOptions{}); err == nil {
		t.Error("a profile download with no line was accepted")
	}
}

// Each physics puts its own answers in the report, named in its terms.
func TestReportAnswersEachPhysics(t *testing.T) {
	for physics, want := range map[string][]string{
		"electrostatic": {"capacitance per metre of depth [F/m]", "dielectric assumed", "peak / breakdown"},
		"seepage":       {"discharge per metre [m³/day]", "critical hydraulic gradient", "exit gradient on right[0]"},
		"generic":       {"conductance per metre of depth", "flow channels"},
	} {
		text := strings.Replace(slab, `"physics":"heat"`, `"physics":"`+physics+`"`, 1)
		p, out := solved(t, text)
		rep := Build(p, out, "today", "test")
		var rows []string
		for _, tb := range rep.Answers {
			for _, r := range tb.Rows {
				rows = append(rows, r[0])
			}
		}
		all := strings.Join(rows, "|")
		for _, w := range want {
			if !strings.Contains(all, w) {
				t.Errorf("%s: no row %q in %q", physics, w, all)
			}
		}
	}
}
