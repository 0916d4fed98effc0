package study

import (
	"fmt"
	"math"

	"edgewise/solver"
	"edgewise/solver/project"
)

// MaxSeekSolves bounds the solves of one seek.
const MaxSeekSolves = 100

// SeekResult is the answer of a seek.
type SeekResult struct {
	Name  string  // the parameter
	Value float64 // its value found
	// Bracket is the width of the last interval known to hold the
	// crossing of the target: the value is good to about this much.
	Bracket  float64
	Output   string  // the output's report path
	Achieved float64 // the output at Value
	Target   float64
	// Tolerance is how far Achieved may be from Target (|Achieved -
	// Target| <= Tolerance holds for every result Find returns).
	Tolerance float64
	// Estimate is the solve's own error estimate at Value
	// (accuracy.estimate of the result).
	Estimate float64
	Solves   int       // solves made
	Outputs  []float64 // the study's report paths at Value (NaN: no number)
}

// Header is the CSV header of a seek: the parameter, "bracket", the
// output, "target", "tolerance", "accuracy.estimate", "solves", then the
// report paths.
func (r *SeekResult) Header(s *Study) []string {
	return append([]string{r.Name, "bracket", r.Output, "target", "tolerance", "accuracy.estimate", "solves"}, s.Report...)
}

// Record is the seek's one CSV row under Header.
func (r *SeekResult) Record() []string {
	rec := []string{Format(r.Value), Format(r.Bracket), Format(r.Achieved), Format(r.Target),
		Format(r.Tolerance), Format(r.Estimate), fmt.Sprint(r.Solves)}
	for _, v := range r.Outputs {
		rec = append(rec, Format(v))
	}
	return rec
}

// SeekError is a seek that found no value: the bracket holds no crossing
// of the target, or the output jumps across it.
type SeekError struct{ Msg string }

func (e *SeekError) Error() string { return "seek: " + e.Msg }

// Find finds the value of s.Seek.Name in [From, To] at which the output
// meets its target, by Brent's method (inverse quadratic interpolation,
// secant steps and bisection, keeping a bracket of a sign change) on
// g(v) = output(v) - target. It narrows the bracket to RootTolerance of
// the interval's width and then answers only if |g| <= Tolerance there;
// with no sign change between the ends, an end within the tolerance is the
// answer. Otherwise (the bracket holds no solution, the output jumps across
// the target, a solve fails) it returns an error and no value. progress,
// if not nil, is told of each solve and may stop the seek by returning
// false.
func (s *Study) Find(p *project.Project, sv *solver.Solver, opt solver.Options, progress func(solves int, value, output float64) bool) (*SeekResult, error) {
	sk := s.Seek
	if sk == nil {
		panic("study: Find of a study without seek")
	}
	opt = s.Options(opt)
	res := &SeekResult{Name: sk.Name, Output: sk.Output, Target: sk.Target, Tolerance: sk.Tolerance}
	seen := map[float64]solver.Result{}
	g := func(v float64) (float64, error) {
		if res.Solves >= MaxSeekSolves {
			return 0, &SeekError{fmt.Sprintf("no answer after %d solves", MaxSeekSolves)}
		}
		q, err := p.With(map[string]float64{sk.Name: v})
		if err != nil {
			return 0, fmt.Errorf("%s = %g: %w", sk.Name, v, err)
		}
		out, err := sv.Solve(q, opt)
		if err == nil {
			err = unconverged(&out.Result)
		}
		if err != nil {
			return 0, fmt.Errorf("%s = %g: %w", sk.Name, v, err)
		}
		res.Solves++
		y, ok := sk.out(&out.Result)
		if !ok {
			return 0, &SeekError{fmt.Sprintf("%s has no value at %s = %g (an infinite flow)", sk.Output, sk.Name, v)}
		}
		seen[v] = out.Result
		if progress != nil && !progress(res.Solves, v, y) {
			return 0, &SeekError{"stopped"}
		}
		return y - sk.Target, nil
	}
	a, b := sk.From, sk.To
	fa, err := g(a)
	if err != nil {
		return nil, err
	}
	fb, err := g(b)
	if err != nil {
		return nil, err
	}
	var x, fx, width float64
	if fa != 0 && fb != 0 && (fa > 0) == (fb > 0) {
		// no sign change: an end within the tolerance is the answer
		x, fx = a, fa
		if math.Abs(fb) < math.Abs(fa) {
			x, fx = b, fb
		}
		if math.Abs(fx) > sk.Tolerance {
			return nil, &SeekError{fmt.Sprintf("the bracket holds no solution: %s is %g at %s = %g and %g at %s = %g, both %s the target %g",
				sk.Output, fa+sk.Target, sk.Name, a, fb+sk.Target, sk.Name, b, side(fa), sk.Target)}
		}
	} else {
		x, fx, width, err = brent(g, a, b, fa, fb, RootTolerance*math.Abs(b-a), sk.Tolerance)
	}
	if j, ok := err.(*jumpError); ok {
		return nil, &SeekError{fmt.Sprintf("%s jumps across the target %g near %s = %.17g: from %g to %g, so no value meets it within %.3g",
			sk.Output, sk.Target, sk.Name, j.at, j.f1+sk.Target, j.f2+sk.Target, sk.Tolerance)}
	}
	if err != nil {
		return nil, err
	}
	r := seen[x]
	res.Value, res.Bracket, res.Achieved, res.Estimate = x, width, fx+sk.Target, r.Accuracy.Estimate
	res.Outputs = s.collect(&r)
	return res, nil
}

// jumpError: the bracket around at shrank to rounding with g still fb on
// one side and fc on the other.
type jumpError struct{ at, f1, f2 float64 }

func (e *jumpError) Error() string { return fmt.Sprintf("jump at %g", e.at) }

func side(f float64) string {
	if f > 0 {
		return "above"
	}
	return "below"
}

// RootTolerance is the width, relative to the seek's interval, to which
// Find shrinks the bracket around the crossing.
const RootTolerance = 1e-9

// brent finds a zero of g in the bracket [a, b] (g(a) = fa and g(b) = fb
// of opposite signs or zero) and returns the point, g there and the width
// of the last bracket. It is Brent's zeroin: each step is an inverse
// quadratic or secant step when that stays well inside the bracket and
// shrinks it fast enough, a bisection otherwise; it ends when the bracket
// is narrower than xtol (plus rounding). The point is an answer only when
// |g| <= ftol there; otherwise g jumps across zero (a *jumpError).
func brent(g func(float64) (float64, error), a, b, fa, fb, xtol, ftol float64) (x, fx, width float64, err error) {
	if fa == 0 {
		return a, fa, 0, nil
	}
	c, fc := b, fb
	var d, e float64
	for {
		if (fb > 0) == (fc > 0) {
			c, fc = a, fa
			d = b - a
			e = d
		}
		if math.Abs(fc) < math.Abs(fb) {
			a, b, c = b, c, b
			fa, fb, fc = fb, fc, fb
		}
		tol := 2*0x1p-52*math.Abs(b) + xtol/2
		m := (c - b) / 2
		if math.Abs(m) <= tol || fb == 0 {
			if math.Abs(fb) > ftol {
				return 0, 0, 0, &jumpError{b, fb, fc}
			}
			return b, fb, math.Abs(c - b), nil
		}
		if math.Abs(e) < tol || math.Abs(fa) <= math.Abs(fb) {
			d, e = m, m // bisection
		} else {
			var p, q float64
			s := fb / fa
			if a == c { // secant
				p, q = 2*m*s, 1-s
			} else { // inverse quadratic interpolation
				q, r := fa/fc, fb/fc
				p = s * (2*m*q*(q-r) - (b-a)*(r-1))
				q = (q - 1) * (r - 1) * (s - 1)
			}
			if p > 0 {
				q = -q
			} else {
				p = -p
			}
			if 2*p < min(3*m*q-math.Abs(tol*q), math.Abs(e*q)) {
				e, d = d, p/q
			} else {
				d, e = m, m
			}
		}
		a, fa = b, fb
		if math.Abs(d) > tol {
			b += d
		} else if m > 0 {
			b += tol
		} else {
			b -= tol
		}
		if fb, err = g(b); err != nil {
			return 0, 0, 0, err
		}
	}
}
