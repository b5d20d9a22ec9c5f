package projection

import (
	"strings"

	model "seatsmith/engine/projection"
	. "seatsmith/engine/render"
)

// Prerender writes a block as a page carries it before the engine runs:
// the root with data-state="static", the block's document (configJSON, a
// JSON object that must not contain "</"), the controls (disabled) and the
// result s computed by the native engine.
func Prerender(c *Config, id, configJSON string, s *model.Summary) string {
	root := El("div", "class", "projection", "id", id, "data-projection", "", "data-state", "static")
	h := strings.TrimSuffix(HTML(root), "</div>")
	return h + `<script type="application/json">` + configJSON + `</script>` +
		HTML(Form(c, id, false)) + HTML(Output(c, s, id)) + "</div>"
}
