#include "engine/synthetic_catalog.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <random>

#include "model/catalog_lookup.hpp"

namespace bine {
namespace {

struct Family {
  std::vector<double> aroma;
  std::vector<double> oils;  // % of oil per compound
  double alpha = 0.0, beta = 0.0, cohumulone = 0.0, oil = 0.0;
};

}  // namespace

Catalog synthetic_catalog(std::size_t count, const Lexicon& lexicon, std::uint64_t seed) {
  std::mt19937_64 random(seed);
  std::uniform_real_distribution<double> unit(0.0, 1.0);
  std::normal_distribution<double> noise(0.0, 1.0);
  const std::size_t axes = lexicon.size();
  const auto& compounds = oil_compounds();
  // Typical ranges (docs/methods.md#hop-chemistry-bounds), % of oil.
  const std::vector<std::pair<double, double>> oil_ranges{{20, 70}, {8, 40}, {3, 15}, {0, 20}, {0.1, 1.5}, {0, 1}};
  auto between = [&](double lo, double hi) { return lo + (hi - lo) * unit(random); };

  std::vector<Family> families(std::max<std::size_t>(1, count / 50));
  for (auto& family : families) {
    family.aroma.assign(axes, 0.0);
    const int named = 2 + static_cast<int>(unit(random) * 4.0);
    for (int i = 0; i < named; ++i)
      family.aroma[static_cast<std::size_t>(unit(random) * static_cast<double>(axes)) % axes] = between(1.0, 5.0);
    for (const auto& [lo, hi] : oil_ranges) family.oils.push_back(between(lo, hi));
    family.alpha = between(2.5, 16.0);
    family.beta = between(2.0, 9.0);
    family.cohumulone = between(18.0, 42.0);
    family.oil = between(0.5, 3.0);
  }

  Catalog catalog;
  catalog.names.push_back("synthetic");
  catalog.demo = true;
  catalog.varieties.reserve(count);
  for (std::size_t n = 0; n < count; ++n) {
    const Family& family =
        families[static_cast<std::size_t>(unit(random) * static_cast<double>(families.size())) % families.size()];
    Variety v;
    v.name = fmt::format("Synthetic {:07d}", n + 1);
    v.source_file = "synthetic";
    auto jitter = [&](double value, double sd, double lo, double hi) {
      return std::clamp(value + sd * noise(random), lo, hi);
    };
    auto range = [&](double mid, double half) { return Range{std::max(0.0, mid - half), mid + half}; };
    v.alpha_acid = range(jitter(family.alpha, 1.0, 2.5, 17.0), 0.5);
    v.beta_acid = range(jitter(family.beta, 0.6, 2.0, 10.0), 0.4);
    v.cohumulone = range(jitter(family.cohumulone, 2.0, 15.0, 45.0), 1.5);
    v.total_oil = range(jitter(family.oil, 0.2, 0.3, 3.5), 0.2);
    v.total_oil->min = std::max(v.total_oil->min, 0.1);  // the loaders' lower bound, despite rounding
    const double kind = unit(random);
    if (kind >= 0.05) {
      for (std::size_t c = 0; c < compounds.size(); ++c) {
        const double mid = jitter(family.oils[c], 0.1 * (oil_ranges[c].second - oil_ranges[c].first),
                                  oil_ranges[c].first, oil_ranges[c].second);
        v.oils[compounds[c]] = range(mid, 0.05 * mid);
      }
      // Shares of total oil: scaled down when their midpoints pass 100 %, as a real analysis cannot.
      double sum = 0.0;
      for (const auto& [compound, share] : v.oils) sum += share.mid();
      if (sum > 100.0)
        for (auto& [compound, share] : v.oils) share = Range{share.min * 100.0 / sum, share.max * 100.0 / sum};
    }
    if (kind >= 0.10) {
      std::map<std::string, double> aroma;
      for (std::size_t a = 0; a < axes; ++a) {
        const double value = family.aroma[a] > 0.0 ? jitter(family.aroma[a], 0.5, 0.0, 5.0)
                                                   : (unit(random) < 0.15 ? between(0.5, 1.5) : 0.0);
        if (value > 0.0) aroma[lexicon.axes()[a].name] = value;
      }
      v.aroma = aroma;
    } else {
      for (std::size_t a = 0; a < axes; ++a)
        if (family.aroma[a] > 0.0) v.tags.push_back(lexicon.axes()[a].name);
    }
    catalog.varieties.push_back(std::move(v));
  }
  index_variety_names(catalog);
  return catalog;
}

}  // namespace bine
