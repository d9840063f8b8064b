#pragma once
// Procedural side view of an animal following a Timeline: OpenCV drawing, anti-aliased, BGR.
// Same timeline and options -> the same pixels (every random choice comes from the seed).
#include <cstdint>
#include <memory>
#include <string>

#include <opencv2/core.hpp>

#include "synth/timeline.h"

namespace stridemark::synth {

// treadmill: still camera, the belt runs under the animal. panning: the camera follows the
// animal, so the whole backdrop slides by (with parallax). overground: a fixed camera, a still
// backdrop, and the animal crosses the frame.
enum class Scene { treadmill, panning, overground };
enum class FootStyle { paw, hoof, toes };

Scene parseScene(std::string_view text);          // throws Error(format)
FootStyle parseFootStyle(std::string_view text);  // throws Error(format)
std::string_view sceneName(Scene scene);
std::string_view footStyleName(FootStyle style);

struct RenderOptions {
  int width = 640;
  int height = 360;
  Scene scene = Scene::treadmill;
  FootStyle feet = FootStyle::paw;  // quadrupeds and bipeds (toes: bipeds)
  bool markers = false;             // bright disc on every foot (for tracking tests)
  double noise = 0;                 // sensor noise, SD in grey levels (0-255)
  bool blur = false;                // exposure-length motion blur (sub-frame renders)
  double flicker = 0;               // mains-light flicker, relative amplitude (0.05 = 5 %)
  int blockiness = 0;               // 0 off, else JPEG quality 1-100 applied to every frame
  double drift = 0;       // panning: imperfect follow, sway as a share of the width (0-0.2)
  bool occluder = false;  // foreground posts / bushes in front of the animal's feet
  double light = 1;       // scene brightness 0.1-1, applied before flicker and noise
  int look = 0;           // 0: the original colours; 1-9999: another coat, ground and backdrop
  std::uint64_t seed = 1;
};

// A foot as a person would see it: the centre of the drawn foot and whether it can be seen.
// Legs crossing in front of legs are not counted as hiding a foot.
struct FootView {
  cv::Point2d centre;     // pixels, origin top-left, x right, y down
  bool inFrame = false;   // the centre's (rounded) pixel is inside the picture
  bool occluded = false;  // centre behind a foreground occluder
  bool visible() const { return inFrame && !occluded; }
};

class Renderer {
 public:
  // Throws stridemark::Error(format) for sizes or effect settings out of range.
  Renderer(const Timeline& timeline, const RenderOptions& options);
  ~Renderer();
  Renderer(const Renderer&) = delete;
  Renderer& operator=(const Renderer&) = delete;

  // Draws frame `frame` (0-based) into `out` (allocated as CV_8UC3 width x height).
  void render(std::int64_t frame, cv::Mat& out);

  // Where the foot of `limb` touches the ground (its sole) at `frame`, in pixels.
  cv::Point2d footPixel(int limb, double frame) const;
  // The drawn foot's centre and visibility at `frame` (the truth behind feet.csv / seeds.csv).
  FootView footView(int limb, std::int64_t frame) const;
  double pixelsPerMetre() const;

 private:
  struct Impl;
  std::unique_ptr<Impl> impl_;
};

}  // namespace stridemark::synth
