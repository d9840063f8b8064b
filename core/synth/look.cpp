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
  // Hue on OpenCV's 0-180 scale: ~10 orange-brown, ~30 yellow, ~45 green, ~105 blue.
  auto pick = [&](double hueLo, double hueHi, double satHi, double vLo, double vHi) {
    return hsv(rng.uniform(hueLo, hueHi), rng.uniform(0.0, satHi), rng.uniform(vLo, vHi));
  };
  // Coats of real animals: black, greys, browns, chestnut, cream, white; the accent (hooves,
  // beak, nose, mane) either dark or pale.
  look.coat = pick(4, 26, 0.65, 0.12, 0.95);
  look.accent = rng.uniform(0, 2) ? pick(0, 30, 0.4, 0.05, 0.3) : pick(5, 30, 0.5, 0.6, 0.95);
  // Room: painted walls of any pale tint, a darker floor, a rubber belt from black to mid grey
  // with a slight tint, grain from sparse to dense, seams from close to far apart.
  look.wallTop = pick(0, 180, 0.25, 0.5, 0.95);
  look.wallBottom = scaled(look.wallTop, rng.uniform(0.7, 0.95));
  look.wallLine = scaled(look.wallTop, rng.uniform(0.6, 0.85));
  look.floor = pick(0, 180, 0.2, 0.2, 0.6);
  look.deck = pick(0, 180, 0.2, 0.1, 0.35);
  look.rail = pick(0, 180, 0.15, 0.3, 0.8);
  look.railTop = scaled(look.rail, 1.1);
  look.belt = pick(0, 180, 0.15, 0.08, 0.5);
  look.beltGrain = scaled(look.belt, rng.uniform(1.15, 1.5));
  look.beltFleck = scaled(look.belt, rng.uniform(0.5, 1.8));
  look.beltSeam = scaled(look.belt, rng.uniform(0.6, 1.7));
  look.beltGrainEvery = rng.uniform(6, 60);
  look.beltSeamM = rng.uniform(0.12, 0.8);
  // Outdoors: skies from grey to blue, hills and meadows from dry yellow to deep green, tracks
  // from pale sand to dark earth, fences of wood or grey metal.
  look.skyTop = pick(95, 115, 0.5, 0.6, 1.0);
  look.skyBottom = scaled(look.skyTop, rng.uniform(0.9, 1.08));
  look.hills = pick(30, 70, 0.4, 0.35, 0.7);
  look.meadowTop = pick(22, 55, 0.65, 0.3, 0.75);
  look.meadowBottom = scaled(look.meadowTop, rng.uniform(0.75, 1.0));
  look.meadowSpeck = scaled(look.meadowTop, rng.uniform(0.6, 0.9));
  look.fence = pick(5, 25, 0.5, 0.25, 0.85);
  look.trackTop = pick(5, 30, 0.55, 0.2, 0.85);
  look.trackBottom = scaled(look.trackTop, rng.uniform(0.75, 1.0));
  look.trackSpeck = scaled(look.trackTop, rng.uniform(0.6, 1.4));
  look.trackTuft = pick(30, 60, 0.7, 0.25, 0.7);
  look.trackSpeckEvery = rng.uniform(6, 60);
  look.trackTuftEvery = rng.uniform(80, 1500);
  return look;
}

}  // namespace stridemark::synth::detail
