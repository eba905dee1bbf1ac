// bine catalog compile: the catalogs a command would load, vectorised and indexed once, into a
// compiled catalog that every command accepts with --catalog (io/compiled_catalog.hpp).
#include <fmt/format.h>

#include <algorithm>
#include <chrono>
#include <memory>

#include "cli/commands.hpp"
#include "engine/aroma_vector.hpp"
#include "engine/hop_index.hpp"
#include "engine/substitutes.hpp"
#include "io/compiled_catalog.hpp"
#include "io/data_dir.hpp"
#include "model/errors.hpp"

namespace bine::cli {
namespace {

struct CompileOptions {
  std::vector<std::string> files;
  std::string out;
  bool json = false;
};

/// A bar on stderr while an index is built, redrawn in place; only on a terminal and not with --json.
std::function<void(std::size_t, std::size_t)> progress_bar(const Console& console, bool json, std::string what) {
  if (!console.err_is_terminal || json) return {};
  return [&console, what = std::move(what)](std::size_t done, std::size_t total) {
    constexpr std::size_t kWidth = 30;
    const std::size_t filled = total ? done * kWidth / total : kWidth;
    console.err << fmt::format("\r{} [{}{}] {:3d} % of {} rows", what, std::string(filled, '#'),
                               std::string(kWidth - filled, ' '), total ? done * 100 / total : 100, total)
                << (done >= total ? "\n" : "") << std::flush;
  };
}

/// The files a compiled catalog depends on: the lexicon and the catalogs given (a shipped one by name).
std::vector<StampedFile> stamp_inputs(const DataSet& data, const std::vector<std::string>& given) {
  std::vector<StampedFile> files{stamp_file(data.data_dir / "lexicon.json", "lexicon")};
  const auto shipped = shipped_catalog_files(data.data_dir);
  for (const auto& file : chosen_catalog_files(data.data_dir, given)) {
    const bool is_shipped = std::find(shipped.begin(), shipped.end(), file) != shipped.end();
    files.push_back(stamp_file(file, is_shipped ? "shipped" : "source"));
  }
  return files;
}

HopIndex build_index(const Console& console, bool json, const DataSet& data, SwapPurpose purpose,
                     CatalogSpread& spread) {
  const Vectorizer vectorizer(data.catalog, data.lexicon, purpose);
  spread = vectorizer.spread();
  std::vector<float> rows;
  rows.reserve(data.catalog.varieties.size() * static_cast<std::size_t>(vectorizer.dimensions()));
  for (const auto& variety : data.catalog.varieties) {
    const auto v = vectorizer.embed(vectorizer.describe(variety));
    rows.insert(rows.end(), v.begin(), v.end());
  }
  IndexSettings settings = index_settings_for(purpose, {});
  settings.build_threads = all_cores();
  settings.progress = progress_bar(console, json, fmt::format("{} index", to_string(purpose)));
  return HopIndex(vectorizer.dimensions(), rows, settings);
}

void run_compile(const Console& console, const GlobalOptions& globals, const CompileOptions& options) {
  const auto start = std::chrono::steady_clock::now();
  for (const auto& file : options.files)
    if (is_compiled_catalog(file))
      throw InputError(fmt::format("catalog compile: {}: already a compiled catalog (give its JSON sources)", file));
  // 1. Load what a command given these files would load, and stamp every file.
  const DataSet data = load_data(globals.data, options.files);
  CompileInput input;
  input.catalog = &data.catalog;
  input.lexicon = &data.lexicon;
  input.files = stamp_inputs(data, options.files);
  input.settings = vector_settings_fingerprint({}, {});
  // 2. Vectorise and index for each question.
  const HopIndex aroma = [&] {
    const auto timer = console.time("aroma index");
    return build_index(console, options.json, data, SwapPurpose::aroma, input.spread);
  }();
  const HopIndex bittering = [&] {
    const auto timer = console.time("bittering index");
    return build_index(console, options.json, data, SwapPurpose::bittering, input.spread);
  }();
  input.aroma_index = &aroma;
  input.bittering_index = &bittering;
  // 3. Write the database and the indexes, each atomically.
  const auto written = [&] {
    const auto timer = console.time("write");
    return write_compiled_catalog(options.out, input);
  }();
  const double seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
  nlohmann::json files = nlohmann::json::array();
  for (const auto& path : written) files.push_back(path.string());
  print_result(
      console, options.json,
      [&] {
        return nlohmann::json{{"compiled", options.out},
                              {"varieties", data.catalog.varieties.size()},
                              {"index", std::string(to_string(aroma.kind()))},
                              {"files", files},
                              {"seconds", seconds}};
      },
      [&](std::ostream& out) {
        out << fmt::format("{}: {} varieties, {} index, compiled in {:.1f} s\n", options.out,
                           data.catalog.varieties.size(), to_string(aroma.kind()), seconds);
        for (std::size_t i = 1; i < written.size(); ++i) out << "  beside it: " << written[i].string() << '\n';
        out << fmt::format("use it with: bine --catalog {} swap VARIETY (or any command)\n", options.out);
      });
}

}  // namespace

void setup_catalog_compile_command(CLI::App& catalog, const GlobalOptions& globals, CommandTable& commands) {
  auto options = std::make_shared<CompileOptions>();
  auto* compile = catalog.add_subcommand(
      "compile", "turn catalog files into a compiled catalog that large-catalog commands answer from at once");
  compile
      ->add_option("FILE", options->files, "catalog JSON files, merged in order (\"demo\" is the shipped demo catalog)")
      ->required();
  compile->add_option("--out", options->out, "the compiled catalog to write, NAME.bine (indexes go beside it)")
      ->required();
  compile->add_flag("--json", options->json, "print a JSON summary (and no progress bar)");
  compile->footer(
      "The compiled catalog holds the files given (the shipped demo catalog only when named \"demo\"),\n"
      "with a name index and the substitute indexes. It is stamped with the content of every file and the lexicon: "
      "when one\n"
      "changes, commands say so and read the JSON files instead until you compile again.\n\n"
      "Examples:\n"
      "  bine catalog compile merchant-1.json merchant-2.json --out merchant.bine\n"
      "  bine --catalog merchant.bine swap Tidewell\n"
      "  bine --catalog merchant.bine blend --target \"citrus=4,floral=3\" --volume 20L --ibu 30");
  commands.add(compile, [&globals, options](const Console& console) { run_compile(console, globals, *options); });
}

}  // namespace bine::cli
