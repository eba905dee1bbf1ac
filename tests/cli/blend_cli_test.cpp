// End-to-end tests of `bine blend` on the example files: exit codes, JSON keys, IBU held (checked
// again through `bine ibu` on the --write output), stock limits, determinism.
#include <doctest/doctest.h>
#include <sys/wait.h>
#include <unistd.h>

#include <cstdio>
#include <filesystem>
#include <fstream>
#include <nlohmann/json.hpp>
#include <sstream>
#include <string>

namespace {

struct Run {
  int status = -1;
  std::string out;
};

/// Runs bine through the shell with stderr discarded; arguments are passed already quoted.
Run bine_blend(const std::string& args) {
  const std::string command = std::string("'") + BINE_BINARY + "' " + args + " 2>/dev/null";
  Run run;
  FILE* pipe = popen(command.c_str(), "r");
  REQUIRE(pipe != nullptr);
  char buffer[4096];
  while (std::fgets(buffer, sizeof buffer, pipe) != nullptr) run.out += buffer;
  const int status = pclose(pipe);
  run.status = WIFEXITED(status) ? WEXITSTATUS(status) : -1;
  return run;
}

std::string examples() { return std::string("'") + BINE_TEST_DIR + "/../descriptor-data/examples/"; }

}  // namespace

TEST_CASE("bine blend from stock holds the recipe's 38 IBU and stays within stock") {
  const std::string ex = examples();
  const Run run = bine_blend("blend --target 'floral=4,citrus=4' --recipe " + ex + "pale-ale.json' --stock " + ex +
                             "stock.json' --json");
  REQUIRE(run.status == 0);
  const auto doc = nlohmann::json::parse(run.out);
  for (const char* key : {"target", "varieties", "profile", "fit", "bittering", "total_ibu"}) CHECK(doc.contains(key));
  // pale-ale.json states "target_ibu": 38.
  CHECK(std::abs(doc["total_ibu"].get<double>() - 38.0) <= 0.05);
  CHECK(doc["target"]["floral"].get<double>() == 4.0);
  CHECK(doc["varieties"].size() >= 1);
  CHECK(doc["varieties"].size() <= 3);
  double grams = 0.0;
  for (const auto& v : doc["varieties"]) {
    grams += v["grams"].get<double>();
    CHECK(v["left_g"].get<double>() >= 0.0);
  }
  CHECK(grams == doctest::Approx(80.0).epsilon(1e-3));  // 4 g/L (default) x 20 L
}

TEST_CASE("bine blend JSON is byte-identical across runs") {
  const std::string ex = examples();
  const std::string args = "blend --like Tidewell --recipe " + ex + "pale-ale.json' --json";
  const Run first = bine_blend(args);
  const Run second = bine_blend(args);
  REQUIRE(first.status == 0);
  CHECK(first.out == second.out);
}

TEST_CASE("--write saves a recipe that bine ibu reports at the held IBU") {
  const std::string ex = examples();
  const auto written = std::filesystem::temp_directory_path() / ("bine-blend-" + std::to_string(::getpid()) + ".json");
  const Run run = bine_blend("blend --target 'citrus=4,tropical=2' --recipe " + ex + "pale-ale.json' --write '" +
                             written.string() + "' --json");
  REQUIRE(run.status == 0);
  const Run ibu = bine_blend("ibu '" + written.string() + "' --json");
  std::filesystem::remove(written);
  REQUIRE(ibu.status == 0);
  CHECK(std::abs(nlohmann::json::parse(ibu.out)["total_ibu"].get<double>() - 38.0) <= 0.05);
}

TEST_CASE("bine blend: infeasible requests exit 3, bad options exit 2") {
  const std::string ex = examples();
  // 2 IBU is below what the kept 10-minute addition alone gives.
  CHECK(bine_blend("blend --target floral=4 --recipe " + ex + "pale-ale.json' --ibu 2").status == 3);
  // Without bittering, 10 % of 80 g in the whirlpool cannot give 150 IBU.
  CHECK(bine_blend("blend --target floral=4 --recipe " + ex + "pale-ale.json' --no-bittering --ibu 150 --split 0.1")
            .status == 3);
  CHECK(bine_blend("blend --target floral=4 --split 2 --recipe " + ex + "pale-ale.json'").status == 2);
  CHECK(bine_blend("blend --target 'flowery=4' --recipe " + ex + "pale-ale.json'").status == 2);
  CHECK(bine_blend("blend --target floral=4").status == 2);  // no recipe and no --volume/--ibu
}
