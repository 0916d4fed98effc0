package export

import (
	"bytes"
	"encoding/base64"
	"fmt"
	"io"
	"math"
	"strconv"
	"unicode/utf8"

	"edgewise/solver/colour"
	"edgewise/solver/contour"
)

// Picture is what SVG draws.
type Picture struct {
	Field *Field
	// Scale colours the field; a zero Scale means colour.Choose over the
	// smallest to the largest finite value of the field.
	Scale colour.Scale
	// Levels are the isoline values; nil draws no isolines.
	Levels []float64
	// Lines are the isolines per level as polylines (x, y pairs in field
	// coordinates, as contour.Join returns them). If nil they are computed
	// from the field with contour.Lines and contour.Join.
	Lines [][][]float64
	// Title is written above the drawing (user text).
	Title string
	// LegendUnit labels the legend bar, e.g. "temperature [°C]" (user text).
	LegendUnit string
	// PixelW is the width of the field drawing in pixels; 0 means 640.
	// A tall rectangle is drawn at most 2*PixelW high, narrower to keep
	// the scale.
	PixelW int
	// Ticks draws round-valued ticks with their coordinates along the
	// bottom and left sides.
	Ticks bool
	// Marks are points to mark with their labels (the probes).
	Marks []Mark
	// Parts are the edges' parts, each marked along the outline in the
	// code of its kind (parts.go) and explained in a key under the
	// drawing; nil marks none and draws no key.
	Parts []EdgePart
	// KindNames names the kinds in the key ("value": "Fixed temperature
	// (Dirichlet)", ...; user text).
	KindNames map[string]string
}

// Mark is a labelled point in field coordinates.
type Mark struct {
	X, Y  float64
	Label string
}

// Layout constants, in pixels.
const (
	margin      = 16.0
	titleSpace  = 30.0
	legendGap   = 24.0
	legendBarW  = 16.0
	legendSpace = 96.0 // bar, ticks and their labels
	legendMinH  = 160.0
	sizeSpace   = 22.0 // the width and height notes
	maxRaster   = 256  // longest side of the embedded PNG (the viewer smooths it when scaling)
	labelMinLen = 70.0 // isolines shorter than this (pixels) get no label
	minTickGap  = 14.0 // closest two legend labels may be (pixels)
)

// SVG writes the picture as a standalone SVG document. It returns an error
// for a malformed field, a mismatch between Levels and Lines, or a failed
// write.
func SVG(w io.Writer, p *Picture) error {
	if p == nil {
		return fmt.Errorf("export: no picture")
	}
	f := p.Field
	if err := f.check(); err != nil {
		return err
	}
	if p.Lines != nil && len(p.Lines) != len(p.Levels) {
		return fmt.Errorf("export: %d isoline sets for %d levels", len(p.Lines), len(p.Levels))
	}
	if p.PixelW < 0 {
		return fmt.Errorf("export: negative picture width %d", p.PixelW)
	}
	sc := p.Scale
	if sc.Map == nil {
		sc = colour.Choose(finiteRange(f.U))
	}
	pw := float64(p.PixelW)
	if pw == 0 {
		pw = 640
	}
	plotW, plotH := pw, pw*f.H/f.W
	if plotH > 2*pw {
		plotH = 2 * pw
		plotW = plotH * f.W / f.H
	}
	top := margin
	if p.Title != "" {
		top += titleSpace
	}
	left := margin + sizeSpace
	below := sizeSpace // under the drawing: the width note (and the x ticks' labels)
	if p.Ticks {
		left += tickSpaceY
		below += tickSpaceX
	}
	legendH := math.Max(plotH, legendMinH)
	legendW := math.Max(legendSpace, textWidth(p.LegendUnit, 11))
	totalW := left + plotW + legendGap + legendW + margin
	totalW = math.Max(totalW, left+textWidth(p.Title, 16)+margin)
	var keys []keyItem
	var keyX []float64
	var keyRow []int
	if len(p.Parts) > 0 {
		keys = keyItems(p.KindNames)
		var lines int
		keyX, keyRow, lines = keyLayout(keys, totalW-left-margin)
		below += float64(lines)*keyLine + 6
	}
	totalH := top + math.Max(plotH, legendH) + below + margin

	var b bytes.Buffer
	b.WriteString(`<?xml version="1.0" encoding="UTF-8"?>` + "\n")
	fmt.Fprintf(&b, `<svg xmlns="http://www.w3.org/2000/svg" version="1.1" width="%s" height="%s" viewBox="0 0 %s %s">`+"\n",
		num(totalW), num(totalH), num(totalW), num(totalH))
	b.WriteString("<title>")
	escape(&b, p.Title)
	b.WriteString("</title>\n")
	fmt.Fprintf(&b, `<rect width="%s" height="%s" fill="#ffffff"/>`+"\n", num(totalW), num(totalH))
	if p.Title != "" {
		fmt.Fprintf(&b, `<text x="%s" y="%s" font-family="sans-serif" font-size="16" fill="#1b1b1b">`, num(left), num(margin+16))
		escape(&b, p.Title)
		b.WriteString("</text>\n")
	}

	// The field raster.
	// no more pixels than grid nodes: the raster adds nothing beyond them
	rw := max(1, min(maxRaster, int(math.Round(plotW)), f.Nx+1))
	rh := max(1, min(maxRaster, int(math.Round(plotH)), f.Ny+1))
	pngData, err := raster(f, sc, rw, rh)
	if err != nil {
		return err
	}
	fmt.Fprintf(&b, `<image x="%s" y="%s" width="%s" height="%s" preserveAspectRatio="none" href="data:image/png;base64,%s"/>`+"\n",
		num(left), num(top), num(plotW), num(plotH), base64.StdEncoding.EncodeToString(pngData))

	// Isolines and their labels.
	sx, sy := plotW/f.W, plotH/f.H
	px := func(x float64) float64 { return left + x*sx }
	py := func(y float64) float64 { return top + plotH - y*sy }
	lines := p.Lines
	if lines == nil && len(p.Levels) > 0 {
		var segs []float64
		lines = make([][][]float64, len(p.Levels))
		for k, c := range p.Levels {
			segs = contour.Lines(segs[:0], f.U, f.Nx, f.Ny, f.W, f.H, c)
			lines[k] = contour.Join(segs)
		}
	}
	if len(lines) > 0 {
		b.WriteString(`<g fill="none" stroke="#202020" stroke-opacity="0.7" stroke-width="0.9" stroke-linejoin="round">` + "\n")
		for _, set := range lines {
			for _, l := range set {
				if len(l) < 4 {
					continue
				}
				b.WriteString(`<path d="M`)
				for k := 0; k+1 < len(l); k += 2 {
					if k > 0 {
						b.WriteString(" L")
					}
					b.WriteString(num(px(l[k])) + " " + num(py(l[k+1])))
				}
				b.WriteString(`"/>` + "\n")
			}
		}
		b.WriteString("</g>\n")
		// Labels: upright tags (a small paper box with a thin ink edge)
		// centred on the line, none over another or over the frame.
		b.WriteString(`<g font-family="sans-serif" font-size="10" text-anchor="middle" dominant-baseline="middle">` + "\n")
		var placed [][4]float64
		for k, set := range lines {
			label := strconv.FormatFloat(p.Levels[k], 'g', 6, 64)
			for _, s := range contour.LabelSpots(set, labelMinLen/sx) {
				cx, cy := px(s.X), py(s.Y)
				w, h := textWidth(label, 10)+8, tagH
				r := [4]float64{cx - w/2 - 2, cy - h/2 - 2, w + 4, h + 4}
				if r[0] < left || r[0]+r[2] > left+plotW || r[1] < top || r[1]+r[3] > top+plotH || overlaps(placed, r) {
					continue
				}
				placed = append(placed, r)
				writeTag(&b, label, cx, cy, w)
			}
		}
		b.WriteString("</g>\n")
	}
	fmt.Fprintf(&b, `<rect x="%s" y="%s" width="%s" height="%s" fill="none" stroke="#1b1b1b" stroke-width="1"/>`+"\n",
		num(left), num(top), num(plotW), num(plotH))

	if len(p.Parts) > 0 {
		edgeParts(&b, p.Parts, f.W, f.H, px, py)
		key(&b, keys, keyX, keyRow, left, top+math.Max(plotH, legendH)+below-float64(keyRow[len(keyRow)-1]+1)*keyLine)
	}

	// Axis ticks and the marked points.
	noteX, noteY := left-8, top+plotH+16
	if p.Ticks {
		ticks(&b, f.W, f.H, left, top, plotW, plotH)
		noteX, noteY = left-8-tickSpaceY, top+plotH+16+tickSpaceX
	}
	marks(&b, p.Marks, px, py)

	// Width and height notes.
	fmt.Fprintf(&b, `<g font-family="sans-serif" font-size="11" fill="#1b1b1b" text-anchor="middle">`+"\n")
	fmt.Fprintf(&b, `<text x="%s" y="%s">`, num(left+plotW/2), num(noteY))
	escape(&b, "W = "+strconv.FormatFloat(f.W, 'g', 6, 64)+" "+f.LengthUnit)
	b.WriteString("</text>\n")
	fmt.Fprintf(&b, `<text transform="translate(%s %s) rotate(-90)">`, num(noteX), num(top+plotH/2))
	escape(&b, "H = "+strconv.FormatFloat(f.H, 'g', 6, 64)+" "+f.LengthUnit)
	b.WriteString("</text>\n</g>\n")

	legend(&b, sc, left+plotW+legendGap, top, legendH, p.LegendUnit, p.Levels)
	b.WriteString("</svg>\n")
	_, err = w.Write(b.Bytes())
	return err
}

// tagH is the height of a value tag (pixels).
const tagH = 14.0

// writeTag writes a value tag: text of width w (box included) centred on
// (cx, cy) in a small paper box with a thin ink edge, never rotated, the
// look the page gives isoline labels and the ends of its colour bar.
func writeTag(b *bytes.Buffer, text string, cx, cy, w float64) {
	fmt.Fprintf(b, `<rect x="%s" y="%s" width="%s" height="%s" rx="2" fill="#fbfaf6" fill-opacity="0.93" stroke="#1b2029" stroke-opacity="0.55" stroke-width="0.8"/>`,
		num(cx-w/2), num(cy-tagH/2), num(w), num(tagH))
	fmt.Fprintf(b, `<text x="%s" y="%s" fill="#1b2029">`, num(cx), num(cy+0.5))
	escape(b, text)
	b.WriteString("</text>\n")
}

// overlaps reports whether box r (x, y, w, h) meets any of the boxes.
func overlaps(boxes [][4]float64, r [4]float64) bool {
	for _, q := range boxes {
		if r[0] < q[0]+q[2] && q[0] < r[0]+r[2] && r[1] < q[1]+q[3] && q[1] < r[1]+r[3] {
			return true
		}
	}
	return false
}

// legend draws the colour bar of the scale, From at the bottom and To at
// the top, at (x, y): thin lines across the bar at the isoline levels,
// round values on short ticks beside it, and its two ends in tags.
func legend(b *bytes.Buffer, sc colour.Scale, x, y, h float64, unit string, levels []float64) {
	m, lo, hi := sc.Map, sc.From, sc.To
	const stops = 32
	b.WriteString(`<defs><linearGradient id="edgewise-legend" x1="0" y1="1" x2="0" y2="0">` + "\n")
	tab := m.Table(stops + 1)
	for k := 0; k <= stops; k++ {
		fmt.Fprintf(b, `<stop offset="%s" stop-color="#%02x%02x%02x"/>`+"\n",
			num(float64(k)/stops), tab[3*k], tab[3*k+1], tab[3*k+2])
	}
	b.WriteString("</linearGradient></defs>\n")
	// The unit sits above the bar, inside the top margin.
	fmt.Fprintf(b, `<g font-family="sans-serif" font-size="11" fill="#1b1b1b">`+"\n")
	fmt.Fprintf(b, `<text x="%s" y="%s">`, num(x), num(y-4))
	escape(b, unit)
	b.WriteString("</text>\n")
	fmt.Fprintf(b, `<rect x="%s" y="%s" width="%s" height="%s" fill="url(#edgewise-legend)" stroke="#1b1b1b" stroke-width="0.8"/>`+"\n",
		num(x), num(y), num(legendBarW), num(h))
	if hi > lo && len(levels) > 0 {
		b.WriteString(`<g stroke="#141820" stroke-opacity="0.5" stroke-width="1">` + "\n")
		for _, v := range levels {
			if v > lo && v < hi {
				ly := y + h - (v-lo)/(hi-lo)*h
				fmt.Fprintf(b, `<line x1="%s" y1="%s" x2="%s" y2="%s"/>`+"\n", num(x), num(ly), num(x+legendBarW), num(ly))
			}
		}
		b.WriteString("</g>\n")
	}
	// Round ticks, plus the two ends unless a round tick is too close to
	// leave room for both labels.
	ticks := contour.Levels(lo, hi, 5)
	if hi > lo {
		clear := func(v float64) bool {
			for _, t := range ticks {
				if math.Abs(t-v)/(hi-lo)*h < minTickGap {
					return false
				}
			}
			return true
		}
		if clear(lo) {
			ticks = append([]float64{lo}, ticks...)
		}
		if clear(hi) {
			ticks = append(ticks, hi)
		}
	} else if !math.IsNaN(lo) {
		ticks = []float64{lo}
	}
	for _, v := range ticks {
		ty := y + h/2
		if hi > lo {
			ty = y + h - (v-lo)/(hi-lo)*h
		}
		end := v == lo || v == hi
		tick := 5.0
		if end {
			tick = 7
		}
		fmt.Fprintf(b, `<line x1="%s" y1="%s" x2="%s" y2="%s" stroke="#1b1b1b" stroke-width="0.8"/>`+"\n",
			num(x+legendBarW), num(ty), num(x+legendBarW+tick), num(ty))
		label := strconv.FormatFloat(v, 'g', 5, 64)
		if end {
			// the ends in tags, kept inside the bar's height
			w := textWidth(label, 10) + 8
			cy := math.Min(math.Max(ty, y+tagH/2), y+h-tagH/2)
			b.WriteString(`<g font-size="10" text-anchor="middle" dominant-baseline="middle">`)
			writeTag(b, label, x+legendBarW+tick+w/2, cy, w)
			b.WriteString("</g>\n")
			continue
		}
		fmt.Fprintf(b, `<text x="%s" y="%s" dominant-baseline="middle">`, num(x+legendBarW+8), num(ty))
		escape(b, label)
		b.WriteString("</text>\n")
	}
	b.WriteString("</g>\n")
}

// raster renders the field at rw x rh pixels, no more than the grid has
// nodes along each side: pixel (px, py) samples the field bilinearly at
// x = px/(rw-1) W, y = (1 - py/(rh-1)) H, so at full resolution the pixels
// are the nodes and the corners hold the corner values. Colours come from
// a 256-entry table of the scale's map, indexed as the page's canvas
// indexes it (Scale.Index); NaN nodes make their neighbourhood transparent.
// The viewer smooths the picture when it scales it to the drawing.
func raster(f *Field, sc colour.Scale, rw, rh int) ([]byte, error) {
	const n = 256
	tab := sc.Map.Table(n)
	img := struct{ Pix []uint8 }{make([]uint8, 4*rw*rh)}
	for py := range rh {
		// row 0 of the image is the top edge y = H
		gy := (1 - float64(py)/float64(max(rh-1, 1))) * float64(f.Ny)
		j := min(int(gy), f.Ny-1)
		ty := gy - float64(j)
		for px := range rw {
			gx := float64(px) / float64(max(rw-1, 1)) * float64(f.Nx)
			i := min(int(gx), f.Nx-1)
			tx := gx - float64(i)
			k := j*(f.Nx+1) + i
			v := (1-ty)*((1-tx)*f.U[k]+tx*f.U[k+1]) + ty*((1-tx)*f.U[k+f.Nx+1]+tx*f.U[k+f.Nx+2])
			if math.IsNaN(v) {
				continue // transparent
			}
			c := sc.Index(v, n)
			copy(img.Pix[4*(py*rw+px):], []uint8{tab[3*c], tab[3*c+1], tab[3*c+2], 255})
		}
	}
	return storedPNG(rw, rh, img.Pix), nil
}

// finiteRange returns the smallest and largest finite values (NaN, NaN if
// there are none).
func finiteRange(u []float64) (lo, hi float64) {
	lo, hi = math.Inf(1), math.Inf(-1)
	for _, v := range u {
		if v-v == 0 {
			lo, hi = math.Min(lo, v), math.Max(hi, v)
		}
	}
	if lo > hi {
		return math.NaN(), math.NaN()
	}
	return lo, hi
}

// textWidth estimates the width of text in a sans-serif font of the given
// size: 0.6 em per character (common practice for layout estimates).
func textWidth(s string, size float64) float64 {
	return 0.6 * size * float64(utf8.RuneCountInString(s))
}

// num formats a drawing coordinate to 0.01 px without trailing zeros.
func num(v float64) string {
	s := strconv.FormatFloat(v, 'f', 2, 64)
	for s[len(s)-1] == '0' {
		s = s[:len(s)-1]
	}
	if s[len(s)-1] == '.' {
		s = s[:len(s)-1]
	}
	if s == "-0" {
		s = "0"
	}
	return s
}

// escape writes user text as XML character data: &, <, >, quotes, and the
// control characters XML 1.0 forbids (dropped) or that would be normalised
// (tab, newline and carriage return as references); invalid UTF-8 becomes
// U+FFFD.
func escape(b *bytes.Buffer, s string) {
	for _, r := range s {
		switch {
		case r == '&':
			b.WriteString("&amp;")
		case r == '<':
			b.WriteString("&lt;")
		case r == '>':
			b.WriteString("&gt;")
		case r == '"':
			b.WriteString("&#34;")
		case r == '\'':
			b.WriteString("&#39;")
		case r == '\t':
			b.WriteString("&#x9;")
		case r == '\n':
			b.WriteString("&#xA;")
		case r == '\r':
			b.WriteString("&#xD;")
		case r < 0x20 || r == 0xFFFE || r == 0xFFFF:
			// not allowed in XML 1.0
		default:
			b.WriteRune(r)
		}
	}
}
