"""How figures are presented everywhere (window, text tables, PDF, CSV): display units, the presentation tables of each result kind, safety cautions and result notes. No Qt."""
