module fieldfit

go 1.26.8

require (
	github.com/chromedp/cdproto v0.159.0
	github.com/chromedp/chromedp v0.23.0
	github.com/hack-pad/go-indexeddb v0.3.2
	golang.org/x/text v0.44.0
	gonum.org/v1/gonum v0.17.0
	honnef.co/go/js/dom/v2 v2.0.0-20231112215516-51f43a291193
)

require (
	github.com/go-json-experiment/json v0.0.0-20260213210345-44df1a37e875 // indirect
	github.com/hack-pad/safejs v0.1.0 // indirect
)
