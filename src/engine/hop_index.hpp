#pragma once
// Nearest neighbours by inner product over descriptor vectors, behind one small interface.
// See hop_index.cpp for the essay (exact vs HNSW, subset search, threads).
#include <cstddef>
#include <cstdint>
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
  int hnsw_ef_search = 64;           // HNSW query beam width (raised to k when k is larger)
  /// Subsets up to this size are scored exactly (one pass over the subset's rows) even in an
  /// HNSW index: a graph walk that may only visit a few allowed nodes loses recall.
  std::size_t exact_subset_up_to = 20'000;
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

}  // namespace bine
