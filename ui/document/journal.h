#pragma once
// Autosave journal (our own ".smjournal" file): a full snapshot of the project written
// atomically after every edit, so a crash or kill -9 loses nothing. Read back on reopen.
//
// Layout (v2): one header line, then the payload (one line of JSON):
//   stridemark.journal.v2 fnv1a64=<16 hex digits> bytes=<payload size>
// The header lets a reader tell a whole journal from a damaged or edited one before trusting
// it. v1 journals (the bare JSON, no header) still read.
#include <QByteArray>
#include <QString>
#include <cstdint>
#include <optional>

#include "model/annotation.h"

namespace stridemark::ui::journal {

inline constexpr const char* kSuffix = ".smjournal";
inline constexpr const char* kSchema = "stridemark.journal.v2";
inline constexpr const char* kSchemaV1 = "stridemark.journal.v1";
// Where a journal that failed its checks is kept for the person to inspect.
inline constexpr const char* kDamagedSuffix = ".damaged";

// core/common/checksum.h over the bytes.
std::uint64_t fnv1a64(const QByteArray& bytes);

// The whole file: header line and payload.
QByteArray encode(const model::Project& project, const QString& projectPath);
// Checks the header (v2), parses the payload and then checks the result is a project the
// project reader accepts, so a recovered journal can always be saved and reopened. Throws
// stridemark::Error(format) naming the file and what is wrong.
model::Project decode(const QByteArray& bytes, const QString& fileForMessages);

// Temp file beside it, fsync, rename (core/formats AtomicFile): a failed write leaves the last
// good journal as it was. Throws stridemark::Error(io) naming the file and the system's reason.
void write(const QString& file, const model::Project& project, const QString& projectPath);
// Nothing when no journal exists; throws Error(io) when unreadable, Error(format) when damaged.
std::optional<model::Project> read(const QString& file);
// Renames a damaged journal to `<file>.damaged` (`.damaged-2`, ... when taken) and returns the
// new name; never deletes. Throws Error(io) when the rename fails.
QString moveAside(const QString& file);

}  // namespace stridemark::ui::journal
