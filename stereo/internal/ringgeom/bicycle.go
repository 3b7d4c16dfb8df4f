package ringgeom

// This file implements the ring sizes both engines draw their lines at,
// and the searches for small bicycles and the bridgeheads their cage
// fixes.

// MinTransRing is the smallest ring that holds a trans double bond: in
// a ring of fewer atoms a double bond can only be cis (trans-cyclooctene
// is the smallest isolable one; common practice), so marks there say
// nothing and a trans mark is impossible.
const MinTransRing = 8

// MaxSmallBridge is the longest bridge, in atoms, of a small bridged
// bicycle: one whose bridgehead substituents must both point out of the
// cage (bicyclo[2.2.2]octane and smaller; in/out isomers need longer
// bridges; common practice).
const MaxSmallBridge = 3

// MaxFusedPerimeter is the largest fused bicycle (two rings sharing a
// bond) that cannot be trans-fused, counted in atoms round its
// perimeter: bicyclo[2.2.0]hexane, bicyclo[3.1.0]hexane and the smaller
// ones have no trans-fused form (common practice), while
// trans-bicyclo[3.3.0]octane and trans-bicyclo[4.2.0]octane exist. The
// seven-atom cases (bicyclo[3.2.0]heptane, bicyclo[4.1.0]heptane) are
// highly strained when trans; they are left alone rather than called
// impossible, since an error there would be worse than silence.
const MaxFusedPerimeter = 6
