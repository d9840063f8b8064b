#pragma once
// How proposals compare with known events (docs/methods.md §13): one-to-one matching per limb
// and event kind, nearest frames first, within a window; then the share within 0, 1 and 2
// frames, missed and spurious events, and the mean signed error per kind (proposal - truth).
#include <array>
#include <cstdint>
#include <vector>

#include "model/annotation.h"

namespace stridemark::vision {

struct ProposalScore {
  int truth = 0;     // events scored (inside the range, not deferred)
  int proposed = 0;  // proposals inside the range
  int within0 = 0, within1 = 0, within2 = 0;
  int matched = 0;   // within the window
  int missed = 0;    // truth events with no proposal in the window
  int spurious = 0;  // proposals with no truth event in the window
  int deferred = 0;  // truth events inside a proposed hidden span (left for a person)
  std::array<double, 2> signedErrorSum{};  // by EventKind (touchdown, liftoff)
  std::array<int, 2> signedErrorCount{};
  // Per proposal (in the order given): its frame error when matched, -1 when not (or outside).
  std::vector<std::int64_t> absoluteError;

  ProposalScore& operator+=(const ProposalScore& other);
  double share(int count) const { return truth ? static_cast<double>(count) / truth : 0.0; }
  double spuriousShare() const { return proposed ? static_cast<double>(spurious) / proposed : 0.0; }
  double meanSignedError(model::EventKind kind) const;
};

// `scored`: frames whose events count (events of the truth outside are ignored, and so are
// proposals outside it). `window`: the largest |frame difference| that still pairs two events.
ProposalScore scoreProposals(const std::vector<model::Event>& truth,
                             const model::Proposals& proposals, model::FrameRange scored,
                             int window);

}  // namespace stridemark::vision
