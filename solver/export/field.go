package export

import (
	"fmt"
	"io"
	"math"
	"runtime"
	"slices"
)

// Units names what the numbers in an export mean.
type Units struct {
	Quantity   string // name of the field, e.g. "temperature"; "" gives "value"
	Unit       string // unit of the field, e.g. "°C"
	FluxUnit   string // unit of the flux, e.g. "W/m2"
	LengthUnit string // unit of x and y, e.g. "m"
}

// Field is a solved field on a node grid of (Nx+1) x (Ny+1) points, row by
// row from the bottom: U[j*(Nx+1)+i] at x = i*W/Nx, y = j*H/Ny.
type Field struct {
	Nx, Ny int
	W, H   float64
	U      []float64 // field values
	Ux, Uy []float64 // gradient at the same nodes; both nil to leave it out
	Kx, Ky float64   // conductivity, for the flux -(Kx Ux, Ky Uy)
	Units
}

// check reports a malformed Field.
func (f *Field) check() error {
	if f == nil {
		return fmt.Errorf("export: no field")
	}
	if f.Nx < 1 || f.Ny < 1 {
		return fmt.Errorf("export: grid %d x %d: need at least one cell each way", f.Nx, f.Ny)
	}
	if !(f.W > 0) || !(f.H > 0) || math.IsInf(f.W, 0) || math.IsInf(f.H, 0) {
		return fmt.Errorf("export: size %g x %g: need positive finite width and height", f.W, f.H)
	}
	n := (f.Nx + 1) * (f.Ny + 1)
	if len(f.U) != n {
		return fmt.Errorf("export: %d values for a grid of %d nodes", len(f.U), n)
	}
	if (f.Ux == nil) != (f.Uy == nil) {
		return fmt.Errorf("export: gradient needs both Ux and Uy")
	}
	if f.Ux != nil && (len(f.Ux) != n || len(f.Uy) != n) {
		return fmt.Errorf("export: gradient has %d, %d values for a grid of %d nodes", len(f.Ux), len(f.Uy), n)
	}
	return nil
}

// x and y give node coordinates, the same way the contour package does.
func (f *Field) x(i int) float64 { return float64(i) * f.W / float64(f.Nx) }
func (f *Field) y(j int) float64 { return float64(j) * f.H / float64(f.Ny) }

// withUnit writes "name [unit]", or just the name without a unit.
func withUnit(name, unit string) string {
	if unit == "" {
		return name
	}
	return name + " [" + unit + "]"
}

// header returns the column names shared by the field and probe files.
func (u Units) header(gradient bool) []string {
	q := u.Quantity
	if q == "" {
		q = "value"
	}
	gu := u.Unit + "/" + u.LengthUnit
	switch {
	case u.Unit == "" && u.LengthUnit == "":
		gu = ""
	case u.Unit == "":
		gu = "1/" + u.LengthUnit
	case u.LengthUnit == "":
		gu = u.Unit
	}
	h := []string{withUnit("x", u.LengthUnit), withUnit("y", u.LengthUnit), withUnit(q, u.Unit)}
	if gradient {
		h = append(h,
			withUnit("grad_x", gu), withUnit("grad_y", gu),
			withUnit("flux_x", u.FluxUnit), withUnit("flux_y", u.FluxUnit))
	}
	return h
}

// appendHeader appends the header line: text cells (guarded and quoted as
// appendText does) ending in CRLF.
func appendHeader(b []byte, cols []string) []byte {
	for k, c := range cols {
		if k > 0 {
			b = append(b, ',')
		}
		b = appendText(b, c)
	}
	return append(b, '\r', '\n')
}

// appendNum appends one number in the shortest form that reads back
// exactly, as strconv's 'g' with precision -1 writes it (appendShortest,
// twice as fast); a zero is written 0, never -0, and a missing value NaN.
func appendNum(b []byte, x float64) []byte {
	if x == 0 {
		return append(b, '0')
	}
	return appendShortest(b, x)
}

// appendFlux appends the flux -k g, given t, the text of g.
func appendFlux(b []byte, k, g float64, t []byte) []byte {
	if k == 1 { // the flux is the gradient negated, exactly
		return appendNegated(b, t)
	}
	return appendNum(b, -k*g)
}

// appendNegated appends the text of -x given the text t of x as appendNum
// wrote it: the sign changed, 0 and NaN kept. Negation is exact, and the
// shortest form of -x is that of x with a minus sign, so a unit
// conductivity's flux column costs a copy instead of a formatting. t must
// not overlap the bytes appended (b has the room: FieldCSV grows it per
// node).
func appendNegated(b, t []byte) []byte {
	switch {
	case t[0] == '-' && t[1] == 'I': // -Inf
		return append(b, "+Inf"...)
	case t[0] == '-':
		return append(b, t[1:]...)
	case t[0] == '+': // +Inf
		return append(append(b, '-'), t[1:]...)
	case len(t) == 1 && t[0] == '0', t[0] == 'N': // 0, NaN
		return append(b, t...)
	}
	return append(append(b, '-'), t...)
}

// bandBytes is about how much text one band of rows is formatted into
// before it is written: large enough that writes are few, small enough to
// stay in cache.
const bandBytes = 256 << 10

// FieldCSV writes the field as CSV, one row per node (see the package
// comment for the columns). It returns an error for a malformed field or a
// failed write.
//
// The text is made in bands of whole grid rows, each band appended into
// a reused buffer and written with one Write call (w needs no buffering
// of its own). The x column repeats on every grid row and y is the same
// along one, so each is formatted once. Where more than one processor is
// available (natively; WebAssembly has one) the bands are formatted in
// parallel while the finished ones are written, in order: the output is
// the same byte for byte.
func FieldCSV(w io.Writer, f *Field) error {
	if err := f.check(); err != nil {
		return err
	}
	cw := newFieldWriter(f)
	if _, err := w.Write(appendHeader(nil, f.header(f.Ux != nil))); err != nil {
		return err
	}
	bands := (f.Ny + cw.rows) / cw.rows
	if workers := min(runtime.GOMAXPROCS(0), 8, bands); workers > 1 {
		return cw.parallel(w, bands, workers)
	}
	return cw.serial(w)
}

// serial formats and writes the bands one after another in one buffer.
func (cw *fieldWriter) serial(w io.Writer) error {
	b := make([]byte, 0, cw.size)
	for j := 0; j <= cw.f.Ny; j += cw.rows {
		b = cw.band(b[:0], j, min(j+cw.rows, cw.f.Ny+1))
		if _, err := w.Write(b); err != nil {
			return err
		}
	}
	return nil
}

// fieldWriter formats the rows of one field.
type fieldWriter struct {
	f    *Field
	xs   []cell // the x column's texts, each followed by a comma
	rows int    // grid rows per band
	size int    // bytes a band can take
}

// A cell holds a number's text and a comma (at most 25 bytes) in its
// first len bytes. Copied whole, it moves with a few word stores instead
// of a call to copy the bytes (the x and y columns are a fifth of the
// file).
type cell struct {
	text [31]byte
	len  uint8
}

func newCell(x float64) cell {
	var c cell
	c.len = uint8(copy(c.text[:], append(appendNum(c.text[:0], x), ',')))
	return c
}

// put writes c at the end of b, which needs 31 bytes of room.
func (c *cell) put(b []byte) []byte {
	n := len(b)
	*(*[31]byte)(b[n : n+31]) = c.text
	return b[:n+int(c.len)]
}

func newFieldWriter(f *Field) *fieldWriter {
	cw := &fieldWriter{f: f, xs: make([]cell, f.Nx+1)}
	xlen := 0
	for i := range cw.xs {
		cw.xs[i] = newCell(f.x(i))
		xlen += int(cw.xs[i].len)
	}
	perNode := xlen/(f.Nx+1) + 3*24 // x, then up to 24 bytes a number
	if f.Ux != nil {
		perNode += 4 * 24
	}
	cw.rows = max(1, bandBytes/(perNode*(f.Nx+1)))
	cw.size = cw.rows*perNode*(f.Nx+1) + nodeRoom
	return cw
}

// nodeRoom is the room one node's line can take: x and y as whole cells,
// five numbers of at most 24 bytes with their separators, and the slack
// of appendShortest.
const nodeRoom = 2*31 + 5*25 + 1 + 16

// band appends grid rows lo to hi-1 to b.
func (cw *fieldWriter) band(b []byte, lo, hi int) []byte {
	f := cw.f
	for j := lo; j < hi; j++ {
		y := newCell(f.y(j))
		row := f.U[j*(f.Nx+1) : (j+1)*(f.Nx+1)]
		if f.Ux == nil {
			for i, u := range row {
				b = slices.Grow(b, nodeRoom)
				b = y.put(cw.xs[i].put(b))
				b = append(appendNum(b, u), '\r', '\n')
			}
			continue
		}
		ux := f.Ux[j*(f.Nx+1) : (j+1)*(f.Nx+1)]
		uy := f.Uy[j*(f.Nx+1) : (j+1)*(f.Nx+1)]
		for i, u := range row {
			b = slices.Grow(b, nodeRoom)
			b = y.put(cw.xs[i].put(b))
			b = append(appendNum(b, u), ',')
			gx := len(b)
			b = append(appendNum(b, ux[i]), ',')
			gy := len(b)
			b = append(appendNum(b, uy[i]), ',')
			end := len(b)
			b = append(appendFlux(b, f.Kx, ux[i], b[gx:gy-1]), ',')
			b = append(appendFlux(b, f.Ky, uy[i], b[gy:end-1]), '\r', '\n')
		}
	}
	return b
}

// Probe is the solution at one user-chosen point.
type Probe struct {
	Label  string
	X, Y   float64
	Value  float64
	Gx, Gy float64 // gradient
	Qx, Qy float64 // flux
	Note   string  // why a number is missing (the gradient is unbounded there), or ""
}

// ProbesCSV writes the probes as CSV, one row per probe, labels and notes
// guarded and quoted (see the package comment); a number the probe has
// not (NaN) is an empty cell, and the note says why. It returns an error
// only for a failed write.
func ProbesCSV(w io.Writer, ps []Probe, u Units) error {
	b := appendHeader(nil, append(append([]string{"label"}, u.header(true)...), "note"))
	for _, p := range ps {
		b = appendText(b, p.Label)
		for _, v := range []float64{p.X, p.Y, p.Value, p.Gx, p.Gy, p.Qx, p.Qy} {
			b = append(b, ',')
			if v == v {
				b = appendNum(b, v)
			}
		}
		b = appendText(append(b, ','), p.Note)
		b = append(b, '\r', '\n')
	}
	_, err := w.Write(b)
	return err
}
