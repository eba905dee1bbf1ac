// Late-hop blend design: the model, its constraints, and the search over subsets.
//
// Model (a linear first approximation). Candidate i has aroma intensities s_i (0-5 per axis) and
// total oil O_i (mL/100 g). With late grams g_i the blend's profile is the oil-weighted mean
//     P = sum_i g_i O_i s_i / sum_i g_i O_i = sum_i x_i s_i,   x_i = g_i O_i / sum_j g_j O_j,
// so P is linear in the oil shares x (x >= 0, sum x = 1) and J = sum_a w_a (P_a - t_a)^2 is a convex
// quadratic in x. Real aromas do not add linearly: linalool, geraniol and citronellol act together
// toward citrus (Takoi K. et al. 2010, J. Inst. Brew. 116:251-260); the model ignores that.
//
// Amounts. With a fixed total of late grams G (--rate x volume), the grams follow from the shares as
//     g_i = G u_i / sum_j u_j,   u_i = x_i / O_i,
// and with a fixed oil dose D mL (--oil-dose x volume) as g_i = 100 D x_i / O_i. Every limit we need
// is linear in the grams, a^T g <= beta, and stays linear in x: with fixed G it is equivalent to
// sum_i (G a_i - beta) x_i / O_i <= 0 (multiply through by sum_j u_j > 0); with fixed D it is
// sum_i 100 D a_i x_i / O_i <= beta. So the QP in x is exact for both ways of fixing the amount.
//
// Limits, each one such row: whirlpool IBU c^T g with c_i = split x IBU per gram of candidate i in the
// whirlpool (the bitterness engine, linear in grams); the bittering charge
// b = (T - kept - c^T g) / u_b must be >= 0, i.e. c^T g <= T - kept; with --stock, g_i <= on hand
// and b <= on hand of its lot (minus the blend's grams of that lot if it is also a candidate);
// with --no-bittering, c^T g = T - kept (an equality). Dry hops add no IBU in this model.
//
// Search. Solving every subset of up to K candidates is exact but grows as N^3. We solve every
// subset of a pool: the `nearest` best single candidates (for one candidate J is its weighted
// distance to the target, so these are the target's nearest neighbours in the objective's own
// metric, found with the faiss inner-product index of hop_index.hpp) plus the `per_axis` strongest candidates on each
// axis the target names, so that a citrus hop and a floral hop that are each far from a citrus-floral target still
// meet. The pool alone misses targets whose optimum is (nearly) exact but needs a partner that is neither near the
// target nor strong on a named axis (the complement of a near candidate). So the pool's best subset is then improved by
// local search over the whole catalog: add any candidate while below K members, or swap one member for any candidate,
// keeping the best move, until no move lowers J (each round K x N QPs). The benchmark (tools/bench/blend_bench.cpp)
// measures the gap to the exhaustive search.
#include "engine/blend.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <limits>
#include <map>
#include <numeric>

#include "engine/aroma_profile.hpp"
#include "engine/blend_solver.hpp"
#include "engine/hop_index.hpp"
#include "model/catalog_lookup.hpp"
#include "model/errors.hpp"
#include "model/names.hpp"

namespace bine {
namespace {

using Index = Eigen::Index;

Index at(std::size_t i) { return static_cast<Index>(i); }

std::string join_names(const std::vector<std::string>& names) {
  std::string text;
  for (std::size_t i = 0; i < names.size() && i < 6; ++i) text += (i ? ", " : "") + names[i];
  if (names.size() > 6) text += fmt::format(" and {} more", names.size() - 6);
  return text;
}

/// Everything about the candidates that does not depend on the subset.
struct Prepared {
  Eigen::MatrixXd gram;          // s_i^T W s_j over the pool (rows in pool order)
  std::vector<Index> position;   // candidate -> row of gram, -1 outside the pool
  Eigen::MatrixXd aroma;         // s_i as columns, every candidate
  Eigen::MatrixXd weighted;      // W s_i as columns
  Eigen::VectorXd self;          // s_i^T W s_i for every candidate
  Eigen::VectorXd linear;        // s_i^T W t
  double constant = 0.0;         // t^T W t
  Eigen::VectorXd ibu_per_gram;  // c_i (whirlpool share included)
  double bittering_per_gram = 0.0;
};

/// Grams per unit share for candidate i: g_i = x_i * scale_i / (normaliser).
struct GramRow {
  Eigen::VectorXd a;  // coefficients on g
  double beta = 0.0;
};

}  // namespace

CandidateSet blend_candidates(const Catalog& catalog, const Lexicon& lexicon, const Stock* stock,
                              std::string_view exclude) {
  CandidateSet set;
  std::vector<std::string> no_aroma, no_oil, unknown;
  const std::string excluded = exclude.empty() ? std::string() : fold_name(exclude);
  const auto usable = [&](const Variety& variety, const std::string& label, BlendCandidate& candidate) {
    const AromaProfile profile = aroma_profile(variety, lexicon);
    if (profile.source == AromaSource::none || profile.intensity.maxCoeff() <= 0.0) {
      no_aroma.push_back(label);
      return false;
    }
    candidate.aroma = profile.intensity;
    return true;
  };
  if (stock == nullptr) {
    for (const auto& variety : catalog.varieties) {
      if (!excluded.empty() && fold_name(variety.name) == excluded) continue;
      if (variety.purpose == Purpose::bittering) continue;
      BlendCandidate candidate;
      candidate.variety = variety.name;
      if (!usable(variety, variety.name, candidate)) continue;
      if (!variety.total_oil || variety.total_oil->mid() <= 0.0) {
        no_oil.push_back(variety.name);
        continue;
      }
      candidate.oil_ml_per_100g = variety.total_oil->mid();
      candidate.alpha_percent = variety.alpha_acid ? variety.alpha_acid->mid() : 0.0;
      set.candidates.push_back(std::move(candidate));
    }
  } else {
    for (const auto& lot : stock->lots) {
      if (!lot.on_hand_g || *lot.on_hand_g <= 0.0) continue;
      if (!excluded.empty() && fold_name(lot.variety) == excluded) continue;
      const Variety* variety = find_variety(catalog, lot.variety);
      const std::string label = fmt::format("{} ({})", lot.variety, lot.lot);
      if (variety == nullptr) {
        unknown.push_back(label);
        continue;
      }
      BlendCandidate candidate;
      candidate.variety = variety->name;
      candidate.lot = lot.lot;
      candidate.form = lot.form;
      candidate.on_hand_g = lot.on_hand_g;
      if (!usable(*variety, label, candidate)) continue;
      const std::optional<double> oil =
          lot.total_oil ? lot.total_oil
                        : (variety->total_oil ? std::optional(variety->total_oil->mid()) : std::nullopt);
      if (!oil || *oil <= 0.0) {
        no_oil.push_back(label);
        continue;
      }
      candidate.oil_ml_per_100g = *oil;
      candidate.alpha_percent =
          lot.alpha_acid ? *lot.alpha_acid : (variety->alpha_acid ? variety->alpha_acid->mid() : 0.0);
      set.candidates.push_back(std::move(candidate));
    }
  }
  set.without_aroma = no_aroma.size();
  if (!no_aroma.empty())
    set.notes.push_back(fmt::format("{} skipped: no aroma data ({})", no_aroma.size(), join_names(no_aroma)));
  if (!no_oil.empty())
    set.notes.push_back(fmt::format("{} skipped: no total oil value ({})", no_oil.size(), join_names(no_oil)));
  if (!unknown.empty())
    set.notes.push_back(
        fmt::format("{} lots skipped: variety not in any catalog ({})", unknown.size(), join_names(unknown)));
  return set;
}

BlendTarget target_from_spec(const Eigen::VectorXd& intensity, const std::vector<bool>& named, double others_weight) {
  BlendTarget target;
  target.intensity = intensity;
  target.weight = Eigen::VectorXd::Constant(intensity.size(), others_weight);
  target.named = named;
  for (Index a = 0; a < intensity.size(); ++a)
    if (named[static_cast<std::size_t>(a)]) target.weight[a] = 1.0;
  return target;
}

BlendTarget target_like(const Eigen::VectorXd& profile) {
  BlendTarget target;
  target.intensity = profile;
  target.weight = Eigen::VectorXd::Ones(profile.size());
  target.named.assign(static_cast<std::size_t>(profile.size()), true);
  return target;
}

double whirlpool_ibu_per_gram(const BlendCandidate& candidate, const BlendRequest& request) {
  HopAddition hop;
  hop.variety = candidate.variety;
  hop.grams = 1.0;
  hop.use = HopUse::whirlpool;
  hop.minutes = request.whirlpool_minutes;
  hop.temperature_c = request.whirlpool_temperature_c;
  hop.form = candidate.form;
  return addition_bitterness(hop, candidate.alpha_percent, request.wort, request.bitterness).ibu;
}

double bittering_ibu_per_gram(const BitteringHop& bittering, const BlendRequest& request) {
  HopAddition hop;
  hop.variety = bittering.variety;
  hop.grams = 1.0;
  hop.use = bittering.use.value_or(HopUse::boil);
  hop.minutes = bittering.minutes;
  hop.form = bittering.form;
  return addition_bitterness(hop, bittering.alpha_percent, request.wort, request.bitterness).ibu;
}

namespace {

Prepared prepare(const BlendRequest& request) {
  Prepared prepared;
  const std::size_t n = request.candidates.size();
  Eigen::MatrixXd& s = prepared.aroma;
  s.resize(request.target.intensity.size(), at(n));
  for (std::size_t i = 0; i < n; ++i) s.col(at(i)) = request.candidates[i].aroma;
  prepared.weighted = request.target.weight.asDiagonal() * s;
  const Eigen::MatrixXd& ws = prepared.weighted;
  prepared.self = s.cwiseProduct(ws).colwise().sum().transpose();
  prepared.linear = ws.transpose() * request.target.intensity;
  prepared.constant = request.target.intensity.dot(request.target.weight.cwiseProduct(request.target.intensity));
  // IBU is linear in grams x alpha at a fixed stage and form: one bitterness-engine call per form
  // gives the coefficient (the whirlpool calls integrate over the stand, so this matters at 1,000).
  std::map<HopForm, double> per_gram_per_alpha;
  prepared.ibu_per_gram.resize(at(n));
  for (std::size_t i = 0; i < n; ++i) {
    const BlendCandidate& candidate = request.candidates[i];
    auto found = per_gram_per_alpha.find(candidate.form);
    if (found == per_gram_per_alpha.end()) {
      BlendCandidate unit = candidate;
      unit.alpha_percent = 1.0;
      found = per_gram_per_alpha.emplace(candidate.form, whirlpool_ibu_per_gram(unit, request)).first;
    }
    prepared.ibu_per_gram[at(i)] = request.whirlpool_share * candidate.alpha_percent * found->second;
  }
  if (request.bittering) prepared.bittering_per_gram = bittering_ibu_per_gram(*request.bittering, request);
  return prepared;
}

/// The Gram matrix over the pool only (a 1,000 x 1,000 one costs more than the whole search).
void prepare_gram(Prepared& prepared, const std::vector<std::size_t>& pool, const BlendRequest& request) {
  Eigen::MatrixXd s(request.target.intensity.size(), at(pool.size()));
  prepared.position.assign(request.candidates.size(), -1);
  for (std::size_t k = 0; k < pool.size(); ++k) {
    s.col(at(k)) = request.candidates[pool[k]].aroma;
    prepared.position[pool[k]] = at(k);
  }
  prepared.gram = s.transpose() * (request.target.weight.asDiagonal() * s);
}

/// s_i^T W s_j: from the pool's Gram matrix, or computed for candidates outside the pool.
double gram_entry(const Prepared& prepared, std::size_t i, std::size_t j) {
  const Index r = prepared.position[i], c = prepared.position[j];
  if (r >= 0 && c >= 0) return prepared.gram(r, c);
  return prepared.aroma.col(at(i)).dot(prepared.weighted.col(at(j)));
}

/// a^T g <= beta as a row in the shares of `subset` (see the essay).
std::pair<Eigen::RowVectorXd, double> share_row(const GramRow& row, const std::vector<std::size_t>& subset,
                                                const BlendRequest& request) {
  Eigen::RowVectorXd coefficients(at(subset.size()));
  for (std::size_t k = 0; k < subset.size(); ++k) {
    const double oil = request.candidates[subset[k]].oil_ml_per_100g;
    const double a = row.a[at(subset[k])];
    coefficients[at(k)] = request.amount_kind == LateAmount::grams ? (request.amount * a - row.beta) / oil
                                                                   : 100.0 * request.amount * a / oil;
  }
  return {coefficients, request.amount_kind == LateAmount::grams ? 0.0 : row.beta};
}

/// Grams of each subset member for shares x.
Eigen::VectorXd grams_for(const Eigen::VectorXd& x, const std::vector<std::size_t>& subset,
                          const BlendRequest& request) {
  Eigen::VectorXd u(x.size());
  for (std::size_t k = 0; k < subset.size(); ++k) u[at(k)] = x[at(k)] / request.candidates[subset[k]].oil_ml_per_100g;
  if (request.amount_kind == LateAmount::grams) return request.amount * u / u.sum();
  return 100.0 * request.amount * u;
}

struct SubsetLimits {
  std::vector<GramRow> rows;  // a^T g <= beta over all candidates
  std::optional<GramRow> equality;
};

SubsetLimits gram_limits(const BlendRequest& request, const Prepared& prepared) {
  SubsetLimits limits;
  const auto n = at(request.candidates.size());
  const double room = request.target_ibu - request.kept_ibu;  // IBU left for late hops + bittering
  if (request.bittering) {
    limits.rows.push_back({prepared.ibu_per_gram, room});  // bittering charge >= 0
    if (request.bittering->on_hand_g && prepared.bittering_per_gram > 0.0) {
      // (room - c^T g) / u_b + g_shared <= on hand
      GramRow row{-prepared.ibu_per_gram / prepared.bittering_per_gram,
                  *request.bittering->on_hand_g - room / prepared.bittering_per_gram};
      if (!request.bittering->lot.empty())
        for (Index i = 0; i < n; ++i)
          if (request.candidates[static_cast<std::size_t>(i)].lot == request.bittering->lot) row.a[i] += 1.0;
      limits.rows.push_back(row);
    }
  } else {
    limits.equality = GramRow{prepared.ibu_per_gram, room};
  }
  for (Index i = 0; i < n; ++i) {
    const auto& candidate = request.candidates[static_cast<std::size_t>(i)];
    if (!candidate.on_hand_g) continue;
    GramRow row{Eigen::VectorXd::Zero(n), *candidate.on_hand_g};
    row.a[i] = 1.0;
    limits.rows.push_back(row);
  }
  return limits;
}

BlendQpSolution solve_subset(const std::vector<std::size_t>& subset, const BlendRequest& request,
                             const Prepared& prepared, const SubsetLimits& limits) {
  const auto k = at(subset.size());
  BlendQp qp;
  qp.hessian.resize(k, k);
  qp.linear.resize(k);
  for (Index r = 0; r < k; ++r) {
    qp.linear[r] = prepared.linear[at(subset[static_cast<std::size_t>(r)])];
    for (Index c = 0; c < k; ++c)
      qp.hessian(r, c) = gram_entry(prepared, subset[static_cast<std::size_t>(r)], subset[static_cast<std::size_t>(c)]);
  }
  qp.constant = prepared.constant;
  // Rows that involve only candidates outside the subset are constant; keep the rest.
  std::vector<std::pair<Eigen::RowVectorXd, double>> rows;
  for (const auto& row : limits.rows) {
    bool touches = row.a.size() == 0;
    for (const std::size_t i : subset) touches = touches || row.a[at(i)] != 0.0;
    if (!touches && row.beta >= 0.0) continue;  // 0 <= beta: always satisfied
    rows.push_back(share_row(row, subset, request));
  }
  qp.inequality.resize(at(rows.size()), k);
  qp.inequality_bound.resize(at(rows.size()));
  for (std::size_t r = 0; r < rows.size(); ++r) {
    qp.inequality.row(at(r)) = rows[r].first;
    qp.inequality_bound[at(r)] = rows[r].second;
  }
  if (limits.equality) {
    auto [row, bound] = share_row(*limits.equality, subset, request);
    qp.equality = row.transpose();
    qp.equality_bound = bound;
  }
  return solve_blend_qp(qp);
}

/// Candidate indices to search: nearest in the objective's metric plus strongest per named axis.
std::vector<std::size_t> choose_pool(const BlendRequest& request, const Prepared& prepared) {
  const std::size_t n = request.candidates.size();
  std::vector<std::size_t> pool(n);
  std::iota(pool.begin(), pool.end(), 0);
  if (request.pool.exhaustive) return pool;
  std::vector<bool> chosen(n, false);
  // Nearest neighbours through the faiss index. J of a single candidate is
  // s^T W s - 2 s^T W t + t^T W t, so with rows [W^1/2 s, -s^T W s / 2] and the query [W^1/2 t, 1]
  // the largest inner product is the smallest J: an exact inner-product search in J's own metric.
  const Index axes = request.target.intensity.size();
  const int dimensions = static_cast<int>(axes) + 1;
  const Eigen::VectorXd root_w = request.target.weight.cwiseSqrt();
  std::vector<float> rows(n * static_cast<std::size_t>(dimensions));
  for (std::size_t i = 0; i < n; ++i) {
    float* row = rows.data() + i * static_cast<std::size_t>(dimensions);
    for (Index a = 0; a < axes; ++a) row[a] = static_cast<float>(root_w[a] * request.candidates[i].aroma[a]);
    row[axes] = static_cast<float>(-0.5 * prepared.self[at(i)]);
  }
  std::vector<float> query(static_cast<std::size_t>(dimensions), 1.0f);
  for (Index a = 0; a < axes; ++a)
    query[static_cast<std::size_t>(a)] = static_cast<float>(root_w[a] * request.target.intensity[a]);
  const HopIndex index(dimensions, rows);
  for (const IndexHit& hit : index.search(query.data(), std::min(n, request.pool.nearest)))
    chosen[static_cast<std::size_t>(hit.id)] = true;
  for (Index a = 0; a < request.target.intensity.size(); ++a) {
    if (!request.target.named[static_cast<std::size_t>(a)] || request.target.intensity[a] <= 0.0) continue;
    std::vector<std::size_t> strongest = pool;
    // Strong on this axis and quiet on the axes the target wants at 0: intensity on the axis less
    // the weighted size of the candidate's off-target aroma.
    const auto score = [&](std::size_t i) {
      const Eigen::VectorXd& s = request.candidates[i].aroma;
      double off = 0.0;
      for (Index b = 0; b < s.size(); ++b)
        if (request.target.intensity[b] <= 0.0) off += request.target.weight[b] * s[b] * s[b];
      return s[a] - std::sqrt(off);
    };
    std::vector<double> scores(n);
    for (std::size_t i = 0; i < n; ++i) scores[i] = score(i);
    std::stable_sort(strongest.begin(), strongest.end(),
                     [&](std::size_t l, std::size_t r) { return scores[l] > scores[r]; });
    for (std::size_t k = 0; k < std::min(n, request.pool.per_axis); ++k) chosen[strongest[k]] = true;
  }
  std::vector<std::size_t> result;
  for (std::size_t i = 0; i < n; ++i)
    if (chosen[i]) result.push_back(i);
  return result;
}

/// The pool plus the `per_axis` least and most bitter candidates per gram and the largest lots.
std::vector<std::size_t> widen_pool(const std::vector<std::size_t>& pool, const BlendRequest& request,
                                    const Prepared& prepared) {
  const std::size_t n = request.candidates.size();
  std::vector<bool> chosen(n, false);
  for (const std::size_t i : pool) chosen[i] = true;
  std::vector<std::size_t> order(n);
  std::iota(order.begin(), order.end(), 0);
  const std::size_t take = std::min(n, request.pool.per_axis);
  const auto add_first = [&](auto less) {
    std::stable_sort(order.begin(), order.end(), less);
    for (std::size_t k = 0; k < take; ++k) chosen[order[k]] = true;
  };
  add_first([&](std::size_t l, std::size_t r) { return prepared.ibu_per_gram[at(l)] < prepared.ibu_per_gram[at(r)]; });
  add_first([&](std::size_t l, std::size_t r) { return prepared.ibu_per_gram[at(l)] > prepared.ibu_per_gram[at(r)]; });
  add_first([&](std::size_t l, std::size_t r) {
    return request.candidates[l].on_hand_g.value_or(0.0) > request.candidates[r].on_hand_g.value_or(0.0);
  });
  std::vector<std::size_t> result;
  for (std::size_t i = 0; i < n; ++i)
    if (chosen[i]) result.push_back(i);
  return result;
}

/// Calls visit(subset) for every subset of `pool` of size 1..k, smaller subsets first.
template <typename Visit>
void for_each_subset(const std::vector<std::size_t>& pool, std::size_t k, Visit visit) {
  std::vector<std::size_t> subset;
  for (std::size_t size = 1; size <= std::min(k, pool.size()); ++size) {
    std::vector<std::size_t> index(size);
    std::iota(index.begin(), index.end(), 0);
    while (true) {
      subset.clear();
      for (std::size_t i : index) subset.push_back(pool[i]);
      visit(subset);
      std::size_t p = size;
      while (p > 0 && index[p - 1] == pool.size() - size + p - 1) --p;
      if (p == 0) break;
      ++index[p - 1];
      for (std::size_t q = p; q < size; ++q) index[q] = index[q - 1] + 1;
    }
  }
}

void explain_infeasible(const BlendRequest& request, const Prepared& prepared) {
  const double room = request.target_ibu - request.kept_ibu;
  if (request.bittering) {
    throw Infeasible(fmt::format(
        "no blend of up to {} candidates fits the limits: the late hops' whirlpool IBU must stay at or below "
        "{:.1f} IBU and each lot within its stock (lower --split or the rate, raise --ibu, or add stock)",
        request.max_varieties, room));
  }
  const double most = prepared.ibu_per_gram.size() ? prepared.ibu_per_gram.maxCoeff() : 0.0;
  const double reach =
      request.amount_kind == LateAmount::grams ? most * request.amount : std::numeric_limits<double>::quiet_NaN();
  throw Infeasible(fmt::format(
      "with --no-bittering the late hops must give exactly {:.1f} IBU, and no blend of up to {} candidates does{} "
      "(raise --split or the rate, or allow a bittering charge)",
      room, request.max_varieties,
      std::isnan(reach) ? std::string() : fmt::format(" (the most bitter candidate alone gives {:.1f} IBU)", reach)));
}

}  // namespace

BlendResult design_blend(const BlendRequest& request) {
  if (request.candidates.empty())
    throw Infeasible(
        "no candidate hops with aroma and oil data (add stock with aroma varieties, or a catalog with aroma data)");
  if (request.amount <= 0.0) throw Infeasible("the late-hop amount is zero (give --rate or --oil-dose above 0)");
  if (request.kept_ibu > request.target_ibu + 0.05)
    throw Infeasible(
        fmt::format("the boil additions kept from the recipe already give {:.1f} IBU, above the target {:.1f} IBU "
                    "(raise the target with --ibu, or shorten or remove those additions)",
                    request.kept_ibu, request.target_ibu));
  if (request.amount_kind == LateAmount::grams) {
    std::vector<double> stock;
    bool limited = true;
    for (const auto& candidate : request.candidates) {
      limited = limited && candidate.on_hand_g.has_value();
      stock.push_back(candidate.on_hand_g.value_or(0.0));
    }
    std::sort(stock.rbegin(), stock.rend());
    const double most = std::accumulate(
        stock.begin(), stock.begin() + static_cast<std::ptrdiff_t>(std::min(stock.size(), request.max_varieties)), 0.0);
    if (limited && most < request.amount)
      throw Infeasible(
          fmt::format("the blend needs {:.0f} g of late hops but the {} largest aroma lots on hand hold only {:.0f} g "
                      "(lower --rate, raise --max-varieties, or add stock)",
                      request.amount, std::min(stock.size(), request.max_varieties), most));
  }
  Prepared prepared = prepare(request);
  const SubsetLimits limits = gram_limits(request, prepared);
  const std::vector<std::size_t> pool = choose_pool(request, prepared);

  BlendResult result;
  double best = std::numeric_limits<double>::infinity();
  std::vector<std::size_t> best_subset;
  Eigen::VectorXd best_shares;
  const auto search = [&](const std::vector<std::size_t>& candidates) {
    prepare_gram(prepared, candidates, request);
    for_each_subset(candidates, request.max_varieties, [&](const std::vector<std::size_t>& subset) {
      ++result.subsets_solved;
      const BlendQpSolution solution = solve_subset(subset, request, prepared, limits);
      if (solution.feasible && solution.objective < best - 1e-12) {  // ties keep the smaller, earlier subset
        best = solution.objective;
        best_subset = subset;
        best_shares = solution.shares;
      }
    });
  };
  search(pool);
  result.pool_size = pool.size();
  if (best_subset.empty() && !request.pool.exhaustive) {
    // The limits may exclude the whole pool (too bitter for the IBU left, too little stock): widen it
    // with the least and most bitter candidates per gram and the largest lots, and search again.
    std::vector<std::size_t> wider = widen_pool(pool, request, prepared);
    search(wider);
    result.pool_size = wider.size();
  }
  if (best_subset.empty()) explain_infeasible(request, prepared);
  if (!request.pool.exhaustive) {
    // Local improvement over the whole catalog: below K members try adding each candidate, at K try
    // replacing each member with each candidate; take the best move (ties: the first in candidate
    // order) and repeat until no move lowers J. Each round is at most K x N small QPs.
    const std::size_t n = request.candidates.size();
    std::vector<std::size_t> trial;
    for (std::size_t round = 0; round < request.pool.swap_rounds && best > 1e-12; ++round) {
      std::vector<std::size_t> move_subset;
      Eigen::VectorXd move_shares;
      double move = best;
      const auto consider = [&](const std::vector<std::size_t>& subset) {
        ++result.subsets_solved;
        const BlendQpSolution solution = solve_subset(subset, request, prepared, limits);
        if (solution.feasible && solution.objective < move - 1e-12) {
          move = solution.objective;
          move_subset = subset;
          move_shares = solution.shares;
        }
      };
      for (std::size_t j = 0; j < n; ++j) {
        if (std::find(best_subset.begin(), best_subset.end(), j) != best_subset.end()) continue;
        if (best_subset.size() < request.max_varieties) {
          trial = best_subset;
          trial.push_back(j);
          consider(trial);
          continue;
        }
        for (std::size_t k = 0; k < best_subset.size(); ++k) {
          trial = best_subset;
          trial[k] = j;
          consider(trial);
        }
      }
      if (move_subset.empty()) break;
      best = move;
      best_subset = move_subset;
      best_shares = move_shares;
    }
  }

  result.target = request.target.intensity;
  result.weight = request.target.weight;
  result.objective = std::max(0.0, best);
  result.fit = std::sqrt(result.objective / request.target.weight.sum());
  result.profile = Eigen::VectorXd::Zero(request.target.intensity.size());
  const Eigen::VectorXd grams = grams_for(best_shares, best_subset, request);
  for (std::size_t k = 0; k < best_subset.size(); ++k) {
    if (best_shares[at(k)] < 1e-9) continue;
    const BlendCandidate& candidate = request.candidates[best_subset[k]];
    BlendPart part;
    part.candidate = best_subset[k];
    part.variety = candidate.variety;
    part.lot = candidate.lot;
    part.oil_share = best_shares[at(k)];
    part.alpha_percent = candidate.alpha_percent;
    part.form = candidate.form;
    part.grams = grams[at(k)];
    part.whirlpool_g = request.whirlpool_share * part.grams;
    part.dry_hop_g = part.grams - part.whirlpool_g;
    part.whirlpool_ibu = part.whirlpool_g * whirlpool_ibu_per_gram(candidate, request);
    result.profile += part.oil_share * candidate.aroma;
    result.late_grams += part.grams;
    result.oil_ml += part.grams * candidate.oil_ml_per_100g / 100.0;
    result.late_ibu += part.whirlpool_ibu;
    if (candidate.on_hand_g) part.left_g = *candidate.on_hand_g - part.grams;
    result.parts.push_back(part);
  }
  std::stable_sort(result.parts.begin(), result.parts.end(),
                   [](const BlendPart& l, const BlendPart& r) { return l.oil_share > r.oil_share; });
  result.kept_ibu = request.kept_ibu;
  result.target_ibu = request.target_ibu;
  result.bittering = request.bittering;
  if (request.bittering && prepared.bittering_per_gram > 0.0) {
    result.bittering_grams =
        std::max(0.0, (request.target_ibu - request.kept_ibu - result.late_ibu) / prepared.bittering_per_gram);
    result.bittering_ibu = result.bittering_grams * prepared.bittering_per_gram;
    if (request.bittering->on_hand_g) {
      double left = *request.bittering->on_hand_g - result.bittering_grams;
      for (auto& part : result.parts)
        if (!request.bittering->lot.empty() && part.lot == request.bittering->lot) {
          left -= part.grams;
          part.left_g = left;
        }
      result.bittering_left_g = left;
    }
  }
  result.total_ibu = result.kept_ibu + result.late_ibu + result.bittering_ibu;
  if (std::abs(result.total_ibu - result.target_ibu) > 0.05)
    throw Infeasible(
        fmt::format("the blend gives {:.1f} IBU but the target is {:.1f} IBU and the bittering hop "
                    "cannot make up the difference (choose a bittering hop with alpha acid data)",
                    result.total_ibu, result.target_ibu));
  return result;
}

}  // namespace bine
