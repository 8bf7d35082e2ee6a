// lacuna/ring/ring.hpp — umbrella header for the coefficient rings: includes, nothing else.
#pragma once

#include <lacuna/ring/concepts.hpp>
#include <lacuna/ring/euclid.hpp>
#include <lacuna/ring/checked.hpp>
#include <lacuna/ring/primality.hpp>
#include <lacuna/ring/integer.hpp>
#include <lacuna/ring/big_integer.hpp>
#include <lacuna/ring/mod_p.hpp>
#include <lacuna/ring/z2.hpp>
#include <lacuna/ring/rational.hpp>
