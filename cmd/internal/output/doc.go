// Package output renders finmarch results for people (tables, Markdown)
// and for programs (CSV, JSON), in metric or US units. It is the only place
// where SI values become display units.
package output
