#pragma once
// Internal: the backdrop of a scene, pre-drawn once. Layers that move with the ground are
// periodic strips copied at an offset each frame, so a frame costs a few memory copies.
#include <cstdint>
#include <vector>

#include <opencv2/core.hpp>

#include "synth/render.h"

namespace stridemark::synth::detail {

struct SceneLayout {
  int width = 640, height = 360;
  double groundY = 288;  // screen row of the near-side ground contact
  double farDy = -5;     // far-side feet stand this many pixels higher
  double scale = 100;    // px per metre at the animal's depth
  double leg = 0.5;      // metres (for sizes relative to the animal)
};

class Backdrop {
 public:
  Backdrop(Scene scene, const SceneLayout& layout, std::uint64_t seed);
  // Paints the backdrop with the ground moved `groundShiftPx` pixels backwards (to the left).
  void paint(cv::Mat& out, double groundShiftPx) const;

 private:
  struct Layer {
    cv::Mat strip;  // height x (width + period)
    cv::Mat mask;   // empty: opaque
    int x0 = 0, y0 = 0, width = 0, period = 1;
    double parallax = 1;
  };
  void buildTreadmill(std::uint64_t seed);
  void buildOverground(std::uint64_t seed);
  Layer makeLayer(int x0, int y0, int width, int height, int period, double parallax) const;

  SceneLayout layout_;
  cv::Mat base_;
  std::vector<Layer> layers_;
};

}  // namespace stridemark::synth::detail
