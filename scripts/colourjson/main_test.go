package main

import (
	"encoding/json"
	"testing"

	"edgewise/solver/colour"
)

// The file holds each map's table as the engine computes it, colour for
// colour, and the maps' names: the page draws with what the SVG and the
// PNG use.
func TestTables(t *testing.T) {
	b, err := tables(size)
	if err != nil {
		t.Fatal(err)
	}
	var doc struct {
		N          int
		Sequential []int
		Diverging  []int
		Names      map[string]string
	}
	if err := json.Unmarshal(b, &doc); err != nil {
		t.Fatal(err)
	}
	if doc.N != size || doc.Names["sequential"] != colour.Sequential.Name() || doc.Names["diverging"] != colour.Diverging.Name() {
		t.Fatalf("n %d, names %v", doc.N, doc.Names)
	}
	for _, m := range []struct {
		name string
		got  []int
		want []uint8
	}{{"sequential", doc.Sequential, colour.Sequential.Table(size)}, {"diverging", doc.Diverging, colour.Diverging.Table(size)}} {
		if len(m.got) != 3*size || len(m.want) != 3*size {
			t.Fatalf("%s: %d numbers, want %d", m.name, len(m.got), 3*size)
		}
		for i := range m.want {
			if m.got[i] != int(m.want[i]) {
				t.Fatalf("%s[%d] = %d, the engine's table has %d", m.name, i, m.got[i], m.want[i])
			}
		}
	}
}
