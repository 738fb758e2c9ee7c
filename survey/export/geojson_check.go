package export

import (
	"bytes"
	"encoding/json"
	"fmt"
	"math"
)

// Problem is one breach of RFC 7946 found by ValidateGeoJSON.
type Problem struct {
	Path    string // JSON path of the offending member, e.g. features[3].geometry
	Section string // RFC 7946 section, e.g. "3.1.6"
	Msg     string
}

func (p Problem) String() string {
	return fmt.Sprintf("%s: %s (RFC 7946 §%s)", p.Path, p.Msg, p.Section)
}

// ValidateGeoJSON checks a GeoJSON text against the structural rules of RFC
// 7946 and returns what it breaks (nil when nothing). With geographic set it
// also checks that positions are longitude in [-180, 180] and latitude in
// [-90, 90] (§4). Winding is checked as the right-hand rule of §3.1.6
// demands of writers, though the RFC lets parsers accept either.
func ValidateGeoJSON(data []byte, geographic bool) []Problem {
	v := &validator{geographic: geographic}
	dec := json.NewDecoder(bytes.NewReader(data))
	var root any
	if err := dec.Decode(&root); err != nil {
		v.add("$", "2", "not a JSON text: "+err.Error())
		return v.problems
	}
	if dec.More() {
		v.add("$", "2", "more than one JSON value")
	}
	obj, ok := root.(map[string]any)
	if !ok {
		v.add("$", "2", "a GeoJSON text is a single object")
		return v.problems
	}
	v.object("$", obj, "")
	return v.problems
}

type validator struct {
	geographic bool
	problems   []Problem
}

func (v *validator) add(path, section, msg string) {
	v.problems = append(v.problems, Problem{Path: path, Section: section, Msg: msg})
}

// geometryTypes are the seven geometry types of §1.4.
var geometryTypes = map[string]bool{
	"Point": true, "MultiPoint": true, "LineString": true, "MultiLineString": true,
	"Polygon": true, "MultiPolygon": true, "GeometryCollection": true,
}

// object checks any GeoJSON object; want, if not empty, restricts its kind
// ("geometry" or "Feature").
func (v *validator) object(path string, o map[string]any, want string) {
	t, ok := o["type"].(string)
	if !ok {
		v.add(path, "3", `missing "type" string member`)
		return
	}
	switch {
	case geometryTypes[t]:
		if want == "Feature" {
			v.add(path, "3.3", "a FeatureCollection holds Feature objects, not "+t)
		}
		v.geometry(path, o, t)
	case t == "Feature" && want != "geometry":
		v.feature(path, o)
	case t == "FeatureCollection" && want == "":
		v.collection(path, o)
	default:
		v.add(path, "1.4", fmt.Sprintf("type %q is not allowed here", t))
		return
	}
	v.bbox(path, o)
}

// forbid reports members that §7.1 forbids on an object of this kind.
func (v *validator) forbid(path string, o map[string]any, kind string, names ...string) {
	for _, n := range names {
		if _, ok := o[n]; ok {
			v.add(path, "7.1", fmt.Sprintf("a %s must not have a %q member", kind, n))
		}
	}
}

func (v *validator) collection(path string, o map[string]any) {
	v.forbid(path, o, "FeatureCollection", "coordinates", "geometries", "geometry", "properties")
	fs, ok := o["features"].([]any)
	if !ok {
		v.add(path, "3.3", `a FeatureCollection has a "features" array`)
		return
	}
	for i, f := range fs {
		p := fmt.Sprintf("%s.features[%d]", path, i)
		fo, ok := f.(map[string]any)
		if !ok {
			v.add(p, "3.3", "each feature is an object")
			continue
		}
		v.object(p, fo, "Feature")
	}
}

func (v *validator) feature(path string, o map[string]any) {
	v.forbid(path, o, "Feature", "coordinates", "geometries")
	g, ok := o["geometry"]
	switch {
	case !ok:
		v.add(path, "3.2", `a Feature has a "geometry" member`)
	case g != nil:
		if gm, isObj := g.(map[string]any); isObj {
			v.object(path+".geometry", gm, "geometry")
		} else {
			v.add(path+".geometry", "3.2", "geometry is an object or null")
		}
	}
	p, ok := o["properties"]
	if _, isObj := p.(map[string]any); !ok || (p != nil && !isObj) {
		v.add(path, "3.2", `a Feature has a "properties" member that is an object or null`)
	}
	if id, ok := o["id"]; ok {
		switch id.(type) {
		case string, float64:
		default:
			v.add(path+".id", "3.2", "id is a string or a number")
		}
	}
}

// bbox checks the optional "bbox" member (§5): 2n numbers, the south-west
// corner before the north-east one (only longitude may wrap, §5.2).
func (v *validator) bbox(path string, o map[string]any) {
	raw, ok := o["bbox"]
	if !ok {
		return
	}
	a, ok := raw.([]any)
	if !ok || len(a) < 4 || len(a)%2 != 0 {
		v.add(path+".bbox", "5", "bbox is an array of 2n numbers")
		return
	}
	nums := make([]float64, len(a))
	for i, x := range a {
		f, ok := x.(float64)
		if !ok {
			v.add(path+".bbox", "5", "bbox holds numbers only")
			return
		}
		nums[i] = f
	}
	n := len(nums) / 2
	for d := range n {
		if nums[d] > nums[n+d] && !(d == 0 && v.geographic) {
			v.add(path+".bbox", "5", fmt.Sprintf("axis %d: minimum %g exceeds maximum %g", d+1, nums[d], nums[n+d]))
		}
	}
}

func (v *validator) ring(path string, r [][]float64, outer bool) {
	if len(r) < 4 {
		v.add(path, "3.1.6", "a linear ring has four or more positions")
		return
	}
	first, last := r[0], r[len(r)-1]
	if len(first) != len(last) || first[0] != last[0] || first[1] != last[1] {
		v.add(path, "3.1.6", "a linear ring is closed: its first and last positions are equivalent")
		return
	}
	a := signedArea(r)
	switch {
	case outer && a <= 0:
		v.add(path, "3.1.6", "an exterior ring runs counter-clockwise (right-hand rule)")
	case !outer && a >= 0:
		v.add(path, "3.1.6", "a hole runs clockwise (right-hand rule)")
	}
}

// signedArea is the shoelace area of a closed ring, positive when
// counter-clockwise.
func signedArea(r [][]float64) float64 {
	var s float64
	for i := 0; i+1 < len(r); i++ {
		s += (r[i][0] - r[0][0]) * (r[i+1][1] - r[0][1])
		s -= (r[i+1][0] - r[0][0]) * (r[i][1] - r[0][1])
	}
	return s / 2
}

// finite reports whether f is a finite number.
func finite(f float64) bool { return !math.IsNaN(f) && !math.IsInf(f, 0) }
