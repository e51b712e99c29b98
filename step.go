package tabprep

// Step is the contract every transformer implements. The step value holds
// what the user chose; P holds what Fit learned from train rows. Both are
// plain structs with exported fields and JSON tags, so they can be printed,
// compared and saved.
//
// Fit must refuse a frame with holdout rows ([RequireTrain]). Transform
// must be a pure function of (p, data): it never modifies data, keeps its
// rows, their order and their roles (unless the step is documented as one
// that drops rows), and is safe to call from many goroutines at once.
type Step[P any] interface {
	// Kind returns the stable identifier of the step in saved state, such
	// as "scale.zscore".
	Kind() string
	// Fit learns parameters from train rows.
	Fit(train *Frame) (P, error)
	// Transform applies fitted parameters to data.
	Transform(p P, data *Frame) (*Frame, error)
}

// Inverter is implemented by steps whose transform can be undone, such as a
// scaled regression target.
type Inverter[P any] interface {
	// Inverse maps transformed data back: Inverse(p, Transform(p, x)) is x
	// up to rounding.
	Inverse(p P, data *Frame) (*Frame, error)
}

// Cell is one value of a row: Num for a numeric column (NaN when missing);
// Str and Code for a categorical one. Str is the level ("" when missing).
// Code is the level's index in the Levels of the schema that lays out the
// row, [MissingCode] when missing, or [UnseenCode] when Str is not among
// those levels; kernels may use Code to avoid looking strings up, and a
// kernel that writes a categorical cell sets both.
type Cell struct {
	Num  float64
	Str  string
	Code int32
}

// UnseenCode is the Code of a categorical [Cell] whose level the layout
// schema does not list, such as a level first met in serving.
const UnseenCode int32 = -2

// RowFunc applies a fitted step to one row held in a register file of
// cells: the slots it reads and writes were fixed when it was made, from a
// [RowLayout]. A RowFunc writes every slot it adds, on every row, must not
// allocate on the common path, and must be safe for concurrent use (each
// caller has its own register file). In a register, a numeric cell's Str
// and Code mean nothing, so a kernel that makes a numeric value writes Num
// alone; a plan hands out numeric cells with Str and Code cleared.
type RowFunc func(regs []Cell) error

// RowKernel is implemented by steps that can act on a single row, for
// compiled serving plans.
type RowKernel[P any] interface {
	// RowKernel returns the row function of p for rows laid out by l, and
	// records in l what the step does to the columns (see [RowLayout]), so
	// that l afterwards lays out the step's output.
	RowKernel(p P, l *RowLayout) (RowFunc, error)
}

// Accumulator gathers the statistics of a fit chunk by chunk, for data that
// does not fit in memory or is fitted in parts on several machines.
type Accumulator[P any] interface {
	// Add folds a chunk of train rows into the statistics.
	Add(chunk *Frame) error
	// Merge folds another accumulator of the same step into this one.
	Merge(other Accumulator[P]) error
	// Finish returns the parameters; the same as Fit on all rows added.
	Finish() (P, error)
}

// Accumulating is implemented by steps that can be fitted chunk by chunk.
type Accumulating[P any] interface {
	// Accumulator returns an empty accumulator for this step.
	Accumulator() Accumulator[P]
}

// OutOfFold is implemented by steps whose values for the training rows must
// not come from a fit on those same rows (target encoding is the common
// case: in-fold values leak the target). A pipeline fitting such a step
// passes the returned frame, not Transform(p, train), to the steps after it.
type OutOfFold[P any] interface {
	// FitOutOfFold returns the parameters fitted on all of train, and train
	// transformed with values computed out of fold.
	FitOutOfFold(train *Frame) (P, *Frame, error)
}

// Supervised is implemented by steps that learn from target columns, such
// as target encoding. A pipeline gives such a step the target columns when
// it fits, and keeps them out of every other step, its input schema and its
// output, so that new rows need not carry the target and no other step
// fits on it by accident.
type Supervised interface {
	// Targets returns the names of the target columns the step reads at fit.
	Targets() []string
}
