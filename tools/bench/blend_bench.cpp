// Blend search benchmark on synthetic catalogs: median time per blend with the pool search at 300 and
// 1,000 varieties, and on 300 varieties the objective gap to an exhaustive search over every subset of
// up to 3 (with the exhaustive search's time beside it). Synthetic data: each variety has 2-5 non-zero
// axes with intensities 1-5, total oil 0.5-3 mL/100 g and alpha 3-15 % (uniform), from a fixed seed.
// Targets name 1-3 axes with intensities 2-5. Brew: 20 L at 1.050, 4 g/L late, 30 % whirlpool at
// 80 C for 20 min, 35 IBU held by a 12 % alpha bittering hop at 60 min.
//
// First, the demo catalog with every axis named at K = 5 and 6 (the bounded pool search of
// docs/methods.md#blend-search), with the exhaustive search's objective for a few targets.
//
// Usage: blend_bench [--targets N] [--exhaustive-targets M] [--seed S] [--swap-rounds R]
//                    [--exhaustive-cache FILE] [--demo-targets N] [--demo-exhaustive M]
//                    [--demo-exhaustive-6 M]
// --demo-targets 0 skips the demo section; --demo-exhaustive (default 3) and --demo-exhaustive-6
// (default 0) say how many demo targets are also searched exhaustively at K = 5 and 6.
// --swap-rounds sets the local-improvement rounds after the pool search (0: pool only).
// --exhaustive-cache keeps the exhaustive objectives per (seed, target) in FILE, so that repeated
// runs compare against them without the ~6 s per target search; delete the file after engine changes
// that alter the exhaustive optimum (the exhaustive search itself does not use the pool settings).
#include <algorithm>
#include <chrono>
#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <fstream>
#include <map>
#include <random>
#include <string>
#include <vector>

#include "engine/blend.hpp"
#include "engine/blend_plan.hpp"
#include "io/data_dir.hpp"
#include "io/loaders.hpp"

namespace {

using bine::BlendCandidate;
using bine::BlendRequest;

std::vector<BlendCandidate> synthetic_candidates(std::size_t count, std::mt19937& random) {
  std::uniform_real_distribution<double> unit(0.0, 1.0);
  std::vector<BlendCandidate> candidates(count);
  for (std::size_t i = 0; i < count; ++i) {
    BlendCandidate& c = candidates[i];
    c.variety = "synthetic-" + std::to_string(i);
    c.aroma = Eigen::VectorXd::Zero(14);
    const int axes = 2 + static_cast<int>(unit(random) * 4.0);
    for (int k = 0; k < axes; ++k) c.aroma[static_cast<Eigen::Index>(unit(random) * 14.0)] = 1.0 + 4.0 * unit(random);
    c.oil_ml_per_100g = 0.5 + 2.5 * unit(random);
    c.alpha_percent = 3.0 + 12.0 * unit(random);
  }
  return candidates;
}

BlendRequest base_request() {
  BlendRequest request;
  request.plan.wort = {20.0, 1.050, 60.0, 0.0, std::nullopt};
  request.plan.late = bine::late_amount({bine::LateDose::Kind::grams_per_litre, 4.0}, 20.0);
  request.plan.ibu.whirlpool_share = 0.3;
  request.plan.ibu.target_ibu = 35.0;
  bine::BitteringHop bittering;
  bittering.variety = "synthetic bittering";
  bittering.alpha_percent = 12.0;
  request.plan.bittering = bittering;
  return request;
}

bine::BlendTarget random_target(std::mt19937& random) {
  std::uniform_real_distribution<double> unit(0.0, 1.0);
  Eigen::VectorXd intensity = Eigen::VectorXd::Zero(14);
  std::vector<bool> named(14, false);
  const int axes = 1 + static_cast<int>(unit(random) * 3.0);
  for (int k = 0; k < axes; ++k) {
    const auto a = static_cast<std::size_t>(unit(random) * 14.0);
    named[a] = true;
    intensity[static_cast<Eigen::Index>(a)] = 2.0 + 3.0 * unit(random);
  }
  return bine::target_from_spec(intensity, named, 0.25);
}

double median(std::vector<double> values) {
  std::sort(values.begin(), values.end());
  const std::size_t n = values.size();
  return n % 2 ? values[n / 2] : 0.5 * (values[n / 2 - 1] + values[n / 2]);
}

/// Nearest-rank percentile (p in 0-100).
double percentile(std::vector<double> values, double p) {
  std::sort(values.begin(), values.end());
  const auto rank = static_cast<std::size_t>(std::ceil(p / 100.0 * static_cast<double>(values.size())));
  return values[std::min(values.size() - 1, rank == 0 ? 0 : rank - 1)];
}

double seconds_since(std::chrono::steady_clock::time_point start) {
  return std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
}

/// The demo catalog (invented demo data, used here for timing only) with every one of its 14 axes
/// named, intensities 0-4 from the seed, late hops for the demo pale ale: median time of the search
/// at K = 5 and 6, and the gap to the exhaustive search over every subset of the whole catalog for
/// the first `exhaustive5` (K = 5, about 30 s each) and `exhaustive6` (K = 6, minutes each) targets.
void demo_catalog_section(std::size_t targets, std::size_t exhaustive5, std::size_t exhaustive6, unsigned seed) {
  const bine::DataSet data = bine::load_data({BINE_SOURCE_DATA_DIR, "bench"}, {});
  const bine::Recipe recipe = bine::load_recipe(std::string(BINE_SOURCE_DATA_DIR) + "/examples/pale-ale.json");
  BlendRequest request;
  request.candidates = bine::blend_candidates(data.catalog, data.lexicon, nullptr, "").candidates;
  request.plan = bine::plan_blend(&recipe, data.catalog, nullptr, bine::BlendChoices{}, bine::BitternessSettings{});
  std::mt19937 random(seed);
  std::uniform_int_distribution<int> level(0, 4);
  const auto axes = static_cast<Eigen::Index>(data.lexicon.size());
  std::vector<bine::BlendTarget> goals;
  for (std::size_t t = 0; t < targets; ++t) {
    Eigen::VectorXd intensity(axes);
    for (Eigen::Index a = 0; a < axes; ++a) intensity[a] = level(random);
    goals.push_back(bine::target_from_spec(intensity, std::vector<bool>(static_cast<std::size_t>(axes), true), 0.25));
  }
  for (const std::size_t k : {std::size_t{5}, std::size_t{6}}) {
    request.max_varieties = k;
    request.pool.exhaustive = false;
    std::vector<double> times, found, solved;
    for (const auto& goal : goals) {
      request.target = goal;
      const auto start = std::chrono::steady_clock::now();
      const bine::BlendResult result = bine::design_blend(request);
      times.push_back(seconds_since(start));
      found.push_back(result.objective);
      solved.push_back(static_cast<double>(result.subsets_solved));
    }
    std::printf(
        "demo catalog (%zu candidates), every axis named, K %zu: median %.1f ms per blend (max %.1f ms), "
        "median %.0f subsets solved\n",
        request.candidates.size(), k, 1e3 * median(times), 1e3 * *std::max_element(times.begin(), times.end()),
        median(solved));
    const std::size_t exhaustive = std::min(targets, k == 5 ? exhaustive5 : exhaustive6);
    request.pool.exhaustive = true;
    for (std::size_t t = 0; t < exhaustive; ++t) {
      request.target = goals[t];
      const auto start = std::chrono::steady_clock::now();
      const double best = bine::design_blend(request).objective;
      const double gap = best > 1e-9 ? (found[t] - best) / best : (found[t] > 1e-9 ? 1.0 : 0.0);
      std::printf("  target %zu: J %.6f, exhaustive J %.6f (gap %.3f %%, exhaustive %.1f s)\n", t, found[t], best,
                  100.0 * gap, seconds_since(start));
    }
  }
}

}  // namespace

int main(int argc, char** argv) {
  std::size_t targets = 200, exhaustive_targets = 200;
  unsigned seed = 7;
  std::size_t swap_rounds = bine::PoolSettings{}.swap_rounds;
  std::string cache_path;
  std::size_t demo_targets = 20, demo_exhaustive5 = 3, demo_exhaustive6 = 0;
  for (int i = 1; i + 1 < argc; i += 2) {
    const std::string option = argv[i];
    if (option == "--targets")
      targets = std::stoul(argv[i + 1]);
    else if (option == "--exhaustive-targets")
      exhaustive_targets = std::stoul(argv[i + 1]);
    else if (option == "--seed")
      seed = static_cast<unsigned>(std::stoul(argv[i + 1]));
    else if (option == "--swap-rounds")
      swap_rounds = std::stoul(argv[i + 1]);
    else if (option == "--exhaustive-cache")
      cache_path = argv[i + 1];
    else if (option == "--demo-targets")
      demo_targets = std::stoul(argv[i + 1]);
    else if (option == "--demo-exhaustive")
      demo_exhaustive5 = std::stoul(argv[i + 1]);
    else if (option == "--demo-exhaustive-6")
      demo_exhaustive6 = std::stoul(argv[i + 1]);
  }
  std::setvbuf(stdout, nullptr, _IOLBF, 0);  // lines appear as they are measured
  std::printf("blend_bench --targets %zu --exhaustive-targets %zu --seed %u --swap-rounds %zu\n", targets,
              exhaustive_targets, seed, swap_rounds);
  if (demo_targets > 0) demo_catalog_section(demo_targets, demo_exhaustive5, demo_exhaustive6, seed);
  std::map<std::pair<unsigned, std::size_t>, double> cache;
  if (!cache_path.empty()) {
    std::ifstream in(cache_path);
    unsigned s = 0;
    std::size_t t = 0;
    double objective = 0.0;
    while (in >> s >> t >> objective) cache[{s, t}] = objective;
  }
  for (const std::size_t size : {std::size_t{300}, std::size_t{1000}}) {
    std::mt19937 random(seed + static_cast<unsigned>(size));
    BlendRequest request = base_request();
    request.pool.swap_rounds = swap_rounds;
    request.candidates = synthetic_candidates(size, random);
    std::vector<bine::BlendTarget> goals;
    for (std::size_t t = 0; t < targets; ++t) goals.push_back(random_target(random));
    std::vector<double> times, pooled, pools;
    for (const auto& goal : goals) {
      request.target = goal;
      const auto start = std::chrono::steady_clock::now();
      const bine::BlendResult result = bine::design_blend(request);
      times.push_back(seconds_since(start));
      pooled.push_back(result.objective);
      pools.push_back(static_cast<double>(result.pool_size));
    }
    std::printf("%zu varieties, K 3: median %.2f ms per blend (max %.2f ms), median pool %.0f candidates\n", size,
                1e3 * median(times), 1e3 * *std::max_element(times.begin(), times.end()), median(pools));
    if (size != 300 || exhaustive_targets == 0) continue;
    std::size_t within = 0, compared = 0;
    std::vector<double> exhaustive_times, gaps;
    request.pool.exhaustive = true;
    for (std::size_t t = 0; t < std::min(targets, exhaustive_targets); ++t) {
      request.target = goals[t];
      double exhaustive = 0.0;
      if (const auto hit = cache.find({seed, t}); hit != cache.end()) {
        exhaustive = hit->second;
      } else {
        const auto start = std::chrono::steady_clock::now();
        exhaustive = bine::design_blend(request).objective;
        exhaustive_times.push_back(seconds_since(start));
        cache[{seed, t}] = exhaustive;
        if (!cache_path.empty()) {
          std::ofstream out(cache_path, std::ios::app);
          out.precision(17);
          out << seed << ' ' << t << ' ' << exhaustive << '\n';
        }
      }
      // Gap relative to the exhaustive objective; objectives below 1e-9 count as exact matches.
      const double gap = exhaustive > 1e-9 ? (pooled[t] - exhaustive) / exhaustive : (pooled[t] > 1e-9 ? 1.0 : 0.0);
      gaps.push_back(gap);
      within += gap <= 0.01 ? 1 : 0;
      ++compared;
    }
    std::printf(
        "300 varieties: pool search within 1 %% of exhaustive on %zu of %zu targets (%.1f %%), "
        "median gap %.4f %%, p90 %.4f %%, worst %.2f %%; exhaustive median %.2f s per blend (%zu searched, "
        "the rest from the cache)\n",
        within, compared, 100.0 * static_cast<double>(within) / static_cast<double>(compared), 100.0 * median(gaps),
        100.0 * percentile(gaps, 90.0), 100.0 * *std::max_element(gaps.begin(), gaps.end()),
        exhaustive_times.empty() ? 0.0 : median(exhaustive_times), exhaustive_times.size());
  }
  return 0;
}
