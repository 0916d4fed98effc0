package export

//go:generate go run ./internal/pow10/gen -o pow10.go

import (
	"encoding/binary"
	"math"
	"math/bits"
	"slices"
	"strconv"
)

// appendShortest appends x exactly as strconv.AppendFloat(b, x, 'g', -1, 64)
// does: the shortest decimal that reads back as x (the nearest one when
// there are several of that length, the even one on a tie), written as
// %f when its decimal exponent is from -4 to 5 and as %e (at least two
// exponent digits) otherwise. The tests compare the two on tens of
// millions of values.
//
// The digits come from the Schubfach method (R. Giulietti, "The Schubfach
// way to render doubles", 2020): the rounding interval of x, scaled by a
// power of ten chosen so that it holds at most one multiple of ten, is
// computed exactly enough by one 64 x 128-bit product per end, rounded to
// odd; the shortest decimal is then either a multiple of ten in the
// interval or the nearer of its two integer neighbours. It does not
// allocate, and unlike strconv it writes the digits straight into b.
func appendShortest(b []byte, x float64) []byte {
	u := math.Float64bits(x)
	if u&(0x7ff<<52) == 0x7ff<<52 { // Inf, NaN: rare, left to strconv
		return strconv.AppendFloat(b, x, 'g', -1, 64)
	}
	if u&(1<<63) != 0 {
		b = append(b, '-')
		u &^= 1 << 63
	}
	if u == 0 {
		return append(b, '0')
	}
	s, k := shortest(u)
	return appendDecimal(b, s, k)
}

// shortest returns the shortest decimal s 10^k in the rounding interval
// of the positive finite float64 with bits u, without trailing zeros in s.
func shortest(u uint64) (s uint64, k int) {
	const bias, mantBits = 1075, 52
	be := int(u >> mantBits)
	m := u & (1<<mantBits - 1)
	var c uint64
	var q int
	if be != 0 {
		c, q = m|1<<mantBits, be-bias
		// a whole number below 2^53 is its own shortest form
		if -mantBits <= q && q <= 0 && c&(1<<-q-1) == 0 {
			return trimZeros(c>>-q, 0)
		}
	} else {
		c, q = m, 1-bias
	}
	// Half the gap to the neighbours is 2^(q-1), except at a power of two,
	// where the lower neighbour is half as far. In units of 2^(q-2):
	lowerCloser := m == 0 && be > 1
	cbl := 4*c - 2
	if lowerCloser {
		cbl++
		k = floorLog10ThreeQuartersPow2(q)
	} else {
		k = floorLog10Pow2(q)
	}
	h := q + floorLog2Pow10(-k) + 1 // from 1 to 4
	g := &pow10Tab[-k-pow10Min]
	vbl := roundToOdd(g, cbl<<h)
	vb := roundToOdd(g, 4*c<<h)
	vbr := roundToOdd(g, (4*c+2)<<h)
	// x's digits round back to x on the boundaries too when c is even
	lower, upper := vbl, vbr
	if c&1 != 0 {
		lower++
		upper--
	}
	s = vb >> 2
	if s >= 10 {
		// a multiple of ten in the interval: one digit fewer
		sp := s / 10
		upIn := lower <= 40*sp
		wpIn := 40*sp+40 <= upper
		if upIn != wpIn {
			if wpIn {
				sp++
			}
			return trimZeros(sp, k+1)
		}
	}
	// From s >= 10 on, s or s+1 ends in a zero only when it is outside
	// the interval (a multiple of ten inside it was taken above, the
	// interval being too short for two), so what is returned has no
	// trailing zero; below, 9 may round up to 10.
	uIn := lower <= 4*s
	wIn := 4*s+4 <= upper
	if uIn != wIn {
		if wIn {
			s++
		}
	} else {
		// both neighbours (or, never, neither): the nearer, the even on a tie
		mid := 4*s + 2
		if vb > mid || vb == mid && s&1 != 0 {
			s++
		}
	}
	if s == 10 {
		return 1, k + 1
	}
	return s, k
}

// roundToOdd returns floor(g cp / 2^128), its lowest bit set when the
// part dropped is more than 2^-63 of a unit.
func roundToOdd(g *[2]uint64, cp uint64) uint64 {
	x1, _ := bits.Mul64(g[1], cp)
	y1, y0 := bits.Mul64(g[0], cp)
	z, carry := bits.Add64(y0, x1, 0)
	y1 += carry
	if z > 1 {
		y1 |= 1
	}
	return y1
}

// floorLog10Pow2 is floor(q log10 2), exact for |q| <= 2620.
func floorLog10Pow2(q int) int { return q * 1262611 >> 22 }

// floorLog10ThreeQuartersPow2 is floor(log10(3/4 2^q)), exact for |q| <= 2620.
func floorLog10ThreeQuartersPow2(q int) int { return (q*1262611 - 524031) >> 22 }

// floorLog2Pow10 is floor(e log2 10), exact for |e| <= 1233.
func floorLog2Pow10(e int) int { return e * 1741647 >> 19 }

// trimZeros removes the trailing zeros of s (> 0) into the exponent.
func trimZeros(s uint64, k int) (uint64, int) {
	for s%10 == 0 {
		s /= 10
		k++
	}
	return s, k
}

// digitPairs holds "00" to "99".
const digitPairs = "00010203040506070809101112131415161718192021222324252627282930313233343536373839" +
	"40414243444546474849505152535455565758596061626364656667686970717273747576777879" +
	"8081828384858687888990919293949596979899"

// pow10s are 10^0 to 10^19.
var pow10s = [20]uint64{1, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12,
	1e13, 1e14, 1e15, 1e16, 1e17, 1e18, 1e19}

// numDigits is the number of decimal digits of s > 0.
func numDigits(s uint64) int {
	n := (bits.Len64(s)*1233)>>12 + 1 // 1233/4096 ~ log10(2): the count or one more
	if s < pow10s[n-1] {
		n--
	}
	return n
}

// eightDigits returns the 8 decimal digits of n < 10^8 (leading zeros
// included) as ASCII bytes in a little-endian word, the first digit in
// the lowest byte. Both halves of four digits are split into pairs, and
// the pairs into digits, in lanes of one word at a time:
// floor(x/100) = floor(x 10486 / 2^20) for x < 10^4 and floor(x/10) =
// floor(x 103 / 2^10) for x < 100 (exact identities over those ranges,
// checked by the tests against strconv).
func eightDigits(n uint32) uint64 {
	x := uint64(n/10000) | uint64(n%10000)<<32
	y := (x * 10486 >> 20) & 0x0000007f0000007f
	x = y | (x-y*100)<<16
	z := (x * 103 >> 10) & 0x000f000f000f000f
	x = z | (x-z*10)<<8
	return x + 0x3030303030303030
}

// putDigits writes the nd decimal digits of s (< 10^17) at the start of d
// from left to right, the last sixteen at most in words of eight; d needs
// 8 bytes of room after them, which it may overwrite.
func putDigits(d []byte, s uint64, nd int) {
	var mid, lo uint32
	switch {
	case nd > 16:
		mid, lo = uint32(s/1e8%1e8), uint32(s%1e8)
		s /= 1e16
	case nd > 8:
		lo = uint32(s % 1e8)
		s /= 1e8
	}
	// the leading digits, left-aligned
	m := (nd-1)%8 + 1
	switch {
	case m == 1:
		d[0] = byte('0' + s)
	case m == 2:
		d[0], d[1] = digitPairs[2*s], digitPairs[2*s+1]
	default: // their word with its leading zeros dropped
		binary.LittleEndian.PutUint64(d, eightDigits(uint32(s))>>(8*(8-m)))
	}
	if nd > 16 {
		binary.LittleEndian.PutUint64(d[m:], eightDigits(mid))
		m += 8
	}
	if nd > 8 {
		binary.LittleEndian.PutUint64(d[m:], eightDigits(lo))
	}
}

// appendDecimal appends s 10^k (s > 0, at most 17 digits, no trailing
// zero) in strconv's 'g' layout for the shortest precision. The digits
// are written straight into b, one place to the right, and the digits
// before the point then moved left by one to make room for it.
func appendDecimal(b []byte, s uint64, k int) []byte {
	nd := 16 // most: a normal number's 16 or 17 digits
	if s >= 1e16 {
		nd = 17
	} else if s < 1e15 {
		nd = numDigits(s)
	}
	dp := nd + k              // the decimal point after dp digits
	b = slices.Grow(b, nd+16) // 8 for putDigits, and "0.0000" or "e+308" at most
	n := len(b)
	exp := dp - 1
	switch {
	case exp < -4 || exp >= 6:
		b = b[:n+1+nd]
		putDigits(b[n+1:n+1+nd+8], s, nd)
		b[n] = b[n+1]
		if nd == 1 {
			b = b[:n+1]
		} else {
			b[n+1] = '.'
		}
		b = append(b, 'e', '+')
		if exp < 0 {
			b[len(b)-1] = '-'
			exp = -exp
		}
		if exp < 100 {
			return append(b, digitPairs[2*exp], digitPairs[2*exp+1])
		}
		return append(b, byte('0'+exp/100), digitPairs[2*(exp%100)], digitPairs[2*(exp%100)+1])
	case dp <= 0: // 0.000ddd
		b = append(b, '0', '.', '0', '0', '0', '0')[:n+2-dp]
		b = b[:len(b)+nd]
		putDigits(b[len(b)-nd:len(b)+8], s, nd)
		return b
	case dp >= nd: // ddd000
		b = b[:n+nd]
		putDigits(b[n:n+nd+8], s, nd)
		return append(b, "00000"[:dp-nd]...)
	}
	// ddd.ddd
	b = b[:n+1+nd]
	putDigits(b[n+1:n+1+nd+8], s, nd)
	for i := n; i < n+dp; i++ { // dp <= 6
		b[i] = b[i+1]
	}
	b[n+dp] = '.'
	return b
}
