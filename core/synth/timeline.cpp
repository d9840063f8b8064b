#include "synth/timeline.h"

#include <algorithm>
#include <cmath>
#include <numeric>
#include <sstream>

#include "common/error.h"

namespace stridemark::synth {
namespace {

constexpr double kPi = 3.14159265358979323846;

double smoothstep(double x) {
  x = std::clamp(x, 0.0, 1.0);
  return x * x * (3.0 - 2.0 * x);
}

// Shortest signed way around the circle from a to b, in cycles: (-0.5, 0.5].
double circularStep(double a, double b) {
  double d = b - a;
  d -= std::floor(d + 0.5);
  return d;
}

double meanOf(const std::vector<double>& v) {
  return std::accumulate(v.begin(), v.end(), 0.0) / static_cast<double>(v.size());
}

std::string fixed(double value, int digits) {
  std::ostringstream out;
  out.precision(digits);
  out << std::fixed << value;
  return out.str();
}

}  // namespace

Timeline::Timeline(const model::LimbSet& limbs, std::vector<GaitSegment> segments,
                   const TimelineOptions& options)
    : limbs_(limbs), segments_(std::move(segments)), options_(options) {
  if (segments_.empty())
    throw Error(ErrorCategory::format, "the gait schedule is empty: give at least one --gait");
  if (!options_.captureRate.valid())
    throw Error(ErrorCategory::format, "the capture rate must be positive");
  if (!(options_.legLengthM > 0.001 && options_.legLengthM < 100))
    throw Error(ErrorCategory::format, "the leg length must be between 1 mm and 100 m");
  if (options_.speedMs && !(*options_.speedMs > 0 && *options_.speedMs < 200))
    throw Error(ErrorCategory::format, "the speed must be between 0 and 200 m/s");
  fps_ = options_.captureRate.toDouble();
  double total = 0;
  double slowest = 1e9;
  for (const auto& segment : segments_) {
    validatePattern(limbs_, segment.pattern);
    segmentStart_.push_back(total);
    total += segment.seconds;
    slowest = std::min(slowest, segment.pattern.strideHz);
  }
  frameCount_ = std::llround(total * fps_);
  if (frameCount_ < 2)
    throw Error(ErrorCategory::format, "the schedule is shorter than two frames: make it longer");
  pad_ = static_cast<std::int64_t>(std::ceil(2.5 * fps_ / slowest)) + 2;
  checkReach();
  integrate();
  buildCycles();
  collectEvents();
}

void Timeline::checkReach() const {
  for (const auto& segment : segments_) {
    const auto& p = segment.pattern;
    const double framesPerStride = fps_ / p.strideHz;
    if (framesPerStride < 8)
      throw Error(ErrorCategory::format,
                  "gait '" + p.name + "' at " + fixed(p.strideHz, 2) + " Hz has only " +
                      fixed(framesPerStride, 1) +
                      " frames per stride at this capture rate; raise --capture-fps (at least 8 "
                      "frames per stride) or lower the stride frequency");
    if (options_.speedMs) {
      const double reach = *options_.speedMs * meanOf(p.dutyFactor) / p.strideHz;
      const double legs = reach / options_.legLengthM;
      if (legs < 0.05 || legs > 1.5)
        throw Error(ErrorCategory::format,
                    "gait '" + p.name + "' at " + fixed(*options_.speedMs, 2) +
                        " m/s would move each foot " + fixed(legs, 2) +
                        " leg lengths during stance (allowed 0.05 to 1.5): change --speed, "
                        "--leg-length or the stride frequency (@HZ)");
    }
  }
}

Timeline::FrameParams Timeline::paramsAt(double seconds) const {
  auto speedOf = [&](const GaitPattern& p) {
    return options_.speedMs
               ? *options_.speedMs
               : p.stanceReach * options_.legLengthM * p.strideHz / meanOf(p.dutyFactor);
  };
  const auto& first = segments_.front().pattern;
  FrameParams out{first.strideHz, speedOf(first), first.dutyFactor, first.phase};
  for (std::size_t k = 1; k < segments_.size(); ++k) {
    if (seconds < segmentStart_[k]) break;
    const auto& prev = segments_[k - 1].pattern;
    const auto& next = segments_[k].pattern;
    // Blend over one stride of the slower gait: phases then drift by at most half a cycle per
    // stride, so each limb's cycle position keeps moving forwards.
    const double blend = 1.0 / std::min(prev.strideHz, next.strideHz);
    const double w = smoothstep((seconds - segmentStart_[k]) / blend);
    out.hz += w * (next.strideHz - out.hz);
    out.speed += w * (speedOf(next) - out.speed);
    for (std::size_t i = 0; i < out.duty.size(); ++i) {
      out.duty[i] += w * (next.dutyFactor[i] - out.duty[i]);
      out.phase[i] += w * circularStep(out.phase[i], next.phase[i]);
    }
  }
  return out;
}

void Timeline::integrate() {
  const auto padded = static_cast<std::size_t>(frameCount_ + 2 * pad_);
  const auto nLimbs = static_cast<std::size_t>(limbs_.size());
  clock_.assign(padded, 0.0);
  distance_.assign(padded, 0.0);
  speed_.assign(padded, 0.0);
  cyclePos_.assign(nLimbs, std::vector<double>(padded, 0.0));
  duty_.assign(nLimbs, std::vector<double>(padded, 0.0));
  std::vector<FrameParams> params;
  params.reserve(padded);
  for (std::size_t i = 0; i < padded; ++i)
    params.push_back(paramsAt(static_cast<double>(static_cast<std::int64_t>(i) - pad_) / fps_));
  for (std::size_t i = 1; i < padded; ++i) {
    clock_[i] = clock_[i - 1] + params[i - 1].hz / fps_;
    distance_[i] = distance_[i - 1] + params[i - 1].speed / fps_;
  }
  // Frame 0 sits at the requested clock value and at distance 0.
  const auto zero = static_cast<std::size_t>(pad_);
  const double clockShift = options_.startCycle - clock_[zero];
  const double distanceShift = -distance_[zero];
  for (std::size_t i = 0; i < padded; ++i) {
    clock_[i] += clockShift;
    distance_[i] += distanceShift;
    speed_[i] = params[i].speed;
    for (std::size_t l = 0; l < nLimbs; ++l) {
      const double u = clock_[i] - params[i].phase[l];
      cyclePos_[l][i] = i == 0 ? u : std::max(u, cyclePos_[l][i - 1]);
      duty_[l][i] = params[i].duty[l];
    }
  }
}

void Timeline::buildCycles() {
  cycles_.assign(static_cast<std::size_t>(limbs_.size()), {});
  const std::size_t padded = clock_.size();
  for (std::size_t l = 0; l < cycles_.size(); ++l) {
    const auto& u = cyclePos_[l];
    auto& cycles = cycles_[l];
    for (std::size_t i = 1; i < padded; ++i) {
      if (std::floor(u[i]) <= std::floor(u[i - 1])) continue;
      const double liftAt = std::floor(u[i]) + duty_[l][i];
      std::size_t j = i + 1;
      while (j < padded && u[j] < liftAt) ++j;
      if (j >= padded) break;
      const auto td = static_cast<std::int64_t>(i) - pad_;
      const auto lo = static_cast<std::int64_t>(j) - pad_;
      cycles.push_back({td, lo, 0.0});
    }
    // A stance ends before the next one starts, and every phase lasts at least one frame.
    for (std::size_t c = 0; c + 1 < cycles.size(); ++c)
      cycles[c].liftoff = std::min(cycles[c].liftoff, cycles[c + 1].touchdown - 1);
    for (auto& cycle : cycles)
      cycle.reach = distance(static_cast<double>(cycle.liftoff)) -
                    distance(static_cast<double>(cycle.touchdown));
  }
}

void Timeline::collectEvents() {
  events_.clear();
  for (std::size_t l = 0; l < cycles_.size(); ++l) {
    for (const auto& cycle : cycles_[l]) {
      if (cycle.touchdown >= 0 && cycle.touchdown < frameCount_)
        events_.push_back({cycle.touchdown, static_cast<int>(l), model::EventKind::touchdown});
      if (cycle.liftoff >= 0 && cycle.liftoff < frameCount_)
        events_.push_back({cycle.liftoff, static_cast<int>(l), model::EventKind::liftoff});
    }
  }
  std::sort(events_.begin(), events_.end(), [](const model::Event& a, const model::Event& b) {
    if (a.frame != b.frame) return a.frame < b.frame;
    if (a.limb != b.limb) return a.limb < b.limb;
    return static_cast<int>(a.kind) < static_cast<int>(b.kind);
  });
  // Segment table for the manifest.
  segmentInfo_.clear();
  for (std::size_t k = 0; k < segments_.size(); ++k) {
    SegmentInfo info;
    info.gait = segments_[k].pattern.name;
    info.firstFrame = std::llround(segmentStart_[k] * fps_);
    info.lastFrame =
        k + 1 < segments_.size() ? std::llround(segmentStart_[k + 1] * fps_) - 1 : frameCount_ - 1;
    info.strideHz = segments_[k].pattern.strideHz;
    info.speedMs = paramsAt(segmentStart_[k] + segments_[k].seconds * 0.999).speed;
    segmentInfo_.push_back(info);
  }
}

double Timeline::sampled(const std::vector<double>& values, double frame) const {
  const double pos =
      std::clamp(frame + static_cast<double>(pad_), 0.0, static_cast<double>(values.size() - 1));
  const auto i = static_cast<std::size_t>(std::floor(pos));
  if (i + 1 >= values.size()) return values.back();
  const double w = pos - static_cast<double>(i);
  return values[i] + w * (values[i + 1] - values[i]);
}

double Timeline::distance(double frame) const {
  return sampled(distance_, frame);
}
double Timeline::speed(double frame) const {
  return sampled(speed_, frame);
}
double Timeline::clock(double frame) const {
  return sampled(clock_, frame);
}

double Timeline::meanSpeed() const {
  double sum = 0;
  for (std::int64_t f = 0; f < frameCount_; ++f) sum += speed_[static_cast<std::size_t>(f + pad_)];
  return sum / static_cast<double>(frameCount_);
}

FootPose Timeline::foot(int limb, double frame) const {
  const auto& cycles = cycles_.at(static_cast<std::size_t>(limb));
  FootPose pose;
  if (cycles.empty()) return pose;
  // Last touchdown at or before `frame`.
  auto it = std::upper_bound(cycles.begin(), cycles.end(), frame, [](double f, const Cycle& c) {
    return f < static_cast<double>(c.touchdown);
  });
  if (it == cycles.begin()) {
    pose.stance = true;
    pose.x = cycles.front().reach / 2;
    return pose;
  }
  const Cycle& current = *std::prev(it);
  const auto td = static_cast<double>(current.touchdown);
  const auto lo = static_cast<double>(current.liftoff);
  if (frame < lo) {
    // Planted: the foot moves backwards relative to the body exactly as the ground does.
    pose.stance = true;
    pose.x = current.reach / 2 - (distance(frame) - distance(td));
    return pose;
  }
  if (it == cycles.end()) {
    pose.x = -current.reach / 2;
    return pose;
  }
  const auto nextTd = static_cast<double>(it->touchdown);
  // The swing runs from the last frame on the ground (lo - 1) to the touchdown frame, so the
  // lift-off frame already shows the foot off the ground (the frame convention: lift-off is the
  // first frame with the foot off), as the touchdown frame shows it down.
  const double s = (frame - lo + 1) / (nextTd - lo + 1);
  const double x0 = -current.reach / 2, x1 = it->reach / 2;
  if (options_.softLanding) return softSwing(s, x0, x1, lo - 1, nextTd);
  pose.x = x0 + (x1 - x0) * smoothstep(s);
  // Lift peaks early in swing, as a foot clears the ground and then reaches forward.
  pose.lift = std::sin(kPi * std::pow(s, 0.8));
  return pose;
}

// Cubic Hermite path whose end slopes follow the ground (the foot keeps drifting back as it
// lifts and is already moving back with the ground as it lands), capped so a long swing does
// not swing far behind; the lift's square has zero slope at both ends.
FootPose Timeline::softSwing(double s, double x0, double x1, double lo, double nextTd) const {
  const double frames = nextTd - lo;
  const double cap = 2.0 * (x1 - x0);  // overshoot stays within ~12 % of the reach
  const double m0 = -std::min(cap, (distance(lo + 1) - distance(lo)) * frames);
  const double m1 = -std::min(cap, (distance(nextTd) - distance(nextTd - 1)) * frames);
  const double s2 = s * s, s3 = s2 * s;
  FootPose pose;
  pose.x =
      (2 * s3 - 3 * s2 + 1) * x0 + (s3 - 2 * s2 + s) * m0 + (3 * s2 - 2 * s3) * x1 + (s3 - s2) * m1;
  const double arc = std::sin(kPi * std::pow(s, 0.8));
  pose.lift = arc * arc;
  return pose;
}

}  // namespace stridemark::synth
