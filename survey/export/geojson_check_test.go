package export

import (
	"strings"
	"testing"
)

// TestValidateGeoJSON feeds texts that break one RFC 7946 rule each and
// demands that rule's section; valid texts (including the RFC's own
// examples of §1.5, from memory) must pass.
func TestValidateGeoJSON(t *testing.T) {
	square := `[[0,0],[1,0],[1,1],[0,1],[0,0]]`
	tests := []struct {
		name       string
		in         string
		geographic bool
		section    string // "" for valid
	}{
		{"point", `{"type":"Point","coordinates":[102.0,0.5]}`, true, ""},
		{"feature collection of the RFC", `{"type":"FeatureCollection","features":[{"type":"Feature","geometry":{"type":"Point","coordinates":[102.0,0.5]},"properties":{"prop0":"value0"}},{"type":"Feature","geometry":{"type":"LineString","coordinates":[[102.0,0.0],[103.0,1.0],[104.0,0.0],[105.0,1.0]]},"properties":{"prop1":0.0}},{"type":"Feature","geometry":{"type":"Polygon","coordinates":[[[100.0,0.0],[101.0,0.0],[101.0,1.0],[100.0,1.0],[100.0,0.0]]]},"properties":{"this":"that"}}]}`, true, ""},
		{"polygon with hole", `{"type":"Polygon","coordinates":[[[0,0],[4,0],[4,4],[0,4],[0,0]],[[1,1],[1,2],[2,2],[2,1],[1,1]]]}`, false, ""},
		{"null geometry and properties", `{"type":"Feature","geometry":null,"properties":null}`, false, ""},
		{"bbox across the antimeridian", `{"type":"Point","bbox":[177,-20,-178,-16],"coordinates":[179,-18]}`, true, ""},
		{"array at the top", `[1,2]`, false, "2"},
		{"two values", `{"type":"Point","coordinates":[1,2]} {}`, false, "2"},
		{"no type", `{"coordinates":[1,2]}`, false, "3"},
		{"unknown type", `{"type":"Circle","coordinates":[1,2]}`, false, "1.4"},
		{"wrong case", `{"type":"point","coordinates":[1,2]}`, false, "1.4"},
		{"no coordinates", `{"type":"Point"}`, false, "3.1"},
		{"position of one number", `{"type":"Point","coordinates":[1]}`, false, "3.1.1"},
		{"position of four numbers", `{"type":"Point","coordinates":[1,2,3,4]}`, false, "3.1.1"},
		{"position with text", `{"type":"Point","coordinates":[1,"2"]}`, false, "3.1.1"},
		{"line of one position", `{"type":"LineString","coordinates":[[1,2]]}`, false, "3.1.4"},
		{"open ring", `{"type":"Polygon","coordinates":[[[0,0],[1,0],[1,1],[0,1]]]}`, false, "3.1.6"},
		{"ring of three positions", `{"type":"Polygon","coordinates":[[[0,0],[1,0],[0,0]]]}`, false, "3.1.6"},
		{"clockwise exterior", `{"type":"Polygon","coordinates":[[[0,0],[0,1],[1,1],[1,0],[0,0]]]}`, false, "3.1.6"},
		{"counter-clockwise hole", `{"type":"Polygon","coordinates":[[[0,0],[4,0],[4,4],[0,4],[0,0]],` + strings.ReplaceAll(square, "1", "2") + `]}`, false, "3.1.6"},
		{"multipolygon bad ring", `{"type":"MultiPolygon","coordinates":[[[[0,0],[1,0],[1,1],[0,0],[5,5]]]]}`, false, "3.1.6"},
		{"collection without geometries", `{"type":"GeometryCollection"}`, false, "3.1.8"},
		{"feature without geometry", `{"type":"Feature","properties":{}}`, false, "3.2"},
		{"feature without properties", `{"type":"Feature","geometry":null}`, false, "3.2"},
		{"feature with array properties", `{"type":"Feature","geometry":null,"properties":[]}`, false, "3.2"},
		{"feature with boolean id", `{"type":"Feature","id":true,"geometry":null,"properties":{}}`, false, "3.2"},
		{"collection without features", `{"type":"FeatureCollection"}`, false, "3.3"},
		{"collection holding a geometry", `{"type":"FeatureCollection","features":[{"type":"Point","coordinates":[1,2]}]}`, false, "3.3"},
		{"longitude out of range", `{"type":"Point","coordinates":[181,0]}`, true, "4"},
		{"latitude out of range", `{"type":"Point","coordinates":[0,-91]}`, true, "4"},
		{"metres pass without geographic", `{"type":"Point","coordinates":[512345.5,5412345.5]}`, false, ""},
		{"bbox of three numbers", `{"type":"Point","bbox":[1,2,3],"coordinates":[1,2]}`, false, "5"},
		{"bbox inverted", `{"type":"Point","bbox":[0,5,1,4],"coordinates":[0,4.5]}`, false, "5"},
		{"collection with properties", `{"type":"FeatureCollection","properties":{},"features":[]}`, false, "7.1"},
		{"feature with coordinates", `{"type":"Feature","coordinates":[1,2],"geometry":null,"properties":{}}`, false, "7.1"},
		{"geometry with properties", `{"type":"Point","properties":{},"coordinates":[1,2]}`, false, "7.1"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			ps := ValidateGeoJSON([]byte(tt.in), tt.geographic)
			if tt.section == "" {
				if len(ps) > 0 {
					t.Errorf("ValidateGeoJSON(%s) = %v, want no problems", tt.in, ps)
				}
				return
			}
			for _, p := range ps {
				if p.Section == tt.section {
					return
				}
			}
			t.Errorf("ValidateGeoJSON(%s) = %v, want a problem under §%s", tt.in, ps, tt.section)
		})
	}
}
