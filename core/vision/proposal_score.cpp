#include "vision/proposal_score.h"

#include <algorithm>
#include <cstdlib>
#include <tuple>

namespace stridemark::vision {

namespace {

bool inside(std::int64_t frame, const model::FrameRange& range) {
  return frame >= range.first && frame <= range.last;
}

bool deferredByHiddenSpan(const model::Event& e, const std::vector<model::HiddenSpan>& hidden) {
  // An event in a hidden span or on the frame right after it could not be placed from the
  // video: the proposer rightly leaves it to a person.
  return std::any_of(hidden.begin(), hidden.end(), [&](const model::HiddenSpan& s) {
    return s.limb == e.limb && e.frame >= s.first && e.frame <= s.last + 1;
  });
}

}  // namespace

ProposalScore& ProposalScore::operator+=(const ProposalScore& o) {
  truth += o.truth;
  proposed += o.proposed;
  within0 += o.within0;
  within1 += o.within1;
  within2 += o.within2;
  matched += o.matched;
  missed += o.missed;
  spurious += o.spurious;
  deferred += o.deferred;
  for (std::size_t k = 0; k < 2; ++k) {
    signedErrorSum[k] += o.signedErrorSum[k];
    signedErrorCount[k] += o.signedErrorCount[k];
  }
  return *this;
}

double ProposalScore::meanSignedError(model::EventKind kind) const {
  const auto k = static_cast<std::size_t>(kind);
  return signedErrorCount[k] ? signedErrorSum[k] / signedErrorCount[k] : 0.0;
}

ProposalScore scoreProposals(const std::vector<model::Event>& truth,
                             const model::Proposals& proposals, model::FrameRange scored,
                             int window) {
  ProposalScore score;
  std::vector<model::Event> wanted;
  for (const auto& e : truth) {
    if (!inside(e.frame, scored)) continue;
    if (deferredByHiddenSpan(e, proposals.hidden)) {
      ++score.deferred;
      continue;
    }
    wanted.push_back(e);
  }
  std::vector<model::Event> offered;
  std::vector<std::size_t> offeredIndex;  // into proposals.events
  for (std::size_t i = 0; i < proposals.events.size(); ++i)
    if (inside(proposals.events[i].event.frame, scored)) {
      offered.push_back(proposals.events[i].event);
      offeredIndex.push_back(i);
    }
  score.absoluteError.assign(proposals.events.size(), -1);
  score.truth = static_cast<int>(wanted.size());
  score.proposed = static_cast<int>(offered.size());
  // Every candidate pair within the window, closest first: greedy one-to-one matching.
  std::vector<std::tuple<std::int64_t, std::size_t, std::size_t>> pairs;
  for (std::size_t i = 0; i < wanted.size(); ++i)
    for (std::size_t j = 0; j < offered.size(); ++j) {
      if (wanted[i].limb != offered[j].limb || wanted[i].kind != offered[j].kind) continue;
      const std::int64_t d = std::llabs(offered[j].frame - wanted[i].frame);
      if (d <= window) pairs.emplace_back(d, i, j);
    }
  std::sort(pairs.begin(), pairs.end());
  std::vector<bool> truthUsed(wanted.size()), offerUsed(offered.size());
  for (const auto& [d, i, j] : pairs) {
    if (truthUsed[i] || offerUsed[j]) continue;
    truthUsed[i] = offerUsed[j] = true;
    score.absoluteError[offeredIndex[j]] = d;
    ++score.matched;
    score.within0 += d == 0;
    score.within1 += d <= 1;
    score.within2 += d <= 2;
    const auto k = static_cast<std::size_t>(wanted[i].kind);
    score.signedErrorSum[k] += static_cast<double>(offered[j].frame - wanted[i].frame);
    ++score.signedErrorCount[k];
  }
  score.missed = score.truth - score.matched;
  score.spurious = score.proposed - score.matched;
  return score;
}

}  // namespace stridemark::vision
