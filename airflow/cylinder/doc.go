// Package cylinder is the estimator of an air-cooled cylinder: given its
// two fin sets (head and barrel), the road speed, the ambient air and the
// heat each set must reject, it finds the wall temperature at the fin roots
// of each set, with the air's temperature marched along the fin passages.
//
// # The model in one page
//
// Stages, each in its own file:
//
//  1. Orientation (orientation.go). Annular fins take the road-speed
//     component in the fin plane, V cos(tilt); the air runs half the
//     circumference at mid-fin radius on each side of each passage, two
//     parallel paths per passage, each fed with ambient air. Longitudinal
//     fins take the component along the axis, V sin(tilt), over the finned
//     length. When both sets are longitudinal the air passes the head
//     passages and then the barrel passages in series (Case.Series). The
//     rest of the road air crosses or runs along the fin envelope
//     (heat.go, envelope): a lower bound on what air striking the fins
//     broadside does.
//  2. Hydraulics (hydraulics.go). A share Recovery of the dynamic pressure
//     0.5 rho V^2 drives each set's passages, scaled by the square of the
//     component's share of V. Brent's method finds the passage velocity
//     at which entry loss (0.5 velocity head, Idelchik 1994) plus exit loss
//     (1 velocity head) plus developing-flow friction 4 f_app L/Dh (the
//     passage model's Friction) uses it up; on a series path the loss of
//     the change of passage area between head and barrel is added
//     (Borda-Carnot expansion, Idelchik's contraction).
//  3. The forced convection by an air-side method (method.go): Gibson's
//     motorcycle-fin correlation (the default on open fins in the road
//     air), Briggs & Young, or the channel march; every estimate also runs
//     the others that apply (Result.Methods) to show the spread, which the
//     uncertainty band draws. The march (march.go), the channel method:
//     each path is cut into Settings.Segments segments graded as L
//     (i/N)^2. In each, bulk properties (airflow.Transport: Sutherland, the
//     Cengel cp cubic) at the segment's mean air temperature, the
//     segment-mean h as d(x h_m)/dx of the passage model's mean Nusselt
//     number (Stephan laminar, Gnielinski turbulent, Gnielinski's linear
//     blend in transition; airflow.DevelopingPlates), the fin efficiency at
//     that h (fins.Curve, exact 1-D fin solutions), and the exact
//     exponential pick-up T_out = T_w - (T_w - T_in) exp(-NTU) with cp the
//     mean over the rise.
//  4. The heat of a set (heat.go). The march's forced heat, combined with
//     the envelope's as Q_F^3 = Q_P^3 + Q_E^3 (Churchill & Usagi 1972),
//     and natural convection (airflow.InclinedFinsH: the fins at their
//     real orientation, vertical channels or horizontal plates) combine as Q^3 = Q_F^3 + Q_N^3 (Churchill 1977's rule,
//     applied to the heats), plus grey radiation from the fin envelope.
//  5. The balance (balance.go). For each set, head first (on a series
//     path its outlet air is the barrel's inlet), the safeguarded secant of
//     airflow/roots finds the wall temperature at which the heat rejected
//     equals the load, to 1e-5 of the load, first on a coarse march and
//     then corrected to the full one. No equilibrium below 500 C is
//     ErrNoEquilibrium, with what to change.
//  6. Results (result.go): per set, the wall temperature, the heats by
//     mode, mean h, efficiencies, passage velocity and, unless
//     Settings.TotalsOnly, the segment-by-segment march.
//  7. The verdict (outcome.go): Design bundles a case with its load,
//     limits and any fixed walls; Design.Evaluate gives an Outcome with
//     the margins to the limits and a Status (ok, marginal within
//     MarginalBand, over limit, no equilibrium).
//
// The heat load comes from Load (load.go): given directly, or the road
// load at cruise (Gillespie 1992) through driveline and thermal
// efficiencies and the cooling share (Heywood 1988), never below the idle
// heat.
//
// # Inputs and settings
//
// Case holds the physics inputs and Settings how they are computed. A zero
// value means the sourced default: Recovery 0 is DefaultRecovery, a zero
// Settings is 40 segments, Idelchik's loss coefficients and the built-in
// correlations; a zero RoadLoad coefficient is its default. Settings.Passage
// and Settings.Natural replace the correlations (airflow.PassageModel,
// airflow.NaturalModel); with the default passage model the march goes by a
// fast path (film.go) that TestFastPath holds to the general one.
// Settings.Workspace keeps fin-efficiency curves across the estimates of
// one goroutine (a sweep's worker).
//
// Units are SI throughout: m, K, Pa, W, kg, s, rad.
//
// # What is assumed
//
// Each fin set has one uniform root temperature; conduction between head
// and barrel is not modelled (each set rejects its own share of the
// load); the air is dry and an ideal gas; the flow divides equally among
// the passages of a set; correlations are used at film properties; the
// cowling, frame and legs are lumped into Recovery, which should be
// calibrated against a measured head temperature.
package cylinder
