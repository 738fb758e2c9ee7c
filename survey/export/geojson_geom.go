package export

import "fmt"

// geometry checks a geometry object of type t (§3.1).
func (v *validator) geometry(path string, o map[string]any, t string) {
	v.forbid(path, o, "geometry", "geometry", "properties")
	if t == "GeometryCollection" {
		gs, ok := o["geometries"].([]any)
		if !ok {
			v.add(path, "3.1.8", `a GeometryCollection has a "geometries" array`)
			return
		}
		for i, g := range gs {
			p := fmt.Sprintf("%s.geometries[%d]", path, i)
			if gm, ok := g.(map[string]any); ok {
				v.object(p, gm, "geometry")
			} else {
				v.add(p, "3.1.8", "each element is a geometry object")
			}
		}
		return
	}
	c, ok := o["coordinates"]
	if !ok {
		v.add(path, "3.1", `a geometry has a "coordinates" member`)
		return
	}
	path += ".coordinates"
	switch t {
	case "Point":
		v.position(path, c)
	case "MultiPoint":
		v.positions(path, c, 0, "3.1.3")
	case "LineString":
		v.positions(path, c, 2, "3.1.4")
	case "MultiLineString":
		v.each(path, c, "3.1.5", func(p string, e any) { v.positions(p, e, 2, "3.1.5") })
	case "Polygon":
		v.polygon(path, c)
	case "MultiPolygon":
		v.each(path, c, "3.1.7", v.polygon)
	}
}

// position checks one position (§3.1.1): two or three numbers (more are
// discouraged and refused here), in range for WGS 84 when geographic (§4).
func (v *validator) position(path string, c any) []float64 {
	a, ok := c.([]any)
	if !ok || len(a) < 2 || len(a) > 3 {
		v.add(path, "3.1.1", "a position is an array of two or three numbers")
		return nil
	}
	p := make([]float64, len(a))
	for i, x := range a {
		f, ok := x.(float64)
		if !ok || !finite(f) {
			v.add(path, "3.1.1", "a position holds numbers only")
			return nil
		}
		p[i] = f
	}
	if v.geographic && (p[0] < -180 || p[0] > 180 || p[1] < -90 || p[1] > 90) {
		v.add(path, "4", fmt.Sprintf("(%g, %g) is not a longitude and latitude", p[0], p[1]))
	}
	return p
}

// positions checks an array of at least least positions.
func (v *validator) positions(path string, c any, least int, section string) [][]float64 {
	a, ok := c.([]any)
	if !ok {
		v.add(path, section, "coordinates are an array of positions")
		return nil
	}
	if len(a) < least {
		v.add(path, section, fmt.Sprintf("needs %d or more positions, has %d", least, len(a)))
	}
	out := make([][]float64, 0, len(a))
	for i, e := range a {
		if p := v.position(fmt.Sprintf("%s[%d]", path, i), e); p != nil {
			out = append(out, p)
		}
	}
	if len(out) != len(a) {
		return nil
	}
	return out
}

// polygon checks an array of linear rings, the first exterior (§3.1.6).
func (v *validator) polygon(path string, c any) {
	a, ok := c.([]any)
	if !ok || len(a) == 0 {
		v.add(path, "3.1.6", "a polygon is a non-empty array of linear rings")
		return
	}
	for i, r := range a {
		p := fmt.Sprintf("%s[%d]", path, i)
		if ps := v.positions(p, r, 0, "3.1.6"); ps != nil {
			v.ring(p, ps, i == 0)
		}
	}
}

// each calls f on every element of the array c.
func (v *validator) each(path string, c any, section string, f func(string, any)) {
	a, ok := c.([]any)
	if !ok {
		v.add(path, section, "coordinates are an array")
		return
	}
	for i, e := range a {
		f(fmt.Sprintf("%s[%d]", path, i), e)
	}
}
