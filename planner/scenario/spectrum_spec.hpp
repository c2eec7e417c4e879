#pragma once
// The command-line spelling of an SPE proton spectrum, for example
//   band:J0=1e10,gamma_a=1.1,gamma_b=3.5,R0_GV=0.25
// Forms and their keys (fluences omnidirectional, protons/cm2; energies MeV; rigidities GV):
//   band          J0 gamma_a gamma_b R0_GV        Band function in rigidity, of J(>R)
//   band-differential C gamma_a gamma_b R0_GV     the Band function as dJ/dR, C in /(cm2 GV)
//   weibull       J0 k alpha                      J(>E) = J0 exp(-k E^alpha)
//   exp-rigidity  J0 R0_GV                        J(>R) = J0 exp(-R/R0)
//   exp-energy    J0 E0_MeV                       J(>E) = J0 exp(-E/E0)
//   power         J0 gamma E_ref_MeV              J(>E) = J0 (E/E_ref)^-gamma
//   table         E1=J1,E2=J2,...                 tabulated J(>E), E in MeV
// Keys every form takes: fit_min_MeV, fit_max_MeV (the range the fit was made over, default
// 10 to 1000), per_sr=yes (J0 or the table is per steradian of an isotropic field: x 4 pi),
// scale_to=F@E (same shape, F protons/cm2 above E MeV) or scale=X (the fluence times X).
//   library:ID[,scale=X,...]                      a published event (event_library.hpp)
#include "planner/scenario/input_error.hpp"

#include "exposure/spectrum.hpp"

#include <string>
#include <string_view>

namespace crewdose::planner {

/// Parses a spectrum spelling; InputError naming `field` (the option or key) on any problem,
/// located on the command line.
[[nodiscard]] exposure::ProtonSpectrum parse_spectrum(std::string_view text,
                                                      std::string_view field);
/// The same, with errors located at `where` (a scenario file line).
[[nodiscard]] exposure::ProtonSpectrum parse_spectrum(std::string_view text, std::string_view field,
                                                      const SourceLocation& where);

/// One line describing a spectrum for reports.
[[nodiscard]] std::string describe_spectrum(const exposure::ProtonSpectrum& spectrum);

/// The help text listing every spelling.
[[nodiscard]] std::string spectrum_help();

} // namespace crewdose::planner
