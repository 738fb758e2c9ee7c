// Package qa checks and cleans survey readings before they are gridded:
// reference-electrode conversion, current scaling, drift, repeats, spikes
// and exclusions by hand. Nothing is deleted and the survey is never
// modified: every reading keeps its original value in the survey, its
// corrected value and status are in the Result, and every correction or
// change of status is a logged Step with its reason.
//
// # Order of the checks
//
// Run applies the checks in this order, each on the values the previous
// one left:
//
//  1. Reference conversion: readings taken against one electrode are put
//     on Settings.To (see package electrode for the offsets and their
//     sources). A reading's own Reference overrides Settings.From.
//
//  2. Current scaling: V × FaultCurrent / test current, the test current
//     being the reading's own or Settings.TestCurrent.
//
//  3. Drift: the base station's readings, in time order, give a curve B(t)
//     (piecewise linear, or monotone cubic); every reading is corrected by
//     V(t) − [B(t) − B(t₁)], with t₁ the first base reading. Without a
//     timestamp on every reading, or when times run backwards within a
//     file, the order of the readings stands in for time and the report
//     says so. Before the first and after the last base reading the
//     correction is held at its end value.
//
//  4. Repeats: readings sharing an id, or within Settings.RepeatDist of each
//     other, form a group. A group whose spread is within the tolerance
//     agrees: every member gets the group mean as its corrected value and
//     the group counts once for gridding (Result.Use picks its first
//     member). A group that disagrees has every member marked suspect, each
//     keeping its own corrected value. All members stay in the output.
//     After drift correction the base station's readings agree by
//     construction, so the base counts once, as one spot, and never forms a
//     cluster of near-coincident values in the fit.
//
//  5. Spikes: a radial basis interpolant (package interp, its default
//     thin-plate spline; Rippa's closed form of the leave-one-out error for
//     the global fit, the local equivalent for large surveys) is fitted to
//     one value per spot, over readings neither suspect nor excluded by
//     hand. A reading's deviation is its leave-one-out residual r less the
//     median residual, shrunk towards zero by its curvature allowance a:
//     e = sign(r − median) · max(0, |r − median| − a). A reading whose
//     robust z = e / (1.4826 MAD · g) is beyond Settings.SpikeK, and whose
//     |e| / g also exceeds the repeat tolerance (no reading is a spike by
//     less than the measurement repeats to), is a candidate.
//
//     The curvature allowance is the leave-one-out error the local bending
//     of the surface explains: at a true extremum, the peak of the
//     potential over an injection electrode or its minimum over a return
//     electrode, the fit without the reading cannot know how far the peak
//     rises and undershoots by about curvature × spacing², hundreds of
//     millivolts on a survey whose noise is one. It is estimated WITHOUT
//     the reading, from the Hessian of a least-squares quadratic through
//     its 12 nearest spots, each curvature shrunk by two of its standard
//     errors so that noise excuses nothing: a = F · ½ · max|λ| · ρ², ρ² the
//     mean squared distance of its four nearest spots, F = 4 where the
//     reading is above or below all its six nearest, 1 elsewhere. The
//     factors are calibrated on the closed-form potential of a buried
//     point source and cover grids up to about 1.35 times the source's
//     depth; curvature.go gives the derivation, the measurements and the
//     sources. It is worked out only for readings beyond the limits
//     without it, a local fit of 12 spots each, so the check stays cheap
//     on large surveys.
//
//     The gap factor g = max(1, (d/h)²), d the distance to the reading's
//     nearest neighbour and h the survey's typical spacing, allows for the
//     larger error expected in a gap; on a regular grid g is 1.
//
//     A candidate is marked suspect only when it stands alone. If one of
//     its six nearest spots (within 2.5 times the typical spacing) is a
//     candidate of the same sign deviating at least half as much, the
//     readings disagree with the fit together: a feature finer than the
//     reading spacing (a real anomaly the interpolant cannot follow, or too
//     coarse a grid), not a bad reading. Such readings are noted and listed
//     in Result.Steep, never marked.
//
//     The suspects are then left out and the fit is made again, up to three
//     times, so that one large spike does not make its neighbours look bad;
//     readings not in the final fit get the out-of-sample residual at their
//     position, which is what their leave-one-out residual means.
//
//     A spot read more than once whose repeats agree (the base station
//     among them) is confirmed by its repeats: it is noted, never marked as
//     a spike. This is how a technician confirms a real anomaly in the
//     field, and it keeps an isolated base station, whose leave-one-out
//     value is an extrapolation, from being flagged.
//
//  6. Hand edits, last, in order (a later edit of a reading wins): an
//     exclusion makes the reading excluded whatever its status (excluded
//     wins over suspect); an inclusion makes it ok whatever the checks
//     said: the user vouches for it, for example for a real anomaly the
//     spike check doubted. A reading excluded by hand
//     takes no part in the drift curve, the repeat means or the spike fit,
//     so excluding the bad one of two disagreeing repeats lets the other
//     agree.
//
// A check that cannot run (a base station read once, too few readings for
// a fit) is skipped with a remark in Result.Remarks, never an error. Errors
// are reserved for input no check can honour: a reading naming a reference
// electrode nobody knows, a reading without test current when scaling to a
// fault current, a named base station not among the readings.
//
// All values are in the survey's unit; tolerances too. Positions are in
// metres.
package qa
