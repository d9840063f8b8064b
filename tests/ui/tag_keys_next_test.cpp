// The Tag keys dock says what each key records next at the playhead (issue 16 item 8), so a
// clip that starts mid-stance is tagged right the first time: checked while a whole trot clip
// is tagged by key presses in the real window, against our generator's ground truth.
#include <gtest/gtest.h>
#include <QDockWidget>
#include <QTemporaryDir>
#include <QTest>

#include "synth/synth.h"
#include "tests/ui/test_support.h"
#include "ui/main_window.h"
#include "ui/widgets/footfall_lanes.h"
#include "ui/widgets/tag_keys.h"

namespace stridemark::ui {
namespace {

using model::Event;
using model::EventKind;

void press(QWidget* target, int key, Qt::KeyboardModifiers mods = Qt::NoModifier) {
  QTest::keyClick(target->window()->windowHandle(), static_cast<Qt::Key>(key), mods);
}

// A trot clip (120 fps) whose first frame is a quarter stride in: some limbs are mid-stance.
test::SampleClip midStanceTrot(const std::filesystem::path& dir) {
  synth::SynthOptions o;
  o.outDir = dir;
  o.gaits = {"trot:2.0"};
  o.timeline.captureRate = Rational{120, 1};
  o.timeline.startCycle = 0.25;
  o.render.width = 320;
  o.render.height = 180;
  const auto result = synth::generate(o);
  test::SampleClip clip{result.video, result.events, result.project, synth::groundTruth(o)};
  clip.truth.normalize();
  return clip;
}

NextTag plainPressOf(EventKind kind) {
  return kind == EventKind::touchdown ? NextTag::touchdown : NextTag::liftoff;
}

TEST(TagKeysNext, TheDockSaysWhatEachKeyRecordsAsThePlayheadMovesAndAfterEachTag) {
  // Common practice, no source: a tag key marks touchdown in swing and lift-off in stance
  // (Annotation::inStance); Shift marks the other kind, for a limb already in stance when the
  // clip starts.
  QTemporaryDir dir;
  const auto clip = midStanceTrot(dir.path().toStdString());
  MainWindow w;
  test::showUnattended(w);
  ASSERT_TRUE(w.openVideo(QString::fromStdString(clip.video.string())));
  auto* legend = w.findChild<TagKeyLegend*>();
  ASSERT_NE(legend, nullptr);
  const int limbs = w.document()->annotation().limbs.size();
  const std::vector<Event>& truth = clip.truth.events;  // model order: by limb, then frame

  // Before any tag every key offers touchdown, with Shift for a limb already in stance.
  for (int limb = 0; limb < limbs; ++limb) {
    EXPECT_EQ(legend->next(limb), NextTag::touchdown);
    EXPECT_TRUE(legend->firstTag(limb));
  }
  EXPECT_TRUE(legend->accessibleDescription().contains(
      QStringLiteral("LF: %1 records ↓ touchdown · Shift: lift-off")
          .arg(TagKeyMap::keyText(w.tagKeys().keyFor(0)))))
      << legend->accessibleDescription().toStdString();
  test::waitUntil([] { return false; }, 200);
  w.findChild<QDockWidget*>(QStringLiteral("dockTagKeys"))
      ->grab()
      .save(test::screenshotDir() + QStringLiteral("/tag-keys-dock-start.png"));
  int startsInStance = 0;
  for (int limb = 0; limb < limbs; ++limb)
    startsInStance += clip.truth.eventsOf(limb).front().kind == EventKind::liftoff;
  ASSERT_GT(startsInStance, 0) << "the clip should start with a limb mid-stance";

  std::vector<Event> order = truth;
  std::sort(order.begin(), order.end(), [](const Event& a, const Event& b) {
    return a.frame != b.frame ? a.frame < b.frame : a.limb < b.limb;
  });
  std::vector<bool> tagged(static_cast<std::size_t>(limbs), false);
  int checkedBetween = 0;
  w.lanes()->setFocus();
  for (const Event& e : order) {
    // Stepping there: between its tags each limb's key offers what the truth says comes next.
    for (int guard = 0; w.playhead() < e.frame && guard < 10000; ++guard) {
      press(w.lanes(), Qt::Key_Right);
      for (int limb = 0; limb < limbs; ++limb) {
        if (!tagged[static_cast<std::size_t>(limb)]) continue;
        const auto events = clip.truth.eventsOf(limb);
        const auto next = std::upper_bound(events.begin(), events.end(),
                                           Event{w.playhead() - 1, limb, EventKind::liftoff});
        if (next == events.end() || next->frame == w.playhead()) continue;
        ASSERT_EQ(legend->next(limb), plainPressOf(next->kind))
            << "limb " << limb << " at frame " << w.playhead();
        ++checkedBetween;
      }
    }
    ASSERT_EQ(w.playhead(), e.frame);
    const auto i = static_cast<std::size_t>(e.limb);
    // What the dock offers is what the truth wants, or (a first lift-off) Shift is offered.
    if (!tagged[i] && e.kind == EventKind::liftoff) {
      EXPECT_EQ(legend->next(e.limb), NextTag::touchdown);
      EXPECT_TRUE(legend->firstTag(e.limb));
      press(w.lanes(), w.tagKeys().keyFor(e.limb), Qt::ShiftModifier);
    } else {
      EXPECT_EQ(legend->next(e.limb), plainPressOf(e.kind))
          << "limb " << e.limb << " frame " << e.frame;
      press(w.lanes(), w.tagKeys().keyFor(e.limb));
    }
    tagged[i] = true;
    EXPECT_EQ(legend->next(e.limb), NextTag::taggedHere) << "after the tag, at its frame";
  }
  EXPECT_GT(checkedBetween, 200);
  auto expected = truth;
  std::sort(expected.begin(), expected.end());
  EXPECT_EQ(w.document()->annotation().events, expected) << "tagged right the first time";

  // Undo takes the last tag back: its key offers it again.
  const Event& last = order.back();
  w.document()->undoStack()->undo();
  EXPECT_EQ(legend->next(last.limb), plainPressOf(last.kind));
  w.document()->undoStack()->redo();

  // A picture of the dock mid-trial: a limb in stance, one in swing, one tagged here.
  w.seek(order[order.size() / 2].frame);
  test::waitUntil([] { return false; }, 200);
  w.findChild<QDockWidget*>(QStringLiteral("dockTagKeys"))
      ->grab()
      .save(test::screenshotDir() + QStringLiteral("/tag-keys-dock.png"));
  w.grab().save(test::screenshotDir() + QStringLiteral("/main-tag-keys.png"));
}

}  // namespace
}  // namespace stridemark::ui
