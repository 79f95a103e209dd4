package render

import (
	"math"
	"strconv"
	"testing"
)

// Colour-vision simulation matrices for complete dichromacy (severity 1),
// applied to linear RGB: G. M. Machado, M. M. Oliveira and L. A. F.
// Fernandes, "A physiologically-based model for simulation of color vision
// deficiency", IEEE Transactions on Visualization and Computer Graphics
// 15(6), 2009, Table 1 (the severity 1.0 rows). Values from memory.
var dichromacy = map[string][3][3]float64{
	"protanopia": {
		{0.152286, 1.052583, -0.204868},
		{0.114503, 0.786281, 0.099216},
		{-0.003882, -0.048116, 1.051998},
	},
	"deuteranopia": {
		{0.367322, 0.860646, -0.227968},
		{0.280085, 0.672501, 0.047413},
		{-0.011820, 0.042940, 0.968881},
	},
	"tritanopia": {
		{1.255528, -0.076749, -0.178779},
		{-0.078411, 0.930809, 0.147602},
		{0.004733, 0.691367, 0.303900},
	},
}

// linearRGB decodes "#rrggbb" to linear RGB by the sRGB transfer function
// (IEC 61966-2-1:1999; from memory).
func linearRGB(hex string) [3]float64 {
	var out [3]float64
	for i := range 3 {
		v, err := strconv.ParseUint(hex[1+2*i:3+2*i], 16, 8)
		if err != nil {
			panic(err)
		}
		c := float64(v) / 255
		if c <= 0.04045 {
			out[i] = c / 12.92
		} else {
			out[i] = math.Pow((c+0.055)/1.055, 2.4)
		}
	}
	return out
}

// simulate applies a dichromacy matrix, or for "greyscale" replaces the
// colour by its relative luminance, or for "colour" leaves it.
func simulate(rgb [3]float64, vision string) [3]float64 {
	switch vision {
	case "colour":
		return rgb
	case "greyscale":
		y := luminance(rgb)
		return [3]float64{y, y, y}
	}
	m := dichromacy[vision]
	var out [3]float64
	for i := range 3 {
		for j := range 3 {
			out[i] += m[i][j] * rgb[j]
		}
		out[i] = math.Min(1, math.Max(0, out[i]))
	}
	return out
}

// luminance is the relative luminance of linear sRGB (ITU-R BT.709
// primaries; WCAG 2.1's definition).
func luminance(rgb [3]float64) float64 {
	return 0.2126*rgb[0] + 0.7152*rgb[1] + 0.0722*rgb[2]
}

// lab converts linear sRGB to CIE 1976 L*a*b* under D65 (CIE 15:2004; the
// sRGB-to-XYZ matrix of IEC 61966-2-1; from memory).
func lab(rgb [3]float64) [3]float64 {
	x := 0.4124*rgb[0] + 0.3576*rgb[1] + 0.1805*rgb[2]
	y := 0.2126*rgb[0] + 0.7152*rgb[1] + 0.0722*rgb[2]
	z := 0.0193*rgb[0] + 0.1192*rgb[1] + 0.9505*rgb[2]
	f := func(t float64) float64 {
		if t > 216.0/24389 {
			return math.Cbrt(t)
		}
		return (24389.0/27*t + 16) / 116
	}
	fx, fy, fz := f(x/0.95047), f(y), f(z/1.08883)
	return [3]float64{116*fy - 16, 500 * (fx - fy), 200 * (fy - fz)}
}

func deltaE(a, b [3]float64) float64 {
	return math.Sqrt((a[0]-b[0])*(a[0]-b[0]) + (a[1]-b[1])*(a[1]-b[1]) + (a[2]-b[2])*(a[2]-b[2]))
}

// TestPaletteDistinguishable checks that the meanings a reader must tell
// apart stay apart in colour, under each simulated dichromacy and in
// greyscale print, and that every line stands out from the white page.
// Thresholds: a CIELAB ΔE*ab of 40 between tension and compression and
// 20 between loads and reactions (about 2.3 is a just-noticeable
// difference: G. Sharma, Digital Color Imaging Handbook, 2003, ch. 1; from
// memory; the margins above it are our choice, for thin lines), a
// lightness difference of 25 L* between tension and compression and 20
// between loads and reactions so that greyscale alone separates them, and
// WCAG 2.1's 3:1 contrast for graphical objects (success criterion
// 1.4.11) against white, except the deliberately faint zero-force grey
// (at least 2:1).
func TestPaletteDistinguishable(t *testing.T) {
	pairs := []struct {
		a, b         string
		minDE, minDL float64
	}{
		{TensionColour, CompressionColour, 40, 25},
		{LoadColour, ReactionColour, 20, 20},
		{TensionColour, ZeroColour, 30, 25},
		{CompressionColour, ZeroColour, 30, 10},
		{LoadColour, CompressionColour, 20, 0},
		{LoadColour, TensionColour, 20, 0},
	}
	for _, vision := range []string{"colour", "protanopia", "deuteranopia", "tritanopia", "greyscale"} {
		for _, p := range pairs {
			la, lb := lab(simulate(linearRGB(p.a), vision)), lab(simulate(linearRGB(p.b), vision))
			de, dl := deltaE(la, lb), math.Abs(la[0]-lb[0])
			if vision != "greyscale" && de < p.minDE {
				t.Errorf("%s: %s and %s differ by ΔE %.1f, want ≥ %g", vision, p.a, p.b, de, p.minDE)
			}
			if dl < p.minDL {
				t.Errorf("%s: %s and %s differ by ΔL* %.1f, want ≥ %g", vision, p.a, p.b, dl, p.minDL)
			}
		}
		for _, c := range []string{TensionColour, CompressionColour, LoadColour, ReactionColour, InkColour, ZeroColour} {
			y := luminance(simulate(linearRGB(c), vision))
			contrast := 1.05 / (y + 0.05) // against white, WCAG 2.1
			want := 3.0
			if c == ZeroColour {
				want = 2
			}
			if contrast < want {
				t.Errorf("%s: %s has contrast %.2f:1 against white, want ≥ %g:1", vision, c, contrast, want)
			}
		}
	}
	// Line style tells them apart without colour at all.
	styles := map[string]bool{TensionDash: true, CompressionDash: true, ZeroDash: true}
	if len(styles) != 3 {
		t.Errorf("tension, compression and zero share a dash pattern: %q %q %q", TensionDash, CompressionDash, ZeroDash)
	}
}

// TestPaletteSimulationMatchesPublishedFixedPoints checks the simulation
// itself: each Machado matrix keeps white white (its rows sum to 1, a
// property the paper's matrices are normalised to) and deuteranopia maps
// pure red and pure green towards one hue, the confusion the simulation
// must show (Machado et al. 2009, Fig. 1; from memory).
func TestPaletteSimulationMatchesPublishedFixedPoints(t *testing.T) {
	for name, m := range dichromacy {
		for i, row := range m {
			if s := row[0] + row[1] + row[2]; math.Abs(s-1) > 1e-3 {
				t.Errorf("%s row %d sums to %g, want 1", name, i, s)
			}
		}
	}
	red := lab(simulate(linearRGB("#cc0000"), "deuteranopia"))
	green := lab(simulate(linearRGB("#00aa00"), "deuteranopia"))
	hue := func(l [3]float64) float64 { return math.Atan2(l[2], l[1]) }
	if d := math.Abs(hue(red) - hue(green)); d > 0.35 {
		t.Errorf("deuteranopia leaves red and green %.2f rad apart in hue, want them near one hue", d)
	}
	// The palette the issue asks us to leave, solid blue and dashed red,
	// must not be ours.
	if TensionColour == "#1f5fa8" || CompressionColour == "#b8322a" {
		t.Error("the old blue/red pairing is still in use")
	}
}
