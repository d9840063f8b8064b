#pragma once
// Bouts (docs/methods.md §11): runs of at least `minStrides` consecutive strides with one gait.
// Unclassified strides inside a run do not end it; a gait seen in fewer strides between two
// bouts is no bout, and those strides, like unsteady strides where one gait meets another,
// are labelled "transition". Bout summaries are filled by the caller.
#include <string>
#include <vector>

#include "analysis/report.h"

namespace stridemark::analysis {

// Relabels transition strides and sets each stride's `bout`.
std::vector<Bout> findBouts(std::vector<StrideRecord>& strides, int minStrides = 2);

// The strides of a bout that its statistics use: steady, classified and not excluded.
std::vector<int> summarisedMembers(const std::vector<StrideRecord>& strides, const Bout& bout);

// Gaits in the order their first bout appears (walk before trot in a walk→trot trial).
std::vector<std::string> gaitsInOrder(const std::vector<Bout>& bouts);

// A transition joins two bouts of different gaits when only strides lie between them.
std::vector<Transition> findTransitions(const std::vector<Bout>& bouts,
                                        const std::vector<StrideRecord>& strides);

}  // namespace stridemark::analysis
