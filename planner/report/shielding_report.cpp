#include "planner/report/shielding_report.hpp"

#include "planner/analyses/shielding_summary.hpp"
#include "planner/report/cautions.hpp"
#include "planner/report/depth_report.hpp"
#include "planner/report/document_writer.hpp"

#include <fmt/format.h>

#include <algorithm>

namespace crewdose::planner {
namespace {

report::Column column(std::string key, std::string header, std::string unit, double scale = 1.0) {
    report::Column c;
    c.key = std::move(key);
    c.header = std::move(header);
    c.unit = std::move(unit);
    c.scale = scale;
    c.digits = 3;
    return c;
}

// A column of the CSV only (the location's own figures, repeated on every organ's row so that
// each row stands alone).
report::Column csv_only(std::string key, bool is_text = false) {
    auto c = column(std::move(key), "", "");
    c.in_text = false;
    c.left = is_text;
    return c;
}

} // namespace

report::Document shielding_document(const ShieldingSummary& s) {
    using report::Field;
    report::Document doc;
    report::Object external{{{"mean", s.external_mean_g_cm2}}};
    for (std::size_t i = 0; i < kShieldingPercentiles.size(); ++i) {
        external.fields.push_back(
            {fmt::format("p{:02.0f}", 100.0 * kShieldingPercentiles[i]), s.external_g_cm2[i]});
    }
    doc.group({"",
               {{"location", s.location},
                {"directions", static_cast<std::int64_t>(s.directions)},
                {"blocked_by_ground_share", s.blocked_share},
                {"external_g_cm2", external},
                {"gcr_phi_MV", s.gcr_phi_MV},
                {"body_model", s.body_model}}});
    report::Group organs{"organs", {}};
    for (const auto& o : s.organs) {
        report::Object oj{
            {{"mean_tissue_g_cm2", o.mean_tissue_g_cm2},
             {"total_g_cm2", report::Object{{{"p05", o.total_p05_g_cm2},
                                             {"p50", o.total_p50_g_cm2},
                                             {"p95", o.total_p95_g_cm2}}}},
             {"gcr_per_day",
              report::Object{
                  {{"with_reactions", dose_si_object(o.gcr_per_day.with_removal)},
                   {"without_reactions", dose_si_object(o.gcr_per_day.without_removal)}}}}}};
        if (o.event) {
            oj.fields.push_back({"event", dose_si_object(*o.event)});
        }
        organs.fields.push_back({o.organ, std::move(oj)});
    }
    if (!organs.fields.empty()) {
        doc.group(std::move(organs));
    }

    doc.text("Shielding at {} ({}), {} directions",
             {Field{"location", s.location}, Field{"scenario", s.scenario_file},
              Field{"directions", static_cast<std::int64_t>(s.directions)}});
    report::Field blocked{"blocked", 100.0 * s.blocked_share, 1, report::Rounding::fixed};
    doc.text("  blocked by the ground or terrain: {} % of the sky (counted as zero dose)",
             {blocked});
    std::string pattern = "  external areal density over the open sky, g/cm2: mean {}";
    std::vector<Field> args{{"mean", s.external_mean_g_cm2, 3, report::Rounding::significant}};
    for (std::size_t i = 0; i < kShieldingPercentiles.size(); ++i) {
        pattern += fmt::format(", p{:.0f} {{}}", 100.0 * kShieldingPercentiles[i]);
        args.push_back({"p", s.external_g_cm2[i], 3, report::Rounding::significant});
    }
    doc.text(pattern, args, 100, "    ");
    doc.text(s.organ_heading);

    report::Table t;
    t.key = "organs";
    t.in_json = false; // JSON: the "organs" object above
    t.is_csv = true;
    t.indent = "    ";
    auto organ = column("organ", "organ", "");
    organ.left = true;
    auto tissue = column("mean_tissue_g_cm2", s.tissue_is_mean ? "tissue*" : "tissue", "g/cm2");
    auto event_col = [&](std::string key, std::string header, std::string unit) {
        auto c = column(std::move(key), std::move(header), std::move(unit), 1e3);
        c.absent = "-";
        c.in_text = s.event_id.has_value();
        return c;
    };
    auto event_id = csv_only("event", true);
    auto csv_event_col = [&](std::string key) {
        auto c = csv_only(std::move(key));
        c.scale = 1e3;
        return c;
    };
    // Text: the effective dose is a dose equivalent only ("-" for its absorbed and RBE-weighted
    // dose), so these two have their own text columns; the CSV keeps the study's numbers.
    auto text_event_col = [&](std::string key, std::string header, std::string unit) {
        auto c = event_col(std::move(key), std::move(header), std::move(unit));
        c.in_csv = false;
        return c;
    };
    t.columns = {
        csv_only("location", true),
        csv_only("body_model", true),
        csv_only("directions"),
        csv_only("blocked_by_ground_share"),
        csv_only("external_mean_g_cm2"),
        csv_only("external_p05_g_cm2"),
        csv_only("external_p50_g_cm2"),
        csv_only("external_p95_g_cm2"),
        organ,
        tissue,
        column("total_p05_g_cm2", "p5", "g/cm2"),
        column("total_p50_g_cm2", "p50", "g/cm2"),
        column("total_p95_g_cm2", "p95", "g/cm2"),
        csv_only("gcr_phi_MV"),
        column("gcr_dose_equivalent_with_reactions_mSv_per_day", "GCR, with", "mSv/day", 1e3),
        column("gcr_dose_equivalent_without_reactions_mSv_per_day", "GCR, w/o", "mSv/day", 1e3),
        event_id,
        csv_event_col("event_absorbed_mGy"),
        text_event_col("absorbed", "absorbed", "mGy"),
        event_col("event_dose_equivalent_mSv", "dose eq.", "mSv"),
        csv_event_col("event_rbe_weighted_mGyEq"),
        text_event_col("rbe_weighted", "RBE-wtd", "mGy-Eq")};
    for (const auto& o : s.organs) {
        report::Value id;
        report::Value absorbed;
        report::Value equivalent;
        report::Value rbe;
        report::Value absorbed_text;
        report::Value rbe_text;
        if (o.event) {
            id = *s.event_id;
            equivalent = o.event->dose_equivalent_Sv;
            absorbed = o.event->absorbed_Gy;
            rbe = o.event->rbe_weighted_GyEq;
            if (o.organ != "effective") {
                absorbed_text = absorbed;
                rbe_text = rbe;
            }
        }
        t.rows.push_back({s.location,
                          s.body_model,
                          static_cast<std::int64_t>(s.directions),
                          s.blocked_share,
                          s.external_mean_g_cm2,
                          s.external_g_cm2[0],
                          s.external_g_cm2[2],
                          s.external_g_cm2[4],
                          o.organ,
                          o.mean_tissue_g_cm2,
                          o.total_p05_g_cm2,
                          o.total_p50_g_cm2,
                          o.total_p95_g_cm2,
                          s.gcr_phi_MV,
                          o.gcr_per_day.with_removal.dose_equivalent_Sv,
                          o.gcr_per_day.without_removal.dose_equivalent_Sv,
                          id,
                          absorbed,
                          absorbed_text,
                          equivalent,
                          rbe,
                          rbe_text});
    }
    doc.table(std::move(t));
    if (s.tissue_is_mean) {
        doc.text("  * the mean over the organ's points and the open directions.");
    }
    doc.text("  p5 / p50 / p95: external shielding plus the organ's tissue, percentiles.");
    doc.text("  GCR per day at the mission start, phi = {} MV, with / without nuclear reactions; "
             "no uncertainty factor.",
             {Field{"phi", s.gcr_phi_MV, 6, report::Rounding::general}}, 100, "  ");
    if (s.event_id) {
        const bool has_effective =
            std::any_of(s.organs.begin(), s.organs.end(),
                        [](const OrganShielding& o) { return o.organ == "effective"; });
        doc.text(
            "  The last three columns: the whole event " + *s.event_id +
                " at this location, no uncertainty factor, the higher of the reactions "
                "bracket" +
                (has_effective ? "; the effective dose is a dose equivalent (mSv) only." : "."),
            {}, 100, "  ");
    }
    doc.blank();
    doc.keyed_text("cautions", caution_text());
    return doc;
}

std::string format_shielding_report(const Study& study, const std::string& location,
                                    const std::optional<std::string>& event, OutputFormat format) {
    return report::write(shielding_document(shielding_summary(study, location, event)), format);
}

} // namespace crewdose::planner
