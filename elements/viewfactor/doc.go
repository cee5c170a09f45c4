// Package viewfactor gives diffuse view factors between surfaces of an
// enclosure and checks a view-factor matrix for the summation and
// reciprocity rules.
//
// A view factor F_ij is the fraction of the radiation leaving diffuse
// surface i that arrives directly at surface j. It depends on geometry
// only, so the functions here use float64, not dual numbers. Lengths are in
// any consistent unit (SI: m); areas in the square of it.
//
// Sources: the closed forms of Incropera, DeWitt, Bergman & Lavine,
// Fundamentals of Heat and Mass Transfer, Table 13.2 (aligned parallel
// rectangles, perpendicular rectangles with a common edge, coaxial parallel
// disks), which go back to Siegel & Howell, Thermal Radiation Heat
// Transfer; summation and reciprocity rules from the same chapter.
package viewfactor
