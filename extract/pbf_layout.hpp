#pragma once
// PbfLayout: where the node blocks of a PBF file end and the way and relation blocks begin.
//
// Extracts are normally written sorted by type (all nodes, then ways, then relations), but a
// reader cannot tell a block's type without decompressing it. Knowing the boundary lets the
// extractor's two passes decompress each block once in total: the way pass reads only the blocks
// after it, the node pass only those before it. The boundary is found by reading the blob framing
// and decompressing a handful of blocks (a binary search). It is a guess to be confirmed: the
// reading passes check that no node appears after it and nothing else before it.

#include <cstddef>
#include <optional>

namespace ringroad::extract {

struct PbfLayout {
    std::size_t header_end = 0;         // end of the OSMHeader blob (the start of the data blobs)
    std::size_t first_non_node = 0;     // start of the first blob holding ways or relations, or the file size
    std::size_t node_blobs = 0;         // data blobs before first_non_node
    std::size_t other_blobs = 0;        // data blobs from first_non_node on
};

// nullopt when the framing cannot be read (truncated, corrupt, not PBF), a probed block cannot be
// decoded, or the blocks are not nodes-first: the caller then reads the whole file in each pass,
// where the reader reports any real problem.
std::optional<PbfLayout> find_pbf_layout(const char* data, std::size_t size);

} // namespace ringroad::extract
