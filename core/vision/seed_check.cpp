#include <cmath>
#include <cstdio>
#include <set>
#include <utility>

#include "vision/propose.h"

namespace stridemark::vision {

namespace {

std::string describe(const model::FootSeed& seed, const model::LimbSet& limbs) {
  const std::string limb = seed.limb >= 0 && seed.limb < limbs.size()
                               ? limbs.label(seed.limb)
                               : "limb #" + std::to_string(seed.limb);
  return "seed " + limb + " at frame " + std::to_string(seed.frame);
}

std::string pixels(double value) {
  char text[32];
  std::snprintf(text, sizeof text, "%.1f", value);
  return text;
}

}  // namespace

std::string seedProblem(const std::vector<model::FootSeed>& seeds, const model::LimbSet& limbs,
                        std::int64_t frameCount, int width, int height) {
  if (seeds.empty())
    return "no seeds: click each foot once (limb, frame, x, y) so its track has a start";
  std::set<std::pair<int, std::int64_t>> seen;
  for (const auto& seed : seeds) {
    if (seed.limb < 0 || seed.limb >= limbs.size())
      return describe(seed, limbs) + ": no such limb in " + limbs.name() + " (use one of " +
             limbs.labelList() + ")";
    if (seed.frame < 0 || seed.frame >= frameCount)
      return describe(seed, limbs) + ": the clip has frames 0.." + std::to_string(frameCount - 1) +
             "; pick a frame inside it";
    // Pixel i spans [i - 0.5, i + 0.5): a click anywhere on an edge pixel is inside.
    if (!std::isfinite(seed.x) || !std::isfinite(seed.y) || seed.x < -0.5 || seed.y < -0.5 ||
        seed.x >= width - 0.5 || seed.y >= height - 0.5)
      return describe(seed, limbs) + ": position (" + pixels(seed.x) + ", " + pixels(seed.y) +
             ") is outside the " + std::to_string(width) + "x" + std::to_string(height) +
             " frame; give pixels of the upright frame, origin top-left, x right, y down";
    if (!seen.insert({seed.limb, seed.frame}).second)
      return describe(seed, limbs) + ": given twice; keep one seed per limb and frame";
  }
  return {};
}

}  // namespace stridemark::vision
