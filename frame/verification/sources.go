package verification

// The published sources of the catalogue.
var (
	AISC = &Source{
		Key:      "AISC 3-23",
		Citation: "AISC Steel Construction Manual, Table 3-23, Shears, Moments and Deflections: the case named in the case column",
		Recalled: true,
		Check:    "the case titles and formulas; each value also follows from the beam's closed-form solution (statics and the elastic curve)",
	}
	Coefficients = &Source{
		Key:      "coefficients",
		Citation: "Continuous beam coefficients for equal spans under uniform load, all spans and patterned (AISC Steel Construction Manual, Table 3-23, continuous beams; Reynolds and Steedman, Reinforced Concrete Designer's Handbook)",
		Recalled: true,
		Check:    "the coefficients; the exact fractions are re-derived by the three-moment equation (Clapeyron)",
	}
	RigidFrame = &Source{
		Key:      "rigid frame",
		Citation: "Rigid frame formulas for single-bay portals with k = (Ib/L)/(Ic/h) (Kleinlogel, Rahmenformeln; beam and frame formula tables)",
		Recalled: true,
		Check:    "the formulas; each is re-derived by slope-deflection",
	}
	FEMTable = &Source{
		Key:      "FEM table",
		Citation: "Fixed-end moment table (Hibbeler, Structural Analysis, inside back cover)",
		Recalled: true,
		Check:    "the table entries; each is the integral of the load against the influence function of a clamped beam",
	}
	SlopeDeflection = &Source{
		Key:      "slope-deflection",
		Citation: "Slope-deflection equations, M = 2EI/L (2θA + θB − 3ψ) + FEM, with a support settlement as the chord rotation ψ = Δ/L (Hibbeler, Structural Analysis, chapter on the slope-deflection method)",
		Recalled: true,
		Check:    "the equations and the chapter; each value is re-derived from them by hand",
	}
	ClosedForm = &Source{
		Key:      "closed form",
		Citation: "Closed form from Euler-Bernoulli beam theory (common practice; no single source)",
	}
	Textbook = &Source{
		Key:      "Pytel & Singer",
		Citation: "Pytel and Singer, Strength of Materials, 4th ed., Problem 877: the beam of Fig. P-815 by moment distribution, M2 = -1077.27 lb·ft, M3 = -640 lb·ft",
		Recalled: true,
		Check:    "the book, edition and problem number; the data and final moments are as given in the worked solution of the problem published on mathalino.com, not checked against the printed book, and are re-derived by the three-moment equation",
	}
)

// Sources lists every source in the order of the catalogue.
func Sources() []*Source {
	return []*Source{AISC, Coefficients, RigidFrame, FEMTable, SlopeDeflection, ClosedForm, Textbook}
}
