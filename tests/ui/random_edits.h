#pragma once
// Random edits through the window's own entry points, shared by the kill test's child process
// (which makes them and acknowledges each) and the test (which replays them to know what every
// acknowledged state must be). Same seed, same starting project: same edits.
#include <iterator>
#include <random>
#include <string>

#include "ui/main_window.h"

namespace stridemark::ui::test {

inline std::int64_t draw(std::mt19937_64& rng, std::int64_t low, std::int64_t high) {
  return std::uniform_int_distribution<std::int64_t>(low, high)(rng);
}

// One edit of a mix like a scoring session's: mostly tags, some removals, moves, hidden spans,
// trial-card changes, undo and redo. Some draws change nothing (a tag where one exists).
inline void randomEdit(MainWindow& w, std::mt19937_64& rng) {
  ProjectDocument& doc = *w.document();
  const auto& a = doc.annotation();
  const int limb = static_cast<int>(draw(rng, 0, a.limbs.size() - 1));
  const std::int64_t frame = draw(rng, 0, w.frameCount() - 1);
  const auto pickEvent = [&] {
    return a.events[static_cast<std::size_t>(draw(rng, 0, std::ssize(a.events) - 1))];
  };
  const std::int64_t kind = draw(rng, 0, 11);
  if (kind <= 4) {
    w.seek(frame);
    w.tagLimb(limb, draw(rng, 0, 4) == 0);
  } else if (kind == 5 && !a.events.empty()) {
    doc.removeEvents({pickEvent()});
  } else if (kind == 6 && !a.events.empty()) {
    const std::int64_t delta = draw(rng, 1, 3) * (draw(rng, 0, 1) ? 1 : -1);
    doc.moveEvents({pickEvent()}, delta, false);
  } else if (kind == 7) {
    w.markHiddenSpans({{limb, frame, frame + draw(rng, 0, 20)}});
  } else if (kind == 8) {
    model::TrialCard card = doc.project().trial;
    card.notes = "note " + std::to_string(draw(rng, 0, 99999)) + " — ñ";
    card.examDate = "2026-0" + std::to_string(draw(rng, 1, 9)) + "-1" + std::to_string(limb);
    card.speedMs = 0.5 + static_cast<double>(draw(rng, 0, 300)) / 100.0;
    doc.setTrialCard(card);
  } else if (kind == 9 || kind == 5 || kind == 6) {
    doc.undoStack()->undo();
  } else {
    doc.undoStack()->redo();
  }
}

}  // namespace stridemark::ui::test
