/* Soil-moisture probe sampler: the rate is set by the build (-DPROBE_RATE_HZ in compile_commands.json),
 * so one source serves the 10 Hz field unit and the faster bench-test build. */
#include "../include/board.h"

#ifndef PROBE_RATE_HZ
#error "the build sets PROBE_RATE_HZ"
#endif

#define PROBE_DIV 1024u

/* @timing probe-sampler
 * circuit: timer
 * clock: SYS_CLOCK_HZ
 * prescaler: PROBE_DIV
 * reload: SYS_CLOCK_HZ / PROBE_DIV / PROBE_RATE_HZ - 1
 * bits: 16
 * expect: 10 Hz
 */
void probe_sampler_init(void)
{
    timer_set_prescaler(PROBE_TIMER, PROBE_DIV - 1u);
    timer_set_reload(PROBE_TIMER, SYS_CLOCK_HZ / PROBE_DIV / PROBE_RATE_HZ - 1u);
}
