//! Terminations, reflection, two-port networks and cascades (in progress).
