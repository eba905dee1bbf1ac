// Writes an invented catalog (engine/synthetic_catalog.hpp) as catalog JSON files, and optionally a
// stock file with lots of its varieties, for timing the command line on large catalogs. Not brewing
// data: every file says so in its "catalog" or "stock" block.
//   make_catalog COUNT PREFIX [PARTS] [LOTS]
// writes PREFIX-1.json ... PREFIX-PARTS.json (COUNT varieties split evenly, default 1 part) and, with
// LOTS > 0, PREFIX-stock.json with LOTS lots of varieties spread over the catalog.
#include <algorithm>
#include <cstdio>
#include <cstdlib>
#include <nlohmann/json.hpp>
#include <string>

#include "engine/synthetic_catalog.hpp"
#include "io/data_dir.hpp"
#include "io/file_io.hpp"
#include "io/loaders.hpp"

int main(int argc, char** argv) {
  if (argc < 3) {
    std::fprintf(stderr, "usage: make_catalog COUNT PREFIX [PARTS] [LOTS]\n");
    return 2;
  }
  const auto count = static_cast<std::size_t>(std::strtoull(argv[1], nullptr, 10));
  const std::string prefix = argv[2];
  const std::size_t parts = argc > 3 ? std::max<std::size_t>(1, std::strtoull(argv[3], nullptr, 10)) : 1;
  const std::size_t lots = argc > 4 ? std::strtoull(argv[4], nullptr, 10) : 0;
  const bine::DataSet data = bine::load_data({BINE_SOURCE_DATA_DIR, "source data"}, {});
  const bine::Catalog catalog = bine::synthetic_catalog(count, data.lexicon, 42);
  const std::size_t per_part = (count + parts - 1) / parts;
  for (std::size_t p = 0; p < parts; ++p) {
    bine::Catalog part;
    part.demo = true;  // invented: the demo flag makes every command say so
    for (std::size_t i = p * per_part; i < std::min(count, (p + 1) * per_part); ++i)
      part.varieties.push_back(catalog.varieties[i]);
    const auto name = "invented benchmark catalog, part " + std::to_string(p + 1);
    bine::write_file_atomically(prefix + "-" + std::to_string(p + 1) + ".json",
                                bine::catalog_file_json(part, name).dump(1) + "\n");
  }
  if (lots > 0) {
    nlohmann::json list = nlohmann::json::array();
    for (std::size_t l = 0; l < lots; ++l) {
      const bine::Variety& v = catalog.varieties[(l * 7919) % count];
      list.push_back({{"variety", v.name},
                      {"lot", "L" + std::to_string(l + 1)},
                      {"alpha_acid", v.alpha_acid ? v.alpha_acid->mid() : 8.0},
                      {"packaged", "2026-01-15"},
                      {"storage", {{"temperature", "-2 C"}, {"package", "vacuum"}}},
                      {"on_hand", "500 g"}});
    }
    const nlohmann::json stock{
        {"stock", {{"name", "invented benchmark stock"}, {"demo", true}, {"source", "tools/bench/make_catalog"}}},
        {"lots", std::move(list)}};
    bine::write_file_atomically(prefix + "-stock.json", stock.dump(1) + "\n");
  }
  return 0;
}
