// libFuzzer harness: any bytes as a --spectrum text. parse_spectrum must answer with a spectrum
// or an InputError, and every spectrum it accepts must be finite and non-negative (integral and
// differential fluence) from 10 keV to 100 GeV, the whole transport grid.
#include "planner/scenario/input_error.hpp"
#include "planner/scenario/spectrum_spec.hpp"

#include <cmath>
#include <cstdint>
#include <cstdlib>
#include <string_view>

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
    using namespace crewdose;
    const std::string_view text(reinterpret_cast<const char*>(data), size);
    try {
        const auto s = planner::parse_spectrum(text, "--spectrum");
        for (double E = 0.01; E <= 1e5; E *= 1.37) {
            const double J = s.integral_fluence_per_cm2(E);
            const double phi = s.differential_fluence_per_cm2_MeV(E);
            if (!std::isfinite(J) || !std::isfinite(phi) || J < 0.0 || phi < 0.0) {
                std::abort();
            }
        }
    } catch (const InputError&) {
        // refused, as it should be
    }
    return 0;
}
