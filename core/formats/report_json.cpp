#include "formats/report_json.h"

#include <cmath>

#include "formats/file_io.h"

namespace stridemark::formats {
namespace {

using analysis::Report;

void writeStat(JsonOut& out, const analysis::Stat& stat) {
  out.beginObject();
  out.key("n");
  out.integer(stat.n);
  out.key("mean");
  out.number(stat.mean);
  out.key("sd");
  out.number(stat.sd);
  out.key("cv");
  out.number(stat.cv);
  out.endObject();
}

void writeFps(JsonOut& out, Rational fps) {
  if (fps.den == 1) {
    out.integer(fps.num);
  } else {
    out.number(fps.toDouble());
  }
}

template <typename Value>
void writePerLimb(JsonOut& out, const Report& report, const std::vector<Value>& values) {
  out.beginObject();
  for (int i = 0; i < report.limbs.size(); ++i) {
    out.key(report.limbs.label(i));
    const auto index = static_cast<std::size_t>(i);
    out.number(index < values.size() ? values[index] : std::nullopt);
  }
  out.endObject();
}

void writeLimbs(JsonOut& out, const Report& report) {
  out.beginObject();
  for (int i = 0; i < report.limbs.size(); ++i) {
    const auto index = static_cast<std::size_t>(i);
    const analysis::LimbSummary summary =
        index < report.limbSummary.size() ? report.limbSummary[index] : analysis::LimbSummary{};
    out.key(report.limbs.label(i));
    out.beginObject();
    out.key("strides");
    out.integer(summary.strides);
    out.key("stride_s");
    writeStat(out, summary.strideS);
    out.key("stance_s");
    writeStat(out, summary.stanceS);
    out.key("swing_s");
    writeStat(out, summary.swingS);
    out.key("duty_factor");
    writeStat(out, summary.dutyFactor);
    out.endObject();
  }
  out.endObject();
}

void writeStride(JsonOut& out, const Report& report, const analysis::StrideRecord& stride) {
  out.beginObject();
  out.key("start_frame");
  out.integer(stride.startFrame);
  out.key("end_frame");
  out.integer(stride.endFrame);
  out.key("duration_s");
  out.number(stride.durationS);
  out.key("duty_factor");
  writePerLimb(out, report, stride.dutyFactor);
  out.key("phase");
  writePerLimb(out, report, stride.phase);
  out.key("gait");
  out.string(stride.gait);
  out.key("band");
  out.stringOrNull(stride.band);
  out.key("sequence");
  out.stringOrNull(stride.sequence);
  out.key("symmetrical");
  out.boolean(stride.symmetrical);
  out.key("aerial");
  out.boolean(stride.aerial);
  if (!stride.symmetrical) {
    out.key("lead");
    out.stringOrNull(stride.lead);
  }
  out.endObject();
}

void writePhase(JsonOut& out, const Report& report) {
  out.beginObject();
  for (int i = 0; i < report.limbs.size(); ++i) {
    const auto index = static_cast<std::size_t>(i);
    const analysis::PhaseSummary phase =
        index < report.phase.size() ? report.phase[index] : analysis::PhaseSummary{};
    out.key(report.limbs.label(i));
    out.beginObject();
    out.key("n");
    out.integer(phase.n);
    out.key("mean");
    out.number(phase.mean);
    out.key("r");
    out.number(phase.r);
    out.key("circ_sd");
    out.number(phase.circSd);
    out.key("rayleigh_p");
    out.number(phase.rayleighP);
    out.endObject();
  }
  out.endObject();
}

void writeNumberMap(JsonOut& out, const std::map<std::string, double>& values) {
  out.beginObject();
  for (const auto& [name, value] : values) {
    out.key(name);
    out.number(value);
  }
  out.endObject();
}

void writeSupport(JsonOut& out, const Report& report) {
  out.beginObject();
  for (std::size_t k = 0; k < report.support.size(); ++k) {
    out.key(std::to_string(k));
    out.number(report.support[k]);
  }
  out.endObject();
}

void writeBouts(JsonOut& out, const Report& report) {
  out.beginArray();
  for (const auto& bout : report.bouts) {
    out.beginObject();
    out.key("gait");
    out.string(bout.gait);
    out.key("first_stride");
    out.integer(bout.firstStride);
    out.key("last_stride");
    out.integer(bout.lastStride);
    out.key("start_frame");
    out.integer(bout.startFrame);
    out.key("end_frame");
    out.integer(bout.endFrame);
    out.endObject();
  }
  out.endArray();
}

void writeSpeed(JsonOut& out, const Report& report) {
  if (!report.speed) {
    out.null();
    return;
  }
  out.beginObject();
  out.key("m_s");
  out.number(report.speed->ms);
  out.key("froude");
  out.number(report.speed->froude);
  out.key("stride_length_m");
  out.number(report.speed->strideLengthM);
  out.key("relative_stride_length");
  out.number(report.speed->relativeStrideLength);
  out.endObject();
}

void writeProblems(JsonOut& out, const Report& report) {
  out.beginArray();
  for (const auto& problem : report.problems) {
    out.beginObject();
    out.key("frame");
    out.integer(problem.frame);
    out.key("limb");
    if (problem.limb && *problem.limb >= 0 && *problem.limb < report.limbs.size()) {
      out.string(report.limbs.label(*problem.limb));
    } else {
      out.null();
    }
    out.key("message");
    out.string(problem.message);
    out.endObject();
  }
  out.endArray();
}

void writeStrideExtra(JsonOut& out, const analysis::StrideRecord& stride) {
  out.beginObject();
  if (stride.quadrant) {
    out.key("quadrant");
    out.string(*stride.quadrant);
  }
  if (stride.hindDutyFactor) {
    out.key("hind_duty_factor");
    out.number(*stride.hindDutyFactor);
  }
  if (stride.limbPhase) {
    out.key("limb_phase");
    out.number(*stride.limbPhase);
  }
  if (stride.dapMs) {
    out.key("dap_ms");
    out.number(*stride.dapMs);
  }
  if (stride.dapPercent) {
    out.key("dap_percent");
    out.number(*stride.dapPercent);
  }
  if (stride.ipsilateralLag) {
    out.key("ipsilateral_lag");
    out.number(*stride.ipsilateralLag);
  }
  if (stride.waveDirection) {
    out.key("wave_direction");
    out.string(*stride.waveDirection);
  }
  const std::pair<const char*, const std::optional<double>*> lags[] = {
      {"fore_lag", &stride.foreLag},
      {"hind_lag", &stride.hindLag},
      {"pair_lag", &stride.pairLag},
      {"template_distance", &stride.templateDistance}};
  for (const auto& [name, value] : lags) {
    if (!*value) continue;
    out.key(name);
    out.number(**value);
  }
  out.endObject();
}

void writeExtra(JsonOut& out, const Report& report) {
  out.beginObject();
  out.key("caution");
  out.string(kCaution);
  out.key("fps_exact");
  out.string(toString(report.fps));
  out.key("phase");
  out.beginObject();
  for (int i = 0; i < report.limbs.size() && static_cast<std::size_t>(i) < report.phase.size();
       ++i) {
    const auto& phase = report.phase[static_cast<std::size_t>(i)];
    out.key(report.limbs.label(i));
    out.beginObject();
    out.key("angular_deviation");
    out.number(phase.angularDeviation);
    out.key("rayleigh_z");
    out.number(phase.rayleighZ);
    out.endObject();
  }
  out.endObject();
  if (report.hildebrand) {
    out.key("hildebrand");
    out.beginObject();
    out.key("quadrant");
    out.string(report.hildebrand->quadrant);
    out.endObject();
  }
  out.key("support_by_combination");
  writeNumberMap(out, report.supportByCombination);
  out.key("symmetry");
  out.beginObject();
  out.key("stride_s");
  writeNumberMap(out, report.symmetry.strideS.si);
  out.key("ratio");
  out.beginObject();
  const std::pair<const char*, const analysis::SymmetryValues*> measures[] = {
      {"stride_s", &report.symmetry.strideS},
      {"stance_s", &report.symmetry.stanceS},
      {"swing_s", &report.symmetry.swingS},
      {"duty_factor", &report.symmetry.dutyFactor}};
  for (const auto& [name, values] : measures) {
    out.key(name);
    writeNumberMap(out, values->ratio);
  }
  out.endObject();
  out.endObject();
  if (report.speed) {
    out.key("speed");
    out.beginObject();
    out.key("dimensionless_speed");
    out.number(report.speed->dimensionlessSpeed);
    out.endObject();
  }
  out.key("transitions");
  out.beginArray();
  for (const auto& transition : report.transitions) {
    out.beginObject();
    out.key("from_gait");
    out.string(transition.fromGait);
    out.key("to_gait");
    out.string(transition.toGait);
    out.key("frame");
    out.integer(transition.frame);
    out.key("stride");
    out.integer(transition.stride);
    out.endObject();
  }
  out.endArray();
  out.key("strides");
  out.beginArray();
  for (const auto& stride : report.strides) writeStrideExtra(out, stride);
  out.endArray();
  out.endObject();
}

}  // namespace

void writeReportJson(const Report& report, JsonOut& out) {
  out.beginObject();
  out.key("schema");
  out.string(kReportSchema);
  out.key("fps");
  writeFps(out, report.fps);
  out.key("limb_set");
  out.string(report.limbs.name());
  out.key("reference_limb");
  out.string(report.limbs.label(report.referenceLimb));
  out.key("limbs");
  writeLimbs(out, report);
  out.key("strides");
  out.beginArray();
  for (const auto& stride : report.strides) writeStride(out, report, stride);
  out.endArray();
  out.key("phase");
  writePhase(out, report);
  if (report.limbs.kind() == model::LimbSetKind::quadruped) {
    out.key("hildebrand");
    if (report.hildebrand) {
      out.beginObject();
      out.key("duty_factor");
      out.number(report.hildebrand->dutyFactor);
      out.key("limb_phase");
      out.number(report.hildebrand->limbPhase);
      out.key("band");
      out.string(report.hildebrand->band);
      out.endObject();
    } else {
      out.null();
    }
  }
  out.key("support");
  writeSupport(out, report);
  out.key("bouts");
  writeBouts(out, report);
  out.key("symmetry");
  out.beginObject();
  out.key("stance_s");
  writeNumberMap(out, report.symmetry.stanceS.si);
  out.key("swing_s");
  writeNumberMap(out, report.symmetry.swingS.si);
  out.key("duty_factor");
  writeNumberMap(out, report.symmetry.dutyFactor.si);
  out.endObject();
  out.key("speed");
  writeSpeed(out, report);
  out.key("problems");
  writeProblems(out, report);
  out.key("extra");
  writeExtra(out, report);
  out.endObject();
  out.finish();
}

std::string reportJsonText(const Report& report) {
  std::string text;
  JsonOut out([&text](std::string_view chunk) { text.append(chunk); });
  writeReportJson(report, out);
  return text;
}

void writeReportJsonFile(const std::filesystem::path& path, const Report& report) {
  AtomicFile file(path);
  JsonOut out([&file](std::string_view chunk) { file.write(chunk); });
  writeReportJson(report, out);
  file.commit();
}

}  // namespace stridemark::formats
