#pragma once
// Internal: the colours and texture densities of one look. Look 0 is the original picture
// (every default below is what the renderer always drew); other numbers draw a different coat,
// belt, ground and backdrop from that number alone, so a held-out look is just an unused number.
#include <optional>

#include <opencv2/core.hpp>

namespace stridemark::synth::detail {

struct Look {
  std::optional<cv::Scalar> coat, accent;  // empty: the body plan's own colours
  // Treadmill room and belt.
  cv::Scalar wallTop{214, 208, 200}, wallBottom{176, 172, 166}, wallLine{160, 156, 150};
  cv::Scalar floor{96, 100, 104}, deck{58, 60, 64}, rail{120, 120, 124}, railTop{135, 135, 140};
  cv::Scalar belt{52, 54, 56}, beltGrain{70, 72, 74}, beltFleck{92, 94, 96}, beltSeam{88, 90, 92};
  int beltGrainEvery = 18;  // one grain speckle per this many pixels
  double beltSeamM = 0.3;   // seam spacing in metres
  // Outdoor backdrop.
  cv::Scalar skyTop{235, 200, 160}, skyBottom{225, 215, 200}, hills{120, 150, 130};
  cv::Scalar meadowTop{80, 150, 120}, meadowBottom{60, 135, 95}, meadowSpeck{50, 120, 80};
  cv::Scalar fence{70, 100, 130};
  cv::Scalar trackTop{75, 125, 140}, trackBottom{60, 105, 125}, trackSpeck{55, 95, 115};
  cv::Scalar trackTuft{60, 140, 90};
  int trackSpeckEvery = 20, trackTuftEvery = 400;
};

// Throws nothing; `number` 0 gives the defaults above.
Look makeLook(int number);

}  // namespace stridemark::synth::detail
