// End-to-end (in-process, run_in_process.hpp): every malformed file and argument list in
// tests/bad-input. Each case must return the case's exit status (2 bad input, 3 infeasible), print
// one "bine: " line per problem naming the file and JSON pointer, contain the case's message
// fragment, and leak no exception or sanitizer text. A crash or a signal would end the test
// executable itself, which CTest reports as a failure.
#include <doctest/doctest.h>
#include <sys/stat.h>

#include <fstream>
#include <nlohmann/json.hpp>
#include <string>
#include <vector>

#include "cli/run_in_process.hpp"
#include "cli/temp_dir.hpp"

namespace {

namespace fs = std::filesystem;

const fs::path kCases = fs::path(BINE_TEST_DIR) / "bad-input";

std::string replace_all(std::string text, const std::string& from, const std::string& to) {
  for (std::size_t at = text.find(from); at != std::string::npos; at = text.find(from, at + to.size()))
    text.replace(at, from.size(), to);
  return text;
}

nlohmann::json load_cases() {
  std::ifstream in(kCases / "cases.json");
  REQUIRE(in.good());
  return nlohmann::json::parse(in).at("cases");
}

/// A 100 MB file that starts like a catalog: far beyond the 32 MB input limit, so `catalog check`
/// refuses it before reading it, and as --catalog it is streamed one variety at a time (never held
/// whole) and found empty.
fs::path make_big_file(const fs::path& folder) {
  const fs::path path = folder / "huge-catalog.json";
  std::ofstream out(path, std::ios::binary);
  out << "{\"varieties\": [";
  const std::string block(1 << 20, ' ');
  for (int i = 0; i < 100; ++i) out << block;
  out << "]}\n";
  return path;
}

/// The file of a case with "made", written at test time: "deep" is prefix, `open` x levels, `close`
/// x levels, suffix (100,000 levels is 200 kB a file, too big to commit); "fifo" is a named pipe
/// (nothing ever writes to it); "fifo-link" a symlink to one; "data-with-fifo" a data folder whose
/// catalog folder holds a pipe named like a catalog. A "deep" file with "name" is written under that
/// name in a folder of its own ({made-dir}), beside copies of the shipped files listed in "beside"
/// (paths under descriptor-data), so a data folder's lexicon or a stock file's journal can be deep.
/// "repeat" is prefix, `element` `count` times with commas (or "separator") between, suffix (a
/// million records, a name of 10,000 letters).
fs::path make_case_file(const fs::path& folder, const nlohmann::json& made, int index) {
  fs::path path = folder / ("made-" + std::to_string(index) + ".json");
  if (made.contains("name")) {
    const fs::path own = folder / ("made-" + std::to_string(index));
    fs::create_directories(own);
    for (const auto& shipped : made.value("beside", nlohmann::json::array())) {
      const fs::path from = fs::path(BINE_SOURCE_DATA_DIR) / shipped.get<std::string>();
      fs::copy_file(from, own / from.filename());
    }
    path = own / made.at("name").get<std::string>();
  }
  const std::string kind = made.at("kind");
  if (kind == "fifo" || kind == "fifo-link") {
    const fs::path fifo = folder / ("pipe-" + std::to_string(index) + ".json");
    REQUIRE(::mkfifo(fifo.c_str(), 0600) == 0);
    if (kind == "fifo") return fifo;
    fs::create_symlink(fifo, path);
    return path;
  }
  if (kind == "data-with-fifo") {
    const fs::path data = folder / ("data-" + std::to_string(index));
    fs::create_directories(data / "catalog");
    fs::copy_file(fs::path(BINE_SOURCE_DATA_DIR) / "lexicon.json", data / "lexicon.json");
    REQUIRE(::mkfifo((data / "catalog" / "pipe.json").c_str(), 0600) == 0);
    return data;
  }
  std::ofstream out(path, std::ios::binary);
  if (kind == "repeat") {
    out << made.at("prefix").get<std::string>();
    const std::string element = made.at("element");
    const std::string separator = made.value("separator", ",");
    const auto count = made.at("count").get<int>();
    for (int i = 0; i < count; ++i) out << (i ? separator : "") << element;
    out << made.at("suffix").get<std::string>();
    return path;
  }
  REQUIRE(kind == "deep");
  const auto levels = made.at("levels").get<int>();
  out << made.at("prefix").get<std::string>();
  for (int i = 0; i < levels; ++i) out << made.at("open").get<std::string>();
  for (int i = 0; i < levels; ++i) out << made.at("close").get<std::string>();
  out << made.at("suffix").get<std::string>();
  return path;
}

const std::vector<std::string> kLeaks{"what()",           "terminate",     "exception",      "nlohmann", "Assertion",
                                      "AddressSanitizer", "runtime error", "internal error", "[json."};

}  // namespace

TEST_CASE("bad-input suite has at least 40 cases, each with a status and a message") {
  const auto cases = load_cases();
  CHECK(cases.size() >= 40);
  for (const auto& item : cases) {
    INFO(item.dump());
    CHECK(item.contains("args"));
    CHECK((item.at("status") == 2 || item.at("status") == 3));
    CHECK(!item.at("message").get<std::string>().empty());
    if (item.contains("file") && item.at("file") != "no-such-file.json")
      CHECK(fs::exists(kCases / "files" / item.at("file").get<std::string>()));
  }
}

TEST_CASE("every bad input ends with exit 2 or 3 and one clear line per problem") {
  const bine::test::TempDir scratch;
  const fs::path big = make_big_file(scratch.path());
  REQUIRE(fs::file_size(big) > 100u * 1000u * 1000u);
  int run = 0;
  for (const auto& item : load_cases()) {
    const std::string name = item.at("name");
    const std::string file =
        item.contains("file") ? (kCases / "files" / item.at("file").get<std::string>()).string() : "";
    const std::string made = item.contains("made") ? make_case_file(scratch.path(), item.at("made"), run).string() : "";
    auto expand = [&](std::string text) {
      text = replace_all(text, "{file}", file);
      text = replace_all(text, "{made-dir}", fs::path(made).parent_path().string());
      text = replace_all(text, "{made}", made);
      text = replace_all(text, "{q10000}", std::string(10000, 'q'));
      text = replace_all(text, "{big}", big.string());
      text = replace_all(text, "{data}", BINE_SOURCE_DATA_DIR);
      return replace_all(text, "{xff}", "\xff");
    };
    std::vector<std::string> args;
    for (const auto& arg : item.at("args")) args.push_back(expand(arg.get<std::string>()));
    const auto result = bine::test::run_cli(args);
    ++run;
    INFO("case: " << name);
    INFO("stderr: " << result.err);
    CHECK(result.status == item.at("status").get<int>());
    CHECK(result.err.find(expand(item.at("message").get<std::string>())) != std::string::npos);
    for (const auto& leak : kLeaks) CHECK(result.err.find(leak) == std::string::npos);
    if (item.contains("names"))
      for (const auto& needle : item.at("names"))
        CHECK(result.err.find(expand(needle.get<std::string>())) != std::string::npos);
    std::istringstream lines(result.err);
    std::string line;
    int count = 0;
    while (std::getline(lines, line)) {
      CHECK(line.rfind("bine: ", 0) == 0);
      ++count;
    }
    CHECK(count >= 1);
    if (item.contains("lines")) CHECK(count == item.at("lines").get<int>());
  }
  CHECK(run >= 40);
}
