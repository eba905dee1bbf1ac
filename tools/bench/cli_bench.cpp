// Command-line benchmark on large catalogs: whole processes of the built bine, timed from spawn to
// exit, with their peak memory from wait4's rusage (ru_maxrss). One run measures the demo catalog and
// a compiled catalog of invented varieties side by side, so the ratios hold on a loaded machine.
//   cli_bench BINE WORKDIR [SIZE] [--json-too] [--ef]
// SIZE (default 100000) invented varieties are written as catalog JSON in parts (each under the input
// limit) with a 2,000-lot stock file, compiled with the demo catalog by `bine catalog compile` (timed), then:
//   swap and blend on the demo catalog, and on the compiled catalog: median of 5 runs, ratio, peak MiB;
//   --json-too: the same commands on the JSON parts (one run each; slow);
//   --ef: for the compiled aroma index, recall@10 against an exact scan and p50 query time per
//         efSearch, over 500 held-out invented varieties, one thread.
// Invented data (engine/synthetic_catalog.hpp): not brewing data.
#include <fcntl.h>
#include <spawn.h>
#include <sys/resource.h>
#include <sys/wait.h>
#include <unistd.h>

#include <algorithm>
#include <chrono>
#include <cstdio>
#include <cstdlib>
#include <cstring>
#include <filesystem>
#include <set>
#include <string>
#include <vector>

#include "engine/aroma_vector.hpp"
#include "engine/hop_index.hpp"
#include "engine/synthetic_catalog.hpp"
#include "io/compiled_catalog.hpp"
#include "io/data_dir.hpp"
#include "io/file_io.hpp"
#include "io/loaders.hpp"

extern char** environ;

namespace {

namespace fs = std::filesystem;
using Clock = std::chrono::steady_clock;

struct Run {
  double seconds = 0.0;
  double peak_mib = 0.0;
  int status = -1;
};

/// Runs argv as a child process with stdout and stderr to /dev/null; wall time and peak memory.
Run run(const std::vector<std::string>& args) {
  std::vector<char*> argv;
  for (const auto& a : args) argv.push_back(const_cast<char*>(a.c_str()));
  argv.push_back(nullptr);
  posix_spawn_file_actions_t actions;
  posix_spawn_file_actions_init(&actions);
  posix_spawn_file_actions_addopen(&actions, 1, "/dev/null", O_WRONLY, 0);
  posix_spawn_file_actions_addopen(&actions, 2, "/dev/null", O_WRONLY, 0);
  const auto start = Clock::now();
  pid_t pid = 0;
  Run result;
  if (posix_spawn(&pid, argv[0], &actions, nullptr, argv.data(), environ) != 0) return result;
  int status = 0;
  rusage usage{};
  wait4(pid, &status, 0, &usage);
  result.seconds = std::chrono::duration<double>(Clock::now() - start).count();
  result.peak_mib = static_cast<double>(usage.ru_maxrss) / 1024.0;
  result.status = WIFEXITED(status) ? WEXITSTATUS(status) : -1;
  posix_spawn_file_actions_destroy(&actions);
  return result;
}

/// Median time of `times` runs; peak memory is the largest seen.
Run median_run(const std::vector<std::string>& args, int times) {
  std::vector<Run> runs;
  for (int i = 0; i < times; ++i) runs.push_back(run(args));
  std::sort(runs.begin(), runs.end(), [](const Run& a, const Run& b) { return a.seconds < b.seconds; });
  Run median = runs[runs.size() / 2];
  for (const auto& r : runs) median.peak_mib = std::max(median.peak_mib, r.peak_mib);
  return median;
}

std::vector<std::string> with(std::vector<std::string> head, const std::vector<std::string>& tail) {
  head.insert(head.end(), tail.begin(), tail.end());
  return head;
}

double percentile(std::vector<double> values, double p) {
  std::sort(values.begin(), values.end());
  return values[std::min(values.size() - 1, static_cast<std::size_t>(p * static_cast<double>(values.size() - 1)))];
}

void print_row(const char* what, const Run& demo, const Run& large) {
  std::printf("%-34s %10.3f %10.3f %8.1fx %9.1f %9.1f%s\n", what, demo.seconds, large.seconds,
              large.seconds / demo.seconds, demo.peak_mib, large.peak_mib,
              demo.status || large.status ? "  (a run failed)" : "");
}

/// recall@10 and p50 per efSearch of the compiled aroma index, one thread.
void ef_sweep(const fs::path& compiled_path, const bine::Lexicon& lexicon) {
  const bine::CompiledCatalog compiled(compiled_path);
  const bine::Vectorizer vectorizer(compiled.spread(), lexicon, bine::SwapPurpose::aroma);
  const bine::Catalog held_out = bine::synthetic_catalog(500, lexicon, 4242);
  std::vector<std::vector<float>> queries;
  for (const auto& v : held_out.varieties) queries.push_back(vectorizer.embed(vectorizer.describe(v)));
  bine::use_single_thread();
  const bine::HopIndex hnsw = compiled.read_index(bine::SwapPurpose::aroma);
  std::vector<std::set<std::int64_t>> truth(queries.size());
  const auto d = static_cast<std::size_t>(hnsw.dimensions());
  for (std::size_t q = 0; q < queries.size(); ++q) {  // exact: a scan over the stored vectors
    std::vector<std::pair<float, std::int64_t>> scored(hnsw.size());
    for (std::size_t i = 0; i < hnsw.size(); ++i) {
      const float* row = hnsw.row(static_cast<std::int64_t>(i));
      float dot = 0.0f;
      for (std::size_t j = 0; j < d; ++j) dot += row[j] * queries[q][j];
      scored[i] = {-dot, static_cast<std::int64_t>(i)};
    }
    std::partial_sort(scored.begin(), scored.begin() + 10, scored.end());
    for (std::size_t k = 0; k < 10; ++k) truth[q].insert(scored[k].second);
  }
  std::printf("\n%s index, %zu rows: efSearch  recall@10  p50 ms  p99 ms\n",
              std::string(to_string(hnsw.kind())).c_str(), hnsw.size());
  for (const int ef : {16, 32, 64, 96, 128, 192, 256}) {
    bine::IndexSettings settings;
    settings.hnsw_ef_search = ef;
    const bine::HopIndex index = compiled.read_index(bine::SwapPurpose::aroma, settings);
    std::vector<double> latency;
    std::size_t found = 0;
    for (std::size_t q = 0; q < queries.size(); ++q) {
      const auto t = Clock::now();
      const auto hits = index.search(queries[q].data(), 10);
      latency.push_back(std::chrono::duration<double, std::milli>(Clock::now() - t).count());
      for (const auto& h : hits) found += truth[q].count(h.id);
    }
    std::printf("%*d %10.3f %7.3f %7.3f\n", 38, ef,
                static_cast<double>(found) / (10.0 * static_cast<double>(queries.size())), percentile(latency, 0.5),
                percentile(latency, 0.99));
    std::fflush(stdout);
  }
}

}  // namespace

int main(int argc, char** argv) {
  if (argc < 3) {
    std::fprintf(stderr, "usage: cli_bench BINE WORKDIR [SIZE] [--json-too] [--ef]\n");
    return 2;
  }
  const std::string bine = fs::absolute(argv[1]).string();
  const fs::path work = argv[2];
  std::size_t size = 100'000;
  bool json_too = false, ef = false;
  for (int i = 3; i < argc; ++i) {
    if (std::strcmp(argv[i], "--json-too") == 0)
      json_too = true;
    else if (std::strcmp(argv[i], "--ef") == 0)
      ef = true;
    else
      size = static_cast<std::size_t>(std::strtoull(argv[i], nullptr, 10));
  }
  fs::create_directories(work);
  const std::string data = BINE_SOURCE_DATA_DIR;
  const bine::DataSet demo = bine::load_data({data, "source data"}, {});

  // 1. Invented catalog in parts of at most 25,000 varieties (about 23 MB each), written by a child
  // process: a child started later inherits this process's peak memory in ru_maxrss (exec keeps the
  // old address space's high-water mark), so this process must stay small.
  std::vector<std::string> parts;
  for (std::size_t from = 0; from < size; from += 25'000)
    parts.push_back((work / ("invented-" + std::to_string(parts.size() + 1) + ".json")).string());
  std::fprintf(stderr, "writing %zu invented varieties...\n", size);
  if (const pid_t writer = fork(); writer == 0) {
    const bine::Catalog catalog = bine::synthetic_catalog(size, demo.lexicon, 42);
    for (std::size_t p = 0; p < parts.size(); ++p) {
      bine::Catalog part;
      part.demo = true;
      for (std::size_t i = p * 25'000; i < std::min(size, (p + 1) * 25'000); ++i)
        part.varieties.push_back(catalog.varieties[i]);
      bine::write_file_atomically(parts[p], bine::catalog_file_json(part, "invented benchmark catalog").dump() + "\n");
    }
    _exit(0);
  } else {
    waitpid(writer, nullptr, 0);
  }
  const std::string compiled = (work / "invented.bine").string();
  std::fprintf(stderr, "compiling...\n");
  // The shipped demo catalog ("demo") is compiled in first, so the same commands (--bittering
  // Ironmarsh) run on both sides.
  const Run compile = run(with({bine, "--data", data, "catalog", "compile", "demo"}, with(parts, {"--out", compiled})));
  std::printf("$ cli_bench %s %s %zu%s%s   (%u cores)\n", argv[1], argv[2], size, json_too ? " --json-too" : "",
              ef ? " --ef" : "", std::max(1u, static_cast<unsigned>(bine::all_cores())));
  std::printf("compile %zu varieties (%zu JSON parts): %.1f s, peak %.0f MiB%s\n\n", size, parts.size(),
              compile.seconds, compile.peak_mib, compile.status ? "  (FAILED)" : "");

  // 2. The same questions on the demo catalog and on the compiled one.
  char some_name[32];
  std::snprintf(some_name, sizeof some_name, "Synthetic %07zu", size / 3 + 1);  // synthetic_catalog's naming
  const std::string some = some_name;
  const std::vector<std::string> base{bine, "--data", data};
  const std::vector<std::string> large = with(base, {"--catalog", compiled});
  const std::vector<std::string> blend{"blend", "--target", "citrus=4,floral=3", "--volume", "20L",
                                       "--ibu", "30",       "--bittering",       "Ironmarsh"};
  std::printf("%-34s %10s %10s %9s %9s %9s\n", "whole process (median of 5)", "demo s", "large s", "ratio", "demo MiB",
              "large MiB");
  print_row("swap", median_run(with(base, {"swap", "Tidewell"}), 5), median_run(with(large, {"swap", some}), 5));
  print_row("swap --for bittering --pairs",
            median_run(with(base, {"swap", "Tidewell", "--for", "bittering", "--pairs"}), 5),
            median_run(with(large, {"swap", some, "--for", "bittering", "--pairs"}), 5));
  print_row("blend (catalog)", median_run(with(base, blend), 5), median_run(with(large, blend), 5));
  if (json_too) {
    std::vector<std::string> from_json = with(base, {"--catalog", "demo"});
    for (const auto& p : parts) from_json = with(from_json, {"--catalog", p});
    print_row("swap on the JSON parts (1 run)", run(with(base, {"swap", "Tidewell"})),
              run(with(from_json, {"swap", some})));
    print_row("blend on the JSON parts (1 run)", run(with(base, blend)), run(with(from_json, blend)));
  }
  std::fflush(stdout);
  if (ef) ef_sweep(compiled, demo.lexicon);
  return 0;
}
