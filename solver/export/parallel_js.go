//go:build js

package export

import "io"

// parallel is serial in WebAssembly, which has one processor: the
// pipeline's goroutines and channels would only make the engine larger
// (25 KB).
func (cw *fieldWriter) parallel(w io.Writer, _, _ int) error { return cw.serial(w) }
