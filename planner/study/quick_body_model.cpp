// The quick screening body model: each organ at one tissue depth, the same in every direction
// (quick_body_model(): skin 0.07 mm, lens 3 mm, BFO 5 cm; conservative, no heart, brain or
// effective dose).
#include "planner/study/body_model.hpp"

namespace crewdose::planner {
namespace {

class QuickBodyModel final : public BodyModel {
  public:
    using BodyModel::BodyModel;

    [[nodiscard]] std::vector<std::string> organs() const override {
        std::vector<std::string> out;
        for (const auto& o : quick_body_model()) {
            out.push_back(o.name);
        }
        return out;
    }
    // One response per organ depth: the tables' default grid (64 nodes per decade).
    [[nodiscard]] exposure::EnergyGridSpec spe_grid() const override { return {}; }
    [[nodiscard]] BodyDepths spe_depths(const BodyPlacement& /*placement*/,
                                        const std::vector<habitats::Vector3>& /*directions*/,
                                        std::size_t /*threads*/) const override {
        return quick_body_depths(); // the same in every direction and placement
    }
    [[nodiscard]] BodyDepths gcr_depths(const BodyPlacement& /*placement*/,
                                        const std::vector<habitats::Vector3>& /*directions*/,
                                        std::size_t /*threads*/) const override {
        return quick_body_depths();
    }
    [[nodiscard]] std::optional<std::vector<std::vector<DepthSample>>>
    depth_samples(const BodyPlacement& /*placement*/,
                  const std::vector<habitats::Vector3>& /*directions*/,
                  const BodyDepths& /*body*/) const override {
        return std::nullopt; // each organ's one depth is a grid node: the grid is exact
    }
    [[nodiscard]] std::string report_text(const Mission& /*mission*/) const override {
        return "quick screening model (skin 0.07 mm, lens 3 mm, BFO 5 cm of tissue in every "
               "direction; no heart, brain or effective dose)";
    }
    [[nodiscard]] std::string organ_table_heading() const override {
        return "  per organ (quick body model: the tissue depth is added in every direction):\n";
    }
};

} // namespace

std::unique_ptr<BodyModel> make_body_model_quick(const BodyModelName& name) {
    return std::make_unique<QuickBodyModel>(name);
}

} // namespace crewdose::planner
