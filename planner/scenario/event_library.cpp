#include "planner/scenario/event_library.hpp"

namespace crewdose::planner {

namespace {

// Where the SAPPHIRE design events were read: the paper itself was not readable here.
constexpr std::string_view kSapphireSource =
    "Jiggens et al. 2018, \"Updated Model of the Solar Energetic Proton Environment in Space\", "
    "J. Space Weather Space Clim. 8, A31, doi:10.1051/swsc/2018010, Table 8 (event-integrated "
    "fluence: gamma_a, R0, C; gamma_b = 5.7 for every event), differential in rigidity, per "
    "steradian";
constexpr std::string_view kSapphireReadIn =
    "as transcribed in the public repository drflei/sapphire-event-spectra at commit "
    "f7cc9a6e5eba56da9007cfc053a3ed2bc19de6ec (sapphire_event_spectra/spectra.py for the "
    "parameters, core.py for the form)";
constexpr std::string_view kSapphireNote =
    "not checked against the paper itself; taken as isotropic (omnidirectional = 4 pi x per "
    "steradian) and as seen at 1 AU";

} // namespace

const std::vector<ReferenceEvent>& reference_events() {
    // The SAPPHIRE design events: the event-integrated fluence of a single event that is
    // exceeded on average once in the return period (a statistical statement, not a forecast).
    // Ids are crewdose's own. The parameters are Table 8's as transcribed (see above).
    static const std::vector<ReferenceEvent> kLibrary{
        {"design-10yr", "Design event, 1 in 10 years (SAPPHIRE)", "design", 10.0,
         "band-differential:C=1.33e10,gamma_a=0.85,gamma_b=5.7,R0_GV=7.22e-2,per_sr=yes",
         kSapphireSource, kSapphireReadIn, kSapphireNote},
        {"design-20yr", "Design event, 1 in 20 years (SAPPHIRE)", "design", 20.0,
         "band-differential:C=2.81e10,gamma_a=0.71,gamma_b=5.7,R0_GV=7.01e-2,per_sr=yes",
         kSapphireSource, kSapphireReadIn, kSapphireNote},
        {"design-50yr", "Design event, 1 in 50 years (SAPPHIRE)", "design", 50.0,
         "band-differential:C=5.85e10,gamma_a=0.56,gamma_b=5.7,R0_GV=6.81e-2,per_sr=yes",
         kSapphireSource, kSapphireReadIn, kSapphireNote},
        {"design-100yr", "Design event, 1 in 100 years (SAPPHIRE)", "design", 100.0,
         "band-differential:C=8.73e10,gamma_a=0.48,gamma_b=5.7,R0_GV=6.71e-2,per_sr=yes",
         kSapphireSource, kSapphireReadIn, kSapphireNote},
        {"design-300yr", "Design event, 1 in 300 years (SAPPHIRE)", "design", 300.0,
         "band-differential:C=1.45e11,gamma_a=0.38,gamma_b=5.7,R0_GV=6.58e-2,per_sr=yes",
         kSapphireSource, kSapphireReadIn, kSapphireNote},
        {"design-1000yr", "Design event, 1 in 1,000 years (SAPPHIRE)", "design", 1000.0,
         "band-differential:C=2.14e11,gamma_a=0.315,gamma_b=5.7,R0_GV=6.50e-2,per_sr=yes",
         kSapphireSource, kSapphireReadIn, kSapphireNote},
        {"design-10000yr", "Design event, 1 in 10,000 years (SAPPHIRE)", "design", 10000.0,
         "band-differential:C=3.95e11,gamma_a=0.195,gamma_b=5.7,R0_GV=6.36e-2,per_sr=yes",
         kSapphireSource, kSapphireReadIn, kSapphireNote},
    };
    return kLibrary;
}

const std::vector<MissingReferenceEvent>& missing_reference_events() {
    static const std::vector<MissingReferenceEvent> kMissing{
        {"the August 1972 event (King 1974's exponential fit)",
         "neither the paper nor a publication quoting the fit could be read here; it stays out "
         "until a citable source is read"},
    };
    return kMissing;
}

const ReferenceEvent* find_reference_event(std::string_view id) {
    for (const auto& e : reference_events()) {
        if (e.id == id) {
            return &e;
        }
    }
    return nullptr;
}

} // namespace crewdose::planner
