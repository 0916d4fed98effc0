package report

import (
	"bytes"
	"encoding/csv"
	"encoding/xml"
	"io"
	"slices"
	"strconv"
	"strings"
	"testing"

	"edgewise/solver"
	"edgewise/solver/contour"
	"edgewise/solver/csp"
	"edgewise/solver/fdcheck"
	"edgewise/solver/jsonlite"
	"edgewise/solver/problem"
	"edgewise/solver/project"
	"edgewise/solver/series"
)

// square is a unit square with the top edge at 1 and the others at 0: the
// engine solves it in every stage of its development.
const square = `{"schema":"edgewise/1","title":"Plate <b>\"A\"</b>, test","physics":"heat","width":1,"height":1,
 "conductivity":2,"edges":{"bottom":{"kind":"value","expr":"0"},"top":{"kind":"value","expr":"1"},
 "left":{"kind":"value","expr":"0"},"right":{"kind":"value","expr":"0"}},
 "probes":[{"x":0.5,"y":0.5,"label":"=centre"},{"x":0.25,"y":0.75,"label":"a, b"}],"grid":{"nx":8,"ny":6}}`

func solved(t *testing.T, text string) (*project.Project, *solver.Output) {
	t.Helper()
	p, err := project.Decode([]byte(text))
	if err != nil {
		t.Fatal(err)
	}
	var s solver.Solver
	out, err := s.Solve(p, solver.Options{NoCrossCheck: true})
	if err != nil {
		t.Fatal(err)
	}
	return p, out
}

func TestFieldCSV(t *testing.T) {
	p, out := solved(t, square)
	d, err := Make(FieldCSV, p, out, PictureOptions{})
	if err != nil {
		t.Fatal(err)
	}
	if d.Name != "plate-b-a-b-test-field.csv" || !strings.HasPrefix(d.MIME, "text/csv") {
		t.Errorf("name %q, mime %q", d.Name, d.MIME)
	}
	rows, err := csv.NewReader(bytes.NewReader(d.Data)).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	want := []string{"x [m]", "y [m]", "temperature [°C]", "grad_x [°C/m]", "grad_y [°C/m]", "flux_x [W/m²]", "flux_y [W/m²]"}
	if strings.Join(rows[0], "|") != strings.Join(want, "|") {
		t.Errorf("header %q, want %q", rows[0], want)
	}
	if len(rows) != 1+9*7 {
		t.Fatalf("%d rows, want a header and 63 nodes", len(rows))
	}
	// The flux column is -k times the gradient column (k = 2): a
	// consistency check of the columns, exact up to rounding.
	for _, r := range rows[1:] {
		g, _ := strconv.ParseFloat(r[4], 64)
		q, _ := strconv.ParseFloat(r[6], 64)
		if d := q + 2*g; d > 1e-12*(1+abs(q)) || d < -1e-12*(1+abs(q)) {
			t.Fatalf("row %q: flux_y is not -2 grad_y", r)
		}
	}
	// The last row is the top-right corner node.
	last := rows[len(rows)-1]
	if last[0] != "1" || last[1] != "1" {
		t.Errorf("last row at (%s, %s), want the node (1, 1)", last[0], last[1])
	}
}

func TestProbesCSV(t *testing.T) {
	p, out := solved(t, square)
	d, err := Make(ProbesCSV, p, out, PictureOptions{})
	if err != nil {
		t.Fatal(err)
	}
	rows, err := csv.NewReader(bytes.NewReader(d.Data)).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	if len(rows) != 3 || rows[0][0] != "label" || rows[0][3] != "temperature [°C]" {
		t.Fatalf("rows %q", rows)
	}
	// A label that looks like a formula is guarded, one with a comma quoted.
	if rows[1][0] != "'=centre" || rows[2][0] != "a, b" {
		t.Errorf("labels %q, %q", rows[1][0], rows[2][0])
	}
	// Exact identity: one edge at 1 on a square gives 1/4 at the centre
	// (the four rotations add up to 1); 1e-9 is the engine's target for
	// exact identities.
	v, _ := strconv.ParseFloat(rows[1][3], 64)
	if abs(v-0.25) > 1e-9 {
		t.Errorf("centre = %v, want 0.25", v)
	}
}

func TestPictureIsXML(t *testing.T) {
	p, out := solved(t, square)
	d, err := Make(Picture, p, out, PictureOptions{PixelW: 200, Levels: 5})
	if err != nil {
		t.Fatal(err)
	}
	if d.MIME != "image/svg+xml" || !strings.HasSuffix(d.Name, "-picture.svg") {
		t.Errorf("name %q, mime %q", d.Name, d.MIME)
	}
	dec := xml.NewDecoder(bytes.NewReader(d.Data))
	paths, texts := 0, []string{}
	inText := false
	for {
		tok, err := dec.Token()
		if err == io.EOF {
			break
		}
		if err != nil {
			t.Fatalf("not well-formed XML: %v", err)
		}
		switch e := tok.(type) {
		case xml.StartElement:
			if e.Name.Local == "path" {
				paths++
			}
			inText = e.Name.Local == "text" || e.Name.Local == "title"
		case xml.CharData:
			if inText {
				texts = append(texts, string(e))
			}
		case xml.EndElement:
			inText = false
		}
	}
	if paths == 0 {
		t.Errorf("no isoline paths")
	}
	all := strings.Join(texts, "\n")
	if !strings.Contains(all, `Plate <b>"A"</b>, test`) || !strings.Contains(all, "temperature [°C]") {
		t.Errorf("title or legend unit missing from the text: %q", all)
	}
	if bytes.Contains(d.Data, []byte("<b>")) {
		t.Errorf("the title's markup reached the SVG unescaped")
	}
}

func TestUnknownDownload(t *testing.T) {
	p, out := solved(t, square)
	if _, err := Make("pdf", p, out, PictureOptions{}); err == nil || !strings.Contains(err.Error(), `"pdf"`) {
		t.Errorf("err = %v, want one naming the kind", err)
	}
}

func TestFileName(t *testing.T) {
	for _, c := range []struct{ title, want string }{
		{"", "edgewise-x.csv"},
		{"Cold plate under a heater strip (demo)", "cold-plate-under-a-heater-strip-demo-x.csv"},
		{"../../etc/passwd", "etc-passwd-x.csv"},
		{"Wärme Ü 2", "wärme-ü-2-x.csv"},
		{"<script>", "script-x.csv"},
		{"---", "edgewise-x.csv"},
		{strings.Repeat("ab ", 40), strings.Repeat("ab-", 13) + "a-x.csv"}, // cut at 40 characters
	} {
		if got := FileName(c.title, "x", "csv"); got != c.want {
			t.Errorf("FileName(%q) = %q, want %q", c.title, got, c.want)
		}
	}
}

func TestBuild(t *testing.T) {
	p, out := solved(t, square)
	rep := Build(p, out, "2026-12-02", "revision test")
	if rep.Title != p.Title || rep.Date != "2026-12-02" || rep.Version != "revision test" {
		t.Errorf("header %q %q %q", rep.Title, rep.Date, rep.Version)
	}
	cell := func(tb Table, row string) string {
		for _, r := range tb.Rows {
			if r[0] == row {
				return r[1]
			}
		}
		t.Errorf("%s: no row %q", tb.Caption, row)
		return ""
	}
	if got := cell(rep.Inputs, "thermal conductivity [W/(m·K)]"); got != "2" {
		t.Errorf("conductivity %q", got)
	}
	if got := cell(rep.Inputs, "output grid (intervals)"); got != "8 x 6" {
		t.Errorf("grid %q", got)
	}
	if got := cell(rep.Edges, "top"); got != "value" {
		t.Errorf("top kind %q", got)
	}
	if rep.Edges.Rows[problem.Top][2] != "temperature = 1 °C" {
		t.Errorf("top condition %q", rep.Edges.Rows[problem.Top][2])
	}
	if len(rep.Probes.Rows) != 2 || rep.Probes.Rows[0][0] != "=centre" {
		t.Errorf("probe rows %q (labels stay as the user wrote them: the page shows them as text)", rep.Probes.Rows)
	}
	if len(rep.Probes.Head) != len(rep.Probes.Rows[0]) {
		t.Errorf("probe head has %d cells, rows %d", len(rep.Probes.Head), len(rep.Probes.Rows[0]))
	}
	// The balance row says why there is no number when a flow is infinite.
	bal := cell(rep.Flows, "balance (sum, should be 0)")
	if out.Result.Balance == nil && !strings.Contains(bal, "infinite") {
		t.Errorf("balance %q with no balance number", bal)
	}
	if out.Result.Balance != nil && bal != num(*out.Result.Balance) {
		t.Errorf("balance %q, want %v", bal, *out.Result.Balance)
	}
	if len(rep.Methods) < 4 || !strings.Contains(strings.Join(rep.Methods, "\n"), "Sine series") {
		t.Errorf("methods %q", rep.Methods)
	}
}

// The methods text is assembled from the packages that implement each
// method: every sentence they give for the solved problem is in the
// report, in their order. The project has every kind of edge, a step of
// value and a step of flux inside edges, a source and orthotropy, so that
// every conditional sentence is asked for.
func TestMethodsComeFromEachPackage(t *testing.T) {
	const text = `{"schema":"edgewise/1","physics":"heat","width":2,"height":1,"conductivity":{"x":2,"y":1},"source":5,
	 "edges":{"bottom":{"kind":"value","expr":"when(s < 1, 8, 2)"},"top":{"kind":"convection","h":12,"ambient":"20"},
	 "left":{"kind":"flux","expr":"when(s < 0.5, 100, 0)"},"right":{"kind":"value","expr":"5"}}, "grid":{"nx":8,"ny":6}}`
	p, err := project.Decode([]byte(text))
	if err != nil {
		t.Fatal(err)
	}
	var s solver.Solver
	out, err := s.Solve(p, solver.Options{})
	if err != nil {
		t.Fatal(err)
	}
	pr, err := project.Compile(p)
	if err != nil {
		t.Fatal(err)
	}
	var want []string
	want = append(want, series.Method(pr)...)
	want = append(want, series.BreakMethod(pr)...)
	want = append(want, fdcheck.Method, contour.Method)
	got := Build(p, out, "today", "v").Methods
	if len(series.BreakMethod(pr)) != 2 {
		t.Errorf("step methods %q, want one for the value step and one for the flux step", series.BreakMethod(pr))
	}
	at := 0
	for _, w := range want {
		k := slices.Index(got[at:], w)
		if k < 0 {
			t.Errorf("the report's methods lack, or misplace, %q", w)
			continue
		}
		at += k + 1
	}
	for _, stale := range []string{"bilinear", "discrete sine transform)", "1/n^3"} {
		if joined := strings.Join(got, "\n"); strings.Contains(joined, stale) {
			t.Errorf("methods still say %q:\n%s", stale, joined)
		}
	}
}

// The report's JSON reads back with the same tables.
func TestReportJSON(t *testing.T) {
	p, out := solved(t, square)
	rep := Build(p, out, "today", "v")
	tree, err := jsonlite.Parse(rep.JSON())
	if err != nil {
		t.Fatal(err)
	}
	m := tree.(map[string]any)
	if m["title"] != p.Title || m["date"] != "today" {
		t.Errorf("title %v date %v", m["title"], m["date"])
	}
	probes := m["probes"].(map[string]any)
	rows := probes["rows"].([]any)
	if len(rows) != 2 || rows[0].([]any)[0] != "=centre" || rows[0].([]any)[3] != rep.Probes.Rows[0][3] {
		t.Errorf("probe rows %v", rows)
	}
	if len(m["methods"].([]any)) != len(rep.Methods) {
		t.Errorf("methods %v", m["methods"])
	}
	// the downloaded report's policy comes from the one source
	if m["csp"] != csp.Report() {
		t.Errorf("csp %v, want csp.Report()", m["csp"])
	}
}

func TestVersion(t *testing.T) {
	if v := Version(); v != "development build" {
		t.Errorf("version %q without a Release", v)
	}
	Release = "2026.12-test"
	defer func() { Release = "" }()
	if v := Version(); v != "2026.12-test" {
		t.Errorf("version %q, want the Release", v)
	}
}

func abs(x float64) float64 {
	if x < 0 {
		return -x
	}
	return x
}

// A report of a project with segments lists each segment's flow and mean
// under its edge, the flows being the result's, and shows an h formula as
// written.
func TestBuildSegments(t *testing.T) {
	p, out := solved(t, `{"schema":"edgewise/1","physics":"seepage","width":30,"height":10,"conductivity":1e-5,
	 "edges":{"bottom":{"kind":"flux","expr":"0"},"left":{"kind":"convection","h":"when(y < 5, 0, 1e-6)","ambient":"9"},"right":{"kind":"flux","expr":"0"},
	 "top":{"segments":[{"to":10,"kind":"value","expr":"12"},{"to":20,"kind":"flux","expr":"0"},{"kind":"value","expr":"2"}]}},"grid":{"nx":30,"ny":10}}`)
	rep := Build(p, out, "2026-12-02", "revision test")
	var rows []string
	for _, r := range rep.Flows.Rows {
		if strings.HasPrefix(r[0], "  top[") {
			rows = append(rows, r[0]+" | "+r[1])
		}
	}
	segs := out.Result.Edges[problem.Top].Segments
	if len(rows) != 3 || len(segs) != 3 {
		t.Fatalf("segment rows %q for %d segments", rows, len(segs))
	}
	for i, g := range segs {
		if !strings.Contains(rows[i], g.Kind) || !strings.Contains(rows[i], "mean") || !g.Finite {
			t.Errorf("row %q for segment %+v", rows[i], g)
		}
	}
	left := ""
	for _, r := range rep.Edges.Rows {
		if r[0] == "left" {
			left = r[2]
		}
	}
	if !strings.Contains(left, "when(y < 5, 0, 1e-6)") {
		t.Errorf("left condition %q: the h formula should be shown as written", left)
	}
}

// The edges CSV lists every edge's parts with the result's flows and means.
func TestEdgesCSV(t *testing.T) {
	p, out := solved(t, `{"schema":"edgewise/1","physics":"seepage","width":30,"height":10,"conductivity":1e-5,
	 "edges":{"bottom":{"kind":"flux","expr":"0"},"left":{"kind":"flux","expr":"0"},"right":{"kind":"flux","expr":"0"},
	 "top":{"segments":[{"to":10,"kind":"value","expr":"12"},{"to":20,"kind":"flux","expr":"0"},{"kind":"value","expr":"2"}]}},"grid":{"nx":30,"ny":10}}`)
	d, err := Make(EdgesCSV, p, out, PictureOptions{})
	if err != nil {
		t.Fatal(err)
	}
	rows, err := csv.NewReader(bytes.NewReader(d.Data)).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	if len(rows) != 1+3+3 || rows[0][0] != "edge" || d.Name != "edges.csv" && !strings.HasSuffix(d.Name, "edges.csv") {
		t.Fatalf("%s: %q", d.Name, rows)
	}
	var top [][]string
	for _, r := range rows[1:] {
		if r[0] == "top" {
			top = append(top, r)
		}
	}
	segs := out.Result.Edges[problem.Top].Segments
	for i, r := range top {
		flow, err := strconv.ParseFloat(r[5], 64)
		if err != nil || flow != *segs[i].Flow || r[2] != segs[i].Kind || r[6] != "true" {
			t.Errorf("row %q, segment %+v", r, segs[i])
		}
	}
}
