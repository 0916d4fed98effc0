package series

import (
	"math"
	"math/cmplx"

	"edgewise/solver/problem"
)

// frame is an edge's local coordinates, in the mapped (isotropic)
// coordinates y' = y sqrt(Kx/Ky): t along the edge from its start (s = 0),
// d into the region; both affine in (x, y).
type frame struct {
	d0, dx, dy float64
	t0, tx, ty float64
}

func newFrame(pr *problem.Problem, side problem.Side) frame {
	c := math.Sqrt(pr.Kx / pr.Ky)
	switch side {
	case problem.Bottom: // d = c y, t = x
		return frame{dy: c, tx: 1}
	case problem.Top: // d = c (H - y), t = x
		return frame{d0: c * pr.H, dy: -c, tx: 1}
	case problem.Left: // d = x, t = c y
		return frame{dx: 1, ty: c}
	}
	return frame{d0: pr.W, dx: -1, ty: c} // right: d = W - x, t = c y
}

func (f *frame) at(x, y float64) (t, d float64) {
	d = f.d0 + f.dx*x + f.dy*y
	if d <= 0 {
		d = 0 // on the edge, and never beyond it by rounding: +0 keeps the branch
	}
	return f.t0 + f.tx*x + f.ty*y, d
}

// family is the singular family of one mixed edge: with zeta the
// normalised local coordinate (t - centre)/half + i d/half and z_i the
// places where a value part meets a flux or convection part,
//
//	G_k(zeta) = c Q(zeta) T_k(zeta),   Q = prod_i (zeta - z_i)^(1/2),
//
// T_k the Chebyshev polynomials, and F_k = Re G_k. Q is real on the edge
// beyond the last meeting and changes between real and imaginary at each
// meeting; c (1 or i) is chosen so that every F_k is zero on the edge's
// value parts and has zero normal derivative on its other parts. The F_k
// are harmonic in the mapped coordinates (so they solve the orthotropic
// equation), carry the r^(k - 1/2) behaviour of every meeting, and leave
// the edge's own conditions untouched; their traces elsewhere go into the
// other edges' data.
type family struct {
	fr           frame
	centre, half float64
	z            []complex128
	c            complex128
	n            int
	kappa, ts    float64 // entering flux = -kappa dF/dd; t per unit s
}

// eval writes F_k and its derivatives along t and d for k < len(f), at
// local (t, d). At a meeting itself the derivatives are NaN.
func (fm *family) eval(t, d float64, f, ft, fd []float64) {
	zeta := complex((t-fm.centre)/fm.half, d/fm.half)
	q, dq := complex(1, 0), complex(0, 0) // Q and Q'/Q
	for _, z := range fm.z {
		w := zeta - z
		q *= cmplx.Sqrt(w)
		dq += 0.5 / w
	}
	q *= fm.c
	tk, tk1 := complex(1, 0), complex(0, 0) // T_k, T_(k-1)
	dk, dk1 := complex(0, 0), complex(0, 0) // T_k', T_(k-1)'
	for k := range f {
		g := q * tk
		dg := q * (tk*dq + dk)
		f[k] = real(g)
		if ft != nil {
			ft[k], fd[k] = real(dg)/fm.half, -imag(dg)/fm.half
		}
		if k == 0 {
			tk, tk1, dk, dk1 = zeta, tk, 1, dk
			continue
		}
		tk, tk1, dk, dk1 = 2*zeta*tk-tk1, tk, 2*tk+2*zeta*dk-dk1, dk
	}
}

// xy evaluates the family at (x, y): F_k and their gradients.
func (fm *family) xy(x, y float64, f, fx, fy []float64) {
	t, d := fm.fr.at(x, y)
	if fx == nil {
		fm.eval(t, d, f, nil, nil)
		return
	}
	fm.eval(t, d, f, fx, fy)
	for k := range f {
		ft, fd := fx[k], fy[k]
		fx[k] = ft*fm.fr.tx + fd*fm.fr.dx
		fy[k] = ft*fm.fr.ty + fd*fm.fr.dy
	}
}

// conjugate returns Im G_k at local (t, 0) for k < len(g): the flow of F_k
// entering through its own edge between s1 and s2 is
// kappa/ts (Im G_k(s2) - Im G_k(s1)).
func (fm *family) conjugate(t float64, g []float64) {
	zeta := complex((t-fm.centre)/fm.half, 0)
	q := fm.c
	for _, z := range fm.z {
		q *= cmplx.Sqrt(zeta - z)
	}
	tk, tk1 := complex(1, 0), complex(0, 0)
	for k := range g {
		g[k] = imag(q * tk)
		if k == 0 {
			tk, tk1 = zeta, tk
			continue
		}
		tk, tk1 = 2*zeta*tk-tk1, tk
	}
}

// entering turns a gradient into the flux entering through edge e.
func entering(pr *problem.Problem, e problem.Side, ux, uy float64) float64 {
	switch e {
	case problem.Bottom:
		return -pr.Ky * uy
	case problem.Top:
		return pr.Ky * uy
	case problem.Left:
		return -pr.Kx * ux
	}
	return pr.Kx * ux
}
