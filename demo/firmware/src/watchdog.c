/* Watchdog service: the main loop refreshes the watchdog once per pass. */
#include "../include/board.h"

/* Main loop pass, at most: the longest task plus the radio poll. */
#define LOOP_PASS_MS      500u

/* @timing wdt-refresh
 * circuit: watchdog
 * clock: @slow-osc
 * prescaler: WATCHDOG_DIV
 * reload: WATCHDOG_TOP
 * refresh: LOOP_PASS_MS * 1 ms
 */
void watchdog_service(void)
{
    watchdog_refresh();
}
