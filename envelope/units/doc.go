// Package units writes SI values for people to read, in one of two unit
// systems: SI (m, m/s, K, kPa, kg/m³) or customary (ft, kt, °F, psf and
// psi, slug/ft³). Values are SI everywhere else in likewind; this package
// converts them only when they are shown, by the interface, the text dump,
// the run list and the facility cautions (a System is an
// envelope.QuantityFormat). Sig, Fixed and Expo are the number formats
// they share.
//
// Reading typed quantities with their units is atmos.ParseQuantity's job.
package units
