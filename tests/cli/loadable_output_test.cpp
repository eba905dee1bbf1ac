// End-to-end (in-process): bine never writes a file its own loader would refuse. An input bine
// reads whose output would be larger than the 32 MB bine reads (io/file_io.hpp kMaxInputBytes,
// 32 x 1024 x 1024 = 33,554,432 bytes) is refused with exit 3 and one line, and neither the file
// nor a temporary file is left; a journal that would grow past it refuses the change.
#include <doctest/doctest.h>

#include <algorithm>
#include <filesystem>
#include <fstream>
#include <set>
#include <string>
#include <vector>

#include "cli/run_in_process.hpp"
#include "cli/temp_dir.hpp"

using bine::test::fixture;
using bine::test::slurp;

namespace {

namespace fs = std::filesystem;

constexpr std::size_t kLimitBytes = 32u * 1024u * 1024u;  // the 32 MB bine reads, hand arithmetic above

std::set<std::string> names_in(const fs::path& folder) {
  std::set<std::string> names;
  for (const auto& entry : fs::directory_iterator(folder)) names.insert(entry.path().filename().string());
  return names;
}

std::size_t line_count(const std::string& text) {
  return static_cast<std::size_t>(std::count(text.begin(), text.end(), '\n'));
}

}  // namespace

TEST_CASE("import: a 5 MB CSV whose catalog would be over 32 MB is refused, and nothing is written") {
  const bine::test::TempDir scratch;
  const fs::path csv = scratch.path() / "spec-sheet.csv";
  {
    // 450,000 rows of 8-13 bytes: 5 MB, far under the limit. Each becomes a variety written over 5
    // indented lines, "{", "alpha_acid": 5.0, "name": "V...", "total_oil": 1.0, "}," (at least 80
    // bytes by hand count), so the catalog is over 450,000 x 80 = 36,000,000 bytes > 33,554,432.
    std::ofstream out(csv, std::ios::binary);
    out << "Variety,Alpha (%),Total oil (mL/100 g)\n";
    for (int i = 0; i < 450000; ++i) out << 'V' << i << ",5,1\n";
  }
  REQUIRE(fs::file_size(csv) < kLimitBytes);
  const fs::path catalog = scratch.path() / "catalog.json";
  const auto run = bine::test::run_cli({"import", csv.string(), "--to", "catalog", "--out", catalog.string()});
  INFO(run.err);
  CHECK(run.status == 3);
  CHECK(line_count(run.err) == 1);
  CHECK(run.err.find(catalog.string() + " would be a ") != std::string::npos);
  CHECK(run.err.find("larger than the 32 MB bine reads, so it is not written") != std::string::npos);
  CHECK(run.out.empty());
  // Neither the catalog nor a temporary file (.catalog.json.XXXXXX) is there.
  CHECK(names_in(scratch.path()) == std::set<std::string>{"spec-sheet.csv"});
}

TEST_CASE("stock receive: lots that would make the stock file over 32 MB are refused, stock and journal untouched") {
  const bine::test::TempDir scratch;
  const fs::path stock = scratch.path() / "stock.json";
  fs::copy_file(fixture("stock-ledger.json"), stock);
  const std::string before = slurp(stock);
  const fs::path csv = scratch.path() / "certificates.csv";
  {
    // 160,000 rows of about 50 bytes: 8 MB. Each lot is written over 13 indented lines (variety,
    // code, form, alpha, date, HSI, storage temperature and package, amount): at least 220 bytes
    // by hand count, so the stock file is over 160,000 x 220 = 35,200,000 bytes > 33,554,432.
    std::ofstream out(csv, std::ios::binary);
    out << "Lot,Variety,Alpha (%),Amount (kg),Packaged,Form,HSI\n";
    for (int i = 0; i < 160000; ++i) out << 'L' << i << ",Fernlight,9.5,1.5,2026-02-01,pellet,0.28\n";
  }
  REQUIRE(fs::file_size(csv) < kLimitBytes);
  const auto run = bine::test::run_cli({"--catalog", fixture("stock-ledger-catalog.json"), "stock", "--stock",
                                        stock.string(), "receive", "--from", csv.string(), "--stored", "-2 C,vacuum"});
  INFO(run.err);
  CHECK(run.status == 3);
  CHECK(line_count(run.err) == 1);
  CHECK(run.err.find(stock.string() + " would be a ") != std::string::npos);
  CHECK(run.err.find("larger than the 32 MB bine reads") != std::string::npos);
  CHECK(slurp(stock) == before);
  // No journal, no temporary file; the lock file stays by design (stock_ledger.hpp: never unlinked).
  CHECK(names_in(scratch.path()) == std::set<std::string>{"certificates.csv", "stock.json", "stock.json.lock"});
}

TEST_CASE("stock adjust: a journal just under 32 MB that the entry would push over refuses the change") {
  const bine::test::TempDir scratch;
  const fs::path stock = scratch.path() / "stock.json";
  fs::copy_file(fixture("stock-ledger.json"), stock);
  const std::string before = slurp(stock);
  const fs::path journal = scratch.path() / "stock.json.journal";
  // Empty lines (read and skipped as no entry) up to 232 bytes under the limit; an entry holds two
  // SHA-256 digests of 64 hex digits and their keys alone (2 x 64 + 30 = 158 bytes), its time, lot,
  // variety and amounts: over 232 bytes.
  const std::size_t journal_bytes = kLimitBytes - 232;
  { std::ofstream(journal, std::ios::binary) << std::string(journal_bytes, '\n'); }
  // The journal as it is is read: stock history works and lists nothing.
  const auto history = bine::test::run_cli(
      {"--catalog", fixture("stock-ledger-catalog.json"), "stock", "--stock", stock.string(), "history"});
  CHECK(history.status == 0);
  const auto run = bine::test::run_cli({"--catalog", fixture("stock-ledger-catalog.json"), "stock", "--stock",
                                        stock.string(), "adjust", "FL-1", "--to", "900 g", "--reason", "count"});
  INFO(run.err);
  CHECK(run.status == 3);
  CHECK(line_count(run.err) == 1);
  // (33,554,200 + an entry of 233 to about 400 bytes) / 10^6 = 33.55 MB: 33.6 to one decimal.
  CHECK(run.err.find(journal.string() + " would grow to 33.6 MB") != std::string::npos);
  CHECK(run.err.find("move the journal aside") != std::string::npos);
  CHECK(fs::file_size(journal) == journal_bytes);
  CHECK(slurp(stock) == before);
  CHECK(names_in(scratch.path()) == std::set<std::string>{"stock.json", "stock.json.journal", "stock.json.lock"});
}
