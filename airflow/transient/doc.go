// Package transient follows head and barrel temperatures through time: a
// ride of steady segments (speed, grade, ambient, or a given heat), the
// cylinder as two lumped thermal masses whose heat out is the steady
// air-side model of airflow/cylinder at the present walls (quasi-steady),
// integrated by the Dormand–Prince 5(4) pair with error control
// (dopri.go). It answers what a steady estimate cannot: how hot the head
// peaks on a ride, and how long it survives idling after a hard run.
//
// Checks (ride_test.go, dopri_test.go): the tableau's order conditions;
// decay, two coupled masses and an oscillator against their closed forms;
// a constant ride converging to the steady estimate to 0.1 K; a load step
// with the air side held linear matching the lumped exponential (time
// constant C/(hA)) to 1 %; and the energy of a whole ride, heat in less
// heat out (the air side evaluated again at the sampled walls, integrated
// by Simpson's rule apart from the integrator) against the stored heat's
// change to 1e-6 of the heat in.
package transient
