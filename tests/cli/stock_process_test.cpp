// bine stock as real processes of the built binary: many at once on one stock file (the lock must
// keep every update), and processes killed with SIGKILL at random points (the stock file must always
// be complete and agree with its journal).
#include <doctest/doctest.h>
#include <fcntl.h>
#include <signal.h>
#include <sys/types.h>
#include <sys/wait.h>
#include <time.h>
#include <unistd.h>

#include <chrono>
#include <filesystem>
#include <fstream>
#include <functional>
#include <nlohmann/json.hpp>
#include <random>
#include <string>
#include <vector>

#include "cli/run_binary.hpp"
#include "cli/temp_dir.hpp"
#include "io/stock_ledger.hpp"

using bine::test::slurp;
using nlohmann::json;

namespace {

/// Starts BINE_BINARY with `args`, output discarded, without waiting for it.
pid_t start_bine(const std::vector<std::string>& args) {
  std::string program = BINE_BINARY;
  std::vector<std::string> copies(args);
  std::vector<char*> argv{program.data()};
  for (auto& arg : copies) argv.push_back(arg.data());
  argv.push_back(nullptr);
  const pid_t pid = ::fork();
  if (pid == 0) {
    const int null = ::open("/dev/null", O_WRONLY);
    ::dup2(null, STDOUT_FILENO);
    ::dup2(null, STDERR_FILENO);
    ::execv(program.c_str(), argv.data());
    ::_exit(127);
  }
  return pid;
}

/// Waits for `pid`; its exit status, or -signal when a signal ended it.
int wait_for(pid_t pid) {
  int status = 0;
  if (::waitpid(pid, &status, 0) != pid) return -1000;
  return WIFEXITED(status) ? WEXITSTATUS(status) : -WTERMSIG(status);
}

std::vector<json> journal_lines(const std::filesystem::path& stock) {
  std::vector<json> lines;
  std::ifstream in(stock.string() + ".journal");
  for (std::string line; std::getline(in, line);) lines.push_back(json::parse(line));
  return lines;
}

/// A stock file with one lot of 1 kg.
void write_one_lot_stock(const std::filesystem::path& file) {
  std::ofstream(file) << R"({"stock": {"name": "one lot"}, "lots": [{"variety": "Fernlight", "lot": "FL-1",
    "alpha_acid": 10, "packaged": "2026-01-01", "storage": {"temperature": "-2 C", "package": "vacuum"},
    "on_hand": "1 kg"}]})";
}

}  // namespace

TEST_CASE("stock receive: 50 processes at once on one stock file all land (the lock loses no update)") {
  const bine::test::TempDir dir;
  const auto stock = dir.path() / "stock.json";
  write_one_lot_stock(stock);
  std::vector<pid_t> children;
  for (int i = 0; i < 50; ++i)
    children.push_back(start_bine({"stock", "--stock", stock.string(), "receive", "--lot", "R-" + std::to_string(i),
                                   "--variety", "Fernlight", "--amount", "1 kg", "--alpha", "9", "--packaged",
                                   "2026-02-01", "--stored", "-2 C,vacuum"}));
  int failures = 0;
  for (const pid_t child : children) failures += wait_for(child) != 0;
  CHECK(failures == 0);
  const json document = json::parse(slurp(stock));
  CHECK(document["lots"].size() == 51);
  const auto lines = journal_lines(stock);
  REQUIRE(lines.size() == 50);
  // The entries chain: each starts from the file the one before wrote, and the last wrote this file.
  for (std::size_t i = 1; i < lines.size(); ++i) CHECK(lines[i]["stock_before"] == lines[i - 1]["stock_after"]);
  CHECK(lines.back()["stock_after"] == bine::sha256_hex(slurp(stock)));
}

TEST_CASE("stock use: 50 processes of 10 g at once on a 1 kg lot leave exactly 500 g and 50 journal entries") {
  const bine::test::TempDir dir;
  const auto stock = dir.path() / "stock.json";
  write_one_lot_stock(stock);
  const auto recipe = dir.path() / "dry-hop.json";
  std::ofstream(recipe) << R"({"name": "10 g dry hop", "batch_volume": "20 L", "original_gravity": "1.050",
    "boil_time": "60 min", "hops": [{"variety": "Fernlight", "amount": "10 g", "use": "dry-hop", "time": "4 d"}]})";
  std::vector<pid_t> children;
  for (int i = 0; i < 50; ++i)
    children.push_back(start_bine({"--catalog", std::string(BINE_TEST_DIR) + "/fixtures/stock-ledger-catalog.json",
                                   "stock", "--stock", stock.string(), "use", recipe.string(), "--on", "2026-03-02"}));
  int failures = 0;
  for (const pid_t child : children) failures += wait_for(child) != 0;
  CHECK(failures == 0);
  // Hand arithmetic: 1000 g - 50 x 10 g = 500 g (the lot gives no oil, so the dry hop holds its grams).
  const std::string text = json::parse(slurp(stock))["lots"][0]["on_hand"].get<std::string>();
  CHECK(text == "500 g");
  const auto lines = journal_lines(stock);
  REQUIRE(lines.size() == 50);
  for (std::size_t i = 0; i < lines.size(); ++i) {
    CHECK(lines[i]["command"] == "use");
    CHECK(lines[i]["changes"][0]["before_g"].get<double>() == doctest::Approx(1000.0 - 10.0 * static_cast<double>(i)));
    if (i > 0) CHECK(lines[i]["stock_before"] == lines[i - 1]["stock_after"]);
  }
  CHECK(lines.back()["stock_after"] == bine::sha256_hex(slurp(stock)));
}

namespace {

double on_hand_g(const std::filesystem::path& stock) {
  const std::string text = json::parse(slurp(stock))["lots"][0]["on_hand"].get<std::string>();
  return std::stod(text.substr(0, text.find(' ')));  // "990 g"; the first write turns "1 kg" into grams
}

/// What a kill test saw over its rounds.
struct KillRounds {
  int killed = 0;   // runs SIGKILL ended (the others finished first)
  int pending = 0;  // rounds that ended between the journal line and the stock file
  long full_us = 0;
};

/// The kill harness: runs `first` once to the end (timing it, and turning the stock's "1 kg" into
/// grams), then `rounds` runs of `round_args(round)` on the one-lot `stock`, each killed with SIGKILL
/// after a random delay from 0 to that time (fixed seed: the same kill points every run). After each,
/// the stock file must parse, hash to the last journal entry's "after" (written) or "before"
/// (killed between journal and file), hold that entry's amount accordingly, and the entries must chain.
KillRounds kill_rounds(const std::filesystem::path& stock, const std::vector<std::string>& first, int rounds,
                       const std::function<std::vector<std::string>(int)>& round_args) {
  KillRounds seen;
  std::mt19937 random(20261202);
  const auto start = std::chrono::steady_clock::now();
  REQUIRE(bine::test::run_bine(first).status == 0);
  seen.full_us = static_cast<long>(
      std::chrono::duration_cast<std::chrono::microseconds>(std::chrono::steady_clock::now() - start).count());
  std::uniform_int_distribution<long> delay_us(0, std::max<long>(1000, seen.full_us));
  for (int round = 0; round < rounds; ++round) {
    INFO("round " << round);
    const pid_t child = start_bine(round_args(round));
    const long wait = delay_us(random);
    const timespec pause{wait / 1000000, (wait % 1000000) * 1000};
    ::nanosleep(&pause, nullptr);
    ::kill(child, SIGKILL);
    seen.killed += wait_for(child) == -SIGKILL;
    // Whole: the stock file always parses.
    const std::string text = slurp(stock);
    json parsed;
    REQUIRE_NOTHROW(parsed = json::parse(text));
    // Agrees: the file is the one the last entry wrote, or (killed between journal and file) the one
    // it started from, which the next command completes.
    const auto lines = journal_lines(stock);
    REQUIRE(!lines.empty());
    const json& last = lines.back();
    const std::string hash = bine::sha256_hex(text);
    REQUIRE((hash == last["stock_after"] || hash == last["stock_before"]));
    const bool written = hash == last["stock_after"];
    seen.pending += !written;
    // The amount is the last entry's after (written) or before (pending).
    CHECK(on_hand_g(stock) == (written ? last["changes"][0]["after_g"] : last["changes"][0]["before_g"]));
    // The entries chain: each starts from the file the one before wrote.
    for (std::size_t i = 1; i < lines.size(); ++i) REQUIRE(lines[i]["stock_before"] == lines[i - 1]["stock_after"]);
  }
  return seen;
}

}  // namespace

TEST_CASE(
    "stock adjust killed with SIGKILL at random points (200 rounds): the file is whole and agrees with the journal") {
  const bine::test::TempDir dir;
  const auto stock = dir.path() / "stock.json";
  write_one_lot_stock(stock);
  const KillRounds seen = kill_rounds(
      stock, {"stock", "--stock", stock.string(), "adjust", "FL-1", "--to", "999 g", "--reason", "first"}, 200,
      [&](int round) {
        return std::vector<std::string>{
            "stock",    "--stock", stock.string(), "adjust", "FL-1", "--to", std::to_string(998 - round) + " g",
            "--reason", "round"};
      });
  // Some runs must have been cut short for the test to say anything.
  CHECK(seen.killed > 20);
  MESSAGE("killed " << seen.killed << " of 200 runs, " << seen.pending
                    << " between journal and stock file; one full run took " << seen.full_us << " us");
}

TEST_CASE(
    "stock use killed with SIGKILL at random points (200 rounds): the file is whole and stock plus journal agree") {
  const bine::test::TempDir dir;
  const auto stock = dir.path() / "stock.json";
  write_one_lot_stock(stock);
  const auto recipe = dir.path() / "dry-hop.json";
  std::ofstream(recipe) << R"({"name": "2 g dry hop", "batch_volume": "20 L", "original_gravity": "1.050",
    "boil_time": "60 min", "hops": [{"variety": "Fernlight", "amount": "2 g", "use": "dry-hop", "time": "4 d"}]})";
  const std::vector<std::string> use{
      "--catalog",     std::string(BINE_TEST_DIR) + "/fixtures/stock-ledger-catalog.json",
      "stock",         "--stock",
      stock.string(),  "use",
      recipe.string(), "--on",
      "2026-03-02"};
  const KillRounds seen = kill_rounds(stock, use, 200, [&](int) { return use; });
  // Stock plus journal agree over the whole run: every use entry took 2 g (the lot gives no oil, so the
  // dry hop holds its grams), so the lot holds 1000 g - 2 g x (use entries the file shows), where the
  // file shows every entry but a last one still pending. Hand arithmetic: at most 201 entries x 2 g =
  // 402 g, within the 1000 g.
  const auto lines = journal_lines(stock);
  const bool last_written = bine::sha256_hex(slurp(stock)) == lines.back()["stock_after"];
  const double shown = static_cast<double>(lines.size()) - (last_written ? 0.0 : 1.0);
  CHECK(on_hand_g(stock) == doctest::Approx(1000.0 - 2.0 * shown));
  for (const json& line : lines) {
    CHECK(line["command"] == "use");
    CHECK(line["changes"][0]["before_g"].get<double>() - line["changes"][0]["after_g"].get<double>() ==
          doctest::Approx(2.0));
  }
  CHECK(seen.killed > 20);
  MESSAGE("killed " << seen.killed << " of 200 runs, " << seen.pending
                    << " between journal and stock file; one full run took " << seen.full_us << " us");
}
