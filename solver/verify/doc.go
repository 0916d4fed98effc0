// Package verify runs the published check cases of edgewise: the file
// testdata/checks.json, read by the Go tests and by the page's checks panel
// alike, so that an engineer can run in the browser exactly what the test
// suite runs and keep the outcome as a verification record.
//
// A checks file (JSON, schema "edgewise-checks/1") holds a list of cases:
//
//	{"id": "torsion-beta-2",           unique, letters, digits, - and _
//	 "title": "...",                   what is checked, in words
//	 "source": "...",                  where the expected value comes from
//	 "basis": "read",                  exact | read | memory | recomputed | common practice
//	 "project": {...},                 an edgewise project (schema edgewise/1)
//	 "quantity": {"formula": "torsion_beta"},
//	 "expect": 0.229,                  the published or exact value, or instead
//	 "reference": {"project": {...}, "quantity": {...}},   another solve (identities)
//	 "tol": 5e-4,                      |computed - expected| <= tol passes
//	 "tol_reason": "..."}              why this tolerance
//
// Quantities are a small fixed set of named formulas of one solve:
//
//	probe_value    u at the probe named by "probe"
//	edge_flow      the flow into the region through "edge" (bottom, top, left, right)
//	balance        the sum of the edge inflows and the source total
//	mean           the mean of u over the rectangle
//	torsion_beta   J / (a b^3), J = 2 mean(u) W H, a = max(W, H), b = min(W, H);
//	               the project must be -lap(u) = 2 with u = 0 on the edges
//	               (source 2, isotropic conductivity 1, four value edges "0"):
//	               the Prandtl stress function of a bar in torsion
//	duct_fre       f Re = Dh^2 / (2 mean(u)), Dh = 2 W H / (W + H); the project
//	               must be -lap(u) = 1 with u = 0 on the edges (source 1,
//	               isotropic conductivity 1, four value edges "0"): the axial
//	               velocity of laminar duct flow for viscosity and pressure
//	               gradient 1, Fanning friction factor times Reynolds number
//	decay_rate     -H u_x / u at the probe named by "probe": along a long strip
//	               the field decays like exp(-lambda x / H), lambda the first
//	               eigenvalue of the cross-section (for an insulated bottom and
//	               a convection top, the first root of x tan x = Bi, Bi = h H / k;
//	               for a bottom at 0, the first root of x cot x = -Bi)
//
// The derived formulas check their preconditions and fail the case when the
// project does not meet them, so an edited checks file cannot make a wrong
// comparison look right.
//
// Cases solve on a small output grid without the finite-difference
// cross-check: every quantity above comes from the series itself (probes,
// flows, mean), not from the output grid.
package verify
