package analysisapi

import (
	"context"
	"errors"
	"strconv"

	"seatsmith/engine/format"
	"seatsmith/engine/input"
	"seatsmith/engine/jsondoc"
	model "seatsmith/engine/projection"
	"seatsmith/engine/render"
	"seatsmith/site/projection"
)

// The projection functions make a projection block's draws in chunks, so
// that a page's worker can report progress and stop between them:
//
//	projectStart(block)        → {id, draws}: reads a projection block
//	                             (site/projection.Parse; counts as text)
//	                             and prepares its run, no draws made
//	projectRun({id, draws: k}) → {done, draws}: makes the next k draws
//	projectResult({id, block}) → {document, view, claims}: the projection
//	                             document (format.ProjectionJSON), the result
//	                             markup (projection.Output as a render
//	                             tree, element ids prefixed by block) and
//	                             each claim's {id, holds, found}
//	projectDrop({id})          → null: forgets the run
//
// Draw i depends on the seed and i alone, so the chunks give the numbers
// one native run gives.

// A run is one projection block's draws, started by projectStart.
type run struct {
	cfg *projection.Config
	st  *model.Study
}

// maxRuns is the most runs kept at once; starting another forgets the
// oldest.
const maxRuns = 4

// maxChunk is the most draws one projectRun call makes.
const maxChunk = 10_000

var (
	runs    = map[int]*run{}
	nextRun = 1
)

func projectStart(arg, _ *jsondoc.Value) (*jsondoc.Value, error) {
	cfg, err := projection.Parse("", 0, arg)
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
	for len(runs) >= maxRuns {
		oldest := nextRun
		for id := range runs {
			oldest = min(oldest, id)
		}
		delete(runs, oldest)
	}
	id := nextRun
	nextRun++
	runs[id] = &run{cfg, st}
	return jsondoc.NewObject().Set("id", jsondoc.Int(id)).Set("draws", jsondoc.Int(cfg.Draws)), nil
}

// runArg reads {id, draws, block}: the run, and the members each function
// takes beside it.
func runArg(arg *jsondoc.Value, draws *int, block *string) (*run, error) {
	id := 0
	table := []jsondoc.Member{{Key: "id", Read: jsondoc.ReadInt(&id, 1, 1<<31-1)}}
	if draws != nil {
		table = append(table, jsondoc.Member{Key: "draws", Read: jsondoc.ReadInt(draws, 1, maxChunk)})
	}
	if block != nil {
		table = append(table, jsondoc.Member{Key: "block", Read: jsondoc.ReadString(block)})
	}
	if err := jsondoc.Decode(arg, "the argument", table); err != nil {
		return nil, err
	}
	if id == 0 {
		return nil, &input.Error{Field: "id", Msg: "missing: give the id projectStart returned"}
	}
	r := runs[id]
	if r == nil {
		return nil, &input.Error{Field: "id", Msg: "no run " + strconv.Itoa(id) + " (dropped or never started)"}
	}
	return r, nil
}

func projectRun(arg, _ *jsondoc.Value) (*jsondoc.Value, error) {
	k := 500
	r, err := runArg(arg, &k, nil)
	if err != nil {
		return nil, err
	}
	from := r.st.Done()
	to := min(from+k, r.cfg.Draws)
	if to > from {
		if err := r.st.Run(context.Background(), from, to); err != nil {
			return nil, err
		}
	}
	return jsondoc.NewObject().Set("done", jsondoc.Int(r.st.Done())).Set("draws", jsondoc.Int(r.cfg.Draws)), nil
}

func projectResult(arg, _ *jsondoc.Value) (*jsondoc.Value, error) {
	block := "projection"
	r, err := runArg(arg, nil, &block)
	if err != nil {
		return nil, err
	}
	s := r.st.Summary()
	claims := jsondoc.NewArray()
	for i := range r.cfg.Claims {
		c := &r.cfg.Claims[i]
		v := c.Check(s)
		claims.Append(jsondoc.NewObject().Set("id", jsondoc.Str(c.ID)).Set("holds", jsondoc.Boolean(v.Holds)).Set("found", jsondoc.Str(v.Found)))
	}
	return jsondoc.NewObject().Set("document", format.ProjectionJSON(s)).
		Set("view", render.JSON(projection.Output(r.cfg, s, block))).Set("claims", claims), nil
}

func projectDrop(arg, _ *jsondoc.Value) (*jsondoc.Value, error) {
	if arg.Kind == jsondoc.Object {
		if v := arg.Get("id"); v != nil {
			if id, err := strconv.Atoi(v.Text); err == nil {
				delete(runs, id)
			}
		}
	}
	return nil, nil
}
