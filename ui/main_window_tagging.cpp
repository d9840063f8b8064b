// Tagging: tag keys (caught for the whole window, never while typing), auto-advance, hidden
// spans, and which limb is selected.
#include <QAbstractSpinBox>
#include <QAction>
#include <QApplication>
#include <QComboBox>
#include <QKeyEvent>
#include <QKeySequenceEdit>
#include <QLineEdit>
#include <QPlainTextEdit>
#include <QStatusBar>
#include <QTextEdit>

#include "ui/main_window.h"
#include "ui/widgets/footfall_lanes.h"
#include "ui/widgets/hidden_span_dialog.h"

namespace stridemark::ui {

namespace {

bool isTextInput(QWidget* w) {
  if (!w) return false;
  if (qobject_cast<QLineEdit*>(w) || qobject_cast<QTextEdit*>(w) ||
      qobject_cast<QPlainTextEdit*>(w) || qobject_cast<QAbstractSpinBox*>(w) ||
      qobject_cast<QKeySequenceEdit*>(w))
    return true;
  if (auto* combo = qobject_cast<QComboBox*>(w)) return combo->isEditable();
  return isTextInput(w->focusProxy());
}

}  // namespace

bool MainWindow::tagLimb(int limb, bool opposite) {
  if (limb < 0 || limb >= doc_.annotation().limbs.size()) return false;
  selectLimb(limb);
  const auto added = doc_.tag(limb, playhead_, opposite);
  if (added && action(ActionId::autoAdvance)->isChecked()) seek(playhead_ + autoAdvanceFrames_);
  return added.has_value();
}

void MainWindow::setAutoAdvance(bool on, std::int64_t frames) {
  autoAdvanceFrames_ = std::max<std::int64_t>(1, frames);
  action(ActionId::autoAdvance)->setChecked(on);
}

bool MainWindow::eventFilter(QObject* watched, QEvent* event) {
  if (event->type() != QEvent::KeyPress) return QMainWindow::eventFilter(watched, event);
  auto* widget = qobject_cast<QWidget*>(watched);
  if (!widget || widget->window() != this) return QMainWindow::eventFilter(watched, event);
  auto* key = static_cast<QKeyEvent*>(event);
  const auto mods = key->modifiers() & ~Qt::KeypadModifier;
  // Tag keys never fire while a text field has focus, nor with Ctrl/Alt/Meta held.
  if ((mods & ~Qt::ShiftModifier) != Qt::NoModifier || isTextInput(QApplication::focusWidget()))
    return QMainWindow::eventFilter(watched, event);
  if (const auto limb = keys_.limbFor(key->key())) {
    // While placing seeds a tag key chooses the limb to seed instead of tagging.
    if (key->isAutoRepeat()) return true;
    if (seeding()) {
      setSeedLimb(*limb);
    } else {
      tagLimb(*limb, mods & Qt::ShiftModifier);
    }
    return true;
  }
  return QMainWindow::eventFilter(watched, event);
}

void MainWindow::toggleHiddenSpan() {
  if (!hiddenStart_) {
    hiddenStart_ = playhead_;
    const auto key = action(ActionId::toggleHiddenSpan)->shortcut();
    statusBar()->showMessage(
        tr("Hidden span of %1 starts at frame %2; press %3 again at its "
           "last frame.")
            .arg(QString::fromStdString(doc_.annotation().limbs.label(selectedLimb_)))
            .arg(playhead_)
            .arg(key.isEmpty() ? menuPath(ActionId::toggleHiddenSpan)
                               : key.toString(QKeySequence::NativeText)));
    return;
  }
  doc_.addHiddenSpan({selectedLimb_, *hiddenStart_, playhead_});
  hiddenStart_.reset();
  statusBar()->clearMessage();
}

void MainWindow::hiddenSpanDialog() {
  // A span started with Ctrl+H ends here; otherwise the dialog starts at the playhead.
  const auto first = hiddenStart_.value_or(playhead_);
  HiddenSpanDialog dialog(doc_.annotation().limbs, first, playhead_, frameCount(), selectedLimb_,
                          this);
  if (dialog.exec() != QDialog::Accepted) return;
  hiddenStart_.reset();
  markHiddenSpans(dialog.spans());
}

bool MainWindow::markHiddenSpans(const std::vector<model::HiddenSpan>& spans) {
  if (spans.empty()) return false;
  // Several limbs hidden at once are one edit: one undo step removes them all.
  doc_.undoStack()->beginMacro(spans.size() == 1 ? tr("Hide a limb")
                                                 : tr("Hide %1 limbs").arg(spans.size()));
  for (const auto& span : spans) doc_.addHiddenSpan(span);
  doc_.undoStack()->endMacro();
  statusBar()->clearMessage();
  return true;
}

void MainWindow::selectLimb(int limb) {
  if (limb < 0) return;
  selectedLimb_ = limb;
  lanes_->setSelectedLimb(limb);
  updateStatus();
}

// Tag keys are kept per limb set: a project with other limbs brings its own.
void MainWindow::reloadTagKeysIfLimbsChanged() {
  if (keys_.limbs() == doc_.annotation().limbs) return;
  keys_ = TagKeyMap::load(doc_.annotation().limbs);
  legend_->setKeys(keys_);
  updateTagKeyHints();
}

void MainWindow::updateTagKeyHints() {
  legend_->setFrame(doc_.annotation(), std::max<std::int64_t>(playhead_, 0));
}

}  // namespace stridemark::ui
