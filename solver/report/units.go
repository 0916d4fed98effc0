package report

import (
	"edgewise/solver"
	"edgewise/solver/export"
)

// exportUnits names the export columns of a physics (solver.Units).
func exportUnits(u solver.UnitSet) export.Units {
	return export.Units{Quantity: u.Value, Unit: u.ValueUnit, FluxUnit: u.FluxUnit, LengthUnit: u.Length}
}

// with writes "name [unit]", or the bare name when there is no unit.
//
//go:noinline
func with(name, unit string) string {
	if unit == "" {
		return name
	}
	return name + " [" + unit + "]"
}

// addRow appends a row to the table. It is kept out of line: inlined at
// its many calls it made the engine's WebAssembly larger.
//
//go:noinline
func addRow(t *Table, cells ...string) { t.Rows = append(t.Rows, cells) }
