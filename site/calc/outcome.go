package calc

import (
	"errors"
	"strconv"
	"strings"

	"seatsmith/engine"
	"seatsmith/engine/analysis"
	"seatsmith/engine/input"
	"seatsmith/engine/jsondoc"
	"seatsmith/site/claim"
)

// A Problem is why a scenario cannot be apportioned, placed at the editor
// field at fault.
type Problem struct {
	Msg string
	// Field is the editor field at fault: "seats", "method", "min", "max",
	// "threshold", "tie", "units", or "units.K.name" and the like for unit K
	// (0-based); empty when no one field is at fault.
	Field string
}

// An Outcome is a calculator's scenario apportioned, compared and checked.
type Outcome struct {
	Block *Block
	// Doc is the scenario document the outcome is for.
	Doc        *jsondoc.Value
	Title      string
	Scenario   engine.Scenario
	Result     *engine.Result
	Comparison *analysis.Comparison
	Verdicts   []claim.Verdict
	// Problem is set, and the results are nil, when the scenario cannot be
	// apportioned.
	Problem *Problem
	// MarginsPending is set when the margins were left out to answer
	// quickly (see [Options]); the result has no Gain and Lose.
	MarginsPending bool
	// OrderPending is set when a full calculator's seat order was left
	// out (see [Options]); the result has no Order, and the layout shows
	// the order's folded section with a note in place of its table.
	OrderPending bool

	// The findings of a variation block, by its mode; Result and
	// Comparison are nil for these blocks.
	Sweep  *SweepOutcome
	Growth *GrowthOutcome
	Admit  *AdmitOutcome
}

// Costly margins (engine.Scenario.CostlyMargins) are filled in without
// being asked only for small scenarios: at most autoMarginUnits units and
// a total of at most autoMarginTotal. Their cost grows much faster than
// the units (by Hamilton's method with bounds, about 0.06 s natively at
// 100 units and 0.3 s at 300, several times that in a browser).
const (
	autoMarginUnits = 12
	autoMarginTotal = 1_000_000
)

// MarginsAuto reports whether pending margins are quick enough to fill in
// without being asked.
func (o *Outcome) MarginsAuto() bool {
	if !o.MarginsPending || o.Result == nil || len(o.Scenario.Units) > autoMarginUnits {
		return false
	}
	total, err := engine.ParseDecimal(o.Result.Total)
	return err == nil && total.Cmp(engine.Whole(autoMarginTotal)) <= 0
}

// Run apportions doc (the block's own scenario when doc is nil) with every
// explanation, compares the block's methods and checks its claims.
func Run(b *Block, doc *jsondoc.Value) *Outcome { return RunWith(b, doc, Options{}) }

// Options say what a run may leave out to answer a reader's edit quickly.
// The zero Options leave out nothing.
type Options struct {
	// QuickMargins leaves out the margins where they are costly
	// (engine.Scenario.CostlyMargins: a largest-remainder method with
	// minimums or maximums, or a threshold). The browser shows such
	// a result at once while the reader types and asks for the margins
	// when they pause.
	QuickMargins bool
	// NoOrder leaves out the seat order of divisor methods, which only a
	// full calculator shows, in a section folded away until the reader
	// opens it, and which the JSON export holds.
	NoOrder bool
}

// RunWith is Run leaving out what opt says.
func RunWith(b *Block, doc *jsondoc.Value, opt Options) *Outcome {
	o := run(b, doc, opt)
	o.Problem = b.Count.relabel(o.Problem)
	return o
}

func run(b *Block, doc *jsondoc.Value, opt Options) *Outcome {
	if doc == nil {
		doc = b.Doc
	}
	o := &Outcome{Block: b, Doc: doc}
	if err := precheckUnits(b.File, doc); err != nil {
		o.Problem = problemOf(err)
		return o
	}
	sdoc, va, ierr := readVariation(b.File, doc, b.vary)
	if ierr != nil {
		o.Problem = problemOf(ierr)
		return o
	}
	src, err := input.FromDoc(b.File, sdoc)
	if err == nil {
		err = checkBlockSize(src.Title, &src.Scenario)
	}
	if err != nil {
		o.Problem = problemOf(err)
		return o
	}
	o.Title, o.Scenario = src.Title, src.Scenario
	va.finish(&o.Scenario)
	for _, need := range []string{"seats", "method"} {
		if !src.Given[need] && b.Mode != Sweep {
			o.Problem = &Problem{Field: need, Msg: fieldLabel(need) + ": missing"}
			return o
		}
	}
	if b.vary != nil {
		b.vary.run(o, va)
		return o
	}
	detail := engine.Full
	if opt.NoOrder {
		detail &^= engine.WithOrder
		o.OrderPending = b.Mode == Full && src.Scenario.Method.IsDivisor()
	}
	if opt.QuickMargins && src.Scenario.CostlyMargins() {
		detail &^= engine.WithMargins
		o.MarginsPending = true
	}
	res, err := engine.Allot(&src.Scenario, detail)
	if err != nil {
		o.Problem = problemOf(err)
		return o
	}
	o.Result = res
	o.Comparison = analysis.CompareMethods(src.Scenario, b.Compare, 0)
	o.Verdicts = claim.CheckIn(src.Scenario, b.Claims, b.Count.claimWords(claim.Context{}))
	return o
}

// problemOf turns an input or engine error into a Problem.
func problemOf(err error) *Problem {
	var ie *input.Error
	var ee *engine.Error
	switch {
	case errors.As(err, &ie):
		f := editorField(ie.Field)
		return &Problem{Field: f, Msg: placeLabel(f) + ie.Msg}
	case errors.As(err, &ee):
		f := ee.Field
		if ee.Unit >= 0 {
			f = "units." + strconv.Itoa(ee.Unit) + "." + ee.Field
		}
		return &Problem{Field: f, Msg: placeLabel(f) + ee.Msg}
	}
	return &Problem{Msg: err.Error()}
}

// editorField turns "units[2].population" into "units.2.population".
func editorField(f string) string {
	if strings.HasPrefix(f, "methods[") {
		return "methods" // one group of checkboxes
	}
	if !strings.HasPrefix(f, "units[") {
		return f
	}
	r := strings.NewReplacer("[", ".", "]", "")
	return r.Replace(f)
}

var fieldLabels = map[string]string{
	"seats": "House size", "method": "Method", "min": "Minimum seats", "max": "Maximum seats",
	"threshold": "Threshold", "tie": "Tie rule", "units": "Units", "population": "population",
	"name": "name", "title": "Title", "version": "Version",
	"from": "From (house size)", "to": "To (house size)", "methods": "Methods", "later": "later population",
	"admit": "New unit", "admit.name": "New unit's name", "admit.population": "New unit's population",
	"admit.added": "Seats added for the new unit",
}

func fieldLabel(f string) string {
	if l, ok := fieldLabels[f]; ok {
		return l
	}
	return f
}

// placeLabel names a field for a message: "Unit 3, population: ".
func placeLabel(f string) string {
	if f == "" {
		return ""
	}
	parts := strings.Split(f, ".")
	if parts[0] == "units" && len(parts) >= 2 {
		k, err := strconv.Atoi(parts[1])
		if err == nil {
			s := "Unit " + strconv.Itoa(k+1)
			if len(parts) >= 3 {
				s += ", " + fieldLabel(parts[2])
			}
			return s + ": "
		}
	}
	return fieldLabel(f) + ": "
}
