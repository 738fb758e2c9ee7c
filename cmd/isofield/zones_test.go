package main

import (
	"encoding/csv"
	"encoding/json"
	"math"
	"os"
	"path/filepath"
	"slices"
	"strconv"
	"strings"
	"testing"
)

// zonesSmall is a fictional half-cell survey: 99 readings on a 2 m lattice,
// V = −150 − 350·exp(−r²/(2·3.5²)) mV CSE around (9.2, 7.4), rounded to
// 0.1 mV. Its field peaks at 350/3.5·e^{−½} = 60.65 mV/m on the circle
// r = 3.5 m (closed form of the Gaussian).
const zonesSmall = "testdata/zones_small.csv"

// smallArgs keeps the checks from setting readings aside, so that the
// tables follow the survey and the interpolant alone.
var smallArgs = []string{"--use-suspects"}

func TestZonesTableGolden(t *testing.T) {
	tests := []struct {
		name, golden string
		args         []string
	}{
		{"concrete with gradient", "zones_concrete.golden", []string{"--preset", "concrete", "--threshold", "50"}},
		{"generic limits", "zones_generic.golden", []string{"--below", "-400", "--above", "-160"}},
		{"grounding cautions", "zones_grounding.golden", []string{"--preset", "grounding", "--soil-rho", "100"}},
		{"grounding at fault", "zones_grounding_fault.golden", []string{"--preset", "grounding", "--soil-rho", "100",
			"--test-current", "1", "--fault-current", "5000", "--gpr", "-2500000", "--structure", "8,6;12,6"}},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			args := append(append(append([]string{"zones"}, smallArgs...), tt.args...), zonesSmall)
			code, out, errs := runArgs(args...)
			if code != 0 {
				t.Fatalf("isofield %v exit %d: %s", args, code, errs)
			}
			golden(t, tt.golden, out)
		})
	}
}

// TestZonesJSON checks the JSON document against the survey: the zone
// below −350 mV must hold exactly the readings whose value is below −350
// mV (each reading sits on a grid node, where the interpolant reproduces
// it), and the field zone's peak must match the closed form 60.65 mV/m.
func TestZonesJSON(t *testing.T) {
	args := append(append([]string{"zones", "--json"}, smallArgs...), "--preset", "concrete", "--threshold", "50", zonesSmall)
	code, out, errs := runArgs(args...)
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	var doc struct {
		Unit  string
		Zones []struct {
			Quantity string
			AreaM2   float64 `json:"area_m2"`
			Centroid struct{ X, Y float64 }
			Peak     struct{ Value, X, Y float64 }
			Readings []struct {
				ID    string
				Line  int
				Value float64
			}
		}
		Cautions []string
	}
	if err := json.Unmarshal([]byte(out), &doc); err != nil {
		t.Fatalf("zones --json is not JSON: %v\n%s", err, out)
	}
	if doc.Unit != "mV" || len(doc.Zones) != 2 || len(doc.Cautions) == 0 {
		t.Fatalf("document unit %q, %d zones, %d cautions; want mV, 2, some", doc.Unit, len(doc.Zones), len(doc.Cautions))
	}
	below := readingsBelow(t, -350)
	for _, z := range doc.Zones {
		if z.AreaM2 <= 0 || math.Hypot(z.Centroid.X-9.2, z.Centroid.Y-7.4) > 0.2 {
			t.Errorf("%s zone: area %g, centroid %+v; want positive, near (9.2, 7.4)", z.Quantity, z.AreaM2, z.Centroid)
		}
		switch z.Quantity {
		case "potential":
			var ids []string
			for _, r := range z.Readings {
				ids = append(ids, r.ID)
				if r.Line < 2 {
					t.Errorf("reading %s without its line", r.ID)
				}
			}
			slices.Sort(ids)
			if strings.Join(ids, " ") != strings.Join(below, " ") {
				t.Errorf("readings in the zone below −350 mV: %v, want %v", ids, below)
			}
		case "field":
			if math.Abs(z.Peak.Value-60.65) > 0.6 {
				t.Errorf("field peak %g mV/m, closed form 60.65 mV/m (±1 %%)", z.Peak.Value)
			}
		}
	}
}

// readingsBelow lists, sorted, the ids of zonesSmall's readings below v.
func readingsBelow(t *testing.T, v float64) []string {
	t.Helper()
	rows := readCSV(t, zonesSmall)
	var ids []string
	for _, r := range rows[1:] {
		if x, _ := strconv.ParseFloat(r[3], 64); x < v {
			ids = append(ids, r[0])
		}
	}
	slices.Sort(ids)
	return ids
}

func TestSuggestCommand(t *testing.T) {
	dir := t.TempDir()
	out := filepath.Join(dir, "stakeout.csv")
	args := append(append([]string{"suggest", "-n", "4", "-o", out}, smallArgs...), zonesSmall)
	code, stdout, errs := runArgs(args...)
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	golden(t, "suggest_small.golden", stdout)
	f, err := os.Open(out)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	rows, err := csv.NewReader(f).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	if len(rows) != 5 || strings.Join(rows[0], ",") != "id,x_m,y_m,score,why" || rows[1][0] != "S01" {
		t.Errorf("stake-out file %v, want a header and S01..S04", rows)
	}
	if code, _, errs := runArgs(args...); code != exitInput || !strings.Contains(errs, "exists") {
		t.Errorf("second write without --force: exit %d, %q; want refusal", code, errs)
	}
	in := filepath.Join(dir, "in.csv")
	data, _ := os.ReadFile(zonesSmall)
	if err := os.WriteFile(in, data, 0o644); err != nil {
		t.Fatal(err)
	}
	if code, _, errs := runArgs("suggest", "--force", "-o", in, in); code != exitInput || !strings.Contains(errs, "input") {
		t.Errorf("writing over the input: exit %d, %q; want refusal", code, errs)
	}
	if after, _ := os.ReadFile(in); string(after) != string(data) {
		t.Errorf("the input file was modified")
	}
}

func TestCriteriaFlagErrors(t *testing.T) {
	tests := []struct {
		name string
		args []string
		has  string
	}{
		{"unknown preset", []string{"zones", "--preset", "bridge", "a.csv"}, "unknown preset"},
		{"bad structure", []string{"zones", "--structure", "1,2;3", "a.csv"}, "want X,Y"},
		{"bad condition", []string{"zones", "--condition", "rusty", "a.csv"}, "unknown concrete condition"},
		{"bad below", []string{"zones", "--below", "NaN", "a.csv"}, "not a finite number"},
		{"suggest none", []string{"suggest", "-n", "0", "a.csv"}, "-n 0"},
		{"zones no file", []string{"zones"}, "no input file"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			code, _, errs := runArgs(tt.args...)
			if code != exitUsage || !strings.Contains(errs, tt.has) {
				t.Errorf("isofield %v: exit %d, stderr %q; want %d and %q", tt.args, code, errs, exitUsage, tt.has)
			}
		})
	}
}
