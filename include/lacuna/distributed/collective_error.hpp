// lacuna/distributed/collective_error.hpp — one error on every rank when any rank fails.
//
// A distributed computation runs as a sequence of phases. Inside a phase a rank works alone
// (reads, reduces, builds); between phases the ranks communicate. collective_phase runs one
// phase on every rank of a communicator and then decides, all together, whether it failed:
//   1. every rank runs its part, catching any exception (bad input, integer overflow, out of
//      memory, ...);
//   2. one MPI_Allreduce (MIN) of "my rank if I failed, else the size of the communicator"
//      finds the lowest failing rank, or none;
//   3. if one failed, its message is broadcast from it, and every rank throws the same
//      lacuna::distributed_error naming the phase, the failing rank and its message.
// So a failure never leaves the other ranks waiting in a collective call that the failing
// rank will not reach (no hang), and no rank returns a partial result. The precondition that
// makes this work: the function run inside a phase does not communicate.
//
// A rank killed by the system (not an exception) is not seen here: the MPI runtime ends the
// job (OpenMPI's default error handler aborts every rank when one process dies).
#pragma once

#include <mpi.h>

#include <cstdint>
#include <exception>
#include <new>
#include <optional>
#include <stdexcept>
#include <string>
#include <string_view>
#include <type_traits>
#include <utility>

namespace lacuna::distributed {

/// The error every rank throws when a rank failed in a phase of a distributed computation.
/// what(): "lacuna: rank R of N failed while PHASE: MESSAGE".
class distributed_error : public std::runtime_error {
 public:
  /// The error of `failing_rank` (of `ranks`) in `phase`, with its own message.
  distributed_error(int failing_rank, int ranks, std::string phase, std::string message)
      : std::runtime_error("lacuna: rank " + std::to_string(failing_rank) + " of " + std::to_string(ranks) +
                           " failed while " + phase + ": " + message),
        rank_(failing_rank), phase_(std::move(phase)), message_(std::move(message)) {}
  /// The lowest rank that failed.
  int failing_rank() const noexcept { return rank_; }
  /// The phase it failed in.
  const std::string& phase() const noexcept { return phase_; }
  /// Its own error message.
  const std::string& message() const noexcept { return message_; }

 private:
  int rank_;
  std::string phase_, message_;
};

/// Throws std::runtime_error naming `what` when an MPI call did not return MPI_SUCCESS (the
/// communicators used here keep MPI's default handler, which aborts; a user may set another).
inline void check_mpi(int code, const char* what) {
  if (code == MPI_SUCCESS) return;
  char text[MPI_MAX_ERROR_STRING];
  int len = 0;
  MPI_Error_string(code, text, &len);
  throw std::runtime_error(std::string("lacuna: ") + what + " failed: " + std::string(text, static_cast<std::size_t>(len)));
}

/// Runs f() on this rank as one phase named `phase` (collective over `comm`: every rank of
/// comm must call it, in the same order), then throws the same distributed_error on every
/// rank if f threw on any rank. Returns f()'s value (f may return void).
/// Precondition: f does not communicate over comm. Cost: one allreduce of an int, and on
/// failure one broadcast of the message.
template <class F>
auto collective_phase(MPI_Comm comm, std::string_view phase, F&& f) -> std::invoke_result_t<F&> {
  using T = std::invoke_result_t<F&>;
  int rank = 0, size = 1;
  MPI_Comm_rank(comm, &rank);
  MPI_Comm_size(comm, &size);
  std::string message;
  bool failed = false;
  std::conditional_t<std::is_void_v<T>, bool, std::optional<T>> value{};
  try {
    if constexpr (std::is_void_v<T>)
      f();
    else
      value.emplace(f());
  } catch (const std::bad_alloc&) {
    failed = true;
    message = "out of memory";
  } catch (const std::exception& e) {
    failed = true;
    message = e.what();
  } catch (...) {
    failed = true;
    message = "an exception of unknown type";
  }
  if (message.size() > 4096) message.resize(4096);  // one line is enough; keeps the broadcast small
  int mine = failed ? rank : size, lowest = size;
  check_mpi(MPI_Allreduce(&mine, &lowest, 1, MPI_INT, MPI_MIN, comm), "MPI_Allreduce (phase status)");
  if (lowest == size) {
    if constexpr (std::is_void_v<T>)
      return;
    else
      return std::move(*value);
  }
  long long length = rank == lowest ? static_cast<long long>(message.size()) : 0;
  check_mpi(MPI_Bcast(&length, 1, MPI_LONG_LONG, lowest, comm), "MPI_Bcast (error length)");
  message.resize(static_cast<std::size_t>(length));
  if (length > 0) check_mpi(MPI_Bcast(message.data(), static_cast<int>(length), MPI_CHAR, lowest, comm), "MPI_Bcast (error)");
  throw distributed_error(lowest, size, std::string(phase), message);
}

}  // namespace lacuna::distributed
