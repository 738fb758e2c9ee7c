package criteria

import (
	"fmt"
	"strings"
)

// Cautions returns the cautions to show with every result of the preset
// (FIELD_FACTS §7, in our own words). The first two apply to every preset.
func Cautions(preset string) []string {
	cs := []string{
		"isofield evaluates measurements. It is no safety authority and replaces neither the governing standard, local codes and regulations, the asset owner's rules, nor the judgement of a qualified or licensed engineer.",
		"Results are for people experienced in the trade (ASTM C876-22a §4.8), read together with other evidence.",
	}
	storm := "Stop fieldwork in thunderstorms; long leads near power lines can carry induced voltage."
	switch strings.ToLower(preset) {
	case Grounding:
		cs = append(cs,
			"Never enter a substation or switchyard or connect to a grounding system without the owner's authorisation and switching; keep clear of live apparatus.",
			"During current injection treat the leads, the remote electrode and its surroundings as energised; keep people and animals away and touch nothing while current flows. A real fault during the test can raise the grid to a dangerous voltage.",
			"Step and touch results hold only for the fault current, clearing time and surface conditions assumed; evaluate them again when any of these change.",
			storm)
	case SP, CP:
		cs = append(cs, storm)
	}
	return append(cs, "Every threshold names its source and the electrode scale it assumes; numbers not confirmed in their source are marked as from memory.")
}

// conditions maps each concrete condition name to why it voids the C876
// bands (ASTM C876 App. X1, from memory in FIELD_FACTS §2).
func conditions() [][2]string {
	return [][2]string{
		{"coated", "coated or epoxy-coated bars"},
		{"galvanised", "galvanised bars"},
		{"cp", "a cathodically protected structure"},
		{"wet", "very wet or saturated concrete"},
		{"dry", "very dry concrete"},
		{"carbonated", "carbonated concrete at the bar depth"},
	}
}

// ConditionNames lists the concrete conditions Settings.Conditions accepts.
func ConditionNames() []string {
	var ns []string
	for _, c := range conditions() {
		ns = append(ns, c[0])
	}
	return ns
}

func conditionText(name string) (string, bool) {
	for _, c := range conditions() {
		if strings.EqualFold(c[0], name) {
			return c[1], true
		}
	}
	return "", false
}

// concreteWarnings lists where cover or conditions void or blur the bands.
func concreteWarnings(set Settings) []string {
	var ws []string
	for _, c := range set.Conditions {
		if t, ok := conditionText(c); ok {
			ws = append(ws, "the ASTM C876 bands do not apply to "+t+" (C876 App. X1, from memory): read the map for relative differences only")
		}
	}
	if set.CoverMM > DefaultCoverLimitMM {
		ws = append(ws, fmt.Sprintf("cover of %g mm exceeds %g mm: local differences blur (ASTM C876-15 §4.2)", set.CoverMM, DefaultCoverLimitMM))
	}
	return append(ws, "interpretation belongs to an engineer experienced in concrete corrosion, with chloride, carbonation and delamination data (ASTM C876-22a §4.8)")
}
