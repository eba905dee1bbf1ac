// Index benchmark: synthetic catalogs of 10^4, 10^5 and 10^6 varieties, vectorised for an aroma
// question; per size and index kind: build time, single-query latency p50/p99 (one thread), recall@10
// against the exact index, and memory. Run through tools/bench/run; not a unit test.
//   index_bench [SIZE ...]   (default 10000 100000 1000000)
#include <algorithm>
#include <chrono>
#include <cstdio>
#include <cstdlib>
#include <set>
#include <string>
#include <vector>

#include "engine/aroma_vector.hpp"
#include "engine/hop_index.hpp"
#include "engine/synthetic_catalog.hpp"
#include "io/data_dir.hpp"

namespace {

using Clock = std::chrono::steady_clock;

double ms_since(Clock::time_point start) {
  return std::chrono::duration<double, std::milli>(Clock::now() - start).count();
}

double percentile(std::vector<double> values, double p) {
  std::sort(values.begin(), values.end());
  const auto at = static_cast<std::size_t>(p * static_cast<double>(values.size() - 1) + 0.5);
  return values[std::min(at, values.size() - 1)];
}

}  // namespace

int main(int argc, char** argv) {
  std::vector<std::size_t> sizes;
  for (int i = 1; i < argc; ++i) sizes.push_back(static_cast<std::size_t>(std::strtoull(argv[i], nullptr, 10)));
  if (sizes.empty()) sizes = {10'000, 100'000, 1'000'000};
  const bine::DataSet data = bine::load_data({BINE_SOURCE_DATA_DIR, "source data"}, {});
  const std::size_t query_count = 500;

  std::printf("%-9s %-6s %11s %9s %9s %10s %9s\n", "lots", "index", "build s", "p50 ms", "p99 ms", "recall@10", "MB");
  for (const std::size_t n : sizes) {
    std::fprintf(stderr, "[%zu] generating and vectorising...\n", n);
    const bine::Catalog catalog = bine::synthetic_catalog(n, data.lexicon, 42);
    const bine::Catalog held_out = bine::synthetic_catalog(query_count, data.lexicon, 4242);
    const bine::Vectorizer vectorizer(catalog, data.lexicon, bine::SwapPurpose::aroma);
    std::vector<float> rows;
    rows.reserve(n * static_cast<std::size_t>(vectorizer.dimensions()));
    for (const auto& v : catalog.varieties) {
      const auto e = vectorizer.embed(vectorizer.describe(v));
      rows.insert(rows.end(), e.begin(), e.end());
    }
    std::vector<std::vector<float>> queries;
    for (const auto& v : held_out.varieties) queries.push_back(vectorizer.embed(vectorizer.describe(v)));

    std::vector<std::set<std::int64_t>> truth(queries.size());
    for (const bine::IndexKind kind : {bine::IndexKind::exact, bine::IndexKind::hnsw}) {
      std::fprintf(stderr, "[%zu] building %s index...\n", n, kind == bine::IndexKind::exact ? "exact" : "HNSW");
      const auto start = Clock::now();
      bine::IndexSettings settings;
      settings.build_threads = bine::all_cores();  // builds on every core, queries on one
      const bine::HopIndex index(vectorizer.dimensions(), rows, settings, &kind);
      const double build_s = ms_since(start) / 1000.0;
      bine::use_single_thread();  // queries on one core
      std::vector<double> latency;
      std::size_t found = 0;
      for (std::size_t q = 0; q < queries.size(); ++q) {
        const auto t = Clock::now();
        const auto hits = index.search(queries[q].data(), 10);
        latency.push_back(ms_since(t));
        if (kind == bine::IndexKind::exact) {
          for (const auto& h : hits) truth[q].insert(h.id);
          found += hits.size();
        } else {
          for (const auto& h : hits) found += truth[q].count(h.id);
        }
      }
      const double recall = static_cast<double>(found) / (10.0 * static_cast<double>(queries.size()));
      std::printf("%-9zu %-6s %11.2f %9.3f %9.3f %10.3f %9.1f\n", n, kind == bine::IndexKind::exact ? "exact" : "hnsw",
                  build_s, percentile(latency, 0.5), percentile(latency, 0.99), recall,
                  static_cast<double>(index.memory_bytes()) / 1e6);
      std::fflush(stdout);
    }
  }
  return 0;
}
