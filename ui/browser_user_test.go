//go:build !js

package ui

import (
	"fmt"
	"testing"

	"github.com/chromedp/chromedp"

	"fieldfit/web/webtest"
)

// user drives the real page the way a person does, for the browser tests
// of this package: each step waits for its element first.
type user struct {
	t testing.TB
	p *webtest.Page
}

func (u user) run(steps ...chromedp.Action[chromedp.Void]) {
	u.t.Helper()
	u.p.Do(steps...)
}

func (u user) eval(expr string) string {
	u.t.Helper()
	return webtest.Eval[string](u.p, expr)
}

// set types text into an input: focus, select what is there, type over it.
func (u user) set(id, text string) {
	u.t.Helper()
	u.run(chromedp.WaitVisible(chromedp.ID(id)),
		chromedp.Evaluate[chromedp.Void](fmt.Sprintf(`(() => { const e = document.getElementById(%q); e.focus(); e.select(); })()`, id)),
		chromedp.SendKeys(chromedp.ID(id), text))
}

// choose picks a value of a select and fires its change event.
func (u user) choose(id, value string) {
	u.t.Helper()
	u.run(chromedp.WaitVisible(chromedp.ID(id)), chromedp.SetValue(chromedp.ID(id), value),
		chromedp.Evaluate[chromedp.Void](fmt.Sprintf(`document.getElementById(%q).dispatchEvent(new Event("change", {bubbles: true}))`, id)))
}

func (u user) click(id string) {
	u.t.Helper()
	u.run(chromedp.WaitVisible(chromedp.ID(id)), chromedp.Click(chromedp.ID(id)))
}

// value is the current value of an input or select ("(missing #id)" when
// there is none).
func (u user) value(id string) string {
	u.t.Helper()
	return u.eval(fmt.Sprintf(`(document.getElementById(%q) || {value: "(missing #%s)"}).value`, id, id))
}

// text is an element's text ("(missing #id)" when there is none).
func (u user) text(id string) string {
	u.t.Helper()
	return u.eval(fmt.Sprintf(`(document.getElementById(%q) || {textContent: "(missing #%s)"}).textContent`, id, id))
}

// waitFor waits until expr is truthy, failing with what.
func (u user) waitFor(what, expr string) {
	u.t.Helper()
	u.p.WaitFor(expr, what)
}
