#pragma once
// Procedural side view of an animal following a Timeline: OpenCV drawing, anti-aliased, BGR.
// Same timeline and options -> the same pixels (every random choice comes from the seed).
#include <cstdint>
#include <memory>
#include <string>

#include <opencv2/core.hpp>

#include "synth/timeline.h"

namespace stridemark::synth {

enum class Scene { treadmill, overground };
enum class FootStyle { paw, hoof };

Scene parseScene(std::string_view text);          // throws Error(format)
FootStyle parseFootStyle(std::string_view text);  // throws Error(format)
std::string_view sceneName(Scene scene);
std::string_view footStyleName(FootStyle style);

struct RenderOptions {
  int width = 640;
  int height = 360;
  Scene scene = Scene::treadmill;
  FootStyle feet = FootStyle::paw;  // quadrupeds and bipeds
  bool markers = false;             // bright disc on every foot (for tracking tests)
  double noise = 0;                 // sensor noise, SD in grey levels (0-255)
  bool blur = false;                // exposure-length motion blur (sub-frame renders)
  double flicker = 0;               // mains-light flicker, relative amplitude (0.05 = 5 %)
  int blockiness = 0;               // 0 off, else JPEG quality 1-100 applied to every frame
  std::uint64_t seed = 1;
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

  // Where the foot of `limb` is drawn at `frame`, in pixels (for tests and overlays).
  cv::Point2d footPixel(int limb, double frame) const;
  double pixelsPerMetre() const;

 private:
  struct Impl;
  std::unique_ptr<Impl> impl_;
};

}  // namespace stridemark::synth
