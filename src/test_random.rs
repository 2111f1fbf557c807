//! A small, repeatable source of random numbers for the unit tests that
//! try many generated inputs against a slower or older way of doing the
//! same thing: Marsaglia's xorshift generator (shifts 13, 7 and 17, "Xorshift
//! RNGs", Journal of Statistical Software 8(14), 2003), from a fixed seed so
//! every run tries the same inputs and a failure can be run again.

/// The generator from `seed` (not zero: zero stays zero): each call gives
/// the next number.
pub(crate) fn xorshift(seed: u64) -> impl FnMut() -> u64 {
    assert_ne!(seed, 0, "a xorshift generator from zero gives only zeros");
    let mut state = seed;
    move || {
        state ^= state << 13;
        state ^= state >> 7;
        state ^= state << 17;
        state
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// The numbers are the generator's, step by step, and differ from call
    /// to call.
    #[test]
    fn the_numbers_are_the_generators() {
        let mut next = xorshift(1);
        // 1 → 1 ^ (1 << 13) = 0x2001; ^ (0x2001 >> 7 = 0x40) = 0x2041;
        // ^ (0x2041 << 17) = 0x4082_2041 (worked by hand).
        assert_eq!(next(), 0x4082_2041);
        let a: Vec<u64> = (0..1000).map(|_| next()).collect();
        let mut sorted = a.clone();
        sorted.sort_unstable();
        sorted.dedup();
        assert_eq!(sorted.len(), a.len());
    }
}
