#include "planner/study/body_model.hpp"

#include "exposure/byte_codec.hpp"

#include <algorithm>
#include <array>
#include <stdexcept>

namespace crewdose::planner {

SourceBodyDepths BodyModel::depths(const BodyPlacement& placement,
                                   const std::vector<habitats::Vector3>& spe_directions,
                                   const std::vector<habitats::Vector3>& gcr_directions,
                                   std::size_t threads) const {
    return {spe_depths(placement, spe_directions, threads),
            gcr_depths(placement, gcr_directions, threads)};
}

std::optional<std::string>
BodyModel::depths_key(const BodyPlacement& /*placement*/,
                      const std::vector<habitats::Vector3>& /*spe_directions*/,
                      const std::vector<habitats::Vector3>& /*gcr_directions*/) const {
    return std::nullopt;
}

namespace {

void encode(exposure::ByteWriter& w, const BodyDepths& b) {
    w.text(b.model);
    w.u64(b.organs.size());
    for (const auto& o : b.organs) {
        w.text(o);
    }
    w.f64s(b.grid_g_cm2);
    w.u64(b.directions);
    w.f64s(b.weights);
}

BodyDepths decode(exposure::ByteReader& r, std::size_t directions) {
    BodyDepths b;
    b.model = r.text();
    b.organs.resize(r.count(64));
    for (auto& o : b.organs) {
        o = r.text();
    }
    b.grid_g_cm2 = r.f64s();
    b.directions = r.count(exposure::ByteReader::kMaxValues);
    b.weights = r.f64s();
    // What of() indexes without checks.
    const std::size_t block = b.organs.size() * b.grid_g_cm2.size();
    if (b.directions != directions ||
        b.weights.size() != block * std::max<std::size_t>(1, directions) ||
        !std::is_sorted(b.grid_g_cm2.begin(), b.grid_g_cm2.end())) {
        throw exposure::CodecError("depths of another shape");
    }
    return b;
}

} // namespace

std::string encode_body_depths(const SourceBodyDepths& depths) {
    exposure::ByteWriter w;
    encode(w, depths.spe);
    encode(w, depths.gcr);
    return w.take();
}

std::optional<SourceBodyDepths> decode_body_depths(std::string_view payload,
                                                   std::size_t spe_directions,
                                                   std::size_t gcr_directions) {
    try {
        exposure::ByteReader r(payload);
        SourceBodyDepths d;
        d.spe = decode(r, spe_directions);
        d.gcr = decode(r, gcr_directions);
        r.finish();
        return d;
    } catch (const exposure::CodecError&) {
        return std::nullopt;
    }
}

SourceBodyDepths cached_depths(const BodyModel& body, const BodyPlacement& placement,
                               const std::vector<habitats::Vector3>& spe_directions,
                               const std::vector<habitats::Vector3>& gcr_directions,
                               std::size_t threads, const exposure::DataCache* cache) {
    const auto key =
        cache ? body.depths_key(placement, spe_directions, gcr_directions) : std::nullopt;
    if (key) {
        if (const auto payload = cache->load(kBodyDepthsCacheKind, *key)) {
            if (auto d =
                    decode_body_depths(*payload, spe_directions.size(), gcr_directions.size())) {
                if (d->spe.model == body.id() && d->gcr.model == body.id()) {
                    return std::move(*d);
                }
            }
        }
    }
    SourceBodyDepths d = body.depths(placement, spe_directions, gcr_directions, threads);
    if (key) {
        cache->store(kBodyDepthsCacheKind, *key, encode_body_depths(d));
    }
    return d;
}

std::vector<OrganResponse>
BodyModel::responses(exposure::TableLibrary& tables, const MaterialResolver& materials,
                     const LocationGeometry& where,
                     const std::vector<habitats::Vector3>& directions) const {
    return body_responses(tables, materials, where, directions,
                          spe_depths(placement_of(where), directions));
}

BodyPlacement placement_of(const LocationGeometry& where) {
    return {where.posture, where.heading_deg};
}

namespace {

// One model per registry line, made once, in the registry's order.
struct Registry {
    std::vector<std::unique_ptr<BodyModel>> owned;
    std::vector<const BodyModel*> models;

    Registry() {
        const auto names = body_model_names();
        std::size_t next = 0;
#define CREWDOSE_MAKE_BODY_MODEL(id, summary, has_posture, spe_directions)                         \
    owned.push_back(make_body_model_##id(names[next++]));
        CREWDOSE_BODY_MODELS(CREWDOSE_MAKE_BODY_MODEL)
#undef CREWDOSE_MAKE_BODY_MODEL
        for (const auto& m : owned) {
            models.push_back(m.get());
        }
    }
};

const Registry& registry() {
    static const Registry r;
    return r;
}

} // namespace

std::span<const BodyModel* const> body_models() {
    return registry().models;
}

const BodyModel& body_model(std::string_view id) {
    for (const BodyModel* m : body_models()) {
        if (m->id() == id) {
            return *m;
        }
    }
    throw std::logic_error("unregistered body model '" + std::string(id) + "'");
}

} // namespace crewdose::planner
