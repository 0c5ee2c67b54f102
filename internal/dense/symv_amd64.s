#include "textflag.h"

// func symvRowAVX(n int, row, xs, ys *float64, xi float64) (dot float64)
//
// For j < n (n a multiple of 8): dot += row[j]·xs[j]; ys[j] += row[j]·xi.
TEXT ·symvRowAVX(SB), NOSPLIT, $0-48
	MOVQ         n+0(FP), CX
	MOVQ         row+8(FP), SI
	MOVQ         xs+16(FP), DI
	MOVQ         ys+24(FP), DX
	VBROADCASTSD xi+32(FP), Y15
	VXORPD       Y0, Y0, Y0
	VXORPD       Y1, Y1, Y1
	SHRQ         $3, CX
	JEQ          done

loop:
	VMOVUPD     (SI), Y2
	VMOVUPD     32(SI), Y3
	VFMADD231PD (DI), Y2, Y0
	VFMADD231PD 32(DI), Y3, Y1
	VMOVUPD     (DX), Y4
	VMOVUPD     32(DX), Y5
	VFMADD231PD Y2, Y15, Y4
	VFMADD231PD Y3, Y15, Y5
	VMOVUPD     Y4, (DX)
	VMOVUPD     Y5, 32(DX)
	ADDQ        $64, SI
	ADDQ        $64, DI
	ADDQ        $64, DX
	DECQ        CX
	JNZ         loop

done:
	VADDPD       Y1, Y0, Y0
	VEXTRACTF128 $1, Y0, X1
	VADDPD       X1, X0, X0
	VHADDPD      X0, X0, X0
	VZEROUPPER
	MOVSD        X0, dot+40(FP)
	RET
