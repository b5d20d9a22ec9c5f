package render

import "seatsmith/engine/jsondoc"

// Doc returns n in the JSON form described in the package documentation.
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

// FromDoc reads a tree in the JSON form back. It reports false for a value
// that is not in that form or uses a tag outside [Allowed].
func FromDoc(v *jsondoc.Value) (*Node, bool) {
	if v == nil {
		return nil, false
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
