#pragma once
// Peak resident memory of this process so far (VmHWM from /proc/self/status), in MiB.
namespace ringroad::bench {
double peak_memory_mib();
}
