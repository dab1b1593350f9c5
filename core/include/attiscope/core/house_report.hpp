// house_report.hpp: what a house convention prints for one pose: the "house" object of
// `convert --json` and the house lines of the convert table. The window's house readout
// and copy buttons use the same functions.
#pragma once

#include <nlohmann/json.hpp>
#include <string>

#include "attiscope/core/convention.hpp"
#include "attiscope/core/rotation.hpp"

namespace attiscope {

/// {"name", "world_frame", "body_frame",
///  "euler": {"sequence","kind","names","values","unit","applied_names","lock_margin_deg","at_lock"},
///  "quaternion": {"layout","algebra","direction","labels","numbers"},
///  "matrix": {"direction","storage","numbers"},
///  "positive_directions": [3 sentences], "steps": [3 sentences]}.
/// Euler names and values are in the house's print order, values in the house's unit and
/// ranges; numbers round-trip (the JSON writer prints 17 significant digits).
nlohmann::json house_json(const Rotation& world_R_body, const HouseConvention& c);

/// The house lines of the convert table, at the house's precision.
std::string house_table(const Rotation& world_R_body, const HouseConvention& c);

}  // namespace attiscope
