package solver

import "edgewise/solver/jsonlite"

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
	for _, e := range []struct {
		name string
		spec EdgeSpec
	}{{"bottom", p.Edges.Bottom}, {"top", p.Edges.Top}, {"left", p.Edges.Left}, {"right", p.Edges.Right}} {
		w.Key(e.name).Open('{').Key("kind").Str(e.spec.Kind)
		if e.spec.Kind == "convection" {
			w.Key("h").Num(e.spec.H).Key("ambient").Str(e.spec.Ambient)
		} else {
			w.Key("expr").Str(e.spec.Expr)
		}
		w.Close('}')
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
	return w.Close('}').Bytes()
}

// JSON returns the result text (schema "edgewise-result/1"). Numbers that
// are not finite are written as null.
func (r *Result) JSON() []byte {
	var w jsonlite.Writer
	w.Open('{').Key("schema").Str(ResultSchema)
	w.Key("probes").Open('[')
	for _, q := range r.Probes {
		w.Open('{').Key("label").Str(q.Label).Key("x").Num(q.X).Key("y").Num(q.Y).Key("value").Num(q.Value)
		w.Key("gradient").Open('[').Num(q.Gradient[0]).Num(q.Gradient[1]).Close(']')
		w.Key("flux").Open('[').Num(q.Flux[0]).Num(q.Flux[1]).Close(']')
		w.Close('}')
	}
	w.Close(']')
	w.Key("edges").Open('{')
	for _, e := range []struct {
		name string
		f    EdgeFlow
	}{{"bottom", r.Edges.Bottom}, {"top", r.Edges.Top}, {"left", r.Edges.Left}, {"right", r.Edges.Right}} {
		w.Key(e.name).Open('{').Key("flow")
		numOrNull(&w, e.f.Flow)
		w.Key("finite").Bool(e.f.Finite).Close('}')
	}
	w.Close('}')
	w.Key("source_total").Num(r.SourceTotal).Key("balance")
	numOrNull(&w, r.Balance)
	w.Key("mean").Num(r.Mean)
	extreme := func(k string, e Extreme) {
		w.Key(k).Open('{').Key("value").Num(e.Value).Key("x").Num(e.X).Key("y").Num(e.Y).Close('}')
	}
	extreme("min", r.Min)
	extreme("max", r.Max)
	a := r.Accuracy
	w.Key("accuracy").Open('{').Key("terms").Int(a.Terms).Key("estimate").Num(a.Estimate).Key("crosscheck")
	numOrNull(&w, a.Crosscheck)
	if a.CrosscheckGrid != "" {
		w.Key("crosscheck_grid").Str(a.CrosscheckGrid)
	}
	if a.CrosscheckReason != "" {
		w.Key("crosscheck_skipped").Str(a.CrosscheckReason)
	}
	w.Key("converged").Bool(a.Converged)
	w.Close('}')
	strs := func(k string, list []string) {
		w.Key(k).Open('[')
		for _, s := range list {
			w.Str(s)
		}
		w.Close(']')
	}
	w.Key("warnings").Open('[')
	for _, x := range r.Warnings {
		x.WriteJSON(&w)
	}
	w.Close(']')
	strs("cautions", r.Cautions)
	w.Key("grid").Open('{').Key("nx").Int(r.Grid.Nx).Key("ny").Int(r.Grid.Ny).Close('}')
	return w.Close('}').Bytes()
}

func numOrNull(w *jsonlite.Writer, v *float64) {
	if v == nil {
		w.Null()
		return
	}
	w.Num(*v)
}
