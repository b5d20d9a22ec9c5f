package format

// A Table is a grid of text cells with named columns. Its rows are either
// held (added with [Table.Add]) or made one at a time as they are written
// (Row, for a table of millions of rows).
type Table struct {
	Columns []Column
	// N is the number of rows Row makes; Row returns row i and may reuse
	// dst (the slice it returned for the previous row) to hold it. Nil
	// for a table whose rows are held.
	N   int
	Row func(i int, dst []string) []string

	rows [][]string
}

// A Column is a table's column: its name and whether it holds numbers.
// Numbers are aligned right in text; in CSV a numeric column holds only
// plain numbers (or nothing), which are never guarded as formulas.
type Column struct {
	Name   string
	Number bool
}

// Text returns text columns with the names.
func Text(names ...string) []Column {
	cs := make([]Column, len(names))
	for i, n := range names {
		cs[i] = Column{Name: n}
	}
	return cs
}

// Numbers returns numeric columns with the names.
func Numbers(names ...string) []Column {
	cs := make([]Column, len(names))
	for i, n := range names {
		cs[i] = Column{Name: n, Number: true}
	}
	return cs
}

// NewTable returns a table without rows whose columns are the groups', in
// order.
func NewTable(groups ...[]Column) *Table {
	t := &Table{}
	for _, g := range groups {
		t.Columns = append(t.Columns, g...)
	}
	return t
}

// Add appends a row of cells, one a column, and returns t.
func (t *Table) Add(cells ...string) *Table {
	t.rows = append(t.rows, cells)
	return t
}

// Len returns the number of rows.
func (t *Table) Len() int {
	if t.Row != nil {
		return t.N
	}
	return len(t.rows)
}

// At returns row i, in dst when the rows are made as they are written.
func (t *Table) At(i int, dst []string) []string {
	if t.Row != nil {
		return t.Row(i, dst)
	}
	return t.rows[i]
}

// Names returns the columns' names.
func (t *Table) Names() []string {
	ns := make([]string, len(t.Columns))
	for i, c := range t.Columns {
		ns[i] = c.Name
	}
	return ns
}

// IsNumber reports whether column i holds numbers.
func (t *Table) IsNumber(i int) bool { return i < len(t.Columns) && t.Columns[i].Number }
