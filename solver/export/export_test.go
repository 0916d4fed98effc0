package export

import (
	"bytes"
	"encoding/base64"
	"encoding/csv"
	"encoding/xml"
	"errors"
	"flag"
	"fmt"
	"image/png"
	"io"
	"math"
	"os"
	"path/filepath"
	"runtime"
	"strconv"
	"strings"
	"testing"
	"unicode"

	"edgewise/solver/colour"
	"edgewise/solver/contour"
)

var update = flag.Bool("update", false, "rewrite the golden files in testdata/export")

const goldenDir = "../../testdata/export"

// golden compares got with the named golden file, or rewrites it with
// -update.
func golden(t *testing.T, name string, got []byte) {
	t.Helper()
	path := filepath.Join(goldenDir, name)
	if *update {
		if err := os.WriteFile(path, got, 0o644); err != nil {
			t.Fatal(err)
		}
		return
	}
	want, err := os.ReadFile(path)
	if err != nil {
		t.Fatalf("%v (run go test -update to create it)", err)
	}
	if !bytes.Equal(got, want) {
		t.Errorf("%s differs from the golden file (%d vs %d bytes); rerun with -update if the change is intended", name, len(got), len(want))
	}
}

// demoField is invented: a 4 x 3 grid on 0.4 m x 0.3 m holding the
// harmonic field u = 20 + 50 x + 100 x y with its exact gradient
// (50 + 100 y, 100 x) and k = 2 by 0.5.
func demoField() *Field {
	f := &Field{Nx: 4, Ny: 3, W: 0.4, H: 0.3, Kx: 2, Ky: 0.5,
		Units: Units{Quantity: "temperature", Unit: "°C", FluxUnit: "W/m2", LengthUnit: "m"}}
	for j := 0; j <= f.Ny; j++ {
		for i := 0; i <= f.Nx; i++ {
			x, y := f.x(i), f.y(j)
			f.U = append(f.U, 20+50*x+100*x*y)
			f.Ux = append(f.Ux, 50+100*y)
			f.Uy = append(f.Uy, 100*x)
		}
	}
	return f
}

func TestFieldCSV(t *testing.T) {
	f := demoField()
	var b bytes.Buffer
	if err := FieldCSV(&b, f); err != nil {
		t.Fatal(err)
	}
	golden(t, "field.csv", b.Bytes())
	recs, err := csv.NewReader(bytes.NewReader(b.Bytes())).ReadAll()
	if err != nil {
		t.Fatalf("re-read: %v", err)
	}
	wantHead := []string{"x [m]", "y [m]", "temperature [°C]", "grad_x [°C/m]", "grad_y [°C/m]", "flux_x [W/m2]", "flux_y [W/m2]"}
	if strings.Join(recs[0], "|") != strings.Join(wantHead, "|") {
		t.Errorf("header %q, want %q", recs[0], wantHead)
	}
	if len(recs) != 1+(f.Nx+1)*(f.Ny+1) {
		t.Fatalf("%d records, want header + %d rows", len(recs), (f.Nx+1)*(f.Ny+1))
	}
	// Every number reads back exactly (shortest round-trip formatting), and
	// the flux is -k times the gradient: exact identities.
	for r, rec := range recs[1:] {
		i, j := r%(f.Nx+1), r/(f.Nx+1)
		v := make([]float64, len(rec))
		for c, s := range rec {
			if v[c], err = strconv.ParseFloat(s, 64); err != nil {
				t.Fatalf("row %d col %d: %v", r+1, c, err)
			}
		}
		k := j*(f.Nx+1) + i
		want := []float64{float64(i) * f.W / 4, float64(j) * f.H / 3, f.U[k], f.Ux[k], f.Uy[k], -2 * f.Ux[k], -0.5 * f.Uy[k]}
		for c := range want {
			if v[c] != want[c] {
				t.Errorf("row %d col %d: %v, want %v", r+1, c, v[c], want[c])
			}
		}
	}
	if !bytes.Contains(b.Bytes(), []byte("\r\n")) || bytes.Count(b.Bytes(), []byte("\n")) != bytes.Count(b.Bytes(), []byte("\r\n")) {
		t.Error("lines must end in CRLF (RFC 4180)")
	}
}

// A field large enough for many bands (and, natively, bands formatted in
// parallel) comes out the same with one processor and with several, and
// every row reads back exactly in its place.
func TestFieldCSVBands(t *testing.T) {
	f := benchField(300)
	f.Nx, f.Ny = 300, 300
	f.U[7] = math.NaN()
	f.Ux[8] = math.Copysign(0, -1)
	var one, many bytes.Buffer
	defer runtime.GOMAXPROCS(runtime.GOMAXPROCS(1))
	if err := FieldCSV(&one, f); err != nil {
		t.Fatal(err)
	}
	runtime.GOMAXPROCS(4)
	if err := FieldCSV(&many, f); err != nil {
		t.Fatal(err)
	}
	if !bytes.Equal(one.Bytes(), many.Bytes()) {
		t.Fatal("the output depends on the number of processors")
	}
	if rows := newFieldWriter(f).rows; rows*4 > f.Ny {
		t.Fatalf("%d rows per band: too few bands to test", rows)
	}
	recs, err := csv.NewReader(bytes.NewReader(many.Bytes())).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	if len(recs) != 1+301*301 {
		t.Fatalf("%d records, want %d", len(recs), 1+301*301)
	}
	for r, rec := range recs[1:] {
		i, j := r%301, r/301
		k := j*301 + i
		want := []float64{f.x(i), f.y(j), f.U[k], f.Ux[k], f.Uy[k], -f.Kx * f.Ux[k], -f.Ky * f.Uy[k]}
		for c, w := range want {
			v, err := strconv.ParseFloat(rec[c], 64)
			if err != nil || !(v == w || math.IsNaN(v) && math.IsNaN(w)) {
				t.Fatalf("row %d (node %d, %d) col %d: %q, want %v", r+1, i, j, c, rec[c], w)
			}
		}
	}
	if !strings.Contains(one.String(), ",NaN,") || strings.Contains(one.String(), ",-0,") {
		t.Error("NaN must be written NaN and -0 as 0")
	}
}

func TestFieldCSVWithoutGradient(t *testing.T) {
	f := demoField()
	f.Ux, f.Uy = nil, nil
	f.Units = Units{}
	recs := fieldRecords(t, f)
	if got := strings.Join(recs[0], ","); got != "x,y,value" {
		t.Errorf("header %q, want x,y,value", got)
	}
	if len(recs) != 21 || len(recs[1]) != 3 {
		t.Errorf("%d records of %d columns, want 21 of 3", len(recs), len(recs[1]))
	}
}

func TestFieldErrors(t *testing.T) {
	cases := []struct {
		name string
		edit func(f *Field)
	}{
		{"no cells", func(f *Field) { f.Nx = 0 }},
		{"short U", func(f *Field) { f.U = f.U[:5] }},
		{"zero width", func(f *Field) { f.W = 0 }},
		{"NaN height", func(f *Field) { f.H = math.NaN() }},
		{"one gradient", func(f *Field) { f.Uy = nil }},
		{"short gradient", func(f *Field) { f.Ux = f.Ux[:3] }},
	}
	for _, c := range cases {
		f := demoField()
		c.edit(f)
		if err := FieldCSV(io.Discard, f); err == nil || !strings.HasPrefix(err.Error(), "export: ") {
			t.Errorf("%s: FieldCSV error %v, want an export: error", c.name, err)
		}
		if err := SVG(io.Discard, &Picture{Field: f}); err == nil {
			t.Errorf("%s: SVG gave no error", c.name)
		}
	}
	if err := FieldCSV(io.Discard, nil); err == nil {
		t.Error("nil field: no error")
	}
}

// hostile labels a user might type; each must come back unchanged from a
// CSV reader (the formula one with the apostrophe guard in front).
var hostile = []struct{ in, back string }{
	{`P1`, `P1`},
	{`He said "hot"`, `He said "hot"`},
	{`left, lower`, `left, lower`},
	{"two\nlines", "two\nlines"},
	{`<script>alert("x")</script>`, `<script>alert("x")</script>`},
	{`=HYPERLINK("x")`, `'=HYPERLINK("x")`},
	{`-5 mm`, `'-5 mm`},
	{` padded `, ` padded `},
	{"", ""},
	// fixed bugs: the guard looked only at the first character
	{`a;=1+1;b`, `a;'=1+1;b`},
	{` =1+1`, `' =1+1`},
	{"\u00a0=1+1", "'\u00a0=1+1"},
	{"\uff1d1+1", "'\uff1d1+1"},
	{"\n=1+1", "'\n'=1+1"},
	{"\nP2", "'\nP2"},
	{"P3,@SUM(A1)", "P3,'@SUM(A1)"},
	{"P4\t+1", "P4\t'+1"},
	{"P5; \u3000-2", "P5;' \u3000-2"},
	{"left; lower", "left; lower"},
}

// TestGuardEverySeparator reads each guarded label back and splits it the
// way a spreadsheet could (on comma, semicolon, tab or a line break): no
// piece may start, after spaces, with a formula starter unless the
// apostrophe is in front of it.
func TestGuardEverySeparator(t *testing.T) {
	in := []string{"=1", "a,=1", "a;+1", "a\t-1", "a\r\n@1", "\u00a0\u2003=1", "\ufeff=1", "\u200b+1",
		"\uff0b1", "\uff0d1", "\uff201", "\u22121", "x; ; =1", ";;;", "=", "a\n\n-1"}
	for _, h := range hostile {
		in = append(in, h.in)
	}
	for _, s := range in {
		var b bytes.Buffer
		if err := ProbesCSV(&b, []Probe{{Label: s}}, Units{}); err != nil {
			t.Fatal(err)
		}
		recs, err := csv.NewReader(&b).ReadAll()
		if err != nil {
			t.Fatalf("%q: re-read: %v", s, err)
		}
		back := recs[1][0]
		if strings.ReplaceAll(back, "'", "") != strings.ReplaceAll(strings.ReplaceAll(s, "'", ""), "\r", "") {
			t.Errorf("%q came back as %q: more than apostrophes changed", s, back)
		}
		for _, piece := range strings.FieldsFunc(back, func(r rune) bool { return strings.ContainsRune(",;\t\r\n", r) }) {
			rest := strings.TrimLeftFunc(piece, func(r rune) bool { return unicode.IsSpace(r) || r == '\u200b' || r == '\ufeff' })
			if rest != "" && strings.ContainsRune("=+-@\uff1d\uff0b\uff0d\uff20\u2212", []rune(rest)[0]) && piece[0] != '\'' {
				t.Errorf("%q came back as %q: the piece %q runs as a formula", s, back, piece)
			}
		}
		if s != "" && strings.ContainsRune("\t\r\n", rune(s[0])) && back[0] != '\'' {
			t.Errorf("%q came back as %q: a leading tab or line break must be guarded", s, back)
		}
	}
}

func TestProbesCSV(t *testing.T) {
	var ps []Probe
	for k, h := range hostile {
		ps = append(ps, Probe{Label: h.in, X: 0.1 * float64(k), Y: 0.05, Value: 20 + float64(k), Gx: 1e-7, Gy: -3, Qx: -2e-7, Qy: 1.5})
	}
	ps[0].Gx, ps[0].Gy, ps[0].Qx, ps[0].Qy = math.NaN(), math.NaN(), math.NaN(), math.NaN()
	ps[0].Note = "unbounded: move the probe off the corner"
	u := Units{Quantity: "temperature", Unit: "K", FluxUnit: "W/m2", LengthUnit: "m"}
	var b bytes.Buffer
	if err := ProbesCSV(&b, ps, u); err != nil {
		t.Fatal(err)
	}
	golden(t, "probes.csv", b.Bytes())
	recs, err := csv.NewReader(bytes.NewReader(b.Bytes())).ReadAll()
	if err != nil {
		t.Fatalf("re-read: %v", err)
	}
	want := "label|x [m]|y [m]|temperature [K]|grad_x [K/m]|grad_y [K/m]|flux_x [W/m2]|flux_y [W/m2]|note"
	if got := strings.Join(recs[0], "|"); got != want {
		t.Errorf("header %q, want %q", got, want)
	}
	if len(recs) != 1+len(ps) {
		t.Fatalf("%d records, want %d", len(recs), 1+len(ps))
	}
	for k, h := range hostile {
		rec := recs[k+1]
		if rec[0] != h.back {
			t.Errorf("label %q came back as %q, want %q", h.in, rec[0], h.back)
		}
		if x, _ := strconv.ParseFloat(rec[1], 64); x != ps[k].X {
			t.Errorf("probe %d: x %q, want %v", k, rec[1], ps[k].X)
		}
	}
	// a gradient the probe has not: empty cells, and the note says why
	if got := strings.Join(recs[1][4:], "|"); got != "||||"+ps[0].Note {
		t.Errorf("unbounded gradient written %q, want empty cells and the note", got)
	}
	if recs[2][8] != "" || recs[2][4] == "" {
		t.Errorf("probe with a gradient: %q", recs[2])
	}
}

type failWriter struct{}

func (failWriter) Write([]byte) (int, error) { return 0, errors.New("disk full") }

// With a unit conductivity the flux columns are the gradient's text
// negated (no formatting); they are what formatting -grad gives, for
// every kind of value: signs, zeros of both signs, NaN, infinities,
// subnormals, the %e and %f layouts.
func TestFieldCSVUnitConductivity(t *testing.T) {
	special := []float64{0, math.Copysign(0, -1), math.NaN(), math.Inf(1), math.Inf(-1), 5e-324, -5e-324,
		1e21, -1e-7, 0.5, -0.5, 123456, -1234567, 1, -1}
	for _, k := range [][2]float64{{1, 1}, {1, 2.5}, {2.5, 1}} {
		f := benchField(40)
		f.Kx, f.Ky = k[0], k[1]
		for i, v := range special {
			f.Ux[3*i], f.Uy[3*i+1] = v, -v
		}
		recs := fieldRecords(t, f)
		text := func(x float64) string { return string(appendNum(nil, x)) }
		for r, rec := range recs[1:] {
			want := []string{text(-f.Kx * f.Ux[r]), text(-f.Ky * f.Uy[r])}
			if rec[5] != want[0] || rec[6] != want[1] {
				t.Fatalf("K %v, node %d (grad %q %q): flux %q %q, want %q %q", k, r, rec[3], rec[4], rec[5], rec[6], want[0], want[1])
			}
		}
	}
	if s := string(appendNum(nil, math.Inf(1))); s != "+Inf" {
		t.Fatalf("+Inf is written %q: appendNegated expects +Inf", s)
	}
}

// failAfter fails every write after the first n.
type failAfter struct{ n, writes int }

func (w *failAfter) Write(p []byte) (int, error) {
	if w.writes++; w.writes > w.n {
		return 0, errors.New("disk full")
	}
	return len(p), nil
}

// A write that fails part way through a field of many bands, formatted
// in parallel, ends the writing with that error (and the workers: the
// next call finds no band left over) after no further write.
func TestFieldCSVWriteFailsMidway(t *testing.T) {
	f := benchField(300)
	defer runtime.GOMAXPROCS(runtime.GOMAXPROCS(4))
	for _, n := range []int{0, 1, 3} {
		w := &failAfter{n: n}
		if err := FieldCSV(w, f); err == nil || err.Error() != "disk full" {
			t.Fatalf("after %d writes: error %v, want disk full", n, err)
		}
		if w.writes != n+1 {
			t.Errorf("after the failed write %d: %d writes in all, want none more", n+1, w.writes)
		}
	}
	var b bytes.Buffer
	if err := FieldCSV(&b, f); err != nil || b.Len() == 0 {
		t.Fatalf("after failures: %v, %d bytes", err, b.Len())
	}
}

func TestWriteErrorsReturned(t *testing.T) {
	if err := FieldCSV(failWriter{}, demoField()); err == nil {
		t.Error("FieldCSV: write error lost")
	}
	if err := ProbesCSV(failWriter{}, []Probe{{Label: "a"}}, Units{}); err == nil {
		t.Error("ProbesCSV: write error lost")
	}
	if err := SVG(failWriter{}, &Picture{Field: demoField()}); err == nil {
		t.Error("SVG: write error lost")
	}
}

func demoPicture() *Picture {
	f := demoField()
	return &Picture{
		Field:      f,
		Scale:      colour.Scale{Map: colour.Sequential, From: 20, To: 52},
		Levels:     contour.Levels(20, 52, 4),
		Title:      `Plate <script>alert("x")</script> & "co"`,
		LegendUnit: "temperature [°C] <b>",
		PixelW:     200,
	}
}

// svgElements parses the document with encoding/xml and returns the
// element counts, the character data of every text element and the image
// hrefs.
func svgElements(t *testing.T, doc []byte) (count map[string]int, texts []string, hrefs []string) {
	t.Helper()
	count = map[string]int{}
	d := xml.NewDecoder(bytes.NewReader(doc))
	var cur *strings.Builder
	for {
		tok, err := d.Token()
		if err == io.EOF {
			break
		}
		if err != nil {
			t.Fatalf("SVG does not parse: %v", err)
		}
		switch e := tok.(type) {
		case xml.StartElement:
			count[e.Name.Local]++
			if e.Name.Space != "http://www.w3.org/2000/svg" {
				t.Errorf("element %s in namespace %q", e.Name.Local, e.Name.Space)
			}
			if e.Name.Local == "text" || e.Name.Local == "title" {
				cur = &strings.Builder{}
			}
			for _, a := range e.Attr {
				if a.Name.Local == "href" {
					hrefs = append(hrefs, a.Value)
				}
			}
		case xml.CharData:
			if cur != nil {
				cur.Write(e)
			}
		case xml.EndElement:
			if cur != nil && (e.Name.Local == "text" || e.Name.Local == "title") {
				texts = append(texts, cur.String())
				cur = nil
			}
		}
	}
	return count, texts, hrefs
}

func TestSVG(t *testing.T) {
	p := demoPicture()
	var b bytes.Buffer
	if err := SVG(&b, p); err != nil {
		t.Fatal(err)
	}
	doc := b.Bytes()
	golden(t, "picture.svg", doc)
	count, texts, hrefs := svgElements(t, doc)
	if count["svg"] != 1 || count["image"] != 1 || count["linearGradient"] != 1 || count["title"] != 1 {
		t.Errorf("elements %v: want one svg, image, linearGradient, title", count)
	}
	// One path per polyline: u = 20 + 50x + 100xy has one open isoline per level.
	if count["path"] != len(p.Levels) {
		t.Errorf("%d paths for %d levels", count["path"], len(p.Levels))
	}
	has := func(s string) bool {
		for _, x := range texts {
			if x == s {
				return true
			}
		}
		return false
	}
	for _, want := range []string{p.Title, p.LegendUnit, "W = 0.4 m", "H = 0.3 m", "20", "25", "50"} {
		if !has(want) {
			t.Errorf("no text %q in %q", want, texts)
		}
	}
	if has("52") {
		t.Error("legend end label 52 drawn 10 px from the tick 50")
	}
	if bytes.Contains(doc, []byte("<script")) || bytes.Contains(doc, []byte("<b>")) {
		t.Error("user markup not escaped")
	}
	// No URL but the SVG namespace.
	if n := bytes.Count(doc, []byte("://")); n != 1 || !bytes.Contains(doc, []byte(`xmlns="http://www.w3.org/2000/svg"`)) {
		t.Errorf("%d URLs in the document, want only the SVG namespace", n)
	}
	// The raster decodes, has the drawing's size, and since u grows with x
	// on every row its colours get lighter (luminance rises) to the right.
	if len(hrefs) != 1 || !strings.HasPrefix(hrefs[0], "data:image/png;base64,") {
		t.Fatalf("image href %.40q, want a PNG data URL", hrefs)
	}
	raw, err := base64.StdEncoding.DecodeString(strings.TrimPrefix(hrefs[0], "data:image/png;base64,"))
	if err != nil {
		t.Fatal(err)
	}
	img, err := png.Decode(bytes.NewReader(raw))
	if err != nil {
		t.Fatal(err)
	}
	// one pixel per grid node: the viewer smooths it to the drawing's size
	if s := img.Bounds().Size(); s.X != 5 || s.Y != 4 {
		t.Errorf("raster %v, want 5 x 4 (one pixel per node of the 4 x 3 grid)", s)
	}
	lum := func(x, y int) float64 {
		r, g, b, _ := img.At(x, y).RGBA()
		return 0.2126*colour.Decode(float64(r)/65535) + 0.7152*colour.Decode(float64(g)/65535) + 0.0722*colour.Decode(float64(b)/65535)
	}
	for _, y := range []int{0, 2, 3} {
		if !(lum(0, y) < lum(2, y) && lum(2, y) < lum(4, y)) {
			t.Errorf("row %d: luminance not rising with x", y)
		}
	}
	// Corners: the smallest value (20, bottom left) gets the map's first
	// colour, the largest (52, top right) its last.
	for _, c := range []struct {
		x, y int
		t    float64
	}{{0, 3, 0}, {4, 0, 1}} {
		r, g, bb := colour.Sequential.At(c.t)
		r2, g2, b2, _ := img.At(c.x, c.y).RGBA()
		// the corner pixels are the corner nodes: the table's end colours,
		// up to the 8-bit rounding of the table (1/255 per channel)
		if d := math.Max(math.Abs(float64(r)-float64(r2>>8)), math.Max(math.Abs(float64(g)-float64(g2>>8)), math.Abs(float64(bb)-float64(b2>>8)))); d > 1 {
			t.Errorf("corner (%d, %d): colour off the map's end by %g", c.x, c.y, d)
		}
	}
}

// A tall rectangle keeps its scale within the height cap, given lines and
// a NaN hole give a well-formed document, and bad line sets are an error.
func TestSVGShapesAndLines(t *testing.T) {
	f := demoField()
	f.W, f.H = 0.1, 1
	f.U[7] = math.NaN()
	levels := []float64{30}
	lines := [][][]float64{contour.Join(contour.Lines(nil, f.U, f.Nx, f.Ny, f.W, f.H, 30))}
	var b bytes.Buffer
	if err := SVG(&b, &Picture{Field: f, Levels: levels, Lines: lines, PixelW: 100, Scale: colour.Scale{Map: colour.Diverging, From: 20, To: 52}}); err != nil {
		t.Fatal(err)
	}
	count, _, hrefs := svgElements(t, b.Bytes())
	if count["image"] != 1 {
		t.Errorf("elements %v", count)
	}
	raw, _ := base64.StdEncoding.DecodeString(strings.TrimPrefix(hrefs[0], "data:image/png;base64,"))
	img, err := png.Decode(bytes.NewReader(raw))
	if err != nil {
		t.Fatal(err)
	}
	if s := img.Bounds().Size(); s.X != 5 || s.Y != 4 {
		t.Errorf("tall raster %v, want 5 x 4 (one pixel per node)", s)
	}
	// the drawing keeps its scale within the height cap: 20 x 200
	if !bytes.Contains(b.Bytes(), []byte(`width="20" height="200" preserveAspectRatio="none"`)) {
		t.Errorf("tall drawing not 20 x 200 (height capped at 2 x PixelW, scale kept)")
	}
	if err := SVG(io.Discard, &Picture{Field: f, Levels: levels, Lines: nil}); err != nil {
		t.Errorf("lines computed from levels: %v", err)
	}
	if err := SVG(io.Discard, &Picture{Field: f, Levels: levels, Lines: [][][]float64{}}); err == nil {
		t.Error("0 line sets for 1 level: no error")
	}
}

// BenchmarkSVG draws a 257 x 129 node field at the default width.
func BenchmarkSVG(b *testing.B) {
	f := &Field{Nx: 256, Ny: 128, W: 0.4, H: 0.2}
	for j := 0; j <= f.Ny; j++ {
		for i := 0; i <= f.Nx; i++ {
			x, y := f.x(i), f.y(j)
			f.U = append(f.U, math.Sin(15*x)*math.Exp(-10*y)+3*x*y)
		}
	}
	lo, hi := finiteRange(f.U)
	p := &Picture{Field: f, Levels: contour.Levels(lo, hi, 12), Title: "bench"}
	var buf bytes.Buffer
	for b.Loop() {
		buf.Reset()
		if err := SVG(&buf, p); err != nil {
			b.Fatal(err)
		}
	}
	b.ReportMetric(float64(buf.Len()), "bytes")
}

// BenchmarkFieldCSV writes an (n+1) x (n+1) node field with gradients, the
// file the runner's -csv and the page's field download make, to a writer
// that only counts (so that the figure is the formatting, not the growth
// of a buffer or the disk). It reports the wall time and the processor
// time a number; run it with -cpu 1,2 for one processor and two.
//
// "512,k=1" is the same field with a unit conductivity, whose flux columns
// are copied from the gradient's text.
func BenchmarkFieldCSV(b *testing.B) {
	for _, c := range []struct {
		n    int
		unit bool
	}{{64, false}, {256, false}, {512, false}, {512, true}, {1024, false}} {
		n, f, name := c.n, benchField(c.n), fmt.Sprint(c.n)
		if c.unit {
			f.Kx, f.Ky, name = 1, 1, name+",k=1"
		}
		b.Run(name, func(b *testing.B) {
			var w countWriter
			numbers := float64(5 * (n + 1) * (n + 1))
			cpu := processorTime()
			for b.Loop() {
				w = 0
				if err := FieldCSV(&w, f); err != nil {
					b.Fatal(err)
				}
			}
			cpu = processorTime() - cpu
			b.SetBytes(int64(w))
			b.ReportMetric(float64(b.Elapsed().Nanoseconds())/(float64(b.N)*numbers), "ns/number")
			b.ReportMetric(float64(cpu.Nanoseconds())/(float64(b.N)*numbers), "cpu-ns/number")
		})
	}
}

// countWriter counts the bytes written to it.
type countWriter int

func (c *countWriter) Write(p []byte) (int, error) {
	*c += countWriter(len(p))
	return len(p), nil
}

// benchField is an invented smooth field on 0.4 m x 0.15 m with its exact
// gradient.
func benchField(n int) *Field {
	f := &Field{Nx: n, Ny: n, W: 0.4, H: 0.15, Kx: 167, Ky: 167, Units: Units{Quantity: "temperature", Unit: "°C", FluxUnit: "W/m2", LengthUnit: "m"}}
	for j := 0; j <= n; j++ {
		for i := 0; i <= n; i++ {
			x, y := f.x(i), f.y(j)
			f.U = append(f.U, 35+145*math.Sin(7.85*x)*math.Exp(-7.85*y))
			f.Ux = append(f.Ux, 145*7.85*math.Cos(7.85*x)*math.Exp(-7.85*y))
			f.Uy = append(f.Uy, -145*7.85*math.Sin(7.85*x)*math.Exp(-7.85*y))
		}
	}
	return f
}

// A fine grid is rastered at no more than maxRaster pixels a side, and the
// stored-block PNG of that size decodes with image/png (the standard
// library's decoder, the reference) to the colours of the map.
func TestLargeRasterDecodes(t *testing.T) {
	n := 300
	f := &Field{Nx: n, Ny: n, W: 1, H: 1, U: make([]float64, (n+1)*(n+1))}
	for k := range f.U {
		f.U[k] = float64(k%(n+1)) / float64(n) // u = x
	}
	data, err := raster(f, colour.Scale{Map: colour.Sequential, From: 0, To: 1}, maxRaster, maxRaster)
	if err != nil {
		t.Fatal(err)
	}
	img, err := png.Decode(bytes.NewReader(data))
	if err != nil {
		t.Fatal(err)
	}
	if s := img.Bounds().Size(); s.X != maxRaster || s.Y != maxRaster {
		t.Fatalf("raster %v", s)
	}
	// u = x: the last column is the map's last colour, the first its first
	for _, c := range []struct{ x, t float64 }{{0, 0}, {maxRaster - 1, 1}} {
		r, g, b := colour.Sequential.At(c.t)
		r2, g2, b2, a := img.At(int(c.x), 100).RGBA()
		if uint8(r2>>8) != r || uint8(g2>>8) != g || uint8(b2>>8) != b || a != 0xffff {
			t.Errorf("column %v: %d %d %d %d, want %d %d %d opaque", c.x, r2>>8, g2>>8, b2>>8, a>>8, r, g, b)
		}
	}
}

// fieldRecords writes f as the field CSV and reads it back as records.
func fieldRecords(t *testing.T, f *Field) [][]string {
	t.Helper()
	var b bytes.Buffer
	if err := FieldCSV(&b, f); err != nil {
		t.Fatal(err)
	}
	recs, err := csv.NewReader(&b).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	return recs
}
