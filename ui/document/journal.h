#pragma once
// Autosave journal (our own ".smjournal" file): a full snapshot of the project written
// atomically after every edit, so a crash or kill -9 loses nothing. Read back on reopen.
#include <QByteArray>
#include <QString>
#include <optional>

#include "model/annotation.h"

namespace stridemark::ui::journal {

inline constexpr const char* kSuffix = ".smjournal";
inline constexpr const char* kSchema = "stridemark.journal.v1";

QByteArray encode(const model::Project& project, const QString& projectPath);
// Throws stridemark::Error(format) naming the file when the journal cannot be understood.
model::Project decode(const QByteArray& bytes, const QString& fileForMessages);

// Writes through QSaveFile (temp file + rename). Throws stridemark::Error(io) on failure.
void write(const QString& file, const model::Project& project, const QString& projectPath);
std::optional<model::Project> read(const QString& file);

}  // namespace stridemark::ui::journal
