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
func with(name, unit string) string {
	if unit == "" {
		return name
	}
	return name + " [" + unit + "]"
}
