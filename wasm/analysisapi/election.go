package analysisapi

import (
	"errors"

	"seatsmith/engine/input"
	"seatsmith/engine/jsondoc"
	"seatsmith/engine/render"
	"seatsmith/site/election"
)

// maxElectionText is the most bytes of an election block's document given
// as text, and maxElectionValues the most JSON values in it (a block at
// its limits holds about 10,000).
const (
	maxElectionText   = 4 << 20
	maxElectionValues = 100_000
)

// electionCall computes an election block under its three systems:
//
//	election({block, doc}) → {view, claims}
//
// doc is the block's document (site/election.Parse), as an object or as
// JSON text; block is the block's element id, which prefixes the ids in
// the markup. view is the result markup (election.Output as a render
// tree) and claims each claim's {id, holds, found}. The block's limits
// (districts, parties, vote rows, seats) are checked before anything is
// computed; a bad document comes back as an error naming the field.
func electionCall(arg, _ *jsondoc.Value) (*jsondoc.Value, error) {
	block := "election"
	var doc *jsondoc.Value
	if err := jsondoc.Decode(arg, "the argument", []jsondoc.Member{
		{Key: "block", Read: jsondoc.ReadString(&block)},
		{Key: "doc", Read: jsondoc.ReadValue(&doc)},
	}); err != nil {
		return nil, err
	}
	if doc == nil {
		return nil, &input.Error{Field: "doc", Msg: "missing: give the election block's document"}
	}
	if doc.Kind == jsondoc.String {
		if len(doc.Text) > maxElectionText {
			return nil, &input.Error{Field: "doc", Msg: "the document is larger than the limit of 4 MiB"}
		}
		v, err := jsondoc.ParseLimit([]byte(doc.Text), maxElectionValues)
		if err != nil {
			var se *jsondoc.SyntaxError
			if errors.As(err, &se) {
				return nil, &input.Error{Line: se.Line, Field: "doc", Msg: "the document's JSON is malformed: " + se.Msg}
			}
			return nil, &input.Error{Field: "doc", Msg: err.Error()}
		}
		doc = v
	}
	cfg, err := election.Parse("", 0, doc)
	if key := election.LimitKey(err); key != "" {
		var ie *input.Error
		errors.As(err, &ie)
		return nil, &input.Error{Field: ie.Field, Msg: ie.Msg + " (limits().election_" + key + ")"}
	}
	if err != nil {
		return nil, err
	}
	o, err := cfg.Run()
	if err != nil {
		return nil, err
	}
	claims := jsondoc.NewArray()
	for i := range cfg.Claims {
		c := &cfg.Claims[i]
		v := c.Check(cfg, o)
		claims.Append(jsondoc.NewObject().Set("id", jsondoc.Str(c.ID)).Set("holds", jsondoc.Boolean(v.Holds)).Set("found", jsondoc.Str(v.Found)))
	}
	return jsondoc.NewObject().Set("view", render.JSON(election.Output(cfg, o, block))).Set("claims", claims), nil
}
