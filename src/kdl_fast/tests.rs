//! Unit tests of the fast KDL parser, one feature at a time.
