#pragma once
// Hildebrand's symmetrical-gait measures (docs/methods.md §2): the limb-phase band (scheme B, eight
// 12.5 %-wide bands whose boundaries live in ONE table), the Cartmill et al. 2002 quadrant
// (scheme A) and the footfall sequence. The symmetry gate is a gait rule (gait_rules.h).
#include <optional>
#include <string>
#include <vector>

namespace stridemark::analysis {

struct BandEdge {
  double from = 0;  // limb phase (cycles) where the band starts; it runs to the next edge
  std::string name;
};

// Scheme B boundaries (team decision, from memory, configurable): the last band wraps past 1.
const std::vector<BandEdge>& defaultBandTable();

// Band of a limb phase (any real value; wrapped into [0, 1)).
std::string hildebrandBand(double limbPhase,
                           const std::vector<BandEdge>& table = defaultBandTable());

// "LSLC", "LSDC", "DSDC", "DSLC"; null on a quadrant boundary (0, 0.25, 0.5, 0.75).
std::optional<std::string> cartmillQuadrant(double limbPhase);

// "lateral" when the forefoot follows its ipsilateral hindfoot within half a stride, "diagonal"
// when later; null at exactly 0 or 0.5 (pace, trot: no sequence).
std::optional<std::string> footfallSequence(double limbPhase);

}  // namespace stridemark::analysis
