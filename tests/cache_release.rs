//! The patched comemo (vendor/comemo, PATCH.md): `evict_and_release` empties the caches
//! as `evict(0)` does, and the caches go on working after it. This binary holds only
//! this test, so no other test evicts the caches meanwhile.

use std::sync::atomic::{AtomicUsize, Ordering};

static CALLS: AtomicUsize = AtomicUsize::new(0);

#[comemo::memoize]
fn square(x: u64) -> u64 {
    CALLS.fetch_add(1, Ordering::SeqCst);
    x * x
}

#[comemo::track]
impl Pile {
    fn get(&self, k: usize) -> u64 {
        self.0[k]
    }
}

struct Pile(Vec<u64>);

#[comemo::memoize]
fn sum(pile: comemo::Tracked<Pile>, n: usize) -> u64 {
    CALLS.fetch_add(1, Ordering::SeqCst);
    (0..n).map(|k| pile.get(k)).sum()
}

fn calls() -> usize {
    CALLS.load(Ordering::SeqCst)
}

#[test]
fn release_empties_the_caches_and_they_work_on() {
    let pile = Pile((1..=100).collect());
    for round in 0..3 {
        let before = calls();
        assert_eq!(square(12), 144);
        assert_eq!(sum(comemo::Track::track(&pile), 100), 5050);
        assert_eq!(calls(), before + 2, "round {round}: computed");
        assert_eq!(square(12), 144);
        assert_eq!(sum(comemo::Track::track(&pile), 100), 5050);
        assert_eq!(calls(), before + 2, "round {round}: remembered");
        match round {
            0 => comemo::evict(0),
            _ => comemo::evict_and_release(),
        }
    }
    // evicting with an age above zero keeps what was used since the last eviction,
    // as published
    let before = calls();
    assert_eq!(square(7), 49);
    comemo::evict(1);
    assert_eq!(square(7), 49);
    assert_eq!(calls(), before + 1);
    comemo::evict_and_release();
    assert_eq!(square(7), 49);
    assert_eq!(calls(), before + 2);
}
