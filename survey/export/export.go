// Package export writes isofield's outputs: the grid CSV of the fixed
// contract, matrix grids with a georeference sidecar, GeoJSON contours,
// zones and readings, SVG and PNG maps, and the HTML survey report.
package export
