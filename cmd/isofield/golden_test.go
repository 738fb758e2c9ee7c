package main

import (
	"flag"
	"os"
	"path/filepath"
	"testing"
)

// update rewrites golden files: go test ./cmd/isofield -update
var update = flag.Bool("update", false, "rewrite the golden files in testdata/")

// golden compares got with testdata/name, or rewrites it with -update.
func golden(t *testing.T, name, got string) {
	t.Helper()
	path := filepath.Join("testdata", name)
	if *update {
		if err := os.WriteFile(path, []byte(got), 0o644); err != nil {
			t.Fatal(err)
		}
		return
	}
	want, err := os.ReadFile(path)
	if err != nil {
		t.Fatalf("%v (run go test ./cmd/isofield -update to create it)", err)
	}
	if got != string(want) {
		t.Errorf("output differs from %s (-update rewrites it):\n--- got\n%s\n--- want\n%s", path, got, want)
	}
}
