"""A check of a diagram's faces and components from the definitions alone, for tests."""

import networkx as nx

from movies.diagram.assembly import canonical_cycle

from movies.diagram.model import Dart, Diagram, Side


def check_on_sphere(d: Diagram) -> Diagram:
    """Every side on exactly one face cycle; cycles turn left at each corner; Euler characteristic
    2 per piece; pieces and faces form a tree; components run along next_edge. Returns ``d``."""
    ends = d.edge_ends
    sides = sorted(s for cycles in d.faces.values() for cycle in cycles for s in cycle)
    assert sides == sorted(Side(e, h) for e in d.edges() for h in "LR")
    dart_edge = {Dart(c, p): label for c, labels in d.crossings.items() for p, label in enumerate(labels)}
    for cycles in d.faces.values():
        for cycle in cycles:
            assert cycle == canonical_cycle(cycle)
            if cycle[0].edge in d.loops:
                assert len(cycle) == 1
                continue
            for i, side in enumerate(cycle):
                following = cycle[(i + 1) % len(cycle)]
                tail, head = ends[side.edge]
                corner = head if side.hand == "L" else tail
                leave = Dart(corner.crossing, (corner.position - 1) % 4)
                f_tail, f_head = ends[following.edge]
                assert (f_tail if following.hand == "L" else f_head) == leave
                assert dart_edge[leave] == following.edge
    piece_of = {e: i for i, piece in enumerate(d.pieces()) for e in piece}
    per_piece: dict[int, int] = {}
    graph = nx.MultiGraph()
    for name, cycles in d.faces.items():
        graph.add_node(("face", name))
        for cycle in cycles:
            per_piece[piece_of[cycle[0].edge]] = per_piece.get(piece_of[cycle[0].edge], 0) + 1
            graph.add_edge(("face", name), ("piece", piece_of[cycle[0].edge]))
    for i, piece in enumerate(d.pieces()):
        vertices = {ends[e][0].crossing for e in piece if e not in d.loops}
        assert per_piece[i] == (len(vertices) + 2 if vertices else 2)
    simple = nx.Graph(graph)
    assert nx.is_tree(simple) and simple.number_of_edges() == graph.number_of_edges()
    assert sorted(e for edges in d.components.values() for e in edges) == d.edges()
    for edges in d.components.values():
        assert edges[0] == min(edges)
        for i, e in enumerate(edges):
            assert d.next_edge(e) == edges[(i + 1) % len(edges)]
    return d
