package solver

import "edgewise/solver/physics"

// The names, units, hints and cautions of each physics live in one table,
// package physics.

// UnitSet names the quantities and units of one physics, for labels,
// legends, CSV headers and cautions. Lengths are in metres throughout.
type UnitSet = physics.Units

// Units returns the quantities and units of a physics; an unknown name
// gives the generic set.
func Units(name string) UnitSet { return physics.Get(name).Units }
