#include "synth/look.h"

#include <algorithm>

#include <opencv2/imgproc.hpp>

namespace stridemark::synth::detail {
namespace {

// A colour from hue (0-180, OpenCV's HSV scale), saturation and value (0-1), as BGR.
cv::Scalar hsv(double hue, double saturation, double value) {
  cv::Mat3b pixel(1, 1,
                  cv::Vec3b(static_cast<uchar>(std::clamp(hue, 0.0, 179.0)),
                            static_cast<uchar>(std::clamp(saturation, 0.0, 1.0) * 255),
                            static_cast<uchar>(std::clamp(value, 0.0, 1.0) * 255)));
  cv::Mat3b bgr;
  cv::cvtColor(pixel, bgr, cv::COLOR_HSV2BGR);
  const cv::Vec3b c = bgr(0, 0);
  return {static_cast<double>(c[0]), static_cast<double>(c[1]), static_cast<double>(c[2])};
}

cv::Scalar scaled(const cv::Scalar& c, double f) {
  return {std::clamp(c[0] * f, 0.0, 255.0), std::clamp(c[1] * f, 0.0, 255.0),
          std::clamp(c[2] * f, 0.0, 255.0)};
}

}  // namespace

Look makeLook(int number) {
  Look look;
  if (number == 0) return look;
  cv::RNG rng(0x5EED0000ULL + static_cast<std::uint64_t>(number) * 7919ULL);
  auto any = [&](double vLo, double vHi, double sHi) {
    return hsv(rng.uniform(0.0, 180.0), rng.uniform(0.0, sHi), rng.uniform(vLo, vHi));
  };
  // Coats from near-black to pale, dull to bright; the accent (hooves, beak, nose) contrasts.
  look.coat = any(0.15, 0.95, 0.8);
  look.accent = rng.uniform(0, 2) ? any(0.05, 0.3, 0.5) : any(0.6, 1.0, 0.9);
  // Room: any wall tint, a floor darker than it; belt from black rubber to pale green or blue.
  look.wallTop = any(0.45, 0.95, 0.35);
  look.wallBottom = scaled(look.wallTop, rng.uniform(0.7, 0.95));
  look.wallLine = scaled(look.wallTop, rng.uniform(0.6, 0.85));
  look.floor = any(0.2, 0.6, 0.3);
  look.deck = any(0.1, 0.35, 0.3);
  look.rail = any(0.3, 0.8, 0.2);
  look.railTop = scaled(look.rail, 1.1);
  look.belt = any(0.1, 0.55, 0.5);
  look.beltGrain = scaled(look.belt, rng.uniform(1.15, 1.5));
  look.beltFleck = scaled(look.belt, rng.uniform(0.5, 1.8));
  look.beltSeam = scaled(look.belt, rng.uniform(0.6, 1.7));
  look.beltGrainEvery = rng.uniform(6, 60);
  look.beltSeamM = rng.uniform(0.12, 0.8);
  // Outdoors: sky from grey dusk to blue, ground from sand to grass to dark earth.
  look.skyTop = any(0.55, 1.0, 0.45);
  look.skyBottom = scaled(look.skyTop, rng.uniform(0.85, 1.1));
  look.hills = any(0.3, 0.75, 0.5);
  look.meadowTop = any(0.3, 0.8, 0.7);
  look.meadowBottom = scaled(look.meadowTop, rng.uniform(0.75, 1.0));
  look.meadowSpeck = scaled(look.meadowTop, rng.uniform(0.6, 0.9));
  look.fence = any(0.2, 0.9, 0.5);
  look.trackTop = any(0.2, 0.85, 0.6);
  look.trackBottom = scaled(look.trackTop, rng.uniform(0.7, 1.0));
  look.trackSpeck = scaled(look.trackTop, rng.uniform(0.6, 1.4));
  look.trackTuft = any(0.2, 0.8, 0.8);
  look.trackSpeckEvery = rng.uniform(6, 60);
  look.trackTuftEvery = rng.uniform(80, 1500);
  return look;
}

}  // namespace stridemark::synth::detail
