// One QApplication per test process, offscreen, with settings kept away from the user's.
#include <gtest/gtest.h>
#include <QApplication>
#include <QDir>
#include <QElapsedTimer>
#include <QSettings>
#include <QStandardPaths>
#include <QTemporaryDir>
#include <QThread>
#include <memory>

#include "synth/synth.h"
#include "tests/ui/test_support.h"
#include "ui/main_window.h"
#include "ui/session/guarded.h"

namespace stridemark::ui::test {

QStringList& recordedErrors() {
  static QStringList errors;
  return errors;
}

SampleClip makeTrotClip(const std::filesystem::path& dir, double seconds) {
  synth::SynthOptions o;
  o.outDir = dir;
  o.gaits = {"trot:" + std::to_string(seconds)};
  o.timeline.captureRate = Rational{120, 1};
  o.render.width = 320;
  o.render.height = 180;
  o.render.seed = 7;
  o.subject = "test dog (invented)";
  const auto result = synth::generate(o);
  SampleClip clip{result.video, result.events, result.project, synth::groundTruth(o)};
  clip.truth.normalize();
  return clip;
}

QString screenshotDir() {
  const QString dir =
      QStringLiteral(STRIDEMARK_BINARY_DIR) + QStringLiteral("/tests/ui/screenshots");
  QDir().mkpath(dir);
  return dir;
}

void showUnattended(MainWindow& w, int width, int height) {
  w.setRecoveryPolicy(RecoveryPolicy::discard);
  w.setBareClipPolicy(BareClipPolicy::useDefaults);
  w.setAskBeforeDiscard(false);
  w.resize(width, height);
  w.show();
}

bool waitUntil(const std::function<bool()>& done, int ms) {
  QElapsedTimer clock;
  clock.start();
  while (!done() && clock.elapsed() < ms) {
    QCoreApplication::processEvents(QEventLoop::AllEvents, 20);
    QThread::msleep(2);
  }
  return done();
}

namespace {

class QtEnvironment : public ::testing::Environment {
 public:
  void SetUp() override {
    if (qEnvironmentVariableIsEmpty("QT_QPA_PLATFORM")) qputenv("QT_QPA_PLATFORM", "offscreen");
    runtimeDir_ = std::make_unique<QTemporaryDir>();
    if (qEnvironmentVariableIsEmpty("XDG_RUNTIME_DIR"))
      qputenv("XDG_RUNTIME_DIR", runtimeDir_->path().toUtf8());
    QStandardPaths::setTestModeEnabled(true);  // caches under ~/.qttest
    // ctest runs test processes in parallel: each gets its own settings so one test's key
    // bindings or window state never leak into another running at the same time.
    settingsDir_ = std::make_unique<QTemporaryDir>();
    QSettings::setPath(QSettings::NativeFormat, QSettings::UserScope, settingsDir_->path());
    QSettings::setPath(QSettings::IniFormat, QSettings::UserScope, settingsDir_->path());
    static int argc = 1;
    static char name[] = "ui_tests";
    static char* argv[] = {name, nullptr};
    app_ = std::make_unique<QApplication>(argc, argv);
    QApplication::setOrganizationName(QStringLiteral("StridemarkTests"));
    QApplication::setApplicationName(QStringLiteral("ui_tests"));
    setErrorSink([](QWidget*, const QString& title, const QString& text) {
      recordedErrors() << title + QStringLiteral(": ") + text;
    });
  }
  void TearDown() override { app_.reset(); }

 private:
  std::unique_ptr<QTemporaryDir> runtimeDir_;
  std::unique_ptr<QTemporaryDir> settingsDir_;
  std::unique_ptr<QApplication> app_;
};

[[maybe_unused]] const auto* const kEnvironment =
    ::testing::AddGlobalTestEnvironment(new QtEnvironment);

}  // namespace
}  // namespace stridemark::ui::test
