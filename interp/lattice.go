package interp

import (
	"math"
	"sync/atomic"
)

// splitDepth is how many times a crowded cell may be split into four
// (lattice.assign): down to 1/256 of its area, which keeps clusters up to
// about (localMax/localTarget)·4^splitDepth ≈ 790 times the survey's mean
// density covered by patches that hold all the readings of their weight
// disks. Denser still, a patch keeps its localMax nearest readings and its
// weight disk shrinks to fit them.
const splitDepth = 4

// Growth of an under-filled or collinear patch: its radius is multiplied
// by patchGrow until it holds localMin readings not on one line, at most
// until patchGrowMax times the base radius; then the patch is dropped.
const (
	patchGrow    = 1.5
	patchGrowMax = 16
)

// fitMargin is the ratio of a patch's fit radius to its weight radius:
// each local fit uses the readings out to fitMargin times the distance at
// which its weight vanishes, so that wherever its weight is felt the
// point lies well inside the readings it was fitted to, and the local
// fit's larger error near its own edge never enters the blend.
const fitMargin = 2

// coverRatio is the ratio of a patch's weight radius to the half-diagonal
// of its lattice cell. It must exceed 1 so that the disks cover the box;
// the larger it is, the more patches overlap at each point: about
// π·coverRatio²/2 of them, each costing a local evaluation.
const coverRatio = 1.15

// lattice is the regular layout of patch centres over the readings'
// bounding box (scaled coordinates): na × nb cells of hx × hy, one patch
// centre at the middle of each, base weight radius rad0, at least
// coverRatio times the half-diagonal of a cell, so the base disks cover
// the box.
type lattice struct {
	x0, y0, hx, hy float64
	na, nb         int
	rad0           float64
}

// newLattice sizes the cells so that a base fit disk (radius
// fitMargin·rad0) holds about localTarget readings at the survey's mean
// density.
func newLattice(ds *dataset) lattice {
	xmin, ymin, xmax, ymax := bounds(ds.x, ds.y)
	w, h := xmax-xmin, ymax-ymin
	n := float64(len(ds.x))
	area := max(w*h, ds.h*ds.h*n)
	rho := math.Sqrt(localTarget*area/(math.Pi*n)) / fitMargin
	H := rho * math.Sqrt2 / coverRatio // a square cell's side
	na := max(1, int(math.Ceil(w/H)))
	nb := max(1, int(math.Ceil(h/H)))
	hx, hy := max(w/float64(na), H*1e-3), max(h/float64(nb), H*1e-3)
	rad0 := max(rho, coverRatio*math.Hypot(hx, hy)/2)
	return lattice{x0: xmin, y0: ymin, hx: hx, hy: hy, na: na, nb: nb, rad0: rad0}
}

func (l lattice) centre(a, b int) (x, y float64) {
	return l.x0 + (float64(a)+0.5)*l.hx, l.y0 + (float64(b)+0.5)*l.hy
}

// assign finds each patch's readings, grows or drops patches as needed,
// extends them past crowded readings when delta > 0 (extender),
// and lays the patches out in lf (coordinates, members, room for the
// coefficients), in lattice order. Rows of the lattice are searched on
// all cores, then copied into place at their offsets, also in parallel.
func (l lattice) assign(ds *dataset, ix *pointIndex, lf *localFit, delta float64) {
	type rowOut struct {
		patches []patch // lo, hi index members
		members []int32
	}
	rows := make([]rowOut, l.nb)
	var next atomic.Int64
	parallelRange(2*l.nb, func(_, _ int) {
		var buf, wide []int32
		ext := extender{delta: delta, steps: extendSteps()}
		for {
			b := int(next.Add(1) - 1)
			if b >= l.nb {
				return
			}
			r := &rows[b]
			r.members = make([]int32, 0, l.na*localTarget*5/4)
			// place lays out the patch of the cell (or sub-cell) centred
			// at (cx, cy), hx × hy, with weight radius rad; a cell whose
			// fit disk holds more than localMax readings is split into
			// four, down to splitDepth levels (clusters of readings many
			// times denser than the survey's mean).
			var place func(cx, cy, hx, hy, rad float64, depth int)
			place = func(cx, cy, hx, hy, rad float64, depth int) {
				if depth == 0 && !ix.anyWithin(cx, cy, rad) {
					return // an empty base disk: no patch (holes, corners)
				}
				// An empty sub-cell of a split cell still gets a patch,
				// grown (growPatch) until it reaches readings, so that its
				// ground stays covered by weight disks.
				base := fitMargin * rad
				if delta > 0 {
					// One search serves the base patch and the extender's
					// first reach (extendFirst).
					wide = ix.within(wide[:0], cx, cy, extendFirst*base)
					buf = buf[:0]
					for _, i := range wide {
						if dx, dy := ds.x[i]-cx, ds.y[i]-cy; dx*dx+dy*dy <= base*base {
							buf = append(buf, i)
						}
					}
				} else {
					buf = ix.within(buf[:0], cx, cy, base)
				}
				if len(buf) > localMax && depth < splitDepth {
					qx, qy := hx/4, hy/4
					sub := coverRatio * math.Hypot(hx/2, hy/2) / 2
					for _, q := range [4][2]float64{{-1, -1}, {1, -1}, {-1, 1}, {1, 1}} {
						place(cx+q[0]*qx, cy+q[1]*qy, hx/2, hy/2, sub, depth+1)
					}
					return
				}
				idx, frad := growPatch(ix, ds, cx, cy, base, buf)
				if idx == nil {
					return
				}
				rad = frad / fitMargin
				if len(idx) < localMax {
					var pre []int32
					if frad == base {
						pre = wide
					}
					idx, frad = ext.extend(ix, ds, cx, cy, rad, frad, idx, pre)
				}
				lo := int32(len(r.members))
				r.members = append(r.members, idx...)
				r.patches = append(r.patches, patch{cx: cx, cy: cy, rad: rad, frad: frad, lo: lo, hi: int32(len(r.members))})
			}
			for a := 0; a < l.na; a++ {
				cx, cy := l.centre(a, b)
				place(cx, cy, l.hx, l.hy, l.rad0, 0)
			}
		}
	})
	pOff, mOff := make([]int, l.nb+1), make([]int, l.nb+1)
	for b, r := range rows {
		pOff[b+1], mOff[b+1] = pOff[b]+len(r.patches), mOff[b]+len(r.members)
	}
	nm := mOff[l.nb]
	lf.patches = make([]patch, pOff[l.nb])
	lf.px, lf.py, lf.coef = make([]float64, nm), make([]float64, nm), make([]float64, nm)
	lf.member = make([]int32, nm)
	parallelRange(l.nb, func(lo, hi int) {
		for b := lo; b < hi; b++ {
			r := &rows[b]
			base := int32(mOff[b])
			copy(lf.member[base:], r.members)
			for j, p := range r.patches {
				for k := p.lo; k < p.hi; k++ {
					i := r.members[k]
					lf.px[base+k] = (ds.x[i] - p.cx) / p.frad
					lf.py[base+k] = (ds.y[i] - p.cy) / p.frad
				}
				p.lo, p.hi = p.lo+base, p.hi+base
				lf.patches[pOff[b]+j] = p
			}
			rows[b] = rowOut{}
		}
	})
}

// growPatch returns the readings of the patch at (cx, cy) and its fit
// radius: rad0 if that holds localMin readings not on one line, else a
// radius grown by patchGrow steps; nil if even patchGrowMax × rad0 fails.
// A patch over localMax readings keeps its localMax nearest. The result
// may share first's storage.
func growPatch(ix *pointIndex, ds *dataset, cx, cy, rad0 float64, first []int32) ([]int32, float64) {
	idx, rad := first, rad0
	for len(idx) < localMin || pointsCollinear(ds, idx) {
		rad *= patchGrow
		if rad > patchGrowMax*rad0 {
			return nil, 0
		}
		idx = ix.within(idx[:0], cx, cy, rad)
	}
	if len(idx) > localMax {
		sortByDistance(idx, ds.x, ds.y, cx, cy)
		idx = idx[:localMax]
		last := idx[localMax-1]
		rad = math.Hypot(ds.x[last]-cx, ds.y[last]-cy) * (1 + 1e-9)
	}
	return idx, rad
}

// pointsCollinear reports whether the readings idx lie on one line (their
// covariance has rank one to within collinearTol).
func pointsCollinear(ds *dataset, idx []int32) bool {
	var mx, my float64
	n := float64(len(idx))
	for _, k := range idx {
		mx += ds.x[k] / n
		my += ds.y[k] / n
	}
	var sxx, syy, sxy float64
	for _, k := range idx {
		dx, dy := ds.x[k]-mx, ds.y[k]-my
		sxx, syy, sxy = sxx+dx*dx, syy+dy*dy, sxy+dx*dy
	}
	tr, det := sxx+syy, sxx*syy-sxy*sxy
	return tr <= 0 || det <= 1e-8*tr*tr
}

// cellMap lists, for each lattice cell, the patches whose disks meet it
// (ids[start[c]:start[c+1]]), and the patch nearest to each cell's centre
// for points that no disk covers.
type cellMap struct {
	lat   lattice
	start []int32
	ids   []int32
	near  []int32
}

func newCellMap(l lattice, ps []patch) cellMap {
	cm := cellMap{lat: l, start: make([]int32, l.na*l.nb+1)}
	cm.eachCell(ps, func(c, _ int) { cm.start[c+1]++ })
	for c := 0; c < l.na*l.nb; c++ {
		cm.start[c+1] += cm.start[c]
	}
	cm.ids = make([]int32, cm.start[l.na*l.nb])
	at := append([]int32(nil), cm.start[:l.na*l.nb]...)
	cm.eachCell(ps, func(c, j int) {
		cm.ids[at[c]] = int32(j)
		at[c]++
	})
	pcx, pcy := make([]float64, len(ps)), make([]float64, len(ps))
	for j, p := range ps {
		pcx[j], pcy[j] = p.cx, p.cy
	}
	pix := newPointIndex(pcx, pcy, 2)
	cm.near = make([]int32, l.na*l.nb)
	parallelRange(l.nb, func(lo, hi int) {
		for b := lo; b < hi; b++ {
			for a := 0; a < l.na; a++ {
				x, y := l.centre(a, b)
				j, _ := pix.nearest(x, y, -1)
				cm.near[b*l.na+a] = int32(j)
			}
		}
	})
	return cm
}

// eachCell calls fn(cell, patch) for every cell a patch's disk meets.
func (cm *cellMap) eachCell(ps []patch, fn func(c, j int)) {
	l := cm.lat
	for j, p := range ps {
		a0 := cellCoord((p.cx-p.rad-l.x0)/l.hx, l.na)
		a1 := cellCoord((p.cx+p.rad-l.x0)/l.hx, l.na)
		b0 := cellCoord((p.cy-p.rad-l.y0)/l.hy, l.nb)
		b1 := cellCoord((p.cy+p.rad-l.y0)/l.hy, l.nb)
		for b := b0; b <= b1; b++ {
			for a := a0; a <= a1; a++ {
				if cm.meets(p, a, b) {
					fn(b*l.na+a, j)
				}
			}
		}
	}
}

// meets reports whether patch p's disk meets cell (a, b). Edge cells
// extend without bound outward, since queries outside the lattice are
// clamped to them.
func (cm *cellMap) meets(p patch, a, b int) bool {
	l := cm.lat
	xlo, xhi := l.x0+float64(a)*l.hx, l.x0+float64(a+1)*l.hx
	ylo, yhi := l.y0+float64(b)*l.hy, l.y0+float64(b+1)*l.hy
	if a == 0 {
		xlo = math.Inf(-1)
	}
	if a == l.na-1 {
		xhi = math.Inf(1)
	}
	if b == 0 {
		ylo = math.Inf(-1)
	}
	if b == l.nb-1 {
		yhi = math.Inf(1)
	}
	dx := max(xlo-p.cx, 0, p.cx-xhi)
	dy := max(ylo-p.cy, 0, p.cy-yhi)
	return dx*dx+dy*dy < p.rad*p.rad
}

// candidates returns the patches that may cover (u, v) and the fallback
// patch of its cell.
func (cm *cellMap) candidates(u, v float64) ([]int32, int32) {
	l := cm.lat
	c := cellCoord((v-l.y0)/l.hy, l.nb)*l.na + cellCoord((u-l.x0)/l.hx, l.na)
	return cm.ids[cm.start[c]:cm.start[c+1]], cm.near[c]
}

// thinFraction and extendMax govern how a patch reaches past unevenly
// spread readings: see extender.
const (
	thinFraction = 1.0
	extendMax    = 2.5
)

// extendStep is the ratio between the fit radii the extender tries;
// extendFirst is the reach of its first search, which suffices for evenly
// spread readings (a second search reaches extendMax).
const (
	extendStep  = 1.1
	extendFirst = 1.3
)

// extender widens the fit of patches whose readings crowd into a few
// lines. Readings taken every metre along lines ten metres apart fill a
// patch's quota from two lines, and across the lines its fit is then
// little better than linear. The extender keeps every reading of the
// weight disk (so that the blend still passes through every reading);
// beyond it, it keeps at most one reading per square of side delta
// (thinFraction × the survey's mean spacing) on a grid centred on the
// patch, the one nearest the centre, and none in squares that hold a
// reading of the weight disk. It then takes the smallest fit radius, in
// steps of extendStep up to extendMax times the base one, at which the
// patch holds localTarget readings. On evenly spread readings this
// trades crowded pairs near the patch for reach (the RMS error of the
// 100,000-reading benchmark fell from 0.052 to 0.028 mV); on lines it
// reaches one or two lines further each side (interp/BENCHMARKS.md).
type extender struct {
	delta float64
	steps int // radius steps up to extendMax (extendSteps)
	cand  []int32
	d2    []float64 // squared distance of each candidate from the centre
	sq    []int32   // square of each candidate
	stamp []int32   // per square: generation it was last written in
	best  []int32   // per square: candidate kept (its position in cand), or −1 if blocked
	gen   int32
	count [32]int
	edge  [32]float64 // squared radius of each step
}

// extendSteps is the number of radius steps up to extendMax.
func extendSteps() int {
	return min(int(math.Ceil(math.Log(extendMax)/math.Log(extendStep))), len(extender{}.count)-1)
}

// pre, when not nil, holds the readings within extendFirst·frad of the
// centre, as pointIndex.within returns them.
func (e *extender) extend(ix *pointIndex, ds *dataset, cx, cy, rad, frad float64, idx, pre []int32) ([]int32, float64) {
	if !(e.delta > 0) {
		return idx, frad
	}
	steps := e.steps
	for st, f := 0, frad; st <= steps; st, f = st+1, f*extendStep {
		e.edge[st] = f * f
	}
	stepOf := func(d2 float64) int { // smallest step whose radius reaches d
		st := 0
		for st < steps && d2 > e.edge[st] {
			st++
		}
		return st
	}
	need := localTarget
	inv := 1 / e.delta
	rad2 := rad * rad
	for _, reach := range []float64{extendFirst, extendMax} {
		r := reach * frad
		k := int(math.Ceil(r*inv)) + 1
		side := 2*k + 1
		if side*side > 1<<16 {
			return idx, frad // squares too small for this patch: keep it as it is
		}
		if len(e.stamp) < side*side {
			e.stamp, e.best = make([]int32, side*side), make([]int32, side*side)
			e.gen = 0
		}
		e.gen++
		cand := pre
		if cand == nil || reach != extendFirst {
			e.cand = ix.within(e.cand[:0], cx, cy, r)
			cand = e.cand
		}
		n := len(cand)
		if cap(e.d2) < n {
			e.d2, e.sq = make([]float64, n, 2*n), make([]int32, n, 2*n)
		}
		e.d2, e.sq = e.d2[:n], e.sq[:n]
		inner := 0
		for t, i := range cand {
			dx, dy := ds.x[i]-cx, ds.y[i]-cy
			// |dx|, |dy| ≤ r ≤ (k−1)·delta, so the conversions truncate
			// positive numbers, which is the floor.
			a, b := int(dx*inv+float64(k)), int(dy*inv+float64(k))
			c := int32(min(b, side-1)*side + min(a, side-1))
			e.d2[t], e.sq[t] = dx*dx+dy*dy, c
			if e.d2[t] <= rad2 { // the weight disk blocks its squares
				e.stamp[c], e.best[c] = e.gen, -1
				inner++
			}
		}
		for t := range cand {
			if e.d2[t] <= rad2 {
				continue
			}
			c := e.sq[t]
			switch {
			case e.stamp[c] != e.gen:
				e.stamp[c], e.best[c] = e.gen, int32(t)
			case e.best[c] >= 0 && e.d2[t] < e.d2[e.best[c]]:
				e.best[c] = int32(t)
			}
		}
		e.count = [32]int{}
		for t := range cand {
			if e.best[e.sq[t]] == int32(t) {
				e.count[stepOf(e.d2[t])]++
			}
		}
		last := reach >= extendMax
		total, upTo := inner, -1
		for st := 0; st <= steps && e.edge[st] <= r*r*(1+1e-12); st++ {
			total += e.count[st]
			if total >= need {
				upTo = st
				break
			}
		}
		if upTo < 0 && !last {
			continue
		}
		if upTo < 0 {
			upTo = steps
		}
		out := idx[:0]
		far := 0.0
		for t, i := range cand {
			if d := e.d2[t]; d <= rad2 || (e.best[e.sq[t]] == int32(t) && d <= e.edge[upTo]) {
				out = append(out, i)
				far = max(far, d)
			}
		}
		return out, max(frad, math.Sqrt(far)*(1+1e-9))
	}
	return idx, frad
}
