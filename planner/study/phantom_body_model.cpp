// The stylised adult phantom as a body model: each organ's own tissue along every direction,
// from the phantom's sample points (phantom_body_depths), for the posture and heading of the
// location; skin, lens, BFO (the active marrow), heart, brain and the ICRP 103 effective dose.
#include "planner/study/body_model.hpp"

#include <fmt/format.h>

#include <cstdio>

namespace crewdose::planner {
namespace {

bool same_directions(const std::vector<habitats::Vector3>& a,
                     const std::vector<habitats::Vector3>& b) {
    return std::equal(a.begin(), a.end(), b.begin(), b.end(),
                      [](const habitats::Vector3& u, const habitats::Vector3& v) {
                          return u.x == v.x && u.y == v.y && u.z == v.z;
                      });
}

class PhantomBodyModel final : public BodyModel {
  public:
    using BodyModel::BodyModel;

    [[nodiscard]] std::vector<std::string> organs() const override {
        return {"skin", "lens", "bfo", "heart", "brain", "effective"};
    }
    [[nodiscard]] exposure::EnergyGridSpec spe_grid() const override {
        exposure::EnergyGridSpec g;
        g.nodes_per_decade = kPhantomSpeNodesPerDecade;
        return g;
    }
    [[nodiscard]] BodyDepths spe_depths(const BodyPlacement& placement,
                                        const std::vector<habitats::Vector3>& directions,
                                        std::size_t threads) const override {
        return on_grids(placement, directions, {phantom_depth_grid()}, threads).front();
    }
    [[nodiscard]] BodyDepths gcr_depths(const BodyPlacement& placement,
                                        const std::vector<habitats::Vector3>& directions,
                                        std::size_t threads) const override {
        return on_grids(placement, directions, {phantom_gcr_depth_grid()}, threads).front();
    }
    [[nodiscard]] SourceBodyDepths depths(const BodyPlacement& placement,
                                          const std::vector<habitats::Vector3>& spe_directions,
                                          const std::vector<habitats::Vector3>& gcr_directions,
                                          std::size_t threads) const override {
        if (!same_directions(spe_directions, gcr_directions)) {
            return BodyModel::depths(placement, spe_directions, gcr_directions, threads);
        }
        // One ray trace per point and direction for both grids.
        auto both = on_grids(placement, spe_directions,
                             {phantom_depth_grid(), phantom_gcr_depth_grid()}, threads);
        return {std::move(both[0]), std::move(both[1])};
    }
    [[nodiscard]] std::optional<std::string>
    depths_key(const BodyPlacement& placement, const std::vector<habitats::Vector3>& spe_directions,
               const std::vector<habitats::Vector3>& gcr_directions) const override {
        // Every number in hexadecimal floating point: the key is the inputs, exactly. The
        // phantom itself (its solids and its 512 points per region) is compiled in: the build
        // id covers it.
        std::string key = fmt::format("phantom points {} skin-factor {} posture {} heading ",
                                      kPhantomPointsPerDirection, kSkinPointsFactor,
                                      static_cast<int>(placement.posture));
        char buf[32];
        auto add = [&](double x) {
            std::snprintf(buf, sizeof buf, "%a ", x);
            key += buf;
        };
        add(placement.heading_deg);
        auto add_all = [&](const char* name, const std::vector<double>& v) {
            key += name;
            for (const double x : v) {
                add(x);
            }
        };
        add_all("\nspe-grid ", phantom_depth_grid());
        add_all("\ngcr-grid ", phantom_gcr_depth_grid());
        auto add_directions = [&](const char* name, const std::vector<habitats::Vector3>& dirs) {
            key += fmt::format("\n{} {}: ", name, dirs.size());
            for (const auto& u : dirs) {
                add(u.x);
                add(u.y);
                add(u.z);
            }
        };
        add_directions("spe-directions", spe_directions);
        add_directions("gcr-directions", gcr_directions);
        return key;
    }
    [[nodiscard]] std::optional<std::vector<std::vector<DepthSample>>>
    depth_samples(const BodyPlacement& placement, const std::vector<habitats::Vector3>& directions,
                  const BodyDepths& body) const override {
        // The grid's weights only hold each depth split between two nodes: trace again, once,
        // keeping every point's own depth.
        std::vector<std::vector<DepthSample>> samples;
        const std::vector<std::vector<double>> grid{body.grid_g_cm2};
        (void)phantom_body_depths(shared_phantom(), placement.posture, placement.heading_deg,
                                  directions, grid, kPhantomPointsPerDirection, 1, &samples);
        return samples;
    }
    [[nodiscard]] std::string report_text(const Mission& mission) const override {
        return fmt::format(
            "stylised adult phantom (MIRD-type hermaphrodite after MIRD Pamphlet 5, organ "
            "tissue depths per direction from {} points per organ region (the skin {}), {} "
            "directions for SPEs; skin 0.07 mm below the body's surface, averaged over it; lens "
            "at 3 mm in every direction (no eyes in the phantom); BFO = active marrow; effective "
            "dose with ICRP 103 weights, oesophagus, salivary glands and bone surface by named "
            "proxies)",
            kPhantomPointsPerDirection, kSkinPointsFactor * kPhantomPointsPerDirection,
            mission.phantom_directions);
    }
    [[nodiscard]] std::string organ_table_heading() const override {
        return "  per organ (stylised phantom: the organ's own tissue along each direction;\n"
               "  percentiles over the organ's points and the open directions; effective =\n"
               "  ICRP 103 weighted, its doses in mSv):\n";
    }

  private:
    static std::vector<BodyDepths> on_grids(const BodyPlacement& placement,
                                            const std::vector<habitats::Vector3>& directions,
                                            const std::vector<std::vector<double>>& grids,
                                            std::size_t threads) {
        return phantom_body_depths(shared_phantom(), placement.posture, placement.heading_deg,
                                   directions, grids, kPhantomPointsPerDirection, threads);
    }
};

} // namespace

std::unique_ptr<BodyModel> make_body_model_phantom(const BodyModelName& name) {
    return std::make_unique<PhantomBodyModel>(name);
}

} // namespace crewdose::planner
