// Package impute fills missing values, or drops what is too sparse to fill,
// with every decision learned from train rows and applied unchanged to new
// rows.
//
// # Conventions
//
// NaN is a missing numeric cell and [tabprep.MissingCode] (the empty level)
// a missing categorical cell. Inputs are never modified: a transform returns
// a new frame that shares every column it did not change, keeps the rows,
// their order and their roles. [DropRows] is the one step that removes rows,
// and says so. Every Fit refuses holdout rows (errors.Is(err,
// tabprep.ErrHoldout)).
//
// A column with no value in the train rows cannot yield a statistic: fitting
// a statistic on it is an error wrapping [tabprep.ErrAllMissing] that names
// the column. There is no silent fallback; give such a column a constant
// rule, or drop it first with [DropSparse].
//
// # Statistic fills
//
// [Mean], [Median], [Min], [Max], [MostFrequent] and [Constant] fill the
// chosen columns with one value per column; [Fill] carries a whole rule set,
// chosen per column by name, then by name pattern, then by kind. All of them
// share [FillParams], which lists per column the decision, where it came
// from and the fill value, and all of them can act on one row
// ([tabprep.RowKernel]).
//
// The mean is the corrected two-pass mean (Chan, Golub & LeVeque 1983). The
// median and other quantiles are found by selection in expected linear time,
// not by sorting, with the sample quantile definitions of Hyndman & Fan
// (1996), "Sample quantiles in statistical packages", The American
// Statistician 50(4): type 7 by default (h = p(n−1)+1, so the median of an
// even count is the mean of the two middle values), type 6 on request
// (h = p(n+1), the definition of the NIST e-Handbook §7.2.5.2). The most
// frequent value breaks ties by the smallest number, or the level that sorts
// first by byte order, so the result does not depend on row order or level
// encoding.
//
// # Row-order fills
//
// [CarryForward], [CarryBackward] and [Interpolate] read the neighbours of a
// gap in the frame being transformed, so their output for a row depends on
// the other rows of that frame. What they learn at fit time is only the edge
// fill: a train statistic per column used where the frame offers no
// neighbour (a leading gap for carry forward, a trailing gap for carry
// backward, a column with no value at all in the frame for every method).
// For the same reason they have no row kernel: compiling a pipeline with
// one of them fails with an error naming the step, and such data is
// transformed in batches.
//
// # Model-based fills
//
// [KNearest] fills a gap with the mean, plain or distance-weighted, of the k
// nearest train rows over the other numeric columns; [Chained] fits one ridge
// regression per chosen column from the others, round after round (chained
// equations), and freezes the coefficients.
//
// Both fill each row on its own and can act on one row. The row kernel of
// [KNearest] scans every train row for each row with a gap, as its
// Transform does, with working memory from a pool it keeps, so a row
// allocates nothing once warm.
//
// # Structure
//
// [Indicators] adds a 0/1 column per chosen column with train gaps, named by
// [IndicatorName]; [DropSparse] drops the columns whose train missing share
// exceeds a threshold; [DropRows] drops the rows that miss a value in chosen
// columns and reports how many went. Indicators and DropSparse can act on
// one row; DropRows cannot, since it may return no row.
//
// # Bounds
//
// Params may come from a document the caller did not write, so the
// transforms check their shape and return an error wrapping
// [tabprep.ErrValue] rather than panic, and K and the rounds of the
// model-based fills are bounded ([MaxK], [MaxRounds]).
package impute
