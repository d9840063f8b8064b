#include "analysis/gait_rules.h"

#include <cmath>
#include <limits>

#include "analysis/circular.h"
#include "analysis/hildebrand.h"

namespace stridemark::analysis {
namespace {

using model::Side;

// A pair's first and second touchdown, and the lag between them (cycles, <= 0.5).
struct Couplet {
  Side first = Side::left;
  Side second = Side::right;
  double firstPhase = 0;
  double lag = 0;
};

Couplet couplet(double left, double right) {
  const double rightAfterLeft = wrapPhase(right - left);
  if (rightAfterLeft <= 0.5) return {Side::left, Side::right, left, rightAfterLeft};
  return {Side::right, Side::left, right, 1.0 - rightAfterLeft};
}

std::string sideName(Side side) {
  return side == Side::left ? "left" : "right";
}

double phaseOf(Side side, double left, double right) {
  return side == Side::left ? left : right;
}

// Phases from integer frames land exactly on tolerance borders: compare with this margin.
constexpr double kEdgeTolerance = 1e-9;

}  // namespace

bool isSymmetrical(double hindContralateral, double foreContralateral, double tolerance) {
  return circularDistance(hindContralateral, 0.5) <= tolerance + kEdgeTolerance &&
         circularDistance(foreContralateral, 0.5) <= tolerance + kEdgeTolerance;
}

void labelQuadrupedStride(StrideRecord& s, const QuadrupedLimbs& limbs, double meanDutyFactor,
                          const GaitTolerances& tol) {
  const auto at = [&](int limb) { return *s.phase[static_cast<std::size_t>(limb)]; };
  const QuadrupedPhases p{at(limbs.lf), at(limbs.rf), at(limbs.lh), at(limbs.rh)};
  s.hindContralateral = wrapPhase(p.rh - p.lh);
  s.foreContralateral = wrapPhase(p.rf - p.lf);
  const AsymmetricalGait lags = classifyAsymmetrical(p, tol.tau + tol.margin);
  s.foreLag = lags.foreLag;
  s.hindLag = lags.hindLag;
  s.pairLag = lags.pairLag;
  if (isSymmetrical(*s.hindContralateral, *s.foreContralateral, tol.symmetry + tol.margin)) {
    s.symmetrical = true;
    if (!s.limbPhase || !s.hindDutyFactor) return;
    s.band = hildebrandBand(*s.limbPhase);
    s.quadrant = cartmillQuadrant(*s.limbPhase);
    s.sequence = footfallSequence(*s.limbPhase);
    s.gait = symmetricalQuadrupedGait(*s.band, *s.hindDutyFactor);
    return;
  }
  s.symmetrical = false;
  if (meanDutyFactor >= 0.5 && !s.aerial) {  // an uneven walk, not a gallop (§3.3 step 2)
    s.gait = "walk";
    return;
  }
  s.gait = lags.gait;
  if (s.gait == "unclassified")
    s.note =
        "the forefeet land together while the hindfeet land apart, which no gait of "
        "docs/methods.md §3.1 does";
  s.lead = lags.lead;
  s.hindLead = lags.hindLead;
}

void labelBipedStride(StrideRecord& s, double rightRelLeft, double meanDutyFactor,
                      const GaitTolerances& tol) {
  s.symmetrical = circularDistance(rightRelLeft, 0.5) <= tol.symmetry + tol.margin + kEdgeTolerance;
  s.gait = bipedGait(rightRelLeft, meanDutyFactor, s.aerial, tol.tau + tol.margin,
                     tol.symmetry + tol.margin);
  if (s.gait == "skip") s.lead = rightRelLeft < 0.5 ? "right" : "left";
}

void labelMultiPairStride(StrideRecord& s, const model::LimbSet& limbs, const GaitTolerances& tol) {
  std::vector<double> phases;
  for (const auto& p : s.phase) {
    if (!p) return;
    phases.push_back(*p);
  }
  const TemplateMatch match = nearestTemplate(limbs, phases);
  s.gait = match.gait;
  s.templateDistance = match.distance;
  s.symmetrical = true;
  for (int seg = 0; seg < limbs.pairs(); ++seg) {
    const auto l = limbs.at(Side::left, seg), r = limbs.at(Side::right, seg);
    if (!l || !r) continue;
    const double contralateral =
        phases[static_cast<std::size_t>(*r)] - phases[static_cast<std::size_t>(*l)];
    if (circularDistance(contralateral, 0.5) > tol.symmetry + kEdgeTolerance) s.symmetrical = false;
  }
  if (const auto wave = ipsilateralWave(limbs, phases, tol.wave)) {
    s.ipsilateralLag = wave->lag;
    s.waveDirection = wave->direction;
  }
}

std::string symmetricalQuadrupedGait(const std::string& band, double hindDutyFactor) {
  if (band == "trot") return "trot";
  if (band == "pace") return "pace";
  return hindDutyFactor >= 0.5 ? "walk" : "amble";
}

AsymmetricalGait classifyAsymmetrical(const QuadrupedPhases& p, double tau) {
  const Couplet fore = couplet(p.lf, p.rf);
  const Couplet hind = couplet(p.lh, p.rh);
  AsymmetricalGait out;
  out.foreLag = fore.lag;
  out.hindLag = hind.lag;
  out.pairLag = wrapPhase(hind.firstPhase - fore.firstPhase);
  const bool foreTogether = fore.lag < tau;
  const bool hindTogether = hind.lag < tau;
  if (!foreTogether) out.lead = sideName(fore.second);
  if (!hindTogether) out.hindLead = sideName(hind.second);
  if (foreTogether && hindTogether) {
    out.gait = circularDistance(hind.firstPhase, fore.firstPhase) < tau ? "pronk" : "bound";
    return out;
  }
  if (hindTogether) {
    out.gait = "half-bound";
    return out;
  }
  if (foreTogether) {  // forefeet together, hindfeet apart: no gait of §3.1 looks like this
    out.gait = "unclassified";
    return out;
  }
  const double leadHind = phaseOf(hind.second, p.lh, p.rh);
  const double trailFore = phaseOf(fore.first, p.lf, p.rf);
  if (circularDistance(leadHind, trailFore) < tau) {
    out.gait = "canter";
    return out;
  }
  out.gait = hind.second == fore.second ? "transverse gallop" : "rotary gallop";
  return out;
}

std::string bipedGait(double rightPhaseRelLeft, double meanDutyFactor, bool aerial, double tau,
                      double symmetryTolerance) {
  if (circularDistance(rightPhaseRelLeft, 0.5) <= symmetryTolerance + kEdgeTolerance)
    return meanDutyFactor >= 0.5 ? "walk" : "run";
  if (meanDutyFactor >= 0.5 && !aerial) return "walk";  // uneven walk (§3.3 step 2)
  if (circularDistance(rightPhaseRelLeft, 0.0) < tau) return "hop";
  return "skip";
}

std::vector<GaitTemplate> coordinationTemplates(const model::LimbSet& limbs) {
  // Each template: left leg of segment s (0 = front) lands `lag` after the leg behind it, the
  // right leg of the segment `contra` after the left one (docs/methods.md §4.2, for N pairs).
  const int pairs = limbs.pairs();
  struct Form {
    const char* gait;
    double lag;
    double contra;
  };
  const double waveLag = 1.0 / (2.0 * pairs);
  const Form forms[] = {
      {"tripod", 0.5, 0.5},
      {"tetrapod", 1.0 / 3.0, 1.0 / 3.0},
      {"tetrapod", 1.0 / 3.0, 2.0 / 3.0},
      {"tetrapod", 1.0 / 3.0, 0.5},
      {"tetrapod", 2.0 / 3.0, 1.0 / 3.0},
      {"tetrapod", 2.0 / 3.0, 2.0 / 3.0},
      {"tetrapod", 2.0 / 3.0, 0.5},
      {"wave", waveLag, 0.5},
      {"wave", -waveLag, 0.5},
  };
  std::vector<GaitTemplate> out;
  for (const Form& form : forms) {
    GaitTemplate t{form.gait, std::vector<double>(static_cast<std::size_t>(limbs.size()))};
    for (int i = 0; i < limbs.size(); ++i) {
      const model::Limb& limb = limbs.limb(i);
      const double left = (pairs - 1 - limb.segment) * form.lag;
      t.offsets[static_cast<std::size_t>(i)] =
          wrapPhase(limb.side == Side::left ? left : left + form.contra);
    }
    out.push_back(std::move(t));
  }
  return out;
}

TemplateMatch nearestTemplate(const model::LimbSet& limbs, std::span<const double> phases) {
  TemplateMatch best;
  best.distance = std::numeric_limits<double>::infinity();
  std::vector<double> residual(phases.size());
  for (const GaitTemplate& t : coordinationTemplates(limbs)) {
    for (std::size_t i = 0; i < phases.size(); ++i) residual[i] = phases[i] - t.offsets[i];
    const double shift = circularMean(residual, 1.0);
    if (std::isnan(shift)) continue;
    double sum = 0;
    for (double r : residual) sum += circularDistance(r, shift);
    const double distance = sum / static_cast<double>(phases.size());
    if (distance < best.distance - 1e-12) best = {t.gait, distance};
  }
  if (!std::isfinite(best.distance)) return {};
  return best;
}

std::optional<IpsilateralWave> ipsilateralWave(const model::LimbSet& limbs,
                                               std::span<const double> phases, double tolerance) {
  std::vector<double> lags;
  for (Side side : {Side::left, Side::right}) {
    for (int s = 0; s + 1 < limbs.pairs(); ++s) {
      const auto front = limbs.at(side, s);
      const auto back = limbs.at(side, s + 1);
      if (!front || !back) continue;
      lags.push_back(phases[static_cast<std::size_t>(*front)] -
                     phases[static_cast<std::size_t>(*back)]);
    }
  }
  if (lags.empty()) return std::nullopt;
  const double mean = circularMean(lags, 1.0);
  if (std::isnan(mean)) return std::nullopt;
  IpsilateralWave out{mean, std::nullopt};
  const double centred = centredPhase(mean);
  // The lag summed over the body must stand clear of 0 (many short segments add up), and the
  // per-segment lag clear of half a cycle (alternation has no direction).
  const double bodyLag = std::abs(centred) * (limbs.pairs() - 1);
  if (bodyLag > tolerance && 0.5 - std::abs(centred) > tolerance)
    out.direction = centred > 0 ? "direct" : "retrograde";
  return out;
}

}  // namespace stridemark::analysis
