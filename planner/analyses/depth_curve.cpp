#include "planner/analyses/depth_curve.hpp"

#include "planner/scenario/input_error.hpp"
#include "planner/scenario/number_parse.hpp"
#include "planner/study/location_response.hpp"
#include "planner/study/result_guard.hpp"
#include "planner/study/study.hpp"

#include "exposure/depth_dose.hpp"
#include "exposure/material_library.hpp"

#include <fmt/format.h>

#include <cmath>

namespace crewdose::planner {
namespace {

const SourceLocation kCommandLine{"command line", 0};

} // namespace

TissueDepth parse_tissue_depth(std::string_view text, std::string_view field) {
    // The quick body model's named depths (skin 0.07 mm, eye lens 3 mm, BFO 5 cm of
    // unit-density tissue).
    for (const auto& o : quick_body_model()) {
        if (text == o.name) {
            const double mm = 10.0 * o.depth_g_cm2;
            return {o.depth_g_cm2, fmt::format("{} ({} of tissue)",
                                               o.name == "lens" ? "eye lens" : organ_label(o.name),
                                               mm >= 10.0 ? fmt::format("{:g} cm", mm / 10.0)
                                                          : fmt::format("{:g} mm", mm))};
        }
    }
    const auto parsed = parse_finite(text);
    const double v = parsed.value_or(-1.0);
    if (!parsed || v < 0.0 || v > 100.0) {
        throw InputError(kCommandLine, std::string(field),
                         fmt::format("'{}' is not a tissue depth; allowed: skin, lens, bfo or a "
                                     "number of g/cm2 from 0 to 100",
                                     text));
    }
    return {v, fmt::format("{:g} g/cm2 of tissue", v)};
}

std::vector<double> parse_depth_list(std::string_view text, std::string_view field) {
    std::vector<double> out;
    for (const auto item : split_commas(text)) {
        const auto v = parse_finite(item);
        if (!v || *v < 0.0 || *v > 1000.0) {
            throw InputError(kCommandLine, std::string(field),
                             fmt::format("'{}' is not a shield areal density; allowed: numbers "
                                         "from 0 to 1000 g/cm2 separated by commas",
                                         item));
        }
        out.push_back(*v);
    }
    return out;
}

std::vector<DepthRow> depth_rows(const exposure::ProtonSpectrum& spectrum,
                                 const exposure::Material& shield, const TissueDepth& tissue,
                                 const std::vector<double>& depths_g_cm2,
                                 const exposure::Material& detector,
                                 const exposure::DataCache* cache) {
    exposure::TableLibrary tables;
    const exposure::Material& soft = *exposure::find_builtin_material("soft-tissue");
    const exposure::Material& water = *exposure::find_builtin_material("water");
    exposure::DepthDoseSetup setup{&shield, &soft, &water, tissue.g_cm2, exposure::RbeModel{}};
    setup.detector = &detector;
    const auto doses = exposure::depth_dose_curve(tables, setup, spectrum, depths_g_cm2);
    // The secondaries: the march of the event's protons with and without them (the march's
    // own default step), their ratio applied to the exact primaries with removal.
    exposure::TableLibrary march_tables(gcr_grid());
    exposure::MarchOptions whole_options;
    whole_options.secondaries = true;
    exposure::FragmentTransport whole(march_tables, whole_options, cache);
    exposure::FragmentTransport primaries(march_tables, exposure::MarchOptions{}, cache);
    exposure::IonField incident = whole.empty_field();
    for (std::size_t m = 0; m < whole.energies().size(); ++m) {
        const double E = whole.energies()[m];
        incident.psi[0][m] = E * spectrum.differential_fluence_per_cm2_MeV(E);
    }
    std::vector<DepthRow> rows;
    for (std::size_t i = 0; i < depths_g_cm2.size(); ++i) {
        const std::string what = fmt::format("the dose behind {} g/cm2", depths_g_cm2[i]);
        DepthRow row{depths_g_cm2[i], doses[i], doses[i].with_removal};
        exposure::IonField a = incident;
        exposure::IonField b = incident;
        for (auto* f : {&a, &b}) {
            auto& march = f == &a ? whole : primaries;
            march.cross(*f, shield, depths_g_cm2[i]);
            march.cross(*f, soft, tissue.g_cm2);
        }
        row.dose.with_removal = apply_secondary_factor(
            row.dose.with_removal,
            secondary_factor(whole.dose(a, detector, water), primaries.dose(b, detector, water)));
        require_dose(row.dose.with_removal, what);
        require_dose(row.dose.without_removal, what);
        rows.push_back(row);
    }
    return rows;
}

} // namespace crewdose::planner
