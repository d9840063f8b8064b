// libFuzzer target: the autosave journal reader (ui/document/journal.cpp, Qt Core only: this
// target compiles that one file, no widgets). Any input either decodes or throws
// stridemark::Error; a decoded journal encodes and decodes back to the same bytes.
#include <QByteArray>
#include <QString>
#include <cstdint>

#include "common/error.h"
#include "fuzz_support.h"
#include "ui/document/journal.h"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  using namespace stridemark;
  namespace journal = ui::journal;
  const QString projectPath = QStringLiteral("/fuzz/trial.stridemark");
  QByteArray encoded;
  try {
    const QByteArray bytes(reinterpret_cast<const char*>(data), static_cast<qsizetype>(size));
    encoded =
        journal::encode(journal::decode(bytes, QStringLiteral("fuzz.smjournal")), projectPath);
  } catch (const Error&) {
    return 0;
  }
  try {
    const auto again = journal::decode(encoded, QStringLiteral("written.smjournal"));
    fuzz::requireSame(journal::encode(again, projectPath).toStdString(), encoded.toStdString(),
                      "journal round trip is stable");
  } catch (const Error& e) {
    std::fprintf(stderr, "%s\n", e.what());
    fuzz::require(false, "a journal we wrote reads back");
  }
  return 0;
}
