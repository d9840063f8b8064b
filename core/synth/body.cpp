#include "synth/body.h"

#include <algorithm>
#include <cmath>

#include <opencv2/imgproc.hpp>

namespace stridemark::synth::detail {
namespace {

using model::LimbSetKind;
using model::Side;

constexpr int kShift = 4;  // sub-pixel bits for every drawing call
constexpr double kOne = 1 << kShift;
constexpr double kPi = 3.14159265358979323846;

cv::Point fixedPoint(cv::Point2d p) {
  return {static_cast<int>(std::lround(p.x * kOne)), static_cast<int>(std::lround(p.y * kOne))};
}

int px(double value) {
  return std::max(1, static_cast<int>(std::lround(value)));
}

cv::Scalar shade(const cv::Scalar& c, double f) {
  return {std::clamp(c[0] * f, 0.0, 255.0), std::clamp(c[1] * f, 0.0, 255.0),
          std::clamp(c[2] * f, 0.0, 255.0)};
}

void segment(cv::Mat& img, cv::Point2d a, cv::Point2d b, double thick, const cv::Scalar& c) {
  cv::line(img, fixedPoint(a), fixedPoint(b), c, px(thick), cv::LINE_AA, kShift);
}

void disc(cv::Mat& img, cv::Point2d centre, double radius, const cv::Scalar& c) {
  cv::circle(img, fixedPoint(centre), static_cast<int>(std::lround(radius * kOne)), c, cv::FILLED,
             cv::LINE_AA, kShift);
}

void oval(cv::Mat& img, cv::Point2d centre, double ax, double ay, double angleDeg,
          const cv::Scalar& c) {
  cv::ellipse(
      img, fixedPoint(centre),
      cv::Size(static_cast<int>(std::lround(ax * kOne)), static_cast<int>(std::lround(ay * kOne))),
      angleDeg, 0, 360, c, cv::FILLED, cv::LINE_AA, kShift);
}

void polygon(cv::Mat& img, const std::vector<cv::Point2d>& pts, const cv::Scalar& c) {
  std::vector<cv::Point> fixedPts;
  for (const auto& p : pts) fixedPts.push_back(fixedPoint(p));
  cv::fillConvexPoly(img, fixedPts, c, cv::LINE_AA, kShift);
}

// Two-link inverse kinematics in screen space: the joint between hip and foot.
cv::Point2d kneeFor(cv::Point2d hip, cv::Point2d foot, double l1, double l2, int kneeSign) {
  const cv::Point2d delta = foot - hip;
  const double d = std::max(1e-6, std::hypot(delta.x, delta.y));
  const double reach = std::clamp(d, std::abs(l1 - l2) + 1e-3, l1 + l2 - 1e-3);
  const double a =
      std::acos(std::clamp((l1 * l1 + reach * reach - l2 * l2) / (2 * l1 * reach), -1.0, 1.0));
  const cv::Point2d dir = delta / d;
  auto rotated = [&](double angle) {
    return cv::Point2d(std::cos(angle) * dir.x - std::sin(angle) * dir.y,
                       std::sin(angle) * dir.x + std::cos(angle) * dir.y);
  };
  const cv::Point2d k1 = hip + rotated(-a) * l1;  // on the +x side for a downward leg
  const cv::Point2d k2 = hip + rotated(a) * l1;
  if (kneeSign > 0) return k1.x >= k2.x ? k1 : k2;
  if (kneeSign < 0) return k1.x < k2.x ? k1 : k2;
  return k1.y < k2.y ? k1 : k2;  // raised joint (insects)
}

struct Painter {
  cv::Mat& img;
  const BodyPlan& plan;
  const View& view;
  double bob;
  double clock;
  double s() const { return view.scale; }
  cv::Point2d at(double x, double y, bool far = false) const {
    return view.toScreen(x, y + bob, far);
  }
  cv::Point2d ground(double x, double y, bool far) const { return view.toScreen(x, y, far); }
};

bool insectLike(const BodyPlan& plan) {
  return plan.kind == LimbSetKind::hexapod || plan.kind == LimbSetKind::multiPair;
}

// Paws point the way the lower leg leans; that side also decides where the paw's centre is.
double pawDirection(cv::Point2d foot, cv::Point2d knee) {
  return foot.x >= knee.x - 0.5 ? 1.0 : -1.0;
}

// Where the drawn foot's centre sits relative to its ground point (see drawFoot).
cv::Point2d centreOffset(const BodyPlan& plan, double L, cv::Point2d foot, cv::Point2d knee) {
  if (insectLike(plan)) return {0, -0.02 * L};
  switch (plan.feet) {
    case FootStyle::hoof:
      return {0, -0.035 * L};
    case FootStyle::toes:
      return {0.05 * L, -0.01 * L};
    case FootStyle::paw:
      break;
  }
  return {pawDirection(foot, knee) * 0.035 * L, -0.035 * L};
}

// Three thin forward toes and a short hind one, slightly fanned as a bird's foot seen from the
// side.
void drawToes(const Painter& p, cv::Point2d foot, const cv::Scalar& colour) {
  const double L = p.plan.leg * p.s();
  const double thick = std::max(1.0, 0.018 * L);
  for (const auto& tip : {cv::Point2d(0.15 * L, 0.0), cv::Point2d(0.12 * L, -0.012 * L),
                          cv::Point2d(0.1 * L, 0.006 * L), cv::Point2d(-0.06 * L, -0.004 * L)})
    segment(p.img, foot + cv::Point2d(0, -0.01 * L), foot + tip, thick, colour);
}

void drawFoot(const Painter& p, cv::Point2d foot, cv::Point2d knee, const cv::Scalar& colour,
              const cv::Scalar& accent) {
  const double L = p.plan.leg * p.s();
  switch (p.plan.kind) {
    case LimbSetKind::quadruped:
    case LimbSetKind::biped:
      if (p.plan.feet == FootStyle::hoof) {
        const double w = 0.075 * L, h = 0.07 * L;
        polygon(p.img,
                {foot + cv::Point2d(-w, 0), foot + cv::Point2d(w * 1.15, 0),
                 foot + cv::Point2d(w * 0.6, -h), foot + cv::Point2d(-w * 0.8, -h)},
                accent);
      } else if (p.plan.feet == FootStyle::toes) {
        drawToes(p, foot, accent);
      } else {
        const double dir = pawDirection(foot, knee);
        oval(p.img, foot + cv::Point2d(dir * 0.035 * L, -0.035 * L), 0.07 * L, 0.037 * L, 0,
             colour);
      }
      break;
    default:
      disc(p.img, foot + cv::Point2d(0, -0.02 * L), 0.03 * L, accent);
      break;
  }
}

struct LegPoints {
  cv::Point2d hip, knee, foot;
};

LegPoints legPoints(const BodyPlan& plan, const View& view, int index, const LegState& state,
                    double bob) {
  const LegPlan& leg = plan.legs[static_cast<std::size_t>(index)];
  LegPoints pts;
  pts.hip = view.toScreen(leg.hipX, leg.hipY + bob, leg.far);
  pts.foot = view.toScreen(leg.hipX + state.footX, state.footY, leg.far);
  pts.knee =
      kneeFor(pts.hip, pts.foot, leg.upper * view.scale, leg.lower * view.scale, leg.kneeSign);
  return pts;
}

void drawLeg(const Painter& p, int index, const LegState& state, bool markers) {
  const LegPlan& leg = p.plan.legs[static_cast<std::size_t>(index)];
  const double L = p.plan.leg * p.s();
  const auto [hip, knee, foot] = legPoints(p.plan, p.view, index, state, p.bob);
  const double f = leg.far ? 0.62 : 1.0;
  const cv::Scalar upperColour = shade(p.plan.coat, f);
  const cv::Scalar lowerColour =
      shade(p.plan.feet == FootStyle::hoof ? p.plan.coatDark : p.plan.coat, f * 0.95);
  const bool insect = insectLike(p.plan);
  const bool bird = p.plan.feet == FootStyle::toes;
  const double thickUpper = (insect ? 0.06 : 0.14) * L;
  const double thickLower = (insect ? 0.04 : (bird ? 0.045 : 0.085)) * L;
  segment(p.img, hip, knee, thickUpper, upperColour);
  segment(p.img, knee, foot, thickLower, bird ? shade(p.plan.accent, f) : lowerColour);
  disc(p.img, knee, thickLower * 0.62, lowerColour);
  drawFoot(p, foot, knee, lowerColour, shade(p.plan.accent, f));
  if (markers) {
    const double r = std::max(3.0, 0.05 * L);
    const cv::Point2d centre = foot + cv::Point2d(0, -r);
    disc(p.img, centre, r + 1.2, cv::Scalar(20, 20, 20));
    disc(p.img, centre, r, leg.far ? cv::Scalar(0, 150, 170) : cv::Scalar(0, 235, 255));
  }
}

void drawQuadrupedBody(const Painter& p) {
  const double L = p.plan.leg;
  const double Ls = L * p.s();
  const bool horse = p.plan.feet == FootStyle::hoof;
  const cv::Scalar& coat = p.plan.coat;
  // Tail first: it hangs behind the hindquarters.
  const double sway = 0.05 * L * std::sin(2 * kPi * p.clock);
  std::vector<cv::Point> tail;
  const cv::Point2d t0 = p.at(-0.82 * L, 1.2 * L);
  const cv::Point2d t1 = p.at(-1.05 * L, (horse ? 1.0 : 1.25) * L + sway);
  const cv::Point2d t2 = p.at((horse ? -1.12 : -1.3) * L, (horse ? 0.55 : 1.15) * L + 2 * sway);
  for (const auto& q : {t0, t1, t2}) tail.push_back(fixedPoint(q));
  cv::polylines(p.img, tail, false, horse ? p.plan.accent : coat, px((horse ? 0.1 : 0.06) * Ls),
                cv::LINE_AA, kShift);
  // Trunk: barrel plus chest and hindquarters.
  oval(p.img, p.at(0, 1.06 * L), 0.86 * Ls, 0.25 * Ls, 0, coat);
  disc(p.img, p.at(0.58 * L, 1.04 * L), 0.25 * Ls, coat);
  disc(p.img, p.at(-0.6 * L, 1.1 * L), 0.25 * Ls, coat);
  oval(p.img, p.at(-0.05 * L, 0.93 * L), 0.55 * Ls, 0.1 * Ls, 0, shade(coat, 0.85));  // belly shade
  // Neck and head.
  const double nod = 0.02 * L * std::sin(4 * kPi * p.clock);
  const cv::Point2d head = horse ? p.at(1.28 * L, 1.62 * L + nod) : p.at(1.02 * L, 1.5 * L + nod);
  polygon(p.img,
          {p.at(0.5 * L, 1.28 * L), p.at(0.82 * L, 0.98 * L),
           head + cv::Point2d(0.1 * Ls, 0.06 * Ls), head + cv::Point2d(-0.08 * Ls, -0.1 * Ls)},
          coat);
  if (horse) {
    oval(p.img, head + cv::Point2d(0.12 * Ls, 0.12 * Ls), 0.28 * Ls, 0.1 * Ls, 55, coat);
    oval(p.img, head + cv::Point2d(0.25 * Ls, 0.3 * Ls), 0.08 * Ls, 0.07 * Ls, 0, shade(coat, 0.7));
    polygon(p.img,
            {head + cv::Point2d(-0.06 * Ls, -0.08 * Ls), head + cv::Point2d(0.0, -0.22 * Ls),
             head + cv::Point2d(0.04 * Ls, -0.06 * Ls)},
            shade(coat, 0.8));
    // Mane along the neck.
    segment(p.img, p.at(0.52 * L, 1.3 * L), head + cv::Point2d(-0.06 * Ls, -0.06 * Ls), 0.05 * Ls,
            p.plan.accent);
  } else {
    oval(p.img, head, 0.17 * Ls, 0.13 * Ls, 0, coat);
    oval(p.img, head + cv::Point2d(0.17 * Ls, 0.05 * Ls), 0.14 * Ls, 0.07 * Ls, 10, coat);
    disc(p.img, head + cv::Point2d(0.3 * Ls, 0.04 * Ls), 0.035 * Ls, p.plan.accent);  // nose
    polygon(p.img,
            {head + cv::Point2d(-0.12 * Ls, -0.05 * Ls), head + cv::Point2d(-0.06 * Ls, -0.25 * Ls),
             head + cv::Point2d(0.02 * Ls, -0.08 * Ls)},
            shade(coat, 0.7));  // ear
  }
  disc(p.img, head + cv::Point2d(0.04 * Ls, -0.03 * Ls), 0.025 * Ls, cv::Scalar(25, 25, 25));
}

void drawBipedBody(const Painter& p) {
  const double L = p.plan.leg, Ls = L * p.s();
  const cv::Scalar& coat = p.plan.coat;
  polygon(p.img,
          {p.at(-0.35 * L, 1.3 * L), p.at(-0.75 * L, 1.45 * L), p.at(-0.7 * L, 1.3 * L),
           p.at(-0.3 * L, 1.15 * L)},
          shade(coat, 0.7));  // tail feathers
  oval(p.img, p.at(0.0, 1.22 * L), 0.48 * Ls, 0.3 * Ls, -12, coat);
  oval(p.img, p.at(-0.05 * L, 1.25 * L), 0.3 * Ls, 0.15 * Ls, -12, shade(coat, 0.8));  // wing
  const double nod = 0.04 * L * std::sin(4 * kPi * p.clock);
  const cv::Point2d head = p.at(0.55 * L + nod, 1.95 * L);
  segment(p.img, p.at(0.3 * L, 1.35 * L), head, 0.16 * Ls, coat);
  disc(p.img, head, 0.13 * Ls, coat);
  polygon(p.img,
          {head + cv::Point2d(0.1 * Ls, -0.04 * Ls), head + cv::Point2d(0.32 * Ls, 0.02 * Ls),
           head + cv::Point2d(0.1 * Ls, 0.05 * Ls)},
          p.plan.accent);
  disc(p.img, head + cv::Point2d(0.04 * Ls, -0.03 * Ls), 0.025 * Ls, cv::Scalar(20, 20, 20));
}

void drawInsectBody(const Painter& p) {
  const double L = p.plan.leg, Ls = L * p.s();
  const cv::Scalar& coat = p.plan.coat;
  oval(p.img, p.at(-0.72 * L, 0.55 * L), 0.42 * Ls, 0.16 * Ls, 4, coat);  // abdomen
  for (int band = 0; band < 4; ++band)
    segment(p.img, p.at((-0.45 - 0.16 * band) * L, 0.68 * L),
            p.at((-0.45 - 0.16 * band) * L, 0.43 * L), 0.02 * Ls, shade(coat, 0.75));
  oval(p.img, p.at(0.02 * L, 0.53 * L), 0.42 * Ls, 0.11 * Ls, 0, shade(coat, 1.1));  // thorax
  const cv::Point2d head = p.at(0.58 * L, 0.56 * L);
  disc(p.img, head, 0.12 * Ls, coat);
  disc(p.img, head + cv::Point2d(0.06 * Ls, -0.04 * Ls), 0.045 * Ls, cv::Scalar(15, 15, 15));
  const double wag = 0.05 * L * std::sin(2 * kPi * p.clock);
  segment(p.img, head + cv::Point2d(0.08 * Ls, -0.1 * Ls), p.at(1.1 * L, 0.95 * L + wag), 0.02 * Ls,
          p.plan.accent);
}

void drawMultiPairBody(const Painter& p) {
  const double L = p.plan.leg, Ls = L * p.s();
  const auto& legs = p.plan.legs;
  const int pairs = static_cast<int>(legs.size()) / 2;
  for (int s = pairs - 1; s >= 0; --s) {
    const double x = legs[static_cast<std::size_t>(s)].hipX;
    const double wave = 0.015 * L * std::sin(2 * kPi * (p.clock + 0.1 * s));
    oval(p.img, p.at(x, 0.42 * L + wave), 0.2 * Ls, 0.12 * Ls, 0,
         shade(p.plan.coat, s % 2 ? 0.85 : 1.0));
  }
  const double front = legs.front().hipX;
  const cv::Point2d head = p.at(front + 0.24 * L, 0.45 * L);
  disc(p.img, head, 0.12 * Ls, shade(p.plan.coat, 0.8));
  segment(p.img, head, p.at(front + 0.6 * L, 0.75 * L), 0.02 * Ls, p.plan.accent);
}

}  // namespace

BodyPlan makeBodyPlan(const model::LimbSet& limbs, double L, FootStyle feet, std::uint64_t seed,
                      const Look& look) {
  BodyPlan plan;
  plan.kind = limbs.kind();
  plan.feet = feet;
  plan.leg = L;
  // A little colour variety between seeds, always in the same family.
  const double tint = 0.9 + 0.2 * static_cast<double>(seed % 7) / 6.0;
  for (const auto& limb : limbs.limbs()) {
    LegPlan leg;
    leg.far = limb.side == Side::right;
    switch (plan.kind) {
      case LimbSetKind::quadruped:
        leg.hipX = limb.segment == 0 ? 0.62 * L : -0.62 * L;
        leg.hipY = 1.0 * L;
        leg.upper = 0.56 * L;
        leg.lower = 0.62 * L;
        leg.kneeSign = limb.segment == 0 ? 1 : -1;
        break;
      case LimbSetKind::biped:
        leg.hipX = 0;
        leg.hipY = 1.0 * L;
        leg.upper = 0.55 * L;
        leg.lower = 0.63 * L;
        leg.kneeSign = -1;
        break;
      case LimbSetKind::hexapod:
        leg.hipX = (0.24 - 0.24 * limb.segment) * L;  // all three pairs on the thorax
        leg.hipY = 0.48 * L;
        leg.upper = 0.38 * L;
        leg.lower = 0.5 * L;
        // Splayed like an insect's: front joints forward, middle raised, hind joints back.
        leg.kneeSign = limb.segment == 0 ? 1 : (limb.segment == 2 ? -1 : 0);
        leg.neutralX = (0.12 - 0.17 * limb.segment) * L;  // front feet reach forward, hind back
        break;
      case LimbSetKind::multiPair: {
        const double spacing = 0.36 * L;
        leg.hipX = (0.5 * (limbs.pairs() - 1) - limb.segment) * spacing;
        leg.hipY = 0.38 * L;
        leg.upper = 0.36 * L;
        leg.lower = 0.46 * L;
        leg.kneeSign = 0;
        break;
      }
    }
    plan.legs.push_back(leg);
  }
  switch (plan.kind) {
    case LimbSetKind::quadruped:
      plan.liftHeight = 0.16 * L;
      plan.minX = -1.4 * L;
      plan.maxX = (feet == FootStyle::hoof ? 1.6 : 1.4) * L;
      plan.maxY = (feet == FootStyle::hoof ? 1.9 : 1.75) * L;
      plan.coat = feet == FootStyle::hoof ? shade(cv::Scalar(40, 72, 128), tint)
                                          : shade(cv::Scalar(80, 135, 190), tint);
      plan.accent = cv::Scalar(30, 30, 35);
      break;
    case LimbSetKind::biped:
      plan.liftHeight = 0.2 * L;
      plan.minX = -0.9 * L;
      plan.maxX = 1.0 * L;
      plan.maxY = 2.15 * L;
      plan.coat = shade(cv::Scalar(120, 110, 95), tint);
      plan.accent = cv::Scalar(40, 150, 220);
      break;
    case LimbSetKind::hexapod:
      plan.liftHeight = 0.2 * L;
      plan.minX = -1.4 * L;
      plan.maxX = 1.2 * L;
      plan.maxY = 1.0 * L;
      plan.coat = shade(cv::Scalar(40, 70, 85), tint);
      plan.accent = cv::Scalar(25, 35, 40);
      break;
    case LimbSetKind::multiPair: {
      const double half = 0.5 * (limbs.pairs() - 1) * 0.36 * L;
      plan.liftHeight = 0.15 * L;
      plan.minX = -half - 0.6 * L;
      plan.maxX = half + 0.7 * L;
      plan.maxY = 0.9 * L;
      plan.coat = shade(cv::Scalar(35, 55, 120), tint);
      plan.accent = cv::Scalar(25, 30, 50);
      break;
    }
  }
  if (look.coat) plan.coat = shade(*look.coat, tint);
  if (look.accent) plan.accent = *look.accent;
  plan.coatDark = shade(plan.coat, 0.6);
  return plan;
}

cv::Point2d footCentre(const BodyPlan& plan, const View& view, int index, const LegState& state,
                       double bob) {
  const LegPoints pts = legPoints(plan, view, index, state, bob);
  return pts.foot + centreOffset(plan, plan.leg * view.scale, pts.foot, pts.knee);
}

void drawAnimal(cv::Mat& image, const BodyPlan& plan, const View& view,
                const std::vector<LegState>& legs, double bob, double clock, bool markers) {
  const Painter painter{image, plan, view, bob, clock};
  for (std::size_t i = 0; i < legs.size(); ++i)
    if (plan.legs[i].far) drawLeg(painter, static_cast<int>(i), legs[i], markers);
  switch (plan.kind) {
    case LimbSetKind::quadruped:
      drawQuadrupedBody(painter);
      break;
    case LimbSetKind::biped:
      drawBipedBody(painter);
      break;
    case LimbSetKind::hexapod:
      drawInsectBody(painter);
      break;
    case LimbSetKind::multiPair:
      drawMultiPairBody(painter);
      break;
  }
  for (std::size_t i = 0; i < legs.size(); ++i)
    if (!plan.legs[i].far) drawLeg(painter, static_cast<int>(i), legs[i], markers);
}

}  // namespace stridemark::synth::detail
