package survey

import (
	"fmt"
	"math"
	"path/filepath"
	"strconv"
	"strings"

	"isofield/survey/geo"
)

// MinReadings is the fewest readings a survey may have: a plane through
// the readings (the linear part of the interpolant) needs three.
const MinReadings = 3

// collinearTol is how far, relative to the diagonal of the readings'
// extent, every reading may lie from one straight line for the survey to
// count as collinear. At 1e-6 a 1 km survey line with 1 mm of scatter
// across it is still one line: nothing can be mapped beside it.
const collinearTol = 1e-6

// merge appends one parsed file. The first file fixes the survey's unit
// and whether its coordinates are metric or geographic.
func (s *Survey) merge(f *parsed, many bool) error {
	prefix := ""
	if many {
		prefix = filepath.Base(f.info.Path) + ": "
	}
	if len(s.Files) == 0 {
		s.Unit = f.info.Unit
	} else if f.info.Geographic != s.Files[0].Geographic {
		return &ParseError{File: f.info.Path, Err: fmt.Errorf("%s here but %s in %s; all files need the same kind of coordinates: %w",
			coordKind(f.info.Geographic), coordKind(s.Files[0].Geographic), s.Files[0].Path, ErrMixedFiles)}
	}
	if f.info.Unit != s.Unit {
		shift := 3 // V to mV
		if s.Unit == Volt {
			shift = -3
		}
		for i := range f.readings {
			f.readings[i].V = shiftDecimal(f.readings[i].V, shift)
		}
		f.notes = append(f.notes, fmt.Sprintf("potentials converted from %v to %v, the survey's unit", f.info.Unit, s.Unit))
	}
	for _, n := range f.notes {
		s.Notes = append(s.Notes, prefix+n)
	}
	s.Files = append(s.Files, f.info)
	if len(s.Readings) == 0 {
		s.Readings = f.readings
	} else {
		s.Readings = append(s.Readings, f.readings...)
	}
	return nil
}

// shiftDecimal returns v × 10^shift rounded once from v's shortest
// decimal form, so that -0.3012 V becomes -301.2 mV and not the
// -301.20000000000005 that a multiplication gives.
func shiftDecimal(v float64, shift int) float64 {
	text := strconv.FormatFloat(v, 'e', -1, 64)
	mant, exp, _ := strings.Cut(text, "e")
	e, err := strconv.Atoi(exp)
	if err != nil {
		return v * math.Pow10(shift)
	}
	out, err := strconv.ParseFloat(mant+"e"+strconv.Itoa(e+shift), 64)
	if err != nil {
		return v * math.Pow10(shift)
	}
	return out
}

func coordKind(geographic bool) string {
	if geographic {
		return "latitude and longitude"
	}
	return "metric x and y"
}

// finish converts geographic coordinates and checks the merged survey.
func (s *Survey) finish() error {
	if len(s.Files) > 0 && s.Files[0].Geographic {
		if err := s.fromLatLon(); err != nil {
			return err
		}
	}
	if len(s.Readings) < MinReadings {
		return fmt.Errorf("%d readings, at least %d are needed: %w", len(s.Readings), MinReadings, ErrTooFew)
	}
	return s.checkCollinear()
}

// fromLatLon converts the readings, which hold longitude in X and
// latitude in Y, to local metres about the centre of their extent.
func (s *Survey) fromLatLon() error {
	if unwrapAntimeridian(s.Readings) {
		s.Notes = append(s.Notes, "the survey crosses the 180° meridian; longitudes were taken across it")
	}
	lon0, lat0, lon1, lat1 := s.Extent()
	g := GeoRef{Lat0: (lat0 + lat1) / 2, Lon0: (lon0 + lon1) / 2}
	if g.Lon0 > 180 {
		g.Lon0 -= 360
	}
	p, err := geo.NewPlane(g.Lat0, g.Lon0)
	if err != nil {
		return fmt.Errorf("survey centre: %v: %w", err, ErrOutOfRange)
	}
	for i := range s.Readings {
		r := &s.Readings[i]
		r.X, r.Y = p.Forward(r.Y, r.X)
	}
	s.Geo = &g
	d := geo.Distance(lat0, lon0, lat1, lon1) / 2
	s.Notes = append(s.Notes, fmt.Sprintf("latitude and longitude converted to east and north metres about %.7f°, %.7f° (WGS 84 local tangent plane; position error under %.2g m at %.0f m from the centre)",
		g.Lat0, g.Lon0, geo.ErrorBound(d), d))
	return nil
}

// unwrapAntimeridian adds 360° to negative longitudes (held in X) when
// that shrinks their span below 180°, so that a survey across the 180°
// meridian gets its true centre. It reports whether it did.
func unwrapAntimeridian(rs []Reading) bool {
	lo, hi := math.Inf(1), math.Inf(-1)
	for _, r := range rs {
		lo, hi = min(lo, r.X), max(hi, r.X)
	}
	if hi-lo <= 180 {
		return false
	}
	for i := range rs {
		if rs[i].X < 0 {
			rs[i].X += 360
		}
	}
	return true
}

// checkCollinear refuses surveys whose readings all lie on one straight
// line (or at one point), within collinearTol of the extent.
func (s *Survey) checkCollinear() error {
	n := float64(len(s.Readings))
	var mx, my float64
	for _, r := range s.Readings {
		mx += r.X / n
		my += r.Y / n
	}
	var sxx, syy, sxy float64
	for _, r := range s.Readings {
		dx, dy := r.X-mx, r.Y-my
		sxx, syy, sxy = sxx+dx*dx, syy+dy*dy, sxy+dx*dy
	}
	x0, y0, x1, y1 := s.Extent()
	diag := math.Hypot(x1-x0, y1-y0)
	if diag == 0 {
		return fmt.Errorf("all %d readings are at one point: %w", len(s.Readings), ErrCollinear)
	}
	// The principal axis of the positions is the best-fitting line.
	th := 0.5 * math.Atan2(2*sxy, sxx-syy)
	sn, cs := math.Sincos(th)
	var far float64
	for _, r := range s.Readings {
		far = max(far, math.Abs(-(r.X-mx)*sn+(r.Y-my)*cs))
	}
	if far <= collinearTol*diag {
		return fmt.Errorf("all %d readings lie within %.3g m of one straight line over %.3g m; a map needs readings beside the line: %w",
			len(s.Readings), far, diag, ErrCollinear)
	}
	return nil
}

// ToLatLon returns the WGS 84 latitude and longitude in degrees of the
// local point (x, y) metres, by the inverse of the conversion the loader
// used (see package survey/geo for the method and its error bound).
func (g GeoRef) ToLatLon(x, y float64) (lat, lon float64) {
	p, err := geo.NewPlane(g.Lat0, g.Lon0)
	if err != nil {
		return math.NaN(), math.NaN()
	}
	return p.Inverse(x, y)
}

// FromLatLon returns the local metres of a WGS 84 latitude and longitude
// in degrees.
func (g GeoRef) FromLatLon(lat, lon float64) (x, y float64) {
	p, err := geo.NewPlane(g.Lat0, g.Lon0)
	if err != nil {
		return math.NaN(), math.NaN()
	}
	return p.Forward(lat, lon)
}
