// range-v3 views against the plain loops they would replace, on the three shapes of code
// where a view pipeline was proposed (docs/performance.md, "range-v3 or std::ranges"):
//   product  — the cartesian product of two cell ranges in complex/construct/product.hpp:
//              every pair (a, b) gets the index offset + a * nb + b;
//   zip      — generators beside their orders (homology_group::generators / orders): the
//              total size of the torsion generators;
//   merge    — two sorted sparse vectors added (the merge of combine_terms): a two-pointer
//              merge against the pipeline concat | sort | chunk_by(index) | sum | drop zeros,
//              the nearest range-v3 spelling (it has no merge-with-sum view).
// The compile-time side (what including the views costs every translation unit) is measured
// with GCC's -ftime-report; the command is in docs/performance.md.
#include <lacuna/chain/term.hpp>

#include <benchmark/benchmark.h>

#include <algorithm>
#include <cstddef>
#include <cstdint>
#include <random>
#include <utility>
#include <vector>

#if __has_include(<range/v3/view/cartesian_product.hpp>)
#define LACUNA_BENCH_HAVE_RANGE_V3 1
#include <range/v3/action/sort.hpp>
#include <range/v3/range/conversion.hpp>
#include <range/v3/view/cartesian_product.hpp>
#include <range/v3/view/chunk_by.hpp>
#include <range/v3/view/concat.hpp>
#include <range/v3/view/filter.hpp>
#include <range/v3/view/iota.hpp>
#include <range/v3/view/transform.hpp>
#include <range/v3/view/zip.hpp>
#endif

namespace {

using entry = lacuna::term<std::uint32_t, std::int64_t>;

std::vector<entry> random_sparse(std::size_t n, std::uint32_t range, unsigned seed) {
  std::mt19937 rng(seed);
  std::vector<char> used(range, 0);
  std::vector<entry> v;
  std::uniform_int_distribution<std::uint32_t> pos(0, range - 1);
  std::uniform_int_distribution<int> val(-3, 3);
  while (v.size() < n) {
    const auto i = pos(rng);
    if (used[i]) continue;
    used[i] = 1;
    int x = val(rng);
    v.push_back({i, x == 0 ? 1 : x});
  }
  std::sort(v.begin(), v.end(), [](const entry& a, const entry& b) { return a.index < b.index; });
  return v;
}

void product_loop(benchmark::State& state) {
  const auto na = static_cast<std::size_t>(state.range(0)), nb = na;
  for (auto _ : state) {
    std::size_t sum = 0;
    for (std::size_t a = 0; a < na; ++a)
      for (std::size_t b = 0; b < nb; ++b) sum += 7 + a * nb + b;
    benchmark::DoNotOptimize(sum);
  }
  state.SetItemsProcessed(static_cast<std::int64_t>(state.iterations() * na * nb));
}

void zip_loop(benchmark::State& state) {
  const auto n = static_cast<std::size_t>(state.range(0));
  std::vector<std::vector<entry>> generators(n, std::vector<entry>(3));
  std::vector<std::int64_t> orders(n);
  for (std::size_t i = 0; i < n; ++i) orders[i] = static_cast<std::int64_t>(i % 3);
  for (auto _ : state) {
    std::size_t sum = 0;
    for (std::size_t i = 0; i < n; ++i)
      if (orders[i] != 0) sum += generators[i].size();
    benchmark::DoNotOptimize(sum);
  }
  state.SetItemsProcessed(static_cast<std::int64_t>(state.iterations() * n));
}

void merge_loop(benchmark::State& state) {
  const auto n = static_cast<std::size_t>(state.range(0));
  const auto x = random_sparse(n, static_cast<std::uint32_t>(4 * n), 1), y = random_sparse(n, static_cast<std::uint32_t>(4 * n), 2);
  std::vector<entry> out;
  for (auto _ : state) {
    out.clear();
    std::size_t i = 0, j = 0;
    while (i < x.size() && j < y.size()) {
      if (x[i].index < y[j].index)
        out.push_back(x[i++]);
      else if (y[j].index < x[i].index)
        out.push_back(y[j++]);
      else {
        const std::int64_t s = x[i].value + y[j].value;
        if (s != 0) out.push_back({x[i].index, s});
        ++i, ++j;
      }
    }
    out.insert(out.end(), x.begin() + static_cast<std::ptrdiff_t>(i), x.end());
    out.insert(out.end(), y.begin() + static_cast<std::ptrdiff_t>(j), y.end());
    benchmark::DoNotOptimize(out.data());
  }
  state.SetItemsProcessed(static_cast<std::int64_t>(state.iterations() * 2 * n));
}

#ifdef LACUNA_BENCH_HAVE_RANGE_V3
void product_range_v3(benchmark::State& state) {
  const auto na = static_cast<std::size_t>(state.range(0)), nb = na;
  for (auto _ : state) {
    std::size_t sum = 0;
    for (const auto [a, b] : ranges::views::cartesian_product(ranges::views::iota(std::size_t{0}, na),
                                                              ranges::views::iota(std::size_t{0}, nb)))
      sum += 7 + a * nb + b;
    benchmark::DoNotOptimize(sum);
  }
  state.SetItemsProcessed(static_cast<std::int64_t>(state.iterations() * na * nb));
}

void zip_range_v3(benchmark::State& state) {
  const auto n = static_cast<std::size_t>(state.range(0));
  std::vector<std::vector<entry>> generators(n, std::vector<entry>(3));
  std::vector<std::int64_t> orders(n);
  for (std::size_t i = 0; i < n; ++i) orders[i] = static_cast<std::int64_t>(i % 3);
  for (auto _ : state) {
    std::size_t sum = 0;
    for (const auto& [g, order] : ranges::views::zip(generators, orders))
      if (order != 0) sum += g.size();
    benchmark::DoNotOptimize(sum);
  }
  state.SetItemsProcessed(static_cast<std::int64_t>(state.iterations() * n));
}

void merge_range_v3(benchmark::State& state) {
  const auto n = static_cast<std::size_t>(state.range(0));
  const auto x = random_sparse(n, static_cast<std::uint32_t>(4 * n), 1), y = random_sparse(n, static_cast<std::uint32_t>(4 * n), 2);
  for (auto _ : state) {
    auto both = ranges::views::concat(x, y) | ranges::to<std::vector>();
    both |= ranges::actions::sort([](const entry& a, const entry& b) { return a.index < b.index; });
    auto out = both | ranges::views::chunk_by([](const entry& a, const entry& b) { return a.index == b.index; }) |
               ranges::views::transform([](auto&& group) {
                 entry e{(*ranges::begin(group)).index, 0};
                 for (const entry& t : group) e.value += t.value;
                 return e;
               }) |
               ranges::views::filter([](const entry& e) { return e.value != 0; }) | ranges::to<std::vector>();
    benchmark::DoNotOptimize(out.data());
  }
  state.SetItemsProcessed(static_cast<std::int64_t>(state.iterations() * 2 * n));
}
#endif

}  // namespace

BENCHMARK(product_loop)->Arg(1000);
BENCHMARK(zip_loop)->Arg(100000);
BENCHMARK(merge_loop)->Arg(100000);
#ifdef LACUNA_BENCH_HAVE_RANGE_V3
BENCHMARK(product_range_v3)->Arg(1000);
BENCHMARK(zip_range_v3)->Arg(100000);
BENCHMARK(merge_range_v3)->Arg(100000);
#endif

BENCHMARK_MAIN();
