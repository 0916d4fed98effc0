package export

import (
	"math"
	"math/rand/v2"
	"strconv"
	"sync"
	"testing"

	"edgewise/solver/export/internal/pow10"
)

// sameAsStrconv reports the first x whose text differs from strconv's
// 'g' shortest form (the reference), or "" when all agree.
func sameAsStrconv(t *testing.T, xs []float64) {
	t.Helper()
	var b []byte
	bad := 0
	for _, x := range xs {
		b = appendShortest(b[:0], x)
		if want := strconv.FormatFloat(x, 'g', -1, 64); string(b) != want {
			t.Errorf("%#016x: got %s, want %s", math.Float64bits(x), b, want)
			if bad++; bad == 10 {
				t.Fatal("too many differences")
			}
		}
	}
}

// The table of powers of ten is the one the generator computes with
// math/big (so a hand edit of pow10.go fails here).
func TestPow10Table(t *testing.T) {
	for e := pow10Min; e <= pow10Max; e++ {
		hi, lo := pow10.Pow10(e)
		if g := pow10Tab[e-pow10Min]; g != [2]uint64{hi, lo} {
			t.Fatalf("pow10Tab[%d] = %#x, want %#x %#x", e, g, hi, lo)
		}
	}
}

// The integer logarithms are exact over every exponent a float64 can
// have (checked against math.Log10/Log2 away from exact integers, and
// with exact integer arithmetic at powers of ten and two).
func TestFloorLogs(t *testing.T) {
	for q := -1100; q <= 1000; q++ {
		want := int(math.Floor(float64(q) * math.Log10(2)))
		if q == 0 {
			want = 0
		}
		if got := floorLog10Pow2(q); got != want {
			t.Errorf("floorLog10Pow2(%d) = %d, want %d", q, got, want)
		}
		want = int(math.Floor(float64(q)*math.Log10(2) + math.Log10(0.75)))
		if got := floorLog10ThreeQuartersPow2(q); got != want {
			t.Errorf("floorLog10ThreeQuartersPow2(%d) = %d, want %d", q, got, want)
		}
	}
	for e := -400; e <= 400; e++ {
		want := int(math.Floor(float64(e) * math.Log2(10)))
		if got := floorLog2Pow10(e); got != want {
			t.Errorf("floorLog2Pow10(%d) = %d, want %d", e, got, want)
		}
	}
}

// Edge cases: zeros, the extremes, every power of two and of ten with
// its neighbours, subnormals, whole numbers, short decimals, the
// boundaries between the %f and %e layouts.
func TestShortestEdges(t *testing.T) {
	xs := []float64{0, math.Copysign(0, -1), math.Inf(1), math.Inf(-1), math.NaN(),
		math.MaxFloat64, math.SmallestNonzeroFloat64, 0x1p-1022, 0x1p-1022 - 0x1p-1074,
		1, -1, 0.1, 0.2, 0.3, 1.0 / 3, 2.0 / 3, 5e-324, 1e23, 8.41e21, 9007199254740991,
		9007199254740992, 9007199254740993, 123456, 1234567, 999999, 1e6, 999999.5,
		0.0001, 0.00001, 0.000123, 0.0000999, 100000, 1e21, 1e22, 5e-5, 2.5e-5}
	near := func(x float64) {
		xs = append(xs, x, -x, math.Nextafter(x, 0), math.Nextafter(x, math.Inf(1)))
	}
	for e := -1074; e <= 1023; e++ {
		near(math.Ldexp(1, e))
	}
	for e := -323; e <= 308; e++ {
		x, _ := strconv.ParseFloat("1e"+strconv.Itoa(e), 64)
		near(x)
		for _, m := range []string{"2", "5", "9.999999999999999", "1.7976931348623157", "4.9406564584124654", "2.2250738585072014", "1.2345"} {
			x, _ := strconv.ParseFloat(m+"e"+strconv.Itoa(e), 64)
			near(x)
		}
	}
	r := rand.New(rand.NewPCG(1, 2))
	for range 200000 {
		xs = append(xs,
			math.Float64frombits(r.Uint64()&(1<<52-1)),           // subnormal
			float64(r.Int64N(1<<53)),                             // whole
			float64(r.Int64N(1<<20))/float64(int(1)<<r.IntN(30)), // binary fraction
			float64(r.Int64N(100000))*math.Pow10(r.IntN(40)-20),  // short decimal
		)
		xs = append(xs, math.Ldexp(float64(1+r.IntN(15)), r.IntN(2100)-1080))
	}
	sameAsStrconv(t, xs)
}

// Random bit patterns over every exponent, and random values in the
// decades a field takes (the %f layout), 32 million in all (fewer under
// the race detector); split over the processors.
func TestShortestRandom(t *testing.T) {
	n := 16 << 20
	if raceOn || testing.Short() {
		n = 1 << 18
	}
	const parts = 8
	var wg sync.WaitGroup
	for p := range parts {
		wg.Add(1)
		go func() {
			defer wg.Done()
			r := rand.New(rand.NewPCG(uint64(p), 16))
			xs := make([]float64, 0, 1<<16)
			for done := 0; done < n/parts; done += cap(xs) / 2 {
				xs = xs[:0]
				for range cap(xs) / 2 {
					u := r.Uint64()
					// bits: every float64 but Inf and NaN, which strconv formats
					if u&(0x7ff<<52) == 0x7ff<<52 {
						u ^= 1 << 62
					}
					xs = append(xs, math.Float64frombits(u), (r.Float64()-0.5)*math.Pow10(r.IntN(16)-8))
				}
				sameAsStrconv(t, xs)
				if t.Failed() {
					return
				}
			}
		}()
	}
	wg.Wait()
}

// appendShortest makes no allocation of its own.
func TestShortestAllocates(t *testing.T) {
	b := make([]byte, 0, 64)
	if a := testing.AllocsPerRun(100, func() {
		b = appendShortest(b[:0], -1.2345678901234567e-7)
		b = appendShortest(b, 0.1234567890123456)
	}); a != 0 {
		t.Errorf("%v allocations a run", a)
	}
}

// BenchmarkShortest formats numbers typical of a field (%f layout, 16-17
// digits) and of random bits (%e layout); strconv for comparison.
func BenchmarkShortest(b *testing.B) {
	r := rand.New(rand.NewPCG(3, 4))
	field := make([]float64, 1024)
	for i := range field {
		field[i] = 35 + 145*r.Float64()
	}
	anyBits := make([]float64, 1024)
	for i := range anyBits {
		anyBits[i] = math.Float64frombits(r.Uint64() &^ (1 << 62))
	}
	for _, c := range []struct {
		name string
		xs   []float64
	}{{"field", field}, {"bits", anyBits}} {
		buf := make([]byte, 0, 32)
		b.Run(c.name, func(b *testing.B) {
			for b.Loop() {
				for _, x := range c.xs {
					buf = appendShortest(buf[:0], x)
				}
			}
			b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N*len(c.xs)), "ns/number")
		})
		b.Run(c.name+"/strconv", func(b *testing.B) {
			for b.Loop() {
				for _, x := range c.xs {
					buf = strconv.AppendFloat(buf[:0], x, 'g', -1, 64)
				}
			}
			b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N*len(c.xs)), "ns/number")
		})
	}
}
