// Package demotest gives the tests of the airflow libraries the upright
// demo single (an invented scenario, the same as cmd/internal/demo's
// upright.toml) as a cylinder.Design, with its cruise heat given directly.
package demotest
