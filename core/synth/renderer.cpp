#include <algorithm>
#include <cmath>
#include <vector>

#include <opencv2/imgproc.hpp>

#include "common/error.h"
#include "synth/block_artefacts.h"
#include "synth/body.h"
#include "synth/render.h"
#include "synth/scene.h"

namespace stridemark::synth {
namespace {

constexpr double kPi = 3.14159265358979323846;
constexpr int kNoiseBank = 8;

// splitmix64: a well-mixed index from (seed, frame) without any global state.
std::uint64_t mix(std::uint64_t x) {
  x += 0x9E3779B97F4A7C15ULL;
  x = (x ^ (x >> 30)) * 0xBF58476D1CE4E5B9ULL;
  x = (x ^ (x >> 27)) * 0x94D049BB133111EBULL;
  return x ^ (x >> 31);
}

double unitFrom(std::uint64_t bits) {
  return static_cast<double>(bits >> 11) * 0x1.0p-53;
}

[[noreturn]] void badOption(const std::string& what) {
  throw Error(ErrorCategory::format, what);
}

}  // namespace

Scene parseScene(std::string_view text) {
  if (text == "treadmill") return Scene::treadmill;
  if (text == "overground") return Scene::overground;
  badOption("unknown scene '" + std::string(text) + "': use treadmill or overground");
}

FootStyle parseFootStyle(std::string_view text) {
  if (text == "paw" || text == "paws") return FootStyle::paw;
  if (text == "hoof" || text == "hooves") return FootStyle::hoof;
  badOption("unknown foot style '" + std::string(text) + "': use paw or hoof");
}

std::string_view sceneName(Scene scene) {
  return scene == Scene::treadmill ? "treadmill" : "overground";
}
std::string_view footStyleName(FootStyle style) {
  return style == FootStyle::paw ? "paw" : "hoof";
}

struct Renderer::Impl {
  const Timeline& timeline;
  RenderOptions options;
  detail::BodyPlan plan;
  detail::View view;
  std::unique_ptr<detail::Backdrop> backdrop;
  std::vector<cv::Mat> noiseUp, noiseDown;  // non-negative parts of zero-mean noise frames
  cv::Mat scratch, accumulator;
  std::vector<detail::LegState> legs;

  Impl(const Timeline& t, const RenderOptions& o) : timeline(t), options(o) {
    validate();
    const double L = timeline.options().legLengthM;
    plan = detail::makeBodyPlan(timeline.limbs(), L, options.feet, options.seed);
    const double spanX = plan.maxX - plan.minX;
    view.scale = std::min(0.78 * options.width / spanX, 0.66 * options.height / plan.maxY);
    view.groundY = 0.82 * options.height;
    view.originX = 0.5 * options.width - 0.5 * (plan.minX + plan.maxX) * view.scale;
    view.farDx = 0.04 * L * view.scale;
    view.farDy = -0.05 * L * view.scale;
    detail::SceneLayout layout{options.width, options.height, view.groundY,
                               view.farDy,    view.scale,     L};
    backdrop = std::make_unique<detail::Backdrop>(options.scene, layout, options.seed);
    legs.resize(static_cast<std::size_t>(timeline.limbs().size()));
    if (options.noise > 0) makeNoiseBank();
  }

  void validate() const {
    if (options.width < 64 || options.height < 64 || options.width > 4096 ||
        options.height > 4096 || options.width % 2 || options.height % 2)
      badOption("frame size " + std::to_string(options.width) + "x" +
                std::to_string(options.height) +
                " is not usable: use even numbers between 64 and 4096, e.g. 640x360");
    if (!(options.noise >= 0 && options.noise <= 64))
      badOption("noise must be between 0 and 64 grey levels");
    if (!(options.flicker >= 0 && options.flicker <= 0.5))
      badOption("flicker must be between 0 and 0.5 (relative brightness)");
    if (options.blockiness < 0 || options.blockiness > 100)
      badOption("blockiness must be a JPEG quality between 1 and 100 (0 = off)");
  }

  void makeNoiseBank() {
    cv::RNG rng(mix(options.seed ^ 0x4E4F495345ULL));
    for (int i = 0; i < kNoiseBank; ++i) {
      cv::Mat noise(options.height, options.width, CV_16SC3);
      rng.fill(noise, cv::RNG::NORMAL, 0, options.noise);
      cv::Mat up, down;
      cv::max(noise, 0, up);
      cv::max(-noise, 0, down);
      up.convertTo(up, CV_8UC3);
      down.convertTo(down, CV_8UC3);
      noiseUp.push_back(up);
      noiseDown.push_back(down);
    }
  }

  void drawScene(double frame, cv::Mat& out) {
    backdrop->paint(out, timeline.distance(frame) * view.scale);
    for (std::size_t i = 0; i < legs.size(); ++i) {
      const FootPose pose = timeline.foot(static_cast<int>(i), frame);
      legs[i].footX = plan.legs[i].neutralX + pose.x;
      legs[i].footY = pose.lift * plan.liftHeight;
    }
    const double clock = timeline.clock(frame);
    const double bob = 0.012 * plan.leg * std::cos(4 * kPi * clock);
    detail::drawAnimal(out, plan, view, legs, bob, clock, options.markers);
  }

  // Exposure-length blur: the average of sub-frame renders across half a frame interval.
  void drawBlurred(double frame, cv::Mat& out) {
    constexpr double offsets[] = {-0.2, 0.0, 0.2};
    accumulator.create(options.height, options.width, CV_16UC3);
    accumulator.setTo(cv::Scalar::all(0));
    for (double dt : offsets) {
      drawScene(frame + dt, scratch);
      cv::add(accumulator, scratch, accumulator, cv::noArray(), CV_16UC3);
    }
    accumulator.convertTo(out, CV_8UC3, 1.0 / 3.0);
  }

  void applyCameraEffects(std::int64_t frame, cv::Mat& out) {
    const std::uint64_t h = mix(options.seed * 1000003ULL + static_cast<std::uint64_t>(frame));
    if (options.flicker > 0) {
      // Lamps on 50 Hz mains flicker at 100 Hz; sampled at the capture rate it aliases.
      const double t = static_cast<double>(frame) / timeline.options().captureRate.toDouble();
      const double gain =
          1.0 + options.flicker * (0.8 * std::sin(2 * kPi * 100.0 * t) + 0.4 * (unitFrom(h) - 0.5));
      out.convertTo(out, CV_8UC3, gain);
    }
    if (options.noise > 0) {
      const auto k = static_cast<std::size_t>(mix(h) % kNoiseBank);
      cv::add(out, noiseUp[k], out);
      cv::subtract(out, noiseDown[k], out);
    }
    if (options.blockiness > 0) applyBlockArtefacts(out, options.blockiness);
  }
};

Renderer::Renderer(const Timeline& timeline, const RenderOptions& options)
    : impl_(std::make_unique<Impl>(timeline, options)) {}

Renderer::~Renderer() = default;

void Renderer::render(std::int64_t frame, cv::Mat& out) {
  out.create(impl_->options.height, impl_->options.width, CV_8UC3);
  const auto t = static_cast<double>(frame);
  if (impl_->options.blur)
    impl_->drawBlurred(t, out);
  else
    impl_->drawScene(t, out);
  impl_->applyCameraEffects(frame, out);
}

cv::Point2d Renderer::footPixel(int limb, double frame) const {
  const auto& leg = impl_->plan.legs.at(static_cast<std::size_t>(limb));
  const FootPose pose = impl_->timeline.foot(limb, frame);
  return impl_->view.toScreen(leg.hipX + leg.neutralX + pose.x, pose.lift * impl_->plan.liftHeight,
                              leg.far);
}

double Renderer::pixelsPerMetre() const {
  return impl_->view.scale;
}

}  // namespace stridemark::synth
