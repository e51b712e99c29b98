package impute

import "github.com/tabprep/tabprep"

// The steps that act on one row. CarryForward, CarryBackward, Interpolate
// and DropRows are missing on purpose: their output for a row depends on
// the other rows of the frame.
var (
	_ tabprep.RowKernel[FillParams]      = Mean{}
	_ tabprep.RowKernel[FillParams]      = Median{}
	_ tabprep.RowKernel[FillParams]      = Min{}
	_ tabprep.RowKernel[FillParams]      = Max{}
	_ tabprep.RowKernel[FillParams]      = MostFrequent{}
	_ tabprep.RowKernel[FillParams]      = Constant{}
	_ tabprep.RowKernel[FillParams]      = Fill{}
	_ tabprep.RowKernel[ChainedParams]   = Chained{}
	_ tabprep.RowKernel[KNearestParams]  = KNearest{}
	_ tabprep.RowKernel[SparseParams]    = DropSparse{}
	_ tabprep.RowKernel[IndicatorParams] = Indicators{}
)
