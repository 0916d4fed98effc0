package export

import (
	"bytes"
	"fmt"
	"math"
)

// EdgePart is a stretch of one edge of the rectangle held by one kind of
// condition, marked along the picture's outline.
type EdgePart struct {
	Side string // "bottom", "right", "top" or "left"
	// From and To are distances along the edge: bottom and top from the
	// left end, left and right from the bottom end.
	From, To float64
	Kind     string // "value", "flux" or "convection"
}

// The marks along the outline, the code the page's picture uses too
// (site/segments.js): a value part is a heavy bar on the outline, a flux
// part a thin line hatched outwards, a convection part a dashed line
// standing off a thin one; a cross-stroke marks where one part of an edge
// meets the next.
const (
	partInk     = "#1b2029"
	partConv    = "#2b4f6e"
	keyLine     = 15.0 // height of a line of the key under the drawing
	keySwatch   = 26.0 // width of a key's sample mark
	keyFontSize = 10.0
)

// outward returns the outward normal of a side in picture coordinates (y
// down), and false for an unknown side.
func outward(side string) (nx, ny float64, ok bool) {
	switch side {
	case "bottom":
		return 0, 1, true
	case "top":
		return 0, -1, true
	case "left":
		return -1, 0, true
	case "right":
		return 1, 0, true
	}
	return 0, 0, false
}

// partMark writes the mark of one part from (ax, ay) to (bx, by) with
// outward normal (nx, ny).
func partMark(b *bytes.Buffer, kind string, ax, ay, bx, by, nx, ny float64) {
	line := func(off float64, attrs string) {
		fmt.Fprintf(b, `<line x1="%s" y1="%s" x2="%s" y2="%s" %s/>`+"\n",
			num(ax+off*nx), num(ay+off*ny), num(bx+off*nx), num(by+off*ny), attrs)
	}
	switch kind {
	case "value":
		line(1.2, `stroke="`+partInk+`" stroke-width="4"`)
	case "flux":
		line(0, `stroke="`+partInk+`" stroke-width="1"`)
		l := math.Hypot(bx-ax, by-ay)
		if l == 0 {
			return
		}
		tx, ty := (bx-ax)/l, (by-ay)/l
		var d bytes.Buffer
		for s := 3.0; s < l; s += 6 {
			x, y := ax+tx*s, ay+ty*s
			fmt.Fprintf(&d, "M%s %sL%s %s", num(x), num(y), num(x+5*nx-3*tx), num(y+5*ny-3*ty))
		}
		fmt.Fprintf(b, `<path d="%s" stroke="%s" stroke-width="1" fill="none"/>`+"\n", d.String(), partInk)
	default:
		line(4, `stroke="`+partConv+`" stroke-width="2" stroke-dasharray="5 3"`)
		line(0, `stroke="`+partConv+`" stroke-width="1"`)
	}
}

// edgeParts writes the marks of the parts along the outline of a W x H
// rectangle drawn by px, py.
func edgeParts(b *bytes.Buffer, parts []EdgePart, w, h float64, px, py func(float64) float64) {
	at := func(side string, s float64) (x, y float64) {
		switch side {
		case "bottom":
			return px(s), py(0)
		case "top":
			return px(s), py(h)
		case "left":
			return px(0), py(s)
		}
		return px(w), py(s)
	}
	b.WriteString(`<g fill="none" stroke-linecap="butt">` + "\n")
	for _, p := range parts {
		nx, ny, ok := outward(p.Side)
		if !ok {
			continue
		}
		ax, ay := at(p.Side, p.From)
		bx, by := at(p.Side, p.To)
		partMark(b, p.Kind, ax, ay, bx, by, nx, ny)
		if p.From > 0 {
			fmt.Fprintf(b, `<line x1="%s" y1="%s" x2="%s" y2="%s" stroke="%s" stroke-width="1.5"/>`+"\n",
				num(ax-6*nx), num(ay-6*ny), num(ax+9*nx), num(ay+9*ny), partInk)
		}
	}
	b.WriteString("</g>\n")
}

// keyItem is one entry of the key: a kind (or "boundary") and its words.
type keyItem struct{ kind, text string }

// keyItems lists the key's entries, names from names (a kind without a
// name is written as it is).
func keyItems(names map[string]string) []keyItem {
	var out []keyItem
	for _, k := range []string{"value", "flux", "convection"} {
		t := names[k]
		if t == "" {
			t = k
		}
		out = append(out, keyItem{k, t})
	}
	return append(out, keyItem{"boundary", "where one part of an edge meets the next"})
}

// keyLayout places the key's entries in lines no wider than width: the x
// of each entry from the key's left and its line, and the number of lines.
func keyLayout(items []keyItem, width float64) (xs []float64, line []int, lines int) {
	x, l := 0.0, 0
	for _, it := range items {
		w := keySwatch + 6 + textWidth(it.text, keyFontSize) + 14
		if x > 0 && x+w > width {
			x, l = 0, l+1
		}
		xs = append(xs, x)
		line = append(line, l)
		x += w
	}
	return xs, line, l + 1
}

// key writes the key at (left, top), lines as keyLayout placed them.
func key(b *bytes.Buffer, items []keyItem, xs []float64, line []int, left, top float64) {
	fmt.Fprintf(b, `<g font-family="sans-serif" font-size="%s" fill="#1b1b1b">`+"\n", num(keyFontSize))
	for i, it := range items {
		x, y := left+xs[i], top+float64(line[i])*keyLine+keyLine/2
		if it.kind == "boundary" {
			partMark(b, "flux", x, y-3, x+keySwatch, y-3, 0, 1)
			fmt.Fprintf(b, `<line x1="%s" y1="%s" x2="%s" y2="%s" stroke="%s" stroke-width="1.5"/>`+"\n",
				num(x+keySwatch/2), num(y-8), num(x+keySwatch/2), num(y+6), partInk)
		} else {
			partMark(b, it.kind, x, y-3, x+keySwatch, y-3, 0, 1)
		}
		fmt.Fprintf(b, `<text x="%s" y="%s" stroke="none">`, num(x+keySwatch+6), num(y+4))
		escape(b, it.text)
		b.WriteString("</text>\n")
	}
	b.WriteString("</g>\n")
}
