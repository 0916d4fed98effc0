package e2e

import (
	"bytes"
	"encoding/base64"
	"encoding/xml"
	"fmt"
	"image"
	"image/png"
	"sort"
	"strconv"
	"strings"
	"testing"
)

// The SVG and PNG downloads of a project show the same colours as the
// canvas at the same places, for a one-signed field (the sequential map
// over its range) and a signed one (the diverging map about zero): the
// colour rule is the engine's, and the canvas, the SVG and the PNG follow
// it alike.
func TestDownloadColoursMatchCanvas(t *testing.T) {
	const grid = `grid: {nx: 20, ny: 10}`
	for _, tc := range []struct {
		name, project, wantMap string
	}{
		{"one-signed", `{schema: "edgewise/1", title: "one-signed", physics: "heat", width: 0.4, height: 0.2, conductivity: 50,
		  edges: {bottom: {kind: "value", expr: "20 + 60*s/W"}, top: {kind: "value", expr: "20"},
		          left: {kind: "flux", expr: "0"}, right: {kind: "value", expr: "50"}}, ` + grid + `}`, "fen"},
		{"signed", `{schema: "edgewise/1", title: "signed", physics: "electrostatic", width: 0.4, height: 0.2, conductivity: 1,
		  edges: {bottom: {kind: "value", expr: "-60"}, top: {kind: "value", expr: "40 + 60*cos(pi*s/W)"},
		          left: {kind: "flux", expr: "0"}, right: {kind: "flux", expr: "0"}}, ` + grid + `}`, "watershed"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			tb := newTab(t)
			tb.open(t, siteURL)
			d := tb.catchDownloads(t)
			tb.loadProject(t, tc.project)
			if m := eval[string](t, tb, `window.edgewiseInternal.last().result.colour.map`); m != tc.wantMap {
				t.Fatalf("the result's colour map is %q, want %q", m, tc.wantMap)
			}
			// isolines off, so that the canvas shows only the fill
			n := eval[int](t, tb, `Number(document.documentElement.dataset.drawn || 0)`)
			eval[bool](t, tb, `(document.getElementById("opt-iso").click(), true)`)
			tb.waitFor(t, fmt.Sprintf(`Number(document.documentElement.dataset.drawn || 0) > %d`, n), "the picture without isolines")
			nx, ny := 20, 10
			nodes := [][2]int{{2, 2}, {6, 7}, {10, 5}, {14, 3}, {18, 8}, {17, 1}, {4, 9}}
			canvas := canvasAt(t, tb, nodes)

			_, svg := d.click(t, tb, "#ew-dl-svg")
			img, box := svgRaster(t, svg)
			if s := img.Bounds().Size(); s.X != nx+1 || s.Y != ny+1 {
				t.Fatalf("the SVG raster is %v, want one pixel per node (%d x %d)", s, nx+1, ny+1)
			}
			eval[bool](t, tb, `(document.getElementById("ew-png-width").value = "800", true)`)
			_, pngData := d.click(t, tb, "#ew-dl-png")
			pic, err := png.Decode(bytes.NewReader(pngData))
			if err != nil {
				t.Fatalf("the PNG download does not decode: %v", err)
			}
			// The PNG is the SVG drawn at 640 pixels (outputs.js) scaled to
			// 800: the raster sits at the same x, y as in the 800-pixel SVG,
			// 640 wide, and the whole drawing is 160 narrower.
			scale := float64(pic.Bounds().Dx()) / (box.total - 160)
			plotW, plotH := 640.0, 640*box.h/box.w
			distinct := map[[3]int]bool{}
			worst := 0
			for k, nd := range nodes {
				i, j := nd[0], nd[1]
				r, g, b, _ := img.At(i, ny-j).RGBA()
				svgC := [3]int{int(r >> 8), int(g >> 8), int(b >> 8)}
				px := scale * (box.x + (float64(i)+0.5)/float64(nx+1)*plotW)
				py := scale * (box.y + (float64(ny-j)+0.5)/float64(ny+1)*plotH)
				pngC := median(pic, int(px), int(py))
				distinct[canvas[k]] = true
				for _, o := range []struct {
					what string
					c    [3]int
				}{{"SVG", svgC}, {"PNG", pngC}} {
					diff := maxDiff(canvas[k], o.c)
					worst = max(worst, diff)
					if diff > 12 {
						t.Errorf("node (%d, %d): canvas %v, %s %v (differ by %d)", i, j, canvas[k], o.what, o.c, diff)
					}
				}
			}
			t.Logf("largest difference from the canvas: %d of 255 per channel", worst)
			if len(distinct) < 4 {
				t.Errorf("the canvas shows only %d colours at %d places: the test cannot tell maps apart", len(distinct), len(nodes))
			}
			// A colour choice of the user's own shows on screen only, and the
			// page says so; back on automatic the note goes.
			summary := func(mode string) string {
				n := eval[int](t, tb, `Number(document.documentElement.dataset.drawn || 0)`)
				eval[bool](t, tb, `(() => { const s = document.getElementById("opt-colours"); s.value = "`+mode+`";
				  s.dispatchEvent(new Event("change", {bubbles: true})); return true; })()`)
				tb.waitFor(t, fmt.Sprintf(`Number(document.documentElement.dataset.drawn || 0) > %d`, n), "the picture in "+mode+" colours")
				return eval[string](t, tb, `document.getElementById("field-summary").textContent`)
			}
			other := map[string]string{"fen": "diverging", "watershed": "sequential"}[tc.wantMap]
			if s := summary(other); !strings.Contains(s, "the SVG, PNG and report use the automatic colours") {
				t.Errorf("with %s colours chosen the summary %q does not say the downloads differ", other, s)
			}
			if s := summary("auto"); strings.Contains(s, "automatic colours") {
				t.Errorf("on automatic colours the summary %q still says they differ", s)
			}
			tb.noErrors(t)
		})
	}
}

// canvasAt reads the field canvas at the centres of the heat-map
// pixels of the given grid nodes (the canvas draws one pixel per node,
// stretched over the rectangle): the median of a 5 x 5 block each.
func canvasAt(t *testing.T, tb *tab, nodes [][2]int) [][3]int {
	t.Helper()
	var list []string
	for _, n := range nodes {
		list = append(list, fmt.Sprintf("[%d,%d]", n[0], n[1]))
	}
	blocks := eval[[][]int](t, tb, `(() => {
	  const EW = window.edgewiseParts, S = window.edgewiseInternal.last(), c = document.getElementById("field");
	  const [x0, yb] = EW.screenOf(0, 0), [x1, yt] = EW.screenOf(S.w, S.h);
	  const dpr = window.devicePixelRatio || 1, ctx = c.getContext("2d");
	  return [`+strings.Join(list, ",")+`].map(([i, j]) => {
	    const px = x0 + (i + 0.5) / (S.nx + 1) * (x1 - x0), py = yt + (S.ny - j + 0.5) / (S.ny + 1) * (yb - yt);
	    return [...ctx.getImageData(Math.round(px * dpr) - 2, Math.round(py * dpr) - 2, 5, 5).data];
	  });
	})()`)
	out := make([][3]int, len(blocks))
	for k, b := range blocks {
		for ch := range 3 {
			var v []int
			for p := 0; p+3 < len(b); p += 4 {
				v = append(v, b[p+ch])
			}
			sort.Ints(v)
			out[k][ch] = v[len(v)/2]
		}
	}
	return out
}

// rasterBox is where an SVG picture puts its field raster, and the width
// of the whole drawing.
type rasterBox struct{ x, y, w, h, total float64 }

// svgRaster returns the SVG's embedded field raster and where it is drawn.
func svgRaster(t *testing.T, data []byte) (image.Image, rasterBox) {
	t.Helper()
	dec := xml.NewDecoder(bytes.NewReader(data))
	var box rasterBox
	var img image.Image
	for {
		tok, err := dec.Token()
		if err != nil {
			break
		}
		se, ok := tok.(xml.StartElement)
		if !ok {
			continue
		}
		attr := func(name string) string {
			for _, a := range se.Attr {
				if a.Name.Local == name {
					return a.Value
				}
			}
			return ""
		}
		f := func(name string) float64 {
			v, err := strconv.ParseFloat(attr(name), 64)
			if err != nil {
				t.Fatalf("SVG %s %s=%q: %v", se.Name.Local, name, attr(name), err)
			}
			return v
		}
		switch se.Name.Local {
		case "svg":
			box.total = f("width")
		case "image":
			box.x, box.y, box.w, box.h = f("x"), f("y"), f("width"), f("height")
			raw, err := base64.StdEncoding.DecodeString(strings.TrimPrefix(attr("href"), "data:image/png;base64,"))
			if err != nil {
				t.Fatal(err)
			}
			if img, err = png.Decode(bytes.NewReader(raw)); err != nil {
				t.Fatal(err)
			}
		}
	}
	if img == nil {
		t.Fatalf("the SVG has no field raster")
	}
	return img, box
}

// median is the per-channel median of the 5 x 5 block around (x, y).
func median(img image.Image, x, y int) [3]int {
	var out [3]int
	for ch := range 3 {
		var v []int
		for dy := -2; dy <= 2; dy++ {
			for dx := -2; dx <= 2; dx++ {
				r, g, b, _ := img.At(x+dx, y+dy).RGBA()
				v = append(v, int([3]uint32{r, g, b}[ch]>>8))
			}
		}
		sort.Ints(v)
		out[ch] = v[len(v)/2]
	}
	return out
}

func maxDiff(a, b [3]int) int {
	d := 0
	for k := range 3 {
		d = max(d, a[k]-b[k], b[k]-a[k])
	}
	return d
}
