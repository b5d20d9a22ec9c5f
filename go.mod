module seatsmith

go 1.26.8

require (
	github.com/andybalholm/brotli v1.3.0
	github.com/chromedp/cdproto v0.159.0
	github.com/chromedp/chromedp v0.23.0
	github.com/hack-pad/safejs v0.1.0
	github.com/sergi/go-diff v1.4.0
	github.com/tdewolff/minify/v2 v2.25.0
	pgregory.net/rapid v1.3.0
)

require (
	github.com/go-json-experiment/json v0.0.0-20260213210345-44df1a37e875 // indirect
	github.com/tdewolff/parse/v2 v2.25.0 // indirect
	golang.org/x/text v0.44.0 // indirect
)
