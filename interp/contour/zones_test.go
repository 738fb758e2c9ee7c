package contour

import (
	"fmt"
	"math"
	"testing"

	"isofield/interp"
)

// pattern turns rows of '#' and '.' (first row north) into flags.
func pattern(rows ...string) (nx, ny int, flags []bool) {
	ny, nx = len(rows), len(rows[0])
	flags = make([]bool, nx*ny)
	for r, row := range rows {
		j := ny - 1 - r
		for i, c := range row {
			flags[j*nx+i] = c == '#'
		}
	}
	return nx, ny, flags
}

func TestComponents(t *testing.T) {
	tests := []struct {
		name  string
		rows  []string
		want  int
		sizes []int
	}{
		{"none", []string{"...", "..."}, 0, nil},
		{"diagonal joins", []string{"#..", ".#.", "..#"}, 1, []int{3}},
		{"two apart", []string{"#.#", "#.#"}, 2, []int{2, 2}},
		{"ring", []string{"###", "#.#", "###"}, 1, []int{8}},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			nx, ny, f := pattern(tt.rows...)
			labels, n := Components(nx, ny, f)
			if n != tt.want {
				t.Fatalf("Components(%q) = %d regions, want %d", tt.rows, n, tt.want)
			}
			sizes := make([]int, n)
			for k, l := range labels {
				if (l >= 0) != f[k] {
					t.Fatalf("node %d: label %d but flagged %v", k, l, f[k])
				}
				if l >= 0 {
					sizes[l]++
				}
			}
			if fmt.Sprint(sizes) != fmt.Sprint(tt.sizes) {
				t.Errorf("region sizes %v, want %v", sizes, tt.sizes)
			}
		})
	}
}

func TestOutline(t *testing.T) {
	tests := []struct {
		name      string
		rows      []string
		area      float64 // outer ring, in cells
		holes     []float64
		outerPnts int // corners plus the closing point
	}{
		{"single node", []string{"#"}, 1, nil, 5},
		{"L shape", []string{"#.", "##"}, 3, nil, 7},
		{"ring with hole", []string{"###", "#.#", "###"}, 9, []float64{-1}, 5},
		{"diagonal pinch", []string{".#", "#."}, 2, nil, 9},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			nx, ny, f := pattern(tt.rows...)
			g := interp.NewGridN(10, 20, 2, 0.5, nx, ny)
			var nodes []int
			for k, v := range f {
				if v {
					nodes = append(nodes, k)
				}
			}
			outer, holes := Outline(g, nodes)
			cell := g.DX * g.DY
			if a := RingArea(outer); math.Abs(a-tt.area*cell) > 1e-9 {
				t.Errorf("outer ring area %g, want %g (counter-clockwise)", a, tt.area*cell)
			}
			if len(outer) != tt.outerPnts {
				t.Errorf("outer ring has %d points, want %d: %v", len(outer), tt.outerPnts, outer)
			}
			if outer[0] != outer[len(outer)-1] {
				t.Errorf("outer ring not closed")
			}
			if len(holes) != len(tt.holes) {
				t.Fatalf("%d holes, want %d", len(holes), len(tt.holes))
			}
			for h := range holes {
				if a := RingArea(holes[h]); math.Abs(a-tt.holes[h]*cell) > 1e-9 {
					t.Errorf("hole %d area %g, want %g (clockwise)", h, a, tt.holes[h]*cell)
				}
			}
		})
	}
}

func TestOutlineCoordinates(t *testing.T) {
	g := interp.NewGridN(10, 20, 2, 0.5, 3, 3)
	outer, _ := Outline(g, []int{g.Index(1, 1)})
	// Node (1, 1) is at (12, 20.5); its cell spans x 11..13, y 20.25..20.75.
	want := []Point{{11, 20.25}, {13, 20.25}, {13, 20.75}, {11, 20.75}, {11, 20.25}}
	if fmt.Sprint(outer) != fmt.Sprint(want) {
		t.Errorf("Outline of one node = %v, want %v", outer, want)
	}
}

func BenchmarkComponents(b *testing.B) {
	for _, n := range []int{200, 1000} {
		f := make([]bool, n*n)
		for k := range f {
			i, j := k%n, k/n
			f[k] = math.Sin(float64(i)/7)*math.Cos(float64(j)/5) > 0.3
		}
		b.Run(fmt.Sprintf("n=%dx%d", n, n), func(b *testing.B) {
			for b.Loop() {
				Components(n, n, f)
			}
		})
	}
}
