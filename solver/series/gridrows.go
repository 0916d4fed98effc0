package series

import (
	"runtime"
	"sync"
	"sync/atomic"
)

// gridChunk is the number of rows a worker takes at a time.
const gridChunk = 8

// columnChunk is the number of grid columns a worker takes at a time
// (forColumns): the chunk is copied out whole, 32 columns of 513 nodes
// with their two derivatives 400 KB, within a processor's own cache.
const columnChunk = 32

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

// forColumns is forRows for chunks of grid columns, whose nodes lie
// next to the neighbouring chunks' in every grid row: the workers take
// the chunks from as many parts of the range as there are workers in
// turn, so that no two work on neighbouring chunks (and write the same
// cache lines) but where two parts meet.
func forColumns(cols int, chunk func(c0, c1, worker int)) {
	workers := max(1, min(runtime.GOMAXPROCS(0), (cols+columnChunk-1)/columnChunk))
	if workers == 1 {
		for c := 0; c < cols; c += columnChunk {
			chunk(c, min(c+columnChunk, cols), 0)
		}
		return
	}
	chunks := (cols + columnChunk - 1) / columnChunk
	per := (chunks + workers - 1) / workers // chunks in a part
	var next atomic.Int64
	var wg sync.WaitGroup
	for k := 0; k < workers; k++ {
		wg.Add(1)
		go func(worker int) {
			defer wg.Done()
			for {
				n := int(next.Add(1)) - 1
				if n >= per*workers {
					return
				}
				c := (n%workers)*per + n/workers // the n-th chunk taken
				if c >= chunks {
					continue
				}
				c0 := c * columnChunk
				chunk(c0, min(c0+columnChunk, cols), worker)
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
