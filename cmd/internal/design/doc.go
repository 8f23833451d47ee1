// Package design reads a finmarch design file (TOML): quantities with units,
// the schema with its ranges and defaults, validation with the line of the
// offending key, and the conversion to the physics packages' SI inputs.
package design
