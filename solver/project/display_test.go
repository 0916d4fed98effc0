package project

import (
	"reflect"
	"strings"
	"testing"
)

// The display choice is optional, read strictly and written back in the
// order of DisplayKinds; the SI numbers of the file do not change with it.
func TestDisplayRoundTrip(t *testing.T) {
	b := mutate(t, func(m map[string]any) {
		m["display"] = map[string]any{"temperature": "degF", "length": "mm", "heat": "BTU/h"}
	})
	p, err := Decode(b)
	if err != nil {
		t.Fatal(err)
	}
	want := Display{"length": "mm", "temperature": "degF", "heat": "BTU/h"}
	if !reflect.DeepEqual(p.Display, want) {
		t.Fatalf("display %v, want %v", p.Display, want)
	}
	if p.Width != 0.4 {
		t.Errorf("width %g: the file's numbers are SI whatever the display", p.Width)
	}
	out := p.JSON()
	if !strings.Contains(string(out), `"display":{"length":"mm","temperature":"degF","heat":"BTU/h"}`) {
		t.Errorf("encoded %s", out)
	}
	q, err := Decode(out)
	if err != nil {
		t.Fatal(err)
	}
	if !reflect.DeepEqual(p, q) {
		t.Errorf("round trip changed the project: %+v vs %+v", p, q)
	}
	// an empty choice stays an empty object; none at all writes none
	p2, err := Decode(mutate(t, func(m map[string]any) { m["display"] = map[string]any{} }))
	if err != nil || p2.Display == nil || len(p2.Display) != 0 || !strings.Contains(string(p2.JSON()), `"display":{}`) {
		t.Errorf("empty display: %v, %v", p2.Display, err)
	}
	p3, err := Decode([]byte(baseProject))
	if err != nil || p3.Display != nil || strings.Contains(string(p3.JSON()), "display") {
		t.Errorf("a project without a display choice: %v, %v", p3.Display, err)
	}
	// every unit name of every kind is accepted
	for _, k := range DisplayKinds {
		for _, u := range k.Units {
			if _, err := Decode(mutate(t, func(m map[string]any) { m["display"] = map[string]any{k.Kind: u} })); err != nil {
				t.Errorf("%s %q: %v", k.Kind, u, err)
			}
		}
	}
}

func TestDisplayErrors(t *testing.T) {
	for _, c := range []struct {
		display any
		want    string
	}{
		{map[string]any{"lenght": "mm"}, "display.lenght: unknown key (allowed here: length, temperature, heat,"},
		{map[string]any{"temperature": "F"}, `display.temperature: unknown unit "F" (use degC, K, degF)`},
		{map[string]any{"length": "MM"}, `display.length: unknown unit "MM" (use m, mm, cm, in, ft)`},
		{map[string]any{"length": 1}, "display.length: expected text in quotes, got the number 1"},
		{map[string]any{"field": "degF"}, `display.field: unknown unit "degF"`},
		{"mm", "display: expected an object {...}, got the text \"mm\""},
		{map[string]any{"length": strings.Repeat("m", 100)}, `display.length: unknown unit "mmmmmmmmmmmmmmmmmmmmmmmmmmmmmmmm...(100 bytes)"`},
	} {
		_, err := Decode(mutate(t, func(m map[string]any) { m["display"] = c.display }))
		if err == nil || !strings.HasPrefix(err.Error(), c.want) {
			t.Errorf("display %.40v: error %v, want %q", c.display, err, c.want)
		}
	}
}
