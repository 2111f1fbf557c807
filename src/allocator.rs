//! The program's allocator: mimalloc, asked the way its plain C entry
//! points are asked wherever the layout allows.
//!
//! The `mimalloc` crate hands every request to mimalloc's aligned entry
//! points (`mi_malloc_aligned`, `mi_realloc_aligned`), which test the
//! alignment and look for a suitably aligned free block before they reach
//! the same small-block path `mi_malloc` takes: about 40 instructions a
//! call more, some 1.5 million calls on a 1,000-set job
//! (docs/performance.md, "The allocator asked plainly"). Almost every
//! request a Rust program makes (strings, vectors of numbers or pointers)
//! needs no more alignment than mimalloc gives every block anyway, so
//! those go to `mi_malloc`, `mi_zalloc` and `mi_realloc`; the rest still
//! go through the `mimalloc` crate's aligned calls.
//!
//! Set as the global allocator in `src/main.rs` and the `phases` example
//! only, not in the library, so the fuzz targets keep the sanitiser's
//! allocator.

use std::alloc::{GlobalAlloc, Layout};
use std::ffi::c_void;

/// mimalloc's own rule (`mi_malloc_is_naturally_aligned` in its
/// `alloc-aligned.c`): a block of at least `align` bytes is aligned to
/// `align` when `align` is at most `MI_MAX_ALIGN_SIZE`, 16 bytes.
const PLAIN_ALIGN: usize = 16;

/// True when a plain `mi_malloc` of `size` bytes is already aligned to
/// `align`.
fn plain(size: usize, align: usize) -> bool {
    align <= PLAIN_ALIGN && align <= size
}

/// mimalloc, through its plain calls when the layout allows.
pub struct Allocator;

// SAFETY: every call forwards to mimalloc, which returns blocks of at least
// the size asked for, aligned to at least `align` (plainly when `plain`
// holds, by its own rule above; else through the aligned calls), or null;
// `mi_free` and `mi_realloc` take any block mimalloc gave, however it was
// asked for.
unsafe impl GlobalAlloc for Allocator {
    #[inline]
    unsafe fn alloc(&self, layout: Layout) -> *mut u8 {
        if plain(layout.size(), layout.align()) {
            // SAFETY: a plain allocation, aligned by mimalloc's rule.
            unsafe { libmimalloc_sys::mi_malloc(layout.size()) as *mut u8 }
        } else {
            // SAFETY: the caller's layout is passed on unchanged.
            unsafe { mimalloc::MiMalloc.alloc(layout) }
        }
    }

    #[inline]
    unsafe fn alloc_zeroed(&self, layout: Layout) -> *mut u8 {
        if plain(layout.size(), layout.align()) {
            // SAFETY: as for `alloc`; mimalloc zeroes the block.
            unsafe { libmimalloc_sys::mi_zalloc(layout.size()) as *mut u8 }
        } else {
            // SAFETY: the caller's layout is passed on unchanged.
            unsafe { mimalloc::MiMalloc.alloc_zeroed(layout) }
        }
    }

    #[inline]
    unsafe fn dealloc(&self, ptr: *mut u8, _layout: Layout) {
        // SAFETY: `ptr` came from this allocator, so from mimalloc.
        unsafe { libmimalloc_sys::mi_free(ptr as *mut c_void) }
    }

    #[inline]
    unsafe fn realloc(&self, ptr: *mut u8, layout: Layout, new_size: usize) -> *mut u8 {
        if plain(new_size, layout.align()) {
            // SAFETY: `ptr` came from mimalloc; the new block is aligned by
            // mimalloc's rule, and the old contents are kept up to the
            // smaller size.
            unsafe { libmimalloc_sys::mi_realloc(ptr as *mut c_void, new_size) as *mut u8 }
        } else {
            // SAFETY: the caller's pointer, layout and size are passed on
            // unchanged.
            unsafe { mimalloc::MiMalloc.realloc(ptr, layout, new_size) }
        }
    }
}

/// mimalloc's `mi_option_purge_delay`: the sixteenth of its options
/// (`mi_option_t` in its `mimalloc.h`, version 2, which the `mimalloc`
/// crate builds with the `v2` feature). A test below holds the number to
/// the option's documented default of 10 ms.
const PURGE_DELAY: libmimalloc_sys::mi_option_t = 15;

/// Keep freed memory for the rest of the process instead of handing it
/// back to the system 10 ms after it was freed (mimalloc's default).
///
/// A render frees one stage's memory and fills it again in the next: on a
/// 1,000-set job mimalloc handed back some 190 MiB in 38 purges, and each
/// page taken again cost a fresh page fault (about 3,500 of the render's
/// 24,000) plus the `madvise` calls themselves; at exit it purged once
/// more, for nothing (docs/performance.md, "Freed memory kept"). The
/// process is short-lived, so the system takes everything back at exit
/// anyway. Called first thing in `main`; `watch`, which lives on between
/// saves, calls [`return_freed_memory`].
pub fn keep_freed_memory() {
    // SAFETY: setting an option takes no pointers; mimalloc reads its
    // options atomically, so setting one while other threads allocate is
    // allowed (its `options.c`).
    unsafe { libmimalloc_sys::mi_option_set(PURGE_DELAY, -1) }
}

/// Hand freed memory back to the system again after mimalloc's default
/// delay: for the long-lived `watch`, so a large render's memory does not
/// stay with the process between saves.
pub fn return_freed_memory() {
    // SAFETY: as for `keep_freed_memory`.
    unsafe { libmimalloc_sys::mi_option_set(PURGE_DELAY, DEFAULT_PURGE_DELAY_MS) }
}

/// From how many bytes of job text [`large_pages_for`] asks for large
/// pages: some 160 measurement sets of a generated job (400 bytes a set).
/// A demo job is 5 to 10 KiB and is left as it was.
pub const LARGE_PAGES_FROM: usize = 64 * 1024;

/// Asks the kernel to back the allocator's memory with large (2 MiB)
/// pages from now on when the job text is at least [`LARGE_PAGES_FROM`]
/// bytes long; a smaller job is left with the usual 4 KiB pages. Called
/// wherever a job's text is read (`cli::load::read_job`: `render`,
/// `check`, `calc` and the rest).
///
/// A long job's render touches some 80 MB of new memory, a page fault for
/// every 4 KiB: on this project's test machine 19,500 faults, about a
/// third of the render's processor time. In large pages it is some 500
/// (docs/performance.md, "Large pages for a long job"). A short job is
/// better off without them: each of the render's threads would clear a
/// whole 2 MiB page for the few kilobytes it uses, beside a typst that
/// needs the memory bus (measured when the allocator asked for them for
/// every job: 5–7 ms dearer renders of the demo jobs). The kernel gives
/// large pages only where its setting allows
/// (`/sys/kernel/mm/transparent_hugepage/enabled`: `always` or
/// `madvise`); where it does not, or when mimalloc is not the program's
/// allocator (it has no memory areas then), nothing changes. Memory
/// already touched keeps its small pages. Asked once per process.
pub fn large_pages_for(job_text_len: usize) {
    static ASKED: std::sync::atomic::AtomicBool = std::sync::atomic::AtomicBool::new(false);
    if job_text_len < LARGE_PAGES_FROM || ASKED.swap(true, std::sync::atomic::Ordering::Relaxed) {
        return;
    }
    for (start, size) in areas() {
        // SAFETY: madvise only advises the kernel about the range, memory
        // mapped by mimalloc for the life of the process; it reads and
        // writes no memory of ours. Its failure (an old kernel, large
        // pages switched off) leaves the pages as they were.
        unsafe {
            libc::madvise(start, size, libc::MADV_HUGEPAGE);
        }
    }
}

/// mimalloc's memory areas (arenas) so far: where each starts, and its
/// length.
fn areas() -> Vec<(*mut c_void, usize)> {
    unsafe extern "C" {
        /// mimalloc's memory area (arena) `arena_id` (1, 2, …): its
        /// start and, through `size`, its length; null past the last
        /// (its `mimalloc.h`, version 2).
        fn mi_arena_area(arena_id: std::ffi::c_int, size: *mut usize) -> *mut c_void;
    }
    let mut areas = Vec::new();
    for id in 1.. {
        let mut size = 0usize;
        // SAFETY: `size` is a live local for the call to fill in; an id
        // past the last area gives null.
        let start = unsafe { mi_arena_area(id, &mut size) };
        if start.is_null() || size == 0 {
            break;
        }
        areas.push((start, size));
    }
    areas
}

/// mimalloc's default purge delay, in milliseconds (its `options.c`).
const DEFAULT_PURGE_DELAY_MS: std::ffi::c_long = 10;

#[cfg(test)]
mod tests {
    use super::*;

    /// The kernel's flags for the mapping that holds `address`
    /// (`/proc/self/smaps`, its `VmFlags` line).
    #[cfg(target_os = "linux")]
    fn mapping_flags(address: usize) -> Option<String> {
        let smaps = std::fs::read_to_string("/proc/self/smaps").ok()?;
        let mut inside = false;
        for line in smaps.lines() {
            if let Some((range, _)) = line.split_once(' ')
                && let Some((from, to)) = range.split_once('-')
                && let (Ok(from), Ok(to)) = (
                    usize::from_str_radix(from, 16),
                    usize::from_str_radix(to, 16),
                )
            {
                inside = (from..to).contains(&address);
            } else if inside && let Some(flags) = line.strip_prefix("VmFlags:") {
                return Some(flags.trim().to_owned());
            }
        }
        None
    }

    /// A job text shorter than [`LARGE_PAGES_FROM`] leaves the allocator's
    /// memory as it was; one that long marks every area of it for large
    /// pages (`hg` among the mapping's flags).
    #[cfg(target_os = "linux")]
    #[test]
    fn a_long_job_asks_for_large_pages_and_a_short_one_does_not() {
        // An allocation through mimalloc itself, so that it has an area
        // (these tests run with the system's allocator).
        // SAFETY: a plain allocation, freed below.
        let block = unsafe { libmimalloc_sys::mi_malloc(100_000) };
        assert!(!block.is_null());
        let found = areas();
        assert!(!found.is_empty(), "mimalloc has no memory area");
        let marked = |flags: &Option<String>| {
            flags
                .as_deref()
                .is_some_and(|f| f.split_whitespace().any(|flag| flag == "hg"))
        };
        large_pages_for(LARGE_PAGES_FROM - 1);
        for (start, _) in &found {
            let flags = mapping_flags(*start as usize);
            assert!(flags.is_some(), "no mapping at {start:?}");
            assert!(!marked(&flags), "{flags:?}");
        }
        large_pages_for(LARGE_PAGES_FROM);
        // A kernel built without large pages refuses the advice.
        if std::path::Path::new("/sys/kernel/mm/transparent_hugepage").exists() {
            for (start, size) in &found {
                for at in [*start as usize, *start as usize + size - 1] {
                    let flags = mapping_flags(at);
                    assert!(marked(&flags), "{at:#x}: {flags:?}");
                }
            }
        }
        // SAFETY: `block` came from mi_malloc above.
        unsafe { libmimalloc_sys::mi_free(block) };
    }

    /// Every size from 1 to 2,100 bytes and some far larger, at every
    /// alignment from 1 to 4,096: the block is aligned, holds what is
    /// written to it, comes back zeroed when asked, and keeps its bytes
    /// through growing and shrinking; the plain path and the aligned one
    /// are both taken.
    #[test]
    fn blocks_are_aligned_and_keep_their_bytes() {
        let sizes = (1..=2_100usize).chain([4_095, 4_096, 65_537, 300_000, 5_000_000]);
        let mut plain_taken = 0;
        let mut aligned_taken = 0;
        for size in sizes {
            for shift in 0..=12 {
                let align = 1usize << shift;
                if shift > 5 && size % 7 != 0 && size < 4_095 {
                    // The large alignments on a seventh of the sizes keep
                    // the test short.
                    continue;
                }
                if plain(size, align) {
                    plain_taken += 1;
                } else {
                    aligned_taken += 1;
                }
                let layout = Layout::from_size_align(size, align).unwrap();
                // SAFETY: a non-zero size; every block is freed below with
                // the layout it has.
                unsafe {
                    let p = Allocator.alloc_zeroed(layout);
                    assert!(!p.is_null(), "{size} bytes at {align}");
                    assert_eq!(p as usize % align, 0, "{size} bytes at {align}");
                    assert!(
                        std::slice::from_raw_parts(p, size).iter().all(|&b| b == 0),
                        "{size} bytes at {align} not zeroed"
                    );
                    for i in 0..size {
                        *p.add(i) = (i % 251) as u8;
                    }
                    let grown = size * 2 + 3;
                    let q = Allocator.realloc(p, layout, grown);
                    assert_eq!(q as usize % align, 0, "{size} → {grown} bytes at {align}");
                    assert!((0..size).all(|i| *q.add(i) == (i % 251) as u8));
                    let shrunk = size.div_ceil(3);
                    let grown_layout = Layout::from_size_align(grown, align).unwrap();
                    let r = Allocator.realloc(q, grown_layout, shrunk);
                    assert_eq!(r as usize % align, 0, "{grown} → {shrunk} bytes at {align}");
                    assert!((0..shrunk).all(|i| *r.add(i) == (i % 251) as u8));
                    Allocator.dealloc(r, Layout::from_size_align(shrunk, align).unwrap());

                    let s = Allocator.alloc(layout);
                    assert_eq!(s as usize % align, 0, "{size} bytes at {align}");
                    Allocator.dealloc(s, layout);
                }
            }
        }
        assert!(plain_taken > 10_000 && aligned_taken > 1_000);
    }

    /// The option number is the purge delay's: unset it reads mimalloc's
    /// documented default (10 ms, `options.c`, unless the environment set
    /// it), and it takes the values the two calls set. The neighbours
    /// (eager commit delay, 14; NUMA nodes, 16) have other defaults (1 and
    /// 0), so a wrong number would show.
    #[test]
    fn the_purge_delay_option_is_the_one_set() {
        // SAFETY: reading and setting options takes no pointers.
        let get = |o| unsafe { libmimalloc_sys::mi_option_get(o) };
        if std::env::var_os("MIMALLOC_PURGE_DELAY").is_none()
            && std::env::var_os("MIMALLOC_RESET_DELAY").is_none()
        {
            assert_eq!(get(PURGE_DELAY), DEFAULT_PURGE_DELAY_MS);
        }
        keep_freed_memory();
        assert_eq!(get(PURGE_DELAY), -1);
        return_freed_memory();
        assert_eq!(get(PURGE_DELAY), 10);
        if std::env::var_os("MIMALLOC_EAGER_COMMIT_DELAY").is_none() {
            assert_eq!(
                PURGE_DELAY - 1,
                libmimalloc_sys::mi_option_eager_commit_delay
            );
            assert_eq!(get(libmimalloc_sys::mi_option_eager_commit_delay), 1);
        }
    }
}
