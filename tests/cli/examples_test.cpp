// Every example a brewer can copy, run as written: the command lines in README.md's code blocks and in
// the "Examples:" of each command's --help. Each must end with its documented exit status: 0, unless
// the README shows the reply under it ("bine: error:" is exit 2, "bine: cannot do that:" exit 3).
// The examples name files as a brewer has them in the folder they work in (pale-ale.json,
// stock.json) or by their place in the repository (descriptor-data/examples/...), so they run in a
// scratch folder holding the shipped examples under both names. Synopsis lines (with placeholders
// such as RECIPE or [--json]) are not examples and are skipped.
#include <doctest/doctest.h>

#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <optional>
#include <regex>
#include <sstream>
#include <string>
#include <vector>

#include "cli/run_in_process.hpp"
#include "cli/temp_dir.hpp"

namespace {

namespace fs = std::filesystem;

struct Example {
  std::string where;  // "README.md:123" or "bine blend --help"
  std::string line;   // the command after "bine " (or after "cp " / "export " for a set-up step)
  int status = 0;     // the documented exit status
  enum class Kind { bine, copy, set_env } kind = Kind::bine;
};

/// Words of a command line as a POSIX shell splits them (double and single quotes; a "#" word starts
/// a comment; a ">" word redirects the output, which the test captures anyway, so it and the rest go).
std::vector<std::string> shell_words(const std::string& line) {
  std::vector<std::string> words;
  std::string word;
  bool in_word = false;
  char quote = 0;
  for (const char c : line) {
    if (quote != 0) {
      if (c == quote)
        quote = 0;
      else
        word += c;
    } else if (c == '"' || c == '\'') {
      quote = c;
      in_word = true;
    } else if (c == ' ') {
      if (in_word) words.push_back(word);
      word.clear();
      in_word = false;
    } else if ((c == '#' || c == '>') && !in_word) {
      break;
    } else {
      word += c;
      in_word = true;
    }
  }
  if (in_word) words.push_back(word);
  return words;
}

/// A synopsis shows the form of a command, not a command to run: brackets, alternatives, "..." or an
/// upper-case placeholder (RECIPE, FILE, PCT).
bool is_synopsis(const std::string& line) {
  static const std::regex placeholder("(^|[ =(])[A-Z][A-Z_/%]{2,}([ )]|$)");
  const std::string command = line.substr(0, line.find(" #"));  // a comment may say anything
  return command.find('[') != std::string::npos || command.find('|') != std::string::npos ||
         command.find("...") != std::string::npos || std::regex_search(command, placeholder);
}

/// One line of a README code block as an example: "bine ..." or "$ bine ...", and the set-up steps
/// the README's own sequences use ("cp A B", "export NAME=VALUE"); nullopt for anything else.
std::optional<Example> example_from(const std::string& line, int number) {
  const std::string where = "README.md:" + std::to_string(number);
  for (const std::string prefix : {"$ bine ", "bine "})
    if (line.rfind(prefix, 0) == 0) return Example{where, line.substr(prefix.size()), 0, Example::Kind::bine};
  if (line.rfind("cp ", 0) == 0) return Example{where, line.substr(3), 0, Example::Kind::copy};
  if (line.rfind("export ", 0) == 0) return Example{where, line.substr(7), 0, Example::Kind::set_env};
  return std::nullopt;
}

/// The README's examples, in order. A line ending in a backslash goes on on the next line, as in a
/// shell. A code block with a synopsis line in it is a synopsis block, and none of it is run.
std::vector<Example> readme_examples() {
  std::istringstream in(bine::test::slurp(fs::path(BINE_TEST_DIR) / ".." / "README.md"));
  std::vector<Example> examples;
  std::vector<Example> block;
  bool in_code = false;
  bool synopsis_block = false;
  std::string line;
  for (int number = 1; std::getline(in, line); ++number) {
    if (line.rfind("```", 0) == 0) {
      if (in_code && !synopsis_block) examples.insert(examples.end(), block.begin(), block.end());
      in_code = !in_code;
      block.clear();
      synopsis_block = false;
      continue;
    }
    if (!in_code) continue;
    const int first = number;
    while (!line.empty() && line.back() == '\\') {
      std::string next;
      if (!std::getline(in, next)) break;
      ++number;
      line = line.substr(0, line.size() - 1) + " " + next.substr(std::min(next.find_first_not_of(' '), next.size()));
    }
    if (line.rfind("bine: error:", 0) == 0 && !block.empty()) block.back().status = 2;
    if (line.rfind("bine: cannot do that:", 0) == 0 && !block.empty()) block.back().status = 3;
    const std::optional<Example> example = example_from(line, first);
    if (!example) continue;
    if (example->kind == Example::Kind::bine && is_synopsis(example->line)) synopsis_block = true;
    block.push_back(*example);
  }
  return examples;
}

/// The examples of `bine WORDS --help`: the lines "  bine ..." under "Examples:".
std::vector<Example> help_examples(const std::vector<std::string>& command) {
  std::vector<std::string> args = command;
  args.push_back("--help");
  const auto help = bine::test::run_cli(args);
  REQUIRE(help.status == 0);
  std::istringstream in(help.out);
  std::vector<Example> examples;
  std::string line;
  std::string where = "bine";
  for (const auto& word : command) where += " " + word;
  where += " --help";
  while (std::getline(in, line)) {
    const auto at = line.find_first_not_of(' ');
    if (at == std::string::npos || at == 0 || line.compare(at, 5, "bine ") != 0) continue;
    examples.push_back({where, line.substr(at + 5), 0});
  }
  return examples;
}

/// One BeerXML 1.0 RECIPE record (field names and units from the specification: kg, L, minutes,
/// percent) with varieties of the shipped catalog, as a recipe program would export it.
std::string beerxml_recipe(const std::string& name) {
  return "<RECIPE><NAME>" + name +
         "</NAME><VERSION>1</VERSION><TYPE>All Grain</TYPE><BREWER>Example</BREWER>"
         "<BATCH_SIZE>20.0</BATCH_SIZE><BOIL_SIZE>24.0</BOIL_SIZE><BOIL_TIME>60</BOIL_TIME><OG>1.050</OG>"
         "<HOPS><HOP><NAME>Keelstone</NAME><VERSION>1</VERSION><ALPHA>13.4</ALPHA><AMOUNT>0.017</AMOUNT>"
         "<USE>Boil</USE><TIME>60</TIME><FORM>Pellet</FORM></HOP>"
         "<HOP><NAME>Tidewell</NAME><VERSION>1</VERSION><ALPHA>7.3</ALPHA><AMOUNT>0.040</AMOUNT>"
         "<USE>Aroma</USE><TIME>20</TIME><FORM>Pellet</FORM></HOP></HOPS>"
         "<FERMENTABLES/><MISCS/><YEASTS/><WATERS/><STYLE><NAME>Pale Ale</NAME><VERSION>1</VERSION>"
         "<CATEGORY>Pale Ale</CATEGORY><CATEGORY_NUMBER>1</CATEGORY_NUMBER><STYLE_LETTER>A</STYLE_LETTER>"
         "<STYLE_GUIDE>Example</STYLE_GUIDE><TYPE>Ale</TYPE><OG_MIN>1.045</OG_MIN><OG_MAX>1.060</OG_MAX>"
         "<FG_MIN>1.010</FG_MIN><FG_MAX>1.015</FG_MAX><IBU_MIN>25</IBU_MIN><IBU_MAX>45</IBU_MAX>"
         "<COLOR_MIN>5</COLOR_MIN><COLOR_MAX>10</COLOR_MAX></STYLE></RECIPE>";
}

void write_text(const fs::path& path, const std::string& text) {
  std::ofstream out(path, std::ios::binary);
  out << text;
}

/// A scratch folder with the shipped examples as ./NAME and ./descriptor-data/examples/NAME, and the
/// brewer's own files the examples name: BeerXML exports (their-recipe.xml, their-recipes.xml), a
/// catalog of their own (my-hops.json, a test fixture), a merchant's catalog in two files and a recipe (recipe.json,
/// the pale ale).
void copy_examples(const fs::path& folder) {
  fs::copy_file(bine::test::fixture("h3-catalog.json"), folder / "my-hops.json");
  // A merchant's catalog in two files (to compile): the shipped demo varieties and two fixtures.
  fs::copy_file(fs::path(BINE_SOURCE_DATA_DIR) / "catalog" / "demo.json", folder / "merchant-1.json");
  fs::copy_file(bine::test::fixture("h3-catalog.json"), folder / "merchant-2.json");
  fs::copy_file(bine::test::fixture("iv-brewhouse.json"), folder / "brewhouse.json");
  // A supplier's spec sheet (the CSV fixture, its varieties named as a supplier would).
  write_text(folder / "supplier-specs.csv",
             std::regex_replace(bine::test::slurp(bine::test::fixture("csv/spec-sheet-semicolon.csv")),
                                std::regex("Fixture "), ""));
  // Certificates of analysis with the two headers the README's --columns names, and new lots to receive
  // (shipped demo varieties, lot codes the demo stock does not have).
  write_text(folder / "certificates.csv",
             "Charge,Variety,AA (%),Amount (kg),Packaged\nTW-26-090,Tidewell,7.2,5,2026-10-01\n"
             "KS-26-091,Keelstone,13.1,2,2026-10-03\n");
  write_text(folder / "new-lots.csv",
             "Lot,Variety,Alpha (%),Amount (kg),Packaged\nTW-26-092,Tidewell,7.5,5,2026-10-05\n");
  // BeerXML 1.0 hop records (HOPS/HOP with the specification's required fields).
  write_text(folder / "hops.xml",
             "<?xml version=\"1.0\"?>\n<HOPS><HOP><NAME>Harbour Gold</NAME><VERSION>1</VERSION><ALPHA>6.5</ALPHA>"
             "<AMOUNT>0.1</AMOUNT><USE>Aroma</USE><TIME>20</TIME><NOTES>lemon, pine</NOTES></HOP></HOPS>\n");
  fs::copy_file(fs::path(BINE_SOURCE_DATA_DIR) / "examples" / "pale-ale.json", folder / "recipe.json");
  const std::string head = "<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n<RECIPES>";
  write_text(folder / "their-recipe.xml", head + beerxml_recipe("Harbour Pale") + "</RECIPES>\n");
  write_text(folder / "their-recipes.xml",
             head + beerxml_recipe("Harbour Pale") + beerxml_recipe("Harbour Mild") + "</RECIPES>\n");
  const fs::path shipped = fs::path(BINE_SOURCE_DATA_DIR) / "examples";
  fs::create_directories(folder / "descriptor-data" / "examples");
  for (const auto& entry : fs::directory_iterator(shipped)) {
    fs::copy_file(entry.path(), folder / entry.path().filename());
    fs::copy_file(entry.path(), folder / "descriptor-data" / "examples" / entry.path().filename());
  }
}

/// Runs the example in `folder` (the working directory for its relative file names); a set-up step
/// copies the file or sets the variable as the shell would.
bine::test::CliRun run_example(const Example& example, const fs::path& folder) {
  const std::vector<std::string> words = shell_words(example.line);
  if (example.kind == Example::Kind::copy) {
    REQUIRE(words.size() == 2);
    fs::copy_file(folder / words[0], folder / words[1], fs::copy_options::overwrite_existing);
    return {0, "", ""};
  }
  if (example.kind == Example::Kind::set_env) {
    const auto eq = example.line.find('=');
    REQUIRE(eq != std::string::npos);
    ::setenv(example.line.substr(0, eq).c_str(), (folder / example.line.substr(eq + 1)).c_str(), 1);
    return {0, "", ""};
  }
  const fs::path before = fs::current_path();
  fs::current_path(folder);
  const auto run = bine::test::run_cli(words);
  fs::current_path(before);
  return run;
}

void check_examples(const std::vector<Example>& examples) {
  const bine::test::TempDir dir;
  copy_examples(dir.path());
  for (const auto& example : examples) {
    const auto run = run_example(example, dir.path());
    INFO(example.where << ": " << example.line << "\n" << run.err);
    CHECK(run.status == example.status);
  }
  ::unsetenv("BINE_STOCK");  // the README's stock sequence sets it
}

}  // namespace

TEST_CASE("the shell splitter keeps quoted words whole and drops comments") {
  // POSIX shell word splitting (quotes removed, "# ..." a comment), written out by hand.
  const auto words = shell_words("swap Tidewell --target \"floral=4,citrus=4\" --stored '-1 C,vacuum'   # best 5");
  REQUIRE(words.size() == 6);
  CHECK(words[3] == "floral=4,citrus=4");
  CHECK(words[5] == "-1 C,vacuum");
  CHECK(is_synopsis("ibu RECIPE [--model tinseth|rager] [--json]"));
  CHECK(is_synopsis("age --alpha PCT --packaged DATE"));
  CHECK_FALSE(is_synopsis("rebalance pale-ale.json --lot \"Keelstone=14.9%\" --on 2026-12-01"));
}

TEST_CASE("every README example ends with its documented exit status") {
  const auto examples = readme_examples();
  // The README has examples for every command; a parser that finds none would pass vacuously.
  REQUIRE(examples.size() >= 20);
  check_examples(examples);
}

TEST_CASE("every --help example ends with exit status 0") {
  std::vector<Example> examples;
  for (const std::vector<std::string>& command : {std::vector<std::string>{"catalog"},
                                                  {"catalog", "list"},
                                                  {"catalog", "show"},
                                                  {"catalog", "check"},
                                                  {"ibu"},
                                                  {"age"},
                                                  {"rebalance"},
                                                  {"swap"},
                                                  {"blend"}}) {
    const auto found = help_examples(command);
    examples.insert(examples.end(), found.begin(), found.end());
  }
  REQUIRE(examples.size() >= 12);
  check_examples(examples);
}
