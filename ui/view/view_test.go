package view

import (
	"strings"
	"testing"
)

func TestTreeHelpers(t *testing.T) {
	clicked := 0
	root := El("div", A("id", "root"),
		TextEl("h1", A("class", "title"), "Wells"),
		El("ul", nil,
			TextEl("li", A("id", "a"), "first").WithKey("a"),
			El("li", A("id", "b"), T("second "), TextEl("b", nil, "bold")).WithKey("b"),
		),
		TextEl("button", A("id", "go"), "Go").Handle("click", func(e *Event) { clicked++ }),
	)
	if got := root.ByID("b").TextContent(); got != "second bold" {
		t.Errorf("TextContent = %q", got)
	}
	if got := root.TextContent(); got != "Wellsfirstsecond boldGo" {
		t.Errorf("root TextContent = %q", got)
	}
	if root.ByID("nope") != nil {
		t.Error("ByID found a missing id")
	}
	lis := root.FindAll(func(n *Node) bool { return n.Tag == "li" })
	if len(lis) != 2 || lis[1].Key != "b" {
		t.Errorf("FindAll li = %d", len(lis))
	}
	if !root.ByID("go").Fire("click", nil) || clicked != 1 {
		t.Errorf("Fire click: clicked = %d", clicked)
	}
	if root.ByID("a").Fire("click", nil) {
		t.Error("Fire on a node without handler reported true")
	}
	if s := root.String(); !strings.Contains(s, `h1 class=title "Wells"`) {
		t.Errorf("String() =\n%s", s)
	}
	n := El("p", nil).Add(nil, T("x"), nil)
	if len(n.Children) != 1 {
		t.Errorf("Add kept nil children: %d", len(n.Children))
	}
}
