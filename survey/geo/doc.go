// Package geo converts WGS 84 latitude and longitude to local east/north
// metres about an origin and back.
//
// The method is the local tangent plane: each point is placed on the WGS 84
// ellipsoid (height zero), converted to earth-centred, earth-fixed (ECEF)
// coordinates with the closed form of NGA TR8350.2 (2000) §4, and rotated
// into the east-north-up frame of the origin; the up component is dropped.
// East and north are therefore the orthographic projection of the ellipsoid
// onto the plane that touches it at the origin.
//
// Error bound. A point at geodesic distance s from the origin lands at
// R·sin(s/R) ≈ s − s³/(6R²) from it, R being the radius of curvature in
// that direction (6,335 km to 6,400 km on WGS 84), and the azimuth from the
// origin is kept. The shortfall s³/(6R²) is below 1 mm for s ≤ 5 km, 4.2 mm
// for s ≤ 10 km and 0.52 m for s ≤ 50 km; local distances between nearby
// points shrink by at most the factor cos(s/R) (3 parts in 10⁷ at 5 km).
// Surveys of a few kilometres are therefore mapped well within the accuracy
// of any receiver. Heights are ignored: all points are taken on the
// ellipsoid.
//
// Plane values are cheap to copy; the zero value is not usable, build one
// with NewPlane. Origins within MaxAbsLat of a pole are refused, since
// east and north lose their meaning there.
package geo
