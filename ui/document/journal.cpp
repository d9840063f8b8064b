#include "ui/document/journal.h"

#include <QFile>
#include <QJsonArray>
#include <QJsonDocument>
#include <QJsonObject>
#include <QRegularExpression>

#include "common/checksum.h"
#include "common/error.h"
#include "formats/file_io.h"
#include "formats/json_out.h"
#include "formats/project_file.h"

namespace stridemark::ui::journal {

namespace {

model::TrialCard decodeTrial(const QJsonObject& o) {
  model::TrialCard t;
  t.subject = o["subject"].toString().toStdString();
  t.species = o["species"].toString().toStdString();
  t.condition = o["condition"].toString().toStdString();
  t.observer = o["observer"].toString().toStdString();
  t.examDate = o["exam_date"].toString().toStdString();
  t.notes = o["notes"].toString().toStdString();
  if (o.contains("speed_m_s")) t.speedMs = o["speed_m_s"].toDouble();
  t.speedSource = o["speed_source"].toString(QStringLiteral("belt")).toStdString();
  if (o.contains("leg_length_m")) t.legLengthM = o["leg_length_m"].toDouble();
  for (const auto& item : o["speed_changes"].toArray()) {
    const auto s = item.toArray();
    if (s.size() == 2) t.speedChanges.push_back({s.at(0).toInteger(), s.at(1).toDouble()});
  }
  return t;
}

// What is wrong with a payload, before the file name is known to the message.
struct BadPayload {
  QString what;
};

[[noreturn]] void bad(const QString& what) {
  throw BadPayload{what};
}

[[noreturn]] void fail(const QString& file, const QString& what) {
  throw Error(ErrorCategory::format,
              QStringLiteral("%1: autosave journal is damaged (%2)").arg(file, what).toStdString());
}

// v2: "stridemark.journal.v2 fnv1a64=<hex> bytes=<n>\n" then exactly n payload bytes whose
// FNV-1a matches. Returns the payload, or throws naming the first check that failed.
QByteArray checkedPayload(const QByteArray& bytes) {
  const qsizetype newline = bytes.indexOf('\n');
  if (newline < 0) bad(QStringLiteral("no header line"));
  static const QRegularExpression header(
      QStringLiteral("^stridemark\\.journal\\.v2 fnv1a64=([0-9a-f]{16}) bytes=([0-9]{1,12})$"));
  const auto match = header.match(QString::fromLatin1(bytes.left(newline)));
  if (!match.hasMatch()) bad(QStringLiteral("header line is not a v2 journal header"));
  const QByteArray payload = bytes.mid(newline + 1);
  const qint64 declared = match.captured(2).toLongLong();
  if (payload.size() != declared)
    bad(QStringLiteral("%1 payload bytes where the header promises %2 (cut short or appended to)")
            .arg(payload.size())
            .arg(declared));
  const QString sum = QStringLiteral("%1").arg(fnv1a64(payload), 16, 16, QLatin1Char('0'));
  if (sum != match.captured(1))
    bad(QStringLiteral("checksum %1 where the header promises %2 (the content was changed)")
            .arg(sum, match.captured(1)));
  return payload;
}

// Written with core's plain JSON writer: the journal is rewritten on every edit, and building
// a QJsonDocument of a 20,000-event trial took ~12 ms of each edit
// (tests/bench/desk_rescore_bench).
QByteArray encodePayload(const model::Project& project, const QString& projectPath) {
  const auto& a = project.annotation;
  formats::JsonOut out(0);  // compact: one line
  const auto text = [&out](const QString& s) { out.string(s.toStdString()); };
  out.beginObject();
  out.key("schema");
  out.string(kSchema);
  out.key("project_path");
  text(projectPath);
  out.key("limb_set");
  out.string(a.limbs.name());
  out.key("capture_rate");
  out.string(toString(a.captureRate));
  out.key("reference_limb");
  out.integer(a.referenceLimb);
  out.key("events");
  out.beginArray();
  for (const auto& e : a.events) {
    out.beginArray();
    out.integer(e.limb);
    out.integer(e.kind == model::EventKind::touchdown ? 0 : 1);
    out.integer(e.frame);
    out.endArray();
  }
  out.endArray();
  out.key("hidden");
  out.beginArray();
  for (const auto& h : a.hidden) {
    out.beginArray();
    out.integer(h.limb);
    out.integer(h.first);
    out.integer(h.last);
    out.endArray();
  }
  out.endArray();
  out.key("excluded");
  out.beginArray();
  for (const auto& x : a.excluded) {
    out.beginArray();
    out.integer(x.startFrame);
    out.string(x.reason);
    out.endArray();
  }
  out.endArray();
  if (a.clip) {
    out.key("clip");
    out.beginArray();
    out.integer(a.clip->first);
    out.integer(a.clip->last);
    out.endArray();
  }
  const model::TrialCard& t = project.trial;
  out.key("trial");
  out.beginObject();
  const std::pair<const char*, const std::string*> texts[] = {
      {"subject", &t.subject},         {"species", &t.species},    {"condition", &t.condition},
      {"observer", &t.observer},       {"exam_date", &t.examDate}, {"notes", &t.notes},
      {"speed_source", &t.speedSource}};
  for (const auto& [key, value] : texts) {
    out.key(key);
    out.string(*value);
  }
  if (t.speedMs) {
    out.key("speed_m_s");
    out.number(*t.speedMs);
  }
  if (t.legLengthM) {
    out.key("leg_length_m");
    out.number(*t.legLengthM);
  }
  out.key("speed_changes");
  out.beginArray();
  for (const auto& step : t.speedChanges) {
    out.beginArray();
    out.integer(step.fromFrame);
    out.number(step.ms);
    out.endArray();
  }
  out.endArray();
  out.endObject();
  if (project.video) {
    out.key("video");
    out.beginObject();
    out.key("path");
    out.string(project.video->path);
    out.key("signature");
    out.string(project.video->signature);
    out.key("frame_count");
    out.integer(project.video->frameCount);
    out.key("file_rate");
    out.string(toString(project.video->fileRate));
    out.endObject();
  }
  out.endObject();
  const std::string json = out.finish();
  return QByteArray(json.data(), static_cast<qsizetype>(json.size()));
}

model::Project decodePayload(const QByteArray& bytes, bool v2) {
  QJsonParseError err{};
  const auto json = QJsonDocument::fromJson(bytes, &err);
  if (json.isNull())
    bad(QStringLiteral("JSON error at byte %1: %2").arg(err.offset).arg(err.errorString()));
  const auto root = json.object();
  if (root["schema"].toString() != QLatin1String(v2 ? kSchema : kSchemaV1))
    bad(QStringLiteral("unknown schema"));
  model::Project p;
  auto& a = p.annotation;
  a.limbs = model::LimbSet::fromName(root["limb_set"].toString().toStdString());
  a.captureRate = parseRate(root["capture_rate"].toString().toStdString(), "capture rate");
  a.referenceLimb = root["reference_limb"].toInt();
  if (a.referenceLimb < 0 || a.referenceLimb >= a.limbs.size())
    bad(QStringLiteral("bad reference limb"));
  for (const auto& item : root["events"].toArray()) {
    const auto e = item.toArray();
    const int limb = e.at(0).toInt(-1);
    if (e.size() != 3 || limb < 0 || limb >= a.limbs.size()) bad(QStringLiteral("bad event entry"));
    a.events.push_back(
        {e.at(2).toInteger(), limb,
         e.at(1).toInt() == 0 ? model::EventKind::touchdown : model::EventKind::liftoff});
  }
  for (const auto& item : root["hidden"].toArray()) {
    const auto h = item.toArray();
    const int limb = h.at(0).toInt(-1);
    // Found by fuzz_journal: an unknown limb here reached the project writer's label lookup.
    if (h.size() != 3 || limb < 0 || limb >= a.limbs.size())
      bad(QStringLiteral("bad hidden span entry"));
    a.hidden.push_back({limb, h.at(1).toInteger(), h.at(2).toInteger()});
  }
  for (const auto& item : root["excluded"].toArray()) {
    const auto x = item.toArray();
    if (x.size() != 2) bad(QStringLiteral("bad excluded stride entry"));
    a.excluded.push_back({x.at(0).toInteger(), x.at(1).toString().toStdString()});
  }
  if (root.contains("clip")) {
    const auto c = root["clip"].toArray();
    a.clip = model::FrameRange{c.at(0).toInteger(), c.at(1).toInteger()};
  }
  a.normalize();
  p.trial = decodeTrial(root["trial"].toObject());
  if (root.contains("video")) {
    const auto v = root["video"].toObject();
    model::VideoLink link;
    link.path = v["path"].toString().toStdString();
    link.signature = v["signature"].toString().toStdString();
    link.frameCount = v["frame_count"].toInteger();
    const auto fileRate = v["file_rate"].toString();
    if (fileRate != QLatin1String("0") && !fileRate.isEmpty())
      link.fileRate = parseRate(fileRate.toStdString(), "file rate");
    p.video = link;
  }
  return p;
}

}  // namespace

std::uint64_t fnv1a64(const QByteArray& bytes) {
  return stridemark::fnv1a64(
      std::string_view(bytes.constData(), static_cast<std::size_t>(bytes.size())));
}

QByteArray encode(const model::Project& project, const QString& projectPath) {
  const QByteArray payload = encodePayload(project, projectPath);
  const QByteArray header = QStringLiteral("%1 fnv1a64=%2 bytes=%3\n")
                                .arg(QLatin1String(kSchema))
                                .arg(fnv1a64(payload), 16, 16, QLatin1Char('0'))
                                .arg(payload.size())
                                .toLatin1();
  return header + payload;
}

model::Project decode(const QByteArray& bytes, const QString& file) {
  try {
    const bool v1 = bytes.startsWith('{');  // v1 journals were the bare JSON
    model::Project journalled = decodePayload(v1 ? bytes : checkedPayload(bytes), !v1);
    // The project reader's checks are stricter than the journal's layout: recovering only what
    // it accepts means a recovered project can be saved and opened again.
    return formats::parseProjectJson(formats::projectJsonText(journalled),
                                     file.toStdString() + " (as a project)");
  } catch (const BadPayload& e) {
    fail(file, e.what);
  } catch (const Error& e) {
    fail(file, QString::fromStdString(e.what()));
  }
}

void write(const QString& file, const model::Project& project, const QString& projectPath) {
  try {
    formats::writeFileAtomically(file.toStdString(), encode(project, projectPath).toStdString(),
                                 formats::Durability::survivePowerLoss);
  } catch (const Error& e) {
    throw Error(ErrorCategory::io,
                QStringLiteral("Autosave journal not updated: %1. The last good journal is "
                               "kept, but edits since then are only in memory: free space on "
                               "that disk, or save the project elsewhere (File > Save As).")
                    .arg(QString::fromStdString(e.what()))
                    .toStdString());
  }
}

std::optional<model::Project> read(const QString& file) {
  QFile in(file);
  if (!in.exists()) return std::nullopt;
  if (!in.open(QIODevice::ReadOnly)) {
    throw Error(ErrorCategory::io, QStringLiteral("%1: cannot read the autosave journal (%2).")
                                       .arg(file, in.errorString())
                                       .toStdString());
  }
  return decode(in.readAll(), file);
}

QString moveAside(const QString& file) {
  QString target = file + QLatin1String(kDamagedSuffix);
  for (int n = 2; QFile::exists(target); ++n)
    target = file + QLatin1String(kDamagedSuffix) + QStringLiteral("-%1").arg(n);
  if (!QFile::rename(file, target)) {
    throw Error(ErrorCategory::io,
                QStringLiteral("%1: could not move the damaged journal aside to %2; move it "
                               "yourself before opening the project again.")
                    .arg(file, target)
                    .toStdString());
  }
  return target;
}

}  // namespace stridemark::ui::journal
