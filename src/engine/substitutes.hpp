#pragma once
// Substitutes for a missing variety: ranked by descriptor similarity through the neighbour index,
// with the aroma differences in words, the amount factor that holds the job, and optionally
// two-variety blends that match better than any single substitute.
#include <Eigen/Dense>
#include <array>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "engine/aroma_vector.hpp"
#include "engine/cellar.hpp"
#include "engine/hop_index.hpp"
#include "model/hops.hpp"
#include "model/lexicon.hpp"

namespace bine {

/// Tuning of the substitute search.
struct SubstituteSettings {
  VectorSettings vectors;
  IndexSettings index;
  std::size_t min_candidates = 50;       // faiss candidates re-scored exactly, at least ...
  std::size_t candidate_multiplier = 4;  // ... or this many times --top
  double difference_threshold = 0.75;    // aroma intensity gap (0-5 scale) worth a word
  std::size_t max_differences = 3;
  std::size_t pair_pool = 12;    // best single substitutes tried pairwise for --pairs
  double min_pair_share = 0.10;  // a pair whose smaller share is below this is one hop, really
  double min_pair_gain = 0.5;    // similarity points a pair must gain over the best single
};

/// What to replace, for what job, from where.
struct SwapRequest {
  std::string missing;  // the variety name as typed
  SwapPurpose purpose = SwapPurpose::aroma;
  std::size_t top = 5;
  bool pairs = false;
  const Cellar* cellar = nullptr;  // restrict to lots on hand, aged to its brew day, when set
};

/// One aroma axis where the substitute differs noticeably (delta = substitute - missing, 0-5 scale).
struct AromaDifference {
  std::string axis;
  double delta = 0.0;
};

/// One ranked substitute: a variety, or a lot of one when the search ran over stock.
struct Substitute {
  Variety variety;
  std::optional<Lot> lot;
  std::optional<double> alpha_today;  // lot alpha aged to the brew day (%)
  std::string alpha_note;             // how alpha_today was obtained, or why it was not aged
  bool stale = false;                 // ranked below every fresh lot
  std::string stale_reason;
  double similarity = 0.0;                   // 0-100
  double confidence = 0.0;                   // 0-1
  std::optional<double> amount_factor;       // grams of substitute per gram of the missing variety
  std::string amount_basis;                  // "oil 1.9 / 1.6 mL/100 g" or why there is no factor
  std::vector<AromaDifference> differences;  // largest first
  Eigen::VectorXd aroma;                     // intensities 0-5 per axis
  AromaSource aroma_source = AromaSource::none;
};

/// A two-variety blend (shares by weight) that matches better than the best single substitute.
struct SubstitutePair {
  std::array<std::string, 2> varieties;
  std::array<std::string, 2> lots;  // empty without stock
  std::array<double, 2> shares{};   // fractions summing to 1
  double similarity = 0.0;          // 0-100
  /// Grams of each hop per gram of the missing variety: share x its amount factor (nullopt without one).
  std::array<std::optional<double>, 2> grams_per_gram{};
};

struct SwapResult {
  Variety missing;
  SwapPurpose purpose = SwapPurpose::aroma;
  Eigen::VectorXd missing_aroma;
  AromaSource missing_source = AromaSource::none;
  std::vector<std::string> axes;        // lexicon axis names, for the differences and charts
  std::vector<Substitute> substitutes;  // best first
  std::vector<SubstitutePair> pairs;    // best first; only with SwapRequest::pairs
  bool from_stock = false;
  std::string stock_name;
  std::optional<Date> on;
  IndexKind index_kind = IndexKind::exact;
  std::size_t candidates = 0;      // varieties or lots that could be ranked
  std::vector<std::string> notes;  // skipped lots, missing data, assumptions
};

/// The index settings for one question. Bittering questions are always answered by an exact scan:
/// a bittering swap ranks on a few chemistry figures whose small differences matter, and an exact
/// index needs no graph build (at 10^6 varieties that is about half of a compile) and is answered
/// in milliseconds. Aroma questions use `settings` as given (HNSW above exact_up_to rows).
IndexSettings index_settings_for(SwapPurpose purpose, IndexSettings settings);

/// A catalog as the substitute search reads it, for one question: rows by position, names through
/// a folded-name index, and the neighbour index over the rows with the vectorizer that embedded
/// them. A Catalog in memory gets one built per search; a compiled catalog (io/compiled_catalog.hpp)
/// reads its index from disk and fetches only the rows the search asks for.
class SubstituteCatalog {
 public:
  virtual ~SubstituteCatalog() = default;
  virtual std::size_t size() const = 0;
  /// The position of the variety with this name (folded comparison), or nullopt.
  virtual std::optional<std::size_t> position_of(std::string_view name) const = 0;
  virtual Variety row(std::size_t position) const = 0;
  /// Every variety name (for "did you mean" when a name is unknown).
  virtual std::vector<std::string> names() const = 0;
  virtual const Vectorizer& vectorizer() const = 0;
  /// Row ids of the index are catalog positions.
  virtual const HopIndex& index() const = 0;
};

/// Ranks substitutes for request.missing (stale lots below every fresh one). Throws InputError for an
/// unknown variety and Infeasible when nothing can be ranked (no other variety, or no stocked lot of a catalog
/// variety).
SwapResult find_substitutes(const Catalog& catalog, const Lexicon& lexicon, const SwapRequest& request,
                            const SubstituteSettings& settings = {});
/// As above over any catalog source; the source's vectorizer must be for request.purpose. A
/// Catalog and its compiled form give the same result when their indexes are exact.
SwapResult find_substitutes(const SubstituteCatalog& catalog, const Lexicon& lexicon, const SwapRequest& request,
                            const SubstituteSettings& settings = {});

/// Grams of substitute per gram of the missing hop that hold the job: for aroma the ratio of total
/// oil (oil delivered holds), for bittering the ratio of alpha acid (IBU holds, since IBU is linear in
/// grams x alpha). nullopt when either value is missing or not positive.
std::optional<double> amount_factor(SwapPurpose purpose, std::optional<double> missing_value,
                                    std::optional<double> substitute_value);

/// "more pine, less citrus" from differences; "close on every aroma axis" when there are none.
std::string differences_in_words(const std::vector<AromaDifference>& differences);

/// Best convex two-hop fit of a target aroma: shares (a, 1 - a) minimising
/// ||a x1 + (1 - a) x2 - target||^2, through the blend QP solver with K = 2.
std::array<double, 2> two_hop_shares(const Eigen::VectorXd& first, const Eigen::VectorXd& second,
                                     const Eigen::VectorXd& target);

}  // namespace bine
