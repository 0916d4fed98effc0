// Command colourjson writes the engine's two colour maps (package colour)
// as tables of 256 colours in the JSON the page reads (site/colours.json,
// and inline in the single file), so that the page draws with the very
// colours the SVG, the PNG and the report use without asking the engine
// for them: the page's first picture then waits for no call but its
// solve.
//
// Usage:
//
//	go run ./scripts/colourjson [-o site/colours.json]
//
// The file: {"n": 256, "sequential": [r, g, b, ...], "diverging": [...],
// "names": {"sequential": name, "diverging": name}}, 3n numbers 0-255
// each, from dark/low to light/high as colour.Map.Table gives them.
package main

import (
	"encoding/json"
	"flag"
	"fmt"
	"os"

	"edgewise/solver/colour"
)

// size is the number of colours in each table (the page's picture and
// colour bar need no more: a step of 1/256 of the range is below what the
// eye tells apart in these maps).
const size = 256

func main() {
	out := flag.String("o", "site/colours.json", "output file")
	flag.Parse()
	b, err := tables(size)
	if err == nil {
		err = os.WriteFile(*out, b, 0o644)
	}
	if err != nil {
		fmt.Fprintln(os.Stderr, "colourjson:", err)
		os.Exit(1)
	}
}

// tables returns the JSON of both maps at n colours, one line a map.
func tables(n int) ([]byte, error) {
	ints := func(t []uint8) []int { // numbers, not base 64: the page and people read them as they are
		v := make([]int, len(t))
		for i, c := range t {
			v[i] = int(c)
		}
		return v
	}
	doc := struct {
		N          int               `json:"n"`
		Sequential []int             `json:"sequential"`
		Diverging  []int             `json:"diverging"`
		Names      map[string]string `json:"names"`
	}{n, ints(colour.Sequential.Table(n)), ints(colour.Diverging.Table(n)),
		map[string]string{"sequential": colour.Sequential.Name(), "diverging": colour.Diverging.Name()}}
	b, err := json.Marshal(doc)
	if err != nil {
		return nil, err
	}
	return append(b, '\n'), nil
}
