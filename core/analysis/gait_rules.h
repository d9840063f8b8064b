#pragma once
// Every rule that gives a stride its gait label lives here (docs/methods.md §2.3, §3.3, §4):
// quadruped symmetrical and asymmetrical gaits with the lead, biped walk/run/hop/skip, and
// nearest-template labels with the ipsilateral wave for hexapods and multi-pair sets. The
// measurements these rules read (phases, duty factors) are made in strides.cpp.
#include <optional>
#include <span>
#include <string>
#include <vector>

#include "analysis/report.h"
#include "model/limb_set.h"

namespace stridemark::analysis {

// Tolerances of the rules, in cycles of the stride.
struct GaitTolerances {
  double symmetry = 0.10;  // |contralateral phase - 0.5| allowed per girdle (§2.3)
  double tau = 0.05;       // "simultaneous" in §3.3, already raised to the minimum frames
  double wave = 0.05;      // ipsilateral wave direction threshold (§4.3)
  double margin = 0;       // half a frame, in cycles of the stride (§3.3 step 9)
};

// Schmitt et al. 2006 gate: both girdles' contralateral phases within `tolerance` of 0.5.
bool isSymmetrical(double hindContralateral, double foreContralateral, double tolerance = 0.10);

// The limbs a quadruped's rules name.
struct QuadrupedLimbs {
  int lf = 0, rf = 1, lh = 2, rh = 3;
};

// Labels a complete quadruped stride (docs/methods.md §3.3) from its phases (s.phase, all in
// the reference window), its Hildebrand point (s.limbPhase, s.hindDutyFactor), its suspension
// (s.aerial) and the mean duty factor of the four limbs: symmetrical gaits by §2, an uneven
// walking stride as an asymmetrical walk, running asymmetrical strides by §3.3. Fills gait,
// band, quadrant, sequence, symmetry, leads, the contralateral phases and the lags.
void labelQuadrupedStride(StrideRecord& s, const QuadrupedLimbs& limbs, double meanDutyFactor,
                          const GaitTolerances& tol);

// Labels a complete biped stride from the right foot's phase after the left (reference window),
// the mean duty factor of the two feet and its suspension: walk or run when symmetrical, an
// uneven walk as an asymmetrical walk, then hop (feet together) or skip.
void labelBipedStride(StrideRecord& s, double rightRelLeft, double meanDutyFactor,
                      const GaitTolerances& tol);

// Labels a hexapod or multi-pair stride by the nearest coordination template, with the
// ipsilateral wave; needs every limb's phase.
void labelMultiPairStride(StrideRecord& s, const model::LimbSet& limbs, const GaitTolerances& tol);

// Symmetrical quadruped stride: band trot -> trot, band pace -> pace, else walk (hind DF >= 0.5)
// or amble.
std::string symmetricalQuadrupedGait(const std::string& band, double hindDutyFactor);

// Touchdown phases of one asymmetrical stride, in cycles of a common stride.
struct QuadrupedPhases {
  double lf = 0, rf = 0, lh = 0, rh = 0;
};

struct AsymmetricalGait {
  std::string gait;                 // pronk, bound, half-bound, canter, transverse/rotary gallop
  std::optional<std::string> lead;  // leading forelimb "left"/"right" (second fore down)
  std::optional<std::string> hindLead;  // leading hindlimb; null when the hind pair lands together
  double foreLag = 0, hindLag = 0, pairLag = 0;  // FL, HL, PL of docs/methods.md §3.2, cycles
};

// The operational classifier of docs/methods.md §3.3 (steps 3-7) for running strides; `tau` in
// cycles of the stride, margin included. A pair within tau has no lead.
AsymmetricalGait classifyAsymmetrical(const QuadrupedPhases& phases, double tau);

// Biped: hop when the feet land together (within tau), walk/run when the right foot lands half a
// stride after the left (within symmetryTolerance; walk when mean DF >= 0.5), else skip.
std::string bipedGait(double rightPhaseRelLeft, double meanDutyFactor, bool aerial, double tau,
                      double symmetryTolerance);

// Template touchdown offsets per limb (limb-set order) for hexapods and multi-pair sets.
struct GaitTemplate {
  std::string gait;  // tripod, tetrapod, wave
  std::vector<double> offsets;
};
std::vector<GaitTemplate> coordinationTemplates(const model::LimbSet& limbs);

struct TemplateMatch {
  std::string gait = "unclassified";
  double distance = 0;  // mean circular distance (cycles) after the best common shift
};
// Nearest template by circular distance; phases per limb in limb-set order.
TemplateMatch nearestTemplate(const model::LimbSet& limbs, std::span<const double> phases);

struct IpsilateralWave {
  double lag = 0;                        // anterior minus posterior neighbour, cycles [0, 1)
  std::optional<std::string> direction;  // "direct" (back to front), "retrograde"
};
// Circular mean of the lag between neighbouring legs of a side (docs/methods.md §4.3). Null when
// the set has fewer than two segments or the lags cancel out. The direction is left out when the
// lag summed over the body is within `tolerance` of 0, or the lag is within it of half a cycle.
std::optional<IpsilateralWave> ipsilateralWave(const model::LimbSet& limbs,
                                               std::span<const double> phases,
                                               double tolerance = 0.05);

}  // namespace stridemark::analysis
