// The desk's seeding mode and proposal review (issue 18 item 3): a click on the Viewer becomes
// a seed at the right video pixel through letterbox and zoom; the review commands walk, accept,
// reject and nudge proposals from the window's actions, say where they are in the status bar,
// and are undone by the window's Undo.
#include <gtest/gtest.h>
#include <QAction>
#include <QSignalSpy>
#include <QStatusBar>
#include <QTemporaryDir>
#include <QTest>
#include <QWheelEvent>

#include "tests/ui/test_support.h"
#include "ui/keys/action_table.h"
#include "ui/main_window.h"
#include "ui/widgets/footfall_lanes.h"
#include "ui/widgets/viewer.h"

namespace stridemark::ui {
namespace {

using model::Event;
using model::EventKind;

constexpr int LF = 0, RF = 1;

QPointF clickedPixel(Viewer& viewer, QPoint at) {
  QSignalSpy spy(&viewer, &Viewer::seedClicked);
  QTest::mouseClick(&viewer, Qt::LeftButton, {}, at);
  return spy.isEmpty() ? QPointF(-1, -1) : spy.takeFirst().at(0).toPointF();
}

TEST(SeedingViewer, ClickMapsToVideoPixelsThroughLetterboxAndZoom) {
  Viewer viewer;
  viewer.resize(400, 400);
  viewer.setSourceSize({640, 360});
  QImage frame(400, 224, QImage::Format_RGB32);
  frame.fill(Qt::gray);
  viewer.setFrame(0, frame);
  viewer.setSeeding(true);
  viewer.show();
  // Source: issue 18 item 3 ("map widget coords to video pixels correctly, including
  // letterboxing and zoom"). Fitted: 400 x 224 widget pixels for 640 x 360, centred, so the
  // picture starts 88 pixels down (the fit is snapped to even pixels).
  const QPointF centre = clickedPixel(viewer, {200, 200});
  EXPECT_NEAR(centre.x(), 320, 1.0);
  EXPECT_NEAR(centre.y(), 180, 1.0);
  const QPointF p = clickedPixel(viewer, {100, 150});
  EXPECT_NEAR(p.x(), 100 * 640.0 / 400, 1.0);
  EXPECT_NEAR(p.y(), (150 - 88) * 360.0 / 224, 1.0);
  EXPECT_EQ(clickedPixel(viewer, {200, 20}), QPointF(-1, -1)) << "the letterbox band is no seed";
  // One wheel step zooms 1.25x around the pointer at the centre: the centre stays put, other
  // points come closer to it in video pixels.
  QWheelEvent wheel(QPointF(200, 200), viewer.mapToGlobal(QPointF(200, 200)), {}, {0, 120},
                    Qt::NoButton, Qt::NoModifier, Qt::NoScrollPhase, false);
  QApplication::sendEvent(&viewer, &wheel);
  ASSERT_DOUBLE_EQ(viewer.zoom(), 1.25);
  const QPointF zoomed = clickedPixel(viewer, {100, 200});
  EXPECT_NEAR(zoomed.x(), 320 - 100 * 640.0 / (400 * 1.25), 1.0);
  EXPECT_NEAR(zoomed.y(), 180, 1.0);
  // A drag pans and places nothing.
  QSignalSpy spy(&viewer, &Viewer::seedClicked);
  QTest::mousePress(&viewer, Qt::LeftButton, {}, {150, 150});
  QMouseEvent move(QEvent::MouseMove, QPointF(190, 170), viewer.mapToGlobal(QPointF(190, 170)),
                   Qt::NoButton, Qt::LeftButton, Qt::NoModifier);
  QApplication::sendEvent(&viewer, &move);
  QTest::mouseRelease(&viewer, Qt::LeftButton, {}, {190, 170});
  EXPECT_TRUE(spy.isEmpty());
}

class ReviewWindow : public ::testing::Test {
 protected:
  void SetUp() override {
    clip_ = test::makeTrotClip(dir_.path().toStdString(), 2.0);
    test::showUnattended(w_, 1280, 720);
    ASSERT_TRUE(w_.openProject(QString::fromStdString(clip_.project.string())));
    test::recordedErrors().clear();
  }
  ProjectDocument& doc() { return *w_.document(); }
  QString status() { return w_.statusBar()->currentMessage(); }

  QTemporaryDir dir_;
  test::SampleClip clip_;
  MainWindow w_;
};

TEST_F(ReviewWindow, ViewerClickPlacesTheChosenLimbsSeedAndUndoTakesItBack) {
  w_.seek(30);
  w_.action(ActionId::seedMode)->trigger();
  ASSERT_TRUE(w_.seeding());
  w_.setSeedLimb(RF);
  ASSERT_TRUE(test::waitUntil([&] { return w_.viewer()->shownFrame() == 30; }));
  Viewer* viewer = w_.viewer();
  const QPoint at(viewer->width() / 2, viewer->height() / 2);
  const auto expected = viewer->videoPixelAt(at);
  ASSERT_TRUE(expected);
  QTest::mouseClick(viewer, Qt::LeftButton, {}, at);
  // Source: issue 18 item 3 (seed = limb, current frame, pixel of the upright frame; stored
  // through an undo command and shown as a marker on its frame).
  ASSERT_EQ(doc().project().seeds.size(), 1u);
  const auto seed = doc().project().seeds.front();
  EXPECT_EQ(seed.limb, RF);
  EXPECT_EQ(seed.frame, 30);
  EXPECT_NEAR(seed.x, expected->x(), 1e-9);
  EXPECT_NEAR(seed.y, expected->y(), 1e-9);
  EXPECT_NEAR(seed.x, 160, 2.0) << "the clip is 320 x 180: the middle is (160, 90)";
  EXPECT_NEAR(seed.y, 90, 2.0);
  ASSERT_EQ(viewer->seeds().size(), 1u);
  EXPECT_EQ(viewer->seeds().front().label, QStringLiteral("RF"));
  EXPECT_NE(w_.seedLimb(), RF) << "the next limb without a seed is chosen";
  w_.action(ActionId::undo)->trigger();
  EXPECT_TRUE(doc().project().seeds.empty());
  EXPECT_TRUE(viewer->seeds().empty());
  w_.action(ActionId::redo)->trigger();
  EXPECT_EQ(doc().project().seeds.size(), 1u);
}

TEST_F(ReviewWindow, KeyboardReviewWalksAcceptsRejectsAndNudgesThroughTheUndoStack) {
  // Proposals as a run would leave them (the run itself is tested with the real core).
  doc().removeEvents(doc().annotation().events);
  model::Proposals p;
  p.events = {{{20, LF, EventKind::touchdown}, 0.91},
              {{45, LF, EventKind::liftoff}, 0.35},
              {{32, RF, EventKind::touchdown}, 0.83}};
  std::sort(p.events.begin(), p.events.end(),
            [](const auto& a, const auto& b) { return a.event < b.event; });
  doc().storeProposals(p, {LF, RF}, {0, 239});
  w_.seek(0);
  w_.action(ActionId::nextProposal)->trigger();
  ASSERT_TRUE(w_.currentProposal());
  // Source: issue 18 item 3 (the playhead seeks to the current proposal; the status bar names
  // it: "RF touchdown @ 132 proposed, confidence 0.83 (3 of 41)").
  EXPECT_EQ(w_.playhead(), 20);
  EXPECT_EQ(w_.lanes()->currentProposal(), (Event{20, LF, EventKind::touchdown}));
  EXPECT_EQ(status(), QStringLiteral("LF touchdown @ 20 proposed, confidence 0.91 (1 of 3)"));
  w_.action(ActionId::nextProposal)->trigger();
  EXPECT_EQ(status(), QStringLiteral("RF touchdown @ 32 proposed, confidence 0.83 (2 of 3)"));
  w_.action(ActionId::acceptProposal)->trigger();
  EXPECT_TRUE(doc().contains({32, RF, EventKind::touchdown}));
  EXPECT_EQ(w_.playhead(), 45) << "the next proposal follows an accept";
  EXPECT_EQ(status(), QStringLiteral("LF lift-off @ 45 proposed, confidence 0.35 (2 of 2)"));
  w_.action(ActionId::nudgeProposalEarlier)->trigger();
  w_.action(ActionId::nudgeProposalEarlier)->trigger();
  EXPECT_EQ(w_.playhead(), 43);
  EXPECT_NE(doc().findProposal({43, LF, EventKind::liftoff}), nullptr);
  w_.action(ActionId::rejectProposal)->trigger();
  EXPECT_EQ(doc().findProposal({43, LF, EventKind::liftoff}), nullptr);
  EXPECT_FALSE(doc().contains({43, LF, EventKind::liftoff}));
  // Least confident first: of the one left plus the one undone back.
  w_.action(ActionId::undo)->trigger();  // the reject
  w_.action(ActionId::undo)->trigger();  // both nudges (one step)
  EXPECT_NE(doc().findProposal({45, LF, EventKind::liftoff}), nullptr);
  w_.action(ActionId::undo)->trigger();  // the accept
  EXPECT_FALSE(doc().contains({32, RF, EventKind::touchdown}));
  EXPECT_EQ(doc().project().proposals.events.size(), 3u);
  w_.action(ActionId::leastConfidentFirst)->trigger();
  w_.setCurrentProposal(std::nullopt);
  w_.action(ActionId::nextProposal)->trigger();
  EXPECT_EQ(w_.playhead(), 45) << "least confident (0.35) first";
  w_.action(ActionId::nextProposal)->trigger();
  EXPECT_EQ(w_.playhead(), 32);
  EXPECT_TRUE(test::recordedErrors().isEmpty()) << test::recordedErrors().join('\n').toStdString();
}

TEST_F(ReviewWindow, ReviewKeysAreOurOwnAndListedInTheCheatSheet) {
  // Common practice, no source: every review command is in the action table, so the key map
  // and the cheat sheet list it; the keys clash with nothing else (ActionTable tests check
  // uniqueness of the table as a whole).
  const QString sheet = w_.cheatSheetHtml();
  for (const auto id :
       {ActionId::seedMode, ActionId::proposeEvents, ActionId::nextProposal,
        ActionId::previousProposal, ActionId::acceptProposal, ActionId::rejectProposal,
        ActionId::nudgeProposalEarlier, ActionId::nudgeProposalLater,
        ActionId::acceptProposalsAbove, ActionId::leastConfidentFirst}) {
    const QAction* a = w_.action(id);
    ASSERT_NE(a, nullptr);
    EXPECT_FALSE(a->shortcut().isEmpty()) << withoutMnemonic(a->text()).toStdString();
    EXPECT_TRUE(sheet.contains(withoutMnemonic(actionText(specOf(id)))))
        << withoutMnemonic(a->text()).toStdString();
    for (const auto& spec : actionTable()) {
      if (spec.id == id) continue;
      for (const auto& key : w_.keyBindings().shortcutsFor(spec.id)) {
        EXPECT_NE(key, a->shortcut()) << "clash with " << spec.name;
      }
    }
  }
  EXPECT_EQ(w_.action(ActionId::acceptProposal)->shortcut(), QKeySequence(QStringLiteral(";")));
  EXPECT_EQ(w_.action(ActionId::nextProposal)->shortcut(), QKeySequence(Qt::Key_PageDown));
}

}  // namespace
}  // namespace stridemark::ui
