package solver

import "edgewise/solver/contour"

// Isolines are the isolines of an output field, flat so that they cross to
// the page as typed arrays.
type Isolines struct {
	Levels []float64
	// Segs holds segments x0,y0,x1,y1 (field coordinates, y up); the
	// segments of level k are Segs[Ends[k-1]:Ends[k]] (Ends[-1] = 0).
	Segs []float64
	Ends []int
	// Labels holds label places as quadruples x, y, angle (radians,
	// counter-clockwise from +x, y up), level index.
	Labels []float64
}

// Isolines computes about n levels between the field's extremes, round in
// the unit the values are shown in (shown = SI*scale + offset; 1 and 0 for
// SI), and the isolines at each; Levels stay SI. Labels go on lines
// longer than a tenth of the shorter side.
func (o *Output) Isolines(n int, scale, offset float64) *Isolines {
	w, h := o.W, o.H
	lo, hi := o.Result.Min.Value*scale+offset, o.Result.Max.Value*scale+offset
	if scale < 0 {
		lo, hi = hi, lo
	}
	levels := contour.Levels(lo, hi, n)
	for k, l := range levels {
		levels[k] = (l - offset) / scale
	}
	iso := &Isolines{Levels: levels}
	minLen := 0.1 * min(w, h)
	for k, level := range iso.Levels {
		start := len(iso.Segs)
		iso.Segs = contour.Lines(iso.Segs, o.U, o.Nx, o.Ny, w, h, level)
		iso.Ends = append(iso.Ends, len(iso.Segs))
		for _, s := range contour.LabelSpots(contour.Join(iso.Segs[start:]), minLen) {
			iso.Labels = append(iso.Labels, s.X, s.Y, s.Angle, float64(k))
		}
	}
	return iso
}
