// End-to-end (in-process, run_in_process.hpp): a compiled catalog answers exactly as the JSON catalog
// it was compiled from. The reference is the same command on the JSON file (the path every other test
// checks against hand arithmetic); a compiled catalog is only a faster way to the same answer, so the
// outputs must match byte for byte. The catalog is invented (engine/synthetic_catalog.hpp), small
// enough that both sides use the exact index.
#include <doctest/doctest.h>

#include <filesystem>
#include <fstream>
#include <nlohmann/json.hpp>
#include <string>
#include <vector>

#include "cli/run_in_process.hpp"
#include "cli/temp_dir.hpp"
#include "engine/synthetic_catalog.hpp"
#include "io/data_dir.hpp"
#include "io/file_io.hpp"
#include "io/loaders.hpp"

namespace {

namespace fs = std::filesystem;
using bine::test::run_cli;

const std::string kData = BINE_SOURCE_DATA_DIR;

/// An invented catalog of `count` varieties written as catalog JSON; returns the variety names.
std::vector<std::string> write_catalog(const fs::path& file, std::size_t count, std::uint64_t seed) {
  const bine::DataSet data = bine::load_data({kData, "--data"}, {});
  bine::Catalog catalog = bine::synthetic_catalog(count, data.lexicon, seed);
  bine::write_file_atomically(file, bine::catalog_file_json(catalog, "invented test catalog").dump(1) + "\n");
  std::vector<std::string> names;
  for (const auto& v : catalog.varieties) names.push_back(v.name);
  return names;
}

/// A stock file with one lot of every 7th variety.
void write_stock(const fs::path& file, const std::vector<std::string>& names) {
  nlohmann::json lots = nlohmann::json::array();
  for (std::size_t i = 0; i < names.size(); i += 7)
    lots.push_back({{"variety", names[i]},
                    {"lot", "T" + std::to_string(i)},
                    {"alpha_acid", 6.5},
                    {"packaged", "2026-03-01"},
                    {"storage", {{"temperature", "-2 C"}, {"package", "vacuum"}}},
                    {"on_hand", "400 g"}});
  bine::write_file_atomically(file, nlohmann::json{{"lots", lots}}.dump(1) + "\n");
}

/// A command's JSON output without "catalogs_used", the one entry that names the file the figures
/// came from (the JSON file or the compiled catalog) and so differs by design.
std::string without_sources(const std::string& out) {
  nlohmann::json document = nlohmann::json::parse(out, nullptr, false);
  if (document.is_discarded() || !document.is_object()) return out;
  document.erase("catalogs_used");
  return document.dump(1);
}

/// `args` after "--catalog FILE".
std::vector<std::string> with_catalog(const fs::path& file, const std::vector<std::string>& args) {
  std::vector<std::string> all{"--catalog", file.string()};
  all.insert(all.end(), args.begin(), args.end());
  return all;
}

}  // namespace

TEST_CASE("a compiled catalog gives the same swap, blend and catalog output as its JSON source over 200 queries") {
  const bine::test::TempDir dir;
  const fs::path json = dir.path() / "invented.json";
  const fs::path compiled = dir.path() / "invented.bine";
  const fs::path stock = dir.path() / "stock.json";
  const auto names = write_catalog(json, 1000, 7);
  write_stock(stock, names);
  const auto compile = run_cli({"catalog", "compile", json.string(), "--out", compiled.string()});
  REQUIRE_MESSAGE(compile.status == 0, compile.err);
  CHECK(fs::exists(compiled));

  // Every variety and every field comes back as the JSON file gives it.
  const auto list_json = run_cli({"--catalog", json.string(), "catalog", "list", "--json"});
  const auto list_compiled = run_cli({"--catalog", compiled.string(), "catalog", "list", "--json"});
  REQUIRE(list_json.status == 0);
  CHECK(without_sources(list_json.out) == without_sources(list_compiled.out));
  const auto used = nlohmann::json::parse(list_compiled.out).at("catalogs_used");
  REQUIRE(used.size() == 1);
  CHECK(used[0].at("name") == "invented test catalog");
  CHECK(used[0].at("file") == "compiled " + compiled.string());

  std::size_t compared = 0;
  for (std::size_t q = 0; q < 200; ++q) {
    const std::string& name = names[(q * 37) % names.size()];
    std::vector<std::string> args{"swap", name, "--json"};
    if (q % 2 == 1) args.insert(args.end(), {"--for", "bittering"});
    if (q % 5 == 0) args.push_back("--pairs");
    if (q % 4 == 0) args.insert(args.end(), {"--stock", stock.string(), "--on", "2026-11-01"});
    std::vector<std::string> with_json{"--catalog", json.string()}, with_compiled{"--catalog", compiled.string()};
    with_json.insert(with_json.end(), args.begin(), args.end());
    with_compiled.insert(with_compiled.end(), args.begin(), args.end());
    const auto a = run_cli(with_json);
    const auto b = run_cli(with_compiled);
    CHECK_MESSAGE(a.status == b.status, name);
    CHECK_MESSAGE(without_sources(a.out) == without_sources(b.out), name);
    compared += a.status == 0 && without_sources(a.out) == without_sources(b.out) ? 1 : 0;
  }
  CHECK(compared == 200);

  // Blends: catalog mode (candidates streamed from the compiled rows), --like, and stock mode.
  const std::vector<std::string> wort{"--volume", "20L", "--ibu", "30", "--bittering", names[5], "--json"};
  const std::vector<std::vector<std::string>> blends{
      {"blend", "--target", "citrus=4,floral=3"},
      {"blend", "--target", "tropical=4,stone-fruit=3", "--max-varieties", "2"},
      {"blend", "--like", names[11]},
      {"blend", "--target", "pine=4", "--stock", stock.string()}};
  for (const auto& blend : blends) {
    std::vector<std::string> a{"--catalog", json.string()}, b{"--catalog", compiled.string()};
    for (auto* args : {&a, &b}) {
      args->insert(args->end(), blend.begin(), blend.end());
      args->insert(args->end(), wort.begin(), wort.end());
    }
    const auto from_json = run_cli(a);
    REQUIRE_MESSAGE(from_json.status == 0, from_json.err);
    CHECK_MESSAGE(without_sources(from_json.out) == without_sources(run_cli(b).out), blend[2]);
  }
}

TEST_CASE("a stale compiled catalog is named and its JSON source read instead, and a missing index is an error") {
  const bine::test::TempDir dir;
  const fs::path json = dir.path() / "invented.json";
  const fs::path compiled = dir.path() / "invented.bine";
  const auto names = write_catalog(json, 300, 8);
  REQUIRE(run_cli({"catalog", "compile", json.string(), "--out", compiled.string()}).status == 0);

  // A different catalog under the same file name: the compiled one no longer matches.
  const auto changed = write_catalog(json, 320, 9);
  const auto stale = run_cli({"--catalog", compiled.string(), "swap", changed.back(), "--json"});
  CHECK(stale.status == 0);
  CHECK(stale.err.find("bine: note: " + compiled.string() + " is stale (" + json.string() + " changed") !=
        std::string::npos);
  CHECK(stale.err.find("bine catalog compile " + json.string() + " --out " + compiled.string()) != std::string::npos);
  CHECK(stale.out ==
        run_cli({"--catalog", json.string(), "swap", changed.back(), "--json"}).out);  // read from the JSON

  // Recompiled, then its source moved away: used as it stands, with a note.
  REQUIRE(run_cli({"catalog", "compile", json.string(), "--out", compiled.string()}).status == 0);
  const fs::path moved = dir.path() / "moved.json";
  fs::rename(json, moved);
  const auto unchecked = run_cli({"--catalog", compiled.string(), "swap", changed.back(), "--json"});
  CHECK(unchecked.status == 0);
  CHECK(unchecked.err.find("not checked against its sources, which are gone (" + json.string() + ")") !=
        std::string::npos);
  fs::rename(moved, json);

  // An index file removed: exit 2 with one line naming the file.
  std::size_t indexes = 0;
  for (const auto& entry : fs::directory_iterator(dir.path()))
    if (entry.path().extension() == ".faiss") {
      ++indexes;
      if (entry.path().string().find(".aroma.") != std::string::npos) fs::remove(entry.path());
    }
  CHECK(indexes == 2);  // the first compile's indexes were removed
  const auto broken = run_cli({"--catalog", compiled.string(), "swap", changed.front()});
  CHECK(broken.status == 2);
  CHECK(broken.err.find("aroma index") != std::string::npos);
  CHECK(broken.err.find("missing or damaged") != std::string::npos);
}

TEST_CASE("catalog compile refuses a compiled catalog as a source and a file that is not one as --catalog") {
  const bine::test::TempDir dir;
  const fs::path json = dir.path() / "invented.json";
  const fs::path compiled = dir.path() / "invented.bine";
  write_catalog(json, 50, 3);
  REQUIRE(run_cli({"catalog", "compile", json.string(), "--out", compiled.string()}).status == 0);
  const auto again = run_cli({"catalog", "compile", compiled.string(), "--out", (dir.path() / "x.bine").string()});
  CHECK(again.status == 2);
  CHECK(again.err.find("already a compiled catalog") != std::string::npos);
  const auto two = run_cli({"--catalog", compiled.string(), "--catalog", compiled.string(), "catalog", "list"});
  CHECK(two.status == 2);
  CHECK(two.err.find("one compiled catalog at a time") != std::string::npos);
}

TEST_CASE("a blend from a compiled catalog leaves out the same varieties, with the same notes, as from its JSON") {
  // Catalog mode reads a compiled catalog's stored blend rows, not whole varieties: the rows must
  // say no aroma, no oil and bittering-only exactly as the varieties do.
  const bine::test::TempDir dir;
  const fs::path json = dir.path() / "mixed.json";
  const fs::path compiled = dir.path() / "mixed.bine";
  const nlohmann::json doc = {
      {"catalog", {{"name", "invented mixed catalog"}, {"demo", true}}},
      {"varieties",
       {{{"name", "Bitter Only"}, {"purpose", "bittering"}, {"alpha_acid", {13.0, 15.0}}, {"total_oil", {2.0, 3.0}}},
        {{"name", "No Aroma"}, {"purpose", "aroma"}, {"alpha_acid", {4.0, 5.0}}, {"total_oil", {1.0, 2.0}}},
        {{"name", "No Oil"}, {"purpose", "aroma"}, {"alpha_acid", {4.0, 5.0}}, {"aroma", {{"citrus", 4.0}}}},
        {{"name", "Lemon Bright"},
         {"purpose", "aroma"},
         {"alpha_acid", {5.0, 7.0}},
         {"total_oil", {1.0, 2.0}},
         {"aroma", {{"citrus", 4.0}, {"floral", 1.0}}}},
        {{"name", "Meadow"},
         {"purpose", "dual"},
         {"alpha_acid", {6.0, 8.0}},
         {"total_oil", {1.5, 2.5}},
         {"aroma", {{"floral", 4.0}, {"citrus", 1.0}}}}}}};
  std::ofstream(json) << doc.dump();
  REQUIRE(run_cli({"catalog", "compile", json.string(), "--out", compiled.string()}).status == 0);
  for (const bool as_json : {true, false}) {
    std::vector<std::string> blend{"blend", "--target", "citrus=4,floral=3", "--volume",   "20L",
                                   "--ibu", "30",       "--bittering",       "Bitter Only"};
    if (as_json) blend.push_back("--json");
    const auto from_json = run_cli(with_catalog(json, blend));
    const auto from_compiled = run_cli(with_catalog(compiled, blend));
    REQUIRE_MESSAGE(from_json.status == 0, from_json.err);
    CHECK(from_json.out.find("No Aroma") != std::string::npos);  // noted as skipped: no aroma data
    CHECK(from_json.out.find("No Oil") != std::string::npos);    // noted as skipped: no total oil
    if (as_json) {
      CHECK(without_sources(from_json.out) == without_sources(from_compiled.out));
    } else {
      const auto cut = [](const std::string& text) { return text.substr(0, text.find("Catalogs used: ")); };
      CHECK(cut(from_json.out) == cut(from_compiled.out));
    }
  }
}
