// Package materials is the catalogue of the alloys that air-cooled cylinders,
// heads and fins are made of: thermal conductivity (with its variation with
// temperature where a handbook tabulates it), density, specific heat,
// typical emissivities for a bare as-cast and for a painted black finish,
// and a sensible maximum service temperature.
//
// All values are SI: W/(m K), kg/m3, J/(kg K), K. Every row names its
// source. Values recalled from a handbook rather than re-read from it are
// marked "from memory"; facts of the trade without a single published
// source are marked "common practice".
package materials
