package report

import (
	"fmt"
	"strings"
	"testing"

	"edgewise/solver/colour"
)

// The picture download is coloured by the result's scale: the legend's
// first and middle stops are the chosen map's colours (the sequential map
// for the one-signed square, the diverging one for a signed field), and
// its end labels are the scale's ends.
func TestPictureUsesResultColour(t *testing.T) {
	signed := strings.Replace(square, `"bottom":{"kind":"value","expr":"0"}`, `"bottom":{"kind":"value","expr":"-1"}`, 1)
	for _, tc := range []struct {
		name, project string
		want          *colour.Map
	}{{"one-signed", square, colour.Sequential}, {"signed", signed, colour.Diverging}} {
		p, out := solved(t, tc.project)
		if out.Result.Colour.Map != tc.want.Name() {
			t.Fatalf("%s: the result chose %q", tc.name, out.Result.Colour.Map)
		}
		d, err := Make(Picture, p, out, PictureOptions{})
		if err != nil {
			t.Fatal(err)
		}
		svg := string(d.Data)
		for _, s := range []struct {
			offset string
			t      float64
		}{{"0", 0}, {"0.5", 0.5}, {"1", 1}} {
			r, g, b := tc.want.At(s.t)
			stop := fmt.Sprintf(`<stop offset="%s" stop-color="#%02x%02x%02x"/>`, s.offset, r, g, b)
			if !strings.Contains(svg, stop) {
				t.Errorf("%s: no legend stop %s", tc.name, stop)
			}
		}
	}
}
