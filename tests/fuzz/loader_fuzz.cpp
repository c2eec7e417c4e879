// libFuzzer harness: any bytes as a scenario file. The loader must answer with a Scenario or an
// InputError (exposure::ParameterError is wrapped by it), never crash, hang or reach undefined
// behaviour (the fuzz build runs under AddressSanitizer and UndefinedBehaviorSanitizer, with
// toml++ compiled in). An accepted scenario must carry only finite, plausible numbers.
#include "planner/scenario/input_error.hpp"
#include "planner/scenario/scenario.hpp"

#include <cmath>
#include <cstdint>
#include <cstdlib>
#include <string>

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
    using namespace crewdose;
    const std::string text(reinterpret_cast<const char*>(data), size);
    try {
        const planner::Scenario sc = planner::parse_scenario(text, "fuzz.toml");
        for (const auto& ev : sc.events) {
            for (double E = 0.01; E <= 1e5; E *= 3.0) {
                const double J = ev.spectrum.integral_fluence_per_cm2(E);
                const double phi = ev.spectrum.differential_fluence_per_cm2_MeV(E);
                if (!std::isfinite(J) || !std::isfinite(phi) || J < 0.0 || phi < 0.0) {
                    std::abort(); // an accepted spectrum that is not finite and >= 0
                }
            }
        }
        if (!std::isfinite(sc.limits.uncertainty_factor)) {
            std::abort();
        }
        for (const auto& loc : sc.locations) {
            if (!std::isfinite(loc.heading_deg)) {
                std::abort();
            }
        }
    } catch (const InputError&) {
        // refused, as it should be
    }
    return 0;
}
