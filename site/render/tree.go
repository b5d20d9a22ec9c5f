package render

import "seatsmith/engine/jsondoc"

// Doc returns n in the JSON form described in the package documentation.
// The values are cut from three slabs sized beforehand, so that a tree of
// thousands of nodes costs a handful of allocations instead of several per
// node (the browser asks for one after every edit).
func Doc(n *Node) *jsondoc.Value {
	var s docSlabs
	s.size(n)
	s.vals = make([]jsondoc.Value, 0, s.nv)
	s.items = make([]*jsondoc.Value, 0, s.ni)
	s.fields = make([]jsondoc.Field, 0, s.nf)
	return s.doc(n)
}

// docSlabs holds the values, array items and object members of one Doc.
type docSlabs struct {
	nv, ni, nf int
	vals       []jsondoc.Value
	items      []*jsondoc.Value
	fields     []jsondoc.Field
}

// size counts what the tree n needs.
func (s *docSlabs) size(n *Node) {
	if n.Tag == "" {
		s.nv++
		return
	}
	s.nv += 3 + len(n.Attrs) // the array, its tag, its attributes and their values
	s.ni += 2 + len(n.Kids)
	s.nf += len(n.Attrs)
	for _, k := range n.Kids {
		s.size(k)
	}
}

func (s *docSlabs) value(v jsondoc.Value) *jsondoc.Value {
	s.vals = append(s.vals, v)
	return &s.vals[len(s.vals)-1]
}

func (s *docSlabs) doc(n *Node) *jsondoc.Value {
	if n.Tag == "" {
		return s.value(jsondoc.Value{Kind: jsondoc.String, Text: n.Text})
	}
	f0 := len(s.fields)
	for _, a := range n.Attrs {
		s.fields = append(s.fields, jsondoc.Field{Key: a.Key, Value: s.value(jsondoc.Value{Kind: jsondoc.String, Text: a.Val})})
	}
	attrs := s.value(jsondoc.Value{Kind: jsondoc.Object, Fields: s.fields[f0:len(s.fields):len(s.fields)]})
	i0 := len(s.items)
	s.items = append(s.items, s.value(jsondoc.Value{Kind: jsondoc.String, Text: n.Tag}), attrs)
	// Reserve the children's places first: their own items follow.
	for range n.Kids {
		s.items = append(s.items, nil)
	}
	items := s.items[i0:len(s.items):len(s.items)]
	for k, kid := range n.Kids {
		items[2+k] = s.doc(kid)
	}
	return s.value(jsondoc.Value{Kind: jsondoc.Array, Items: items})
}

// JSON returns n in the JSON form as one raw JSON value (see
// jsondoc.RawJSON), written directly from the tree: the same text as
// jsondoc.Marshal(Doc(n)) at a fraction of the cost, for the answers the
// browser asks for after every edit.
func JSON(n *Node) *jsondoc.Value { return jsondoc.RawJSON(string(AppendJSON(nil, n))) }

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
