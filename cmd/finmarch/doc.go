// Command finmarch estimates how well the fins of an air-cooled engine
// cylinder cool it. Run it with no arguments for the built-in demo, or see
// 'finmarch --help'.
package main
