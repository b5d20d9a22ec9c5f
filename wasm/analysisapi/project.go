package main

import (
	"context"
	"errors"
	"strconv"

	"seatsmith/engine/input"
	"seatsmith/engine/jsondoc"
	"seatsmith/engine/projection"
	"seatsmith/engine/report"
	"seatsmith/site/forecast"
	"seatsmith/engine/render"
)

// The projection functions run a study in chunks, so that a page's worker
// can report progress and stop between them:
//
//	projectStart(block)        → {id, draws}: reads a projection block
//	                             (site/forecast.Parse; counts as text)
//	                             and prepares its study, no draws made
//	projectRun({id, draws: k}) → {done, draws}: makes the next k draws
//	projectResult({id, block}) → {document, view, claims}: the projection
//	                             document (report.Projection), the result
//	                             markup (forecast.Output as a render tree,
//	                             element ids prefixed by block) and each
//	                             claim's {id, holds, found}
//	projectDrop({id})          → null: forgets the study
//
// Draw i depends on the seed and i alone, so the chunks give the numbers
// one native run gives.
func init() {
	register("projectStart", projectStart)
	register("projectRun", projectRun)
	register("projectResult", projectResult)
	register("projectDrop", projectDrop)
}

type liveStudy struct {
	cfg *forecast.Config
	st  *projection.Study
}

// maxStudies is the most studies kept at once; starting another forgets
// the oldest.
const maxStudies = 4

var (
	studies   = map[int]*liveStudy{}
	nextStudy = 1
)

func projectStart(arg *jsondoc.Value) (*jsondoc.Value, error) {
	cfg, err := forecast.Parse("", 0, arg)
	if err != nil {
		return nil, err
	}
	st, err := cfg.Study()
	if err != nil {
		var ie *input.Error
		if errors.As(err, &ie) && ie.File != "" {
			// Name the counts file, line and field in the message.
			where := ie.File
			if ie.Line > 0 {
				where += ", line " + strconv.Itoa(ie.Line)
			}
			if ie.Field != "" {
				where += ", " + ie.Field
			}
			return nil, &input.Error{Msg: where + ": " + ie.Msg}
		}
		return nil, err
	}
	for len(studies) >= maxStudies {
		oldest := nextStudy
		for id := range studies {
			oldest = min(oldest, id)
		}
		delete(studies, oldest)
	}
	id := nextStudy
	nextStudy++
	studies[id] = &liveStudy{cfg, st}
	return jsondoc.NewObject().Set("id", jsondoc.Int(id)).Set("draws", jsondoc.Int(cfg.Draws)), nil
}

func studyArg(arg *jsondoc.Value) (*liveStudy, error) {
	if arg.Kind != jsondoc.Object {
		return nil, &input.Error{Msg: "give {id: …} of a study from projectStart"}
	}
	v := arg.Get("id")
	if v == nil || v.Kind != jsondoc.Number {
		return nil, &input.Error{Field: "id", Msg: "missing: give the study's id"}
	}
	id, err := strconv.Atoi(v.Text)
	if err != nil || studies[id] == nil {
		return nil, &input.Error{Field: "id", Msg: "no study " + strconv.Quote(v.Text) + " (dropped or never started)"}
	}
	return studies[id], nil
}

func projectRun(arg *jsondoc.Value) (*jsondoc.Value, error) {
	ls, err := studyArg(arg)
	if err != nil {
		return nil, err
	}
	k := 500
	if v := arg.Get("draws"); v != nil && !v.IsNull() {
		n, err := strconv.Atoi(v.Text)
		if err != nil || n < 1 {
			return nil, &input.Error{Field: "draws", Msg: "give a whole number of draws above zero"}
		}
		k = n
	}
	from := ls.st.Done()
	to := min(from+k, ls.cfg.Draws)
	if to > from {
		if err := ls.st.Run(context.Background(), from, to); err != nil {
			return nil, err
		}
	}
	return jsondoc.NewObject().Set("done", jsondoc.Int(ls.st.Done())).Set("draws", jsondoc.Int(ls.cfg.Draws)), nil
}

func projectResult(arg *jsondoc.Value) (*jsondoc.Value, error) {
	ls, err := studyArg(arg)
	if err != nil {
		return nil, err
	}
	block := "forecast"
	if v := arg.Get("block"); v != nil && v.Kind == jsondoc.String && v.Text != "" {
		block = v.Text
	}
	s := ls.st.Summary()
	claims := jsondoc.NewArray()
	for i := range ls.cfg.Claims {
		c := &ls.cfg.Claims[i]
		v := c.Check(s)
		claims.Append(jsondoc.NewObject().Set("id", jsondoc.Str(c.ID)).Set("holds", jsondoc.Boolean(v.Holds)).Set("found", jsondoc.Str(v.Found)))
	}
	return jsondoc.NewObject().Set("document", report.Projection(s)).
		Set("view", render.JSON(forecast.Output(ls.cfg, s, block))).Set("claims", claims), nil
}

func projectDrop(arg *jsondoc.Value) (*jsondoc.Value, error) {
	if arg.Kind == jsondoc.Object {
		if v := arg.Get("id"); v != nil {
			if id, err := strconv.Atoi(v.Text); err == nil {
				delete(studies, id)
			}
		}
	}
	return nil, nil
}
