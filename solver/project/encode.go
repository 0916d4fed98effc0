package project

import (
	"fmt"

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
	w.Key("physics").Str(p.Physics)
	p.writeParameters(&w)
	num := func(path string, v float64) { p.writeNum(&w, path, v) }
	w.Key("width")
	num("width", p.Width)
	w.Key("height")
	num("height", p.Height)
	w.Key("conductivity")
	_, textX := p.Texts["conductivity.x"]
	_, textY := p.Texts["conductivity.y"]
	if p.Conductivity.X == p.Conductivity.Y && !textX && !textY {
		num("conductivity", p.Conductivity.X)
	} else {
		w.Open('{').Key("x")
		num("conductivity.x", p.Conductivity.X)
		w.Key("y")
		num("conductivity.y", p.Conductivity.Y)
		w.Close('}')
	}
	w.Key("source")
	num("source", p.Source)
	w.Key("edges").Open('{')
	for _, side := range problem.Sides {
		w.Key(side.String())
		p.Edges[side].write(&w, "edges."+side.String(), num)
	}
	w.Close('}')
	w.Key("probes").Open('[')
	for i, q := range p.Probes {
		path := fmt.Sprintf("probes[%d]", i)
		w.Open('{').Key("x")
		num(path+".x", q.X)
		w.Key("y")
		num(path+".y", q.Y)
		w.Key("label").Str(q.Label).Close('}')
	}
	w.Close(']')
	if p.Grid != nil {
		w.Key("grid").Open('{').Key("nx").Int(p.Grid.Nx).Key("ny").Int(p.Grid.Ny).Close('}')
	}
	p.writeStudy(&w)
	if p.Sheet != nil {
		p.Sheet.write(w.Key("sheet"))
	}
	if p.Answers != nil {
		w.Key("answers")
		p.Answers.write(&w)
	}
	if p.Display != nil {
		p.Display.write(w.Key("display"))
	}
	return w.Close('}').Bytes()
}
