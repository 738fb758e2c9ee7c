package qa

import "fmt"

// timeAxis returns each reading's place in time for the drift curve:
// seconds since the earliest reading when every reading has a timestamp and
// the times never run backwards within a file; otherwise the reading's
// position in input order (files in the order given), with a note saying
// why.
func (c *checker) timeAxis() (t []float64, byTime bool, note string) {
	n := len(c.s.Readings)
	t = make([]float64, n)
	for i := range t {
		t[i] = float64(i)
	}
	if why := c.whyNotTime(); why != "" {
		note = why + ": the order of the readings stands in for time"
		c.remark("drift: %s", note)
		return t, false, note
	}
	t0 := c.s.Readings[0].Time
	for _, rd := range c.s.Readings {
		if rd.Time.Before(t0) {
			t0 = rd.Time
		}
	}
	for i, rd := range c.s.Readings {
		t[i] = rd.Time.Sub(t0).Seconds()
	}
	return t, true, ""
}

// whyNotTime returns why timestamps cannot order the readings, or "".
func (c *checker) whyNotTime() string {
	with, first := 0, -1
	for i, rd := range c.s.Readings {
		if rd.HasTime {
			with++
		} else if first < 0 {
			first = i
		}
	}
	switch {
	case with == 0:
		return "no timestamps"
	case first >= 0:
		return fmt.Sprintf("only %d of %d readings have a timestamp (first without: %s)", with, len(c.s.Readings), c.where(first))
	}
	last := map[int]int{} // file → index of its previous reading
	for i, rd := range c.s.Readings {
		if p, ok := last[rd.File]; ok && rd.Time.Before(c.s.Readings[p].Time) {
			return fmt.Sprintf("times run backwards at %s (%s after %s)", c.where(i),
				rd.Time.Format("2006-01-02 15:04:05"), c.s.Readings[p].Time.Format("2006-01-02 15:04:05"))
		}
		last[rd.File] = i
	}
	return ""
}
