"""How figures are presented everywhere (window, text tables, PDF, CSV), no Qt.

``units`` the display units (SI/US) · ``figures`` the row type of a presentation table (key, label,
display quantity, decimals, per-output looks) · ``balance_tables``, ``staging_table``, ``year_tables``,
``recovery_table`` the presentation table of each result kind · ``summary_table`` the report's first
page · ``cautions`` safety cautions · ``result_notes`` notes on figures often taken for errors.
"""
