package tui

import (
	"context"
	"fmt"
	"os"
	"slices"
	"time"

	tea "github.com/charmbracelet/bubbletea"

	"isofield/survey"
	"isofield/survey/pipeline"
	"isofield/survey/qa"
)

// resultMsg is a finished pipeline run of generation gen; preview marks
// the quick coarse first look.
type resultMsg struct {
	gen     int
	res     *pipeline.Result
	scene   *scene // derived from res in the background (nil: derive it)
	err     error
	preview bool
}

// previewCoarsening is how much coarser than the automatic spacing the first
// look at a survey is gridded: 4× the spacing is 1/16 of the nodes, so the
// map appears in a fraction of a second while the full grid follows.
const previewCoarsening = 4

// progressMsg reports a run's progress; next waits for the one after.
type progressMsg struct {
	gen   int
	stage string
	frac  float64
	next  tea.Cmd
}

// stageSpan gives each pipeline stage its share of the progress bar.
func stageSpan(stage string) (lo, hi float64) {
	switch stage {
	case pipeline.StageLoad:
		return 0, 0.1
	case pipeline.StageCheck:
		return 0.1, 0.2
	case pipeline.StageFit:
		return 0.2, 0.5
	case pipeline.StageGrid:
		return 0.5, 0.85
	}
	return 0.85, 1
}

// runPipeline returns a command running the pipeline on a copy of cfg in
// the background, and the function that cancels it. Progress arrives as
// progressMsg, the outcome as resultMsg; both carry gen so the root can
// drop messages of a run it has replaced. The command captures values only,
// never the model.
//
// A preview run (only when the spacing is automatic) loads the survey,
// grids it previewCoarsening times coarser than the automatic spacing and
// suggests no infill points.
func runPipeline(cfg pipeline.Config, gen int, preview bool) (tea.Cmd, context.CancelFunc) {
	cfg = cloneConfig(cfg)
	ctx, cancel := context.WithCancel(context.Background())
	ch := make(chan progressMsg, 1)
	done := make(chan struct{})
	var wait tea.Cmd
	wait = func() tea.Msg {
		select {
		case p := <-ch:
			p.next = wait
			return p
		case <-done:
			return nil
		}
	}
	report := func(stage string, f float64) {
		lo, hi := stageSpan(stage)
		select {
		case ch <- progressMsg{gen: gen, stage: stage, frac: lo + f*(hi-lo)}:
		default: // the UI is behind: drop this report, a later one follows
		}
	}
	run := func() tea.Msg {
		defer close(done)
		if preview {
			return runPreview(ctx, cfg, gen, report)
		}
		res, err := pipeline.Run(ctx, cfg, report)
		return withScene(resultMsg{gen: gen, res: res, err: err}, cfg)
	}
	return tea.Batch(safe(run), wait), cancel
}

// watchTickMsg is the watch mode's poll.
type watchTickMsg struct{}

// watchStamp is what the watch mode compares: each file's size and time.
type watchStamp struct {
	size  []int64
	mtime []time.Time
}

// statMsg carries the files' current stamp.
type statMsg struct{ stamp watchStamp }

// watchInterval is how often watch mode looks at the files.
const watchInterval = time.Second

func watchTick() tea.Cmd {
	return tea.Tick(watchInterval, func(time.Time) tea.Msg { return watchTickMsg{} })
}

// statFiles returns a command that stamps the files (missing files stamp
// as size -1 so that their return is noticed).
func statFiles(files []string) tea.Cmd {
	files = slices.Clone(files)
	return safe(func() tea.Msg { return statMsg{stamp: stampOf(files)} })
}

func stampOf(files []string) watchStamp {
	st := watchStamp{size: make([]int64, len(files)), mtime: make([]time.Time, len(files))}
	for i, f := range files {
		st.size[i] = -1
		if fi, err := os.Stat(f); err == nil {
			st.size[i], st.mtime[i] = fi.Size(), fi.ModTime()
		}
	}
	return st
}

func (a watchStamp) equal(b watchStamp) bool {
	return slices.Equal(a.size, b.size) && slices.EqualFunc(a.mtime, b.mtime, time.Time.Equal)
}

// savedMsg reports the outcome of saving the session.
type savedMsg struct {
	path string
	err  error
}

// saveEdits returns a command that saves cfg through save, or nil when
// there is nowhere to save.
func saveEdits(save func(pipeline.Config) error, path string, cfg pipeline.Config) tea.Cmd {
	if save == nil {
		return nil
	}
	cfg.Edits = slices.Clone(cfg.Edits)
	return safe(func() tea.Msg { return savedMsg{path: path, err: save(cfg)} })
}

// editFor returns the hand edit that flips reading i of res.
func editFor(res *pipeline.Result, i int, reason string) qa.Edit {
	r := res.Survey.Readings[i]
	path := ""
	if r.File >= 0 && r.File < len(res.Survey.Files) {
		path = res.Survey.Files[r.File].Path
	}
	exclude := res.QA == nil || i >= len(res.QA.Status) || res.QA.Status[i] != qa.Excluded
	return qa.Edit{File: path, Line: r.Line0, ID: r.ID, Exclude: exclude, Reason: reason}
}

// panicMsg carries a panic caught in a background command to Update,
// which ends the UI cleanly.
type panicMsg struct{ what string }

// safe wraps cmd so that a panic in it becomes a panicMsg.
func safe(cmd tea.Cmd) tea.Cmd {
	return func() (msg tea.Msg) {
		defer func() {
			if r := recover(); r != nil {
				msg = panicMsg{what: fmt.Sprint(r)}
			}
		}()
		return cmd()
	}
}

// runPreview runs the coarse first look of cfg.
func runPreview(ctx context.Context, cfg pipeline.Config, gen int, report pipeline.Progress) tea.Msg {
	s := cfg.Survey
	if s == nil {
		var err error
		if s, err = survey.Load(cfg.Files, cfg.Load); err != nil {
			return resultMsg{gen: gen, err: err, preview: true}
		}
	}
	xmin, ymin, xmax, ymax := s.Extent()
	cfg.Survey = s
	cfg.Spacing = previewCoarsening * pipeline.AutoSpacing(xmax-xmin, ymax-ymin)
	cfg.Suggest = 0
	res, err := pipeline.Run(ctx, cfg, report)
	return withScene(resultMsg{gen: gen, res: res, err: err, preview: true}, cfg)
}

// withScene derives the scene of a successful result, so that the UI loop
// only swaps it in (at 10⁶ readings the derivation takes a noticeable
// fraction of a second).
func withScene(msg resultMsg, cfg pipeline.Config) resultMsg {
	if msg.err == nil && msg.res != nil {
		msg.scene = newScene(msg.res, cfg)
	}
	return msg
}
