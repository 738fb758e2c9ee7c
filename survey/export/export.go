// Package export writes isofield's outputs: the grid CSV of the fixed
// contract, matrix grids with a georeference sidecar, GeoJSON contours,
// zones and readings, SVG and PNG maps, and the HTML survey report.
package export

// TEMPORARY contract: filled in by the export work.

import (
	"errors"
	"io"

	"isofield/interp"
)

// Column is an extra grid column appended after the fixed ones. Values has
// one entry per node; NaN is written as an empty cell.
type Column struct {
	Name   string
	Values []float64
}

// WriteGridCSV writes g in the grid CSV contract:
// x_m,y_m,potential_U,ex_U_per_m,ey_U_per_m,field_U_per_m,flagged
// followed by the extra columns, one row per node in index order.
// flagged may be nil (all 0).
func WriteGridCSV(w io.Writer, g *interp.Grid, unit string, flagged []bool, extra []Column) error {
	return errors.New("export: not implemented yet")
}
