#!/usr/bin/python3
"""Reads a .vtu file with meshio (an independent VTK reader) and prints its content as JSON.

Usage: read_vtu.py FILE.vtu
Prints {"points": [[x, y, z], ...], "triangles": [[a, b, c], ...],
        "point_data": {name: [...]}, "cell_data": {name: [...]}} on standard output.
Used by tests/report/test_outputs.cpp to check what edgeflux writes.
"""
import json
import sys

import meshio


def plain(array):
    """Scalars as a flat list (meshio keeps an explicit single component as an N×1 array)."""
    if array.ndim == 2 and array.shape[1] == 1:
        array = array[:, 0]
    return array.tolist()


def main():
    mesh = meshio.read(sys.argv[1])
    triangles = [block.data.tolist() for block in mesh.cells if block.type == "triangle"]
    if len(triangles) != 1 or len(mesh.cells) != 1:
        sys.exit("expected exactly one block of triangles, found: %s" % [b.type for b in mesh.cells])
    out = {
        "points": mesh.points.tolist(),
        "triangles": triangles[0],
        "point_data": {k: plain(v) for k, v in mesh.point_data.items()},
        "cell_data": {k: plain(v[0]) for k, v in mesh.cell_data.items()},
    }
    json.dump(out, sys.stdout)


if __name__ == "__main__":
    main()
