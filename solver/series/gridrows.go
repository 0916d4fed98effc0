package series

import (
	"runtime"
	"sync"
	"sync/atomic"
)

// gridChunk is the number of rows a worker takes at a time.
const gridChunk = 8

// rowWorkers returns the number of workers forRows uses for rows rows.
func rowWorkers(rows int) int {
	return max(1, min(runtime.GOMAXPROCS(0), (rows+gridChunk-1)/gridChunk))
}

// forRows calls chunk(r0, r1, worker) for consecutive runs of at most
// gridChunk rows covering [0, rows), sharing them among rowWorkers(rows)
// workers (one, in order, in the single-threaded wasm build); worker
// (below rowWorkers(rows)) tells whose buffers to use. Chunks must write
// disjoint nodes.
func forRows(rows int, chunk func(r0, r1, worker int)) {
	workers := rowWorkers(rows)
	if workers == 1 {
		for r := 0; r < rows; r += gridChunk {
			chunk(r, min(r+gridChunk, rows), 0)
		}
		return
	}
	var next atomic.Int64
	var wg sync.WaitGroup
	for k := 0; k < workers; k++ {
		wg.Add(1)
		go func(worker int) {
			defer wg.Done()
			for {
				r0 := int(next.Add(gridChunk)) - gridChunk
				if r0 >= rows {
					return
				}
				chunk(r0, min(r0+gridChunk, rows), worker)
			}
		}(k)
	}
	wg.Wait()
}

// gridRows is forRows with each worker's rowBuf (kept across calls).
func (s *Solution) gridRows(rows int, chunk func(r0, r1 int, buf *rowBuf)) {
	w := s.gw
	for len(w.bufs) < rowWorkers(rows) {
		w.bufs = append(w.bufs, new(rowBuf))
	}
	bufs := w.bufs
	forRows(rows, func(r0, r1, worker int) { chunk(r0, r1, bufs[worker]) })
}

// forEach calls f(i) for i < n, on up to GOMAXPROCS workers (in order on
// one).
func forEach(n int, f func(i int)) {
	workers := max(1, min(runtime.GOMAXPROCS(0), n))
	if workers == 1 {
		for i := 0; i < n; i++ {
			f(i)
		}
		return
	}
	var next atomic.Int64
	var wg sync.WaitGroup
	for k := 0; k < workers; k++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for {
				i := int(next.Add(1)) - 1
				if i >= n {
					return
				}
				f(i)
			}
		}()
	}
	wg.Wait()
}
