#pragma once
// Tag keys: one key per limb, laid out like the animal seen from above (front pair on the
// upper keyboard row, left limbs on the left). Rebindable; stored in QSettings per limb set.
#include <QDialog>
#include <QWidget>
#include <cstdint>
#include <optional>
#include <vector>

#include "model/annotation.h"
#include "model/limb_set.h"

class QKeySequenceEdit;
class QLabel;

namespace stridemark::ui {

class TagKeyMap {
 public:
  TagKeyMap() = default;
  explicit TagKeyMap(const model::LimbSet& limbs);  // our defaults

  static TagKeyMap load(const model::LimbSet& limbs);  // QSettings, else defaults
  void save() const;

  const model::LimbSet& limbs() const { return limbs_; }
  int keyFor(int limb) const { return keys_.at(static_cast<std::size_t>(limb)); }
  // Returns false (and changes nothing) when the key is taken by another limb or reserved.
  bool bind(int limb, int key);
  std::optional<int> limbFor(int key) const;
  static bool isReserved(int key);  // keys the transport needs (arrows, space, ...)
  static QString keyText(int key);

 private:
  model::LimbSet limbs_ = model::LimbSet::quadruped();
  std::vector<int> keys_;
};

// What a plain press of a limb's tag key records at the playhead (Annotation::inStance):
// touchdown while the limb is in swing, lift-off in stance, nothing where it is tagged already.
enum class NextTag { touchdown, liftoff, taggedHere };

// The legend: key caps arranged like the limbs, coloured like the lanes, each saying what its
// key records next at the playhead, so a clip that starts mid-stance is tagged right at once.
class TagKeyLegend : public QWidget {
  Q_OBJECT
 public:
  explicit TagKeyLegend(QWidget* parent = nullptr);
  void setKeys(const TagKeyMap& keys);
  // The tags and the playhead the caps describe; repaints when what a key records changes.
  void setFrame(const model::Annotation& annotation, std::int64_t frame);
  NextTag next(int limb) const { return next_.at(static_cast<std::size_t>(limb)).kind; }
  // No tag of the limb before the playhead: Shift+key may be what is wanted (clip starts in
  // stance).
  bool firstTag(int limb) const { return next_.at(static_cast<std::size_t>(limb)).first; }
  static QString nextText(NextTag next);  // "↓ touchdown"
  // While placing foot seeds a press chooses the limb to seed: the caps say so.
  void setSeeding(bool on);
  QSize sizeHint() const override;

 protected:
  void paintEvent(QPaintEvent* event) override;

 private:
  struct Next {
    NextTag kind = NextTag::touchdown;
    bool first = true;
    friend bool operator==(const Next&, const Next&) = default;
  };
  QString capNote(int limb) const;
  QSize capSize() const;
  void describe();
  TagKeyMap keys_;
  std::vector<Next> next_;
  std::int64_t frame_ = 0;
  bool seeding_ = false;
};

class TagKeyDialog : public QDialog {
  Q_OBJECT
 public:
  TagKeyDialog(const TagKeyMap& keys, QWidget* parent = nullptr);
  TagKeyMap keys() const { return keys_; }
  void accept() override;

 private:
  TagKeyMap keys_;
  std::vector<QKeySequenceEdit*> edits_;
  QLabel* error_;
};

}  // namespace stridemark::ui
