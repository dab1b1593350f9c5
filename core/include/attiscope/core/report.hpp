// report.hpp: everything attiscope says about one rotation, as the `convert --json` object
// and as a readable table. The window's copy-as-JSON uses the same function.
#pragma once

#include <nlohmann/json.hpp>
#include <string>
#include <vector>

#include "attiscope/core/euler.hpp"
#include "attiscope/core/rotation.hpp"
#include "attiscope/core/text.hpp"

namespace attiscope {

struct ReportOptions {
  EulerConvention euler;                ///< the convention of the "euler" key
  AngleUnit unit = AngleUnit::Degrees;  ///< for the table only; JSON is in degrees
  int precision = 6;                    ///< significant digits in the table
  std::string reading = "quat-wxyz";    ///< how the input was read
  std::vector<std::string> warnings;
};

/// {"w","x","y","z"} of the canonical quaternion (the design's "quaternion" object).
nlohmann::json quaternion_json(const Rotation& r);
/// The matrix world_R_body (or a_R_b) as 3 rows of 3 numbers.
nlohmann::json matrix_json(const Rotation& r);

/// One Euler object: {"sequence","kind","angles_deg","lock_margin_deg","at_lock",
/// "rate_condition_number"}.
nlohmann::json euler_json(const EulerAngles& e);

/// The `convert --json` object (design.md, "Command line"), numbers round-trip exact.
nlohmann::json convert_json(const Rotation& world_R_body, const ReportOptions& options);

/// The same content as an aligned plain-text table.
std::string convert_table(const Rotation& world_R_body, const ReportOptions& options);

}  // namespace attiscope
