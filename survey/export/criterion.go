package export

import "fmt"

// CriterionLines says in words what flags a node, one rule a line, with the
// thresholds in effect and where they come from. It is empty when nothing
// is flagged by any rule.
func (b *Bundle) CriterionLines() []string {
	c := b.Criterion
	var out []string
	if b.FieldThreshold > 0 {
		s := fmt.Sprintf("field |E| ≥ %.6g %s/m", b.FieldThreshold, b.Unit)
		if c != nil && c.FieldLabel != "" {
			s += " (" + c.FieldLabel + ")"
		}
		out = append(out, s)
	}
	if c == nil {
		return out
	}
	if c.HasBelow {
		out = append(out, c.BelowLabel)
	}
	if c.HasAbove {
		out = append(out, c.AboveLabel)
	}
	if c.Step {
		out = append(out, fmt.Sprintf("step voltage above the tolerable %.6g %s", c.StepLimit, b.Unit))
	}
	if c.Touch {
		out = append(out, fmt.Sprintf("touch voltage above the tolerable %.6g %s", c.TouchLimit, b.Unit))
	}
	return out
}

// presetTitle names the preset in words.
func (b *Bundle) presetTitle() string {
	if b.Criterion == nil {
		return "none"
	}
	if b.Criterion.Title != "" {
		return b.Criterion.Title
	}
	return b.Criterion.Preset
}
