package project

import (
	"errors"
	"strings"
	"testing"
)

// FuzzDecode: no input panics; every error is one line that names a field
// (or says the file is not a project); whatever decodes also compiles or
// fails with a field error, and re-encodes to text that decodes again.
func FuzzDecode(f *testing.F) {
	f.Add([]byte(baseProject))
	f.Add([]byte(`{"schema":"edgewise/1","physics":"generic","width":1,"height":1,"conductivity":{"x":1,"y":2},
	  "edges":{"bottom":{"kind":"flux","expr":"sin(s)"},"top":{"kind":"value","expr":0},
	  "left":{"kind":"convection","h":0,"ambient":"readings(s, 0, 1, 1, 2)"},"right":{"kind":"value","expr":"1/0"}}}`))
	f.Add([]byte(paramProject))
	f.Add([]byte(`{"schema":"edgewise/1","physics":"heat","width":30,"height":10,"conductivity":1,
	  "edges":{"bottom":{"kind":"value","expr":"0"},"left":{"kind":"flux","expr":"0"},"right":{"kind":"convection","h":"2*5","ambient":"1"},
	  "top":{"segments":[{"to":10,"kind":"value","expr":"12"},{"to":20,"kind":"flux","expr":"0"},{"kind":"convection","h":"when(s < 25, 8, 20)","ambient":"18"}]}}}`))
	f.Add([]byte(`{"schema":"edgewise/1"}`))
	f.Add([]byte(`[1,2,3]`))
	f.Fuzz(func(t *testing.T, data []byte) {
		p, err := Decode(data)
		if err != nil {
			checkOneLine(t, err)
			return
		}
		if _, err := Compile(p); err != nil {
			checkOneLine(t, err)
			var fe *Error
			if !errors.As(err, &fe) || fe.Path == "" {
				t.Fatalf("compile error without a field path: %v", err)
			}
		}
		q, err := Decode(p.JSON())
		if err != nil {
			t.Fatalf("re-encoded project does not decode: %v\n%s", err, p.JSON())
		}
		if string(q.JSON()) != string(p.JSON()) {
			t.Fatalf("re-encoding is not stable:\n%s\n%s", p.JSON(), q.JSON())
		}
	})
}

func checkOneLine(t *testing.T, err error) {
	t.Helper()
	msg := err.Error()
	if msg == "" || strings.Contains(msg, "\n") {
		t.Fatalf("error is not one line: %q", msg)
	}
}
