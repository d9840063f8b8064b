#include "formats/report_json.h"

#include <algorithm>
#include <charconv>
#include <cmath>
#include <cstring>
#include <functional>

#include "formats/file_io.h"
#include "formats/write_behind.h"

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

// Strides are formatted straight into the writer's buffer: a report of 10^5 strides is ~55 MB
// of JSON, and the generic writer's per-key bookkeeping was most of its cost. The text is the
// same as JsonOut's compact form (strides sit below its line-break depth).
class StrideText {
 public:
  explicit StrideText(const Report& report) {
    for (int i = 0; i < report.limbs.size(); ++i) {
      std::string quoted;
      appendJsonString(quoted, report.limbs.label(i));
      quoted += ':';
      labelRoom_ += quoted.size();
      labels_.push_back(std::move(quoted));
    }
  }

  void write(JsonOut& out, const analysis::StrideRecord& s) const {
    const std::size_t room = 256 + 3 * kNumber + 2 * (labelRoom_ + labels_.size() * kNumber) +
                             jsonStringRoom(s.gait) + stringRoom(s.band) + stringRoom(s.sequence) +
                             stringRoom(s.lead);
    char* p = out.beginRaw(room);
    text::NumberText& numbers = out.numbers();
    p = put(p, "{\"start_frame\":");
    p = std::to_chars(p, p + kNumber, s.startFrame).ptr;
    p = put(p, ",\"end_frame\":");
    p = std::to_chars(p, p + kNumber, s.endFrame).ptr;
    p = put(p, ",\"duration_s\":");
    p = number(p, numbers, s.durationS);
    p = put(p, ",\"duty_factor\":");
    p = perLimb(p, numbers, s.dutyFactor);
    p = put(p, ",\"phase\":");
    p = perLimb(p, numbers, s.phase);
    p = put(p, ",\"gait\":");
    p = writeJsonString(p, s.gait);
    p = put(p, ",\"band\":");
    p = stringOrNull(p, s.band);
    p = put(p, ",\"sequence\":");
    p = stringOrNull(p, s.sequence);
    p = put(p, s.symmetrical ? std::string_view(",\"symmetrical\":true")
                             : std::string_view(",\"symmetrical\":false"));
    p = put(
        p, s.aerial ? std::string_view(",\"aerial\":true") : std::string_view(",\"aerial\":false"));
    if (!s.symmetrical) {
      p = put(p, ",\"lead\":");
      p = stringOrNull(p, s.lead);
    }
    *p++ = '}';
    out.endRaw(p);
  }

  // extra.strides[i]: only the values that are defined.
  static void writeExtra(JsonOut& out, const analysis::StrideRecord& s) {
    char* p = out.beginRaw(extraRoom(s));
    out.endRaw(extraText(p, out.numbers(), s));
  }

  // Room extraText needs for `s`.
  static std::size_t extraRoom(const analysis::StrideRecord& s) {
    return 256 + 10 * kNumber + stringRoom(s.quadrant) + stringRoom(s.waveDirection);
  }

  // Writes the extra.strides element of `s` at `p` and returns its end.
  static char* extraText(char* p, text::NumberText& numbers, const analysis::StrideRecord& s) {
    char separator = '{';
    const auto field = [&](std::string_view quotedKey) {
      *p++ = separator;
      separator = ',';
      p = put(p, quotedKey);
    };
    const auto optionalNumber = [&](std::string_view quotedKey, const std::optional<double>& v) {
      if (!v) return;
      field(quotedKey);
      p = number(p, numbers, *v);
    };
    const auto optionalText = [&](std::string_view quotedKey, const std::optional<std::string>& v) {
      if (!v) return;
      field(quotedKey);
      p = writeJsonString(p, *v);
    };
    optionalText("\"quadrant\":", s.quadrant);
    optionalNumber("\"hind_duty_factor\":", s.hindDutyFactor);
    optionalNumber("\"limb_phase\":", s.limbPhase);
    optionalNumber("\"dap_ms\":", s.dapMs);
    optionalNumber("\"dap_percent\":", s.dapPercent);
    optionalNumber("\"ipsilateral_lag\":", s.ipsilateralLag);
    optionalText("\"wave_direction\":", s.waveDirection);
    optionalNumber("\"fore_lag\":", s.foreLag);
    optionalNumber("\"hind_lag\":", s.hindLag);
    optionalNumber("\"pair_lag\":", s.pairLag);
    optionalNumber("\"template_distance\":", s.templateDistance);
    if (separator == '{') *p++ = '{';
    *p++ = '}';
    return p;
  }

 private:
  static constexpr std::size_t kNumber = 32;  // room for one number, integer or null

  static std::size_t stringRoom(const std::optional<std::string>& value) {
    return value ? jsonStringRoom(*value) : 4;
  }

  static char* put(char* p, std::string_view text) {
    std::memcpy(p, text.data(), text.size());
    return p + text.size();
  }

  static char* number(char* p, text::NumberText& numbers, double value) {
    return std::isfinite(value) ? numbers.write(p, value) : put(p, "null");
  }

  static char* stringOrNull(char* p, const std::optional<std::string>& value) {
    return value ? writeJsonString(p, *value) : put(p, "null");
  }

  char* perLimb(char* p, text::NumberText& numbers,
                const analysis::LimbValues<std::optional<double>>& values) const {
    *p++ = '{';
    for (std::size_t i = 0; i < labels_.size(); ++i) {
      if (i > 0) *p++ = ',';
      p = put(p, labels_[i]);
      const std::optional<double> value = i < values.size() ? values[i] : std::nullopt;
      p = value ? number(p, numbers, *value) : put(p, "null");
    }
    *p++ = '}';
    return p;
  }

  std::vector<std::string> labels_;  // quoted limb labels with their colon: "LF":
  std::size_t labelRoom_ = 0;
};

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

// Writes the elements of extra.strides (the array is open).
using ExtraStrides = std::function<void(JsonOut&)>;

void writeExtra(JsonOut& out, const Report& report, const ExtraStrides& extraStrides) {
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
  extraStrides(out);
  out.endArray();
  out.endObject();
}

// Everything up to and including the opening of the strides array.
void writeHead(JsonOut& out, const Report& report) {
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
}

// Everything after the last stride.
void writeTail(JsonOut& out, const Report& report, const ExtraStrides& extraStrides) {
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
  writeExtra(out, report, extraStrides);
  out.endObject();
  out.finish();
}

}  // namespace

void writeReportJson(const Report& report, JsonOut& out) {
  writeHead(out, report);
  const StrideText strideText(report);
  for (const auto& stride : report.strides) strideText.write(out, stride);
  writeTail(out, report, [&report](JsonOut& extra) {
    for (const auto& stride : report.strides) StrideText::writeExtra(extra, stride);
  });
}

std::string reportJsonText(const Report& report) {
  std::string text;
  JsonOut out([&text](std::string_view chunk) { text.append(chunk); });
  writeReportJson(report, out);
  return text;
}

void writeReportJsonFile(const std::filesystem::path& path, const Report& report) {
  // Regenerable: a report is made again from its input. Written behind the formatting.
  WriteBehindFile file(path, Durability::regenerable);
  JsonOut out([&file](std::string_view chunk) { file.write(chunk); });
  writeReportJson(report, out);
  file.commit();
}

// The extra.strides elements, comma-separated, in pieces that are never copied or moved.
struct ReportJsonStream::Pending {
  explicit Pending(const Report& head) : strides(head) {}

  void addExtra(const analysis::StrideRecord& s, text::NumberText& numbers) {
    const std::size_t room = StrideText::extraRoom(s) + 1;
    if (pieces.empty() || pieces.back().capacity - pieces.back().size < room) {
      const std::size_t capacity = std::max(kPiece, room);
      pieces.push_back({std::make_unique_for_overwrite<char[]>(capacity), 0, capacity});
    }
    Piece& piece = pieces.back();
    char* p = piece.text.get() + piece.size;
    if (any) *p++ = ',';
    any = true;
    p = StrideText::extraText(p, numbers, s);
    piece.size = static_cast<std::size_t>(p - piece.text.get());
  }

  static constexpr std::size_t kPiece = std::size_t{1} << 20;
  struct Piece {
    std::unique_ptr<char[]> text;
    std::size_t size = 0;
    std::size_t capacity = 0;
  };
  StrideText strides;
  std::vector<Piece> pieces;
  bool any = false;
};

ReportJsonStream::ReportJsonStream(JsonOut& out) : out_(out) {}
ReportJsonStream::~ReportJsonStream() = default;

void ReportJsonStream::begin(const Report& head) {
  writeHead(out_, head);
  pending_ = std::make_unique<Pending>(head);
}

void ReportJsonStream::consume(std::span<const analysis::StrideRecord> strides) {
  for (const analysis::StrideRecord& s : strides) {
    pending_->strides.write(out_, s);
    pending_->addExtra(s, out_.numbers());  // same thread as the strides' own text
  }
}

void ReportJsonStream::finish(const Report& report) {
  writeTail(out_, report, [this](JsonOut& extra) {
    if (!pending_ || !pending_->any) return;
    extra.beginRawText();
    for (const Pending::Piece& piece : pending_->pieces)
      extra.rawText(std::string_view(piece.text.get(), piece.size));
  });
  pending_.reset();
}

Report scoreToReportJson(JsonOut& out, model::Project project,
                         const analysis::AnalysisOptions& options) {
  ReportJsonStream stream(out);
  Report report = analysis::analyseStreaming(std::move(project), options, stream);
  stream.finish(report);
  return report;
}

Report scoreToReportJsonFile(const std::filesystem::path& path, model::Project project,
                             const analysis::AnalysisOptions& options) {
  // Regenerable: a report is made again from its input. Written behind, so that the kernel's
  // copying overlaps the scoring.
  WriteBehindFile file(path, Durability::regenerable);
  JsonOut out([&file](std::string_view chunk) { file.write(chunk); });
  Report report = scoreToReportJson(out, std::move(project), options);
  file.commit();
  return report;
}

}  // namespace stridemark::formats
