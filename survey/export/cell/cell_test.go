package cell

import "testing"

// TestNeutral follows the OWASP guidance on CSV injection (from memory):
// cells starting with =, +, - or @ (and tab or carriage return) are
// prefixed with an apostrophe, while plain numbers stay numbers.
func TestNeutral(t *testing.T) {
	tests := []struct{ name, in, want string }{
		{"empty", "", ""},
		{"plain text", "probe slipped", "probe slipped"},
		{"formula", "=SUM(A1:A9)", "'=SUM(A1:A9)"},
		{"plus formula", "+cmd|' /C calc'!A0", "'+cmd|' /C calc'!A0"},
		{"minus text", "-re-read", "'-re-read"},
		{"at sign", "@SUM(1)", "'@SUM(1)"},
		{"tab first", "\t=1", "'\t=1"},
		{"carriage return first", "\r=1", "'\r=1"},
		{"negative number", "-350.2", "-350.2"},
		{"positive number", "+12", "+12"},
		{"exponent", "-1.5e-3", "-1.5e-3"},
		{"exponent sign only", "-1e", "'-1e"},
		{"two points", "-1.2.3", "'-1.2.3"},
		{"sign alone", "-", "'-"},
		{"minus then formula", "-1+2", "'-1+2"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			if got := Neutral(tt.in); got != tt.want {
				t.Errorf("Neutral(%q) = %q, want %q", tt.in, got, tt.want)
			}
		})
	}
}

// FuzzNeutral: the result never starts with a trigger unless it is a
// plain number, and neutralising twice changes nothing more.
func FuzzNeutral(f *testing.F) {
	for _, s := range []string{"", "=1", "-350.2", "@x", "+", "-1e5", "abc"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		got := Neutral(s)
		if got != "" && (got[0] == '=' || got[0] == '@' || got[0] == '\t' || got[0] == '\r') {
			t.Fatalf("Neutral(%q) = %q starts with a trigger", s, got)
		}
		if (got != "" && (got[0] == '+' || got[0] == '-')) && !isPlainNumber(got) {
			t.Fatalf("Neutral(%q) = %q starts with a sign but is no number", s, got)
		}
		if again := Neutral(got); again != got {
			t.Fatalf("Neutral is not idempotent: %q -> %q -> %q", s, got, again)
		}
	})
}
