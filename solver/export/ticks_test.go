package export

import (
	"bytes"
	"reflect"
	"slices"
	"strings"
	"testing"
)

func TestAxisTicks(t *testing.T) {
	for _, c := range []struct {
		l    float64
		want []float64
	}{
		{0.4, []float64{0, 0.1, 0.2, 0.3, 0.4}},
		{0.05, []float64{0, 0.01, 0.02, 0.03, 0.04, 0.05}},
		{0.3, []float64{0, 0.05, 0.1, 0.15, 0.2, 0.25, 0.3}},
		{0.37, []float64{0, 0.1, 0.2, 0.3, 0.37}},
	} {
		if got := axisTicks(c.l); !reflect.DeepEqual(got, c.want) {
			t.Errorf("axisTicks(%g) = %v, want %v", c.l, got, c.want)
		}
	}
}

// With Ticks and Marks the picture carries the coordinates along two sides
// and each marked point with its label (escaped user text).
func TestSVGTicksAndMarks(t *testing.T) {
	p := demoPicture()
	var plain bytes.Buffer
	if err := SVG(&plain, p); err != nil {
		t.Fatal(err)
	}
	p.Ticks = true
	p.Marks = []Mark{{X: 0.1, Y: 0.2, Label: "P1 <i>"}, {X: 0.3, Y: 0.05, Label: "T2"}}
	var b bytes.Buffer
	if err := SVG(&b, p); err != nil {
		t.Fatal(err)
	}
	count, texts, _ := svgElements(t, b.Bytes())
	_, plainTexts, _ := svgElements(t, plain.Bytes())
	if count["circle"] != 2 {
		t.Errorf("%d circles, want one per mark", count["circle"])
	}
	for _, want := range []string{"P1 <i>", "T2", "0", "0.1", "0.2", "0.3", "0.4"} {
		if !slices.Contains(texts, want) {
			t.Errorf("no text %q in %q", want, texts)
		}
	}
	if slices.Contains(plainTexts, "0.1") {
		t.Errorf("ticks drawn without Ticks")
	}
	if strings.Contains(b.String(), "<i>") {
		t.Errorf("a mark's label became markup")
	}
}
