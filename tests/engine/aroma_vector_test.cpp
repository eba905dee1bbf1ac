// The descriptor vectorizer: similarity by hand arithmetic on tiny catalogs, symmetry and range on the
// demo catalog, missing-block re-weighting, confidence, and that the index vectors' inner product is
// the exact similarity when nothing is missing.
#include "engine/aroma_vector.hpp"

#include <doctest/doctest.h>

#include <cmath>

#include "io/data_dir.hpp"

namespace {

bine::Variety variety(const std::string& name, std::map<std::string, double> aroma, std::optional<bine::Range> alpha) {
  bine::Variety v;
  v.name = name;
  if (!aroma.empty()) v.aroma = std::move(aroma);
  v.alpha_acid = alpha;
  return v;
}

bine::DataSet demo_data() { return bine::load_data({BINE_TEST_DIR "/../descriptor-data", "test data"}, {}); }

}  // namespace

TEST_CASE("similarity by hand on a two-variety catalog") {
  const bine::DataSet data = demo_data();
  bine::Catalog catalog;
  catalog.varieties.push_back(variety("A", {{"citrus", 4.0}}, bine::Range{10.0, 10.0}));
  catalog.varieties.push_back(variety("B", {{"citrus", 4.0}, {"pine", 3.0}}, bine::Range{14.0, 14.0}));
  const auto& a = catalog.varieties[0];
  const auto& b = catalog.varieties[1];

  // Hand arithmetic. Aroma cosine: (4 x 4) / (4 x 5) = 0.8.
  // Alpha over the catalog: mean 12, population sd 2, so z = -1 and +1; angles -pi/4 and +pi/4;
  // cos(pi/2) = 0. Only alpha is known, so the chemistry block covers its emphasis share.
  SUBCASE("bittering question") {
    const bine::Vectorizer v(catalog, data.lexicon, bine::SwapPurpose::bittering);
    // Weights aroma 0.2, chemistry 0.8 with emphasis alpha 3 of 3+1+2+0 = 6: effective 0.8 x 3/6 = 0.4.
    // score = (0.2 x 0.8 + 0.4 x 0) / (0.2 + 0.4) = 0.16 / 0.6 = 0.26667; coverage 0.6 / 1.0.
    const auto s = v.similarity(v.describe(a), v.describe(b));
    CHECK(s.score == doctest::Approx(0.26667).epsilon(1e-4));
    CHECK(s.coverage == doctest::Approx(0.6));
    CHECK(s.confidence == doctest::Approx(0.6));  // explicit intensities: no reduction
    CHECK(s.percent() == doctest::Approx(26.667).epsilon(1e-4));
  }
  SUBCASE("aroma question") {
    const bine::Vectorizer v(catalog, data.lexicon, bine::SwapPurpose::aroma);
    // Weights aroma 0.7, oils 0.2 (absent), chemistry 0.1 x 1/4 (alpha only) = 0.025.
    // score = (0.7 x 0.8 + 0.025 x 0) / 0.725 = 0.77241; coverage 0.725.
    const auto s = v.similarity(v.describe(a), v.describe(b));
    CHECK(s.score == doctest::Approx(0.77241).epsilon(1e-4));
    CHECK(s.coverage == doctest::Approx(0.725));
  }
}

TEST_CASE("identical descriptors score 100, and similarity is symmetric and in range on the demo catalog") {
  const bine::DataSet data = demo_data();
  for (const auto purpose : {bine::SwapPurpose::aroma, bine::SwapPurpose::bittering}) {
    const bine::Vectorizer v(data.catalog, data.lexicon, purpose);
    std::vector<bine::Descriptors> all;
    for (const auto& x : data.catalog.varieties) all.push_back(v.describe(x));
    for (std::size_t i = 0; i < all.size(); ++i) {
      CHECK(v.similarity(all[i], all[i]).percent() == doctest::Approx(100.0));
      for (std::size_t j = i + 1; j < all.size(); ++j) {
        const double ij = v.similarity(all[i], all[j]).percent();
        const double ji = v.similarity(all[j], all[i]).percent();
        CHECK(ij == ji);
        CHECK(ij >= 0.0);
        CHECK(ij <= 100.0);
      }
    }
  }
}

TEST_CASE("the index vectors' inner product equals the exact similarity when no block is missing") {
  const bine::DataSet data = demo_data();
  const bine::Vectorizer v(data.catalog, data.lexicon, bine::SwapPurpose::aroma);
  int compared = 0;
  for (const auto& x : data.catalog.varieties) {
    for (const auto& y : data.catalog.varieties) {
      const auto dx = v.describe(x);
      const auto dy = v.describe(y);
      const auto s = v.similarity(dx, dy);
      if (s.coverage < 1.0 - 1e-12) continue;  // a block missing: the re-scoring step differs on purpose
      const auto ex = v.embed(dx);
      const auto ey = v.embed(dy);
      double dot = 0.0;
      for (std::size_t i = 0; i < ex.size(); ++i) dot += double(ex[i]) * double(ey[i]);
      CHECK(dot == doctest::Approx(s.score).epsilon(1e-5));
      ++compared;
    }
  }
  CHECK(compared > 1000);
}

TEST_CASE("missing blocks are re-weighted, not zero-filled, and lower confidence") {
  const bine::DataSet data = demo_data();
  bine::Catalog catalog;
  catalog.varieties.push_back(variety("Rated", {{"citrus", 4.0}, {"floral", 2.0}}, bine::Range{6.0, 8.0}));
  bine::Variety tagged = variety("Tagged", {}, bine::Range{6.0, 8.0});
  tagged.tags = {"citrus"};  // one tag on an axis scores 3 (aroma_profile.hpp rule)
  catalog.varieties.push_back(tagged);
  catalog.varieties.push_back(variety("Bare", {}, bine::Range{6.0, 8.0}));
  const bine::Vectorizer v(catalog, data.lexicon, bine::SwapPurpose::aroma);
  const auto rated = v.describe(catalog.varieties[0]);
  const auto from_tags = v.describe(catalog.varieties[1]);
  const auto bare = v.describe(catalog.varieties[2]);
  CHECK(from_tags.aroma_source == bine::AromaSource::tags);
  CHECK_FALSE(bare.has_aroma());

  // Rated vs Bare: only alpha is comparable (equal midpoints, cos 0 = 1), so the score is 1 on
  // coverage 0.1 x 1/4 = 0.025, not a diluted 0.025 as zero-filling would give.
  const auto with_bare = v.similarity(rated, bare);
  CHECK(with_bare.score == doctest::Approx(1.0));
  CHECK(with_bare.coverage == doctest::Approx(0.025));

  // Rated vs Tagged: aroma cosine (4 x 3) / (sqrt(16 + 4) x 3) = 0.89443, alpha cos 1:
  // score = (0.7 x 0.89443 + 0.025 x 1) / 0.725 = 0.89806; confidence 0.725 x 0.85 = 0.61625.
  const auto with_tags = v.similarity(rated, from_tags);
  CHECK(with_tags.score == doctest::Approx(0.89806).epsilon(1e-4));
  CHECK(with_tags.confidence == doctest::Approx(0.61625));
}

TEST_CASE("a target profile becomes an aroma-only query") {
  const bine::DataSet data = demo_data();
  const bine::Vectorizer v(data.catalog, data.lexicon, bine::SwapPurpose::aroma);
  const Eigen::VectorXd target = bine::parse_aroma_spec("citrus=4,floral=2", data.lexicon, "--target");
  bine::Variety same = variety("Same", {{"citrus", 2.0}, {"floral", 1.0}}, bine::Range{5.0, 7.0});
  // Cosine ignores loudness: (2, 1) is parallel to (4, 2), so the aroma block scores 1.
  const auto s = v.similarity(v.describe_target(target), v.describe(same));
  CHECK(s.percent() == doctest::Approx(100.0));
  CHECK(s.coverage == doctest::Approx(0.7));
  const auto q = v.embed(v.describe_target(target));
  CHECK(q.size() == static_cast<std::size_t>(v.dimensions()));
  double norm = 0.0;
  for (float x : q) norm += double(x) * double(x);
  CHECK(norm == doctest::Approx(0.7));  // aroma block unit length x sqrt(0.7)
}

TEST_CASE("question names") {
  CHECK(bine::swap_purpose_from("Aroma") == bine::SwapPurpose::aroma);
  CHECK(bine::swap_purpose_from("bittering") == bine::SwapPurpose::bittering);
  CHECK_FALSE(bine::swap_purpose_from("flavour").has_value());
}
