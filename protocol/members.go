package protocol

// MemberResult is one beam's results along its length for one case, in
// the member's local axes (x from its first end to its second). Internal
// forces act on the face of a cut whose outward normal is local +x:
// tension positive; moments as right-handed vectors, so that a 2D beam
// sagging under gravity has a positive moment_z, dM_z/dx = −V_y and
// dM_y/dx = V_z (the shear of the beam tables, with dM/dx = V, is
// −shear_y). In 2D, shear_y and moment_z are the member's shear and
// moment in the plane; shear_z, torsion and moment_y are 3D only. Station
// arrays are empty when stations were not asked for. At a point load a
// station reports the value just past it (towards the second end).
type MemberResult struct {
	// ID is the member's id.
	ID string `json:"id"`
	// Stations are the distances of the stations from the first end
	// (length units).
	Stations []float64 `json:"stations,omitempty"`
	// Axial is the axial force N at each station.
	Axial []float64 `json:"axial,omitempty"`
	// ShearY is the shear force V_y at each station.
	ShearY []float64 `json:"shear_y,omitempty"`
	// ShearZ is the shear force V_z at each station (3D).
	ShearZ []float64 `json:"shear_z,omitempty"`
	// Torsion is the torque T at each station (3D).
	Torsion []float64 `json:"torsion,omitempty"`
	// MomentY is the bending moment M_y at each station (3D).
	MomentY []float64 `json:"moment_y,omitempty"`
	// MomentZ is the bending moment M_z at each station.
	MomentZ []float64 `json:"moment_z,omitempty"`
	// Displacements are the translations of the member's axis at each
	// station in global axes (dimension entries, length units); the
	// displaced position is the station's position plus it.
	Displacements [][]float64 `json:"displacements,omitempty"`
	// MaxAxial and MinAxial are the largest and smallest axial force along
	// the member, with their distances.
	MaxAxial Along `json:"max_axial"`
	MinAxial Along `json:"min_axial"`
	// PeakMomentZ is the moment about local z of largest magnitude
	// (signed), found exactly from the closed-form polynomials between
	// point loads, not only at the stations.
	PeakMomentZ Along `json:"peak_moment_z"`
	// PeakMomentY is the same about local y (3D).
	PeakMomentY *Along `json:"peak_moment_y,omitempty"`
	// PeakDeflectionY is the local y displacement of largest magnitude
	// (signed), found exactly.
	PeakDeflectionY Along `json:"peak_deflection_y"`
	// PeakDeflectionZ is the same along local z (3D).
	PeakDeflectionZ *Along `json:"peak_deflection_z,omitempty"`
	// PeakDisplacement is the largest translation magnitude along the
	// member, found exactly.
	PeakDisplacement Along `json:"peak_displacement"`
	// AxialUtilisation, BendingUtilisation and CombinedUtilisation are the
	// member's checks (null when not made, see the result's unchecked):
	// axial N/N_Rd with buckling in compression; bending Σ|M|/(W·f) about
	// the bending axes; combined N/N_Rd + |M_y|/M_y,Rd + |M_z|/M_z,Rd with
	// each term at its own largest value along the member (conservative).
	AxialUtilisation    *float64 `json:"axial_utilisation"`
	BendingUtilisation  *float64 `json:"bending_utilisation,omitempty"`
	CombinedUtilisation *float64 `json:"combined_utilisation,omitempty"`
	// BucklingReduction is the χ used in compression (EN 1993-1-1
	// §6.3.1.2), omitted when the member is not in compression.
	BucklingReduction float64 `json:"buckling_reduction,omitempty"`
	// StrainEnergy is the member's strain energy (force·length) in axial
	// force, bending and torsion.
	StrainEnergy StrainEnergy `json:"strain_energy"`
}

// Along is a value at a distance along a member.
type Along struct {
	// Value is the value (signed where the quantity has a sign).
	Value float64 `json:"value"`
	// At is the distance from the member's first end (length units).
	At float64 `json:"at"`
}

// StrainEnergy splits a member's strain energy (force·length).
type StrainEnergy struct {
	// Axial is ∫N²/2EA.
	Axial float64 `json:"axial"`
	// Bending is ∫M_z²/2EI_z + M_y²/2EI_y.
	Bending float64 `json:"bending"`
	// Torsion is ∫T²/2GJ (3D).
	Torsion float64 `json:"torsion"`
}
