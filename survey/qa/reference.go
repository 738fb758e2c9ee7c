package qa

import (
	"errors"
	"fmt"
	"sort"
	"strings"

	"isofield/survey/electrode"
)

// ErrNoTestCurrent is the cause of the error for a reading without a test
// current when scaling to a fault current.
var ErrNoTestCurrent = errors.New("no test current for scaling to the fault current (give --test-current or a test current column)")

// readingRefs returns each reading's reference electrode: its own if it
// names one, else Settings.From. Unknown names are errors naming the
// reading's file and line.
func (c *checker) readingRefs() ([]electrode.Reference, error) {
	refs := make([]electrode.Reference, len(c.s.Readings))
	parsed := map[string]electrode.Reference{}
	for i, rd := range c.s.Readings {
		refs[i] = c.set.From
		if rd.Reference == "" {
			continue
		}
		r, ok := parsed[rd.Reference]
		if !ok {
			var err error
			if r, err = electrode.ParseReference(rd.Reference); err != nil {
				return nil, c.inputError(i, err)
			}
			parsed[rd.Reference] = r
		}
		if r != electrode.None {
			refs[i] = r
		}
	}
	return refs, nil
}

// convertReferences puts every reading on Settings.To.
func (c *checker) convertReferences() error {
	refs, err := c.readingRefs()
	if err != nil {
		return err
	}
	to := c.set.To
	if to == electrode.None {
		c.remarkMixedScales(refs)
		return nil
	}
	per := c.s.Unit.PerVolt()
	byFrom := map[electrode.Reference]int{}
	reasons := map[electrode.Reference]string{}
	unstated := 0
	for i, from := range refs {
		if from == electrode.None {
			unstated++
		}
		if from == electrode.None || from == to {
			continue
		}
		off, err := electrode.Offset(from, to)
		if err != nil {
			return c.inputError(i, err)
		}
		off *= per
		reason, ok := reasons[from]
		if !ok {
			reason = fmt.Sprintf("reference %v → %v: %+.4g %s", from, to, off, c.unit())
			reasons[from] = reason
		}
		c.setValue(i, c.res.Corrected[i]+off, KindReference, reason)
		c.note(i, reason)
		byFrom[from]++
	}
	for _, from := range sortedRefs(byFrom) {
		off, _ := electrode.Offset(from, to)
		a, _ := electrode.Lookup(from)
		b, _ := electrode.Lookup(to)
		c.res.Conversions = append(c.res.Conversions, Conversion{
			From: from, To: to, Offset: off * per, Count: byFrom[from],
			Source: sourcePair(a, b),
		})
	}
	if unstated > 0 {
		c.remark("%d readings name no reference electrode and no --from-ref is set: taken to be on the %v scale already", unstated, to)
	}
	return nil
}

// remarkMixedScales warns when readings name different electrodes but no
// target scale was set.
func (c *checker) remarkMixedScales(refs []electrode.Reference) {
	count := map[electrode.Reference]int{}
	for _, r := range refs {
		if r != electrode.None {
			count[r]++
		}
	}
	if len(count) < 2 {
		return
	}
	var parts []string
	for _, r := range sortedRefs(count) {
		parts = append(parts, fmt.Sprintf("%v: %d", r, count[r]))
	}
	c.remark("readings are on %d reference scales (%s) and no target electrode is set (--to-ref): they are not comparable and were not converted",
		len(count), strings.Join(parts, ", "))
}

func sortedRefs(m map[electrode.Reference]int) []electrode.Reference {
	var rs []electrode.Reference
	for r := range m {
		rs = append(rs, r)
	}
	sort.Slice(rs, func(i, j int) bool { return rs[i] < rs[j] })
	return rs
}

// sourcePair names the sources of two electrodes' potentials.
func sourcePair(a, b electrode.Info) string {
	sa := fmt.Sprintf("%s %+.3f V vs SHE [%s] (%s)", a.Name, a.VsSHE, a.Status, a.Source)
	sb := fmt.Sprintf("%s %+.3f V vs SHE [%s] (%s)", b.Name, b.VsSHE, b.Status, b.Source)
	return sa + "; " + sb
}

// scaleCurrent scales readings per test current to the fault current.
func (c *checker) scaleCurrent() error {
	fault := c.set.FaultCurrent
	if fault == 0 {
		if c.set.TestCurrent > 0 || c.anyTestCurrent() {
			c.remark("test current stated but no fault current (--fault-current): readings not scaled")
		}
		return nil
	}
	byTest := map[float64]int{}
	for i, rd := range c.s.Readings {
		itest := rd.TestCurrent
		if itest <= 0 {
			itest = c.set.TestCurrent
		}
		if itest <= 0 {
			return c.inputError(i, ErrNoTestCurrent)
		}
		f := fault / itest
		reason := fmt.Sprintf("scaled to fault current: × %g A / %g A", fault, itest)
		c.setValue(i, c.res.Corrected[i]*f, KindCurrent, reason)
		c.note(i, reason)
		byTest[itest]++
	}
	for _, it := range sortedKeys(byTest) {
		c.res.Scalings = append(c.res.Scalings, Scaling{TestCurrent: it, FaultCurrent: fault, Factor: fault / it, Count: byTest[it]})
	}
	return nil
}

func (c *checker) anyTestCurrent() bool {
	for _, rd := range c.s.Readings {
		if rd.TestCurrent > 0 {
			return true
		}
	}
	return false
}

func sortedKeys(m map[float64]int) []float64 {
	var ks []float64
	for k := range m {
		ks = append(ks, k)
	}
	sort.Float64s(ks)
	return ks
}
