// File > Export… in the real main window: saves a modified project first, then opens the
// Export dialog on the saved file with the video's frame count. Common practice, no source.
#include <gtest/gtest.h>
#include <QAction>
#include <QApplication>
#include <QSpinBox>
#include <QTemporaryDir>
#include <QTimer>

#include "tests/ui/test_support.h"
#include "ui/export/export_dialog.h"
#include "ui/main_window.h"

namespace stridemark::ui {
namespace {

TEST(ExportAction, SavesModifiedProjectThenOpensExportDialog) {
  QTemporaryDir dir;
  const auto clip = test::makeTrotClip(dir.path().toStdString(), 1.0);
  MainWindow w;
  w.setRecoveryPolicy(RecoveryPolicy::discard);
  w.setBareClipPolicy(BareClipPolicy::useDefaults);
  w.setAskBeforeDiscard(false);
  ASSERT_TRUE(w.openVideo(QString::fromStdString(clip.video.string())));
  const QString projectPath = dir.filePath(QStringLiteral("trial.stridemark"));
  ASSERT_TRUE(w.saveProjectAs(projectPath));

  QAction* action = w.exportAction();
  ASSERT_NE(action, nullptr);
  EXPECT_TRUE(action->isEnabled());
  EXPECT_EQ(action->shortcut(), QKeySequence(QStringLiteral("Ctrl+E")));

  ASSERT_TRUE(w.document()->tag(0, 5).has_value());
  ASSERT_TRUE(w.document()->isModified());

  // The dialog is modal: inspect and close it from the event loop it runs.
  bool sawDialog = false;
  std::int64_t clipTo = -1;
  QTimer::singleShot(0, [&] {
    auto* d = qobject_cast<exports::ExportDialog*>(QApplication::activeModalWidget());
    if (!d) return;
    sawDialog = true;
    for (auto* spin : d->findChildren<QSpinBox*>())
      if (spin->accessibleName() == QStringLiteral("Last frame of the clip"))
        clipTo = spin->maximum();
    d->reject();
  });
  action->trigger();
  EXPECT_TRUE(sawDialog);
  EXPECT_FALSE(w.document()->isModified());  // saved before the export read the file
  EXPECT_EQ(w.document()->projectPath(), projectPath);
  EXPECT_EQ(clipTo, w.frameCount() - 1);  // the clip range is bounded by the video's frames
  EXPECT_GT(clipTo, 10);
}

}  // namespace
}  // namespace stridemark::ui
