// lacuna/chain/reducible_complex.hpp — the former name of chain/elimination_workspace.hpp,
// kept for code that includes it (deprecated; include the new header).
#pragma once

#include <lacuna/chain/elimination_workspace.hpp>
