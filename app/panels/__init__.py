"""The workbench's dockable panels, one per file."""
