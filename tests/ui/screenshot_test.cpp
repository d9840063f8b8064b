// Screenshots of the main window with a scored sample in the light and dark palettes, written
// to the build folder for people to look at, with checks that catch a blank or unthemed window.
#include <gtest/gtest.h>
#include <QApplication>
#include <QCoreApplication>
#include <QDir>
#include <QImage>
#include <QPainter>
#include <QSet>
#include <QTemporaryDir>
#include <QTextBrowser>
#include <QTextDocument>
#include <QTimer>

#include "tests/support/process.h"
#include "tests/ui/test_support.h"
#include "ui/keys/action_table.h"
#include "ui/main_window.h"
#include "ui/session/palettes.h"
#include "ui/widgets/footfall_lanes.h"
#include "ui/widgets/viewer.h"

namespace stridemark::ui {
namespace {

double meanLightness(const QImage& image) {
  double sum = 0;
  int n = 0;
  for (int y = 0; y < image.height(); y += 4)
    for (int x = 0; x < image.width(); x += 4, ++n) sum += QColor(image.pixel(x, y)).lightness();
  return sum / n;
}

int pixelsNear(const QImage& image, QColor colour, int tolerance) {
  int count = 0;
  for (int y = 0; y < image.height(); ++y)
    for (int x = 0; x < image.width(); ++x) {
      const QColor c(image.pixel(x, y));
      if (std::abs(c.red() - colour.red()) <= tolerance &&
          std::abs(c.green() - colour.green()) <= tolerance &&
          std::abs(c.blue() - colour.blue()) <= tolerance)
        ++count;
    }
  return count;
}

QImage shoot(Theme theme, const std::filesystem::path& project, const QString& name) {
  applyTheme(theme);
  MainWindow w;
  w.setRecoveryPolicy(RecoveryPolicy::discard);
  w.setAskBeforeDiscard(false);
  w.resize(1440, 900);
  w.show();
  EXPECT_TRUE(w.openProject(QString::fromStdString(project.string())));
  w.seek(61);
  EXPECT_TRUE(test::waitUntil([&] { return w.report() && !w.report()->strides.empty(); }));
  EXPECT_TRUE(test::waitUntil([&] { return w.viewer()->shownFrame() == 61; }));
  test::waitUntil([] { return false; }, 300);  // let the docks repaint
  const QImage shot = w.grab().toImage();
  const QString dir =
      QStringLiteral(STRIDEMARK_BINARY_DIR) + QStringLiteral("/tests/ui/screenshots");
  QDir().mkpath(dir);
  EXPECT_TRUE(shot.save(dir + QLatin1Char('/') + name));
  // Lanes alone too: the part people look at most.
  w.lanes()->grab().toImage().save(dir + QStringLiteral("/lanes-") + name);
  return shot;
}

TEST(Screenshots, MainWindowWithScoredSampleLightAndDark) {
  QTemporaryDir dir;
  const auto clip = test::makeTrotClip(dir.path().toStdString(), 3.0);
  const QImage light = shoot(Theme::light, clip.project, QStringLiteral("main-light.png"));
  const QImage dark = shoot(Theme::dark, clip.project, QStringLiteral("main-dark.png"));
  applyTheme(Theme::light);
  ASSERT_FALSE(light.isNull());
  ASSERT_FALSE(dark.isNull());
  EXPECT_GT(meanLightness(light), meanLightness(dark) + 40) << "dark palette was not applied";
  // The first limb's Okabe-Ito orange appears in stance bars (a scored sample is on screen).
  EXPECT_GT(pixelsNear(light, QColor(0xe6, 0x9f, 0x00), 12), 500);
  EXPECT_GT(pixelsNear(dark, QColor(0xe6, 0x9f, 0x00), 12), 500);
}

QString screenshotDir() {
  return QStringLiteral(STRIDEMARK_BINARY_DIR) + QStringLiteral("/tests/ui/screenshots");
}

int distinctColours(const QImage& image) {
  QSet<QRgb> colours;
  for (int y = 0; y < image.height(); y += 3)
    for (int x = 0; x < image.width(); x += 3) colours.insert(image.pixel(x, y));
  return static_cast<int>(colours.size());
}

// The dialog a window action opens, grabbed from inside its own event loop and closed.
QImage shootDialogOf(QAction* action, const QString& name, QString* text = nullptr) {
  QImage shot;
  QTimer::singleShot(200, [&] {
    auto* dialog = QApplication::activeModalWidget();
    if (!dialog) return;
    shot = dialog->grab().toImage();
    if (auto* browser = dialog->findChild<QTextBrowser*>(); browser && text) {
      *text = browser->toPlainText();
      // The whole sheet in one picture, not only what the dialog shows before scrolling.
      auto* doc = browser->document();
      QImage whole(doc->size().toSize(), QImage::Format_RGB32);
      whole.fill(Qt::white);
      QPainter painter(&whole);
      doc->drawContents(&painter);
      whole.save(screenshotDir() + QStringLiteral("/whole-") + name);
    }
    shot.save(screenshotDir() + QLatin1Char('/') + name);
    dialog->close();
  });
  action->trigger();
  return shot;
}

TEST(Screenshots, CheatSheetAndKeyDialogs) {
  QDir().mkpath(screenshotDir());
  MainWindow w;
  w.show();
  QString text;
  const QImage sheet =
      shootDialogOf(w.action(ActionId::cheatSheet), QStringLiteral("cheat-sheet.png"), &text);
  ASSERT_FALSE(sheet.isNull()) << "Help > Keyboard cheat sheet opened no dialog";
  EXPECT_GT(distinctColours(sheet), 20);
  EXPECT_TRUE(text.contains(QStringLiteral("Footfall lanes"))) << text.toStdString();
  EXPECT_FALSE(
      shootDialogOf(w.action(ActionId::keyBindings), QStringLiteral("key-bindings.png")).isNull());
  EXPECT_FALSE(shootDialogOf(w.action(ActionId::tagKeys), QStringLiteral("tag-keys.png")).isNull());
}

// High-DPI: QT_SCALE_FACTOR must be set before the QApplication exists, so the window is drawn
// by a child run of this same program at device scale 2 (the child test below).
TEST(Screenshots, MainWindowAtScaleTwoIsTwiceTheLogicalSizeAndNotBlank) {
  const std::string self = QCoreApplication::applicationFilePath().toStdString();
  const auto r = testsupport::runShell("QT_SCALE_FACTOR=2 " + testsupport::shellQuote(self) +
                                       " --gtest_filter=ScreenshotsAtScale.*");
  EXPECT_EQ(r.exitCode, 0) << r.out << r.err;
  EXPECT_NE(r.out.find("[  PASSED  ] 1 test"), std::string::npos) << "the child did not run\n"
                                                                  << r.out;
  const QImage shot(screenshotDir() + QStringLiteral("/main-light-scale2.png"));
  EXPECT_EQ(shot.size(), QSize(2880, 1800)) << "1440x900 logical pixels at scale 2";
}

// Runs only as the child of the test above (or by hand with QT_SCALE_FACTOR=1.5 to look at it).
TEST(ScreenshotsAtScale, MainWindowAtTheEnvironmentScale) {
  const double scale = qEnvironmentVariable("QT_SCALE_FACTOR").toDouble();
  if (scale <= 1.0)
    GTEST_SKIP() << "child of Screenshots.MainWindowAtScaleTwo…; needs QT_SCALE_FACTOR";
  QTemporaryDir dir;
  const auto clip = test::makeTrotClip(dir.path().toStdString(), 3.0);
  const QString name = QStringLiteral("main-light-scale%1.png").arg(scale);
  const QImage shot = shoot(Theme::light, clip.project, name);
  ASSERT_FALSE(shot.isNull());
  // Drawn in device pixels: scale times the 1440x900 logical window, not an upscaled copy.
  EXPECT_EQ(shot.width(), qRound(1440 * scale));
  EXPECT_EQ(shot.height(), qRound(900 * scale));
  // Not blank: a themed window with a scored sample (orange stance bars of LF, many colours).
  EXPECT_GT(pixelsNear(shot, QColor(0xe6, 0x9f, 0x00), 12), static_cast<int>(500 * scale * scale));
  EXPECT_GT(distinctColours(shot), 200);
  const double lightness = meanLightness(shot);
  EXPECT_GT(lightness, 60);
  EXPECT_LT(lightness, 250);
  const QImage lanes(screenshotDir() + QStringLiteral("/lanes-") + name);
  EXPECT_GT(pixelsNear(lanes, QColor(0xe6, 0x9f, 0x00), 12), static_cast<int>(200 * scale * scale));
}

}  // namespace
}  // namespace stridemark::ui
