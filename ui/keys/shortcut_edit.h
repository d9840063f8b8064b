#pragma once
// A key-sequence field that leaves Escape to its dialog (cancel) and Tab to focus moves,
// instead of recording them as keys.
#include <QKeySequenceEdit>

namespace stridemark::ui {

class ShortcutEdit : public QKeySequenceEdit {
  Q_OBJECT
 public:
  explicit ShortcutEdit(const QKeySequence& keys, QWidget* parent = nullptr);

 protected:
  bool event(QEvent* event) override;
  void keyPressEvent(QKeyEvent* event) override;
};

}  // namespace stridemark::ui
