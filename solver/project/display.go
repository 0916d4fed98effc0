package project

import (
	"strings"

	"edgewise/solver/jsonlite"
)

// Display is the choice of units the page shows numbers in: a unit name
// for each kind of quantity, keyed by the kind ("length": "mm",
// "temperature": "degF"). The project file itself stays SI; this object
// ("display" in the file, optional, every key optional) only tells the page
// how to show the numbers and how to read a number typed without a unit.
// A kind left out is shown in SI.
type Display map[string]string

// DisplayKinds lists the kinds of quantity a display choice may name, in
// the order written, each with the unit names it allows (the SI unit
// first). The page's conversion factors live with the page (site/measure.js);
// the names here and there must agree.
var DisplayKinds = []struct {
	Kind  string
	Units []string
}{
	{"length", []string{"m", "mm", "cm", "in", "ft"}},           // coordinates, sizes
	{"temperature", []string{"degC", "K", "degF"}},              // heat: values; differences follow
	{"heat", []string{"W", "BTU/h"}},                            // heat: flows, fluxes, conductivity, h, source
	{"potential", []string{"V", "mV", "kV"}},                    // electrostatics: values
	{"field", []string{"V/m", "V/mm", "kV/m", "kV/mm"}},         // electrostatics: gradient
	{"permittivity", []string{"F/m", "pF/m"}},                   // electrostatics: material constant, capacitance per metre
	{"head", []string{"m", "cm", "ft"}},                         // seepage: hydraulic head
	{"darcy", []string{"m/s", "cm/s", "m/day", "ft/day"}},       // seepage: hydraulic conductivity and Darcy flux
	{"discharge", []string{"m3/s", "L/s", "m3/day", "ft3/day"}}, // seepage: discharge per metre of depth
	{"rate", []string{"1/s", "1/day"}},                          // seepage: recharge, leakance
}

// display reads the optional "display" object: known kinds only, each a
// known unit name of that kind.
func (d *decoder) display(v any) Display {
	kinds := make([]string, len(DisplayKinds))
	for i, k := range DisplayKinds {
		kinds[i] = k.Kind
	}
	m := d.object(v, "display", nil, kinds...)
	if m == nil {
		return nil
	}
	out := Display{}
	for _, k := range DisplayKinds {
		u, ok := m[k.Kind]
		if !ok {
			continue
		}
		path := "display." + k.Kind
		name := d.text(u, path)
		if d.err != nil {
			return nil
		}
		if !contains(k.Units, name) {
			d.fail(path, "unknown unit %q (use %s)", Clip(name), strings.Join(k.Units, ", "))
			return nil
		}
		out[k.Kind] = name
	}
	return out
}

// write puts the choice into w as an object, in the order of DisplayKinds.
func (c Display) write(w *jsonlite.Writer) {
	w.Open('{')
	for _, k := range DisplayKinds {
		if u, ok := c[k.Kind]; ok {
			w.Key(k.Kind).Str(u)
		}
	}
	w.Close('}')
}
