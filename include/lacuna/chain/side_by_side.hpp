// lacuna/chain/side_by_side.hpp — run two pieces of work at once, exceptions included.
#pragma once

#include <exception>
#include <thread>

namespace lacuna::detail {

/// Runs beside() on a second thread and here() on the calling one, waits for both, and
/// rethrows the first exception either raised (here()'s first). Used where the work splits
/// into independent parts whose results do not depend on the order.
template <class Beside, class Here>
void side_by_side(Beside&& beside, Here&& here) {
  std::exception_ptr failure;
  std::thread worker([&] {
    try {
      beside();
    } catch (...) {
      failure = std::current_exception();
    }
  });
  try {
    here();
  } catch (...) {
    worker.join();
    throw;
  }
  worker.join();
  if (failure) std::rethrow_exception(failure);
}

}  // namespace lacuna::detail
