package electrode

import (
	"fmt"
	"strings"
)

// aliases maps spellings, reduced by key, to electrodes. Plain "Ag/AgCl"
// means the saturated-KCl electrode; seawater electrodes must be named
// as such (agcl-sw), because their offset differs by about 50 mV.
func aliases() map[string]Reference {
	m := map[string]Reference{}
	add := func(r Reference, names ...string) {
		for _, n := range names {
			m[key(n)] = r
		}
	}
	add(CSE, "cse", "cu/cuso4", "cuso4", "copper/copper-sulfate", "copper/copper-sulphate",
		"copper-sulfate", "copper-sulphate", "cu/cuso4 sat")
	add(AgAgClSatKCl, "agcl-kcl-sat", "ag/agcl", "agcl", "ag/agcl sat kcl", "agcl sat kcl",
		"ag/agcl sat", "agcl-sat", "silver/silver-chloride")
	add(AgAgCl35KCl, "agcl-3.5m", "ag/agcl 3.5m", "agcl 3.5m kcl", "ag/agcl 3.5m kcl")
	add(AgAgClSeawater, "agcl-sw", "ag/agcl-sw", "agcl-seawater", "ag/agcl seawater",
		"ag/agcl/seawater")
	add(SCE, "sce", "calomel", "saturated calomel", "hg/hg2cl2")
	add(Zinc, "zn", "zinc")
	add(SHE, "she", "hydrogen", "standard hydrogen")
	return m
}

// key reduces a spelling to lower-case letters and digits, keeping a dot
// only between two digits ("3.5").
func key(s string) string {
	rs := []rune(strings.ToLower(s))
	var b strings.Builder
	for i, c := range rs {
		switch {
		case c >= 'a' && c <= 'z', c >= '0' && c <= '9':
			b.WriteRune(c)
		case c == '.' && i > 0 && i+1 < len(rs) && isDigit(rs[i-1]) && isDigit(rs[i+1]):
			b.WriteRune(c)
		}
	}
	return b.String()
}

func isDigit(c rune) bool { return c >= '0' && c <= '9' }

// ParseReference reads a reference electrode's name in any common spelling,
// ignoring case, spaces and the separators / - _ ( ): "cse", "Cu/CuSO4",
// "Ag/AgCl" (saturated KCl), "agcl-kcl-sat", "agcl-3.5m", "agcl-sw", "SCE",
// "zn", "she" and the longer names. An empty string (or only separators)
// is None. An unknown name is an error wrapping ErrUnknown that lists the
// known names.
func ParseReference(s string) (Reference, error) {
	k := key(s)
	if k == "" {
		return None, nil
	}
	if r, ok := aliases()[k]; ok {
		return r, nil
	}
	return None, fmt.Errorf("%w %q (known: %s)", ErrUnknown, s, strings.Join(Names(), ", "))
}
