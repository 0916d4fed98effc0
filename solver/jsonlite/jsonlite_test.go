package jsonlite

import (
	"bytes"
	"encoding/json"
	"math"
	"math/rand/v2"
	"reflect"
	"strings"
	"testing"
)

// normalise turns encoding/json's tree (with UseNumber) into ours.
func normalise(v any) any {
	switch t := v.(type) {
	case json.Number:
		return Number(t)
	case map[string]any:
		for k, x := range t {
			t[k] = normalise(x)
		}
	case []any:
		for i, x := range t {
			t[i] = normalise(x)
		}
	}
	return v
}

func reference(t *testing.T, text string) (any, error) {
	t.Helper()
	dec := json.NewDecoder(strings.NewReader(text))
	dec.UseNumber()
	var v any
	err := dec.Decode(&v)
	if err == nil && !json.Valid([]byte(text)) {
		err = &json.SyntaxError{}
	}
	return normalise(v), err
}

// Parse agrees with encoding/json (the standard library's decoder, the
// reference) on valid documents and on which documents are invalid.
func TestParseAgreesWithEncodingJSON(t *testing.T) {
	docs := []string{
		`{"schema":"edgewise/1","width":0.4,"edges":{"top":{"kind":"value","expr":"20 + 5*s"}}}`,
		`[1, -0, 0.5, 1e-3, -2.5E+10, true, false, null, "a\"b\\c\/d\n\u00e9\ud83d\ude00"]`,
		` {"a" : [ ] , "b" : { } } `,
		`"naïve"`, `0`, `-1.25e0`,
		// invalid
		`{"a":1,}`, `[1 2]`, `{"a" 1}`, `01`, `1.`, `.5`, `-`, `1e`, `"abc`, `{"a":1}x`, `tru`,
		"\"tab\there\"", `"\x"`, `{1:2}`, `[`, ``, `nul`, `"\u12"`,
	}
	for _, d := range docs {
		want, werr := reference(t, d)
		got, gerr := Parse([]byte(d))
		if (werr != nil) != (gerr != nil) {
			t.Errorf("%q: error %v, encoding/json says %v", d, gerr, werr)
			continue
		}
		if werr == nil && !reflect.DeepEqual(got, want) {
			t.Errorf("%q: got %#v, want %#v", d, got, want)
		}
	}
}

func TestParseErrors(t *testing.T) {
	tests := []struct{ in, want string }{
		{"{\n  \"a\": 1,\n  \"a\": 2\n}", "JSON syntax error at line 3, col 3: the key \"a\" appears twice"},
		{"{\"w\": 0,5}", "JSON syntax error at line 1, col 9: expected a key in double quotes"},
		{"[1,\n 2,\n x]", "JSON syntax error at line 3, col 2: unexpected character 'x'"},
		{strings.Repeat("[", MaxDepth+1), "JSON syntax error at line 1, col 65: nested more than 64 levels deep"},
		{"\"a\xffb\"", "JSON syntax error at line 1, col 3: text is not valid UTF-8"},
	}
	for _, tc := range tests {
		_, err := Parse([]byte(tc.in))
		if err == nil || err.Error() != tc.want {
			t.Errorf("Parse(%q) error %v, want %q", tc.in, err, tc.want)
		}
	}
}

// Text the Writer produces is read back by encoding/json to the same
// values, for seeded random numbers and strings.
func TestWriterRoundTrip(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	var w Writer
	w.Open('{')
	var nums []float64
	var strs []string
	for i := 0; i < 500; i++ {
		v := math.Float64frombits(rng.Uint64())
		if math.IsNaN(v) || math.IsInf(v, 0) {
			v = rng.NormFloat64()
		}
		nums = append(nums, v)
		var sb strings.Builder
		alphabet := []rune("a\"\\\n\t<>&é\u2028😀\x01/")
		for k := 0; k < 8; k++ {
			sb.WriteRune(alphabet[rng.IntN(len(alphabet))])
		}
		strs = append(strs, sb.String())
	}
	w.Key("nums").Open('[')
	for _, v := range nums {
		w.Num(v)
	}
	w.Close(']')
	w.Key("strs").Open('[')
	for _, s := range strs {
		w.Str(s)
	}
	w.Close(']')
	w.Key("misc").Open('{').Key("t").Bool(true).Key("n").Null().Key("i").Int(-42).Key("nan").Num(math.NaN()).Close('}')
	w.Close('}')
	var got struct {
		Nums []float64
		Strs []string
		Misc map[string]any
	}
	if err := json.Unmarshal(w.Bytes(), &got); err != nil {
		t.Fatalf("%v in %s", err, w.Bytes())
	}
	if !reflect.DeepEqual(got.Nums, nums) || !reflect.DeepEqual(got.Strs, strs) {
		t.Errorf("round trip changed values")
	}
	if got.Misc["t"] != true || got.Misc["n"] != nil || got.Misc["i"] != -42.0 || got.Misc["nan"] != nil {
		t.Errorf("misc = %v", got.Misc)
	}
	if bytes.ContainsAny(w.Bytes(), "<>&\u2028") {
		t.Errorf("output holds characters unsafe inside an HTML script element")
	}
}

func FuzzParse(f *testing.F) {
	for _, s := range []string{`{"a":[1,2,{"b":null}]}`, `"\ud83d\ude00"`, `-0.5e-3`, `[`, `{"a":1,"a":2}`} {
		f.Add([]byte(s))
	}
	f.Fuzz(func(t *testing.T, data []byte) {
		v, err := Parse(data)
		want, werr := func() (any, error) {
			dec := json.NewDecoder(bytes.NewReader(data))
			dec.UseNumber()
			var v any
			err := dec.Decode(&v)
			if err == nil && !json.Valid(data) {
				err = &json.SyntaxError{}
			}
			return normalise(v), err
		}()
		if err != nil {
			if _, ok := err.(*SyntaxError); !ok {
				t.Fatalf("error of type %T", err)
			}
			// we are stricter only about repeated keys, depth and invalid UTF-8
			if werr == nil && !strings.Contains(err.Error(), "appears twice") && !strings.Contains(err.Error(), "nested") &&
				!strings.Contains(err.Error(), "UTF-8") {
				t.Fatalf("Parse(%q) = %v, but encoding/json accepts it", data, err)
			}
			return
		}
		if werr != nil {
			t.Fatalf("Parse(%q) accepted what encoding/json refuses: %v", data, werr)
		}
		if !reflect.DeepEqual(v, want) && utf8Valid(data) {
			t.Fatalf("Parse(%q) = %#v, want %#v", data, v, want)
		}
	})
}

func utf8Valid(b []byte) bool { return strings.ToValidUTF8(string(b), "\ufffd") == string(b) }

// Value writes a parsed tree back with object keys sorted, so that two
// orders of the same object give one text, and the text parses to the same
// tree; a number float64 cannot hold is an error, not a changed number.
func TestWriterValue(t *testing.T) {
	for _, pair := range [][2]string{
		{`{"b": [1, 2.5e-3, "x", true, null], "a": {"d": {}, "c": []}}`, `{"a":{"c":[],"d":{}},"b":[1,0.0025,"x",true,null]}`},
		{`{"a": {"c": [], "d": {}}, "b": [1, 0.0025, "x", true, null]}`, `{"a":{"c":[],"d":{}},"b":[1,0.0025,"x",true,null]}`},
	} {
		v, err := Parse([]byte(pair[0]))
		if err != nil {
			t.Fatal(err)
		}
		var w Writer
		if err := w.Value(v); err != nil {
			t.Fatal(err)
		}
		if got := string(w.Bytes()); got != pair[1] {
			t.Errorf("%s\nwrote %s\nwant  %s", pair[0], got, pair[1])
		}
	}
	v, err := Parse([]byte(`[1e999]`))
	if err != nil {
		t.Skip("the parser refuses 1e999 itself")
	}
	var w Writer
	if err := w.Value(v); err == nil {
		t.Errorf("a number beyond float64 was written: %s", w.Bytes())
	}
}
