// End-to-end (in-process, run_in_process.hpp): the same inputs give byte-identical JSON. Each command runs twice with
// --json; the two outputs must be equal, non-empty, valid JSON. JSON stays in canonical units, so --units us must not
// change it either.
#include <doctest/doctest.h>

#include <nlohmann/json.hpp>
#include <string>
#include <vector>

#include "cli/run_in_process.hpp"

namespace {

const std::string kExamples = std::string(BINE_SOURCE_DATA_DIR) + "/examples";

/// Runs `args` twice; checks both succeed with identical, parseable JSON; returns the output.
std::string check_twice(const std::vector<std::string>& args) {
  std::string joined;
  for (const auto& arg : args) joined += arg + " ";
  INFO("bine " << joined);
  const auto first = bine::test::run_cli(args);
  const auto second = bine::test::run_cli(args);
  INFO("stderr: " << first.err);
  CHECK(first.status == 0);
  CHECK(second.status == 0);
  CHECK(!first.out.empty());
  CHECK(first.out == second.out);
  CHECK(nlohmann::json::accept(first.out));
  return first.out;
}

}  // namespace

TEST_CASE("catalog list --json is byte-identical run to run and unit-system independent") {
  const std::string metric = check_twice({"catalog", "list", "--json"});
  const std::string us = check_twice({"--units", "us", "catalog", "list", "--json"});
  CHECK(metric == us);
  // A user catalog merged in changes the document, deterministically.
  const std::string merged = check_twice(
      {"--catalog", std::string(BINE_TEST_DIR) + "/bad-input/files/catalog-good.json", "catalog", "list", "--json"});
  CHECK(merged != metric);
}

TEST_CASE("catalog show --json is byte-identical run to run, whatever the name's spelling") {
  const std::string exact = check_twice({"catalog", "show", "Ironmarsh", "--json"});
  // Names fold case and surrounding space (names.hpp), so these must give the same document.
  CHECK(check_twice({"catalog", "show", "IRONMARSH", "--json"}) == exact);
  CHECK(check_twice({"--units", "us", "catalog", "show", "ironmarsh", "--json"}) == exact);
}

TEST_CASE("ibu --json is byte-identical run to run and unit-system independent") {
  const std::string metric = check_twice({"ibu", kExamples + "/pale-ale.json", "--json"});
  CHECK(check_twice({"--units", "us", "ibu", kExamples + "/pale-ale.json", "--json"}) == metric);
  CHECK(check_twice({"ibu", kExamples + "/hazy-ipa.json", "--model", "rager", "--json"}) != metric);
}

TEST_CASE("age --json is byte-identical run to run") {
  check_twice({"age", "--alpha", "11.2", "--packaged", "2025-10-01", "--stored", "-1 C,vacuum", "--variety",
               "Ironmarsh", "--on", "2026-06-01", "--json"});
}

TEST_CASE("rebalance --json is byte-identical run to run") {
  check_twice({"rebalance", kExamples + "/pale-ale.json", "--lot", "Keelstone=15.1", "--json"});
}

TEST_CASE("blend --json is byte-identical run to run (faiss search and QP included)") {
  check_twice({"blend", "--target", "floral=4,citrus=4", "--recipe", kExamples + "/pale-ale.json", "--json"});
  check_twice({"blend", "--like", "Tidewell", "--recipe", kExamples + "/pale-ale.json", "--stock",
               kExamples + "/stock.json", "--on", "2026-12-01", "--max-varieties", "2", "--json"});
}
