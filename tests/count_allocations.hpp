// tests/count_allocations.hpp — for tests that check a path does not allocate: replaces every
// form of the global operator new and delete (plain, array, sized, nothrow) with malloc and
// free and counts the allocations in lacuna_test::allocations. Include it in exactly one
// translation unit of a test program. All forms are replaced together so that no pointer from
// one allocator reaches the other (AddressSanitizer reports a mismatch otherwise: the nothrow
// form, used by std::stable_sort's buffer, was left to the sanitizer's allocator once). The
// over-aligned forms stay the implementation's, new and delete alike.
#pragma once

#include <atomic>
#include <cstddef>
#include <cstdlib>
#include <new>

namespace lacuna_test {
inline std::atomic<std::size_t> allocations{0};
inline void* counted_malloc(std::size_t n) noexcept {
  ++allocations;
  return std::malloc(n ? n : 1);
}
}  // namespace lacuna_test

// GCC 12 inlines the replaced operator delete into std::allocator (and Boost's wrapexcept) and
// then mistakes the malloc/free pair for a mismatch (-Wmismatched-new-delete); it is matched.
#if defined(__GNUC__) && !defined(__clang__)
#pragma GCC diagnostic ignored "-Wmismatched-new-delete"
#endif

void* operator new(std::size_t n) {
  if (void* p = lacuna_test::counted_malloc(n)) return p;
  throw std::bad_alloc();
}
void* operator new[](std::size_t n) {
  if (void* p = lacuna_test::counted_malloc(n)) return p;
  throw std::bad_alloc();
}
void* operator new(std::size_t n, const std::nothrow_t&) noexcept { return lacuna_test::counted_malloc(n); }
void* operator new[](std::size_t n, const std::nothrow_t&) noexcept { return lacuna_test::counted_malloc(n); }
void operator delete(void* p) noexcept { std::free(p); }
void operator delete[](void* p) noexcept { std::free(p); }
void operator delete(void* p, std::size_t) noexcept { std::free(p); }
void operator delete[](void* p, std::size_t) noexcept { std::free(p); }
void operator delete(void* p, const std::nothrow_t&) noexcept { std::free(p); }
void operator delete[](void* p, const std::nothrow_t&) noexcept { std::free(p); }
