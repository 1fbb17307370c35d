//! Star catalog files: decoding (being built).
