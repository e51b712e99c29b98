// Package scale rescales and reshapes numeric columns: z-score, min-max,
// decimal scaling, robust (median and inter-quantile range), max-abs, row
// normalisation, log and log1p, the Box-Cox and Yeo-Johnson power
// transforms, and the quantile transform to a uniform or normal output.
//
// # Conventions
//
// Every step is a value type whose Columns field is a [tabprep.Selection] of
// numeric columns (the zero Selection chooses every numeric column). Fit
// refuses holdout rows, resolves the selection against the train frame and
// freezes the column names and everything the transform needs into the
// step's parameters, so a transform is a pure function of the parameters and
// the data. Transform replaces each fitted column by its rescaled values,
// under the same name and in the same place; every other column is shared,
// not copied. Inputs are never modified. Rows, their order and their roles
// are kept.
//
// NaN means missing. A missing cell is skipped by every fit and stays missing
// through every transform and inverse.
//
// # Estimators
//
// Means and variances come from the corrected two-pass algorithm and the
// Chan, Golub & LeVeque merge (see [ZScore]); the z-score default is the
// sample standard deviation (denominator n−1). Quantiles are Hyndman & Fan
// (1996) type 7, found by selection, not sorting ([Robust]). A column whose
// train values are all equal has no spread; each step documents the value
// such a column maps to, which is never NaN or an infinity.
//
// # Domains
//
// Log, Log1p, Box-Cox and Yeo-Johnson are defined on part of the real line
// only (or overflow outside it). A value outside the domain is an error that
// names the column, the row and the value, unless the step's OutOfDomain
// field is [DomainMissing], which makes such a cell missing instead.
//
// # Capabilities
//
// Every step except [RowNorm] implements [tabprep.Inverter]: the inverse
// maps transformed values back to the original scale, up to rounding. Every
// step implements [tabprep.RowKernel] for compiled serving plans, and
// [ZScore] implements [tabprep.Accumulating] for fitting chunk by chunk.
package scale
