// Package airflow holds the air side of the fins: dry-air properties and
// the standard atmosphere (air.go), forced convection in fin passages
// (passage.go: Stephan, Shah, Petukhov and Gnielinski with Gnielinski's
// transition blend, behind the PassageModel interface), natural convection
// from fin channels (natural.go: Bar-Cohen & Rohsenow, behind the
// NaturalModel interface), and correlations kept only as cross-checks
// (crosscheck.go). Every correlation's doc comment gives its formula,
// source, validity range and units; outside the range it still answers and
// records a warning in a *validity.Log (nil for none).
//
// The cylinder estimator that puts these together (orientation model,
// passage hydraulics, the air-temperature march and the wall balance) is
// the sub-package airflow/cylinder; the root finders are airflow/roots.
// SI units throughout: K, Pa, m, m/s, W.
package airflow
