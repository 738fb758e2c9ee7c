package export

import (
	"image/color"
	"math"
)

// The map palettes are isofield's own. Both are ordered in lightness, so
// they survive grey-scale printing and the common colour-vision
// deficiencies: the diverging one runs from a dark blue through an off-white
// to a dark brown-orange (signed surveys, zero in the middle); the
// sequential one from a pale cream through amber and brick to a dark plum
// (one-signed surveys and the field magnitude).
var (
	divergingAnchors = []color.RGBA{
		{0x1f, 0x3f, 0x73, 0xff}, {0x5b, 0x86, 0xb5, 0xff}, {0xb9, 0xd0, 0xe3, 0xff},
		{0xf5, 0xf3, 0xea, 0xff},
		{0xef, 0xc3, 0x8e, 0xff}, {0xc9, 0x7b, 0x35, 0xff}, {0x7a, 0x3e, 0x0c, 0xff},
	}
	sequentialAnchors = []color.RGBA{
		{0xfb, 0xf6, 0xe0, 0xff}, {0xf1, 0xc8, 0x5a, 0xff}, {0xd6, 0x6a, 0x3c, 0xff},
		{0x9b, 0x2f, 0x4a, 0xff}, {0x4a, 0x1a, 0x4f, 0xff},
	}
)

// ramp returns the colour at t in [0, 1] along the anchors, linear in sRGB
// between neighbouring anchors.
func ramp(anchors []color.RGBA, t float64) color.RGBA {
	t = math.Max(0, math.Min(1, t))
	f := t * float64(len(anchors)-1)
	i := min(int(f), len(anchors)-2)
	u := f - float64(i)
	a, b := anchors[i], anchors[i+1]
	mix := func(x, y uint8) uint8 { return uint8(math.Round(float64(x)*(1-u) + float64(y)*u)) }
	return color.RGBA{mix(a.R, b.R), mix(a.G, b.G), mix(a.B, b.B), 0xff}
}

// bandColours returns one colour per band of the increasing levels (band b
// holds values v with levels[b-1] <= v < levels[b]). Ranges that cross
// zero get the diverging palette with zero at its middle; others the
// sequential one.
func bandColours(levels []float64, interval float64, forceSequential bool) []color.RGBA {
	n := len(levels) + 1
	mids := make([]float64, n)
	for b := range n {
		switch {
		case len(levels) == 0:
			mids[b] = 0
		case b == 0:
			mids[b] = levels[0] - interval/2
		case b == n-1:
			mids[b] = levels[n-2] + interval/2
		default:
			mids[b] = (levels[b-1] + levels[b]) / 2
		}
	}
	cs := make([]color.RGBA, n)
	signed := !forceSequential && mids[0] < 0 && mids[n-1] > 0
	span := math.Max(math.Abs(mids[0]), math.Abs(mids[n-1]))
	for b := range n {
		if signed {
			cs[b] = ramp(divergingAnchors, 0.5+0.5*mids[b]/span)
		} else {
			cs[b] = ramp(sequentialAnchors, (float64(b)+0.5)/float64(n))
		}
	}
	return cs
}
