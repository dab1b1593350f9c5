// track_clean.hpp: a cleaned copy of a track and its export as CSV.
//
// The clean copy has the same samples and times as the track (nothing is dropped, moved or
// reordered: time faults stay for the person to judge), with every quaternion normalised
// and its sign chosen continuous (q[i-1] . q[i] >= 0). Euler channels are unwrapped on
// export: whole turns are added so the first and third angles move continuously. Every
// change is listed.
//
// The CSV export writes 17 significant digits, so reading it back gives the same rotations
// to about 1e-15 rad.
#pragma once

#include <cstddef>
#include <functional>
#include <ostream>
#include <string>
#include <vector>

#include "attiscope/core/euler.hpp"
#include "attiscope/core/expected.hpp"
#include "attiscope/core/matrix.hpp"
#include "attiscope/core/quaternion.hpp"
#include "attiscope/core/text.hpp"
#include "attiscope/core/track.hpp"

namespace attiscope {

enum class CleanChangeKind {
  SignFlipped,    ///< samples [sample, sample + count) were negated to keep the sign continuous
  Normalised,     ///< samples [sample, sample + count) were scaled to norm 1; `value`: the
                  ///< norm farthest from 1 among them
  EulerUnwrapped  ///< from `sample` on, `value` whole turns (signed) were added to `channel`
};

/// "sign_flipped", "normalised", "euler_unwrapped".
std::string clean_change_kind_name(CleanChangeKind k);

struct CleanChange {
  std::size_t sample = 0;
  CleanChangeKind kind = CleanChangeKind::SignFlipped;
  std::size_t count = 1;
  int channel = -1;  ///< EulerUnwrapped: 0 (first angle) or 2 (third angle)
  double value = 0.0;
};

/// The clean copy: `track` has unit, sign-continuous quaternions; `changes` lists what was
/// done, by sample. Euler unwrapping is listed by the Euler export (it depends on the
/// convention).
struct CleanTrack {
  Track track;
  std::vector<CleanChange> changes;
};

/// Normalises every quaternion and makes the sign continuous. The first sample keeps its
/// sign. Samples that are not a rotation (zero or non-finite) are copied unchanged.
CleanTrack clean_track(const Track& track);

/// Unwraps the first and third Euler channels of a sample series in place: after each step
/// whose raw change exceeds pi, whole turns are added so the step lies in [-pi, pi].
/// Appends one EulerUnwrapped change per step changed (channel 0 or 2). The middle angle
/// never wraps (its range is half a turn) and is left alone.
void unwrap_euler(std::vector<double>& a, std::vector<double>& c, std::vector<CleanChange>* changes);

/// What the CSV export writes per sample, after the time column.
enum class ExportRepresentation { Quaternion, Euler, Matrix };

struct TrackExportOptions {
  ExportRepresentation representation = ExportRepresentation::Quaternion;
  QuatConvention quaternion;            ///< Quaternion: layout, algebra, direction
  EulerConvention euler;                ///< Euler: sequence and kind
  AngleUnit unit = AngleUnit::Degrees;  ///< Euler angle unit
  bool unwrap = true;                   ///< Euler: unwrap the first and third channels
  MatrixConvention matrix;              ///< Matrix: direction and storage
};

/// The header line (no newline): "t_s,qw,qx,qy,qz", "t_s,yaw_z_deg,..." and so on. Quaternion
/// columns follow the layout; a world-to-body or JPL export says so in the column names.
std::string track_csv_header(const TrackExportOptions& options);

/// Called each time a block of rows has gone to the stream, with the rows written so far;
/// returning false stops the writing.
using CsvRowsWritten = std::function<bool(std::size_t rows)>;

/// Writes the header and one row per sample of `track` (use a clean copy), in blocks of
/// about 64 KiB. Quaternions keep a continuous sign in the chosen convention. Euler unwrap
/// changes are appended to `changes` when it is given. Error when the stream fails or
/// `rows_written` stops it.
Expected<std::size_t> write_track_csv(std::ostream& out, const Track& track,
                                      const TrackExportOptions& options,
                                      std::vector<CleanChange>* changes = nullptr,
                                      const CsvRowsWritten& rows_written = {});

}  // namespace attiscope
