// Package split partitions the rows of a frame into train and holdout and
// tags the holdout rows, so that no later fit can read them: the pipeline
// and every built-in step refuse a frame with holdout rows, and
// frame.Train() selects what to fit on.
//
// # Strategies
//
// A [Strategy] makes one split: [Random], [Stratified] on a categorical
// column, [Ordered] by row order or by a column, [Systematic] (every k-th
// row) and [KeyHash] (a hash of a key column). [ThreeWay] makes train,
// validation and test with any of Random, Stratified, Ordered and KeyHash.
// A [Folding] makes cross-validation folds, ranged over with
// for i, fold := range folds: [RandomFolds], [StratifiedFolds],
// [GroupFolds] and [TimeFolds] (expanding or sliding window, with an
// optional buffer). Each split comes with a [Report] of its partitions and,
// for a chosen categorical column, of its classes, printable as a small
// table.
//
// # Conventions
//
// A split never modifies its input: it returns a new frame that shares all
// the input's columns and differs only in its roles. It neither drops nor
// duplicates a row: every row is in exactly one partition. Rows already
// tagged holdout take no part and keep their role, so splits nest (split
// off a test set, then make folds of what is left); a split refuses to fill
// a partition name the input already uses. Missing cells (NaN, or the
// missing code) in a column a split reads are an error naming the row,
// except that Stratified and StratifiedFolds can treat them as one more
// class. Bad options and data too small for them are errors naming the
// value and its limit; they wrap [tabprep.ErrOption], [ErrTooFew],
// [tabprep.ErrKind], [tabprep.ErrNoColumn] or [tabprep.ErrValue].
//
// # Determinism
//
// Every random choice comes from one generator: PCG (the DXSM variant that
// math/rand/v2 implements, whose output is specified) started at
// (Seed, 0x7461627072657021), with integers in a range drawn by Lemire's
// multiply-and-reject method, written in this package rather than taken
// from rand.Rand. Class quotas are computed in integer arithmetic, classes
// are visited in level order and rows in row order, and no map order is
// ever used. So the same Seed, options and rows give the same split on
// every platform and Go version; a golden test guards this. Ordered,
// Systematic and KeyHash draw nothing; KeyHash depends only on each key and
// the salt, not on the other rows or their order.
package split
