// The neighbour index: faiss behind one small interface.
//
// Method. Descriptor vectors (aroma_vector.hpp) are built so that their inner product is the
// weighted similarity of two hops, so "nearest" means "largest inner product". Up to
// IndexSettings::exact_up_to rows we keep an exact faiss::IndexFlatIP: a catalog of a few hundred or
// a few thousand varieties is scanned in microseconds, and exactness means the ranking can be
// checked against a plain Eigen computation. Above the threshold we build a faiss::IndexHNSWFlat
// (hierarchical navigable small-world graph; Malkov Y.A. & Yashunin D.A. 2018, IEEE TPAMI 42(4):
// 824-836) over the same inner product: queries walk the graph instead of scanning all rows, trading
// a small loss of recall for a large gain in speed (measured in tools/bench/index_bench.cpp). Both
// kinds answer through the same search() call.
//
// Subsets. Restricting a search to some rows (the lots in the brewer's stock) uses faiss's
// SearchParameters with an IDSelectorBatch for the flat index. For HNSW a selector makes the walk skip
// forbidden nodes, which loses recall when few nodes are allowed; subsets up to
// exact_subset_up_to rows are therefore scored exactly from the index's stored vectors, which is
// both exact and cheap at that size.
//
// Threads. faiss parallelises over queries with OpenMP; a single query gains nothing from threads
// and pays their start-up, so callers answering one query at a time call use_single_thread(). An
// HNSW build parallelises over the rows it inserts; IndexSettings::build_threads gives it every core
// for the build alone (compiling a catalog, the benchmark), at the price of a graph that depends on
// thread timing. With a progress callback the rows go in about a hundred batches, one call each.
//
// Limits. faiss reports errors by throwing faiss::FaissException; inputs here are built by our own
// code, so such an exception is a bug and is left to the CLI's internal-error handler.
#include "engine/hop_index.hpp"

#include <faiss/IndexFlat.h>
#include <faiss/IndexHNSW.h>
#include <faiss/impl/IDSelector.h>
#include <omp.h>

#include <algorithm>
#include <stdexcept>

namespace bine {
namespace {

using faiss_id = faiss::Index::idx_t;

std::vector<IndexHit> collect(const std::vector<float>& scores, const std::vector<faiss_id>& labels) {
  std::vector<IndexHit> hits;
  hits.reserve(labels.size());
  for (std::size_t i = 0; i < labels.size(); ++i)
    if (labels[i] >= 0) hits.push_back({labels[i], scores[i]});
  return hits;
}

}  // namespace

std::string_view to_string(IndexKind kind) {
  return kind == IndexKind::exact ? "exact (flat inner product)" : "HNSW (approximate)";
}

void use_single_thread() { omp_set_num_threads(1); }

int all_cores() { return omp_get_num_procs(); }

namespace {

/// Sets OpenMP's thread count for one scope (a build) and restores it after.
class ScopedThreads {
 public:
  explicit ScopedThreads(int threads) : before_(omp_get_max_threads()) {
    if (threads > 0) omp_set_num_threads(threads);
  }
  ~ScopedThreads() { omp_set_num_threads(before_); }
  ScopedThreads(const ScopedThreads&) = delete;
  ScopedThreads& operator=(const ScopedThreads&) = delete;

 private:
  int before_;
};

void add_rows(faiss::IndexHNSWFlat& hnsw, faiss_id count, const float* rows, int dimensions,
              const IndexSettings& settings) {
  const ScopedThreads threads(settings.build_threads);
  if (!settings.progress) {
    hnsw.add(count, rows);
    return;
  }
  const faiss_id step = std::max<faiss_id>(1000, count / 100);
  for (faiss_id done = 0; done < count; done += step) {
    const faiss_id batch = std::min(step, count - done);
    hnsw.add(batch, rows + static_cast<std::size_t>(done) * static_cast<std::size_t>(dimensions));
    settings.progress(static_cast<std::size_t>(done + batch), static_cast<std::size_t>(count));
  }
}

}  // namespace

HopIndex::HopIndex(int dimensions, const std::vector<float>& rows, const IndexSettings& settings,
                   const IndexKind* force)
    : dimensions_(dimensions), settings_(settings) {
  if (dimensions <= 0 || rows.size() % static_cast<std::size_t>(dimensions) != 0)
    throw std::invalid_argument("HopIndex: rows do not match the dimension");
  const auto count = static_cast<faiss_id>(rows.size() / static_cast<std::size_t>(dimensions));
  kind_ =
      force ? *force : (static_cast<std::size_t>(count) > settings.exact_up_to ? IndexKind::hnsw : IndexKind::exact);
  if (kind_ == IndexKind::exact) {
    auto flat = std::make_unique<faiss::IndexFlatIP>(dimensions);
    flat->add(count, rows.data());
    rows_ = flat->get_xb();
    index_ = std::move(flat);
  } else {
    auto hnsw =
        std::make_unique<faiss::IndexHNSWFlat>(dimensions, settings.hnsw_neighbors, faiss::METRIC_INNER_PRODUCT);
    hnsw->hnsw.efConstruction = settings.hnsw_ef_construction;
    hnsw->hnsw.efSearch = settings.hnsw_ef_search;
    add_rows(*hnsw, count, rows.data(), dimensions, settings);
    rows_ = static_cast<const faiss::IndexFlat*>(hnsw->storage)->get_xb();
    index_ = std::move(hnsw);
  }
}

HopIndex::HopIndex(std::unique_ptr<faiss::Index> index, const IndexSettings& settings) : settings_(settings) {
  if (!index || index->metric_type != faiss::METRIC_INNER_PRODUCT)
    throw std::invalid_argument("HopIndex: not an inner-product index");
  dimensions_ = index->d;
  if (auto* hnsw = dynamic_cast<faiss::IndexHNSWFlat*>(index.get())) {
    kind_ = IndexKind::hnsw;
    hnsw->hnsw.efSearch = settings.hnsw_ef_search;
    rows_ = static_cast<const faiss::IndexFlat*>(hnsw->storage)->get_xb();
  } else if (auto* flat = dynamic_cast<faiss::IndexFlatIP*>(index.get())) {
    kind_ = IndexKind::exact;
    rows_ = flat->get_xb();
  } else {
    throw std::invalid_argument("HopIndex: neither a flat nor an HNSW index");
  }
  index_ = std::move(index);
}

HopIndex::~HopIndex() = default;
HopIndex::HopIndex(HopIndex&&) noexcept = default;
HopIndex& HopIndex::operator=(HopIndex&&) noexcept = default;

std::size_t HopIndex::size() const { return static_cast<std::size_t>(index_->ntotal); }

std::size_t HopIndex::memory_bytes() const {
  std::size_t bytes = size() * static_cast<std::size_t>(dimensions_) * sizeof(float);
  if (kind_ == IndexKind::hnsw) {
    const auto& graph = static_cast<const faiss::IndexHNSWFlat&>(*index_).hnsw;
    bytes += graph.neighbors.size() * sizeof(faiss::HNSW::storage_idx_t) + graph.offsets.size() * sizeof(std::size_t) +
             graph.levels.size() * sizeof(int);
  }
  return bytes;
}

std::vector<IndexHit> HopIndex::search(const float* query, std::size_t k) const {
  k = std::min(k, size());
  if (k == 0) return {};
  std::vector<float> scores(k);
  std::vector<faiss_id> labels(k);
  if (kind_ == IndexKind::hnsw) {
    faiss::SearchParametersHNSW params;
    params.efSearch = std::max(settings_.hnsw_ef_search, static_cast<int>(k));
    index_->search(1, query, static_cast<faiss_id>(k), scores.data(), labels.data(), &params);
  } else {
    index_->search(1, query, static_cast<faiss_id>(k), scores.data(), labels.data());
  }
  return collect(scores, labels);
}

std::vector<IndexHit> HopIndex::search_subset(const float* query, std::size_t k,
                                              const std::vector<std::int64_t>& subset) const {
  if (subset.empty() || k == 0) return {};
  if (kind_ == IndexKind::hnsw && subset.size() <= settings_.exact_subset_up_to) return exact_over(query, k, subset);
  k = std::min(k, subset.size());
  std::vector<faiss_id> ids(subset.begin(), subset.end());
  faiss::IDSelectorBatch selector(ids.size(), ids.data());
  std::vector<float> scores(k);
  std::vector<faiss_id> labels(k);
  if (kind_ == IndexKind::hnsw) {
    faiss::SearchParametersHNSW params;
    params.sel = &selector;
    params.efSearch = std::max(settings_.hnsw_ef_search, static_cast<int>(k));
    index_->search(1, query, static_cast<faiss_id>(k), scores.data(), labels.data(), &params);
  } else {
    faiss::SearchParameters params;
    params.sel = &selector;
    index_->search(1, query, static_cast<faiss_id>(k), scores.data(), labels.data(), &params);
  }
  return collect(scores, labels);
}

std::vector<IndexHit> HopIndex::exact_over(const float* query, std::size_t k,
                                           const std::vector<std::int64_t>& subset) const {
  std::vector<IndexHit> hits;
  hits.reserve(subset.size());
  const auto d = static_cast<std::size_t>(dimensions_);
  for (const std::int64_t id : subset) {
    if (id < 0 || static_cast<std::size_t>(id) >= size()) continue;
    const float* row = rows_ + static_cast<std::size_t>(id) * d;
    float dot = 0.0f;
    for (std::size_t j = 0; j < d; ++j) dot += row[j] * query[j];
    hits.push_back({id, dot});
  }
  k = std::min(k, hits.size());
  std::partial_sort(
      hits.begin(), hits.begin() + static_cast<std::ptrdiff_t>(k), hits.end(),
      [](const IndexHit& a, const IndexHit& b) { return a.score != b.score ? a.score > b.score : a.id < b.id; });
  hits.resize(k);
  return hits;
}

}  // namespace bine
