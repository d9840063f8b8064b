// Hidden spans in the main window: the limb picker (one, several or all limbs as one undo
// step) and selecting a span in the Footfall lanes by clicking inside it, then Delete.
// Common practice, no source: a hidden span is an ordinary edit, so undo and redo restore it.
#include <gtest/gtest.h>
#include <QApplication>
#include <QDialogButtonBox>
#include <QDir>
#include <QPushButton>
#include <QTemporaryDir>
#include <QTest>
#include <QTimer>

#include "tests/ui/test_support.h"
#include "ui/main_window.h"
#include "ui/widgets/footfall_lanes.h"
#include "ui/widgets/hidden_span_dialog.h"

namespace stridemark::ui {
namespace {

using model::HiddenSpan;

void press(QWidget* target, int key, Qt::KeyboardModifiers mods = Qt::NoModifier) {
  QTest::keyClick(target->window()->windowHandle(), static_cast<Qt::Key>(key), mods);
}

// Answers the next modal HiddenSpanDialog with `choose`, then OK.
void answerPicker(const std::function<void(HiddenSpanDialog&)>& choose, bool* seen) {
  QTimer::singleShot(0, [choose, seen] {
    auto* dialog = qobject_cast<HiddenSpanDialog*>(QApplication::activeModalWidget());
    if (!dialog) {
      answerPicker(choose, seen);  // not shown yet: try again on the next turn
      return;
    }
    *seen = true;
    choose(*dialog);
    dialog->accept();
  });
}

struct Desk {
  explicit Desk(const test::SampleClip& clip) {
    test::showUnattended(w, 1200, 800);
    EXPECT_TRUE(w.openVideo(QString::fromStdString(clip.video.string())));
    // Window shortcuts (Ctrl+H, Delete) need the window to be the active one.
    w.activateWindow();
    EXPECT_TRUE(QTest::qWaitForWindowActive(&w));
    w.lanes()->setFocus();
  }
  const std::vector<HiddenSpan>& hidden() { return w.document()->annotation().hidden; }
  MainWindow w;
};

TEST(HiddenSpans, LimbPickerMarksAllLimbsAsOneUndoStep) {
  QTemporaryDir dir;
  const auto clip = test::makeTrotClip(dir.path().toStdString(), 1.0);
  Desk desk(clip);
  auto& w = desk.w;
  const int limbs = w.document()->annotation().limbs.size();

  w.seek(20);
  press(w.lanes(), Qt::Key_H, Qt::ControlModifier);  // start a span at 20
  w.seek(45);
  bool seen = false;
  std::vector<HiddenSpan> offered;
  answerPicker(
      [&](HiddenSpanDialog& d) {
        offered = d.spans();  // what the dialog proposes before the user changes anything
        d.setAllLimbs(true);
      },
      &seen);
  press(w.lanes(), Qt::Key_H, Qt::ControlModifier | Qt::ShiftModifier);
  ASSERT_TRUE(seen) << "Ctrl+Shift+H opens the limb picker";
  // Prefilled with the span started by Ctrl+H, for the selected limb.
  EXPECT_EQ(offered, (std::vector<HiddenSpan>{{0, 20, 45}}));
  ASSERT_EQ(static_cast<int>(desk.hidden().size()), limbs);
  for (int limb = 0; limb < limbs; ++limb)
    EXPECT_EQ(desk.hidden()[static_cast<std::size_t>(limb)], (HiddenSpan{limb, 20, 45}));

  w.document()->undoStack()->undo();  // one step takes all of them back
  EXPECT_TRUE(desk.hidden().empty());
  w.document()->undoStack()->redo();
  EXPECT_EQ(static_cast<int>(desk.hidden().size()), limbs);
  w.document()->undoStack()->undo();

  // Two chosen limbs, range typed in the dialog (ends reversed on purpose).
  w.activateWindow();  // the closed dialog handed activation back
  ASSERT_TRUE(QTest::qWaitForWindowActive(&w));
  seen = false;
  answerPicker(
      [](HiddenSpanDialog& d) {
        d.setChosenLimbs({1, 3});
        d.setRange(70, 55);
      },
      &seen);
  press(w.lanes(), Qt::Key_H, Qt::ControlModifier | Qt::ShiftModifier);
  ASSERT_TRUE(seen);
  EXPECT_EQ(desk.hidden(), (std::vector<HiddenSpan>{{1, 55, 70}, {3, 55, 70}}));
  w.document()->undoStack()->undo();
  EXPECT_TRUE(desk.hidden().empty());
}

TEST(HiddenSpans, PickerWithNoLimbTickedCannotBeAccepted) {
  model::LimbSet limbs = model::LimbSet::quadruped();
  HiddenSpanDialog d(limbs, 5, 9, 100, 2);
  EXPECT_EQ(d.spans(), (std::vector<HiddenSpan>{{2, 5, 9}}));
  d.setAllLimbs(true);
  EXPECT_EQ(d.spans().size(), 4u);
  d.setAllLimbs(false);
  EXPECT_TRUE(d.spans().empty());
  auto* ok = d.findChild<QDialogButtonBox*>()->button(QDialogButtonBox::Ok);
  EXPECT_FALSE(ok->isEnabled());
}

TEST(HiddenSpans, ClickSelectsASpanAndDeleteRemovesItAsUndoableEdit) {
  QTemporaryDir dir;
  const auto clip = test::makeTrotClip(dir.path().toStdString(), 1.0);
  Desk desk(clip);
  auto& w = desk.w;
  auto* lanes = w.lanes();
  ASSERT_TRUE(w.markHiddenSpans({{1, 30, 60}, {2, 30, 60}}));
  ASSERT_EQ(desk.hidden().size(), 2u);

  QTest::mouseClick(lanes, Qt::LeftButton, {}, lanes->pointFor(1, 45).toPoint());
  ASSERT_TRUE(lanes->selectedHiddenSpan().has_value()) << "a click inside the span selects it";
  EXPECT_EQ(*lanes->selectedHiddenSpan(), (HiddenSpan{1, 30, 60}));
  EXPECT_EQ(w.playhead(), 45) << "the click still seeks";
  // For people to look at: the selected span is outlined in its lane.
  const QString shots =
      QStringLiteral(STRIDEMARK_BINARY_DIR) + QStringLiteral("/tests/ui/screenshots");
  QDir().mkpath(shots);
  lanes->grab().save(shots + QStringLiteral("/lanes-hidden-span-selected.png"));

  press(lanes, Qt::Key_Delete);
  EXPECT_EQ(desk.hidden(), (std::vector<HiddenSpan>{{2, 30, 60}}));
  EXPECT_FALSE(lanes->selectedHiddenSpan().has_value());
  EXPECT_TRUE(w.document()->undoStack()->undoText().startsWith(QStringLiteral("Unhide")))
      << w.document()->undoStack()->undoText().toStdString();
  w.document()->undoStack()->undo();
  EXPECT_EQ(desk.hidden(), (std::vector<HiddenSpan>{{1, 30, 60}, {2, 30, 60}}));
  w.document()->undoStack()->redo();
  EXPECT_EQ(desk.hidden(), (std::vector<HiddenSpan>{{2, 30, 60}}));

  // Outside any span: the selection clears and Delete removes nothing.
  QTest::mouseClick(lanes, Qt::LeftButton, {}, lanes->pointFor(2, 45).toPoint());
  EXPECT_TRUE(lanes->selectedHiddenSpan().has_value());
  QTest::mouseClick(lanes, Qt::LeftButton, {}, lanes->pointFor(2, 80).toPoint());
  EXPECT_FALSE(lanes->selectedHiddenSpan().has_value());
  press(lanes, Qt::Key_Delete);
  EXPECT_EQ(desk.hidden(), (std::vector<HiddenSpan>{{2, 30, 60}}));
}

}  // namespace
}  // namespace stridemark::ui
