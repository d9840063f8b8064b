#include "synth/gait.h"

#include <charconv>
#include <cmath>
#include <map>

#include "common/error.h"

namespace stridemark::synth {
namespace {

using model::LimbSet;
using model::LimbSetKind;

struct PresetRow {
  const char* name;
  const char* label;  // gait label scoring should give
  double duty;
  double hz;
  double reach;
  std::vector<std::pair<const char*, double>> phases;  // unnamed limbs: 0
};

// Quadruped offsets are touchdown phases relative to LH (Hildebrand's reference).
// Source: docs/methods.md §2.5 (walk 0.25), §2.2 (trot 0.5, pace 0), §3.1 footfall orders
// (transverse LH RH LF RF; rotary with opposite orders in the two pairs; canter: trailing hind,
// diagonal pair together, lead fore), §3.3 classifier rules for half-bound / bound / pronk.
const std::vector<PresetRow>& quadrupedRows() {
  static const std::vector<PresetRow> rows = {
      {"walk", "walk", 0.65, 1.2, 0.7, {{"LF", 0.25}, {"RH", 0.5}, {"RF", 0.75}}},
      {"amble", "amble", 0.45, 1.8, 0.7, {{"LF", 0.25}, {"RH", 0.5}, {"RF", 0.75}}},
      {"trot", "trot", 0.40, 2.0, 0.7, {{"LF", 0.5}, {"RH", 0.5}, {"RF", 0.0}}},
      {"pace", "pace", 0.45, 1.8, 0.7, {{"LF", 0.0}, {"RH", 0.5}, {"RF", 0.5}}},
      {"canter", "canter", 0.35, 2.0, 0.8, {{"RH", 0.25}, {"LF", 0.25}, {"RF", 0.5}}},
      {"transverse-gallop",
       "transverse gallop",
       0.25,
       2.3,
       0.9,
       {{"RH", 0.1}, {"LF", 0.5}, {"RF", 0.6}}},
      {"rotary-gallop", "rotary gallop", 0.25, 2.5, 0.9, {{"RH", 0.1}, {"RF", 0.5}, {"LF", 0.6}}},
      {"half-bound", "half-bound", 0.30, 2.5, 0.8, {{"RH", 0.0}, {"LF", 0.5}, {"RF", 0.6}}},
      {"bound", "bound", 0.30, 2.6, 0.8, {{"RH", 0.0}, {"LF", 0.5}, {"RF", 0.5}}},
      {"pronk", "pronk", 0.30, 2.0, 0.5, {{"RH", 0.0}, {"LF", 0.0}, {"RF", 0.0}}},
  };
  return rows;
}

// Source: docs/methods.md §4.1 (walk DF > 0.5, run < 0.5, hop in phase, skip asymmetrical).
const std::vector<PresetRow>& bipedRows() {
  static const std::vector<PresetRow> rows = {
      {"walk", "walk", 0.60, 0.9, 0.7, {{"R", 0.5}}},
      {"run", "run", 0.35, 1.4, 0.8, {{"R", 0.5}}},
      {"hop", "hop", 0.35, 1.6, 0.6, {{"R", 0.0}}},
      {"skip", "skip", 0.40, 1.3, 0.7, {{"R", 0.25}}},
  };
  return rows;
}

// Source: docs/methods.md §4.2 offsets (L3 = 0 based), shifted so that L1 (the reference) is 0.
const std::vector<PresetRow>& hexapodRows() {
  static const std::vector<PresetRow> rows = {
      {"tripod",
       "tripod",
       0.50,
       6.0,
       0.8,
       {{"R1", 0.5}, {"L2", 0.5}, {"R2", 0.0}, {"L3", 0.0}, {"R3", 0.5}}},
      {"tetrapod",
       "tetrapod",
       2.0 / 3.0,
       4.0,
       0.7,
       {{"R1", 1.0 / 3.0}, {"L2", 2.0 / 3.0}, {"R2", 0.0}, {"L3", 1.0 / 3.0}, {"R3", 2.0 / 3.0}}},
      {"wave",
       "wave",
       5.0 / 6.0,
       2.5,
       0.6,
       {{"R1", 3.0 / 6.0},
        {"L2", 5.0 / 6.0},
        {"R2", 2.0 / 6.0},
        {"L3", 4.0 / 6.0},
        {"R3", 1.0 / 6.0}}},
  };
  return rows;
}

GaitPattern fromRow(const LimbSet& limbs, const PresetRow& row) {
  GaitPattern p;
  p.name = row.name;
  p.expectedLabel = row.label;
  p.dutyFactor.assign(static_cast<std::size_t>(limbs.size()), row.duty);
  p.phase.assign(static_cast<std::size_t>(limbs.size()), 0.0);
  for (const auto& [label, phase] : row.phases)
    p.phase[static_cast<std::size_t>(*limbs.indexOf(label))] = phase;
  p.strideHz = row.hz;
  p.stanceReach = row.reach;
  return p;
}

// Multi-pair metachronal wave generalising the hexapod wave: each segment touches down 1/(2N)
// of a cycle after the one behind it (a direct wave, back to front), the right side half a
// cycle after the left. Source: docs/methods.md §4.2 wave offsets (N = 3) and §4.3 wave direction.
GaitPattern metachronalWave(const LimbSet& limbs) {
  const int n = limbs.pairs();
  GaitPattern p;
  p.name = "wave";
  p.expectedLabel = "wave";
  p.dutyFactor.assign(static_cast<std::size_t>(limbs.size()), n == 3 ? 5.0 / 6.0 : 0.75);
  p.phase.assign(static_cast<std::size_t>(limbs.size()), 0.0);
  const double lag = 1.0 / (2.0 * n);
  for (int i = 0; i < limbs.size(); ++i) {
    const auto& limb = limbs.limb(i);
    // Segment 0 (front) is the reference; segments behind it touch down earlier.
    double phase = -lag * limb.segment + (limb.side == model::Side::right ? 0.5 : 0.0);
    phase -= std::floor(phase);
    p.phase[static_cast<std::size_t>(i)] = phase;
  }
  p.strideHz = 2.0;
  p.stanceReach = 0.6;
  return p;
}

const std::vector<PresetRow>* rowsFor(const LimbSet& limbs) {
  switch (limbs.kind()) {
    case LimbSetKind::quadruped:
      return &quadrupedRows();
    case LimbSetKind::biped:
      return &bipedRows();
    case LimbSetKind::hexapod:
      return &hexapodRows();
    case LimbSetKind::multiPair:
      return nullptr;
  }
  return nullptr;
}

[[noreturn]] void bad(const std::string& text, const std::string& what) {
  throw Error(ErrorCategory::format, "gait '" + text + "': " + what);
}

double parseNumber(std::string_view text, std::string_view whole, std::string_view what) {
  double value = 0;
  const auto* end = text.data() + text.size();
  const auto [ptr, ec] = std::from_chars(text.data(), end, value);
  if (ec != std::errc() || ptr != end || !std::isfinite(value))
    bad(std::string(whole), std::string(what) + " '" + std::string(text) + "' is not a number");
  return value;
}

std::vector<std::string_view> split(std::string_view text, char sep) {
  std::vector<std::string_view> parts;
  std::size_t start = 0;
  while (true) {
    const auto pos = text.find(sep, start);
    parts.push_back(text.substr(start, pos == std::string_view::npos ? pos : pos - start));
    if (pos == std::string_view::npos) return parts;
    start = pos + 1;
  }
}

GaitPattern parseCustom(const LimbSet& limbs, std::string_view name, std::string_view whole) {
  GaitPattern p;
  p.name = "custom";
  p.dutyFactor.assign(static_cast<std::size_t>(limbs.size()), 0.6);
  p.phase.assign(static_cast<std::size_t>(limbs.size()), 0.0);
  p.strideHz = 1.5;
  p.stanceReach = 0.7;
  const auto parts = split(name, ',');
  for (std::size_t i = 1; i < parts.size(); ++i) {
    const auto eq = parts[i].find('=');
    if (eq == std::string_view::npos)
      bad(std::string(whole),
          "'" + std::string(parts[i]) + "' should be df=X, df.LIMB=X or LIMB=PHASE");
    const auto key = parts[i].substr(0, eq);
    const double value = parseNumber(parts[i].substr(eq + 1), whole, "value");
    if (key == "df") {
      p.dutyFactor.assign(p.dutyFactor.size(), value);
      continue;
    }
    const bool dutyKey = key.starts_with("df.");
    const auto label = dutyKey ? key.substr(3) : key;
    const auto index = limbs.indexOf(label);
    if (!index)
      bad(std::string(whole), "no limb '" + std::string(label) + "' in the " + limbs.name() +
                                  " limb set (" + limbs.labelList() + ")");
    auto& target = dutyKey ? p.dutyFactor : p.phase;
    target[static_cast<std::size_t>(*index)] = value;
  }
  return p;
}

}  // namespace

std::vector<std::string> presetNames(const LimbSet& limbs) {
  const auto* rows = rowsFor(limbs);
  if (!rows) return {"wave"};
  std::vector<std::string> names;
  for (const auto& row : *rows) names.emplace_back(row.name);
  return names;
}

GaitPattern presetGait(const LimbSet& limbs, std::string_view name) {
  if (const auto* rows = rowsFor(limbs)) {
    for (const auto& row : *rows)
      if (name == row.name) return fromRow(limbs, row);
  } else if (name == "wave" || name == "metachronal-wave") {
    return metachronalWave(limbs);
  }
  std::string list;
  for (const auto& n : presetNames(limbs)) list += (list.empty() ? "" : ", ") + n;
  throw Error(ErrorCategory::format, "no gait preset '" + std::string(name) + "' for the " +
                                         limbs.name() + " limb set. Use one of: " + list +
                                         ", or custom,df=X,LIMB=PHASE,...");
}

void validatePattern(const LimbSet& limbs, const GaitPattern& p) {
  const auto n = static_cast<std::size_t>(limbs.size());
  if (p.dutyFactor.size() != n || p.phase.size() != n)
    bad(p.name, "needs one duty factor and one phase per limb (" + limbs.labelList() + ")");
  for (std::size_t i = 0; i < n; ++i) {
    const auto& label = limbs.label(static_cast<int>(i));
    if (!(p.dutyFactor[i] >= 0.05 && p.dutyFactor[i] <= 0.95))
      bad(p.name, "duty factor of " + label + " must be between 0.05 and 0.95");
    if (!(p.phase[i] >= 0.0 && p.phase[i] < 1.0))
      bad(p.name, "phase of " + label + " must be in [0, 1)");
  }
  if (!(p.strideHz > 0.05 && p.strideHz <= 50.0))
    bad(p.name, "stride frequency must be between 0.05 and 50 Hz");
}

GaitSegment parseGaitSegment(const LimbSet& limbs, std::string_view text) {
  GaitSegment segment;
  std::string_view rest = text;
  std::optional<double> hz;
  if (const auto at = rest.find('@'); at != std::string_view::npos) {
    hz = parseNumber(rest.substr(at + 1), text, "stride frequency");
    rest = rest.substr(0, at);
  }
  std::optional<double> seconds;
  if (const auto colon = rest.find(':'); colon != std::string_view::npos) {
    seconds = parseNumber(rest.substr(colon + 1), text, "duration");
    rest = rest.substr(0, colon);
  }
  if (rest.empty()) bad(std::string(text), "expected NAME[:SECONDS][@HZ]");
  segment.pattern =
      rest.starts_with("custom") ? parseCustom(limbs, rest, text) : presetGait(limbs, rest);
  if (hz) segment.pattern.strideHz = *hz;
  if (seconds) segment.seconds = *seconds;
  if (!(segment.seconds > 0 && segment.seconds <= 3600))
    bad(std::string(text), "duration must be between 0 and 3600 seconds");
  // Phases are relative to the reference limb: shift so that it is 0.
  const double ref = segment.pattern.phase[static_cast<std::size_t>(limbs.defaultReference())];
  for (auto& phase : segment.pattern.phase) {
    phase -= ref;
    phase -= std::floor(phase);
  }
  validatePattern(limbs, segment.pattern);
  return segment;
}

}  // namespace stridemark::synth
