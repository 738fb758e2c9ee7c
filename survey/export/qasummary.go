package export

import (
	"fmt"

	"isofield/survey"
	"isofield/survey/qa"
)

// summariseQA counts statuses and logged steps and lists the readings that
// are not ok.
func summariseQA(s *survey.Survey, q *qa.Result, ms []Mark) QASummary {
	sum := QASummary{Counts: map[string]int{"ok": 0, "suspect": 0, "excluded": 0}}
	for _, m := range ms {
		sum.Counts[m.Status]++
		if m.Status != "ok" {
			sum.Items = append(sum.Items, m)
		}
	}
	if q == nil {
		return sum
	}
	sum.Steps = countKinds(q.Log)
	sum.Lines = append(sum.Lines, repeatLines(q, s.Unit.String())...)
	sum.Lines = append(sum.Lines, driftLines(q.Drift, s.Unit.String())...)
	for _, c := range q.Conversions {
		sum.Lines = append(sum.Lines, fmt.Sprintf("reference: %d readings converted from %v to %v (offset %+.4g %s; %s)",
			c.Count, c.From, c.To, c.Offset, s.Unit, c.Source))
	}
	for _, c := range q.Scalings {
		sum.Lines = append(sum.Lines, fmt.Sprintf("current scaling: %d readings × %.4g (test current %g A to fault current %g A)",
			c.Count, c.Factor, c.TestCurrent, c.FaultCurrent))
	}
	if len(q.Suspects) > 0 {
		sum.Lines = append(sum.Lines, fmt.Sprintf("spikes: %d readings disagree with their neighbours (robust scale %.4g %s)",
			len(q.Suspects), q.SpikeScale, s.Unit))
	}
	sum.Lines = append(sum.Lines, q.Remarks...)
	for _, st := range q.Log {
		if st.Reading < 0 {
			sum.Lines = append(sum.Lines, st.Kind+": "+st.Reason)
		}
	}
	return sum
}

// countKinds counts logged steps by kind, in the order kinds first appear.
func countKinds(log []qa.Step) []KindCount {
	var out []KindCount
	at := map[string]int{}
	for _, st := range log {
		k, ok := at[st.Kind]
		if !ok {
			k = len(out)
			at[st.Kind] = k
			out = append(out, KindCount{Kind: st.Kind})
		}
		out[k].Count++
	}
	return out
}

// repeatLines summarises the repeat groups.
func repeatLines(q *qa.Result, unit string) []string {
	if len(q.Repeats) == 0 {
		return nil
	}
	agree, spread := 0, 0.0
	for _, g := range q.Repeats {
		if g.Agree {
			agree++
		}
		spread = max(spread, g.Spread)
	}
	return []string{fmt.Sprintf("repeats: %d spots read more than once; %d agree within tolerance, %d do not; largest spread %.4g %s",
		len(q.Repeats), agree, len(q.Repeats)-agree, spread, unit)}
}

// driftLines summarises the drift correction and the loop closure.
func driftLines(d *qa.DriftCurve, unit string) []string {
	if d == nil {
		return nil
	}
	basis := "by time"
	if !d.ByTime {
		basis = "by reading order (" + d.TimeNote + ")"
	}
	return []string{
		fmt.Sprintf("drift: base station %s read %d times, corrected %s", d.Base, len(d.Members), basis),
		fmt.Sprintf("loop closure: %+.4g %s (largest step between base readings %.4g %s)", d.LoopClosure, unit, d.MaxStep, unit),
	}
}
