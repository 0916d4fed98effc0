package expr

import (
	"math"
	"reflect"
	"testing"
)

// A named constant folds into the program exactly like the number written
// out, so a formula that uses one evaluates as fast.
func TestCompileWithFolds(t *testing.T) {
	consts := []Const{{"h_top", 25}, {"k_plate", 200}}
	got, err := CompileWith("h_top*s/k_plate + sin(pi*h_top)", consts, "s")
	if err != nil {
		t.Fatal(err)
	}
	want, err := Compile("25*s/200 + sin(pi*25)", "s")
	if err != nil {
		t.Fatal(err)
	}
	if !reflect.DeepEqual(got.prog, want.prog) {
		t.Errorf("program %v, want the one of the numbers written out %v", got.prog, want.prog)
	}
	if v := got.Eval([]float64{0.4}); v != want.Eval([]float64{0.4}) {
		t.Errorf("value %g", v)
	}
	if n := got.Named(); !reflect.DeepEqual(n, []string{"h_top", "k_plate"}) {
		t.Errorf("Named() = %v", n)
	}
	if s := got.String(); s != "h_top * s / k_plate + sin(pi * h_top)" {
		t.Errorf("String() = %q, want the names kept", s)
	}
	// a name in a branch never taken still counts as used: the user wrote it
	e, err := CompileWith("when(1 < 0, k_plate, 3)", consts)
	if err != nil {
		t.Fatal(err)
	}
	if v, ok := e.Const(); !ok || v != 3 || !reflect.DeepEqual(e.Named(), []string{"k_plate"}) {
		t.Errorf("dead branch: %g %v, named %v", v, ok, e.Named())
	}
}

func TestCompileWithErrors(t *testing.T) {
	consts := []Const{{"h_top", 25}}
	for _, c := range []struct{ src, want string }{
		{"h_tpo", `col 1: unknown name "h_tpo" (did you mean h_top?)`},
		{"2*W", `col 3: unknown name "W" (this formula may use pi, e, h_top)`},
		{"h_top(2)", "col 1: h_top is not a function (write h_top*(...) to multiply)"},
	} {
		_, err := CompileWith(c.src, consts)
		if err == nil || err.Error() != c.want {
			t.Errorf("%s: error %v, want %s", c.src, err, c.want)
		}
	}
}

func TestCheckName(t *testing.T) {
	for _, c := range []struct {
		name string
		ok   bool
	}{
		{"h_top", true}, {"_k", true}, {"T2", true}, {"w", true},
		{"x", false}, {"y", false}, {"s", false}, {"W", false}, {"H", false},
		{"pi", false}, {"e", false}, {"sin", false}, {"when", false}, {"readings", false},
		{"", false}, {"2a", false}, {"a-b", false}, {"a b", false}, {"é", false},
		{string(make([]byte, 65)), false},
	} {
		if err := CheckName(c.name); (err == nil) != c.ok {
			t.Errorf("CheckName(%q) = %v, want ok %v", c.name, err, c.ok)
		}
	}
}

func TestCompileWithBadConstPanics(t *testing.T) {
	for _, consts := range [][]Const{{{"x", 1}}, {{"a", 1}, {"a", 2}}, {{"pi", 3}}} {
		func() {
			defer func() {
				if recover() == nil {
					t.Errorf("CompileWith with %v did not panic", consts)
				}
			}()
			_, _ = CompileWith("1", consts, "x")
		}()
	}
	if _, err := CompileWith("nan_ok", []Const{{"nan_ok", math.NaN()}}); err != nil {
		t.Errorf("a NaN constant is the caller's to check: %v", err)
	}
}
