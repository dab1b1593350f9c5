// track_gen.hpp: generated tracks for tests and benchmarks, with known motion, so a test
// knows where each injected fault is. Rotations are built exactly from Euler angle
// functions of time (from_euler), so the quaternion sign is continuous by construction.
#pragma once

#include <Eigen/Core>
#include <cmath>
#include <cstddef>
#include <cstdio>
#include <functional>
#include <random>
#include <string>

#include "attiscope/core/euler.hpp"
#include "attiscope/core/track.hpp"

namespace attiscope::test {

inline constexpr double kDegToRad = M_PI / 180.0;

/// A number as a test log writes it: 17 significant digits, so it reads back exactly.
inline std::string FullPrecision(double v) {
  char buf[40];
  std::snprintf(buf, sizeof buf, "%.17g", v);
  return buf;
}

inline void PushSample(Track* t, double time, const Eigen::Quaterniond& q) {
  t->time_s.push_back(time);
  t->qw.push_back(q.w());
  t->qx.push_back(q.x());
  t->qy.push_back(q.y());
  t->qz.push_back(q.z());
}

/// n samples at times i * dt; the pose at time t is from_euler(c, angles_deg(t) in radians).
inline Track TrackFromEuler(const EulerConvention& c, std::size_t n, double dt,
                            const std::function<Eigen::Vector3d(double)>& angles_deg) {
  Track t;
  t.has_time = true;
  t.time_unit = "s";
  t.reading = "quat-wxyz";
  for (std::size_t i = 0; i < n; ++i) {
    const double time = static_cast<double>(i) * dt;
    PushSample(&t, time, from_euler(c, angles_deg(time) * kDegToRad).stored_quaternion());
  }
  return t;
}

/// A smooth random walk of the angular velocity (a tumbling body), n samples at rate_hz.
/// The quaternion is integrated exactly per step, so its sign is continuous.
inline Track RandomWalkTrack(std::size_t n, double rate_hz, std::uint32_t seed,
                             double rate_scale_rad_s = 1.0) {
  std::mt19937 rng(seed);
  std::normal_distribution<double> g(0.0, 1.0);
  Track t;
  t.has_time = true;
  t.time_unit = "s";
  const double dt = 1.0 / rate_hz;
  Eigen::Quaterniond q(g(rng), g(rng), g(rng), g(rng));
  q.normalize();
  Eigen::Vector3d omega = Eigen::Vector3d(g(rng), g(rng), g(rng)) * rate_scale_rad_s;
  for (std::size_t i = 0; i < n; ++i) {
    PushSample(&t, static_cast<double>(i) * dt, q);
    omega = 0.999 * omega + 0.05 * rate_scale_rad_s * Eigen::Vector3d(g(rng), g(rng), g(rng));
    const double angle = omega.norm() * dt;
    if (angle > 0.0) q = q * Eigen::Quaterniond(Eigen::AngleAxisd(angle, omega / omega.norm()));
  }
  return t;
}

/// Multiplies the quaternion numbers of samples [begin, end) by s (s = -1: a sign flip).
inline void ScaleSamples(Track* t, std::size_t begin, std::size_t end, double s) {
  for (std::size_t i = begin; i < end && i < t->size(); ++i) {
    t->qw[i] *= s;
    t->qx[i] *= s;
    t->qy[i] *= s;
    t->qz[i] *= s;
  }
}

}  // namespace attiscope::test
