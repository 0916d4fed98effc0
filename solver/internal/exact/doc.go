// Package exact holds exact solutions for testing the engine: a
// homogeneous rectangle 0 < x < W, 0 < y < H (conductivity Kx, Ky, no
// source) with two boundary parts held at UA and UB, each a stretch of one
// edge (possibly the whole edge), and the rest of the boundary insulated.
// It gives the field, its gradient, the flux density entering along any
// edge (the exit gradient along a part), the flow through any stretch of
// an edge (FlowThrough, from the stream function, no quadrature), the
// mean field along a stretch (MeanAlong, by quadrature) and the
// conductance between the parts, to about 1e-12 or better away from the
// parts' ends. It also holds Smooth, a manufactured field smooth up to the
// corners, with the problem of any edge kinds that carries it.
//
// # Method
//
// The formulas are the classical ones of conformal mapping, found in any
// complex-analysis or potential-theory text (written here from memory, and
// checked by the package tests against identities and the published
// coefficients of the classical singularity benchmark).
//
// Orthotropy by the coordinate map: Kx u_xx + Ky u_yy = 0 on W x H is
// Laplace's equation on W x cH, c = sqrt(Kx/Ky), at (x, cy); flows scale by
// sqrt(Kx Ky), the conductance of the mapped rectangle times sqrt(Kx Ky).
//
// The rectangle is turned a quarter if need be so that the mapped one,
// a x b, has b >= a (the part ends then spread over the half-plane rather
// than crowd near +-1). Centred and scaled, z' = (2K/a)(X - a/2 + iY) runs
// over -K < Re z' < K, 0 < Im z' < K', with the modulus k chosen so that
//
//	K'(k)/K(k) = 2b/a,  q = exp(-pi K'/K),  k = theta2^2/theta3^2,  k' = theta4^2/theta3^2
//
// and zeta = sn(z', k) maps it onto the upper half-plane, corners to
// -1, 1, 1/k, -1/k. sn, cn, dn come from Jacobi's theta series,
//
//	sn = (theta3/theta2) theta1(v)/theta4(v),  cn = (theta4/theta2) theta2(v)/theta4(v),
//	dn = (theta4/theta3) theta3(v)/theta4(v),  v = pi z'/(2K),
//
// which converge like q^(n^2) (q <= exp(-2 pi)) and keep relative accuracy
// where cn and dn fall like exp(-Im z') in long rectangles; near the pole
// iK' the map takes sn(u + iK') = 1/(k sn u) instead. The tests check them
// against the arithmetic-geometric-mean method at real arguments. Complete
// integrals come from the AGM: K(k) = pi / (2 agm(1, k')).
//
// The four part ends, in counter-clockwise order t1 < t2 < t3 < t4 on the
// real axis (part A from t1 to t2, part B from t3 to t4), have the
// cross-ratio
//
//	lambda = (t3-t2)(t4-t1) / ((t3-t1)(t4-t2)),  1 - lambda = (t2-t1)(t4-t3) / ((t3-t1)(t4-t2))
//
// A Moebius map w = (m11 zeta + m12)/(m21 zeta + m22) takes them to
//
//	-1/kap, -1, 1, 1/kap      with lambda = 4 kap/(1+kap)^2      when lambda <= 1/2
//	-1, 1, 1/kap, -1/kap      with 1 - lambda = 4 kap/(1+kap)^2  otherwise
//
// (the second keeps kap away from 1, where the first would crowd the
// parts together). Then
//
//	F(w) = int_0^w dt / sqrt((1 - t^2)(1 - kap^2 t^2)) = w R_F(1 - w^2, 1 - kap^2 w^2, 1)
//
// (Carlson's symmetric form, computed by duplication; F(asin w | kap^2) for
// real w) maps the half-plane onto the rectangle |Re F| < K(kap),
// 0 < Im F < K'(kap), the parts on its two sides (first arrangement) or
// on its bottom and top (second), where the field is linear:
//
//	u = (UA+UB)/2 + (UB-UA) Re F / (2K),    conductance K'(kap) / (2 K(kap))
//	u = UA + (UB-UA) Im F / K',             conductance 2 K(kap) / K'(kap)
//
// per unit depth and unit conductivity. The gradient and the flux density
// follow from dF/dw = 1/(sqrt(1-w^2) sqrt(1-kap^2 w^2)), dw/dzeta = det m /
// (m21 zeta + m22)^2 and dzeta/dz' = cn dn; the flux entering across an
// arc traversed counter-clockwise is the conductivity times the change of
// Im(u + i psi) along it.
//
// # Accuracy and limits
//
// Values to about 1e-13 of |UB - UA|, flux density to about 1e-12
// relative, except near the parts' ends and the corners: an end is a
// branch point of the map, and within a distance d of it (relative to the
// rectangle) the value loses about 1e-16/d, or 1e-16/d^2 at a corner where
// two parts touch, and the flux density near a corner about 1e-16/d^2. Rectangles up to about 1:30 (after the
// orthotropic map) have been checked; the tests say which.
package exact
