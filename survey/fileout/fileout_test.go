package fileout

import (
	"errors"
	"io"
	"os"
	"path/filepath"
	"testing"
)

func TestWrite(t *testing.T) {
	dir := t.TempDir()
	in := filepath.Join(dir, "in.csv")
	if err := os.WriteFile(in, []byte("x,y,v\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	out := filepath.Join(dir, "out.csv")
	failing := errors.New("boom")
	tests := []struct {
		name    string
		path    string
		opt     Options
		write   string
		fail    bool
		wantErr error
		want    string // content of path afterwards
	}{
		{name: "new file", path: out, write: "a", want: "a"},
		{name: "exists without force", path: out, write: "b", wantErr: ErrExists, want: "a"},
		{name: "exists with force", path: out, opt: Options{Force: true}, write: "c", want: "c"},
		{name: "failed write keeps old", path: out, opt: Options{Force: true}, fail: true, wantErr: failing, want: "c"},
		{name: "input refused", path: in, opt: Options{Force: true, Inputs: []string{in}}, write: "x", wantErr: ErrIsInput, want: "x,y,v\n"},
		{name: "input refused by other spelling", path: filepath.Join(dir, ".", "in.csv"), opt: Options{Force: true, Inputs: []string{in}}, write: "x", wantErr: ErrIsInput, want: "x,y,v\n"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			err := Write(tt.path, tt.opt, func(w io.Writer) error {
				if _, err := io.WriteString(w, tt.write); err != nil {
					return err
				}
				if tt.fail {
					return failing
				}
				return nil
			})
			if !errors.Is(err, tt.wantErr) {
				t.Fatalf("Write(%q) error = %v, want %v", tt.path, err, tt.wantErr)
			}
			got, _ := os.ReadFile(tt.path)
			if string(got) != tt.want {
				t.Errorf("after Write(%q) content = %q, want %q", tt.path, got, tt.want)
			}
		})
	}
	ents, _ := os.ReadDir(dir)
	if len(ents) != 2 {
		t.Errorf("temporary files left behind: %v", ents)
	}
}
