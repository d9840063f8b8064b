#include "analysis/hildebrand.h"

#include <cmath>

#include "analysis/circular.h"

namespace stridemark::analysis {
namespace {
constexpr double kEdgeTolerance = 1e-9;  // phases from integer frames land exactly on edges
}

const std::vector<BandEdge>& defaultBandTable() {
  static const std::vector<BandEdge> table = {
      {0.0625, "lateral-sequence lateral couplets"},   {0.1875, "lateral-sequence single-foot"},
      {0.3125, "lateral-sequence diagonal couplets"},  {0.4375, "trot"},
      {0.5625, "diagonal-sequence diagonal couplets"}, {0.6875, "diagonal-sequence single-foot"},
      {0.8125, "diagonal-sequence lateral couplets"},  {0.9375, "pace"},
  };
  return table;
}

std::string hildebrandBand(double limbPhase, const std::vector<BandEdge>& table) {
  if (table.empty()) return {};
  const double phase = wrapPhase(limbPhase);
  const BandEdge* band = &table.back();  // wraps round below the first edge
  for (const BandEdge& edge : table)
    if (phase + kEdgeTolerance >= edge.from) band = &edge;
  return band->name;
}

std::optional<std::string> cartmillQuadrant(double limbPhase) {
  const double phase = wrapPhase(limbPhase);
  static const char* const names[] = {"LSLC", "LSDC", "DSDC", "DSLC"};
  const double scaled = phase * 4.0;
  const double nearestEdge = std::round(scaled);
  if (std::abs(scaled - nearestEdge) < kEdgeTolerance) return std::nullopt;
  return std::string(names[static_cast<int>(std::floor(scaled))]);
}

std::optional<std::string> footfallSequence(double limbPhase) {
  const double phase = wrapPhase(limbPhase);
  if (phase < kEdgeTolerance || std::abs(phase - 0.5) < kEdgeTolerance ||
      phase > 1.0 - kEdgeTolerance)
    return std::nullopt;
  return phase < 0.5 ? "lateral" : "diagonal";
}

}  // namespace stridemark::analysis
