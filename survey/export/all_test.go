package export

import (
	"bytes"
	"context"
	"crypto/sha256"
	"encoding/hex"
	"errors"
	"image/png"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"isofield/survey/fileout"
	"isofield/survey/geo"
)

// TestAll writes every export of the fixture, then checks the safety
// rules: a second run refuses (and writes nothing) without Force, an input
// is never a target, Force replaces. It decodes the 300 dpi PNG at its
// stated size, reads the grid CSV back and checks the recorded checksums.
func TestAll(t *testing.T) {
	dir := t.TempDir()
	res, cfg := fixtureSurvey(false)
	res.Survey.Files[0].Path = filepath.Join(dir, "pad.csv")
	if err := os.WriteFile(res.Survey.Files[0].Path, []byte("input\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	// 60 dpi keeps the test fast; TestMapPNGSize ties MapPixels to the
	// decoded size and to the documented 3150 × 2250 at MapDPI.
	opt := Options{Version: "test", DPI: 60}
	paths, err := All(context.Background(), dir, res, cfg, opt)
	if err != nil {
		t.Fatal(err)
	}
	if len(paths) != 16 {
		t.Errorf("wrote %d files, want 16: %v", len(paths), paths)
	}
	checkAllFiles(t, dir)

	_, err = All(context.Background(), dir, res, cfg, opt)
	if !errors.Is(err, fileout.ErrExists) {
		t.Errorf("second export without Force: %v, want ErrExists", err)
	}
	opt.Force, opt.DPI = true, 20 // a low resolution: this run checks replacing only
	if _, err := All(context.Background(), dir, res, cfg, opt); err != nil {
		t.Errorf("export with Force: %v", err)
	}
	// An input named like an output is refused even with Force.
	res.Survey.Files[0].Path = filepath.Join(dir, FileGridCSV)
	if _, err := All(context.Background(), dir, res, cfg, opt); !errors.Is(err, fileout.ErrIsInput) {
		t.Errorf("export over an input: %v, want ErrIsInput", err)
	}
	if b, _ := os.ReadFile(filepath.Join(dir, "pad.csv")); string(b) != "input\n" {
		t.Errorf("input file changed to %q", b)
	}
}

// checkAllFiles checks the written files' content.
func checkAllFiles(t *testing.T, dir string) {
	t.Helper()
	read := func(name string) []byte {
		b, err := os.ReadFile(filepath.Join(dir, name))
		if err != nil {
			t.Fatal(err)
		}
		return b
	}
	img, err := png.Decode(bytes.NewReader(read(FileMapPNG)))
	if err != nil {
		t.Fatal(err)
	}
	if w, h := MapPixels(60); img.Bounds().Dx() != w || img.Bounds().Dy() != h {
		t.Errorf("%s is %v, stated %d×%d", FileMapPNG, img.Bounds().Size(), w, h)
	}
	gf, err := ReadGridCSV(bytes.NewReader(read(FileGridCSV)), FileGridCSV)
	if err != nil {
		t.Fatal(err)
	}
	if len(gf.Extra) == 0 || gf.Extra[0].Name != "band" {
		t.Errorf("grid csv extra columns %v, want band first", gf.Extra)
	}
	for _, name := range []string{FileContours, FileZones, FileReadings, FileInfill} {
		if ps := ValidateGeoJSON(read(name), false); len(ps) > 0 {
			t.Errorf("%s: %v", name, ps)
		}
	}
	info := string(read(FileInfo))
	for _, name := range []string{FileGridCSV, FileReport, FileCleanCSV} {
		sum := sha256.Sum256(read(name))
		if want := "output = " + name + " sha256:" + hex.EncodeToString(sum[:]); !strings.Contains(info, want) {
			t.Errorf("%s lacks %q", FileInfo, want)
		}
	}
	if !strings.Contains(info, "made_by = isofield test") {
		t.Errorf("%s does not name the version", FileInfo)
	}
}

// TestGridColumnsLatLon checks that a survey read from latitude and
// longitude gets lat_deg and lon_deg columns that map back to the nodes'
// metres through the forward transform within a millimetre.
func TestGridColumnsLatLon(t *testing.T) {
	tests := []struct {
		name       string
		geographic bool
		want       []string
	}{
		{"local metres", false, []string{"band"}},
		{"geographic", true, []string{"band", "lat_deg", "lon_deg"}},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			res, _ := fixtureSurvey(tt.geographic)
			_, extra := GridColumns(res)
			var names []string
			for _, c := range extra {
				names = append(names, c.Name)
			}
			if strings.Join(names, ",") != strings.Join(tt.want, ",") {
				t.Fatalf("extra columns %v, want %v", names, tt.want)
			}
			if !tt.geographic {
				return
			}
			p, err := geo.NewPlane(res.Survey.Geo.Lat0, res.Survey.Geo.Lon0)
			if err != nil {
				t.Fatal(err)
			}
			g := res.Grid
			for k := range g.Len() {
				e, n := p.Forward(extra[1].Values[k], extra[2].Values[k])
				x, y := g.Node(k%g.NX, k/g.NX)
				if math.Hypot(e-x, n-y) > 1e-3 {
					t.Fatalf("node %d at (%v, %v) m comes back at (%v, %v)", k, x, y, e, n)
				}
			}
		})
	}
}
