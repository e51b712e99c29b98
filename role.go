package tabprep

import "strings"

// Role is the role of one row: train, or holdout in a named partition.
type Role struct {
	Holdout   bool
	Partition string // "" for train; the partition name for holdout
}

// Train is the role of a training row, the zero Role.
var Train = Role{}

// DefaultPartition is the partition name of a holdout row tagged without one.
const DefaultPartition = "holdout"

// Holdout returns the role of a holdout row in the named partition, such as
// "validation" or "test"; "" means [DefaultPartition].
func Holdout(partition string) Role {
	if partition == "" {
		partition = DefaultPartition
	}
	return Role{Holdout: true, Partition: partition}
}

// String returns "train" or the holdout partition name.
func (r Role) String() string {
	if !r.Holdout {
		return "train"
	}
	if r.Partition == "" {
		return DefaultPartition
	}
	return r.Partition
}

// ParseRole parses the names [Role.String] returns: "train", or any other
// non-empty name, which is a holdout partition.
func ParseRole(s string) (Role, error) {
	switch {
	case s == "train":
		return Train, nil
	case s == "" || strings.TrimSpace(s) != s:
		return Role{}, Errorf("tabprep.role", ErrRole, "", "role %q: use \"train\" or a partition name without surrounding spaces", s)
	}
	return Holdout(s), nil
}

// normal returns r with the partition name filled in, or an error if r is
// malformed.
func (r Role) normal() (Role, error) {
	if !r.Holdout {
		if r.Partition != "" {
			return r, Errorf("tabprep.role", ErrRole, "", "train role with partition %q; use tabprep.Holdout(%q)", r.Partition, r.Partition)
		}
		return r, nil
	}
	if r.Partition == "train" {
		return r, Errorf("tabprep.role", ErrRole, "", "holdout partition may not be named \"train\"")
	}
	return Holdout(r.Partition), nil
}

// roleTable stores one role per row compactly: code 0 is train, code k is
// holdout in parts[k-1]. A nil codes slice means every row is train.
type roleTable struct {
	codes []uint8
	parts []string
}

const maxPartitions = 255

func (t roleTable) role(i int) Role {
	if t.codes == nil || t.codes[i] == 0 {
		return Train
	}
	return Role{Holdout: true, Partition: t.parts[t.codes[i]-1]}
}

func (t roleTable) holdouts() int {
	n := 0
	for _, c := range t.codes {
		if c != 0 {
			n++
		}
	}
	return n
}

// code returns the code for r, adding its partition to t.parts if needed.
func (t *roleTable) code(r Role) (uint8, error) {
	if !r.Holdout {
		return 0, nil
	}
	for i, p := range t.parts {
		if p == r.Partition {
			return uint8(i + 1), nil
		}
	}
	if len(t.parts) == maxPartitions {
		return 0, Errorf("tabprep.role", ErrRole, "", "more than %d holdout partitions", maxPartitions)
	}
	t.parts = append(t.parts, r.Partition)
	return uint8(len(t.parts)), nil
}

func (t roleTable) take(rows []int) roleTable {
	if t.codes == nil {
		return t
	}
	out := roleTable{codes: make([]uint8, len(rows)), parts: t.parts}
	any := false
	for i, r := range rows {
		out.codes[i] = t.codes[r]
		any = any || out.codes[i] != 0
	}
	if !any {
		return roleTable{}
	}
	return out
}
