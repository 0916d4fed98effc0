package contour

import "math"

// niceSteps are the mantissas of the allowed level spacings, in tenths:
// 1, 2, 2.5, 5 (and 10 = the next decade's 1).
var niceSteps = [...]int64{10, 20, 25, 50, 100}

// Levels returns about n round contour levels strictly inside (min, max):
// multiples of a spacing of 1, 2, 2.5 or 5 times a power of ten, chosen so
// the count is as close to n as possible (ties go to the larger spacing).
// Levels are computed as k*spacing (never accumulated), so they print as
// short decimals. It returns nil when the range is too narrow for its
// magnitude to hold distinct round levels (spacing near the float64
// resolution), and when n < 1, when min or max is not finite,
// or when min >= max (a constant field has no isolines).
func Levels(min, max float64, n int) []float64 {
	if n < 1 || !(min < max) || math.IsInf(min, 0) || math.IsInf(max, 0) {
		return nil
	}
	raw := (max - min) / float64(n)
	if raw == 0 || math.IsInf(raw, 0) {
		return nil
	}
	e := int(math.Floor(math.Log10(raw))) - 1 // spacing = mant * 10^e, mant in tenths of the decade
	best, bestErr := []float64(nil), math.Inf(1)
	for _, de := range []int{-1, 0, 1} {
		for _, mant := range niceSteps {
			lv := levelsFor(min, max, mant, e+de, 4*n+8)
			if lv == nil {
				continue
			}
			err := math.Abs(float64(len(lv) - n))
			if err <= bestErr {
				best, bestErr = lv, err
			}
		}
	}
	return best
}

// levelsFor returns the multiples of mant*10^e strictly inside (min, max),
// or nil if there would be none or more than limit.
func levelsFor(min, max float64, mant int64, e, limit int) []float64 {
	step := float64(mant) * math.Pow10(e)
	k0 := math.Floor(min/step) + 1
	k1 := math.Ceil(max/step) - 1
	if k1-k0+1 > float64(limit) || k1 < k0 || math.Abs(k0) > 1<<52 || math.Abs(k1) > 1<<52 {
		return nil // none, too many, or spacing below the numbers' resolution
	}
	val := func(k float64) float64 {
		if e < 0 {
			return k * float64(mant) / math.Pow10(-e) // exact power of ten: correctly rounded decimal
		}
		return k * float64(mant) * math.Pow10(e)
	}
	var lv []float64
	for k := k0 - 1; k <= k1+1; k++ { // one spare each side: min/step may have rounded
		if v := val(k); v > min && v < max && (len(lv) == 0 || v > lv[len(lv)-1]) {
			lv = append(lv, v)
		}
	}
	return lv
}
