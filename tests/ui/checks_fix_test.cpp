// The Checks dock in the real main window: a trot tagged by key presses with one stray press,
// the "look swapped" problem it raises, the one-step fix from the dock, and undo. Also what the
// list says before anything is tagged.
#include <gtest/gtest.h>
#include <QAction>
#include <QApplication>
#include <QContextMenuEvent>
#include <QDockWidget>
#include <QMenu>
#include <QTest>
#include <QTimer>
#include <QToolButton>
#include <algorithm>

#include "tests/core/analysis/event_train.h"
#include "tests/ui/test_support.h"
#include "ui/keys/action_table.h"
#include "ui/main_window.h"
#include "ui/widgets/footfall_lanes.h"
#include "ui/widgets/report_panels.h"

namespace stridemark::ui {
namespace {

using model::Event;
using model::EventKind;

constexpr int LF = 0;
constexpr std::int64_t kStray = 5100;  // inside LF's swing (lift-off 4480, touchdown 5200)

void press(QWidget* target, int key) {
  QTest::keyClick(target->window()->windowHandle(), static_cast<Qt::Key>(key));
}

bool saysSwapped(const analysis::Report& r) {
  return std::any_of(r.problems.begin(), r.problems.end(), [](const analysis::Problem& p) {
    return p.message.find("look swapped") != std::string::npos;
  });
}

QListWidgetItem* itemSaying(ChecksList* checks, const QString& words) {
  for (int row = 0; row < checks->count(); ++row)
    if (checks->item(row)->text().contains(words)) return checks->item(row);
  return nullptr;
}

// The report of the document as it is now (the worker re-scores after each edit).
const analysis::Report& currentReport(MainWindow& w) {
  w.analysisRunner()->waitIdle();
  EXPECT_TRUE(test::waitUntil([&] { return w.report() != nullptr; }));
  test::waitUntil([] { return false; }, 50);  // the finished signal reaches the docks
  return *w.report();
}

struct Desk {
  Desk() {
    test::showUnattended(w);
    checks = w.findChild<ChecksList*>();
    fix = w.findChild<QToolButton*>(QStringLiteral("checksFixButton"));
  }
  MainWindow w;
  ChecksList* checks = nullptr;
  QToolButton* fix = nullptr;
};

TEST(ChecksFix, AStrayPressIsFixedFromChecksInOneUndoableStep) {
  // Source: issue 16 item 2 (one extra key press flips a limb's later tags; a one-step,
  // undoable fix in the desk). The trot of tests/core/analysis/real_trials_test.cpp: DF 0.40,
  // 1200-frame strides at 1200 fps, tagged here key press by key press.
  const model::Annotation truth = testing::symmetricalQuadruped(0.4, 0.5, 1200, 10);
  Desk desk;
  MainWindow& w = desk.w;
  ASSERT_NE(desk.checks, nullptr);
  ASSERT_NE(desk.fix, nullptr);
  model::Project project;
  project.annotation.captureRate = truth.captureRate;
  project.annotation.referenceLimb = truth.referenceLimb;
  project.annotation.clip = model::FrameRange{0, truth.events.back().frame + 1200};
  w.document()->reset(project, {});
  w.lanes()->setFocus();

  std::vector<Event> presses = truth.events;
  presses.push_back({kStray, LF, EventKind::touchdown});  // one press too many
  std::sort(presses.begin(), presses.end(), [](const Event& a, const Event& b) {
    return a.frame != b.frame ? a.frame < b.frame : a.limb < b.limb;
  });
  for (const Event& e : presses) {
    w.seek(e.frame);
    press(w.lanes(), w.tagKeys().keyFor(e.limb));
  }
  // The desk did what a tag key does: after the stray touchdown LF is "in stance", so every
  // later LF tag was recorded the other way round.
  std::vector<Event> stray = truth.events;
  for (Event& e : stray)
    if (e.limb == LF && e.frame > kStray)
      e.kind = e.kind == EventKind::touchdown ? EventKind::liftoff : EventKind::touchdown;
  stray.push_back({kStray, LF, EventKind::touchdown});
  std::sort(stray.begin(), stray.end());
  ASSERT_EQ(w.document()->annotation().events, stray);

  ASSERT_TRUE(saysSwapped(currentReport(w)));
  QListWidgetItem* item = itemSaying(desk.checks, QStringLiteral("look swapped"));
  ASSERT_NE(item, nullptr);
  EXPECT_TRUE(item->text().startsWith(QStringLiteral("frame 5100 · LF")))
      << item->text().toStdString();
  EXPECT_TRUE(desk.fix->isVisible()) << "a fixable problem shows the fix button";
  EXPECT_FALSE(desk.fix->isEnabled()) << "nothing selected yet";

  // Clicking the entry jumps to the extra tag and selects it; the context menu offers the fix.
  desk.checks->scrollToItem(item);
  QTest::mouseClick(desk.checks->viewport(), Qt::LeftButton, {},
                    desk.checks->visualItemRect(item).center());
  EXPECT_EQ(w.playhead(), kStray);
  EXPECT_TRUE(desk.fix->isEnabled());
  QStringList menuItems;
  QTimer::singleShot(100, [&] {
    auto* menu = qobject_cast<QMenu*>(QApplication::activePopupWidget());
    if (!menu) return;
    for (QAction* a : menu->actions()) menuItems << a->text();
    menu->grab().save(test::screenshotDir() + QStringLiteral("/checks-context-menu.png"));
    menu->close();
  });
  const QPoint at = desk.checks->visualItemRect(item).center();
  QContextMenuEvent menuEvent(QContextMenuEvent::Mouse, at,
                              desk.checks->viewport()->mapToGlobal(at));
  QApplication::sendEvent(desk.checks->viewport(), &menuEvent);
  EXPECT_TRUE(menuItems.contains(QStringLiteral("Swap this limb's tags from here")))
      << menuItems.join(QLatin1Char('|')).toStdString();
  test::waitUntil([] { return false; }, 200);
  w.findChild<QDockWidget*>(QStringLiteral("dockChecks"))
      ->grab()
      .save(test::screenshotDir() + QStringLiteral("/checks-fix.png"));

  // The fix: one undo step; LF's tags from the extra one on read the right way round again.
  const int undoSteps = w.document()->undoStack()->count();
  QTest::mouseClick(desk.fix, Qt::LeftButton);
  EXPECT_EQ(w.document()->undoStack()->count(), undoSteps + 1);
  std::vector<Event> fixed = truth.events;
  fixed.push_back({kStray, LF, EventKind::liftoff});
  std::sort(fixed.begin(), fixed.end());
  EXPECT_EQ(w.document()->annotation().events, fixed);
  const analysis::Report& after = currentReport(w);
  EXPECT_FALSE(saysSwapped(after));
  EXPECT_EQ(itemSaying(desk.checks, QStringLiteral("look swapped")), nullptr);
  // What is left is the extra tag itself (two lift-offs in a row), the entry now selected.
  EXPECT_TRUE(
      std::any_of(after.problems.begin(), after.problems.end(),
                  [](const analysis::Problem& p) { return p.frame == kStray && p.limb == LF; }));
  ASSERT_NE(desk.checks->currentItem(), nullptr);
  EXPECT_TRUE(desk.checks->currentItem()->text().startsWith(QStringLiteral("frame 5100 · LF")))
      << desk.checks->currentItem()->text().toStdString();
  EXPECT_FALSE(desk.fix->isVisible()) << "no problem left with this fix";
  w.findChild<QDockWidget*>(QStringLiteral("dockChecks"))
      ->grab()
      .save(test::screenshotDir() + QStringLiteral("/checks-after-fix.png"));

  // Undo brings the swapped tags, and the problem, back.
  w.action(ActionId::undo)->trigger();
  EXPECT_EQ(w.document()->annotation().events, stray);
  EXPECT_TRUE(saysSwapped(currentReport(w)));
  EXPECT_NE(itemSaying(desk.checks, QStringLiteral("look swapped")), nullptr);
}

TEST(ChecksFix, WithNoTagsChecksSaysNothingIsTaggedYet) {
  // Common practice, no source: an empty annotation is not a clean one.
  Desk desk;
  model::Project project;
  project.annotation.clip = model::FrameRange{0, 999};
  desk.w.document()->reset(project, {});
  currentReport(desk.w);
  ASSERT_EQ(desk.checks->count(), 1);
  EXPECT_TRUE(desk.checks->item(0)->text().startsWith(QStringLiteral("Nothing tagged yet")));
  EXPECT_EQ(itemSaying(desk.checks, QStringLiteral("No problems found")), nullptr);
  ASSERT_TRUE(desk.w.tagLimb(0));
  currentReport(desk.w);
  EXPECT_EQ(itemSaying(desk.checks, QStringLiteral("Nothing tagged yet")), nullptr);
  desk.w.action(ActionId::undo)->trigger();
  currentReport(desk.w);
  EXPECT_NE(itemSaying(desk.checks, QStringLiteral("Nothing tagged yet")), nullptr);
}

}  // namespace
}  // namespace stridemark::ui
