package session_test

import (
	"fmt"
	"os"
	"path/filepath"
	"time"

	"isofield/survey/session"
)

// The terminal UI excludes a reading; the next run reads the edit back.
func Example() {
	dir, err := os.MkdirTemp("", "isofield-example")
	if err != nil {
		fmt.Println(err)
		return
	}
	defer os.RemoveAll(dir)
	in := filepath.Join(dir, "deck-east.csv")

	f, err := session.Open(session.PathFor([]string{in}))
	if err != nil {
		fmt.Println(err)
		return
	}
	at := time.Date(2026, 5, 4, 10, 30, 0, 0, time.UTC)
	if err := f.Exclude(in, 12, "A7", "probe stood in a puddle", at); err != nil {
		fmt.Println(err)
		return
	}

	g, err := session.Load(f.Path())
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Println(filepath.Base(g.Path()))
	for _, e := range g.QAEdits() {
		fmt.Println(filepath.Base(e.File), e.Line, e.ID, e.Exclude, e.Reason)
	}
	// Output:
	// deck-east.csv.isofield.json
	// deck-east.csv 12 A7 true probe stood in a puddle
}
