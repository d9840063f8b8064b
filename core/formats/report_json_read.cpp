// Reader for stridemark.report.v1 (the writer is report_json.cpp).
#include <charconv>
#include <cmath>

#include "common/error.h"
#include "formats/file_io.h"
#include "formats/json_in.h"
#include "formats/report_json.h"

namespace stridemark::formats {
namespace {

using analysis::Report;
constexpr double kNaN = analysis::kUndefined;

double numberOrNaN(const JsonIn& value) {
  return value.numberOrNull().value_or(kNaN);
}

int count(const JsonIn& value) {
  const std::int64_t n = value.integer();
  if (n < 0 || n > 1'000'000'000) value.fail("expected a count of 0 or more");
  return static_cast<int>(n);
}

analysis::Stat readStat(const JsonIn& in) {
  analysis::Stat stat;
  stat.n = count(in.at("n"));
  stat.mean = numberOrNaN(in.at("mean"));
  stat.sd = numberOrNaN(in.at("sd"));
  stat.cv = numberOrNaN(in.at("cv"));
  return stat;
}

Rational readFps(const JsonIn& in) {
  const double fps = in.number();
  if (fps <= 0) in.fail("expected a positive capture rate");
  if (in.raw().is_number_integer()) return {in.integer(), 1};
  return rationalFromDouble(fps);
}

std::vector<std::optional<double>> readPerLimb(const JsonIn& in, const model::LimbSet& limbs) {
  std::vector<std::optional<double>> values(static_cast<std::size_t>(limbs.size()));
  for (int i = 0; i < limbs.size(); ++i) {
    values[static_cast<std::size_t>(i)] = in.at(limbs.label(i)).numberOrNull();
  }
  return values;
}

std::optional<std::string> textOrNull(const JsonIn& in, std::string_view key) {
  const auto value = in.find(key);
  return value ? std::optional(value->text()) : std::nullopt;
}

analysis::StrideRecord readStride(const JsonIn& in, const model::LimbSet& limbs) {
  analysis::StrideRecord stride;
  stride.startFrame = in.at("start_frame").integer();
  stride.endFrame = in.at("end_frame").integer();
  stride.durationS = in.at("duration_s").number();
  stride.dutyFactor = readPerLimb(in.at("duty_factor"), limbs);
  stride.phase = readPerLimb(in.at("phase"), limbs);
  stride.gait = in.at("gait").text();
  stride.band = textOrNull(in, "band");
  stride.sequence = textOrNull(in, "sequence");
  stride.symmetrical = in.at("symmetrical").boolean();
  stride.aerial = in.at("aerial").boolean();
  stride.lead = textOrNull(in, "lead");
  stride.hindLead = textOrNull(in, "hind_lead");
  if (const auto steady = in.find("steady")) stride.steady = steady->boolean();
  if (const auto bout = in.find("bout")) stride.bout = static_cast<int>(bout->integer());
  return stride;
}

void readStrideExtra(const JsonIn& in, analysis::StrideRecord& stride) {
  stride.quadrant = textOrNull(in, "quadrant");
  auto number = [&](std::string_view key) -> std::optional<double> {
    const auto value = in.find(key);
    return value ? value->numberOrNull() : std::nullopt;
  };
  stride.hindDutyFactor = number("hind_duty_factor");
  stride.limbPhase = number("limb_phase");
  stride.dapMs = number("dap_ms");
  stride.dapPercent = number("dap_percent");
  stride.ipsilateralLag = number("ipsilateral_lag");
  stride.waveDirection = textOrNull(in, "wave_direction");
  stride.foreLag = number("fore_lag");
  stride.hindLag = number("hind_lag");
  stride.pairLag = number("pair_lag");
  stride.templateDistance = number("template_distance");
  stride.dapLhRfMs = number("dap_lh_rf_ms");
  stride.dapRhLfMs = number("dap_rh_lf_ms");
  stride.dapLhRfPercent = number("dap_lh_rf_percent");
  stride.dapRhLfPercent = number("dap_rh_lf_percent");
  stride.hindContralateral = number("hind_contralateral");
  stride.foreContralateral = number("fore_contralateral");
  if (const auto complete = in.find("complete")) stride.complete = complete->boolean();
  stride.note = textOrNull(in, "note");
  stride.excluded = textOrNull(in, "excluded");
}

std::map<std::string, double> readNumberMap(const JsonIn& in) {
  std::map<std::string, double> values;
  for (const auto& [name, value] : in.members()) values[name] = numberOrNaN(value);
  return values;
}

int limbIndex(const JsonIn& in, const model::LimbSet& limbs) {
  const std::string label = in.text();
  const auto index = limbs.indexOf(label);
  if (!index) in.fail("limb '" + label + "' is not in limb set " + limbs.name());
  return *index;
}

std::vector<analysis::LimbSummary> readLimbs(const JsonIn& in, const model::LimbSet& limbs) {
  std::vector<analysis::LimbSummary> out(static_cast<std::size_t>(limbs.size()));
  for (int i = 0; i < limbs.size(); ++i) {
    const JsonIn limb = in.at(limbs.label(i));
    auto& summary = out[static_cast<std::size_t>(i)];
    summary.strides = count(limb.at("strides"));
    summary.strideS = readStat(limb.at("stride_s"));
    summary.stanceS = readStat(limb.at("stance_s"));
    summary.swingS = readStat(limb.at("swing_s"));
    summary.dutyFactor = readStat(limb.at("duty_factor"));
  }
  return out;
}

std::vector<analysis::PhaseSummary> readPhase(const JsonIn& in, const model::LimbSet& limbs) {
  std::vector<analysis::PhaseSummary> out(static_cast<std::size_t>(limbs.size()));
  for (int i = 0; i < limbs.size(); ++i) {
    const JsonIn limb = in.at(limbs.label(i));
    auto& phase = out[static_cast<std::size_t>(i)];
    phase.n = count(limb.at("n"));
    phase.mean = numberOrNaN(limb.at("mean"));
    phase.r = numberOrNaN(limb.at("r"));
    phase.circSd = numberOrNaN(limb.at("circ_sd"));
    phase.rayleighP = numberOrNaN(limb.at("rayleigh_p"));
  }
  return out;
}

std::vector<double> readSupport(const JsonIn& in) {
  std::vector<double> support;
  for (const auto& [name, value] : in.members()) {
    std::size_t k = 0;
    const auto [end, ec] = std::from_chars(name.data(), name.data() + name.size(), k);
    if (ec != std::errc() || end != name.data() + name.size() || k > 10000) {
      value.fail("expected a limb count (0, 1, 2, ...) as the key");
    }
    if (support.size() <= k) support.resize(k + 1, 0.0);
    support[k] = value.number();
  }
  return support;
}

std::optional<analysis::HildebrandSummary> readHildebrand(const JsonIn& in) {
  if (in.isNull()) return std::nullopt;
  analysis::HildebrandSummary summary;
  if (const auto n = in.find("n")) summary.n = count(*n);
  summary.dutyFactor = numberOrNaN(in.at("duty_factor"));
  summary.limbPhase = numberOrNaN(in.at("limb_phase"));
  summary.band = in.at("band").isNull() ? "" : in.at("band").text();
  return summary;
}

analysis::Symmetry readSymmetry(const JsonIn& in) {
  analysis::Symmetry symmetry;
  symmetry.stanceS.si = readNumberMap(in.at("stance_s"));
  symmetry.swingS.si = readNumberMap(in.at("swing_s"));
  symmetry.dutyFactor.si = readNumberMap(in.at("duty_factor"));
  return symmetry;
}

std::optional<analysis::SpeedSummary> readSpeed(const JsonIn& in) {
  if (in.isNull()) return std::nullopt;
  analysis::SpeedSummary speed;
  speed.ms = in.at("m_s").number();
  speed.froude = in.at("froude").numberOrNull();
  speed.strideLengthM = numberOrNaN(in.at("stride_length_m"));
  speed.relativeStrideLength = in.at("relative_stride_length").numberOrNull();
  return speed;
}

std::optional<analysis::DapSummary> readDap(const JsonIn& in) {
  if (in.isNull()) return std::nullopt;
  analysis::DapSummary dap;
  dap.lhRfMs = readStat(in.at("lh_rf_ms"));
  dap.rhLfMs = readStat(in.at("rh_lf_ms"));
  dap.lhRfPercent = readStat(in.at("lh_rf_percent"));
  dap.rhLfPercent = readStat(in.at("rh_lf_percent"));
  dap.meanMs = numberOrNaN(in.at("mean_ms"));
  dap.differenceMs = numberOrNaN(in.at("difference_ms"));
  return dap;
}

analysis::Summary readSummary(const JsonIn& in, const model::LimbSet& limbs) {
  analysis::Summary s;
  s.strides = count(in.at("strides"));
  s.limbs = readLimbs(in.at("limbs"), limbs);
  s.phase = readPhase(in.at("phase"), limbs);
  s.hildebrand = readHildebrand(in.at("hildebrand"));
  s.support = readSupport(in.at("support"));
  s.symmetry = readSymmetry(in.at("symmetry"));
  s.speed = readSpeed(in.at("speed"));
  s.dap = readDap(in.at("dap"));
  return s;
}

void readBouts(const JsonIn& in, Report& report) {
  for (std::size_t i = 0; i < in.arraySize(); ++i) {
    const JsonIn item = in.at(i);
    analysis::Bout bout;
    bout.gait = item.at("gait").text();
    bout.firstStride = count(item.at("first_stride"));
    bout.lastStride = count(item.at("last_stride"));
    bout.startFrame = item.at("start_frame").integer();
    bout.endFrame = item.at("end_frame").integer();
    if (const auto summary = item.find("summary"))
      bout.summary = readSummary(*summary, report.limbs);
    report.bouts.push_back(bout);
  }
}

void readProblems(const JsonIn& in, Report& report) {
  for (std::size_t i = 0; i < in.arraySize(); ++i) {
    const JsonIn item = in.at(i);
    analysis::Problem problem;
    problem.frame = item.at("frame").integer();
    if (const auto limb = item.find("limb")) problem.limb = limbIndex(*limb, report.limbs);
    problem.message = item.at("message").text();
    report.problems.push_back(problem);
  }
}

void readExtra(const JsonIn& in, Report& report) {
  if (const auto phase = in.find("phase")) {
    for (const auto& [label, value] : phase->members()) {
      const auto index = report.limbs.indexOf(label);
      if (!index) value.fail("limb '" + label + "' is not in limb set " + report.limbs.name());
      auto& summary = report.phase[static_cast<std::size_t>(*index)];
      summary.angularDeviation = numberOrNaN(value.at("angular_deviation"));
      summary.rayleighZ = numberOrNaN(value.at("rayleigh_z"));
    }
  }
  if (const auto hildebrand = in.find("hildebrand"); hildebrand && report.hildebrand) {
    report.hildebrand->quadrant = hildebrand->at("quadrant").text();
  }
  if (const auto support = in.find("support_by_combination")) {
    report.supportByCombination = readNumberMap(*support);
  }
  if (const auto symmetry = in.find("symmetry")) {
    if (const auto stride = symmetry->find("stride_s"))
      report.symmetry.strideS.si = readNumberMap(*stride);
    if (const auto ratio = symmetry->find("ratio")) {
      for (const analysis::SymmetryMeasure& measure : analysis::kSymmetryMeasures) {
        if (const auto map = ratio->find(measure.key))
          (report.symmetry.*measure.values).ratio = readNumberMap(*map);
      }
    }
  }
  if (const auto speed = in.find("speed"); speed && report.speed) {
    report.speed->dimensionlessSpeed = speed->at("dimensionless_speed").numberOrNull();
  }
  if (const auto transitions = in.find("transitions")) {
    for (std::size_t i = 0; i < transitions->arraySize(); ++i) {
      const JsonIn item = transitions->at(i);
      analysis::Transition transition;
      transition.fromGait = item.at("from_gait").text();
      transition.toGait = item.at("to_gait").text();
      transition.frame = item.at("frame").integer();
      transition.stride = count(item.at("stride"));
      report.transitions.push_back(transition);
    }
  }
  if (const auto strides = in.find("strides")) {
    if (strides->arraySize() != report.strides.size()) {
      strides->fail("has " + std::to_string(strides->arraySize()) + " entries but /strides has " +
                    std::to_string(report.strides.size()) + " — the two lists must match");
    }
    for (std::size_t i = 0; i < report.strides.size(); ++i) {
      readStrideExtra(strides->at(i), report.strides[i]);
    }
  }
}

}  // namespace

Report parseReportJson(std::string_view text, std::string_view fileName) {
  const nlohmann::json document = parseJsonText(text, fileName);
  const JsonIn root(document, fileName);
  const JsonIn schema = root.at("schema");
  if (schema.text() != kReportSchema) {
    schema.fail("schema '" + schema.text() + "' is not " + std::string(kReportSchema) +
                " — this build reads only that report schema");
  }
  Report report;
  const std::string limbSet = root.at("limb_set").text();
  try {
    report.limbs = model::LimbSet::fromName(limbSet);
  } catch (const Error& e) {
    root.at("limb_set").fail(e.what());
  }
  report.fps = readFps(root.at("fps"));
  if (const auto exact = root.find("extra"); exact && exact->find("fps_exact")) {
    const std::string fpsExact = exact->at("fps_exact").text();
    try {
      report.fps = parseRate(fpsExact, "fps_exact");
    } catch (const Error& e) {
      exact->at("fps_exact").fail(e.what());
    }
  }
  report.referenceLimb = limbIndex(root.at("reference_limb"), report.limbs);
  report.limbSummary = readLimbs(root.at("limbs"), report.limbs);
  const JsonIn strides = root.at("strides");
  for (std::size_t i = 0; i < strides.arraySize(); ++i) {
    report.strides.push_back(readStride(strides.at(i), report.limbs));
  }
  report.phase = readPhase(root.at("phase"), report.limbs);
  if (const auto hildebrand = root.find("hildebrand"))
    report.hildebrand = readHildebrand(*hildebrand);
  report.support = readSupport(root.at("support"));
  readBouts(root.at("bouts"), report);
  if (const auto byGait = root.find("by_gait"))
    for (const auto& [gait, summary] : byGait->members())
      report.byGait[gait] = readSummary(summary, report.limbs);
  if (const auto mixed = root.find("mixed_gaits")) report.mixedGaits = mixed->boolean();
  report.symmetry = readSymmetry(root.at("symmetry"));
  if (const auto speed = root.find("speed")) report.speed = readSpeed(*speed);
  if (const auto dap = root.find("dap")) report.dap = readDap(*dap);
  readProblems(root.at("problems"), report);
  if (const auto extra = root.find("extra")) readExtra(*extra, report);
  return report;
}

Report readReportJsonFile(const std::filesystem::path& path) {
  const std::string text = readWholeFile(path);
  return parseReportJson(text, path.string());
}

}  // namespace stridemark::formats
