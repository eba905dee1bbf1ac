#pragma once
// Descriptor vectors: a variety, a lot or a target profile as one float vector in three blocks
// (aroma, oil composition, chemistry), whose inner products are weighted similarities.
// See aroma_vector.cpp for the essay (blocks, encoding, weights, missing data, confidence).
#include <Eigen/Dense>
#include <array>
#include <optional>
#include <string_view>
#include <vector>

#include "engine/aroma_profile.hpp"
#include "model/hops.hpp"
#include "model/lexicon.hpp"

namespace bine {

/// The question a comparison answers: replace a hop's aroma, or its bittering.
enum class SwapPurpose { aroma, bittering };
std::string_view to_string(SwapPurpose purpose);
std::optional<SwapPurpose> swap_purpose_from(std::string_view text);

/// The chemistry features, in block order.
enum class ChemistryFeature { alpha_acid, beta_acid, cohumulone, total_oil };
inline constexpr std::size_t kChemistryFeatures = 4;

/// Block weights (shares of the similarity) and per-feature emphasis inside the chemistry block.
struct BlockWeights {
  double aroma = 0.0;
  double oils = 0.0;
  double chemistry = 0.0;
  std::array<double, kChemistryFeatures> chemistry_emphasis{1.0, 1.0, 1.0, 1.0};  // alpha, beta, cohumulone, oil
};

/// Settings of the vector model. Defaults: an aroma question weighs aroma 0.7, oils 0.2,
/// chemistry 0.1; a bittering question weighs chemistry 0.8 (alpha 3, cohumulone 2, beta 1, oil 0)
/// and aroma 0.2.
struct VectorSettings {
  BlockWeights for_aroma{0.7, 0.2, 0.1, {1.0, 1.0, 1.0, 1.0}};
  BlockWeights for_bittering{0.2, 0.0, 0.8, {3.0, 1.0, 2.0, 0.0}};
  /// Standardised values are mapped to angles of z x angle_per_sd radians, with z clamped to
  /// +-max_sd, so two hops max_sd standard deviations either side of the mean are opposite.
  double angle_per_sd = 0.7853981633974483;  // pi/4
  double max_sd = 2.0;
  double confidence_tags = 0.85;  // confidence factor when aroma came from tags
  double confidence_oils = 0.6;   // ... from oil composition
  const BlockWeights& weights(SwapPurpose purpose) const {
    return purpose == SwapPurpose::aroma ? for_aroma : for_bittering;
  }
};

/// A hop's descriptors before weighting: what each block knows, and what it does not.
struct Descriptors {
  Eigen::VectorXd aroma;  // intensities 0-5 per lexicon axis (all 0 when absent)
  AromaSource aroma_source = AromaSource::none;
  std::vector<std::optional<double>> oils;                          // standardised share per compound
  std::array<std::optional<double>, kChemistryFeatures> chemistry;  // standardised alpha, beta, cohumulone, oil
  bool has_aroma() const { return aroma_source != AromaSource::none; }
};

/// Similarity of two descriptor sets under one question.
struct PairSimilarity {
  double score = 0.0;       // weighted cosine over the blocks both sides have, -1..1
  double coverage = 0.0;    // share of the question's weight both sides could be compared on, 0..1
  double confidence = 0.0;  // coverage, lowered when aroma came from tags or oils
  /// 0-100 for brewers: 100 x max(0, score); symmetric, 100 for identical descriptors.
  double percent() const { return 100.0 * std::max(0.0, score); }
};

/// Mean and population standard deviation of one feature over a catalog.
struct FeatureSpread {
  double mean = 0.0;
  double sd = 1.0;
};

/// A catalog's spread of each oil compound (in oil_compounds() order) and chemistry feature: what
/// standardises them. A compiled catalog stores it so its rows embed as at compile time.
struct CatalogSpread {
  std::vector<FeatureSpread> oils;
  std::array<FeatureSpread, kChemistryFeatures> chemistry;
};

/// The spread of every oil compound and chemistry feature over the varieties that have it.
CatalogSpread catalog_spread(const Catalog& catalog);

/// Turns varieties, lots and target profiles into descriptors and float vectors for one catalog
/// (whose spread standardises oils and chemistry) and one question.
class Vectorizer {
 public:
  Vectorizer(const Catalog& catalog, const Lexicon& lexicon, SwapPurpose purpose, VectorSettings settings = {});
  /// From a spread computed before (a compiled catalog's), without the catalog.
  Vectorizer(CatalogSpread spread, const Lexicon& lexicon, SwapPurpose purpose, VectorSettings settings = {});

  Descriptors describe(const Variety& variety) const;
  /// A lot: its variety's descriptors with the lot's measured alpha, beta and oil (alpha as given,
  /// e.g. already aged) in place of the catalog ranges, and its own aroma (a rub test, lot_aroma)
  /// in place of the variety's profile when `own_aroma` is given.
  Descriptors describe(const Variety& variety, const Lot& lot, std::optional<double> alpha_today,
                       const AromaProfile* own_aroma = nullptr) const;
  /// A target profile ("floral=4,citrus=4" parsed by parse_aroma_spec): aroma block only.
  Descriptors describe_target(const Eigen::VectorXd& intensities) const;

  /// The float vector for the index: each block unit-length (or zero when absent), scaled by the
  /// square root of its weight, so the inner product of two full vectors is their score.
  std::vector<float> embed(const Descriptors& descriptors) const;
  /// Exact similarity with missing blocks dropped and the remaining weights renormalised.
  PairSimilarity similarity(const Descriptors& a, const Descriptors& b) const;

  int dimensions() const;
  SwapPurpose purpose() const { return purpose_; }
  const VectorSettings& settings() const { return settings_; }
  const CatalogSpread& spread() const { return spread_; }

 private:
  std::optional<double> standardise(std::optional<double> value, const FeatureSpread& spread) const;
  Descriptors describe_with(const Variety& variety, std::optional<double> alpha, std::optional<double> beta,
                            std::optional<double> oil, const AromaProfile* own_aroma = nullptr) const;

  const Lexicon* lexicon_;
  SwapPurpose purpose_;
  VectorSettings settings_;
  CatalogSpread spread_;
};

}  // namespace bine
