package tui

import (
	"fmt"
	"strings"

	"github.com/charmbracelet/bubbles/key"
	tea "github.com/charmbracelet/bubbletea"

	"isofield/survey/qa"
)

// pickRadius is how many text columns from the cursor a reading may be and
// still count as under it.
const pickRadius = 1.5

// readingUnderCursor returns the reading nearest the cursor if it lies
// within pickRadius columns, else -1.
func (m Model) readingUnderCursor() int {
	x, y := m.mapPane.Cursor()
	i, d := m.scene.nearestReading(x, y)
	if i < 0 || d > pickRadius*m.mapPane.view.RowHeight() {
		return -1
	}
	return i
}

// askReason opens the reason prompt for the reading under the cursor (map)
// or the selected row (table).
func (m Model) askReason() (Model, tea.Cmd, bool) {
	i := -1
	if m.focus == focusTable {
		i = m.table.Selected()
	} else {
		i = m.readingUnderCursor()
	}
	if i < 0 {
		m.message = "no reading under the cursor: move onto a + ? or x mark, or use the table (t)"
		return m, nil, true
	}
	m.prompting, m.target = true, i
	m.reason.Reset()
	m.reason.Prompt = m.promptText(i)
	m.reason.Placeholder = "reason, then enter (esc: keep as is)"
	m.reason = fitInput(m.reason, m.width)
	cmd := m.reason.Focus()
	return m, cmd, true
}

func (m Model) promptText(i int) string {
	verb := "exclude"
	if q := m.scene.res.QA; q != nil && i < len(q.Status) && q.Status[i] == qa.Excluded {
		verb = "include again"
	}
	r := m.scene.res.Survey.Readings[i]
	name := r.ID
	if name == "" {
		name = fmt.Sprintf("line %d", r.Line0)
	}
	return fmt.Sprintf("%s %s (%s): ", verb, name, m.scene.stats.origUnit.with(r.V))
}

// onPromptKey types the reason; Enter records the edit, saves the session
// and regrids; Esc gives up.
func (m Model) onPromptKey(msg tea.KeyMsg) (tea.Model, tea.Cmd) {
	switch {
	case msg.Type == tea.KeyCtrlC:
		return m, tea.Quit
	case key.Matches(msg, m.keys.Back):
		m.prompting = false
		m.reason.Blur()
		m.message = "nothing changed"
		return m, nil
	case msg.Type == tea.KeyEnter:
		return m.applyEdit()
	}
	var cmd tea.Cmd
	m.reason, cmd = m.reason.Update(msg)
	return m, cmd
}

// applyEdit records the exclusion or inclusion of the target reading.
func (m Model) applyEdit() (tea.Model, tea.Cmd) {
	m.prompting = false
	m.reason.Blur()
	reason := strings.TrimSpace(m.reason.Value())
	if reason == "" {
		reason = "by hand"
	}
	e := editFor(m.scene.res, m.target, reason)
	m.cfg.Edits = append(append([]qa.Edit(nil), m.cfg.Edits...), e)
	verb := "excluded"
	if !e.Exclude {
		verb = "included"
	}
	m.message = fmt.Sprintf("%s %s: %s", verb, labelOf(e), reason)
	save := saveEdits(m.opt.Save, m.opt.SessionPath, m.cfg)
	if save == nil {
		m.message += " (kept for this session only: no session file)"
	}
	m, run := m.regrid("edit")
	return m, tea.Batch(save, run)
}

func labelOf(e qa.Edit) string {
	if e.ID != "" {
		return e.ID
	}
	return fmt.Sprintf("line %d", e.Line)
}
