// End-to-end (in-process): inputs whose problems repeat thousands of times must give a short answer.
// A problem is said once (a repeated --lot), each file or command line reports at most the first
// 50 problems and how many more there were (model/errors.hpp kMaxProblemLines), and an array longer
// than its limit is refused while parsing (io/json_guard.hpp kJsonArrayLimits).
#include <doctest/doctest.h>

#include <fstream>
#include <string>
#include <vector>

#include "cli/run_in_process.hpp"
#include "cli/temp_dir.hpp"

namespace {

namespace fs = std::filesystem;

const std::string kPaleAle = std::string(BINE_SOURCE_DATA_DIR) + "/examples/pale-ale.json";

std::size_t count_lines(const std::string& text) {
  std::size_t lines = 0;
  for (char c : text) lines += c == '\n' ? 1 : 0;
  return lines;
}

}  // namespace

TEST_CASE("3,000 identical --lot options are reported once") {
  std::vector<std::string> args{"rebalance", kPaleAle};
  for (int i = 0; i < 3000; ++i) args.insert(args.end(), {"--lot", "Keelstone=12"});
  const auto result = bine::test::run_cli(args);
  INFO(result.err.substr(0, 2000));
  CHECK(result.status == 2);
  CHECK(count_lines(result.err) == 1);
  CHECK(result.err.find("\"Keelstone\" is given more than once") != std::string::npos);
}

TEST_CASE("a million empty hop objects are refused at the first past the limit, in one line") {
  const bine::test::TempDir scratch;
  const fs::path recipe = scratch.path() / "many-hops.json";
  {
    std::ofstream out(recipe);
    out << "{\"batch_volume\": \"20 L\", \"hops\": [{}";
    for (int i = 1; i < 1000000; ++i) out << ",{}";
    out << "]}";
  }
  const auto result = bine::test::run_cli({"catalog", "check", recipe.string()});
  CHECK(result.status == 2);
  CHECK(count_lines(result.err) == 1);
  // A recipe holds at most 1,000 additions (io/json_guard.hpp), indices 0-999: 1000 is the first too many.
  CHECK(result.err.find(recipe.string() + ": /hops/1000: more than 1,000 hop additions") != std::string::npos);
}

TEST_CASE("1,000 empty hop objects give 50 problem lines and a count of the rest") {
  const bine::test::TempDir scratch;
  const fs::path recipe = scratch.path() / "many-hops.json";
  {
    std::ofstream out(recipe);
    out << "{\"batch_volume\": \"20 L\", \"original_gravity\": 1.05, \"boil_time\": 60, \"hops\": [{}";
    for (int i = 1; i < 1000; ++i) out << ",{}";
    out << "]}";
  }
  const auto result = bine::test::run_cli({"catalog", "check", recipe.string()});
  CHECK(result.status == 2);
  // 50 problems, then the count line: an empty addition lacks its variety, amount and use, so
  // 1,000 x 3 = 3,000 problems, 3,000 - 50 = 2,950 more.
  CHECK(count_lines(result.err) == 51);
  CHECK(result.err.find(recipe.string() + ": /hops/0/variety: is missing") != std::string::npos);
  CHECK(result.err.find("... and 2950 more problems (fix these first)") != std::string::npos);
}

TEST_CASE("3,000 malformed --lot options give 50 lines and a count of the rest") {
  std::vector<std::string> args{"rebalance", kPaleAle};
  for (int i = 0; i < 3000; ++i) args.insert(args.end(), {"--lot", "Keelstone"});
  const auto result = bine::test::run_cli(args);
  CHECK(result.status == 2);
  CHECK(count_lines(result.err) == 51);
  CHECK(result.err.find("... and 2950 more problems") != std::string::npos);
}
