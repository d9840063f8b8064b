// libFuzzer target: the autosave journal reader (ui/document/journal.cpp, Qt Core only: this
// target compiles that one file, no widgets). Any input either decodes or throws
// stridemark::Error; a decoded journal encodes and decodes back to the same bytes. An input
// without the v2 header is read twice: as it is (a v1 journal, or a damaged header) and as the
// payload of a v2 journal with a correct header, so mutations reach the payload's checks
// instead of stopping at the checksum.
#include <QByteArray>
#include <QString>
#include <cstdint>

#include "common/error.h"
#include "fuzz_support.h"
#include "ui/document/journal.h"

namespace {

using namespace stridemark;
namespace journal = ui::journal;

QByteArray withHeader(const QByteArray& payload) {
  return QStringLiteral("%1 fnv1a64=%2 bytes=%3\n")
             .arg(QLatin1String(journal::kSchema))
             .arg(journal::fnv1a64(payload), 16, 16, QLatin1Char('0'))
             .arg(payload.size())
             .toLatin1() +
         payload;
}

void decodeAndRoundTrip(const QByteArray& bytes) {
  const QString projectPath = QStringLiteral("/fuzz/trial.stridemark");
  QByteArray encoded;
  try {
    encoded =
        journal::encode(journal::decode(bytes, QStringLiteral("fuzz.smjournal")), projectPath);
  } catch (const Error&) {
    return;
  }
  try {
    const auto again = journal::decode(encoded, QStringLiteral("written.smjournal"));
    fuzz::requireSame(journal::encode(again, projectPath).toStdString(), encoded.toStdString(),
                      "journal round trip is stable");
  } catch (const Error& e) {
    std::fprintf(stderr, "%s\n", e.what());
    fuzz::require(false, "a journal we wrote reads back");
  }
}

}  // namespace

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  const QByteArray bytes(reinterpret_cast<const char*>(data), static_cast<qsizetype>(size));
  decodeAndRoundTrip(bytes);
  if (!bytes.startsWith(journal::kSchema)) decodeAndRoundTrip(withHeader(bytes));
  return 0;
}
