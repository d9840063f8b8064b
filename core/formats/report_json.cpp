#include "formats/report_json.h"

#include "formats/file_io.h"
#include "formats/json_out.h"

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

void writeLimbs(JsonOut& out, const model::LimbSet& limbs,
                const std::vector<analysis::LimbSummary>& summaries) {
  out.beginObject();
  for (int i = 0; i < limbs.size(); ++i) {
    const auto index = static_cast<std::size_t>(i);
    const analysis::LimbSummary summary =
        index < summaries.size() ? summaries[index] : analysis::LimbSummary{};
    out.key(limbs.label(i));
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

void writePerLimb(JsonOut& out, const Report& report,
                  const std::vector<std::optional<double>>& values) {
  out.beginObject();
  for (int i = 0; i < report.limbs.size(); ++i) {
    const auto index = static_cast<std::size_t>(i);
    out.key(report.limbs.label(i));
    out.number(index < values.size() ? values[index] : std::nullopt);
  }
  out.endObject();
}

// One element of "strides" (compact: below the writer's line-break depth).
void writeStride(JsonOut& out, const Report& report, const analysis::StrideRecord& s) {
  out.beginObject();
  out.key("start_frame");
  out.integer(s.startFrame);
  out.key("end_frame");
  out.integer(s.endFrame);
  out.key("duration_s");
  out.number(s.durationS);
  out.key("duty_factor");
  writePerLimb(out, report, s.dutyFactor);
  out.key("phase");
  writePerLimb(out, report, s.phase);
  out.key("gait");
  out.string(s.gait);
  out.key("band");
  out.stringOrNull(s.band);
  out.key("sequence");
  out.stringOrNull(s.sequence);
  out.key("symmetrical");
  out.boolean(s.symmetrical);
  out.key("aerial");
  out.boolean(s.aerial);
  if (!s.symmetrical) {
    out.key("lead");
    out.stringOrNull(s.lead);
    out.key("hind_lead");
    out.stringOrNull(s.hindLead);
  }
  out.key("steady");
  out.boolean(s.steady);
  out.key("bout");
  if (s.bout >= 0) {
    out.integer(s.bout);
  } else {
    out.null();
  }
  out.endObject();
}

// One element of extra.strides: only the values that are defined.
void writeStrideExtra(JsonOut& out, const analysis::StrideRecord& s) {
  const auto number = [&out](const char* key, const std::optional<double>& v) {
    if (!v) return;
    out.key(key);
    out.number(*v);
  };
  const auto text = [&out](const char* key, const std::optional<std::string>& v) {
    if (!v) return;
    out.key(key);
    out.string(*v);
  };
  out.beginObject();
  text("quadrant", s.quadrant);
  number("hind_duty_factor", s.hindDutyFactor);
  number("limb_phase", s.limbPhase);
  number("dap_ms", s.dapMs);
  number("dap_percent", s.dapPercent);
  number("dap_lh_rf_ms", s.dapLhRfMs);
  number("dap_rh_lf_ms", s.dapRhLfMs);
  number("dap_lh_rf_percent", s.dapLhRfPercent);
  number("dap_rh_lf_percent", s.dapRhLfPercent);
  number("hind_contralateral", s.hindContralateral);
  number("fore_contralateral", s.foreContralateral);
  number("ipsilateral_lag", s.ipsilateralLag);
  text("wave_direction", s.waveDirection);
  number("fore_lag", s.foreLag);
  number("hind_lag", s.hindLag);
  number("pair_lag", s.pairLag);
  number("template_distance", s.templateDistance);
  out.key("complete");
  out.boolean(s.complete);
  text("note", s.note);
  text("excluded", s.excluded);
  out.endObject();
}

void writePhase(JsonOut& out, const model::LimbSet& limbs,
                const std::vector<analysis::PhaseSummary>& phases) {
  out.beginObject();
  for (int i = 0; i < limbs.size(); ++i) {
    const auto index = static_cast<std::size_t>(i);
    const analysis::PhaseSummary phase =
        index < phases.size() ? phases[index] : analysis::PhaseSummary{};
    out.key(limbs.label(i));
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

void writeSupport(JsonOut& out, const std::vector<double>& support) {
  out.beginObject();
  for (std::size_t k = 0; k < support.size(); ++k) {
    out.key(std::to_string(k));
    out.number(support[k]);
  }
  out.endObject();
}

void writeHildebrand(JsonOut& out, const std::optional<analysis::HildebrandSummary>& h) {
  if (!h) {
    out.null();
    return;
  }
  out.beginObject();
  out.key("n");
  out.integer(h->n);
  out.key("duty_factor");
  out.number(h->dutyFactor);
  out.key("limb_phase");
  out.number(h->limbPhase);
  out.key("band");
  out.string(h->band);
  out.endObject();
}

void writeSymmetry(JsonOut& out, const analysis::Symmetry& symmetry) {
  out.beginObject();
  out.key("stance_s");
  writeNumberMap(out, symmetry.stanceS.si);
  out.key("swing_s");
  writeNumberMap(out, symmetry.swingS.si);
  out.key("duty_factor");
  writeNumberMap(out, symmetry.dutyFactor.si);
  out.endObject();
}

void writeSpeed(JsonOut& out, const std::optional<analysis::SpeedSummary>& speed) {
  if (!speed) {
    out.null();
    return;
  }
  out.beginObject();
  out.key("m_s");
  out.number(speed->ms);
  out.key("froude");
  out.number(speed->froude);
  out.key("stride_length_m");
  out.number(speed->strideLengthM);
  out.key("relative_stride_length");
  out.number(speed->relativeStrideLength);
  out.endObject();
}

void writeDap(JsonOut& out, const std::optional<analysis::DapSummary>& dap) {
  if (!dap) {
    out.null();
    return;
  }
  out.beginObject();
  out.key("convention");
  out.string(kDapConvention);
  out.key("lh_rf_ms");
  writeStat(out, dap->lhRfMs);
  out.key("rh_lf_ms");
  writeStat(out, dap->rhLfMs);
  out.key("lh_rf_percent");
  writeStat(out, dap->lhRfPercent);
  out.key("rh_lf_percent");
  writeStat(out, dap->rhLfPercent);
  out.key("mean_ms");
  out.number(dap->meanMs);
  out.key("difference_ms");
  out.number(dap->differenceMs);
  out.endObject();
}

// A bout's, a gait's or the trial's summary (docs/methods.md §11): each member has the shape
// of the trial-level member of the same name.
void writeSummary(JsonOut& out, const model::LimbSet& limbs, const analysis::Summary& s) {
  out.beginObject();
  out.key("strides");
  out.integer(s.strides);
  out.key("limbs");
  writeLimbs(out, limbs, s.limbs);
  out.key("phase");
  writePhase(out, limbs, s.phase);
  out.key("hildebrand");
  writeHildebrand(out, s.hildebrand);
  out.key("support");
  writeSupport(out, s.support);
  out.key("symmetry");
  writeSymmetry(out, s.symmetry);
  out.key("speed");
  writeSpeed(out, s.speed);
  out.key("dap");
  writeDap(out, s.dap);
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
    out.key("summary");
    writeSummary(out, report.limbs, bout.summary);
    out.endObject();
  }
  out.endArray();
}

void writeByGait(JsonOut& out, const Report& report) {
  out.beginObject();
  for (const auto& [gait, summary] : report.byGait) {
    out.key(gait);
    writeSummary(out, report.limbs, summary);
  }
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
  for (const analysis::SymmetryMeasure& measure : analysis::kSymmetryMeasures) {
    out.key(measure.key);
    writeNumberMap(out, (report.symmetry.*measure.values).ratio);
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
  for (const analysis::StrideRecord& stride : report.strides) writeStrideExtra(out, stride);
  out.endArray();
  out.endObject();
}

void writeReport(JsonOut& out, const Report& report) {
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
  writeLimbs(out, report.limbs, report.limbSummary);
  out.key("strides");
  out.beginArray();
  for (const analysis::StrideRecord& stride : report.strides) writeStride(out, report, stride);
  out.endArray();
  out.key("phase");
  writePhase(out, report.limbs, report.phase);
  if (report.limbs.kind() == model::LimbSetKind::quadruped) {
    out.key("hildebrand");
    writeHildebrand(out, report.hildebrand);
  }
  out.key("support");
  writeSupport(out, report.support);
  out.key("bouts");
  writeBouts(out, report);
  out.key("by_gait");
  writeByGait(out, report);
  out.key("mixed_gaits");
  out.boolean(report.mixedGaits);
  out.key("symmetry");
  writeSymmetry(out, report.symmetry);
  out.key("speed");
  writeSpeed(out, report.speed);
  if (report.limbs.kind() == model::LimbSetKind::quadruped) {
    out.key("dap");
    writeDap(out, report.dap);
  }
  out.key("problems");
  writeProblems(out, report);
  out.key("extra");
  writeExtra(out, report);
  out.endObject();
}

}  // namespace

std::string reportJsonText(const Report& report) {
  JsonOut out;
  writeReport(out, report);
  return out.finish();
}

void writeReportJsonFile(const std::filesystem::path& path, const Report& report) {
  writeFileAtomically(path, reportJsonText(report), Durability::regenerable);
}

}  // namespace stridemark::formats
