// Command physicsjson writes the physics table (package physics) as the
// JSON the page reads: names, units, edge-kind labels and hints of every
// physics.
//
// Usage:
//
//	go run ./scripts/physicsjson [-o site/physics.json]
package main

import (
	"bytes"
	"encoding/json"
	"flag"
	"fmt"
	"os"

	"edgewise/solver/physics"
)

func main() {
	out := flag.String("o", "site/physics.json", "output file")
	flag.Parse()
	if err := write(*out); err != nil {
		fmt.Fprintln(os.Stderr, "physicsjson:", err)
		os.Exit(1)
	}
}

// write writes the table, indented for people who read it, to path.
func write(path string) error {
	var b bytes.Buffer
	if err := json.Indent(&b, physics.JSON(), "", "  "); err != nil {
		return err
	}
	b.WriteByte('\n')
	return os.WriteFile(path, b.Bytes(), 0o644)
}
