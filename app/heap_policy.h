#pragma once
// How this process asks the C library and the kernel for memory (issue 13). A validation of a
// large cohort allocates and frees a handful of arrays of n values each. On the virtual machine
// the project is measured on, the first touch of a fresh 4 KiB page costs about 16 us (0.25 GB/s),
// and with the C library's defaults each large array is a fresh mapping, faulted in page by page
// and unmapped when freed. Measured with scripts/bench-whole.sh, this policy takes
// `validate --risk` on 1,000,000 rows from about 0.88 s to about 0.5 s (README, Performance).

namespace calivera {

enum class ProcessKind {
  Command,      // one command-line run: memory goes back to the system when the process ends
  Workstation,  // long-lived: freed memory above the reserve is handed back as usual
};

// Large blocks come from the heap and freed memory stays there for reuse (mallopt), one arena
// serves every thread, and a reserve at the start of the heap is advised for transparent huge
// pages (one fault per 2 MiB): a quarter of physical memory between 1 and 16 GiB for a command,
// 1 GiB for the workstation. Only advice: untouched reserved address space costs no memory, and
// where any step is refused (no glibc, a sanitizer's allocator, strict overcommit) the process
// runs with the defaults.
void applyHeapPolicy(ProcessKind kind);

}  // namespace calivera
