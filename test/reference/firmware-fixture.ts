// Firmware of our own: a clock tree of #defines, an enum whose constants count on implicitly, and register values
// derived in C's integer arithmetic (PWM_CMP truncates 67.2 to 67), so a real-valued reading would differ.
export const boardHeader = `#ifndef BOARD_H
#define BOARD_H
#define XTAL_HZ 12000000UL
#define PLL_MUL 6u
#define SYS_HZ (XTAL_HZ * PLL_MUL / 2u)
enum div_log2 { DIV_1_LOG2, DIV_2_LOG2, DIV_4_LOG2, DIV_8_LOG2 };
#define PWM_PRESCALE (1u << DIV_8_LOG2)
enum pwm_regs { PWM_HZ = 20000, PWM_TOP = SYS_HZ / PWM_PRESCALE / PWM_HZ - 1, PWM_CMP = PWM_TOP * 3 / 10 };
#define CONSOLE_BAUD 9600u
#define UART_DIV ((SYS_HZ / 2u + 8u * CONSOLE_BAUD) / (16u * CONSOLE_BAUD))
#endif
`;

/** Each firmware block's keys and the C text of their values, written into the comment and compiled by gcc. */
export const firmwareBlocks: Record<string, { circuit: string; keys: Record<string, string> }> = {
  'motor-pwm': { circuit: 'timer', keys: { clock: 'SYS_HZ', prescaler: 'PWM_PRESCALE', reload: 'PWM_TOP', compare: 'PWM_CMP' } },
  console: { circuit: 'baud', keys: { clock: 'SYS_HZ / 2', baud: 'CONSOLE_BAUD', divisor: 'UART_DIV' } },
};

export function firmwareSource(): string {
  const [pwm, uart] = Object.entries(firmwareBlocks).map(([name, b]) => [`@timing ${name}`, `circuit: ${b.circuit}`, ...Object.entries(b.keys).map(([k, v]) => `${k}: ${v}`)]);
  return ['#include "board.h"', '', '/* ' + pwm[0], ...pwm.slice(1).map((l) => ' * ' + l), ' */', 'void pwm_start(void);', '', ...uart.map((l) => '// ' + l), 'void console_start(void);', ''].join('\n');
}
