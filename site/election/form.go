package election

import (
	"strconv"
	"strings"

	. "seatsmith/engine/render"
)

// Form is the block's controls: the threshold, the compensatory seats,
// and a table of every district's seats and every party's votes in it.
// enabled is false for the prerendered page, where the controls wait for
// the engine.
func Form(c *Config, id string, enabled bool) *Node {
	f := El("form", "class", "el-form", "data-role", "election-form", "novalidate", "", "aria-describedby", id+"-form-note")
	rules := El("fieldset", "class", "el-fields")
	rules.SetIf(!enabled, "disabled", "")
	rules.Add(Wrap("legend", "Rules"))
	field := func(name, label, hint, value string) {
		fid := id + "-" + name
		wrap := El("div", "class", "el-field")
		wrap.Add(Wrap("label", label, "for", fid))
		wrap.Add(El("input", "type", "text", "id", fid, "name", name, "autocomplete", "off", "value", value,
			"data-field", name, "aria-describedby", fid+"-hint"))
		wrap.Add(Wrap("small", hint, "id", fid+"-hint", "class", "el-hint"))
		rules.Add(wrap)
	}
	field("threshold", "Threshold", "share of all votes, e.g. 4%; empty for none", c.Threshold)
	field("compensatory", "Compensatory seats", "two-tier only, 0 to "+strconv.Itoa(MaxCompensatory), strconv.Itoa(c.Compensatory))
	f.Add(rules)

	votes := El("fieldset", "class", "el-fields el-votes")
	votes.SetIf(!enabled, "disabled", "")
	votes.Add(Wrap("legend", "Votes and seats by district"))
	t := El("table", "class", "el-table el-editor", "data-role", "election-editor")
	t.Add(Wrap("caption", "Each district's seats, and each party's votes in it (– where the party has no list)."))
	head := El("tr")
	head.Add(Wrap("th", "District", "scope", "col"), Wrap("th", "Seats", "scope", "col"))
	for _, p := range c.Parties {
		head.Add(Wrap("th", p, "scope", "col"))
	}
	t.Add(El("thead").Add(head))
	body := El("tbody")
	s := &c.Source.Scenario
	rows := make([][]int, len(s.Districts))
	for d := range rows {
		rows[d] = make([]int, len(c.Parties))
		for p := range rows[d] {
			rows[d][p] = -1
		}
	}
	for k, rc := range c.Rows {
		rows[rc.District][rc.Party] = k
	}
	for d, dist := range s.Districts {
		tr := El("tr", "data-district", dist.Name)
		tr.Add(Wrap("th", dist.Name, "scope", "row"))
		tr.Add(El("td").Add(El("input", "type", "text", "inputmode", "numeric", "autocomplete", "off", "size", "4",
			"value", strconv.Itoa(dist.Seats), "data-field", "seats", "data-district", strconv.Itoa(d),
			"aria-label", "Seats of "+dist.Name)))
		for p, party := range c.Parties {
			k := rows[d][p]
			if k < 0 {
				tr.Add(Wrap("td", "–"))
				continue
			}
			tr.Add(El("td").Add(El("input", "type", "text", "inputmode", "decimal", "autocomplete", "off", "size", "8",
				"value", s.Votes[k].Votes.String(), "data-field", "votes", "data-row", strconv.Itoa(k),
				"aria-label", "Votes for "+party+" in "+dist.Name)))
		}
		body.Add(tr)
	}
	f.Add(votes.Add(Stackable(t.Add(body))))
	f.Add(Wrap("p", "", "class", "el-error", "data-role", "election-error", "role", "alert", "hidden", ""))
	note := "Change a number and the three results below follow, computed in your browser; nothing is sent anywhere."
	if !enabled {
		note = "The results below were computed when the page was built. With JavaScript on, you can change the votes, seats, threshold and compensatory seats and see the results follow."
	}
	f.Add(Wrap("p", note, "id", id+"-form-note", "class", "el-hint"))
	return f
}

// Prerender writes a block as a page carries it before the engine runs:
// the root with data-state="static", the block's document (configJSON, a
// JSON object that must not contain "</"), the controls (disabled) and
// the results computed by the native engine.
func Prerender(c *Config, id, configJSON string, o *Outcome) string {
	root := El("div", "class", "election", "id", id, "data-election", "", "data-state", "static")
	h := strings.TrimSuffix(HTML(root), "</div>")
	return h + `<script type="application/json">` + configJSON + `</script>` +
		HTML(Form(c, id, false)) + HTML(Output(c, o, id)) + "</div>"
}
