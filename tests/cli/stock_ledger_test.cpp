// bine stock: list, receive, adjust, history and undo run in-process on a copy of a small stock of
// our own (tests/fixtures/stock-ledger.json), with the journal and the stock file read back.
#include "io/stock_ledger.hpp"

#include <doctest/doctest.h>

#include <algorithm>
#include <filesystem>
#include <fstream>
#include <nlohmann/json.hpp>
#include <string>
#include <vector>

#include "cli/run_binary.hpp"
#include "cli/run_in_process.hpp"
#include "cli/temp_dir.hpp"

using bine::test::fixture;
using bine::test::slurp;
using nlohmann::json;

namespace {

/// `bine --catalog <the fixture's varieties> ARGS`, in-process. The catalog names the stock's
/// invented varieties and gives none of them a stability, so every lot ages at the fair class.
bine::test::CliRun run_cli(std::vector<std::string> args) {
  args.insert(args.begin(), {"--catalog", fixture("stock-ledger-catalog.json")});
  return bine::test::run_cli(args);
}

/// A copy of the fixture stock in a scratch folder, with its journal beside it.
struct ScratchStock {
  bine::test::TempDir dir;
  std::filesystem::path file = dir.path() / "stock.json";
  ScratchStock() { std::filesystem::copy_file(fixture("stock-ledger.json"), file); }
  std::string path() const { return file.string(); }
  std::vector<json> journal() const {
    std::vector<json> lines;
    std::ifstream in(file.string() + ".journal");
    for (std::string line; std::getline(in, line);) lines.push_back(json::parse(line));
    return lines;
  }
  json document() const { return json::parse(slurp(file)); }
};

void write(const std::filesystem::path& path, const std::string& text) {
  std::ofstream(path, std::ios::binary | std::ios::trunc) << text;
}

}  // namespace

TEST_CASE("stock: SHA-256 of the FIPS 180-2 examples and of a file as python3 hashlib gives it") {
  // FIPS 180-2, appendix B.1 and B.2 (one block, two blocks).
  CHECK(bine::sha256_hex("abc") == "ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad");
  CHECK(bine::sha256_hex("abcdbcdecdefdefgefghfghighijhijkijkljklmklmnlmnomnopnopq") ==
        "248d6a61d20638b8e5c026930c3e6039a33ce45964ff2167f6ecedd419db06c1");
  // Debian's python3 hashlib on the fixture file (a longer, multi-block input).
  const auto run = bine::test::run_program(
      BINE_PYTHON, {"-c", "import hashlib,sys; print(hashlib.sha256(open(sys.argv[1],'rb').read()).hexdigest())",
                    fixture("stock-ledger.json")});
  REQUIRE(run.exited);
  REQUIRE(run.status == 0);
  CHECK(bine::sha256_hex(slurp(fixture("stock-ledger.json"))) + "\n" == run.out);
}

TEST_CASE("stock list: alpha today, share left, HSI state, stale flag, days until stale and totals per variety") {
  const auto run = run_cli({"stock", "list", fixture("stock-ledger.json"), "--on", "2026-03-02", "--json"});
  INFO(run.err);
  REQUIRE(run.status == 0);
  const json out = json::parse(run.out);
  REQUIRE(out["lots"].size() == 3);
  // Fernlight has no stability in the fixture catalog: the fair class, 65 % left after 180 days at 20 C open
  // (common practice), so k = -ln(0.65) / 180 per day (Garetz 1994 first-order loss).
  // FL-1: 60 days at 5 C vacuum, TF = 2^((5 - 20) / 15) = 0.5, SF = 0.5 (from memory):
  // remaining exp(-k x 0.25 x 60) = 0.96474, alpha 9.647 %; below 75 % after
  // ln(4/3) / (k x 0.25) = 480.8 -> 481 days from packaging, 421 days from 2026-03-02.
  const json& fl1 = out["lots"][0];
  CHECK(fl1["lot"] == "FL-1");
  CHECK(fl1["alpha_today"].get<double>() == doctest::Approx(9.6474).epsilon(1e-4));
  CHECK(fl1["remaining"].get<double>() == doctest::Approx(0.96474).epsilon(1e-4));
  CHECK(fl1["stale"] == false);
  CHECK(fl1["days_until_stale"] == 421);
  CHECK(fl1["on_hand_g"] == 1000.0);
  // FL-2: 200 days at 20 C open: remaining exp(-k x 200) = 0.61962 < 0.75: stale, 0 days left.
  const json& fl2 = out["lots"][1];
  CHECK(fl2["remaining"].get<double>() == doctest::Approx(0.61962).epsilon(1e-4));
  CHECK(fl2["stale"] == true);
  CHECK(fl2["days_until_stale"] == 0);
  // BM-1: no packaging date: not aged, certificate alpha, no stale flag; HSI 0.50 shows
  // 110 x log10(0.50 / 0.25) = 33.11 % lost (Garetz 1994 after Nickerson & Likens 1979).
  const json& bm1 = out["lots"][2];
  CHECK(bm1["alpha_today"] == 6.0);
  CHECK(bm1["aged"] == false);
  CHECK(bm1["days_until_stale"].is_null());
  CHECK(bm1["hsi_loss_percent"].get<double>() == doctest::Approx(33.113).epsilon(1e-4));
  // HSI 0.50 is above the oxidised edge 0.45 (common practice, from memory): stale, as in swap.
  CHECK(bm1["stale"] == true);
  CHECK(bm1["stale_reason"].get<std::string>().find("oxidised") != std::string::npos);
  // Totals: Fernlight 1000 g + 500 g, of it 500 g stale; Brackenmoor 250 g, all of it stale (oxidised).
  REQUIRE(out["varieties"].size() == 2);
  CHECK(out["varieties"][0]["on_hand_g"] == 1500.0);
  CHECK(out["varieties"][0]["stale_g"] == 500.0);
  CHECK(out["varieties"][1]["on_hand_g"] == 250.0);
  CHECK(out["varieties"][1]["stale_g"] == 250.0);
  // --stale-below 99: FL-1's 96.5 % is below it as well.
  const auto strict =
      run_cli({"stock", "list", fixture("stock-ledger.json"), "--on", "2026-03-02", "--stale-below", "99", "--json"});
  REQUIRE(strict.status == 0);
  CHECK(json::parse(strict.out)["lots"][0]["stale"] == true);

  // Text: every amount with its unit, in US units on request (1500 g = 3.31 lb; 250 g = 8.82 oz).
  const auto text = run_cli({"--units", "us", "stock", "list", fixture("stock-ledger.json"), "--on", "2026-03-02"});
  REQUIRE(text.status == 0);
  CHECK(text.out.find("3.31 lb") != std::string::npos);
  CHECK(text.out.find("8.82 oz") != std::string::npos);
  CHECK(text.out.find("421 days") != std::string::npos);
  CHECK(text.out.find("STALE") != std::string::npos);
}

TEST_CASE("stock list: a lot with an HSI ages at its variety's rate exactly as one without (HSI is a state)") {
  bine::test::TempDir dir;
  const auto file = dir.path() / "hsi.json";
  // Two lots of one variety without a stability in the catalog (fair class), same alpha, date and storage; only
  // one carries an HSI. The HSI is what the sample had lost when analysed, already in its certificate
  // alpha, never a storage rate (Garetz 1994; docs/methods.md#hsi).
  write(file, R"({"lots": [
    {"variety": "Testlot Unlisted", "lot": "Q-HSI", "alpha_acid": 10, "hsi": 0.31, "packaged": "2026-01-01",
     "storage": {"temperature": "20 C", "package": "sealed"}, "on_hand": "1 kg"},
    {"variety": "Testlot Unlisted", "lot": "Q-NONE", "alpha_acid": 10, "packaged": "2026-01-01",
     "storage": {"temperature": "20 C", "package": "sealed"}, "on_hand": "1 kg"}]})");
  const auto run = run_cli({"stock", "list", file.string(), "--on", "2026-04-11", "--json"});
  INFO(run.err);
  REQUIRE(run.status == 0);
  const json out = json::parse(run.out);
  REQUIRE(out["lots"].size() == 2);
  // Garetz 1994: k = ln(100 / 65) / 180 = 0.0023932 per day (fair class, 35 % lost in 6 months,
  // common practice); TF(20 C) = 1; SF sealed 0.75 (from memory); D = 100 days (2026-01-01 to
  // 2026-04-11). A = 10 x exp(-0.0023932 x 0.75 x 100) = 8.3569 % (83.569 % left). Below 75 % after
  // ln(4/3) / (0.0023932 x 0.75) = 160.27 -> 161 days from packaging: 61 days from the list day.
  for (std::size_t i = 0; i < 2; ++i) {
    const json lot = out["lots"][i];
    INFO(lot.dump());
    CHECK(lot["alpha_today"].get<double>() == doctest::Approx(8.3569).epsilon(1e-4));
    CHECK(lot["remaining"].get<double>() == doctest::Approx(0.83569).epsilon(1e-4));
    CHECK(lot["stability_percent"].get<double>() == doctest::Approx(65.0));
    CHECK(lot["days_until_stale"] == 61);
    CHECK(lot["stale"] == false);
  }
  // The HSI's own state: 110 x log10(0.31 / 0.25) = 10.28 % lost before analysis (Garetz 1994
  // after Nickerson & Likens 1979); 0.31 is ageing, not oxidised (common practice, from memory).
  CHECK(out["lots"][0]["hsi_loss_percent"].get<double>() == doctest::Approx(10.276).epsilon(1e-3));
  CHECK(out["lots"][1]["hsi_loss_percent"].is_null());
}

TEST_CASE("stock list: the stock file from BINE_STOCK, and a clear line when none is given") {
  ::setenv("BINE_STOCK", fixture("stock-ledger.json").c_str(), 1);
  const auto from_env = run_cli({"stock", "list", "--on", "2026-03-02"});
  ::unsetenv("BINE_STOCK");
  CHECK(from_env.status == 0);
  CHECK(from_env.out.find("FL-1") != std::string::npos);
  const auto none = run_cli({"stock", "list", "--on", "2026-03-02"});
  CHECK(none.status == 2);
  CHECK(none.err.find("no stock file (expected --stock FILE, or the BINE_STOCK environment variable)") !=
        std::string::npos);
}

TEST_CASE("stock receive and undo: the lot goes in and out again, each change one journal line with hashes") {
  ScratchStock stock;
  const std::string before = slurp(stock.file);
  const auto receive =
      run_cli({"stock", "--stock", stock.path(), "receive", "--lot", "KW-7", "--variety", "Kestrel Wold", "--amount",
               "11 lb", "--alpha", "12.1", "--packaged", "2026-02-01", "--stored", "-2 C,vacuum"});
  INFO(receive.err);
  REQUIRE(receive.status == 0);
  json document = stock.document();
  REQUIRE(document["lots"].size() == 4);
  // 11 lb = 11 x 453.59237 g = 4989.52 g (exact pound definition), stored to 0.01 g.
  CHECK(document["lots"][3]["on_hand"] == "4989.52 g");
  CHECK(document["lots"][3]["storage"]["temperature"] == -2.0);
  auto journal = stock.journal();
  REQUIRE(journal.size() == 1);
  CHECK(journal[0]["command"] == "receive");
  CHECK(journal[0]["changes"][0]["lot"] == "KW-7");
  CHECK(journal[0]["changes"][0]["after_g"] == 4989.52);
  CHECK(journal[0]["stock_before"] == bine::sha256_hex(before));
  CHECK(journal[0]["stock_after"] == bine::sha256_hex(slurp(stock.file)));

  const auto again = run_cli({"stock", "--stock", stock.path(), "receive", "--lot", "kw-7", "--variety", "X",
                              "--amount", "1 kg", "--alpha", "5", "--packaged", "2026-02-01", "--stored", "0 C,open"});
  CHECK(again.status == 2);
  CHECK(again.err.find("already in") != std::string::npos);

  const auto undo = run_cli({"stock", "--stock", stock.path(), "undo"});
  INFO(undo.err);
  REQUIRE(undo.status == 0);
  CHECK(stock.document()["lots"] == json::parse(before)["lots"]);
  journal = stock.journal();
  REQUIRE(journal.size() == 2);
  CHECK(journal[1]["command"] == "undo");
  CHECK(journal[1]["undoes"] == 1);
  CHECK(journal[1]["stock_after"] == bine::sha256_hex(slurp(stock.file)));
  // Nothing left to undo: the receive is undone, and undo entries are not themselves undone.
  const auto nothing = run_cli({"stock", "--stock", stock.path(), "undo"});
  CHECK(nothing.status == 3);
  CHECK(nothing.err.find("nothing to undo") != std::string::npos);
}

TEST_CASE("stock adjust, history and undo, and undo refuses a stock file edited by hand since the last entry") {
  ScratchStock stock;
  REQUIRE(run_cli({"stock", "--stock", stock.path(), "adjust", "FL-1", "--to", "800 g", "--reason", "count"}).status ==
          0);
  REQUIRE(run_cli({"stock", "--stock", stock.path(), "adjust", "BM-1", "--to", "0.1 kg", "--reason", "spilt"}).status ==
          0);
  CHECK(stock.document()["lots"][0]["on_hand"] == "800 g");
  CHECK(stock.document()["lots"][2]["on_hand"] == "100 g");
  const auto history = run_cli({"stock", "--stock", stock.path(), "history", "FL-1", "--json"});
  REQUIRE(history.status == 0);
  const json entries = json::parse(history.out);
  REQUIRE(entries.size() == 1);
  CHECK(entries[0]["reason"] == "count");
  CHECK(entries[0]["changes"][0]["before_g"] == 1000.0);
  CHECK(entries[0]["changes"][0]["after_g"] == 800.0);

  const auto unknown = run_cli({"stock", "--stock", stock.path(), "adjust", "FL-3", "--to", "1 kg", "--reason", "x"});
  CHECK(unknown.status == 2);
  CHECK(unknown.err.find("\"FL-3\": no such lot") != std::string::npos);

  // Undo walks back: first BM-1 to 250 g, then FL-1 to 1000 g.
  REQUIRE(run_cli({"stock", "--stock", stock.path(), "undo"}).status == 0);
  CHECK(stock.document()["lots"][2]["on_hand"] == "250 g");
  CHECK(stock.document()["lots"][0]["on_hand"] == "800 g");

  // An edit by hand: undo refuses and leaves the file as edited.
  json edited = stock.document();
  edited["lots"][0]["on_hand"] = "750 g";
  write(stock.file, edited.dump(2));
  const std::string hand = slurp(stock.file);
  const auto refused = run_cli({"stock", "--stock", stock.path(), "undo"});
  CHECK(refused.status == 2);
  CHECK(refused.err.find("edited by hand since journal entry 3") != std::string::npos);
  CHECK(slurp(stock.file) == hand);
  CHECK(stock.journal().size() == 3);
  // A count after the edit is journalled from what the file holds (750 g), and undo works again.
  REQUIRE(run_cli({"stock", "--stock", stock.path(), "adjust", "FL-1", "--to", "700 g", "--reason", "count"}).status ==
          0);
  CHECK(stock.journal().back()["changes"][0]["before_g"] == 750.0);
  REQUIRE(run_cli({"stock", "--stock", stock.path(), "undo"}).status == 0);
  CHECK(stock.document()["lots"][0]["on_hand"] == "750 g");
}

TEST_CASE("stock: a change journalled but not yet written is completed by the next command and a cut line is dropped") {
  ScratchStock stock;
  const std::string before = slurp(stock.file);
  REQUIRE(run_cli({"stock", "--stock", stock.path(), "adjust", "FL-2", "--to", "300 g", "--reason", "count"}).status ==
          0);
  const std::string after = slurp(stock.file);
  // As if bine had been killed after the journal line and before replacing the stock file.
  write(stock.file, before);
  const auto list = run_cli({"stock", "list", stock.path(), "--on", "2026-03-02", "--json"});
  REQUIRE(list.status == 0);
  CHECK(json::parse(list.out)["lots"][1]["on_hand_g"] == 300.0);
  CHECK(slurp(stock.file) == after);

  // As if bine had been killed in the middle of a journal line: that line is no entry, and the next
  // change starts a line of its own.
  {
    std::ofstream journal(stock.path() + ".journal", std::ios::app | std::ios::binary);
    journal << "{\"id\": 2, \"time\": \"2026-";
  }
  const auto history = run_cli({"stock", "--stock", stock.path(), "history", "--json"});
  REQUIRE(history.status == 0);
  CHECK(json::parse(history.out).size() == 1);
  REQUIRE(run_cli({"stock", "--stock", stock.path(), "adjust", "FL-2", "--to", "200 g", "--reason", "count"}).status ==
          0);
  const auto lines = stock.journal();  // every line parses
  REQUIRE(lines.size() == 2);
  CHECK(lines[1]["id"] == 2);
  CHECK(lines[1]["changes"][0]["before_g"] == 300.0);
}

TEST_CASE("stock: bad input names the option and value") {
  ScratchStock stock;
  const auto bad =
      run_cli({"stock", "--stock", stock.path(), "receive", "--lot", "N-1", "--variety", "Fernlight", "--amount",
               "5 parsecs", "--alpha", "40", "--packaged", "2026-02-30", "--stored", "-2 C,jar"});
  CHECK(bad.status == 2);
  CHECK(bad.err.find("--amount") != std::string::npos);
  CHECK(bad.err.find("--alpha") != std::string::npos);
  CHECK(bad.err.find("--packaged") != std::string::npos);
  CHECK(bad.err.find("--stored") != std::string::npos);
  CHECK(!std::filesystem::exists(stock.path() + ".journal"));
  const auto missing = run_cli({"stock", "list", (stock.dir.path() / "none.json").string()});
  CHECK(missing.status == 2);
  CHECK(missing.err.find("none.json: file not found") != std::string::npos);
}

TEST_CASE("stock receive --from a CSV: every row one lot, in one journal entry, quoted codes and decimal commas") {
  ScratchStock stock;
  const auto receive = run_cli({"stock", "--stock", stock.path(), "receive", "--from",
                                fixture("receipts/certificates.csv"), "--stored", "-2 C,vacuum"});
  INFO(receive.err);
  REQUIRE(receive.status == 0);
  const json document = stock.document();
  REQUIRE(document["lots"].size() == 5);  // 3 in the fixture stock + 2 rows
  const json& first = document["lots"][3];
  CHECK(first["lot"] == "CR-1, \"a\"");
  CHECK(first["variety"] == "Fernlight, \"new\"");
  CHECK(first["alpha_acid"] == 9.5);    // "9,5": a decimal comma
  CHECK(first["on_hand"] == "1500 g");  // "1,5" kg = 1.5 x 1000 g (exact unit definition)
  CHECK(first["hsi"] == 0.28);
  CHECK(first["storage"]["package"] == "vacuum");  // from --stored: the CSV has no storage column
  CHECK(document["lots"][4]["form"] == "whole");
  const auto journal = stock.journal();
  REQUIRE(journal.size() == 1);
  CHECK(journal[0]["changes"].size() == 2);
  CHECK(journal[0]["reason"] == "from " + fixture("receipts/certificates.csv"));
  // One undo takes the whole file's lots out again.
  REQUIRE(run_cli({"stock", "--stock", stock.path(), "undo"}).status == 0);
  CHECK(stock.document()["lots"].size() == 3);
}

TEST_CASE("stock receive --from a CSV with bad rows: nothing written, each problem named by file, line and value") {
  ScratchStock stock;
  const std::string before = slurp(stock.file);
  const std::string file = fixture("receipts/certificates-bad.csv");
  const auto receive =
      run_cli({"stock", "--stock", stock.path(), "receive", "--from", file, "--stored", "-2 C,vacuum"});
  CHECK(receive.status == 2);
  CHECK(slurp(stock.file) == before);
  CHECK_FALSE(std::filesystem::exists(stock.file.string() + ".journal"));
  // Line 3, column 3 holds "6.1x"; line 4 has no amount and a lot code already in the stock.
  CHECK(receive.err.find(file + ": line 3, column 3 (\"Alpha (%)\"): \"6.1x\"") != std::string::npos);
  CHECK(receive.err.find(file + ": line 4: \"Brackenmoor\": no amount") != std::string::npos);
  CHECK(receive.err.find(file + ": line 4: lot \"FL-1\": already in " + stock.path() + " as lot 1") !=
        std::string::npos);
  CHECK(std::count(receive.err.begin(), receive.err.end(), '\n') == 3);  // one line per problem
}

TEST_CASE("stock receive --from a stock file (JSON): its own storage kept, --stored for the others, or refused") {
  ScratchStock stock;
  const std::string file = fixture("receipts/lots.json");
  const auto refused = run_cli({"stock", "--stock", stock.path(), "receive", "--from", file});
  CHECK(refused.status == 2);
  CHECK(refused.err.find(file + ": /lots/1: no storage (expected --stored") != std::string::npos);
  CHECK(stock.document()["lots"].size() == 3);
  const auto receive = run_cli({"stock", "--stock", stock.path(), "receive", "--from", file, "--stored", "-2 C,open"});
  INFO(receive.err);
  REQUIRE(receive.status == 0);
  const json document = stock.document();
  REQUIRE(document["lots"].size() == 5);
  CHECK(document["lots"][3]["storage"]["package"] == "sealed");
  CHECK(document["lots"][4]["storage"]["package"] == "open");
  // 3 lb = 3 x 453.59237 g = 1360.78 g (exact pound definition), stored to 0.01 g.
  CHECK(document["lots"][4]["on_hand"] == "1360.78 g");
  const auto both = run_cli({"stock", "--stock", stock.path(), "receive", "--from", file, "--lot", "X-1"});
  CHECK(both.status == 2);
  CHECK(both.err ==
        "bine: error: --lot: not with --from " + file + " (the file gives every lot; expected one or the other)\n");
}

TEST_CASE("stock receive --from: a file whose every row is bad still names each cell, and a code twice is named") {
  ScratchStock stock;
  const auto only_bad = stock.dir.path() / "only-bad.csv";
  write(only_bad, "Lot,Variety,Alpha (%),Amount (kg),Packaged\nB-1,Fernlight,lots,1,2026-02-01\n");
  const auto bad =
      run_cli({"stock", "--stock", stock.path(), "receive", "--from", only_bad.string(), "--stored", "-2 C,vacuum"});
  CHECK(bad.status == 2);
  CHECK(bad.err.find(only_bad.string() + ": line 2, column 3 (\"Alpha (%)\"): \"lots\"") != std::string::npos);
  const auto twice = stock.dir.path() / "twice.csv";
  write(twice,
        "Lot,Variety,Alpha (%),Amount (kg),Packaged\nT-1,Fernlight,9,1,2026-02-01\nt-1,Fernlight,9,1,2026-02-01\n");
  const auto again =
      run_cli({"stock", "--stock", stock.path(), "receive", "--from", twice.string(), "--stored", "-2 C,vacuum"});
  CHECK(again.status == 2);
  CHECK(again.err == "bine: error: " + twice.string() +
                         ": line 3: lot \"t-1\": already at line 2 of this file (expected a new lot code; to correct "
                         "an amount use stock adjust)\n");
  CHECK(stock.document()["lots"].size() == 3);
}
