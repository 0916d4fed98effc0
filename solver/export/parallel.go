//go:build !js

package export

import (
	"io"
	"sync"
)

// parallel formats the bands on workers goroutines and writes them in
// order as they are done. At most 2*workers bands are in hand at once,
// so that the memory stays bounded however slow w is.
func (cw *fieldWriter) parallel(w io.Writer, bands, workers int) error {
	type job struct {
		band int
		buf  []byte
		done chan struct{}
	}
	inHand := 2 * workers
	jobs := make(chan *job, inHand)  // to the workers
	order := make(chan *job, inHand) // to the writer, in band order
	free := make(chan []byte, inHand)
	for range inHand {
		free <- make([]byte, 0, cw.size)
	}
	stop := make(chan struct{}) // closed when the writer gives up
	go func() {
		defer close(jobs)
		defer close(order)
		for k := range bands {
			select {
			case <-stop:
				return
			default:
			}
			var buf []byte
			select {
			case buf = <-free:
			case <-stop:
				return
			}
			jb := &job{band: k, buf: buf, done: make(chan struct{})}
			jobs <- jb
			order <- jb
		}
	}()
	var wg sync.WaitGroup
	for range workers {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for jb := range jobs {
				lo := jb.band * cw.rows
				jb.buf = cw.band(jb.buf[:0], lo, min(lo+cw.rows, cw.f.Ny+1))
				close(jb.done)
			}
		}()
	}
	var err error
	for jb := range order {
		<-jb.done
		if err == nil {
			if _, err = w.Write(jb.buf); err != nil {
				close(stop)
			}
		}
		free <- jb.buf
	}
	wg.Wait()
	return err
}
