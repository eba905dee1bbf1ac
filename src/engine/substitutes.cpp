// Substitutes: the neighbour index proposes, the exact similarity decides.
//
// 1. Every catalog variety is vectorised for the question (aroma_vector.hpp) and put in a HopIndex.
// 2. The missing variety's vector queries the index for a candidate set larger than --top
//    (max(min_candidates, candidate_multiplier x top)); with a stock file the search is restricted to
//    the ids of varieties that have lots on hand.
// 3. Each candidate (a variety, or each stocked lot of it with the lot's measured alpha, beta and oil)
//    is re-scored by Vectorizer::similarity, which handles missing blocks exactly, and the list is
//    sorted by similarity, ties by name then lot code, so output is deterministic.
// 4. The amount factor holds the job: aroma -> total oil ratio (oil delivered holds), bittering ->
//    alpha ratio (IBU is linear in grams x alpha: docs/methods.md#linearity). Lots use their own oil and
//    their alpha aged to the brew day (storage_loss.hpp, Garetz 1994). Missing data give no factor;
//    nothing is guessed.
// 5. Pairs (--pairs): the best pair_pool substitutes are tried two at a time; the blend QP solver
//    (blend_solver.hpp, K = 2, simplex only) finds the shares by weight whose blended aroma intensities
//    are closest to the missing variety's. The blend's oil and chemistry descriptors are the
//    share-weighted means of the two hops' standardised values (a linear first approximation; oil
//    compounds interact, docs/methods.md#linear-blend-limit). Pairs are kept when their similarity
//    beats the best single substitute by min_pair_gain points and the smaller share is at least
//    min_pair_share (a 96/4 "blend" is one hop with a pinch of another).
#include "engine/substitutes.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <deque>
#include <limits>
#include <map>
#include <set>

#include "engine/blend_solver.hpp"
#include "model/catalog_lookup.hpp"
#include "model/errors.hpp"
#include "model/names.hpp"

namespace bine {
namespace {

struct Candidate {
  const Variety* variety = nullptr;
  const CellarLot* lot = nullptr;
  Descriptors descriptors;
};

std::optional<double> mid_of(const std::optional<Range>& range) {
  if (!range) return std::nullopt;
  return range->mid();
}

Substitute make_substitute(const Candidate& c, const Descriptors& missing, const Variety& missing_variety,
                           const Vectorizer& vectorizer, const std::vector<std::string>& axes,
                           const SubstituteSettings& settings) {
  Substitute s;
  s.variety = *c.variety;
  if (c.lot) {
    s.lot = c.lot->lot;
    s.alpha_today = c.lot->alpha_today;
    s.alpha_note = c.lot->alpha_note;
    s.stale = c.lot->stale;
    s.stale_reason = c.lot->stale_reason;
  }
  const PairSimilarity sim = vectorizer.similarity(missing, c.descriptors);
  s.similarity = sim.percent();
  s.confidence = sim.confidence;
  s.aroma = c.descriptors.aroma;
  s.aroma_source = c.descriptors.aroma_source;

  const bool aroma_job = vectorizer.purpose() == SwapPurpose::aroma;
  const std::optional<double> wanted =
      aroma_job ? mid_of(missing_variety.total_oil) : mid_of(missing_variety.alpha_acid);
  std::optional<double> offered;
  std::string offered_from = "catalog";
  if (aroma_job) {
    offered = (c.lot && c.lot->lot.total_oil) ? c.lot->lot.total_oil : mid_of(c.variety->total_oil);
    if (c.lot && c.lot->lot.total_oil) offered_from = "lot";
  } else {
    const bool from_lot = c.lot && c.lot->alpha_today && c.lot->basis != AlphaBasis::catalog_midpoint;
    offered = from_lot ? c.lot->alpha_today : mid_of(c.variety->alpha_acid);
    offered_from = from_lot ? "lot, on the brew day" : "catalog midpoint";
  }
  s.amount_factor = amount_factor(vectorizer.purpose(), wanted, offered);
  const std::string_view what = aroma_job ? "oil" : "alpha";
  const std::string_view unit = aroma_job ? " mL/100 g" : " %";
  if (s.amount_factor) {
    s.amount_basis = fmt::format("{} {:.2f}{} / {:.2f}{} ({})", what, *wanted, unit, *offered, unit, offered_from);
  } else {
    s.amount_basis = fmt::format("n/a (no {} data for {})", what, !wanted ? missing_variety.name : c.variety->name);
  }

  if (missing.has_aroma() && c.descriptors.has_aroma()) {
    for (std::size_t a = 0; a < axes.size(); ++a) {
      const double delta =
          c.descriptors.aroma[static_cast<Eigen::Index>(a)] - missing.aroma[static_cast<Eigen::Index>(a)];
      if (std::abs(delta) >= settings.difference_threshold) s.differences.push_back({axes[a], delta});
    }
    std::stable_sort(
        s.differences.begin(), s.differences.end(),
        [](const AromaDifference& x, const AromaDifference& y) { return std::abs(x.delta) > std::abs(y.delta); });
    if (s.differences.size() > settings.max_differences) s.differences.resize(settings.max_differences);
  }
  return s;
}

// The share-weighted blend of two descriptor sets: intensities mix linearly; standardised values
// mix where both have them, else the one that has it stands.
Descriptors blend_descriptors(const Descriptors& a, const Descriptors& b, double share_a) {
  Descriptors d;
  d.aroma = share_a * a.aroma + (1.0 - share_a) * b.aroma;
  d.aroma_source = a.aroma_source == AromaSource::explicit_values ? b.aroma_source : a.aroma_source;
  auto mix = [&](std::optional<double> x, std::optional<double> y) -> std::optional<double> {
    if (x && y) return share_a * *x + (1.0 - share_a) * *y;
    return x ? x : y;
  };
  d.oils.resize(a.oils.size());
  for (std::size_t i = 0; i < a.oils.size(); ++i) d.oils[i] = mix(a.oils[i], b.oils[i]);
  for (std::size_t i = 0; i < kChemistryFeatures; ++i) d.chemistry[i] = mix(a.chemistry[i], b.chemistry[i]);
  return d;
}

}  // namespace

std::optional<double> amount_factor(SwapPurpose /*purpose*/, std::optional<double> missing_value,
                                    std::optional<double> substitute_value) {
  if (!missing_value || !substitute_value || *missing_value <= 0.0 || *substitute_value <= 0.0) return std::nullopt;
  return *missing_value / *substitute_value;
}

std::string differences_in_words(const std::vector<AromaDifference>& differences) {
  if (differences.empty()) return "close on every aroma axis";
  std::string words;
  for (const auto& d : differences) {
    if (!words.empty()) words += ", ";
    words += (d.delta > 0.0 ? "more " : "less ") + d.axis;
  }
  return words;
}

std::array<double, 2> two_hop_shares(const Eigen::VectorXd& first, const Eigen::VectorXd& second,
                                     const Eigen::VectorXd& target) {
  Eigen::MatrixXd a(first.size(), 2);
  a.col(0) = first;
  a.col(1) = second;
  const BlendQpSolution solution =
      solve_blend_qp(qp_from_least_squares(a, target, Eigen::VectorXd::Ones(first.size())));
  if (!solution.feasible || solution.shares.size() != 2) return {0.5, 0.5};
  return {solution.shares[0], solution.shares[1]};
}

IndexSettings index_settings_for(SwapPurpose purpose, IndexSettings settings) {
  if (purpose == SwapPurpose::bittering) settings.exact_up_to = std::numeric_limits<std::size_t>::max();
  return settings;
}

namespace {

/// A Catalog in memory as a substitute source: every variety embedded and indexed for the question.
class CatalogInMemory final : public SubstituteCatalog {
 public:
  CatalogInMemory(const Catalog& catalog, const Lexicon& lexicon, SwapPurpose purpose,
                  const SubstituteSettings& settings)
      : catalog_(catalog),
        vectorizer_(catalog, lexicon, purpose, settings.vectors),
        index_(vectorizer_.dimensions(), embed_all(), index_settings_for(purpose, settings.index)) {}
  std::size_t size() const override { return catalog_.varieties.size(); }
  std::optional<std::size_t> position_of(std::string_view name) const override {
    const Variety* variety = find_variety(catalog_, name);
    if (!variety) return std::nullopt;
    return static_cast<std::size_t>(variety - catalog_.varieties.data());
  }
  Variety row(std::size_t position) const override { return catalog_.varieties.at(position); }
  std::vector<std::string> names() const override { return variety_names(catalog_); }
  const Vectorizer& vectorizer() const override { return vectorizer_; }
  const HopIndex& index() const override { return index_; }

 private:
  std::vector<float> embed_all() const {
    std::vector<float> rows;
    rows.reserve(catalog_.varieties.size() * static_cast<std::size_t>(vectorizer_.dimensions()));
    for (const auto& variety : catalog_.varieties) {
      const auto v = vectorizer_.embed(vectorizer_.describe(variety));
      rows.insert(rows.end(), v.begin(), v.end());
    }
    return rows;
  }
  const Catalog& catalog_;
  Vectorizer vectorizer_;
  HopIndex index_;
};

/// The position of the variety to replace; InputError with suggestions when the name is unknown.
std::size_t require_position(const SubstituteCatalog& catalog, std::string_view name) {
  if (const auto position = catalog.position_of(name)) return *position;
  std::string hint = did_you_mean(name, catalog.names());
  if (hint.empty()) hint = "see 'bine catalog list'";
  throw InputError(fmt::format("swap: unknown variety \"{}\" ({})", name, hint));
}

/// The catalog positions that may answer, and, with stock, the lots on hand of each.
struct Eligible {
  std::vector<std::int64_t> ids;
  std::map<std::size_t, std::vector<const CellarLot*>> lots_of;  // by catalog position; empty without stock
};

Eligible eligible_varieties(const SubstituteCatalog& catalog, std::size_t missing_at, const Variety& missing,
                            const SwapRequest& request) {
  Eligible eligible;
  if (!request.cellar) {
    for (std::size_t i = 0; i < catalog.size(); ++i)
      if (i != missing_at) eligible.ids.push_back(static_cast<std::int64_t>(i));
    if (eligible.ids.empty())
      throw Infeasible(fmt::format("the catalog has no variety besides {}", missing.name), {Remedy::add_catalog});
    return eligible;
  }
  for (const auto& lot : request.cellar->lots) {
    // age_cellar has refused every lot of a variety the catalog does not know.
    const auto position = catalog.position_of(lot.lot.variety);
    if (!position || !lot.on_hand() || *position == missing_at) continue;
    eligible.lots_of[*position].push_back(&lot);
  }
  for (const auto& [position, lots] : eligible.lots_of) eligible.ids.push_back(static_cast<std::int64_t>(position));
  if (eligible.ids.empty())
    throw Infeasible(fmt::format("no lot on hand in {} is a catalog variety other than {}", request.cellar->source_file,
                                 missing.name),
                     {Remedy::add_stock, Remedy::whole_catalog});
  return eligible;
}

/// A lot on hand as a candidate: its own rub-test aroma when it has one (noted), else its variety's.
Candidate lot_candidate(const Variety& variety, const CellarLot& lot, const Cellar& cellar, const Lexicon& lexicon,
                        const Vectorizer& vectorizer, std::vector<std::string>& notes) {
  const std::optional<AromaProfile> own = lot_aroma(lot.lot, lot.index, cellar.source_file, lexicon);
  if (own) notes.push_back(rub_test_note(lot.lot, lot.code));
  return {&variety, &lot, vectorizer.describe(variety, lot.lot, lot.alpha_today, own ? &*own : nullptr)};
}

/// The index's nearest varieties (or their lots on hand), each to be re-scored exactly. A lot with
/// its own rub test is always a candidate: its variety's catalog profile, which the index holds,
/// says little about how near the lot itself is. The rows the candidates need are fetched into
/// `rows` (a deque, so the candidates' pointers stay valid as it grows).
std::vector<Candidate> candidates_near(const SubstituteCatalog& catalog, const Lexicon& lexicon,
                                       const Eligible& eligible, const Descriptors& wanted, const SwapRequest& request,
                                       const SubstituteSettings& settings, std::deque<Variety>& rows,
                                       std::vector<std::string>& notes) {
  const Vectorizer& vectorizer = catalog.vectorizer();
  const std::vector<float> query = vectorizer.embed(wanted);
  const std::size_t k = std::max(settings.min_candidates, settings.candidate_multiplier * request.top);
  const auto hits = catalog.index().search_subset(query.data(), request.cellar ? k : k + 1, eligible.ids);
  std::vector<Candidate> candidates;
  std::set<std::size_t> hit;
  for (const auto& h : hits) {
    const auto i = static_cast<std::size_t>(h.id);
    hit.insert(i);
    const Variety& variety = rows.emplace_back(catalog.row(i));
    if (!request.cellar) {
      candidates.push_back({&variety, nullptr, vectorizer.describe(variety)});
      continue;
    }
    for (const CellarLot* lot : eligible.lots_of.at(i))
      candidates.push_back(lot_candidate(variety, *lot, *request.cellar, lexicon, vectorizer, notes));
  }
  if (!request.cellar) return candidates;
  for (const auto& [i, lots] : eligible.lots_of) {
    if (hit.count(i) != 0) continue;
    const Variety* variety = nullptr;
    for (const CellarLot* lot : lots) {
      if (!lot->lot.rub_test) continue;
      if (variety == nullptr) variety = &rows.emplace_back(catalog.row(i));
      candidates.push_back(lot_candidate(*variety, *lot, *request.cellar, lexicon, vectorizer, notes));
    }
  }
  return candidates;
}

/// Positions of `ranked` best first: fresh before stale, then similarity, variety name, lot code.
std::vector<std::size_t> ranking_order(const std::vector<Substitute>& ranked) {
  std::vector<std::size_t> order(ranked.size());
  for (std::size_t i = 0; i < order.size(); ++i) order[i] = i;
  std::sort(order.begin(), order.end(), [&](std::size_t x, std::size_t y) {
    const Substitute& a = ranked[x];
    const Substitute& b = ranked[y];
    if (a.stale != b.stale) return b.stale;
    if (a.similarity != b.similarity) return a.similarity > b.similarity;
    if (a.variety.name != b.variety.name) return a.variety.name < b.variety.name;
    return (a.lot ? a.lot->lot : "") < (b.lot ? b.lot->lot : "");
  });
  return order;
}

/// Convex two-hop fits among the best `pair_pool` candidates that beat the best single one.
std::vector<SubstitutePair> fit_pairs(const std::vector<Candidate>& candidates, const std::vector<std::size_t>& order,
                                      double best_single, const Descriptors& wanted, const Vectorizer& vectorizer,
                                      const SubstituteSettings& settings) {
  std::vector<SubstitutePair> pairs;
  const std::size_t pool = std::min(settings.pair_pool, order.size());
  for (std::size_t x = 0; x < pool; ++x) {
    for (std::size_t y = x + 1; y < pool; ++y) {
      const Candidate& a = candidates[order[x]];
      const Candidate& b = candidates[order[y]];
      if (a.variety == b.variety || !a.descriptors.has_aroma() || !b.descriptors.has_aroma()) continue;
      const auto shares = two_hop_shares(a.descriptors.aroma, b.descriptors.aroma, wanted.aroma);
      if (std::min(shares[0], shares[1]) < settings.min_pair_share) continue;  // one hop, really
      const Descriptors mixed = blend_descriptors(a.descriptors, b.descriptors, shares[0]);
      const double similarity = vectorizer.similarity(wanted, mixed).percent();
      if (similarity < best_single + settings.min_pair_gain) continue;
      pairs.push_back({{a.variety->name, b.variety->name},
                       {a.lot ? a.lot->lot.lot : "", b.lot ? b.lot->lot.lot : ""},
                       shares,
                       similarity});
    }
  }
  std::sort(pairs.begin(), pairs.end(), [](const SubstitutePair& p, const SubstitutePair& q) {
    if (p.similarity != q.similarity) return p.similarity > q.similarity;
    return std::tie(p.varieties, p.lots) < std::tie(q.varieties, q.lots);
  });
  return pairs;
}

/// Each pair member's grams per gram of the missing variety: its share times its own amount factor.
void add_grams_per_gram(std::vector<SubstitutePair>& pairs, const std::vector<Substitute>& ranked) {
  for (auto& pair : pairs)
    for (std::size_t k = 0; k < 2; ++k)
      for (const auto& s : ranked)
        if (s.variety.name == pair.varieties[k] && (s.lot ? s.lot->lot : std::string()) == pair.lots[k] &&
            s.amount_factor)
          pair.grams_per_gram[k] = pair.shares[k] * *s.amount_factor;
}

}  // namespace

SwapResult find_substitutes(const Catalog& catalog, const Lexicon& lexicon, const SwapRequest& request,
                            const SubstituteSettings& settings) {
  require_variety(catalog, request.missing, "swap");  // before the index is built
  const CatalogInMemory source(catalog, lexicon, request.purpose, settings);
  return find_substitutes(source, lexicon, request, settings);
}

SwapResult find_substitutes(const SubstituteCatalog& catalog, const Lexicon& lexicon, const SwapRequest& request,
                            const SubstituteSettings& settings) {
  const std::size_t missing_at = require_position(catalog, request.missing);
  const Variety missing = catalog.row(missing_at);
  SwapResult result;
  result.missing = missing;
  result.purpose = request.purpose;
  result.axes = lexicon.axis_names();
  result.from_stock = request.cellar != nullptr;
  if (request.cellar) {
    result.stock_name = request.cellar->name;
    result.on = request.cellar->on;
  }
  // 1. The catalog's vectors and index (built in memory, or read from a compiled catalog).
  const Vectorizer& vectorizer = catalog.vectorizer();
  const Descriptors wanted = vectorizer.describe(missing);
  result.missing_aroma = wanted.aroma;
  result.missing_source = wanted.aroma_source;
  result.index_kind = catalog.index().kind();
  // 2. Which varieties may answer: all but the missing one, or those with lots on hand.
  const Eligible eligible = eligible_varieties(catalog, missing_at, missing, request);
  // 3. Ask the index for candidates, then re-score exactly (missing blocks handled per pair) and rank.
  std::deque<Variety> rows;
  const std::vector<Candidate> candidates =
      candidates_near(catalog, lexicon, eligible, wanted, request, settings, rows, result.notes);
  result.candidates = candidates.size();
  std::vector<Substitute> ranked;
  for (const auto& c : candidates)
    ranked.push_back(make_substitute(c, wanted, missing, vectorizer, result.axes, settings));
  const std::vector<std::size_t> order = ranking_order(ranked);
  for (std::size_t i = 0; i < order.size() && i < request.top; ++i) result.substitutes.push_back(ranked[order[i]]);
  if (!wanted.has_aroma())
    result.notes.push_back(fmt::format("{} has no aroma data: ranked on oils and chemistry only", missing.name));
  // 4. Pairs: convex two-hop fits among the best candidates.
  if (!request.pairs || result.substitutes.empty()) return result;
  if (!wanted.has_aroma()) {
    result.notes.push_back("no pairs: the missing variety has no aroma data to fit");
    return result;
  }
  result.pairs = fit_pairs(candidates, order, ranked[order[0]].similarity, wanted, vectorizer, settings);
  if (result.pairs.size() > request.top) result.pairs.resize(request.top);
  add_grams_per_gram(result.pairs, ranked);
  if (result.pairs.empty())
    result.notes.push_back(fmt::format("no two-variety blend beats the best single substitute by {:g} points or more",
                                       settings.min_pair_gain));
  return result;
}

}  // namespace bine
