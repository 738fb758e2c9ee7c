package qa

import (
	"fmt"
	"io"
	"math"
	"strings"

	"isofield/survey"
	"isofield/survey/electrode"
)

// How many rows the report lists before summarising the rest.
const (
	maxRepeatRows  = 40
	maxSuspectRows = 60
	maxDriftRows   = 40
	maxSteepRows   = 24
)

// WriteReport writes the plain-text QA report of r, the result of checking
// s: counts, reference conversions, current scaling, drift curve and loop
// closure, repeats and their spread, suspects with their residuals, hand
// edits, remarks and the settings used.
func WriteReport(w io.Writer, s *survey.Survey, r *Result) error {
	p := &printer{w: w, s: s, r: r, u: s.Unit.String()}
	p.header()
	p.conversions()
	p.scalings()
	p.drift()
	p.repeats()
	p.spikes()
	p.edits()
	p.remarks()
	p.settings()
	return p.err
}

// printer writes the report, keeping the first write error.
type printer struct {
	w   io.Writer
	s   *survey.Survey
	r   *Result
	u   string
	err error
}

func (p *printer) f(format string, args ...any) {
	if p.err == nil {
		_, p.err = fmt.Fprintf(p.w, format, args...)
	}
}

func (p *printer) header() {
	ok, sus, exc := p.r.Counts()
	p.f("readings: %d in %d file(s), potentials in %s\n", len(p.s.Readings), len(p.s.Files), p.u)
	for _, fi := range p.s.Files {
		p.f("  %s: %d readings\n", fi.Path, fi.Readings)
	}
	p.f("status: %d ok, %d suspect, %d excluded\n", ok, sus, exc)
}

func (p *printer) conversions() {
	p.f("\nreference electrodes\n")
	if len(p.r.Conversions) == 0 {
		p.f("  no conversion (readings used on the scale they were read)\n")
	}
	for _, c := range p.r.Conversions {
		p.f("  %v → %v: %+.4g %s added to %d readings\n    %s\n", c.From, c.To, c.Offset, p.u, c.Count, c.Source)
	}
}

func (p *printer) scalings() {
	if len(p.r.Scalings) == 0 {
		return
	}
	p.f("\ncurrent scaling (V × fault current / test current)\n")
	for _, sc := range p.r.Scalings {
		p.f("  test current %g A → fault current %g A: × %.4g on %d readings\n", sc.TestCurrent, sc.FaultCurrent, sc.Factor, sc.Count)
	}
	p.f("  caution: step and touch results hold only for the fault current, clearing time and surface\n")
	p.f("  conditions assumed; re-evaluate when they change. This tool is no safety authority: follow\n")
	p.f("  the governing standard, local codes and a licensed engineer.\n")
}

func (p *printer) drift() {
	p.f("\ndrift\n")
	d := p.r.Drift
	if d == nil {
		p.f("  no drift correction")
		if p.r.BaseProposal != "" {
			p.f("; proposed base station: %s (use --base %s)", p.r.BaseProposal, p.r.BaseProposal)
		}
		p.f("\n")
		return
	}
	axis, tunit := "time", "s"
	if !d.ByTime {
		axis, tunit = "order of readings", "reading"
	}
	p.f("  base station %s: %d readings, %v in %s\n", d.Base, len(d.Members), d.Method, axis)
	if d.TimeNote != "" {
		p.f("  %s\n", d.TimeNote)
	}
	p.f("  %12s %12s %12s\n", "t ("+tunit+")", "base ("+p.u+")", "drift ("+p.u+")")
	for k := range d.T {
		if k == maxDriftRows {
			p.f("  ... and %d more base readings\n", len(d.T)-k)
			break
		}
		p.f("  %12.6g %12.6g %+12.4g\n", d.T[k], d.B[k], d.B[k]-d.B[0])
	}
	p.f("  loop closure %+.4g %s; largest step between base readings %.4g %s\n", d.LoopClosure, p.u, d.MaxStep, p.u)
	if d.Outside > 0 {
		p.f("  %d readings before the first or after the last base reading: correction held at its end value\n", d.Outside)
	}
}

func (p *printer) repeats() {
	set := p.r.Settings
	agree := 0
	for _, g := range p.r.Repeats {
		if g.Agree {
			agree++
		}
	}
	p.f("\nrepeats: %d groups, %d agree, %d disagree (tolerance %s, same id or within %s)\n",
		len(p.r.Repeats), agree, len(p.r.Repeats)-agree, p.tol(set.RepeatTol), p.dist(set.RepeatDist))
	if len(p.r.Repeats) == 0 {
		return
	}
	p.f("  %-24s %3s %12s %12s\n", "spot", "n", "mean ("+p.u+")", "spread")
	rows := 0
	for pass := 0; pass < 2; pass++ {
		for _, g := range p.r.Repeats {
			if g.Agree != (pass == 1) {
				continue
			}
			if rows == maxRepeatRows {
				p.f("  ... and %d more groups\n", len(p.r.Repeats)-rows)
				return
			}
			rows++
			p.f("  %-24s %3d %12.6g %12.4g  %s\n", p.spot(g.Members[0]), len(g.Members), g.Mean, g.Spread, groupWord(g))
		}
	}
}

func groupWord(g RepeatGroup) string {
	w := "agree"
	if !g.Agree {
		w = "DISAGREE"
	}
	if g.Base {
		w += ", base station"
	}
	return w
}

func (p *printer) spikes() {
	set := p.r.Settings
	if set.SpikeK < 0 {
		p.f("\nspikes: spike check off\n")
		return
	}
	p.f("\nspikes: robust z beyond %.3g and residual beyond %s\n", set.SpikeK, p.tol(set.RepeatTol))
	p.f("  each limit is raised by the reading's curvature allowance, about curvature × spacing² from\n")
	p.f("  a least-squares quadratic through its 12 nearest readings without it, so that a real peak\n")
	p.f("  sampled coarsely (as over an injection electrode) is not marked\n")
	if fi := p.r.Fit; fi != nil {
		method := "global"
		if fi.Patches > 0 {
			method = fmt.Sprintf("local, %d patches", fi.Patches)
		}
		rms := "not computed"
		if !math.IsNaN(fi.LOORMS) {
			rms = fmt.Sprintf("%.4g %s", fi.LOORMS, p.u)
		}
		p.f("  fit: %v (%s), leave-one-out RMS %s; scale 1.4826 MAD = %.4g %s\n",
			fi.Kernel, method, rms, p.r.SpikeScale, p.u)
	}
	p.steep()
	if len(p.r.Suspects) == 0 {
		p.f("  no lone spikes\n")
		return
	}
	p.f("  %-24s %12s %12s %8s\n", "reading", "value", "residual", "z")
	for k, sp := range p.r.Suspects {
		if k == maxSuspectRows {
			p.f("  ... and %d more (isofield clean lists every reading)\n", len(p.r.Suspects)-k)
			break
		}
		p.f("  %-24s %12.6g %+12.4g %8s\n", p.spot(sp.Reading), p.r.Corrected[sp.Reading], sp.Residual, zText(sp.Z))
	}
}

// steep summarises the readings that disagree with the fit together.
func (p *printer) steep() {
	if len(p.r.Steep) == 0 {
		return
	}
	p.f("  %d readings disagree with the fit together with a neighbour (not marked: features finer\n", len(p.r.Steep))
	p.f("  than the reading spacing; consider readings in between):")
	for k, i := range p.r.Steep {
		if k == maxSteepRows {
			p.f(" ... and %d more", len(p.r.Steep)-k)
			break
		}
		if k%4 == 0 {
			p.f("\n   ")
		}
		p.f(" %s", p.spot(i))
	}
	p.f("\n")
}

// zText prints a robust z, capping it at ±999 (a scale of zero, from
// readings the fit follows exactly, gives an infinite z).
func zText(z float64) string {
	switch {
	case z > 999:
		return ">+999"
	case z < -999:
		return "<-999"
	}
	return fmt.Sprintf("%+.1f", z)
}

func (p *printer) edits() {
	var rows []Step
	for _, st := range p.r.Log {
		if st.Kind == KindExclude || st.Kind == KindInclude {
			rows = append(rows, st)
		}
	}
	if len(rows) == 0 {
		return
	}
	p.f("\nhand edits\n")
	for _, st := range rows {
		p.f("  %-24s %s\n", p.spot(st.Reading), st.Reason)
	}
}

func (p *printer) remarks() {
	if len(p.r.Remarks) == 0 {
		return
	}
	p.f("\nremarks\n")
	for _, m := range p.r.Remarks {
		p.f("  - %s\n", m)
	}
}

func (p *printer) settings() {
	s := p.r.Settings
	base := s.Base
	if base == "" {
		base = "none"
		if s.AutoBase {
			base = "automatic"
		}
	}
	p.f("\nsettings: from-ref %s, to-ref %s, repeat-tol %s, repeat-dist %s, base %s, drift %v, spike-k %.3g, test-current %s, fault-current %s\n",
		refName(s.From), refName(s.To), p.tol(s.RepeatTol), p.dist(s.RepeatDist), base, s.Drift, s.SpikeK,
		amps(s.TestCurrent), amps(s.FaultCurrent))
}

func refName(r electrode.Reference) string { return r.String() }

func amps(a float64) string {
	if a == 0 {
		return "none"
	}
	return fmt.Sprintf("%g A", a)
}

func (p *printer) tol(t float64) string {
	if t < 0 {
		return "off"
	}
	return fmt.Sprintf("%g %s", roundSig(t), p.u)
}

func (p *printer) dist(d float64) string {
	if d < 0 {
		return "off (ids only)"
	}
	return fmt.Sprintf("%g m", d)
}

// roundSig rounds to 9 significant digits, hiding float noise such as
// 0.010000000000000002.
func roundSig(v float64) float64 {
	if v == 0 || math.IsInf(v, 0) || math.IsNaN(v) {
		return v
	}
	e := math.Pow(10, 8-math.Floor(math.Log10(math.Abs(v))))
	return math.Round(v*e) / e
}

// spot names reading i as "file:line id".
func (p *printer) spot(i int) string {
	return ReadingName(p.s, i)
}

// ReadingName names reading i of s as "file:line id" (file by its base
// name) for reports and logs.
func ReadingName(s *survey.Survey, i int) string {
	if i < 0 || i >= len(s.Readings) {
		return "survey"
	}
	rd := s.Readings[i]
	name := "?"
	if rd.File >= 0 && rd.File < len(s.Files) {
		name = baseName(s.Files[rd.File].Path)
	}
	out := fmt.Sprintf("%s:%d", name, rd.Line0)
	if rd.ID != "" {
		out += " " + rd.ID
	}
	return out
}

func baseName(path string) string {
	if k := strings.LastIndexAny(path, `/\`); k >= 0 {
		return path[k+1:]
	}
	return path
}

// WriteLog writes every step of r's log, one line each, in the order the
// steps were taken.
func WriteLog(w io.Writer, s *survey.Survey, r *Result) error {
	for _, st := range r.Log {
		var err error
		switch {
		case st.Reading < 0:
			_, err = fmt.Fprintf(w, "survey: %s\n", st.Reason)
		case st.Was != st.Now || st.Before == st.After:
			_, err = fmt.Fprintf(w, "%s: %s → %s: %s\n", ReadingName(s, st.Reading), st.Was, st.Now, st.Reason)
		default:
			_, err = fmt.Fprintf(w, "%s: %.6g → %.6g %s: %s\n", ReadingName(s, st.Reading), st.Before, st.After, s.Unit, st.Reason)
		}
		if err != nil {
			return err
		}
	}
	return nil
}
