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

// rowWorkers returns the number of workers forRows uses for rows rows
// (forColumns uses no more).
func rowWorkers(rows int) int { return chunkWorkers(rows, gridChunk) }

// chunkWorkers returns the number of workers forChunks uses for n
// indices in runs of size.
func chunkWorkers(n, size int) int {
	return max(1, min(runtime.GOMAXPROCS(0), (n+size-1)/size))
}

// forRows calls chunk(r0, r1, worker) for consecutive runs of at most
// gridChunk rows covering [0, rows), sharing them among rowWorkers(rows)
// workers (one, in order, in the single-threaded wasm build); worker
// (below rowWorkers(rows)) tells whose buffers to use. Chunks must write
// disjoint nodes.
func forRows(rows int, chunk func(r0, r1, worker int)) {
	forChunks(rows, gridChunk, false, chunk)
}

// forColumns is forRows for runs of columnChunk grid columns, whose
// nodes lie next to the neighbouring runs' in every grid row: the
// workers take the runs from the two ends of the range in turn, the
// columns next to the loaded edges, which keep the most terms, first,
// and two workers seldom write the same cache lines (where the ends
// meet, and the first and last runs where a grid row ends and the next
// begins).
func forColumns(cols int, chunk func(c0, c1, worker int)) {
	forChunks(cols, columnChunk, true, chunk)
}

// forChunks calls chunk for the runs of size indices covering [0, n)
// on up to GOMAXPROCS workers, taking them in order or, fromEnds, from
// the two ends in turn.
func forChunks(n, size int, fromEnds bool, chunk func(i0, i1, worker int)) {
	chunks, workers := (n+size-1)/size, chunkWorkers(n, size)
	var next atomic.Int64
	work := func(worker int) {
		for {
			c := int(next.Add(1)) - 1 // the c-th run taken
			if c >= chunks {
				return
			}
			if fromEnds && c%2 == 1 {
				c = chunks - 1 - c/2
			} else if fromEnds {
				c /= 2
			}
			chunk(c*size, min(c*size+size, n), worker)
		}
	}
	if workers == 1 {
		work(0)
		return
	}
	var wg sync.WaitGroup
	for k := 0; k < workers; k++ {
		wg.Add(1)
		go func(worker int) {
			defer wg.Done()
			work(worker)
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
