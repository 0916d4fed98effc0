package e2e

import (
	"strconv"
	"strings"
	"testing"

	"edgewise/solver/physics"
)

// The page labels itself from the engine's physics table, served and in
// the offline file alike: its choice of physics is the table's, in order,
// and choosing each one puts that entry's quantity names, units, edge-kind
// names and hints on the form.
func TestPhysicsFromTable(t *testing.T) {
	bothPages(t, func(t *testing.T, u string) {
		tb := newTab(t)
		tb.open(t, u)
		tb.loadPlate(t)
		opts := eval[[][]string](t, tb, `[...document.getElementById("in-physics").options].map(o => [o.value, o.textContent])`)
		all := physics.All()
		if len(opts) != len(all) {
			t.Fatalf("the page offers %d physics %v, the table has %d", len(opts), opts, len(all))
		}
		for i, p := range all {
			if opts[i][0] != p.ID || opts[i][1] != p.Name {
				t.Errorf("choice %d is %v, want %s %q", i, opts[i], p.ID, p.Name)
			}
		}
		for _, p := range all {
			n := tb.solved(t)
			eval[bool](t, tb, `(() => { const s = document.getElementById("in-physics"); s.value = `+strconv.Quote(p.ID)+`;
			  s.dispatchEvent(new Event("change", {bubbles: true})); return true; })()`)
			tb.waitSolved(t, n+1)
			got := eval[map[string]string](t, tb, `(() => { const $ = (id) => document.getElementById(id);
			  return {kinds: [...$("in-top-kind").options].map(o => o.textContent).join("|"),
			    material: document.querySelector("[data-q=conductivity]").textContent,
			    cond: document.querySelector("[data-unit=cond]").textContent,
			    hintK: $("hint-k").textContent, hintPhysics: $("hint-physics").textContent, hintSource: $("hint-source").textContent,
			    value: $("in-top-expr-label").textContent, gradient: $("probe-head-g").textContent}; })()`)
			unit := func(s string) string {
				if s == "" {
					return ""
				}
				return "[" + s + "]"
			}
			capital := func(s string) string { return strings.ToUpper(s[:1]) + s[1:] }
			want := map[string]string{
				"kinds":       p.Kinds.Value + "|" + p.Kinds.Flux + "|" + p.Kinds.Convection,
				"material":    capital(p.Conductivity),
				"cond":        unit(p.CondUnit),
				"hintK":       p.Hints.Conductivity,
				"hintPhysics": p.Hints.Physics,
				"hintSource":  p.Hints.Source,
				"value":       capital(p.Value) + " " + unit(p.ValueUnit),
				"gradient":    capital(p.Magnitude) + " " + unit(p.GradientUnit),
			}
			for k, w := range want {
				if got[k] != w {
					t.Errorf("%s: %s shows %q, want %q", p.ID, k, got[k], w)
				}
			}
		}
		tb.noErrors(t)
	})
}
