package geo

import (
	"fmt"
	"math"
)

// WGS 84 defining constants (NGA TR8350.2, 2000, Table 3.1).
const (
	SemiMajor  = 6378137.0         // a, metres
	Flattening = 1 / 298.257223563 // f
)

// e2 is the first eccentricity squared, f(2 − f).
const e2 = Flattening * (2 - Flattening)

// MaxAbsLat is the largest origin latitude (degrees) NewPlane accepts.
const MaxAbsLat = 89.0

// inverseTol is the residual, in metres, at which Inverse stops iterating.
const inverseTol = 1e-9

// Plane is the local tangent plane at an origin on the WGS 84 ellipsoid.
type Plane struct {
	lat0, lon0 float64 // origin, degrees
	x0, y0, z0 float64 // origin in ECEF metres
	// rows of the ECEF → east-north rotation
	ex, ey         float64
	nx, ny, nz     float64
	m0, n0, cosLat float64 // radii of curvature at the origin and cos φ0
}

// NewPlane returns the tangent plane at (lat0, lon0) in degrees. It returns
// an error when the latitude is outside ±MaxAbsLat or the longitude outside
// ±180, or either is not finite.
func NewPlane(lat0, lon0 float64) (Plane, error) {
	if !(math.Abs(lat0) <= MaxAbsLat) || !(math.Abs(lon0) <= 180) {
		return Plane{}, fmt.Errorf("origin %g, %g: latitude must be within ±%g° and longitude within ±180°", lat0, lon0, MaxAbsLat)
	}
	p := Plane{lat0: lat0, lon0: lon0}
	phi, lam := rad(lat0), rad(lon0)
	sp, cp := math.Sincos(phi)
	sl, cl := math.Sincos(lam)
	p.x0, p.y0, p.z0 = ecef(phi, lam)
	p.ex, p.ey = -sl, cl
	p.nx, p.ny, p.nz = -sp*cl, -sp*sl, cp
	p.m0, p.n0 = Radii(lat0)
	p.cosLat = cp
	return p, nil
}

// Origin returns the plane's origin in degrees.
func (p Plane) Origin() (lat, lon float64) { return p.lat0, p.lon0 }

// Forward returns the east and north metres of (lat, lon) in degrees.
func (p Plane) Forward(lat, lon float64) (east, north float64) {
	x, y, z := ecef(rad(lat), rad(lon))
	dx, dy, dz := x-p.x0, y-p.y0, z-p.z0
	return p.ex*dx + p.ey*dy, p.nx*dx + p.ny*dy + p.nz*dz
}

// Inverse returns the latitude and longitude in degrees of the point on the
// ellipsoid whose projection is (east, north). It iterates Forward with the
// local radii of curvature as the step until the residual is below a
// nanometre; points farther than the radius of the earth from the origin
// have no preimage and give NaN.
func (p Plane) Inverse(east, north float64) (lat, lon float64) {
	if math.Hypot(east, north) >= p.n0*(1-e2) {
		return math.NaN(), math.NaN()
	}
	lat = p.lat0 + deg(north/p.m0)
	lon = p.lon0 + deg(east/(p.n0*p.cosLat))
	for range 50 {
		fe, fn := p.Forward(lat, lon)
		de, dn := east-fe, north-fn
		if math.Abs(de) < inverseTol && math.Abs(dn) < inverseTol {
			break
		}
		m, n := Radii(lat)
		lat += deg(dn / m)
		lon += deg(de / (n * math.Cos(rad(lat))))
	}
	return lat, normLon(lon)
}

// Radii returns the meridian radius of curvature M and the prime-vertical
// radius N in metres at latitude lat (degrees):
// M = a(1 − e²)/(1 − e² sin²φ)^{3/2}, N = a/(1 − e² sin²φ)^{1/2}.
func Radii(lat float64) (m, n float64) {
	s := math.Sin(rad(lat))
	w := 1 - e2*s*s
	n = SemiMajor / math.Sqrt(w)
	return n * (1 - e2) / w, n
}

// ecef returns the earth-centred, earth-fixed coordinates of a point on the
// ellipsoid (height zero) at latitude phi, longitude lam in radians
// (NGA TR8350.2 eq. 4-14).
func ecef(phi, lam float64) (x, y, z float64) {
	sp, cp := math.Sincos(phi)
	sl, cl := math.Sincos(lam)
	n := SemiMajor / math.Sqrt(1-e2*sp*sp)
	return n * cp * cl, n * cp * sl, n * (1 - e2) * sp
}

func rad(d float64) float64 { return d * math.Pi / 180 }
func deg(r float64) float64 { return r * 180 / math.Pi }

// normLon brings a longitude into [-180, 180).
func normLon(lon float64) float64 {
	if lon >= -180 && lon < 180 {
		return lon
	}
	return math.Mod(math.Mod(lon+180, 360)+360, 360) - 180
}

// meanRadius is the WGS 84 mean radius (2a + b)/3 in metres, used only
// for error estimates.
const meanRadius = 6371008.8

// Distance is the great-circle distance in metres between two points on a
// sphere of the mean earth radius (haversine formula); good to about 0.5 %,
// which is all the error estimate needs.
func Distance(lat1, lon1, lat2, lon2 float64) float64 {
	p1, p2 := rad(lat1), rad(lat2)
	dp, dl := p2-p1, rad(lon2-lon1)
	h := math.Sin(dp/2)*math.Sin(dp/2) + math.Cos(p1)*math.Cos(p2)*math.Sin(dl/2)*math.Sin(dl/2)
	return 2 * meanRadius * math.Asin(math.Sqrt(min(1, h)))
}

// ErrorBound returns the largest shortfall in metres of the plane
// distance from the origin against the geodesic distance s (metres):
// s³/(6R²) with R the smallest radius of curvature on WGS 84, the meridian
// radius at the equator, a(1 − e²).
func ErrorBound(s float64) float64 {
	r := SemiMajor * (1 - e2)
	return s * s * s / (6 * r * r)
}
