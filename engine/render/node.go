package render

// A Node is an element or a run of text.
type Node struct {
	// Tag is the element's tag name; empty for a text node.
	Tag string
	// Text is the content of a text node.
	Text  string
	Attrs []Attr
	Kids  []*Node
}

// An Attr is one attribute of an element.
type Attr struct {
	Key, Val string
}

// El returns an element with the given tag and attributes, given as
// alternating keys and values. A key without a value gets the empty value.
//
//go:noinline
func El(tag string, kv ...string) *Node {
	n := newElement(len(kv))
	n.Tag = tag
	setPairs(n, kv)
	return n
}

// newElement returns an empty element with room for the attributes of kv
// of length k. Up to three attributes are allocated with the node, in one
// piece: a page's answer to an edit lays out thousands of elements.
func newElement(k int) *Node {
	switch {
	case k == 0:
		return &Node{}
	case k <= 6:
		x := &struct {
			n Node
			a [3]Attr
		}{}
		x.n.Attrs = x.a[:0:3]
		return &x.n
	}
	return &Node{Attrs: make([]Attr, 0, (k+1)/2)}
}

// setPairs appends the attributes given as alternating keys and values.
func setPairs(n *Node, kv []string) {
	for i := 0; i < len(kv); i += 2 {
		v := ""
		if i+1 < len(kv) {
			v = kv[i+1]
		}
		n.Attrs = append(n.Attrs, Attr{kv[i], v})
	}
}

// Text returns a text node.
//
//go:noinline
func Text(s string) *Node { return &Node{Text: s} }

// Add appends children and returns n. Nil children are skipped.
//
//go:noinline
func (n *Node) Add(kids ...*Node) *Node {
	for _, k := range kids {
		if k != nil {
			n.Kids = append(n.Kids, k)
		}
	}
	return n
}

// AddText appends a text child and returns n.
//
//go:noinline
func (n *Node) AddText(s string) *Node { return n.Add(Text(s)) }

// Set adds or replaces an attribute and returns n.
//
//go:noinline
func (n *Node) Set(key, val string) *Node {
	for i := range n.Attrs {
		if n.Attrs[i].Key == key {
			n.Attrs[i].Val = val
			return n
		}
	}
	n.Attrs = append(n.Attrs, Attr{key, val})
	return n
}

// SetIf adds the attribute when cond is true, and returns n.
//
//go:noinline
func (n *Node) SetIf(cond bool, key, val string) *Node {
	if cond {
		n.Set(key, val)
	}
	return n
}

// Attr returns the value of an attribute and whether it is set.
func (n *Node) Attr(key string) (string, bool) {
	for _, a := range n.Attrs {
		if a.Key == key {
			return a.Val, true
		}
	}
	return "", false
}

// Wrap returns an element holding the text s.
//
//go:noinline
func Wrap(tag, s string, kv ...string) *Node {
	if len(kv) > 4 {
		return El(tag, kv...).AddText(s)
	}
	// The element, its text, the list of its one child and up to two
	// attributes in one piece.
	x := &struct {
		n, text Node
		kids    [1]*Node
		a       [2]Attr
	}{}
	x.n.Tag, x.text.Text = tag, s
	x.kids[0] = &x.text
	x.n.Kids, x.n.Attrs = x.kids[:1:1], x.a[:0:2]
	setPairs(&x.n, kv)
	return &x.n
}

// Walk calls f for n and every node below it, depth first.
func (n *Node) Walk(f func(*Node)) {
	f(n)
	for _, k := range n.Kids {
		k.Walk(f)
	}
}

// TextContent returns the concatenated text below n, as the DOM's
// textContent would.
func (n *Node) TextContent() string {
	if n.Tag == "" {
		return n.Text
	}
	var b []byte
	n.Walk(func(x *Node) {
		if x.Tag == "" {
			b = append(b, x.Text...)
		}
	})
	return string(b)
}
