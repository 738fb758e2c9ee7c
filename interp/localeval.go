package interp

import "math"

func (lf *localFit) Value(x, y float64) float64 {
	v, _, _ := lf.valueGrad(x, y)
	return v
}

func (lf *localFit) Gradient(x, y float64) (dx, dy float64) {
	_, dx, dy = lf.valueGrad(x, y)
	return dx, dy
}

func (lf *localFit) evalRow(y, x0, dx float64, v, gx, gy []float64, mask []bool) {
	for i := range v {
		if mask != nil && mask[i] {
			continue
		}
		v[i], gx[i], gy[i] = lf.valueGrad(x0+float64(i)*dx, y)
	}
}

// valueGrad blends the patches covering (x, y) with Shepard-normalised
// Wendland weights. With W = Σ w_j, S = Σ w_j s_j and V = S/W,
// ∇V = (Σ (s_j ∇w_j + w_j ∇s_j) − V Σ ∇w_j) / W. Where no disk covers the
// point (far outside the data) it uses the nearest patch alone.
func (lf *localFit) valueGrad(x, y float64) (val, dx, dy float64) {
	u, v := (x-lf.cx)/lf.s, (y-lf.cy)/lf.s
	cand, near := lf.cells.candidates(u, v)
	var W, Wu, Wv, S, Su, Sv float64
	for _, j := range cand {
		p := &lf.patches[j]
		du, dv := u-p.cx, v-p.cy
		r2 := du*du + dv*dv
		rad2 := p.rad * p.rad
		if r2 >= rad2 {
			continue
		}
		q := math.Sqrt(r2 / rad2)
		t := 1 - q
		t3 := t * t * t
		w := t3 * t * (4*q + 1)
		dw := -20 * t3 / rad2 // ∇w = dw · (du, dv)
		s, su, sv := lf.patchValueGrad(p, du/p.frad, dv/p.frad)
		su, sv = su/p.frad, sv/p.frad
		W += w
		Wu, Wv = Wu+dw*du, Wv+dw*dv
		S += w * s
		Su += s*dw*du + w*su
		Sv += s*dw*dv + w*sv
	}
	if W == 0 {
		p := &lf.patches[near]
		s, su, sv := lf.patchValueGrad(p, (u-p.cx)/p.frad, (v-p.cy)/p.frad)
		return s, su / (p.frad * lf.s), sv / (p.frad * lf.s)
	}
	val = S / W
	return val, (Su - val*Wu) / (W * lf.s), (Sv - val*Wv) / (W * lf.s)
}

// patchValueGrad evaluates patch p's fit at patch coordinates (u, v),
// returning the value and the gradient in patch coordinates.
func (lf *localFit) patchValueGrad(p *patch, u, v float64) (s, su, sv float64) {
	s = p.d[0] + p.d[1]*u + p.d[2]*v
	su, sv = p.d[1], p.d[2]
	b := p.b
	px, py, c := lf.px[p.lo:p.hi], lf.py[p.lo:p.hi], lf.coef[p.lo:p.hi]
	if b.k == ThinPlate {
		ks, ku, kv := tpsValueGrad(c, px, py, u, v, b.lt)
		return s + ks, su + ku, sv + kv
	}
	for i, ci := range c {
		du, dv := u-px[i], v-py[i]
		f, dr := b.phiD(du*du + dv*dv)
		s += ci * f
		su += ci * dr * du
		sv += ci * dr * dv
	}
	return s, su, sv
}
