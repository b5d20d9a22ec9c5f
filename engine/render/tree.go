package render

import (
	"sync"

	"seatsmith/engine/jsondoc"
)

// Doc returns n in the JSON form described in the package documentation,
// as a tree of values that a caller can inspect. [JSON] writes the same
// text directly, which is what answers to the browser use.
func Doc(n *Node) *jsondoc.Value {
	if n.Tag == "" {
		return jsondoc.Str(n.Text)
	}
	attrs := jsondoc.NewObject()
	for _, a := range n.Attrs {
		attrs.Set(a.Key, jsondoc.Str(a.Val))
	}
	v := jsondoc.NewArray(jsondoc.Str(n.Tag), attrs)
	for _, k := range n.Kids {
		v.Append(Doc(k))
	}
	return v
}

// JSON returns n in the JSON form as one raw JSON value (see
// jsondoc.RawJSON), written directly from the tree: the same text as
// jsondoc.Marshal(Doc(n)) at a fraction of the cost, for the answers the
// browser asks for after every edit.
func JSON(n *Node) *jsondoc.Value {
	bp := jsonBuffers.Get().(*[]byte)
	b := AppendJSON((*bp)[:0], n)
	v := jsondoc.RawJSON(string(b))
	if cap(b) <= maxKeptJSON {
		*bp = b
		jsonBuffers.Put(bp)
	}
	return v
}

// jsonBuffers keeps the buffers JSON writes into: the answer to an edit
// would otherwise grow a new one from nothing each time, several times
// over the answer's length.
var jsonBuffers = sync.Pool{New: func() any { return new([]byte) }}

// maxKeptJSON is the largest buffer JSON keeps for reuse.
const maxKeptJSON = 1 << 20

// AppendJSON appends n in the JSON form to b.
func AppendJSON(b []byte, n *Node) []byte {
	if n.Tag == "" {
		return jsondoc.AppendString(b, n.Text)
	}
	b = append(b, '[')
	b = jsondoc.AppendString(b, n.Tag)
	b = append(b, ",{"...)
	for i, a := range n.Attrs {
		if i > 0 {
			b = append(b, ',')
		}
		b = jsondoc.AppendString(b, a.Key)
		b = append(b, ':')
		b = jsondoc.AppendString(b, a.Val)
	}
	b = append(b, '}')
	for _, k := range n.Kids {
		b = append(b, ',')
		b = AppendJSON(b, k)
	}
	return append(b, ']')
}

// FromDoc reads a tree in the JSON form back, from a tree of values or from
// raw JSON text (as [JSON] makes). It reports false for a value that is not
// in that form or uses a tag outside [Allowed].
func FromDoc(v *jsondoc.Value) (*Node, bool) {
	if v == nil {
		return nil, false
	}
	if v.Kind == jsondoc.Raw {
		p, err := jsondoc.Parse([]byte(v.Text))
		if err != nil {
			return nil, false
		}
		v = p
	}
	switch v.Kind {
	case jsondoc.String:
		return Text(v.Text), true
	case jsondoc.Array:
	default:
		return nil, false
	}
	if len(v.Items) < 2 || v.Items[0].Kind != jsondoc.String || v.Items[1].Kind != jsondoc.Object || !Allowed(v.Items[0].Text) {
		return nil, false
	}
	n := &Node{Tag: v.Items[0].Text}
	for _, f := range v.Items[1].Fields {
		if f.Value.Kind != jsondoc.String {
			return nil, false
		}
		n.Attrs = append(n.Attrs, Attr{f.Key, f.Value.Text})
	}
	for _, k := range v.Items[2:] {
		c, ok := FromDoc(k)
		if !ok {
			return nil, false
		}
		n.Kids = append(n.Kids, c)
	}
	return n, true
}
