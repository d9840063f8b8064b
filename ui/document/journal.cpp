#include "ui/document/journal.h"

#include <QFile>
#include <QJsonArray>
#include <QJsonDocument>
#include <QJsonObject>
#include <QSaveFile>

#include "common/error.h"

namespace stridemark::ui::journal {

namespace {

QString rateText(Rational r) {
  return QString::fromStdString(toString(r));
}

QJsonObject encodeTrial(const model::TrialCard& t) {
  QJsonObject o;
  o["subject"] = QString::fromStdString(t.subject);
  o["species"] = QString::fromStdString(t.species);
  o["condition"] = QString::fromStdString(t.condition);
  o["observer"] = QString::fromStdString(t.observer);
  o["notes"] = QString::fromStdString(t.notes);
  if (t.speedMs) o["speed_m_s"] = *t.speedMs;
  o["speed_source"] = QString::fromStdString(t.speedSource);
  if (t.legLengthM) o["leg_length_m"] = *t.legLengthM;
  return o;
}

model::TrialCard decodeTrial(const QJsonObject& o) {
  model::TrialCard t;
  t.subject = o["subject"].toString().toStdString();
  t.species = o["species"].toString().toStdString();
  t.condition = o["condition"].toString().toStdString();
  t.observer = o["observer"].toString().toStdString();
  t.notes = o["notes"].toString().toStdString();
  if (o.contains("speed_m_s")) t.speedMs = o["speed_m_s"].toDouble();
  t.speedSource = o["speed_source"].toString(QStringLiteral("belt")).toStdString();
  if (o.contains("leg_length_m")) t.legLengthM = o["leg_length_m"].toDouble();
  return t;
}

[[noreturn]] void fail(const QString& file, const QString& what) {
  throw Error(ErrorCategory::format,
              QStringLiteral("%1: autosave journal is unreadable (%2). Delete or rename it to "
                             "open the project without recovery.")
                  .arg(file, what)
                  .toStdString());
}

}  // namespace

QByteArray encode(const model::Project& project, const QString& projectPath) {
  const auto& a = project.annotation;
  QJsonObject root;
  root["schema"] = QString::fromLatin1(kSchema);
  root["project_path"] = projectPath;
  root["limb_set"] = QString::fromStdString(a.limbs.name());
  root["capture_rate"] = rateText(a.captureRate);
  root["reference_limb"] = a.referenceLimb;
  QJsonArray events;
  for (const auto& e : a.events) {
    events.append(QJsonArray{e.limb, e.kind == model::EventKind::touchdown ? 0 : 1,
                             static_cast<qint64>(e.frame)});
  }
  root["events"] = events;
  QJsonArray hidden;
  for (const auto& h : a.hidden) {
    hidden.append(QJsonArray{h.limb, static_cast<qint64>(h.first), static_cast<qint64>(h.last)});
  }
  root["hidden"] = hidden;
  if (a.clip)
    root["clip"] =
        QJsonArray{static_cast<qint64>(a.clip->first), static_cast<qint64>(a.clip->last)};
  root["trial"] = encodeTrial(project.trial);
  if (project.video) {
    QJsonObject v;
    v["path"] = QString::fromStdString(project.video->path);
    v["signature"] = QString::fromStdString(project.video->signature);
    v["frame_count"] = static_cast<qint64>(project.video->frameCount);
    v["file_rate"] = rateText(project.video->fileRate);
    root["video"] = v;
  }
  return QJsonDocument(root).toJson(QJsonDocument::Compact);
}

model::Project decode(const QByteArray& bytes, const QString& file) {
  QJsonParseError err{};
  const auto json = QJsonDocument::fromJson(bytes, &err);
  if (json.isNull())
    fail(file, QStringLiteral("JSON error at byte %1: %2").arg(err.offset).arg(err.errorString()));
  const auto root = json.object();
  if (root["schema"].toString() != QLatin1String(kSchema))
    fail(file, QStringLiteral("unknown schema"));
  model::Project p;
  auto& a = p.annotation;
  a.limbs = model::LimbSet::fromName(root["limb_set"].toString().toStdString());
  a.captureRate = parseRate(root["capture_rate"].toString().toStdString(), "capture rate");
  a.referenceLimb = root["reference_limb"].toInt();
  if (a.referenceLimb < 0 || a.referenceLimb >= a.limbs.size()) fail(file, "bad reference limb");
  for (const auto& item : root["events"].toArray()) {
    const auto e = item.toArray();
    const int limb = e.at(0).toInt(-1);
    if (e.size() != 3 || limb < 0 || limb >= a.limbs.size()) fail(file, "bad event entry");
    a.events.push_back(
        {e.at(2).toInteger(), limb,
         e.at(1).toInt() == 0 ? model::EventKind::touchdown : model::EventKind::liftoff});
  }
  for (const auto& item : root["hidden"].toArray()) {
    const auto h = item.toArray();
    if (h.size() != 3) fail(file, "bad hidden span entry");
    a.hidden.push_back({h.at(0).toInt(), h.at(1).toInteger(), h.at(2).toInteger()});
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

void write(const QString& file, const model::Project& project, const QString& projectPath) {
  QSaveFile out(file);
  if (!out.open(QIODevice::WriteOnly) || out.write(encode(project, projectPath)) < 0 ||
      !out.commit()) {
    throw Error(ErrorCategory::io,
                QStringLiteral("%1: cannot write the autosave journal (%2). Check free space "
                               "and write permission of the folder; save the project elsewhere.")
                    .arg(file, out.errorString())
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

}  // namespace stridemark::ui::journal
