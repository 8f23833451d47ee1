// Package validity records when a correlation or closed form is evaluated
// outside the range its source states. The value is still returned by the
// caller; the Log only remembers, once per cause, what was out of range so
// that the command line and the JSON output can show it.
package validity
