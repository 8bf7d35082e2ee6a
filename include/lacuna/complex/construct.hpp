// lacuna/complex/construct.hpp — umbrella header of the constructions: includes them, nothing else.
#pragma once

#include <lacuna/complex/construct/barycentric_subdivision.hpp>
#include <lacuna/complex/construct/cone.hpp>
#include <lacuna/complex/construct/disjoint_union.hpp>
#include <lacuna/complex/construct/graph_complexes.hpp>
#include <lacuna/complex/construct/join.hpp>
#include <lacuna/complex/construct/product.hpp>
#include <lacuna/complex/construct/quotient.hpp>
#include <lacuna/complex/construct/simplicial_product.hpp>
#include <lacuna/complex/construct/skeleton.hpp>
#include <lacuna/complex/construct/subcomplex.hpp>
#include <lacuna/complex/construct/suspension.hpp>
#include <lacuna/complex/construct/to_cell_list.hpp>
#include <lacuna/complex/construct/wedge.hpp>
