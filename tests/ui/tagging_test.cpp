// Tagging by simulated key presses in the real main window, checked against ground truth that
// our synthetic generator wrote independently of the UI (events CSV read by core/formats).
#include <gtest/gtest.h>
#include <QDir>
#include <QFile>
#include <QFileInfo>
#include <QImage>
#include <QLineEdit>
#include <QTemporaryDir>
#include <QTest>
#include <atomic>

#include "formats/events_csv.h"
#include "tests/ui/test_support.h"
#include "ui/export/export_job.h"
#include "ui/main_window.h"
#include "ui/widgets/footfall_lanes.h"
#include "ui/widgets/viewer.h"

namespace stridemark::ui {
namespace {

// Through the window system interface, like a real keyboard: the focus widget, the shortcut
// map (transport actions) and our tag-key filter all see it.
void press(QWidget* target, int key, Qt::KeyboardModifiers mods = Qt::NoModifier) {
  QTest::keyClick(target->window()->windowHandle(), static_cast<Qt::Key>(key), mods);
}

TEST(Tagging, WholeTrotTrialByKeyPressesReproducesGroundTruth) {
  QTemporaryDir dir;
  const auto clip = test::makeTrotClip(dir.path().toStdString(), 2.0);
  const auto truth = formats::readEventsCsv(clip.events);
  ASSERT_GT(truth.events.size(), 20u);

  MainWindow w;
  test::showUnattended(w, 1200, 800);
  ASSERT_TRUE(w.openVideo(QString::fromStdString(clip.video.string())));
  w.lanes()->setFocus();
  auto* target = w.lanes();

  // Walk the clip with the step key like a scorer does, pressing each limb's tag key at the
  // frames the ground truth names. A limb whose first event is a lift-off (clip starts in
  // stance) gets Shift+key, the documented way to mark it.
  std::vector<model::Event> order = truth.events;
  std::sort(order.begin(), order.end(), [](const auto& a, const auto& b) {
    return a.frame != b.frame ? a.frame < b.frame : a.limb < b.limb;
  });
  std::vector<bool> seen(4, false);
  for (const auto& e : order) {
    for (int guard = 0; w.playhead() < e.frame && guard < 10000; ++guard)
      press(target, Qt::Key_Right);
    ASSERT_EQ(w.playhead(), e.frame);
    const bool opposite =
        !seen[static_cast<std::size_t>(e.limb)] && e.kind == model::EventKind::liftoff;
    seen[static_cast<std::size_t>(e.limb)] = true;
    press(target, w.tagKeys().keyFor(e.limb), opposite ? Qt::ShiftModifier : Qt::NoModifier);
  }
  auto expected = truth.events;
  std::sort(expected.begin(), expected.end());
  EXPECT_EQ(w.document()->annotation().events, expected);

  // The figures followed: the analysis of the tagged trial labels its strides as trot.
  // Source: Hildebrand 1965 (docs/methods.md §2.2) - limb phase near 50 % is a trot.
  w.analysisRunner()->waitIdle();
  ASSERT_TRUE(test::waitUntil([&] { return w.report() && !w.report()->strides.empty(); }));
  int trots = 0;
  for (const auto& s : w.report()->strides) trots += s.gait == "trot";
  EXPECT_GT(trots, 0);
  // The export's figure set and file names: every figure as SVG, PNG and PDF.
  QTemporaryDir out;
  ASSERT_TRUE(w.exportFiguresTo(out.path()));
  for (const char* stem : {"footfall_diagram", "support_strip", "gait_map", "phase_dial",
                           "stride_duty_factor", "stride_stance_swing"}) {
    for (const char* ext : {"svg", "png", "pdf"})
      EXPECT_GT(QFileInfo(out.filePath(QStringLiteral("%1.%2").arg(stem, ext))).size(), 500)
          << stem << "." << ext;
    EXPECT_FALSE(QImage(out.filePath(QStringLiteral("%1.png").arg(stem))).isNull());
  }
  // ... drawn exactly as `stridemark export` draws them from the saved project.
  const QString project = dir.filePath(QStringLiteral("tagged.stridemark"));
  ASSERT_TRUE(w.saveProjectAs(project));
  exports::ExportOptions options;
  options.projectPath = project.toStdString();
  options.outDir = dir.filePath(QStringLiteral("export")).toStdString();
  options.figureFormats = {exports::FigureFormat::png};
  const std::atomic<bool> cancel{false};
  exports::runExport(options, {}, cancel);
  const QFileInfoList pngs = QDir(out.path()).entryInfoList({QStringLiteral("*.png")});
  EXPECT_EQ(pngs.size(), 6);
  for (const QFileInfo& png : pngs) {
    QFile desk(png.filePath());
    QFile exported(QString::fromStdString((options.outDir / "figures").string()) +
                   QLatin1Char('/') + png.fileName());
    ASSERT_TRUE(desk.open(QIODevice::ReadOnly) && exported.open(QIODevice::ReadOnly))
        << png.fileName().toStdString();
    EXPECT_EQ(desk.readAll(), exported.readAll()) << png.fileName().toStdString();
  }
  // The Viewer painted the frame the playhead is on (decoded off the UI thread).
  EXPECT_TRUE(test::waitUntil([&] { return w.viewer()->shownFrame() == w.playhead(); }));
}

TEST(Tagging, KeysDoNothingWhileATextFieldHasFocus) {
  MainWindow w;
  w.setAskBeforeDiscard(false);
  model::Project p;
  p.annotation.clip = model::FrameRange{0, 99};
  w.document()->reset(p, {});
  w.show();
  auto* field = new QLineEdit(&w);
  field->show();
  field->setFocus();
  ASSERT_TRUE(test::waitUntil([&] { return field->hasFocus(); }, 2000));
  const int key = w.tagKeys().keyFor(0);
  press(field, key);
  EXPECT_TRUE(w.document()->annotation().events.empty());
  EXPECT_FALSE(field->text().isEmpty()) << "the letter went into the field";
  w.lanes()->setFocus();
  press(w.lanes(), key);
  EXPECT_EQ(w.document()->annotation().events.size(), 1u);
}

TEST(Tagging, AutoAdvanceStepsAfterATag) {
  MainWindow w;
  w.setAskBeforeDiscard(false);
  model::Project p;
  p.annotation.clip = model::FrameRange{0, 99};
  w.document()->reset(p, {});
  w.show();
  w.setAutoAdvance(true, 3);
  w.lanes()->setFocus();
  press(w.lanes(), w.tagKeys().keyFor(2));
  EXPECT_EQ(w.playhead(), 3);
  press(w.lanes(), w.tagKeys().keyFor(2));
  EXPECT_EQ(w.document()->annotation().events,
            (std::vector<model::Event>{{0, 2, model::EventKind::touchdown},
                                       {3, 2, model::EventKind::liftoff}}));
  w.setAutoAdvance(false);
}

TEST(Tagging, DefaultKeysAreLaidOutLikeTheAnimalFromAbove) {
  // Common practice, no source: fore limbs on the upper keyboard row, left limbs on the left.
  const TagKeyMap quad(model::LimbSet::quadruped());
  const QString rowQ = QStringLiteral("QWERTYUIOP"), rowA = QStringLiteral("ASDFGHJKL");
  const auto col = [](const QString& row, int key) { return row.indexOf(QChar(key)); };
  EXPECT_GE(col(rowQ, quad.keyFor(0)), 0);  // LF upper row
  EXPECT_GE(col(rowQ, quad.keyFor(1)), 0);  // RF upper row
  EXPECT_GE(col(rowA, quad.keyFor(2)), 0);  // LH lower row
  EXPECT_LT(col(rowQ, quad.keyFor(0)), col(rowQ, quad.keyFor(1)));
  EXPECT_LT(col(rowA, quad.keyFor(2)), col(rowA, quad.keyFor(3)));
  const TagKeyMap hex(model::LimbSet::hexapod());
  std::set<int> keys;
  for (int i = 0; i < 6; ++i) keys.insert(hex.keyFor(i));
  EXPECT_EQ(keys.size(), 6u);
  const TagKeyMap many(model::LimbSet::multiPair(7));
  keys.clear();
  for (int i = 0; i < 14; ++i) keys.insert(many.keyFor(i));
  EXPECT_EQ(keys.size(), 14u) << "every limb of a 7-pair set has its own key";
  TagKeyMap rebound = quad;
  EXPECT_FALSE(rebound.bind(0, quad.keyFor(1))) << "a key already used by RF";
  EXPECT_FALSE(rebound.bind(0, Qt::Key_Space)) << "transport keys are reserved";
  EXPECT_TRUE(rebound.bind(0, Qt::Key_U));
  EXPECT_EQ(rebound.limbFor(Qt::Key_U), 0);
}

}  // namespace
}  // namespace stridemark::ui
