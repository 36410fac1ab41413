// Package scenarios reads, checks and describes rockheat scenario files.
//
// A scenario is a TOML file of ranges: a title, [run] settings, [model]
// settings and an [inputs] table whose values are plain numbers (fixed) or
// inline tables naming a distribution. Load decodes a file, checks every
// key, value and range, and returns a Scenario with its inputs as
// sampler distributions in the units of the file (the key's suffix names
// the unit: area_km2 is in km²); conversion to SI happens downstream.
// Every problem found is reported at once, each naming the file, the line
// where it can be found, the key, what is wrong and how to fix it.
//
// The bundled example scenarios are embedded with go:embed and listed by
// Examples; they describe invented prospects.
package scenarios
