// Package physics is the one table of the physics edgewise knows. A physics
// changes what the field means, never the mathematics: for each one the
// table holds its id (as written in a project file), the name the page
// offers, the names and units of its quantities, the names of the three
// edge kinds, the hints shown beside the inputs (each with its source), and
// the cautions a solved field gets, with their thresholds and wording.
//
// Everything else reads this table: the project decoder (which ids exist),
// the solver (cautions), the report and the downloads (names and units), and
// the page, through the JSON that JSON writes (scripts/physicsjson puts it
// in site/physics.json at build time).
//
// Adding a physics is one entry in table.go and a line in its test.
//
// The JSON (schema "edgewise-physics/1"):
//
//	{"schema": "edgewise-physics/1",
//	 "physics": [
//	   {"id": "heat", "name": "Heat conduction (temperature)",
//	    "units": {"physics": "heat", "value": "temperature", "value_unit": "°C",
//	              "gradient": ..., "gradient_unit": ..., "conductivity": ..., "conductivity_unit": ...,
//	              "flux": ..., "flux_unit": ..., "flow_unit": ..., "source": ..., "source_unit": ...,
//	              "coefficient": ..., "coefficient_unit": ..., "length_unit": "m"},
//	    "kinds": {"value": "Fixed temperature (Dirichlet)", "flux": ..., "convection": ...},
//	    "labels": {"flux_in": "heat flux in", "ambient": "fluid temperature"},
//	    "hints": {"physics": ..., "conductivity": ..., "source": ..., "h": ...},
//	    "magnitude": "temperature gradient magnitude |∇T|", // |grad u| as a column heading
//	    "readout": "temperature gradient |∇T|",   // |grad u| in the pointer readout
//	    "also": {"unit": "kV/mm", "scale": 1e-6},  // optional: |grad u| also in this unit
//	    "default_h": "10",                         // h filled in when an edge turns to convection
//	    "usual": {"conductivity": [lo, hi], "h": [lo, hi], "source": ...}, // optional: usual spans
//	    "example": {...},                          // optional: the physics' example project
//	    "more_examples": [{...}, ...]},            // optional: further examples (e.g. edges made of segments)
//	   ...]}
//
// The order of the list is the order of the page's choice.
package physics
