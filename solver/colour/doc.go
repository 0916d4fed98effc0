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
// Two maps are designed in OKLab polar form (L, C, h) from one written rule,
// not from any published map:
//
//  1. Lightness carries the value. It changes linearly with t (sequential:
//     strictly rising; diverging: lightest at the neutral centre and falling
//     by the same amount on both arms), so the picture reads in greyscale and
//     on a photocopy, and the order survives every colour-vision deficiency.
//  2. The hue turns with lightness along a path of our own, so that
//     neighbouring levels differ in hue as well as in lightness: the turn is
//     a straight line in hue angle, stated by its two ends.
//  3. Chroma stays modest (at most 0.13) and is zero at a diverging map's
//     centre, so no colour shouts and zero looks like nothing.
//  4. The checks (maps_test.go, cvd_test.go): lightness of the emitted 8-bit
//     colours monotonic; CIE luminance and luma monotonic (sequential) or
//     V-shaped (diverging); neighbouring levels of a 16-level legend at
//     least 0.02 apart in OKLab for normal vision and under simulated
//     protanopia, deuteranopia and tritanopia; the two diverging arms told
//     apart under each simulation; the hue turning the way the rule says.
//
// The maps:
//
//	Sequential ("fen": peat, moss, pool water): L 0.22 to 0.97; hue from
//	          45 deg (a dark peat brown) through 120 (moss) to 200 (a pale
//	          cold water colour); chroma 0.05, rising to 0.11 at the middle,
//	          0.035 at the pale end.
//	Diverging ("watershed"): a light neutral (L 0.97, C 0) at t = 0.5;
//	          L 0.42 at both ends; the low arm turns from a pale aqua
//	          (200 deg) through sky blue to a violet (300 deg), the high arm
//	          from a pale straw (95 deg) through peach and rose to a crimson
//	          (355 deg); chroma grows like the distance from the centre to
//	          the power 0.75, up to 0.13.
//
// Every colour is brought into the sRGB gamut by lowering its chroma at
// fixed L and h (bisection), never by clamping channels, so lightness and
// hue are what the design says. Channels are encoded with the sRGB transfer
// function of IEC 61966-2-1 and rounded to 8 bits.
package colour
