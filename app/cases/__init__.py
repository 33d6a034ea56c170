"""Cases of the project in the window: the list of cases (show one, new, rename, remove, make
base — each one undo step), and the comparison of cases (table of figures with differences from
a reference case, charts side by side), solved off the GUI thread with progress and cancel."""
