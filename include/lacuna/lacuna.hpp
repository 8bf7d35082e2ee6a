// lacuna/lacuna.hpp — the umbrella header: includes the public API, nothing else.
#pragma once

#include <lacuna/ring/concepts.hpp>
#include <lacuna/complex/concepts.hpp>
