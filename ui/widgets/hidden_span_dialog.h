#pragma once
// Marks a hidden span for a chosen set of limbs (one limb, several, or all): the frames in which
// those limbs cannot be seen. The main window turns the choice into one undoable edit.
#include <QDialog>
#include <cstdint>
#include <vector>

#include "model/annotation.h"
#include "model/limb_set.h"

class QCheckBox;
class QListWidget;
class QSpinBox;

namespace stridemark::ui {

class HiddenSpanDialog : public QDialog {
  Q_OBJECT
 public:
  // `first`/`last` prefill the frame range; `preselected` is ticked at the start.
  HiddenSpanDialog(const model::LimbSet& limbs, std::int64_t first, std::int64_t last,
                   std::int64_t frameCount, int preselected, QWidget* parent = nullptr);

  // One span per ticked limb, first <= last.
  std::vector<model::HiddenSpan> spans() const;
  // For tests and keyboard users: tick exactly these limbs (empty: none).
  void setChosenLimbs(const std::vector<int>& limbs);
  void setAllLimbs(bool all);
  void setRange(std::int64_t first, std::int64_t last);

 private:
  void syncAllBox();
  void updateOk();

  QListWidget* list_ = nullptr;
  QCheckBox* all_ = nullptr;
  QSpinBox* first_ = nullptr;
  QSpinBox* last_ = nullptr;
  class QPushButton* ok_ = nullptr;
};

}  // namespace stridemark::ui
