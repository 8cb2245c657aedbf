/* UART to the radio module, on the slow peripheral bus since revision C (notes/clock-tree.md). */
#include "../include/board.h"

/*
 * @timing radio-uart
 * circuit: baud
 * clock: @slow-bus
 * baud: RADIO_BAUD
 * oversampling: UART_OVERSAMPLING
 * divisor: UART_DIVISOR
 * expect: 9600 baud ±1%
 */
void radio_uart_init(void)
{
    uart_set_divisor(RADIO_PORT, UART_DIVISOR);
}
