package export

import (
	"bytes"
	"fmt"
	"strconv"

	"edgewise/solver/contour"
)

// Room for the axis ticks' labels, in pixels.
const (
	tickSpaceX = 14.0 // under the drawing
	tickSpaceY = 30.0 // left of it
	tickLen    = 4.0
)

// ticks draws round-valued ticks (inward, on the frame) along the bottom
// (x from 0 to w) and the left side (y from 0 to h) with their values.
func ticks(b *bytes.Buffer, w, h, left, top, plotW, plotH float64) {
	b.WriteString(`<g font-family="sans-serif" font-size="9" fill="#1b1b1b" stroke="none">` + "\n")
	var path bytes.Buffer
	for _, x := range axisTicks(w) {
		X := left + x/w*plotW
		fmt.Fprintf(&path, "M%s %s v%s ", num(X), num(top+plotH), num(-tickLen))
		fmt.Fprintf(b, `<text x="%s" y="%s" text-anchor="middle">%s</text>`+"\n", num(X), num(top+plotH+11), tick(x))
	}
	for _, y := range axisTicks(h) {
		Y := top + plotH - y/h*plotH
		fmt.Fprintf(&path, "M%s %s h%s ", num(left), num(Y), num(tickLen))
		fmt.Fprintf(b, `<text x="%s" y="%s" text-anchor="end" dominant-baseline="middle">%s</text>`+"\n", num(left-3), num(Y), tick(y))
	}
	fmt.Fprintf(b, `<path d="%s" stroke="#1b1b1b" stroke-width="1" fill="none"/>`+"\n", bytes.TrimSpace(path.Bytes()))
	b.WriteString("</g>\n")
}

// axisTicks are 0, the round values inside (0, l) for about four ticks,
// and l itself unless it falls closer than half a spacing to the last.
func axisTicks(l float64) []float64 {
	lv := contour.Levels(0, l, 4)
	out := append([]float64{0}, lv...)
	step := l
	if len(lv) >= 2 {
		step = lv[1] - lv[0]
	} else if len(lv) == 1 {
		step = lv[0]
	}
	if l-out[len(out)-1] >= 0.5*step {
		out = append(out, l)
	}
	return out
}

// tick writes a tick value (digits only: no escaping needed).
func tick(v float64) string { return strconv.FormatFloat(v, 'g', 6, 64) }

// marks draws each point as a small ring with its label (user text).
func marks(b *bytes.Buffer, list []Mark, px, py func(float64) float64) {
	if len(list) == 0 {
		return
	}
	b.WriteString(`<g font-family="sans-serif" font-size="10" fill="#1b1b1b">` + "\n")
	for _, m := range list {
		x, y := px(m.X), py(m.Y)
		fmt.Fprintf(b, `<circle cx="%s" cy="%s" r="3.5" fill="#ffffff" stroke="#1b1b1b" stroke-width="1.5"/>`+"\n", num(x), num(y))
		fmt.Fprintf(b, `<text x="%s" y="%s" stroke="#ffffff" stroke-width="2.5" paint-order="stroke">`, num(x+6), num(y-5))
		escape(b, m.Label)
		b.WriteString("</text>\n")
	}
	b.WriteString("</g>\n")
}
