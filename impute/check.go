package impute

import "github.com/tabprep/tabprep"

// Params come from a state document or from the caller's code, so the
// transforms that index by them check their shape first and return an
// error rather than panic.

func badParams(op, format string, args ...any) error {
	return tabprep.Errorf(op, tabprep.ErrValue, "", "malformed params: "+format+"; fit the step again", args...)
}

func (p KNearestParams) check(op string) error {
	d := len(p.Columns)
	switch {
	case p.K < 1 || p.K > MaxK:
		return badParams(op, "K = %d", p.K)
	case p.Weights != WeightUniform && p.Weights != WeightDistance:
		return badParams(op, "weights %q", p.Weights)
	case len(p.Center) != d || len(p.Scale) != d:
		return badParams(op, "%d columns but %d centres and %d scales", d, len(p.Center), len(p.Scale))
	case p.Rows < 0 || len(p.Reference) != p.Rows*d:
		return badParams(op, "%d reference values for %d rows of %d columns", len(p.Reference), p.Rows, d)
	}
	return nil
}

func (p ChainedParams) check(op string) error {
	d := len(p.Columns)
	if len(p.Center) != d || len(p.Equations) != d {
		return badParams(op, "%d columns but %d centres and %d equations", d, len(p.Center), len(p.Equations))
	}
	for _, e := range p.Equations {
		if len(e.Coef) != d {
			return badParams(op, "equation of %q has %d coefficients for %d columns", e.Target, len(e.Coef), d)
		}
	}
	for _, t := range p.Order {
		if t < 0 || t >= d {
			return badParams(op, "order index %d outside [0, %d)", t, d)
		}
	}
	if p.Rounds < 0 || p.Rounds > MaxRounds {
		return badParams(op, "%d rounds", p.Rounds)
	}
	return nil
}
