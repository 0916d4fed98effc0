package colour

import "math"

// m1 maps linear sRGB to the cone-like LMS space and m2 maps the cube roots
// of LMS to OKLab (Ottosson 2020, published values).
var (
	m1 = [3][3]float64{
		{0.4122214708, 0.5363325363, 0.0514459929},
		{0.2119034982, 0.6806995451, 0.1073969566},
		{0.0883024619, 0.2817188376, 0.6299787005},
	}
	m2 = [3][3]float64{
		{0.2104542553, 0.7936177850, -0.0040720468},
		{1.9779984951, -2.4285922050, 0.4505937099},
		{0.0259040371, 0.7827717662, -0.8086757660},
	}
	m1inv = invert3(m1)
	m2inv = invert3(m2)
)

// invert3 returns the inverse of a 3x3 matrix by cofactors.
func invert3(m [3][3]float64) [3][3]float64 {
	var c [3][3]float64
	for i := 0; i < 3; i++ {
		for j := 0; j < 3; j++ {
			i1, i2 := (i+1)%3, (i+2)%3
			j1, j2 := (j+1)%3, (j+2)%3
			// cofactor of m[i][j], stored transposed (adjugate)
			c[j][i] = m[i1][j1]*m[i2][j2] - m[i1][j2]*m[i2][j1]
		}
	}
	det := m[0][0]*c[0][0] + m[0][1]*c[1][0] + m[0][2]*c[2][0]
	if det == 0 {
		panic("colour: singular matrix")
	}
	for i := range c {
		for j := range c[i] {
			c[i][j] /= det
		}
	}
	return c
}

func mul3(m *[3][3]float64, x, y, z float64) (float64, float64, float64) {
	return m[0][0]*x + m[0][1]*y + m[0][2]*z,
		m[1][0]*x + m[1][1]*y + m[1][2]*z,
		m[2][0]*x + m[2][1]*y + m[2][2]*z
}

// LinearToOKLab converts linear-light sRGB to OKLab.
func LinearToOKLab(r, g, b float64) (L, A, B float64) {
	l, m, s := mul3(&m1, r, g, b)
	return mul3(&m2, math.Cbrt(l), math.Cbrt(m), math.Cbrt(s))
}

// OKLabToLinear converts OKLab to linear-light sRGB. The result may lie
// outside [0, 1] when the colour is outside the sRGB gamut.
func OKLabToLinear(L, A, B float64) (r, g, b float64) {
	l, m, s := mul3(&m2inv, L, A, B)
	return mul3(&m1inv, l*l*l, m*m*m, s*s*s)
}

// Decode applies the sRGB transfer function (IEC 61966-2-1): an encoded
// channel in [0, 1] to linear light.
func Decode(c float64) float64 {
	if c <= 0.04045 {
		return c / 12.92
	}
	return math.Pow((c+0.055)/1.055, 2.4)
}

// Encode is the inverse of Decode: linear light in [0, 1] to an encoded
// channel. The standard prints the linear-side breakpoint as 0.0031308;
// we use 0.04045/12.92 (= 0.00313080...) so that the two branches invert
// each other exactly.
func Encode(c float64) float64 {
	if c <= 0.04045/12.92 {
		return 12.92 * c
	}
	return 1.055*math.Pow(c, 1/2.4) - 0.055
}

// SRGBToOKLab converts encoded sRGB channels in [0, 1] to OKLab.
func SRGBToOKLab(r, g, b float64) (L, A, B float64) {
	return LinearToOKLab(Decode(r), Decode(g), Decode(b))
}

// OKLabToSRGB converts OKLab to encoded sRGB channels; out-of-gamut colours
// give channels outside [0, 1].
func OKLabToSRGB(L, A, B float64) (r, g, b float64) {
	r, g, b = OKLabToLinear(L, A, B)
	return encodeSigned(r), encodeSigned(g), encodeSigned(b)
}

// encodeSigned extends Encode to negative values by odd symmetry so that
// out-of-gamut colours still round-trip.
func encodeSigned(c float64) float64 {
	if c < 0 {
		return -Encode(-c)
	}
	return Encode(c)
}
