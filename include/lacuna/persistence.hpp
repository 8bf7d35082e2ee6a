// lacuna/persistence.hpp — the umbrella header of persistence: includes the persistence API,
// nothing else. Kept apart from lacuna/lacuna.hpp, which does not include it: measured with
// g++ 12 -O2 on a file that includes only the umbrella, lacuna.hpp alone took 3.50 s of user
// time and with the persistence headers 4.05 s (the least of four runs each), a sixth more for
// every program that does not compute persistence. docs/persistence.md describes the headers.
#pragma once

#include <lacuna/persistence/filtration.hpp>
#include <lacuna/persistence/diagram.hpp>
#include <lacuna/persistence/values_filtration.hpp>
#include <lacuna/persistence/cubical_filtration.hpp>
#include <lacuna/persistence/rips_filtration.hpp>
#include <lacuna/persistence/implicit_rips.hpp>
#include <lacuna/persistence/filtered_boundary.hpp>
#include <lacuna/persistence/reduction.hpp>
#include <lacuna/persistence/cubical_reduction.hpp>
#include <lacuna/persistence/persistence.hpp>
