#pragma once
// The shelter tests' fixture, shared by the tests of the sizing and of its reports: a hut, an
// aluminium spherical shell of 2 m radius around the dose point in deep space (no ground), 64
// directions to keep the tests quick; the event is invented.
#include "fixture.hpp"
#include "planner/analyses/shelter.hpp"

#include <string>
#include <utility>
#include <vector>

/// The hut's scenario, with `extra_layer` added to its shell.
inline std::string hut_plan(const std::string& extra_layer = "") {
    return fill(read_fixture("shelter-hut.toml.in"), {{"@EXTRA_LAYERS@", extra_layer}});
}

/// Sizing the hut's shelter ("inside") for its event ("spe") with these materials and a BFO
/// target in mGy-Eq.
inline crewdose::planner::ShelterRequest hut_request(std::vector<std::string> materials,
                                                     double bfo_target) {
    crewdose::planner::ShelterRequest r;
    r.event_id = "spe";
    r.location_id = "inside";
    r.materials = std::move(materials);
    r.targets["bfo"] = bfo_target;
    return r;
}
