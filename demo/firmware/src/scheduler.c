/* Cooperative scheduler: every task runs from the 1 ms tick. */
#include "../include/board.h"

/* @timing scheduler-tick
 * circuit: timer
 * clock: @fast-bus
 * prescaler: TICK_DIV
 * reload: TICK_TOP
 * expect: 1 kHz ±0.5%
 */
void scheduler_init(void)
{
    timer_set_prescaler(TICK_TIMER, TICK_DIV - 1u);
    timer_set_reload(TICK_TIMER, TICK_TOP);
    timer_enable_irq(TICK_TIMER);
}

static volatile uint32_t ticks;

void scheduler_tick_isr(void)
{
    ticks++;
}
