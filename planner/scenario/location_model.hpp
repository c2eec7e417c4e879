#pragma once
// What a scenario says about a place that is not geometry: the EVA suit, and the default sizes
// of the direction sets the study traces (their convergence studies are cited with each).
#include <cstddef>
#include <string>
#include <vector>

namespace crewdose::planner {

/// One layer of an EVA suit, in areal density.
struct SuitLayer {
    std::string material_id;
    double areal_density_g_cm2;
};

/// An EVA suit as a thin shell around the body, thicker over a cone behind the wearer where
/// the life-support pack is. Defaults (planning assumptions, override them with the suit's own
/// figures): 0.3 g/cm2 aluminium-equivalent all round, the "thin spacesuit" figure used in the
/// open literature (from memory), and 2 g/cm2 of aluminium for the pack over a 60-degree
/// half-angle cone (an assumption of this project, not from a source).
struct SuitModel {
    std::vector<SuitLayer> all_around{{"aluminium", 0.3}};
    std::vector<SuitLayer> pack{{"aluminium", 2.0}};
    double pack_half_angle_deg = 60.0;
};

/// Default number of directions: 2048. Convergence study (tests/unit/direction_convergence_test,
/// demo Band event): in a small rover cabin 1024 -> 4096 directions changes skin, lens and BFO
/// doses by up to 0.50 %, 2048 -> 8192 by 0.13 %.
inline constexpr std::size_t kDefaultDirections = 2048;

/// Default number of directions for the GCR marches. Convergence on the lunar demo (six
/// locations, three organs, absorbed dose and dose equivalent, with and without nuclear
/// reactions) against 4096 directions: 64 differ by up to 2.5 %, 256 by 0.30 %, 1024 by
/// 0.071 % (the per-nucleus responses before the marches: 3.1, 0.29, 0.066 %). The GCR rate is
/// a background whose model uncertainty is far larger than 0.3 %.
inline constexpr std::size_t kDefaultGcrDirections = 256;

/// Default number of directions for the SPE responses of a phantom location: 256 (each costs
/// one path response per grid depth, 30 of them). Convergence: tests/unit/phantom_test.
inline constexpr std::size_t kDefaultPhantomDirections = 256;

} // namespace crewdose::planner
