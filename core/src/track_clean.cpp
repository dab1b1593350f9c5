// track_clean.cpp: the clean copy of a track (unit, sign-continuous quaternions) and its
// CSV export in any representation and convention.
#include "attiscope/core/track_clean.hpp"

#include <charconv>
#include <cmath>

#include "attiscope/core/track_analysis.hpp"

namespace attiscope {

std::string clean_change_kind_name(CleanChangeKind k) {
  switch (k) {
    case CleanChangeKind::SignFlipped: return "sign_flipped";
    case CleanChangeKind::Normalised: return "normalised";
    case CleanChangeKind::EulerUnwrapped: return "euler_unwrapped";
  }
  return "unknown";
}

CleanTrack clean_track(const Track& track) {
  CleanTrack out;
  out.track = track;
  Track& t = out.track;
  const std::size_t n = t.size();
  bool negating = false;
  std::size_t run_change = 0;  // index in changes of the current SignFlipped run
  bool normalising = false;
  std::size_t norm_change = 0;  // index in changes of the current Normalised run
  std::size_t last_valid = n;   // index of the previous sample that is a rotation
  for (std::size_t i = 0; i < n; ++i) {
    double w = t.qw[i], x = t.qx[i], y = t.qy[i], z = t.qz[i];
    const double norm = std::sqrt(w * w + x * x + y * y + z * z);
    if (!std::isfinite(norm) || !(norm >= kMinQuaternionNorm)) {  // not a rotation: copied as is
      normalising = negating = false;
      continue;
    }
    // Norms off by more than kUnitNormTolerance are listed, as runs; every sample is scaled.
    const bool listed = std::abs(norm - 1.0) > kUnitNormTolerance;
    if (listed && normalising) {
      CleanChange& run = out.changes[norm_change];
      run.count = i - run.sample + 1;
      if (std::abs(norm - 1.0) > std::abs(run.value - 1.0)) run.value = norm;
    } else if (listed) {
      CleanChange c;
      c.sample = i;
      c.kind = CleanChangeKind::Normalised;
      c.value = norm;
      norm_change = out.changes.size();
      out.changes.push_back(c);
    }
    normalising = listed;
    if (norm != 1.0) {
      w /= norm;
      x /= norm;
      y /= norm;
      z /= norm;
    }
    bool negate = false;
    if (last_valid < n) {
      const double dot =
          t.qw[last_valid] * w + t.qx[last_valid] * x + t.qy[last_valid] * y + t.qz[last_valid] * z;
      negate = dot < 0.0;
    }
    if (negate) {
      w = -w;
      x = -x;
      y = -y;
      z = -z;
    }
    // Runs of negated samples become one change.
    if (negate && negating) {
      CleanChange& run = out.changes[run_change];
      run.count = i - run.sample + 1;
    } else if (negate) {
      CleanChange c;
      c.sample = i;
      c.kind = CleanChangeKind::SignFlipped;
      run_change = out.changes.size();
      out.changes.push_back(c);
    }
    negating = negate;
    t.qw[i] = w;
    t.qx[i] = x;
    t.qy[i] = y;
    t.qz[i] = z;
    last_valid = i;
  }
  return out;
}

void unwrap_euler(std::vector<double>& a, std::vector<double>& c, std::vector<CleanChange>* changes) {
  const double turn = 2.0 * M_PI;
  std::vector<double>* channels[2] = {&a, &c};
  for (int k = 0; k < 2; ++k) {
    std::vector<double>& v = *channels[k];
    double offset = 0.0;    // whole turns added so far
    double prev_raw = 0.0;  // the previous value as given
    bool have_prev = false;
    for (std::size_t i = 0; i < v.size(); ++i) {
      const double raw = v[i];
      if (!std::isfinite(raw)) continue;
      if (have_prev) {
        const double step = raw - prev_raw;
        if (std::abs(step) > M_PI) {
          const double turns = -std::round(step / turn);
          offset += turns * turn;
          if (changes) {
            CleanChange ch;
            ch.sample = i;
            ch.kind = CleanChangeKind::EulerUnwrapped;
            ch.channel = k == 0 ? 0 : 2;
            ch.value = turns;
            changes->push_back(ch);
          }
        }
      }
      prev_raw = raw;
      have_prev = true;
      v[i] = raw + offset;
    }
  }
}

namespace {

std::string quat_column_suffix(const QuatConvention& q) {
  std::string s;
  if (q.algebra == QuatAlgebra::Jpl) s += "_jpl";
  if (q.direction == Direction::WorldToBody) s += "_w2b";
  return s;
}

// Appends a number with 17 significant digits (round-trips exactly).
void append_number(std::string& line, double v) {
  char buf[32];
  const auto r = std::to_chars(buf, buf + sizeof buf, v, std::chars_format::general, 17);
  line.append(buf, r.ptr);
}

}  // namespace

std::string track_csv_header(const TrackExportOptions& o) {
  std::string h = "t_s";
  switch (o.representation) {
    case ExportRepresentation::Quaternion: {
      const char* names = o.quaternion.layout == QuatLayout::ScalarFirst ? "wxyz" : "xyzw";
      for (int k = 0; k < 4; ++k) h += std::string(",q") + names[k] + quat_column_suffix(o.quaternion);
      break;
    }
    case ExportRepresentation::Euler: {
      const std::string unit = o.unit == AngleUnit::Degrees ? "deg" : "rad";
      for (int k = 0; k < 3; ++k) {
        h += "," + o.euler.kind_name() + "_" + o.euler.sequence() + "_" + std::to_string(k + 1) + "_" +
             axis_letter(o.euler.axes[static_cast<std::size_t>(k)]) + "_" + unit;
      }
      break;
    }
    case ExportRepresentation::Matrix: {
      // r: world_R_body (v_world = R v_body); dcm: body_R_world. Row i, column j, in storage order.
      const std::string prefix = o.matrix.direction == Direction::BodyToWorld ? "r" : "dcm";
      for (int a = 1; a <= 3; ++a) {
        for (int b = 1; b <= 3; ++b) {
          const int row = o.matrix.storage == MatrixStorage::Rows ? a : b;
          const int col = o.matrix.storage == MatrixStorage::Rows ? b : a;
          h += "," + prefix + std::to_string(row) + std::to_string(col);
        }
      }
      break;
    }
  }
  return h;
}

Expected<std::size_t> write_track_csv(std::ostream& out, const Track& track, const TrackExportOptions& o,
                                      std::vector<CleanChange>* changes, const CsvRowsWritten& rows_written) {
  const std::size_t n = track.size();
  std::vector<double> ea, eb, ec;
  if (o.representation == ExportRepresentation::Euler) {
    ea.resize(n);
    eb.resize(n);
    ec.resize(n);
    track_euler(track, 0, n, o.euler, ea.data(), eb.data(), ec.data());
    if (o.unwrap) unwrap_euler(ea, ec, changes);
  }
  const double angle_scale = o.unit == AngleUnit::Degrees ? 180.0 / M_PI : 1.0;
  std::string buf = track_csv_header(o) + "\n";
  std::array<double, 4> prev_q{};
  bool have_prev_q = false;
  for (std::size_t i = 0; i < n; ++i) {
    append_number(buf, track.time_s[i]);
    const Eigen::Quaterniond q(track.qw[i], track.qx[i], track.qy[i], track.qz[i]);
    const double norm = q.norm();
    const bool valid = std::isfinite(norm) && norm >= kMinQuaternionNorm;
    switch (o.representation) {
      case ExportRepresentation::Quaternion: {
        std::array<double, 4> v{};
        if (valid) {
          v = to_quaternion_numbers(Rotation(q), o.quaternion);
          if (have_prev_q) {
            const double dot = v[0] * prev_q[0] + v[1] * prev_q[1] + v[2] * prev_q[2] + v[3] * prev_q[3];
            if (dot < 0.0) {
              for (double& x : v) x = -x;
            }
          }
          prev_q = v;
          have_prev_q = true;
        } else {
          v.fill(std::numeric_limits<double>::quiet_NaN());
        }
        for (double x : v) {
          buf += ',';
          append_number(buf, x);
        }
        break;
      }
      case ExportRepresentation::Euler:
        for (double x : {ea[i], eb[i], ec[i]}) {
          buf += ',';
          append_number(buf, x * angle_scale);
        }
        break;
      case ExportRepresentation::Matrix: {
        std::array<double, 9> m{};
        if (valid) {
          m = to_matrix_numbers(Rotation(q), o.matrix);
        } else {
          m.fill(std::numeric_limits<double>::quiet_NaN());
        }
        for (double x : m) {
          buf += ',';
          append_number(buf, x);
        }
        break;
      }
    }
    buf += '\n';
    if (buf.size() > (1u << 16)) {
      out.write(buf.data(), static_cast<std::streamsize>(buf.size()));
      buf.clear();
      if (!out) return Error{"writing the CSV failed"};
      if (rows_written && !rows_written(i + 1)) return Error{"writing the CSV was stopped"};
    }
  }
  out.write(buf.data(), static_cast<std::streamsize>(buf.size()));
  out.flush();
  if (!out) return Error{"writing the CSV failed"};
  if (rows_written) rows_written(n);
  return n;
}

}  // namespace attiscope
