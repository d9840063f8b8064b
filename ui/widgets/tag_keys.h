#pragma once
// Tag keys: one key per limb, laid out like the animal seen from above (front pair on the
// upper keyboard row, left limbs on the left). Rebindable; stored in QSettings per limb set.
#include <QDialog>
#include <QWidget>
#include <optional>
#include <vector>

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

// The legend: key caps arranged like the limbs, coloured like the lanes.
class TagKeyLegend : public QWidget {
  Q_OBJECT
 public:
  explicit TagKeyLegend(QWidget* parent = nullptr);
  void setKeys(const TagKeyMap& keys);
  QSize sizeHint() const override;

 protected:
  void paintEvent(QPaintEvent* event) override;

 private:
  TagKeyMap keys_;
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
