package basis

import (
	"math"
	"strings"
	"testing"
)

// Method names the family New builds for the two ends.
func TestMethodNamesTheFamily(t *testing.T) {
	inf := math.Inf(1)
	for _, c := range []struct {
		a, b float64
		want string
	}{
		{inf, inf, "Sine"},
		{0, 0, "Cosine"},
		{inf, 0, "Quarter-wave"},
		{0, inf, "Quarter-wave"},
		{0, 3, "Robin"},
		{inf, 0.5, "Robin"},
	} {
		if got := Method(c.a, c.b); !strings.HasPrefix(got, c.want) {
			t.Errorf("Method(%g, %g) = %q, want %s...", c.a, c.b, got, c.want)
		}
		// the family agrees with the basis itself: the sine family (both
		// ends value) is the only one whose first eigenvalue is pi/L
		b := New(1, c.a, c.b, 4)
		if sine := math.Abs(b.Lambda[0]-math.Pi) < 1e-12; sine != (c.want == "Sine") {
			t.Errorf("Method(%g, %g) = %q but lambda_0 = %g", c.a, c.b, Method(c.a, c.b), b.Lambda[0])
		}
	}
}
