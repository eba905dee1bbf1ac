// The stock file's journal, its lock and the write-ahead order (see stock_ledger.hpp).
#include "io/stock_ledger.hpp"

#include <fcntl.h>
#include <fmt/format.h>
#include <sys/file.h>
#include <unistd.h>

#include <array>
#include <cerrno>
#include <chrono>
#include <cmath>
#include <cstdint>
#include <cstring>
#include <utility>

#include "io/file_io.hpp"
#include "io/json_fields.hpp"
#include "io/loaders.hpp"
#include "model/errors.hpp"
#include "model/names.hpp"

namespace bine {
namespace {

using ordered_json = nlohmann::ordered_json;

// SHA-256, FIPS 180-4 section 6.2: the round constants are the first 32 bits of the fractional
// parts of the cube roots of the first 64 primes.
constexpr std::array<std::uint32_t, 64> kRound{
    0x428a2f98, 0x71374491, 0xb5c0fbcf, 0xe9b5dba5, 0x3956c25b, 0x59f111f1, 0x923f82a4, 0xab1c5ed5,
    0xd807aa98, 0x12835b01, 0x243185be, 0x550c7dc3, 0x72be5d74, 0x80deb1fe, 0x9bdc06a7, 0xc19bf174,
    0xe49b69c1, 0xefbe4786, 0x0fc19dc6, 0x240ca1cc, 0x2de92c6f, 0x4a7484aa, 0x5cb0a9dc, 0x76f988da,
    0x983e5152, 0xa831c66d, 0xb00327c8, 0xbf597fc7, 0xc6e00bf3, 0xd5a79147, 0x06ca6351, 0x14292967,
    0x27b70a85, 0x2e1b2138, 0x4d2c6dfc, 0x53380d13, 0x650a7354, 0x766a0abb, 0x81c2c92e, 0x92722c85,
    0xa2bfe8a1, 0xa81a664b, 0xc24b8b70, 0xc76c51a3, 0xd192e819, 0xd6990624, 0xf40e3585, 0x106aa070,
    0x19a4c116, 0x1e376c08, 0x2748774c, 0x34b0bcb5, 0x391c0cb3, 0x4ed8aa4a, 0x5b9cca4f, 0x682e6ff3,
    0x748f82ee, 0x78a5636f, 0x84c87814, 0x8cc70208, 0x90befffa, 0xa4506ceb, 0xbef9a3f7, 0xc67178f2};

constexpr std::uint32_t rotr(std::uint32_t x, int n) { return (x >> n) | (x << (32 - n)); }

void sha256_block(std::array<std::uint32_t, 8>& h, const unsigned char* block) {
  std::array<std::uint32_t, 64> w{};
  for (int t = 0; t < 16; ++t)
    w[t] = (std::uint32_t{block[4 * t]} << 24) | (std::uint32_t{block[4 * t + 1]} << 16) |
           (std::uint32_t{block[4 * t + 2]} << 8) | std::uint32_t{block[4 * t + 3]};
  for (int t = 16; t < 64; ++t) {
    const std::uint32_t s0 = rotr(w[t - 15], 7) ^ rotr(w[t - 15], 18) ^ (w[t - 15] >> 3);
    const std::uint32_t s1 = rotr(w[t - 2], 17) ^ rotr(w[t - 2], 19) ^ (w[t - 2] >> 10);
    w[t] = w[t - 16] + s0 + w[t - 7] + s1;
  }
  auto [a, b, c, d, e, f, g, k] = h;
  for (int t = 0; t < 64; ++t) {
    const std::uint32_t t1 = k + (rotr(e, 6) ^ rotr(e, 11) ^ rotr(e, 25)) + ((e & f) ^ (~e & g)) + kRound[t] + w[t];
    const std::uint32_t t2 = (rotr(a, 2) ^ rotr(a, 13) ^ rotr(a, 22)) + ((a & b) ^ (a & c) ^ (b & c));
    k = g;
    g = f;
    f = e;
    e = d + t1;
    d = c;
    c = b;
    b = a;
    a = t1 + t2;
  }
  const std::array<std::uint32_t, 8> add{a, b, c, d, e, f, g, k};
  for (int i = 0; i < 8; ++i) h[i] += add[i];
}

std::string now_utc() {
  const auto now = std::chrono::floor<std::chrono::seconds>(std::chrono::system_clock::now());
  const auto day = std::chrono::floor<std::chrono::days>(now);
  const std::chrono::hh_mm_ss time(now - day);
  return fmt::format("{}T{:02}:{:02}:{:02}Z", format_date(day), time.hours().count(), time.minutes().count(),
                     time.seconds().count());
}

std::string grams_text(double grams) { return fmt::format("{} g", ledger_grams(grams)); }

ordered_json change_to_json(const LotChange& change) {
  ordered_json j;
  j["index"] = change.index;
  j["lot"] = change.lot;
  j["variety"] = change.variety;
  j["before_g"] = change.before_g;
  j["after_g"] = change.after_g;
  if (change.kind == LotChangeKind::added) j["added"] = change.record;
  if (change.kind == LotChangeKind::removed) j["removed"] = change.record;
  return j;
}

/// Reads one entry; a missing or mistyped field throws nlohmann's type_error, turned into a line.
JournalEntry entry_from_json(const nlohmann::json& j) {
  JournalEntry e;
  e.id = j.at("id").get<std::size_t>();
  e.time = j.at("time").get<std::string>();
  e.command = j.at("command").get<std::string>();
  e.recipe = j.value("recipe", "");
  e.recipe_file = j.value("recipe_file", "");
  e.recipe_sha256 = j.value("recipe_sha256", "");
  e.batches = j.value("batches", std::size_t{0});
  e.on = j.value("on", "");
  e.reason = j.value("reason", "");
  if (j.contains("undoes")) e.undoes = j.at("undoes").get<std::size_t>();
  for (const auto& c : j.at("changes")) {
    LotChange change;
    change.index = c.at("index").get<std::size_t>();
    change.lot = c.at("lot").get<std::string>();
    change.variety = c.value("variety", "");
    change.before_g = c.at("before_g").get<double>();
    change.after_g = c.at("after_g").get<double>();
    for (const auto* key : {"added", "removed"})
      if (c.contains(key)) {
        change.kind = std::string_view(key) == "added" ? LotChangeKind::added : LotChangeKind::removed;
        change.record = ordered_json::parse(c.at(key).dump());
      }
    e.changes.push_back(std::move(change));
  }
  e.stock_before = j.at("stock_before").get<std::string>();
  e.stock_after = j.at("stock_after").get<std::string>();
  return e;
}

/// Writes all of `text` to `fd` and fsyncs it; false (errno set) on failure.
bool write_all(int fd, std::string_view text) {
  std::size_t written = 0;
  while (written < text.size()) {
    const ssize_t n = ::write(fd, text.data() + written, text.size() - written);
    if (n < 0 && errno == EINTR) continue;
    if (n < 0) return false;
    written += static_cast<std::size_t>(n);
  }
  return ::fsync(fd) == 0;
}

/// Appends one line to the journal, durable before it returns. A tail cut short by a killed writer
/// is cut off first so the new line starts a line of its own.
void append_line(const std::filesystem::path& journal, const std::string& line) {
  const std::string name = journal.string();
  const int fd = ::open(journal.c_str(), O_RDWR | O_CREAT | O_APPEND | O_CLOEXEC, 0644);
  if (fd < 0) throw InputError(fmt::format("{}: cannot be opened for writing ({})", name, std::strerror(errno)));
  const std::string existing = read_text_file(journal);
  if (const auto end = existing.rfind('\n') + 1; end != existing.size())
    if (::ftruncate(fd, static_cast<off_t>(end)) != 0) {
      ::close(fd);
      throw InputError(fmt::format("{}: cannot cut a line written short ({})", name, std::strerror(errno)));
    }
  const bool ok = write_all(fd, line + "\n");
  const int saved = errno;
  ::close(fd);
  if (!ok) throw InputError(fmt::format("{}: appending failed ({})", name, std::strerror(saved)));
}

/// Refuses (Infeasible) a line that would grow the journal past what bine reads, before anything is
/// written: the next command could read neither the journal nor, through it, the stock.
void check_journal_room(const std::filesystem::path& journal, const std::string& line) {
  std::error_code ec;
  const std::uintmax_t now = std::filesystem::file_size(journal, ec);
  const std::uintmax_t grown = (ec ? 0 : now) + line.size() + 1;
  if (grown <= kMaxInputBytes) return;
  throw Infeasible(
      fmt::format("{} would grow to {:.1f} MB, larger than the {} MB bine reads, so the change is not made (move "
                  "the journal aside to start a new one)",
                  journal.string(), static_cast<double>(grown) / 1e6, kMaxInputBytes / (1024 * 1024)));
}

/// The lot the change names, checked against the document and the amount it holds now.
void check_lot(const ordered_json& lots, const Stock& stock, const LotChange& change, double expected_g,
               const std::string& file) {
  if (change.index >= lots.size())
    throw InputError(fmt::format("{}: /lots/{}: no such lot (the journal's lot {} is not in the file)", file,
                                 change.index, change.lot));
  const ordered_json& record = lots[change.index];
  const std::string code = record.is_object() ? record.value("lot", "") : "";
  const std::string shown = code.empty() ? fmt::format("lot {}", change.index + 1) : code;
  if (fold_name(shown) != fold_name(change.lot))
    throw InputError(fmt::format("{}: /lots/{}: is lot {} (the journal expects lot {} there)", file, change.index,
                                 shown, change.lot));
  const double held = change.index < stock.lots.size() ? stock.lots[change.index].on_hand_g.value_or(0.0) : 0.0;
  if (std::abs(held - expected_g) > 0.006)
    throw InputError(fmt::format("{}: /lots/{}/on_hand: lot {} holds {} (the journal expects {})", file, change.index,
                                 change.lot, grams_text(held), grams_text(expected_g)));
}

}  // namespace

std::string sha256_hex(std::string_view bytes) {
  std::array<std::uint32_t, 8> h{0x6a09e667, 0xbb67ae85, 0x3c6ef372, 0xa54ff53a,
                                 0x510e527f, 0x9b05688c, 0x1f83d9ab, 0x5be0cd19};
  std::string padded(bytes);
  const std::uint64_t bits = static_cast<std::uint64_t>(bytes.size()) * 8u;
  padded.push_back(static_cast<char>(0x80));
  while (padded.size() % 64 != 56) padded.push_back('\0');
  for (int i = 7; i >= 0; --i) padded.push_back(static_cast<char>((bits >> (8 * i)) & 0xffu));
  for (std::size_t offset = 0; offset < padded.size(); offset += 64)
    sha256_block(h, reinterpret_cast<const unsigned char*>(padded.data() + offset));
  std::string hex;
  for (const std::uint32_t word : h) hex += fmt::format("{:08x}", word);
  return hex;
}

double ledger_grams(double grams) {
  const double value = std::round(grams * 100.0) / 100.0;
  return value == 0.0 ? 0.0 : value;  // never "-0 g"
}

ordered_json entry_to_json(const JournalEntry& entry) {
  ordered_json j;
  j["id"] = entry.id;
  j["time"] = entry.time;
  j["command"] = entry.command;
  if (!entry.recipe.empty() || !entry.recipe_file.empty()) {
    j["recipe"] = entry.recipe;
    j["recipe_file"] = entry.recipe_file;
    j["recipe_sha256"] = entry.recipe_sha256;
    j["batches"] = entry.batches;
  }
  if (!entry.on.empty()) j["on"] = entry.on;
  if (!entry.reason.empty()) j["reason"] = entry.reason;
  if (entry.undoes) j["undoes"] = *entry.undoes;
  j["changes"] = ordered_json::array();
  for (const auto& change : entry.changes) j["changes"].push_back(change_to_json(change));
  j["stock_before"] = entry.stock_before;
  j["stock_after"] = entry.stock_after;
  return j;
}

std::vector<JournalEntry> parse_journal(std::string_view text, const std::string& file) {
  std::vector<JournalEntry> entries;
  std::size_t line_number = 0;
  std::size_t start = 0;
  while (start < text.size()) {
    const auto end = text.find('\n', start);
    if (end == std::string_view::npos) break;  // cut short by a killed writer: not an entry
    ++line_number;
    const std::string_view line = text.substr(start, end - start);
    start = end + 1;
    if (line.empty()) continue;
    // Through the guard like every JSON bine reads: a line nested 100,000 levels deep would
    // otherwise overflow the stack when its record is copied.
    Diagnostics problems(file);
    const auto value = parse_json_text(line, problems);
    if (!value) {
      std::string why = problems.lines().empty() ? "not JSON" : problems.lines().front().substr(file.size() + 2);
      if (why.rfind("/: ", 0) == 0) why.erase(0, 3);  // a problem inside the object, not the file
      if (const auto at = why.find(" at line 1, column "); at != std::string::npos) why.replace(at, 18, " at column");
      throw InputError(
          fmt::format("{}: line {}: not a journal entry: {} (was the journal edited?)", file, line_number, why));
    }
    try {
      entries.push_back(entry_from_json(*value));
    } catch (const nlohmann::json::exception&) {
      throw InputError(
          fmt::format("{}: line {}: not a journal entry (expected one JSON object a line as bine "
                      "writes them; was the journal edited?)",
                      file, line_number));
    }
  }
  return entries;
}

std::string apply_changes(std::string_view stock_text, const std::vector<LotChange>& changes, const std::string& file) {
  const Stock stock = parse_stock(stock_text, file);
  ordered_json document = ordered_json::parse(stock_text);
  ordered_json& lots = document.at("lots");
  for (const LotChange& change : changes) {
    if (change.kind == LotChangeKind::added) {
      if (change.index != lots.size())
        throw InputError(fmt::format("{}: /lots: has {} lots (the journal puts lot {} in as lot {})", file, lots.size(),
                                     change.lot, change.index + 1));
      lots.push_back(change.record);
      continue;
    }
    check_lot(lots, stock, change, change.before_g, file);
    if (change.kind == LotChangeKind::removed) {
      if (change.index + 1 != lots.size())
        throw InputError(fmt::format("{}: /lots/{}: lot {} is no longer the last lot (it cannot be taken out)", file,
                                     change.index, change.lot));
      lots.erase(change.index);
      continue;
    }
    lots[change.index]["on_hand"] = grams_text(change.after_g);
  }
  return document.dump(2) + "\n";
}

std::vector<LotChange> inverse_changes(const std::vector<LotChange>& changes) {
  std::vector<LotChange> inverse;
  for (auto it = changes.rbegin(); it != changes.rend(); ++it) {
    LotChange change = *it;
    std::swap(change.before_g, change.after_g);
    if (change.kind != LotChangeKind::amount)
      change.kind = change.kind == LotChangeKind::added ? LotChangeKind::removed : LotChangeKind::added;
    inverse.push_back(std::move(change));
  }
  return inverse;
}

std::filesystem::path journal_path(const std::filesystem::path& stock_file) {
  return std::filesystem::path(stock_file.string() + ".journal");
}

std::filesystem::path lock_path(const std::filesystem::path& stock_file) {
  return std::filesystem::path(stock_file.string() + ".lock");
}

StockLedger::StockLedger(std::filesystem::path stock_file, bool for_reading) : stock_file_(std::move(stock_file)) {
  text_ = read_text_file(stock_file_);  // names a missing stock file before any lock file is made
  std::error_code ec;
  if (for_reading && !std::filesystem::exists(journal_file(), ec)) {
    reload();
    return;
  }
  const auto lock = lock_path(stock_file_);
  lock_fd_ = ::open(lock.c_str(), O_RDWR | O_CREAT | O_CLOEXEC, 0644);
  if (lock_fd_ < 0)
    throw InputError(fmt::format("{}: cannot open the lock file ({})", lock.string(), std::strerror(errno)));
  while (::flock(lock_fd_, LOCK_EX) != 0) {
    if (errno == EINTR) continue;
    const int saved = errno;
    ::close(lock_fd_);
    throw InputError(fmt::format("{}: cannot lock ({})", lock.string(), std::strerror(saved)));
  }
  reload();
  complete_pending();
}

StockLedger::~StockLedger() {
  if (lock_fd_ >= 0) ::close(lock_fd_);  // closing releases the flock; the lock file stays (never unlinked)
}

std::filesystem::path StockLedger::journal_file() const { return journal_path(stock_file_); }

void StockLedger::reload() {
  text_ = read_text_file(stock_file_);
  stock_ = parse_stock(text_, stock_file_.string());
  const auto journal = journal_file();
  std::error_code ec;
  entries_ = std::filesystem::exists(journal, ec) ? parse_journal(read_text_file(journal), journal.string())
                                                  : std::vector<JournalEntry>{};
}

void StockLedger::complete_pending() {
  if (entries_.empty()) return;
  const JournalEntry& last = entries_.back();
  const std::string hash = sha256_hex(text_);
  if (hash == last.stock_after || hash != last.stock_before) return;
  const std::string after = apply_changes(text_, last.changes, stock_file_.string());
  if (sha256_hex(after) != last.stock_after) return;  // not what the entry wrote: leave the file alone
  write_loadable_file(stock_file_, after);
  completed_pending_ = true;
  reload();
}

bool StockLedger::edited_since_last_entry() const {
  return !entries_.empty() && sha256_hex(text_) != entries_.back().stock_after;
}

const JournalEntry& StockLedger::commit(JournalEntry entry) {
  const std::string file = stock_file_.string();
  const std::string after = apply_changes(text_, entry.changes, file);
  check_readable_size(after, file);  // the file written must load again: its size first, then its content
  Stock loaded = parse_stock(after, file);
  entry.id = entries_.empty() ? 1 : entries_.back().id + 1;
  entry.time = now_utc();
  entry.stock_before = sha256_hex(text_);
  entry.stock_after = sha256_hex(after);
  const std::string line = entry_to_json(entry).dump();
  check_journal_room(journal_file(), line);
  append_line(journal_file(), line);
  write_loadable_file(stock_file_, after);
  text_ = after;
  stock_ = std::move(loaded);  // what was checked above is what was written
  entries_.push_back(std::move(entry));
  return entries_.back();
}

}  // namespace bine
