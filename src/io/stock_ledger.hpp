#pragma once
// The cold store as a ledger. A stock file STOCK has beside it STOCK.journal (one JSON object a
// line, one line per change) and STOCK.lock (an advisory flock held around every read-modify-write,
// so two bine processes never lose an update).
//
// A change is written ahead: its journal line (with the SHA-256 of the stock file before and after)
// is appended and fsync'd, then the stock file is replaced atomically. A process killed between the
// two leaves a journal one step ahead of the stock file; the next ledger opened finds the stock file
// still hashing to the entry's "before", applies the entry, and the two agree again. A stock file
// hashing to neither was edited by hand since the last entry: kept as it is, and said so.
#include <cstddef>
#include <filesystem>
#include <nlohmann/json.hpp>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "model/hops.hpp"

namespace bine {

/// SHA-256 of `bytes` as 64 lowercase hex digits (FIPS 180-4).
std::string sha256_hex(std::string_view bytes);

/// What an entry did to one lot.
enum class LotChangeKind {
  amount,   // its amount on hand changed
  added,    // the lot record was put in at the end of the file (stock receive)
  removed,  // the lot record, the last in the file, was taken out (undoing a receive)
};

/// One lot changed by an entry.
struct LotChange {
  LotChangeKind kind = LotChangeKind::amount;
  std::size_t index = 0;  // position in the stock file's "lots"
  std::string lot;        // the lot code, or "lot N" when the file gives none
  std::string variety;
  double before_g = 0.0;
  double after_g = 0.0;
  nlohmann::ordered_json record;  // added or removed: the whole lot record
};

/// One line of the journal.
struct JournalEntry {
  std::size_t id = 0;   // 1, 2, ... in journal order
  std::string time;     // UTC, ISO 8601
  std::string command;  // "receive", "adjust", "use" or "undo"
  std::string recipe;   // use: the recipe's name
  std::string recipe_file;
  std::string recipe_sha256;          // use: SHA-256 of the recipe file
  std::size_t batches = 0;            // use
  std::string on;                     // use: the brew day, YYYY-MM-DD
  std::string reason;                 // adjust: why; undo: what was undone
  std::optional<std::size_t> undoes;  // undo: the id of the entry reversed
  std::vector<LotChange> changes;
  std::string stock_before;  // SHA-256 of the stock file before the change
  std::string stock_after;   // SHA-256 of the stock file the change wrote
};

nlohmann::ordered_json entry_to_json(const JournalEntry& entry);

/// The journal's entries. Throws InputError naming the file and line of an entry it cannot read;
/// a last line cut short (no newline: the writer was killed mid-line) is not an entry.
std::vector<JournalEntry> parse_journal(std::string_view text, const std::string& file);

/// The stock file's text with every change applied, in order. Throws InputError when a lot is not
/// where the change says or does not hold the amount it says.
std::string apply_changes(std::string_view stock_text, const std::vector<LotChange>& changes, const std::string& file);

/// The changes that undo `changes` (in reverse order, before and after swapped, added <-> removed).
std::vector<LotChange> inverse_changes(const std::vector<LotChange>& changes);

/// An amount on hand as the stock file stores it: grams rounded to 0.01 g ("990 g").
double ledger_grams(double grams);

/// The stock file, its journal and its lock, open for one command.
class StockLedger {
 public:
  /// Takes the lock (waits for another bine to finish), reads stock file and journal, and completes
  /// a change the journal holds that the stock file does not yet show. `for_reading`: a stock
  /// without a journal is only read (no lock file is made beside it; nothing can be pending).
  explicit StockLedger(std::filesystem::path stock_file, bool for_reading = false);
  ~StockLedger();
  StockLedger(const StockLedger&) = delete;
  StockLedger& operator=(const StockLedger&) = delete;

  const std::filesystem::path& stock_file() const { return stock_file_; }
  std::filesystem::path journal_file() const;
  const std::string& text() const { return text_; }
  /// The stock file as the loader reads it (grams, dates, storage).
  const Stock& stock() const { return stock_; }
  const std::vector<JournalEntry>& entries() const { return entries_; }
  /// True when the stock file is not the one the last entry wrote (it was edited by hand).
  bool edited_since_last_entry() const;
  /// True when opening completed a change a killed process had journalled but not written.
  bool completed_pending() const { return completed_pending_; }

  /// Journals `entry` (id, time and hashes filled in here), then replaces the stock file. Returns
  /// the entry as written.
  const JournalEntry& commit(JournalEntry entry);

 private:
  void reload();
  void complete_pending();

  std::filesystem::path stock_file_;
  int lock_fd_ = -1;
  std::string text_;
  Stock stock_;
  std::vector<JournalEntry> entries_;
  bool completed_pending_ = false;
};

/// Paths beside the stock file.
std::filesystem::path journal_path(const std::filesystem::path& stock_file);
std::filesystem::path lock_path(const std::filesystem::path& stock_file);

}  // namespace bine
