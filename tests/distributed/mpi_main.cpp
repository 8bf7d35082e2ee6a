// The doctest main of tests/distributed/: every rank runs the same test cases in the same
// order, between MPI_Init and MPI_Finalize, so that their collective calls match. Every rank
// reports for itself; the exit status of every rank is the worst over all ranks, so mpiexec
// fails the run when any rank failed a check.
#define DOCTEST_CONFIG_IMPLEMENT
#include <doctest/doctest.h>

#include <mpi.h>

int main(int argc, char** argv) {
  MPI_Init(&argc, &argv);
  int status = 0;
  {
    doctest::Context context(argc, argv);
    status = context.run();
  }
  int worst = 0;
  MPI_Allreduce(&status, &worst, 1, MPI_INT, MPI_MAX, MPI_COMM_WORLD);
  MPI_Finalize();
  return worst;
}
