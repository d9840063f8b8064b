#pragma once
// Shared helpers for the ui suites: the Qt application environment (offscreen), a recorder
// for error messages, and a synthetic trot clip with exact ground truth from core/synth.
#include <QString>
#include <QStringList>
#include <filesystem>
#include <functional>

#include "model/annotation.h"

namespace stridemark::ui {
class MainWindow;
}

namespace stridemark::ui::test {

// Shows `w` at the given size with no prompt that would wait for a person: a journal is
// discarded, a bare clip takes the defaults, unsaved changes are dropped on close.
void showUnattended(MainWindow& w, int width = 1400, int height = 900);

// Messages that reached ui::reportError since the last clear().
QStringList& recordedErrors();

struct SampleClip {
  std::filesystem::path video, events, project;
  model::Annotation truth;
};

// Writes a small trot clip (H.264, 120 fps) with its ground truth into `dir` using our own
// generator. Deterministic: same seed, same events.
SampleClip makeTrotClip(const std::filesystem::path& dir, double seconds = 3.0);

// Where screenshot tests write PNGs for people to look at (created on first use).
QString screenshotDir();

// Processes events until `done` returns true or `ms` pass; returns done().
bool waitUntil(const std::function<bool()>& done, int ms = 10000);

}  // namespace stridemark::ui::test
