// End-to-end (in-process): a lot's own aroma from the brewer's rub test. Fixtures (invented for the
// tests): two lots of one variety, alike in every figure; only one carries a rub test, scored exactly
// as the missing variety's catalog profile (citrus 4, floral 2). Expected values follow from those
// inputs alone.
#include <doctest/doctest.h>

#include <filesystem>
#include <fstream>
#include <nlohmann/json.hpp>
#include <string>

#include "cli/run_in_process.hpp"
#include "cli/temp_dir.hpp"

namespace {

using bine::test::fixture;
using bine::test::run_cli;

std::vector<std::string> with_fixtures(std::vector<std::string> args) {
  args.insert(args.begin(), {"--catalog", fixture("rub-catalog.json")});
  args.insert(args.end(), {"--stock", fixture("rub-stock.json"), "--on", "2026-12-01"});
  return args;
}

}  // namespace

TEST_CASE("swap: a lot's rub test stands for its aroma, so two lots of one variety rank apart") {
  const auto run = run_cli(with_fixtures({"swap", "Rub Gone", "--json"}));
  INFO(run.err);
  REQUIRE(run.status == 0);
  const auto doc = nlohmann::json::parse(run.out);
  const auto& subs = doc.at("substitutes");
  REQUIRE(subs.size() == 2);
  // The rubbed lot's aroma is the missing variety's own profile (citrus 4, floral 2, the rest 0); the
  // plain lot keeps its variety's catalog profile (pine 4): orthogonal to it, so it ranks below.
  CHECK(subs[0].at("lot") == "RO-RUBBED");
  CHECK(subs[0].at("aroma_source") == "the lot's rub test");
  CHECK(subs[0].at("aroma").at("citrus") == 4.0);
  CHECK(subs[0].at("aroma").at("floral") == 2.0);
  CHECK(subs[0].at("aroma").value("pine", 0.0) == 0.0);  // an axis at 0 may be left out
  CHECK(subs[1].at("lot") == "RO-PLAIN");
  CHECK(subs[1].at("aroma").at("pine") == 4.0);
  CHECK(double(subs[0].at("similarity")) > double(subs[1].at("similarity")));
  bool said = false;
  for (const auto& note : doc.at("notes"))
    said = said || note.get<std::string>().find("lot RO-RUBBED: aroma from the brewer's rub test of 2026-11-20") !=
                       std::string::npos;
  CHECK(said);
}

TEST_CASE("blend: the rubbed lot alone matches a target equal to its rub test") {
  const auto run = run_cli(with_fixtures({"blend", "--target", "citrus=4,floral=2", "--volume", "20L", "--ibu", "20",
                                          "--bittering", "Rub Other", "--json"}));
  INFO(run.err);
  REQUIRE(run.status == 0);
  const auto doc = nlohmann::json::parse(run.out);
  // The target is exactly the rubbed lot's scores, so that lot alone fits with no error; the plain lot
  // (pine 4) can only add distance.
  REQUIRE(doc.at("varieties").size() == 1);
  CHECK(doc.at("varieties")[0].at("lot") == "RO-RUBBED");
  CHECK(double(doc.at("varieties")[0].at("share")) == doctest::Approx(1.0));
  CHECK(double(doc.at("fit")) == doctest::Approx(0.0).epsilon(1e-9));
}

TEST_CASE("a rub test naming no axis of the lexicon, or without its date, is refused with one line each") {
  const bine::test::TempDir dir;
  std::ifstream in(fixture("rub-stock.json"));
  nlohmann::json stock = nlohmann::json::parse(in);
  stock["lots"][1]["rub_test"]["scores"] = {{"citrsu", 4}};
  const auto typo = dir.path() / "typo.json";
  std::ofstream(typo) << stock.dump();
  const auto bad_axis = run_cli(
      {"--catalog", fixture("rub-catalog.json"), "swap", "Rub Gone", "--stock", typo.string(), "--on", "2026-12-01"});
  CHECK(bad_axis.status == 2);
  CHECK(bad_axis.err.find(typo.string() + ": /lots/1/rub_test/scores/citrsu") != std::string::npos);
  CHECK(bad_axis.err.find("did you mean citrus") != std::string::npos);

  stock["lots"][1]["rub_test"] = {{"scores", {{"citrus", 6}}}};
  const auto undated = dir.path() / "undated.json";
  std::ofstream(undated) << stock.dump();
  const auto refused = run_cli({"--catalog", fixture("rub-catalog.json"), "swap", "Rub Gone", "--stock",
                                undated.string(), "--on", "2026-12-01"});
  CHECK(refused.status == 2);
  CHECK(refused.err.find("/lots/1/rub_test/scored") != std::string::npos);
  CHECK(refused.err.find("/lots/1/rub_test/scores/citrus") != std::string::npos);  // 6 is above 5
}
