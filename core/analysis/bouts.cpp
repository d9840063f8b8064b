#include "analysis/bouts.h"

#include <algorithm>

namespace stridemark::analysis {
namespace {

bool classified(const StrideRecord& s) {
  return s.gait != "unclassified" && s.gait != "transition";
}

// Strides i and j (i < j) follow on without a gap.
bool joined(const std::vector<StrideRecord>& strides, std::size_t i, std::size_t j) {
  for (std::size_t k = i; k < j; ++k)
    if (strides[k].endFrame != strides[k + 1].startFrame) return false;
  return true;
}

struct Run {
  std::string gait;
  std::vector<std::size_t> members;  // classified strides, ascending
};

std::vector<Run> runsOf(const std::vector<StrideRecord>& strides) {
  std::vector<Run> runs;
  for (std::size_t i = 0; i < strides.size(); ++i) {
    if (!classified(strides[i])) continue;
    if (!runs.empty() && runs.back().gait == strides[i].gait &&
        joined(strides, runs.back().members.back(), i)) {
      runs.back().members.push_back(i);
    } else {
      runs.push_back({strides[i].gait, {i}});
    }
  }
  return runs;
}

Bout boutOf(const std::vector<StrideRecord>& strides, const Run& run) {
  Bout b;
  b.gait = run.gait;
  b.firstStride = static_cast<int>(run.members.front());
  b.lastStride = static_cast<int>(run.members.back());
  b.startFrame = strides[run.members.front()].startFrame;
  b.endFrame = strides[run.members.back()].endFrame;
  return b;
}

// Unsteady strides at the edge where one bout meets a bout of another gait are transitions.
void trimUnsteadyEdges(std::vector<StrideRecord>& strides, std::vector<Run>& bouts) {
  for (std::size_t b = 0; b + 1 < bouts.size(); ++b) {
    Run& before = bouts[b];
    Run& after = bouts[b + 1];
    if (before.gait == after.gait || !joined(strides, before.members.back(), after.members.front()))
      continue;
    while (before.members.size() > 1 && !strides[before.members.back()].steady) {
      strides[before.members.back()].gait = "transition";
      before.members.pop_back();
    }
    while (after.members.size() > 1 && !strides[after.members.front()].steady) {
      strides[after.members.front()].gait = "transition";
      after.members.erase(after.members.begin());
    }
  }
}

// A stride between bouts of two gaits that is incomplete only because a limb's touchdown
// slipped into or out of its window (the cycles change length there) is a transition too.
void labelSlippedBetween(std::vector<StrideRecord>& strides, const std::vector<Run>& bouts) {
  for (std::size_t b = 0; b + 1 < bouts.size(); ++b) {
    const std::size_t last = bouts[b].members.back(), next = bouts[b + 1].members.front();
    if (bouts[b].gait == bouts[b + 1].gait || !joined(strides, last, next)) continue;
    for (std::size_t i = last + 1; i < next; ++i)
      if (strides[i].gait == "unclassified" && strides[i].touchdownSlipped)
        strides[i].gait = "transition";
  }
}

}  // namespace

std::vector<Bout> findBouts(std::vector<StrideRecord>& strides, int minStrides) {
  const std::vector<Run> runs = runsOf(strides);
  std::vector<Run> kept;
  std::vector<std::size_t> shortRuns;  // indices into runs
  for (std::size_t r = 0; r < runs.size(); ++r) {
    if (static_cast<int>(runs[r].members.size()) >= minStrides) {
      kept.push_back(runs[r]);
    } else {
      shortRuns.push_back(r);
    }
  }
  // A short run between two bouts is a transition between them.
  for (const std::size_t r : shortRuns) {
    const std::size_t first = runs[r].members.front(), last = runs[r].members.back();
    bool boutBefore = false, boutAfter = false;
    for (const Run& k : kept) {
      if (k.members.back() < first && joined(strides, k.members.back(), first)) boutBefore = true;
      if (k.members.front() > last && joined(strides, last, k.members.front())) boutAfter = true;
    }
    if (boutBefore && boutAfter)
      for (const std::size_t i : runs[r].members) strides[i].gait = "transition";
  }
  trimUnsteadyEdges(strides, kept);
  labelSlippedBetween(strides, kept);
  std::vector<Bout> bouts;
  for (const Run& run : kept) {
    bouts.push_back(boutOf(strides, run));
    for (int i = bouts.back().firstStride; i <= bouts.back().lastStride; ++i)
      strides[static_cast<std::size_t>(i)].bout = static_cast<int>(bouts.size()) - 1;
  }
  return bouts;
}

std::vector<int> summarisedMembers(const std::vector<StrideRecord>& strides, const Bout& bout) {
  std::vector<int> members;
  for (int i = bout.firstStride; i <= bout.lastStride; ++i) {
    const StrideRecord& s = strides[static_cast<std::size_t>(i)];
    if (s.gait == bout.gait && s.steady && !s.excluded) members.push_back(i);
  }
  return members;
}

std::vector<std::string> gaitsInOrder(const std::vector<Bout>& bouts) {
  std::vector<std::string> gaits;
  for (const Bout& bout : bouts)
    if (std::find(gaits.begin(), gaits.end(), bout.gait) == gaits.end()) gaits.push_back(bout.gait);
  return gaits;
}

std::vector<Transition> findTransitions(const std::vector<Bout>& bouts,
                                        const std::vector<StrideRecord>& strides) {
  std::vector<Transition> out;
  for (std::size_t i = 1; i < bouts.size(); ++i) {
    const Bout& before = bouts[i - 1];
    const Bout& after = bouts[i];
    if (before.gait == after.gait) continue;
    if (!joined(strides, static_cast<std::size_t>(before.lastStride),
                static_cast<std::size_t>(after.firstStride)))
      continue;
    out.push_back({before.gait, after.gait, after.startFrame, after.firstStride});
  }
  return out;
}

}  // namespace stridemark::analysis
