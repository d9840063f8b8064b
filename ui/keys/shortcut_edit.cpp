#include "ui/keys/shortcut_edit.h"

#include <QKeyEvent>

namespace stridemark::ui {

namespace {

bool isPlain(const QKeyEvent* key, Qt::Key which) {
  return key->key() == which && (key->modifiers() & ~Qt::KeypadModifier) == Qt::NoModifier;
}

}  // namespace

ShortcutEdit::ShortcutEdit(const QKeySequence& keys, QWidget* parent)
    : QKeySequenceEdit(keys, parent) {
  setClearButtonEnabled(true);
}

bool ShortcutEdit::event(QEvent* event) {
  // QKeySequenceEdit records Tab as a key; here it moves the focus like in any other form.
  if (event->type() == QEvent::KeyPress) {
    const auto* key = static_cast<QKeyEvent*>(event);
    if (key->key() == Qt::Key_Backtab ||
        (key->key() == Qt::Key_Tab && (key->modifiers() & Qt::ShiftModifier)))
      return focusNextPrevChild(false);
    if (isPlain(key, Qt::Key_Tab)) return focusNextPrevChild(true);
  }
  return QKeySequenceEdit::event(event);
}

void ShortcutEdit::keyPressEvent(QKeyEvent* event) {
  if (isPlain(event, Qt::Key_Escape)) {
    event->ignore();  // on to the dialog, which cancels
    return;
  }
  QKeySequenceEdit::keyPressEvent(event);
}

}  // namespace stridemark::ui
