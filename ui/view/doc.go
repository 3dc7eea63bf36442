// Package view describes a screen as a tree of plain Go values — elements,
// attributes, text and event handlers — that a thin browser layer turns
// into the page and keeps in step with later trees.
//
// Screen logic builds Nodes and native tests inspect them (Find, ByID,
// TextContent); the js/wasm half of the package (Mount) patches the live
// document with the differences between successive trees. User text only
// ever reaches the page through textContent and attribute setters, never
// as HTML.
package view
