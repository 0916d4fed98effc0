package export

import (
	"bufio"
	"encoding/csv"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"
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

// text makes user text safe for a spreadsheet cell (see the package
// comment); the csv writer does the RFC 4180 quoting.
func text(s string) string {
	if s != "" && strings.ContainsRune("=+-@\t\r", rune(s[0])) {
		return "'" + s
	}
	return s
}

func writeHeader(w io.Writer, cols []string) error {
	cw := csv.NewWriter(w)
	cw.UseCRLF = true
	for i := range cols {
		cols[i] = text(cols[i])
	}
	if err := cw.Write(cols); err != nil {
		return err
	}
	cw.Flush()
	return cw.Error()
}

// appendNums appends numbers as one CSV record (numbers never need
// quoting) ending in CRLF.
func appendNums(b []byte, v ...float64) []byte {
	for k, x := range v {
		if x == 0 {
			x = 0 // no "-0"
		}
		if k > 0 {
			b = append(b, ',')
		}
		b = strconv.AppendFloat(b, x, 'g', -1, 64)
	}
	return append(b, '\r', '\n')
}

// FieldCSV writes the field as CSV, one row per node (see the package
// comment for the columns). It returns an error for a malformed field or a
// failed write.
func FieldCSV(w io.Writer, f *Field) error {
	if err := f.check(); err != nil {
		return err
	}
	bw := bufio.NewWriterSize(w, 1<<16)
	grad := f.Ux != nil
	if err := writeHeader(bw, f.header(grad)); err != nil {
		return err
	}
	var line []byte
	for j := 0; j <= f.Ny; j++ {
		for i := 0; i <= f.Nx; i++ {
			k := j*(f.Nx+1) + i
			if grad {
				line = appendNums(line[:0], f.x(i), f.y(j), f.U[k], f.Ux[k], f.Uy[k], -f.Kx*f.Ux[k], -f.Ky*f.Uy[k])
			} else {
				line = appendNums(line[:0], f.x(i), f.y(j), f.U[k])
			}
			if _, err := bw.Write(line); err != nil {
				return err
			}
		}
	}
	return bw.Flush()
}

// Probe is the solution at one user-chosen point.
type Probe struct {
	Label  string
	X, Y   float64
	Value  float64
	Gx, Gy float64 // gradient
	Qx, Qy float64 // flux
}

// ProbesCSV writes the probes as CSV, one row per probe, labels quoted as
// RFC 4180 asks (see the package comment). It returns an error only for a
// failed write.
func ProbesCSV(w io.Writer, ps []Probe, u Units) error {
	cw := csv.NewWriter(w)
	cw.UseCRLF = true
	cols := append([]string{"label"}, u.header(true)...)
	for i := range cols {
		cols[i] = text(cols[i])
	}
	if err := cw.Write(cols); err != nil {
		return err
	}
	rec := make([]string, 8)
	for _, p := range ps {
		rec[0] = text(p.Label)
		for k, v := range []float64{p.X, p.Y, p.Value, p.Gx, p.Gy, p.Qx, p.Qy} {
			if v == 0 {
				v = 0 // no "-0"
			}
			rec[k+1] = strconv.FormatFloat(v, 'g', -1, 64)
		}
		if err := cw.Write(rec); err != nil {
			return err
		}
	}
	cw.Flush()
	return cw.Error()
}
