// compare_report.hpp: a comparison and a mean-and-spread as JSON: the `compare --json`
// objects, and the Compare panel's copy-as-JSON. Angles in degrees; quaternions canonical
// Hamilton (w, x, y, z), body-to-world.
#pragma once

#include <nlohmann/json.hpp>
#include <vector>

#include "attiscope/core/compare.hpp"

#include "attiscope/core/report.hpp"  // quaternion_json

namespace attiscope {

/// reference, current, angle_deg, body {relation, quaternion, axis, angle_deg, turns_deg,
/// named_turns}, world {relation, quaternion, axis, angle_deg, turns_deg}, euler_difference
/// {sequence, kind, reference_deg, current_deg, difference_deg, mismatch_deg, note}, warnings.
nlohmann::json comparison_json(const Comparison& c);

/// count, mean {quaternion}, aligned_quaternions, lines (as given; 1-based indices when
/// empty), angles_from_mean_deg, max_deg, max_line, rms_deg, hemisphere_flips, method.
nlohmann::json mean_spread_json(const MeanSpread& s, const std::vector<int>& lines = {});

}  // namespace attiscope
