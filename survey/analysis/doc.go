// Package analysis turns a gridded survey into what a technician acts on:
// equipotential bands and lines, the field, step and touch voltages, flagged
// zones, class areas, the cumulative frequency of the readings, infill
// suggestions and profiles.
//
// Analyze takes an evaluated interp.Grid (values, analytic gradients,
// mask), the fitted interpolant, the readings used and the criteria
// settings, and returns a Result whose every field is documented for the
// terminal UI and the exports. Conventions:
//
//   - Per-node slices follow the grid's index j*NX + i (row j = 0 is the
//     southern edge); per-cell slices follow package contour. Masked or
//     non-finite nodes are NaN in float slices and -1 in index slices.
//   - Potentials are in the survey's unit U (V or mV); fields E = −∇V in U
//     per metre; lengths in metres; areas in m², each node standing for the
//     DX × DY cell centred on it.
//   - Directions are azimuths in degrees clockwise from grid north (+y).
//   - Readings are referred to by their index in the survey (Input.Index).
//
// Flagging follows the preset's criterion (package criteria): the field
// threshold, potential limits, and for the grounding preset the step and
// touch voltages against the tolerable ones of IEEE Std 80. Each quantity
// gives its own 8-connected zones; a node may lie in zones of several
// quantities, and NodeZone names the highest-ranked.
//
// Step voltage (StepVoltage) is the largest potential difference between
// two points 1 m apart around a node, sampled from the interpolant, not
// |E| × 1 m: 35 samples per node, read through a bicubic Hermite surface
// of the interpolant on a grid of at most 0.25 m spacing where that is
// cheaper (StepGrid), on all cores. Touch voltage is |GPR − V| where a
// person standing at the node could reach the grounded structure.
//
// Nothing here is a safety authority: Result.Criterion carries the sources,
// warnings and cautions that must be shown with every result.
package analysis
