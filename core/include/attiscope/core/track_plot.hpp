// track_plot.hpp: what the Track panel's plots draw, computed in core (no GL, no ImGui).
//
// Channels against time: the four quaternion numbers as read (sign flips visible), the
// three Euler angles in a chosen convention and angle mode, the lock margin in that
// convention, and the angular rate. Series are held as float in display units (degrees,
// degrees per second): a plot needs no more, and 4 bytes a sample keeps a ten-million-sample
// track within memory. Exact numbers for a read-out come from the track itself
// (to_euler of one sample), not from these series.
//
// Drawing: plot_envelope() gives, for N pixel columns over a time window, the minimum and
// maximum of a channel in each column, from a min/max pyramid over blocks of samples, so
// the cost depends on the number of columns, not on the number of samples in view.
#pragma once

#include <cstddef>
#include <vector>

#include "attiscope/core/euler.hpp"
#include "attiscope/core/track.hpp"

namespace attiscope {

/// How the first and third Euler angles are shown. The middle angle is always as computed.
enum class AngleMode {
  Wrapped,    ///< (-180, 180]
  ZeroTo360,  ///< [0, 360)
  Unwrapped,  ///< whole turns added so the angle moves continuously
};

enum class PlotChannel { Qw, Qx, Qy, Qz, Euler1, Euler2, Euler3, LockMargin, AngularRate };
inline constexpr int kPlotChannelCount = 9;

/// Min/max over blocks of kPyramidBase samples, then of 2, 4, 8 ... such blocks.
/// 2 * 2 floats per kPyramidBase samples over all levels: 0.25 bytes a sample.
inline constexpr std::size_t kPyramidBase = 64;

struct MinMaxPyramid {
  /// level[L] holds (min, max) pairs, interleaved (one cache line serves both), of the
  /// full blocks of kPyramidBase << L samples.
  std::vector<std::vector<float>> level;
  std::size_t samples = 0;

  bool empty() const { return level.empty(); }
  std::size_t levels() const { return level.size(); }
  std::size_t blocks(std::size_t l) const { return level[l].size() / 2; }
  std::size_t bytes() const;
};

/// The plot data of one track in one convention and angle mode.
struct TrackPlotData {
  EulerConvention convention;
  AngleMode mode = AngleMode::Wrapped;
  std::vector<float> euler_deg[3];     ///< application order, in `mode`
  std::vector<float> lock_margin_deg;  ///< Tait-Bryan 90 - |b|, proper min(b, 180 - b)
  std::vector<float> rate_deg_s;       ///< angular_rate() in degrees per second (NaN: no time step)
  MinMaxPyramid pyramid[kPlotChannelCount];
  /// Running maximum of the time column, kept only when the time column goes backwards
  /// somewhere (so columns can be found by bisection); empty otherwise.
  std::vector<double> sorted_time_s;

  /// Bytes held by this object (the track itself not included).
  std::size_t bytes() const;
};

/// Builds every series and pyramid of a track. threads: worker threads (1 = calling thread).
void build_track_plot(const Track& track, const EulerConvention& c, AngleMode mode, unsigned threads,
                      TrackPlotData* out);

/// Recomputes what depends on the convention and mode (the Euler series, the lock margin and
/// their pyramids), reusing the buffers: what a convention switch in the window costs.
void set_plot_convention(const Track& track, const EulerConvention& c, AngleMode mode, unsigned threads,
                         TrackPlotData* data);

/// The value of a channel at a sample, in display units (NaN when there is none).
double plot_value(const Track& track, const TrackPlotData& data, PlotChannel ch, std::size_t i);

/// Minimum and maximum of a channel over samples [begin, end), NaN values skipped. When
/// the range holds no finite value, min > max (min = +inf, max = -inf).
void channel_range(const Track& track, const TrackPlotData& data, PlotChannel ch, std::size_t begin,
                   std::size_t end, float* min, float* max);

/// First sample whose (sorted) time is >= t.
std::size_t sample_at_or_after(const Track& track, const TrackPlotData& data, double t);

/// When a pixel column holds at least this many samples, the inner column boundaries are
/// moved to the nearest multiple of kPyramidBase (at most 32 samples, under 1/16 of a
/// column), so each column is whole pyramid blocks and costs a few lookups, not a scan.
inline constexpr std::size_t kEnvelopeSnapSamples = 8 * kPyramidBase;

/// A channel decimated to pixel columns over [t0, t1).
struct PlotEnvelope {
  double t0 = 0.0, t1 = 0.0;
  /// Per column: min and max over samples [column_begin[c], column_begin[c + 1]); NaN when
  /// the column holds no finite value. Column c covers the time [t0 + c w, t0 + (c + 1) w),
  /// w = (t1 - t0) / columns, its boundaries moved as kEnvelopeSnapSamples says.
  std::vector<float> min, max;
  std::vector<std::size_t> column_begin;  ///< columns + 1 sample indices (empty when points)
  /// true when the window holds at most two samples per column: draw the samples
  /// [first, last] as a line instead (first and last include one sample beyond each edge).
  bool points = false;
  std::size_t first = 0, last = 0;
};

/// The sample boundaries of the pixel columns of [t0, t1): columns + 1 indices.
std::vector<std::size_t> envelope_columns(const Track& track, const TrackPlotData& data, double t0, double t1,
                                          std::size_t columns);

/// The envelopes of several channels over one window (the column boundaries are found once).
std::vector<PlotEnvelope> plot_envelopes(const Track& track, const TrackPlotData& data,
                                         const std::vector<PlotChannel>& channels, double t0, double t1,
                                         std::size_t columns);

PlotEnvelope plot_envelope(const Track& track, const TrackPlotData& data, PlotChannel ch, double t0,
                           double t1, std::size_t columns);

}  // namespace attiscope
