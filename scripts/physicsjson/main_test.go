package main

import (
	"encoding/json"
	"os"
	"path/filepath"
	"testing"

	"edgewise/solver/physics"
)

// The file holds the table: every physics, in order, with the same text.
func TestWrite(t *testing.T) {
	path := filepath.Join(t.TempDir(), "physics.json")
	if err := write(path); err != nil {
		t.Fatal(err)
	}
	b, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	var doc struct {
		Schema  string `json:"schema"`
		Physics []struct {
			ID    string            `json:"id"`
			Units map[string]string `json:"units"`
		} `json:"physics"`
	}
	if err := json.Unmarshal(b, &doc); err != nil {
		t.Fatal(err)
	}
	all := physics.All()
	if doc.Schema != physics.Schema || len(doc.Physics) != len(all) {
		t.Fatalf("schema %q, %d physics, want %q and %d", doc.Schema, len(doc.Physics), physics.Schema, len(all))
	}
	for i, p := range all {
		if doc.Physics[i].ID != p.ID || doc.Physics[i].Units["value_unit"] != p.ValueUnit {
			t.Errorf("entry %d: %+v, want %s in %q", i, doc.Physics[i], p.ID, p.ValueUnit)
		}
	}
}
