package export

import (
	"bytes"
	"fmt"
	"strings"
	"testing"
)

// Parts along the outline: each kind drawn in its own code (a heavy bar, a
// hatched line, a dashed line), a cross-stroke at each inner boundary, and
// the key under the drawing naming the kinds (user text escaped); the
// drawing grows by the key's height and nothing else moves.
func TestSVGEdgeParts(t *testing.T) {
	plain := demoPicture()
	var b0 bytes.Buffer
	if err := SVG(&b0, plain); err != nil {
		t.Fatal(err)
	}
	p := demoPicture()
	W, H := p.Field.W, p.Field.H
	p.Parts = []EdgePart{
		{Side: "top", From: 0, To: W / 3, Kind: "value"},
		{Side: "top", From: W / 3, To: 2 * W / 3, Kind: "flux"},
		{Side: "top", From: 2 * W / 3, To: W, Kind: "value"},
		{Side: "bottom", From: 0, To: W, Kind: "convection"},
		{Side: "left", From: 0, To: H, Kind: "flux"},
		{Side: "right", From: 0, To: H, Kind: "flux"},
	}
	p.KindNames = map[string]string{"value": "Fixed <temperature>", "flux": "Heat flux in", "convection": "Convection"}
	var b bytes.Buffer
	if err := SVG(&b, p); err != nil {
		t.Fatal(err)
	}
	doc := b.String()
	_, texts, _ := svgElements(t, b.Bytes())
	for _, want := range []string{"Fixed <temperature>", "Heat flux in", "Convection", "where one part of an edge meets the next"} {
		found := false
		for _, s := range texts {
			found = found || s == want
		}
		if !found {
			t.Errorf("the key has no %q (texts %q)", want, texts)
		}
	}
	if strings.Contains(doc, "<temperature>") {
		t.Errorf("user text written as markup")
	}
	// marks: 2 value bars on the top + 1 in the key; the dashed line once
	// on the bottom and once in the key; 2 cross-strokes on the top and 1
	// in the key
	if n := strings.Count(doc, `stroke-width="4"`); n != 3 {
		t.Errorf("%d heavy bars, want 3", n)
	}
	if n := strings.Count(doc, `stroke-dasharray="5 3"`); n != 2 {
		t.Errorf("%d dashed lines, want 2", n)
	}
	if n := strings.Count(doc, `stroke-width="1.5"/>`); n != 3 {
		t.Errorf("%d cross-strokes, want 3", n)
	}
	h0, h1 := height(t, b0.String()), height(t, doc)
	if !(h1 > h0+keyLine && h1 < h0+4*keyLine+10) {
		t.Errorf("height %g with the key, %g without", h1, h0)
	}
	if i, j := strings.Index(b0.String(), "<image"), strings.Index(doc, "<image"); i < 0 || j < 0 || b0.String()[i:i+200] != doc[j:j+200] {
		t.Errorf("the raster moved or changed with the parts")
	}
}

// height reads the height attribute of the svg element.
func height(t *testing.T, doc string) float64 {
	t.Helper()
	i := strings.Index(doc, `height="`)
	var h float64
	if i < 0 {
		t.Fatal("no height")
	}
	rest := doc[i+len(`height="`):]
	if _, err := fmt.Sscan(rest[:strings.IndexByte(rest, '"')], &h); err != nil {
		t.Fatal(err)
	}
	return h
}
