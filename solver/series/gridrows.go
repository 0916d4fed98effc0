package series

import (
	"runtime"
	"sync"
	"sync/atomic"
)

// gridChunk is the number of rows a worker takes at a time.
const gridChunk = 8

// gridRows calls chunk(r0, r1, buf) for consecutive runs of at most
// gridChunk rows covering [0, rows), sharing them among up to GOMAXPROCS
// workers (one, in order, in the single-threaded wasm build), each with
// its own buffers. Chunks must write disjoint nodes.
func (s *Solution) gridRows(rows int, chunk func(r0, r1 int, buf *rowBuf)) {
	w := &s.gw
	workers := max(1, min(runtime.GOMAXPROCS(0), (rows+gridChunk-1)/gridChunk))
	for len(w.bufs) < workers {
		w.bufs = append(w.bufs, new(rowBuf))
	}
	if workers == 1 {
		for r := 0; r < rows; r += gridChunk {
			chunk(r, min(r+gridChunk, rows), w.bufs[0])
		}
		return
	}
	var next atomic.Int64
	var wg sync.WaitGroup
	for k := 0; k < workers; k++ {
		wg.Add(1)
		go func(buf *rowBuf) {
			defer wg.Done()
			for {
				r0 := int(next.Add(gridChunk)) - gridChunk
				if r0 >= rows {
					return
				}
				chunk(r0, min(r0+gridChunk, rows), buf)
			}
		}(w.bufs[k])
	}
	wg.Wait()
}
