package export

import (
	"context"
	"fmt"
	"io"
	"math"
	"path/filepath"

	"isofield/survey/fileout"
	"isofield/survey/pipeline"
)

// The files All writes into its directory. The names are fixed: scripts
// and the README rely on them.
const (
	FileGridCSV         = "grid.csv"           // grid CSV contract, plus band (and step/touch) columns
	FilePotentialMatrix = "grid_potential.csv" // matrix form of the potential
	FileFieldMatrix     = "grid_field.csv"     // matrix form of |E|
	FileGeoref          = "grid_georef.txt"    // georeference sidecar of both matrices
	FileContours        = "contours.geojson"   // equipotential LineStrings
	FileZones           = "zones.geojson"      // flagged-zone Polygons with statistics
	FileReadings        = "readings.geojson"   // readings as Points with QA status
	FileInfill          = "infill.geojson"     // suggested readings as Points
	FileMapSVG          = "map_potential.svg"  // potential map
	FileMapPNG          = "map_potential.png"  // the same at MapDPI
	FileFieldSVG        = "map_field.svg"      // field map
	FileFieldPNG        = "map_field.png"      // the same at MapDPI
	FileReport          = "report.html"        // the survey report
)

// GridColumns returns the flags and the extra columns of the grid CSV for a
// pipeline result: flagged from the analysis, then "band" (the node's
// contour band, see contour.Band) and, where the preset computes them,
// "step_U" and "touch_U". Without an analysis nothing is flagged and there
// are no extra columns.
func GridColumns(res *pipeline.Result) (flagged []bool, extra []Column) {
	a := res.Analysis
	if a == nil {
		return nil, nil
	}
	flagged = a.Flagged
	if len(a.NodeBand) == res.Grid.Len() {
		band := make([]float64, len(a.NodeBand))
		for k, b := range a.NodeBand {
			band[k] = float64(b)
			if b < 0 {
				band[k] = math.NaN()
			}
		}
		extra = append(extra, Column{Name: "band", Values: band})
	}
	unit := res.Survey.Unit.String()
	if len(a.Step) == res.Grid.Len() {
		extra = append(extra, Column{Name: "step_" + unit, Values: a.Step})
	}
	if len(a.Touch) == res.Grid.Len() {
		extra = append(extra, Column{Name: "touch_" + unit, Values: a.Touch})
	}
	return flagged, extra
}

// All writes every export of a pipeline result into dir (which must
// exist) under the fixed names above and returns the paths written. cfg is
// the configuration that made res; it is shown in every output. Each file
// is written atomically; an existing file is replaced only with
// opt.Force, and neither the survey's files nor opt.Inputs are ever
// written. All stops at the first error; files already written stay.
func All(ctx context.Context, dir string, res *pipeline.Result, cfg pipeline.Config, opt Options) ([]string, error) {
	b, err := FromResult(ctx, res, cfg, opt)
	if err != nil {
		return nil, err
	}
	flagged, extra := GridColumns(res)
	jobs := b.jobs(flagged, extra)
	fo := fileout.Options{Force: opt.Force, Inputs: b.inputs(opt)}
	if err := precheck(dir, jobs, fo); err != nil {
		return nil, err
	}
	var done []string
	for _, j := range jobs {
		if err := ctx.Err(); err != nil {
			return done, err
		}
		path := filepath.Join(dir, j.name)
		if err := fileout.Write(path, fo, j.write); err != nil {
			return done, err
		}
		done = append(done, path)
	}
	return done, nil
}

// job is one output file.
type job struct {
	name  string
	write func(w io.Writer) error
}

// jobs lists the outputs in the order All writes them.
func (b *Bundle) jobs(flagged []bool, extra []Column) []job {
	g := b.Grid
	matrices := []string{"potential (" + b.Unit + "): " + FilePotentialMatrix, "field |E| (" + b.Unit + "/m): " + FileFieldMatrix}
	pot := b.usable(func(k int) float64 { return g.V[k] })
	fld := b.usable(func(k int) float64 { return math.Hypot(g.GX[k], g.GY[k]) })
	return []job{
		{FileGridCSV, func(w io.Writer) error { return WriteGridCSV(w, g, b.Unit, flagged, extra) }},
		{FilePotentialMatrix, func(w io.Writer) error { return WriteMatrix(w, g, pot) }},
		{FileFieldMatrix, func(w io.Writer) error { return WriteMatrix(w, g, fld) }},
		{FileGeoref, func(w io.Writer) error { return WriteGeoref(w, b.georefOf(matrices)) }},
		{FileContours, b.WriteContoursGeoJSON},
		{FileZones, b.WriteZonesGeoJSON},
		{FileReadings, b.WriteReadingsGeoJSON},
		{FileInfill, b.WriteInfillGeoJSON},
		{FileMapSVG, func(w io.Writer) error { return b.WriteMapSVG(w, PotentialMap) }},
		{FileMapPNG, func(w io.Writer) error { return b.WriteMapPNG(w, PotentialMap, MapDPI) }},
		{FileFieldSVG, func(w io.Writer) error { return b.WriteMapSVG(w, FieldMap) }},
		{FileFieldPNG, func(w io.Writer) error { return b.WriteMapPNG(w, FieldMap, MapDPI) }},
		{FileReport, b.WriteReport},
	}
}

// inputs lists the files never to be written: the survey's and opt's.
func (b *Bundle) inputs(opt Options) []string {
	in := append([]string(nil), opt.Inputs...)
	if b.Survey != nil {
		for _, f := range b.Survey.Files {
			in = append(in, f.Path)
		}
	}
	return in
}

// precheck refuses the whole export before writing anything when a target
// is an input or exists without Force, so a refused export leaves no
// half set of files.
func precheck(dir string, jobs []job, fo fileout.Options) error {
	for _, j := range jobs {
		path := filepath.Join(dir, j.name)
		if err := fileout.Check(path, fo); err != nil {
			return fmt.Errorf("%s: %w", path, err)
		}
	}
	return nil
}
