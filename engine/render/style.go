package render

// Gusset's visual language, defined once here and used by every picture
// (form, force, solve, layout, mode and chart pictures): a picture drawn
// elsewhere in the engine takes its colours, dash patterns, symbols and
// font from these constants and from StyleSheet.
//
// The scheme is our own. Tension and compression differ by colour AND line
// style, and their colours differ strongly in lightness too, so that the
// drawing reads in colour, in greyscale print and for readers with any of
// the three kinds of dichromacy (checked by TestPaletteDistinguishable,
// which simulates protanopia, deuteranopia, tritanopia and greyscale):
//
//   - tension: deep indigo, a continuous line with round ends;
//   - compression: amber, a dash-dot line with square-cut ends;
//   - zero force: light grey, a dotted line;
//   - loads: teal arrows with a filled head;
//   - reactions: near-black arrows with an open (white-filled) head, drawn
//     at the supports;
//   - supports: a triangle for a pin (both directions held) on a hatched
//     ground line, a triangle on a plain line with a gap for a roller (one
//     direction held), a hatched block for a clamp (rotation held too);
//   - labels: one sans-serif font at two sizes, on a white halo.
const (
	// TensionColour strokes members in tension (axial force > 0).
	TensionColour = "#2b1d72"
	// CompressionColour strokes members in compression (axial force < 0).
	CompressionColour = "#c96f00"
	// ZeroColour strokes members whose force is zero within tolerance.
	ZeroColour = "#b0b0b0"
	// LoadColour strokes and fills load arrows.
	LoadColour = "#007a6c"
	// ReactionColour strokes reaction arrows; their heads are open.
	ReactionColour = "#262626"
	// InkColour is the colour of text, nodes and support symbols.
	InkColour = "#222222"
	// FrameColour outlines panels and draws chart grids.
	FrameColour = "#d0d0d0"
	// TensionBandColour and CompressionBandColour fill the pale band of a
	// member drawn wide (a layout member's width is its area), under a
	// thin centre line in TensionColour or CompressionColour and its dash,
	// so that a wide compression member reads as one member.
	TensionBandColour     = "#cfcbe6"
	CompressionBandColour = "#f3d9b8"
	// DeflectedColour strokes the deflected shape over the undeformed
	// model, which is drawn in ZeroColour beneath it.
	DeflectedColour = TensionColour

	// TensionDash is the SVG stroke-dasharray of tension: continuous.
	TensionDash = "none"
	// CompressionDash is the SVG stroke-dasharray of compression: dash-dot.
	CompressionDash = "9 3 2 3"
	// ZeroDash is the SVG stroke-dasharray of zero-force members: dotted.
	ZeroDash = "1.5 3"

	// ArrowheadSize is the length and width of an arrowhead in pixels.
	ArrowheadSize = 12.0

	// FontFamily is the one font stack of every picture and chart.
	FontFamily = `"DejaVu Sans", "Liberation Sans", Arial, sans-serif`
	// FontSize and SmallFontSize are the two text sizes, in pixels.
	FontSize      = 12.0
	SmallFontSize = 11.0
	// TitleFontSize is the size of a picture's title, in pixels.
	TitleFontSize = 15.0
)

// The older private names, kept so that drawing code reads the same.
const (
	tensionColour     = TensionColour
	compressionColour = CompressionColour
	zeroColour        = ZeroColour
	externalColour    = LoadColour
	inkColour         = InkColour
	compressionDash   = CompressionDash
	zeroDash          = ZeroDash
)

// StyleSheet is the CSS every picture embeds: its classes name the
// meanings above (tension, compression, zero, load, reaction; external is
// a load or reaction drawn without telling them apart).
const StyleSheet = `
text { font-family: ` + FontFamily + `; fill: ` + InkColour + `; font-size: 12px; }
.title { font-size: 15px; font-weight: bold; }
.small { font-size: 11px; }
.label { font-size: 12px; paint-order: stroke; stroke: #ffffff; stroke-width: 3px; stroke-linejoin: round; }
.small.label { font-size: 11px; }
.space { font-weight: bold; }
.tension { stroke: ` + TensionColour + `; fill: none; stroke-linecap: round; }
.compression { stroke: ` + CompressionColour + `; fill: none; stroke-dasharray: ` + CompressionDash + `; stroke-linecap: butt; }
.zero { stroke: ` + ZeroColour + `; fill: none; stroke-dasharray: ` + ZeroDash + `; stroke-linecap: round; }
.external, .load { stroke: ` + LoadColour + `; fill: none; }
.reaction { stroke: ` + ReactionColour + `; fill: none; }
.leader { stroke: #808080; stroke-width: 0.8; fill: none; }
.frame { stroke: ` + FrameColour + `; fill: none; }
.bar { stroke: #444444; fill: none; }
.support { stroke: ` + InkColour + `; fill: #ffffff; stroke-width: 1.3; }
.hatch { stroke: ` + InkColour + `; stroke-width: 0.9; fill: none; }
.hinge { stroke: ` + InkColour + `; fill: #ffffff; stroke-width: 1.5; }
.torsion-release { stroke: ` + InkColour + `; fill: #ffffff; stroke-width: 1.5; }
.tension-band { stroke: ` + TensionBandColour + `; fill: none; stroke-linecap: butt; }
.compression-band { stroke: ` + CompressionBandColour + `; fill: none; stroke-linecap: butt; }
.zero-band { stroke: #e4e4e4; fill: none; stroke-linecap: butt; }
.domain { stroke: #a8a8a8; fill: none; }
.hole { stroke: #5a5a5a; fill: none; stroke-dasharray: 2 2; }
`

// markerDefs defines the arrowheads: a filled head for loads, an open
// head for reactions, both of a fixed size in pixels (ArrowheadSize)
// whatever the line's width, so that short load-line segments keep
// readable heads.
const markerDefs = `<defs>` +
	`<marker id="arrow" viewBox="0 0 10 10" refX="9" refY="5" markerUnits="userSpaceOnUse" markerWidth="11" markerHeight="11" orient="auto-start-reverse">` +
	`<path d="M0,0 L10,5 L0,10 z" fill="` + LoadColour + `"/></marker>` +
	`<marker id="arrow-reaction" viewBox="0 0 12 12" refX="10" refY="6" markerUnits="userSpaceOnUse" markerWidth="12" markerHeight="12" orient="auto-start-reverse">` +
	`<path d="M1,1 L11,6 L1,11 z" fill="#ffffff" stroke="` + ReactionColour + `" stroke-width="1.6"/></marker>` +
	`</defs>`
