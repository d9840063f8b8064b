#include "export_fixture.h"

#include <gtest/gtest.h>
#include <sys/wait.h>
#include <QApplication>
#include <array>
#include <cstdio>
#include <cstdlib>
#include <fstream>
#include <memory>
#include <sstream>
#include <stdexcept>

namespace stridemark::testing {

namespace fs = std::filesystem;

CommandResult run(const std::string& command) {
  CommandResult result;
  const std::string full = "(" + command + ") 2>&1";
  FILE* pipe = popen(full.c_str(), "r");
  if (!pipe) throw std::runtime_error("cannot run: " + command);
  std::array<char, 4096> buffer{};
  while (const std::size_t n = fread(buffer.data(), 1, buffer.size(), pipe)) {
    result.out.append(buffer.data(), n);
  }
  const int status = pclose(pipe);
  result.exitCode = WIFEXITED(status) ? WEXITSTATUS(status) : -1;
  return result;
}

fs::path freshFolder(const std::string& name) {
  const fs::path dir = fs::path(STRIDEMARK_BINARY_DIR) / "tests" / "export" / "work" / name;
  fs::remove_all(dir);
  fs::create_directories(dir);
  return dir;
}

void makeClip(const fs::path& path, int frames) {
  const CommandResult r = run(
      "ffmpeg -nostdin -v error -y -f lavfi -i testsrc2=size=320x240:rate=240 -frames:v " +
      std::to_string(frames) +
      " -c:v libx264 -preset ultrafast -pix_fmt yuv420p -g 48 -threads 2 '" + path.string() + "'");
  if (r.exitCode != 0) throw std::runtime_error("ffmpeg failed: " + r.out);
}

model::Project trotProject(const std::string& videoPath, std::int64_t frameCount) {
  using model::EventKind;
  model::Project p;
  p.annotation.limbs = model::LimbSet::quadruped();
  p.annotation.captureRate = {240, 1};
  p.annotation.referenceLimb = p.annotation.limbs.defaultReference();
  const int lf = *p.annotation.limbs.indexOf("LF");
  const int rf = *p.annotation.limbs.indexOf("RF");
  const int lh = *p.annotation.limbs.indexOf("LH");
  const int rh = *p.annotation.limbs.indexOf("RH");
  constexpr int kPeriod = 48;
  constexpr int kStance = 26;
  auto& ev = p.annotation.events;
  ev.push_back({3, lh, EventKind::liftoff});  // clip starts with LH in stance
  for (int k = 0; k < 4; ++k) {
    const std::int64_t a = 5 + kPeriod * k;  // LH + RF
    const std::int64_t b = a + kPeriod / 2;  // LF + RH
    for (int limb : {lh, rf}) {
      ev.push_back({a, limb, EventKind::touchdown});
      ev.push_back({a + kStance, limb, EventKind::liftoff});
    }
    for (int limb : {lf, rh}) {
      ev.push_back({b, limb, EventKind::touchdown});
      ev.push_back({b + kStance, limb, EventKind::liftoff});
    }
  }
  for (int limb : {lh, rf}) ev.push_back({5 + kPeriod * 4, limb, EventKind::touchdown});
  p.annotation.hidden.push_back({rh, 60, 66});
  p.annotation.normalize();
  p.trial.subject = "Test dog Bramble (invented)";
  p.trial.species = "dog";
  p.trial.condition = "treadmill trot, test data";
  p.trial.observer = "Export test";
  p.trial.examDate = "2026-03-14";
  p.trial.speedMs = 1.8;
  p.trial.legLengthM = 0.5;
  model::VideoLink link;
  link.path = videoPath;
  link.signature = "test-signature-0001";
  link.frameCount = frameCount;
  link.fileRate = {240, 1};
  p.video = link;
  return p;
}

namespace {

std::unique_ptr<QApplication>& qtApp() {
  static std::unique_ptr<QApplication> app;
  return app;
}

// Tears the application down while main() still runs: a QApplication destroyed during exit
// handlers crashes in Qt 6.4's post routines.
class QtTeardown : public ::testing::Environment {
 public:
  void TearDown() override { qtApp().reset(); }
};
// gtest owns registered environments (its API takes a raw pointer).
[[maybe_unused]] ::testing::Environment* const kQtTeardown =
    ::testing::AddGlobalTestEnvironment(std::make_unique<QtTeardown>().release());

}  // namespace

void ensureQt() {
  if (qtApp()) return;
  setenv("QT_QPA_PLATFORM", "offscreen", 1);
  static int argc = 1;
  static char name[] = "test_export";
  static char* argv[] = {name, nullptr};
  qtApp() = std::make_unique<QApplication>(argc, argv);
}

std::string stridemarkBinary() {
  return std::string(STRIDEMARK_BINARY_DIR) + "/app/stridemark";
}

std::string readText(const fs::path& path) {
  std::ifstream in(path, std::ios::binary);
  std::stringstream s;
  s << in.rdbuf();
  return s.str();
}

}  // namespace stridemark::testing
