package project

import (
	"edgewise/solver/jsonlite"
	"edgewise/solver/problem"
)

// JSON returns the project file text (schema "edgewise/1"), in the field
// order of the contract. A conductivity is one number when isotropic.
func (p *Project) JSON() []byte {
	var w jsonlite.Writer
	w.Open('{').Key("schema").Str(Schema)
	if p.Title != "" {
		w.Key("title").Str(p.Title)
	}
	w.Key("physics").Str(p.Physics).Key("width").Num(p.Width).Key("height").Num(p.Height)
	w.Key("conductivity")
	if p.Conductivity.X == p.Conductivity.Y {
		w.Num(p.Conductivity.X)
	} else {
		w.Open('{').Key("x").Num(p.Conductivity.X).Key("y").Num(p.Conductivity.Y).Close('}')
	}
	w.Key("source").Num(p.Source)
	w.Key("edges").Open('{')
	for _, side := range problem.Sides {
		w.Key(side.String())
		p.Edges[side].write(&w)
	}
	w.Close('}')
	w.Key("probes").Open('[')
	for _, q := range p.Probes {
		w.Open('{').Key("x").Num(q.X).Key("y").Num(q.Y).Key("label").Str(q.Label).Close('}')
	}
	w.Close(']')
	if p.Grid != nil {
		w.Key("grid").Open('{').Key("nx").Int(p.Grid.Nx).Key("ny").Int(p.Grid.Ny).Close('}')
	}
	if p.Answers != nil {
		w.Key("answers")
		p.Answers.write(&w)
	}
	return w.Close('}').Bytes()
}
