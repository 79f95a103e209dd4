// Package render draws structural diagrams as SVG: the form and force
// diagrams of a reciprocal pair side by side (FormAndForce) and a form
// diagram alone coloured by axial force (Form).
//
// The visual style is our own. Tension and compression are told apart both
// by colour and by line style: tension is a solid blue line, compression a
// dashed red line, a zero-force member a dotted grey line; external forces
// (loads and reactions) are green arrows. Every picture carries a legend
// with the units, a scale bar per diagram and a caption with the caution
// that it is a preliminary design aid that a qualified engineer must check
// against the local codes and standards.
package render
