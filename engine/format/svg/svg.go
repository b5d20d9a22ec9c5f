package svg

import (
	"io"

	"seatsmith/engine/format"
	"seatsmith/engine/render"
)

// Encoder writes documents' charts as SVG.
type Encoder struct{}

// Encode writes d's chart, or returns format.ErrNoPart when d has none.
func (Encoder) Encode(w io.Writer, d *format.Document) error {
	if d.Chart == nil {
		return format.ErrNoPart
	}
	_, err := io.WriteString(w, render.SVG(d.Chart()))
	return err
}
