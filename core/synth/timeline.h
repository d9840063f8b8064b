#pragma once
// The gait schedule turned into time: a global stride clock, per-limb touchdown / lift-off
// frames (the ground truth) and the foot trajectories the renderer draws from those same frames.
//
// Each limb's cycle position is u_i = clock - phase_i; it touches down when u_i passes an
// integer k and lifts off when it passes k + duty factor. Stride frequency, duty factors, phases
// and speed blend smoothly over one (slower) stride at each segment change, so feet never jump.
#include <cstdint>
#include <optional>
#include <vector>

#include "common/rational.h"
#include "model/annotation.h"
#include "synth/gait.h"

namespace stridemark::synth {

struct TimelineOptions {
  Rational captureRate{240, 1};
  double legLengthM = 0.55;       // hip height, the body's scale
  std::optional<double> speedMs;  // constant ground / belt speed; default: from each gait
  double startCycle = 0.0;        // clock value at frame 0 (fraction of a stride)
  // Soft landing: the swinging foot slows to the ground's speed and settles with no vertical
  // speed at touchdown, and breaks over gently at lift-off. Events (the stance span) are the
  // same either way; only the swing path changes.
  bool softLanding = false;
};

struct FootPose {
  bool stance = false;
  double x = 0;     // metres, forward of the limb's neutral point under the hip (body frame)
  double lift = 0;  // 0..1 share of the swing height (0 in stance)
};

struct SegmentInfo {
  std::string gait;
  std::int64_t firstFrame = 0;
  std::int64_t lastFrame = 0;  // inclusive
  double speedMs = 0;
  double strideHz = 0;
};

class Timeline {
 public:
  // Throws stridemark::Error(format) for schedules that cannot be rendered (too few frames per
  // stride, stance reach outside what a leg can do).
  Timeline(const model::LimbSet& limbs, std::vector<GaitSegment> segments,
           const TimelineOptions& options);

  const model::LimbSet& limbs() const { return limbs_; }
  const TimelineOptions& options() const { return options_; }
  std::int64_t frameCount() const { return frameCount_; }
  // Ground truth: every touchdown and lift-off in [0, frameCount), sorted by frame, then limb.
  const std::vector<model::Event>& events() const { return events_; }
  const std::vector<SegmentInfo>& segments() const { return segmentInfo_; }

  // All of these accept fractional frames (sub-frame rendering for motion blur).
  FootPose foot(int limb, double frame) const;
  double distance(double frame) const;  // metres of ground passed under the body since frame 0
  double speed(double frame) const;     // m/s
  double clock(double frame) const;     // strides since the start (reference limb cycle)
  double meanSpeed() const;             // over the clip's frames

 private:
  struct Cycle {
    std::int64_t touchdown;
    std::int64_t liftoff;
    double reach;  // metres travelled by the foot relative to the body during this stance
  };
  struct FrameParams {
    double hz, speed;
    std::vector<double> duty, phase;
  };
  FrameParams paramsAt(double seconds) const;
  FootPose softSwing(double s, double x0, double x1, double lo, double nextTd) const;
  double sampled(const std::vector<double>& values, double frame) const;
  void integrate();
  void buildCycles();
  void collectEvents();
  void checkReach() const;

  model::LimbSet limbs_;
  std::vector<GaitSegment> segments_;
  std::vector<double> segmentStart_;  // seconds
  TimelineOptions options_;
  double fps_ = 0;
  std::int64_t frameCount_ = 0;
  std::int64_t pad_ = 0;  // frames simulated before 0 and after the end (feet need context)
  std::vector<double> clock_, distance_, speed_;
  std::vector<std::vector<double>> cyclePos_;  // per limb, monotone u_i per padded frame
  std::vector<std::vector<double>> duty_;      // per limb per padded frame
  std::vector<std::vector<Cycle>> cycles_;     // per limb
  std::vector<model::Event> events_;
  std::vector<SegmentInfo> segmentInfo_;
};

}  // namespace stridemark::synth
