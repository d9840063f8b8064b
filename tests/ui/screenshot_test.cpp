// Screenshots of the main window with a scored sample in the light and dark palettes, written
// to the build folder for people to look at, with checks that catch a blank or unthemed window.
#include <gtest/gtest.h>
#include <QDir>
#include <QImage>
#include <QTemporaryDir>

#include "tests/ui/test_support.h"
#include "ui/app/palettes.h"
#include "ui/main_window.h"
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

}  // namespace
}  // namespace stridemark::ui
