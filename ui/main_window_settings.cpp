// Settings and the trial card: palette, tag keys, key bindings, the frame cache budget.
#include <QInputDialog>
#include <QSettings>
#include <algorithm>

#include "ui/keys/key_bindings_dialog.h"
#include "ui/main_window.h"
#include "ui/session/guarded.h"
#include "ui/session/palettes.h"
#include "ui/widgets/trial_card_dialog.h"

namespace stridemark::ui {

void MainWindow::setTheme(bool dark) {
  applyTheme(dark ? Theme::dark : Theme::light);
  QSettings().setValue(QStringLiteral("theme"), themeName(dark ? Theme::dark : Theme::light));
}

void MainWindow::editTrialCard() {
  const bool locked = doc_.limbSetLocked();
  TrialCardDialog dialog(doc_.project(), locked, this);
  dialog.setCurrentFrame(playhead_);
  if (dialog.exec() != QDialog::Accepted) return;
  runGuarded(this, tr("Trial card"), [&] {
    doc_.undoStack()->beginMacro(tr("Edit trial card"));
    if (!locked) doc_.setLimbSet(dialog.limbSet());
    doc_.setCaptureRate(dialog.captureRate());
    doc_.setReferenceLimb(dialog.referenceLimb());
    doc_.setTrialCard(dialog.trialCard());
    doc_.undoStack()->endMacro();
  });
  reloadTagKeysIfLimbsChanged();
}

void MainWindow::editTagKeys() {
  TagKeyDialog dialog(keys_, this);
  if (dialog.exec() != QDialog::Accepted) return;
  keys_ = dialog.keys();
  keys_.save();
  legend_->setKeys(keys_);
  updateTagKeyHints();
}

void MainWindow::editKeyBindings() {
  KeyBindingsDialog dialog(bindings_, keys_, this);
  if (dialog.exec() != QDialog::Accepted) return;
  bindings_ = dialog.bindings();
  bindings_.save();
  applyKeyBindings();
}

void MainWindow::editFrameCacheBudget() {
  constexpr int kLeastMiB = 64, kMostMiB = 64 * 1024;
  const int current = static_cast<int>(
      std::clamp<std::size_t>(videoOptions_.budgetBytes >> 20, kLeastMiB, kMostMiB));
  bool ok = false;
  const int mib = QInputDialog::getInt(
      this, tr("Frame cache"),
      tr("Memory for decoded frames (MiB).\nMore keeps stepping backwards smooth on clips\n"
         "with far-apart keyframes; less leaves memory to other programs."),
      current, kLeastMiB, kMostMiB, 64, &ok);
  if (ok) setFrameCacheBudget(static_cast<std::size_t>(mib) << 20);
}

void MainWindow::setFrameCacheBudget(std::size_t bytes) {
  videoOptions_.budgetBytes = bytes;
  QSettings().setValue(QStringLiteral("video/cacheBudgetMiB"),
                       static_cast<qulonglong>(bytes >> 20));
  if (!video_) return;
  video_->setBudget(bytes);
  // As at open: a budget too small for the clip's keyframe spacing gets the stepping proxy.
  if (video_->startProxyIfAdvised() && video_->proxyBuilding()) showProxyProgress(true);
  updateStatus();
}

}  // namespace stridemark::ui
