// lacuna/lacuna.hpp — the umbrella header: includes the public API, nothing else.
#pragma once

#include <lacuna/ring/ring.hpp>

#include <lacuna/complex/concepts.hpp>
#include <lacuna/complex/errors.hpp>
#include <lacuna/complex/cell_list.hpp>
#include <lacuna/complex/simplicial_complex.hpp>
#include <lacuna/complex/clique_complex.hpp>
#include <lacuna/complex/cubical_complex.hpp>
#include <lacuna/complex/polygon_mesh.hpp>
#include <lacuna/complex/coboundary_table.hpp>
#include <lacuna/complex/validate.hpp>
#include <lacuna/complex/construct.hpp>

#include <lacuna/chain/combine_terms.hpp>
#include <lacuna/chain/chain.hpp>
#include <lacuna/chain/chain_map.hpp>
#include <lacuna/chain/checked_coefficient.hpp>
#include <lacuna/chain/dense_matrix.hpp>
#include <lacuna/chain/indexed_cells.hpp>
#include <lacuna/chain/slotted_lists.hpp>
#include <lacuna/chain/sparse_matrix.hpp>
#include <lacuna/chain/term.hpp>
#include <lacuna/chain/elimination_workspace.hpp>
#include <lacuna/chain/run_control.hpp>

#include <lacuna/algorithm/dense_smith.hpp>
#include <lacuna/algorithm/smith_invariants.hpp>
#include <lacuna/algorithm/modular_smith.hpp>
#include <lacuna/algorithm/lattice_smith.hpp>
#include <lacuna/algorithm/unit_elimination.hpp>
#include <lacuna/algorithm/elimination_maps.hpp>
#include <lacuna/algorithm/smith_normal_form.hpp>
#include <lacuna/algorithm/stages.hpp>
#include <lacuna/algorithm/field_reduction.hpp>
#include <lacuna/algorithm/gradient_flow.hpp>
#include <lacuna/algorithm/morse_reduction.hpp>
#include <lacuna/algorithm/cubical_morse.hpp>
#include <lacuna/algorithm/dominated_vertices.hpp>

#include <lacuna/homology/homology.hpp>
#include <lacuna/homology/verify.hpp>
#include <lacuna/homology/certificate.hpp>
#include <lacuna/homology/certify.hpp>
#include <lacuna/homology/universal_coefficients.hpp>
#include <lacuna/homology/induced_map.hpp>
#include <lacuna/homology/exact_sequence.hpp>
#include <lacuna/homology/euler_checks.hpp>
#include <lacuna/homology/mayer_vietoris.hpp>
#include <lacuna/homology/clique_homology.hpp>
#include <lacuna/persistence/diagram_distance.hpp>

#include <lacuna/io/facets.hpp>
#include <lacuna/io/cells.hpp>
#include <lacuna/io/off.hpp>
#include <lacuna/io/obj.hpp>
#include <lacuna/io/netpbm.hpp>
#include <lacuna/io/nrrd.hpp>
#include <lacuna/io/points.hpp>
#include <lacuna/io/distances.hpp>
#include <lacuna/io/values.hpp>
#include <lacuna/io/persistence_svg.hpp>
#include <lacuna/io/cycle_svg.hpp>
#include <lacuna/io/certificate_json.hpp>
