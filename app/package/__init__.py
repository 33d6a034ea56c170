"""The package panel: capacity control, motor, auxiliaries and loads of the project's ``package``
section, beside the package figures, the data sheet and the part-load chart (edits.py is Qt-free;
worker.py computes the data sheet off the GUI thread; panel.py lays it out)."""
