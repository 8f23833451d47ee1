// Package demo embeds the built-in demo designs: an invented 500 cc-class
// air-cooled single, upright with annular fins and laid over with
// longitudinal fins.
package demo
