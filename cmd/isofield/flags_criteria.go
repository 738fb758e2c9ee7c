package main

import (
	"flag"

	"isofield/survey/criteria"
)

// TEMPORARY: filled in by the analysis work. addCriteriaFlags registers the
// preset and threshold flags shared by grid, zones, suggest, export, report
// and view. It must register --threshold (field, U per metre) and --preset.
func addCriteriaFlags(fs *flag.FlagSet, s *criteria.Settings) {
	fs.Float64Var(&s.FieldThreshold, "threshold", 0, "flag nodes whose field reaches `FIELD` (potential unit per metre)")
}
