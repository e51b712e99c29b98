package tabprep

// HasRoleColumn reports whether the header named the role column, so the
// rows' roles come from the input rather than all being train. A caller
// that writes what it reads uses it to decide whether to write roles.
func (d *CSVReader) HasRoleColumn() bool { return d.role >= 0 }
