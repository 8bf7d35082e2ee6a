// lacuna/lacuna.hpp — the umbrella header: includes the public API, nothing else.
#pragma once

#include <lacuna/ring/ring.hpp>
#include <lacuna/complex/concepts.hpp>
