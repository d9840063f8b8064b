#include "synth/scene.h"

#include <algorithm>
#include <cmath>

#include <opencv2/imgproc.hpp>

namespace stridemark::synth::detail {
namespace {

constexpr double kPi = 3.14159265358979323846;

int rounded(double v) {
  return static_cast<int>(std::lround(v));
}

// Vertical colour ramp from `top` to `bottom` over the rows of `img`.
void verticalRamp(cv::Mat& img, const cv::Scalar& top, const cv::Scalar& bottom) {
  for (int y = 0; y < img.rows; ++y) {
    const double w = img.rows > 1 ? static_cast<double>(y) / (img.rows - 1) : 0.0;
    img.row(y).setTo(top * (1 - w) + bottom * w);
  }
}

// Small random speckles that make ground motion visible (and trackable).
void speckle(cv::Mat& tile, cv::RNG& rng, int count, int maxRadius, const cv::Scalar& base,
             double spread) {
  for (int i = 0; i < count; ++i) {
    const cv::Point c(rng.uniform(0, tile.cols), rng.uniform(0, tile.rows));
    const double f = 1.0 + rng.uniform(-spread, spread);
    const int r = rng.uniform(1, maxRadius + 1);
    for (int dx : {-tile.cols, 0, tile.cols})
      cv::circle(tile, c + cv::Point(dx, 0), r, base * f, cv::FILLED, cv::LINE_AA);
  }
}

// Tile (one period) plus its first `width` columns again: any offset in [0, period) reads a
// seamless window of `width` columns.
cv::Mat wrapStrip(const cv::Mat& tile, int width) {
  cv::Mat strip(tile.rows, tile.cols + width, tile.type());
  tile.copyTo(strip(cv::Rect(0, 0, tile.cols, tile.rows)));
  int filled = 0;
  while (filled < width) {
    const int n = std::min(tile.cols, width - filled);
    tile(cv::Rect(0, 0, n, tile.rows)).copyTo(strip(cv::Rect(tile.cols + filled, 0, n, tile.rows)));
    filled += n;
  }
  return strip;
}

int periodFor(double spacingPx, int atLeast) {
  const double spacing = std::max(8.0, spacingPx);
  const int n = std::max(1, static_cast<int>(std::ceil(atLeast / spacing)));
  return std::max(8, rounded(spacing * n));
}

StripLayer makeLayer(const SceneLayout& layout, int x0, int y0, int width, int height, int period,
                     double parallax) {
  StripLayer layer;
  layer.x0 = std::clamp(x0, 0, layout.width - 1);
  layer.y0 = std::clamp(y0, 0, layout.height - 1);
  layer.width = std::min(width, layout.width - layer.x0);
  layer.period = period;
  layer.parallax = parallax;
  layer.strip.create(std::min(height, layout.height - layer.y0), period + layer.width, CV_8UC3);
  return layer;
}

}  // namespace

int StripLayer::offsetFor(double shiftPx) const {
  long offset = std::lround(shiftPx * parallax) % period;
  if (offset < 0) offset += period;
  return static_cast<int>(offset);
}

void StripLayer::paintInto(cv::Mat& out, double shiftPx) const {
  const cv::Rect source(offsetFor(shiftPx), 0, width, strip.rows);
  cv::Mat target = out(cv::Rect(x0, y0, width, strip.rows));
  if (mask.empty())
    strip(source).copyTo(target);
  else
    strip(source).copyTo(target, mask(source));
}

Backdrop::Backdrop(Scene scene, const SceneLayout& layout, const Look& look, std::uint64_t seed)
    : layout_(layout), look_(look) {
  base_.create(layout.height, layout.width, CV_8UC3);
  if (scene == Scene::treadmill)
    buildTreadmill(seed);
  else
    buildOutdoors(seed);
}

void Backdrop::buildTreadmill(std::uint64_t seed) {
  cv::RNG rng(seed * 2654435761ULL + 17);
  const double Ls = layout_.leg * layout_.scale;
  const int W = layout_.width, H = layout_.height;
  const int beltTop = rounded(layout_.groundY + layout_.farDy - 0.06 * Ls);
  const int beltBottom = rounded(layout_.groundY + 0.05 * Ls);
  const int deckBottom = std::min(H, beltBottom + rounded(0.16 * Ls));
  // Lab wall with panels, a skirting board and a floor.
  cv::Mat wall = base_(cv::Rect(0, 0, W, beltTop));
  verticalRamp(wall, look_.wallTop, look_.wallBottom);
  for (int x = rounded(0.13 * W); x < W; x += rounded(0.27 * W))
    cv::line(base_, {x, 0}, {x, beltTop}, look_.wallLine, 2, cv::LINE_AA);
  base_(cv::Rect(0, beltTop, W, H - beltTop)).setTo(look_.floor);
  // Treadmill deck under the belt and the side rail behind the animal.
  const int x0 = rounded(0.03 * W), x1 = rounded(0.97 * W);
  cv::rectangle(base_, {x0, beltBottom}, {x1, deckBottom}, look_.deck, cv::FILLED);
  cv::rectangle(base_, {x0, beltBottom}, {x1, beltBottom + 3}, cv::Scalar(150, 150, 150),
                cv::FILLED);
  cv::rectangle(base_, {rounded(0.1 * W), beltBottom + rounded(0.06 * Ls)},
                {rounded(0.3 * W), beltBottom + rounded(0.1 * Ls)}, cv::Scalar(40, 110, 190),
                cv::FILLED);  // safety label stripe
  const int railY = rounded(layout_.groundY - 1.35 * Ls);
  for (int x : {x0 + 6, x1 - 6})
    cv::line(base_, {x, railY}, {x, beltTop}, look_.rail, std::max(3, rounded(0.04 * Ls)),
             cv::LINE_AA);
  cv::line(base_, {x0 + 6, railY}, {x1 - 6, railY}, look_.railTop, std::max(3, rounded(0.035 * Ls)),
           cv::LINE_AA);
  // Moving belt: dark rubber, grain, transverse seams every 0.3 m.
  const double seam = look_.beltSeamM * layout_.scale;
  const int period = periodFor(seam, 400);
  StripLayer belt = makeLayer(layout_, x0, beltTop, x1 - x0, beltBottom - beltTop, period, 1.0);
  cv::Mat tile(belt.strip.rows, period, CV_8UC3, look_.belt);
  speckle(tile, rng, period * tile.rows / look_.beltGrainEvery, 1, look_.beltGrain, 0.45);
  speckle(tile, rng, period / 25, 2, look_.beltFleck, 0.2);
  const int seams = std::max(1, rounded(period / seam));
  for (int i = 0; i < seams; ++i) {
    const int x = rounded(i * static_cast<double>(period) / seams);
    cv::line(tile, {x, 0}, {x, tile.rows}, look_.beltSeam, 2, cv::LINE_AA);
  }
  belt.strip = wrapStrip(tile, belt.width);
  layers_.push_back(std::move(belt));
}

void Backdrop::buildOutdoors(std::uint64_t seed) {
  cv::RNG rng(seed * 2654435761ULL + 29);
  const double Ls = layout_.leg * layout_.scale;
  const int W = layout_.width, H = layout_.height;
  const int nearTop = std::clamp(rounded(layout_.groundY + layout_.farDy - 0.12 * Ls), 1, H - 2);
  const int horizon = std::clamp(rounded(layout_.groundY - 1.25 * Ls), 1, nearTop - 1);
  verticalRamp(base_, look_.skyTop, look_.skyBottom);  // sky

  // Distant hills, barely moving.
  const int hillTop = std::max(0, horizon - rounded(0.5 * Ls));
  const int hillPeriod = periodFor(W * 0.75, W);
  StripLayer hills = makeLayer(layout_, 0, hillTop, W, horizon - hillTop, hillPeriod, 0.08);
  cv::Mat hillTile(hills.strip.rows, hillPeriod, CV_8UC3);
  base_(cv::Rect(0, hillTop, 1, hills.strip.rows)).copyTo(hillTile.col(0));
  for (int x = 1; x < hillPeriod; ++x) hillTile.col(0).copyTo(hillTile.col(x));
  std::vector<cv::Point> ridge;
  const double phase = rng.uniform(0.0, 2 * kPi);
  for (int x = 0; x <= hillPeriod; x += 4) {
    const double t = 2 * kPi * x / hillPeriod;
    const double h = 0.55 + 0.25 * std::sin(t + phase) + 0.15 * std::sin(3 * t + 2 * phase);
    ridge.emplace_back(x, rounded(hillTile.rows * (1.0 - h)));
  }
  ridge.emplace_back(hillPeriod, hillTile.rows);
  ridge.emplace_back(0, hillTile.rows);
  cv::fillPoly(hillTile, std::vector<std::vector<cv::Point>>{ridge}, look_.hills, cv::LINE_AA);
  hills.strip = wrapStrip(hillTile, hills.width);
  layers_.push_back(std::move(hills));

  // Far meadow: slower than the track the animal runs on.
  const int farPeriod = periodFor(0.5 * layout_.scale, 400);
  StripLayer meadow = makeLayer(layout_, 0, horizon, W, nearTop - horizon, farPeriod, 0.6);
  cv::Mat farTile(meadow.strip.rows, farPeriod, CV_8UC3);
  verticalRamp(farTile, look_.meadowTop, look_.meadowBottom);
  speckle(farTile, rng, farPeriod * farTile.rows / 60, 1, look_.meadowSpeck, 0.3);
  meadow.strip = wrapStrip(farTile, meadow.width);
  layers_.push_back(std::move(meadow));

  // Paddock fence behind the animal (masked over sky and meadow).
  const double postSpacing = 2.0 * layout_.scale * 0.85;
  const int fencePeriod = periodFor(postSpacing, 500);
  const int fenceBase = horizon + rounded(0.25 * Ls);
  const int fenceTop = std::max(0, fenceBase - rounded(0.9 * Ls));
  StripLayer fence = makeLayer(layout_, 0, fenceTop, W, fenceBase - fenceTop, fencePeriod, 0.85);
  cv::Mat fenceTile(fence.strip.rows, fencePeriod, CV_8UC3, look_.fence);
  cv::Mat fenceMask(fence.strip.rows, fencePeriod, CV_8UC1, cv::Scalar(0));
  const int posts = std::max(1, rounded(fencePeriod / postSpacing));
  const int postW = std::max(3, rounded(0.05 * Ls));
  for (int i = 0; i < posts; ++i) {
    const int x = rounded(i * static_cast<double>(fencePeriod) / posts);
    for (int dx : {-fencePeriod, 0, fencePeriod})
      cv::rectangle(fenceMask, {x + dx, 0}, {x + dx + postW, fenceMask.rows}, 255, cv::FILLED);
  }
  for (double rail : {0.12, 0.5})
    cv::rectangle(fenceMask, {0, rounded(rail * fenceMask.rows)},
                  {fencePeriod, rounded(rail * fenceMask.rows) + std::max(2, postW / 2)}, 255,
                  cv::FILLED);
  fence.strip = wrapStrip(fenceTile, fence.width);
  fence.mask = wrapStrip(fenceMask, fence.width);
  layers_.push_back(std::move(fence));

  // Track surface under the feet: moves exactly with the ground.
  const int nearPeriod = periodFor(0.25 * layout_.scale, 400);
  StripLayer track = makeLayer(layout_, 0, nearTop, W, H - nearTop, nearPeriod, 1.0);
  cv::Mat nearTile(track.strip.rows, nearPeriod, CV_8UC3);
  verticalRamp(nearTile, look_.trackTop, look_.trackBottom);
  speckle(nearTile, rng, nearPeriod * nearTile.rows / look_.trackSpeckEvery, 1, look_.trackSpeck,
          0.35);
  speckle(nearTile, rng, nearPeriod * nearTile.rows / look_.trackTuftEvery, 3, look_.trackTuft,
          0.25);
  track.strip = wrapStrip(nearTile, track.width);
  layers_.push_back(std::move(track));
}

void Backdrop::paint(cv::Mat& out, double groundShiftPx) const {
  base_.copyTo(out);
  for (const auto& layer : layers_) layer.paintInto(out, groundShiftPx);
}

Occluder::Occluder(Scene scene, const SceneLayout& layout, const std::vector<double>& footXs,
                   std::uint64_t seed)
    : layout_(layout), treadmill_(scene == Scene::treadmill) {
  cv::RNG rng(seed * 2654435761ULL + 41);
  const double Ls = layout.leg * layout.scale;
  const int top = std::clamp(rounded(layout.groundY - 0.75 * Ls), 0, layout.height - 2);
  const bool panning = scene == Scene::panning;
  const int period = panning ? rounded(layout.width * rng.uniform(0.8, 1.5)) : layout.width;
  layer_ = makeLayer(layout, 0, top, layout.width, layout.height - top, period, 1.25);
  cv::Mat tile(layer_.strip.rows, period, CV_8UC3, cv::Scalar::all(0));
  cv::Mat mask(layer_.strip.rows, period, CV_8UC1, cv::Scalar(0));
  double centre = rng.uniform(0.3, 0.7) * layout.width;  // fixed camera over ground
  if (panning) centre = rng.uniform(0.0, 1.0) * period;
  if (scene == Scene::treadmill && !footXs.empty())
    centre = footXs[static_cast<std::size_t>(rng.uniform(0, static_cast<int>(footXs.size())))] +
             rng.uniform(-0.12, 0.12) * Ls;
  drawObject(tile, mask, centre, rng);
  layer_.strip = wrapStrip(tile, layer_.width);
  layer_.mask = wrapStrip(mask, layer_.width);
}

// A post (square-cut, lit from the left) or a low bush; drawn without anti-aliasing so the
// mask says exactly which pixels it replaced.
void Occluder::drawObject(cv::Mat& tile, cv::Mat& mask, double centreX, cv::RNG& rng) const {
  const double Ls = layout_.leg * layout_.scale;
  const double groundRow = layout_.groundY - layer_.y0;
  const int period = tile.cols;
  const bool post = rng.uniform(0, 2) == 0 || treadmill_;  // a frame upright beside a belt
  const double width = rng.uniform(0.16, 0.28) * Ls;
  const int postTop = rounded(groundRow - rng.uniform(0.35, 0.6) * Ls);
  const double tone = rng.uniform(0.5, 1.3);  // weathered grey-brown wood, light to dark
  const cv::Scalar wood(rng.uniform(55, 75) * tone, rng.uniform(80, 100) * tone,
                        rng.uniform(105, 135) * tone);
  const cv::Scalar leaf(rng.uniform(20, 90), rng.uniform(80, 170), rng.uniform(30, 110));
  struct Blob {
    double dx, y;
    int r;
    double tone;
  };
  std::vector<Blob> blobs;
  for (int i = 0; i < 12; ++i)
    blobs.push_back({rng.uniform(-0.5, 0.5) * width, groundRow - rng.uniform(-0.05, 0.4) * Ls,
                     std::max(2, rounded(rng.uniform(0.07, 0.13) * Ls)), rng.uniform(0.7, 1.25)});
  auto fill = [&](cv::Point a, cv::Point b, const cv::Scalar& colour) {
    cv::rectangle(tile, a, b, colour, cv::FILLED, cv::LINE_8);
    cv::rectangle(mask, a, b, 255, cv::FILLED, cv::LINE_8);
  };
  for (int shift : {-period, 0, period}) {
    const double cx = centreX + shift;
    if (post) {
      const int left = rounded(cx - width / 2), right = rounded(cx + width / 2);
      fill({left, postTop}, {right, tile.rows}, wood);
      fill({left, postTop}, {left + (right - left) / 4, tile.rows}, wood * 1.25);
      fill({right - (right - left) / 5, postTop}, {right, tile.rows}, wood * 0.7);
      fill({left, postTop}, {right, postTop + std::max(2, rounded(0.03 * Ls))}, wood * 0.6);
    } else {
      for (const Blob& blob : blobs) {
        const cv::Point c(rounded(cx + blob.dx), rounded(blob.y));
        cv::circle(tile, c, blob.r, leaf * blob.tone, cv::FILLED, cv::LINE_8);
        cv::circle(mask, c, blob.r, 255, cv::FILLED, cv::LINE_8);
      }
      fill({rounded(cx - 0.4 * width), rounded(groundRow - 0.05 * Ls)},
           {rounded(cx + 0.4 * width), tile.rows}, leaf * 0.6);
    }
  }
}

void Occluder::paint(cv::Mat& out, double groundShiftPx) const {
  layer_.paintInto(out, groundShiftPx);
}

bool Occluder::covers(cv::Point2d p, double groundShiftPx) const {
  const int x = rounded(p.x), y = rounded(p.y) - layer_.y0;
  if (x < 0 || x >= layer_.width || y < 0 || y >= layer_.mask.rows) return false;
  return layer_.mask.at<uchar>(y, layer_.offsetFor(groundShiftPx) + x) != 0;
}

}  // namespace stridemark::synth::detail
