package series

import (
	"math"
	"math/cmplx"
)

// pieceKind names the analytic function f of a harmonic piece
// u = Re(c f(zeta)), zeta = rho (z - z0), z = x + i y.
type pieceKind int

const (
	powPiece   pieceKind = iota // zeta^n
	logPiece                    // log zeta: the angle function at a corner break
	zlogPiece                   // zeta log zeta: value/flux corner mismatch
	z2logPiece                  // zeta^2 log zeta: curvature mismatch at a value/value corner
	z3logPiece                  // zeta^3 log zeta: third-order mismatch at a value/flux corner
)

// piece is one harmonic function carried out of the series: smooth
// polynomials fitted at the corners and the singular corner functions.
// Every piece is the real part of an analytic function, so its flow through
// a segment is the change of the harmonic conjugate Im(c f) along it and its
// area integral follows from a second antiderivative of f.
type piece struct {
	kind   pieceKind
	n      int // power for powPiece
	z0     complex128
	rho    complex128
	c      complex128
	corner int // corner index for corner pieces, -1 for smooth ones
}

// ipow returns z^n for n >= 0 by repeated multiplication. It is a
// function of its own, not inlined, to keep its loop out of piece.f (see
// the package doc of edgewise/solver, Loops in functions of their own).
//
//go:noinline
func ipow(z complex128, n int) complex128 {
	r := complex(1, 0)
	for ; n > 0; n-- {
		r *= z
	}
	return r
}

func (p *piece) zeta(x, y float64) complex128 { return p.rho * complex(x-real(p.z0), y-imag(p.z0)) }

// f returns f(zeta), f'(zeta), f”(zeta).
func (p *piece) f(z complex128) (f, d1, d2 complex128) {
	switch p.kind {
	case powPiece:
		n := p.n
		switch n {
		case 0:
			return 1, 0, 0
		case 1:
			return z, 1, 0
		}
		zn2 := ipow(z, n-2)
		return zn2 * z * z, complex(float64(n), 0) * zn2 * z, complex(float64(n*(n-1)), 0) * zn2
	}
	if z == 0 {
		switch p.kind {
		case zlogPiece:
			return 0, complex(math.Inf(-1), 0), complex(math.Inf(1), 0)
		case z2logPiece:
			return 0, 0, complex(math.Inf(-1), 0)
		case z3logPiece:
			return 0, 0, 0
		}
	}
	// one call of the logarithm for every kind: a smaller function for
	// the browser to optimize (see the package doc of edgewise/solver,
	// Loops in functions of their own)
	l := cmplx.Log(z)
	switch p.kind {
	case logPiece:
		return l, 1 / z, -1 / (z * z)
	case zlogPiece:
		return z * l, l + 1, 1 / z
	case z2logPiece:
		return z * z * l, 2*z*l + z, 2*l + 3
	case z3logPiece:
		return z * z * z * l, 3*z*z*l + z*z, 6*z*l + 5*z
	}
	panic("series: bad piece kind")
}

// f3 returns f”'(zeta).
func (p *piece) f3(z complex128) complex128 {
	switch p.kind {
	case powPiece:
		n := p.n
		if n < 3 {
			return 0
		}
		return complex(float64(n*(n-1)*(n-2)), 0) * ipow(z, n-3)
	case logPiece:
		return 2 / (z * z * z)
	case zlogPiece:
		return -1 / (z * z)
	case z2logPiece:
		return 2 / z
	case z3logPiece:
		return 6*cmplx.Log(z) + 11
	}
	panic("series: bad piece kind")
}

// third returns the third derivative along the unit directions ea, eb, ec.
func (p *piece) third(x, y float64, ea, eb, ec complex128) float64 {
	r := p.rho
	return real(p.c * p.f3(p.zeta(x, y)) * r * ea * r * eb * r * ec)
}

// f2 returns a second antiderivative of f, zero at zeta = 0 for the
// logarithmic kinds.
func (p *piece) f2(z complex128) complex128 {
	switch p.kind {
	case powPiece:
		n := float64(p.n)
		return ipow(z, p.n+2) / complex((n+1)*(n+2), 0)
	}
	if z == 0 {
		return 0
	}
	l := cmplx.Log(z)
	switch p.kind {
	case logPiece:
		return z*z*l/2 - 3*z*z/4
	case zlogPiece:
		z3 := z * z * z
		return z3*l/6 - 5*z3/36
	case z2logPiece:
		z4 := z * z * z * z
		return z4*l/12 - 7*z4/144
	case z3logPiece:
		z5 := z * z * z * z * z
		return z5*l/20 - 9*z5/400
	}
	panic("series: bad piece kind")
}

// value returns u, u_x, u_y at (x, y). At the corner of a singular piece
// the angle function takes the mean of its two edge values and the
// gradient is NaN where it is unbounded.
func (p *piece) value(x, y float64) (u, ux, uy float64) {
	z := p.zeta(x, y)
	if z == 0 {
		switch p.kind {
		case logPiece:
			return -imag(p.c) * math.Pi / 4, math.NaN(), math.NaN()
		case zlogPiece:
			return 0, math.NaN(), math.NaN()
		case z2logPiece, z3logPiece:
			return 0, 0, 0
		}
	}
	f, d1, _ := p.f(z)
	g := p.c * d1 * p.rho
	return real(p.c * f), real(g), -imag(g)
}

// second returns the second derivative along the unit direction e.
func (p *piece) second(x, y float64, e complex128) float64 {
	_, _, d2 := p.f(p.zeta(x, y))
	r := p.rho * e
	return real(p.c * d2 * r * r)
}

// mixed returns the second derivative along the unit directions ea, eb.
func (p *piece) mixed(x, y float64, ea, eb complex128) float64 {
	_, _, d2 := p.f(p.zeta(x, y))
	return real(p.c * d2 * p.rho * ea * p.rho * eb)
}

// conj returns the harmonic conjugate Im(c f) at (x, y); it is -Inf/+Inf
// at the corner of a log piece.
func (p *piece) conj(x, y float64) float64 {
	z := p.zeta(x, y)
	if z == 0 {
		if p.kind == logPiece {
			return math.Inf(1)
		}
		if p.kind != powPiece {
			return 0
		}
	}
	f, _, _ := p.f(z)
	return imag(p.c * f)
}

// area returns the integral of the piece over [0, w] x [0, h].
func (p *piece) area(w, h float64) float64 {
	at := func(x, y float64) complex128 { return p.f2(p.zeta(x, y)) }
	s := at(w, h) - at(0, h) - at(w, 0) + at(0, 0)
	return real(p.c * s / (1i * p.rho * p.rho))
}
