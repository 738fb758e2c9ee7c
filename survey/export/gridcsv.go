package export

import (
	"fmt"
	"io"
	"math"
	"runtime"
	"sync"

	"isofield/interp"
	"isofield/survey/qa"
)

// Column is an extra grid column appended after the fixed ones. Values has
// one entry per node; NaN is written as an empty cell.
type Column struct {
	Name   string
	Values []float64
}

// GridHeader returns the fixed header of the grid CSV contract for unit
// ("V" or "mV").
func GridHeader(unit string) []string {
	return []string{
		"x_m", "y_m",
		"potential_" + unit,
		"ex_" + unit + "_per_m",
		"ey_" + unit + "_per_m",
		"field_" + unit + "_per_m",
		"flagged",
	}
}

// WriteGridCSV writes g in the grid CSV contract:
//
//	x_m,y_m,potential_U,ex_U_per_m,ey_U_per_m,field_U_per_m,flagged
//
// followed by the extra columns, one row per node in index order (row j = 0,
// the southern edge, first; i grows fastest). U is unit, "V" or "mV".
//
// Coordinates are in the grid's own system and every number is written in
// the shortest form that reads back to the same float64, so seven-digit
// northings keep all their digits. ex and ey are the field E = -grad V
// (the negated g.GX and g.GY); field is |E|. A masked node, or one whose
// value is NaN, keeps x and y, leaves the potential and field cells empty
// and has flagged 0 (a node without a value cannot break a threshold).
// flagged may be nil (all 0). Extra cells that are NaN are empty.
//
// It panics if flagged or an extra column is neither nil nor of length
// g.Len() (a caller's bug).
func WriteGridCSV(w io.Writer, g *interp.Grid, unit string, flagged []bool, extra []Column) error {
	n := g.Len()
	if flagged != nil && len(flagged) != n {
		panic(fmt.Sprintf("export: %d flags for %d nodes", len(flagged), n))
	}
	for _, c := range extra {
		if len(c.Values) != n {
			panic(fmt.Sprintf("export: column %q has %d values for %d nodes", c.Name, len(c.Values), n))
		}
	}
	head := make([]byte, 0, 256)
	for k, h := range GridHeader(unit) {
		head = appendSep(head, k)
		head = append(head, h...)
	}
	for _, c := range extra {
		head = append(head, ',')
		head = append(head, qa.Neutralise(c.Name)...)
	}
	head = append(head, '\n')
	if _, err := w.Write(head); err != nil {
		return fmt.Errorf("writing grid csv: %w", err)
	}
	rows := func(buf []byte, lo, hi int) []byte {
		for k := lo; k < hi; k++ {
			buf = appendGridRow(buf, g, k%g.NX, k/g.NX, flagged, extra)
		}
		return buf
	}
	if err := writeChunked(w, n, rows); err != nil {
		return fmt.Errorf("writing grid csv: %w", err)
	}
	return nil
}

// chunkRows is the number of rows one worker formats at a time.
const chunkRows = 8192

// writeChunked formats rows [0, n) in chunks on all cores and writes the
// chunks to w in order. format appends rows [lo, hi) to buf.
func writeChunked(w io.Writer, n int, format func(buf []byte, lo, hi int) []byte) error {
	workers := max(1, min(runtime.GOMAXPROCS(0), (n+chunkRows-1)/chunkRows))
	bufs := make([][]byte, workers)
	var wg sync.WaitGroup
	for lo := 0; lo < n; lo += workers * chunkRows {
		for p := range workers {
			a := min(n, lo+p*chunkRows)
			b := min(n, a+chunkRows)
			wg.Go(func() { bufs[p] = format(bufs[p][:0], a, b) })
		}
		wg.Wait()
		for _, b := range bufs {
			if _, err := w.Write(b); err != nil {
				return err
			}
		}
	}
	return nil
}

// appendGridRow appends node (i, j)'s row, ending in a newline.
func appendGridRow(buf []byte, g *interp.Grid, i, j int, flagged []bool, extra []Column) []byte {
	k := g.Index(i, j)
	x, y := g.Node(i, j)
	buf = appendShortest(buf, x)
	buf = append(buf, ',')
	buf = appendShortest(buf, y)
	v := g.V[k]
	if g.Mask[k] || math.IsNaN(v) {
		buf = append(buf, ",,,,,0"...)
	} else {
		ex, ey := 0-g.GX[k], 0-g.GY[k] // 0 - v, not -v: no "-0" cells
		buf = appendCell(buf, v)
		buf = appendCell(buf, ex)
		buf = appendCell(buf, ey)
		buf = appendCell(buf, math.Hypot(ex, ey))
		if flagged != nil && flagged[k] {
			buf = append(buf, ",1"...)
		} else {
			buf = append(buf, ",0"...)
		}
	}
	for _, c := range extra {
		buf = appendCell(buf, c.Values[k])
	}
	return append(buf, '\n')
}

// appendCell appends a comma and v, or only the comma when v is NaN.
func appendCell(buf []byte, v float64) []byte {
	buf = append(buf, ',')
	if math.IsNaN(v) {
		return buf
	}
	return appendShortest(buf, v)
}

func appendSep(buf []byte, k int) []byte {
	if k > 0 {
		return append(buf, ',')
	}
	return buf
}
