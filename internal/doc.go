// Package internal holds, in its subpackages, the numeric kernels that the
// step packages share and that are not part of the tabprep API: moments
// (internal/moment) and order statistics (internal/quantile).
package internal
