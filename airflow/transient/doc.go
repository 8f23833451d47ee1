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
//
// A ride's summary (Summarise, Soak: peaks, first passing of each limit,
// time over it, the standstill's minutes to it) is read from the
// integrator's accepted steps (Trace.Steps) and their cubic Hermite dense
// output (dense.go: maxima at the step ends and the cubic's interior
// stationary points; crossings located as events, the root of
// T(t) - limit on each monotone piece by Brent's method; Hairer, Nørsett
// and Wanner 1993, Sec. II.6), not from the samples, so the output
// interval does not change it; a wall passing the 500 C cap stops the ride
// at that event (a runaway: no peak). Checks (summary_test.go): a hand-made
// step's hump and crossings in closed form; the same summary at outputs
// every 1, 60 and 300 s; the events against a bisection of the dense
// output on a 0.01 s grid; a runaway's time against the lumped
// exponential's closed form.
package transient
