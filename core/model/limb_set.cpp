#include "model/limb_set.h"

#include <charconv>

#include "common/error.h"

namespace stridemark::model {

LimbSet::LimbSet(LimbSetKind kind, std::string name, std::vector<Limb> limbs, int pairs,
                 int reference)
    : kind_(kind),
      name_(std::move(name)),
      limbs_(std::move(limbs)),
      pairs_(pairs),
      defaultReference_(reference) {}

LimbSet LimbSet::quadruped() {
  return LimbSet(LimbSetKind::quadruped, "quadruped",
                 {{"LF", Side::left, 0},
                  {"RF", Side::right, 0},
                  {"LH", Side::left, 1},
                  {"RH", Side::right, 1}},
                 2, 2);
}

LimbSet LimbSet::biped() {
  return LimbSet(LimbSetKind::biped, "biped", {{"L", Side::left, 0}, {"R", Side::right, 0}}, 1,
                 0);
}

LimbSet LimbSet::hexapod() {
  std::vector<Limb> limbs;
  for (int s = 0; s < 3; ++s) {
    limbs.push_back({"L" + std::to_string(s + 1), Side::left, s});
    limbs.push_back({"R" + std::to_string(s + 1), Side::right, s});
  }
  return LimbSet(LimbSetKind::hexapod, "hexapod", std::move(limbs), 3, 0);
}

LimbSet LimbSet::multiPair(int pairs) {
  if (pairs < 1 || pairs > 200) {
    throw Error(ErrorCategory::format, "a multi-pair limb set needs 1 to 200 pairs, not " +
                                           std::to_string(pairs));
  }
  std::vector<Limb> limbs;
  for (int s = 0; s < pairs; ++s) limbs.push_back({"L" + std::to_string(s + 1), Side::left, s});
  for (int s = 0; s < pairs; ++s) limbs.push_back({"R" + std::to_string(s + 1), Side::right, s});
  return LimbSet(LimbSetKind::multiPair, "multi-pair-" + std::to_string(pairs), std::move(limbs),
                 pairs, 0);
}

LimbSet LimbSet::fromName(std::string_view name) {
  if (name == "quadruped") return quadruped();
  if (name == "biped") return biped();
  if (name == "hexapod") return hexapod();
  for (std::string_view prefix : {"multi-pair-", "multi-pair:", "multipair:", "multipair-"}) {
    if (name.substr(0, prefix.size()) == prefix) {
      const std::string_view digits = name.substr(prefix.size());
      int pairs = 0;
      const auto [ptr, ec] = std::from_chars(digits.data(), digits.data() + digits.size(), pairs);
      if (ec == std::errc() && ptr == digits.data() + digits.size()) return multiPair(pairs);
    }
  }
  throw Error(ErrorCategory::format,
              "unknown limb set '" + std::string(name) +
                  "': use quadruped, biped, hexapod or multi-pair-N (N pairs, e.g. multi-pair-8)");
}

std::optional<int> LimbSet::indexOf(std::string_view label) const {
  for (std::size_t i = 0; i < limbs_.size(); ++i)
    if (limbs_[i].label == label) return static_cast<int>(i);
  return std::nullopt;
}

std::optional<int> LimbSet::at(Side side, int segment) const {
  for (std::size_t i = 0; i < limbs_.size(); ++i)
    if (limbs_[i].side == side && limbs_[i].segment == segment) return static_cast<int>(i);
  return std::nullopt;
}

int LimbSet::contralateral(int index) const {
  const Limb& l = limb(index);
  return *at(l.side == Side::left ? Side::right : Side::left, l.segment);
}

std::string LimbSet::labelList() const {
  std::string out;
  for (const auto& l : limbs_) {
    if (!out.empty()) out += ", ";
    out += l.label;
  }
  return out;
}

}  // namespace stridemark::model
