package render

import (
	"fmt"
	"testing"
)

func TestStackable(t *testing.T) {
	table := func() *Node {
		return El("table", "class", "sc-results").Add(
			El("thead").Add(El("tr").Add(Wrap("th", "Unit", "scope", "col"), Wrap("th", " Seats ", "scope", "col"),
				El("th", "scope", "col").Add(Wrap("span", "Remove", "class", "sc-vh")))),
			El("tbody").Add(El("tr").Add(Wrap("th", "North", "scope", "row"), Wrap("td", "9"), El("td").Add(Wrap("button", "×")))),
			El("tfoot").Add(El("tr").Add(Wrap("th", "Total", "scope", "row"), Wrap("td", "15"))))
	}
	cases := []struct {
		name string
		t    *Node
		want string
	}{
		{"labels body and foot", table(),
			`<table class="sc-results sc-stack"><thead><tr><th scope="col">Unit</th><th scope="col"> Seats </th><th scope="col"><span class="sc-vh">Remove</span></th></tr></thead>` +
				`<tbody><tr><th scope="row" data-label="Unit">North</th><td data-label="Seats">9</td><td><button>×</button></td></tr></tbody>` +
				`<tfoot><tr><th scope="row" data-label="Unit">Total</th><td data-label="Seats">15</td></tr></tfoot></table>`},
		{"no header", El("table").Add(El("tbody").Add(El("tr").Add(Wrap("td", "1")))),
			`<table class="sc-stack"><tbody><tr><td>1</td></tr></tbody></table>`},
		{"more cells than headers", El("table").Add(El("thead").Add(El("tr").Add(Wrap("th", "A"))), El("tbody").Add(El("tr").Add(Wrap("td", "1"), Wrap("td", "2")))),
			`<table class="sc-stack"><thead><tr><th>A</th></tr></thead><tbody><tr><td data-label="A">1</td><td>2</td></tr></tbody></table>`},
	}
	for _, c := range cases {
		if got := HTML(Stackable(c.t)); got != c.want {
			t.Errorf("%s:\n got %s\nwant %s", c.name, got, c.want)
		}
	}
}

func ExampleStackable() {
	t := El("table").Add(
		El("thead").Add(El("tr").Add(Wrap("th", "Unit"), Wrap("th", "Seats"))),
		El("tbody").Add(El("tr").Add(Wrap("th", "North", "scope", "row"), Wrap("td", "9"))))
	fmt.Println(HTML(Stackable(t)))
	// Output:
	// <table class="sc-stack"><thead><tr><th>Unit</th><th>Seats</th></tr></thead><tbody><tr><th scope="row" data-label="Unit">North</th><td data-label="Seats">9</td></tr></tbody></table>
}
