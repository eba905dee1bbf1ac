#pragma once
// Nearest neighbours by inner product over descriptor vectors, behind one small interface.
// See hop_index.cpp for the essay (exact vs HNSW, subset search, threads).
#include <cstddef>
#include <cstdint>
#include <functional>
#include <memory>
#include <string_view>
#include <vector>

namespace faiss {
struct Index;
}

namespace bine {

/// Which faiss structure answers the queries.
enum class IndexKind { exact, hnsw };
std::string_view to_string(IndexKind kind);

/// Tuning of the neighbour index. Defaults suit catalogs from a few dozen to a million rows.
struct IndexSettings {
  std::size_t exact_up_to = 50'000;  // rows; above this an HNSW graph is built
  int hnsw_neighbors = 32;           // HNSW M: links per node
  int hnsw_ef_construction = 40;     // HNSW build beam width
  /// HNSW query beam width (raised to k when k is larger). 96: recall@10 0.988 at 10^6 rows where
  /// 64 gave 0.976, for a p50 of 0.28 ms instead of 0.20 ms (tools/bench/cli_bench --ef).
  int hnsw_ef_search = 96;
  /// Subsets up to this size are scored exactly (one pass over the subset's rows) even in an
  /// HNSW index: a graph walk that may only visit a few allowed nodes loses recall.
  std::size_t exact_subset_up_to = 20'000;
  /// OpenMP threads for an HNSW build: 0 builds as OpenMP is set (one thread after
  /// use_single_thread(), which keeps a build deterministic); n > 0 uses n threads for the build
  /// only (faster, but the graph, and so an approximate answer, may differ between builds).
  int build_threads = 0;
  /// Called during an HNSW build with rows added and rows in all (for a progress bar); the build
  /// then adds its rows in about a hundred steps.
  std::function<void(std::size_t done, std::size_t total)> progress;
};

/// One search result: the row id given at build time and its inner product with the query.
struct IndexHit {
  std::int64_t id = 0;
  float score = 0.0f;
};

/// An inner-product index over fixed-length float rows. Row ids are 0..size()-1 in build order.
class HopIndex {
 public:
  /// Builds the index over `rows` (row-major, rows.size() must be a multiple of `dimensions`).
  /// The kind is exact up to settings.exact_up_to rows, HNSW above, unless `force` names one.
  HopIndex(int dimensions, const std::vector<float>& rows, const IndexSettings& settings = {},
           const IndexKind* force = nullptr);
  /// Takes over an index read back from a file (a faiss::IndexFlatIP or faiss::IndexHNSWFlat over
  /// inner product, as this class builds them). Throws std::invalid_argument for any other kind.
  HopIndex(std::unique_ptr<faiss::Index> index, const IndexSettings& settings = {});
  ~HopIndex();
  HopIndex(HopIndex&&) noexcept;
  HopIndex& operator=(HopIndex&&) noexcept;
  HopIndex(const HopIndex&) = delete;
  HopIndex& operator=(const HopIndex&) = delete;

  /// The `k` rows with the largest inner product with `query` (length dimensions()), best first.
  /// Fewer than k when the index (or subset) is smaller.
  std::vector<IndexHit> search(const float* query, std::size_t k) const;
  /// As search, but only over the row ids in `subset` (the lots in stock, say).
  std::vector<IndexHit> search_subset(const float* query, std::size_t k, const std::vector<std::int64_t>& subset) const;

  IndexKind kind() const { return kind_; }
  int dimensions() const { return dimensions_; }
  std::size_t size() const;
  /// Approximate bytes held: vectors plus, for HNSW, the graph links.
  std::size_t memory_bytes() const;
  /// The faiss index, for faiss::write_index.
  const faiss::Index& faiss_index() const { return *index_; }
  /// The stored vector of row `id` (dimensions() floats).
  const float* row(std::int64_t id) const {
    return rows_ + static_cast<std::size_t>(id) * static_cast<std::size_t>(dimensions_);
  }

 private:
  std::vector<IndexHit> exact_over(const float* query, std::size_t k, const std::vector<std::int64_t>& subset) const;

  int dimensions_ = 0;
  IndexKind kind_ = IndexKind::exact;
  IndexSettings settings_;
  std::unique_ptr<faiss::Index> index_;
  const float* rows_ = nullptr;  // the stored vectors inside index_ (flat storage, row-major)
};

/// Limits OpenMP (and so faiss) to one thread: single queries are faster without thread start-up,
/// and OpenBLAS and OpenMP threads otherwise fight over the cores.
void use_single_thread();

/// The number of cores OpenMP sees (for IndexSettings::build_threads).
int all_cores();

}  // namespace bine
