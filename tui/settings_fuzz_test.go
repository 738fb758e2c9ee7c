package tui

import (
	"testing"

	"isofield/survey/pipeline"
)

// FuzzSettingValue types arbitrary text into every setting of every
// preset: nothing may panic, and a value the form accepts must read back
// as text that the form accepts again with the same result.
func FuzzSettingValue(f *testing.F) {
	for _, s := range []string{"", "0", "25", "-3", "1,5", "auto", "AUTO", "none", "1e400", "NaN", "inf", "70", "yes", "thin-plate", "x"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, v string) {
		for _, s := range allSettings() {
			var c pipeline.Config
			if err := s.set(&c, v); err != nil {
				continue
			}
			again := c
			again.Criteria = cloneCriteria(c.Criteria)
			if err := s.set(&again, s.get(&c)); err != nil {
				t.Fatalf("%s: %q accepted, but its read-back %q is not: %v", s.label, v, s.get(&c), err)
			}
			if s.get(&again) != s.get(&c) {
				t.Fatalf("%s: %q reads back as %q, then %q", s.label, v, s.get(&c), s.get(&again))
			}
		}
	})
}
