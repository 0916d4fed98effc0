// Package pow10 computes, exactly with math/big, the 128-bit significands
// of the powers of ten that the export package's shortest-number formatter
// multiplies by. The generator in gen/ writes them into
// solver/export/pow10.go (`go generate ./solver/export/`); the formatter
// never uses math/big at run time, and its tests compare the table with
// this package.
//
// For each e from Min to Max the table holds
//
//	g(e) = floor(10^e * 2^(127-r)) + 1,   r = floor(log2(10^e))
//
// so that 2^127 < g(e) <= 2^128 - 1 and g(e) - 1 <= 10^e 2^(127-r) < g(e):
// the power rounded up to 128 bits, as the rounding-to-odd argument of
// the formatter needs.
package pow10

import "math/big"

// The range of decimal exponents -k that a float64 needs: k runs from
// floor(log10(2^-1074)) = -324 to floor(log10(2^971)) = 292.
const (
	Min = -292
	Max = 324
)

// Pow10 returns g(e) as its high and low 64-bit halves.
func Pow10(e int) (hi, lo uint64) {
	ten := big.NewInt(10)
	num, den := big.NewInt(1), big.NewInt(1)
	if e >= 0 {
		num.Exp(ten, big.NewInt(int64(e)), nil)
	} else {
		den.Exp(ten, big.NewInt(int64(-e)), nil)
	}
	// r = floor(log2(num/den))
	r := num.BitLen() - den.BitLen()
	if new(big.Int).Lsh(den, uint(max(r, 0))).Cmp(new(big.Int).Lsh(num, uint(max(-r, 0)))) > 0 {
		r--
	}
	// g = floor(num * 2^(127-r) / den) + 1
	s := 127 - r
	if s >= 0 {
		num.Lsh(num, uint(s))
	} else {
		den.Lsh(den, uint(-s))
	}
	g := new(big.Int).Quo(num, den)
	g.Add(g, big.NewInt(1))
	if g.BitLen() != 128 {
		panic("pow10: g has the wrong length")
	}
	mask := new(big.Int).SetUint64(^uint64(0))
	return new(big.Int).Rsh(g, 64).Uint64(), new(big.Int).And(g, mask).Uint64()
}
