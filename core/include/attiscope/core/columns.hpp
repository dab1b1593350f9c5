// columns.hpp: the columns of a pose log (a text with one pose per line), and a fast
// reader of a whole log file into a Track (track.hpp).
//
// Column finding uses header names when the first line has them (t, time, stamp, qw, qx,
// quat_w, orientation.w, q0..q3, r11..r33, ...; Euler angles by the house convention's own
// angle names, then roll/pitch/yaw, phi/theta/psi or heading/pitch/bank, with an optional
// unit suffix such as "_deg", "_rad", "(deg)", "[rad]"). Without a header it uses statistics over
// the sample rows: four adjacent columns whose rows have unit norm are a quaternion (the
// slot that holds the scalar is found from the text of the header, or the house layout
// decides), nine adjacent columns orthonormal per row are a matrix, and a monotonic column
// is time, its unit taken from its magnitude.
//
// JSON lines (one object per line, `{"t": 0.01, "qw": 1, "qx": 0, "qy": 0, "qz": 0}`) are read
// the same way: the keys of the first object are the header (a nested object's keys are
// joined with '.', so {"orientation": {"w": ..}} is "orientation.w"), and each line's numbers
// are found by key, in any order. Strings, booleans, nulls and arrays are ignored.
#pragma once

#include <array>
#include <atomic>
#include <cstddef>
#include <functional>
#include <string>
#include <string_view>
#include <vector>

#include "attiscope/core/euler.hpp"
#include "attiscope/core/expected.hpp"
#include "attiscope/core/matrix.hpp"
#include "attiscope/core/quaternion.hpp"
#include "attiscope/core/text.hpp"
#include "attiscope/core/track.hpp"

namespace attiscope {

/// How the rotation of each row is written.
enum class TrackForm {
  QuatWxyz,    ///< four columns, scalar first
  QuatXyzw,    ///< four columns, scalar last
  MatrixRows,  ///< nine columns, row-major, world_R_body
  MatrixCols,  ///< nine columns, column-major, world_R_body
  Euler,       ///< three angle columns in application order (ColumnMapping::euler, euler_unit)
};

/// "quat-wxyz", "quat-xyzw", "matrix-rows", "matrix-cols", "euler" (the --as names).
std::string track_form_name(TrackForm f);
/// How many numbers a row's rotation takes in a form: 3 (Euler), 4 (quaternion) or 9.
std::size_t track_form_numbers(TrackForm f);

/// Where the time and the rotation are in each row of a log.
struct ColumnMapping {
  char delimiter = ',';          ///< ',', ';', '\t', or ' ' (runs of spaces and tabs)
  bool decimal_comma = false;    ///< "0,5" means 0.5 (only with ';' or '\t' delimiters)
  std::size_t header_lines = 0;  ///< lines at the top that are not data
  std::size_t column_count = 0;  ///< fields per data row
  int time_column = -1;          ///< -1: no time column (time is the sample index)
  double time_scale = 1.0;       ///< multiply the time column by this to get seconds
  std::string time_unit = "s";   ///< "s", "ms", "us", "ns"
  TrackForm form = TrackForm::QuatWxyz;
  /// Columns of the rotation numbers in storage order (track_form_numbers(form) are used:
  /// 3 Euler angles in application order, 4 for a quaternion, 9 for a matrix).
  std::array<int, 9> rotation_columns{};
  /// The Euler form: the convention of the three angles and their unit.
  EulerConvention euler;
  AngleUnit euler_unit = AngleUnit::Degrees;
  std::vector<TrackColumn> columns;  ///< name and role of every column
  std::vector<std::string> notes;    ///< how each choice was made, one sentence each
  bool ambiguous = false;            ///< a choice the text did not decide (layout, storage, unit)
  /// One JSON object per line: column c is the number under key json_keys[c] (delimiter and
  /// decimal_comma do not apply; header_lines is 0).
  bool json_lines = false;
  std::vector<std::string> json_keys;
};

/// How the rotation columns are read, for summaries: "quat-wxyz", or for Euler angles
/// "euler intrinsic ZYX, degrees".
std::string track_reading_text(const ColumnMapping& m);

/// The house choices column finding falls back on.
struct ColumnPreferences {
  QuatLayout quat_layout = QuatLayout::ScalarFirst;
  MatrixStorage matrix_storage = MatrixStorage::Rows;
  /// The house Euler convention: its angle names (application order) are looked for in a
  /// header before the common ones, and its unit decides when the numbers do not.
  EulerConvention euler;
  AngleUnit euler_unit = AngleUnit::Degrees;
  std::array<std::string, 3> euler_names{"yaw", "pitch", "roll"};
};

struct HouseConvention;
/// The house choices of a house convention: its quaternion layout, matrix storage, Euler
/// convention, angle unit and angle names.
ColumnPreferences column_preferences(const HouseConvention& house);

/// Finds the columns from the first lines of a log (a few hundred lines are plenty). Error
/// when no rotation columns are found, naming the line the trouble is on.
Expected<ColumnMapping> find_columns(std::string_view sample, const ColumnPreferences& preferences = {});

/// Seconds per unit of a time column: "s" 1, "ms" 1e-3, "us" 1e-6, "ns" 1e-9.
double time_unit_seconds(std::string_view unit);

/// Sets every column's role and time_scale from time_column, time_unit, form and
/// rotation_columns: what a mapping edited by hand (the Track panel) needs before reading.
void assign_column_roles(ColumnMapping* m);

/// Called now and then while reading: bytes done, bytes in total.
using ReadProgress = std::function<void(std::size_t done, std::size_t total)>;

/// Reads a whole log text with a mapping. Rows that cannot be read (a wrong number of
/// fields, a field that is not a number, a zero quaternion, a non-finite angle) are listed in bad_rows with
/// their line number and skipped; blank and '#' comment lines are counted in skipped_lines. Error only when
/// the read was cancelled.
Expected<Track> read_track_text(std::string_view text, const ColumnMapping& mapping,
                                const ReadProgress& progress = {}, const std::atomic<bool>* cancel = nullptr);

/// The same from a file, mapped into memory (no copy). Errors: the file cannot be opened or
/// mapped, or the read was cancelled.
Expected<Track> read_track_file(const std::string& path, const ColumnMapping& mapping,
                                const ReadProgress& progress = {}, const std::atomic<bool>* cancel = nullptr);

/// The first `max_bytes` of a file (whole lines), for find_columns.
Expected<std::string> read_file_head(const std::string& path, std::size_t max_bytes = 64 * 1024);

}  // namespace attiscope
