package tui

import (
	"strconv"

	"github.com/charmbracelet/bubbles/cursor"
	"github.com/charmbracelet/bubbles/progress"
	"github.com/charmbracelet/bubbles/textinput"
	"github.com/charmbracelet/lipgloss"
	"github.com/muesli/termenv"
)

// newTextInput returns a Bubbles text input for the reason prompt and the
// settings' typed values: at most limit characters, a steady cursor (no
// blink timer, so frames change only on input), styled from st. Without
// colour the cursor cannot be shown in reverse video, so it is drawn as
// "_" at the end of the text or before the character it is on.
func newTextInput(st Styles, limit int) textinput.Model {
	in := textinput.New()
	in.Prompt = ""
	in.CharLimit = limit
	in.PromptStyle = st.Label
	in.TextStyle = st.Value
	in.PlaceholderStyle = st.Faint
	in.Cursor.Style = st.Value
	in.Cursor.TextStyle = st.Value
	in.Cursor.SetMode(cursor.CursorStatic)
	if !st.Colour {
		in.Cursor.Style = st.Value.Transform(monoCursor)
	}
	// Paste comes through the terminal (bracketed paste); ctrl+v would
	// read a clipboard that a site laptop over SSH does not have.
	in.KeyMap.Paste.SetEnabled(false)
	return in
}

// monoCursor draws the cursor cell without colour or reverse video.
func monoCursor(s string) string {
	if s == " " || s == "" {
		return "_"
	}
	return "_" + s
}

// fitInput sets the input's visible width so that its prompt and text fit
// w cells (the input scrolls sideways beyond that).
func fitInput(in textinput.Model, w int) textinput.Model {
	in.Width = max(w-lipgloss.Width(in.Prompt)-2, 8)
	return in
}

// newProgress returns the Bubbles progress bar the UI draws runs with:
// one solid colour (the accent), no animation (ViewAs draws the fraction
// the last report gave), the percentage right of the bar.
func newProgress(st Styles) progress.Model {
	p := termenv.Ascii
	dark := true
	if st.Renderer != nil {
		p, dark = st.Renderer.ColorProfile(), st.Renderer.HasDarkBackground()
	}
	pick := func(c lipgloss.AdaptiveColor) string {
		if dark {
			return c.Dark
		}
		return c.Light
	}
	bar := progress.New(progress.WithColorProfile(p), progress.WithSolidFill(pick(st.Accent)),
		progress.WithFillCharacters('█', '░'))
	bar.EmptyColor = pick(st.Dim)
	bar.PercentFormat = " %3.0f%%"
	return bar
}

// progressView draws frac (0..1) as a bar width cells wide, percentage
// included.
func progressView(bar progress.Model, width int, frac float64) string {
	bar.Width = max(width, 9)
	return bar.ViewAs(min(max(frac, 0), 1))
}

func itoa(n int) string { return strconv.Itoa(n) }
