#pragma once
// The result of scoring one annotation: everything `stridemark score` writes as
// stridemark.report.v1 (contract in CHANGELOG.md) and everything the workstation's docks show.
// Per-limb vectors are indexed by limb index in the annotation's LimbSet.
// Analysis fills this (core/analysis); formats writes and reads it (core/formats).
#include <cstdint>
#include <limits>
#include <map>
#include <optional>
#include <string>
#include <vector>

#include "common/rational.h"
#include "model/limb_set.h"

namespace stridemark::analysis {

inline constexpr double kUndefined = std::numeric_limits<double>::quiet_NaN();

// n, mean, sample SD (n - 1), CV = SD / mean. NaN where undefined (n < 1, or n < 2 for SD).
struct Stat {
  int n = 0;
  double mean = kUndefined;
  double sd = kUndefined;
  double cv = kUndefined;
};

// One complete cycle of one limb: touchdown -> next touchdown (its own stride).
struct LimbCycle {
  int limb = 0;
  std::int64_t touchdown = 0;
  std::int64_t nextTouchdown = 0;
  std::optional<std::int64_t> liftoff;  // missing when untagged or hidden

  std::int64_t strideFrames() const { return nextTouchdown - touchdown; }
  std::optional<std::int64_t> stanceFrames() const {
    if (!liftoff) return std::nullopt;
    return *liftoff - touchdown;
  }
  std::optional<std::int64_t> swingFrames() const {
    if (!liftoff) return std::nullopt;
    return nextTouchdown - *liftoff;
  }
};

struct LimbSummary {
  int strides = 0;  // complete, valid cycles
  Stat strideS, stanceS, swingS, dutyFactor;
};

// One stride of the reference limb and the other limbs seen in its window.
struct StrideRecord {
  std::int64_t startFrame = 0;  // reference touchdown k
  std::int64_t endFrame = 0;    // reference touchdown k + 1
  double durationS = 0;
  std::vector<std::optional<double>> dutyFactor;  // per limb: its cycle that starts in the window
  std::vector<std::optional<double>> phase;       // per limb, [0, 1); reference limb = 0
  std::string gait = "unclassified";
  std::optional<std::string> band;      // Hildebrand band (symmetrical quadruped strides)
  std::optional<std::string> quadrant;  // Cartmill et al. 2002 quadrant (LSLC, LSDC, DSDC, DSLC)
  std::optional<std::string> sequence;  // "lateral" / "diagonal"
  std::optional<std::string> lead;      // leading forelimb "left" / "right" (asymmetrical)
  std::optional<std::string> hindLead;  // leading hindlimb; null when the pair lands together
  bool symmetrical = false;
  // Complete (docs/methods.md §1.5): every limb has one touchdown in the window and its own
  // cycle is tagged; steady: every limb's own cycle is within the tolerance of this stride.
  bool complete = false;
  bool steady = true;
  std::optional<std::string> note;    // why the stride is unclassified or left out of summaries
  std::optional<int> incompleteLimb;  // the limb the note of an incomplete stride is about
  // That limb lands 0 or 2 times in the window although its tags are whole: its cycle changed
  // length here (a change of speed or gait), or a tag is missed or extra.
  bool touchdownSlipped = false;
  bool cutByTagEnds = false;  // the limb's tags begin or end inside the stride (not a mistake)
  std::optional<std::string> excluded;   // a person's reason for leaving it out of statistics
  int bout = -1;                         // index into Report::bouts, -1 when in none
  bool aerial = false;                   // a whole-body suspension inside the stride
  std::optional<double> hindDutyFactor;  // Hildebrand y (quadrupeds)
  std::optional<double> limbPhase;       // Hildebrand x (quadrupeds)
  // Diagonal advanced placement (docs/methods.md §7.3), trot strides only: fore touchdown minus
  // hind touchdown of each diagonal (positive = hind first), in ms from frames at the capture
  // rate and in % of the stride; dapMs/dapPercent are the mean of the two diagonals.
  std::optional<double> dapLhRfMs, dapRhLfMs, dapLhRfPercent, dapRhLfPercent;
  std::optional<double> dapMs;
  std::optional<double> dapPercent;
  // Contralateral phases of the girdles in the reference window (hind: RH after LH; fore: RF
  // after LF), the numbers the symmetry gate reads; they show an uneven walk's unevenness.
  std::optional<double> hindContralateral, foreContralateral;
  // Support: share of the stride with k limbs in stance (index k), and per combination label.
  std::vector<double> supportByCount;
  std::map<std::string, double> supportByCombination;
  // Hexapods and multi-pair sets: ipsilateral phase lag (back-to-front) and wave direction.
  std::optional<double> ipsilateralLag;
  std::optional<std::string> waveDirection;  // "direct" / "retrograde"
  // Added by analysis: touchdowns of each limb inside the window (phase is null unless 1; more
  // than 1 flags a stride mismatch or stumble), the template gait's mean circular distance, and
  // the asymmetrical lags of docs/methods.md §3.2 (fore, hind, pair; cycles).
  std::vector<int> touchdownCount;
  // Per limb: its own cycle that starts in the window, when valid (what summaries describe).
  std::vector<std::optional<LimbCycle>> ownCycle;
  std::optional<double> templateDistance;
  std::optional<double> foreLag, hindLag, pairLag;
};

struct PhaseSummary {
  int n = 0;
  double mean = kUndefined;              // cycles, [0, 1); NaN when R is 0 or n is 0
  double r = kUndefined;                 // mean resultant length
  double circSd = kUndefined;            // sqrt(-2 ln R), cycles
  double angularDeviation = kUndefined;  // sqrt(2 (1 - R)), cycles
  double rayleighZ = kUndefined;
  double rayleighP = kUndefined;  // Zar's approximation
};

struct HildebrandSummary {
  int n = 0;                       // symmetrical strides with a Hildebrand point
  double dutyFactor = kUndefined;  // mean hind-limb duty factor
  double limbPhase = kUndefined;   // circular mean of LF relative to LH
  std::string band;
  std::string quadrant;
};

// Added by analysis: the change of gait where one bout ends and the next begins.
struct Transition {
  std::string fromGait;
  std::string toGait;
  std::int64_t frame = 0;  // start frame of the new bout
  int stride = 0;          // index of the new bout's first stride
};

// Robinson symmetry index per left/right pair; key = pair name ("fore", "hind", "pair",
// "segment1", ...). Positive when the right limb's value is larger.
struct SymmetryValues {
  std::map<std::string, double> si;     // percent
  std::map<std::string, double> ratio;  // right / left
};

struct Symmetry {
  SymmetryValues strideS, stanceS, swingS, dutyFactor;
};

// Every symmetry measure, in the order reports and tables list them: the one list the JSON,
// the tables and the desk read.
struct SymmetryMeasure {
  const char* key;    // report JSON and table name
  const char* title;  // for people
  SymmetryValues Symmetry::*values;
};
inline constexpr SymmetryMeasure kSymmetryMeasures[] = {
    {"stride_s", "Stride time", &Symmetry::strideS},
    {"stance_s", "Stance time", &Symmetry::stanceS},
    {"swing_s", "Swing time", &Symmetry::swingS},
    {"duty_factor", "Duty factor", &Symmetry::dutyFactor},
};

struct SpeedSummary {
  double ms = 0;
  std::optional<double> froude;                // v^2 / (g h), g = 9.81
  std::optional<double> dimensionlessSpeed;    // sqrt(Fr)
  double strideLengthM = kUndefined;           // v * mean reference stride time
  std::optional<double> relativeStrideLength;  // stride length / leg length
};

// Diagonal advanced placement over strides (docs/methods.md §7.3; positive = hind first).
struct DapSummary {
  Stat lhRfMs, rhLfMs, lhRfPercent, rhLfPercent;
  double meanMs = kUndefined;        // mean of the two diagonals' means
  double differenceMs = kUndefined;  // LH-RF mean minus RH-LF mean: a left-right sign
};

// Every summary of a set of strides (a bout, a gait, the trial), docs/methods.md §11.
struct Summary {
  int strides = 0;
  std::vector<LimbSummary> limbs;  // per limb: its cycles that start in the strides' windows
  std::vector<PhaseSummary> phase;
  std::optional<HildebrandSummary> hildebrand;  // quadrupeds only
  std::vector<double> support;                  // share of the strides' time with k in stance
  std::map<std::string, double> supportByCombination;
  Symmetry symmetry;
  std::optional<SpeedSummary> speed;
  std::optional<DapSummary> dap;  // quadrupeds with trot strides
};

struct Bout {
  std::string gait;
  int firstStride = 0;  // indices into Report::strides
  int lastStride = 0;
  std::int64_t startFrame = 0;
  std::int64_t endFrame = 0;
  Summary summary;
};

struct Problem {
  std::int64_t frame = 0;
  std::optional<int> limb;
  std::string message;
};

struct Report {
  model::LimbSet limbs = model::LimbSet::quadruped();
  Rational fps{240, 1};
  int referenceLimb = 0;
  std::vector<LimbCycle> cycles;                // every valid cycle of every limb
  std::vector<LimbSummary> limbSummary;         // per limb
  std::vector<StrideRecord> strides;            // per reference stride
  std::vector<PhaseSummary> phase;              // per limb
  std::optional<HildebrandSummary> hildebrand;  // quadrupeds only
  std::vector<double> support;                  // share of scored time with k limbs in stance
  std::map<std::string, double> supportByCombination;
  std::optional<DapSummary> dap;
  std::vector<Bout> bouts;
  std::map<std::string, Summary> byGait;  // over all bouts of each gait
  bool mixedGaits = false;                // bouts of more than one gait
  std::vector<Transition> transitions;    // added by analysis
  Symmetry symmetry;
  std::optional<SpeedSummary> speed;
  std::vector<Problem> problems;
};

}  // namespace stridemark::analysis
