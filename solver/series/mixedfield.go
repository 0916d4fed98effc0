package series

import (
	"math"
	"slices"
	"sync"

	"edgewise/solver/gauss"
	"edgewise/solver/problem"
)

// Tolerances of the mixed fit, relative to the data scale (mixedScale):
// the levels stop once the estimate is below mixedTol (the estimate is
// pessimistic by 10 to 100 times on the exact and manufactured cases, so
// the true error is then about 1e-7 to 1e-6 of the scale); above
// mixedUnconverged the result is marked not converged.
const (
	mixedTol         = 1e-5
	mixedUnconverged = 1e-3
)

// PartResult is what a solved field reports about one part of an edge
// (the whole edge for a one-condition edge).
type PartResult struct {
	From, To float64
	Kind     problem.Kind
	Flow     float64 // entering the region
	Finite   bool
	Mean     float64 // average field value along the part
}

// PartsOf returns the parts of the mixed edge e of the solved problem pr,
// one entry per part (nil for an edge that is not mixed: its flow and mean
// are the whole edge's).
func PartsOf(f Field, pr *problem.Problem, e problem.Side) []PartResult {
	mf, ok := f.(*mixedField)
	if !ok || !pr.Edges[e].Mixed() {
		return nil
	}
	return mf.parts(e)
}

// stretchMean returns the mean of f over [a, b], split at the cuts inside,
// each piece by Gauss-Legendre in theta with s = a + (b - a)(1 - cos theta)/2,
// which leaves the square-root behaviour at a meeting smooth.
func stretchMean(f func(float64) float64, a, b float64, cuts []float64) float64 {
	pts := []float64{a}
	for _, c := range cuts {
		if c > a && c < b {
			pts = append(pts, c)
		}
	}
	pts = append(pts, b)
	meanX, meanW := meanRule()
	sum := 0.0
	for k := 0; k+1 < len(pts); k++ {
		lo, hi := pts[k], pts[k+1]
		for i, th := range meanX {
			theta := math.Pi * (th + 1) / 2
			s := lo + (hi-lo)*(1-math.Cos(theta))/2
			sum += meanW[i] * f(s) * (hi - lo) / 2 * math.Sin(theta) * math.Pi / 2
		}
	}
	return sum / (b - a)
}

// meanRule returns stretchMean's 48-node Gauss-Legendre rule, made on
// first use rather than when every program linking the engine starts.
func meanRule() (x, w []float64) {
	meanOnce.Do(func() {
		meanNodes, meanWeights = make([]float64, 48), make([]float64, 48)
		gauss.Legendre(meanNodes, meanWeights, -1, 1)
	})
	return meanNodes, meanWeights
}

var (
	meanOnce               sync.Once
	meanNodes, meanWeights []float64
)

// mixedField is the solution of a problem with mixed edges: the inner
// problem's series plus the family members.
type mixedField struct {
	pr       *problem.Problem // the user's problem
	inner    Field
	ms       *mixedSolver // nil when every mixed edge was a plain one
	x        []float64
	fit      float64 // estimated field error of the fit
	target   float64
	scale    float64
	warnings []problem.Warning
	once     sync.Once
	mean     float64
	// each mixed edge's parts, computed once (parts)
	partsMu   sync.Mutex
	partsDone [4][]PartResult
}

// mixedScale is the data scale of a problem with mixed edges: the range of
// its values and ambients, and the largest |flux| times the longer side
// over the conductivity.
func mixedScale(p *problem.Problem) float64 {
	lo, hi, flux := math.Inf(1), math.Inf(-1), 0.0
	for _, side := range problem.Sides {
		e := p.Edges[side]
		L := p.Length(side)
		parts := e.Parts
		if !e.Mixed() {
			parts = []problem.Part{{Kind: e.Kind, F: e.F}}
		}
		for i := 0; i <= 256; i++ {
			s := L * float64(i) / 256
			q := parts[0]
			if e.Mixed() {
				q = parts[e.PartAt(s)]
			}
			v := q.F(s)
			if q.Kind == problem.Flux {
				flux = max(flux, math.Abs(v))
				continue
			}
			lo, hi = min(lo, v), max(hi, v)
		}
	}
	sc := flux * max(p.W, p.H) / math.Sqrt(p.Kx*p.Ky)
	if hi > lo {
		sc = max(sc, hi-lo)
	}
	if sc == 0 {
		sc = max(math.Abs(lo), 1)
	}
	return sc
}

// check estimates the fit's error from the residual r(s) of each span's
// condition (entering flux less what the condition asks; on a convection
// part divided by 1 + h l/k, see below), taken at places between the
// collocation points: a flux error r along a stretch of
// boundary moves the field by about its integral over the stretch over
// pi k times the logarithmic weight of the distance (the half-plane's
// Green's function); the estimate takes twice the largest |integral of r|
// from the span's start, over k across the edge, plus the largest |r|
// times the spacing of the places over k for what varies between them,
// and doubles that for safety (the places stop short of the span's ends,
// where a corner's error is largest: 24 seeded manufactured cases put the
// true error at up to 1.5 times the undoubled estimate).
func (mf *mixedField) check() {
	ms := mf.ms
	mf.scale = mixedScale(ms.pr)
	mf.target = mixedTol * mf.scale
	for _, me := range ms.edges {
		kn := ms.pr.Ky
		if me.side == problem.Left || me.side == problem.Right {
			kn = ms.pr.Kx
		}
		for _, sp := range me.spans {
			places := me.places(&sp, len(sp.rows)*mixedCheckEach)
			worst, integral, most := 0.0, 0.0, 0.0
			// on a convection part the residual r = entering + h u - h a of an
			// error e is about e (k/l + h): weighted by 1/(1 + h l/k) it is a
			// flux error again (l the span's length)
			weighted := func(s float64) float64 {
				return me.rowWeight(ms.pr, s) * ms.residual(me, mf.inner, mf.x, s, true)
			}
			prevS := places[0]
			prevR := weighted(prevS)
			for _, s := range places[1:] {
				r := weighted(s)
				if r-r != 0 || prevR-prevR != 0 {
					worst = math.Inf(1)
					break
				}
				integral += (r + prevR) / 2 * (s - prevS)
				most = max(most, math.Abs(integral))
				worst = max(worst, math.Abs(r)*(s-prevS))
				prevS, prevR = s, r
			}
			mf.fit += 2 * (2*most + worst) / kn // doubled for safety, as the series' tails
		}
	}
}

func (mf *mixedField) mixedSides() []problem.Side {
	var out []problem.Side
	for _, side := range problem.Sides {
		if mf.pr.Edges[side].Mixed() {
			out = append(out, side)
		}
	}
	return out
}

func (mf *mixedField) At(x, y float64) (u, ux, uy float64) {
	u, ux, uy = mf.inner.At(x, y)
	if mf.ms != nil {
		fu, fx, fy := mf.ms.famSum(mf.x, x, y)
		u, ux, uy = u+fu, ux+fx, uy+fy
	}
	return u, ux, uy
}

func (mf *mixedField) Grid(nx, ny int, u, ux, uy []float64) {
	mf.inner.Grid(nx, ny, u, ux, uy)
	if mf.ms == nil {
		return
	}
	// the family members by family.sumFast, rows shared among the processors
	forRows(ny+1, func(r0, r1, _ int) {
		for j := r0; j < r1; j++ {
			y := float64(j) * mf.pr.H / float64(ny)
			for i := 0; i <= nx; i++ {
				x := float64(i) * mf.pr.W / float64(nx)
				k := j*(nx+1) + i
				var fu, fx, fy float64
				for _, me := range mf.ms.edges {
					fm := me.fam
					if fm == nil {
						continue
					}
					t, d := fm.fr.at(x, y)
					g, gt, gd := fm.sumFast(t, d, mf.x[me.famOff:me.famOff+fm.n])
					fu += g
					fx += gt*fm.fr.tx + gd*fm.fr.dx
					fy += gt*fm.fr.ty + gd*fm.fr.dy
				}
				u[k] += fu
				if ux != nil {
					ux[k] += fx
				}
				if uy != nil {
					uy[k] += fy
				}
			}
		}
	})
}

// famFlow returns the flow of the family entering through [a, b] of edge
// e: its own edge's family exactly, by its conjugate; the others by
// quadrature.
func (mf *mixedField) famFlow(e problem.Side, a, b float64) float64 {
	ms := mf.ms
	q := 0.0
	others := false // families of other edges, smooth here but steep near a corner
	for _, me := range ms.edges {
		others = others || (me.fam != nil && me.side != e)
	}
	if others {
		q = gradedGauss(func(s float64) float64 {
			x, y := ms.pr.Point(e, s)
			_, fx, fy := ms.famSum(mf.x, x, y, ms.bySide[e])
			return Entering(ms.pr, e, fx, fy)
		}, a, b, 40, gl16x, gl16w)
	}
	if me := ms.bySide[e]; me != nil && me.fam != nil {
		fm := me.fam
		g1, g2 := make([]float64, fm.n), make([]float64, fm.n)
		fm.conjugate(a*fm.ts, g1)
		fm.conjugate(b*fm.ts, g2)
		for k := 0; k < fm.n; k++ {
			q += mf.x[me.famOff+k] * fm.kappa / fm.ts * (g2[k] - g1[k])
		}
	}
	return q
}

// parts returns the parts of mixed edge e (computed once).
func (mf *mixedField) parts(e problem.Side) []PartResult {
	mf.partsMu.Lock()
	defer mf.partsMu.Unlock()
	if mf.partsDone[e] == nil {
		mf.partsDone[e] = mf.computeParts(e)
	}
	return slices.Clone(mf.partsDone[e])
}

func (mf *mixedField) computeParts(e problem.Side) []PartResult {
	pr := mf.pr
	ed := pr.Edges[e]
	L := pr.Length(e)
	_, edgeFinite := mf.inner.Flow(e)
	out := make([]PartResult, len(ed.Parts))
	for i, part := range ed.Parts {
		a, b := ed.PartRange(i, L)
		cuts := ed.Breaks
		r := PartResult{From: a, To: b, Kind: part.Kind, Finite: true}
		r.Mean = stretchMean(func(s float64) float64 {
			if part.Kind == problem.Value {
				return part.F(s) // the field is the data there
			}
			x, y := pr.Point(e, s)
			u, _, _ := mf.At(x, y)
			return u
		}, a, b, cuts)
		if !edgeFinite && !mf.partFinite(e, i) {
			r.Finite = false
			out[i] = r
			continue
		}
		pts := []float64{a}
		for _, c := range cuts {
			if c > a && c < b {
				pts = append(pts, c)
			}
		}
		pts = append(pts, b)
		in := func(s float64) float64 {
			x, y := pr.Point(e, s)
			_, ix, iy := mf.inner.At(x, y)
			return Entering(pr, e, ix, iy)
		}
		for k := 0; k+1 < len(pts); k++ {
			// graded only towards an end where the flux may have a
			// logarithm: a corner or a break of the user's data
			r.Flow += gradedTowards(in, pts[k], pts[k+1], !mf.isMeet(e, pts[k]), !mf.isMeet(e, pts[k+1]))
		}
		if mf.ms != nil {
			r.Flow += mf.famFlow(e, a, b)
		}
		out[i] = r
	}
	return out
}

// isMeet reports whether s is a meeting of mixed edge e, where the inner
// data are smooth to the third derivative by construction (a corner, or a
// break of the user's data, may put a logarithm into the flux instead).
func (mf *mixedField) isMeet(e problem.Side, s float64) bool {
	return mf.ms != nil && mf.ms.bySide[e] != nil && slices.Contains(mf.ms.bySide[e].meets, s)
}

// gradedTowards integrates f over [a, b] by 16-point Gauss-Legendre rules
// on panels halving towards the flagged ends down to (b - a) 2^-40 (for an
// integrable logarithm there), and on four even panels when neither is
// flagged (a smooth integrand).
func gradedTowards(f func(float64) float64, a, b float64, atA, atB bool) float64 {
	const depth = 40
	L := b - a
	pts := []float64{a}
	if atA {
		for k := depth; k >= 3; k-- {
			pts = append(pts, a+math.Ldexp(L, -k))
		}
	}
	for p := 1; p < 4; p++ {
		pts = append(pts, a+L*float64(p)/4)
	}
	if atB {
		for k := 3; k <= depth; k++ {
			pts = append(pts, b-math.Ldexp(L, -k))
		}
	}
	pts = append(pts, b)
	return onPanels(f, pts, gl16x, gl16w)
}

// partFinite reports whether part i of edge e has a finite flow: not when
// it is a value part next to a value part with another value, or touches a
// corner where two values differ.
func (mf *mixedField) partFinite(e problem.Side, i int) bool {
	pr := mf.pr
	ed := pr.Edges[e]
	if ed.Parts[i].Kind != problem.Value {
		return true
	}
	L := pr.Length(e)
	a, b := ed.PartRange(i, L)
	for _, j := range []int{i - 1, i + 1} {
		if j < 0 || j >= len(ed.Parts) || ed.Parts[j].Kind != problem.Value {
			continue
		}
		at := a
		if j > i {
			at = b
		}
		if ed.Parts[i].F(at) != ed.Parts[j].F(at) {
			return false
		}
	}
	for _, end := range []int{0, 1} {
		if (end == 0 && i != 0) || (end == 1 && i != len(ed.Parts)-1) {
			continue
		}
		c := cornerAt(e, end == 1)
		other := problem.Side(c)
		if other == e {
			other = problem.Side((c + 3) % 4)
		}
		kind, f := endCondition(pr, other, edgeEnd(other, c))
		if kind != problem.Value {
			continue
		}
		s := float64(end) * L
		v1, v2 := ed.Parts[i].F(s), f(float64(edgeEnd(other, c))*pr.Length(other))
		if math.Abs(v1-v2) > 1e-14*max(math.Abs(v1), math.Abs(v2), 1e-300) {
			return false
		}
	}
	return true
}

func (mf *mixedField) Flow(e problem.Side) (float64, bool) {
	q, fin := mf.inner.Flow(e)
	if mf.ms == nil || !fin {
		return q, fin
	}
	if mf.pr.Edges[e].Mixed() {
		// the inner problem's flow plus the family's, part by part
		sum := 0.0
		for _, p := range mf.parts(e) {
			sum += p.Flow
		}
		return sum, true
	}
	return q + mf.famFlow(e, 0, mf.pr.Length(e)), true
}

// Mean returns the area mean of the field: the inner problem's, plus the
// family's, exact (family.area).
func (mf *mixedField) Mean() float64 {
	mf.once.Do(func() {
		mf.mean = mf.inner.Mean()
		if mf.ms != nil {
			mf.mean += mf.familyArea() / (mf.pr.W * mf.pr.H)
		}
	})
	return mf.mean
}

// familyArea returns the integral of the family over the region.
func (mf *mixedField) familyArea() float64 {
	pr := mf.pr
	c := math.Sqrt(pr.Kx / pr.Ky)
	sum := 0.0
	for _, me := range mf.ms.edges {
		if me.fam == nil {
			continue
		}
		depth := c * pr.H // d = c y (bottom, top) or x (left, right)
		if me.side == problem.Left || me.side == problem.Right {
			depth = pr.W
		}
		sum += me.fam.area(mf.x[me.famOff:me.famOff+me.fam.n], depth, c)
	}
	return sum
}

// familyAreaByQuadrature is familyArea by graded Gauss-Legendre rules in
// both directions (for the tests).
func (mf *mixedField) familyAreaByQuadrature() float64 {
	pr := mf.pr
	ycuts := []float64{0}
	for _, me := range mf.ms.edges {
		if me.side == problem.Left || me.side == problem.Right {
			ycuts = append(ycuts, me.meets...)
		}
	}
	ycuts = append(ycuts, pr.H)
	slices.Sort(ycuts)
	inner := func(x float64) float64 {
		sum := 0.0
		for k := 0; k+1 < len(ycuts); k++ {
			if ycuts[k+1] > ycuts[k] {
				sum += gradedGauss(func(y float64) float64 {
					u, _, _ := mf.ms.famSum(mf.x, x, y)
					return u
				}, ycuts[k], ycuts[k+1], 20, gl16x, gl16w)
			}
		}
		return sum
	}
	cuts := []float64{0}
	for _, me := range mf.ms.edges {
		if me.side == problem.Bottom || me.side == problem.Top {
			cuts = append(cuts, me.meets...)
		}
	}
	cuts = append(cuts, pr.W)
	slices.Sort(cuts)
	sum := 0.0
	for k := 0; k+1 < len(cuts); k++ {
		if cuts[k+1] > cuts[k] {
			sum += gradedGauss(inner, cuts[k], cuts[k+1], 20, gl16x, gl16w)
		}
	}
	return sum
}

func (mf *mixedField) Terms() int { return mf.inner.Terms() }

func (mf *mixedField) ErrorEstimate() float64 { return mf.inner.ErrorEstimate() + mf.fit }

func (mf *mixedField) Warnings() []problem.Warning {
	return append(slices.Clone(mf.inner.Warnings()), mf.warnings...)
}
