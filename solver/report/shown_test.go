package report

import (
	"math"
	"slices"
	"strconv"
	"strings"
	"testing"

	"edgewise/solver/project"
)

// Every kind and unit name the project file allows has its conversion
// here, and no other.
func TestShownCoversDisplayKinds(t *testing.T) {
	if len(kindUnits) != len(project.DisplayKinds) {
		t.Errorf("%d kinds here, %d in the project file", len(kindUnits), len(project.DisplayKinds))
	}
	for _, k := range project.DisplayKinds {
		units, ok := kindUnits[k.Kind]
		if !ok || len(units) != len(k.Units) {
			t.Errorf("kind %q: %v here, %v in the file", k.Kind, units, k.Units)
			continue
		}
		for _, u := range k.Units {
			if _, ok := units[u]; !ok {
				t.Errorf("kind %q: no conversion for %q", k.Kind, u)
			}
		}
	}
}

// The report of a project shown in °F, inches and Btu/h: absolute
// temperatures get 9/5 T + 32, differences 9/5 (exact), and the Btu
// units match NIST SP 811 (2008), Appendix B.9 (from memory, 7 digits):
// 1 Btu_IT/(h·ft·°F) = 1.730735 W/(m·K).
func TestReportInDisplayUnits(t *testing.T) {
	si := strings.Replace(square, `"grid"`, `"source":1000,"grid"`, 1)
	p, out := solved(t, si)
	base := Build(p, out, "d", "v")
	q, out2 := solved(t, strings.Replace(si, `"grid"`, `"display":{"length":"in","temperature":"degF","heat":"BTU/h"},"grid"`, 1))
	rep := Build(q, out2, "d", "v")
	cell := func(r *Report, tb *Table, row, col int) float64 {
		t.Helper()
		f, err := strconv.ParseFloat(tb.Rows[row][col], 64)
		if err != nil {
			t.Fatalf("%s row %d col %d: %v", tb.Caption, row, col, err)
		}
		return f
	}
	check := func(what string, got, want, rel float64) {
		t.Helper()
		if math.Abs(got-want) > rel*math.Abs(want) {
			t.Errorf("%s: %.7g, want %.7g", what, got, want)
		}
	}
	const six = 5e-6 // the report prints six digits: half a unit in the sixth
	check("maximum temperature (°F)", cell(rep, &rep.Extremes, 1, 1), 1.8*cell(base, &base.Extremes, 1, 1)+32, six)
	check("x of the maximum (in)", cell(rep, &rep.Extremes, 1, 2), cell(base, &base.Extremes, 1, 2)/0.0254, six)
	check("error estimate (°F, a difference)", cell(rep, &rep.Accuracy, 1, 1), 1.8*cell(base, &base.Accuracy, 1, 1), six)
	check("width (in)", cell(rep, &rep.Inputs, 1, 1), 1/0.0254, six)
	check("conductivity (Btu/(h·ft·°F))", cell(rep, &rep.Inputs, 3, 1), 2/1.730735, six)
	check("probe temperature (°F)", cell(rep, &rep.Probes, 0, 3), 1.8*cell(base, &base.Probes, 0, 3)+32, six)
	check("probe gradient (°F/in)", cell(rep, &rep.Probes, 0, 5), cell(base, &base.Probes, 0, 5)*1.8*0.0254, six)
	for _, h := range []string{"temperature [°F]", "x [in]"} {
		if !slices.Contains(rep.Extremes.Head, h) {
			t.Errorf("extremes head %q, want %q", rep.Extremes.Head, h)
		}
	}
	if got := rep.Inputs.Rows[3][0]; got != "thermal conductivity [Btu/(h·ft·°F)]" {
		t.Errorf("conductivity row %q", got)
	}
	if got := rep.Accuracy.Rows[1][0]; !strings.HasSuffix(got, "[°F]") {
		t.Errorf("error estimate row %q, want °F", got)
	}
	// the SI report is unchanged by the conversions
	if base.Extremes.Head[1] != "temperature [°C]" || base.Inputs.Rows[1][1] != "1" {
		t.Errorf("SI report: %q, %q", base.Extremes.Head, base.Inputs.Rows[1])
	}
}
