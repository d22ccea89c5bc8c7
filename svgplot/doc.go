// Package svgplot draws small, deterministic SVG plots for calculation
// packages: T-s and h-s diagrams of power cycles (a saturation dome, the
// cycle path and its labelled states) and x-y sweep plots.
//
// The package knows nothing about fluids or units: callers pass plain
// numbers and plain-text labels. A [Plot] is rendered by [Plot.SVG] into a
// single <svg> element meant to be inlined in an HTML page. The output
//
//   - has no XML prolog, no scripts, no external references and fetches no
//     fonts (it names the generic family sans-serif);
//   - carries CSS classes for the page to restyle and inline presentation
//     attributes, so it also prints correctly without any stylesheet;
//   - is byte-for-byte the same for the same input: coordinates are written
//     with at most two decimals, tick labels with a precision derived from
//     the tick step, and nothing depends on map order or the clock;
//   - keeps every drawn data coordinate inside the plot frame: lines are
//     clipped to the axis ranges and markers outside them are left out;
//   - escapes all text, which may come from user files.
//
// Scales are linear; ticks follow 1-2-5 steps (see [NiceTicks]).
package svgplot
