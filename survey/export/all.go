package export

import (
	"cmp"
	"context"
	"crypto/sha256"
	"encoding/hex"
	"fmt"
	"io"
	"math"
	"path/filepath"
	"runtime"
	"strings"
	"sync"
	"time"

	"isofield/interp"
	"isofield/survey/fileout"
	"isofield/survey/geo"
	"isofield/survey/pipeline"
	"isofield/survey/qa"
)

// The files All writes into its directory. The names are fixed: scripts
// and the README rely on them.
const (
	FileCleanCSV        = "readings_clean.csv" // every reading, corrected value and QA status (see qa.WriteCleanCSV)
	FileQALog           = "qa_log.txt"         // every logged correction and status change
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
	FileInfo            = "export_info.txt"    // version, settings, inputs and SHA-256 of every file written
)

// GridColumns returns the flags and the extra columns of the grid CSV for a
// pipeline result: flagged from the analysis, then "band" (the node's
// contour band, see contour.Band), "step_U" and "touch_U" where the preset
// computes them, and for surveys read from latitude and longitude
// "lat_deg" and "lon_deg" (WGS 84) of every node. Without an analysis
// nothing is flagged.
func GridColumns(res *pipeline.Result) (flagged []bool, extra []Column) {
	n := res.Grid.Len()
	if a := res.Analysis; a != nil {
		flagged = a.Flagged
		if len(a.NodeBand) == n {
			band := make([]float64, n)
			for k, b := range a.NodeBand {
				band[k] = float64(b)
				if b < 0 {
					band[k] = math.NaN()
				}
			}
			extra = append(extra, Column{Name: "band", Values: band})
		}
		unit := res.Survey.Unit.String()
		if len(a.Step) == n {
			extra = append(extra, Column{Name: "step_" + unit, Values: a.Step})
		}
		if len(a.Touch) == n {
			extra = append(extra, Column{Name: "touch_" + unit, Values: a.Touch})
		}
	}
	if geo := res.Survey.Geo; geo != nil {
		extra = append(extra, latLonColumns(res.Grid, geo.Lat0, geo.Lon0)...)
	}
	return flagged, extra
}

// latLonColumns returns the WGS 84 latitude and longitude of every node of
// g, whose metres are on the tangent plane at (lat0, lon0); nil when the
// origin is invalid.
func latLonColumns(g *interp.Grid, lat0, lon0 float64) []Column {
	p, err := geo.NewPlane(lat0, lon0)
	if err != nil {
		return nil
	}
	lat, lon := make([]float64, g.Len()), make([]float64, g.Len())
	for k := range lat {
		x, y := g.Node(k%g.NX, k/g.NX)
		lat[k], lon[k] = p.Inverse(x, y)
	}
	return []Column{{Name: "lat_deg", Values: lat}, {Name: "lon_deg", Values: lon}}
}

// All writes every export of a pipeline result into dir (which must
// exist) under the fixed names above and returns the paths written. cfg is
// the configuration that made res; it is shown in every output. Each file
// is written atomically; an existing file is replaced only with
// opt.Force, and neither the survey's files nor opt.Inputs are ever
// written. The files are written on all cores; on an error the files
// already written stay, and All returns them with the first error.
func All(ctx context.Context, dir string, res *pipeline.Result, cfg pipeline.Config, opt Options) ([]string, error) {
	b, err := FromResult(ctx, res, cfg, opt)
	if err != nil {
		return nil, err
	}
	flagged, extra := GridColumns(res)
	jobs := b.jobs(flagged, extra)
	fo := fileout.Options{Force: opt.Force, Inputs: b.inputs(opt)}
	if err := precheck(dir, append(jobs, job{name: FileInfo}), fo); err != nil {
		return nil, err
	}
	// The maps are drawn once here, so the jobs below only read b.
	for _, k := range []MapKind{PotentialMap, FieldMap} {
		if err := b.WriteMapSVG(io.Discard, k); err != nil {
			return nil, err
		}
	}
	done, sums, err := runJobs(ctx, dir, jobs, fo)
	if err != nil {
		return done, err
	}
	path := filepath.Join(dir, FileInfo)
	if err := fileout.Write(path, fo, func(w io.Writer) error { return b.writeInfo(w, sums) }); err != nil {
		return done, err
	}
	return append(done, path), nil
}

// runJobs writes the jobs' files on all cores and returns, in job order,
// the paths written and their SHA-256. On errors it returns the first in
// job order with the files that were written.
func runJobs(ctx context.Context, dir string, jobs []job, fo fileout.Options) ([]string, [][2]string, error) {
	errs := make([]error, len(jobs))
	sums := make([]string, len(jobs))
	next := make(chan int)
	var wg sync.WaitGroup
	for range max(1, runtime.GOMAXPROCS(0)) {
		wg.Go(func() {
			for i := range next {
				errs[i] = ctx.Err()
				if errs[i] != nil {
					continue
				}
				h := sha256.New()
				errs[i] = fileout.Write(filepath.Join(dir, jobs[i].name), fo,
					func(w io.Writer) error { return jobs[i].write(io.MultiWriter(w, h)) })
				sums[i] = hex.EncodeToString(h.Sum(nil))
			}
		})
	}
	for i := range jobs {
		next <- i
	}
	close(next)
	wg.Wait()
	var done []string
	var out [][2]string
	var first error
	for i, j := range jobs {
		if errs[i] != nil {
			first = cmp.Or(first, errs[i])
			continue
		}
		done = append(done, filepath.Join(dir, j.name))
		out = append(out, [2]string{j.name, sums[i]})
	}
	return done, out, first
}

// writeInfo writes what made the export and the SHA-256 of each file, so
// that outputs whose format has no room for it (the grid CSV contract, the
// matrices) can be traced too.
func (b *Bundle) writeInfo(w io.Writer, sums [][2]string) error {
	var sb strings.Builder
	fmt.Fprintf(&sb, "# isofield export\nmade_by = isofield %s\n", b.Version)
	if !b.Made.IsZero() {
		fmt.Fprintf(&sb, "made = %s\n", b.Made.UTC().Format(time.RFC3339))
	}
	fmt.Fprintf(&sb, "title = %s\npositions = %s\nunit = %s\n", b.Title, b.positionSystem(), b.Unit)
	if b.Survey != nil {
		for _, f := range b.Survey.Files {
			fmt.Fprintf(&sb, "input = %s sha256:%s\n", f.Path, f.SHA256)
		}
	}
	for _, s := range b.Settings {
		fmt.Fprintf(&sb, "setting = %s: %s\n", s.Name, s.Value)
	}
	for _, r := range b.CriterionLines() {
		fmt.Fprintf(&sb, "flagged_where = %s\n", r)
	}
	for _, s := range sums {
		fmt.Fprintf(&sb, "output = %s sha256:%s\n", s[0], s[1])
	}
	_, err := io.WriteString(w, sb.String())
	return err
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
	var js []job
	if b.qa != nil && b.Survey != nil {
		js = append(js,
			job{FileCleanCSV, func(w io.Writer) error { return qa.WriteCleanCSV(w, b.Survey, b.qa) }},
			job{FileQALog, func(w io.Writer) error { return qa.WriteLog(w, b.Survey, b.qa) }})
	}
	return append(js, []job{
		{FileGridCSV, func(w io.Writer) error { return WriteGridCSV(w, g, b.Unit, flagged, extra) }},
		{FilePotentialMatrix, func(w io.Writer) error { return WriteMatrix(w, g, pot) }},
		{FileFieldMatrix, func(w io.Writer) error { return WriteMatrix(w, g, fld) }},
		{FileGeoref, func(w io.Writer) error { return WriteGeoref(w, b.georefOf(matrices)) }},
		{FileContours, b.WriteContoursGeoJSON},
		{FileZones, b.WriteZonesGeoJSON},
		{FileReadings, b.WriteReadingsGeoJSON},
		{FileInfill, b.WriteInfillGeoJSON},
		{FileMapSVG, func(w io.Writer) error { return b.WriteMapSVG(w, PotentialMap) }},
		{FileMapPNG, func(w io.Writer) error { return b.WriteMapPNG(w, PotentialMap, b.dpi) }},
		{FileFieldSVG, func(w io.Writer) error { return b.WriteMapSVG(w, FieldMap) }},
		{FileFieldPNG, func(w io.Writer) error { return b.WriteMapPNG(w, FieldMap, b.dpi) }},
		{FileReport, b.WriteReport},
	}...)
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
