// Package render draws structural diagrams and charts as SVG: the form and
// force diagrams of a reciprocal pair side by side (FormAndForce), a form
// diagram alone coloured by axial force (Form), a solved model's deflected
// shape and member forces (Solved), least-volume layouts with line width
// by area, in the plane or in space as an axonometric view, a plan and an
// elevation (Layout), and line charts of sweeps (Chart).
//
// The visual language is our own and is defined once, in style.go, for
// every picture: tension is a continuous deep-indigo line, compression a
// dash-dot amber line, a zero-force member a dotted light-grey line; loads
// are teal arrows with filled heads, reactions near-black arrows with open
// heads; supports are drawn with textbook symbols. The colours stay apart
// in greyscale and under simulated protanopia, deuteranopia and
// tritanopia (style_test.go). Every picture carries a legend with the
// units, a scale bar per diagram and a caption with the caution that it is
// a preliminary design aid that a qualified engineer must check against
// the local codes and standards.
package render
