// Package encode turns categories and strings into the numbers a learner
// needs: one-hot, ordinal, frequency, target encoding and feature hashing of
// categorical columns; binning of numeric columns; and parsing of numbers
// and times held as text.
//
// # Conventions
//
// Every step learns from train rows only (its Fit starts with
// [tabprep.RequireTrain]) and never modifies its input. A missing numeric
// cell is NaN; a missing categorical cell is the empty string. Fitted level
// lists are in byte order of the level strings unless the user gives an
// order, so parameters do not depend on the order of the rows.
//
// # Output columns
//
// A step that makes one column from a source replaces the source in place,
// under the same name (ordinal, frequency, target encoding of a numeric
// target, binning, unix-time parsing, number parsing). A step that makes
// several drops the source and appends its outputs after the remaining
// columns, named by this package's rule:
//
//	<column>=<level>      one-hot indicator of a level
//	<column>#other        one-hot indicator of grouped rare (or unseen) levels
//	<column>#missing      one-hot indicator of a missing cell
//	<column>@<class>      target encoding for one class of a categorical target
//	<column>#<i>          feature-hashing bucket i, from 0
//	<column>.<part>       a part of a parsed time, such as booked_on.hour
//
// A new name that clashes with a column the data keeps is an error. Each
// params type has an Outputs method that lists the names it writes.
//
// # Unseen levels and missing cells
//
// Each encoder states what a level training never saw and a missing cell
// become; where a policy makes them errors, the error names the column, the
// row and the level.
//
// # Target encoding
//
// [Target] shrinks each level's mean target towards the global mean with the
// weight of Micci-Barreca (2001), and gives the training rows out-of-fold
// values (it implements [tabprep.OutOfFold]) so that the values a learner is
// trained on do not contain the row's own target.
//
// # Row kernels
//
// Every step of the package implements [tabprep.RowKernel]: a compiled
// serving plan applies it to one row, with the same cells as its batch
// transform. What a step works out per level in a batch, its row kernel
// works out per level of the plan's input when the plan is compiled and
// looks up by the cell's code, so a row allocates nothing. A level the plan
// has not listed is handled in the row: hashed, or parsed — [ParseNumber]
// without allocating, [ParseTime] with the exceptions its RowKernel lists.
// [Target] reads no target in a row; a pipeline keeps it out.
package encode
