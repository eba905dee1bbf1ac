// The neighbour index against a plain Eigen brute-force ranking (the reference: every inner product
// computed in double precision and sorted), and HNSW recall on a synthetic catalog.
#include "engine/hop_index.hpp"

#include <doctest/doctest.h>

#include <Eigen/Dense>
#include <algorithm>
#include <random>
#include <set>

#include "engine/aroma_vector.hpp"
#include "engine/substitutes.hpp"
#include "engine/synthetic_catalog.hpp"
#include "io/data_dir.hpp"

namespace {

using bine::HopIndex;
using bine::IndexKind;

// Row-major float rows as an Eigen matrix (rows x dims), in double for the reference.
Eigen::MatrixXd as_matrix(const std::vector<float>& rows, int dims) {
  const auto n = static_cast<Eigen::Index>(rows.size() / static_cast<std::size_t>(dims));
  Eigen::MatrixXd m(n, dims);
  for (Eigen::Index i = 0; i < n; ++i)
    for (Eigen::Index j = 0; j < dims; ++j) m(i, j) = rows[static_cast<std::size_t>(i * dims + j)];
  return m;
}

// Brute force: ids of the k largest inner products, ties by id, over an optional subset.
std::vector<std::int64_t> brute_force(const Eigen::MatrixXd& m, const std::vector<float>& query, std::size_t k,
                                      const std::vector<std::int64_t>* subset = nullptr) {
  Eigen::VectorXd q(m.cols());
  for (Eigen::Index j = 0; j < m.cols(); ++j) q[j] = query[static_cast<std::size_t>(j)];
  const Eigen::VectorXd scores = m * q;
  std::vector<std::int64_t> ids;
  if (subset)
    ids = *subset;
  else
    for (Eigen::Index i = 0; i < m.rows(); ++i) ids.push_back(i);
  std::sort(ids.begin(), ids.end(),
            [&](std::int64_t a, std::int64_t b) { return scores[a] != scores[b] ? scores[a] > scores[b] : a < b; });
  ids.resize(std::min(k, ids.size()));
  return ids;
}

std::vector<float> random_rows(std::size_t n, int dims, std::uint64_t seed) {
  std::mt19937_64 random(seed);
  std::normal_distribution<float> normal(0.0f, 1.0f);
  std::vector<float> rows(n * static_cast<std::size_t>(dims));
  for (auto& x : rows) x = normal(random);
  return rows;
}

std::vector<std::int64_t> ids_of(const std::vector<bine::IndexHit>& hits) {
  std::vector<std::int64_t> ids;
  for (const auto& hit : hits) ids.push_back(hit.id);
  return ids;
}

bine::DataSet demo_data() { return bine::load_data({BINE_TEST_DIR "/../descriptor-data", "test data"}, {}); }

}  // namespace

TEST_CASE("exact index ranks the demo catalog as Eigen brute force does") {
  const bine::DataSet data = demo_data();
  for (const auto purpose : {bine::SwapPurpose::aroma, bine::SwapPurpose::bittering}) {
    const bine::Vectorizer vectorizer(data.catalog, data.lexicon, purpose);
    std::vector<float> rows;
    for (const auto& variety : data.catalog.varieties) {
      const auto v = vectorizer.embed(vectorizer.describe(variety));
      rows.insert(rows.end(), v.begin(), v.end());
    }
    const HopIndex index(vectorizer.dimensions(), rows);
    REQUIRE(index.kind() == IndexKind::exact);
    const Eigen::MatrixXd m = as_matrix(rows, vectorizer.dimensions());
    const auto d = static_cast<std::size_t>(vectorizer.dimensions());
    int mismatched = 0;
    for (std::size_t q = 0; q < data.catalog.varieties.size(); ++q) {
      const std::vector<float> query(rows.begin() + static_cast<std::ptrdiff_t>(q * d),
                                     rows.begin() + static_cast<std::ptrdiff_t>((q + 1) * d));
      const auto hits = index.search(query.data(), 10);
      const auto expected = brute_force(m, query, 10);
      // Float scores may tie differently from double ones only when two scores agree to ~1e-6.
      REQUIRE(hits.size() == expected.size());
      for (std::size_t r = 0; r < hits.size(); ++r) {
        CHECK(hits[r].score ==
              doctest::Approx(m.row(expected[r]).dot(m.row(static_cast<Eigen::Index>(q)))).epsilon(1e-5));
      }
      // Same ids in the same order, except that rows whose exact scores tie (duplicated descriptors)
      // may come in either order: then the reference scores at each rank must agree.
      for (std::size_t r = 0; r < hits.size(); ++r) {
        const double got = m.row(hits[r].id).dot(m.row(static_cast<Eigen::Index>(q)));
        const double want = m.row(expected[r]).dot(m.row(static_cast<Eigen::Index>(q)));
        if (hits[r].id != expected[r]) CHECK(got == doctest::Approx(want).epsilon(1e-6));
      }
      std::vector<std::int64_t> a = ids_of(hits), b = expected;
      std::sort(a.begin(), a.end());
      std::sort(b.begin(), b.end());
      if (a != b) {  // a differing set is only allowed at the tenth place, on a tie
        CHECK(m.row(hits.back().id).dot(m.row(static_cast<Eigen::Index>(q))) ==
              doctest::Approx(m.row(expected.back()).dot(m.row(static_cast<Eigen::Index>(q)))).epsilon(1e-6));
      }
      mismatched += ids_of(hits) == expected ? 0 : 1;
    }
    MESSAGE(to_string(purpose) << ": rankings differing only on exact ties: " << mismatched);
    CHECK(mismatched <= 3);
  }
}

TEST_CASE("exact and HNSW subset searches return only ids in the subset, best first") {
  const int dims = 16;
  const auto rows = random_rows(3000, dims, 7);
  const Eigen::MatrixXd m = as_matrix(rows, dims);
  std::vector<std::int64_t> subset;
  for (std::int64_t id = 5; id < 3000; id += 37) subset.push_back(id);
  const std::set<std::int64_t> allowed(subset.begin(), subset.end());
  const auto query = random_rows(1, dims, 99);
  for (const IndexKind kind : {IndexKind::exact, IndexKind::hnsw}) {
    const HopIndex index(dims, rows, {}, &kind);
    const auto hits = index.search_subset(query.data(), 10, subset);
    REQUIRE(hits.size() == 10);
    for (const auto& hit : hits) CHECK(allowed.count(hit.id) == 1);
    CHECK(ids_of(hits) == brute_force(m, query, 10, &subset));
  }
  // A subset larger than the exact-subset threshold goes through faiss's selector in the graph.
  bine::IndexSettings settings;
  settings.exact_subset_up_to = 10;
  const IndexKind hnsw = IndexKind::hnsw;
  const HopIndex index(dims, rows, settings, &hnsw);
  const auto hits = index.search_subset(query.data(), 10, subset);
  CHECK_FALSE(hits.empty());
  for (const auto& hit : hits) CHECK(allowed.count(hit.id) == 1);
}

TEST_CASE("the index kind follows the size threshold") {
  const auto rows = random_rows(200, 8, 3);
  bine::IndexSettings settings;
  settings.exact_up_to = 200;
  CHECK(HopIndex(8, rows, settings).kind() == IndexKind::exact);
  settings.exact_up_to = 199;
  const HopIndex graph(8, rows, settings);
  CHECK(graph.kind() == IndexKind::hnsw);
  CHECK(graph.size() == 200);
  // 200 rows x 8 floats x 4 bytes of vectors, plus the graph's links.
  CHECK(graph.memory_bytes() > 200u * 8u * 4u);
  // Asking for more than there are returns all of them.
  CHECK(HopIndex(8, rows).search(rows.data(), 500).size() == 200);
}

TEST_CASE("bittering questions use an exact index at any size, aroma questions the size threshold") {
  // A design rule of substitutes.hpp (index_settings_for), checked on a catalog over the threshold.
  const auto rows = random_rows(300, 8, 5);
  bine::IndexSettings small;
  small.exact_up_to = 100;
  const auto bittering = bine::index_settings_for(bine::SwapPurpose::bittering, small);
  const auto aroma = bine::index_settings_for(bine::SwapPurpose::aroma, small);
  CHECK(HopIndex(8, rows, bittering).kind() == IndexKind::exact);
  CHECK(HopIndex(8, rows, aroma).kind() == IndexKind::hnsw);
  CHECK(aroma.exact_up_to == 100);
}

TEST_CASE("HNSW recall@10 is at least 0.95 on a synthetic catalog of 20,000") {
  const bine::DataSet data = demo_data();
  const bine::Catalog catalog = bine::synthetic_catalog(20'000, data.lexicon, 11);
  const bine::Catalog queries = bine::synthetic_catalog(200, data.lexicon, 12);
  const bine::Vectorizer vectorizer(catalog, data.lexicon, bine::SwapPurpose::aroma);
  std::vector<float> rows;
  for (const auto& variety : catalog.varieties) {
    const auto v = vectorizer.embed(vectorizer.describe(variety));
    rows.insert(rows.end(), v.begin(), v.end());
  }
  const IndexKind hnsw = IndexKind::hnsw;
  const HopIndex index(vectorizer.dimensions(), rows, {}, &hnsw);
  const Eigen::MatrixXd m = as_matrix(rows, vectorizer.dimensions());
  std::size_t found = 0;
  for (const auto& variety : queries.varieties) {
    const auto query = vectorizer.embed(vectorizer.describe(variety));
    const auto truth = brute_force(m, query, 10);
    const std::set<std::int64_t> expected(truth.begin(), truth.end());
    for (const auto& hit : index.search(query.data(), 10)) found += expected.count(hit.id);
  }
  const double recall = static_cast<double>(found) / (10.0 * static_cast<double>(queries.varieties.size()));
  MESSAGE("HNSW recall@10 = " << recall);
  CHECK(recall >= 0.95);
}
