package encode

// FNV1a exposes the level hash before mixing, for the test against the
// standard library's hash/fnv.
var FNV1a = fnv1a
