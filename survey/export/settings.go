package export

import (
	"fmt"
	"strings"
	"time"

	"isofield/interp"
	"isofield/survey/pipeline"
)

// Options control what All and the single writers put into the outputs.
type Options struct {
	// Version is the isofield version written into every output.
	Version string
	// Title overrides the survey's name in titles.
	Title string
	// Made is the time stamp shown in outputs; the zero time leaves it out.
	Made time.Time
	// Settings are shown after the ones SettingsOf derives from the
	// configuration (for example a session file's name).
	Settings []Setting
	// Force allows replacing existing files.
	Force bool
	// Inputs are files never to be written, besides the survey's own files.
	Inputs []string
	// DPI is the resolution of PNG maps (0: MapDPI).
	DPI int
}

// SettingsOf describes the configuration that made res, with what the fit
// actually chose where a setting was automatic.
func SettingsOf(cfg pipeline.Config, res *pipeline.Result) []Setting {
	var ss []Setting
	add := func(name, value string) { ss = append(ss, Setting{Name: name, Value: value}) }
	preset := cfg.Criteria.Preset
	if preset == "" {
		preset = "generic"
	}
	add("preset", preset)
	unit := "U"
	if res != nil && res.Survey != nil {
		unit = res.Survey.Unit.String()
	}
	switch t := cfg.Criteria.FieldThreshold; {
	case t > 0:
		add("field threshold", fmtNum(t)+" "+unit+"/m")
	case t == 0:
		add("field threshold", "preset default")
	default:
		add("field threshold", "none")
	}
	if res != nil && res.Model != nil {
		info := res.Model.Info()
		add("kernel", info.Kernel.String())
		add("method", methodName(info.Method, info.Patches))
		add("smoothing", choice(cfg.Fit.AutoSmoothing, fmt.Sprintf("%.4g", info.Smoothing)))
		if info.Kernel.HasShape() {
			add("shape", choice(cfg.Fit.AutoShape, fmt.Sprintf("%.4g", info.Shape)))
		}
		if info.LOORMS == info.LOORMS {
			add("leave-one-out RMS", fmt.Sprintf("%.4g", info.LOORMS))
		}
	}
	if res != nil && res.Grid != nil {
		g := res.Grid
		add("grid", fmt.Sprintf("%d × %d nodes at %s m", g.NX, g.NY, fmtNum(g.DX)))
	}
	mask := maskText(cfg.MaskDistance)
	if res != nil && cfg.MaskDistance == 0 && res.MaskDistance > 0 {
		mask = fmtNum(res.MaskDistance) + " m (automatic)"
	}
	add("mask distance", mask)
	add("outline", outlineText(cfg.Outline, res))
	add("suspect readings gridded", yesNo(cfg.UseSuspects))
	return ss
}

func methodName(m interp.Method, patches int) string {
	if m == interp.Local {
		return fmt.Sprintf("partition of unity (%d patches)", patches)
	}
	return "global"
}

func choice(auto bool, v string) string {
	if auto {
		return v + " (chosen by leave-one-out)"
	}
	return v
}

func maskText(d float64) string {
	switch {
	case d < 0:
		return "none"
	case d == 0:
		return "automatic"
	}
	return fmtNum(d) + " m"
}

// outlineText describes the outline mask: "none", or the convex hull with
// the margin the run used.
func outlineText(o pipeline.Outline, res *pipeline.Result) string {
	switch {
	case o != pipeline.OutlineHull:
		return o.String()
	case res != nil && res.OutlineMargin > 0:
		return fmt.Sprintf("convex hull + %.3g m", res.OutlineMargin)
	}
	return "convex hull"
}

func yesNo(b bool) string {
	if b {
		return "yes"
	}
	return "no"
}

// settingsLine writes the settings on one line, "name=value; ...", for the
// headers of text outputs.
func settingsLine(ss []Setting) string {
	parts := make([]string, len(ss))
	for i, s := range ss {
		parts[i] = s.Name + "=" + s.Value
	}
	return strings.Join(parts, "; ")
}
