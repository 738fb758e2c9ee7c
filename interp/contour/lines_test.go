package contour

import (
	"context"
	"fmt"
	"math"
	"math/rand/v2"
	"testing"

	"isofield/interp"
)

// paraboloid returns V = x² + y² on [-2, 2]² at spacing h. Its level L is
// the circle of radius √L (closed form).
func paraboloid(h float64) *interp.Grid {
	n := int(math.Round(4/h)) + 1
	g := interp.NewGridN(-2, -2, h, h, n, n)
	fill(g, func(x, y float64) float64 { return x*x + y*y })
	return g
}

func TestLinesCircles(t *testing.T) {
	g := paraboloid(0.02)
	// Linear interpolation along an edge of length h misplaces a crossing of
	// x²+y² by at most h²/4 in value, so by h²/(8r) in radius; 1e-3 m is a
	// wide margin at h = 0.02 m and r ≥ 0.5 m.
	const tol = 1e-3
	tests := []struct {
		name   string
		level  float64
		lines  int
		closed bool
	}{
		{"small circle", 0.25, 1, true},
		{"unit circle", 1, 1, true},
		{"large circle", 3, 1, true},
		{"cut by the edge into four arcs", 5, 4, false},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			ls, err := Lines(context.Background(), g, []float64{tt.level})
			if err != nil {
				t.Fatal(err)
			}
			if len(ls) != tt.lines {
				t.Fatalf("level %g: %d lines, want %d", tt.level, len(ls), tt.lines)
			}
			r := math.Sqrt(tt.level)
			for _, l := range ls {
				if l.Closed != tt.closed {
					t.Errorf("level %g: Closed = %v, want %v", tt.level, l.Closed, tt.closed)
				}
				if l.Closed && l.Points[0] != l.Points[len(l.Points)-1] {
					t.Errorf("level %g: closed line does not end at its start", tt.level)
				}
				for _, p := range l.Points {
					if d := math.Abs(math.Hypot(p.X, p.Y) - r); d > tol {
						t.Fatalf("level %g: point %v is %g from the circle of radius √L = %g", tt.level, p, d, r)
					}
				}
				if !l.Closed {
					checkEndsOnEdge(t, g, l)
				}
			}
		})
	}
}

// checkEndsOnEdge fails unless both ends of an open line lie on the grid's
// boundary.
func checkEndsOnEdge(t *testing.T, g *interp.Grid, l Line) {
	t.Helper()
	xmax, ymax := g.Node(g.NX-1, g.NY-1)
	for _, p := range []Point{l.Points[0], l.Points[len(l.Points)-1]} {
		if p.X != g.X0 && p.Y != g.Y0 && p.X != xmax && p.Y != ymax {
			t.Errorf("open line ends at %v, inside the grid", p)
		}
	}
}

// TestLinesSaddle checks the centre-value rule on one saddle cell with
// corners SW=1, SE=0, NE=1, NW=0 (mean 0.5).
func TestLinesSaddle(t *testing.T) {
	g := interp.NewGridN(0, 0, 1, 1, 2, 2)
	copy(g.V, []float64{1, 0, 0, 1}) // SW, SE, NW, NE in index order
	tests := []struct {
		name  string
		level float64
		// joined is true when the high corners SW and NE are joined through
		// the centre, so the lines cut off the low corners SE and NW.
		joined bool
	}{
		{"mean on the level counts as high", 0.5, true},
		{"mean above the level", 0.4, true},
		{"mean below the level", 0.6, false},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			ls, err := Lines(context.Background(), g, []float64{tt.level})
			if err != nil {
				t.Fatal(err)
			}
			if len(ls) != 2 {
				t.Fatalf("%d lines, want 2", len(ls))
			}
			for _, l := range ls {
				mid := Point{(l.Points[0].X + l.Points[1].X) / 2, (l.Points[0].Y + l.Points[1].Y) / 2}
				// A segment cutting off SE or NW has its midpoint nearer to
				// that corner than to SW and NE.
				nearLow := math.Hypot(mid.X-1, mid.Y) < 0.5 || math.Hypot(mid.X, mid.Y-1) < 0.5
				if nearLow != tt.joined {
					t.Errorf("level %g: segment %v cuts off a %s corner, want joined=%v", tt.level, l.Points, map[bool]string{true: "low", false: "high"}[nearLow], tt.joined)
				}
			}
			cb := CellBands(g, []float64{tt.level})
			if (cb[0] == 1) != tt.joined {
				t.Errorf("level %g: cell band %d disagrees with the saddle rule", tt.level, cb[0])
			}
		})
	}
}

func TestLinesZeroLine(t *testing.T) {
	g := interp.NewGridN(-1, -1, 0.1, 0.1, 21, 21)
	fill(g, func(x, y float64) float64 { return x + 0.3 })
	ls, err := Lines(context.Background(), g, Levels(-0.7, 1.3, 0.5))
	if err != nil {
		t.Fatal(err)
	}
	zeros := 0
	for _, l := range ls {
		if l.Zero {
			zeros++
			for _, p := range l.Points {
				if math.Abs(p.X+0.3) > 1e-12 {
					t.Errorf("zero line point %v off x = -0.3", p)
				}
			}
		}
	}
	if zeros != 1 {
		t.Errorf("%d zero lines, want 1", zeros)
	}
}

// TestLinesMask masks one node on the unit circle's path: the circle must
// break into one open line whose ends touch cells next to the mask, and no
// segment may lie in a cell touching the masked node.
func TestLinesMask(t *testing.T) {
	g := paraboloid(0.1)
	i, j := 30, 20 // node (1, 0), on the unit circle
	g.Mask[g.Index(i, j)] = true
	ls, err := Lines(context.Background(), g, []float64{1})
	if err != nil {
		t.Fatal(err)
	}
	if len(ls) != 1 || ls[0].Closed {
		t.Fatalf("got %d lines (closed %v), want one open line", len(ls), len(ls) > 0 && ls[0].Closed)
	}
	checkSegmentsInCells(t, g, ls)
	for _, p := range []Point{ls[0].Points[0], ls[0].Points[len(ls[0].Points)-1]} {
		if math.Hypot(p.X-1, p.Y) > 0.1*math.Sqrt2+1e-9 {
			t.Errorf("open end %v is not at the masked node's cells", p)
		}
	}
}

// checkSegmentsInCells fails unless every segment of every line lies in one
// cell whose four corners are usable.
func checkSegmentsInCells(t *testing.T, g *interp.Grid, ls []Line) {
	t.Helper()
	const eps = 1e-9
	for _, l := range ls {
		for n := 0; n+1 < len(l.Points); n++ {
			a, b := l.Points[n], l.Points[n+1]
			if !inUsableCell(g, a, b, eps) {
				t.Fatalf("segment %v-%v of level %g is in no usable cell", a, b, l.Level)
			}
		}
	}
}

func inUsableCell(g *interp.Grid, a, b Point, eps float64) bool {
	mi := int(math.Floor(((a.X+b.X)/2 - g.X0) / g.DX))
	mj := int(math.Floor(((a.Y+b.Y)/2 - g.Y0) / g.DY))
	for dj := -1; dj <= 1; dj++ {
		for di := -1; di <= 1; di++ {
			i, j := mi+di, mj+dj
			if i < 0 || j < 0 || i >= g.NX-1 || j >= g.NY-1 {
				continue
			}
			if _, ok := cellCorners(g, i, j); !ok {
				continue
			}
			x0, y0 := g.Node(i, j)
			in := func(p Point) bool {
				return p.X >= x0-eps && p.X <= x0+g.DX+eps && p.Y >= y0-eps && p.Y <= y0+g.DY+eps
			}
			if in(a) && in(b) {
				return true
			}
		}
	}
	return false
}

// TestLinesRandomGrids is a property test on seeded random grids with
// random masks and NaNs: no panic, every segment inside one usable cell,
// closed lines end where they start, and each level's lines use every
// crossed edge once.
func TestLinesRandomGrids(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	for trial := range 200 {
		nx, ny := 1+rng.IntN(12), 1+rng.IntN(12)
		g := interp.NewGridN(rng.Float64()*10, rng.Float64()*10, 0.1+rng.Float64(), 0.1+rng.Float64(), nx, ny)
		for k := range g.V {
			g.V[k] = math.Round(rng.NormFloat64()*4) / 2 // ties with levels on purpose
			switch rng.IntN(20) {
			case 0:
				g.Mask[k] = true
			case 1:
				g.V[k] = math.NaN()
			}
		}
		levels := []float64{-1, 0, 0.5, 2}
		ls, err := Lines(context.Background(), g, levels)
		if err != nil {
			t.Fatal(err)
		}
		t.Run(fmt.Sprint("trial ", trial), func(t *testing.T) {
			checkSegmentsInCells(t, g, ls)
			for _, l := range ls {
				if len(l.Points) < 2 {
					t.Errorf("line of %d points", len(l.Points))
				}
				if l.Closed && l.Points[0] != l.Points[len(l.Points)-1] {
					t.Errorf("closed line does not end at its start")
				}
			}
		})
	}
}

func TestLinesCancelled(t *testing.T) {
	ctx, cancel := context.WithCancel(context.Background())
	cancel()
	if _, err := Lines(ctx, paraboloid(0.1), []float64{1}); err == nil {
		t.Errorf("Lines with a cancelled context returned no error")
	}
}

func BenchmarkLines(b *testing.B) {
	for _, n := range []int{200, 500, 1000} {
		g := interp.NewGridN(0, 0, 1, 1, n, n)
		// Two buried sources of opposite sign, 5 % of the side deep.
		s := float64(n)
		d2 := 0.05 * s * 0.05 * s
		fill(g, func(x, y float64) float64 {
			a := (x-0.3*s)*(x-0.3*s) + (y-0.4*s)*(y-0.4*s)
			b := (x-0.7*s)*(x-0.7*s) + (y-0.6*s)*(y-0.6*s)
			return 1/math.Sqrt(a+d2) - 1/math.Sqrt(b+d2)
		})
		lo, hi, _ := Range(g)
		levels := Levels(lo, hi, NiceInterval(lo, hi))
		b.Run(fmt.Sprintf("n=%dx%d", n, n), func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				if _, err := Lines(context.Background(), g, levels); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}
