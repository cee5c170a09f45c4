// Package air gives the properties of dry air and of the U.S. Standard
// Atmosphere 1976 for the convection elements of a thermal network.
//
// Units are SI throughout: temperature in K, pressure in Pa, density in
// kg/m³, viscosity in Pa s, conductivity in W/(m K), specific heat in
// J/(kg K), diffusivities in m²/s.
//
// At evaluates every temperature-dependent property on a dual.Num, so an
// element that calls it inside a Newton iteration obtains the exact
// derivative of each property along its seed direction.
//
// Sources:
//
//   - Density: ideal gas, ρ = p/(R T), with R = R*/M0 = 8314.32/28.9644 =
//     287.0531 J/(kg K), the gas constants of the U.S. Standard Atmosphere
//     1976 (NOAA, NASA, USAF, U.S. Government Printing Office, 1976).
//   - Viscosity: Sutherland's law μ = βs T^(3/2)/(T + S) with βs =
//     1.458×10⁻⁶ kg/(m s K^½) and S = 110.4 K, the U.S. Standard
//     Atmosphere 1976 constants.
//   - Conductivity: the U.S. Standard Atmosphere 1976 expression
//     k = 2.64638×10⁻³ T^(3/2)/(T + 245.4·10^(−12/T)).
//   - Specific heat: natural cubic spline through Incropera & DeWitt,
//     Fundamentals of Heat and Mass Transfer, Table A.4 (air at atmospheric
//     pressure), 200 K to 600 K.
//   - Standard atmosphere: U.S. Standard Atmosphere 1976, the three layers
//     from sea level to 32 km geopotential altitude.
//
// Against Table A.4 the viscosity law agrees within 1 % from 200 K to 450 K
// and within 1.4 % up to 600 K; the conductivity expression agrees within
// 0.8 % from 200 K to 600 K (see the tests). μ, k and cp are taken as
// independent of pressure, which holds for the pressures accepted by Check.
package air
