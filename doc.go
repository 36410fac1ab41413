// Package rockheat runs a checked scenario through the pipeline:
// draw the inputs (package sampler), evaluate the model on each batch of
// trials (package heatmodel) and summarise every output (package stats).
// Estimate returns a Result value; package report renders it and
// cmd/rockheat is the command line.
//
// Inputs are drawn in the units of the scenario file and converted to SI
// once, per batch, before the model sees them. Outputs are reported in
// J for heat and MW for power.
package rockheat
