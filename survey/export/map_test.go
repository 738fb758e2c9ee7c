package export

import (
	"bytes"
	"image/png"
	"strings"
	"testing"
)

func TestMapSVGGolden(t *testing.T) {
	b := fixtureBundle(t, false)
	for _, tt := range []struct {
		name string
		kind MapKind
	}{{"map_potential.svg", PotentialMap}, {"map_field.svg", FieldMap}} {
		t.Run(tt.name, func(t *testing.T) {
			var buf bytes.Buffer
			if err := b.WriteMapSVG(&buf, tt.kind); err != nil {
				t.Fatal(err)
			}
			var again bytes.Buffer
			if err := fixtureBundle(t, false).WriteMapSVG(&again, tt.kind); err != nil {
				t.Fatal(err)
			}
			if !bytes.Equal(buf.Bytes(), again.Bytes()) {
				t.Fatal("two renderings of the same bundle differ")
			}
			for _, want := range []string{b.Title, "made by isofield test", "0", " m", "N", "<image"} {
				if !strings.Contains(buf.String(), want) {
					t.Errorf("svg lacks %q", want)
				}
			}
			golden(t, tt.name, buf.Bytes())
		})
	}
}

// TestMapPNGSize decodes the PNG with image/png and checks the stated size.
func TestMapPNGSize(t *testing.T) {
	if testing.Short() {
		t.Skip("renders several maps; run without -short")
	}
	b := fixtureBundle(t, false)
	for _, dpi := range []int{33, 96} { // 10.5 in × 33 = 346.5 px: rounding shows
		var buf bytes.Buffer
		if err := b.WriteMapPNG(&buf, FieldMap, dpi); err != nil {
			t.Fatal(err)
		}
		img, err := png.Decode(&buf)
		if err != nil {
			t.Fatal(err)
		}
		w, h := MapPixels(dpi)
		if got := img.Bounds().Size(); got.X != w || got.Y != h {
			t.Errorf("PNG at %d dpi is %v, stated %d×%d", dpi, got, w, h)
		}
	}
	if w, h := MapPixels(0); w != 3150 || h != 2250 {
		t.Errorf("MapPixels(0) = %d×%d, documented 3150×2250", w, h)
	}
}

func BenchmarkMap(b *testing.B) {
	bd := fixtureBundle(b, false)
	b.Run("svg", func(b *testing.B) {
		for b.Loop() {
			bd.svg = nil // draw again rather than reuse the kept drawing
			var buf bytes.Buffer
			if err := bd.WriteMapSVG(&buf, PotentialMap); err != nil {
				b.Fatal(err)
			}
		}
	})
	b.Run("png-300dpi", func(b *testing.B) {
		for b.Loop() {
			var buf bytes.Buffer
			if err := bd.WriteMapPNG(&buf, PotentialMap, MapDPI); err != nil {
				b.Fatal(err)
			}
		}
	})
}
