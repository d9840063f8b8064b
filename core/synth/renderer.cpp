#include <algorithm>
#include <cmath>
#include <sstream>
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

// A value as the user typed it (0.05, not 0.050000).
std::string shortNumber(double value) {
  std::ostringstream out;
  out << value;
  return out.str();
}

}  // namespace

Scene parseScene(std::string_view text) {
  if (text == "treadmill") return Scene::treadmill;
  if (text == "panning") return Scene::panning;
  if (text == "overground") return Scene::overground;
  badOption("unknown scene '" + std::string(text) +
            "': use treadmill (still camera, moving belt), panning (camera follows the animal) "
            "or overground (still camera, the animal crosses the frame)");
}

FootStyle parseFootStyle(std::string_view text) {
  if (text == "paw" || text == "paws") return FootStyle::paw;
  if (text == "hoof" || text == "hooves") return FootStyle::hoof;
  if (text == "toes") return FootStyle::toes;
  badOption("unknown foot style '" + std::string(text) + "': use paw, hoof or toes (bipeds)");
}

std::string_view sceneName(Scene scene) {
  switch (scene) {
    case Scene::treadmill:
      return "treadmill";
    case Scene::panning:
      return "panning";
    case Scene::overground:
      break;
  }
  return "overground";
}
std::string_view footStyleName(FootStyle style) {
  switch (style) {
    case FootStyle::paw:
      return "paw";
    case FootStyle::hoof:
      return "hoof";
    case FootStyle::toes:
      break;
  }
  return "toes";
}

struct Renderer::Impl {
  const Timeline& timeline;
  RenderOptions options;
  detail::BodyPlan plan;
  detail::View view;
  std::unique_ptr<detail::Backdrop> backdrop;
  std::unique_ptr<detail::Occluder> occluder;
  double baseOriginX = 0;
  double crossingPx = 0;      // overground: pixels the animal travels across the whole clip
  double driftPhase[2] = {};  // panning with drift: phases of the two sway components
  std::vector<cv::Mat> noiseUp, noiseDown;  // non-negative parts of zero-mean noise frames
  cv::Mat scratch, accumulator;
  std::vector<detail::LegState> legs;

  Impl(const Timeline& t, const RenderOptions& o) : timeline(t), options(o) {
    validate();
    const double L = timeline.options().legLengthM;
    const detail::Look look = detail::makeLook(options.look);
    plan = detail::makeBodyPlan(timeline.limbs(), L, options.feet, options.seed, look);
    const double spanX = plan.maxX - plan.minX;
    view.scale = std::min(0.78 * options.width / spanX, 0.66 * options.height / plan.maxY);
    if (options.scene == Scene::overground) fitCrossing();
    view.groundY = 0.82 * options.height;
    view.originX = 0.5 * options.width - 0.5 * (plan.minX + plan.maxX) * view.scale;
    baseOriginX = view.originX;
    view.farDx = 0.04 * L * view.scale;
    view.farDy = -0.05 * L * view.scale;
    detail::SceneLayout layout{options.width, options.height, view.groundY,
                               view.farDy,    view.scale,     L};
    backdrop = std::make_unique<detail::Backdrop>(options.scene, layout, look, options.seed);
    legs.resize(static_cast<std::size_t>(timeline.limbs().size()));
    if (options.occluder)
      occluder = std::make_unique<detail::Occluder>(options.scene, layout, nearFootColumns(),
                                                    options.seed);
    const std::uint64_t h = mix(options.seed ^ 0x4452494654ULL);
    driftPhase[0] = 2 * kPi * unitFrom(h);
    driftPhase[1] = 2 * kPi * unitFrom(mix(h));
    if (options.noise > 0) makeNoiseBank();
  }

  // A fixed camera sees the animal cross: its path fills 0.9 of the width when the animal can
  // be drawn between a quarter and 0.55 of the follow-camera size; a long clip at the smallest
  // size starts and ends with the animal (partly) outside the frame, a short one stays inside.
  void fitCrossing() {
    const double last = static_cast<double>(std::max<std::int64_t>(1, timeline.frameCount() - 1));
    const double metres = std::max(1e-9, timeline.distance(last) - timeline.distance(0));
    view.scale = std::clamp(0.9 * options.width / metres, 0.25 * view.scale, 0.55 * view.scale);
    crossingPx = metres * view.scale;
  }

  // Screen columns of the near feet at mid-stance (where a fixed occluder hides them).
  std::vector<double> nearFootColumns() const {
    std::vector<double> columns;
    for (const auto& leg : plan.legs)
      if (!leg.far) columns.push_back(view.toScreen(leg.hipX + leg.neutralX, 0, false).x);
    return columns;
  }

  double seconds(double frame) const { return frame / timeline.options().captureRate.toDouble(); }

  // How far right of its centred place the animal is drawn: an overground crossing, or the
  // panning camera's lag and overshoot (two slow sways, about 2.7 s and 1.1 s).
  double animalShiftPx(double frame) const {
    if (options.scene == Scene::overground)
      return (timeline.distance(frame) - timeline.distance(0)) * view.scale - 0.5 * crossingPx;
    if (options.scene == Scene::panning && options.drift > 0) {
      const double t = seconds(frame);
      return options.drift * options.width *
             (0.65 * std::sin(2 * kPi * t / 2.7 + driftPhase[0]) +
              0.35 * std::sin(2 * kPi * t / 1.1 + driftPhase[1]));
    }
    return 0;
  }

  // How far the ground has slid left in the picture (0 for a still camera over still ground).
  double groundShiftPx(double frame) const {
    if (options.scene == Scene::overground) return 0;
    const double shift = timeline.distance(frame) * view.scale;
    return options.scene == Scene::panning ? shift - animalShiftPx(frame) : shift;
  }

  // The occluder stands still except when the camera pans.
  double occluderShiftPx(double frame) const {
    return options.scene == Scene::panning ? groundShiftPx(frame) : 0;
  }

  double bobAt(double frame) const {
    return 0.012 * plan.leg * std::cos(4 * kPi * timeline.clock(frame));
  }

  detail::LegState legAt(std::size_t i, double frame) const {
    const FootPose pose = timeline.foot(static_cast<int>(i), frame);
    return {plan.legs[i].neutralX + pose.x, pose.lift * plan.liftHeight};
  }

  detail::View viewAt(double frame) const {
    detail::View v = view;
    v.originX = baseOriginX + animalShiftPx(frame);
    return v;
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
    if (!(options.drift >= 0 && options.drift <= 0.2))
      badOption("--drift " + shortNumber(options.drift) +
                " is out of range: use 0 (perfect follow) to 0.2 (sway of a fifth of the width)");
    if (options.drift > 0 && options.scene != Scene::panning)
      badOption("--drift needs --scene panning (only a following camera can lag the animal)");
    if (!(options.light >= 0.1 && options.light <= 1))
      badOption("--light " + shortNumber(options.light) +
                " is out of range: use 0.1 (very dark) to 1 (normal light)");
    if (options.look < 0 || options.look > 9999)
      badOption("--look " + std::to_string(options.look) +
                " is out of range: use 0 (the original look) to 9999");
    if (options.feet == FootStyle::toes && timeline.limbs().kind() != model::LimbSetKind::biped)
      badOption("--feet toes is for bipeds (--limbs biped); use paw or hoof");
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
    backdrop->paint(out, groundShiftPx(frame));
    for (std::size_t i = 0; i < legs.size(); ++i) legs[i] = legAt(i, frame);
    detail::drawAnimal(out, plan, viewAt(frame), legs, bobAt(frame), timeline.clock(frame),
                       options.markers);
    if (occluder) occluder->paint(out, occluderShiftPx(frame));
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
    // Dim light: the scene is darker but sensor noise stays the same, so it weighs more.
    if (options.light < 1) out.convertTo(out, CV_8UC3, options.light);
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
  return impl_->viewAt(frame).toScreen(leg.hipX + leg.neutralX + pose.x,
                                       pose.lift * impl_->plan.liftHeight, leg.far);
}

FootView Renderer::footView(int limb, std::int64_t frame) const {
  const auto& im = *impl_;
  const auto t = static_cast<double>(frame);
  const auto index = static_cast<std::size_t>(limb);
  if (index >= im.plan.legs.size())
    throw Error(ErrorCategory::format,
                "limb index " + std::to_string(limb) + " is not in the clip's limb set");
  FootView foot;
  foot.centre = detail::footCentre(im.plan, im.viewAt(t), limb, im.legAt(index, t), im.bobAt(t));
  // The pixel holding the centre (rounded, as a click lands) must exist.
  const long x = std::lround(foot.centre.x), y = std::lround(foot.centre.y);
  foot.inFrame = x >= 0 && y >= 0 && x < im.options.width && y < im.options.height;
  foot.occluded = im.occluder && im.occluder->covers(foot.centre, im.occluderShiftPx(t));
  return foot;
}

double Renderer::pixelsPerMetre() const {
  return impl_->view.scale;
}

}  // namespace stridemark::synth
