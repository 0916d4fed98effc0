package report

import (
	"bytes"
	"fmt"
	"strings"
	"unicode"

	"edgewise/solver"
	"edgewise/solver/contour"
	"edgewise/solver/export"
	"edgewise/solver/physics"
	"edgewise/solver/problem"
	"edgewise/solver/project"
)

// The kinds of download Make knows.
const (
	FieldCSV  = "field-csv"
	ProbesCSV = "probes-csv"
	// EdgesCSV lists every edge's parts (one for a one-condition edge):
	// where each runs, its kind, the flow into the region and its mean.
	EdgesCSV = "edges-csv"
	Picture  = "svg"
	// ProfileCSV is the line profile PictureOptions.Profile asks for.
	ProfileCSV = "profile-csv"
)

// Download is one file for the page to save.
type Download struct {
	Name string // a file name made from the project title
	MIME string
	Data []byte
}

// PictureOptions shape the SVG picture.
type PictureOptions struct {
	PixelW int // width of the field drawing; 0 means 640
	Levels int // about this many isolines; 0 means 12, negative none
	// Profile is the line of a ProfileCSV download.
	Profile *ProfileLine
}

// Make builds one download of a solved project: FieldCSV, ProbesCSV or
// Picture. An unknown kind is an error.
func Make(kind string, p *project.Project, out *solver.Output, opt PictureOptions) (*Download, error) {
	l := solver.Units(p.Physics)
	var b bytes.Buffer
	d := &Download{}
	switch kind {
	case FieldCSV:
		if err := export.FieldCSV(&b, field(p, out, l)); err != nil {
			return nil, err
		}
		d.Name, d.MIME = FileName(p.Title, "field", "csv"), "text/csv;charset=utf-8"
	case ProbesCSV:
		ps := make([]export.Probe, len(out.Result.Probes))
		for i, q := range out.Result.Probes {
			ps[i] = export.Probe{Label: q.Label, X: q.X, Y: q.Y, Value: q.Value,
				Gx: q.Gradient[0], Gy: q.Gradient[1], Qx: q.Flux[0], Qy: q.Flux[1], Note: q.Unbounded}
		}
		if err := export.ProbesCSV(&b, ps, exportUnits(l)); err != nil {
			return nil, err
		}
		d.Name, d.MIME = FileName(p.Title, "probes", "csv"), "text/csv;charset=utf-8"
	case Picture:
		n := opt.Levels
		if n == 0 {
			n = 12
		}
		pic := &export.Picture{
			Field:      field(p, out, l),
			Scale:      out.Result.Colour.Scale(),
			Title:      p.Title,
			LegendUnit: with(l.Value, l.ValueUnit),
			PixelW:     opt.PixelW,
			Ticks:      true,
		}
		for _, q := range p.Probes {
			pic.Marks = append(pic.Marks, export.Mark{X: q.X, Y: q.Y, Label: q.Label})
		}
		pic.Parts, pic.KindNames = edgeParts(p)
		if n > 0 {
			pic.Levels = contour.Levels(out.Result.Min.Value, out.Result.Max.Value, n)
		}
		if err := export.SVG(&b, pic); err != nil {
			return nil, err
		}
		d.Name, d.MIME = FileName(p.Title, "picture", "svg"), "image/svg+xml"
	case EdgesCSV:
		edgesCSV(&b, p, out)
		d.Name, d.MIME = FileName(p.Title, "edges", "csv"), "text/csv;charset=utf-8"
	case ProfileCSV:
		if opt.Profile == nil {
			return nil, fmt.Errorf("report: a profile download needs the line (option profile)")
		}
		profileCSV(&b, p, out, *opt.Profile)
		d.Name, d.MIME = FileName(p.Title, "profile", "csv"), "text/csv;charset=utf-8"
	default:
		return nil, fmt.Errorf("report: unknown download %q (use %s, %s, %s, %s or %s)", kind, FieldCSV, ProbesCSV, EdgesCSV, Picture, ProfileCSV)
	}
	d.Data = b.Bytes()
	return d, nil
}

// edgeParts lists every edge's parts (one for an edge of one condition)
// for the picture's outline, and the physics' names of the kinds.
func edgeParts(p *project.Project) ([]export.EdgePart, map[string]string) {
	var parts []export.EdgePart
	for _, side := range problem.Sides {
		L := p.Width
		if side == problem.Left || side == problem.Right {
			L = p.Height
		}
		segs := p.Edges[side].Segments
		from := 0.0
		for i, s := range segs {
			to := s.To
			if i == len(segs)-1 {
				to = L
			}
			parts = append(parts, export.EdgePart{Side: side.String(), From: from, To: to, Kind: s.Kind.String()})
			from = to
		}
	}
	ph := physics.Get(p.Physics)
	return parts, map[string]string{"value": ph.Kinds.Value, "flux": ph.Kinds.Flux, "convection": ph.Kinds.Convection}
}

// field is the export view of a solved output.
func field(p *project.Project, out *solver.Output, l solver.UnitSet) *export.Field {
	return &export.Field{
		Nx: out.Nx, Ny: out.Ny, W: out.W, H: out.H,
		U: out.U, Ux: out.Ux, Uy: out.Uy,
		Kx: p.Conductivity.X, Ky: p.Conductivity.Y,
		Units: exportUnits(l),
	}
}

// FileName makes a safe file name from a title: letters and digits kept
// (any script), everything else folded into single hyphens, at most 40
// characters, then "-" + what + "." + ext. An empty title gives "edgewise".
func FileName(title, what, ext string) string {
	var b strings.Builder
	hyphen := false
	n := 0
	for _, r := range strings.ToLower(title) {
		if n >= 40 {
			break
		}
		if unicode.IsLetter(r) || unicode.IsDigit(r) {
			if hyphen && b.Len() > 0 {
				b.WriteByte('-')
				n++
			}
			hyphen = false
			b.WriteRune(r)
			n++
			continue
		}
		hyphen = true
	}
	base := b.String()
	if base == "" {
		base = "edgewise"
	}
	return base + "-" + what + "." + ext
}
