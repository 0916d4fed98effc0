// Package colour holds the colour maps edgewise draws its fields with, and
// the OKLab colour space they are designed in.
//
// OKLab is Björn Ottosson's perceptual colour space ("A perceptual color
// space for image processing", 2020). From linear sRGB (r, g, b) it is
//
//	[l m s]   = M1 [r g b]
//	[l' m' s'] = cube roots of l, m, s
//	[L a b]   = M2 [l' m' s']
//
// with the published matrices M1 and M2 (see oklab.go). The inverse
// matrices are computed here, in float64, from M1 and M2 rather than taken
// from the rounded published inverses, so that a round trip is exact to
// rounding error; the test compares them with the published inverses.
//
// Two maps are designed in OKLab polar form (L, C, h):
//
//	Sequential ("dusk"):  L rises linearly from 0.22 to 0.96; the hue turns
//	                      from a deep blue-violet through teal and sage to a
//	                      pale warm sand; chroma is modest throughout.
//	Diverging ("ember-tide"): a deep sea blue and a burnt copper at equal
//	                      lightness 0.48 at the ends, a light neutral
//	                      (L 0.965, C 0) at t = 0.5, lightness V-shaped and
//	                      symmetric about the centre.
//
// Every colour is brought into the sRGB gamut by lowering its chroma at
// fixed L and h (bisection), never by clamping channels, so lightness and
// hue are what the design says. Channels are encoded with the sRGB transfer
// function of IEC 61966-2-1 and rounded to 8 bits.
package colour
