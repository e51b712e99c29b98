// Package state is the versioned JSON format of fitted tabprep state and the
// registry of step kinds.
//
// A document holds a format name and version, the library version, the input
// and output schemas, each step as {kind, spec, params}, a fingerprint of the
// training rows and a checksum of the body. Numbers round-trip bit for bit:
// finite floats are written in the shortest form that parses back to the
// same bits, and NaN and the infinities, which JSON lacks, are written as
// the strings "NaN", "+Inf" and "-Inf" by [Float] and [Floats], the types
// step parameters use for their float fields.
//
// Decoding is strict: unknown fields, a newer format version, a wrong
// checksum, an unknown step kind and a document larger than the size limit
// are errors that say what to do.
//
// # Registry
//
// Each step kind is registered once, in the init function of its package,
// with [Register]. The pipeline package imports the built-in step packages,
// so loading a document needs no blank imports; a custom step's package must
// be imported by the program that loads it.
package state
