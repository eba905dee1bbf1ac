// The streamed catalog reader (loaders.hpp: load_catalog_streamed, used for files over the input
// limit) against the whole-file reader: the same varieties from the same file, and the same kind of
// one-line problems. The reference is parse_catalog, whose checks the loader tests pin to hand-written
// fixtures; a streamed read is only another way to the same catalog.
#include <doctest/doctest.h>

#include <filesystem>
#include <fstream>
#include <string>

#include "cli/temp_dir.hpp"
#include "engine/synthetic_catalog.hpp"
#include "io/data_dir.hpp"
#include "io/file_io.hpp"
#include "io/loaders.hpp"
#include "model/catalog_lookup.hpp"
#include "model/errors.hpp"

namespace {

namespace fs = std::filesystem;
const std::string kData = BINE_SOURCE_DATA_DIR;

bine::Lexicon lexicon() { return bine::load_lexicon(kData + "/lexicon.json"); }

std::string problems_of(const fs::path& file, const bine::Lexicon& lex) {
  try {
    bine::load_catalog_streamed(file, lex);
  } catch (const bine::InputError& error) {
    std::string all;
    for (const auto& line : error.lines()) all += line + "\n";
    return all;
  }
  return "";
}

void write(const fs::path& file, const std::string& text) {
  std::ofstream out(file, std::ios::binary);
  out << text;
}

}  // namespace

TEST_CASE("a streamed catalog has the same varieties as the whole-file read of the same file") {
  const bine::Lexicon lex = lexicon();
  const bine::test::TempDir dir;
  const fs::path file = dir.path() / "invented.json";
  const bine::Catalog invented = bine::synthetic_catalog(400, lex, 5);
  bine::write_file_atomically(file, bine::catalog_file_json(invented, "invented").dump(1));
  for (const fs::path& path : {file, fs::path(kData + "/catalog/demo.json")}) {
    const bine::Catalog whole = bine::load_catalog(path, lex);
    const bine::Catalog streamed = bine::load_catalog_streamed(path, lex);
    CHECK(streamed.names == whole.names);
    CHECK(streamed.demo == whole.demo);
    REQUIRE(streamed.varieties.size() == whole.varieties.size());
    CHECK(bine::catalog_file_json(streamed, "x") == bine::catalog_file_json(whole, "x"));
    CHECK(streamed.varieties.back().source_file == path.string());
    CHECK(bine::find_variety(streamed, whole.varieties[3].name) == &streamed.varieties[3]);
  }
}

TEST_CASE("a catalog file over the input limit is streamed: the limit applies per variety, not per file") {
  const bine::Lexicon lex = lexicon();
  const bine::test::TempDir dir;
  const fs::path file = dir.path() / "spaced.json";
  // Two varieties with 33 MiB of white space between them: over kMaxInputBytes (32 MiB) as a file.
  const std::string spaces(33u << 20, ' ');
  write(file, R"({"varieties": [{"name": "Padded One", "alpha_acid": [5, 6]},)" + spaces +
                  R"({"name": "Padded Two", "total_oil": 1.2}]})");
  REQUIRE(fs::file_size(file) > bine::kMaxInputBytes);
  CHECK_THROWS_AS(bine::read_text_file(file), bine::InputError);  // the whole-file reader refuses it
  const bine::Catalog catalog = bine::load_catalog(file, lex);
  REQUIRE(catalog.varieties.size() == 2);
  CHECK(catalog.varieties[0].alpha_acid->max == 6.0);
  CHECK(catalog.varieties[1].total_oil->min == 1.2);
}

TEST_CASE("streamed catalog problems: broken JSON, a duplicate, a bad value, an oversized record, no array") {
  const bine::Lexicon lex = lexicon();
  const bine::test::TempDir dir;
  const fs::path file = dir.path() / "bad.json";

  write(file, "{\"varieties\": [\n  {\"name\": \"A\"},\n  {\"name\": \"B\" \"origin\": \"X\"}\n]}");
  CHECK(problems_of(file, lex).find(file.string() + ": not valid JSON at line 3, column") != std::string::npos);

  write(file, R"({"varieties": [{"name": "Same"}, {"name": "same"}]})");
  CHECK(problems_of(file, lex) ==
        file.string() + ": /varieties/1/name: variety \"same\" is already defined at /varieties/0\n");

  write(file, R"({"varieties": [{"name": "Hot", "alpha_acid": 95}]})");
  CHECK(problems_of(file, lex).find(file.string() + ": /varieties/0/alpha_acid:") != std::string::npos);

  write(file, R"({"varieties": [{"name": "Big", "notes": ")" + std::string((1u << 20) + 10, 'x') + R"("}]})");
  CHECK(problems_of(file, lex) == file.string() +
                                      ": /varieties/0: one variety is larger than 1 MiB (check the file "
                                      "for a broken record)\n");

  write(file, R"({"varieties": {"name": "Alone"}})");
  CHECK(problems_of(file, lex).find("/varieties: ") != std::string::npos);
  CHECK(problems_of(file, lex).find("is not an array") != std::string::npos);

  write(file, R"({"catalog": {"name": "empty"}})");
  CHECK(problems_of(file, lex) == file.string() + ": /varieties: is missing (required)\n");
}
