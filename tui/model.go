package tui

import (
	"context"
	"fmt"
	"time"

	"github.com/charmbracelet/bubbles/help"
	"github.com/charmbracelet/bubbles/key"
	"github.com/charmbracelet/bubbles/progress"
	"github.com/charmbracelet/bubbles/textinput"
	tea "github.com/charmbracelet/bubbletea"

	"isofield/survey"
	"isofield/survey/pipeline"
)

// state is the root's life cycle.
type state int

const (
	stateLoading state = iota // first run in progress
	stateError                // first run failed; nothing to show
	stateReady                // a result is on screen
)

// focus is the screen that receives keys.
type focus int

const (
	focusMap focus = iota
	focusZones
	focusTable
	focusProfile
	focusSettings
)

// Model is the root of the UI.
type Model struct {
	state  state
	err    error
	cfg    pipeline.Config
	opt    Options
	keys   KeyMap
	styles Styles
	help   help.Model
	width  int
	height int

	scene *scene

	// background run
	gen     int
	running bool
	cancel  context.CancelFunc
	stage   string
	frac    float64
	bar     progress.Model

	mapPane  mapPane
	side     sidePane
	zones    zoneList
	table    readingsTable
	profile  profileView
	settings settingsForm

	focus    focus
	showHelp bool
	helpPage int // the help page on show (see helpPages)
	marks    [2]*[2]float64
	nextMark int

	// the exclusion prompt
	prompting bool
	target    int
	reason    textinput.Model

	message  string
	msgSeq   int // counts messages; a message clears after messageLife
	watch    watchStamp
	initCmd  tea.Cmd
	panicked string // cause of a caught panic; the UI then quits
}

// New returns the root model for cfg, drawn with st.
func New(cfg pipeline.Config, opt Options, keys KeyMap, st Styles) Model {
	h := help.New()
	h.Styles = st.Help
	keys.Export.SetEnabled(opt.ExportDir != "")
	m := Model{
		cfg: cfg, opt: opt, keys: keys, styles: st, help: h,
		mapPane:  newMapPane(keys, st),
		side:     newSidePane(st),
		zones:    newZoneList(keys, st),
		table:    newReadingsTable(keys, st),
		profile:  newProfileView(st),
		settings: newSettingsForm(keys, st).SetConfig(cfg),
		reason:   newTextInput(st, 120),
		bar:      newProgress(st),
	}
	return m.resize(80, 24)
}

// Init returns the command Start prepared: the first run and, in watch
// mode, the file poll.
func (m Model) Init() tea.Cmd { return m.initCmd }

// Start begins the first run and keeps its command for Init. It is
// separate from Init so that the run's cancel function stays in the model.
func (m Model) Start() (Model, tea.Cmd) {
	cmds := []tea.Cmd{}
	m, c := m.run("first look", m.cfg.Spacing == 0, m.opt.Loaded)
	cmds = append(cmds, c)
	if m.opt.Watch && len(m.cfg.Files) > 0 {
		m.watch = stampOf(m.cfg.Files)
		cmds = append(cmds, watchTick())
	}
	m.initCmd = tea.Batch(cmds...)
	return m, m.initCmd
}

// regrid cancels any run in progress and starts a new one.
func (m Model) regrid(why string) (Model, tea.Cmd) { return m.run(why, false, nil) }

// run cancels any run in progress and starts a new one, a coarse preview
// when asked. loaded, if not nil, is the survey as just read from the
// files, which the run uses instead of reading them again; m.cfg keeps
// naming the files, so later runs (watch mode) read them afresh.
func (m Model) run(why string, preview bool, loaded *survey.Survey) (Model, tea.Cmd) {
	if m.cancel != nil {
		m.cancel()
	}
	m.gen++
	cfg := m.cfg
	if loaded != nil && cfg.Survey == nil {
		cfg.Survey = loaded
	}
	cmd, cancel := runPipeline(cfg, m.gen, preview)
	m.cancel, m.running, m.stage, m.frac = cancel, true, why, 0
	return m, cmd
}

// Update routes a message to its handler. A panic in any handler is caught
// here: the UI records a one-line cause and quits, so that Run restores the
// terminal and reports it instead of a stack dump over the screen.
func (m Model) Update(msg tea.Msg) (next tea.Model, cmd tea.Cmd) {
	defer func() {
		if r := recover(); r != nil {
			m.panicked = fmt.Sprint(r)
			if m.cancel != nil {
				m.cancel()
			}
			next, cmd = m, tea.Quit
		}
	}()
	before := m.message
	next, cmd = m.update(msg)
	if nm, ok := next.(Model); ok && nm.message != before && nm.message != "" {
		nm.msgSeq++
		next, cmd = nm, tea.Batch(cmd, clearLater(nm.msgSeq))
	}
	return next, cmd
}

// messageLife is how long a message stays on the message line; then the
// line goes back to what it shows when idle (for grounding, the caution).
const messageLife = 8 * time.Second

// clearMsg clears message number seq, unless a newer one replaced it.
type clearMsg struct{ seq int }

func clearLater(seq int) tea.Cmd {
	return tea.Tick(messageLife, func(time.Time) tea.Msg { return clearMsg{seq} })
}

func (m Model) update(msg tea.Msg) (tea.Model, tea.Cmd) {
	switch msg := msg.(type) {
	case panicMsg:
		panic(msg.what)
	case tea.WindowSizeMsg:
		return m.resize(msg.Width, msg.Height), nil
	case resultMsg:
		return m.onResult(msg)
	case progressMsg:
		return m.onProgress(msg)
	case readingsSortedMsg:
		m.table = m.table.onSorted(msg)
		return m, nil
	case watchTickMsg:
		return m, statFiles(m.cfg.Files)
	case statMsg:
		return m.onStat(msg)
	case savedMsg:
		return m.onSaved(msg), nil
	case exportedMsg:
		return m.onExported(msg), nil
	case applyMsg:
		m.cfg = msg.cfg
		m.message = "settings changed: regridding"
		save := saveEdits(m.opt.Save, m.opt.SessionPath, m.cfg)
		m, run := m.regrid("settings")
		return m, tea.Batch(save, run)
	case clearMsg:
		if msg.seq == m.msgSeq {
			m.message = ""
		}
		return m, nil
	case jumpMsg:
		m.mapPane = m.mapPane.MoveTo(msg.X, msg.Y)
		return m, nil
	case tea.KeyMsg:
		return m.onKey(msg)
	}
	return m.forward(msg)
}

// forward passes other messages (cursor blinks and the like) to the child
// that may be waiting for them.
func (m Model) forward(msg tea.Msg) (tea.Model, tea.Cmd) {
	var cmd tea.Cmd
	switch {
	case m.prompting:
		m.reason, cmd = m.reason.Update(msg)
	case m.focus == focusSettings:
		m.settings, cmd = m.settings.Update(msg)
	}
	return m, cmd
}

func (m Model) onResult(msg resultMsg) (tea.Model, tea.Cmd) {
	if msg.gen != m.gen {
		return m, nil // a replaced run: drop it
	}
	m.running, m.cancel = false, nil
	if msg.preview && msg.err != nil {
		return m.regrid("loading") // the full run reports the error
	}
	if msg.err != nil {
		if m.scene == nil {
			m.state, m.err = stateError, msg.err
			return m, nil
		}
		m.message = "regrid failed, showing the previous map: " + msg.err.Error()
		return m, nil
	}
	m.state, m.err = stateReady, nil
	m.scene = msg.scene
	if m.scene == nil {
		m.scene = newScene(msg.res, m.cfg)
	}
	first := !m.mapPane.fitted
	m.mapPane = m.mapPane.SetData(m.scene.data)
	if first && m.mapPane.Crowded() {
		m.message = "many readings: only suspects (?) and exclusions (x) marked; 4: all/flagged/none"
	}
	m.zones = m.zones.SetZones(m.scene.zones, m.scene.unit)
	m.table = m.table.SetResult(msg.res, m.scene.stats)
	m.settings = m.settings.SetConfig(m.cfg).SetUnit(m.scene.unit)
	m.profile = m.profile.Set(m.scene, m.marks[0], m.marks[1])
	if msg.preview {
		// The full grid follows at once on the survey the preview read.
		return m.run("full grid", false, msg.res.Survey)
	}
	return m, nil
}

func (m Model) onProgress(msg progressMsg) (tea.Model, tea.Cmd) {
	if msg.gen == m.gen && m.running {
		m.stage, m.frac = msg.stage, msg.frac
	}
	return m, msg.next
}

func (m Model) onStat(msg statMsg) (tea.Model, tea.Cmd) {
	if msg.stamp.equal(m.watch) {
		return m, watchTick()
	}
	m.watch = msg.stamp
	m.message = "input changed: regridding"
	m, cmd := m.regrid("reload")
	return m, tea.Batch(cmd, watchTick())
}

func (m Model) onSaved(msg savedMsg) Model {
	if msg.err != nil {
		m.message = "could not save the session: " + msg.err.Error()
	} else if msg.path != "" {
		m.message += "; saved to " + msg.path
	}
	return m
}

// onKey handles the keys that act everywhere, then routes the rest.
func (m Model) onKey(msg tea.KeyMsg) (tea.Model, tea.Cmd) {
	if m.prompting {
		return m.onPromptKey(msg)
	}
	typing := m.focus == focusSettings && m.settings.Editing()
	if msg.Type == tea.KeyRunes && len(msg.Runes) > 1 && !typing && !msg.Paste {
		return m.onKeys(msg.Runes)
	}
	switch {
	case msg.Type == tea.KeyCtrlC, !typing && key.Matches(msg, m.keys.Quit):
		if m.cancel != nil {
			m.cancel()
		}
		return m, tea.Quit
	case typing:
		return m.routeKey(msg)
	case key.Matches(msg, m.keys.Help):
		// ? opens the help's first page, steps through the others, then
		// closes.
		switch {
		case !m.showHelp:
			m.showHelp, m.helpPage = true, 0
		case m.helpPage+1 < len(m.helpPages()):
			m.helpPage++
		default:
			m.showHelp, m.helpPage = false, 0
		}
		return m, nil
	case key.Matches(msg, m.keys.Back):
		m.showHelp, m.helpPage, m.focus = false, 0, focusMap
		return m, nil
	case key.Matches(msg, m.keys.Cancel) && m.running:
		m.cancel()
		m.running, m.cancel = false, nil
		m.gen++ // the cancelled run's messages are now stale
		m.message = "regrid cancelled"
		return m, nil
	}
	if m.state != stateReady {
		return m, nil
	}
	if next, cmd, ok := m.onScreenKey(msg); ok {
		return next, cmd
	}
	return m.routeKey(msg)
}

// onKeys handles several keys that arrived as one message (typed faster
// than the terminal is read, or sent by a script) one by one.
func (m Model) onKeys(rs []rune) (tea.Model, tea.Cmd) {
	var cmds []tea.Cmd
	var next tea.Model = m
	for _, r := range rs {
		var cmd tea.Cmd
		next, cmd = next.(Model).onKey(tea.KeyMsg{Type: tea.KeyRunes, Runes: []rune{r}})
		cmds = append(cmds, cmd)
	}
	return next, tea.Batch(cmds...)
}

// onScreenKey handles the keys that switch screens or act on the survey.
func (m Model) onScreenKey(msg tea.KeyMsg) (Model, tea.Cmd, bool) {
	k := m.keys
	switch {
	case key.Matches(msg, k.ZoneList) && m.focus != focusSettings:
		m.focus = toggle(m.focus, focusZones)
	case key.Matches(msg, k.Table) && m.focus != focusSettings:
		m.focus = toggle(m.focus, focusTable)
	case key.Matches(msg, k.Settings) && m.focus != focusTable:
		m.settings = m.settings.SetConfig(m.cfg)
		m.focus = toggle(m.focus, focusSettings)
	case key.Matches(msg, k.Profile) && m.focus != focusSettings:
		m.focus = toggle(m.focus, focusProfile)
	case key.Matches(msg, k.NextZone) && m.focus != focusTable:
		var cmd tea.Cmd
		m.zones, cmd = m.zones.Step(1)
		return m, cmd, true
	case key.Matches(msg, k.PrevZone) && m.focus != focusTable:
		var cmd tea.Cmd
		m.zones, cmd = m.zones.Step(-1)
		return m, cmd, true
	case key.Matches(msg, k.Mark) && m.focus == focusMap:
		x, y := m.mapPane.Cursor()
		m.marks[m.nextMark] = &[2]float64{x, y}
		m.message = fmt.Sprintf("mark %c at %s, %s", 'A'+rune(m.nextMark), fixed(x), fixed(y))
		m.nextMark = 1 - m.nextMark
		m.mapPane.view.MarkA, m.mapPane.view.MarkB = m.marks[0], m.marks[1]
		m.profile = m.profile.Set(m.scene, m.marks[0], m.marks[1])
	case key.Matches(msg, k.Exclude) && (m.focus == focusMap || m.focus == focusTable):
		return m.askReason()
	case key.Matches(msg, k.Export):
		m.message = "exporting…"
		return m, exportView(m.opt, m.scene.res, m.cfg, describeView(m.mapPane), time.Now()), true
	default:
		return m, nil, false
	}
	return m, nil, true
}

func toggle(cur, f focus) focus {
	if cur == f {
		return focusMap
	}
	return f
}

// routeKey sends a key to the focused screen.
func (m Model) routeKey(msg tea.KeyMsg) (tea.Model, tea.Cmd) {
	var cmd tea.Cmd
	switch m.focus {
	case focusZones:
		m.zones, cmd = m.zones.Update(msg)
	case focusTable:
		m.table, cmd = m.table.Update(msg)
	case focusSettings:
		m.settings, cmd = m.settings.Update(msg)
	case focusProfile:
	default:
		m.mapPane, cmd = m.mapPane.Update(msg)
	}
	return m, cmd
}
