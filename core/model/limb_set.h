#pragma once
// Limb sets: which limbs an animal has, their labels, sides and girdles.
#include <optional>
#include <string>
#include <string_view>
#include <vector>

namespace stridemark::model {

enum class LimbSetKind { quadruped, biped, hexapod, multiPair };
enum class Side { left, right };

struct Limb {
  std::string label;  // "LF", "L", "L2"
  Side side;
  int segment;  // 0 = front-most pair; quadruped: 0 = fore, 1 = hind; biped: 0
};

class LimbSet {
 public:
  static LimbSet quadruped();
  static LimbSet biped();
  static LimbSet hexapod();
  static LimbSet multiPair(int pairs);  // L1..LN, R1..RN (front to back); pairs >= 1
  // "quadruped", "biped", "hexapod", "multi-pair-N" (also "multipair:N", "multi-pair:N").
  // Throws stridemark::Error(format) naming the accepted forms.
  static LimbSet fromName(std::string_view name);

  LimbSetKind kind() const { return kind_; }
  const std::string& name() const { return name_; }  // canonical: "multi-pair-5"
  int size() const { return static_cast<int>(limbs_.size()); }
  int pairs() const { return pairs_; }
  const Limb& limb(int index) const { return limbs_.at(static_cast<std::size_t>(index)); }
  const std::string& label(int index) const { return limb(index).label; }
  const std::vector<Limb>& limbs() const { return limbs_; }
  std::optional<int> indexOf(std::string_view label) const;  // case-sensitive
  int defaultReference() const { return defaultReference_; }
  // The limb on the other side of the same segment (LF <-> RF).
  int contralateral(int index) const;
  // Index of the limb with this side and segment, if the set has one.
  std::optional<int> at(Side side, int segment) const;
  std::string labelList() const;  // "LF, RF, LH, RH" for error messages

  friend bool operator==(const LimbSet& a, const LimbSet& b) { return a.name_ == b.name_; }

 private:
  LimbSet(LimbSetKind kind, std::string name, std::vector<Limb> limbs, int pairs, int reference);
  LimbSetKind kind_;
  std::string name_;
  std::vector<Limb> limbs_;
  int pairs_;
  int defaultReference_;
};

}  // namespace stridemark::model
