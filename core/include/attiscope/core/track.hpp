// track.hpp: a pose log held in memory: one time and one quaternion per sample, with the
// rows that failed to parse and what each column was read as.
//
// Layout: structure of arrays, 40 bytes per sample (time + four quaternion numbers), so a
// ten-million-sample log fits in 400 MB. Quaternions are Hamilton, scalar first,
// body-to-world, and keep the sign they had in the file (a track's sign is continuous on
// purpose: canonicalising would hide the flips the diagnosis looks for).
#pragma once

#include <cstddef>
#include <string>
#include <vector>

namespace attiscope {

/// A row of a log that could not be read, and why.
struct BadRow {
  std::size_t line = 0;  ///< 1-based line number in the file
  std::string reason;
};

/// What one column (or group of columns) of a log was read as.
struct TrackColumn {
  std::string name;  ///< header name, or "column 3"
  std::string role;  ///< "time", "quaternion w", "matrix r12", "ignored", ...
};

struct Track {
  std::vector<double> time_s;          ///< seconds; sample index when the log has no time column
  std::vector<double> qw, qx, qy, qz;  ///< as read (normalised only when asked), sign kept
  std::vector<BadRow> bad_rows;
  std::size_t skipped_lines = 0;  ///< blank lines and '#' comment lines (header lines not counted)
  std::vector<TrackColumn> columns;
  std::string reading;    ///< how the rotation columns were read, e.g. "quat-wxyz"
  bool has_time = false;  ///< false: time_s holds sample indices
  std::string time_unit;  ///< unit the time column was written in ("s", "ms", "us", "ns")

  std::size_t size() const { return time_s.size(); }
};

}  // namespace attiscope
