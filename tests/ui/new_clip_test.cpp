// Opening a clip without a project (issue 16 item 8): the New trial dialog asks the capture
// rate, the limb set and for an events CSV before tagging starts; a project saved beside the
// clip under its name opens instead; tests and automation skip the dialog by policy.
#include <gtest/gtest.h>
#include <QApplication>
#include <QComboBox>
#include <QDialogButtonBox>
#include <QFile>
#include <QLabel>
#include <QLineEdit>
#include <QPushButton>
#include <QTemporaryDir>
#include <QTest>
#include <QTimer>

#include "formats/events_csv.h"
#include "synth/synth.h"
#include "tests/ui/test_support.h"
#include "ui/main_window.h"
#include "ui/widgets/new_clip_dialog.h"

namespace stridemark::ui {
namespace {

// Answers the next modal NewClipDialog with `act` (which accepts or rejects it).
void answerNewClip(const std::function<void(NewClipDialog&)>& act, bool* seen) {
  QTimer::singleShot(0, [act, seen] {
    auto* dialog = qobject_cast<NewClipDialog*>(QApplication::activeModalWidget());
    if (!dialog) {
      answerNewClip(act, seen);  // not shown yet
      return;
    }
    *seen = true;
    act(*dialog);
  });
}

// Closes whatever modal dialog appears (a test that expects none can see it did).
void refuseAnyDialog(bool* seen) {
  QTimer::singleShot(0, [seen] {
    if (auto* dialog = qobject_cast<QDialog*>(QApplication::activeModalWidget())) {
      *seen = true;
      dialog->reject();
    }
  });
}

QComboBox* combo(NewClipDialog& d, const char* name) {
  return d.findChild<QComboBox*>(QString::fromLatin1(name));
}

void typeInto(QComboBox* box, const QString& text) {
  box->lineEdit()->selectAll();
  QTest::keyClicks(box->lineEdit(), text);
}

void startTagging(NewClipDialog& d) {
  d.findChild<QDialogButtonBox*>()->button(QDialogButtonBox::Ok)->click();
}

QString labelsText(const QDialog& d) {
  QStringList texts;
  for (const QLabel* label : d.findChildren<QLabel*>()) texts << label->text();
  return texts.join(QLatin1Char('\n'));
}

// A high-speed clip as cameras store it: captured at 240 fps, the file claiming 30 fps.
std::filesystem::path highSpeedClip(const std::filesystem::path& dir) {
  synth::SynthOptions o;
  o.outDir = dir;
  o.gaits = {"trot:1.0"};
  o.timeline.captureRate = Rational{240, 1};
  o.fileRate = Rational{30, 1};
  o.render.width = 160;
  o.render.height = 96;
  return synth::generate(o).video;
}

struct Desk {
  Desk() {
    w.setRecoveryPolicy(RecoveryPolicy::discard);
    w.setAskBeforeDiscard(false);
    w.resize(1200, 800);
    w.show();
  }
  MainWindow w;
};

TEST(NewClip, AHighSpeedClipStoredAtALowerFileRateGetsTheRateTheCameraRecorded) {
  // Source: issue 16 ("a bare 240 fps clip stored at 30 fps opens at 30 fps and shows 5.7 s
  // strides without a word"); the dialog says so and takes the camera's rate.
  QTemporaryDir dir;
  const auto video = highSpeedClip(dir.path().toStdString());
  Desk desk;
  bool seen = false;
  QString prefilled, before, after, limbs;
  answerNewClip(
      [&](NewClipDialog& d) {
        prefilled = combo(d, "captureRate")->currentText();
        limbs = combo(d, "limbSet")->currentText();
        before = labelsText(d);
        typeInto(combo(d, "captureRate"), QStringLiteral("240"));
        combo(d, "limbSet")->setCurrentText(QStringLiteral("quadruped"));
        after = labelsText(d);
        d.grab().save(test::screenshotDir() + QStringLiteral("/new-clip-dialog.png"));
        startTagging(d);
      },
      &seen);
  ASSERT_TRUE(desk.w.openVideo(QString::fromStdString(video.string())));
  ASSERT_TRUE(seen) << "a bare clip opened without asking";
  EXPECT_EQ(prefilled, QStringLiteral("30")) << "prefilled from the file rate (no metadata)";
  EXPECT_EQ(limbs, QStringLiteral("quadruped")) << "the limb set in use, offered as a choice";
  EXPECT_TRUE(before.contains(QStringLiteral("lower file rate"))) << before.toStdString();
  // 240 frames: 8 s at the file rate, 1 s at the camera's.
  EXPECT_TRUE(before.contains(QStringLiteral("At 30 fps the clip lasts 8.00 s")))
      << before.toStdString();
  EXPECT_TRUE(after.contains(QStringLiteral("At 240 fps the clip lasts 1.00 s")))
      << after.toStdString();
  const auto& a = desk.w.document()->annotation();
  EXPECT_EQ(a.captureRate, (Rational{240, 1}));
  EXPECT_EQ(a.limbs, model::LimbSet::quadruped());
  EXPECT_TRUE(a.events.empty());
  EXPECT_EQ(desk.w.document()->videoPath(), QString::fromStdString(video.string()));
  EXPECT_FALSE(desk.w.document()->isModified());
}

TEST(NewClip, TheLimbSetIsAskedAndAnEventsCsvCanBeTheStart) {
  // Common practice, no source: tags made elsewhere are read with the file's own limb set and
  // rate; the window's limb set is only the first offer.
  QTemporaryDir dir;
  const auto clip = test::makeTrotClip(dir.path().toStdString(), 2.0);
  const model::Annotation truth = formats::toAnnotation(formats::readEventsCsv(clip.events));
  Desk desk;
  model::Project biped;  // the previous project was a biped
  biped.annotation.limbs = model::LimbSet::biped();
  desk.w.document()->reset(biped, {});
  bool seen = false;
  QString offered, afterImport, rateAfterImport;
  answerNewClip(
      [&](NewClipDialog& d) {
        offered = combo(d, "limbSet")->currentText();
        EXPECT_TRUE(d.importEvents(QString::fromStdString(clip.events.string())));
        afterImport = combo(d, "limbSet")->currentText();
        rateAfterImport = combo(d, "captureRate")->currentText();
        QCoreApplication::processEvents();  // the layout follows the longer status line
        d.grab().save(test::screenshotDir() + QStringLiteral("/new-clip-dialog-imported.png"));
        startTagging(d);
      },
      &seen);
  ASSERT_TRUE(desk.w.openVideo(QString::fromStdString(clip.video.string())));
  ASSERT_TRUE(seen);
  EXPECT_EQ(offered, QStringLiteral("biped"));
  EXPECT_EQ(afterImport, QStringLiteral("quadruped")) << "the CSV says quadruped";
  EXPECT_EQ(rateAfterImport, QStringLiteral("120"));
  const auto& a = desk.w.document()->annotation();
  EXPECT_EQ(a.limbs, model::LimbSet::quadruped());
  EXPECT_EQ(a.events, truth.events);
  EXPECT_EQ(desk.w.tagKeys().limbs(), model::LimbSet::quadruped()) << "tag keys follow";
  EXPECT_TRUE(desk.w.document()->isModified()) << "imported tags are unsaved work";
}

TEST(NewClip, ACsvOfAnotherClipIsRefusedWithWhatIsWrongAndCancelKeepsTheOpenProject) {
  // Our rule: every event must fall inside the clip.
  QTemporaryDir dir;
  const auto clip = test::makeTrotClip(dir.path().toStdString(), 1.0);
  const QString csv = dir.filePath(QStringLiteral("other.csv"));
  QFile f(csv);
  ASSERT_TRUE(f.open(QIODevice::WriteOnly));
  f.write("# fps: 120\nlimb,event,frame\nLH,touchdown,10\nLH,liftoff,9000\n");
  f.close();
  Desk desk;
  model::Project open;
  open.annotation.clip = model::FrameRange{0, 99};
  open.annotation.events = {{5, 0, model::EventKind::touchdown}};
  desk.w.document()->reset(open, {});
  bool seen = false;
  QString error;
  bool stayed = false;
  answerNewClip(
      [&](NewClipDialog& d) {
        EXPECT_TRUE(d.importEvents(csv));
        startTagging(d);
        stayed = d.isVisible();
        error = d.findChild<QLabel*>(QStringLiteral("error"))->text();
        d.reject();
      },
      &seen);
  EXPECT_FALSE(desk.w.openVideo(QString::fromStdString(clip.video.string())));
  ASSERT_TRUE(seen);
  EXPECT_TRUE(stayed) << "a wrong CSV must not start the trial";
  EXPECT_TRUE(
      error.contains(QStringLiteral("LH liftoff at frame 9000 is after the clip's last "
                                    "frame (119)")))
      << error.toStdString();
  EXPECT_EQ(desk.w.document()->annotation().events, open.annotation.events)
      << "cancelled: the open project is untouched";
}

TEST(NewClip, AProjectSavedBesideTheClipOpensInsteadOfANewTrial) {
  // Common practice, no source: the project named like the clip, whose link leads back to it.
  QTemporaryDir dir;
  const auto clip = test::makeTrotClip(dir.path().toStdString(), 1.0);
  const QString beside = dir.filePath(QStringLiteral("clip.stridemark"));
  ASSERT_TRUE(QFile::copy(QString::fromStdString(clip.project.string()), beside));
  Desk desk;
  bool dialog = false;
  refuseAnyDialog(&dialog);
  ASSERT_TRUE(desk.w.openVideo(QString::fromStdString(clip.video.string())));
  test::waitUntil([] { return false; }, 100);  // the refusing timer runs out here
  EXPECT_FALSE(dialog) << "the saved project needs no questions";
  EXPECT_EQ(desk.w.document()->projectPath(), beside);
  EXPECT_EQ(desk.w.document()->annotation().events, clip.truth.events);
  ASSERT_NE(desk.w.video(), nullptr);
  EXPECT_EQ(desk.w.video()->path(), QString::fromStdString(clip.video.string()));

  // The same project beside a copy of the clip links to the original: a new trial, saying why.
  const QString copy = dir.filePath(QStringLiteral("copy.mp4"));
  ASSERT_TRUE(QFile::copy(QString::fromStdString(clip.video.string()), copy));
  ASSERT_TRUE(QFile::copy(beside, dir.filePath(QStringLiteral("copy.stridemark"))));
  bool seen = false;
  QString note;
  answerNewClip(
      [&](NewClipDialog& d) {
        note = labelsText(d);
        d.grab().save(test::screenshotDir() + QStringLiteral("/new-clip-dialog-note.png"));
        startTagging(d);
      },
      &seen);
  ASSERT_TRUE(desk.w.openVideo(copy));
  ASSERT_TRUE(seen);
  EXPECT_TRUE(
      note.contains(QStringLiteral("copy.stridemark beside the clip belongs to another "
                                   "video")))
      << note.toStdString();
  EXPECT_TRUE(desk.w.document()->projectPath().isEmpty());
  EXPECT_TRUE(desk.w.document()->annotation().events.empty());
  EXPECT_EQ(desk.w.document()->videoPath(), copy);
}

TEST(NewClip, AutomationSkipsTheDialogAndTakesItsDefaults) {
  // Our rule: BareClipPolicy::useDefaults answers as the dialog would start (file rate, the
  // limb set in use, nothing imported).
  QTemporaryDir dir;
  const auto video = highSpeedClip(dir.path().toStdString());
  Desk desk;
  desk.w.setBareClipPolicy(BareClipPolicy::useDefaults);
  model::Project hexapod;
  hexapod.annotation.limbs = model::LimbSet::hexapod();
  desk.w.document()->reset(hexapod, {});
  bool dialog = false;
  refuseAnyDialog(&dialog);
  ASSERT_TRUE(desk.w.openVideo(QString::fromStdString(video.string())));
  test::waitUntil([] { return false; }, 100);
  EXPECT_FALSE(dialog);
  const auto& a = desk.w.document()->annotation();
  EXPECT_EQ(a.captureRate, (Rational{30, 1}));
  EXPECT_EQ(a.limbs, model::LimbSet::hexapod());
  EXPECT_EQ(a.referenceLimb, model::LimbSet::hexapod().defaultReference());
  ASSERT_TRUE(a.clip.has_value());
  EXPECT_EQ(a.clip->last, 239);
}

}  // namespace
}  // namespace stridemark::ui
