"""Small reusable widgets of the workbench (entry fields, section headers)."""
