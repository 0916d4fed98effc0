package physics

import (
	"encoding/json"
	"strings"
	"testing"
)

// The ids a project file may name, in the page's order. A new physics is
// added here and in table.go.
var wantIDs = []string{Heat, Electrostatic, Seepage, Generic}

func TestTable(t *testing.T) {
	if len(table) != len(wantIDs) {
		t.Fatalf("%d physics in the table, want %d", len(table), len(wantIDs))
	}
	seen := map[string]bool{}
	for i, p := range All() {
		if p.ID != wantIDs[i] {
			t.Errorf("entry %d is %q, want %q", i, p.ID, wantIDs[i])
		}
		if seen[p.ID] || seen[p.Name] {
			t.Errorf("%s: id or name %q used twice", p.ID, p.Name)
		}
		seen[p.ID], seen[p.Name] = true, true
		if p.Units.Physics != p.ID {
			t.Errorf("%s: units say physics %q", p.ID, p.Units.Physics)
		}
		// every name the page shows is there; units may be empty (generic)
		for what, s := range map[string]string{"name": p.Name, "value": p.Value, "gradient": p.Gradient,
			"conductivity": p.Conductivity, "flux": p.Flux, "source": p.Source, "coefficient": p.Coefficient,
			"length": p.Length, "value kind": p.Kinds.Value, "flux kind": p.Kinds.Flux,
			"convection kind": p.Kinds.Convection, "conductivity hint": p.Hints.Conductivity,
			"flux-in label": p.Labels.FluxIn, "ambient label": p.Labels.Ambient,
			"source hint": p.Hints.Source, "h hint": p.Hints.H, "magnitude": p.Magnitude, "readout": p.Readout,
			"default h": p.DefaultH} {
			if strings.TrimSpace(s) == "" {
				t.Errorf("%s: no %s", p.ID, what)
			}
		}
		// the textbook name of each condition follows its label
		for _, k := range []struct{ label, term string }{{p.Kinds.Value, "(Dirichlet)"},
			{p.Kinds.Flux, "(Neumann)"}, {p.Kinds.Convection, "(Robin)"}} {
			if !strings.HasSuffix(k.label, k.term) {
				t.Errorf("%s: kind label %q does not end in %s", p.ID, k.label, k.term)
			}
		}
		if (p.Also.Unit == "") != (p.Also.Scale == 0) {
			t.Errorf("%s: second unit %+v is half set", p.ID, p.Also)
		}
		if got, ok := Lookup(p.ID); !ok || got != p {
			t.Errorf("Lookup(%q) = %v, %v", p.ID, got, ok)
		}
	}
	if _, ok := Lookup("magnetic"); ok {
		t.Errorf("Lookup of an unknown id succeeded")
	}
	if Get("magnetic").ID != Generic {
		t.Errorf("an unknown id does not fall back to the generic physics")
	}
	if got, want := Choices(), "heat, electrostatic, seepage or generic"; got != want {
		t.Errorf("Choices() = %q, want %q", got, want)
	}
}

func TestJSON(t *testing.T) {
	var doc struct {
		Schema  string `json:"schema"`
		Physics []struct {
			ID     string            `json:"id"`
			Name   string            `json:"name"`
			Units  map[string]string `json:"units"`
			Kinds  map[string]string `json:"kinds"`
			Labels map[string]string `json:"labels"`
			Hints  map[string]string `json:"hints"`
			Also   *struct {
				Unit  string  `json:"unit"`
				Scale float64 `json:"scale"`
			} `json:"also"`
			Magnitude string `json:"magnitude"`
			Readout   string `json:"readout"`
			DefaultH  string `json:"default_h"`
			Usual     *struct {
				Conductivity []float64 `json:"conductivity"`
				H            []float64 `json:"h"`
				Source       string    `json:"source"`
			} `json:"usual"`
			Example      map[string]any   `json:"example"`
			MoreExamples []map[string]any `json:"more_examples"`
			Terms        struct {
				Conductance        string  `json:"conductance"`
				ConductanceUnit    string  `json:"conductance_unit"`
				Resistance         string  `json:"resistance"`
				ResistanceUnit     string  `json:"resistance_unit"`
				EdgeFlow           string  `json:"edge_flow"`
				PerLength          string  `json:"per_length"`
				PerLengthUnit      string  `json:"per_length_unit"`
				SourceRate         string  `json:"source_rate"`
				SourceRateUnit     string  `json:"source_rate_unit"`
				VacuumPermittivity float64 `json:"vacuum_permittivity"`
				Dielectrics        []struct {
					Name     string  `json:"name"`
					Strength float64 `json:"strength"`
					RelPerm  float64 `json:"rel_perm"`
					Source   string  `json:"source"`
				} `json:"dielectrics"`
			} `json:"terms"`
		} `json:"physics"`
	}
	dec := json.NewDecoder(strings.NewReader(string(JSON())))
	dec.DisallowUnknownFields()
	if err := dec.Decode(&doc); err != nil {
		t.Fatalf("JSON() does not read back: %v", err)
	}
	if doc.Schema != Schema || len(doc.Physics) != len(table) {
		t.Fatalf("schema %q with %d physics", doc.Schema, len(doc.Physics))
	}
	for i, got := range doc.Physics {
		p := table[i]
		if got.ID != p.ID || got.Name != p.Name || got.Magnitude != p.Magnitude || got.Readout != p.Readout || got.DefaultH != p.DefaultH {
			t.Errorf("entry %d: %+v", i, got)
		}
		if len(got.Units) != 15 || got.Units["value"] != p.Value || got.Units["flow_unit"] != p.FlowUnit ||
			got.Units["conductivity_unit"] != p.CondUnit || got.Units["length_unit"] != p.Length {
			t.Errorf("%s: units %v", p.ID, got.Units)
		}
		if got.Kinds["value"] != p.Kinds.Value || got.Kinds["flux"] != p.Kinds.Flux || got.Kinds["convection"] != p.Kinds.Convection {
			t.Errorf("%s: kinds %v", p.ID, got.Kinds)
		}
		if got.Hints["physics"] != p.Hints.Physics || got.Hints["h"] != p.Hints.H || len(got.Hints) != 4 {
			t.Errorf("%s: hints %v", p.ID, got.Hints)
		}
		if (got.Usual != nil) != (p.Usual.Conductivity[1] > 0) || got.Usual != nil && got.Usual.Conductivity[0] != p.Usual.Conductivity[0] {
			t.Errorf("%s: usual %+v, want %+v", p.ID, got.Usual, p.Usual)
		}
		if (got.Example != nil) != (p.Example() != nil) || got.Example != nil && got.Example["physics"] != p.ID {
			t.Errorf("%s: example %v", p.ID, got.Example)
		}
		if len(got.MoreExamples) != len(p.MoreExamples()) {
			t.Errorf("%s: %d more examples in the JSON, %d files", p.ID, len(got.MoreExamples), len(p.MoreExamples()))
		}
		for _, ex := range got.MoreExamples {
			if ex["physics"] != p.ID {
				t.Errorf("%s: a further example says physics %v", p.ID, ex["physics"])
			}
		}
		tm := got.Terms
		if tm.Conductance != p.Terms.Conductance || tm.ConductanceUnit != p.Terms.ConductanceUnit || tm.SourceRateUnit != p.Terms.SourceRateUnit ||
			tm.VacuumPermittivity != 8.8541878128e-12 || len(tm.Dielectrics) != len(p.Terms.Dielectrics) {
			t.Errorf("%s: terms %+v", p.ID, tm)
		}
		for k, d := range tm.Dielectrics {
			if want := p.Terms.Dielectrics[k]; d.Name != want.Name || d.Strength != want.Strength || d.Source == "" {
				t.Errorf("%s: dielectric %+v, want %+v", p.ID, d, want)
			}
		}
		if (got.Also != nil) != (p.Also.Unit != "") || got.Also != nil && (got.Also.Unit != p.Also.Unit || got.Also.Scale != p.Also.Scale) {
			t.Errorf("%s: also %+v, want %+v", p.ID, got.Also, p.Also)
		}
	}
}

// Each physics speaks its own trade's words: no heat word in another
// physics' names, kinds, labels or hints, and the generic one writes its
// field as "u" everywhere (never "U", even where the page capitalises a
// name's first letter: the symbol is never first).
func TestOwnWords(t *testing.T) {
	heatWords := []string{"ambient", "heat", "temperature", "convection", "fluid", "insulated"}
	for _, p := range All() {
		texts := []string{p.Name, p.Value, p.Gradient, p.Conductivity, p.Flux, p.Source, p.Coefficient,
			p.Kinds.Value, p.Kinds.Flux, p.Kinds.Convection, p.Labels.FluxIn, p.Labels.Ambient,
			p.Hints.Conductivity, p.Hints.Source, p.Hints.H, p.Magnitude, p.Readout}
		for _, s := range texts {
			low := strings.ToLower(s)
			if p.ID != Heat {
				for _, w := range heatWords {
					if strings.Contains(low, w) {
						t.Errorf("%s: %q uses the heat word %q", p.ID, s, w)
					}
				}
			}
			if p.ID == Generic && (strings.Contains(s, " U") || strings.Contains(s, "(U") || strings.HasPrefix(s, "u ") || s == "u") {
				t.Errorf("generic: %q writes the field's symbol as U or puts it first", s)
			}
		}
	}
	es, _ := Lookup(Electrostatic)
	if !strings.Contains(es.Labels.FluxIn, "surface charge density") {
		t.Errorf("electrostatic flux edges give %q, want the surface charge density", es.Labels.FluxIn)
	}
}
