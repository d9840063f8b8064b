#pragma once
// Internal: the backdrop of a scene, pre-drawn once. Layers that move with the ground are
// periodic strips copied at an offset each frame, so a frame costs a few memory copies.
#include <cstdint>
#include <vector>

#include <opencv2/core.hpp>

#include "synth/look.h"
#include "synth/render.h"

namespace stridemark::synth::detail {

struct SceneLayout {
  int width = 640, height = 360;
  double groundY = 288;  // screen row of the near-side ground contact
  double farDy = -5;     // far-side feet stand this many pixels higher
  double scale = 100;    // px per metre at the animal's depth
  double leg = 0.5;      // metres (for sizes relative to the animal)
};

// A periodic strip (one period plus one screen width) copied at an offset each frame.
struct StripLayer {
  cv::Mat strip;  // height x (width + period)
  cv::Mat mask;   // empty: opaque
  int x0 = 0, y0 = 0, width = 0, period = 1;
  double parallax = 1;
  int offsetFor(double shiftPx) const;
  void paintInto(cv::Mat& out, double shiftPx) const;
};

class Backdrop {
 public:
  Backdrop(Scene scene, const SceneLayout& layout, const Look& look, std::uint64_t seed);
  // Paints the backdrop with the ground moved `groundShiftPx` pixels backwards (to the left).
  void paint(cv::Mat& out, double groundShiftPx) const;

 private:
  void buildTreadmill(std::uint64_t seed);
  void buildOutdoors(std::uint64_t seed);

  SceneLayout layout_;
  Look look_;
  cv::Mat base_;
  std::vector<StripLayer> layers_;
};

// Foreground posts and bushes in front of the animal's feet. Still for a fixed camera (placed
// over `footXs`, the screen columns the near feet pass); with a panning camera they recur every
// 0.8-1.5 frame widths and slide with the ground.
class Occluder {
 public:
  Occluder(Scene scene, const SceneLayout& layout, const std::vector<double>& footXs,
           std::uint64_t seed);
  void paint(cv::Mat& out, double groundShiftPx) const;
  // True where an occluder pixel covers screen point `p` (the same mask paint() copies through).
  bool covers(cv::Point2d p, double groundShiftPx) const;

 private:
  void drawObject(cv::Mat& tile, cv::Mat& mask, double centreX, cv::RNG& rng) const;
  SceneLayout layout_;
  bool treadmill_ = false;
  StripLayer layer_;
};

}  // namespace stridemark::synth::detail
