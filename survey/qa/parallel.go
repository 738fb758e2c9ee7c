package qa

import (
	"runtime"
	"sync"
	"sync/atomic"
)

// forChunks calls fn on consecutive chunks [lo, hi) of [0, n), at most
// chunk long, from runtime.GOMAXPROCS(0) goroutines, and returns when all
// are done. fn must be safe to call concurrently on distinct chunks.
func forChunks(n, chunk int, fn func(lo, hi int)) {
	workers := min(runtime.GOMAXPROCS(0), (n+chunk-1)/chunk)
	if workers <= 1 {
		fn(0, n)
		return
	}
	var next atomic.Int64
	var wg sync.WaitGroup
	for range workers {
		wg.Go(func() {
			for {
				lo := int(next.Add(int64(chunk))) - chunk
				if lo >= n {
					return
				}
				fn(lo, min(lo+chunk, n))
			}
		})
	}
	wg.Wait()
}
