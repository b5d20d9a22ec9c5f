package main

import (
	"errors"
	"strconv"
)

// A module is what wasmsize reads from a WebAssembly binary: the size of
// each function body in the code section, with the function's name where
// the binary has a name section, and the size of the data section.
type module struct {
	funcs    []function
	data     int // bytes of the data section
	sections map[string]int
}

type function struct {
	name string // "" when the binary carries no names
	size int    // bytes of the body
}

// readModule parses the sections of a WebAssembly binary (version 1).
func readModule(b []byte) (*module, error) {
	if len(b) < 8 || string(b[:4]) != "\x00asm" || b[4] != 1 || b[5] != 0 || b[6] != 0 || b[7] != 0 {
		return nil, errors.New("not a WebAssembly (version 1) binary")
	}
	m := &module{sections: map[string]int{}}
	imported := 0
	names := map[int]string{}
	r := &reader{b: b, i: 8}
	for r.i < len(b) {
		id := r.byte()
		size := r.uleb()
		if r.err != nil || size > len(b)-r.i {
			return nil, errors.New("truncated section at byte " + strconv.Itoa(r.i))
		}
		body := &reader{b: b[r.i : r.i+size]}
		r.i += size
		switch id {
		case 0: // custom
			name := body.name()
			m.sections["custom "+name] += size
			if name == "name" {
				readNames(body, names)
			}
		case 2: // import
			m.sections["import"] += size
			for n := body.uleb(); n > 0 && body.err == nil; n-- {
				body.name()
				body.name()
				switch kind := body.byte(); kind {
				case 0: // function: type index
					imported++
					body.uleb()
				case 1: // table: element type and limits
					body.byte()
					body.limits()
				case 2: // memory: limits
					body.limits()
				case 3: // global: type and mutability
					body.byte()
					body.byte()
				}
			}
		case 10: // code
			m.sections["code"] += size
			n := body.uleb()
			for k := 0; k < n && body.err == nil; k++ {
				sz := body.uleb()
				if sz > len(body.b)-body.i {
					return nil, errors.New("truncated function body")
				}
				body.i += sz
				m.funcs = append(m.funcs, function{size: sz})
			}
		case 11: // data
			m.sections["data"] += size
			m.data += size
		default:
			m.sections[sectionName(id)] += size
		}
		if body.err != nil {
			return nil, errors.New("malformed " + sectionName(id) + " section: " + body.err.Error())
		}
	}
	for k := range m.funcs {
		m.funcs[k].name = names[imported+k]
	}
	return m, nil
}

// readNames reads the function names subsection of a name section.
func readNames(r *reader, names map[int]string) {
	for r.i < len(r.b) && r.err == nil {
		id := r.byte()
		size := r.uleb()
		if r.err != nil || size > len(r.b)-r.i {
			return
		}
		sub := &reader{b: r.b[r.i : r.i+size]}
		r.i += size
		if id != 1 {
			continue
		}
		for n := sub.uleb(); n > 0 && sub.err == nil; n-- {
			idx := sub.uleb()
			names[idx] = sub.name()
		}
	}
}

func sectionName(id byte) string {
	names := [...]string{"custom", "type", "import", "function", "table", "memory", "global", "export", "start", "element", "code", "data", "data count"}
	if int(id) < len(names) {
		return names[id]
	}
	return "section " + strconv.Itoa(int(id))
}

// reader decodes the primitive encodings of the binary format. The first
// error sticks; later reads return zero values.
type reader struct {
	b   []byte
	i   int
	err error
}

var errShort = errors.New("unexpected end")

func (r *reader) byte() byte {
	if r.err != nil || r.i >= len(r.b) {
		r.err = errShort
		return 0
	}
	c := r.b[r.i]
	r.i++
	return c
}

// uleb reads an unsigned LEB128 number of at most 32 bits.
func (r *reader) uleb() int {
	var x uint64
	for shift := 0; shift < 35; shift += 7 {
		c := r.byte()
		if r.err != nil {
			return 0
		}
		x |= uint64(c&0x7f) << shift
		if c < 0x80 {
			if x > 1<<32-1 {
				r.err = errors.New("number out of range")
				return 0
			}
			return int(x)
		}
	}
	r.err = errors.New("number too long")
	return 0
}

func (r *reader) name() string {
	n := r.uleb()
	if r.err != nil || n > len(r.b)-r.i {
		r.err = errShort
		return ""
	}
	s := string(r.b[r.i : r.i+n])
	r.i += n
	return s
}

func (r *reader) limits() {
	if r.byte()&1 != 0 {
		r.uleb()
	}
	r.uleb()
}
