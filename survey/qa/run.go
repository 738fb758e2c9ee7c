package qa

import (
	"context"
	"errors"
	"fmt"
	"math"

	"isofield/survey"
)

// checker carries one run's state.
type checker struct {
	s   *survey.Survey
	set Settings // defaults filled in
	res *Result
	// hand is true for readings excluded by hand at the end of the edits.
	hand     []bool
	progress func(done, total int) // of the spike fits; may be nil
	// treeOnly makes the neighbour searches use the k-d tree, never the
	// grid (for tests that compare the two).
	treeOnly bool
}

// Run checks and corrects the survey's readings with the given settings
// and hand edits, in the order the package documentation states. It never
// modifies s. See RunContext.
func Run(s *survey.Survey, set Settings, edits []Edit) (*Result, error) {
	return RunContext(context.Background(), s, set, edits)
}

// RunContext is Run honouring ctx during the spike fit.
func RunContext(ctx context.Context, s *survey.Survey, set Settings, edits []Edit) (*Result, error) {
	return RunProgress(ctx, s, set, edits, nil)
}

// RunProgress is RunContext reporting the progress of the spike fits, the
// slow part on large surveys: progress, if not nil, is called from any
// goroutine with the work done and the total of the current fit, in
// arbitrary units (as interp.Options.Progress).
func RunProgress(ctx context.Context, s *survey.Survey, set Settings, edits []Edit, progress func(done, total int)) (*Result, error) {
	if s == nil {
		return nil, errors.New("qa: no survey")
	}
	if err := set.Validate(); err != nil {
		return nil, fmt.Errorf("qa settings: %w", err)
	}
	c := newChecker(s, set.effective(s.Unit))
	c.progress = progress
	return c.run(ctx, edits)
}

// run makes the checks in order, the hand edits last.
func (c *checker) run(ctx context.Context, edits []Edit) (*Result, error) {
	plan := c.resolveEdits(edits)
	if err := c.corrections(); err != nil {
		return nil, err
	}
	if err := c.spikes(ctx); err != nil {
		return nil, err
	}
	c.applyEdits(plan)
	return c.res, nil
}

// corrections makes the checks before the spike check: reference
// conversion, current scaling, repeat groups, drift and repeats.
func (c *checker) corrections() error {
	if err := c.convertReferences(); err != nil {
		return err
	}
	if err := c.scaleCurrent(); err != nil {
		return err
	}
	c.group()
	if err := c.drift(); err != nil {
		return err
	}
	c.repeats()
	return nil
}

func newChecker(s *survey.Survey, set Settings) *checker {
	n := len(s.Readings)
	r := &Result{
		Corrected: make([]float64, n),
		Status:    make([]Status, n),
		Notes:     make([][]string, n),
		Group:     make([]int, n),
		Residual:  make([]float64, n),
		Z:         make([]float64, n),
		Settings:  set,
	}
	for i, rd := range s.Readings {
		r.Corrected[i] = rd.V
		r.Group[i] = -1
		r.Residual[i] = math.NaN()
		r.Z[i] = math.NaN()
	}
	return &checker{s: s, set: set, res: r, hand: make([]bool, n)}
}

// setValue changes reading i's corrected value and logs the step.
func (c *checker) setValue(i int, v float64, kind, reason string) {
	old := c.res.Corrected[i]
	if v == old {
		return
	}
	c.res.Corrected[i] = v
	st := c.res.Status[i]
	c.res.Log = append(c.res.Log, Step{Reading: i, Kind: kind, Reason: reason, Before: old, After: v, Was: st, Now: st})
}

// setStatus changes reading i's status, logs the step and notes the
// reason on the reading.
func (c *checker) setStatus(i int, st Status, kind, reason string) {
	v := c.res.Corrected[i]
	c.res.Log = append(c.res.Log, Step{Reading: i, Kind: kind, Reason: reason, Before: v, After: v, Was: c.res.Status[i], Now: st})
	c.res.Status[i] = st
	c.note(i, reason)
}

// note adds a note to reading i.
func (c *checker) note(i int, text string) {
	c.res.Notes[i] = append(c.res.Notes[i], text)
}

// remark adds a survey-wide remark and logs it.
func (c *checker) remark(format string, args ...any) {
	text := fmt.Sprintf(format, args...)
	c.res.Remarks = append(c.res.Remarks, text)
	c.res.Log = append(c.res.Log, Step{Reading: -1, Kind: KindNote, Reason: text})
}

// where names reading i as "file:line" for messages.
func (c *checker) where(i int) string {
	rd := c.s.Readings[i]
	name := "reading"
	if rd.File >= 0 && rd.File < len(c.s.Files) {
		name = c.s.Files[rd.File].Path
	}
	return fmt.Sprintf("%s:%d", name, rd.Line0)
}

// inputError is an error about reading i, naming its file and line.
func (c *checker) inputError(i int, err error) error {
	rd := c.s.Readings[i]
	name := ""
	if rd.File >= 0 && rd.File < len(c.s.Files) {
		name = c.s.Files[rd.File].Path
	}
	return &survey.ParseError{File: name, Line: rd.Line0, Err: err}
}

// unit is the survey's unit as written.
func (c *checker) unit() string { return c.s.Unit.String() }
